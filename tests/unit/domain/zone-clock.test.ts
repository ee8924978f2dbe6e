// The zone clock's offsets against Node's Intl reading of the IANA time-zone database, which is
// independent of luxon: the year tables are shared between clocks, so spans that cross a UTC
// new year, start on a change or sit inside one year must all read the same offsets as Intl.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { ZoneClock } from '../../../packages/domain/src/slots/zone-clock';

const HOUR = 3_600_000;
const DAY = 24 * HOUR;

/** UTC offset in ms at an instant, from Intl's "longOffset" name (GMT+05:45, GMT-03:00, GMT). */
function intlOffset(zone: string, instant: number): number {
  const name = new Intl.DateTimeFormat('en-US', { timeZone: zone, timeZoneName: 'longOffset' }).formatToParts(new Date(instant)).find((p) => p.type === 'timeZoneName')!.value;
  const m = /GMT(?:([+-])(\d{2}):(\d{2}))?/.exec(name)!;
  if (!m[1]) return 0;
  return (m[1] === '-' ? -1 : 1) * (Number(m[2]) * 60 + Number(m[3])) * 60_000;
}

// EU rules, southern hemisphere (summer time across the new year), a 30-minute shift, a :45 offset
const ZONES = ['Europe/Berlin', 'Europe/Helsinki', 'Pacific/Auckland', 'Australia/Lord_Howe', 'Asia/Kathmandu', 'America/Sao_Paulo'];

describe('ZoneClock offsets from the shared year tables', () => {
  it('reads the same offset as Intl at random instants of spans from late 2026 past the spring 2027 changes', () => {
    fc.assert(
      fc.property(fc.constantFrom(...ZONES), fc.integer({ min: 0, max: 60 }), fc.integer({ min: 100, max: 160 }), fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { minLength: 5, maxLength: 20 }), (zone, startDay, spanDays, points) => {
        const spanStart = Date.UTC(2026, 10, 15) + startDay * DAY + 7 * HOUR;
        const spanEnd = spanStart + spanDays * DAY;
        const clock = new ZoneClock(zone, spanStart, spanEnd);
        for (const p of points) {
          const t = Math.floor((spanStart + p * (spanEnd - spanStart)) / 1000) * 1000;
          expect(clock.offsetAt(t), `${zone} at ${new Date(t).toISOString()}`).toBe(intlOffset(zone, t));
        }
      }),
      { numRuns: 150 },
    );
  });

  it('puts each change on its second: Berlin 2026-03-29 01:00 UTC and 2026-10-25 01:00 UTC (EU rule, IANA tz database)', () => {
    // a clock over the autumn first, so the spring one reads a year table made by another clock
    new ZoneClock('Europe/Berlin', Date.UTC(2026, 9, 20), Date.UTC(2026, 9, 30));
    const clock = new ZoneClock('Europe/Berlin', Date.UTC(2026, 2, 28), Date.UTC(2026, 10, 1));
    const spring = Date.UTC(2026, 2, 29, 1);
    const autumn = Date.UTC(2026, 9, 25, 1);
    expect(clock.offsetAt(spring - 1000)).toBe(HOUR);
    expect(clock.offsetAt(spring)).toBe(2 * HOUR);
    expect(clock.offsetAt(autumn - 1000)).toBe(2 * HOUR);
    expect(clock.offsetAt(autumn)).toBe(HOUR);
    expect(clock.nextChangeAfter(Date.UTC(2026, 2, 28))).toBe(spring);
    expect(clock.nextChangeAfter(spring)).toBe(autumn);
    expect(clock.nextChangeAfter(autumn)).toBe(Number.POSITIVE_INFINITY);
  });

  it('starts a span that begins on a change with the new offset, and one across the new year with the old', () => {
    const spring = Date.UTC(2026, 2, 29, 1);
    expect(new ZoneClock('Europe/Berlin', spring, spring + DAY).offsetAt(spring)).toBe(2 * HOUR);
    // Auckland keeps summer time (+13:00) over the new year
    const clock = new ZoneClock('Pacific/Auckland', Date.UTC(2026, 11, 30), Date.UTC(2027, 0, 3));
    expect(clock.offsetAt(Date.UTC(2027, 0, 1))).toBe(13 * HOUR);
    expect(clock.nextChangeAfter(Date.UTC(2026, 11, 30))).toBe(Number.POSITIVE_INFINITY);
  });

  it('reads a wall-clock time in a gap as the instant of the jump, inside the span and outside it (Berlin 2026-03-29, Apia 2011-12-30; IANA tz database via Intl, Node 20)', () => {
    const jump = Date.UTC(2026, 2, 29, 1);
    const wall = (h: number, m: number) => Date.UTC(2026, 2, 29, h, m);
    const inside = new ZoneClock('Europe/Berlin', Date.UTC(2026, 2, 27), Date.UTC(2026, 2, 31));
    // outside the span the offsets come from luxon and the jump is found by bisection
    const outside = new ZoneClock('Europe/Berlin', Date.UTC(2026, 4, 1), Date.UTC(2026, 4, 3));
    for (const clock of [inside, outside]) {
      expect([wall(2, 0), wall(2, 5), wall(2, 30), wall(2, 55)].map((w) => clock.toInstant(w))).toEqual([jump, jump, jump, jump]);
      expect(clock.toInstant(wall(1, 55))).toBe(jump - 5 * 60_000);
      expect(clock.toInstant(wall(3, 0))).toBe(jump);
    }
    const apia = new ZoneClock('Pacific/Apia', Date.UTC(2011, 11, 28), Date.UTC(2012, 0, 2));
    const skipped = Date.UTC(2011, 11, 30, 10);
    expect([0, 9, 23].map((h) => apia.toInstant(Date.UTC(2011, 11, 30, h)))).toEqual([skipped, skipped, skipped]);
    expect(apia.toInstant(Date.UTC(2011, 11, 31))).toBe(skipped);
  });

  it('refuses an unknown zone', () => {
    expect(() => new ZoneClock('Mars/Olympus', 0, DAY)).toThrow(/unknown time zone/);
  });
});
