// Health handler: 200 when the database answers and is fully migrated, 503 otherwise.
import type { Response } from 'express';
import type { AppDeps } from '../app-context';
import { checkHealth } from '../services/health.service';

export function healthController({ dataSource, version }: AppDeps) {
  return {
    getHealth: async ({ res }: { res: Response }) => {
      const health = await checkHealth(dataSource, version);
      res.status(health.status === 'ok' ? 200 : 503).set('cache-control', 'no-store');
      return { data: health };
    },
  };
}
