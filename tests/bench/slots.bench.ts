// Benchmark of the slot engine: one organisation, 20 technicians, 28 days, 1,000 existing
// bookings (target: well under 20 ms median). Run:
//   node_modules/.bin/vitest bench --run tests/bench/slots.bench.ts --project unit
import { bench, describe } from 'vitest';
import { computeSlots, type ExistingBooking, type SlotQuery, type SlotTechnician } from '../../packages/domain/src/slots';
import { WorkingHoursSchema } from '../../packages/domain/src/schemas/hours';

/** Small seeded generator (mulberry32), so every run benchmarks the same organisation. */
function random(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const TECHNICIANS = 20;
const DAYS = 28;
const BOOKINGS = 1000;
const CUSTOMER = { lat: 47.2692, lng: 11.4041 };

function organisation(): SlotQuery {
  const rnd = random(20260316);
  const near = () => ({ lat: CUSTOMER.lat + (rnd() - 0.5) * 1.2, lng: CUSTOMER.lng + (rnd() - 0.5) * 1.8 });
  const day = [{ start: '08:00', end: '12:00' }, { start: '12:30', end: '17:30' }];
  // the month crosses the spring change (29 March 2026), and two zones share the work
  const start = Date.parse('2026-03-16T00:00:00+01:00');
  const technicians: SlotTechnician[] = Array.from({ length: TECHNICIANS }, (_, i) => ({
    id: `tech-${i + 1}`,
    base: near(),
    hours: WorkingHoursSchema.parse({
      timeZone: i % 4 === 0 ? 'Europe/Berlin' : 'Europe/Vienna',
      weekly: { monday: day, tuesday: day, wednesday: day, thursday: day, friday: day, saturday: i % 2 ? [{ start: '09:00', end: '13:00' }] : [] },
      exceptions: [
        ...(i % 5 === 0 ? [{ kind: 'days-off', from: '2026-03-30', to: '2026-04-03' }] : []),
        { kind: 'time-off', start: new Date(start + (2 + (i % 7)) * 86_400_000 + 9 * 3_600_000).toISOString(), end: new Date(start + (2 + (i % 7)) * 86_400_000 + 11 * 3_600_000).toISOString() },
        { kind: 'extra-hours', date: '2026-04-04', start: '14:00', end: '18:00' },
      ],
      minimumNoticeMinutes: 120,
      bookingHorizonDays: 60,
      bufferMinutes: 15,
    }),
    bookings: [] as ExistingBooking[],
  }));
  for (let b = 0; b < BOOKINGS; b++) {
    const technician = technicians[b % TECHNICIANS]!;
    const dayStart = start + Math.floor(rnd() * DAYS) * 86_400_000;
    const at = dayStart + (7 * 60 + Math.floor(rnd() * 36) * 15) * 60_000; // 08:00–17:00 local, roughly
    const minutes = 60 + Math.floor(rnd() * 9) * 15;
    (technician.bookings as ExistingBooking[]).push({ id: `b${b}`, start: new Date(at).toISOString(), end: new Date(at + minutes * 60_000).toISOString(), location: near() });
  }
  return { technicians, durationMinutes: 90, customer: CUSTOMER, now: '2026-03-16T07:00:00+01:00', from: '2026-03-16T07:00:00+01:00', days: DAYS };
}

const query = organisation();

/** The same organisation with copies of its hours: the engine keeps nothing from earlier runs for them. */
const fresh = (): SlotQuery => ({ ...query, technicians: query.technicians.map((t) => ({ ...t, hours: structuredClone(t.hours) })) });

function measured(name: string, next: () => SlotQuery) {
  const times: number[] = [];
  bench(
    name,
    () => {
      const q = next();
      const t0 = performance.now();
      const result = computeSlots(q);
      times.push(performance.now() - t0);
      if (result.technicians.length !== TECHNICIANS) throw new Error('missing technicians');
    },
    {
      time: 3000,
      warmupTime: 500,
      teardown: (_task, mode) => {
        if (mode !== 'run' || times.length === 0) return;
        const sorted = [...times].sort((a, b) => a - b);
        const median = sorted[Math.floor(sorted.length / 2)]!;
        const slots = computeSlots(query);
        console.info(
          `slot engine, ${name}: median ${median.toFixed(2)} ms over ${sorted.length} runs (p95 ${sorted[Math.floor(sorted.length * 0.95)]!.toFixed(2)} ms); ` +
            `${slots.technicians.reduce((n, t) => n + t.slots.length, 0)} technician slots, ${slots.organisation.length} organisation slots`,
        );
        times.length = 0;
      },
    },
  );
}

describe(`computeSlots: ${TECHNICIANS} technicians × ${DAYS} days × ${BOOKINGS} bookings`, () => {
  // the engine keeps each hours object's working windows per searched days (engine.ts): the
  // first run for an hours object computes them, later runs for the same days reuse them
  measured('new hours objects (nothing kept)', fresh);
  measured('the same hours objects again (windows kept)', () => query);
});
