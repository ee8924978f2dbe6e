// Public Directory routes for partners.
import { z } from 'zod';
import { PublicPartnerSchema } from '@emberline/domain';
import type { AppContext } from '../app';
import type { ApiRouter } from '../lib/api-router';
import { partnersController } from '../controllers/partners.controller';

export function registerPartnerRoutes(api: ApiRouter, app: AppContext): void {
  const c = partnersController(app);
  api.route(
    {
      method: 'get',
      path: '/partners',
      summary: 'Approved partners with their base, service area and capabilities',
      tags: ['Directory'],
      response: z.object({ data: z.array(PublicPartnerSchema) }),
    },
    c.list,
  );
}
