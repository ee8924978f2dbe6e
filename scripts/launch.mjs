#!/usr/bin/env node
// Entry for `npm start|test|dev|bench|migrate|seed|db:backup|db:restore`: installs npm packages when they are missing
// or stale (plain JavaScript because TypeScript tooling may not be installed yet), then hands
// over to the TypeScript script of the same name.
import { spawn, spawnSync } from 'node:child_process';
import { existsSync, statSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const command = process.argv[2];
const scripts = { start: 'start.ts', test: 'test.ts', dev: 'dev.ts', bench: 'bench.ts', migrate: 'db.ts', seed: 'db.ts', 'admin:create': 'admin-create.ts', 'db:backup': 'backup.ts', 'db:restore': 'backup.ts' };
if (!scripts[command]) {
  console.error(`Unknown command "${command}". Use one of: ${Object.keys(scripts).join(', ')}`);
  process.exit(2);
}

const [major, minor] = process.versions.node.split('.').map(Number);
if (major < 20 || (major === 20 && minor < 19)) {
  console.error(`Emberline needs Node.js 20.19 or newer; this is ${process.versions.node}.`);
  process.exit(2);
}

// a local .env (git-ignored) sets configuration for every command; see .env.example
if (existsSync(path.join(root, '.env'))) process.loadEnvFile(path.join(root, '.env'));

const marker = path.join(root, 'node_modules', '.package-lock.json');
const lock = path.join(root, 'package-lock.json');
const stale = !existsSync(marker) || !existsSync(path.join(root, 'node_modules/.bin/tsx')) || statSync(marker).mtimeMs < statSync(lock).mtimeMs;
if (stale) {
  console.log('▸ Installing npm packages (npm ci)…');
  const ci = spawnSync('npm', ['ci', '--no-audit', '--no-fund'], { cwd: root, stdio: 'inherit' });
  if (ci.status !== 0) {
    console.error('npm ci failed: see the messages above.');
    process.exit(ci.status ?? 1);
  }
}

const child = spawn(process.execPath, ['--import', 'tsx', path.join(root, 'scripts', scripts[command]), command, ...process.argv.slice(3)], {
  cwd: root,
  stdio: 'inherit',
});
for (const signal of ['SIGINT', 'SIGTERM', 'SIGHUP']) process.on(signal, () => child.kill(signal));
child.on('exit', (code, signal) => process.exit(code ?? (signal ? 1 : 0)));
