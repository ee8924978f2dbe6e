// The payments fake for API and browser tests: an in-process fake on a free port, a gateway
// (the real SDK) pointed at it, and the environment that makes createTestApp use it too.
import { createPaymentsFake, type PayOutcome, type PaymentsFake, type PaymentsFakeSnapshot, type TestCardInput, type WebhookTarget } from '../../apps/api/src/fakes/payments/payments-fake';
import { createPaymentGateway, type GatewayOptions, type PaymentGateway } from '../../apps/api/src/payments/gateway';

export const TEST_PAYMENTS_SECRET_KEY = 'sk_test_emberline_tests';
export const TEST_PAYMENTS_WEBHOOK_SECRET = 'whsec_emberline_tests';

/** Documented test card numbers (Stripe documentation: testing — test card numbers). */
export const TEST_CARD = {
  succeeds: '4242 4242 4242 4242',
  declined: '4000 0000 0000 0002',
  insufficientFunds: '4000 0000 0000 9995',
} as const;

export interface TestPaymentsFake {
  /** The fake's base URL: the API base and the payment page's origin. */
  url: string;
  /** Variables for createTestApp(overrides) so the app's own gateway talks to this fake. */
  env: Record<'STRIPE_API_BASE' | 'STRIPE_SECRET_KEY' | 'STRIPE_WEBHOOK_SECRET', string>;
  /** A gateway on this fake, with no SDK retries unless asked. */
  gateway: PaymentGateway;
  fake: PaymentsFake;
  /**
   * Where webhooks go: a URL (e.g. `${baseUrl}/api/payments/webhook` of a listening app), or a
   * function that receives them in-process, e.g. through supertest:
   * `(payload, headers) => request(app).post('/api/payments/webhook').set(headers).send(payload).then((r) => r.status)`.
   */
  webhookTarget(target: WebhookTarget | null): void;
  state(): PaymentsFakeSnapshot;
  /** Pays a checkout session as the test payment page would. */
  pay(sessionId: string, card: TestCardInput): PayOutcome;
  /** Waits until every webhook delivery (and retry) is done. */
  idle(): Promise<void>;
  close(): Promise<void>;
}

export async function startPaymentsFake(o: { webhookTarget?: WebhookTarget; gateway?: GatewayOptions; webhookRetryDelaysMs?: number[] } = {}): Promise<TestPaymentsFake> {
  const fake = await createPaymentsFake({
    port: 0,
    secretKey: TEST_PAYMENTS_SECRET_KEY,
    webhookSecret: TEST_PAYMENTS_WEBHOOK_SECRET,
    webhookTarget: o.webhookTarget,
    // quick retries keep failing-endpoint tests short
    webhookRetryDelaysMs: o.webhookRetryDelaysMs ?? [50, 100, 200],
    webhookTimeoutMs: 5000,
  });
  const env = { STRIPE_API_BASE: fake.url, STRIPE_SECRET_KEY: TEST_PAYMENTS_SECRET_KEY, STRIPE_WEBHOOK_SECRET: TEST_PAYMENTS_WEBHOOK_SECRET };
  const gateway = createPaymentGateway({ ...env, NODE_ENV: 'test', PAYMENTS_FAKE_PORT: fake.port }, { maxNetworkRetries: 0, timeoutMs: 5000, ...o.gateway });
  return {
    url: fake.url,
    env,
    gateway,
    fake,
    webhookTarget: (target) => fake.setWebhookTarget(target),
    state: () => fake.state(),
    pay: (sessionId, card) => fake.pay(sessionId, card),
    idle: () => fake.idle(),
    close: () => fake.close(),
  };
}
