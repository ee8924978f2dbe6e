// Runs pending migrations and the idempotent seed; used by npm start, the tests and the CLI.
import { createDataSource, type DbConfig } from './data-source';
import { runSeed, type SeedReport } from './seed';

export interface MigrateReport {
  migrationsRun: string[];
  seed: SeedReport | null;
}

export async function migrateAndSeed(config: DbConfig, o: { seed?: boolean } = {}): Promise<MigrateReport> {
  const ds = await createDataSource(config).initialize();
  try {
    const ran = await ds.runMigrations({ transaction: 'each' });
    const seed = o.seed === false ? null : await runSeed(ds.manager);
    return { migrationsRun: ran.map((m) => m.name), seed };
  } finally {
    await ds.destroy();
  }
}
