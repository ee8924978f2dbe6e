// What a partner's landing page sums up from its bookings: the jobs of today and of the next days
// (work that holds a technician's time), and what owners paid for the jobs completed in a period.
import type { BookingStatus } from '../schemas/bookings';

/** Statuses of a job that is or was on someone's day: agreed, under way or done. */
export const JOB_STATUSES: readonly BookingStatus[] = ['confirmed', 'in_progress', 'completed'];

interface JobLike {
  status: BookingStatus;
  start: string;
  quote: { currency: string; grossMinor: number };
}

/** The calendar day (YYYY-MM-DD) of an instant in a time zone. */
function dayIn(instant: string | Date, timeZone: string): string {
  return new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit' }).format(new Date(instant));
}

/**
 * Jobs starting on `now`'s day in `timeZone` and on the `days` days after it, each list in time
 * order. Jobs waiting for an answer, released, declined or cancelled are not on anyone's day.
 */
export function upcomingJobs<T extends JobLike>(bookings: readonly T[], now: Date, timeZone: string, days = 6): { today: T[]; later: T[] } {
  const today = dayIn(now, timeZone);
  const last = dayIn(new Date(now.getTime() + days * 86_400_000), timeZone);
  const jobs = bookings.filter((b) => JOB_STATUSES.includes(b.status)).sort((a, b) => Date.parse(a.start) - Date.parse(b.start));
  return {
    today: jobs.filter((b) => dayIn(b.start, timeZone) === today),
    later: jobs.filter((b) => {
      const day = dayIn(b.start, timeZone);
      return day > today && day <= last;
    }),
  };
}

/** What owners paid (gross, minor units) for completed jobs, per currency, currencies in A–Z order. */
export function paidForCompleted(bookings: readonly JobLike[]): { currency: string; grossMinor: number; jobs: number }[] {
  const by = new Map<string, { currency: string; grossMinor: number; jobs: number }>();
  for (const b of bookings) {
    if (b.status !== 'completed') continue;
    const sum = by.get(b.quote.currency) ?? { currency: b.quote.currency, grossMinor: 0, jobs: 0 };
    sum.grossMinor += b.quote.grossMinor;
    sum.jobs += 1;
    by.set(b.quote.currency, sum);
  }
  return [...by.values()].sort((a, b) => a.currency.localeCompare(b.currency));
}
