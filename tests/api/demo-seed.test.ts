// The demo seed signs people in with a published password, a network admin among them: it must not
// reach a production database unless SEED_DEMO=force asks for it, whichever way the seed is run.
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { DataSource } from 'typeorm';
import { ConfigError, loadSeedSettings } from '../../apps/api/src/config';
import { createDataSource } from '../../apps/api/src/db/data-source';
import { migrateAndSeed } from '../../apps/api/src/db/migrate';
import { runSeed } from '../../apps/api/src/db/seed';
import { DEMO_NETWORK_ADMINS, DEMO_ORGANISATIONS } from '../../apps/api/src/db/seed/demo-data';
import { LocalDiskStorage } from '../../apps/api/src/storage';
import { scratchDatabase, type ScratchDatabase } from '../setup/scratch-database';

let scratch: ScratchDatabase;
let ds: DataSource;
let uploads: string;
let storage: LocalDiskStorage;

/** How many of the demo's accounts and organisations the database holds. */
async function demoRows(): Promise<{ admins: number; organisations: number; documents: number }> {
  const [admins] = await ds.query('SELECT COUNT(*) AS n FROM user_account WHERE email IN (?)', [DEMO_NETWORK_ADMINS.map((a) => a.email)]);
  const [organisations] = await ds.query('SELECT COUNT(*) AS n FROM organisation WHERE name IN (?)', [DEMO_ORGANISATIONS.map((o) => o.name)]);
  const [documents] = await ds.query('SELECT COUNT(*) AS n FROM partner_document');
  return { admins: Number(admins.n), organisations: Number(organisations.n), documents: Number(documents.n) };
}

beforeAll(async () => {
  scratch = scratchDatabase('seed');
  uploads = mkdtempSync(path.join(tmpdir(), 'emberline-seed-'));
  storage = new LocalDiskStorage(uploads);
  ds = await createDataSource(scratch.db).initialize();
}, 60_000);
afterAll(async () => {
  await ds?.destroy();
  scratch?.drop();
  rmSync(uploads, { recursive: true, force: true });
});

describe('the demo seed in production', () => {
  it('is left out when NODE_ENV is production, while the catalogue is seeded', async () => {
    const report = await migrateAndSeed({ ...scratch.db, NODE_ENV: 'production' }, { passwordHashCost: 4, storage });
    expect(report.seed).toMatchObject({ demo: 'refused-in-production', usersAdded: 0, organisationsAdded: 0 });
    expect(report.seed!.capabilitiesAdded).toBeGreaterThan(0);
    expect(await demoRows()).toEqual({ admins: 0, organisations: 0, documents: 0 });
  }, 60_000);

  it('is left out when a caller names no environment and the process runs in production', async () => {
    const before = process.env.NODE_ENV;
    process.env.NODE_ENV = 'production';
    try {
      const report = await runSeed(ds.manager, { passwordHashCost: 4, storage });
      expect(report.demo).toBe('refused-in-production');
    } finally {
      process.env.NODE_ENV = before;
    }
    expect(await demoRows()).toEqual({ admins: 0, organisations: 0, documents: 0 });
  });

  it('is left out anywhere with SEED_DEMO=false', async () => {
    const report = await runSeed(ds.manager, { nodeEnv: 'development', seedDemo: 'false', passwordHashCost: 4, storage });
    expect(report.demo).toBe('off');
    expect(await demoRows()).toEqual({ admins: 0, organisations: 0, documents: 0 });
  });

  it('goes in with SEED_DEMO=force, once', async () => {
    const report = await migrateAndSeed({ ...scratch.db, NODE_ENV: 'production', SEED_DEMO: 'force' }, { passwordHashCost: 4, storage });
    expect(report.seed).toMatchObject({ demo: 'seeded', organisationsAdded: DEMO_ORGANISATIONS.length });
    const rows = await demoRows();
    expect(rows).toMatchObject({ admins: DEMO_NETWORK_ADMINS.length, organisations: DEMO_ORGANISATIONS.length });
    expect(rows.documents).toBeGreaterThan(0);
    const again = await migrateAndSeed({ ...scratch.db, NODE_ENV: 'production', SEED_DEMO: 'force' }, { passwordHashCost: 4, storage });
    expect(again.seed).toMatchObject({ demo: 'seeded', usersAdded: 0, organisationsAdded: 0 });
  }, 60_000);

  it('reads SEED_DEMO with NODE_ENV for `npm run seed`, refusing anything but auto, false and force', () => {
    expect(loadSeedSettings({})).toEqual({ NODE_ENV: 'development', SEED_DEMO: 'auto', PASSWORD_HASH_COST: 17 });
    expect(loadSeedSettings({ NODE_ENV: 'production', SEED_DEMO: 'force' })).toEqual({ NODE_ENV: 'production', SEED_DEMO: 'force', PASSWORD_HASH_COST: 17 });
    expect(() => loadSeedSettings({ NODE_ENV: 'production', SEED_DEMO: 'yes' })).toThrow(ConfigError);
    expect(() => loadSeedSettings({ NODE_ENV: 'production', SEED_DEMO: 'yes' })).toThrow(/SEED_DEMO/);
  });
});
