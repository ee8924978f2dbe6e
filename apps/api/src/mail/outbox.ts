// The mail outbox: queued in the caller's transaction, sent by a job that retries with backoff.
import { randomUUID } from 'node:crypto';
import { createTransport } from 'nodemailer';
import { LessThanOrEqual, type DataSource, type EntityManager } from 'typeorm';
import { MailOutboxEntity, type MailAttachment, type MailTemplateValues } from '../entities/mail-outbox.entity';
import type { Logger } from '../lib/logger';
import { renderMail, resolveMailLocale, type MailTemplate, type MailTemplateData, type RenderedMail } from './render';
import { redactSecrets } from '../lib/redact';
import { mailQueued } from './mail-queued';
import { mailSecretKeyOf, MailSecretError, openSecretData, sealSecretData, splitSecretData } from './secret-data';

/** Named MariaDB lock: with several API instances only the one holding it sends. */
export const OUTBOX_LOCK = 'emberline.mail-outbox';
/** After this many failed attempts a message is marked `failed` and left for a person to look at. */
export const MAX_MAIL_ATTEMPTS = 8;
export const MAIL_RETRY_BASE_MS = 30_000;
export const MAIL_RETRY_CAP_MS = 60 * 60_000;
/** Header carrying the outbox row id, so a message delivered twice can be recognised. */
export const OUTBOX_ID_HEADER = 'X-Emberline-Outbox-Id';

const SUBJECT_MAX = 300;
const LAST_ERROR_MAX = 500;

export interface OutgoingMail {
  from: string;
  to: string;
  subject: string;
  text: string;
  html: string;
  messageId: string;
  headers: Record<string, string>;
  /** Only present when the message carries files (nodemailer's attachment shape). */
  attachments?: { filename: string; contentType: string; content: string; encoding: 'base64' }[];
}

/** The part of a nodemailer transport the outbox uses (tests may pass a stand-in). */
export interface MailTransport {
  sendMail(mail: OutgoingMail): Promise<{ messageId?: string }>;
}

export interface EnqueueMail<T extends MailTemplate> {
  to: string;
  template: T;
  locale: string;
  data: MailTemplateData[T];
  /** Files to send along, e.g. the calendar invitation of a booking confirmation. */
  attachments?: MailAttachment[];
}

const fitSubject = (subject: string) => (subject.length > SUBJECT_MAX ? `${subject.slice(0, SUBJECT_MAX - 1)}…` : subject);
/** What a sealed value is bound to: moved to another row or address, it no longer opens. */
const sealContext = (row: Pick<MailOutboxEntity, 'id' | 'to'>) => `${row.id}\n${row.to}`;

/**
 * Renders the message and inserts it into the outbox with `manager`, the caller's transaction,
 * so the mail exists exactly when the business change it reports commits. Link tokens are
 * redacted in everything stored in the clear (the mail log shows it to network admins); their
 * real values are sealed with the data source's mail key until the message is sent.
 */
export async function enqueueMail<T extends MailTemplate>(manager: EntityManager, mail: EnqueueMail<T>): Promise<MailOutboxEntity> {
  const locale = resolveMailLocale(mail.locale);
  const { shown, secret } = splitSecretData(mail.data as unknown as Record<string, unknown>);
  const rendered = renderMail(mail.template, locale, shown as unknown as MailTemplateData[T]);
  const id = randomUUID();
  const now = new Date();
  const row = manager.create(MailOutboxEntity, {
    id,
    to: mail.to,
    template: mail.template,
    locale,
    subject: fitSubject(rendered.subject),
    text: rendered.text,
    html: rendered.html,
    attachments: mail.attachments?.length ? mail.attachments : null,
    templateData: shown as MailTemplateValues,
    secretData: secret ? sealSecretData(mailSecretKeyOf(manager), sealContext({ id, to: mail.to }), secret) : null,
    status: 'pending',
    attempts: 0,
    nextAttemptAt: now,
    lastError: null,
    messageId: null,
    sentAt: null,
    createdAt: now,
  });
  await manager.insert(MailOutboxEntity, row);
  mailQueued(manager);
  return row;
}

/**
 * The message as it is sent: rows with sealed link tokens are rendered again with the real
 * values; others go out as stored. Throws MailSecretError when the seal does not open.
 */
export function outgoingContent(row: MailOutboxEntity, key: Buffer | null): RenderedMail {
  if (!row.secretData) return { subject: row.subject, text: row.text, html: row.html };
  if (!key) throw new MailSecretError('No mail secret key to open the message’s links with');
  const data = { ...row.templateData, ...openSecretData(key, sealContext(row), row.secretData) };
  const rendered = renderMail(row.template as MailTemplate, row.locale, data as unknown as MailTemplateData[MailTemplate]);
  return { ...rendered, subject: fitSubject(rendered.subject) };
}

/**
 * Once a message is sent or given up on, its sealed tokens are dropped; rows queued before tokens
 * were redacted (no template data) have their stored text redacted then.
 */
function forgetSecrets(row: MailOutboxEntity): Partial<Pick<MailOutboxEntity, 'secretData' | 'subject' | 'text' | 'html'>> {
  return row.templateData ? { secretData: null } : { secretData: null, subject: redactSecrets(row.subject), text: redactSecrets(row.text), html: redactSecrets(row.html) };
}

/**
 * Wait before the next attempt after `attempts` failed ones: 30 s × 2^(attempts − 1), capped at
 * 1 h, i.e. 30 s, 1 min, 2, 4, 8, 16, 32 min. With 8 attempts a message keeps trying for about
 * 63 minutes before it is marked `failed`.
 */
export function mailRetryDelayMs(attempts: number): number {
  return Math.min(MAIL_RETRY_BASE_MS * 2 ** Math.max(0, attempts - 1), MAIL_RETRY_CAP_MS);
}

/** Errors that say the SMTP server is unreachable, rather than that it refused this one message. */
const TRANSPORT_DOWN = new Set(['ECONNECTION', 'ETIMEDOUT', 'ESOCKET', 'EDNS', 'ETLS', 'EAUTH', 'ENOAUTH', 'EPROXY', 'ECONNREFUSED', 'ECONNRESET', 'EHOSTUNREACH']);

/** A short, storable error text with any credentials in URLs, AUTH exchanges or links removed. */
export function describeMailError(err: unknown): string {
  const e = err as { code?: unknown; responseCode?: unknown; message?: unknown };
  const code = typeof e?.code === 'string' ? e.code : null;
  const responseCode = typeof e?.responseCode === 'number' ? e.responseCode : null;
  const message = typeof e?.message === 'string' ? e.message : String(err);
  const text = redactSecrets([code, responseCode, message].filter((x) => x !== null && x !== '').join(': '))
    .replace(/([a-z][a-z0-9+.-]*:\/\/)[^\s/@]*@/gi, '$1[redacted]@')
    .replace(/(AUTH\s+\S+)\s+\S+/gi, '$1 [redacted]')
    .replace(/\s+/g, ' ')
    .trim();
  return text.length > LAST_ERROR_MAX ? `${text.slice(0, LAST_ERROR_MAX - 1)}…` : text;
}

/** The domain of the From address, used for Message-IDs (falls back to an unroutable one). */
function messageIdDomain(from: string): string {
  return /@([A-Za-z0-9.-]+)>?\s*$/.exec(from)?.[1] ?? 'emberline.invalid';
}

export interface ProcessOutboxOptions {
  dataSource: DataSource;
  transport: MailTransport;
  /** From header, e.g. "Emberline <no-reply@emberline.example>". */
  from: string;
  /** The run's clock: which rows are due, and the base of the next backoff. */
  now?: Date;
  batchSize?: number;
  logger?: Logger;
}

export interface ProcessOutboxResult {
  sent: number;
  retried: number;
  failed: number;
  /** True when another process held the outbox lock, so this run did nothing. */
  skipped: boolean;
}

/**
 * Sends the due messages once. Holds `GET_LOCK` on one dedicated connection for the whole run so
 * that, across API instances, exactly one process sends; the lock dies with the connection if the
 * process does.
 */
export async function processOutbox(options: ProcessOutboxOptions): Promise<ProcessOutboxResult> {
  const { dataSource, transport, from, logger } = options;
  const now = options.now ?? new Date();
  const batchSize = options.batchSize ?? 50;
  const result: ProcessOutboxResult = { sent: 0, retried: 0, failed: 0, skipped: false };
  const runner = dataSource.createQueryRunner();
  let locked = false;
  try {
    await runner.connect();
    const rows: { locked: number | string | null }[] = await runner.query('SELECT GET_LOCK(?, 0) AS locked', [OUTBOX_LOCK]);
    locked = Number(rows[0]?.locked) === 1;
    if (!locked) return { ...result, skipped: true };

    const due = await runner.manager.find(MailOutboxEntity, {
      where: { status: 'pending', nextAttemptAt: LessThanOrEqual(now) },
      order: { createdAt: 'ASC', id: 'ASC' },
      take: batchSize,
    });
    const domain = messageIdDomain(from);
    const key = due.some((row) => row.secretData) ? secretKeyOrNull(dataSource) : null;
    for (const row of due) {
      const messageId = `<${row.id}@${domain}>`;
      const attempts = row.attempts + 1;
      let content: RenderedMail;
      try {
        content = outgoingContent(row, key);
      } catch (err) {
        // sealed under another server secret (or none here): no retry can send working links
        const lastError = describeMailError(err);
        await runner.manager.update(MailOutboxEntity, { id: row.id }, { status: 'failed', attempts, lastError, ...forgetSecrets(row) });
        result.failed++;
        logger?.error({ outboxId: row.id, template: row.template, error: lastError }, 'gave up sending an e-mail whose links cannot be opened');
        continue;
      }
      try {
        const info = await transport.sendMail({
          from,
          to: row.to,
          subject: content.subject,
          text: content.text,
          html: content.html,
          messageId,
          headers: { [OUTBOX_ID_HEADER]: row.id },
          ...(row.attachments?.length ? { attachments: row.attachments.map((a) => ({ ...a, encoding: 'base64' as const })) } : {}),
        });
        await runner.manager.update(MailOutboxEntity, { id: row.id }, { status: 'sent', attempts, sentAt: now, messageId: info.messageId ?? messageId, lastError: null, ...forgetSecrets(row) });
        result.sent++;
      } catch (err) {
        const lastError = describeMailError(err);
        if (attempts >= MAX_MAIL_ATTEMPTS) {
          await runner.manager.update(MailOutboxEntity, { id: row.id }, { status: 'failed', attempts, lastError, ...forgetSecrets(row) });
          result.failed++;
          logger?.error({ outboxId: row.id, template: row.template, attempts, error: lastError }, 'gave up sending an e-mail');
        } else {
          const nextAttemptAt = new Date(now.getTime() + mailRetryDelayMs(attempts));
          await runner.manager.update(MailOutboxEntity, { id: row.id }, { attempts, nextAttemptAt, lastError });
          result.retried++;
          logger?.warn({ outboxId: row.id, template: row.template, attempts, nextAttemptAt, error: lastError }, 'sending an e-mail failed, will retry');
        }
        // with the server unreachable every further message would wait for the same timeout;
        // they stay due and are tried on the next run
        const code = (err as { code?: unknown })?.code;
        if (typeof code === 'string' && TRANSPORT_DOWN.has(code)) break;
      }
    }
    return result;
  } finally {
    if (locked) {
      // released before the connection goes back to the pool, where it would otherwise keep the lock
      await runner.query('SELECT RELEASE_LOCK(?)', [OUTBOX_LOCK]).catch((err: unknown) => {
        logger?.warn({ error: describeMailError(err) }, 'could not release the mail outbox lock');
      });
    }
    await runner.release();
  }
}

function secretKeyOrNull(dataSource: DataSource): Buffer | null {
  try {
    return mailSecretKeyOf(dataSource);
  } catch {
    return null;
  }
}

/**
 * A nodemailer SMTP transport for `smtpUrl` (smtp:// or smtps://, credentials in the URL). Short
 * timeouts so that an unreachable server fails the attempt quickly instead of stalling the job.
 */
export function createMailTransport(smtpUrl: string): MailTransport & { close(): void } {
  return createTransport({
    url: smtpUrl,
    connectionTimeout: 5_000,
    greetingTimeout: 5_000,
    dnsTimeout: 5_000,
    socketTimeout: 20_000,
  });
}
