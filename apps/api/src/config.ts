// Reads the environment once, checks it with zod and exposes a frozen, typed configuration.
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { z } from 'zod';

export const projectRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../..');

const port = (fallback: number) => z.coerce.number().int().min(1).max(65535).default(fallback);
const flag = (fallback: boolean) =>
  z.enum(['true', 'false', '1', '0']).default(fallback ? 'true' : 'false').transform((v) => v === 'true' || v === '1');

/** Every variable is documented with its default in .env.example. */
export const EnvSchema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
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
  TRUST_PROXY: flag(false),
});

export type Config = Readonly<z.infer<typeof EnvSchema>> & { readonly publicUrl: string };

export class ConfigError extends Error {
  constructor(readonly issues: { variable: string; message: string }[]) {
    super(`Invalid configuration: ${issues.map((i) => `${i.variable}: ${i.message}`).join('; ')}`);
    this.name = 'ConfigError';
  }
}

export function loadConfig(env: NodeJS.ProcessEnv = process.env): Config {
  const parsed = EnvSchema.safeParse(env);
  if (!parsed.success) {
    throw new ConfigError(parsed.error.issues.map((i) => ({ variable: String(i.path[0] ?? '?'), message: i.message })));
  }
  const c = parsed.data;
  return Object.freeze({ ...c, publicUrl: c.PUBLIC_URL ?? `http://${c.HOST}:${c.PORT}` });
}
