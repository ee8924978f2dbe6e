// Builds the real Express app against the test database for supertest and browser tests.
import { inject } from 'vitest';
import type { DataSource } from 'typeorm';
import { createApp, type EmberlineApp } from '../../apps/api/src/app';
import { loadConfig } from '../../apps/api/src/config';
import { createDataSource } from '../../apps/api/src/db/data-source';
import { createLogger } from '../../apps/api/src/lib/logger';
import { dbEnv } from '../../scripts/lib/project';

export interface TestApp {
  app: EmberlineApp;
  dataSource: DataSource;
  close(): Promise<void>;
}

export async function createTestApp(overrides: Record<string, string> = {}): Promise<TestApp> {
  const db = inject('db');
  const config = loadConfig({ ...dbEnv(db), NODE_ENV: 'test', LOG_LEVEL: 'silent', SERVE_APPS: 'false', DB_POOL_SIZE: '4', ...overrides });
  const dataSource = await createDataSource(config).initialize();
  const app = createApp({ config, dataSource, logger: createLogger(config.LOG_LEVEL), version: 'test' });
  return { app, dataSource, close: () => dataSource.destroy() };
}
