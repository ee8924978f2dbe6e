// Password-guessing throttle in MariaDB (so it holds across API instances): growing pauses per
// address and client IP, and a failure count per address that may lock the account (auth.service).
import { createHash } from 'node:crypto';
import type { EntityManager } from 'typeorm';
import { createError } from '../lib/errors';

/** Failed passwords one IP may try on one address before pauses begin. */
export const FREE_FAILURES = 5;
export const FIRST_PAUSE_SECONDS = 60;
export const LONGEST_PAUSE_SECONDS = 60 * 60;
/** A day without failures and an address or address+IP pair starts afresh. */
export const FORGET_AFTER_HOURS = 24;

export const SignInPaused = createError('SIGN_IN_PAUSED', 429, 'Too many failed sign-ins');

/** The pause after an address+IP pair's `failures`-th failure: none at first, then doubling up to an hour. */
export function pauseSeconds(failures: number): number {
  if (failures < FREE_FAILURES) return 0;
  return Math.min(FIRST_PAUSE_SECONDS * 2 ** (failures - FREE_FAILURES), LONGEST_PAUSE_SECONDS);
}

export interface ThrottleKeys {
  pair: Buffer;
  address: Buffer;
}

const sha256 = (text: string) => createHash('sha256').update(text, 'utf8').digest();

/** Keys from the address as typed (known or not, so both are throttled alike) and the client IP. */
export function throttleKeys(email: string, ip: string | null | undefined): ThrottleKeys {
  const address = email.trim().toLowerCase();
  return { pair: sha256(`pair\n${address}\n${ip ?? 'no-ip'}`), address: sha256(`address\n${address}`) };
}

type Row = { key_hash: Buffer; failures: number; blocked_until: Date | null };

const DEADLOCK = 1213;
const LOCK_WAIT_TIMEOUT = 1205;

/** Attempts on one address race for the same rows; InnoDB may pick one to retry. */
async function retryingDeadlocks<T>(work: () => Promise<T>): Promise<T> {
  for (let attempt = 1; ; attempt++) {
    try {
      return await work();
    } catch (error) {
      const errno = (error as { errno?: number; driverError?: { errno?: number } }).driverError?.errno ?? (error as { errno?: number }).errno;
      if (attempt >= 3 || (errno !== DEADLOCK && errno !== LOCK_WAIT_TIMEOUT)) throw error;
    }
  }
}

/**
 * Counts this attempt as a failure before the password is checked, so parallel guesses cannot
 * slip past the pause, and starts the pause the count calls for; `passwordAccepted` takes the
 * attempt back. Throws SignInPaused while the pair waits (without counting). Runs in its own
 * transaction on `manager`'s data source: the caller's transaction may roll back, the count must
 * stay. Returns the address's failures in the last day, this attempt included.
 */
export async function beginPasswordAttempt(manager: EntityManager, keys: ThrottleKeys, now = new Date()): Promise<{ addressFailures: number }> {
  const forgetBefore = new Date(now.getTime() - FORGET_AFTER_HOURS * 3_600_000);
  type Outcome = { waitSeconds: number } | { addressFailures: number };
  const outcome = await retryingDeadlocks(() => manager.connection.transaction(async (m): Promise<Outcome> => {
    // a paused row is left as it is; otherwise one more failure (or the first of a fresh day)
    await m.query(
      `INSERT INTO sign_in_throttle (key_hash, failures, last_failure_at, blocked_until) VALUES (?, 1, ?, NULL)
       ON DUPLICATE KEY UPDATE
         failures = IF(blocked_until > VALUES(last_failure_at), failures, IF(last_failure_at < ?, 1, failures + 1)),
         last_failure_at = IF(blocked_until > VALUES(last_failure_at), last_failure_at, VALUES(last_failure_at))`,
      [keys.pair, now, forgetBefore],
    );
    const [pair] = (await m.query('SELECT key_hash, failures, blocked_until FROM sign_in_throttle WHERE key_hash = ?', [keys.pair])) as Row[];
    if (pair!.blocked_until && pair!.blocked_until.getTime() > now.getTime()) return { waitSeconds: (pair!.blocked_until.getTime() - now.getTime()) / 1000 };
    const pause = pauseSeconds(pair!.failures);
    if (pause > 0) await m.query('UPDATE sign_in_throttle SET blocked_until = ? WHERE key_hash = ?', [new Date(now.getTime() + pause * 1000), keys.pair]);
    await m.query(
      `INSERT INTO sign_in_throttle (key_hash, failures, last_failure_at, blocked_until) VALUES (?, 1, ?, NULL)
       ON DUPLICATE KEY UPDATE failures = IF(last_failure_at < ?, 1, failures + 1), last_failure_at = VALUES(last_failure_at)`,
      [keys.address, now, forgetBefore],
    );
    const [address] = (await m.query('SELECT failures FROM sign_in_throttle WHERE key_hash = ?', [keys.address])) as Row[];
    return { addressFailures: Number(address!.failures) };
  }));
  if ('waitSeconds' in outcome) {
    const minutes = Math.max(1, Math.ceil(outcome.waitSeconds / 60));
    const paused = SignInPaused(`Too many failed attempts from here: please wait ${minutes} minute(s) before you try again, or reset your password.`);
    paused.retryAfterSeconds = outcome.waitSeconds;
    throw paused;
  }
  return outcome;
}

/** The password was right: the pair starts afresh and the address's count drops this attempt. */
export async function passwordAccepted(manager: EntityManager, keys: ThrottleKeys): Promise<void> {
  await retryingDeadlocks(() =>
    manager.connection.transaction(async (m) => {
      await m.query('DELETE FROM sign_in_throttle WHERE key_hash = ?', [keys.pair]);
      await m.query('UPDATE sign_in_throttle SET failures = GREATEST(failures, 1) - 1 WHERE key_hash = ?', [keys.address]);
    }),
  );
}

/** After a password reset (the owner proved the address): the address and the resetting IP start afresh. */
export async function forgetFailures(manager: EntityManager, keys: ThrottleKeys): Promise<void> {
  await manager.query('DELETE FROM sign_in_throttle WHERE key_hash IN (?, ?)', [keys.pair, keys.address]);
}

/** Rows with nothing left to remember; called now and then, so the table stays small. */
export async function sweepThrottle(manager: EntityManager, now = new Date()): Promise<void> {
  const forgetBefore = new Date(now.getTime() - FORGET_AFTER_HOURS * 3_600_000);
  await manager.query('DELETE FROM sign_in_throttle WHERE last_failure_at < ? AND (blocked_until IS NULL OR blocked_until < ?) LIMIT 500', [forgetBefore, now]);
}
