// Reference checks of the slot engine across daylight-saving changes. Expected instants come from
// the EU summer-time rule (Directive 2000/84/EC: clocks change at 01:00 UTC on the last Sunday of
// March and of October) and the zones' standard offsets (CET +1, GMT 0, EET +2; from memory), and
// are cross-checked against the IANA time-zone database as Node's Intl ships it.
import { describe, expect, it } from 'vitest';
import { computeSlots, type SlotResult } from '../../packages/domain/src/slots';
import { WorkingHoursSchema } from '../../packages/domain/src/schemas/hours';

const MINUTE = 60_000;
const HOUR = 60 * MINUTE;
const PLACE = { lat: 47.2692, lng: 11.4041 }; // base and customer together: no travel

/** Last Sunday of a month (0-based month) in 2026, as a day of the month — calendar arithmetic. */
function lastSunday(month: number): number {
  const lastDay = new Date(Date.UTC(2026, month + 1, 0));
  return lastDay.getUTCDate() - lastDay.getUTCDay();
}

const ZONES = [
  { zone: 'Europe/Berlin', standardHours: 1 },
  { zone: 'Europe/London', standardHours: 0 },
  { zone: 'Europe/Helsinki', standardHours: 2 },
] as const;

const CHANGES = [
  { name: 'spring forward', month: 2, offsetHoursBefore: 0, offsetHoursAfter: 1 },
  { name: 'fall back', month: 9, offsetHoursBefore: 1, offsetHoursAfter: 0 },
] as const;

/** Offset (minutes) and wall-clock parts of an instant in a zone, read from Intl (IANA tz database). */
function intlLocal(instant: number, zone: string): { label: string; offsetMinutes: number } {
  const parts = Object.fromEntries(
    new Intl.DateTimeFormat('en-GB', { timeZone: zone, year: 'numeric', month: '2-digit', day: '2-digit', hour: '2-digit', minute: '2-digit', hourCycle: 'h23' })
      .formatToParts(new Date(instant))
      .map((p) => [p.type, p.value]),
  );
  const wall = Date.UTC(Number(parts.year), Number(parts.month) - 1, Number(parts.day), Number(parts.hour), Number(parts.minute));
  return { label: `${parts.year}-${parts.month}-${parts.day}T${parts.hour}:${parts.minute}`, offsetMinutes: (wall - instant) / MINUTE };
}

function offsetText(hours: number): string {
  return `${hours < 0 ? '-' : '+'}${String(Math.abs(hours)).padStart(2, '0')}:00`;
}

function slotsFor(zone: string, day: number, month: number, start: string, end: string): SlotResult {
  const hours = WorkingHoursSchema.parse({ timeZone: zone, weekly: { sunday: [{ start, end }] }, minimumNoticeMinutes: 0, bookingHorizonDays: 365, bufferMinutes: 0 });
  return computeSlots({
    technicians: [{ id: 'tech', hours, base: PLACE }],
    durationMinutes: 60,
    gridMinutes: 15,
    customer: PLACE,
    now: '2026-01-01T00:00:00Z',
    from: new Date(Date.UTC(2026, month, day - 1, 12)), // Saturday noon UTC: still Saturday in all three zones
    days: 2,
  });
}

describe('EU summer time in 2026 — Directive 2000/84/EC', () => {
  it('changes on Sunday 29 March and Sunday 25 October 2026', () => {
    expect(lastSunday(2)).toBe(29);
    expect(lastSunday(9)).toBe(25);
  });

  for (const { zone, standardHours } of ZONES) {
    for (const change of CHANGES) {
      it(`${zone}: Intl's offsets before and after 01:00 UTC on the ${change.name} Sunday match the directive — IANA tz database via Intl`, () => {
        const t = Date.UTC(2026, change.month, lastSunday(change.month), 1);
        expect(intlLocal(t - MINUTE, zone).offsetMinutes).toBe((standardHours + change.offsetHoursBefore) * 60);
        expect(intlLocal(t, zone).offsetMinutes).toBe((standardHours + change.offsetHoursAfter) * 60);
      });
    }
  }
});

describe('a 09:00–17:00 day with a 60-minute job on a 15-minute grid — Directive 2000/84/EC, IANA tz database via Intl', () => {
  for (const { zone, standardHours } of ZONES) {
    for (const change of CHANGES) {
      const day = lastSunday(change.month);
      const offsetHours = standardHours + change.offsetHoursAfter; // 09:00 is well after 01:00 UTC
      it(`${zone}, ${change.name} (2026-${change.month + 1}-${day}): 29 starts 09:00 … 16:00 local at UTC${offsetText(offsetHours)}`, () => {
        const result = slotsFor(zone, day, change.month, '09:00', '17:00');
        const expected = Array.from({ length: 29 }, (_, i) => Date.UTC(2026, change.month, day, 9 - offsetHours, i * 15));
        const slots = result.technicians[0]!.slots;
        expect(slots.map((s) => s.start)).toEqual(expected.map((t) => new Date(t).toISOString()));
        expect(slots.map((s) => s.end)).toEqual(expected.map((t) => new Date(t + HOUR).toISOString()));
        expect(slots.map((s) => s.localStart)).toEqual(expected.map((t) => `${intlLocal(t, zone).label}${offsetText(offsetHours)}`));
        expect(slots.map((s) => intlLocal(Date.parse(s.start), zone).label.slice(11))).toEqual(
          Array.from({ length: 29 }, (_, i) => `${String(9 + Math.floor(i / 4)).padStart(2, '0')}:${String((i % 4) * 15).padStart(2, '0')}`),
        );
        expect(result.organisation.map((s) => s.start)).toEqual(slots.map((s) => s.start));
      });
    }
  }

  it('e.g. Berlin 09:00 is 07:00Z on 29 March and 08:00Z on 25 October 2026', () => {
    expect(slotsFor('Europe/Berlin', 29, 2, '09:00', '17:00').technicians[0]!.slots[0]!.start).toBe('2026-03-29T07:00:00.000Z');
    expect(slotsFor('Europe/Berlin', 25, 9, '09:00', '17:00').technicians[0]!.slots[0]!.start).toBe('2026-10-25T08:00:00.000Z');
  });
});

describe('a working night 01:00–05:00 across the change — Directive 2000/84/EC, IANA tz database via Intl', () => {
  for (const { zone, standardHours } of ZONES) {
    for (const change of CHANGES) {
      const day = lastSunday(change.month);
      const switchAt = Date.UTC(2026, change.month, day, 1);
      const before = (standardHours + change.offsetHoursBefore) * HOUR;
      const after = (standardHours + change.offsetHoursAfter) * HOUR;
      /** Instants showing a wall-clock time that day: none in a gap, two in a repeated hour. */
      const occurrences = (minutes: number): number[] => {
        const wall = Date.UTC(2026, change.month, day) + minutes * MINUTE;
        return [wall - before, wall - after].filter((u, i) => (i === 0 ? u < switchAt : u >= switchAt)).filter((u, i, all) => all.indexOf(u) === i);
      };
      // a boundary that does not exist is read with the offset before the gap (RFC 5545, from memory)
      const boundary = (minutes: number) => occurrences(minutes)[0] ?? Date.UTC(2026, change.month, day) + minutes * MINUTE - before;
      const windowStart = boundary(60);
      const windowEnd = boundary(300);

      it(`${zone}, ${change.name}: ${change.name === 'spring forward' ? 'the skipped hour is lost' : 'the repeated hour is counted once'}`, () => {
        const expected: number[] = [];
        for (let minutes = 0; minutes < 24 * 60; minutes += 15) {
          const first = occurrences(minutes).find((u) => u >= windowStart && u + HOUR <= windowEnd);
          if (first !== undefined) expected.push(first);
        }
        const slots = slotsFor(zone, day, change.month, '01:00', '05:00').technicians[0]!.slots;
        expect(slots.map((s) => s.start)).toEqual(expected.map((t) => new Date(t).toISOString()));
        // the night really is 3 hours (spring) or 5 hours (autumn) long
        expect(windowEnd - windowStart).toBe((change.name === 'spring forward' ? 3 : 5) * HOUR);
        const labels = slots.map((s) => intlLocal(Date.parse(s.start), zone).label);
        expect(new Set(labels).size).toBe(labels.length);
        if (change.name === 'spring forward') {
          // (3 h − 1 h) / 15 min + 1 starts, none showing a wall-clock time inside the gap
          expect(slots).toHaveLength(9);
          const gapStart = switchAt + before;
          for (const s of slots) {
            const wall = Date.parse(s.start) + intlLocal(Date.parse(s.start), zone).offsetMinutes * MINUTE;
            expect(wall < gapStart || wall >= gapStart + (after - before)).toBe(true);
          }
        } else {
          // every wall-clock quarter hour from 01:00 to 04:00 once: 13 starts, not 17
          expect(slots).toHaveLength(13);
          expect(labels.map((l) => l.slice(11))).toEqual(Array.from({ length: 13 }, (_, i) => `${String(1 + Math.floor(i / 4)).padStart(2, '0')}:${String((i % 4) * 15).padStart(2, '0')}`));
          // and each at its first occurrence, with the offset Intl shows for it
          for (const s of slots) expect(s.localStart.slice(16)).toBe(offsetText(intlLocal(Date.parse(s.start), zone).offsetMinutes / 60));
        }
      });
    }
  }
});
