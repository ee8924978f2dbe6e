// The payments fake's memory: objects in the provider's wire shape, kept in memory and, when a
// file is given, in one JSON file. A test double's state, never product data.
import { randomBytes } from 'node:crypto';
import { existsSync, readFileSync } from 'node:fs';
import { mkdir, rename, writeFile } from 'node:fs/promises';
import path from 'node:path';

/** A provider object as it goes over the wire; keys starting with "_" are the fake's own and never leave it. */
export type WireObject = Record<string, unknown> & { id: string; object: string };

export interface IdempotentResult {
  method: string;
  path: string;
  /** The raw form body of the first request, compared with every replay. */
  body: string;
  status: number;
  response: unknown;
  createdAt: number;
}

export interface WebhookDelivery {
  eventId: string;
  type: string;
  url: string;
  attempts: number;
  status: 'pending' | 'delivered' | 'failed';
  /** HTTP status of the last attempt, or null when the endpoint could not be reached. */
  lastStatus: number | null;
  lastError: string | null;
}

export interface RequestLogEntry {
  at: string;
  method: string;
  path: string;
  status: number;
  idempotencyKey: string | null;
  replayed: boolean;
}

export interface FakeState {
  version: 1;
  /** Seconds added to the wall clock, so tests can let sessions expire without waiting. */
  clockOffsetSeconds: number;
  customers: Record<string, WireObject>;
  checkoutSessions: Record<string, WireObject>;
  paymentIntents: Record<string, WireObject>;
  charges: Record<string, WireObject>;
  refunds: Record<string, WireObject>;
  accounts: Record<string, WireObject>;
  transfers: Record<string, WireObject>;
  balanceTransactions: Record<string, WireObject>;
  events: Record<string, WireObject>;
  idempotency: Record<string, IdempotentResult>;
  deliveries: WebhookDelivery[];
  requests: RequestLogEntry[];
}

export type Collection = Exclude<keyof FakeState, 'version' | 'clockOffsetSeconds' | 'idempotency' | 'deliveries' | 'requests'>;

export const COLLECTIONS: readonly Collection[] = [
  'customers',
  'checkoutSessions',
  'paymentIntents',
  'charges',
  'refunds',
  'accounts',
  'transfers',
  'balanceTransactions',
  'events',
];

export function emptyState(): FakeState {
  return {
    version: 1,
    clockOffsetSeconds: 0,
    customers: {},
    checkoutSessions: {},
    paymentIntents: {},
    charges: {},
    refunds: {},
    accounts: {},
    transfers: {},
    balanceTransactions: {},
    events: {},
    idempotency: {},
    deliveries: [],
    requests: [],
  };
}

const ALPHABET = 'abcdefghijklmnopqrstuvwxyzABCDEFGHIJKLMNOPQRSTUVWXYZ0123456789';

/** An id in the provider's style: a type prefix and 24 random letters and digits. */
export function newId(prefix: string): string {
  const bytes = randomBytes(24);
  let out = '';
  for (const b of bytes) out += ALPHABET[b % ALPHABET.length];
  return `${prefix}_${out}`;
}

/** A copy without the fake's own "_" keys: what the API answers and what events carry. */
export function toWire<T>(value: T): T {
  if (Array.isArray(value)) return value.map((v) => toWire(v)) as T;
  if (value && typeof value === 'object') {
    const out: Record<string, unknown> = {};
    for (const [k, v] of Object.entries(value)) if (!k.startsWith('_')) out[k] = toWire(v);
    return out as T;
  }
  return value;
}

export function loadState(file: string): FakeState {
  if (!existsSync(file)) return emptyState();
  try {
    const parsed = JSON.parse(readFileSync(file, 'utf8')) as Partial<FakeState>;
    if (parsed.version !== 1) throw new Error('unknown version');
    return { ...emptyState(), ...parsed };
  } catch (err) {
    throw new Error(`Cannot read the payments fake's state from ${file} (${(err as Error).message}); delete the file to start afresh`, { cause: err });
  }
}

/** Writes one snapshot at a time through a temporary file, so a crash never leaves half a file. */
export function createPersister(file: string | undefined, onError: (message: string) => void) {
  let writes = Promise.resolve();
  return {
    save(state: FakeState) {
      if (!file) return;
      const snapshot = JSON.stringify(state);
      writes = writes
        .then(async () => {
          await mkdir(path.dirname(file), { recursive: true });
          const tmp = `${file}.${process.pid}.tmp`;
          await writeFile(tmp, snapshot);
          await rename(tmp, file);
        })
        .catch((err: unknown) => onError(`could not save ${file}: ${(err as Error).message}`));
    },
    flushed: () => writes,
  };
}
