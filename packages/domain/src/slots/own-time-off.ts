// What a technician may change in their own working hours without a partner admin: their time
// off (whole days off and time away). The weekly pattern, the zone, extra hours and the booking
// rules stay the partner admin's, because they decide what owners can book. Time off applies at
// once (no approval step): the partner admin sees it on the technician's hours and in the audit log.
import type { HoursException, WorkingHours } from '../schemas/hours';

const isTimeOff = (e: HoursException) => e.kind === 'days-off' || e.kind === 'time-off';

/** A stable text of a value with object keys sorted, so equal data compares equal. */
function canonical(value: unknown): string {
  return JSON.stringify(value, (_k, v: unknown) => (v && typeof v === 'object' && !Array.isArray(v) ? Object.fromEntries(Object.entries(v).sort(([a], [b]) => a.localeCompare(b))) : v));
}

/** Everything but the time off, in a form that compares by value (extra hours as a sorted list). */
function withoutTimeOff(hours: WorkingHours): string {
  const { exceptions, ...rest } = hours;
  return canonical({ ...rest, exceptions: exceptions.filter((e) => !isTimeOff(e)).map(canonical).sort() });
}

/** True when `after` differs from `before` only in days off and time away (and hours were set before). */
export function changesOnlyTimeOff(before: WorkingHours | null, after: WorkingHours): boolean {
  return before !== null && withoutTimeOff(before) === withoutTimeOff(after);
}
