// Bree job (worker thread): deletes coverage gaps and alerts past their retention, and the search
// index's change log past its own, then signals done.
import { parentPort } from 'node:worker_threads';
import { loadConfig } from '../config';
import { createDataSource } from '../db/data-source';
import { createLogger } from '../lib/logger';
import { purgeCoverage } from '../services/coverage.service';
import { pruneSearchIndexChanges } from '../services/search-index';

const config = loadConfig();
const logger = createLogger(config.LOG_LEVEL).child({ job: 'coverage-retention' });
const dataSource = createDataSource({ ...config, DB_POOL_SIZE: 1 });

try {
  await dataSource.initialize();
  const deleted = await purgeCoverage(dataSource.manager, new Date());
  if (deleted.gaps || deleted.alerts) logger.info(deleted, 'old coverage gaps and alerts deleted');
  const changes = await pruneSearchIndexChanges(dataSource.manager, new Date());
  if (changes) logger.info({ changes }, 'old search index change-log rows deleted');
} finally {
  if (dataSource.isInitialized) await dataSource.destroy();
}

if (parentPort) parentPort.postMessage('done');
