// The one door to the payments provider: the only module that imports its SDK. Every change
// carries an idempotency key, answers our own plain shapes, and fails with our own errors.
import Stripe from 'stripe';
import type { Config } from '../config';
import { PaymentDeclined, PaymentIdempotencyConflict, PaymentRejected, PaymentsUnavailable, WebhookSignatureInvalid } from './errors';

export type PaymentsConfig = Pick<Config, 'NODE_ENV' | 'STRIPE_SECRET_KEY' | 'STRIPE_WEBHOOK_SECRET' | 'STRIPE_API_BASE' | 'PAYMENTS_FAKE_PORT'>;

/** The header the provider signs its webhooks in. */
export const WEBHOOK_SIGNATURE_HEADER = 'stripe-signature';

/** A verified webhook event, as the provider's SDK types it. */
export type PaymentEvent = Stripe.Event;

export type PaymentIntentStatus = 'requires_payment_method' | 'requires_confirmation' | 'requires_action' | 'processing' | 'requires_capture' | 'canceled' | 'succeeded';

export interface CreateCheckoutInput {
  bookingId: string;
  /** The whole amount to hold, in minor units (cents). */
  amountMinor: number;
  /** ISO 4217, any case: "EUR". */
  currency: string;
  /** What the customer sees on the payment page. */
  description: string;
  customerEmail?: string;
  /** Where the customer lands after paying; a literal `{CHECKOUT_SESSION_ID}` is replaced by the session id. */
  successUrl: string;
  cancelUrl: string;
  /** Between 30 minutes and 24 hours from now (the provider's limits). */
  expiresAt: Date;
  /** Extra metadata next to booking_id (keys up to 40 characters, values up to 500). */
  metadata?: Record<string, string>;
  idempotencyKey: string;
}

export interface CheckoutCreated {
  sessionId: string;
  /** The provider's payment page for this session. */
  url: string;
  expiresAt: Date;
}

export interface PaymentErrorSummary {
  /** e.g. card_declined */
  code: string | null;
  /** e.g. generic_decline, insufficient_funds */
  declineCode: string | null;
  message: string | null;
}

export interface CheckoutStatus {
  sessionId: string;
  status: 'open' | 'complete' | 'expired';
  /** "unpaid" while the money is only held (manual capture); "paid" once captured at checkout. */
  paymentStatus: 'paid' | 'unpaid' | 'no_payment_required';
  bookingId: string | null;
  amountMinor: number;
  currency: string;
  expiresAt: Date;
  /** Set once the customer tried to pay. */
  paymentIntentId: string | null;
  paymentIntentStatus: PaymentIntentStatus | null;
  /** What can still be captured: the whole amount once authorised, 0 otherwise. */
  amountCapturableMinor: number;
  /** The last failed attempt (a declined card), if any. */
  lastPaymentError: PaymentErrorSummary | null;
}

export interface PaymentIntentSummary {
  paymentIntentId: string;
  status: PaymentIntentStatus;
  bookingId: string | null;
  amountMinor: number;
  amountCapturableMinor: number;
  amountReceivedMinor: number;
  currency: string;
  latestChargeId: string | null;
  lastPaymentError: PaymentErrorSummary | null;
}

export interface RefundSummary {
  refundId: string;
  status: string;
  amountMinor: number;
  currency: string;
  paymentIntentId: string | null;
  chargeId: string | null;
}

export interface ConnectedAccountInput {
  type: 'express' | 'custom';
  /** ISO 3166-1 alpha-2, e.g. "AT". */
  country: string;
  email?: string;
  metadata?: Record<string, string>;
  idempotencyKey: string;
}

export interface ConnectedAccountSummary {
  accountId: string;
  type: string;
  chargesEnabled: boolean;
  payoutsEnabled: boolean;
  detailsSubmitted: boolean;
}

export interface TransferInput {
  destinationAccountId: string;
  amountMinor: number;
  currency: string;
  /** The charge whose money this passes on (lets the transfer run before that money is available). */
  sourceChargeId?: string;
  transferGroup?: string;
  metadata?: Record<string, string>;
  idempotencyKey: string;
}

export interface TransferSummary {
  transferId: string;
  amountMinor: number;
  currency: string;
  destinationAccountId: string;
  balanceTransactionId: string | null;
  sourceChargeId: string | null;
}

export interface BalanceTransactionQuery {
  /** 1–100, default 10. */
  limit?: number;
  startingAfter?: string;
  /** charge, refund, transfer, … */
  type?: string;
  /** Only the transactions of this charge, refund or transfer. */
  sourceId?: string;
}

export interface BalanceTransactionSummary {
  id: string;
  type: string;
  /** Positive for money in, negative for money out, in minor units. */
  amountMinor: number;
  feeMinor: number;
  netMinor: number;
  currency: string;
  sourceId: string | null;
  created: Date;
}

export interface PaymentGateway {
  /** Starts a hosted checkout that authorises (holds) the amount; capture it later. */
  createCheckout(input: CreateCheckoutInput): Promise<CheckoutCreated>;
  getCheckout(sessionId: string): Promise<CheckoutStatus>;
  /** Ends an open checkout so that it can no longer be paid. */
  expireCheckout(sessionId: string, idempotencyKey: string): Promise<CheckoutStatus>;
  getPaymentIntent(paymentIntentId: string): Promise<PaymentIntentSummary>;
  /** Takes held money: all of it, or `amountMinor` of it (the rest of the hold is released). */
  capture(paymentIntentId: string, amountMinor: number | undefined, idempotencyKey: string): Promise<PaymentIntentSummary>;
  /** Releases a hold that was never captured; no money moves. */
  cancelAuthorization(paymentIntentId: string, idempotencyKey: string): Promise<PaymentIntentSummary>;
  /** Gives back captured money: all that is left, or `amountMinor` of it. */
  refund(paymentIntentId: string, amountMinor: number | undefined, idempotencyKey: string): Promise<RefundSummary>;
  /** Checks a webhook's signature over the raw body; throws WebhookSignatureInvalid when it does not verify. */
  verifyWebhook(rawBody: Buffer, signature: string | undefined): PaymentEvent;
  createConnectedAccount(input: ConnectedAccountInput): Promise<ConnectedAccountSummary>;
  transfer(input: TransferInput): Promise<TransferSummary>;
  /** Newest first. */
  listBalanceTransactions(query?: BalanceTransactionQuery): Promise<{ items: BalanceTransactionSummary[]; hasMore: boolean }>;
}

export interface GatewayOptions {
  /** Retries of a failed request (network errors, 409, 5xx), safe because every change is keyed. Default 2. */
  maxNetworkRetries?: number;
  /** Per request, in milliseconds. Default 20 000. */
  timeoutMs?: number;
  /** How old a webhook may be, in seconds. Default 300, the SDK's. */
  webhookToleranceSeconds?: number;
}

/**
 * Where the SDK sends requests: STRIPE_API_BASE when set; unset, the real service in production and
 * the local fake (127.0.0.1:PAYMENTS_FAKE_PORT) anywhere else. Only scheme, host and port count.
 */
export function paymentsApiBase(config: PaymentsConfig): URL | null {
  if (config.STRIPE_API_BASE) return new URL(config.STRIPE_API_BASE);
  if (config.NODE_ENV === 'production') return null;
  return new URL(`http://127.0.0.1:${config.PAYMENTS_FAKE_PORT}`);
}

function requireKey(idempotencyKey: string): string {
  // a missing key would let the SDK invent one per call, and a retry by our caller would pay twice
  if (typeof idempotencyKey !== 'string' || idempotencyKey.trim() === '' || idempotencyKey.length > 255) {
    throw new TypeError('Every change to a payment needs an idempotency key of 1 to 255 characters');
  }
  return idempotencyKey;
}

function requireMinor(amountMinor: number, name: string): number {
  if (!Number.isSafeInteger(amountMinor) || amountMinor <= 0) throw new RangeError(`${name} must be a positive whole number of minor units`);
  return amountMinor;
}

/** The SDK's errors as ours; nothing of the request (and so never the secret key) is carried over. */
export function toPaymentError(err: unknown): Error {
  const E = Stripe.errors;
  if (err instanceof E.StripeCardError) {
    return new PaymentDeclined(err.code ?? 'card_declined', err.decline_code, err.message || 'The card was declined.');
  }
  if (err instanceof E.StripeConnectionError) return new PaymentsUnavailable('unreachable');
  if (err instanceof E.StripeRateLimitError) return new PaymentsUnavailable('rate_limited', 'The payments provider is busy. Please try again in a minute.', err.requestId);
  if (err instanceof E.StripeAuthenticationError || err instanceof E.StripePermissionError) {
    return new PaymentsUnavailable('not_authorised', 'Payments are not set up correctly at the moment; the team has to check the provider credentials.', err.requestId);
  }
  if (err instanceof E.StripeIdempotencyError) return new PaymentIdempotencyConflict(err.message);
  if (err instanceof E.StripeInvalidRequestError) return new PaymentRejected(err.code, err.message, err.param);
  if (err instanceof E.StripeError) {
    if (err.statusCode === undefined || err.statusCode >= 500) return new PaymentsUnavailable('provider_error', undefined, err.requestId);
    return new PaymentRejected(err.code, err.message, err.param);
  }
  return err instanceof Error ? err : new Error(String(err));
}

async function call<T>(request: () => Promise<T>): Promise<T> {
  try {
    return await request();
  } catch (err) {
    throw toPaymentError(err);
  }
}

const idOf = (value: string | { id: string } | null | undefined): string | null => (value == null ? null : typeof value === 'string' ? value : value.id);

function errorSummary(error: Stripe.PaymentIntent.LastPaymentError | null | undefined): PaymentErrorSummary | null {
  if (!error) return null;
  return { code: error.code ?? null, declineCode: error.decline_code ?? null, message: error.message ?? null };
}

function intentSummary(pi: Stripe.PaymentIntent): PaymentIntentSummary {
  return {
    paymentIntentId: pi.id,
    status: pi.status as PaymentIntentStatus,
    bookingId: pi.metadata?.booking_id ?? null,
    amountMinor: pi.amount,
    amountCapturableMinor: pi.amount_capturable,
    amountReceivedMinor: pi.amount_received,
    currency: pi.currency,
    latestChargeId: idOf(pi.latest_charge),
    lastPaymentError: errorSummary(pi.last_payment_error),
  };
}

function checkoutStatus(session: Stripe.Checkout.Session): CheckoutStatus {
  const pi = typeof session.payment_intent === 'object' ? session.payment_intent : null;
  return {
    sessionId: session.id,
    status: session.status as CheckoutStatus['status'],
    paymentStatus: session.payment_status as CheckoutStatus['paymentStatus'],
    bookingId: session.metadata?.booking_id ?? session.client_reference_id ?? null,
    amountMinor: session.amount_total ?? 0,
    currency: session.currency ?? '',
    expiresAt: new Date(session.expires_at * 1000),
    paymentIntentId: idOf(session.payment_intent),
    paymentIntentStatus: pi ? (pi.status as PaymentIntentStatus) : null,
    amountCapturableMinor: pi ? pi.amount_capturable : 0,
    lastPaymentError: pi ? errorSummary(pi.last_payment_error) : null,
  };
}

export function createPaymentGateway(config: PaymentsConfig, options: GatewayOptions = {}): PaymentGateway {
  const base = paymentsApiBase(config);
  const stripe = new Stripe(config.STRIPE_SECRET_KEY, {
    maxNetworkRetries: options.maxNetworkRetries ?? 2,
    timeout: options.timeoutMs ?? 20_000,
    telemetry: false,
    ...(base
      ? {
          host: base.hostname,
          port: base.port || (base.protocol === 'https:' ? 443 : 80),
          protocol: base.protocol === 'https:' ? ('https' as const) : ('http' as const),
        }
      : {}),
  });
  const webhookSecret = config.STRIPE_WEBHOOK_SECRET;
  const tolerance = options.webhookToleranceSeconds ?? 300;

  const gateway: PaymentGateway = {
    async createCheckout(input) {
      const idempotencyKey = requireKey(input.idempotencyKey);
      const amount = requireMinor(input.amountMinor, 'amountMinor');
      const currency = input.currency.toLowerCase();
      const metadata = { ...input.metadata, booking_id: input.bookingId };
      const session = await call(() =>
        stripe.checkout.sessions.create(
          {
            mode: 'payment',
            line_items: [{ quantity: 1, price_data: { currency, unit_amount: amount, product_data: { name: input.description } } }],
            customer_email: input.customerEmail,
            client_reference_id: input.bookingId,
            success_url: input.successUrl,
            cancel_url: input.cancelUrl,
            expires_at: Math.floor(input.expiresAt.getTime() / 1000),
            metadata,
            // the money is held at checkout and taken once the job is confirmed
            payment_intent_data: { capture_method: 'manual', description: input.description, metadata },
          },
          { idempotencyKey },
        ),
      );
      if (!session.url) throw new PaymentRejected(undefined, 'The payments provider answered without a payment page URL.');
      return { sessionId: session.id, url: session.url, expiresAt: new Date(session.expires_at * 1000) };
    },

    async getCheckout(sessionId) {
      return checkoutStatus(await call(() => stripe.checkout.sessions.retrieve(sessionId, { expand: ['payment_intent'] })));
    },

    async expireCheckout(sessionId, idempotencyKey) {
      const key = requireKey(idempotencyKey);
      return checkoutStatus(await call(() => stripe.checkout.sessions.expire(sessionId, { expand: ['payment_intent'] }, { idempotencyKey: key })));
    },

    async getPaymentIntent(paymentIntentId) {
      return intentSummary(await call(() => stripe.paymentIntents.retrieve(paymentIntentId)));
    },

    async capture(paymentIntentId, amountMinor, idempotencyKey) {
      const key = requireKey(idempotencyKey);
      const params = amountMinor === undefined ? {} : { amount_to_capture: requireMinor(amountMinor, 'amountMinor') };
      return intentSummary(await call(() => stripe.paymentIntents.capture(paymentIntentId, params, { idempotencyKey: key })));
    },

    async cancelAuthorization(paymentIntentId, idempotencyKey) {
      const key = requireKey(idempotencyKey);
      return intentSummary(await call(() => stripe.paymentIntents.cancel(paymentIntentId, {}, { idempotencyKey: key })));
    },

    async refund(paymentIntentId, amountMinor, idempotencyKey) {
      const key = requireKey(idempotencyKey);
      const refund = await call(() =>
        stripe.refunds.create(
          { payment_intent: paymentIntentId, ...(amountMinor === undefined ? {} : { amount: requireMinor(amountMinor, 'amountMinor') }) },
          { idempotencyKey: key },
        ),
      );
      return {
        refundId: refund.id,
        status: refund.status ?? 'pending',
        amountMinor: refund.amount,
        currency: refund.currency,
        paymentIntentId: idOf(refund.payment_intent),
        chargeId: idOf(refund.charge),
      };
    },

    verifyWebhook(rawBody, signature) {
      if (!signature) throw new WebhookSignatureInvalid('The request has no payments provider signature header.');
      try {
        return stripe.webhooks.constructEvent(rawBody, signature, webhookSecret, tolerance);
      } catch (err) {
        if (err instanceof Stripe.errors.StripeSignatureVerificationError) {
          // the SDK's message is long and names its own documentation; the first sentence is enough
          throw new WebhookSignatureInvalid(err.message.split('\n')[0]!.trim());
        }
        throw new WebhookSignatureInvalid('The webhook body could not be read.');
      }
    },

    async createConnectedAccount(input) {
      const key = requireKey(input.idempotencyKey);
      const account = await call(() =>
        stripe.accounts.create(
          { type: input.type, country: input.country.toUpperCase(), email: input.email, metadata: input.metadata, capabilities: { transfers: { requested: true } } },
          { idempotencyKey: key },
        ),
      );
      return {
        accountId: account.id,
        type: account.type ?? input.type,
        chargesEnabled: account.charges_enabled ?? false,
        payoutsEnabled: account.payouts_enabled ?? false,
        detailsSubmitted: account.details_submitted ?? false,
      };
    },

    async transfer(input) {
      const key = requireKey(input.idempotencyKey);
      const transfer = await call(() =>
        stripe.transfers.create(
          {
            amount: requireMinor(input.amountMinor, 'amountMinor'),
            currency: input.currency.toLowerCase(),
            destination: input.destinationAccountId,
            source_transaction: input.sourceChargeId,
            transfer_group: input.transferGroup,
            metadata: input.metadata,
          },
          { idempotencyKey: key },
        ),
      );
      return {
        transferId: transfer.id,
        amountMinor: transfer.amount,
        currency: transfer.currency,
        destinationAccountId: idOf(transfer.destination) ?? input.destinationAccountId,
        balanceTransactionId: idOf(transfer.balance_transaction),
        sourceChargeId: idOf(transfer.source_transaction),
      };
    },

    async listBalanceTransactions(query = {}) {
      const page = await call(() =>
        stripe.balanceTransactions.list({ limit: query.limit, starting_after: query.startingAfter, type: query.type, source: query.sourceId }),
      );
      return {
        hasMore: page.has_more,
        items: page.data.map((t) => ({
          id: t.id,
          type: t.type,
          amountMinor: t.amount,
          feeMinor: t.fee,
          netMinor: t.net,
          currency: t.currency,
          sourceId: idOf(t.source),
          created: new Date(t.created * 1000),
        })),
      };
    },
  };
  return gateway;
}
