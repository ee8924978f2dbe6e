// `npm start`: installs what is missing, starts MariaDB, migrates and seeds, builds the apps,
// starts the API (which serves the apps) and prints where everything is. Ctrl-C stops it all.
import { spawn } from 'node:child_process';
import path from 'node:path';
import { migrateAndSeed } from '../apps/api/src/db/migrate';
import { loadConfig, ConfigError } from '../apps/api/src/config';
import { buildApps } from './lib/build';
import { ensureDatabase, startMariaDb, type MariaDbInstance } from './lib/mariadb';
import { portInUse, waitForHttp } from './lib/net';
import { failAndExit, ok, step } from './lib/output';
import { dbEnv, devDatabase, root } from './lib/project';
import { ensureSystemPackages, MARIADB } from './lib/system';

const t0 = performance.now();
let db: MariaDbInstance | undefined;

async function shutdown(code: number): Promise<never> {
  if (db?.startedHere) {
    step('Stopping MariaDB…');
    await db.stop();
  }
  process.exit(code);
}

try {
  ensureSystemPackages([MARIADB]);
  const settings = devDatabase();
  const env = { ...process.env, NODE_ENV: process.env.NODE_ENV ?? 'production', ...dbEnv(settings) };
  let config;
  try {
    config = loadConfig(env);
  } catch (err) {
    if (err instanceof ConfigError) failAndExit(`Configuration error:\n${err.issues.map((i) => `  ${i.variable}: ${i.message}`).join('\n')}`, 2);
    throw err;
  }
  if (await portInUse(config.HOST, config.PORT)) {
    failAndExit(`Port ${config.PORT} on ${config.HOST} is already in use (is Emberline already running?). Stop that program or set PORT.`, 4);
  }

  step(`Starting MariaDB on 127.0.0.1:${settings.port} (data in ${path.relative(root, settings.dir)}/)…`);
  db = await startMariaDb(settings.dir, settings.port);
  ok(db.startedHere ? `MariaDB started (pid ${db.pid})` : `MariaDB already running (pid ${db.pid}), reusing it`);
  ensureDatabase(db, settings);
  const report = await migrateAndSeed(config);
  ok(`Database ready: ${report.migrationsRun.length} migration(s) run; seed added ${report.seed?.capabilitiesAdded ?? 0} capabilities and ${report.seed?.serviceTypesAdded ?? 0} service types`);

  buildApps();

  step('Starting the API…');
  const api = spawn(process.execPath, ['--import', 'tsx', path.join(root, 'apps/api/src/server.ts')], { cwd: root, env, stdio: 'inherit' });
  let stopping = false;
  api.on('exit', (code) => {
    if (!stopping) console.error(`\n✖ The API stopped unexpectedly (exit code ${code}).`);
    void shutdown(stopping ? 0 : code || 1);
  });
  for (const signal of ['SIGINT', 'SIGTERM'] as const) {
    process.on(signal, () => {
      if (stopping) return;
      stopping = true;
      step('Stopping the API…');
      api.kill('SIGTERM');
    });
  }

  const healthUrl = `${config.publicUrl}/api/health`;
  const status = await waitForHttp(healthUrl, 60_000);
  if (status !== 200) {
    console.error(`\n✖ The API did not report healthy at ${healthUrl} (last status: ${status ?? 'no answer'}).`);
    stopping = true;
    api.kill('SIGTERM');
  } else {
    const seconds = ((performance.now() - t0) / 1000).toFixed(1);
    const u = config.publicUrl;
    console.log(`
  Emberline is running (ready in ${seconds} s)

  Directory (van owners)       ${u}/
  Console (partners, admins)   ${u}/console/
  API health                   ${u}/api/health
  API reference                ${u}/api/docs   (OpenAPI: ${u}/api/openapi.json)
  MariaDB                      127.0.0.1:${settings.port}, database ${settings.name}, user ${settings.user}
                               (password in var/secrets.json)

  Demo sign-ins: none yet. Accounts, roles and the demo partners arrive with the accounts work;
  the catalogue of ${report.seed ? 'service types and capabilities' : 'services'} is seeded.

  Press Ctrl-C to stop the API and MariaDB.
`);
  }
} catch (err) {
  console.error(`\n✖ ${(err as Error).message}\n`);
  await shutdown(1);
}
