// Runs pending migrations and the idempotent seed; used by npm start, the tests and the CLI.
import { createDataSource, type DbConfig } from './data-source';
import { runSeed, type FullSeedReport } from './seed';

export interface MigrateReport {
  migrationsRun: string[];
  seed: FullSeedReport | null;
}

export async function migrateAndSeed(config: DbConfig, o: { seed?: boolean; demo?: boolean; bcryptCost?: number } = {}): Promise<MigrateReport> {
  const ds = await createDataSource(config).initialize();
  try {
    const ran = await ds.runMigrations({ transaction: 'each' });
    const seed = o.seed === false ? null : await runSeed(ds.manager, { demo: o.demo, bcryptCost: o.bcryptCost });
    return { migrationsRun: ran.map((m) => m.name), seed };
  } finally {
    await ds.destroy();
  }
}
