// The local-disk storage driver: files under one root directory, named by random keys only,
// written to a temporary name first so a crash never leaves half a file under a real key.
import { randomUUID } from 'node:crypto';
import { createReadStream } from 'node:fs';
import { mkdir, rename, rm, writeFile } from 'node:fs/promises';
import path from 'node:path';
import type { Readable } from 'node:stream';
import { StoredFileMissing, type Storage } from './storage';

/** Keys are ours (UUIDs); anything else could be an attempt to leave the root. */
const KEY = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/;

export class LocalDiskStorage implements Storage {
  constructor(readonly root: string) {}

  private pathOf(key: string): string {
    if (!KEY.test(key)) throw new StoredFileMissing(`Not a storage key: ${key.slice(0, 80)}`);
    // two-level fan-out keeps directories small
    return path.join(this.root, key.slice(0, 2), key);
  }

  async put(data: Buffer): Promise<string> {
    const key = randomUUID();
    const target = this.pathOf(key);
    await mkdir(path.dirname(target), { recursive: true, mode: 0o700 });
    const temporary = `${target}.${process.pid}.part`;
    try {
      await writeFile(temporary, data, { mode: 0o600, flag: 'wx' });
      await rename(temporary, target);
    } catch (err) {
      await rm(temporary, { force: true });
      throw err;
    }
    return key;
  }

  get(key: string): Promise<Readable> {
    return new Promise((resolve, reject) => {
      let stream: Readable;
      try {
        stream = createReadStream(this.pathOf(key));
      } catch (err) {
        return reject(err);
      }
      // resolve only once the file is open, so a missing file fails before any header is sent
      stream.once('open', () => resolve(stream));
      stream.once('error', (err: NodeJS.ErrnoException) => reject(err.code === 'ENOENT' ? new StoredFileMissing(`No stored file ${key}`) : err));
    });
  }

  async delete(key: string): Promise<void> {
    await rm(this.pathOf(key), { force: true });
  }
}
