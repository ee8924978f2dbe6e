// Public catalogue routes: service types and capabilities.
import { z } from 'zod';
import { CapabilityCategorySchema, CapabilityListSchema, CatalogueCodeSchema, ServiceTypeListSchema, ServiceTypeSchema } from '@emberline/domain';
import type { AppDeps } from '../app-context';
import type { ApiRouter } from '../lib/api-router';
import { catalogueController } from '../controllers/catalogue.controller';

export function registerCatalogueRoutes(api: ApiRouter, deps: AppDeps): void {
  const c = catalogueController(deps);
  api.route(
    {
      method: 'get',
      path: '/catalogue/service-types',
      summary: 'List the service types owners can book',
      tags: ['Catalogue'],
      response: ServiceTypeListSchema,
    },
    c.listServiceTypes,
  );
  api.route(
    {
      method: 'get',
      path: '/catalogue/service-types/:code',
      summary: 'One service type with its required capabilities and cautions',
      tags: ['Catalogue'],
      params: z.object({ code: CatalogueCodeSchema }),
      response: z.object({ data: ServiceTypeSchema }),
      problems: [404],
    },
    c.getServiceType,
  );
  api.route(
    {
      method: 'get',
      path: '/catalogue/capabilities',
      summary: 'List the equipment and skills partners can hold',
      tags: ['Catalogue'],
      query: z.object({ category: CapabilityCategorySchema.optional() }),
      response: CapabilityListSchema,
    },
    c.listCapabilities,
  );
}
