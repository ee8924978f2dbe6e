// What the payments fake does: checkout sessions, payment intents and their charges, refunds,
// connected accounts, transfers and the balance ledger, each change recorded as an event.
// Behaviour follows the provider's API reference; where the fake simplifies, it says so here.
import { checkCard, type CardDetails, type CardOutcome } from './test-cards';
import {
  allow,
  asParams,
  currency as readCurrency,
  int,
  invalid,
  metadata as readMetadata,
  missingObject,
  oneOf,
  ProviderError,
  str,
  unexpectedState,
  url,
  type Params,
} from './params';
import { newId, toWire, type FakeState, type WireObject } from './store';

/** Where a change came from: an API request (with its id and idempotency key) or the payment page. */
export interface Origin {
  requestId: string | null;
  idempotencyKey: string | null;
}

export const NO_REQUEST: Origin = { requestId: null, idempotencyKey: null };

export interface FakeContext {
  state: FakeState;
  /** Unix seconds on the fake's clock (the wall clock plus the test offset). */
  now(): number;
  /** Base URL of the fake as a browser reaches it; checkout URLs point at its payment page. */
  publicUrl: string;
  /** Records an event (and queues its webhook). */
  emit(type: string, object: WireObject, origin: Origin, previousAttributes?: Record<string, unknown>): WireObject;
}

/**
 * The fake's own fee on a captured charge, invented for the fake and not the provider's price list:
 * 1.5 % of the amount, rounded to the minor unit, plus 25 minor units. Refunds and transfers carry no fee.
 */
export const fakeFee = (amount: number) => Math.round(amount * 0.015) + 25;

/** Smallest charge the fake accepts, in minor units (the provider's minimum for the common currencies). */
export const MINIMUM_CHARGE = 50;

const CHECKOUT_MIN_LIFETIME_S = 30 * 60;
const CHECKOUT_MAX_LIFETIME_S = 24 * 60 * 60;

type Status = 'requires_payment_method' | 'requires_confirmation' | 'requires_action' | 'processing' | 'requires_capture' | 'canceled' | 'succeeded';

function get(ctx: FakeContext, collection: keyof Pick<FakeState, 'customers' | 'checkoutSessions' | 'paymentIntents' | 'charges' | 'refunds' | 'accounts' | 'transfers' | 'balanceTransactions' | 'events'>, kind: string, id: string, param = 'id'): WireObject {
  const found = ctx.state[collection][id];
  if (!found) throw missingObject(kind, id, param);
  return found;
}

export const getSession = (ctx: FakeContext, id: string) => get(ctx, 'checkoutSessions', 'checkout.session', id);
export const getPaymentIntent = (ctx: FakeContext, id: string, param = 'intent') => get(ctx, 'paymentIntents', 'payment_intent', id, param);

// ---------------------------------------------------------------------------------------------
// Customers

export function createCustomer(ctx: FakeContext, p: Params): WireObject {
  allow(p, ['email', 'name', 'description', 'phone', 'metadata', 'expand']);
  const customer: WireObject = {
    id: newId('cus'),
    object: 'customer',
    created: ctx.now(),
    description: str(p, 'description', { max: 350 }) ?? null,
    email: str(p, 'email', { max: 512 }) ?? null,
    livemode: false,
    metadata: readMetadata(p.metadata),
    name: str(p, 'name', { max: 256 }) ?? null,
    phone: str(p, 'phone', { max: 20 }) ?? null,
  };
  ctx.state.customers[customer.id] = customer;
  return customer;
}

// ---------------------------------------------------------------------------------------------
// Balance ledger

function addBalanceTransaction(ctx: FakeContext, o: { type: 'charge' | 'refund' | 'transfer'; amount: number; fee: number; currency: string; source: string; description: string | null }): WireObject {
  const created = ctx.now();
  const txn: WireObject = {
    id: newId('txn'),
    object: 'balance_transaction',
    amount: o.amount,
    // the fake makes money available at once; the provider holds it for a few days
    available_on: created,
    created,
    currency: o.currency,
    description: o.description,
    fee: o.fee,
    fee_details: o.fee ? [{ amount: o.fee, application: null, currency: o.currency, description: 'Payments fake processing fee (1.5 % + 25)', type: 'stripe_fee' }] : [],
    net: o.amount - o.fee,
    reporting_category: o.type,
    source: o.source,
    status: 'available',
    type: o.type,
  };
  ctx.state.balanceTransactions[txn.id] = txn;
  return txn;
}

export function availableBalance(ctx: FakeContext, currency: string): number {
  return Object.values(ctx.state.balanceTransactions)
    .filter((t) => t.currency === currency)
    .reduce((sum, t) => sum + (t.net as number), 0);
}

export function balance(ctx: FakeContext): WireObject {
  const currencies = [...new Set(Object.values(ctx.state.balanceTransactions).map((t) => t.currency as string))];
  return {
    id: 'balance',
    object: 'balance',
    available: currencies.map((c) => ({ amount: availableBalance(ctx, c), currency: c, source_types: { card: availableBalance(ctx, c) } })),
    livemode: false,
    pending: currencies.map((c) => ({ amount: 0, currency: c, source_types: { card: 0 } })),
  };
}

// ---------------------------------------------------------------------------------------------
// Checkout sessions

export function createCheckoutSession(ctx: FakeContext, p: Params): WireObject {
  allow(p, ['mode', 'line_items', 'customer', 'customer_email', 'client_reference_id', 'success_url', 'cancel_url', 'expires_at', 'metadata', 'payment_intent_data', 'payment_method_types', 'locale', 'expand']);
  const mode = str(p, 'mode', { required: true });
  if (mode !== 'payment') throw invalid(`The payments fake supports mode=payment only, not ${mode}.`, 'mode');
  const now = ctx.now();

  const rawItems = p.line_items;
  if (rawItems === undefined || rawItems === '') throw invalid('Missing required param: line_items.', 'line_items', 'parameter_missing');
  if (!Array.isArray(rawItems) || rawItems.length === 0) throw invalid('line_items must be a list with at least one item.', 'line_items');
  let sessionCurrency: string | undefined;
  const lineItems = rawItems.map((raw, i) => {
    const prefix = `line_items[${i}]`;
    const item = asParams(raw, prefix);
    allow(item, ['price_data', 'quantity', 'price'], prefix);
    if (item.price !== undefined) throw missingObject('price', String(item.price), `${prefix}[price]`);
    const priceData = asParams(item.price_data, `${prefix}[price_data]`);
    if (Object.keys(priceData).length === 0) throw invalid(`Missing required param: ${prefix}[price_data].`, `${prefix}[price_data]`, 'parameter_missing');
    allow(priceData, ['currency', 'unit_amount', 'product_data'], `${prefix}[price_data]`);
    const itemCurrency = readCurrency(priceData, 'currency', `${prefix}[price_data][currency]`);
    if (sessionCurrency && sessionCurrency !== itemCurrency) throw invalid('All line items must use the same currency.', `${prefix}[price_data][currency]`);
    sessionCurrency = itemCurrency;
    const unitAmount = int(priceData, 'unit_amount', { required: true, min: 0, param: `${prefix}[price_data][unit_amount]` });
    const product = asParams(priceData.product_data, `${prefix}[price_data][product_data]`);
    allow(product, ['name', 'description'], `${prefix}[price_data][product_data]`);
    const name = str(product, 'name', { required: true, max: 250, param: `${prefix}[price_data][product_data][name]` });
    const description = str(product, 'description', { max: 500 }) ?? null;
    const quantity = int(item, 'quantity', { required: true, min: 1, param: `${prefix}[quantity]` });
    return {
      id: newId('li'),
      object: 'item',
      amount_discount: 0,
      amount_subtotal: unitAmount * quantity,
      amount_tax: 0,
      amount_total: unitAmount * quantity,
      currency: itemCurrency,
      description: name,
      price: { id: newId('price'), object: 'price', currency: itemCurrency, unit_amount: unitAmount, product: { name, description }, type: 'one_time' },
      quantity,
    };
  });
  const amountTotal = lineItems.reduce((sum, li) => sum + li.amount_total, 0);
  if (amountTotal < MINIMUM_CHARGE) throw invalid(`The Checkout Session's total amount must be at least ${MINIMUM_CHARGE} minor units.`, 'line_items', 'amount_too_small');

  const expiresAt = int(p, 'expires_at') ?? now + CHECKOUT_MAX_LIFETIME_S;
  if (expiresAt < now + CHECKOUT_MIN_LIFETIME_S || expiresAt > now + CHECKOUT_MAX_LIFETIME_S) {
    throw invalid('The `expires_at` timestamp must be at least 30 minutes and at most 24 hours after the Checkout Session is created.', 'expires_at');
  }
  const customer = str(p, 'customer');
  if (customer) get(ctx, 'customers', 'customer', customer, 'customer');

  const piData = asParams(p.payment_intent_data, 'payment_intent_data');
  allow(piData, ['capture_method', 'metadata', 'description', 'transfer_group', 'receipt_email'], 'payment_intent_data');
  const id = newId('cs_test');
  const session: WireObject = {
    id,
    object: 'checkout.session',
    amount_subtotal: amountTotal,
    amount_total: amountTotal,
    cancel_url: url(p, 'cancel_url', { required: false }) ?? null,
    client_reference_id: str(p, 'client_reference_id', { max: 200 }) ?? null,
    created: now,
    currency: sessionCurrency,
    customer: customer ?? null,
    customer_details: null,
    customer_email: str(p, 'customer_email', { max: 800 }) ?? null,
    expires_at: expiresAt,
    livemode: false,
    locale: str(p, 'locale') ?? null,
    metadata: readMetadata(p.metadata),
    mode: 'payment',
    payment_intent: null,
    payment_method_types: ['card'],
    payment_status: 'unpaid',
    status: 'open',
    success_url: url(p, 'success_url', { required: true }),
    url: `${ctx.publicUrl}/pay/${id}`,
    _line_items: lineItems,
    _payment_intent_data: {
      capture_method: oneOf(piData, 'capture_method', ['automatic', 'automatic_async', 'manual'], 'automatic_async', 'payment_intent_data[capture_method]'),
      metadata: readMetadata(piData.metadata, 'payment_intent_data[metadata]'),
      description: str(piData, 'description', { max: 1000 }) ?? null,
      transfer_group: str(piData, 'transfer_group') ?? null,
      receipt_email: str(piData, 'receipt_email') ?? null,
    },
  };
  ctx.state.checkoutSessions[id] = session;
  return session;
}

/** The session's line items as the provider lists them (`expand[]=line_items`). */
export function sessionLineItems(session: WireObject) {
  return { object: 'list', data: session._line_items, has_more: false, url: `/v1/checkout/sessions/${session.id}/line_items` };
}

function expireSessionNow(ctx: FakeContext, session: WireObject, origin: Origin): void {
  session.status = 'expired';
  session.url = null;
  // an attempt that never succeeded ends with the session
  const piId = session.payment_intent as string | null;
  const pi = piId ? ctx.state.paymentIntents[piId] : undefined;
  if (pi && pi.status === 'requires_payment_method') {
    pi.status = 'canceled';
    pi.canceled_at = ctx.now();
    pi.cancellation_reason = 'abandoned';
    ctx.emit('payment_intent.canceled', pi, origin);
  }
  ctx.emit('checkout.session.expired', session, origin);
}

export function expireSession(ctx: FakeContext, id: string, p: Params, origin: Origin): WireObject {
  allow(p, ['expand']);
  const session = getSession(ctx, id);
  if (session.status !== 'open') throw unexpectedState(`Only Checkout Sessions with a status in ["open"] can be expired; this one is ${String(session.status)}.`, 'checkout_session_not_open');
  expireSessionNow(ctx, session, origin);
  return session;
}

/** Expires every open session whose time is up; runs before each request and on a timer. */
export function sweepExpiredSessions(ctx: FakeContext): number {
  let expired = 0;
  const now = ctx.now();
  for (const session of Object.values(ctx.state.checkoutSessions)) {
    if (session.status === 'open' && (session.expires_at as number) <= now) {
      expireSessionNow(ctx, session, NO_REQUEST);
      expired++;
    }
  }
  return expired;
}

// ---------------------------------------------------------------------------------------------
// Payment intents and charges

function newPaymentIntent(ctx: FakeContext, o: { amount: number; currency: string; captureMethod: string; metadata: Record<string, string>; description: string | null; customer: string | null; receiptEmail: string | null; transferGroup: string | null }): WireObject {
  const id = newId('pi');
  const pi: WireObject = {
    id,
    object: 'payment_intent',
    amount: o.amount,
    amount_capturable: 0,
    amount_received: 0,
    canceled_at: null,
    cancellation_reason: null,
    capture_method: o.captureMethod,
    client_secret: `${id}_secret_${newId('s').slice(2)}`,
    confirmation_method: 'automatic',
    created: ctx.now(),
    currency: o.currency,
    customer: o.customer,
    description: o.description,
    last_payment_error: null,
    latest_charge: null,
    livemode: false,
    metadata: o.metadata,
    payment_method: null,
    payment_method_types: ['card'],
    receipt_email: o.receiptEmail,
    status: 'requires_payment_method' satisfies Status,
    transfer_group: o.transferGroup,
  };
  ctx.state.paymentIntents[id] = pi;
  return pi;
}

export function createPaymentIntent(ctx: FakeContext, p: Params): WireObject {
  allow(p, ['amount', 'currency', 'capture_method', 'metadata', 'description', 'customer', 'receipt_email', 'transfer_group', 'payment_method_types', 'expand']);
  const amount = int(p, 'amount', { required: true, min: 1 });
  if (amount < MINIMUM_CHARGE) throw invalid(`Amount must be at least ${MINIMUM_CHARGE} minor units.`, 'amount', 'amount_too_small');
  const customer = str(p, 'customer') ?? null;
  if (customer) get(ctx, 'customers', 'customer', customer, 'customer');
  return newPaymentIntent(ctx, {
    amount,
    currency: readCurrency(p, 'currency'),
    captureMethod: oneOf(p, 'capture_method', ['automatic', 'automatic_async', 'manual'], 'automatic_async'),
    metadata: readMetadata(p.metadata),
    description: str(p, 'description', { max: 1000 }) ?? null,
    customer,
    receiptEmail: str(p, 'receipt_email') ?? null,
    transferGroup: str(p, 'transfer_group') ?? null,
  });
}

function capturedNow(ctx: FakeContext, pi: WireObject, charge: WireObject, amount: number): void {
  const txn = addBalanceTransaction(ctx, { type: 'charge', amount, fee: fakeFee(amount), currency: pi.currency as string, source: charge.id, description: (pi.description as string | null) ?? null });
  charge.captured = true;
  charge.amount_captured = amount;
  charge.balance_transaction = txn.id;
  pi.amount_capturable = 0;
  pi.amount_received = amount;
  pi.status = 'succeeded' satisfies Status;
}

export type AttemptResult =
  | { outcome: 'authorised'; paymentIntent: WireObject; charge: WireObject }
  | { outcome: 'declined'; paymentIntent: WireObject; charge: WireObject; code: string; declineCode: string; message: string };

/** One card attempt on a payment intent: a charge that is authorised (and captured unless manual) or declined. */
function attempt(ctx: FakeContext, pi: WireObject, card: { outcome: CardOutcome; last4: string; expMonth: number; expYear: number }, origin: Origin): AttemptResult {
  const paymentMethod = newId('pm');
  const declined = card.outcome.kind === 'declined' ? card.outcome : null;
  const charge: WireObject = {
    id: newId('ch'),
    object: 'charge',
    amount: pi.amount,
    amount_captured: 0,
    amount_refunded: 0,
    balance_transaction: null,
    captured: false,
    created: ctx.now(),
    currency: pi.currency,
    customer: pi.customer,
    description: pi.description,
    failure_code: declined ? declined.code : null,
    failure_message: declined ? declined.message : null,
    livemode: false,
    metadata: pi.metadata,
    outcome: declined
      ? { network_status: 'declined_by_network', reason: declined.declineCode, risk_level: 'normal', seller_message: 'The bank did not return any further details with this decline.', type: 'issuer_declined' }
      : { network_status: 'approved_by_network', reason: null, risk_level: 'normal', seller_message: 'Payment complete.', type: 'authorized' },
    paid: !declined,
    payment_intent: pi.id,
    payment_method: paymentMethod,
    // no card network names in the fake: only what a test needs
    payment_method_details: { type: 'card', card: { last4: card.last4, exp_month: card.expMonth, exp_year: card.expYear, funding: 'credit' } },
    refunded: false,
    status: declined ? 'failed' : 'succeeded',
    transfer_group: pi.transfer_group,
  };
  ctx.state.charges[charge.id] = charge;
  pi.latest_charge = charge.id;
  pi.payment_method = paymentMethod;

  if (declined) {
    pi.status = 'requires_payment_method' satisfies Status;
    pi.last_payment_error = { type: 'card_error', code: declined.code, decline_code: declined.declineCode, message: declined.message, charge: charge.id, payment_method: { id: paymentMethod, object: 'payment_method', type: 'card' } };
    ctx.emit('payment_intent.payment_failed', pi, origin);
    return { outcome: 'declined', paymentIntent: pi, charge, code: declined.code, declineCode: declined.declineCode, message: declined.message };
  }
  pi.last_payment_error = null;
  if (pi.capture_method === 'manual') {
    pi.status = 'requires_capture' satisfies Status;
    pi.amount_capturable = pi.amount;
    ctx.emit('payment_intent.amount_capturable_updated', pi, origin);
  } else {
    capturedNow(ctx, pi, charge, pi.amount as number);
    ctx.emit('payment_intent.succeeded', pi, origin);
  }
  return { outcome: 'authorised', paymentIntent: pi, charge };
}

export type PayResult =
  | { outcome: 'succeeded'; session: WireObject; paymentIntent: WireObject; redirectUrl: string }
  | { outcome: 'declined'; session: WireObject; paymentIntent: WireObject; code: string; declineCode: string; message: string }
  | { outcome: 'refused'; field: 'number' | 'expiry' | 'cvc'; message: string }
  | { outcome: 'closed'; session: WireObject; message: string };

/** The customer pays a checkout session with a card (from the payment page or the control API). */
export function paySession(ctx: FakeContext, sessionId: string, details: CardDetails): PayResult {
  const session = getSession(ctx, sessionId);
  if (session.status !== 'open') {
    return { outcome: 'closed', session, message: session.status === 'complete' ? 'This payment has already been made.' : 'This payment link has expired.' };
  }
  const check = checkCard(details, new Date(ctx.now() * 1000));
  if (!check.ok) return { outcome: 'refused', field: check.field, message: check.message };

  const piData = session._payment_intent_data as { capture_method: string; metadata: Record<string, string>; description: string | null; transfer_group: string | null; receipt_email: string | null };
  const existing = session.payment_intent ? ctx.state.paymentIntents[session.payment_intent as string] : undefined;
  const pi =
    existing ??
    newPaymentIntent(ctx, {
      amount: session.amount_total as number,
      currency: session.currency as string,
      captureMethod: piData.capture_method,
      metadata: piData.metadata,
      description: piData.description,
      customer: session.customer as string | null,
      receiptEmail: piData.receipt_email ?? (session.customer_email as string | null),
      transferGroup: piData.transfer_group,
    });
  session.payment_intent = pi.id;
  const result = attempt(ctx, pi, { outcome: check.card.outcome, last4: check.last4, expMonth: check.expMonth, expYear: check.expYear }, NO_REQUEST);
  if (result.outcome === 'declined') return { ...result, session };

  session.status = 'complete';
  // with manual capture the money is only held, so the session stays unpaid until capture
  session.payment_status = pi.status === 'succeeded' ? 'paid' : 'unpaid';
  session.customer_details = { email: session.customer_email, name: null };
  session.url = null;
  ctx.emit('checkout.session.completed', session, NO_REQUEST);
  const redirectUrl = (session.success_url as string).replaceAll('{CHECKOUT_SESSION_ID}', session.id);
  return { outcome: 'succeeded', session, paymentIntent: pi, redirectUrl };
}

/** Pays a payment intent created through the API with a test card (control API only). */
export function payPaymentIntent(ctx: FakeContext, id: string, details: CardDetails): AttemptResult | { outcome: 'refused'; field: string; message: string } {
  const pi = getPaymentIntent(ctx, id);
  if (pi.status !== 'requires_payment_method') throw unexpectedState(`This PaymentIntent has a status of ${String(pi.status)}; only one that requires a payment method can be paid.`);
  const check = checkCard(details, new Date(ctx.now() * 1000));
  if (!check.ok) return { outcome: 'refused', field: check.field, message: check.message };
  return attempt(ctx, pi, { outcome: check.card.outcome, last4: check.last4, expMonth: check.expMonth, expYear: check.expYear }, NO_REQUEST);
}

export function capturePaymentIntent(ctx: FakeContext, id: string, p: Params, origin: Origin): WireObject {
  allow(p, ['amount_to_capture', 'metadata', 'expand']);
  const pi = getPaymentIntent(ctx, id);
  if (pi.status !== 'requires_capture') {
    throw unexpectedState(`This PaymentIntent could not be captured because it has a status of ${String(pi.status)}. Only a PaymentIntent with one of the following statuses may be captured: requires_capture.`);
  }
  const capturable = pi.amount_capturable as number;
  const amount = int(p, 'amount_to_capture', { min: 1 }) ?? capturable;
  if (amount > capturable) throw invalid(`The amount to capture (${amount}) is greater than the amount that can be captured (${capturable}).`, 'amount_to_capture', 'amount_too_large');
  if (p.metadata !== undefined) pi.metadata = { ...(pi.metadata as object), ...readMetadata(p.metadata) };
  const charge = get(ctx, 'charges', 'charge', pi.latest_charge as string);
  // a partial capture releases the rest of the hold; the fake keeps no record of the released part
  capturedNow(ctx, pi, charge, amount);
  ctx.emit('payment_intent.succeeded', pi, origin);
  return pi;
}

const CANCELABLE: readonly Status[] = ['requires_payment_method', 'requires_capture', 'requires_confirmation', 'requires_action', 'processing'];

export function cancelPaymentIntent(ctx: FakeContext, id: string, p: Params, origin: Origin): WireObject {
  allow(p, ['cancellation_reason', 'expand']);
  const pi = getPaymentIntent(ctx, id);
  if (!CANCELABLE.includes(pi.status as Status)) {
    throw unexpectedState(`You cannot cancel this PaymentIntent because it has a status of ${String(pi.status)}. Only a PaymentIntent with one of the following statuses may be canceled: ${CANCELABLE.join(', ')}.`);
  }
  const openSession = Object.values(ctx.state.checkoutSessions).find((s) => s.payment_intent === pi.id && s.status === 'open');
  if (openSession) throw unexpectedState(`This PaymentIntent belongs to the open Checkout Session ${openSession.id}; expire the session instead.`);
  const reason = p.cancellation_reason === undefined ? null : oneOf(p, 'cancellation_reason', ['duplicate', 'fraudulent', 'requested_by_customer', 'abandoned'], 'requested_by_customer');
  const wasHeld = pi.status === 'requires_capture';
  pi.status = 'canceled' satisfies Status;
  pi.canceled_at = ctx.now();
  pi.cancellation_reason = reason;
  pi.amount_capturable = 0;
  if (wasHeld && pi.latest_charge) {
    // releasing a hold moves no money: the charge shows the whole amount as given back, with no refund object
    const charge = get(ctx, 'charges', 'charge', pi.latest_charge as string);
    charge.amount_refunded = charge.amount;
    charge.refunded = true;
  }
  ctx.emit('payment_intent.canceled', pi, origin);
  return pi;
}

// ---------------------------------------------------------------------------------------------
// Refunds

export function createRefund(ctx: FakeContext, p: Params, origin: Origin): WireObject {
  allow(p, ['payment_intent', 'charge', 'amount', 'reason', 'metadata', 'expand']);
  const piId = str(p, 'payment_intent');
  const chargeId = str(p, 'charge');
  if (!piId && !chargeId) throw invalid('Missing required param: payment_intent (or charge).', 'payment_intent', 'parameter_missing');
  const charge = chargeId ? get(ctx, 'charges', 'charge', chargeId, 'charge') : undefined;
  const pi = getPaymentIntent(ctx, piId ?? (charge!.payment_intent as string), 'payment_intent');
  if (pi.status !== 'succeeded') {
    throw unexpectedState(`This PaymentIntent has a status of ${String(pi.status)} and has no captured charge to refund. An uncaptured PaymentIntent is canceled, not refunded.`);
  }
  const target = charge ?? get(ctx, 'charges', 'charge', pi.latest_charge as string);
  const remaining = (target.amount_captured as number) - (target.amount_refunded as number);
  if (remaining <= 0) throw unexpectedState(`Charge ${target.id} has already been refunded.`, 'charge_already_refunded');
  const amount = int(p, 'amount', { min: 1 }) ?? remaining;
  if (amount > remaining) throw invalid(`Refund amount (${amount}) is greater than the unrefunded amount on the charge (${remaining}).`, 'amount', 'amount_too_large');

  const refund: WireObject = {
    id: newId('re'),
    object: 'refund',
    amount,
    balance_transaction: null,
    charge: target.id,
    created: ctx.now(),
    currency: target.currency,
    metadata: readMetadata(p.metadata),
    payment_intent: pi.id,
    reason: p.reason === undefined ? null : oneOf(p, 'reason', ['duplicate', 'fraudulent', 'requested_by_customer'], 'requested_by_customer'),
    status: 'succeeded',
  };
  const txn = addBalanceTransaction(ctx, { type: 'refund', amount: -amount, fee: 0, currency: target.currency as string, source: refund.id, description: 'REFUND FOR CHARGE' });
  refund.balance_transaction = txn.id;
  ctx.state.refunds[refund.id] = refund;
  const previous = { amount_refunded: target.amount_refunded, refunded: target.refunded };
  target.amount_refunded = (target.amount_refunded as number) + amount;
  target.refunded = target.amount_refunded === target.amount_captured;
  ctx.emit('charge.refunded', target, origin, previous);
  return refund;
}

// ---------------------------------------------------------------------------------------------
// Connected accounts and transfers

export function createAccount(ctx: FakeContext, p: Params): WireObject {
  allow(p, ['type', 'country', 'email', 'business_type', 'capabilities', 'metadata', 'default_currency', 'business_profile', 'expand']);
  const type = oneOf(p, 'type', ['custom', 'express', 'standard'], 'express');
  const requested = Object.keys(asParams(p.capabilities, 'capabilities'));
  const account: WireObject = {
    id: newId('acct'),
    object: 'account',
    business_type: str(p, 'business_type') ?? null,
    // the fake has no onboarding: every account can take transfers and payouts at once
    capabilities: Object.fromEntries((requested.length ? requested : ['card_payments', 'transfers']).map((c) => [c, 'active'])),
    charges_enabled: true,
    country: (str(p, 'country') ?? 'DE').toUpperCase(),
    created: ctx.now(),
    default_currency: (str(p, 'default_currency') ?? 'eur').toLowerCase(),
    details_submitted: true,
    email: str(p, 'email') ?? null,
    metadata: readMetadata(p.metadata),
    payouts_enabled: true,
    type,
  };
  ctx.state.accounts[account.id] = account;
  return account;
}

export const getAccount = (ctx: FakeContext, id: string) => get(ctx, 'accounts', 'account', id, 'account');

export function createTransfer(ctx: FakeContext, p: Params): WireObject {
  allow(p, ['amount', 'currency', 'destination', 'source_transaction', 'transfer_group', 'metadata', 'description', 'expand']);
  const amount = int(p, 'amount', { required: true, min: 1 });
  const currency = readCurrency(p, 'currency');
  const destination = str(p, 'destination', { required: true });
  get(ctx, 'accounts', 'account', destination, 'destination');
  const sourceTransaction = str(p, 'source_transaction');
  if (sourceTransaction) {
    // a transfer tied to a charge may use that charge's money, up to what it has not yet passed on
    const charge = get(ctx, 'charges', 'charge', sourceTransaction, 'source_transaction');
    if (!charge.captured) throw invalid(`The charge ${sourceTransaction} has not been captured.`, 'source_transaction');
    const passedOn = Object.values(ctx.state.transfers).filter((t) => t.source_transaction === sourceTransaction).reduce((s, t) => s + (t.amount as number), 0);
    const left = (charge.amount_captured as number) - (charge.amount_refunded as number) - passedOn;
    if (amount > left) throw invalid(`The transfer amount (${amount}) exceeds what is left of the source charge (${left}).`, 'amount', 'amount_too_large');
  } else if (availableBalance(ctx, currency) < amount) {
    throw invalid(`Insufficient funds in the available balance: ${availableBalance(ctx, currency)} ${currency} available, ${amount} requested.`, 'amount', 'balance_insufficient');
  }
  const transfer: WireObject = {
    id: newId('tr'),
    object: 'transfer',
    amount,
    amount_reversed: 0,
    balance_transaction: null,
    created: ctx.now(),
    currency,
    description: str(p, 'description') ?? null,
    destination,
    destination_payment: newId('py'),
    livemode: false,
    metadata: readMetadata(p.metadata),
    reversed: false,
    source_transaction: sourceTransaction ?? null,
    transfer_group: str(p, 'transfer_group') ?? null,
  };
  const txn = addBalanceTransaction(ctx, { type: 'transfer', amount: -amount, fee: 0, currency, source: transfer.id, description: transfer.description as string | null });
  transfer.balance_transaction = txn.id;
  ctx.state.transfers[transfer.id] = transfer;
  return transfer;
}

// ---------------------------------------------------------------------------------------------
// Lists

/** The provider's cursor pagination over a collection, newest first. */
export function list(items: WireObject[], p: Params, listUrl: string): { object: 'list'; data: WireObject[]; has_more: boolean; url: string } {
  const limit = int(p, 'limit', { min: 1 }) ?? 10;
  if (limit > 100) throw invalid('limit must be at most 100.', 'limit');
  const newestFirst = [...items].reverse();
  let start = 0;
  let end = newestFirst.length;
  const after = str(p, 'starting_after');
  const before = str(p, 'ending_before');
  if (after) {
    const i = newestFirst.findIndex((o) => o.id === after);
    if (i < 0) throw missingObject('object', after, 'starting_after');
    start = i + 1;
  }
  if (before) {
    const i = newestFirst.findIndex((o) => o.id === before);
    if (i < 0) throw missingObject('object', before, 'ending_before');
    end = i;
    start = Math.max(start, end - limit);
  }
  const data = newestFirst.slice(start, Math.min(end, start + limit));
  // paging backwards, "more" lies before the page; forwards, after it
  const hasMore = before ? start > 0 : start + limit < end;
  return { object: 'list', data: toWire(data), has_more: hasMore, url: listUrl };
}

/** `created[gte]=…` style filters and plain `created=…`. */
export function createdFilter(p: Params): (o: WireObject) => boolean {
  const raw = p.created;
  if (raw === undefined || raw === '') return () => true;
  if (typeof raw === 'string') {
    const exact = int(p, 'created');
    return (o) => o.created === exact;
  }
  const range = asParams(raw, 'created');
  allow(range, ['gt', 'gte', 'lt', 'lte'], 'created');
  const gt = int(range, 'gt', { param: 'created[gt]' });
  const gte = int(range, 'gte', { param: 'created[gte]' });
  const lt = int(range, 'lt', { param: 'created[lt]' });
  const lte = int(range, 'lte', { param: 'created[lte]' });
  return (o) => {
    const c = o.created as number;
    return (gt === undefined || c > gt) && (gte === undefined || c >= gte) && (lt === undefined || c < lt) && (lte === undefined || c <= lte);
  };
}

export { ProviderError };
