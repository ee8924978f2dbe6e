// Public Directory handlers for partners: approved organisations only.
import type { AppContext } from '../app-context';
import type { Actor } from '../lib/context';
import type { SlotsQuery } from '@emberline/domain';
import { getPartnerProfile, listPublicPartners } from '../services/partners.service';
import { partnerSlots } from '../services/slots.service';

export function partnersController({ dataSource }: AppContext) {
  return {
    slots: async ({ params, query, actor }: { params: { partnerId: string }; query: SlotsQuery; actor: Actor }) => ({
      data: await partnerSlots({ manager: dataSource.manager, actor }, params.partnerId, query, new Date()),
    }),
    profile: async ({ params, actor }: { params: { partnerId: string }; actor: Actor }) => ({
      data: await getPartnerProfile({ manager: dataSource.manager, actor }, params.partnerId, new Date()),
    }),
    list: async ({ actor }: { actor: Actor }) => ({ data: await listPublicPartners({ manager: dataSource.manager, actor }) }),
  };
}
