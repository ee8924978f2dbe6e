// The bookings' scheduled jobs against the payments fake: a lapsed hold is released (its payment
// page closed) and the slot is listed again; a payment whose webhook never came is applied by the
// job; a requested booking nobody confirmed expires at its start with the hold released; the
// reminder goes out once, a day before. Bookings are aged by moving their times back, so the
// jobs run at the real time and touch nothing else in the shared test database.
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runBookingReminders, runExpireHolds } from '../../apps/api/src/services/booking-jobs.service';
import { createTestApp, type TestApp } from '../setup/app';
import { bearer } from '../setup/onboarding';
import { startPaymentsFake, TEST_CARD, type TestPaymentsFake } from '../setup/payments';
import { book, bookablePartner, bookingRequest, bookingRow, deliverWebhooksTo, expectProblem, insertBooking, mails, newOwner, pay, slotStarts, type BookablePartner } from '../setup/bookings';

let t: TestApp;
let fake: TestPaymentsFake;
let P: BookablePartner;

beforeAll(async () => {
  fake = await startPaymentsFake();
  t = await createTestApp(fake.env);
  deliverWebhooksTo(fake, t.app);
  P = await bookablePartner(t.app, t.dataSource);
}, 120_000);
afterAll(async () => {
  await t.close();
  await fake.close();
});

const expireHolds = () => runExpireHolds({ dataSource: t.dataSource, payments: fake.gateway, publicUrl: 'http://emberline.test' });
const lapse = (id: string) => t.dataSource.query('UPDATE booking SET hold_expires_at = ? WHERE id = ?', [new Date(Date.now() - 60_000), id]);

async function held() {
  const owner = await newOwner(t.app, t.dataSource);
  const [start] = await slotStarts(t.app, P.orgId);
  const res = await book(t.app, owner, bookingRequest(P.orgId, start!));
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return { owner, id: res.body.data.id as string, start: start! };
}

describe('expire-holds', () => {
  it('releases a lapsed hold, closes its payment page, and the slot is listed again', async () => {
    const { id, start } = await held();
    expect(await slotStarts(t.app, P.orgId)).not.toContain(start);
    await lapse(id);
    const result = await expireHolds();
    expect(result.skipped).toBe(false);
    expect(result.released).toBeGreaterThanOrEqual(1);
    const row = await bookingRow(t.dataSource, id);
    expect(row.status).toBe('released');
    expect(fake.state().checkoutSessions.find((s) => s.id === row.checkout_session_id)!.status).toBe('expired');
    expect(await slotStarts(t.app, P.orgId)).toContain(start);
    // run again: nothing left to do for it
    await expireHolds();
    expect(Number((await t.dataSource.query("SELECT COUNT(*) AS n FROM booking_event WHERE booking_id = ? AND to_status = 'released'", [id]))[0].n)).toBe(1);
  });

  it('applies a payment whose webhook never arrived instead of releasing the hold', async () => {
    const { id } = await held();
    fake.webhookTarget(null);
    try {
      expect((await pay(fake, t.dataSource, id, TEST_CARD.succeeds)).outcome).toBe('succeeded');
      expect((await bookingRow(t.dataSource, id)).status).toBe('held');
    } finally {
      deliverWebhooksTo(fake, t.app);
    }
    await lapse(id);
    const result = await expireHolds();
    expect(result.paid).toBeGreaterThanOrEqual(1);
    expect(await bookingRow(t.dataSource, id)).toMatchObject({ status: 'requested', payment_status: 'authorised' });
  });

  it('answers BOOKING_PAID when the owner gives up a slot that was paid meanwhile', async () => {
    const { owner, id } = await held();
    fake.webhookTarget(null);
    try {
      await pay(fake, t.dataSource, id, TEST_CARD.succeeds);
      expectProblem(await request(t.app).post(`/api/bookings/${id}/release`).set(bearer(owner)), 409, 'BOOKING_PAID');
      expect((await bookingRow(t.dataSource, id)).status).toBe('held');
    } finally {
      deliverWebhooksTo(fake, t.app);
    }
  });

  it('expires a requested booking nobody confirmed before its start and releases the hold on the card', async () => {
    const { owner, id } = await held();
    await pay(fake, t.dataSource, id, TEST_CARD.succeeds);
    expect((await bookingRow(t.dataSource, id)).status).toBe('requested');
    await t.dataSource.query('UPDATE booking SET start_at = start_at - INTERVAL 3 DAY, end_at = end_at - INTERVAL 3 DAY WHERE id = ?', [id]);
    const result = await expireHolds();
    expect(result.expired).toBeGreaterThanOrEqual(1);
    const row = await bookingRow(t.dataSource, id);
    expect(row).toMatchObject({ status: 'expired', payment_status: 'cancelled' });
    expect(fake.state().paymentIntents.find((pi) => pi.id === row.payment_intent_id)!.status).toBe('canceled');
    expect(await mails(t.dataSource, owner.email, 'booking-expired')).toHaveLength(1);
  });
});

describe('booking-reminders', () => {
  it('sends one reminder a day before a confirmed booking, however often it runs', async () => {
    const owner = await newOwner(t.app, t.dataSource);
    const soon = await insertBooking(t.dataSource, { orgId: P.orgId, technicianId: P.technician.userId, ownerId: owner.userId, offerId: P.offerId, start: new Date(Date.now() + 23 * 3_600_000), status: 'confirmed' });
    const later = await insertBooking(t.dataSource, { orgId: P.orgId, technicianId: P.technician.userId, ownerId: owner.userId, offerId: P.offerId, start: new Date(Date.now() + 30 * 3_600_000), status: 'confirmed' });
    const run = () => runBookingReminders({ dataSource: t.dataSource, publicUrl: 'http://emberline.test' });
    expect((await run()).sent).toBeGreaterThanOrEqual(1);
    await run();
    await Promise.all([run(), run()]);
    const sent = await mails(t.dataSource, owner.email, 'booking-reminder');
    expect(sent).toHaveLength(1);
    expect(sent[0]!.text_body).toContain(soon.reference);
    expect((await bookingRow(t.dataSource, soon.id)).reminder_sent_at).not.toBeNull();
    expect((await bookingRow(t.dataSource, later.id)).reminder_sent_at).toBeNull();
  });
});
