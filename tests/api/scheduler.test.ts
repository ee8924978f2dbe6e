// The scheduler on the test MariaDB: mail queued in a transaction is sent when it commits, not at
// the next poll, and an idle scheduler costs the process next to no CPU.
import { afterAll, beforeAll, beforeEach, describe, expect, inject, it, vi } from 'vitest';
import type { DataSource } from 'typeorm';
import { loadConfig } from '../../apps/api/src/config';
import { createDataSource } from '../../apps/api/src/db/data-source';
import { startMailCapture, type MailCapture } from '../../apps/api/src/fakes/mail/capture-server';
import { createScheduler, type Scheduler } from '../../apps/api/src/jobs/scheduler';
import { createLogger } from '../../apps/api/src/lib/logger';
import { enqueueMail } from '../../apps/api/src/mail/outbox';
import { useMailSecretKey } from '../../apps/api/src/mail/secret-data';
import { dbEnv } from '../../scripts/lib/project';
import { TEST_JWT_SECRET } from '../setup/app';

let dataSource: DataSource;
let capture: MailCapture;
let scheduler: Scheduler | undefined;

const env = (mailIntervalSeconds: string) => ({
  ...dbEnv(inject('db')),
  NODE_ENV: 'test',
  LOG_LEVEL: 'silent',
  DB_POOL_SIZE: '4',
  JWT_SECRET: TEST_JWT_SECRET,
  SMTP_URL: `smtp://127.0.0.1:${capture.smtpPort}`,
  MAIL_INTERVAL_SECONDS: mailIntervalSeconds,
  // the daily jobs stay out of the way of the measurements
  INSURANCE_CHECK_INTERVAL_HOURS: '24',
});

beforeAll(async () => {
  capture = await startMailCapture({ smtpPort: 0, httpPort: 0 });
  dataSource = await createDataSource(loadConfig(env('60'))).initialize();
  useMailSecretKey(dataSource, TEST_JWT_SECRET);
});

afterAll(async () => {
  await capture?.stop();
  await dataSource?.destroy();
});

beforeEach(async () => {
  await dataSource.query('DELETE FROM mail_outbox');
  capture.clear();
});

const queueInTransaction = (to: string) =>
  dataSource.transaction((manager) => enqueueMail(manager, { to, template: 'verify-email', locale: 'en', data: { name: 'Sam', link: 'https://emberline.test/verify-email?token=t&app=directory' } }));
const delivered = (id: string) => capture.messages().filter((m) => m.headers['x-emberline-outbox-id'] === id);

async function started(mailIntervalSeconds: string): Promise<Scheduler> {
  scheduler = createScheduler({ env: env(mailIntervalSeconds), logger: createLogger('silent') });
  await scheduler.start();
  return scheduler;
}

describe('the scheduler', () => {
  afterAll(async () => scheduler?.stop());

  it('sends mail queued in a transaction when it commits, long before the next poll', async () => {
    const s = await started('60');
    try {
      // the run at start is over once this first message is out
      const first = await queueInTransaction('first@example.org');
      await vi.waitFor(() => expect(delivered(first.id)).toHaveLength(1), { timeout: 15_000, interval: 100 });
      await new Promise((r) => setTimeout(r, 500));
      const queuedAt = Date.now();
      const second = await queueInTransaction('second@example.org');
      await vi.waitFor(() => expect(delivered(second.id)).toHaveLength(1), { timeout: 5_000, interval: 50 });
      expect(Date.now() - queuedAt).toBeLessThan(5_000);
    } finally {
      await s.stop();
    }
  }, 30_000);

  it('costs the process under 5 % of a core while idle, even polling the outbox every second', async () => {
    const s = await started('1');
    try {
      const warm = await queueInTransaction('warm@example.org');
      await vi.waitFor(() => expect(delivered(warm.id)).toHaveLength(1), { timeout: 15_000, interval: 100 });
      const before = process.cpuUsage();
      const t0 = performance.now();
      await new Promise((r) => setTimeout(r, 4_000));
      const used = process.cpuUsage(before);
      const share = (used.user + used.system) / 1000 / (performance.now() - t0);
      expect(share).toBeLessThan(0.05);
    } finally {
      await s.stop();
    }
  }, 30_000);
});
