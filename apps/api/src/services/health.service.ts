// Health of the API and its database, for load balancers and the start script.
import type { DataSource } from 'typeorm';
import type { Health } from '@emberline/domain';
import { pendingMigrations } from '../db/data-source';

const startedAt = Date.now();

function withTimeout<T>(promise: Promise<T>, ms: number): Promise<T> {
  return Promise.race([
    promise,
    new Promise<never>((_, reject) => setTimeout(() => reject(new Error(`no answer within ${ms} ms`)), ms).unref()),
  ]);
}

export async function checkHealth(dataSource: DataSource, version: string): Promise<Health> {
  const base = { version, uptimeSeconds: Math.floor((Date.now() - startedAt) / 1000) };
  const t0 = performance.now();
  try {
    await withTimeout(dataSource.query('SELECT 1'), 2500);
    const latencyMs = Math.round((performance.now() - t0) * 10) / 10;
    const pending = await withTimeout(pendingMigrations(dataSource), 2500);
    return { ...base, status: pending.length ? 'degraded' : 'ok', database: { ok: true, latencyMs, pendingMigrations: pending.length } };
  } catch (err) {
    const code = (err as { code?: string }).code;
    return {
      ...base,
      status: 'degraded',
      database: { ok: false, latencyMs: null, pendingMigrations: null, error: code ? `database unreachable (${code})` : 'database unreachable' },
    };
  }
}
