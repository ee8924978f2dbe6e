// `npm run migrate` and `npm run seed`: start the dev MariaDB if needed, migrate and seed.
import { loadSeedSettings } from '../apps/api/src/config';
import { migrateAndSeed } from '../apps/api/src/db/migrate';
import { DEMO_FORCED_MESSAGE, DEMO_REFUSED_MESSAGE } from '../apps/api/src/db/seed';
import { ensureDatabase, startMariaDb } from './lib/mariadb';
import { failAndExit, ok, warn } from './lib/output';
import { devDatabase } from './lib/project';
import { ensureSystemPackages, MARIADB } from './lib/system';

try {
  // a bad SEED_DEMO stops here, before anything starts
  const seedSettings = loadSeedSettings();
  ensureSystemPackages([MARIADB]);
  const settings = devDatabase();
  const db = await startMariaDb(settings.dir, settings.port);
  ensureDatabase(db, settings);
  const report = await migrateAndSeed(
    { DB_HOST: '127.0.0.1', DB_PORT: settings.port, DB_NAME: settings.name, DB_USER: settings.user, DB_PASSWORD: settings.password, DB_POOL_SIZE: 2, ...seedSettings },
    { seed: process.argv[2] !== 'migrate' },
  );
  ok(`Migrations run: ${report.migrationsRun.length ? report.migrationsRun.join(', ') : 'none pending'}`);
  if (report.seed) ok(`Seed: ${report.seed.capabilitiesAdded} capabilities, ${report.seed.serviceTypesAdded} service types added`);
  if (report.seed?.demo === 'refused-in-production') warn(DEMO_REFUSED_MESSAGE);
  else if (report.seed?.demo === 'seeded' && seedSettings.NODE_ENV === 'production') warn(DEMO_FORCED_MESSAGE);
  if (db.startedHere) await db.stop();
} catch (err) {
  failAndExit((err as Error).message);
}
