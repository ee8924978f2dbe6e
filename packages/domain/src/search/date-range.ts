// Which "free on" dates a search can answer: from yesterday in UTC (some zones are still on it)
// up to the longest booking horizon a partner may set; any other date is out of range, not a gap.
import { HOURS_LIMITS } from '../schemas/hours';

const DAY_MS = 86_400_000;
const isoDay = (ms: number) => new Date(ms).toISOString().slice(0, 10);

/** The first and last date (YYYY-MM-DD) a search for a free slot can answer at `now`. */
export function searchDateRange(now: Date): { first: string; last: string } {
  return { first: isoDay(now.getTime() - DAY_MS), last: isoDay(now.getTime() + HOURS_LIMITS.bookingHorizonDays.max * DAY_MS) };
}

/** A message when `date` is outside the range, else null. */
export function searchDateProblem(date: string, now: Date): string | null {
  const { first, last } = searchDateRange(now);
  if (date >= first && date <= last) return null;
  return `${date} is out of range: pick a day from today up to ${HOURS_LIMITS.bookingHorizonDays.max} days ahead (until ${last})`;
}
