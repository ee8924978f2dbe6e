// The search's batched next slots give, for every partner, exactly the first slot the slot engine
// gives that partner alone (its slot list): jobs sharing a run, workshops moved to the owner's
// place when nobody drives, and the short first pass must never change the answer.
import { describe, expect, it } from 'vitest';
import { computeSlots, WorkingHoursSchema, type ExistingBooking, type GeoPoint, type SlotTechnician } from '@emberline/domain';
import { firstSlots, type SlotJob } from '../../../apps/api/src/services/slots.service';
import { random } from '../../bench/search-data';

const NOW = new Date('2026-03-27T10:17:00Z');
const PLACE = { lat: 48.2, lng: 11.6 };
const ZONES = ['Europe/Berlin', 'Europe/Lisbon', 'Europe/Helsinki'];

function hours(rnd: () => number, zone: string) {
  const day = [{ start: rnd() < 0.5 ? '08:00' : '09:30', end: rnd() < 0.5 ? '17:00' : '12:00' }];
  const weekly = rnd() < 0.3 ? { saturday: day } : { monday: day, tuesday: day, wednesday: day, thursday: day, friday: day };
  return WorkingHoursSchema.parse({ timeZone: zone, weekly, minimumNoticeMinutes: Math.floor(rnd() * 4) * 60, bookingHorizonDays: 30, bufferMinutes: rnd() < 0.5 ? 0 : 15 });
}

function bookingsAt(rnd: () => number, where: () => GeoPoint): ExistingBooking[] {
  return Array.from({ length: Math.floor(rnd() * 6) }, () => {
    const start = NOW.getTime() + Math.floor(rnd() * 5 * 96) * 15 * 60_000;
    return { start, end: start + (1 + Math.floor(rnd() * 8)) * 30 * 60_000, location: where() };
  });
}

/** A partner's job: mobile from a base near the place, or a workshop where everything happens at the base. */
function job(rnd: () => number, i: number): SlotJob {
  const base = { lat: PLACE.lat + (rnd() - 0.5), lng: PLACE.lng + (rnd() - 0.5) };
  const workshop = rnd() < 0.5;
  const zone = ZONES[Math.floor(rnd() * ZONES.length)]!;
  const technicians: SlotTechnician[] = Array.from({ length: 1 + Math.floor(rnd() * 3) }, (_, t) => ({
    id: `user-${i}-${t}`,
    hours: hours(rnd, rnd() < 0.8 ? zone : ZONES[Math.floor(rnd() * ZONES.length)]!),
    base,
    // a workshop's jobs are at the workshop; now and then one is not, and it must then run alone
    bookings: bookingsAt(rnd, () => (workshop && rnd() < 0.9 ? base : { lat: PLACE.lat + (rnd() - 0.5), lng: PLACE.lng + (rnd() - 0.5) })),
  }));
  return { key: `partner-${i}`, technicians, customer: workshop ? base : PLACE, durationMinutes: [30, 60, 90][Math.floor(rnd() * 3)]!, from: NOW };
}

describe('firstSlots', () => {
  it('gives each partner the first slot of its own slot list', () => {
    const rnd = random(42);
    for (let round = 0; round < 20; round++) {
      const jobs = Array.from({ length: 8 }, (_, i) => job(rnd, round * 10 + i));
      const days = rnd() < 0.5 ? 14 : 1;
      const batched = firstSlots(jobs, { now: NOW, days, place: PLACE });
      for (const j of jobs) {
        const alone = computeSlots({ technicians: j.technicians, durationMinutes: j.durationMinutes, customer: j.customer, now: NOW, from: j.from, days });
        const first = alone.organisation[0];
        expect(batched.get(j.key), `${j.key} in round ${round}`).toEqual(first ? { start: first.start, localStart: first.localStart, timeZone: alone.timeZone } : null);
      }
    }
  });
});
