// The job on its day: a confirmed job starts only inside the network's start window on its local
// day, is marked done only after it started, keeps its time taken once done, and the owner gets a
// receipt by e-mail when the payment is taken.
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../setup/app';
import { bearer } from '../setup/onboarding';
import { startPaymentsFake, TEST_CARD, type TestPaymentsFake } from '../setup/payments';
import { appointmentStartsNow, book, bookablePartner, bookingRequest, bookingRow, deliverWebhooksTo, expectProblem, insertBooking, mails, newOwner, pay, slotStarts, type BookablePartner } from '../setup/bookings';

let t: TestApp;
let fake: TestPaymentsFake;
let P: BookablePartner;

const HOUR_MS = 3_600_000;
const DAY_MS = 86_400_000;

beforeAll(async () => {
  fake = await startPaymentsFake();
  t = await createTestApp(fake.env);
  deliverWebhooksTo(fake, t.app);
  P = await bookablePartner(t.app, t.dataSource, { stock: 5 });
}, 120_000);
afterAll(async () => {
  await t.close();
  await fake.close();
});

const decide = (id: string, body: object, who = P.technician) => request(t.app).post(`/api/orgs/${P.orgId}/bookings/${id}/decision`).set(bearer(who)).send(body);

/** A paid and accepted booking of a new owner at the first free start from `fromDays` days on. */
async function confirmed(fromDays: number) {
  const owner = await newOwner(t.app, t.dataSource);
  const start = (await slotStarts(t.app, P.orgId, { from: new Date(Date.now() + fromDays * DAY_MS).toISOString(), days: 2 }))[0]!;
  const res = await book(t.app, owner, bookingRequest(P.orgId, start));
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  const booking = res.body.data as { id: string; reference: string; start: string };
  expect((await pay(fake, t.dataSource, booking.id, TEST_CARD.succeeds)).outcome).toBe('succeeded');
  await decide(booking.id, { action: 'accept' }).expect(200);
  return { owner, booking };
}

describe('starting and finishing a job', () => {
  it('refuses to start a job days before its appointment with 409 START_TOO_EARLY and the earliest start', async () => {
    const { booking } = await confirmed(3);
    const res = await decide(booking.id, { action: 'start' });
    expectProblem(res, 409, 'START_TOO_EARLY');
    // the network's default window: two hours before the start (slots lie inside 08:00–17:00, so on the same day)
    expect(Date.parse(res.body.earliestStart)).toBe(Date.parse(booking.start) - 2 * HOUR_MS);
    expect(res.body.detail).toContain(booking.reference);
    expect((await bookingRow(t.dataSource, booking.id)).status).toBe('confirmed');
    // the Console reads the same window to grey out its button
    const seen = (await request(t.app).get(`/api/orgs/${P.orgId}/bookings/${booking.id}`).set(bearer(P.technician)).expect(200)).body.data;
    expect(Date.parse(seen.startWindow.from)).toBe(Date.parse(res.body.earliestStart));
  });

  it('reads the window from the network setting', async () => {
    const { booking } = await confirmed(3);
    await t.dataSource.query("UPDATE network_setting SET value = '{\"minutes\":30}' WHERE setting_key = 'job-start-window'");
    try {
      const res = await decide(booking.id, { action: 'start' });
      expectProblem(res, 409, 'START_TOO_EARLY');
      expect(Date.parse(res.body.earliestStart)).toBe(Date.parse(booking.start) - 30 * 60_000);
    } finally {
      await t.dataSource.query("UPDATE network_setting SET value = '{\"minutes\":120}' WHERE setting_key = 'job-start-window'");
    }
  });

  it('refuses to mark a job done before it was started (409 NOT_STARTED) and takes no money', async () => {
    const { booking } = await confirmed(3);
    expectProblem(await decide(booking.id, { action: 'complete' }), 409, 'NOT_STARTED');
    const row = await bookingRow(t.dataSource, booking.id);
    expect(row).toMatchObject({ status: 'confirmed', payment_status: 'authorised' });
    expect(fake.state().requests.some((r) => r.path.endsWith('/capture') && r.idempotencyKey === `booking:${booking.id}:capture`)).toBe(false);
  });

  it('starts on the day, then completes: the payment is taken and the owner gets the receipt by e-mail', async () => {
    const { owner, booking } = await confirmed(3);
    await appointmentStartsNow(t.dataSource, booking.id);
    await decide(booking.id, { action: 'start' }).expect(200);
    // under way, the owner is given a way to reach the partner
    const underWay = (await request(t.app).get(`/api/bookings/${booking.id}`).set(bearer(owner)).expect(200)).body.data;
    expect(underWay).toMatchObject({ status: 'in_progress', partner: { email: P.admin.email } });
    const done = (await decide(booking.id, { action: 'complete' }).expect(200)).body.data;
    expect(done).toMatchObject({ status: 'completed', payment: { status: 'captured', capturedMinor: 7200 } });
    const [receipt, ...more] = await mails(t.dataSource, owner.email, 'booking-completed');
    expect(more).toHaveLength(0);
    expect(receipt!.subject).toContain(booking.reference);
    expect(receipt!.text_body).toContain('€72.00');
    expect(receipt!.text_body).toContain(booking.reference);
    expect(receipt!.text_body).toContain(done.partner.name);
  });

  it('refuses to start once the appointment\'s local day is over (START_DAY_OVER)', async () => {
    const { booking } = await confirmed(3);
    await t.dataSource.query('UPDATE booking SET start_at = UTC_TIMESTAMP(3) - INTERVAL 2 DAY, end_at = UTC_TIMESTAMP(3) - INTERVAL 2 DAY + INTERVAL 30 MINUTE WHERE id = ?', [booking.id]);
    expectProblem(await decide(booking.id, { action: 'start' }), 409, 'START_DAY_OVER');
  });
});

describe('the time of a finished job', () => {
  it('is not offered again as a slot, nor bookable, once the job is completed', async () => {
    // from midnight UTC four days ahead over three days: some time is free whatever the hour of the run
    const day = new Date(Math.floor(Date.now() / DAY_MS + 4) * DAY_MS).toISOString();
    const start = (await slotStarts(t.app, P.orgId, { from: day, days: 3 }))[0]!;
    const owner = await newOwner(t.app, t.dataSource);
    await insertBooking(t.dataSource, { orgId: P.orgId, technicianId: P.technician.userId, ownerId: owner.userId, offerId: P.offerId, start: new Date(start), status: 'completed' });
    expect(await slotStarts(t.app, P.orgId, { from: day, days: 3 })).not.toContain(start);
    expectProblem(await book(t.app, await newOwner(t.app, t.dataSource), bookingRequest(P.orgId, start)), 409, 'SLOT_TAKEN');
  });
});
