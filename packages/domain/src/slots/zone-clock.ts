// Wall-clock ↔ instant arithmetic in one IANA zone, with the zone's UTC offsets (from luxon) cached for a span.
import { IANAZone } from 'luxon';

const MINUTE_MS = 60_000;
const DAY_MS = 86_400_000;
/** Offsets are sampled this far apart: assumes no zone changes its offset twice within twelve hours (true of the tz database's current rules, from memory). */
const SAMPLE_MS = 12 * 3_600_000;
/** The time-zone database states changes in whole seconds (and luxon reads offsets per second). */
const SECOND_MS = 1000;

/**
 * Local times are handled as "wall-clock milliseconds": the local date and time read as if they
 * were UTC (Date.UTC(y, m - 1, d, h, min)). Asking luxon for an offset costs microseconds, so
 * the offsets in force over [spanStart, spanEnd] are found once (each change located to the
 * second) and then looked up; outside the span luxon is asked directly.
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
    let t = spanStart;
    let offset = this.luxonOffset(t);
    this.starts.push(t);
    this.offsets.push(offset);
    while (t < spanEnd) {
      const next = Math.min(t + SAMPLE_MS, spanEnd);
      const nextOffset = this.luxonOffset(next);
      if (nextOffset === offset) {
        t = next;
        continue;
      }
      // the offset changed in (t, next]: find the first second of the new offset
      let lo = t;
      let hi = next;
      while (hi - lo > SECOND_MS) {
        const mid = Math.max(lo + SECOND_MS, Math.floor((lo + hi) / 2 / SECOND_MS) * SECOND_MS);
        if (this.luxonOffset(mid) === offset) lo = mid;
        else hi = mid;
      }
      t = hi;
      offset = this.luxonOffset(hi);
      this.starts.push(hi);
      this.offsets.push(offset);
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
   * occurrence; a time that does not exist (clocks go forward) is read with the offset before
   * the gap, which lands as far after the gap as it was into it — as RFC 5545 §3.3.5 reads
   * local times (from memory).
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
    return first; // in the gap
  }

  private luxonOffset(instant: number): number {
    return Math.round(this.zone.offset(instant) * MINUTE_MS);
  }
}
