// Health route for load balancers, the start script and people.
import { HealthResponseSchema } from '@emberline/domain';
import type { AppDeps } from '../app-context';
import type { ApiRouter } from '../lib/api-router';
import { healthController } from '../controllers/health.controller';

export function registerHealthRoutes(api: ApiRouter, deps: AppDeps): void {
  const c = healthController(deps);
  api.route(
    {
      method: 'get',
      path: '/health',
      summary: 'Database connectivity and pending migrations',
      description: 'Answers 200 when the database answers and every migration has run, 503 with the same body otherwise.',
      tags: ['Operations'],
      response: HealthResponseSchema,
      problems: [503],
    },
    c.getHealth,
  );
}
