// Builds the real Express app against the test database for supertest and browser tests.
import { randomUUID } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { inject } from 'vitest';
import type { DataSource } from 'typeorm';
import { createApp, type EmberlineApp } from '../../apps/api/src/app';
import { loadConfig } from '../../apps/api/src/config';
import { createDataSource } from '../../apps/api/src/db/data-source';
import { createLogger } from '../../apps/api/src/lib/logger';
import type { LimitSettings } from '../../apps/api/src/middleware/rate-limits';
import type { Storage } from '../../apps/api/src/storage';
import { dbEnv } from '../../scripts/lib/project';

export interface TestApp {
  app: EmberlineApp;
  dataSource: DataSource;
  /** Where this app's uploads are stored: a temporary directory of its own, removed on close. */
  uploadsDir: string;
  close(): Promise<void>;
}

export const TEST_JWT_SECRET = 'test-secret-for-emberline-api-tests-0123456789';

/**
 * `limitScope`: apps given the same one share their rate-limit counters (as instances of one
 * deployment do); by default each app counts on its own, so no test uses up another's limits.
 */
export async function createTestApp(overrides: Record<string, string> = {}, o: { limits?: Partial<LimitSettings>; storage?: Storage; limitScope?: string } = {}): Promise<TestApp> {
  const db = inject('db');
  const uploadsDir = mkdtempSync(path.join(tmpdir(), 'emberline-uploads-'));
  const config = loadConfig({
    ...dbEnv(db),
    NODE_ENV: 'test',
    LOG_LEVEL: 'silent',
    SERVE_APPS: 'false',
    DB_POOL_SIZE: '4',
    // scrypt at N = 2^4 keeps the suite fast; a test checks that the default is OWASP's 2^17
    PASSWORD_HASH_COST: '4',
    PUBLIC_URL: 'http://emberline.test',
    RUN_SCHEDULER: 'false',
    UPLOADS_DIR: uploadsDir,
    ...overrides,
  });
  const dataSource = await createDataSource(config).initialize();
  const app = createApp({ config, dataSource, logger: createLogger(config.LOG_LEVEL), version: 'test', jwtSecret: TEST_JWT_SECRET, limits: o.limits, limitScope: o.limitScope ?? `test-${randomUUID()}:`, storage: o.storage });
  return {
    app,
    dataSource,
    uploadsDir: config.UPLOADS_DIR,
    close: async () => {
      await dataSource.destroy();
      rmSync(uploadsDir, { recursive: true, force: true });
    },
  };
}
