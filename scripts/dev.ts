// `npm run dev`: MariaDB, migrations and seed as in `npm start`, then the API in watch mode and
// Vite with hot reload for both apps (Directory at /, Console at /console/), proxying /api.
import { spawn, type ChildProcess } from 'node:child_process';
import path from 'node:path';
import { migrateAndSeed } from '../apps/api/src/db/migrate';
import { loadConfig } from '../apps/api/src/config';
import { ensureDatabase, startMariaDb } from './lib/mariadb';
import { failAndExit, ok, step } from './lib/output';
import { bin, dbEnv, devDatabase, root } from './lib/project';
import { ensureSystemPackages, MARIADB } from './lib/system';

try {
  ensureSystemPackages([MARIADB]);
  const settings = devDatabase();
  const env = { ...process.env, NODE_ENV: 'development', SERVE_APPS: 'false', ...dbEnv(settings) };
  const config = loadConfig(env);
  const db = await startMariaDb(settings.dir, settings.port);
  ensureDatabase(db, settings);
  await migrateAndSeed(config);
  ok(`MariaDB on 127.0.0.1:${settings.port}, migrated and seeded`);

  const children: ChildProcess[] = [
    spawn(bin('tsx'), ['watch', '--clear-screen=false', path.join(root, 'apps/api/src/server.ts')], { cwd: root, env, stdio: 'inherit' }),
    spawn(bin('vite'), [], { cwd: root, env: { ...env, EMBERLINE_API_URL: config.publicUrl }, stdio: 'inherit' }),
  ];
  step(`Directory http://127.0.0.1:${process.env.VITE_PORT ?? 5173}/  ·  Console http://127.0.0.1:${process.env.VITE_PORT ?? 5173}/console/  ·  API ${config.publicUrl}/api`);
  let stopping = false;
  const stop = async () => {
    if (stopping) return;
    stopping = true;
    for (const c of children) c.kill('SIGTERM');
    if (db.startedHere) await db.stop();
    process.exit(0);
  };
  for (const c of children) c.on('exit', () => void stop());
  process.on('SIGINT', () => void stop());
  process.on('SIGTERM', () => void stop());
} catch (err) {
  failAndExit((err as Error).message);
}
