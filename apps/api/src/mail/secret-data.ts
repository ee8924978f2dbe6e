// One-time link tokens in e-mails: redacted wherever a message is stored or shown, sealed until sent.
import { createCipheriv, createDecipheriv, hkdfSync, randomBytes } from 'node:crypto';
import type { DataSource, EntityManager } from 'typeorm';
import { redactSecrets } from '../lib/redact';

/**
 * Splits template data into what may be stored and shown (every secret redacted) and the original
 * values of the fields that held a secret, or null when none did.
 */
export function splitSecretData(data: Record<string, unknown>): { shown: Record<string, unknown>; secret: Record<string, string> | null } {
  const shown: Record<string, unknown> = {};
  const secret: Record<string, string> = {};
  for (const [key, value] of Object.entries(data)) {
    const redacted = typeof value === 'string' ? redactSecrets(value) : value;
    if (redacted !== value) secret[key] = value as string;
    shown[key] = redacted;
  }
  return { shown, secret: Object.keys(secret).length ? secret : null };
}

const KEY_INFO = 'emberline mail-outbox secret data v1';
const SEALED_PREFIX = 'v1.';
const IV_BYTES = 12;
const TAG_BYTES = 16;

/** The AES-256 key for sealed mail data, derived (HKDF-SHA256) from the server's secret. */
export function mailSecretKey(serverSecret: string): Buffer {
  return Buffer.from(hkdfSync('sha256', Buffer.from(serverSecret, 'utf8'), Buffer.alloc(0), KEY_INFO, 32));
}

export class MailSecretError extends Error {
  override name = 'MailSecretError';
}

/**
 * AES-256-GCM with `context` (the row's id and recipient) as associated data, so a sealed value
 * copied into another row, e.g. one addressed to someone else, does not open.
 */
export function sealSecretData(key: Buffer, context: string, secret: Record<string, string>): string {
  const iv = randomBytes(IV_BYTES);
  const cipher = createCipheriv('aes-256-gcm', key, iv);
  cipher.setAAD(Buffer.from(context, 'utf8'));
  const body = Buffer.concat([cipher.update(JSON.stringify(secret), 'utf8'), cipher.final()]);
  return SEALED_PREFIX + Buffer.concat([iv, cipher.getAuthTag(), body]).toString('base64url');
}

export function openSecretData(key: Buffer, context: string, sealed: string): Record<string, string> {
  if (!sealed.startsWith(SEALED_PREFIX)) throw new MailSecretError('Unknown format of sealed mail data');
  const raw = Buffer.from(sealed.slice(SEALED_PREFIX.length), 'base64url');
  try {
    const decipher = createDecipheriv('aes-256-gcm', key, raw.subarray(0, IV_BYTES));
    decipher.setAAD(Buffer.from(context, 'utf8'));
    decipher.setAuthTag(raw.subarray(IV_BYTES, IV_BYTES + TAG_BYTES));
    const plain = Buffer.concat([decipher.update(raw.subarray(IV_BYTES + TAG_BYTES)), decipher.final()]).toString('utf8');
    return JSON.parse(plain) as Record<string, string>;
  } catch {
    // the usual cause: the server secret changed between queueing and sending
    throw new MailSecretError('The sealed mail data could not be opened with the current server secret');
  }
}

// enqueueMail is called from many services with only an EntityManager, so the key travels with
// the data source their managers belong to rather than through every caller
const keys = new WeakMap<DataSource, Buffer>();

/** Lets mail queued or sent through `dataSource` seal and open link tokens with `serverSecret`. */
export function useMailSecretKey(dataSource: DataSource, serverSecret: string): void {
  keys.set(dataSource, mailSecretKey(serverSecret));
}

export function mailSecretKeyOf(source: DataSource | EntityManager): Buffer {
  const dataSource = 'dataSource' in source ? source.dataSource : source;
  const key = keys.get(dataSource);
  if (!key) throw new MailSecretError('No mail secret key for this data source: call useMailSecretKey first');
  return key;
}
