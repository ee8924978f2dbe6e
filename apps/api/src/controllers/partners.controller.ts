// Public Directory handlers for partners: approved organisations only.
import type { AppContext } from '../app';
import type { Actor } from '../lib/context';
import { listPublicPartners } from '../services/partners.service';

export function partnersController({ dataSource }: AppContext) {
  return {
    list: async ({ actor }: { actor: Actor }) => ({ data: await listPublicPartners({ manager: dataSource.manager, actor }) }),
  };
}
