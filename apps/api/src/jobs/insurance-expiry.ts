// Bree job (worker thread): the daily insurance check (reminders, suspensions), then signals done.
import { parentPort } from 'node:worker_threads';
import { loadConfig } from '../config';
import { createDataSource } from '../db/data-source';
import { createLogger } from '../lib/logger';
import { runInsuranceExpiry } from '../services/insurance-expiry.service';
import { todayUtc } from '../services/onboarding.service';

const config = loadConfig();
const logger = createLogger(config.LOG_LEVEL).child({ job: 'insurance-expiry' });
// one connection holds the lock and reads; a second covers TypeORM's own check
const dataSource = createDataSource({ ...config, DB_POOL_SIZE: 2 });

try {
  await dataSource.initialize();
  const result = await runInsuranceExpiry({ dataSource, today: todayUtc(), publicUrl: config.publicUrl, logger });
  if (result.reminders || result.suspended) logger.info(result, 'insurance check done');
} finally {
  if (dataSource.isInitialized) await dataSource.destroy();
}

if (parentPort) parentPort.postMessage('done');
