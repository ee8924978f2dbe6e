// Password hashes: scrypt in libuv's thread pool (off the event loop), stored as a PHC string.
//
// OWASP's Password Storage Cheat Sheet: where Argon2id is not at hand, scrypt with N = 2^17,
// r = 8, p = 1 (128 MiB). Stored as `$scrypt$ln=17,r=8,p=1$<salt>$<key>` (PHC string format,
// unpadded base64), so the cost can rise later and old hashes still verify. Hashes from before
// (bcrypt, `$2a$`/`$2b$`) still verify, and `needsRehash` says to replace them.
import { randomBytes, scrypt, timingSafeEqual, type ScryptOptions } from 'node:crypto';
import { availableParallelism } from 'node:os';
import bcrypt from 'bcryptjs';

/** log2 of scrypt's N: OWASP's minimum, the default outside tests. */
export const DEFAULT_PASSWORD_HASH_COST = 17;
const BLOCK_SIZE = 8;
const PARALLELISM = 1;
const SALT_BYTES = 16;
const KEY_BYTES = 32;
// a stored string may not make one sign-in cost more than this (a tampered row would stall the pool)
const MAX_COST = 20;

/** Whatever `ln` says, scrypt needs 128·N·r bytes; Node refuses more than 32 MiB unless told (N = 2^17 needs 128 MiB). */
const maxmemFor = (N: number, r: number, p: number) => 128 * r * (N + p + 2);

/**
 * At most `slots` tasks at once, the rest wait in order. Hashes are given one core less than the
 * machine has (at least one): a burst of sign-ins then queues instead of taking every core, so
 * searches and the rest of the API stay responsive, and memory stays at slots × 128 MiB.
 */
export function createGate(slots: number) {
  let running = 0;
  const waiting: (() => void)[] = [];
  return async function run<T>(task: () => Promise<T>): Promise<T> {
    // a finished task hands its slot straight to the next waiting one, so no newcomer can jump in
    if (running >= slots) await new Promise<void>((resolve) => waiting.push(resolve));
    else running++;
    try {
      return await task();
    } finally {
      const next = waiting.shift();
      if (next) next();
      else running--;
    }
  };
}

const hashGate = createGate(Math.max(1, availableParallelism() - 1));

export function scryptKey(password: string | Buffer, salt: Buffer, keyBytes: number, o: { N: number; r: number; p: number }): Promise<Buffer> {
  const options: ScryptOptions = { N: o.N, r: o.r, p: o.p, maxmem: maxmemFor(o.N, o.r, o.p) };
  return hashGate(() => new Promise((resolve, reject) => scrypt(password, salt, keyBytes, options, (error, key) => (error ? reject(error) : resolve(key)))));
}

const b64 = (bytes: Buffer) => bytes.toString('base64').replace(/=+$/, '');

interface ScryptHash {
  ln: number;
  r: number;
  p: number;
  salt: Buffer;
  key: Buffer;
}

const PHC = /^\$scrypt\$ln=(\d{1,2}),r=(\d{1,2}),p=(\d{1,2})\$([A-Za-z0-9+/]+)\$([A-Za-z0-9+/]+)$/;

function parseScrypt(stored: string): ScryptHash | null {
  const m = PHC.exec(stored);
  if (!m) return null;
  const [ln, r, p] = [Number(m[1]), Number(m[2]), Number(m[3])];
  if (ln < 1 || ln > MAX_COST || r < 1 || r > BLOCK_SIZE || p < 1 || p > 4) return null;
  const key = Buffer.from(m[5]!, 'base64');
  return key.length >= 16 ? { ln, r, p, salt: Buffer.from(m[4]!, 'base64'), key } : null;
}

const isBcrypt = (stored: string) => /^\$2[aby]\$\d\d\$[./A-Za-z0-9]{53}$/.test(stored);

/** A new hash at 2^`cost` (scrypt's N) with a fresh salt. */
export async function hashPassword(password: string, cost: number): Promise<string> {
  const salt = randomBytes(SALT_BYTES);
  const key = await scryptKey(password, salt, KEY_BYTES, { N: 2 ** cost, r: BLOCK_SIZE, p: PARALLELISM });
  return `$scrypt$ln=${cost},r=${BLOCK_SIZE},p=${PARALLELISM}$${b64(salt)}$${b64(key)}`;
}

/** Whether `password` matches the stored hash (scrypt, or bcrypt from before); false for anything unreadable. */
export async function verifyPassword(password: string, stored: string): Promise<boolean> {
  const parsed = parseScrypt(stored);
  if (parsed) {
    const key = await scryptKey(password, parsed.salt, parsed.key.length, { N: 2 ** parsed.ln, r: parsed.r, p: parsed.p });
    return timingSafeEqual(key, parsed.key);
  }
  // bcryptjs works on the event loop; only accounts not signed in since the move still take this path
  if (isBcrypt(stored)) return bcrypt.compare(password, stored);
  return false;
}

/** True when the stored hash is not scrypt with today's parameters: replace it after a successful check. */
export function needsRehash(stored: string, cost: number): boolean {
  const parsed = parseScrypt(stored);
  return !parsed || parsed.ln !== cost || parsed.r !== BLOCK_SIZE || parsed.p !== PARALLELISM || parsed.key.length !== KEY_BYTES || parsed.salt.length !== SALT_BYTES;
}
