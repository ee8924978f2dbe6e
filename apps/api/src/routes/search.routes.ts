// Public Directory routes for the search, places and coverage alerts; the network admins' map of
// coverage gaps.
import { z } from 'zod';
import {
  CoverageAlertInputSchema,
  CoverageGapsQuerySchema,
  CoverageGapsSchema,
  MAX_SEARCH_RADIUS_KM,
  PlaceListSchema,
  PlaceQuerySchema,
  SEARCH_SLOT_DAYS,
  SearchQuerySchema,
  SearchResponseSchema,
} from '@emberline/domain';
import type { AppContext } from '../app-context';
import type { ApiRouter } from '../lib/api-router';
import { searchController } from '../controllers/search.controller';
import { COVERAGE_GAP_CELLS_MAX, COVERAGE_RETENTION_DAYS } from '../services/coverage.service';

export function registerSearchRoutes(api: ApiRouter, app: AppContext): void {
  const c = searchController(app);
  const tags = ['Directory'];
  api.route(
    {
      method: 'get',
      path: '/search',
      summary: 'Approved partners who can do a service for this vehicle at this place',
      description: [
        'The vehicle fields are checked against the active eligibility rules first: a service that does not fit the vehicle answers no results, with `meta.eligibility` saying why (and what to book instead).',
        `Otherwise a partner is listed when it offers the service, holds every capability the service and the rules require, and either comes to the place (inside its radius, with a travel policy in the offer's currency and the road distance within its reach; \`jobAt: owner\`, with the travel fee) or has a workshop within \`radiusKm\` of the place (\`jobAt: workshop\`, no travel fee). \`mode\` keeps one kind only; with \`any\` a partner doing both comes to the owner when it can. Partners further than ${MAX_SEARCH_RADIUS_KM} km are never candidates.`,
        `Prices are net, in the partner's currency: labour + parts kit + travel fee. \`durationMinutes\` adds the rules' extra minutes. \`nextSlot\` is the first free start in the next ${SEARCH_SLOT_DAYS} days (on \`date\` when given, in the partner's local date). \`meta.total\` counts the results before \`limit\`.`,
        'When nobody covers the place for this service and vehicle, `meta.nearestOutside` lists the nearest partners offering it and the search is recorded anonymously as a coverage gap (only a ~10 km cell, the service and a rough vehicle class; `meta.gapRecorded`). A search emptied only by the price or date filters, or by the mode, is not a gap. The handler time is in the `Server-Timing` header.',
      ].join('\n\n'),
      tags,
      query: SearchQuerySchema,
      response: SearchResponseSchema,
      before: app.limiters.search,
    },
    c.search,
  );
  api.route(
    {
      method: 'get',
      path: '/places',
      summary: 'Places whose name starts with the typed text',
      description:
        'Cities and towns of 1,000 or more inhabitants from GeoNames (CC BY 4.0), matched on a prefix of their name (or a common local name) regardless of case and accents; a whole-name match first, then the largest. The index is built on the first call.',
      tags,
      query: PlaceQuerySchema,
      response: PlaceListSchema,
      before: app.limiters.places,
    },
    c.places,
  );
  api.route(
    {
      method: 'post',
      path: '/coverage-alerts',
      summary: 'Ask to be told by e-mail when a partner covers this place for this service',
      description: `Stores the address with the ~10 km cell of the place (never the place) and sends a confirmation. The answer is the same whether or not the address already waits for this cell and service. The address is deleted once the owner has been told, or after ${COVERAGE_RETENTION_DAYS} days.`,
      tags,
      body: CoverageAlertInputSchema,
      response: z.object({ data: z.object({ accepted: z.literal(true) }) }),
      status: 202,
      before: app.limiters.coverageAlert,
    },
    c.createAlert,
  );
  api.route(
    {
      method: 'get',
      path: '/admin/coverage-gaps',
      summary: 'Searches nobody could answer, per ~10 km cell and service, with the owners waiting there',
      description: `Cells searched in the last \`days\` days, newest first (at most ${COVERAGE_GAP_CELLS_MAX}); \`alerts\` counts the owners still waiting for an e-mail for that cell and service.`,
      tags: ['Network admin'],
      roles: ['network_admin'],
      query: CoverageGapsQuerySchema,
      response: CoverageGapsSchema,
    },
    c.gaps,
  );
}
