// Builds both apps with Vite, skipping the build when dist/ is newer than every source file.
import { spawnSync } from 'node:child_process';
import { existsSync, readdirSync, statSync } from 'node:fs';
import path from 'node:path';
import { bin, root } from './project';
import { step } from './output';

const SOURCES = ['index.html', 'vite.config.ts', 'package-lock.json', 'public', 'apps/directory', 'apps/console', 'packages/ui', 'packages/api-client', 'packages/domain'];

function newest(p: string): number {
  if (!existsSync(p)) return 0;
  const s = statSync(p);
  if (!s.isDirectory()) return s.mtimeMs;
  let max = s.mtimeMs;
  for (const entry of readdirSync(p)) if (entry !== 'node_modules') max = Math.max(max, newest(path.join(p, entry)));
  return max;
}

export function buildApps(force = false): void {
  const stamp = path.join(root, 'dist/index.html');
  if (!force && existsSync(stamp) && existsSync(path.join(root, 'dist/apps/console/index.html'))) {
    const built = statSync(stamp).mtimeMs;
    if (SOURCES.every((s) => newest(path.join(root, s)) <= built)) {
      step('Apps are built and current (dist/)');
      return;
    }
  }
  step('Building the Directory and the Console (vite build)…');
  const r = spawnSync(bin('vite'), ['build', '--logLevel', 'warn'], { cwd: root, stdio: 'inherit' });
  if (r.status !== 0) throw new Error('vite build failed: see the messages above.');
}
