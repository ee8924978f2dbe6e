// Builds the configured storage driver.
import type { Config } from '../config';
import { LocalDiskStorage } from './local-disk-storage';
import type { Storage } from './storage';

export { LocalDiskStorage };
export { StoredFileMissing, type Storage } from './storage';

export function createStorage(config: Pick<Config, 'STORAGE_DRIVER' | 'UPLOADS_DIR'>): Storage {
  switch (config.STORAGE_DRIVER) {
    case 'local':
      return new LocalDiskStorage(config.UPLOADS_DIR);
  }
}
