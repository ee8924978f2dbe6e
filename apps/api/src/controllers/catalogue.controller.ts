// Catalogue handlers: take validated input, call the service, shape the response.
import type { CapabilityCategory } from '@emberline/domain';
import type { AppDeps } from '../app-context';
import { ANONYMOUS } from '../lib/context';
import * as catalogue from '../services/catalogue.service';

export function catalogueController({ dataSource }: AppDeps) {
  const ctx = () => ({ manager: dataSource.manager, actor: ANONYMOUS });
  return {
    listCapabilities: async ({ query }: { query: { category?: CapabilityCategory } }) => ({
      data: await catalogue.listCapabilities(ctx(), query),
    }),
    listServiceTypes: async () => ({ data: await catalogue.listServiceTypes(ctx()) }),
    getServiceType: async ({ params }: { params: { code: string } }) => ({ data: await catalogue.getServiceType(ctx(), params.code) }),
  };
}
