// A database of a test's own on the test MariaDB, beside the shared one: for tests that must start
// empty or change the demo data every other test file reads. Dropped again by `drop()`.
import { inject } from 'vitest';
import { rootSql } from '../../scripts/lib/mariadb';

export interface ScratchDatabase {
  name: string;
  /** DB_* variables for `loadConfig`/`createTestApp` overrides and `migrateAndSeed`. */
  env: { DB_HOST: string; DB_PORT: string; DB_NAME: string; DB_USER: string; DB_PASSWORD: string };
  /** The same as numbers, as `migrateAndSeed` takes them. */
  db: { DB_HOST: string; DB_PORT: number; DB_NAME: string; DB_USER: string; DB_PASSWORD: string; DB_POOL_SIZE: number };
  drop(): void;
}

/** Creates (from nothing) `<test database>_<suffix>` and grants the test user on it. */
export function scratchDatabase(suffix: string): ScratchDatabase {
  if (!/^\w{1,20}$/.test(suffix)) throw new Error(`scratch database suffix "${suffix}": letters, digits and _ only`);
  const settings = inject('db');
  const name = `${settings.name}_${suffix}`;
  const grants = ['127.0.0.1', 'localhost'].map((host) => `GRANT ALL PRIVILEGES ON \`${name}\`.* TO '${settings.user}'@'${host}';`).join('\n');
  rootSql(settings.socket, `DROP DATABASE IF EXISTS \`${name}\`;\nCREATE DATABASE \`${name}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;\n${grants}`);
  const env = { DB_HOST: '127.0.0.1', DB_PORT: String(settings.port), DB_NAME: name, DB_USER: settings.user, DB_PASSWORD: settings.password };
  return {
    name,
    env,
    db: { ...env, DB_PORT: settings.port, DB_POOL_SIZE: 2 },
    drop: () => void rootSql(settings.socket, `DROP DATABASE IF EXISTS \`${name}\`;`),
  };
}
