// Runs pending migrations and the idempotent seed; used by npm start, the tests and the CLI.
import path from 'node:path';
import { projectRoot, type Config } from '../config';
import { createStorage, type Storage } from '../storage';
import { createDataSource, type DbConfig } from './data-source';
import { runSeed, type FullSeedReport } from './seed';

export interface MigrateReport {
  migrationsRun: string[];
  seed: FullSeedReport | null;
}

/** The demo documents go to `o.storage`, else to the storage the configuration names (default var/uploads). */
export async function migrateAndSeed(
  config: DbConfig & Partial<Pick<Config, 'STORAGE_DRIVER' | 'UPLOADS_DIR' | 'NODE_ENV' | 'SEED_DEMO' | 'PASSWORD_HASH_COST'>>,
  o: { seed?: boolean; demo?: boolean; passwordHashCost?: number; storage?: Storage } = {},
): Promise<MigrateReport> {
  const ds = await createDataSource(config).initialize();
  try {
    const ran = await ds.runMigrations({ transaction: 'each' });
    const storage =
      o.storage ?? createStorage({ STORAGE_DRIVER: config.STORAGE_DRIVER ?? 'local', UPLOADS_DIR: config.UPLOADS_DIR ?? path.resolve(projectRoot, process.env.UPLOADS_DIR ?? 'var/uploads') });
    const seed = o.seed === false ? null : await runSeed(ds.manager, { demo: o.demo, nodeEnv: config.NODE_ENV, seedDemo: config.SEED_DEMO, passwordHashCost: o.passwordHashCost ?? config.PASSWORD_HASH_COST, storage });
    return { migrationsRun: ran.map((m) => m.name), seed };
  } finally {
    await ds.destroy();
  }
}
