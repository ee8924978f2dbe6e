// The payments fake driven only through the provider's official SDK, by way of our gateway:
// checkout, the test cards, signed webhooks, capture, refunds, idempotency, outages, transfers.
// Test card numbers: Stripe documentation: testing — test card numbers.
// Webhook signatures: Stripe documentation: webhook signatures (t=…,v1=HMAC-SHA256 of "t.payload").
import { spawn } from 'node:child_process';
import http from 'node:http';
import { mkdtempSync, rmSync } from 'node:fs';
import net, { type AddressInfo } from 'node:net';
import os from 'node:os';
import path from 'node:path';
import express from 'express';
import Stripe from 'stripe';
import request from 'supertest';
import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { createPaymentsFake } from '../../apps/api/src/fakes/payments/payments-fake';
import { signatureHeader } from '../../apps/api/src/fakes/payments/webhooks';
import { problemDetails } from '../../apps/api/src/middleware/problem-details';
import { PaymentDeclined, PaymentIdempotencyConflict, PaymentRejected, PaymentsUnavailable, WebhookSignatureInvalid } from '../../apps/api/src/payments/errors';
import { loadConfig } from '../../apps/api/src/config';
import { createPaymentGateway, paymentsApiBase, toPaymentError, type CreateCheckoutInput, type PaymentEvent } from '../../apps/api/src/payments/gateway';
import { root } from '../../scripts/lib/project';
import { startPaymentsFake, TEST_CARD, TEST_PAYMENTS_SECRET_KEY, TEST_PAYMENTS_WEBHOOK_SECRET, type TestPaymentsFake } from '../setup/payments';

interface Delivery {
  raw: Buffer;
  signature: string;
  event: PaymentEvent;
}

/** A webhook endpoint that keeps what it receives, after checking each signature like the API will. */
async function startReceiver(fake: () => TestPaymentsFake) {
  const received: Delivery[] = [];
  let failuresLeft = 0;
  const server = http.createServer((req, res) => {
    const chunks: Buffer[] = [];
    req.on('data', (c: Buffer) => chunks.push(c));
    req.on('end', () => {
      if (failuresLeft > 0) {
        failuresLeft -= 1;
        res.writeHead(500).end();
        return;
      }
      const raw = Buffer.concat(chunks);
      const signature = String(req.headers['stripe-signature'] ?? '');
      try {
        received.push({ raw, signature, event: fake().gateway.verifyWebhook(raw, signature) });
        res.writeHead(200).end();
      } catch {
        res.writeHead(400).end();
      }
    });
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  return {
    url: `http://127.0.0.1:${(server.address() as AddressInfo).port}/api/payments/webhook`,
    received,
    events: (type?: string) => received.map((d) => d.event).filter((e) => !type || e.type === type),
    failNext: (n: number) => (failuresLeft = n),
    clear: () => received.splice(0),
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}

let p: TestPaymentsFake;
let receiver: Awaited<ReturnType<typeof startReceiver>>;
let seq = 0;
const key = (what: string) => `test-${what}-${++seq}-${Date.now()}`;

function checkoutInput(over: Partial<CreateCheckoutInput> = {}): CreateCheckoutInput {
  const bookingId = over.bookingId ?? `bk_${++seq}`;
  return {
    bookingId,
    amountMinor: 18_500,
    currency: 'EUR',
    description: 'Parking heater service: glow pin replacement',
    customerEmail: 'clara@owners.example',
    successUrl: `http://emberline.test/bookings/${bookingId}/paid?session={CHECKOUT_SESSION_ID}`,
    cancelUrl: `http://emberline.test/bookings/${bookingId}`,
    expiresAt: new Date(Date.now() + 60 * 60 * 1000),
    idempotencyKey: key('checkout'),
    ...over,
  };
}

/** A checkout paid with the success card: the money is held (requires_capture). */
async function heldPayment(amountMinor = 18_500) {
  const checkout = await p.gateway.createCheckout(checkoutInput({ amountMinor }));
  const paid = p.pay(checkout.sessionId, TEST_CARD.succeeds);
  expect(paid.outcome).toBe('succeeded');
  const status = await p.gateway.getCheckout(checkout.sessionId);
  return { checkout, paymentIntentId: status.paymentIntentId! };
}

beforeAll(async () => {
  receiver = await startReceiver(() => p);
  p = await startPaymentsFake({ webhookTarget: receiver.url });
});
afterAll(async () => {
  await p.close();
  await receiver.close();
});
beforeEach(async () => {
  // a test starts with the webhooks of the ones before it delivered and forgotten
  await p.idle();
  receiver.clear();
});

describe('checkout, payment and capture', () => {
  it('runs checkout → success card → verified webhooks → capture → partial refund → ledger with fees', async () => {
    const input = checkoutInput({ bookingId: 'bk_happy' });
    const checkout = await p.gateway.createCheckout(input);
    expect(checkout.sessionId).toMatch(/^cs_test_\w+$/);
    expect(checkout.url).toBe(`${p.url}/pay/${checkout.sessionId}`);
    expect(Math.abs(checkout.expiresAt.getTime() - input.expiresAt.getTime())).toBeLessThan(1000);

    const open = await p.gateway.getCheckout(checkout.sessionId);
    expect(open).toMatchObject({ status: 'open', paymentStatus: 'unpaid', bookingId: 'bk_happy', amountMinor: 18_500, currency: 'eur', paymentIntentId: null, amountCapturableMinor: 0 });

    const paid = p.pay(checkout.sessionId, TEST_CARD.succeeds);
    expect(paid.outcome).toBe('succeeded');
    if (paid.outcome !== 'succeeded') return;
    expect(paid.redirectUrl).toBe(`http://emberline.test/bookings/bk_happy/paid?session=${checkout.sessionId}`);

    await p.idle();
    expect(receiver.events().map((e) => e.type)).toEqual(['payment_intent.amount_capturable_updated', 'checkout.session.completed']);
    const completed = receiver.events('checkout.session.completed')[0]!;
    const session = completed.data.object as Stripe.Checkout.Session;
    expect(session).toMatchObject({ id: checkout.sessionId, status: 'complete', payment_status: 'unpaid', metadata: { booking_id: 'bk_happy' } });
    expect(completed).toMatchObject({ object: 'event', livemode: false });
    // the SDK's own check accepts the fake's signature, independently of our gateway
    const raw = receiver.received.find((d) => d.event.id === completed.id)!;
    expect(Stripe.webhooks.constructEvent(raw.raw, raw.signature, TEST_PAYMENTS_WEBHOOK_SECRET).id).toBe(completed.id);

    const held = await p.gateway.getCheckout(checkout.sessionId);
    expect(held).toMatchObject({ status: 'complete', paymentStatus: 'unpaid', paymentIntentStatus: 'requires_capture', amountCapturableMinor: 18_500, lastPaymentError: null });
    const pi = held.paymentIntentId!;
    expect(pi).toMatch(/^pi_\w+$/);

    const captured = await p.gateway.capture(pi, undefined, key('capture'));
    expect(captured).toMatchObject({ paymentIntentId: pi, status: 'succeeded', bookingId: 'bk_happy', amountReceivedMinor: 18_500, amountCapturableMinor: 0 });
    expect(captured.latestChargeId).toMatch(/^ch_\w+$/);

    const refund = await p.gateway.refund(pi, 5_000, key('refund'));
    expect(refund).toMatchObject({ status: 'succeeded', amountMinor: 5_000, currency: 'eur', paymentIntentId: pi, chargeId: captured.latestChargeId });

    await p.idle();
    expect(receiver.events().map((e) => e.type)).toEqual(['payment_intent.amount_capturable_updated', 'checkout.session.completed', 'payment_intent.succeeded', 'charge.refunded']);
    const refunded = receiver.events('charge.refunded')[0]!.data.object as Stripe.Charge;
    expect(refunded).toMatchObject({ id: captured.latestChargeId, amount_captured: 18_500, amount_refunded: 5_000, refunded: false });

    // the fake's own fee (not the provider's): 1.5 % rounded to the cent, plus 25 cents
    const fee = Math.round(18_500 * 0.015) + 25;
    const charge = await p.gateway.listBalanceTransactions({ sourceId: captured.latestChargeId! });
    expect(charge.items).toEqual([expect.objectContaining({ type: 'charge', amountMinor: 18_500, feeMinor: fee, netMinor: 18_500 - fee, currency: 'eur' })]);
    const refunds = await p.gateway.listBalanceTransactions({ sourceId: refund.refundId });
    expect(refunds.items).toEqual([expect.objectContaining({ type: 'refund', amountMinor: -5_000, feeMinor: 0, netMinor: -5_000 })]);
  });

  it('captures part of a hold and refunds no more than was captured', async () => {
    const { paymentIntentId } = await heldPayment(20_000);
    const captured = await p.gateway.capture(paymentIntentId, 12_000, key('capture'));
    expect(captured).toMatchObject({ status: 'succeeded', amountMinor: 20_000, amountReceivedMinor: 12_000 });
    const tooMuch = await p.gateway.refund(paymentIntentId, 12_001, key('refund')).catch((e: unknown) => e);
    expect(tooMuch).toBeInstanceOf(PaymentRejected);
    expect(tooMuch).toMatchObject({ providerCode: 'amount_too_large', status: 409, code: 'PAYMENT_REJECTED' });
    const rest = await p.gateway.refund(paymentIntentId, undefined, key('refund'));
    expect(rest.amountMinor).toBe(12_000);
    const again = await p.gateway.refund(paymentIntentId, undefined, key('refund')).catch((e: unknown) => e);
    expect(again).toMatchObject({ providerCode: 'charge_already_refunded' });
  });

  it('refuses a second capture and capturing more than is held', async () => {
    const { paymentIntentId } = await heldPayment(10_000);
    await expect(p.gateway.capture(paymentIntentId, 10_001, key('capture'))).rejects.toMatchObject({ providerCode: 'amount_too_large' });
    await p.gateway.capture(paymentIntentId, undefined, key('capture'));
    await expect(p.gateway.capture(paymentIntentId, undefined, key('capture'))).rejects.toMatchObject({ providerCode: 'payment_intent_unexpected_state', status: 409 });
  });
});

describe('declined cards', () => {
  it.each([
    [TEST_CARD.declined, 'generic_decline'],
    [TEST_CARD.insufficientFunds, 'insufficient_funds'],
  ])('%s is declined with %s and leaves nothing to capture', async (card, declineCode) => {
    const checkout = await p.gateway.createCheckout(checkoutInput());
    const result = p.pay(checkout.sessionId, card);
    expect(result).toMatchObject({ outcome: 'declined', code: 'card_declined', declineCode });

    const status = await p.gateway.getCheckout(checkout.sessionId);
    expect(status).toMatchObject({
      status: 'open',
      paymentStatus: 'unpaid',
      paymentIntentStatus: 'requires_payment_method',
      amountCapturableMinor: 0,
      lastPaymentError: { code: 'card_declined', declineCode },
    });
    await expect(p.gateway.capture(status.paymentIntentId!, undefined, key('capture'))).rejects.toMatchObject({ providerCode: 'payment_intent_unexpected_state' });

    await p.idle();
    const failed = receiver.events('payment_intent.payment_failed');
    expect(failed).toHaveLength(1);
    expect((failed[0]!.data.object as Stripe.PaymentIntent).last_payment_error).toMatchObject({ code: 'card_declined', decline_code: declineCode });
    expect(receiver.events('checkout.session.completed')).toHaveLength(0);

    // the customer may try again on the same session with another card
    expect(p.pay(checkout.sessionId, TEST_CARD.succeeds).outcome).toBe('succeeded');
    expect(await p.gateway.getCheckout(checkout.sessionId)).toMatchObject({ status: 'complete', paymentIntentId: status.paymentIntentId, paymentIntentStatus: 'requires_capture', lastPaymentError: null });
  });

  it('refuses any other card number, naming the test numbers', async () => {
    const checkout = await p.gateway.createCheckout(checkoutInput());
    const result = p.pay(checkout.sessionId, '1234 5678 9012 3456');
    expect(result).toMatchObject({ outcome: 'refused', field: 'number' });
    if (result.outcome === 'refused') for (const n of Object.values(TEST_CARD)) expect(result.message).toContain(n);
    expect(p.pay(checkout.sessionId, { number: TEST_CARD.succeeds, expiry: '01/20' })).toMatchObject({ outcome: 'refused', field: 'expiry' });
    expect((await p.gateway.getCheckout(checkout.sessionId)).paymentIntentId).toBeNull();
  });

  it('maps a card error from the SDK to PaymentDeclined with its decline code', () => {
    const sdkError = new Stripe.errors.StripeCardError({ type: 'card_error', code: 'card_declined', decline_code: 'insufficient_funds', message: 'Your card has insufficient funds.' });
    const ours = toPaymentError(sdkError);
    expect(ours).toBeInstanceOf(PaymentDeclined);
    expect(ours).toMatchObject({ status: 402, code: 'PAYMENT_DECLINED', providerCode: 'card_declined', declineCode: 'insufficient_funds' });
  });
});

describe('webhook signatures', () => {
  let delivery: Delivery;
  beforeAll(async () => {
    receiver.clear();
    await heldPayment();
    await p.idle();
    delivery = receiver.received[0]!;
  });

  it('signs exactly as the SDK does', () => {
    const t = 1_700_000_000;
    const payload = delivery.raw.toString('utf8');
    expect(signatureHeader(payload, TEST_PAYMENTS_WEBHOOK_SECRET, t)).toBe(
      Stripe.webhooks.generateTestHeaderString({ payload, secret: TEST_PAYMENTS_WEBHOOK_SECRET, timestamp: t }),
    );
    expect(delivery.signature).toMatch(/^t=\d+,v1=[0-9a-f]{64}$/);
  });

  it('rejects a changed body, a wrong secret, a missing header and an old signature', () => {
    const tampered = Buffer.from(delivery.raw.toString('utf8').replace('"amount": 18500', '"amount": 1'));
    expect(tampered.equals(delivery.raw)).toBe(false);
    expect(() => p.gateway.verifyWebhook(tampered, delivery.signature)).toThrow(WebhookSignatureInvalid);

    const otherSecret = createPaymentGateway({ ...p.env, NODE_ENV: 'test', PAYMENTS_FAKE_PORT: 4030, STRIPE_WEBHOOK_SECRET: 'whsec_someone_else' });
    expect(() => otherSecret.verifyWebhook(delivery.raw, delivery.signature)).toThrow(WebhookSignatureInvalid);

    expect(() => p.gateway.verifyWebhook(delivery.raw, undefined)).toThrow(WebhookSignatureInvalid);
    expect(() => p.gateway.verifyWebhook(delivery.raw, 'nonsense')).toThrow(WebhookSignatureInvalid);

    const old = signatureHeader(delivery.raw.toString('utf8'), TEST_PAYMENTS_WEBHOOK_SECRET, Math.floor(Date.now() / 1000) - 3600);
    const err = (() => {
      try {
        p.gateway.verifyWebhook(delivery.raw, old);
      } catch (e) {
        return e;
      }
    })();
    expect(err).toBeInstanceOf(WebhookSignatureInvalid);
    expect(err).toMatchObject({ status: 400, code: 'WEBHOOK_SIGNATURE_INVALID', detail: expect.stringMatching(/tolerance/) });
  });

  it('retries a failed delivery with backoff until the endpoint takes it', async () => {
    receiver.failNext(2);
    const checkout = await p.gateway.createCheckout(checkoutInput());
    await p.gateway.expireCheckout(checkout.sessionId, key('expire'));
    await p.idle();
    const record = p.state().deliveries.find((d) => d.type === 'checkout.session.expired' && receiver.events('checkout.session.expired').some((e) => e.id === d.eventId));
    expect(record).toMatchObject({ status: 'delivered', attempts: 3, lastStatus: 200 });
  });

  it('gives up after the last retry and records the failure', async () => {
    const down = await startPaymentsFake({ webhookTarget: 'http://127.0.0.1:9/unreachable', webhookRetryDelaysMs: [10, 20] });
    try {
      const checkout = await down.gateway.createCheckout(checkoutInput());
      await down.gateway.expireCheckout(checkout.sessionId, key('expire'));
      await down.idle();
      expect(down.state().deliveries).toEqual([expect.objectContaining({ type: 'checkout.session.expired', status: 'failed', attempts: 3, lastStatus: null })]);
    } finally {
      await down.close();
    }
  });
});

describe('idempotency', () => {
  it('creates one checkout for the same key twice and refuses the key with other parameters', async () => {
    const input = checkoutInput();
    const first = await p.gateway.createCheckout(input);
    const second = await p.gateway.createCheckout(input);
    expect(second.sessionId).toBe(first.sessionId);
    expect(p.state().checkoutSessions.filter((s) => (s.metadata as Record<string, string>).booking_id === input.bookingId)).toHaveLength(1);
    expect(p.state().requests.filter((r) => r.idempotencyKey === input.idempotencyKey).map((r) => r.replayed)).toEqual([false, true]);

    const conflict = await p.gateway.createCheckout({ ...input, amountMinor: 99_00 }).catch((e: unknown) => e);
    expect(conflict).toBeInstanceOf(PaymentIdempotencyConflict);
    expect(conflict).toMatchObject({ status: 409, code: 'PAYMENT_IDEMPOTENCY_CONFLICT' });
  });

  it('replays a capture and a refund instead of repeating them', async () => {
    const { paymentIntentId } = await heldPayment(15_000);
    const captureKey = key('capture');
    const a = await p.gateway.capture(paymentIntentId, undefined, captureKey);
    const b = await p.gateway.capture(paymentIntentId, undefined, captureKey);
    expect(b).toEqual(a);
    const refundKey = key('refund');
    const r1 = await p.gateway.refund(paymentIntentId, 1_000, refundKey);
    const r2 = await p.gateway.refund(paymentIntentId, 1_000, refundKey);
    expect(r2.refundId).toBe(r1.refundId);
    expect(p.state().refunds.filter((r) => r.payment_intent === paymentIntentId)).toHaveLength(1);
    expect(p.state().balanceTransactions.filter((t) => t.source === a.latestChargeId)).toHaveLength(1);
  });

  it('requires a key for every change', async () => {
    await expect(p.gateway.capture('pi_x', undefined, '')).rejects.toThrow(/idempotency key/);
    await expect(p.gateway.createCheckout(checkoutInput({ idempotencyKey: '  ' }))).rejects.toThrow(/idempotency key/);
  });
});

describe('ending a payment without taking money', () => {
  it('cancels an authorisation: the hold is released and nothing reaches the ledger', async () => {
    const { paymentIntentId } = await heldPayment(9_000);
    await p.idle();
    receiver.clear();
    const cancelled = await p.gateway.cancelAuthorization(paymentIntentId, key('cancel'));
    expect(cancelled).toMatchObject({ status: 'canceled', amountCapturableMinor: 0, amountReceivedMinor: 0 });
    await p.idle();
    expect(receiver.events().map((e) => e.type)).toEqual(['payment_intent.canceled']);
    expect(p.state().balanceTransactions.filter((t) => t.source === cancelled.latestChargeId)).toEqual([]);
    await expect(p.gateway.capture(paymentIntentId, undefined, key('capture'))).rejects.toBeInstanceOf(PaymentRejected);
    await expect(p.gateway.refund(paymentIntentId, undefined, key('refund'))).rejects.toMatchObject({ providerCode: 'payment_intent_unexpected_state' });
  });

  it('expires an open checkout, which then cannot be paid', async () => {
    const checkout = await p.gateway.createCheckout(checkoutInput());
    const expired = await p.gateway.expireCheckout(checkout.sessionId, key('expire'));
    expect(expired).toMatchObject({ status: 'expired', paymentIntentId: null });
    expect(p.pay(checkout.sessionId, TEST_CARD.succeeds)).toMatchObject({ outcome: 'closed' });
    await expect(p.gateway.expireCheckout(checkout.sessionId, key('expire'))).rejects.toMatchObject({ providerCode: 'checkout_session_not_open' });
    await p.idle();
    expect(receiver.events('checkout.session.expired').map((e) => (e.data.object as Stripe.Checkout.Session).id)).toContain(checkout.sessionId);
  });

  it('expires a checkout at its expiry time (the fake clock moves on)', async () => {
    const fake = await startPaymentsFake();
    try {
      const checkout = await fake.gateway.createCheckout(checkoutInput({ expiresAt: new Date(Date.now() + 45 * 60 * 1000) }));
      fake.fake.advanceClock(46 * 60);
      expect(await fake.gateway.getCheckout(checkout.sessionId)).toMatchObject({ status: 'expired' });
      expect(fake.state().events.map((e) => e.type)).toEqual(['checkout.session.expired']);
    } finally {
      await fake.close();
    }
  });

  it('refuses an expiry outside 30 minutes to 24 hours', async () => {
    const soon = await p.gateway.createCheckout(checkoutInput({ expiresAt: new Date(Date.now() + 5 * 60 * 1000) })).catch((e: unknown) => e);
    expect(soon).toMatchObject({ code: 'PAYMENT_REJECTED', param: 'expires_at' });
  });
});

describe('when the provider cannot be used', () => {
  async function closedPort(): Promise<number> {
    return new Promise((resolve) => {
      const probe = net.createServer().listen(0, '127.0.0.1', () => {
        const { port } = probe.address() as AddressInfo;
        probe.close(() => resolve(port));
      });
    });
  }

  it('answers PaymentsUnavailable (503 problem details) when nothing listens', async () => {
    const port = await closedPort();
    const gateway = createPaymentGateway({ ...p.env, STRIPE_API_BASE: `http://127.0.0.1:${port}`, NODE_ENV: 'test', PAYMENTS_FAKE_PORT: port }, { maxNetworkRetries: 0 });
    const err = await gateway.getCheckout('cs_test_nothing').catch((e: unknown) => e);
    expect(err).toBeInstanceOf(PaymentsUnavailable);
    expect(err).toMatchObject({ reason: 'unreachable', status: 503, code: 'PAYMENTS_UNAVAILABLE' });

    // what a route that meets this error answers
    const app = express();
    app.get('/api/pay', () => {
      throw err;
    });
    app.use(problemDetails);
    const res = await request(app).get('/api/pay');
    expect(res.status).toBe(503);
    expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
    expect(JSON.parse(res.text)).toMatchObject({ type: 'urn:emberline:problem:payments-unavailable', status: 503, code: 'PAYMENTS_UNAVAILABLE' });
  });

  it('answers PaymentsUnavailable on a server error, and a retry with the same key creates one object', async () => {
    p.fake.failNext(1);
    await expect(p.gateway.createCheckout(checkoutInput())).rejects.toMatchObject({ reason: 'provider_error', status: 503 });

    const retrying = createPaymentGateway({ ...p.env, NODE_ENV: 'test', PAYMENTS_FAKE_PORT: p.fake.port }, { maxNetworkRetries: 1 });
    const input = checkoutInput();
    p.fake.failNext(1);
    const created = await retrying.createCheckout(input);
    const requests = p.state().requests.filter((r) => r.idempotencyKey === input.idempotencyKey);
    expect(requests.map((r) => r.status)).toEqual([500, 200]);
    expect(p.state().checkoutSessions.filter((s) => s.id === created.sessionId)).toHaveLength(1);
  });

  it('answers PaymentsUnavailable when the connection drops', async () => {
    // the SDK retries a dropped connection once by itself, so drop two
    p.fake.failNext(2, 'disconnect');
    await expect(p.gateway.getCheckout('cs_test_dropped')).rejects.toMatchObject({ reason: 'unreachable' });
  });

  it('answers PaymentsUnavailable for a wrong secret key, and the key appears nowhere', async () => {
    const wrongKey = 'sk_test_wrong_key_that_must_not_leak_4321';
    const gateway = createPaymentGateway({ ...p.env, STRIPE_SECRET_KEY: wrongKey, NODE_ENV: 'test', PAYMENTS_FAKE_PORT: p.fake.port }, { maxNetworkRetries: 0 });
    const err = await gateway.getCheckout('cs_test_any').catch((e: unknown) => e);
    expect(err).toMatchObject({ reason: 'not_authorised', status: 503 });
    const everything = JSON.stringify({ err, message: (err as Error).message, stack: (err as Error).stack, gateway });
    expect(everything).not.toContain(wrongKey);
    expect(everything).not.toContain('must_not_leak');
  });
});

describe('connected accounts and transfers', () => {
  it('creates an account and passes a captured payment on to it', async () => {
    const account = await p.gateway.createConnectedAccount({ type: 'express', country: 'at', email: 'lena@partner.example', metadata: { organisation_id: 'org_1' }, idempotencyKey: key('account') });
    expect(account).toMatchObject({ type: 'express', payoutsEnabled: true });
    expect(account.accountId).toMatch(/^acct_\w+$/);

    const { paymentIntentId } = await heldPayment(30_000);
    const captured = await p.gateway.capture(paymentIntentId, undefined, key('capture'));
    const transfer = await p.gateway.transfer({
      destinationAccountId: account.accountId,
      amountMinor: 25_000,
      currency: 'EUR',
      sourceChargeId: captured.latestChargeId!,
      transferGroup: 'bk_transfer',
      idempotencyKey: key('transfer'),
    });
    expect(transfer).toMatchObject({ amountMinor: 25_000, currency: 'eur', destinationAccountId: account.accountId, sourceChargeId: captured.latestChargeId });
    const ledger = await p.gateway.listBalanceTransactions({ type: 'transfer', limit: 100 });
    expect(ledger.items).toContainEqual(expect.objectContaining({ id: transfer.balanceTransactionId, type: 'transfer', amountMinor: -25_000, feeMinor: 0, sourceId: transfer.transferId }));

    // no more than the charge brought in
    await expect(
      p.gateway.transfer({ destinationAccountId: account.accountId, amountMinor: 6_000, currency: 'eur', sourceChargeId: captured.latestChargeId!, idempotencyKey: key('transfer') }),
    ).rejects.toMatchObject({ providerCode: 'amount_too_large' });
  });

  it('refuses a transfer larger than the balance, and to an unknown account', async () => {
    const fresh = await startPaymentsFake();
    try {
      const account = await fresh.gateway.createConnectedAccount({ type: 'custom', country: 'DE', idempotencyKey: key('account') });
      await expect(fresh.gateway.transfer({ destinationAccountId: account.accountId, amountMinor: 100, currency: 'eur', idempotencyKey: key('transfer') })).rejects.toMatchObject({ providerCode: 'balance_insufficient' });
      await expect(fresh.gateway.transfer({ destinationAccountId: 'acct_unknown', amountMinor: 100, currency: 'eur', idempotencyKey: key('transfer') })).rejects.toMatchObject({ providerCode: 'resource_missing' });
    } finally {
      await fresh.close();
    }
  });

  it('pages through balance transactions newest first', async () => {
    const all = await p.gateway.listBalanceTransactions({ limit: 100 });
    expect(all.items.length).toBeGreaterThan(3);
    const first = await p.gateway.listBalanceTransactions({ limit: 2 });
    expect(first.hasMore).toBe(true);
    const next = await p.gateway.listBalanceTransactions({ limit: 2, startingAfter: first.items[1]!.id });
    expect([...first.items, ...next.items].map((t) => t.id)).toEqual(all.items.slice(0, 4).map((t) => t.id));
  });
});

describe('the provider surface beyond the gateway', () => {
  const sdk = () => new Stripe(TEST_PAYMENTS_SECRET_KEY, { host: '127.0.0.1', port: p.fake.port, protocol: 'http', telemetry: false, maxNetworkRetries: 0 });

  it('keeps customers, payment intents, refunds lists and events in the provider shapes', async () => {
    const client = sdk();
    const customer = await client.customers.create({ email: 'owner@owners.example', metadata: { user_id: 'u1' } });
    expect(await client.customers.retrieve(customer.id)).toMatchObject({ id: customer.id, object: 'customer', email: 'owner@owners.example', livemode: false });

    const pi = await client.paymentIntents.create({ amount: 4_200, currency: 'eur', capture_method: 'manual', metadata: { booking_id: 'bk_direct' } });
    expect(pi).toMatchObject({ object: 'payment_intent', status: 'requires_payment_method', capture_method: 'manual', amount_capturable: 0 });
    expect(p.fake.payPaymentIntent(pi.id, TEST_CARD.succeeds)).toMatchObject({ outcome: 'authorised' });
    await p.gateway.capture(pi.id, 4_000, key('capture'));
    await p.gateway.refund(pi.id, 1_000, key('refund'));
    const refunds = await client.refunds.list({ payment_intent: pi.id });
    expect(refunds).toMatchObject({ object: 'list', has_more: false, url: '/v1/refunds' });
    expect(refunds.data).toHaveLength(1);
    expect(await client.refunds.retrieve(refunds.data[0]!.id)).toMatchObject({ amount: 1_000, status: 'succeeded' });

    const events = await client.events.list({ type: 'payment_intent.*', limit: 100 });
    expect(events.data.some((e) => e.type === 'payment_intent.succeeded' && (e.data.object as Stripe.PaymentIntent).id === pi.id)).toBe(true);
    expect((await client.events.retrieve(events.data[0]!.id)).id).toBe(events.data[0]!.id);
  });

  it('answers errors in the provider shape with the right status', async () => {
    const client = sdk();
    const missing = await client.paymentIntents.retrieve('pi_missing').catch((e: unknown) => e);
    expect(missing).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
    expect(missing).toMatchObject({ statusCode: 404, code: 'resource_missing' });
    const unknownParam = await client.customers.create({ nickname: 'x' } as unknown as Stripe.CustomerCreateParams).catch((e: unknown) => e);
    expect(unknownParam).toMatchObject({ statusCode: 400, code: 'parameter_unknown', param: 'nickname' });
    const res = await fetch(`${p.url}/v1/customers`, { method: 'POST' });
    expect(res.status).toBe(401);
    expect(await res.json()).toMatchObject({ error: { type: 'invalid_request_error' } });
  });
});

describe('the test payment page', () => {
  const form = (fields: Record<string, string>) => ({ method: 'POST', body: new URLSearchParams(fields), redirect: 'manual' as const });

  it('shows the amount and a labelled form, and says it is a test page', async () => {
    const checkout = await p.gateway.createCheckout(checkoutInput({ amountMinor: 12_345 }));
    const res = await fetch(checkout.url);
    expect(res.status).toBe(200);
    const html = await res.text();
    expect(html).toContain('<html lang="en">');
    expect(html).toMatch(/Local test payment page/);
    expect(html).toContain('€123.45');
    expect(html).toContain('glow pin replacement');
    for (const id of ['number', 'expiry', 'cvc']) expect(html).toMatch(new RegExp(`<label for="${id}">`));
    expect(html).toContain('4242 4242 4242 4242');
  });

  it('redirects (303) to the success URL after a good card and shows a decline on the page', async () => {
    const declined = await p.gateway.createCheckout(checkoutInput());
    const d = await fetch(declined.url, form({ number: TEST_CARD.insufficientFunds, expiry: '12/39', cvc: '123' }));
    expect(d.status).toBe(402);
    const page = await d.text();
    expect(page).toMatch(/role="alert"/);
    expect(page).toMatch(/insufficient funds/);
    expect(page).toContain(`href="http://emberline.test/bookings/`);

    const good = await p.gateway.createCheckout(checkoutInput({ bookingId: 'bk_page' }));
    const ok = await fetch(good.url, form({ number: TEST_CARD.succeeds, expiry: '12/39', cvc: '123' }));
    expect(ok.status).toBe(303);
    expect(ok.headers.get('location')).toBe(`http://emberline.test/bookings/bk_page/paid?session=${good.sessionId}`);
    expect((await fetch(good.url)).status).toBe(410);
  });
});

describe('running the fake', () => {
  const tmp = mkdtempSync(path.join(os.tmpdir(), 'emberline-payments-'));
  afterAll(() => rmSync(tmp, { recursive: true, force: true }));
  const children: ReturnType<typeof spawn>[] = [];
  afterEach(() => {
    for (const child of children.splice(0)) if (child.exitCode === null) child.kill('SIGKILL');
  });

  it('keeps its state in a file across restarts', async () => {
    const stateFile = path.join(tmp, 'state.json');
    const first = await createPaymentsFake({ port: 0, stateFile });
    const gateway = createPaymentGateway({ NODE_ENV: 'test', STRIPE_SECRET_KEY: first.secretKey, STRIPE_WEBHOOK_SECRET: first.webhookSecret, STRIPE_API_BASE: first.url, PAYMENTS_FAKE_PORT: first.port }, { maxNetworkRetries: 0 });
    const checkout = await gateway.createCheckout(checkoutInput());
    await first.close();
    const second = await createPaymentsFake({ port: 0, stateFile });
    try {
      expect(second.state().checkoutSessions.map((s) => s.id)).toEqual([checkout.sessionId]);
    } finally {
      await second.close();
    }
  });

  it('starts on its own, prints one ready line and stops on SIGTERM', async () => {
    const child = spawn(process.execPath, ['--import', 'tsx', path.join(root, 'apps/api/src/fakes/payments/server.ts')], {
      cwd: root,
      env: { ...process.env, PAYMENTS_FAKE_PORT: '0', PAYMENTS_FAKE_STATE_FILE: '', PAYMENTS_FAKE_WEBHOOK_URL: '' },
    });
    children.push(child);
    let output = '';
    const line = await new Promise<string>((resolve, reject) => {
      child.stdout.on('data', (d) => {
        output += d;
        if (output.includes('\n')) resolve(output);
      });
      child.stderr.on('data', (d) => (output += d));
      child.on('exit', () => reject(new Error(output)));
    });
    expect(line).toMatch(/^Payments fake ready: API http:\/\/127\.0\.0\.1:\d+\/v1, test payment page .*; no webhook endpoint\n$/);
    const url = /API (http:\/\/[\d.:]+)\/v1/.exec(line)![1];
    expect((await fetch(`${url}/__fake/health`)).status).toBe(200);
    const exited = new Promise<number | null>((resolve) => child.on('exit', (code) => resolve(code)));
    child.kill('SIGTERM');
    expect(await exited).toBe(0);
  });
});

describe('configuration', () => {
  const base = { DB_PASSWORD: 'secret-for-tests' };
  const production = { ...base, NODE_ENV: 'production', JWT_SECRET: 'j'.repeat(40) };

  it('uses the local fake and its credentials outside production', () => {
    const c = loadConfig(base);
    expect(c).toMatchObject({ STRIPE_SECRET_KEY: 'sk_test_emberline_local', STRIPE_WEBHOOK_SECRET: 'whsec_emberline_local', PAYMENTS_FAKE_PORT: 4030 });
    expect(paymentsApiBase(c)?.href).toBe('http://127.0.0.1:4030/');
    expect(paymentsApiBase(loadConfig({ ...base, PAYMENTS_FAKE_PORT: '4999' }))?.href).toBe('http://127.0.0.1:4999/');
    expect(paymentsApiBase(loadConfig({ ...base, STRIPE_API_BASE: 'https://payments.example:8443' }))?.href).toBe('https://payments.example:8443/');
  });

  it('requires real credentials in production, and talks to the real service unless told otherwise', () => {
    expect(() => loadConfig(production)).toThrow(/STRIPE_SECRET_KEY: is required in production; STRIPE_WEBHOOK_SECRET: is required in production/);
    const c = loadConfig({ ...production, STRIPE_SECRET_KEY: 'sk_live_abc123', STRIPE_WEBHOOK_SECRET: 'whsec_abc123' });
    expect(paymentsApiBase(c)).toBeNull();
    expect(() => loadConfig({ ...base, STRIPE_SECRET_KEY: 'pk_test_abc' })).toThrow(/STRIPE_SECRET_KEY/);
    expect(() => loadConfig({ ...base, STRIPE_API_BASE: 'ftp://x' })).toThrow(/STRIPE_API_BASE/);
  });
});
