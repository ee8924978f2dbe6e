// `npm run db:backup [-- <file>]` and `npm run db:restore -- <file> --yes`: the development database (or DB_HOST's) to and from a gzipped SQL file.
import { existsSync } from 'node:fs';
import path from 'node:path';
import { backupDatabase, backupFileName, restoreDatabase, type Connection } from './lib/backup';
import { ensureDatabase, startMariaDb, type MariaDbInstance } from './lib/mariadb';
import { portInUse } from './lib/net';
import { failAndExit, ok, step } from './lib/output';
import { devDatabase, root, varDir } from './lib/project';
import { ensureSystemPackages, MARIADB } from './lib/system';

const command = process.argv[2];
const args = process.argv.slice(3);
const confirmed = args.includes('--yes');
const file = args.find((a) => !a.startsWith('--'));
const usage = 'Usage: npm run db:backup [-- <file.sql.gz>]   |   npm run db:restore -- <file.sql.gz> --yes';

const settings = devDatabase();
const host = process.env.DB_HOST ?? '127.0.0.1';
/** Anything but loopback is a server of its own (a managed one, a primary): the project's private server is not started. */
const external = !['127.0.0.1', 'localhost', '::1'].includes(host);
let db = null as MariaDbInstance | null;

async function connect(): Promise<Connection> {
  if (external) return { host, port: settings.port, user: settings.user, password: settings.password };
  ensureSystemPackages([MARIADB]);
  db = await startMariaDb(settings.dir, settings.port);
  // on a fresh machine the database and its account do not exist yet: a restore creates them
  ensureDatabase(db, settings);
  return { socket: db.socket };
}

try {
  if (command === 'db:backup') {
    const target = path.resolve(root, file ?? backupFileName(path.join(varDir, 'backups')));
    step(`Backing up database ${settings.name} on ${host}:${settings.port}…`);
    const done = await backupDatabase(await connect(), settings.name, target);
    ok(`Backup written: ${path.relative(process.cwd(), done.file) || done.file} (${(done.bytes / 1024).toFixed(0)} KiB)`);
  } else if (command === 'db:restore') {
    if (!file) failAndExit(usage, 2);
    const source = path.resolve(process.cwd(), file);
    if (!existsSync(source)) failAndExit(`No such file: ${source}`, 2);
    if (!confirmed) {
      failAndExit(`This replaces everything in database ${settings.name} on ${host}:${settings.port} with the content of ${file}.\nRun again with --yes to go ahead: npm run db:restore -- ${file} --yes`, 2);
    }
    // a running API keeps its search index and change-log position in memory; they would not match the restored data
    const apiHost = process.env.HOST ?? '127.0.0.1';
    const apiPort = Number(process.env.PORT ?? 4000);
    if (!external && (await portInUse(apiHost, apiPort))) failAndExit(`Something listens on ${apiHost}:${apiPort} (is npm start running?). Stop the API before a restore, and start it again afterwards.`, 4);
    step(`Restoring ${file} into database ${settings.name} on ${host}:${settings.port}…`);
    await restoreDatabase(await connect(), settings.name, source);
    ok(`Database ${settings.name} restored. The next npm start runs any migrations newer than the backup.`);
  } else {
    failAndExit(usage, 2);
  }
} catch (err) {
  process.exitCode = 1;
  console.error(`\n✖ ${(err as Error).message}\n`);
} finally {
  if (db?.startedHere) await db.stop();
}
