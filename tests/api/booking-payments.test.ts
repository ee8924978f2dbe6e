// Bookings with the payments fake: pay with a test card, the signed webhook moves the booking on,
// the partner accepts, completes (the payment is captured) or declines (the hold is released),
// the owner cancels inside or outside the free window (a fee is captured), moves or gives up a
// booking; a declined card keeps the hold for another card; webhooks are verified and applied exactly once.
// Test cards: Stripe documentation: testing — test card numbers. Calendar: RFC 5545.
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { signatureHeader } from '../../apps/api/src/fakes/payments/webhooks';
import { WEBHOOK_SIGNATURE_HEADER } from '../../apps/api/src/payments/gateway';
import { calendarUid } from '../../apps/api/src/services/booking-calendar';
import { createTestApp, type TestApp } from '../setup/app';
import type { SignedIn } from '../setup/accounts';
import { bearer } from '../setup/onboarding';
import { startPaymentsFake, TEST_CARD, TEST_PAYMENTS_WEBHOOK_SECRET, type TestPaymentsFake } from '../setup/payments';
import {
  appointmentStartsNow,
  book,
  bookablePartner,
  bookingRequest,
  bookingRow,
  deliverWebhooksTo,
  expectProblem,
  mails,
  newOwner,
  pay,
  slotStarts,
  type BookablePartner,
} from '../setup/bookings';

let t: TestApp;
let fake: TestPaymentsFake;
let P: BookablePartner;

const FEE = 2000;
const DAY_MS = 86_400_000;

beforeAll(async () => {
  fake = await startPaymentsFake();
  // every test signs up owners of its own: more than the 20 sign-ups an hour one address may make
  t = await createTestApp(fake.env, { limits: { signUp: { perIp: 100, perAccount: 5, windowMinutes: 60 } } });
  deliverWebhooksTo(fake, t.app);
  // free until 48 hours before the start, then a 20.00 fee
  P = await bookablePartner(t.app, t.dataSource, { cancellation: { freeUntilHours: 48, feeMinor: FEE }, stock: 5 });
}, 120_000);
afterAll(async () => {
  await t.close();
  await fake.close();
});

const decide = (id: string, body: object, who = P.admin) => request(t.app).post(`/api/orgs/${P.orgId}/bookings/${id}/decision`).set(bearer(who)).send(body);
const mine = (who: SignedIn, id: string) => request(t.app).get(`/api/bookings/${id}`).set(bearer(who)).expect(200).then((r) => r.body.data);
const intentOf = (id: string) => fake.state().paymentIntents.find((pi) => pi.id === id)!;
const sessionOf = (id: string) => fake.state().checkoutSessions.find((s) => s.id === id)!;
const eventsOf = async (id: string) => Number((await t.dataSource.query('SELECT COUNT(*) AS n FROM booking_event WHERE booking_id = ?', [id]))[0].n);
const paymentEvents = async () => Number((await t.dataSource.query('SELECT COUNT(*) AS n FROM payment_event'))[0].n);

/** Another owner racing for the same time (one account: sign-ups are rate limited). */
let rivalOwner: Promise<SignedIn> | null = null;
const rival = () => (rivalOwner ??= newOwner(t.app, t.dataSource));

/** A held booking of a new owner at the first free start (from `fromDays` days on). */
async function held(o: { fromDays?: number } = {}) {
  const owner = await newOwner(t.app, t.dataSource);
  const starts = await slotStarts(t.app, P.orgId, o.fromDays ? { from: new Date(Date.now() + o.fromDays * DAY_MS).toISOString(), days: 2 } : {});
  const res = await book(t.app, owner, bookingRequest(P.orgId, starts[0]!));
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return { owner, booking: res.body.data as { id: string; start: string; reference: string }, start: starts[0]! };
}

/** A booking paid with the test card that succeeds, then (optionally) accepted by the partner. */
async function paid(o: { fromDays?: number; accept?: boolean } = {}) {
  const h = await held(o);
  expect((await pay(fake, t.dataSource, h.booking.id, TEST_CARD.succeeds)).outcome).toBe('succeeded');
  if (o.accept) await decide(h.booking.id, { action: 'accept' }).expect(200);
  return h;
}

/** The lines of an iCalendar text with folded lines joined (RFC 5545, 3.1). */
const icsLines = (text: string) => text.replace(/\r\n[ \t]/g, '').split('\r\n');
const icsStamp = (iso: string) => iso.replace(/[-:]/g, '').replace(/\.\d{3}/, '');

describe('paying and the partner\'s decisions', () => {
  it('runs the happy path: pay → requested → accepted (with a calendar invitation) → started → completed and captured', async () => {
    const { owner, booking } = await held();
    expect((await pay(fake, t.dataSource, booking.id, TEST_CARD.succeeds)).outcome).toBe('succeeded');

    let b = await mine(owner, booking.id);
    expect(b).toMatchObject({ status: 'requested', payment: { status: 'authorised', authorisedMinor: 7200, capturedMinor: 0 }, checkoutUrl: null, holdExpiresAt: null });
    expect(b.history.map((e: { to: string }) => e.to)).toEqual(['held', 'requested']);
    const row = await bookingRow(t.dataSource, booking.id);
    expect(intentOf(row.payment_intent_id)).toMatchObject({ status: 'requires_capture', amount_capturable: 7200 });
    expect(await mails(t.dataSource, owner.email, 'booking-requested')).toHaveLength(1);
    expect(await mails(t.dataSource, P.admin.email, 'partner-booking-new')).not.toHaveLength(0);
    expect((await mails(t.dataSource, P.technician.email, 'partner-booking-new')).some((m) => m.text_body.includes(booking.reference))).toBe(true);

    b = (await decide(booking.id, { action: 'accept' }, P.technician).expect(200)).body.data;
    expect(b.status).toBe('confirmed');
    const [confirmation] = await mails(t.dataSource, owner.email, 'booking-confirmed');
    const attachments = (typeof confirmation!.attachments === 'string' ? JSON.parse(confirmation!.attachments) : confirmation!.attachments) as { filename: string; contentType: string; content: string }[];
    expect(attachments).toHaveLength(1);
    expect(attachments[0]!.filename).toBe(`booking-${booking.reference}.ics`);
    expect(attachments[0]!.contentType).toMatch(/^text\/calendar/);
    // RFC 5545: a VCALENDAR with one VEVENT; DTSTART in UTC ("Z" form, 3.3.5) is the booking's start; the UID (3.8.4.7) is stable
    const lines = icsLines(Buffer.from(attachments[0]!.content, 'base64').toString('utf8'));
    expect(lines[0]).toBe('BEGIN:VCALENDAR');
    expect(lines).toContain('VERSION:2.0');
    expect(lines).toContain('BEGIN:VEVENT');
    expect(lines).toContain(`DTSTART:${icsStamp(booking.start)}`);
    expect(lines).toContain(`DTEND:${icsStamp(new Date(Date.parse(booking.start) + 30 * 60_000).toISOString())}`);
    expect(lines).toContain(`UID:${calendarUid(booking.id)}`);
    expect(lines).toContain('STATUS:CONFIRMED');
    expect(lines.filter((l) => l === 'END:VCALENDAR')).toHaveLength(1);
    const download = await request(t.app).get(`/api/bookings/${booking.id}/calendar.ics`).set(bearer(owner)).expect(200);
    expect(download.headers['content-type']).toMatch(/^text\/calendar/);
    expect(icsLines(download.text)).toContain(`UID:${calendarUid(booking.id)}`);

    // the job's day has come: it may be started from two hours before
    await appointmentStartsNow(t.dataSource, booking.id);
    await decide(booking.id, { action: 'start' }, P.technician).expect(200);
    b = (await decide(booking.id, { action: 'complete' }, P.technician).expect(200)).body.data;
    expect(b).toMatchObject({ status: 'completed', payment: { status: 'captured', capturedMinor: 7200 } });
    expect(intentOf(row.payment_intent_id)).toMatchObject({ status: 'succeeded', amount_received: 7200 });
    expect(fake.state().requests.some((r) => r.path.endsWith('/capture') && r.idempotencyKey === `booking:${booking.id}:capture`)).toBe(true);
    // the kit's one handset left the stock
    expect((await t.dataSource.query('SELECT stock FROM part WHERE id = ?', [P.partId]))[0].stock).toBe(4);
    expect((await mine(owner, booking.id)).status).toBe('completed');
    expect(((await request(t.app).get('/api/bookings').set(bearer(owner)).expect(200)).body.data as { id: string }[]).map((x) => x.id)).toContain(booking.id);
  });

  it('confirms at once for an organisation that auto-confirms, with only the confirmation e-mail', async () => {
    await t.dataSource.query('UPDATE organisation SET auto_confirm_bookings = 1 WHERE id = ?', [P.orgId]);
    try {
      const { owner, booking } = await paid();
      const b = await mine(owner, booking.id);
      expect(b.status).toBe('confirmed');
      expect(b.history.map((e: { to: string; actor: string }) => `${e.to}/${e.actor}`)).toEqual(['held/owner', 'requested/system', 'confirmed/system']);
      expect(await mails(t.dataSource, owner.email, 'booking-requested')).toHaveLength(0);
      expect(await mails(t.dataSource, owner.email, 'booking-confirmed')).toHaveLength(1);
    } finally {
      await t.dataSource.query('UPDATE organisation SET auto_confirm_bookings = 0 WHERE id = ?', [P.orgId]);
    }
  });

  it('keeps the hold and the payment page after a declined card, so another card can pay until the hold lapses', async () => {
    const { owner, booking, start } = await held();
    expect((await pay(fake, t.dataSource, booking.id, TEST_CARD.declined)).outcome).toBe('declined');
    let b = await mine(owner, booking.id);
    expect(b).toMatchObject({ status: 'held', payment: { status: 'failed', authorisedMinor: 0 } });
    expect(b.checkoutUrl).toBeTruthy();
    expect(Date.parse(b.holdExpiresAt)).toBeGreaterThan(Date.now());
    expect(b.history.at(-1).note).toContain('generic_decline');
    // the time stays the owner's: nobody else can book it, and it is in her list
    expect(sessionOf((await bookingRow(t.dataSource, booking.id)).checkout_session_id).status).toBe('open');
    expect(await slotStarts(t.app, P.orgId)).not.toContain(start);
    expectProblem(await book(t.app, await rival(), bookingRequest(P.orgId, start)), 409, 'SLOT_TAKEN');
    expect(((await request(t.app).get('/api/bookings').set(bearer(owner)).expect(200)).body.data as { id: string }[]).map((x) => x.id)).toEqual([booking.id]);
    // another card on the same page pays
    expect((await pay(fake, t.dataSource, booking.id, TEST_CARD.succeeds)).outcome).toBe('succeeded');
    b = await mine(owner, booking.id);
    expect(b).toMatchObject({ status: 'requested', payment: { status: 'authorised', authorisedMinor: 7200 } });
    expect(b.history.map((e: { to: string }) => e.to)).toEqual(['held', 'held', 'requested']);
  });

  it('resumes the owner\'s own hold when she books the same time again (back from the payment page)', async () => {
    const { owner, booking, start } = await held();
    const again = await book(t.app, owner, bookingRequest(P.orgId, start, { phone: '+43 512 000000', notes: 'Gate code 42' }));
    expect(again.status, JSON.stringify(again.body)).toBe(201);
    expect(again.body.data).toMatchObject({ id: booking.id, status: 'held', customer: { phone: '+43 512 000000' }, notes: 'Gate code 42' });
    const row = await bookingRow(t.dataSource, booking.id);
    expect(again.body.data.checkoutUrl).toBe(row.checkout_url);
    expect(fake.state().checkoutSessions.filter((s) => String(s.success_url).includes(booking.id))).toHaveLength(1);
    // after a decline too; another owner still races and loses
    expect((await pay(fake, t.dataSource, booking.id, TEST_CARD.declined)).outcome).toBe('declined');
    expect((await book(t.app, owner, bookingRequest(P.orgId, start))).body.data.id).toBe(booking.id);
    expectProblem(await book(t.app, await rival(), bookingRequest(P.orgId, start)), 409, 'SLOT_TAKEN');
    // a released hold is not resumed: a new booking takes the time
    await request(t.app).post(`/api/bookings/${booking.id}/release`).set(bearer(owner)).expect(200);
    const fresh = await book(t.app, owner, bookingRequest(P.orgId, start));
    expect(fresh.status).toBe(201);
    expect(fresh.body.data.id).not.toBe(booking.id);
  });

  it('treats insufficient funds like any declined card', async () => {
    const { owner, booking } = await held();
    expect((await pay(fake, t.dataSource, booking.id, TEST_CARD.insufficientFunds)).outcome).toBe('declined');
    expect((await mine(owner, booking.id)).history.at(-1).note).toContain('insufficient_funds');
  });

  it('lets the partner decline a requested booking: the hold on the card is cancelled and the owner told why', async () => {
    const { owner, booking } = await paid();
    const b = (await decide(booking.id, { action: 'decline', reason: 'The technician is ill that day' }).expect(200)).body.data;
    expect(b).toMatchObject({ status: 'declined', payment: { status: 'cancelled', capturedMinor: 0 } });
    const row = await bookingRow(t.dataSource, booking.id);
    expect(intentOf(row.payment_intent_id)).toMatchObject({ status: 'canceled', amount_received: 0 });
    expect(fake.state().requests.some((r) => r.path.endsWith('/cancel') && r.idempotencyKey === `booking:${booking.id}:cancel-authorisation`)).toBe(true);
    const [mail] = await mails(t.dataSource, owner.email, 'booking-declined');
    expect(mail!.text_body).toContain('The technician is ill that day');
  });

  it('records a no-show after the start and takes only the cancellation fee', async () => {
    const { owner, booking } = await paid({ accept: true });
    expectProblem(await decide(booking.id, { action: 'no-show' }), 409, 'BOOKING_STATE');
    // the start has passed
    await t.dataSource.query('UPDATE booking SET start_at = start_at - INTERVAL 2 DAY, end_at = end_at - INTERVAL 2 DAY WHERE id = ?', [booking.id]);
    const b = (await decide(booking.id, { action: 'no-show' }, P.technician).expect(200)).body.data;
    expect(b).toMatchObject({ status: 'no_show', payment: { status: 'captured', capturedMinor: FEE } });
    expect(intentOf((await bookingRow(t.dataSource, booking.id)).payment_intent_id)).toMatchObject({ status: 'succeeded', amount_received: FEE });
    expect((await mine(owner, booking.id)).status).toBe('no_show');
  });

  it('never takes the stock below zero on completion', async () => {
    const { booking } = await paid({ accept: true });
    await appointmentStartsNow(t.dataSource, booking.id);
    await decide(booking.id, { action: 'start' }).expect(200);
    await t.dataSource.query('UPDATE part SET stock = 0 WHERE id = ?', [P.partId]);
    await decide(booking.id, { action: 'complete' }).expect(200);
    expect((await t.dataSource.query('SELECT stock FROM part WHERE id = ?', [P.partId]))[0].stock).toBe(0);
  });

  it('lets the partner cancel a confirmed booking, releasing the hold', async () => {
    const { owner, booking } = await paid({ accept: true });
    const b = (await decide(booking.id, { action: 'cancel', reason: 'Our van broke down' }).expect(200)).body.data;
    expect(b).toMatchObject({ status: 'cancelled_by_partner', payment: { status: 'cancelled' } });
    expect(await mails(t.dataSource, owner.email, 'booking-declined')).toHaveLength(1);
  });
});

describe('the owner\'s changes', () => {
  it('cancels for free more than 48 hours before the start: the hold is released', async () => {
    const { owner, booking } = await paid({ fromDays: 4, accept: true });
    expect((await mine(owner, booking.id)).cancellationNow).toEqual({ allowed: true, feeMinor: 0, refundMinor: 7200 });
    const b = (await request(t.app).post(`/api/bookings/${booking.id}/cancel`).set(bearer(owner)).send({ reason: 'Sold the van' }).expect(200)).body.data;
    expect(b).toMatchObject({ status: 'cancelled_by_owner', payment: { status: 'cancelled', capturedMinor: 0 } });
    expect(intentOf((await bookingRow(t.dataSource, booking.id)).payment_intent_id).status).toBe('canceled');
    const [mail] = await mails(t.dataSource, owner.email, 'booking-cancelled');
    expect(mail!.text_body).toContain('€0.00');
    expect(await mails(t.dataSource, P.admin.email, 'partner-booking-cancelled')).not.toHaveLength(0);
  });

  it('captures only the fee when a confirmed booking is cancelled inside the 48 hours', async () => {
    const { owner, booking } = await paid({ accept: true });
    expect((await mine(owner, booking.id)).cancellationNow).toEqual({ allowed: true, feeMinor: FEE, refundMinor: 7200 - FEE });
    const b = (await request(t.app).post(`/api/bookings/${booking.id}/cancel`).set(bearer(owner)).send({}).expect(200)).body.data;
    expect(b).toMatchObject({ status: 'cancelled_by_owner', payment: { status: 'captured', capturedMinor: FEE } });
    expect(intentOf((await bookingRow(t.dataSource, booking.id)).payment_intent_id)).toMatchObject({ status: 'succeeded', amount_received: FEE });
    const [mail] = await mails(t.dataSource, owner.email, 'booking-cancelled');
    expect(mail!.text_body).toContain('€20.00');
    expect(mail!.text_body).toContain('€52.00');
  });

  it('cancels a requested booking for free (the partner has not accepted yet)', async () => {
    const { owner, booking } = await paid();
    const b = (await request(t.app).post(`/api/bookings/${booking.id}/cancel`).set(bearer(owner)).send({}).expect(200)).body.data;
    expect(b).toMatchObject({ status: 'cancelled_by_owner', payment: { status: 'cancelled', capturedMinor: 0 } });
  });

  it('moves a booking while cancelling is free, and not inside the 48 hours', async () => {
    const late = await paid({ accept: true });
    const closed = await request(t.app).post(`/api/bookings/${late.booking.id}/reschedule`).set(bearer(late.owner)).send({ start: late.start });
    expectProblem(closed, 409, 'RESCHEDULE_CLOSED');
    expect(closed.body.detail).toContain('48 hours');
    // a start without a UTC offset is a field error, and the booking keeps its time
    const malformed = await request(t.app).post(`/api/bookings/${late.booking.id}/reschedule`).set(bearer(late.owner)).send({ start: '2027-01-12 09:00' }).expect(400);
    expect((malformed.body.errors as { path: string }[]).map((e) => e.path)).toEqual(['start']);
    expect((await request(t.app).get(`/api/bookings/${late.booking.id}`).set(bearer(late.owner)).expect(200)).body.data.start).toBe(late.booking.start);

    const early = await paid({ fromDays: 4, accept: true });
    const target = (await slotStarts(t.app, P.orgId, { from: new Date(Date.now() + 5 * DAY_MS).toISOString(), days: 2 }))[0]!;
    const moved = (await request(t.app).post(`/api/bookings/${early.booking.id}/reschedule`).set(bearer(early.owner)).send({ start: target }).expect(200)).body.data;
    expect(moved).toMatchObject({ status: 'confirmed', start: target });
    expect(moved.history.at(-1)).toMatchObject({ from: 'confirmed', to: 'confirmed', actor: 'owner' });
    const [mail] = await mails(t.dataSource, early.owner.email, 'booking-rescheduled');
    const attachment = (typeof mail!.attachments === 'string' ? JSON.parse(mail!.attachments) : mail!.attachments)[0];
    // the same event, updated: same UID, a higher SEQUENCE (RFC 5545, 3.8.7.4)
    const lines = icsLines(Buffer.from(attachment.content, 'base64').toString('utf8'));
    expect(lines).toContain(`UID:${calendarUid(early.booking.id)}`);
    expect(lines).toContain('SEQUENCE:1');
    expect(lines).toContain(`DTSTART:${icsStamp(target)}`);
    // the old start is free again, the new one taken
    const starts = await slotStarts(t.app, P.orgId, { from: new Date(Date.now() + 4 * DAY_MS).toISOString(), days: 3 });
    expect(starts).toContain(early.start);
    expect(starts).not.toContain(target);
    // a taken start is refused
    expectProblem(await request(t.app).post(`/api/bookings/${early.booking.id}/reschedule`).set(bearer(early.owner)).send({ start: late.start }), 409, 'SLOT_TAKEN');
  });

  it('gives up a held slot when the owner leaves the payment page, and refuses once it is paid', async () => {
    const { owner, booking, start } = await held();
    const b = (await request(t.app).post(`/api/bookings/${booking.id}/release`).set(bearer(owner)).expect(200)).body.data;
    expect(b.status).toBe('released');
    expect(sessionOf((await bookingRow(t.dataSource, booking.id)).checkout_session_id).status).toBe('expired');
    expect(await slotStarts(t.app, P.orgId)).toContain(start);
    await request(t.app).post(`/api/bookings/${booking.id}/release`).set(bearer(owner)).expect(200);

    const p = await paid();
    expectProblem(await request(t.app).post(`/api/bookings/${p.booking.id}/release`).set(bearer(p.owner)), 409, 'BOOKING_STATE');
  });
});

describe('the webhook', () => {
  it('refuses a bad or missing signature with 400 and changes nothing', async () => {
    const { booking } = await held();
    const row = await bookingRow(t.dataSource, booking.id);
    const payload = JSON.stringify({ id: 'evt_forged_1', object: 'event', type: 'checkout.session.expired', data: { object: { id: row.checkout_session_id, object: 'checkout.session', metadata: { booking_id: booking.id } } } });
    const before = await paymentEvents();
    const forged = await request(t.app).post('/api/payments/webhook').set('content-type', 'application/json').set(WEBHOOK_SIGNATURE_HEADER, signatureHeader(payload, 'whsec_not_ours')).send(payload);
    expectProblem(forged, 400, 'WEBHOOK_SIGNATURE_INVALID');
    expectProblem(await request(t.app).post('/api/payments/webhook').set('content-type', 'application/json').send(payload), 400, 'WEBHOOK_SIGNATURE_INVALID');
    // signed, then changed: the signature covers the bytes
    const header = signatureHeader(payload, TEST_PAYMENTS_WEBHOOK_SECRET);
    expectProblem(await request(t.app).post('/api/payments/webhook').set('content-type', 'application/json').set(WEBHOOK_SIGNATURE_HEADER, header).send(payload.replace('expired', 'completed')), 400, 'WEBHOOK_SIGNATURE_INVALID');
    expect((await bookingRow(t.dataSource, booking.id)).status).toBe('held');
    expect(await paymentEvents()).toBe(before);
  });

  it('applies an event once, however often and however concurrently it is delivered', async () => {
    const { booking } = await held();
    const row = await bookingRow(t.dataSource, booking.id);
    const payload = JSON.stringify({ id: `evt_twice_${booking.id}`, object: 'event', type: 'checkout.session.expired', data: { object: { id: row.checkout_session_id, object: 'checkout.session', metadata: { booking_id: booking.id } } } });
    const send = () => request(t.app).post('/api/payments/webhook').set('content-type', 'application/json').set(WEBHOOK_SIGNATURE_HEADER, signatureHeader(payload, TEST_PAYMENTS_WEBHOOK_SECRET)).send(payload);
    const answers = await Promise.all([send(), send(), send()]);
    expect(answers.map((a) => a.status)).toEqual([200, 200, 200]);
    expect(answers.filter((a) => a.body.data.duplicate === false)).toHaveLength(1);
    expect((await bookingRow(t.dataSource, booking.id)).status).toBe('released');
    const history = await t.dataSource.query("SELECT COUNT(*) AS n FROM booking_event WHERE booking_id = ? AND to_status = 'released'", [booking.id]);
    expect(Number(history[0].n)).toBe(1);
    expect((await send()).body.data.duplicate).toBe(true);
  });

  it('ignores a replay of the provider\'s own event after it was applied', async () => {
    const { booking } = await paid();
    const events = await eventsOf(booking.id);
    const completed = fake.state().events.find((e) => e.type === 'checkout.session.completed' && ((e.data as { object: { metadata: { booking_id: string } } }).object.metadata.booking_id === booking.id))!;
    await fetch(`${fake.url}/__fake/events/${completed.id}/resend`, { method: 'POST' });
    await fake.idle();
    expect(await eventsOf(booking.id)).toBe(events);
    expect((await bookingRow(t.dataSource, booking.id)).status).toBe('requested');
  });
});
