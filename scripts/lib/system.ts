// Installs what the project needs from Debian's packages when it is missing.
import { existsSync } from 'node:fs';
import { spawnSync } from 'node:child_process';
import { step } from './output';

export interface SystemNeed {
  /** A file whose presence means the need is met. */
  binary: string;
  packages: string[];
  what: string;
}

export const MARIADB: SystemNeed = { binary: '/usr/sbin/mariadbd', packages: ['mariadb-server', 'mariadb-client'], what: 'MariaDB server' };
export const CHROMIUM: SystemNeed = { binary: '/usr/bin/chromium', packages: ['chromium'], what: 'Chromium for browser tests' };

export function ensureSystemPackages(needs: SystemNeed[]): void {
  const missing = needs.filter((n) => !existsSync(n.binary));
  if (!missing.length) return;
  const packages = missing.flatMap((n) => n.packages);
  step(`Installing ${missing.map((n) => n.what).join(' and ')} from Debian's packages (${packages.join(' ')})…`);
  if (process.getuid?.() !== 0) {
    throw new Error(`Missing ${packages.join(', ')}. Run as root, or install them first: apt-get install -y ${packages.join(' ')}`);
  }
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  const update = spawnSync('apt-get', ['update', '-qq'], { stdio: 'inherit', env });
  if (update.status !== 0) throw new Error('apt-get update failed: see the messages above.');
  const install = spawnSync('apt-get', ['install', '-y', '-qq', '--no-install-recommends', ...packages], { stdio: 'inherit', env });
  if (install.status !== 0) throw new Error(`apt-get install ${packages.join(' ')} failed: see the messages above.`);
  for (const n of missing) if (!existsSync(n.binary)) throw new Error(`${n.what} was installed but ${n.binary} is still missing.`);
}
