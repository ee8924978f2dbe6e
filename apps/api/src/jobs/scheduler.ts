// Runs the scheduled jobs with Bree, each run in its own worker thread: the mail sender, the
// daily insurance check, the daily clean-up of old coverage gaps and alerts, the minutely release
// of lapsed booking holds, and the booking reminders.
import { fileURLToPath } from 'node:url';
import Bree from 'bree';
import { loadConfig } from '../config';
import type { Logger } from '../lib/logger';

/** Bree loads only .js/.mjs, so every job starts in this runner, which imports `<job name>.ts`. */
const RUNNER = fileURLToPath(new URL('./run-ts-job.mjs', import.meta.url));
/** A run that hangs (a stuck socket) is ended so the next interval can start a fresh one. */
const MAX_RUN_MS = 5 * 60_000;
const DAY_MS = 86_400_000;
const MINUTE_MS = 60_000;

export interface SchedulerOptions {
  /** The environment the jobs read their configuration from (`loadConfig`), usually process.env. */
  env: NodeJS.ProcessEnv;
  logger: Logger;
}

export interface Scheduler {
  start(): Promise<void>;
  /** Stops the timers and waits for a running job to finish its batch. */
  stop(): Promise<void>;
}

const describe = (value: unknown) => (value instanceof Error ? value.message : String(value));

export function createScheduler({ env, logger }: SchedulerOptions): Scheduler {
  // a bad setting should fail here, once, not in every worker every few seconds
  const config = loadConfig(env);
  const log = logger.child({ component: 'scheduler' });
  const workerEnv = Object.fromEntries(Object.entries(env).filter((e): e is [string, string] => typeof e[1] === 'string'));

  const bree = new Bree({
    root: false,
    // Bree reports every worker start and finish; that is debug detail at our interval
    logger: {
      info: (message: unknown) => log.debug(describe(message)),
      // "already running" only means a run outlasted the interval; the next tick catches up
      warn: (message: unknown) => (/already running/.test(describe(message)) ? log.debug(describe(message)) : log.warn(describe(message))),
      error: (message: unknown) => log.error(describe(message)),
    },
    // a failing job (database down, bad SMTP URL) is logged; the next interval tries again
    errorHandler: (error, data) => log.error({ job: data.name, error: describe(error) }, 'scheduled job failed'),
    jobs: [
      {
        name: 'send-mail',
        path: RUNNER,
        timeout: 0,
        interval: config.MAIL_INTERVAL_SECONDS * 1000,
        closeWorkerAfterMs: MAX_RUN_MS,
        worker: { env: workerEnv },
      },
      {
        name: 'insurance-expiry',
        path: RUNNER,
        // once at start (a restart must not skip a day), then every interval
        timeout: 0,
        interval: Math.round(config.INSURANCE_CHECK_INTERVAL_HOURS * 3_600_000),
        closeWorkerAfterMs: MAX_RUN_MS,
        worker: { env: workerEnv },
      },
      {
        name: 'coverage-retention',
        path: RUNNER,
        // a day after start, then daily: nothing is urgent, and start-up stays light
        interval: DAY_MS,
        closeWorkerAfterMs: MAX_RUN_MS,
        worker: { env: workerEnv },
      },
      {
        name: 'expire-holds',
        path: RUNNER,
        // a minute after start, then every minute: a held slot is free again within a minute of
        // its hold lapsing (not at start, where the mail sender and the insurance check go first)
        interval: MINUTE_MS,
        closeWorkerAfterMs: MAX_RUN_MS,
        worker: { env: workerEnv },
      },
      {
        name: 'booking-reminders',
        path: RUNNER,
        // every 15 minutes from start: a reminder goes out between 24 h and 23¾ h before the start
        interval: 15 * MINUTE_MS,
        closeWorkerAfterMs: MAX_RUN_MS,
        worker: { env: workerEnv },
      },
    ],
  });

  return {
    async start() {
      await bree.start();
      log.info({ jobs: ['send-mail', 'insurance-expiry', 'coverage-retention', 'expire-holds', 'booking-reminders'], mailIntervalSeconds: config.MAIL_INTERVAL_SECONDS, insuranceCheckIntervalHours: config.INSURANCE_CHECK_INTERVAL_HOURS }, 'scheduler started');
    },
    async stop() {
      await bree.stop();
    },
  };
}
