// `npm start`: installs what is missing, starts MariaDB, migrates and seeds, builds the apps,
// starts the API (which serves the apps) and prints where everything is; MariaDB is restarted
// with backoff if it dies meanwhile. Ctrl-C stops it all.
import { spawn, type ChildProcess } from 'node:child_process';
import path from 'node:path';
import { migrateAndSeed } from '../apps/api/src/db/migrate';
import { loadConfig, ConfigError } from '../apps/api/src/config';
import { buildApps } from './lib/build';
import { ensureDatabase, startMariaDb, superviseMariaDb, type MariaDbInstance, type Supervisor, type SupervisorEvent } from './lib/mariadb';
import { portInUse, waitForHttp } from './lib/net';
import { failAndExit, ok, step, warn } from './lib/output';
import { dbEnv, devDatabase, localSecret, root } from './lib/project';
import { ensureSystemPackages, MARIADB } from './lib/system';
import { DEMO_FORCED_MESSAGE, DEMO_REFUSED_MESSAGE } from '../apps/api/src/db/seed';
import { DEMO_NETWORK_ADMINS, DEMO_ORGANISATIONS, DEMO_OWNERS, DEMO_PASSWORD } from '../apps/api/src/db/seed/demo-data';

function demoSignIns(): string {
  const rows: [string, string][] = [
    ...DEMO_NETWORK_ADMINS.map((p): [string, string] => ['network admin', p.email]),
    ...DEMO_ORGANISATIONS.flatMap((o) => o.members.map((m): [string, string] => [`${m.role === 'partner_admin' ? 'partner admin' : 'technician'}, ${o.name} (${o.status})`, m.email])),
    ...DEMO_OWNERS.slice(0, 2).map((p): [string, string] => ['van owner', p.email]),
  ];
  return rows.map(([role, email]) => `    ${email.padEnd(32)} ${role}`).join('\n');
}

const t0 = performance.now();
let db: MariaDbInstance | undefined;
let dbSupervisor: Supervisor | undefined;
let mail: ChildProcess | undefined;
let payments: ChildProcess | undefined;
const MAIL_SMTP_PORT = Number(process.env.MAIL_CAPTURE_SMTP_PORT ?? 2525);
const MAIL_HTTP_PORT = Number(process.env.MAIL_CAPTURE_HTTP_PORT ?? 2580);
const PAYMENTS_FAKE_PORT = Number(process.env.PAYMENTS_FAKE_PORT ?? 4030);
// a developer who points STRIPE_API_BASE elsewhere (the provider's own test service) needs no fake
const RUN_PAYMENTS_FAKE = !process.env.STRIPE_API_BASE;

/** Starts a helper process and resolves once it prints its ready line; rejects if it exits first. */
function startChild(name: string, args: string[], env: NodeJS.ProcessEnv, ready: RegExp): Promise<ChildProcess> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, args, { cwd: root, env, stdio: ['ignore', 'pipe', 'pipe'] });
    let output = '';
    const onData = (chunk: Buffer) => {
      output += chunk.toString();
      process.stdout.write(chunk);
      if (ready.test(output)) resolve(child);
    };
    child.stdout!.on('data', onData);
    child.stderr!.on('data', (chunk: Buffer) => {
      output += chunk.toString();
      process.stderr.write(chunk);
    });
    child.once('exit', (code) => reject(new Error(`The ${name} stopped during start-up (exit code ${code}).`)));
  });
}

/** What the MariaDB supervisor does, told to the person running `npm start`. */
function reportDb(e: SupervisorEvent): void {
  const s = (ms: number) => `${(ms / 1000).toFixed(1)} s`;
  if (e.type === 'died') warn(`MariaDB (pid ${e.pid}) stopped unexpectedly after ${s(e.uptimeMs)}; the API answers 503 until it is back.`);
  else if (e.type === 'restarting') step(`Starting MariaDB again in ${s(e.delayMs)} (attempt ${e.attempt})…`);
  else if (e.type === 'restarted') ok(`MariaDB restarted (pid ${e.pid}) after ${s(e.downMs)} down; the API reconnects by itself`);
  else if (e.type === 'restart-failed') warn(`MariaDB did not start again: ${e.error.message.split('\n')[0]}`);
  else console.error(`\n✖ MariaDB failed ${e.failures} times in a row; giving up.${e.error ? `\n${e.error.message}` : ''}\n`);
}

async function shutdown(code: number): Promise<never> {
  // first, so that stopping MariaDB below is not taken for a crash
  await dbSupervisor?.stop();
  for (const child of [mail, payments]) {
    if (child && child.exitCode === null) {
      child.kill('SIGTERM');
      await new Promise((r) => child.once('exit', r));
    }
  }
  if (db?.startedHere) {
    step('Stopping MariaDB…');
    await db.stop();
  }
  process.exit(code);
}

try {
  ensureSystemPackages([MARIADB]);
  const settings = devDatabase();
  const env: NodeJS.ProcessEnv = {
    ...process.env,
    ...dbEnv(settings),
    JWT_SECRET: process.env.JWT_SECRET ?? localSecret('jwtSecret', 48),
    SMTP_URL: process.env.SMTP_URL ?? `smtp://127.0.0.1:${MAIL_SMTP_PORT}`,
    MAIL_CAPTURE_URL: process.env.MAIL_CAPTURE_URL ?? `http://127.0.0.1:${MAIL_HTTP_PORT}`,
    STRIPE_API_BASE: process.env.STRIPE_API_BASE ?? `http://127.0.0.1:${PAYMENTS_FAKE_PORT}`,
  };
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
  const report = await migrateAndSeed(config, { passwordHashCost: config.PASSWORD_HASH_COST });
  const seeded = report.seed;
  ok(`Database ready: ${report.migrationsRun.length} migration(s) run; seed added ${seeded?.capabilitiesAdded ?? 0} capabilities, ${seeded?.serviceTypesAdded ?? 0} service types, ${seeded?.organisationsAdded ?? 0} organisations, ${seeded?.usersAdded ?? 0} people`);
  if (seeded?.demo === 'refused-in-production') warn(DEMO_REFUSED_MESSAGE);
  else if (seeded?.demo === 'seeded' && config.NODE_ENV === 'production') warn(DEMO_FORCED_MESSAGE);
  // watches the server by its pid and starts it again on the same data directory and port
  dbSupervisor = superviseMariaDb(db, { onEvent: reportDb, onRestart: (next) => (db = next) });
  void dbSupervisor.done.then((how) => {
    if (how === 'gave-up') void shutdown(1);
  });

  buildApps();

  step(`Starting the e-mail capture server (SMTP ${MAIL_SMTP_PORT}, web ${MAIL_HTTP_PORT})…`);
  mail = await startChild('mail capture', ['--import', 'tsx', path.join(root, 'apps/api/src/fakes/mail/server.ts')], {
    ...env,
    MAIL_CAPTURE_SMTP_PORT: String(MAIL_SMTP_PORT),
    MAIL_CAPTURE_HTTP_PORT: String(MAIL_HTTP_PORT),
    MAIL_CAPTURE_FILE: path.join(root, 'var/mail/captured.json'),
  }, /Mail capture ready/);

  if (RUN_PAYMENTS_FAKE) {
    step(`Starting the payments fake (test payment page, port ${PAYMENTS_FAKE_PORT})…`);
    payments = await startChild('payments fake', ['--import', 'tsx', path.join(root, 'apps/api/src/fakes/payments/server.ts')], {
      ...env,
      PAYMENTS_FAKE_PORT: String(PAYMENTS_FAKE_PORT),
      // the API's webhook route; the fake signs with STRIPE_WEBHOOK_SECRET, the same as the API checks
      PAYMENTS_FAKE_WEBHOOK_URL: `${config.publicUrl}/api/payments/webhook`,
      PAYMENTS_FAKE_STATE_FILE: path.join(root, 'var/payments/state.json'),
    }, /Payments fake ready/);
  }

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
  E-mail capture               SMTP 127.0.0.1:${MAIL_SMTP_PORT}; captured mail at http://127.0.0.1:${MAIL_HTTP_PORT}/messages
                               and in the Console's mail log (network admins)
  Payments                     ${RUN_PAYMENTS_FAKE ? `local payments fake at http://127.0.0.1:${PAYMENTS_FAKE_PORT} (test payment page; state at /__fake/state)` : `provider API at ${env.STRIPE_API_BASE}`}

${seeded?.demo === 'seeded' ? `  Demo sign-ins, all with the password ${DEMO_PASSWORD}:\n${demoSignIns()}\n` : ''}
  Press Ctrl-C to stop the API, the e-mail capture server, the payments fake and MariaDB.
`);
  }
} catch (err) {
  console.error(`\n✖ ${(err as Error).message}\n`);
  await shutdown(1);
}
