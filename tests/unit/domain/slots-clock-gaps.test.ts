// Working hours across spring-forward gaps and skipped calendar days, worked out by hand.
// Transitions: IANA tz database 2025c as reported by Intl in Node 20.20.2 (ICU 78.2); each is
// checked against Intl below, so a different tz database fails here rather than in the engine.
import { describe, expect, it } from 'vitest';
import { computeSlots } from '../../../packages/domain/src/slots';
import { WorkingHoursSchema, type WorkingHoursDraft } from '../../../packages/domain/src/schemas/hours';

const PLACE = { lat: 47.2692, lng: 11.4041 };

/** Local labels of one technician's slots; the base is at the customer, so no drive cuts the day. */
function labels(timeZone: string, weekly: WorkingHoursDraft['weekly'], from: string, options: { days?: number; durationMinutes?: number; gridMinutes?: number } = {}): string[] {
  const hours = WorkingHoursSchema.parse({ timeZone, weekly, minimumNoticeMinutes: 0, bookingHorizonDays: 365, bufferMinutes: 0 });
  const result = computeSlots({
    technicians: [{ id: 't', hours, base: PLACE }],
    customer: PLACE,
    now: Date.parse(from) - 86_400_000,
    from,
    days: options.days ?? 1,
    durationMinutes: options.durationMinutes ?? 60,
    gridMinutes: options.gridMinutes ?? 15,
  });
  return result.technicians[0]!.slots.map((s) => s.localStart);
}

/** Local date and time Intl shows for an instant, e.g. "2011-12-31 00:00". */
function intlLocal(zone: string, iso: string): string {
  const p = Object.fromEntries(
    new Intl.DateTimeFormat('en-GB', { timeZone: zone, year: 'numeric', month: '2-digit', day: '2-digit', hour: '2-digit', minute: '2-digit', hourCycle: 'h23' })
      .formatToParts(new Date(iso))
      .map((x) => [x.type, x.value]),
  );
  return `${p.year}-${p.month}-${p.day} ${p.hour}:${p.minute}`;
}

describe('the transitions the examples rely on (IANA tz database via Intl, Node 20)', () => {
  it.each([
    // zone, last second before the jump, local time then, local time at the jump
    ['Europe/Berlin', '2026-03-29T01:00:00Z', '2026-03-29 01:59', '2026-03-29 03:00'],
    ['America/New_York', '2026-03-08T07:00:00Z', '2026-03-08 01:59', '2026-03-08 03:00'],
    ['Australia/Lord_Howe', '2026-10-03T15:30:00Z', '2026-10-04 01:59', '2026-10-04 02:30'],
    ['Pacific/Apia', '2011-12-30T10:00:00Z', '2011-12-29 23:59', '2011-12-31 00:00'],
    ['Pacific/Kiritimati', '1994-12-31T10:00:00Z', '1994-12-30 23:59', '1995-01-01 00:00'],
    ['Pacific/Kwajalein', '1993-08-21T12:00:00Z', '1993-08-20 23:59', '1993-08-22 00:00'],
  ])('%s jumps at %s', (zone, jump, before, after) => {
    expect(intlLocal(zone, new Date(Date.parse(jump) - 1000).toISOString())).toBe(before);
    expect(intlLocal(zone, jump)).toBe(after);
  });
});

describe('working hours are clipped to the instants that exist inside them', () => {
  it('hours wholly inside the gap are empty: 02:00–02:30 on 29 March 2026 in Berlin offer nothing (not 03:00)', () => {
    expect(labels('Europe/Berlin', { sunday: [{ start: '02:00', end: '02:30' }] }, '2026-03-29T00:00:00+01:00', { durationMinutes: 15 })).toEqual([]);
  });

  it('a start in the gap begins where the gap ends: 02:30–06:00 in Berlin on 29 March 2026 starts at 03:00 CEST, no working time lost', () => {
    const got = labels('Europe/Berlin', { sunday: [{ start: '02:30', end: '06:00' }] }, '2026-03-29T00:00:00+01:00');
    expect(got[0]).toBe('2026-03-29T03:00+02:00');
    expect(got.at(-1)).toBe('2026-03-29T05:00+02:00');
    expect(got).toHaveLength(9);
  });

  it('an end in the gap ends where the gap starts: 00:00–02:30 in Berlin on 29 March 2026 is two real hours, last 60-minute start 01:00 CET', () => {
    const got = labels('Europe/Berlin', { sunday: [{ start: '00:00', end: '02:30' }] }, '2026-03-29T00:00:00+01:00');
    expect(got[0]).toBe('2026-03-29T00:00+01:00');
    expect(got.at(-1)).toBe('2026-03-29T01:00+01:00');
  });

  it('New York, 8 March 2026: 01:30–02:30 is the half hour 01:30–02:00 EST, so one 30-minute start', () => {
    expect(labels('America/New_York', { sunday: [{ start: '01:30', end: '02:30' }] }, '2026-03-08T00:00:00-05:00', { durationMinutes: 30 })).toEqual(['2026-03-08T01:30-05:00']);
  });

  it('Lord Howe, 4 October 2026 (clocks go from 02:00 to 02:30): 02:15–04:00 starts at 02:30', () => {
    expect(labels('Australia/Lord_Howe', { sunday: [{ start: '02:15', end: '04:00' }] }, '2026-10-04T00:00:00+10:30')).toEqual([
      '2026-10-04T02:30+11:00',
      '2026-10-04T02:45+11:00',
      '2026-10-04T03:00+11:00',
    ]);
  });

  it('a boundary on the far side of the gap is kept: Lord Howe 02:30–03:30 on 4 October 2026 gives 02:30 to 03:00 for a 30-minute job', () => {
    expect(labels('Australia/Lord_Howe', { sunday: [{ start: '02:30', end: '03:30' }] }, '2026-10-04T00:00:00+10:30', { durationMinutes: 30 })).toEqual([
      '2026-10-04T02:30+11:00',
      '2026-10-04T02:45+11:00',
      '2026-10-04T03:00+11:00',
    ]);
  });
});

describe('a calendar day the zone skipped has no hours, and nothing moves to the next day', () => {
  // Friday 30 December 2011 did not happen in Samoa: Thursday 23:59 (UTC-10) was followed by Saturday 00:00 (UTC+14)
  const friday = [{ start: '09:00', end: '12:00' }];
  const saturday = [{ start: '14:00', end: '16:00' }];

  it('Pacific/Apia: Friday hours give nothing, Saturday keeps only its own', () => {
    expect(labels('Pacific/Apia', { friday, saturday }, '2011-12-29T00:00:00-10:00', { days: 3, gridMinutes: 60 })).toEqual(['2011-12-31T14:00+14:00', '2011-12-31T15:00+14:00']);
    expect(labels('Pacific/Apia', { friday }, '2011-12-29T00:00:00-10:00', { days: 3 })).toEqual([]);
  });

  it('Pacific/Kiritimati skipped Saturday 31 December 1994, Pacific/Kwajalein Saturday 21 August 1993: their hours give nothing', () => {
    const saturdayOnly = { saturday: [{ start: '08:00', end: '17:00' }] };
    expect(labels('Pacific/Kiritimati', saturdayOnly, '1994-12-30T00:00:00-10:00', { days: 3 })).toEqual([]);
    expect(labels('Pacific/Kwajalein', saturdayOnly, '1993-08-20T00:00:00-12:00', { days: 3 })).toEqual([]);
  });

  it('a late job on the day before the skipped one runs on into the real next day: Apia, Thursday 22:00–24:00 and Saturday 00:00–02:00', () => {
    // Thursday 22:00 (UTC-10) is 08:00Z, Saturday 02:00 (UTC+14) is 12:00Z: four real hours
    const got = labels('Pacific/Apia', { thursday: [{ start: '22:00', end: '24:00' }], saturday: [{ start: '00:00', end: '02:00' }] }, '2011-12-29T00:00:00-10:00', { durationMinutes: 180 });
    expect(got).toEqual(['2011-12-29T22:00-10:00', '2011-12-29T22:15-10:00', '2011-12-29T22:30-10:00', '2011-12-29T22:45-10:00', '2011-12-29T23:00-10:00']);
  });
});
