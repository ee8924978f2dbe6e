// What a technician may change in their own hours: days off and time away, nothing else.
import { describe, expect, it } from 'vitest';
import { changesOnlyTimeOff, WorkingHoursSchema, type WorkingHours } from '@emberline/domain';

const base: WorkingHours = WorkingHoursSchema.parse({
  timeZone: 'Europe/Vienna',
  weekly: { monday: [{ start: '08:00', end: '16:00' }], tuesday: [], wednesday: [], thursday: [], friday: [], saturday: [], sunday: [] },
  exceptions: [{ kind: 'extra-hours', date: '2026-12-12', start: '09:00', end: '12:00' }],
  minimumNoticeMinutes: 120,
  bookingHorizonDays: 60,
  bufferMinutes: 15,
});
const change = (patch: Partial<WorkingHours>): WorkingHours => ({ ...base, ...patch });

describe('changesOnlyTimeOff', () => {
  it('allows adding and removing days off and time away', () => {
    const withDays = change({ exceptions: [...base.exceptions, { kind: 'days-off', from: '2026-12-21', to: '2026-12-24' }] });
    expect(changesOnlyTimeOff(base, withDays)).toBe(true);
    const withAway = change({ exceptions: [{ kind: 'time-off', start: '2026-12-10T09:00:00.000Z', end: '2026-12-10T11:00:00.000Z' }, ...withDays.exceptions] });
    expect(changesOnlyTimeOff(withDays, withAway)).toBe(true);
    expect(changesOnlyTimeOff(withAway, base)).toBe(true);
  });

  it('refuses changes to the weekly pattern, the zone, extra hours and the booking rules', () => {
    expect(changesOnlyTimeOff(base, change({ weekly: { ...base.weekly, tuesday: [{ start: '08:00', end: '12:00' }] } }))).toBe(false);
    expect(changesOnlyTimeOff(base, change({ timeZone: 'Europe/Berlin' }))).toBe(false);
    expect(changesOnlyTimeOff(base, change({ exceptions: [] }))).toBe(false);
    expect(changesOnlyTimeOff(base, change({ minimumNoticeMinutes: 60 }))).toBe(false);
    expect(changesOnlyTimeOff(base, change({ bufferMinutes: 0 }))).toBe(false);
  });

  it('refuses setting hours where none were set', () => {
    expect(changesOnlyTimeOff(null, base)).toBe(false);
  });

  it('does not mind the order of keys or of the exceptions', () => {
    const reordered = Object.fromEntries(Object.entries(base).reverse()) as WorkingHours;
    expect(changesOnlyTimeOff(base, reordered)).toBe(true);
  });
});
