// Unit checks of the slot engine (travel, buffer, notice, horizon, exceptions, union) and of the
// working-hours schema. Expected times are worked out here from the rules, not taken from the code.
import { describe, expect, it } from 'vitest';
import { computeSlots, type SlotQuery, type SlotTechnician } from '../../../packages/domain/src/slots';
import { JobDurationMinutesSchema, WorkingHoursSchema, type WorkingHours, type WorkingHoursDraft } from '../../../packages/domain/src/schemas/hours';

const MINUTE = 60_000;
const INNSBRUCK = { lat: 47.2692, lng: 11.4041 };
const MUNICH = { lat: 48.1351, lng: 11.582 };

/** Haversine with the IUGG mean radius R1 = 6 371 008.8 m (IUGG; Moritz, "Geodetic Reference System 1980", Bulletin Géodésique 54, 1980), written out here. */
function sphereKm(a: { lat: number; lng: number }, b: { lat: number; lng: number }): number {
  const r = Math.PI / 180;
  const h = Math.sin(((b.lat - a.lat) * r) / 2) ** 2 + Math.cos(a.lat * r) * Math.cos(b.lat * r) * Math.sin(((b.lng - a.lng) * r) / 2) ** 2;
  return (2 * 6_371_008.8 * Math.asin(Math.sqrt(h))) / 1000;
}

const everyDay = (start: string, end: string) => {
  const i = [{ start, end }];
  return { monday: i, tuesday: i, wednesday: i, thursday: i, friday: i, saturday: i, sunday: i };
};

function hours(draft: Partial<WorkingHoursDraft> = {}): WorkingHours {
  return WorkingHoursSchema.parse({ timeZone: 'Europe/Berlin', weekly: everyDay('07:00', '19:00'), minimumNoticeMinutes: 0, bookingHorizonDays: 365, bufferMinutes: 0, ...draft });
}

function technician(overrides: Partial<SlotTechnician> = {}): SlotTechnician {
  return { id: 'tech-a', hours: hours(), base: INNSBRUCK, bookings: [], ...overrides };
}

// Wednesday 13 May 2026; Berlin is on UTC+2 (summer time, Directive 2000/84/EC), so local quarter
// hours are UTC quarter hours and "T..+02:00" strings below are the local times.
function query(overrides: Partial<SlotQuery> = {}): SlotQuery {
  return {
    technicians: [technician()],
    durationMinutes: 60,
    customer: INNSBRUCK,
    now: '2026-05-01T00:00:00Z',
    from: '2026-05-13T00:00:00+02:00',
    days: 1,
    ...overrides,
  };
}

const starts = (q: SlotQuery, i = 0) => computeSlots(q).technicians[i]!.slots.map((s) => Date.parse(s.start));
const at = (local: string) => Date.parse(`2026-05-13T${local}:00+02:00`);
const ceilTo = (t: number, step: number) => Math.ceil(t / step) * step;
const floorTo = (t: number, step: number) => Math.floor(t / step) * step;
const quarterHoursBetween = (first: number, last: number) => Array.from({ length: (last - first) / (15 * MINUTE) + 1 }, (_, i) => first + i * 15 * MINUTE);

describe('travel between jobs (road factor 1.3, 60 km/h: common practice, no source)', () => {
  const munichBooking = { id: 'b1', start: '2026-05-13T11:00:00+02:00', end: '2026-05-13T12:00:00+02:00', location: MUNICH };
  const buffer = 10;
  // our own arithmetic: great-circle km × 1.3 ÷ 60 km/h
  const travelMs = ((sphereKm(MUNICH, INNSBRUCK) * 1.3) / 60) * 60 * MINUTE;

  it('Munich to Innsbruck is about 97 km on the sphere (haversine, R1 — IUGG)', () => {
    expect(sphereKm(MUNICH, INNSBRUCK)).toBeGreaterThan(96);
    expect(sphereKm(MUNICH, INNSBRUCK)).toBeLessThan(98);
  });

  it('after a job ending 12:00 in Munich the first start in Innsbruck is 12:00 + buffer + travel, rounded up to the quarter hour', () => {
    const q = query({ technicians: [technician({ hours: hours({ bufferMinutes: buffer }), bookings: [munichBooking] })] });
    const firstAfter = ceilTo(at('12:00') + buffer * MINUTE + travelMs, 15 * MINUTE);
    const lastBefore = floorTo(at('11:00') - buffer * MINUTE - travelMs - 60 * MINUTE, 15 * MINUTE);
    const got = starts(q);
    expect(got.filter((t) => t > at('11:00'))[0]).toBe(firstAfter);
    expect(got).not.toContain(firstAfter - 15 * MINUTE);
    // before the booking: the job, the buffer and the drive to Munich must end by 11:00
    expect(got.filter((t) => t < at('11:00'))).toEqual(quarterHoursBetween(at('07:00'), lastBefore));
    expect(got.filter((t) => t > lastBefore && t < firstAfter)).toEqual([]);
    expect(got.at(-1)).toBe(at('18:00'));
  });

  it('uses the assumptions it is given: factor 1.5 at 80 km/h', () => {
    const q = query({ travel: { roadFactor: 1.5, averageSpeedKmh: 80 }, technicians: [technician({ hours: hours({ bufferMinutes: buffer }), bookings: [munichBooking] })] });
    const travel = ((sphereKm(MUNICH, INNSBRUCK) * 1.5) / 80) * 60 * MINUTE;
    expect(starts(q).filter((t) => t > at('11:00'))[0]).toBe(ceilTo(at('12:00') + buffer * MINUTE + travel, 15 * MINUTE));
  });

  it('from the base: the day starts at the base in Munich, so the first start is 07:00 + travel to Innsbruck', () => {
    const q = query({ technicians: [technician({ base: MUNICH })] });
    expect(starts(q)[0]).toBe(ceilTo(at('07:00') + travelMs, 15 * MINUTE));
  });

  it('a booking next door needs only the buffer: 10:00–11:00 with 15 min buffer leaves 08:45 and 11:15', () => {
    const q = query({ technicians: [technician({ hours: hours({ bufferMinutes: 15 }), bookings: [{ start: at('10:00'), end: at('11:00'), location: INNSBRUCK }] })] });
    const got = starts(q);
    expect(got).toContain(at('08:45'));
    expect(got).not.toContain(at('09:00'));
    expect(got).not.toContain(at('11:00'));
    expect(got).toContain(at('11:15'));
  });

  it('bookings of other days and overlapping bookings are handled in any input order', () => {
    const bookings = [
      { start: at('15:00'), end: at('16:00'), location: INNSBRUCK },
      { start: at('09:00'), end: at('10:00'), location: INNSBRUCK },
      { start: at('09:30'), end: at('10:30'), location: INNSBRUCK },
      { start: '2026-05-12T09:00:00+02:00', end: '2026-05-12T18:00:00+02:00', location: MUNICH },
    ];
    const got = starts(query({ technicians: [technician({ bookings })] }));
    expect(got).toEqual([...quarterHoursBetween(at('07:00'), at('08:00')), ...quarterHoursBetween(at('10:30'), at('14:00')), ...quarterHoursBetween(at('16:00'), at('18:00'))]);
  });
});

describe('notice, horizon and the search window', () => {
  it('minimum notice: now 08:07 with 120 minutes notice gives a first start of 10:15', () => {
    const q = query({ now: '2026-05-13T08:07:00+02:00', technicians: [technician({ hours: hours({ minimumNoticeMinutes: 120 }) })] });
    expect(starts(q)[0]).toBe(at('10:15'));
  });

  it('horizon: 2 days after Wednesday 13 May means Friday 15 May is the last bookable local date', () => {
    const q = query({ now: '2026-05-13T06:00:00+02:00', days: 7, technicians: [technician({ hours: hours({ bookingHorizonDays: 2 }) })] });
    const dates = new Set(computeSlots(q).technicians[0]!.slots.map((s) => s.localStart.slice(0, 10)));
    expect([...dates]).toEqual(['2026-05-13', '2026-05-14', '2026-05-15']);
  });

  it('from and days: starts from `from` on, over that many local days', () => {
    const q = query({ from: '2026-05-13T16:20:00+02:00', days: 2 });
    const got = starts(q);
    expect(got[0]).toBe(at('16:30'));
    expect(new Date(got.at(-1)!).toISOString()).toBe('2026-05-14T16:00:00.000Z'); // 18:00 local on the 14th
  });
});

describe('working hours and exceptions', () => {
  it('the whole job must fit: 08:00–12:00 and 13:00–17:00 with a 90-minute job', () => {
    const weekly = { wednesday: [{ start: '08:00', end: '12:00' }, { start: '13:00', end: '17:00' }] };
    const got = starts(query({ durationMinutes: 90, technicians: [technician({ hours: hours({ weekly }) })] }));
    expect(got).toEqual([...quarterHoursBetween(at('08:00'), at('10:30')), ...quarterHoursBetween(at('13:00'), at('15:30'))]);
  });

  it('touching intervals join: 08:00–12:00 and 12:00–16:00 allow 11:30–12:30', () => {
    const weekly = { wednesday: [{ start: '12:00', end: '16:00' }, { start: '08:00', end: '12:00' }] };
    expect(starts(query({ technicians: [technician({ hours: hours({ weekly }) })] }))).toEqual(quarterHoursBetween(at('08:00'), at('15:00')));
  });

  it('a job may run past midnight when the next day starts at 00:00 (24:00 ends a day)', () => {
    const weekly = { wednesday: [{ start: '20:00', end: '24:00' }], thursday: [{ start: '00:00', end: '02:00' }] };
    const got = starts(query({ durationMinutes: 120, days: 2, technicians: [technician({ hours: hours({ weekly }) })] }));
    expect(got).toEqual(quarterHoursBetween(at('20:00'), at('24:00')));
    // searching Wednesday alone still lets its last jobs run into Thursday's hours
    const wednesday = starts(query({ durationMinutes: 120, days: 1, technicians: [technician({ hours: hours({ weekly }) })] }));
    expect(wednesday).toEqual(quarterHoursBetween(at('20:00'), at('23:45')));
  });

  it('time off between instants removes every job that would overlap it', () => {
    const exceptions = [{ kind: 'time-off' as const, start: '2026-05-13T13:00:00+02:00', end: '2026-05-13T14:30:00+02:00' }];
    const got = starts(query({ technicians: [technician({ hours: hours({ exceptions }) })] }));
    expect(got.filter((t) => t > at('12:00') && t < at('14:30'))).toEqual([]);
    expect(got).toContain(at('12:00'));
    expect(got).toContain(at('14:30'));
  });

  it('days off remove whole local days, extra hours add to a day off', () => {
    const exceptions = [
      { kind: 'days-off' as const, from: '2026-05-14', to: '2026-05-15' },
      { kind: 'extra-hours' as const, date: '2026-05-16', start: '09:00', end: '12:00' },
    ];
    const weekly = { ...everyDay('07:00', '19:00'), saturday: [] };
    const slots = computeSlots(query({ days: 4, technicians: [technician({ hours: hours({ weekly, exceptions }) })] })).technicians[0]!.slots;
    const byDate = (d: string) => slots.filter((s) => s.localStart.startsWith(d)).map((s) => s.localStart.slice(11, 16));
    expect(byDate('2026-05-13')).toHaveLength(45); // 07:00 … 18:00
    expect(byDate('2026-05-14')).toEqual([]);
    expect(byDate('2026-05-15')).toEqual([]);
    expect(byDate('2026-05-16')).toEqual(['09:00', '09:15', '09:30', '09:45', '10:00', '10:15', '10:30', '10:45', '11:00']);
  });

  it('after a morning off, the day starts at the base when work starts', () => {
    const exceptions = [{ kind: 'time-off' as const, start: '2026-05-13T07:00:00+02:00', end: '2026-05-13T12:00:00+02:00' }];
    const travelMs = ((sphereKm(MUNICH, INNSBRUCK) * 1.3) / 60) * 60 * MINUTE;
    expect(starts(query({ technicians: [technician({ base: MUNICH, hours: hours({ exceptions }) })] }))[0]).toBe(ceilTo(at('12:00') + travelMs, 15 * MINUTE));
  });

  it('a grid of 60 minutes in a zone at UTC+05:30 falls on local full hours (offset from the IANA tz database via Intl)', () => {
    const kolkata = hours({ timeZone: 'Asia/Kolkata', weekly: everyDay('09:00', '12:00') });
    const slots = computeSlots(query({ gridMinutes: 60, technicians: [technician({ hours: kolkata })] })).technicians[0]!.slots;
    expect(slots.map((s) => s.localStart)).toEqual(['2026-05-13T09:00+05:30', '2026-05-13T10:00+05:30', '2026-05-13T11:00+05:30']);
    const intlHour = (iso: string) => new Intl.DateTimeFormat('en-GB', { timeZone: 'Asia/Kolkata', hour: '2-digit', minute: '2-digit', hourCycle: 'h23' }).format(new Date(iso));
    expect(slots.map((s) => intlHour(s.start))).toEqual(['09:00', '10:00', '11:00']);
  });

  it('a boundary in the spring-forward gap is clipped to the end of the gap: 02:30–06:00 on 29 March 2026 in Berlin starts at 03:00 CEST (more in slots-clock-gaps.test.ts)', () => {
    const h = hours({ weekly: { sunday: [{ start: '02:30', end: '06:00' }] } });
    const slots = computeSlots(query({ from: '2026-03-29T00:00:00+01:00', now: '2026-03-01T00:00:00Z', technicians: [technician({ hours: h })] })).technicians[0]!.slots;
    expect(slots[0]!.localStart).toBe('2026-03-29T03:00+02:00');
    expect(slots.at(-1)!.localStart).toBe('2026-03-29T05:00+02:00');
  });

  it('a boundary in the repeated hour means its first occurrence: 02:30 on 25 October 2026 in Berlin is 00:30Z (RFC 5545 §3.3.5, from memory)', () => {
    const h = hours({ weekly: { sunday: [{ start: '02:30', end: '06:00' }] } });
    const slots = computeSlots(query({ from: '2026-10-25T00:00:00+02:00', now: '2026-10-01T00:00:00Z', technicians: [technician({ hours: h })] })).technicians[0]!.slots;
    expect(slots[0]).toMatchObject({ start: '2026-10-25T00:30:00.000Z', localStart: '2026-10-25T02:30+02:00' });
    const labels = slots.map((s) => s.localStart.slice(11, 16));
    expect(new Set(labels).size).toBe(labels.length);
  });
});

describe('the organisation view', () => {
  it('is the union of the technicians, each start listing who can take it', () => {
    const morning = technician({ id: 'morning', hours: hours({ weekly: { wednesday: [{ start: '08:00', end: '11:00' }] } }) });
    const midday = technician({ id: 'midday', hours: hours({ weekly: { wednesday: [{ start: '10:00', end: '13:00' }] } }) });
    const result = computeSlots(query({ technicians: [morning, midday] }));
    const org = result.organisation.map((s) => [s.localStart.slice(11, 16), s.technicianIds.join('+')]);
    expect(org).toEqual([
      ['08:00', 'morning'], ['08:15', 'morning'], ['08:30', 'morning'], ['08:45', 'morning'],
      ['09:00', 'morning'], ['09:15', 'morning'], ['09:30', 'morning'], ['09:45', 'morning'],
      ['10:00', 'morning+midday'],
      ['10:15', 'midday'], ['10:30', 'midday'], ['10:45', 'midday'], ['11:00', 'midday'], ['11:15', 'midday'], ['11:30', 'midday'], ['11:45', 'midday'], ['12:00', 'midday'],
    ]);
    expect(result.timeZone).toBe('Europe/Berlin');
  });

  it('labels organisation slots in its own zone while each technician keeps theirs', () => {
    const london = technician({ id: 'london', hours: hours({ timeZone: 'Europe/London', weekly: { wednesday: [{ start: '09:00', end: '10:00' }] } }) });
    const helsinki = technician({ id: 'helsinki', hours: hours({ timeZone: 'Europe/Helsinki', weekly: { wednesday: [{ start: '11:00', end: '12:00' }] } }) });
    // two days: `from` (00:00 in Berlin) is still Tuesday evening in London
    const result = computeSlots(query({ timeZone: 'Europe/Berlin', days: 2, technicians: [london, helsinki] }));
    // 09:00 BST (+01:00) and 11:00 EEST (+03:00) are both 08:00Z, i.e. 10:00 in Berlin
    expect(result.technicians.map((t) => t.slots.map((s) => s.localStart))).toEqual([['2026-05-13T09:00+01:00'], ['2026-05-13T11:00+03:00']]);
    expect(result.organisation).toEqual([{ start: '2026-05-13T08:00:00.000Z', end: '2026-05-13T09:00:00.000Z', localStart: '2026-05-13T10:00+02:00', technicianIds: ['london', 'helsinki'] }]);
  });
});

describe('bad engine input', () => {
  it('refuses durations off the 5-minute step, grids that do not divide a day, and local times without offset', () => {
    expect(() => computeSlots(query({ durationMinutes: 62 }))).toThrow(/multiple of 5/);
    expect(() => computeSlots(query({ durationMinutes: 1445 }))).toThrow(/up to 1440/);
    expect(() => computeSlots(query({ gridMinutes: 7 }))).toThrow(/gridMinutes/);
    expect(() => computeSlots(query({ days: 0 }))).toThrow(/days/);
    expect(() => computeSlots(query({ maxSlotsPerTechnician: 0 }))).toThrow(/maxSlotsPerTechnician/);
    expect(() => computeSlots(query({ maxSlotsPerTechnician: 1.5 }))).toThrow(/maxSlotsPerTechnician/);
    expect(() => computeSlots(query({ from: '2026-05-13T09:00' }))).toThrow(/offset/);
    expect(() => computeSlots(query({ customer: { lat: 95, lng: 0 } }))).toThrow(/latitude/);
    expect(() => computeSlots(query({ travel: { averageSpeedKmh: 0 } }))).toThrow(/speed/);
    expect(() => computeSlots(query({ technicians: [technician({ bookings: [{ start: at('12:00'), end: at('11:00'), location: MUNICH }] })] }))).toThrow(/ends before/);
    expect(() => computeSlots(query({ technicians: [technician({ bookings: [{ start: at('11:00'), end: at('12:00'), location: { lat: Number.NaN, lng: 11 } }] })] }))).toThrow(/latitude/);
    expect(() => computeSlots(query({ timeZone: 'Mars/Olympus_Mons' }))).toThrow(/time zone/);
  });
});

describe('WorkingHoursSchema', () => {
  const valid: WorkingHoursDraft = {
    timeZone: 'Europe/Vienna',
    weekly: { monday: [{ start: '08:00', end: '12:00' }, { start: '12:00', end: '17:00' }], saturday: [{ start: '09:00', end: '13:00' }] },
    exceptions: [
      { kind: 'time-off', start: '2026-05-13T13:00:00+02:00', end: '2026-05-13T15:00:00+02:00' },
      { kind: 'days-off', from: '2026-08-03', to: '2026-08-14' },
      { kind: 'extra-hours', date: '2026-05-17', start: '10:00', end: '14:00' },
    ],
    minimumNoticeMinutes: 120,
    bookingHorizonDays: 28,
    bufferMinutes: 15,
  };
  const issues = (draft: unknown) => {
    const r = WorkingHoursSchema.safeParse(draft);
    return r.success ? [] : r.error.issues.map((i) => ({ path: i.path, message: i.message }));
  };

  it('accepts a valid week (touching intervals are fine) and fills missing days with none', () => {
    const parsed = WorkingHoursSchema.parse(valid);
    expect(parsed.weekly.tuesday).toEqual([]);
    expect(parsed.weekly.monday).toHaveLength(2);
  });

  it('overlapping intervals: an error on the later one naming both', () => {
    expect(issues({ ...valid, weekly: { monday: [{ start: '09:00', end: '12:00' }, { start: '11:00', end: '13:00' }] } })).toEqual([
      { path: ['weekly', 'monday', 1, 'start'], message: '11:00–13:00 overlaps 09:00–12:00 on Monday' },
    ]);
    // nested inside an earlier, longer interval, listed first
    expect(issues({ ...valid, weekly: { friday: [{ start: '11:00', end: '11:30' }, { start: '08:00', end: '18:00' }, { start: '09:00', end: '10:00' }] } }).map((i) => i.path)).toEqual([
      ['weekly', 'friday', 2, 'start'],
      ['weekly', 'friday', 0, 'start'],
    ]);
  });

  it('reversed or empty intervals: an error on the end', () => {
    expect(issues({ ...valid, weekly: { tuesday: [{ start: '17:00', end: '09:00' }] } })).toEqual([
      { path: ['weekly', 'tuesday', 0, 'end'], message: 'The end (09:00) must be after the start (17:00)' },
    ]);
    expect(issues({ ...valid, weekly: { tuesday: [{ start: '09:00', end: '09:00' }] } }).map((i) => i.path)).toEqual([['weekly', 'tuesday', 0, 'end']]);
  });

  it('an unknown time zone is refused; IANA names are accepted (IANA tz database via luxon/Intl)', () => {
    expect(issues({ ...valid, timeZone: 'Europe/Atlantis' })).toEqual([
      { path: ['timeZone'], message: 'Unknown time zone "Europe/Atlantis"; use a name from the time-zone database such as Europe/Vienna' },
    ]);
    expect(issues({ ...valid, timeZone: 'America/Argentina/Buenos_Aires' })).toEqual([]);
  });

  it('durations not a multiple of 5 minutes: buffer, notice and job duration', () => {
    expect(issues({ ...valid, bufferMinutes: 7 })).toEqual([{ path: ['bufferMinutes'], message: 'Buffer between jobs must be a multiple of 5 minutes' }]);
    expect(issues({ ...valid, minimumNoticeMinutes: 62 })).toEqual([{ path: ['minimumNoticeMinutes'], message: 'Minimum notice must be a multiple of 5 minutes' }]);
    expect(JobDurationMinutesSchema.safeParse(47).error?.issues.map((i) => i.message)).toEqual(['Job duration must be a multiple of 5 minutes']);
    expect(JobDurationMinutesSchema.safeParse(45).success).toBe(true);
    expect(issues({ ...valid, weekly: { monday: [{ start: '09:07', end: '12:00' }] } })).toEqual([
      { path: ['weekly', 'monday', 0, 'start'], message: 'Times go in steps of 5 minutes, e.g. 09:05' },
    ]);
  });

  it('ranges and formats', () => {
    expect(issues({ ...valid, bufferMinutes: 300 })).toEqual([{ path: ['bufferMinutes'], message: 'Buffer between jobs must be between 0 and 240 minutes' }]);
    expect(issues({ ...valid, bookingHorizonDays: 0 })).toEqual([{ path: ['bookingHorizonDays'], message: 'Booking horizon must be between 1 and 365 days' }]);
    expect(issues({ ...valid, weekly: { monday: [{ start: '9:00', end: '12:00' }] } }).map((i) => i.path)).toEqual([['weekly', 'monday', 0, 'start']]);
  });

  it('exceptions: reversed time off, days off backwards, a date that does not exist, overlapping extra hours', () => {
    expect(
      issues({
        ...valid,
        exceptions: [
          { kind: 'time-off', start: '2026-05-13T15:00:00+02:00', end: '2026-05-13T13:00:00+02:00' },
          { kind: 'days-off', from: '2026-08-14', to: '2026-08-03' },
          { kind: 'days-off', from: '2026-02-30', to: '2026-03-01' },
          { kind: 'extra-hours', date: '2026-05-17', start: '10:00', end: '14:00' },
          { kind: 'extra-hours', date: '2026-05-17', start: '13:00', end: '15:00' },
          { kind: 'time-off', start: '2026-05-13T13:00:00', end: '2026-05-13T15:00:00+02:00' },
        ],
      }),
    ).toEqual([
      { path: ['exceptions', 0, 'end'], message: 'The time off must end after it starts' },
      { path: ['exceptions', 1, 'to'], message: 'The last day off (2026-08-03) must not be before the first (2026-08-14)' },
      { path: ['exceptions', 2, 'from'], message: 'This date does not exist' },
      { path: ['exceptions', 5, 'start'], message: 'Enter a date and time with a UTC offset, e.g. 2026-03-29T09:00:00+02:00' },
      { path: ['exceptions', 4, 'start'], message: '13:00–15:00 overlaps 10:00–14:00 on 2026-05-17' },
    ]);
  });
});
