// Wall-clock ↔ instant arithmetic in one IANA zone, with the zone's UTC offsets (from luxon) cached for a span.
import { IANAZone } from 'luxon';

const MINUTE_MS = 60_000;
const DAY_MS = 86_400_000;
/** Offsets are sampled this far apart: assumes no zone changes its offset twice within twelve hours (true of the tz database's current rules, from memory). */
const SAMPLE_MS = 12 * 3_600_000;
/** The time-zone database states changes in whole seconds (and luxon reads offsets per second). */
const SECOND_MS = 1000;

/** Offsets in force over one UTC calendar year of one zone: starts[0] is the year's first instant. */
interface YearTable {
  starts: number[];
  offsets: number[];
}

/**
 * The offset changes of a zone are the same for every search, so they are found once per zone and
 * UTC year (about 730 questions to luxon and a bisection per change) and kept: a year table is a
 * few numbers, and a zone has a handful of years in use. The oldest go first beyond the limit.
 */
const yearTables = new Map<string, YearTable>();
const YEAR_TABLES_MAX = 2000;

const luxonOffset = (zone: IANAZone, instant: number) => Math.round(zone.offset(instant) * MINUTE_MS);

/** Samples [from, to] every SAMPLE_MS and locates each change to the second. */
function offsetTable(zone: IANAZone, from: number, to: number): YearTable {
  const starts = [from];
  let offset = luxonOffset(zone, from);
  const offsets = [offset];
  let t = from;
  while (t < to) {
    const next = Math.min(t + SAMPLE_MS, to);
    const nextOffset = luxonOffset(zone, next);
    if (nextOffset === offset) {
      t = next;
      continue;
    }
    t = firstSecondOfChange((instant) => luxonOffset(zone, instant), t, next);
    offset = luxonOffset(zone, t);
    starts.push(t);
    offsets.push(offset);
  }
  return { starts, offsets };
}

/** The first second in (lo, hi] whose offset differs from lo's, lo and hi being whole seconds with different offsets (bisection). */
function firstSecondOfChange(offsetOf: (instant: number) => number, lo: number, hi: number): number {
  const offset = offsetOf(lo);
  while (hi - lo > SECOND_MS) {
    const mid = Math.max(lo + SECOND_MS, Math.floor((lo + hi) / 2 / SECOND_MS) * SECOND_MS);
    if (offsetOf(mid) === offset) lo = mid;
    else hi = mid;
  }
  return hi;
}

function yearTable(zone: IANAZone, year: number): YearTable {
  const key = `${zone.name}|${year}`;
  let table = yearTables.get(key);
  if (!table) {
    table = offsetTable(zone, Date.UTC(year, 0, 1), Date.UTC(year + 1, 0, 1));
    if (yearTables.size >= YEAR_TABLES_MAX) yearTables.delete(yearTables.keys().next().value!);
    yearTables.set(key, table);
  }
  return table;
}

/**
 * Local times are handled as "wall-clock milliseconds": the local date and time read as if they
 * were UTC (Date.UTC(y, m - 1, d, h, min)). Asking luxon for an offset costs microseconds, so
 * the offsets in force over [spanStart, spanEnd] are taken from the zone's year tables (each
 * change located to the second) and then looked up; outside the span luxon is asked directly.
 */
export class ZoneClock {
  private readonly zone: IANAZone;
  /** Instants from which `offsets[i]` is in force; starts[0] is the span start. */
  private readonly starts: number[] = [];
  private readonly offsets: number[] = [];

  constructor(
    readonly name: string,
    private readonly spanStart: number,
    private readonly spanEnd: number,
  ) {
    const zone = IANAZone.create(name);
    if (!zone.isValid) throw new RangeError(`unknown time zone "${name}"`);
    this.zone = zone;
    const firstYear = new Date(spanStart).getUTCFullYear();
    const lastYear = new Date(spanEnd).getUTCFullYear();
    for (let year = firstYear; year <= lastYear; year++) {
      const table = yearTable(zone, year);
      table.starts.forEach((start, i) => {
        const offset = table.offsets[i]!;
        if (start > spanEnd) return;
        if (start <= spanStart) {
          // the offset in force at the span's start is the last one that began at or before it
          this.starts[0] = spanStart;
          this.offsets[0] = offset;
        } else if (this.offsets.at(-1) !== offset) {
          this.starts.push(start);
          this.offsets.push(offset);
        }
      });
    }
  }

  /** UTC offset in milliseconds in force at the instant. */
  offsetAt(instant: number): number {
    if (instant < this.spanStart || instant > this.spanEnd) return this.luxonOffset(instant);
    let i = this.starts.length - 1;
    while (this.starts[i]! > instant) i--;
    return this.offsets[i]!;
  }

  /** The first instant after `instant` at which the offset changes within the span, or Infinity. */
  nextChangeAfter(instant: number): number {
    for (const s of this.starts) if (s > instant) return s;
    return Number.POSITIVE_INFINITY;
  }

  /** Wall-clock milliseconds of an instant. */
  toWallClock(instant: number): number {
    return instant + this.offsetAt(instant);
  }

  /**
   * The instant of a wall-clock time. A time that occurs twice (clocks go back) means its first
   * occurrence. A time that does not exist (clocks go forward, or a whole skipped day) means the
   * instant of the jump: the first real instant after the gap, which is also where the time
   * before the gap ends. So a span of wall-clock times keeps exactly the real instants inside it,
   * rather than being shifted by the gap as RFC 5545 §3.3.5 reads such times (with the offset
   * before the gap), which would put working time outside the hours and move a skipped day's
   * hours onto the next day.
   */
  toInstant(wallClock: number): number {
    // any real offset is within ±1 day, so these two offsets bracket the one sought
    const before = this.offsetAt(wallClock - DAY_MS);
    const after = this.offsetAt(wallClock + DAY_MS);
    const first = wallClock - before;
    if (this.offsetAt(first) === before) {
      if (before === after) return first;
      const second = wallClock - after;
      return this.offsetAt(second) === after ? Math.min(first, second) : first;
    }
    const second = wallClock - after;
    if (this.offsetAt(second) === after) return second;
    // in the gap: the offset changes in (second, first]
    const change = this.nextChangeAfter(second);
    if (second >= this.spanStart && change <= first) return change;
    return firstSecondOfChange((instant) => this.offsetAt(instant), second, first);
  }

  private luxonOffset(instant: number): number {
    return luxonOffset(this.zone, instant);
  }
}
