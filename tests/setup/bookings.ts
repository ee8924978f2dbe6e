// Helpers for booking tests: an approved partner that can be booked (offer with a parts kit,
// travel policy, a technician's hours), an owner, a valid booking request, the payments fake's
// webhooks handed to the app through supertest, and a booking row written directly for tests
// that need one without the payment flow.
import request from 'supertest';
import type { DataSource } from 'typeorm';
import type { Express } from 'express';
import { expect } from 'vitest';
import { newId } from '../../apps/api/src/lib/secure-token';
import { signUpAndVerify, type SignedIn } from './accounts';
import { approvedPartner, bearer } from './onboarding';
import type { TestPaymentsFake } from './payments';

/** Near the test area's base (Innsbruck, 80 km, mobile). */
export const INNSBRUCK_PLACE = { lat: 47.26, lng: 11.39 };
/** Linz, about 190 km from Innsbruck: outside the area. */
export const LINZ = { lat: 48.3069, lng: 14.2858 };

export const ADDRESS = { line: 'Museumstraße 5', postalCode: '6020', city: 'Innsbruck', country: 'AT', ...INNSBRUCK_PLACE };
export const VEHICLE = { model: 'Test van', fuel: 'diesel', factoryHeater: 'coolant_auxiliary', climateControl: 'automatic', electricalSystemV: 12, year: 2021 };

const DAY = [{ start: '08:00', end: '17:00' }];
export const EVERY_DAY = { monday: DAY, tuesday: DAY, wednesday: DAY, thursday: DAY, friday: DAY, saturday: DAY, sunday: DAY };

export interface BookablePartner {
  orgId: string;
  admin: SignedIn;
  technician: SignedIn;
  partId: string;
  offerId: string;
}

/**
 * An approved mobile partner in Innsbruck offering handset pairing (45.00 labour, 30 minutes) with
 * one handset (15.00) in its kit, travel free within 20 km then 0.80/km, and a technician working
 * every day 08:00–17:00 (Vienna) with an hour's notice and no buffer.
 */
export async function bookablePartner(app: Express, ds: DataSource, o: { cancellation?: { freeUntilHours: number; feeMinor: number }; stock?: number; area?: object } = {}): Promise<BookablePartner> {
  const p = await approvedPartner(app, ds, { technician: true, area: o.area });
  const part = await request(app).post(`/api/orgs/${p.orgId}/parts`).set(bearer(p.admin)).send({ name: 'Handset', partType: 'handset', unitPriceMinor: 1500, currency: 'EUR', stock: o.stock ?? 5 }).expect(201);
  const offer = await request(app)
    .post(`/api/orgs/${p.orgId}/offers`)
    .set(bearer(p.admin))
    .send({
      serviceTypeCode: 'handset-pairing',
      priceMinor: 4500,
      currency: 'EUR',
      durationMinutes: 30,
      technicianUserIds: [p.technician!.userId],
      partsKit: [{ partId: part.body.data.id, quantity: 1 }],
      deposit: { kind: 'none' },
      cancellation: o.cancellation ?? { freeUntilHours: 24, feeMinor: 0 },
    })
    .expect(201);
  await request(app).put(`/api/orgs/${p.orgId}/travel-policy`).set(bearer(p.admin)).send({ freeWithinKm: 20, ratePerKmMinor: 80, currency: 'EUR', maxDistanceKm: 150 }).expect(200);
  await request(app)
    .put(`/api/orgs/${p.orgId}/technicians/${p.technician!.userId}/hours`)
    .set(bearer(p.admin))
    .send({ timeZone: 'Europe/Vienna', weekly: EVERY_DAY, minimumNoticeMinutes: 60, bookingHorizonDays: 60, bufferMinutes: 0 })
    .expect(200);
  return { orgId: p.orgId, admin: p.admin, technician: p.technician!, partId: part.body.data.id, offerId: offer.body.data.id };
}

export const newOwner = (app: Express, ds: DataSource) => signUpAndVerify(app, ds, 'owner');

/** The partner's bookable starts for handset pairing at the Innsbruck place. */
export async function slotStarts(app: Express, partnerId: string, o: { from?: string; days?: number } = {}): Promise<string[]> {
  const res = await request(app)
    .get(`/api/partners/${partnerId}/slots`)
    .query({ serviceType: 'handset-pairing', ...INNSBRUCK_PLACE, days: o.days ?? 3, ...(o.from ? { from: o.from } : {}) })
    .expect(200);
  return (res.body.data.organisation as { start: string }[]).map((s) => s.start);
}

export function bookingRequest(partnerId: string, start: string, over: Record<string, unknown> = {}) {
  return { partnerId, serviceType: 'handset-pairing', start, jobAt: 'owner', address: ADDRESS, vehicle: VEHICLE, customer: { kind: 'consumer' }, phone: '+43 660 1234567', ...over };
}

export const book = (app: Express, who: SignedIn, body: object) => request(app).post('/api/bookings').set(bearer(who)).send(body);

/** Hands every webhook of the fake to the app through supertest; answers the status the app gave. */
export function deliverWebhooksTo(fake: TestPaymentsFake, app: Express): void {
  fake.webhookTarget((payload, headers) =>
    request(app)
      .post('/api/payments/webhook')
      .set(headers)
      .send(payload)
      .then((r) => r.status),
  );
}

export const bookingRow = async (ds: DataSource, id: string) => (await ds.query('SELECT * FROM booking WHERE id = ?', [id]))[0];
/** Moves a booking's appointment to begin now, its length kept: its day has come and the job may start. */
export const appointmentStartsNow = (ds: DataSource, id: string) =>
  ds.query('UPDATE booking SET end_at = UTC_TIMESTAMP(3) + INTERVAL TIMESTAMPDIFF(MICROSECOND, start_at, end_at) MICROSECOND, start_at = UTC_TIMESTAMP(3) WHERE id = ?', [id]);
export const bookingCount = async (ds: DataSource, where = '1 = 1', params: unknown[] = []) => Number((await ds.query(`SELECT COUNT(*) AS n FROM booking WHERE ${where}`, params))[0].n);

/** Pays the booking's checkout with a test card and waits until the webhooks are handled. */
export async function pay(fake: TestPaymentsFake, ds: DataSource, bookingId: string, card: string) {
  const row = await bookingRow(ds, bookingId);
  const outcome = fake.pay(row.checkout_session_id, card);
  await fake.idle();
  return outcome;
}

/**
 * A booking row written directly (status and payment as given, a `seed_` payment so no provider
 * call is made), for tests about reading, listing and tenancy rather than the payment flow.
 */
export async function insertBooking(
  ds: DataSource,
  o: { orgId: string; technicianId: string; ownerId: string; offerId: string; start: Date; status?: string; reference?: string; customerName?: string; customerEmail?: string },
): Promise<{ id: string; reference: string }> {
  const id = newId();
  const reference = o.reference ?? `T-${id.slice(0, 8).toUpperCase()}`;
  const [st] = await ds.query("SELECT id FROM service_type WHERE code = 'handset-pairing'");
  const quote = {
    currency: 'EUR',
    minorUnits: 2,
    lines: [{ kind: 'labour', description: 'Handset pairing', netMinor: 4500, vatRateBp: 2000, vatMinor: 900, grossMinor: 5400 }],
    netMinor: 4500,
    vatMinor: 900,
    grossMinor: 5400,
    vat: { treatment: 'standard', country: 'AT', rateBp: 2000, validFrom: '2016-01-01', note: null },
    depositMinor: 0,
    cancellation: { freeUntilHours: 24, feeMinor: 0 },
    partner: { commissionBp: 1200, commissionMinor: 540, partnerShareMinor: 3854, processingFeeEstimateMinor: 106 },
  };
  await ds.query(
    `INSERT INTO booking (id, reference, organisation_id, technician_user_id, owner_user_id, offer_id, service_type_id, status, start_at, end_at, time_zone, job_at, job_lat, job_lng,
       address, vehicle, customer, quote, kit, currency, gross_minor, payment_intent_id, payment_status, authorised_minor)
     VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, 'Europe/Vienna', 'owner', ?, ?, ?, ?, ?, ?, '[]', 'EUR', 5400, ?, 'authorised', 5400)`,
    [
      id,
      reference,
      o.orgId,
      o.technicianId,
      o.ownerId,
      o.offerId,
      st.id,
      o.status ?? 'requested',
      o.start,
      new Date(o.start.getTime() + 30 * 60_000),
      INNSBRUCK_PLACE.lat,
      INNSBRUCK_PLACE.lng,
      JSON.stringify(ADDRESS),
      JSON.stringify(VEHICLE),
      JSON.stringify({ kind: 'consumer', name: o.customerName ?? 'Test owner', email: o.customerEmail ?? 'owner@test.example', locale: 'en', companyName: null, vatId: null }),
      JSON.stringify(quote),
      `seed_pi_${id}`,
    ],
  );
  await ds.query("INSERT INTO booking_event (booking_id, from_status, to_status, actor, note) VALUES (?, NULL, 'held', 'owner', NULL)", [id]);
  return { id, reference };
}

/** The outbox rows of a template to an address, newest last. */
export async function mails(ds: DataSource, to: string, template: string): Promise<{ subject: string; text_body: string; attachments: unknown }[]> {
  return ds.query('SELECT subject, text_body, attachments FROM mail_outbox WHERE to_address = ? AND template = ? ORDER BY created_at, id', [to, template]);
}

export function expectProblem(res: request.Response, status: number, code: string) {
  expect(res.status, JSON.stringify(res.body)).toBe(status);
  expect(res.body.code).toBe(code);
}
