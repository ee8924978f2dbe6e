// Bree job (worker thread): sends the due messages of the mail outbox once, then signals done.
import { parentPort } from 'node:worker_threads';
import { loadConfig } from '../config';
import { createDataSource } from '../db/data-source';
import { createLogger } from '../lib/logger';
import { localSecret } from '../lib/local-secrets';
import { createMailTransport, processOutbox } from '../mail/outbox';
import { useMailSecretKey } from '../mail/secret-data';

const config = loadConfig();
const logger = createLogger(config.LOG_LEVEL).child({ job: 'send-mail' });
// one connection holds the outbox lock and does the work; a second covers TypeORM's own check
const dataSource = createDataSource({ ...config, DB_POOL_SIZE: 2 });
const transport = createMailTransport(config.SMTP_URL);
// the server hands its secret to the jobs as JWT_SECRET; run directly, the job reads the same local one
useMailSecretKey(dataSource, config.JWT_SECRET ?? localSecret('jwtSecret', 48));

try {
  await dataSource.initialize();
  const result = await processOutbox({ dataSource, transport, from: config.MAIL_FROM, logger });
  if (result.sent || result.retried || result.failed) logger.info(result, 'mail outbox processed');
} finally {
  transport.close();
  if (dataSource.isInitialized) await dataSource.destroy();
}

// Bree ends the worker on "done"; outside Bree (run directly) the process simply exits
if (parentPort) parentPort.postMessage('done');
