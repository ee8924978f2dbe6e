// Where uploaded files live, behind one small interface so the driver is a matter of
// configuration (local disk today, S3-compatible storage later).
import type { Readable } from 'node:stream';

export class StoredFileMissing extends Error {
  override name = 'StoredFileMissing';
}

export interface Storage {
  /** Stores the bytes under a new random key and returns the key. */
  put(data: Buffer): Promise<string>;
  /** Opens a stored file for reading; rejects with StoredFileMissing when there is none. */
  get(key: string): Promise<Readable>;
  /** Removes a stored file; removing one that is not there is not an error. */
  delete(key: string): Promise<void>;
}
