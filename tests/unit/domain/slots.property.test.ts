// Property tests of the slot engine (fast-check). The oracle reads local times from the IANA
// time-zone database through Node's Intl, one 5-minute cell at a time, independently of the
// engine's luxon-based arithmetic.
import { afterEach, describe, expect, it, vi } from 'vitest';
import fc from 'fast-check';
import { readFileSync, readdirSync } from 'node:fs';
import path from 'node:path';
import { Settings } from 'luxon';
import { computeSlots, type SlotQuery, type SlotResult } from '../../../packages/domain/src/slots';
import { travelMinutes, type GeoPoint } from '../../../packages/domain/src/geo';
import { WEEKDAYS, WorkingHoursSchema, minutesOfDay, type Weekday, type WorkingHours } from '../../../packages/domain/src/schemas/hours';

const MINUTE = 60_000;
const CELL = 5 * MINUTE;
const DAY = 86_400_000;
const RUNS = 200;
/** Generous: the runs take a second or two, more on a busy CI machine. */
const TIMEOUT = 60_000;

// Zones with different rules: EU (01:00 UTC), North America (02:00 local), a 30-minute shift
// (Lord Howe), the southern hemisphere, a :45 offset without summer time, and UTC.
const ZONES = ['Europe/Berlin', 'Europe/London', 'Europe/Helsinki', 'America/New_York', 'Australia/Lord_Howe', 'Pacific/Auckland', 'Asia/Kathmandu', 'UTC'];
// Days around the 2026 changes in those zones (IANA tz database), to be sure the runs cross them.
const CHANGE_DATES = ['2026-03-29', '2026-10-25', '2026-03-08', '2026-11-01', '2026-04-05', '2026-09-27', '2026-10-04'];
const ALL_MARKS = Array.from({ length: 289 }, (_, i) => i * 5);
// On those dates interval boundaries avoid 01:00–03:55, where the clocks may go back: the oracle
// reads "inside working hours" off the local labels, which does not say which of the two
// occurrences of a repeated time a boundary means (the unit tests pin the first).
const MARKS = ALL_MARKS.filter((m) => m < 60 || m >= 240);
// Searches next to a spring-forward gap or a skipped day, whose boundaries fall anywhere, mostly on
// and around the gap's ends. Inside a gap no 5-minute instant carries the local time, so the
// oracle's reading of the labels is the rule "hours are clipped to the instants that exist". Local
// gaps [from, to) in minutes: IANA tz database 2025c as reported by Intl in Node 20.20.2 (ICU 78.2),
// checked in slots-clock-gaps.test.ts; the skipped days are gaps of a whole day.
const GAPS = [
  { zone: 'Europe/Berlin', date: '2026-03-29', from: 120, to: 180 },
  { zone: 'Europe/London', date: '2026-03-29', from: 60, to: 120 },
  { zone: 'Europe/Helsinki', date: '2026-03-29', from: 180, to: 240 },
  { zone: 'America/New_York', date: '2026-03-08', from: 120, to: 180 },
  { zone: 'Australia/Lord_Howe', date: '2026-10-04', from: 120, to: 150 },
  { zone: 'Pacific/Auckland', date: '2026-09-27', from: 120, to: 180 },
  { zone: 'Pacific/Apia', date: '2011-12-30', from: 0, to: 1440 },
  { zone: 'Pacific/Kiritimati', date: '1994-12-31', from: 0, to: 1440 },
  { zone: 'Pacific/Kwajalein', date: '1993-08-21', from: 0, to: 1440 },
];
const gapEnds = (g: (typeof GAPS)[number]) => [...new Set([g.from - 5, g.from, g.from + 5, Math.round((g.from + g.to) / 10) * 5, g.to - 5, g.to, g.to + 5])].filter((m) => m >= 0 && m <= 1440);
const hhmm = (m: number) => `${String(Math.floor(m / 60)).padStart(2, '0')}:${String(m % 60).padStart(2, '0')}`;

// ---------------------------------------------------------------- the oracle (Intl, per cell)
interface Local {
  date: string;
  minute: number;
  weekday: Weekday;
  wall: number;
}
const formats = new Map<string, Intl.DateTimeFormat>();
const locals = new Map<string, Local>();
function local(instant: number, zone: string): Local {
  const key = `${zone}|${instant}`;
  const hit = locals.get(key);
  if (hit) return hit;
  let f = formats.get(zone);
  if (!f) {
    f = new Intl.DateTimeFormat('en-GB', { timeZone: zone, year: 'numeric', month: '2-digit', day: '2-digit', hour: '2-digit', minute: '2-digit', hourCycle: 'h23' });
    formats.set(zone, f);
  }
  const p = Object.fromEntries(f.formatToParts(new Date(instant)).map((x) => [x.type, x.value]));
  const midnight = Date.UTC(Number(p.year), Number(p.month) - 1, Number(p.day));
  const minute = Number(p.hour) * 60 + Number(p.minute);
  const result: Local = { date: `${p.year}-${p.month}-${p.day}`, minute, weekday: WEEKDAYS[(new Date(midnight).getUTCDay() + 6) % 7]!, wall: midnight + minute * MINUTE };
  locals.set(key, result);
  return result;
}
const addDays = (date: string, n: number) => new Date(Date.parse(`${date}T00:00:00Z`) + n * DAY).toISOString().slice(0, 10);

/** Is the technician working (and not away) during the 5-minute cell starting at `cell`? */
function working(cell: number, hours: WorkingHours): boolean {
  const l = local(cell, hours.timeZone);
  const intervals = [...hours.weekly[l.weekday], ...hours.exceptions.flatMap((e) => (e.kind === 'extra-hours' && e.date === l.date ? [e] : []))];
  if (!intervals.some((i) => minutesOfDay(i.start) <= l.minute && l.minute < minutesOfDay(i.end))) return false;
  for (const e of hours.exceptions) {
    if (e.kind === 'days-off' && e.from <= l.date && l.date <= e.to) return false;
    if (e.kind === 'time-off' && cell < Date.parse(e.end) && cell + CELL > Date.parse(e.start)) return false;
  }
  return true;
}

const travelMs = (from: GeoPoint, q: SlotQuery) => Math.ceil(travelMinutes(from, q.customer, { roadFactor: 1.3, averageSpeedKmh: 60, ...q.travel }) * MINUTE);

/** Booking, buffer and travel both ways leave room for a job [s, s + duration). */
function clearOfBookings(s: number, q: SlotQuery): boolean {
  const t = q.technicians[0]!;
  const e = s + q.durationMinutes * MINUTE;
  const buffer = t.hours.bufferMinutes * MINUTE;
  return (t.bookings ?? []).every((b) => {
    const travel = travelMs(b.location, q);
    return Date.parse(b.end as string) + buffer + travel <= s || e + buffer + travel <= Date.parse(b.start as string);
  });
}

/** Every rule but the bookings: search days, notice, horizon, grid, the whole job at work. */
function insideHours(s: number, q: SlotQuery): boolean {
  const hours = q.technicians[0]!.hours;
  const zone = hours.timeZone;
  const from = q.from as number;
  const l = local(s, zone);
  if (s < from || s < (q.now as number) + hours.minimumNoticeMinutes * MINUTE) return false;
  if (l.date >= addDays(local(from, zone).date, q.days) || l.date > addDays(local(q.now as number, zone).date, hours.bookingHorizonDays)) return false;
  if (l.minute % (q.gridMinutes ?? 15) !== 0) return false;
  for (let cell = s; cell < s + q.durationMinutes * MINUTE; cell += CELL) if (!working(cell, hours)) return false;
  return true;
}

/** Brute force: every 5-minute instant of the search, kept when all rules hold. */
function oracle(q: SlotQuery): number[] {
  const t = q.technicians[0]!;
  const zone = t.hours.timeZone;
  const from = q.from as number;
  const fromDate = local(from, zone).date;
  const lastDate = addDays(fromDate, q.days - 1);
  const scanStart = Math.floor((from - 2 * DAY) / CELL) * CELL;
  const scanEnd = from + (q.days + 2) * DAY;
  // the day starts at the base at its first working instant
  const firstOfDay = new Map<string, number>();
  for (let cell = scanStart; cell < scanEnd; cell += CELL) {
    const date = local(cell, zone).date;
    if (date >= fromDate && date <= lastDate && !firstOfDay.has(date) && working(cell, t.hours)) firstOfDay.set(date, cell);
  }
  const fromBase = travelMs(t.base, q);
  const kept: number[] = [];
  let lastWall = -Infinity;
  for (let s = Math.ceil(from / CELL) * CELL; s < scanEnd; s += CELL) {
    if (!insideHours(s, q) || !clearOfBookings(s, q)) continue;
    if ([...firstOfDay.values()].some((first) => first <= s && s < first + fromBase)) continue;
    const wall = local(s, zone).wall; // a wall-clock time repeated when clocks go back is offered once
    if (wall <= lastWall) continue;
    lastWall = wall;
    kept.push(s);
  }
  return kept;
}

// ---------------------------------------------------------------- generators
const nearAlps = fc.record({ lat: fc.double({ min: 46.5, max: 48.5, noNaN: true }), lng: fc.double({ min: 10.5, max: 13.5, noNaN: true }) });
const intervalsOf = (mark: fc.Arbitrary<number>, minLength: number) => fc.uniqueArray(mark, { minLength, maxLength: 6 }).map((marks) => {
  const sorted = [...marks].sort((a, b) => a - b);
  const out: Array<{ start: string; end: string }> = [];
  for (let i = 0; i + 1 < sorted.length; i += 2) out.push({ start: hhmm(sorted[i]!), end: hhmm(sorted[i + 1]!) });
  return out;
});
// mostly working days, some days off
const intervalsFrom = (mark: fc.Arbitrary<number>) => fc.oneof({ arbitrary: intervalsOf(mark, 2), weight: 3 }, { arbitrary: intervalsOf(mark, 0), weight: 1 });
const startDate = fc.oneof(fc.constantFrom(...CHANGE_DATES), fc.integer({ min: 0, max: 364 }).map((d) => addDays('2026-01-01', d)));

const ordinary = fc.record({ zone: fc.constantFrom(...ZONES), date: startDate, intervals: fc.constant(intervalsFrom(fc.constantFrom(...MARKS))) });
// the search starts on the gap's date or the day before, so its one to three days mostly reach it
const nearGap = fc.constantFrom(...GAPS).chain((g) =>
  fc.record({
    zone: fc.constant(g.zone),
    date: fc.integer({ min: -1, max: 0 }).map((d) => addDays(g.date, d)),
    intervals: fc.constant(intervalsFrom(fc.oneof({ arbitrary: fc.constantFrom(...gapEnds(g)), weight: 2 }, { arbitrary: fc.constantFrom(...ALL_MARKS), weight: 1 }))),
  }),
);

const queries = fc
  .oneof(ordinary, nearGap)
  .chain(({ zone, date, intervals }) => fc.record({
    zone: fc.constant(zone),
    date: fc.constant(date),
    fromCells: fc.integer({ min: -14 * 12, max: 24 * 12 }),
    nowCells: fc.integer({ min: -576, max: 36 }),
    days: fc.integer({ min: 1, max: 3 }),
    weekly: fc.tuple(intervals, intervals, intervals, intervals, intervals, intervals, intervals),
    timeOff: fc.array(fc.record({ at: fc.integer({ min: -288, max: 4 * 288 }), cells: fc.integer({ min: 1, max: 144 }) }), { maxLength: 3 }),
    daysOff: fc.array(fc.record({ at: fc.integer({ min: -1, max: 3 }), length: fc.integer({ min: 0, max: 1 }) }), { maxLength: 1 }),
    extra: fc.uniqueArray(fc.record({ at: fc.integer({ min: -1, max: 3 }), hours: intervals.filter((i) => i.length > 0).map((i) => i[0]!) }), { maxLength: 2, selector: (e) => e.at }),
    bookings: fc.array(fc.record({ at: fc.integer({ min: -288, max: 4 * 288 }), cells: fc.integer({ min: 3, max: 48 }), location: nearAlps }), { maxLength: 8 }),
    durationMinutes: fc.integer({ min: 1, max: 36 }).map((n) => n * 5),
    gridMinutes: fc.constantFrom(5, 10, 15, 20, 30, 60),
    bufferMinutes: fc.integer({ min: 0, max: 12 }).map((n) => n * 5),
    noticeMinutes: fc.integer({ min: 0, max: 48 }).map((n) => n * 5),
    horizonDays: fc.integer({ min: 1, max: 5 }),
    roadFactor: fc.double({ min: 1, max: 2, noNaN: true }),
    speed: fc.integer({ min: 20, max: 120 }),
    customer: nearAlps,
    base: nearAlps,
    baseAtCustomer: fc.boolean(),
  }))
  .map((g): SlotQuery => {
    const day0 = Date.parse(`${g.date}T00:00:00Z`);
    const from = day0 + g.fromCells * CELL;
    const hours = WorkingHoursSchema.parse({
      timeZone: g.zone,
      weekly: Object.fromEntries(WEEKDAYS.map((d, i) => [d, g.weekly[i]])),
      exceptions: [
        ...g.timeOff.map((t) => ({ kind: 'time-off', start: new Date(day0 + t.at * CELL).toISOString(), end: new Date(day0 + (t.at + t.cells) * CELL).toISOString() })),
        ...g.daysOff.map((d) => ({ kind: 'days-off', from: addDays(g.date, d.at), to: addDays(g.date, d.at + d.length) })),
        ...g.extra.map((e) => ({ kind: 'extra-hours', date: addDays(g.date, e.at), ...e.hours })),
      ],
      minimumNoticeMinutes: g.noticeMinutes,
      bookingHorizonDays: g.horizonDays,
      bufferMinutes: g.bufferMinutes,
    });
    return {
      technicians: [
        {
          id: 'tech',
          hours,
          base: g.baseAtCustomer ? g.customer : g.base,
          bookings: g.bookings.map((b, i) => ({ id: `b${i}`, start: new Date(day0 + b.at * CELL).toISOString(), end: new Date(day0 + (b.at + b.cells) * CELL).toISOString(), location: b.location })),
        },
      ],
      durationMinutes: g.durationMinutes,
      gridMinutes: g.gridMinutes,
      customer: g.customer,
      now: from + g.nowCells * CELL,
      from,
      days: g.days,
      travel: { roadFactor: g.roadFactor, averageSpeedKmh: g.speed },
    };
  });

const startsOf = (r: SlotResult) => r.technicians[0]!.slots.map((s) => Date.parse(s.start));

// ---------------------------------------------------------------- properties
describe('slot engine properties (fast-check, oracle: IANA tz database via Intl)', () => {
  afterEach(() => {
    vi.restoreAllMocks();
    Settings.defaultZone = 'system';
  });

  it('no slot overlaps a booking, its buffer or the drive to or from it', () => {
    fc.assert(
      fc.property(queries, (q) => {
        for (const s of startsOf(computeSlots(q))) expect(clearOfBookings(s, q), new Date(s).toISOString()).toBe(true);
      }),
      { numRuns: RUNS },
    );
  }, TIMEOUT);

  it('every slot lies wholly inside working hours and outside exceptions, on the local grid, within notice, horizon and the searched days', () => {
    fc.assert(
      fc.property(queries, (q) => {
        const result = computeSlots(q);
        const zone = q.technicians[0]!.hours.timeZone;
        for (const slot of result.technicians[0]!.slots) {
          const s = Date.parse(slot.start);
          expect(insideHours(s, q), slot.start).toBe(true);
          expect(Date.parse(slot.end) - s).toBe(q.durationMinutes * MINUTE);
          // the local label is the one Intl shows
          const l = local(s, zone);
          expect(slot.localStart.slice(0, 16)).toBe(`${l.date}T${hhmm(l.minute)}`);
        }
      }),
      { numRuns: RUNS },
    );
  }, TIMEOUT);

  it('finds exactly the starts a brute-force search over every 5-minute instant finds', () => {
    fc.assert(
      fc.property(queries, (q) => {
        expect(startsOf(computeSlots(q)).map((t) => new Date(t).toISOString())).toEqual(oracle(q).map((t) => new Date(t).toISOString()));
      }),
      { numRuns: RUNS },
    );
  }, TIMEOUT);

  it('with maxSlotsPerTechnician = k, gives the first k of the oracle\'s starts and nothing else', () => {
    fc.assert(
      fc.property(queries, fc.integer({ min: 1, max: 4 }), (q, k) => {
        const limited = computeSlots({ ...q, maxSlotsPerTechnician: k });
        const expected = oracle(q).slice(0, k).map((t) => new Date(t).toISOString());
        expect(startsOf(limited).map((t) => new Date(t).toISOString())).toEqual(expected);
        expect(limited.organisation.map((s) => s.start)).toEqual(expected);
      }),
      { numRuns: RUNS },
    );
  }, TIMEOUT);

  it('gives the same slots for a working-hours object used before, for other days and places, as for a fresh copy of it', () => {
    fc.assert(
      fc.property(queries, queries, (q1, q2) => {
        // q2 with q1's hours object, after q1 has run with it (the engine keeps windows per hours object)
        const shared = q1.technicians[0]!.hours;
        computeSlots(q1);
        const reused = computeSlots({ ...q2, technicians: [{ ...q2.technicians[0]!, hours: shared }] });
        const fresh = computeSlots({ ...q2, technicians: [{ ...q2.technicians[0]!, hours: structuredClone(shared) }] });
        expect(reused).toEqual(fresh);
        // and the same days again, at another place
        const again = computeSlots({ ...q1, customer: q2.customer });
        expect(again).toEqual(computeSlots({ ...q1, customer: q2.customer, technicians: [{ ...q1.technicians[0]!, hours: structuredClone(shared) }] }));
      }),
      { numRuns: RUNS },
    );
  }, TIMEOUT);

  it('the organisation view is the union of the technicians, each start naming exactly those free for it', () => {
    fc.assert(
      fc.property(queries, queries, (q1, q2) => {
        const second = { ...q2.technicians[0]!, id: 'tech-2' };
        const result = computeSlots({ ...q1, technicians: [q1.technicians[0]!, second] });
        const own = result.technicians.map((t) => new Set(t.slots.map((s) => s.start)));
        const all = [...new Set([...own[0]!, ...own[1]!])].sort();
        expect(result.organisation.map((s) => s.start)).toEqual(all);
        for (const s of result.organisation) expect(s.technicianIds).toEqual(['tech', 'tech-2'].filter((_, i) => own[i]!.has(s.start)));
      }),
      { numRuns: RUNS },
    );
  }, TIMEOUT);

  it("does not depend on the machine's time zone: same result whatever luxon's default zone, and no local-time Date methods or clock reads", () => {
    const localMethods = ['getFullYear', 'getMonth', 'getDate', 'getDay', 'getHours', 'getMinutes', 'getSeconds', 'getTimezoneOffset', 'toString', 'toDateString', 'toTimeString', 'toLocaleString', 'toLocaleDateString', 'toLocaleTimeString'] as const;
    const spies = localMethods.map((m) => vi.spyOn(Date.prototype, m));
    const clock = vi.spyOn(Date, 'now');
    fc.assert(
      fc.property(queries, (q) => {
        for (const spy of [...spies, clock]) spy.mockClear();
        const results = ['UTC', 'Pacific/Auckland', 'America/Los_Angeles', 'Asia/Kathmandu'].map((zone) => {
          Settings.defaultZone = zone;
          return computeSlots(q);
        });
        Settings.defaultZone = 'system';
        // checked before expect() runs, which may read the clock itself
        const called = [...localMethods, 'Date.now'].filter((_, i) => (i < spies.length ? spies[i]! : clock).mock.calls.length > 0);
        expect(called).toEqual([]);
        for (const r of results.slice(1)) expect(r).toEqual(results[0]);
      }),
      { numRuns: RUNS },
    );
  }, TIMEOUT);

  it('the engine sources use no local-time Date API and never read the clock', () => {
    const root = path.resolve(__dirname, '../../../packages/domain/src');
    const files = ['slots', 'geo'].flatMap((dir) => readdirSync(path.join(root, dir)).map((f) => path.join(root, dir, f)));
    files.push(path.join(root, 'schemas/hours.ts'));
    for (const file of files) {
      const source = readFileSync(file, 'utf8');
      expect(source, file).not.toMatch(/\.(getFullYear|getMonth|getDate|getDay|getHours|getMinutes|getTimezoneOffset|setHours|setDate|toLocale\w*String)\(|Date\.now\(|new Date\(\)|DateTime\.(now|local)\(/);
    }
  });
});
