// Local fake of the payments provider's HTTP API for development and tests: the provider's request
// encoding, response shapes, errors, idempotency and signed webhooks, a test payment page, and a
// JSON control API under /__fake. It runs in-process (tests) or on its own (server.ts).
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import express, { type NextFunction, type Request, type Response } from 'express';
import { LOCAL_PAYMENTS_SECRET_KEY, LOCAL_PAYMENTS_WEBHOOK_SECRET } from '../../config';
import {
  balance,
  cancelPaymentIntent,
  capturePaymentIntent,
  createAccount,
  createCheckoutSession,
  createCustomer,
  createdFilter,
  createPaymentIntent,
  createRefund,
  createTransfer,
  expireSession,
  getAccount,
  getPaymentIntent,
  getSession,
  list,
  paySession,
  payPaymentIntent,
  sessionLineItems,
  sweepExpiredSessions,
  type FakeContext,
  type Origin,
} from './operations';
import { allow, expandList, missingObject, ProviderError, str, type Params } from './params';
import { renderClosed, renderNotFound, renderPaymentForm } from './payment-page';
import { COLLECTIONS, createPersister, emptyState, loadState, newId, toWire, type FakeState, type WireObject } from './store';
import type { CardDetails } from './test-cards';
import { createWebhookSender, type WebhookTarget } from './webhooks';

export type { WebhookReceiver, WebhookTarget } from './webhooks';

export interface PaymentsFakeOptions {
  host?: string;
  /** 0 picks a free port; the chosen one is on the result. */
  port: number;
  /** The secret key clients must send as `Authorization: Bearer …`. */
  secretKey?: string;
  /** Signs the webhooks (whsec_…). */
  webhookSecret?: string;
  /** Where events are POSTed: a URL, or a function receiving them in-process. */
  webhookTarget?: WebhookTarget;
  /** Base URL browsers reach the fake at (for checkout URLs); by default http://host:port. */
  publicUrl?: string;
  /** JSON file the state is kept in across restarts (development). */
  stateFile?: string;
  /** Delays before each webhook retry; by default three retries after 0.5, 2 and 8 seconds. */
  webhookRetryDelaysMs?: number[];
  webhookTimeoutMs?: number;
  /** How often open checkout sessions are checked for expiry. */
  sweepIntervalMs?: number;
  log?: (line: string) => void;
}

export interface PaymentsFakeSnapshot {
  clockOffsetSeconds: number;
  webhookTarget: string | null;
  customers: WireObject[];
  checkoutSessions: WireObject[];
  paymentIntents: WireObject[];
  charges: WireObject[];
  refunds: WireObject[];
  accounts: WireObject[];
  transfers: WireObject[];
  balanceTransactions: WireObject[];
  events: WireObject[];
  deliveries: FakeState['deliveries'];
  requests: FakeState['requests'];
  balance: WireObject;
}

/** A card for the control API; expiry and CVC default to valid test values. */
export type TestCardInput = string | (Partial<CardDetails> & { number: string });

export type PayOutcome =
  | { outcome: 'succeeded'; session: WireObject; paymentIntent: WireObject; redirectUrl: string }
  | { outcome: 'declined'; session?: WireObject; paymentIntent: WireObject; code: string; declineCode: string; message: string }
  | { outcome: 'refused'; field: string; message: string }
  | { outcome: 'closed'; session: WireObject; message: string }
  | { outcome: 'authorised'; paymentIntent: WireObject };

export interface PaymentsFake {
  host: string;
  port: number;
  /** http://host:port — the API base (STRIPE_API_BASE) and the payment page's origin. */
  url: string;
  secretKey: string;
  webhookSecret: string;
  setWebhookTarget(target: WebhookTarget | null): void;
  state(): PaymentsFakeSnapshot;
  reset(): void;
  /** Pays a checkout session as the payment page would, without a browser. */
  pay(sessionId: string, card: TestCardInput): PayOutcome;
  /** Pays a payment intent created through the API. */
  payPaymentIntent(paymentIntentId: string, card: TestCardInput): PayOutcome;
  /** The next `count` provider API requests fail: HTTP 500, or a dropped connection. */
  failNext(count?: number, mode?: 'error' | 'disconnect'): void;
  /** Moves the fake's clock on (sessions past their expiry expire); answers the total offset. */
  advanceClock(seconds: number): number;
  /** Resolves once every queued webhook delivery and retry has finished. */
  idle(): Promise<void>;
  close(): Promise<void>;
}

/** Thrown when the port cannot be bound; `code` is the system's (e.g. EADDRINUSE). */
export class PaymentsFakeListenError extends Error {
  constructor(
    readonly host: string,
    readonly port: number,
    readonly code: string | undefined,
    cause: Error,
  ) {
    super(
      code === 'EADDRINUSE'
        ? `The payments fake port ${host}:${port} is already in use`
        : `The payments fake could not listen on ${host}:${port}: ${cause.message}`,
      { cause },
    );
    this.name = 'PaymentsFakeListenError';
  }
}

const MAX_LOG = 500;
const IDEMPOTENCY_TTL_S = 24 * 60 * 60;

/** "sk_test_****************ocal": enough to tell keys apart, never the key. */
export const maskKey = (key: string) => {
  const prefix = /^[a-z]+_(test_|live_)?/.exec(key)?.[0] ?? '';
  return `${prefix}${'*'.repeat(Math.max(4, key.length - prefix.length - 4))}${key.slice(-4)}`;
};

function cardInput(card: TestCardInput): CardDetails {
  const c = typeof card === 'string' ? { number: card } : card;
  const year = (new Date().getUTCFullYear() + 5) % 100;
  return { number: c.number, expiry: c.expiry ?? `12/${String(year).padStart(2, '0')}`, cvc: c.cvc ?? '123' };
}

export async function createPaymentsFake(options: PaymentsFakeOptions): Promise<PaymentsFake> {
  const host = options.host ?? '127.0.0.1';
  const secretKey = options.secretKey ?? LOCAL_PAYMENTS_SECRET_KEY;
  const webhookSecret = options.webhookSecret ?? LOCAL_PAYMENTS_WEBHOOK_SECRET;
  const log = options.log ?? (() => undefined);
  let state: FakeState = options.stateFile ? loadState(options.stateFile) : emptyState();
  const persister = createPersister(options.stateFile, (m) => log(`payments fake: ${m}`));
  const persist = () => persister.save(state);
  let failures: { count: number; mode: 'error' | 'disconnect' } = { count: 0, mode: 'error' };
  let apiVersion: string | null = null;

  const sender = createWebhookSender({
    secret: webhookSecret,
    retryDelaysMs: options.webhookRetryDelaysMs ?? [500, 2000, 8000],
    timeoutMs: options.webhookTimeoutMs ?? 10_000,
    log,
    changed: persist,
  });
  if (options.webhookTarget) sender.setTarget(options.webhookTarget);

  const ctx: FakeContext = {
    get state() {
      return state;
    },
    now: () => Math.floor(Date.now() / 1000) + state.clockOffsetSeconds,
    publicUrl: options.publicUrl ?? '',
    emit(type, object, origin, previousAttributes) {
      const event: WireObject = {
        id: newId('evt'),
        object: 'event',
        api_version: apiVersion,
        created: ctx.now(),
        data: { object: toWire(object), ...(previousAttributes ? { previous_attributes: previousAttributes } : {}) },
        livemode: false,
        pending_webhooks: sender.target() ? 1 : 0,
        request: { id: origin.requestId, idempotency_key: origin.idempotencyKey },
        type,
      };
      state.events[event.id] = event;
      const delivery = sender.send(event);
      if (delivery) state.deliveries = [...state.deliveries, delivery].slice(-MAX_LOG);
      return event;
    },
  };

  const find = (id: string): WireObject | undefined => {
    for (const c of COLLECTIONS) if (state[c][id]) return state[c][id];
    return undefined;
  };

  /** `expand[]`: ids in the named top-level fields (or `data.<field>` of a list) become their objects. */
  function expand<T>(body: T, paths: string[]): T {
    if (paths.length === 0 || !body || typeof body !== 'object') return body;
    const target = body as Record<string, unknown>;
    if (target.object === 'list' && Array.isArray(target.data)) {
      const inner = paths.filter((p) => p.startsWith('data.')).map((p) => p.slice(5));
      target.data = (target.data as unknown[]).map((o) => expand(o, inner));
      return body;
    }
    for (const path of paths) {
      if (path === 'line_items' && target.object === 'checkout.session') {
        const session = state.checkoutSessions[target.id as string];
        if (session) target.line_items = toWire(sessionLineItems(session));
        continue;
      }
      const value = target[path];
      if (typeof value === 'string') {
        const found = find(value);
        if (found) target[path] = toWire(found);
      }
    }
    return body;
  }

  // -------------------------------------------------------------------------------------------
  // The provider's API under /v1

  const api = express.Router();

  api.use((req, res, next) => {
    res.locals.requestId = newId('req');
    res.setHeader('request-id', res.locals.requestId as string);
    const started = new Date().toISOString();
    res.on('finish', () => {
      state.requests = [
        ...state.requests,
        {
          at: started,
          method: req.method,
          path: req.originalUrl.split('?')[0]!,
          status: res.statusCode,
          idempotencyKey: req.get('idempotency-key') ?? null,
          replayed: res.getHeader('idempotent-replayed') === 'true',
        },
      ].slice(-MAX_LOG);
      persist();
    });
    if (failures.count > 0) {
      failures.count -= 1;
      if (failures.mode === 'disconnect') {
        req.socket.destroy();
        return;
      }
      res.status(500).json({ error: { type: 'api_error', message: 'The payments fake was told to fail this request (POST /__fake/fail-next).' } });
      return;
    }
    next();
  });

  api.use((req, res, next) => {
    const auth = req.get('authorization') ?? '';
    const key = /^Bearer\s+(.+)$/i.exec(auth)?.[1]?.trim();
    if (!key) {
      res.status(401).json({ error: { type: 'invalid_request_error', message: 'You did not provide an API key. Provide it in the Authorization header as a Bearer token.' } });
      return;
    }
    if (key !== secretKey) {
      res.status(401).json({ error: { type: 'invalid_request_error', message: `Invalid API Key provided: ${maskKey(key)}` } });
      return;
    }
    apiVersion = req.get('stripe-version') ?? apiVersion;
    if (apiVersion) res.setHeader('stripe-version', apiVersion);
    sweepExpiredSessions(ctx);
    next();
  });

  api.use(
    express.urlencoded({
      extended: true,
      limit: '1mb',
      verify: (req, _res, buf) => {
        (req as Request & { rawBody?: string }).rawBody = buf.toString('utf8');
      },
    }),
  );

  type Handler = (params: Params, req: Request, origin: Origin) => { status?: number; body: unknown };

  /** Runs a handler with the provider's error shape and, for POSTs with a key, its idempotency rules. */
  const handle = (fn: Handler) => (req: Request, res: Response) => {
    const params = (req.method === 'GET' ? req.query : (req.body ?? {})) as Params;
    const key = req.method === 'POST' ? req.get('idempotency-key') : undefined;
    const origin: Origin = { requestId: res.locals.requestId as string, idempotencyKey: key ?? null };
    const rawBody = (req as Request & { rawBody?: string }).rawBody ?? '';
    const path = req.originalUrl.split('?')[0]!;
    if (key) {
      res.setHeader('idempotency-key', key);
      const stored = state.idempotency[key];
      if (stored) {
        if (stored.method !== req.method || stored.path !== path || stored.body !== rawBody) {
          res.status(400).json({
            error: {
              type: 'idempotency_error',
              message: `Keys for idempotent requests can only be used with the same parameters they were first used with. Try using a key other than '${key}' if you meant to execute a different request.`,
            },
          });
          return;
        }
        res.setHeader('idempotent-replayed', 'true');
        res.status(stored.status).json(stored.response);
        return;
      }
    }
    let status: number;
    let body: unknown;
    let keep = true;
    try {
      const out = fn(params, req, origin);
      status = out.status ?? 200;
      body = expand(toWire(out.body), expandList(params));
    } catch (err) {
      if (!(err instanceof ProviderError)) throw err;
      status = err.status;
      body = { error: err.body };
      // the provider keeps no result for a request that failed its parameter checks
      keep = !err.validation;
    }
    if (key && keep && status < 500) {
      state.idempotency[key] = { method: req.method, path, body: rawBody, status, response: body, createdAt: ctx.now() };
    }
    res.status(status).json(body);
  };

  const byId = (collection: keyof Pick<FakeState, 'customers' | 'charges' | 'refunds' | 'transfers' | 'balanceTransactions' | 'events'>, kind: string): Handler => (p, req) => {
    allow(p, ['expand']);
    const id = String(req.params.id);
    const found = state[collection][id];
    if (!found) throw missingObject(kind, id);
    return { body: found };
  };
  const filtered = (items: WireObject[], p: Params, fields: string[]) =>
    items.filter((o) => fields.every((f) => p[f] === undefined || p[f] === '' || o[f] === p[f]));
  const listOf = (collection: keyof Pick<FakeState, 'checkoutSessions' | 'paymentIntents' | 'charges' | 'refunds' | 'transfers'>, fields: string[]): Handler => (p, req) => {
    allow(p, ['limit', 'starting_after', 'ending_before', 'expand', 'created', ...fields]);
    const items = filtered(Object.values(state[collection]), p, fields).filter(createdFilter(p));
    return { body: list(items, p, req.baseUrl + req.path) };
  };

  api.post('/customers', handle((p) => ({ body: createCustomer(ctx, p) })));
  api.get('/customers/:id', handle(byId('customers', 'customer')));

  api.post('/checkout/sessions', handle((p) => ({ body: createCheckoutSession(ctx, p) })));
  api.get('/checkout/sessions', handle(listOf('checkoutSessions', ['payment_intent', 'customer', 'status'])));
  api.get('/checkout/sessions/:id', handle((p, req) => {
    allow(p, ['expand']);
    return { body: getSession(ctx, String(req.params.id)) };
  }));
  api.get('/checkout/sessions/:id/line_items', handle((p, req) => {
    allow(p, ['limit', 'starting_after', 'ending_before', 'expand']);
    const session = getSession(ctx, String(req.params.id));
    return { body: list([...(session._line_items as WireObject[])].reverse(), p, `/v1/checkout/sessions/${session.id}/line_items`) };
  }));
  api.post('/checkout/sessions/:id/expire', handle((p, req, origin) => ({ body: expireSession(ctx, String(req.params.id), p, origin) })));

  api.post('/payment_intents', handle((p) => ({ body: createPaymentIntent(ctx, p) })));
  api.get('/payment_intents', handle(listOf('paymentIntents', ['customer'])));
  api.get('/payment_intents/:id', handle((p, req) => {
    allow(p, ['expand', 'client_secret']);
    return { body: getPaymentIntent(ctx, String(req.params.id)) };
  }));
  api.post('/payment_intents/:id/capture', handle((p, req, origin) => ({ body: capturePaymentIntent(ctx, String(req.params.id), p, origin) })));
  api.post('/payment_intents/:id/cancel', handle((p, req, origin) => ({ body: cancelPaymentIntent(ctx, String(req.params.id), p, origin) })));

  api.get('/charges', handle(listOf('charges', ['payment_intent', 'customer', 'transfer_group'])));
  api.get('/charges/:id', handle(byId('charges', 'charge')));

  api.post('/refunds', handle((p, _req, origin) => ({ body: createRefund(ctx, p, origin) })));
  api.get('/refunds', handle(listOf('refunds', ['payment_intent', 'charge'])));
  api.get('/refunds/:id', handle(byId('refunds', 'refund')));

  api.post('/accounts', handle((p) => ({ body: createAccount(ctx, p) })));
  api.get('/accounts/:id', handle((p, req) => {
    allow(p, ['expand']);
    return { body: getAccount(ctx, String(req.params.id)) };
  }));

  api.post('/transfers', handle((p) => ({ body: createTransfer(ctx, p) })));
  api.get('/transfers', handle(listOf('transfers', ['destination', 'transfer_group'])));
  api.get('/transfers/:id', handle(byId('transfers', 'transfer')));

  api.get('/balance', handle((p) => {
    allow(p, ['expand']);
    return { body: balance(ctx) };
  }));
  api.get('/balance_transactions', handle((p, req) => {
    allow(p, ['limit', 'starting_after', 'ending_before', 'expand', 'created', 'type', 'source', 'currency', 'payout']);
    const items = filtered(Object.values(state.balanceTransactions), p, ['type', 'source', 'currency']).filter(createdFilter(p));
    return { body: list(items, p, req.baseUrl + req.path) };
  }));
  api.get('/balance_transactions/:id', handle(byId('balanceTransactions', 'balance_transaction')));

  api.get('/events', handle((p, req) => {
    allow(p, ['limit', 'starting_after', 'ending_before', 'expand', 'created', 'type', 'types', 'delivery_success']);
    const type = str(p, 'type');
    const types = Array.isArray(p.types) ? p.types.map(String) : undefined;
    // a trailing "*" matches a family of events, as in "payment_intent.*"
    const matches = (t: string) => !type || (type.endsWith('*') ? t.startsWith(type.slice(0, -1)) : t === type);
    const items = Object.values(state.events).filter((e) => matches(e.type as string) && (!types || types.includes(e.type as string))).filter(createdFilter(p));
    return { body: list(items, p, req.baseUrl + req.path) };
  }));
  api.get('/events/:id', handle(byId('events', 'event')));

  api.use((req, res) => {
    res.status(404).json({ error: { type: 'invalid_request_error', message: `Unrecognized request URL (${req.method}: ${req.originalUrl.split('?')[0]}). The payments fake implements only part of the provider's API.` } });
  });
  api.use((err: Error & { status?: number; type?: string }, _req: Request, res: Response, _next: NextFunction) => {
    if (err.status && err.status < 500) {
      res.status(400).json({ error: { type: 'invalid_request_error', message: `The request body could not be read: ${err.message}` } });
      return;
    }
    log(`payments fake: internal error: ${err.stack ?? err.message}`);
    res.status(500).json({ error: { type: 'api_error', message: 'The payments fake failed unexpectedly; see its log.' } });
  });

  // -------------------------------------------------------------------------------------------
  // The test payment page

  const page = express.Router();
  page.use((_req, res, next) => {
    res.setHeader('cache-control', 'no-store');
    res.setHeader('content-security-policy', "default-src 'none'; style-src 'unsafe-inline'; form-action 'self' http: https:; base-uri 'none'; frame-ancestors 'none'");
    res.setHeader('x-content-type-options', 'nosniff');
    sweepExpiredSessions(ctx);
    next();
  });
  page.get('/:id', (req, res) => {
    const session = state.checkoutSessions[req.params.id];
    if (!session) return void res.status(404).type('html').send(renderNotFound());
    if (session.status !== 'open') return void res.status(410).type('html').send(renderClosed(session, session.status === 'complete' ? 'This payment has already been made' : 'This payment link has expired'));
    res.type('html').send(renderPaymentForm({ session }));
  });
  page.post('/:id', express.urlencoded({ extended: false, limit: '16kb' }), (req, res) => {
    const session = state.checkoutSessions[req.params.id];
    if (!session) return void res.status(404).type('html').send(renderNotFound());
    const body = (req.body ?? {}) as Record<string, string>;
    const values = { number: String(body.number ?? ''), expiry: String(body.expiry ?? ''), cvc: String(body.cvc ?? '') };
    const result = paySession(ctx, session.id, values);
    persist();
    switch (result.outcome) {
      case 'succeeded':
        return void res.redirect(303, result.redirectUrl);
      case 'declined':
        // the card number stays so the person sees what they tried; the CVC does not
        return void res.status(402).type('html').send(renderPaymentForm({ session, values: { ...values, cvc: '' }, declined: { message: result.message, declineCode: result.declineCode } }));
      case 'refused':
        return void res.status(422).type('html').send(renderPaymentForm({ session, values: { ...values, cvc: '' }, fieldError: { field: result.field, message: result.message } }));
      case 'closed':
        return void res.status(410).type('html').send(renderClosed(session, result.message));
    }
  });

  // -------------------------------------------------------------------------------------------
  // The control API for tests and people, apart from the provider's surface

  const snapshot = (): PaymentsFakeSnapshot => {
    const target = sender.target();
    return {
      clockOffsetSeconds: state.clockOffsetSeconds,
      webhookTarget: target === null ? null : typeof target === 'string' ? target : 'in-process receiver',
      customers: toWire(Object.values(state.customers)),
      checkoutSessions: toWire(Object.values(state.checkoutSessions)),
      paymentIntents: toWire(Object.values(state.paymentIntents)),
      charges: toWire(Object.values(state.charges)),
      refunds: toWire(Object.values(state.refunds)),
      accounts: toWire(Object.values(state.accounts)),
      transfers: toWire(Object.values(state.transfers)),
      balanceTransactions: toWire(Object.values(state.balanceTransactions)),
      events: toWire(Object.values(state.events)),
      deliveries: state.deliveries.map((d) => ({ ...d })),
      requests: [...state.requests],
      balance: balance(ctx),
    };
  };

  const wire = <T>(o: T): T => toWire(o);
  const pay = (sessionId: string, card: TestCardInput): PayOutcome => {
    sweepExpiredSessions(ctx);
    const result = paySession(ctx, sessionId, cardInput(card));
    persist();
    return wire(result);
  };
  const payIntent = (id: string, card: TestCardInput): PayOutcome => {
    const result = payPaymentIntent(ctx, id, cardInput(card));
    persist();
    return wire(result) as PayOutcome;
  };
  const advanceClock = (seconds: number) => {
    state.clockOffsetSeconds += seconds;
    sweepExpiredSessions(ctx);
    persist();
    return state.clockOffsetSeconds;
  };
  const reset = () => {
    state = emptyState();
    failures = { count: 0, mode: 'error' };
    persist();
  };

  const control = express.Router();
  control.use(express.json({ limit: '64kb' }));
  const problem = (res: Response, status: number, title: string) => res.status(status).json({ title, status });
  const guard = (fn: (req: Request, res: Response) => void) => (req: Request, res: Response) => {
    try {
      fn(req, res);
    } catch (err) {
      if (err instanceof ProviderError) return void problem(res, err.status, err.message);
      throw err;
    }
  };
  const payStatus: Record<PayOutcome['outcome'], number> = { succeeded: 200, authorised: 200, declined: 402, refused: 422, closed: 409 };
  const cardFrom = (body: Record<string, unknown>): TestCardInput => ({
    number: String(body.card ?? body.number ?? ''),
    expiry: body.expiry === undefined ? undefined : String(body.expiry),
    cvc: body.cvc === undefined ? undefined : String(body.cvc),
  });

  control.get('/health', (_req, res) => void res.json({ data: { status: 'ok' } }));
  control.get('/state', (_req, res) => void res.json({ data: snapshot() }));
  control.post('/reset', (_req, res) => {
    reset();
    res.json({ data: { reset: true } });
  });
  control.post('/sessions/:id/pay', guard((req, res) => {
    const result = pay(String(req.params.id), cardFrom((req.body ?? {}) as Record<string, unknown>));
    res.status(payStatus[result.outcome]).json({ data: result });
  }));
  control.post('/payment-intents/:id/pay', guard((req, res) => {
    const result = payIntent(String(req.params.id), cardFrom((req.body ?? {}) as Record<string, unknown>));
    res.status(payStatus[result.outcome]).json({ data: result });
  }));
  control.post('/fail-next', (req, res) => {
    const body = (req.body ?? {}) as { count?: unknown; mode?: unknown };
    const count = body.count === undefined ? 1 : Number(body.count);
    const mode = body.mode === 'disconnect' ? 'disconnect' : 'error';
    if (!Number.isInteger(count) || count < 0 || count > 100) return void problem(res, 400, 'count must be an integer from 0 to 100');
    failures = { count, mode };
    res.json({ data: failures });
  });
  control.post('/webhook-endpoint', (req, res) => {
    const raw = ((req.body ?? {}) as { url?: unknown }).url;
    const target = typeof raw === 'string' && /^https?:\/\//.test(raw) && URL.canParse(raw) ? raw : null;
    if (raw !== null && target === null) return void problem(res, 400, 'url must be an http(s) URL, or null to stop sending webhooks');
    sender.setTarget(target);
    res.json({ data: { url: target } });
  });
  control.post('/clock/advance', (req, res) => {
    const seconds = Number((req.body as { seconds?: unknown } | undefined)?.seconds);
    if (!Number.isInteger(seconds) || seconds < 0) return void problem(res, 400, 'seconds must be a whole, positive number');
    res.json({ data: { clockOffsetSeconds: advanceClock(seconds) } });
  });
  control.post('/events/:id/resend', (req, res) => {
    const event = state.events[String(req.params.id)];
    if (!event) return void problem(res, 404, 'No event with this id');
    const delivery = sender.send(event);
    if (!delivery) return void problem(res, 409, 'No webhook endpoint is configured');
    state.deliveries = [...state.deliveries, delivery].slice(-MAX_LOG);
    res.status(202).json({ data: delivery });
  });
  control.use((_req, res) => void problem(res, 404, 'Not a control API route'));

  const app = express();
  app.disable('x-powered-by');
  app.set('etag', false);
  // the provider's GET parameters use the same bracket notation as its form bodies
  app.set('query parser', 'extended');
  app.use('/v1', api);
  app.use('/pay', page);
  app.use('/__fake', control);
  app.get('/', (_req, res) => {
    res.json({ data: { name: 'Emberline payments fake (a test double of the payments provider)', api: '/v1', paymentPage: '/pay/:sessionId', control: '/__fake/state' } });
  });

  const server = http.createServer(app);
  const port = await new Promise<number>((resolve, reject) => {
    const onError = (err: NodeJS.ErrnoException) => reject(new PaymentsFakeListenError(host, options.port, err.code, err));
    server.once('error', onError);
    server.listen(options.port, host, () => {
      server.off('error', onError);
      resolve((server.address() as AddressInfo).port);
    });
  });
  const url = `http://${host}:${port}`;
  if (!ctx.publicUrl) ctx.publicUrl = url;
  const sweeper = setInterval(() => {
    if (sweepExpiredSessions(ctx) > 0) persist();
    // idempotent results live a day at the provider
    const cutoff = ctx.now() - IDEMPOTENCY_TTL_S;
    for (const [key, stored] of Object.entries(state.idempotency)) if (stored.createdAt < cutoff) delete state.idempotency[key];
  }, options.sweepIntervalMs ?? 5000);
  sweeper.unref();

  return {
    host,
    port,
    url,
    secretKey,
    webhookSecret,
    setWebhookTarget: (target) => sender.setTarget(target),
    state: snapshot,
    reset,
    pay,
    payPaymentIntent: payIntent,
    failNext(count = 1, mode = 'error') {
      failures = { count, mode };
    },
    advanceClock,
    idle: () => sender.idle(),
    async close() {
      clearInterval(sweeper);
      sender.close();
      server.closeAllConnections();
      await new Promise<void>((resolve) => server.close(() => resolve()));
      persist();
      await persister.flushed();
    },
  };
}
