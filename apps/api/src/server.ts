// Starts the API: reads configuration, connects to MariaDB, listens, and stops cleanly on
// SIGINT/SIGTERM.
import type { Server } from 'node:http';
import { ConfigError, loadConfig, type Config } from './config';
import { createDataSource, pendingMigrations } from './db/data-source';
import { createLogger } from './lib/logger';
import { createApp } from './app';
import { VERSION } from './version';
import { localSecret } from './lib/local-secrets';
import { createScheduler, type Scheduler } from './jobs/scheduler';
import { loadPlaces } from './services/places.service';
import { searchIndexFor } from './services/search-index';

function fail(message: string, exitCode: number): never {
  process.stderr.write(`\n✖ ${message}\n\n`);
  process.exit(exitCode);
}

function readConfig(): Config {
  try {
    return loadConfig();
  } catch (err) {
    if (err instanceof ConfigError) {
      fail(`Configuration error:\n${err.issues.map((i) => `  ${i.variable}: ${i.message}`).join('\n')}\nSee .env.example for every variable and its default.`, 2);
    }
    throw err;
  }
}

async function main(): Promise<void> {
  const config = readConfig();
  const logger = createLogger(config.LOG_LEVEL);
  const dataSource = createDataSource(config);

  for (let attempt = 1; ; attempt++) {
    try {
      await dataSource.initialize();
      break;
    } catch (err) {
      if (attempt >= 10) {
        fail(`Cannot reach MariaDB at ${config.DB_HOST}:${config.DB_PORT} as ${config.DB_USER}: ${(err as Error).message}`, 3);
      }
      logger.warn({ attempt, err: (err as Error).message }, 'database not reachable yet, retrying');
      await new Promise((r) => setTimeout(r, 1000));
    }
  }
  const pending = await pendingMigrations(dataSource);
  if (pending.length) logger.warn({ pending }, 'migrations have not run yet: run "npm run migrate"');

  const jwtSecret = config.JWT_SECRET ?? localSecret('jwtSecret', 48);
  const app = createApp({ config, dataSource, logger, version: VERSION, jwtSecret });
  const server: Server = app.listen(config.PORT, config.HOST);
  server.on('error', (err: NodeJS.ErrnoException) => {
    if (err.code === 'EADDRINUSE') fail(`Port ${config.PORT} on ${config.HOST} is already in use. Stop the other process or set PORT.`, 4);
    if (err.code === 'EACCES') fail(`No permission to listen on ${config.HOST}:${config.PORT}. Choose another PORT.`, 4);
    fail(`The server could not start: ${err.message}`, 4);
  });
  server.on('listening', () => {
    logger.info({ url: config.publicUrl }, 'Emberline API listening');
    // the place index is built in a worker thread, so requests are answered meanwhile; the first
    // look-up then need not wait for it
    const t0 = performance.now();
    loadPlaces().then(
      (index) => logger.info({ places: index.names.length, ms: Math.round(performance.now() - t0) }, 'place index ready'),
      (err: unknown) => logger.warn({ err: (err as Error).message }, 'place index not built yet; the first look-up will try again'),
    );
    // the search index too, so the first owner's search does not wait for every partner to load
    const t1 = performance.now();
    const searchIndex = searchIndexFor(dataSource.manager);
    searchIndex.current(dataSource.manager).then(
      (index) => logger.info({ partners: index.partners.size, ms: Math.round(performance.now() - t1) }, 'search index ready'),
      (err: unknown) => logger.warn({ err: (err as Error).message }, 'search index not loaded yet; the first search will try again'),
    );
  });

  // the jobs read the same environment; with several instances a database lock keeps each run single
  let scheduler: Scheduler | undefined;
  if (config.RUN_SCHEDULER) {
    scheduler = createScheduler({ env: { ...process.env, JWT_SECRET: jwtSecret }, logger });
    await scheduler.start();
  }

  let stopping = false;
  const stop = (signal: string) => {
    if (stopping) return;
    stopping = true;
    logger.info({ signal }, 'stopping');
    server.close(() => void Promise.allSettled([scheduler?.stop(), dataSource.destroy()]).finally(() => process.exit(0)));
    server.closeAllConnections();
    setTimeout(() => process.exit(0), 5000).unref();
  };
  process.on('SIGINT', () => stop('SIGINT'));
  process.on('SIGTERM', () => stop('SIGTERM'));
}

void main();
