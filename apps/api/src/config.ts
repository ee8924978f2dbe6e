// Reads the environment once, checks it with zod and exposes a frozen, typed configuration.
import { isIP, isIPv4 } from 'node:net';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { z } from 'zod';
import { DEFAULT_PASSWORD_HASH_COST } from './lib/password-hash';

export const projectRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../..');

/** Credentials of the local payments fake (apps/api/src/fakes/payments); refused in production. */
export const DEFAULT_MAIL_FROM = 'Emberline <no-reply@emberline.invalid>';
export const LOCAL_PAYMENTS_SECRET_KEY = 'sk_test_emberline_local';
export const LOCAL_PAYMENTS_WEBHOOK_SECRET = 'whsec_emberline_local';

const port = (fallback: number) => z.coerce.number().int().min(1).max(65535).default(fallback);
const flag = (fallback: boolean) =>
  z.enum(['true', 'false', '1', '0']).default(fallback ? 'true' : 'false').transform((v) => v === 'true' || v === '1');

/** The subnets Express's 'trust proxy' knows by name (proxy-addr). */
const NAMED_SUBNETS = ['loopback', 'linklocal', 'uniquelocal'];

/** An address, a subnet (`10.0.0.0/8`, `fd00::/8`, `10.0.0.0/255.0.0.0`) or a named subnet. */
function isProxyEntry(entry: string): boolean {
  if (NAMED_SUBNETS.includes(entry)) return true;
  const [address = '', range, extra] = entry.split('/');
  const family = isIP(address);
  if (!family || extra !== undefined) return false;
  if (range === undefined) return true;
  if (/^\d{1,3}$/.test(range)) return Number(range) <= (family === 4 ? 32 : 128);
  return family === 4 && isIPv4(range);
}

/**
 * Which proxies may say who the client is (X-Forwarded-For, -Proto): `false`, a hop count, or
 * their addresses and subnets. `true` would trust every hop, so any client could name its own
 * address and walk past the per-address rate limits: refused, with the way out in the message.
 */
const trustProxy = z
  .string()
  .trim()
  .default('false')
  .transform((value, ctx): false | number | string[] => {
    if (value === '' || value === 'false') return false;
    if (value === 'true') {
      ctx.addIssue({
        code: 'custom',
        message: 'true would trust every hop, so any client could claim any address: give the number of proxies in front of the API (e.g. 1) or their addresses or subnets, comma-separated (e.g. 10.0.0.0/8,loopback)',
      });
      return z.NEVER;
    }
    if (/^\d+$/.test(value)) {
      const hops = Number(value);
      if (hops > 16) ctx.addIssue({ code: 'custom', message: 'a hop count is at most 16 (the proxies in front of the API)' });
      return hops === 0 ? false : hops;
    }
    const entries = value.split(',').map((e) => e.trim());
    const bad = entries.filter((e) => !isProxyEntry(e));
    if (bad.length) {
      ctx.addIssue({ code: 'custom', message: `not a hop count, address or subnet: ${bad.map((b) => JSON.stringify(b)).join(', ')} (e.g. 1, or 10.0.0.0/8,loopback)` });
    }
    return entries;
  });

/** SEED_DEMO: `auto` seeds the demo scenario outside production only, `false` never, `force` in production too. */
export const SEED_DEMO_MODES = ['auto', 'false', 'force'] as const;
export type SeedDemoMode = (typeof SEED_DEMO_MODES)[number];
const nodeEnv = z.enum(['development', 'production', 'test']).default('development');
const seedDemo = z.enum(SEED_DEMO_MODES).default('auto');
/** log2 of scrypt's N for password hashes (lib/password-hash.ts). */
const passwordHashCost = z.coerce.number().int().min(1).max(20).default(DEFAULT_PASSWORD_HASH_COST);

// the cost may only go below OWASP's minimum to keep the test suite fast
function checkPasswordHashCost(c: { NODE_ENV: string; PASSWORD_HASH_COST: number }, ctx: z.RefinementCtx): void {
  if (c.NODE_ENV !== 'test' && c.PASSWORD_HASH_COST < DEFAULT_PASSWORD_HASH_COST) {
    ctx.addIssue({ code: 'custom', path: ['PASSWORD_HASH_COST'], message: `must be at least ${DEFAULT_PASSWORD_HASH_COST} outside tests` });
  }
}

/** BCRYPT_COST, the variable's name before scrypt, still sets the cost (tests set it low); PASSWORD_HASH_COST wins. */
const withRenamedVariables = (env: NodeJS.ProcessEnv): NodeJS.ProcessEnv =>
  env.BCRYPT_COST === undefined || env.PASSWORD_HASH_COST !== undefined ? env : { ...env, PASSWORD_HASH_COST: env.BCRYPT_COST };

/** What the seed needs to know, for scripts that seed without the API's whole configuration. */
export const SeedEnvSchema = z.object({ NODE_ENV: nodeEnv, SEED_DEMO: seedDemo, PASSWORD_HASH_COST: passwordHashCost }).superRefine(checkPasswordHashCost);

/** Every variable is documented with its default in .env.example. */
export const EnvSchema = z.object({
  NODE_ENV: nodeEnv,
  HOST: z.string().min(1).default('127.0.0.1'),
  PORT: port(4000),
  PUBLIC_URL: z.url().optional(),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
  DB_HOST: z.string().min(1).default('127.0.0.1'),
  DB_PORT: port(3307),
  DB_NAME: z.string().regex(/^[A-Za-z0-9_]{1,64}$/, 'letters, digits and _ only').default('emberline'),
  DB_USER: z.string().regex(/^[A-Za-z0-9_]{1,32}$/, 'letters, digits and _ only').default('emberline'),
  DB_PASSWORD: z.string().min(1, 'must not be empty'),
  DB_POOL_SIZE: z.coerce.number().int().min(1).max(200).default(10),
  SERVE_APPS: flag(true),
  APPS_DIR: z.string().default('dist').transform((dir) => path.resolve(projectRoot, dir)),
  TRUST_PROXY: trustProxy,
  /** Signs access tokens (HS256). Required in production; in development generated once into var/. */
  JWT_SECRET: z.string().min(32, 'must be at least 32 characters').optional(),
  ACCESS_TOKEN_TTL_SECONDS: z.coerce.number().int().min(60).max(3600).default(900),
  REFRESH_TOKEN_TTL_DAYS: z.coerce.number().int().min(1).max(90).default(30),
  PASSWORD_HASH_COST: passwordHashCost,
  /** Where mail goes: the local capture server in development and tests, the real relay in production. */
  SMTP_URL: z.url({ protocol: /^smtps?$/, error: 'must be an smtp:// or smtps:// URL' }).default('smtp://127.0.0.1:2525'),
  MAIL_FROM: z.string().trim().min(3).max(254).default(DEFAULT_MAIL_FROM),
  /** HTTP API of the mail capture server (development and tests only), e.g. http://127.0.0.1:2580. */
  MAIL_CAPTURE_URL: z.url({ protocol: /^https?$/ }).optional(),
  /** Runs the scheduled jobs (outbox sender) in this process; the jobs lock, so several instances may. */
  RUN_SCHEDULER: flag(true),
  MAIL_INTERVAL_SECONDS: z.coerce.number().int().min(1).max(3600).default(60),
  /** How often approved partners' insurance expiry is checked (reminders, suspensions). */
  INSURANCE_CHECK_INTERVAL_HOURS: z.coerce.number().min(0.01).max(24 * 7).default(24),
  /** Where uploaded documents are kept: `local` disk today; S3-compatible storage later. */
  STORAGE_DRIVER: z.enum(['local']).default('local'),
  /** Directory of the local storage driver, outside any folder the server serves publicly. */
  UPLOADS_DIR: z.string().min(1).default('var/uploads').transform((dir) => path.resolve(projectRoot, dir)),
  /** Secret API key of the payments provider. Outside production it defaults to the local fake's key. */
  STRIPE_SECRET_KEY: z.string().regex(/^(sk|rk)_(test|live)_\w+$/, 'must be a secret key (sk_test_…, sk_live_…)').default(LOCAL_PAYMENTS_SECRET_KEY),
  /** Signs the payments provider's webhooks. Outside production it defaults to the local fake's secret. */
  STRIPE_WEBHOOK_SECRET: z.string().regex(/^whsec_\w+$/, 'must be a webhook signing secret (whsec_…)').default(LOCAL_PAYMENTS_WEBHOOK_SECRET),
  /** Base URL of the payments provider's API. Unset: the real service in production, the local fake elsewhere. */
  STRIPE_API_BASE: z.url({ protocol: /^https?$/, error: 'must be an http:// or https:// URL' }).optional(),
  /** Port of the local payments fake (development and tests), which STRIPE_API_BASE points at when unset. */
  PAYMENTS_FAKE_PORT: port(4030),
  /** Whether the seed adds the demo scenario, whose published password signs in a network admin. */
  SEED_DEMO: seedDemo,
}).superRefine((c, ctx) => {
  if (c.NODE_ENV === 'production' && !c.JWT_SECRET) ctx.addIssue({ code: 'custom', path: ['JWT_SECRET'], message: 'is required in production' });
  // the local fake's credentials work nowhere else
  if (c.NODE_ENV === 'production' && c.STRIPE_SECRET_KEY === LOCAL_PAYMENTS_SECRET_KEY) ctx.addIssue({ code: 'custom', path: ['STRIPE_SECRET_KEY'], message: 'is required in production' });
  if (c.NODE_ENV === 'production' && c.STRIPE_WEBHOOK_SECRET === LOCAL_PAYMENTS_WEBHOOK_SECRET) ctx.addIssue({ code: 'custom', path: ['STRIPE_WEBHOOK_SECRET'], message: 'is required in production' });
  checkPasswordHashCost(c, ctx);
});

export type Config = Readonly<z.infer<typeof EnvSchema>> & { readonly publicUrl: string };

export class ConfigError extends Error {
  constructor(readonly issues: { variable: string; message: string }[]) {
    super(`Invalid configuration: ${issues.map((i) => `${i.variable}: ${i.message}`).join('; ')}`);
    this.name = 'ConfigError';
  }
}

/** NODE_ENV and SEED_DEMO alone, for `npm run seed`, which needs nothing else of the API's configuration. */
export function loadSeedSettings(env: NodeJS.ProcessEnv = process.env): z.infer<typeof SeedEnvSchema> {
  const parsed = SeedEnvSchema.safeParse(withRenamedVariables(env));
  if (!parsed.success) throw new ConfigError(parsed.error.issues.map((i) => ({ variable: String(i.path[0] ?? '?'), message: i.message })));
  return parsed.data;
}

export function loadConfig(env: NodeJS.ProcessEnv = process.env): Config {
  const parsed = EnvSchema.safeParse(withRenamedVariables(env));
  if (!parsed.success) {
    throw new ConfigError(parsed.error.issues.map((i) => ({ variable: String(i.path[0] ?? '?'), message: i.message })));
  }
  const c = parsed.data;
  return Object.freeze({ ...c, publicUrl: c.PUBLIC_URL ?? `http://${c.HOST}:${c.PORT}` });
}
