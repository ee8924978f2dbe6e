// The usual week of several technicians as one, in one time zone: for a partner's profile page.
import { DateTime } from 'luxon';
import { minutesOfDay, WEEKDAYS, type WorkingHours } from '../schemas/hours';
import type { PartnerProfile } from '../schemas/search';

const WEEK_MINUTES = 7 * 1440;

const clock = (minutes: number) => (minutes === 1440 ? '24:00' : `${String(Math.floor(minutes / 60)).padStart(2, '0')}:${String(minutes % 60).padStart(2, '0')}`);

/**
 * The union of weekly patterns, in `zone`: hours kept in another zone are moved by the difference
 * of the two zones' offsets at `now` (and may spill into the next or previous day). Exceptions are
 * left out: this is the usual week, not a calendar.
 */
export function weeklyUnion(patterns: readonly WorkingHours[], zone: string, now: Date): PartnerProfile['weeklyHours'] {
  const offsetAt = (z: string) => DateTime.fromJSDate(now, { zone: z }).offset;
  const spans: [number, number][] = [];
  for (const hours of patterns) {
    const shift = offsetAt(zone) - offsetAt(hours.timeZone);
    WEEKDAYS.forEach((day, i) => {
      for (const interval of hours.weekly[day]) {
        const start = (i * 1440 + minutesOfDay(interval.start) + shift + WEEK_MINUTES) % WEEK_MINUTES;
        const end = start + minutesOfDay(interval.end) - minutesOfDay(interval.start);
        // a stretch moved across Sunday midnight continues on Monday
        if (end > WEEK_MINUTES) spans.push([start, WEEK_MINUTES], [0, end - WEEK_MINUTES]);
        else spans.push([start, end]);
      }
    });
  }
  spans.sort((a, b) => a[0] - b[0] || a[1] - b[1]);
  const merged: [number, number][] = [];
  for (const [start, end] of spans) {
    const last = merged[merged.length - 1];
    if (last && start <= last[1]) last[1] = Math.max(last[1], end);
    else merged.push([start, end]);
  }
  const days = WEEKDAYS.map((_, i) => ({ weekday: i + 1, intervals: [] as { start: string; end: string }[] }));
  for (const [start, end] of merged) {
    // a stretch past midnight is shown as two, one on each day
    for (let dayStart = Math.floor(start / 1440) * 1440; dayStart < end; dayStart += 1440) {
      const from = Math.max(start, dayStart);
      const to = Math.min(end, dayStart + 1440);
      if (to > from) days[dayStart / 1440]!.intervals.push({ start: clock(from - dayStart), end: clock(to - dayStart) });
    }
  }
  return days;
}
