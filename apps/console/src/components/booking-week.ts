// The week calendar's arithmetic: weeks as local dates (Monday first), bookings placed on the days
// and quarter hours of the technician's time zone (luxon, never the browser's zone), side by side
// when they overlap.
import { DateTime } from 'luxon';
import type { Booking } from '@emberline/domain';

/** Minutes one row of the calendar grid stands for. */
export const ROW_MINUTES = 15;
/** Hours the calendar shows when no booking lies outside them. */
export const DEFAULT_HOURS: readonly [number, number] = [7, 19];
const DATE = /^\d{4}-\d{2}-\d{2}$/;

/** The zone the browser runs in, for when a technician has not set one. */
export function browserZone(): string {
  return Intl.DateTimeFormat().resolvedOptions().timeZone || 'UTC';
}

/** Today's date in a zone, as YYYY-MM-DD. */
export function todayIn(zone: string): string {
  return DateTime.now().setZone(zone).toISODate() ?? DateTime.now().toISODate()!;
}

/** Monday of the week a date (YYYY-MM-DD) falls in; null for anything else. */
export function mondayOf(date: string): string | null {
  if (!DATE.test(date)) return null;
  const d = DateTime.fromISO(date, { zone: 'utc' });
  return d.isValid ? d.minus({ days: d.weekday - 1 }).toISODate() : null;
}

export function addDays(date: string, days: number): string {
  return DateTime.fromISO(date, { zone: 'utc' }).plus({ days }).toISODate()!;
}

/** The seven dates of the week starting on `monday`. */
export function weekDates(monday: string): string[] {
  return Array.from({ length: 7 }, (_, i) => addDays(monday, i));
}

/**
 * Instants to ask the API for: a day either side of the week in UTC, which covers the week in
 * every time zone (offsets stay within ±14 h), so the request does not wait for the zone.
 */
export function weekQueryRange(monday: string): { from: string; to: string } {
  const start = DateTime.fromISO(monday, { zone: 'utc' });
  return { from: start.minus({ days: 1 }).toISO()!, to: start.plus({ days: 8 }).toISO()! };
}

export interface PlacedBooking {
  booking: Booking;
  /** 0 = Monday … 6 = Sunday. */
  day: number;
  date: string;
  /** Minutes after local midnight in the zone; a job past midnight is cut at the end of its first day. */
  startMinute: number;
  endMinute: number;
  /** Local wall-clock times, "09:00". */
  startTime: string;
  endTime: string;
  /** Side-by-side position among overlapping bookings of the same day. */
  lane: number;
  lanes: number;
}

/** The bookings of the week, placed on its days in `zone`; those outside the week are left out. */
export function placeWeek(bookings: readonly Booking[], monday: string, zone: string): PlacedBooking[] {
  const dates = weekDates(monday);
  const placed: PlacedBooking[] = [];
  for (const booking of bookings) {
    const start = DateTime.fromISO(booking.start, { setZone: true }).setZone(zone);
    const end = DateTime.fromISO(booking.end, { setZone: true }).setZone(zone);
    if (!start.isValid || !end.isValid) continue;
    const date = start.toISODate()!;
    const day = dates.indexOf(date);
    if (day < 0) continue;
    const startMinute = start.hour * 60 + start.minute;
    const endMinute = end.toISODate() === date ? Math.max(end.hour * 60 + end.minute, startMinute + ROW_MINUTES) : 24 * 60;
    placed.push({ booking, day, date, startMinute, endMinute, startTime: start.toFormat('HH:mm'), endTime: end.toFormat('HH:mm'), lane: 0, lanes: 1 });
  }
  placed.sort((a, b) => a.day - b.day || a.startMinute - b.startMinute || a.endMinute - b.endMinute);
  // overlapping bookings of a day form a group; each takes the first lane free at its start
  let group: PlacedBooking[] = [];
  let groupEnd = -1;
  let groupDay = -1;
  const close = () => {
    const lanes = Math.max(1, ...group.map((p) => p.lane + 1));
    for (const p of group) p.lanes = lanes;
  };
  for (const p of placed) {
    if (p.day !== groupDay || p.startMinute >= groupEnd) {
      close();
      group = [];
      groupEnd = -1;
      groupDay = p.day;
    }
    const laneEnds: number[] = [];
    for (const q of group) laneEnds[q.lane] = Math.max(laneEnds[q.lane] ?? 0, q.endMinute);
    let lane = laneEnds.findIndex((endAt) => endAt <= p.startMinute);
    if (lane < 0) lane = laneEnds.length;
    p.lane = lane;
    group.push(p);
    groupEnd = Math.max(groupEnd, p.endMinute);
  }
  close();
  return placed;
}

/** First and last hour the grid shows: the working day, widened to every booking of the week. */
export function hourSpan(placed: readonly PlacedBooking[], defaults: readonly [number, number] = DEFAULT_HOURS): [number, number] {
  let first = defaults[0];
  let last = defaults[1];
  for (const p of placed) {
    first = Math.min(first, Math.floor(p.startMinute / 60));
    last = Math.max(last, Math.ceil(p.endMinute / 60));
  }
  return [Math.max(0, first), Math.min(24, last)];
}

/** Grid lines (1-based, CSS grid) of a placed booking: row 1 holds the day headings, column 1 the hours. */
export function gridArea(p: Pick<PlacedBooking, 'day' | 'startMinute' | 'endMinute'>, firstHour: number): { rowStart: number; rowEnd: number; column: number } {
  const offset = firstHour * 60;
  const rowStart = 2 + Math.floor((p.startMinute - offset) / ROW_MINUTES);
  const rowEnd = Math.max(rowStart + 1, 2 + Math.ceil((p.endMinute - offset) / ROW_MINUTES));
  return { rowStart, rowEnd, column: 2 + p.day };
}
