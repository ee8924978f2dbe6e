// Public Directory routes for partners.
import { z } from 'zod';
import { IdSchema, MAX_SLOT_SEARCH_DAYS, PartnerProfileSchema, PartnerSlotsSchema, PublicPartnerSchema, SLOT_LIST_LIMIT, SlotsQuerySchema } from '@emberline/domain';
import type { AppContext } from '../app-context';
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
  api.route(
    {
      method: 'get',
      path: '/partners/:partnerId',
      summary: 'The public profile of an approved partner',
      description:
        'Offers with labour, parts-kit total and duration (net, in the offer\'s currency), equipment, travel policy, and the weekly hours of the technicians on any offer (their union, in the first technician\'s time zone). A partner that is not approved is 404. Ratings and reviews arrive with bookings.',
      tags: ['Directory'],
      params: z.object({ partnerId: IdSchema }),
      response: z.object({ data: PartnerProfileSchema }),
      problems: [404],
    },
    c.profile,
  );
  api.route(
    {
      method: 'get',
      path: '/partners/:partnerId/slots',
      summary: 'Bookable start times of an approved partner for a service type at a place',
      description: `The place (\`lat\`, \`lng\`) must lie in the partner's service area (else 400 on both). Searches \`days\` local days (1–${MAX_SLOT_SEARCH_DAYS}) from \`from\` (default now) for the technicians assigned to the partner's offer; each list holds at most ${SLOT_LIST_LIMIT} slots. A partner that is not approved is 404.`,
      tags: ['Directory'],
      params: z.object({ partnerId: IdSchema }),
      query: SlotsQuerySchema,
      response: z.object({ data: PartnerSlotsSchema }),
      problems: [404],
    },
    c.slots,
  );
}
