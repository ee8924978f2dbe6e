// Scheduled job: sends the due messages of the mail outbox once.
import { createMailTransport, processOutbox } from '../mail/outbox';
import type { JobContext } from './scheduler';

export async function sendMail({ dataSource, config, logger }: JobContext): Promise<void> {
  const transport = createMailTransport(config.SMTP_URL);
  try {
    const result = await processOutbox({ dataSource, transport, from: config.MAIL_FROM, logger });
    if (result.sent || result.retried || result.failed) logger.info(result, 'mail outbox processed');
  } finally {
    transport.close();
  }
}
