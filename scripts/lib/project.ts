// Where the project keeps its local state, and the settings for the dev and test databases.
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { localSecret } from '../../apps/api/src/lib/local-secrets';

export { localSecret };

export const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
export const varDir = path.join(root, 'var');
export const bin = (name: string) => path.join(root, 'node_modules/.bin', name);

export interface DatabaseSettings {
  dir: string;
  port: number;
  name: string;
  user: string;
  password: string;
}

export function devDatabase(env = process.env): DatabaseSettings {
  return {
    dir: path.join(varDir, 'mariadb'),
    port: Number(env.DB_PORT ?? 3307),
    name: env.DB_NAME ?? 'emberline',
    user: env.DB_USER ?? 'emberline',
    password: env.DB_PASSWORD ?? localSecret('devDbPassword'),
  };
}

/** Tests use their own server and data directory, so they never touch development data. */
export function testDatabase(name: 'emberline_test' | 'emberline_e2e', env = process.env): DatabaseSettings {
  const port = Number(env.TEST_DB_PORT ?? 3308);
  return {
    // another port gets its own data directory, so two test runs can go on side by side
    dir: path.join(varDir, port === 3308 ? 'test-mariadb' : `test-mariadb-${port}`),
    port,
    name,
    user: 'emberline_test',
    password: localSecret('testDbPassword'),
  };
}

/** The search benchmark's server and database: its own port and data directory, never the dev or test data. */
export function benchDatabase(env = process.env): DatabaseSettings {
  return {
    dir: path.join(varDir, 'bench-mariadb'),
    port: Number(env.BENCH_DB_PORT ?? 3309),
    name: 'emberline_bench',
    user: 'emberline_bench',
    password: localSecret('benchDbPassword'),
  };
}

export function dbEnv(db: DatabaseSettings): Record<string, string> {
  return { DB_HOST: '127.0.0.1', DB_PORT: String(db.port), DB_NAME: db.name, DB_USER: db.user, DB_PASSWORD: db.password };
}
