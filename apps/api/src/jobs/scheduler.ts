// Runs the scheduled jobs with Bree, in this process: the mail sender (woken when mail is queued,
// polled as a safety net), the daily insurance check, the daily clean-up of old coverage gaps and
// alerts, the minutely release of lapsed booking holds, and the booking reminders.
import { EventEmitter } from 'node:events';
import { fileURLToPath } from 'node:url';
import type { Worker } from 'node:worker_threads';
import Bree from 'bree';
import type { DataSource } from 'typeorm';
import { loadConfig, type Config } from '../config';
import { createDataSource } from '../db/data-source';
import type { Logger } from '../lib/logger';
import { localSecret } from '../lib/local-secrets';
import { onMailQueued } from '../mail/mail-queued';
import { useMailSecretKey } from '../mail/secret-data';
import { createPaymentGateway, type PaymentGateway } from '../payments/gateway';
import { bookingReminders } from './booking-reminders';
import { coverageRetention } from './coverage-retention';
import { expireHolds } from './expire-holds';
import { insuranceExpiry } from './insurance-expiry';
import { sendMail } from './send-mail';

/** A run that hangs (a stuck socket) is given up so the next interval can start a fresh one. */
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

/** What a job gets: its own small pool (one connection holds the job's lock, one works). */
export interface JobContext {
  dataSource: DataSource;
  config: Config;
  logger: Logger;
  payments(): PaymentGateway;
}

type Job = (context: JobContext) => Promise<void>;

/**
 * One run of a job in this thread, shaped like the worker Bree would start: it reports "online",
 * then "done" (or an error and "done"). A worker thread per run loaded the whole API again each
 * time, which kept an idle instance at about a third of a core.
 */
class InProcessRun extends EventEmitter {
  readonly isMainThread = true;
  readonly threadId = 0;
  readonly resourceLimits = {};
  private over = false;

  constructor(run: () => Promise<void>) {
    super();
    setImmediate(() => {
      this.emit('online');
      run().then(
        () => this.finish(),
        (err: unknown) => {
          if (!this.over) this.emit('error', err);
          this.finish();
        },
      );
    });
  }

  private finish(): void {
    if (this.over) return;
    this.over = true;
    this.emit('message', 'done');
  }

  /** Bree's "cancel" on stop: the run ends after its batch anyway. */
  postMessage(): void {}

  /** After MAX_RUN_MS: Bree forgets the run; a late end of the promise reports nothing. */
  async terminate(): Promise<number> {
    if (this.over) return 0;
    this.over = true;
    this.emit('exit', 1);
    return 1;
  }
}

/** Bree with every run in this thread; `runJob` runs the job of that name. */
class InProcessBree extends Bree {
  constructor(config: Bree.BreeOptions, runJob: (name: string) => Promise<void>) {
    super(config);
    // Bree's documented extension point for how a run starts
    this.createWorker = (_filename, options) => new InProcessRun(() => runJob(String(options.workerData?.job?.name))) as unknown as Worker;
  }
}

const describe = (value: unknown) => (value instanceof Error ? value.message : String(value));

/** The jobs by name; Bree's `path` names the job's module, which this process has loaded already. */
const JOBS: Record<string, { run: Job; poolSize: number }> = {
  'send-mail': { run: sendMail, poolSize: 2 },
  'insurance-expiry': { run: insuranceExpiry, poolSize: 2 },
  'coverage-retention': { run: coverageRetention, poolSize: 1 },
  'expire-holds': { run: expireHolds, poolSize: 2 },
  'booking-reminders': { run: bookingReminders, poolSize: 2 },
};
const modulePath = (name: string) => fileURLToPath(new URL(`./${name}.ts`, import.meta.url));

export function createScheduler({ env, logger }: SchedulerOptions): Scheduler {
  // a bad setting should fail here, once, not at every run
  const config = loadConfig(env);
  const log = logger.child({ component: 'scheduler' });
  const mailKeySecret = config.JWT_SECRET ?? localSecret('jwtSecret', 48);

  // each job keeps its small pool between runs (connecting and building TypeORM's metadata each
  // time was most of a run's cost); a pool that failed to connect is tried again at the next run
  const dataSources = new Map<string, Promise<DataSource>>();
  const dataSourceFor = (name: string): Promise<DataSource> => {
    let ready = dataSources.get(name);
    if (!ready) {
      const dataSource = createDataSource({ ...config, DB_POOL_SIZE: JOBS[name]!.poolSize });
      useMailSecretKey(dataSource, mailKeySecret);
      ready = dataSource.initialize();
      ready.catch(() => dataSources.delete(name));
      dataSources.set(name, ready);
    }
    return ready;
  };
  let payments: PaymentGateway | undefined;
  const context = (name: string, dataSource: DataSource): JobContext => ({
    dataSource,
    config,
    logger: logger.child({ job: name }),
    payments: () => (payments ??= createPaymentGateway(config)),
  });
  const runJob = async (name: string): Promise<void> => {
    const job = JOBS[name];
    if (!job) throw new Error(`Not a job: ${name}`);
    await job.run(context(name, await dataSourceFor(name)));
  };

  const bree = new InProcessBree(
    {
      root: false,
      // Bree reports every run's start and finish; that is debug detail at our interval
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
          path: modulePath('send-mail'),
          // at start, then as a safety net every interval; queued mail wakes it at once
          timeout: 0,
          interval: config.MAIL_INTERVAL_SECONDS * 1000,
          closeWorkerAfterMs: MAX_RUN_MS,
        },
        {
          name: 'insurance-expiry',
          path: modulePath('insurance-expiry'),
          // once at start (a restart must not skip a day), then every interval
          timeout: 0,
          interval: Math.round(config.INSURANCE_CHECK_INTERVAL_HOURS * 3_600_000),
          closeWorkerAfterMs: MAX_RUN_MS,
        },
        {
          name: 'coverage-retention',
          path: modulePath('coverage-retention'),
          // a day after start, then daily: nothing is urgent, and start-up stays light
          interval: DAY_MS,
          closeWorkerAfterMs: MAX_RUN_MS,
        },
        {
          name: 'expire-holds',
          path: modulePath('expire-holds'),
          // a minute after start, then every minute: a held slot is free again within a minute of
          // its hold lapsing (not at start, where the mail sender and the insurance check go first)
          interval: MINUTE_MS,
          closeWorkerAfterMs: MAX_RUN_MS,
        },
        {
          name: 'booking-reminders',
          path: modulePath('booking-reminders'),
          // every 15 minutes from start: a reminder goes out between 24 h and 23¾ h before the start
          interval: 15 * MINUTE_MS,
          closeWorkerAfterMs: MAX_RUN_MS,
        },
      ],
    },
    runJob,
  );

  // mail queued while the sender runs may have missed its query: one more run follows it
  let mailAgain = false;
  let stopped = false;
  const wakeMail = () => {
    if (stopped) return;
    if (bree.workers.has('send-mail')) mailAgain = true;
    else void bree.run('send-mail');
  };
  bree.on('worker deleted', (name: string) => {
    if (name !== 'send-mail' || !mailAgain) return;
    mailAgain = false;
    wakeMail();
  });
  let unsubscribe: (() => void) | undefined;

  return {
    async start() {
      stopped = false;
      unsubscribe = onMailQueued(wakeMail);
      await bree.start();
      log.info({ jobs: Object.keys(JOBS), mailIntervalSeconds: config.MAIL_INTERVAL_SECONDS, insuranceCheckIntervalHours: config.INSURANCE_CHECK_INTERVAL_HOURS }, 'scheduler started');
    },
    async stop() {
      stopped = true;
      unsubscribe?.();
      await bree.stop();
      const pools = [...dataSources.values()];
      dataSources.clear();
      await Promise.allSettled(pools.map(async (ready) => (await ready).destroy()));
    },
  };
}
