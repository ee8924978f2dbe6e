// Fault: the payments provider answers 500, drops the connection or answers too late. The gateway
// retries with the same idempotency key, so a booking gets one payment page and a capture takes
// the money once; when the provider stays down the booking answers 503 and leaves nothing behind.
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createPaymentGateway } from '../../apps/api/src/payments/gateway';
import { createTestApp, type TestApp } from '../setup/app';
import type { SignedIn } from '../setup/accounts';
import { appointmentStartsNow, book, bookablePartner, bookingCount, bookingRequest, bookingRow, deliverWebhooksTo, newOwner, pay, slotStarts, type BookablePartner } from '../setup/bookings';
import { bearer } from '../setup/onboarding';
import { startPaymentsFake, TEST_CARD, type TestPaymentsFake } from '../setup/payments';
import { printFigures } from './fault-helpers';

let t: TestApp;
let fake: TestPaymentsFake;
let P: BookablePartner;
let owner: SignedIn;
let starts: string[];

beforeAll(async () => {
  fake = await startPaymentsFake();
  t = await createTestApp(fake.env);
  deliverWebhooksTo(fake, t.app);
  P = await bookablePartner(t.app, t.dataSource);
  owner = await newOwner(t.app, t.dataSource);
  starts = await slotStarts(t.app, P.orgId, { days: 3 });
}, 120_000);
afterAll(async () => {
  await t?.close();
  await fake?.close();
});

const requestsWithKey = (key: string) => fake.state().requests.filter((r) => r.idempotencyKey === key);
const sessionsOf = (bookingId: string) => fake.state().checkoutSessions.filter((s) => s.client_reference_id === bookingId);
const intent = (id: string) => fake.state().paymentIntents.find((pi) => pi.id === id)!;
const chargesOf = (piId: string) => fake.state().charges.filter((c) => c.payment_intent === piId);
const decide = (id: string, action: string) => request(t.app).post(`/api/orgs/${P.orgId}/bookings/${id}/decision`).set(bearer(P.technician)).send({ action });

/**
 * A proxy in front of the fake: the first request with each idempotency key reaches the fake at
 * once (so the change is made there), but its answer comes only after `delayMs`.
 */
async function lateAnswers(target: string, delayMs: number) {
  const seen = new Set<string>();
  const server = http.createServer((req, res) => {
    res.on('error', () => undefined);
    const key = req.headers['idempotency-key'];
    const late = typeof key === 'string' && !seen.has(key);
    if (typeof key === 'string') seen.add(key);
    const upstream = http.request(new URL(req.url!, target), { method: req.method, headers: req.headers }, (up) => {
      const chunks: Buffer[] = [];
      up.on('data', (c: Buffer) => chunks.push(c));
      up.on('end', () => {
        const answer = () => {
          if (res.destroyed || res.socket?.destroyed) return;
          res.writeHead(up.statusCode!, up.headers);
          res.end(Buffer.concat(chunks));
        };
        if (late) setTimeout(answer, delayMs);
        else answer();
      });
    });
    upstream.on('error', () => res.destroy());
    req.pipe(upstream);
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  return { url: `http://127.0.0.1:${(server.address() as AddressInfo).port}`, close: () => new Promise((r) => server.close(r)) };
}

describe('the payments provider failing', () => {
  it('retries a checkout that met 500s and a capture whose connection dropped with the same key: one page, one charge', async () => {
    fake.fake.failNext(2, 'error');
    const res = await book(t.app, owner, bookingRequest(P.orgId, starts[0]!));
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const id: string = res.body.data.id;
    const checkoutTries = requestsWithKey(`booking:${id}:checkout`);
    expect(checkoutTries.map((r) => r.status)).toEqual([500, 500, 200]);
    expect(sessionsOf(id)).toHaveLength(1);

    expect((await pay(fake, t.dataSource, id, TEST_CARD.succeeds)).outcome).toBe('succeeded');
    await decide(id, 'accept').expect(200);
    // a job starts only on its day, from shortly before its time
    await appointmentStartsNow(t.dataSource, id);
    await decide(id, 'start').expect(200);
    fake.fake.failNext(1, 'disconnect');
    const done = await decide(id, 'complete');
    expect(done.status, JSON.stringify(done.body)).toBe(200);
    const row = await bookingRow(t.dataSource, id);
    const captureTries = requestsWithKey(`booking:${id}:capture`);
    const pi = intent(row.payment_intent_id);
    printFigures('payments provider answering 500 / dropping the connection', {
      'checkout attempts (same key)': `${checkoutTries.length} (${checkoutTries.map((r) => r.status).join(', ')})`,
      'capture attempts (same key)': `${captureTries.length + 1} (1 dropped, then ${captureTries.map((r) => r.status).join(', ')})`,
      'checkout sessions for the booking': sessionsOf(id).length,
      'charges on the payment': chargesOf(pi.id as string).length,
      'amount received / booking total': `${pi.amount_received} / ${row.gross_minor}`,
    });
    expect(done.body.data).toMatchObject({ status: 'completed', payment: { status: 'captured' } });
    // the dropped attempt never reached the handler; the SDK's retry carried the same key
    expect(captureTries.map((r) => r.status)).toEqual([200]);
    expect(pi).toMatchObject({ status: 'succeeded', amount_received: Number(row.gross_minor) });
    expect(chargesOf(pi.id as string)).toHaveLength(1);
  }, 60_000);

  it('answers 503 with Retry-After and saves nothing when the provider stays down; the slot stays free', async () => {
    const before = await bookingCount(t.dataSource, 'organisation_id = ?', [P.orgId]);
    const sessionsBefore = fake.state().checkoutSessions.length;
    fake.fake.failNext(10, 'error');
    const res = await book(t.app, owner, bookingRequest(P.orgId, starts[2]!));
    fake.fake.failNext(0);
    expect(res.status, JSON.stringify(res.body)).toBe(503);
    expect(res.body.code).toBe('PAYMENTS_UNAVAILABLE');
    expect(res.headers['retry-after']).toMatch(/^\d+$/);
    expect(await bookingCount(t.dataSource, 'organisation_id = ?', [P.orgId])).toBe(before);
    expect(fake.state().checkoutSessions.length).toBe(sessionsBefore);
    const again = await book(t.app, owner, bookingRequest(P.orgId, starts[2]!));
    expect(again.status, JSON.stringify(again.body)).toBe(201);
    expect(sessionsOf(again.body.data.id)).toHaveLength(1);
  }, 60_000);

  it('retries a capture and a checkout whose answers came too late: the provider replays its result, nothing is charged twice', async () => {
    const proxy = await lateAnswers(fake.url, 1500);
    const t0 = Date.now();
    try {
      const slow = createPaymentGateway({ ...fake.env, STRIPE_API_BASE: proxy.url, NODE_ENV: 'test', PAYMENTS_FAKE_PORT: 0 }, { timeoutMs: 400, maxNetworkRetries: 2 });
      const bookingId = `fault-${Date.now()}`;
      const checkout = await slow.createCheckout({
        bookingId,
        amountMinor: 5400,
        currency: 'EUR',
        description: 'Handset pairing (fault test)',
        successUrl: 'http://emberline.test/ok',
        cancelUrl: 'http://emberline.test/cancel',
        expiresAt: new Date(Date.now() + 3_600_000),
        idempotencyKey: `booking:${bookingId}:checkout`,
      });
      expect(sessionsOf(bookingId)).toHaveLength(1);
      expect(fake.pay(checkout.sessionId, TEST_CARD.succeeds).outcome).toBe('succeeded');
      const piId = (await fake.gateway.getCheckout(checkout.sessionId)).paymentIntentId!;
      const captured = await slow.capture(piId, undefined, `booking:${bookingId}:capture`);
      const checkoutTries = requestsWithKey(`booking:${bookingId}:checkout`);
      const captureTries = requestsWithKey(`booking:${bookingId}:capture`);
      printFigures('payments provider answering too late (timeout 400 ms, answer after 1,500 ms)', {
        'checkout attempts (same key)': `${checkoutTries.length} (replayed: ${checkoutTries.filter((r) => r.replayed).length})`,
        'capture attempts (same key)': `${captureTries.length} (replayed: ${captureTries.filter((r) => r.replayed).length})`,
        'checkout sessions': sessionsOf(bookingId).length,
        'charges on the payment': chargesOf(piId).length,
        'amount received': `${intent(piId).amount_received} of 5400`,
        'time for both calls': `${Date.now() - t0} ms`,
      });
      expect(captured).toMatchObject({ status: 'succeeded', amountReceivedMinor: 5400 });
      expect(checkoutTries.length).toBeGreaterThanOrEqual(2);
      expect(checkoutTries.slice(1).every((r) => r.replayed)).toBe(true);
      expect(captureTries.length).toBeGreaterThanOrEqual(2);
      expect(captureTries[0]!.replayed).toBe(false);
      expect(captureTries.slice(1).every((r) => r.replayed)).toBe(true);
      expect(intent(piId)).toMatchObject({ status: 'succeeded', amount_received: 5400 });
      expect(chargesOf(piId)).toHaveLength(1);
      expect(fake.state().balanceTransactions.filter((b) => b.source === chargesOf(piId)[0]!.id)).toHaveLength(1);
    } finally {
      await proxy.close();
    }
  }, 60_000);
});
