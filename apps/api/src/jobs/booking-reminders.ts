// Bree job (worker thread): queues the reminders of bookings starting within a day, then signals done.
import { parentPort } from 'node:worker_threads';
import { loadConfig } from '../config';
import { createDataSource } from '../db/data-source';
import { createLogger } from '../lib/logger';
import { runBookingReminders } from '../services/booking-jobs.service';

const config = loadConfig();
const logger = createLogger(config.LOG_LEVEL).child({ job: 'booking-reminders' });
const dataSource = createDataSource({ ...config, DB_POOL_SIZE: 2 });

try {
  await dataSource.initialize();
  const result = await runBookingReminders({ dataSource, publicUrl: config.publicUrl, logger });
  if (result.sent) logger.info(result, 'booking reminders queued');
} finally {
  if (dataSource.isInitialized) await dataSource.destroy();
}

if (parentPort) parentPort.postMessage('done');
