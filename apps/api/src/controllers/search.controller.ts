// Public Directory handlers for the search, places and coverage alerts; the network's coverage gaps.
import type { Request, Response } from 'express';
import type { CoverageAlertInput, SearchQuery } from '@emberline/domain';
import type { AppContext } from '../app-context';
import type { Actor } from '../lib/context';
import { resolveMailLocale } from '../mail/render';
import { createAlert, listGaps } from '../services/coverage.service';
import { findPlaces } from '../services/places.service';
import { search } from '../services/search.service';

export function searchController({ dataSource }: AppContext) {
  const read = (actor: Actor) => ({ manager: dataSource.manager, actor });
  return {
    search: async ({ query, actor, res }: { query: SearchQuery; actor: Actor; res: Response }) => {
      const t0 = performance.now();
      const result = await search(read(actor), query, new Date());
      // the handler's own time, for the browser's network panel and the benchmark
      res.setHeader('Server-Timing', `search;dur=${(performance.now() - t0).toFixed(2)}`);
      return result;
    },
    places: async ({ query }: { query: { q: string; limit: number } }) => ({ data: await findPlaces(query.q, query.limit) }),
    createAlert: async ({ body, actor, req }: { body: CoverageAlertInput; actor: Actor; req: Request }) => {
      const locale = resolveMailLocale(req.acceptsLanguages('en', 'de') || 'en');
      await dataSource.transaction((manager) => createAlert({ manager, actor }, body, { locale }));
      return { data: { accepted: true as const } };
    },
    gaps: async ({ query, actor }: { query: { days: number; serviceType?: string }; actor: Actor }) => listGaps(read(actor), query, new Date()),
  };
}
