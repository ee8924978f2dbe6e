// The slot engine: bookable start times per technician and for the organisation, from working
// hours, exceptions, existing bookings and driving time. Pure: the caller passes `now`.
// Working hours are clipped to the real instants inside them: a start in a spring-forward gap
// begins at the gap's end, an end in it ends at the gap's start (the same instant), hours wholly
// inside it are empty, and a calendar day the zone skipped has no hours (none move to the next day).
import { DateTime } from 'luxon';
import { assertGeoPoint, type GeoPoint } from '../geo/distance';
import { assertTravelAssumptions, DEFAULT_TRAVEL_ASSUMPTIONS, travelMinutes, type TravelAssumptions } from '../geo/travel';
import { DURATION_STEP_MINUTES, minutesOfDay, WEEKDAYS, type Weekday, type WorkingHours } from '../schemas/hours';
import type { BookableSlot, Instant, OrganisationSlot, SlotQuery, SlotResult, SlotTechnician, TechnicianSlots } from './types';
import { ZoneClock } from './zone-clock';

const MINUTE_MS = 60_000;
const DAY_MS = 86_400_000;
export const DEFAULT_GRID_MINUTES = 15;
export const MAX_SEARCH_DAYS = 366;

/** [start, end) in epoch milliseconds. */
interface Span {
  start: number;
  end: number;
}

interface LocalDay {
  date: string;
  weekday: Weekday;
  /** Local midnight as wall-clock milliseconds (see ZoneClock). */
  wallMidnight: number;
}

/** The local days searched in one zone, shared by the technicians working in it. */
interface ZoneCalendar {
  clock: ZoneClock;
  /**
   * The searched days and the day after them, into which a late job may run; when the zone skipped
   * that day, also the next day that happened (the job runs on into it).
   */
  days: LocalDay[];
  /** How many of `days` are searched. */
  searched: number;
  /** First instant of the local day after the last searched day. */
  searchEnd: number;
  /** First instant after the booking horizon, per horizon in days (technicians share them). */
  horizonEnds: Map<number, number>;
}

const ISO_WITH_OFFSET = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}(?::\d{2}(?:\.\d+)?)?(?:Z|[+-]\d{2}:\d{2})$/i;

/** Epoch milliseconds of an instant; refuses strings without `Z` or an offset. */
export function toEpochMs(value: Instant, label = 'instant'): number {
  let ms: number;
  if (typeof value === 'number') ms = value;
  else if (value instanceof Date) ms = value.getTime();
  else {
    if (!ISO_WITH_OFFSET.test(value)) throw new RangeError(`${label} must be an ISO 8601 date-time with Z or a UTC offset, got "${value}"`);
    ms = Date.parse(value);
    if (Number.isNaN(ms)) ms = DateTime.fromISO(value, { setZone: true }).toMillis();
  }
  if (!Number.isFinite(ms)) throw new RangeError(`${label} is not a valid instant: ${String(value)}`);
  return ms;
}

/** Bookable slots for every technician and their union for the organisation. */
export function computeSlots(query: SlotQuery): SlotResult {
  const durationMinutes = query.durationMinutes;
  // a job may run into the day after the search, not further
  if (!Number.isInteger(durationMinutes) || durationMinutes <= 0 || durationMinutes > 1440 || durationMinutes % DURATION_STEP_MINUTES !== 0) {
    throw new RangeError(`durationMinutes must be a positive multiple of ${DURATION_STEP_MINUTES} up to 1440, got ${durationMinutes}`);
  }
  const gridMinutes = query.gridMinutes ?? DEFAULT_GRID_MINUTES;
  if (!Number.isInteger(gridMinutes) || gridMinutes <= 0 || 1440 % gridMinutes !== 0) {
    throw new RangeError(`gridMinutes must be a whole number of minutes that divides a day (5, 10, 15, 30, 60, …), got ${gridMinutes}`);
  }
  if (!Number.isInteger(query.days) || query.days < 1 || query.days > MAX_SEARCH_DAYS) {
    throw new RangeError(`days must be a whole number from 1 to ${MAX_SEARCH_DAYS}, got ${query.days}`);
  }
  const maxSlots = query.maxSlotsPerTechnician ?? Number.POSITIVE_INFINITY;
  if (!(maxSlots === Number.POSITIVE_INFINITY || (Number.isInteger(maxSlots) && maxSlots >= 1))) {
    throw new RangeError(`maxSlotsPerTechnician must be a whole number of 1 or more, got ${query.maxSlotsPerTechnician}`);
  }
  assertGeoPoint(query.customer, 'customer');
  const travel: TravelAssumptions = { ...DEFAULT_TRAVEL_ASSUMPTIONS, ...query.travel };
  assertTravelAssumptions(travel);

  const context: Context = {
    nowMs: toEpochMs(query.now, 'now'),
    fromMs: toEpochMs(query.from, 'from'),
    days: query.days,
    durationMs: durationMinutes * MINUTE_MS,
    gridMs: gridMinutes * MINUTE_MS,
    customer: query.customer,
    travel,
    maxSlots,
    calendars: new Map(),
    labels: { dates: new Map(), utcTimes: new Map(), localTimes: new Map(), offsets: new Map() },
  };

  const starts: number[][] = [];
  const technicians: TechnicianSlots[] = query.technicians.map((technician) => {
    const { slots, startsMs } = technicianSlots(technician, context);
    starts.push(startsMs);
    return { technicianId: technician.id, timeZone: technician.hours.timeZone, slots };
  });

  const timeZone = query.timeZone ?? query.technicians[0]?.hours.timeZone ?? 'UTC';
  const orgClock = calendarFor(timeZone, context).clock;
  const byStart = new Map<number, string[]>();
  query.technicians.forEach((technician, i) => {
    for (const start of starts[i]!) {
      const ids = byStart.get(start);
      if (ids) ids.push(technician.id);
      else byStart.set(start, [technician.id]);
    }
  });
  const organisation: OrganisationSlot[] = [...byStart.keys()]
    .sort((a, b) => a - b)
    .map((start) => ({ ...slotAt(start, orgClock.offsetAt(start), context), technicianIds: byStart.get(start)! }));

  return { technicians, organisation, timeZone };
}

interface Context {
  nowMs: number;
  fromMs: number;
  days: number;
  durationMs: number;
  gridMs: number;
  customer: GeoPoint;
  travel: TravelAssumptions;
  /** Slots per technician to stop at. */
  maxSlots: number;
  calendars: Map<string, ZoneCalendar>;
  /** Pieces of labels, shared by all labels of one call (see utcText). */
  labels: { dates: Map<number, string>; utcTimes: Map<number, string>; localTimes: Map<number, string>; offsets: Map<number, string> };
}

/**
 * The searched local days of a zone. The zone's clock (its offsets from the shared year tables,
 * see ZoneClock) gives the local date of `from`; the dates after it are counted on wall-clock
 * midnights (a zone-free calendar, so no offsets are looked up), and each day's instants come
 * from the clock — never by adding 24 hours to an instant.
 */
function calendarFor(zone: string, context: Context): ZoneCalendar {
  const cached = context.calendars.get(zone);
  if (cached) return cached;
  // local midnight of `from` is within a day of it; three more days either side, because
  // wall-clock conversions look a day beyond the time they convert
  const clock = new ZoneClock(zone, context.fromMs - 4 * DAY_MS, context.fromMs + (context.days + 4) * DAY_MS);
  const firstMidnight = Math.floor(clock.toWallClock(context.fromMs) / DAY_MS) * DAY_MS;
  const days: LocalDay[] = [];
  const addDay = (wallMidnight: number) => {
    const date = new Date(wallMidnight);
    // getUTCDay counts from Sunday; WEEKDAYS from Monday
    days.push({ date: date.toISOString().slice(0, 10), weekday: WEEKDAYS[(date.getUTCDay() + 6) % 7]!, wallMidnight });
  };
  for (let i = 0; i <= context.days; i++) addDay(firstMidnight + i * DAY_MS);
  const searchEnd = clock.toInstant(days[context.days]!.wallMidnight);
  // a skipped day (its midnight and the next are the same instant) lends no hours: the next one does
  for (let next = days[context.days]!.wallMidnight + DAY_MS; clock.toInstant(next) === searchEnd; next += DAY_MS) addDay(next);
  const calendar: ZoneCalendar = { clock, days, searched: context.days, searchEnd, horizonEnds: new Map() };
  context.calendars.set(zone, calendar);
  return calendar;
}

function wallMidnightOf(date: string): number {
  return Date.UTC(Number(date.slice(0, 4)), Number(date.slice(5, 7)) - 1, Number(date.slice(8, 10)));
}

function technicianSlots(technician: SlotTechnician, context: Context): { slots: BookableSlot[]; startsMs: number[] } {
  const hours = technician.hours;
  assertGeoPoint(technician.base, `technician ${technician.id} base`);
  const calendar = calendarFor(hours.timeZone, context);
  const clock = calendar.clock;

  // Latest start: before the local day after (today + horizon) and before the end of the search.
  let horizonEnd = calendar.horizonEnds.get(hours.bookingHorizonDays);
  if (horizonEnd === undefined) {
    // local midnight of the day after today + horizon, on the wall clock; past the search's
    // last day it cannot cut anything (the search ends first)
    const todayWall = Math.floor(clock.toWallClock(context.nowMs) / DAY_MS) * DAY_MS;
    const horizonWall = todayWall + (hours.bookingHorizonDays + 1) * DAY_MS;
    horizonEnd = horizonWall > calendar.days[calendar.days.length - 1]!.wallMidnight ? Number.POSITIVE_INFINITY : clock.toInstant(horizonWall);
    calendar.horizonEnds.set(hours.bookingHorizonDays, horizonEnd);
  }
  const earliestStart = Math.max(context.fromMs, context.nowMs + hours.minimumNoticeMinutes * MINUTE_MS);
  const latestStart = Math.min(horizonEnd, calendar.searchEnd) - 1;
  if (latestStart < earliestStart) return { slots: [], startsMs: [] };

  const { windows, dayFirstStarts } = cachedWorkingWindows(hours, calendar);
  const ranges = startRanges(windows, context.durationMs, earliestStart, latestStart);
  if (ranges.length === 0) return { slots: [], startsMs: [] };
  const blocked = blockedStarts(technician, dayFirstStarts, context, earliestStart, latestStart);
  const allowed = subtractFromClosed(ranges, blocked);
  return gridSlots(allowed, clock, context);
}

/** The weekly intervals as minutes of the day, read once per hours object (callers keep theirs for many runs). */
const weeklyMinutesCache = new WeakMap<WorkingHours, Record<Weekday, ReadonlyArray<readonly [number, number]>>>();

function weeklyMinutes(hours: WorkingHours): Record<Weekday, ReadonlyArray<readonly [number, number]>> {
  let weekly = weeklyMinutesCache.get(hours);
  if (!weekly) {
    weekly = {} as Record<Weekday, ReadonlyArray<readonly [number, number]>>;
    for (const day of WEEKDAYS) weekly[day] = hours.weekly[day].map((i) => [minutesOfDay(i.start), minutesOfDay(i.end)] as const);
    weeklyMinutesCache.set(hours, weekly);
  }
  return weekly;
}

/**
 * Working windows by hours object and searched days. They depend on nothing else (the zone's
 * offsets are fixed data), so every search of the same days reuses them: the slot search of a
 * day asks for the same technicians' windows over and over, and only what depends on the
 * customer (travel, bookings) differs. Like the weekly intervals, this assumes a WorkingHours
 * object is not changed once made (callers parse new ones).
 */
const windowsCache = new WeakMap<WorkingHours, Map<string, { windows: Span[]; dayFirstStarts: number[] }>>();
/** Searched-day spans kept per hours object (a few "today" searches of different lengths a day). */
const WINDOWS_PER_HOURS = 8;

function cachedWorkingWindows(hours: WorkingHours, calendar: ZoneCalendar): { windows: Span[]; dayFirstStarts: number[] } {
  const key = `${calendar.days[0]!.date}|${calendar.searched}`;
  let byDays = windowsCache.get(hours);
  if (!byDays) windowsCache.set(hours, (byDays = new Map()));
  let found = byDays.get(key);
  if (!found) {
    found = workingWindows(hours, calendar);
    if (byDays.size >= WINDOWS_PER_HOURS) byDays.delete(byDays.keys().next().value!);
    byDays.set(key, found);
  }
  return found;
}

/** Working time as instants, exceptions applied, merged; and the first working instant of each day. */
function workingWindows(hours: WorkingHours, calendar: ZoneCalendar): { windows: Span[]; dayFirstStarts: number[] } {
  const clock = calendar.clock;
  const firstDate = calendar.days[0]!.date;
  const lastDate = calendar.days[calendar.days.length - 1]!.date;
  const timeOff: Span[] = [];
  const extra = new Map<string, Array<[number, number]>>();
  for (const exception of hours.exceptions) {
    if (exception.kind === 'time-off') {
      timeOff.push({ start: toEpochMs(exception.start, 'time off start'), end: toEpochMs(exception.end, 'time off end') });
    } else if (exception.kind === 'days-off') {
      // holidays far from the search would each cost offset look-ups outside the cached span
      if (exception.to < firstDate || exception.from > lastDate) continue;
      timeOff.push({ start: clock.toInstant(wallMidnightOf(exception.from)), end: clock.toInstant(wallMidnightOf(exception.to) + DAY_MS) });
    } else {
      const list = extra.get(exception.date) ?? [];
      list.push([minutesOfDay(exception.start), minutesOfDay(exception.end)]);
      extra.set(exception.date, list);
    }
  }
  const away = mergeSpans(timeOff, false);
  const weekly = weeklyMinutes(hours);

  const windows: Span[] = [];
  const dayFirstStarts: number[] = [];
  calendar.days.forEach((day, index) => {
    const extraToday = extra.get(day.date);
    const intervals = extraToday ? [...weekly[day.weekday], ...extraToday] : weekly[day.weekday];
    if (intervals.length === 0) return;
    const spans: Span[] = [];
    for (const [startMinute, endMinute] of intervals) {
      const start = clock.toInstant(day.wallMidnight + startMinute * MINUTE_MS);
      const end = clock.toInstant(day.wallMidnight + endMinute * MINUTE_MS);
      if (end > start) spans.push({ start, end });
    }
    const free = subtractSpans(mergeSpans(spans, true), away);
    if (free.length === 0) return;
    // the day after the search only lends its hours to jobs starting the evening before
    if (index < calendar.searched) dayFirstStarts.push(free[0]!.start);
    for (const span of free) windows.push(span);
  });
  // touching windows join, so a job may run from one interval into the next (and past midnight)
  return { windows: mergeSpans(windows, true), dayFirstStarts };
}

/** Closed ranges [a, b] of start instants whose whole job fits a window and the notice/horizon limits. */
function startRanges(windows: Span[], durationMs: number, earliest: number, latest: number): Span[] {
  const ranges: Span[] = [];
  for (const w of windows) {
    const a = Math.max(w.start, earliest);
    const b = Math.min(w.end - durationMs, latest);
    if (b >= a) ranges.push({ start: a, end: b });
  }
  return ranges;
}

/**
 * Start instants that clash with a booking, as half-open spans, sorted and merged. A start s
 * clashes with booking B unless B.end + buffer + travel(B → customer) ≤ s, or
 * s + duration + buffer + travel(customer → B) ≤ B.start; each booking therefore forbids one
 * span of starts, and sorting those spans (O(n log n)) replaces any pairwise scan. On each day
 * the technician sets out from the base at the first working instant.
 */
function blockedStarts(technician: SlotTechnician, dayFirstStarts: number[], context: Context, earliest: number, latest: number): Span[] {
  const bufferMs = technician.hours.bufferMinutes * MINUTE_MS;
  const travelMs = (point: GeoPoint) => Math.ceil(travelMinutes(point, context.customer, context.travel) * MINUTE_MS);
  const blocked: Span[] = [];
  for (const booking of technician.bookings ?? []) {
    const start = toEpochMs(booking.start, `booking ${booking.id ?? ''} start`);
    const end = toEpochMs(booking.end, `booking ${booking.id ?? ''} end`);
    if (end < start) throw new RangeError(`booking ${booking.id ?? ''} ends before it starts`);
    // a bad location would turn the travel into NaN and silently block nothing
    assertGeoPoint(booking.location, `booking ${booking.id ?? ''} location`);
    const travel = travelMs(booking.location); // great-circle distance is the same both ways
    const lo = start - bufferMs - travel - context.durationMs + 1;
    const hi = end + bufferMs + travel;
    if (hi > earliest && lo <= latest) blocked.push({ start: lo, end: hi });
  }
  const fromBase = travelMs(technician.base);
  if (fromBase > 0) for (const first of dayFirstStarts) blocked.push({ start: first, end: first + fromBase });
  return mergeSpans(blocked, false);
}

/** Sorts and merges spans; `joinTouching` also joins [a, b) with [b, c). */
function mergeSpans(spans: Span[], joinTouching: boolean): Span[] {
  if (spans.length <= 1) return spans.slice();
  const sorted = spans.slice().sort((x, y) => x.start - y.start);
  const merged: Span[] = [{ ...sorted[0]! }];
  for (let i = 1; i < sorted.length; i++) {
    const span = sorted[i]!;
    const last = merged[merged.length - 1]!;
    if (span.start < last.end || (joinTouching && span.start === last.end)) last.end = Math.max(last.end, span.end);
    else merged.push({ ...span });
  }
  return merged;
}

/** Half-open spans minus sorted, disjoint half-open spans. */
function subtractSpans(spans: Span[], remove: Span[]): Span[] {
  if (remove.length === 0) return spans;
  const out: Span[] = [];
  for (const span of spans) {
    let cursor = span.start;
    for (let k = firstEndingAfter(remove, span.start); k < remove.length && remove[k]!.start < span.end; k++) {
      const r = remove[k]!;
      if (r.start > cursor) out.push({ start: cursor, end: r.start });
      cursor = Math.max(cursor, r.end);
    }
    if (cursor < span.end) out.push({ start: cursor, end: span.end });
  }
  return out;
}

/** Closed ranges [start, end] minus sorted, disjoint half-open spans, both in ascending order. */
function subtractFromClosed(ranges: Span[], remove: Span[]): Span[] {
  if (remove.length === 0) return ranges;
  const out: Span[] = [];
  let j = 0;
  for (const range of ranges) {
    while (j < remove.length && remove[j]!.end <= range.start) j++;
    let cursor = range.start;
    for (let k = j; k < remove.length && remove[k]!.start <= range.end; k++) {
      const r = remove[k]!;
      if (r.start > cursor) out.push({ start: cursor, end: r.start - 1 });
      cursor = Math.max(cursor, r.end);
    }
    if (cursor <= range.end) out.push({ start: cursor, end: range.end });
  }
  return out;
}

/** Index of the first span whose end is after `instant` (binary search). */
function firstEndingAfter(spans: Span[], instant: number): number {
  let lo = 0;
  let hi = spans.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (spans[mid]!.end <= instant) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/**
 * Grid points in the allowed ranges: instants whose local wall-clock time is a multiple of the
 * grid after local midnight. Where the clocks go back, the repeated wall-clock times are
 * offered once, at their first occurrence: a technician's local labels only ever increase.
 */
function gridSlots(allowed: Span[], clock: ZoneClock, context: Context): { slots: BookableSlot[]; startsMs: number[] } {
  const { gridMs } = context;
  const slots: BookableSlot[] = [];
  const startsMs: number[] = [];
  let lastWall = Number.NEGATIVE_INFINITY;
  for (const range of allowed) {
    let t = range.start;
    while (t <= range.end) {
      const change = clock.nextChangeAfter(t);
      const offset = clock.offsetAt(t);
      const segmentEnd = Math.min(range.end, change - 1);
      for (let p = Math.ceil((t + offset) / gridMs) * gridMs - offset; p <= segmentEnd; p += gridMs) {
        const wall = p + offset;
        if (wall <= lastWall) continue;
        lastWall = wall;
        startsMs.push(p);
        slots.push(slotAt(p, offset, context));
        if (slots.length >= context.maxSlots) return { slots, startsMs };
      }
      if (change > range.end) break;
      t = change;
    }
  }
  return { slots, startsMs };
}

function slotAt(start: number, offsetMs: number, context: Context): BookableSlot {
  return { start: utcText(start, context), end: utcText(start + context.durationMs, context), localStart: wallClockText(start + offsetMs, offsetMs, context) };
}

/*
 * Labels are put together from cached pieces (the date of each day, the time of day, the
 * offset) because one call writes thousands of them; a Date and toISOString per label took
 * half of the run time.
 */

/** "2026-03-29T07:00:00.000Z", as toISOString writes it. */
function utcText(ms: number, context: Context): string {
  const day = Math.floor(ms / DAY_MS);
  return dateText(day, context) + cached(context.labels.utcTimes, ms - day * DAY_MS, utcTimeText);
}

/** "2026-03-29T09:00+02:00" from wall-clock milliseconds and the offset in force. */
function wallClockText(wall: number, offsetMs: number, context: Context): string {
  const day = Math.floor(wall / DAY_MS);
  return dateText(day, context) + cached(context.labels.localTimes, wall - day * DAY_MS, localTimeText) + cached(context.labels.offsets, offsetMs, offsetText);
}

function dateText(day: number, context: Context): string {
  return cached(context.labels.dates, day, (d) => new Date(d * DAY_MS).toISOString().slice(0, 10));
}

function cached(texts: Map<number, string>, key: number, make: (key: number) => string): string {
  let text = texts.get(key);
  if (text === undefined) {
    text = make(key);
    texts.set(key, text);
  }
  return text;
}

const pad = (n: number, width = 2) => String(n).padStart(width, '0');
const utcTimeText = (ms: number) => `T${pad(Math.floor(ms / 3_600_000))}:${pad(Math.floor(ms / MINUTE_MS) % 60)}:${pad(Math.floor(ms / 1000) % 60)}.${pad(ms % 1000, 3)}Z`;
const localTimeText = (ms: number) => `T${pad(Math.floor(ms / 3_600_000))}:${pad(Math.floor(ms / MINUTE_MS) % 60)}`;
const offsetText = (offsetMs: number) => {
  const minutes = Math.round(Math.abs(offsetMs) / MINUTE_MS);
  return `${offsetMs < 0 ? '-' : '+'}${pad(Math.floor(minutes / 60))}:${pad(minutes % 60)}`;
};
