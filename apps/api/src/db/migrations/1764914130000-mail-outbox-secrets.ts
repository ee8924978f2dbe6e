// Mail outbox rows keep link tokens out of the clear: redacted template data for the log, the
// real values sealed until sent. Rows already sent or given up on are redacted here; pending ones
// keep their links until the sender has sent them (it redacts them then).
import type { MigrationInterface, QueryRunner } from 'typeorm';
import { redactSecrets } from '../../lib/redact';

const BATCH = 500;

/** Redacts link tokens in the stored text of every message sent or given up on. */
export async function redactFinishedMail(q: QueryRunner): Promise<number> {
  let changed = 0;
  // keyset pages by id, so a large log is redacted without holding it all in memory
  let after = '';
  for (;;) {
    const rows: { id: string; subject: string; text_body: string; html_body: string }[] = await q.query(
      "SELECT id, subject, text_body, html_body FROM mail_outbox WHERE status <> 'pending' AND id > ? ORDER BY id LIMIT ?",
      [after, BATCH],
    );
    for (const row of rows) {
      const redacted = { subject: redactSecrets(row.subject), text: redactSecrets(row.text_body), html: redactSecrets(row.html_body) };
      if (redacted.subject === row.subject && redacted.text === row.text_body && redacted.html === row.html_body) continue;
      await q.query('UPDATE mail_outbox SET subject = ?, text_body = ?, html_body = ? WHERE id = ?', [redacted.subject, redacted.text, redacted.html, row.id]);
      changed++;
    }
    if (rows.length < BATCH) return changed;
    after = rows[rows.length - 1]!.id;
  }
}

export class MailOutboxSecrets1764914130000 implements MigrationInterface {
  name = 'MailOutboxSecrets1764914130000';

  async up(q: QueryRunner): Promise<void> {
    await q.query('ALTER TABLE mail_outbox ADD COLUMN template_data JSON NULL AFTER html_body, ADD COLUMN secret_data TEXT NULL AFTER template_data');
    await redactFinishedMail(q);
  }

  async down(q: QueryRunner): Promise<void> {
    // redacted tokens cannot come back, and need not: the links have expired or been used
    await q.query('ALTER TABLE mail_outbox DROP COLUMN secret_data, DROP COLUMN template_data');
  }
}
