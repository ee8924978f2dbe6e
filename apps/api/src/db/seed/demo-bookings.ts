// Demo bookings, so the booking screens mean something: Kaltstart Service Bayern's busy week ahead
// (confirmed and requested jobs at its Munich workshop), and Clara's upcoming confirmed job and a
// completed one with Glutwerk Mobil, which confirms bookings automatically. Priced by the same
// planning and quote code as a real booking; the payments are only recorded (authorised or
// captured, with made-up `seed_` ids), the provider is never called. Idempotent: each booking has
// a fixed reference and is added only when missing.
import type { EntityManager } from 'typeorm';
import { DateTime } from 'luxon';
import type { BookingStatus } from '@emberline/domain';
import { newId } from '../../lib/secure-token';
import { quoteSettings } from '../../services/network-settings';
import { BODY_PATHS, localDate, planJob, quoteFor } from '../../services/quote.service';
import { DEMO_VEHICLES } from './demo-data';

interface DemoBooking {
  reference: string;
  organisation: string;
  technician: string;
  owner: string;
  serviceType: string;
  status: Extract<BookingStatus, 'requested' | 'confirmed' | 'completed'>;
  /** Weeks from this week's Monday (1 = next week), the weekday (1 = Monday) and the local time. */
  week: number;
  weekday: number;
  time: string;
  address?: { line: string; postalCode: string; city: string; country: 'AT' | 'DE'; lat: number; lng: number };
}

/** Clara's place in Innsbruck (invented street number), a few km from Glutwerk's base. */
const CLARA_PLACE = { line: 'Höttinger Au 12', postalCode: '6020', city: 'Innsbruck', country: 'AT' as const, lat: 47.268, lng: 11.377 };

export const DEMO_BOOKINGS: DemoBooking[] = [
  { reference: 'EMB-DEMOK1', organisation: 'Kaltstart Service Bayern', technician: 'anja@kaltstart.example', owner: 'max@owners.example', serviceType: 'parking-conversion-manual', status: 'confirmed', week: 1, weekday: 1, time: '09:00' },
  { reference: 'EMB-DEMOK2', organisation: 'Kaltstart Service Bayern', technician: 'deniz@kaltstart.example', owner: 'jakob@owners.example', serviceType: 'seasonal-heater-service', status: 'confirmed', week: 1, weekday: 1, time: '10:00' },
  { reference: 'EMB-DEMOK3', organisation: 'Kaltstart Service Bayern', technician: 'anja@kaltstart.example', owner: 'hannes@owners.example', serviceType: 'control-unit-firmware-update', status: 'requested', week: 1, weekday: 1, time: '14:00' },
  { reference: 'EMB-DEMOK4', organisation: 'Kaltstart Service Bayern', technician: 'deniz@kaltstart.example', owner: 'max@owners.example', serviceType: 'control-unit-firmware-update', status: 'confirmed', week: 1, weekday: 2, time: '08:30' },
  { reference: 'EMB-DEMOK5', organisation: 'Kaltstart Service Bayern', technician: 'anja@kaltstart.example', owner: 'jakob@owners.example', serviceType: 'seasonal-heater-service', status: 'requested', week: 1, weekday: 3, time: '09:00' },
  { reference: 'EMB-DEMOK6', organisation: 'Kaltstart Service Bayern', technician: 'deniz@kaltstart.example', owner: 'hannes@owners.example', serviceType: 'parking-conversion-manual', status: 'confirmed', week: 1, weekday: 4, time: '11:00' },
  { reference: 'EMB-DEMOC1', organisation: 'Glutwerk Mobil', technician: 'tobias@glutwerk.example', owner: 'clara@owners.example', serviceType: 'parking-conversion-auto', status: 'confirmed', week: 1, weekday: 4, time: '10:00', address: CLARA_PLACE },
  { reference: 'EMB-DEMOC2', organisation: 'Glutwerk Mobil', technician: 'tobias@glutwerk.example', owner: 'clara@owners.example', serviceType: 'seasonal-heater-service', status: 'completed', week: -3, weekday: 2, time: '09:00', address: CLARA_PLACE },
];

const MINUTE_MS = 60_000;

export async function seedDemoBookings(manager: EntityManager, now: Date): Promise<number> {
  const q = <T = unknown>(sql: string, params: unknown[] = []): Promise<T[]> => manager.query(sql, params);
  const existing = new Set((await q<{ reference: string }>('SELECT reference FROM booking WHERE reference IN (?)', [DEMO_BOOKINGS.map((b) => b.reference)])).map((r) => r.reference));
  if (existing.size === DEMO_BOOKINGS.length) return 0;
  // the first time only: Glutwerk confirms automatically (an admin may change it later)
  if (existing.size === 0) await q("UPDATE organisation SET auto_confirm_bookings = 1 WHERE name = 'Glutwerk Mobil'");
  const settings = await quoteSettings(manager);
  let added = 0;
  for (const demo of DEMO_BOOKINGS) {
    if (existing.has(demo.reference)) continue;
    const [org] = await q<{ id: string }>("SELECT id FROM organisation WHERE name = ? AND status = 'approved'", [demo.organisation]);
    const [technician] = await q<{ id: string }>('SELECT id FROM user_account WHERE email = ?', [demo.technician]);
    const [owner] = await q<{ id: string; name: string; email: string; locale: string }>('SELECT id, name, email, locale FROM user_account WHERE email = ?', [demo.owner]);
    const [hours] = org && technician ? await q<{ hours: unknown }>('SELECT hours FROM working_hours WHERE organisation_id = ? AND user_id = ?', [org.id, technician.id]) : [];
    if (!org || !technician || !owner || !hours) continue;
    const vehicle = DEMO_VEHICLES[demo.owner]![0]!;
    const [vehicleRow] = await q<{ id: string }>('SELECT id FROM vehicle WHERE owner_user_id = ? ORDER BY created_at LIMIT 1', [owner.id]);
    const profile = { model: vehicle.model, fuel: vehicle.fuel, factoryHeater: vehicle.factoryHeater, climateControl: vehicle.climateControl, electricalSystemV: vehicle.electricalSystemV, year: vehicle.year };
    const jobAt = demo.address ? ('owner' as const) : ('workshop' as const);
    const plan = await planJob(
      manager,
      { partnerId: org.id, serviceType: demo.serviceType, vehicle: profile, jobAt, place: demo.address, placeCountry: demo.address?.country },
      BODY_PATHS,
      () => new Error(`Seed: ${demo.organisation} is not listed`),
    );
    const zone = (typeof hours.hours === 'string' ? (JSON.parse(hours.hours) as { timeZone: string }) : (hours.hours as { timeZone: string })).timeZone;
    const [h, m] = demo.time.split(':').map(Number);
    const start = DateTime.fromJSDate(now, { zone })
      .startOf('week')
      .plus({ weeks: demo.week, days: demo.weekday - 1 })
      .set({ hour: h, minute: m })
      .toJSDate();
    const end = new Date(start.getTime() + plan.durationMinutes * MINUTE_MS);
    const quote = quoteFor(plan, settings, { supplyDate: localDate(start, zone) });
    const created = new Date(Math.min(now.getTime(), start.getTime()) - 5 * 86_400_000);
    const completed = demo.status === 'completed';
    const id = newId();
    await q(
      `INSERT INTO booking (id, reference, organisation_id, technician_user_id, owner_user_id, offer_id, service_type_id, status, start_at, end_at, time_zone,
         job_at, job_lat, job_lng, address, vehicle, customer, phone, notes, quote, kit, currency, gross_minor,
         checkout_session_id, payment_intent_id, payment_status, authorised_minor, captured_minor, hold_expires_at, reminder_sent_at, created_at)
       VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`,
      [
        id,
        demo.reference,
        org.id,
        technician.id,
        owner.id,
        plan.offer.id,
        plan.serviceType.id,
        demo.status,
        start,
        end,
        zone,
        jobAt,
        plan.location.lat,
        plan.location.lng,
        demo.address ? JSON.stringify({ line: demo.address.line, postalCode: demo.address.postalCode, city: demo.address.city, country: demo.address.country, lat: demo.address.lat, lng: demo.address.lng }) : null,
        JSON.stringify({ ...profile, vehicleId: vehicleRow?.id ?? null }),
        JSON.stringify({ kind: 'consumer', name: owner.name, email: owner.email, locale: owner.locale, companyName: null, vatId: null }),
        null,
        null,
        JSON.stringify(quote),
        JSON.stringify(plan.kit),
        quote.currency,
        quote.grossMinor,
        `seed_cs_${demo.reference}`,
        `seed_pi_${demo.reference}`,
        completed ? 'captured' : 'authorised',
        quote.grossMinor,
        completed ? quote.grossMinor : 0,
        new Date(created.getTime() + 10 * MINUTE_MS),
        completed ? new Date(start.getTime() - 86_400_000) : null,
        created,
      ],
    );
    const steps: [BookingStatus | null, BookingStatus, 'owner' | 'partner' | 'system', string | null][] = [
      [null, 'held', 'owner', null],
      ['held', 'requested', 'system', 'Payment authorised'],
    ];
    if (demo.status !== 'requested') steps.push(['requested', 'confirmed', demo.organisation === 'Glutwerk Mobil' ? 'system' : 'partner', null]);
    if (completed) steps.push(['confirmed', 'in_progress', 'partner', null], ['in_progress', 'completed', 'partner', null]);
    for (const [i, [from, to, actor, note]] of steps.entries()) {
      const at = to === 'in_progress' ? start : to === 'completed' ? end : new Date(created.getTime() + i * MINUTE_MS);
      await q('INSERT INTO booking_event (booking_id, from_status, to_status, actor, actor_user_id, note, at) VALUES (?, ?, ?, ?, ?, ?, ?)', [
        id,
        from,
        to,
        actor,
        actor === 'owner' ? owner.id : actor === 'partner' ? technician.id : null,
        note,
        at,
      ]);
    }
    added++;
  }
  return added;
}
