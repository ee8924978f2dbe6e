// Global setup for the API and browser test projects: starts the test MariaDB (its own data
// directory under var/test-mariadb, never the development one), recreates this project's
// database, migrates and seeds it, and hands the connection settings to the tests.
import { rmSync } from 'node:fs';
import path from 'node:path';
import type { TestProject } from 'vitest/node';
import { projectRoot } from '../../apps/api/src/config';
import { migrateAndSeed } from '../../apps/api/src/db/migrate';
import { LocalDiskStorage } from '../../apps/api/src/storage';
import { ensureDatabase, startMariaDb } from '../../scripts/lib/mariadb';
import { testDatabase, type DatabaseSettings } from '../../scripts/lib/project';
import { ensureSystemPackages, MARIADB } from '../../scripts/lib/system';

declare module 'vitest' {
  export interface ProvidedContext {
    db: DatabaseSettings & { socket: string; pid: number; uploadsDir: string };
  }
}

export default async function setup(project: TestProject) {
  ensureSystemPackages([MARIADB]);
  const settings = testDatabase(project.name === 'e2e' ? 'emberline_e2e' : 'emberline_test');
  const db = await startMariaDb(settings.dir, settings.port);
  ensureDatabase(db, { ...settings, recreate: true });
  // the demo documents of the recreated database, never in the development uploads
  // another test server port (a second run side by side) keeps its own folder too
  const uploads = path.join(projectRoot, 'var', `${settings.name}${settings.port === 3308 ? '' : `-${settings.port}`}-uploads`);
  rmSync(uploads, { recursive: true, force: true });
  await migrateAndSeed(
    { DB_HOST: '127.0.0.1', DB_PORT: settings.port, DB_NAME: settings.name, DB_USER: settings.user, DB_PASSWORD: settings.password, DB_POOL_SIZE: 2 },
    { passwordHashCost: 4, storage: new LocalDiskStorage(uploads) },
  );
  project.provide('db', { ...settings, socket: db.socket, pid: db.pid, uploadsDir: uploads });
  return async () => {
    if (db.startedHere) await db.stop();
  };
}
