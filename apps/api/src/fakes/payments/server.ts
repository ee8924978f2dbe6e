// Runs the payments fake on its own: `node --import tsx apps/api/src/fakes/payments/server.ts`.
// PAYMENTS_FAKE_PORT (4030), PAYMENTS_FAKE_WEBHOOK_URL (where events go; none when unset),
// PAYMENTS_FAKE_STATE_FILE (keeps the state across restarts), STRIPE_SECRET_KEY and
// STRIPE_WEBHOOK_SECRET (the local defaults when unset, as in the API's configuration).
import { createPaymentsFake, PaymentsFakeListenError } from './payments-fake';

function port(name: string, fallback: number): number {
  const raw = process.env[name];
  if (raw === undefined || raw === '') return fallback;
  const value = Number(raw);
  if (!Number.isInteger(value) || value < 0 || value > 65535) {
    process.stderr.write(`✖ ${name} must be a port number (0–65535), not "${raw}"\n`);
    process.exit(2);
  }
  return value;
}

const webhookUrl = process.env.PAYMENTS_FAKE_WEBHOOK_URL || undefined;
if (webhookUrl && !/^https?:\/\//.test(webhookUrl)) {
  process.stderr.write(`✖ PAYMENTS_FAKE_WEBHOOK_URL must be an http(s) URL, not "${webhookUrl}"\n`);
  process.exit(2);
}
const stateFile = process.env.PAYMENTS_FAKE_STATE_FILE || undefined;

try {
  const fake = await createPaymentsFake({
    port: port('PAYMENTS_FAKE_PORT', 4030),
    secretKey: process.env.STRIPE_SECRET_KEY || undefined,
    webhookSecret: process.env.STRIPE_WEBHOOK_SECRET || undefined,
    webhookTarget: webhookUrl,
    stateFile,
    log: (line) => process.stdout.write(`payments fake: ${line}\n`),
  });
  let stopping = false;
  const stop = () => {
    if (stopping) return;
    stopping = true;
    void fake.close().finally(() => process.exit(0));
    setTimeout(() => process.exit(0), 3000).unref();
  };
  // handlers first: whoever reads the ready line may send a signal straight away
  process.on('SIGINT', stop);
  process.on('SIGTERM', stop);
  // one line, which the start scripts wait for and people read
  process.stdout.write(
    `Payments fake ready: API ${fake.url}/v1, test payment page ${fake.url}/pay/…, state ${fake.url}/__fake/state` +
      (webhookUrl ? `; webhooks to ${webhookUrl}` : '; no webhook endpoint') +
      (stateFile ? ` (kept in ${stateFile})` : '') +
      '\n',
  );
} catch (err) {
  if (err instanceof PaymentsFakeListenError && err.code === 'EADDRINUSE') {
    process.stderr.write(`✖ ${err.message}. Stop the other program (another payments fake?) or set PAYMENTS_FAKE_PORT.\n`);
    process.exit(4);
  }
  process.stderr.write(`✖ The payments fake could not start: ${(err as Error).message}\n`);
  process.exit(1);
}
