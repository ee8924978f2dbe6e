// `npm run admin:create -- --email … --name … [--password …]`: creates a network admin (or
// makes an existing account one) in the development database, and writes it to the audit log.
import { randomBytes } from 'node:crypto';
import { parseArgs } from 'node:util';
import { EmailSchema, NameSchema, PasswordSchema } from '@emberline/domain';
import { loadSeedSettings } from '../apps/api/src/config';
import { createDataSource } from '../apps/api/src/db/data-source';
import { migrateAndSeed } from '../apps/api/src/db/migrate';
import { createNetworkAdmin } from '../apps/api/src/services/admin.service';
import { ensureDatabase, startMariaDb } from './lib/mariadb';
import { failAndExit, ok } from './lib/output';
import { devDatabase } from './lib/project';
import { ensureSystemPackages, MARIADB } from './lib/system';

const { values } = parseArgs({ args: process.argv.slice(3), options: { email: { type: 'string' }, name: { type: 'string' }, password: { type: 'string' } } });
const email = EmailSchema.safeParse(values.email ?? '');
const name = NameSchema.safeParse(values.name ?? '');
if (!email.success || !name.success) failAndExit('Usage: npm run admin:create -- --email admin@example.org --name "Full Name" [--password …]', 2);
const password = values.password ?? randomBytes(12).toString('base64url');
const strong = PasswordSchema.safeParse(password);
if (!strong.success) failAndExit(`--password: ${strong.error.issues[0]!.message}`, 2);
const { PASSWORD_HASH_COST } = loadSeedSettings();

ensureSystemPackages([MARIADB]);
const settings = devDatabase();
const db = await startMariaDb(settings.dir, settings.port);
try {
  ensureDatabase(db, settings);
  const dbConfig = { DB_HOST: '127.0.0.1', DB_PORT: settings.port, DB_NAME: settings.name, DB_USER: settings.user, DB_PASSWORD: settings.password, DB_POOL_SIZE: 2 };
  await migrateAndSeed(dbConfig, { seed: false });
  const ds = await createDataSource(dbConfig).initialize();
  try {
    const outcome = await ds.transaction((manager) =>
      createNetworkAdmin({ manager, actor: { userId: null, roles: [], organisationId: null } }, { email: email.data, name: name.data, password, passwordHashCost: PASSWORD_HASH_COST }),
    );
    if (outcome === 'promoted') ok(`${email.data} is now a network admin (password unchanged).`);
    else ok(`Network admin ${email.data} created.${values.password ? '' : ` Password: ${password}  (shown once: change it after signing in)`}`);
  } finally {
    await ds.destroy();
  }
} finally {
  if (db.startedHere) await db.stop();
}
