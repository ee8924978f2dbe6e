// Bree job (worker thread): releases lapsed holds and expires unanswered bookings, then signals done.
import { parentPort } from 'node:worker_threads';
import { loadConfig } from '../config';
import { createDataSource } from '../db/data-source';
import { createLogger } from '../lib/logger';
import { createPaymentGateway } from '../payments/gateway';
import { runExpireHolds } from '../services/booking-jobs.service';

const config = loadConfig();
const logger = createLogger(config.LOG_LEVEL).child({ job: 'expire-holds' });
// one connection holds the lock; the other does the work, one booking at a time
const dataSource = createDataSource({ ...config, DB_POOL_SIZE: 2 });

try {
  await dataSource.initialize();
  const result = await runExpireHolds({ dataSource, payments: createPaymentGateway(config), publicUrl: config.publicUrl, logger });
  if (result.released || result.paid || result.expired || result.failed) logger.info(result, 'lapsed holds and unanswered bookings handled');
} finally {
  if (dataSource.isInitialized) await dataSource.destroy();
}

if (parentPort) parentPort.postMessage('done');
