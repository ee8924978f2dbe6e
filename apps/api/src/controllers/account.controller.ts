// The signed-in user's own account.
import type { AppContext } from '../app-context';
import type { Actor } from '../lib/context';
import * as account from '../services/account.service';

export function accountController({ dataSource }: AppContext) {
  return {
    getMe: async ({ actor }: { actor: Actor }) => ({ data: await account.getMe({ manager: dataSource.manager, actor }) }),
    updateMe: async ({ body, actor }: { body: { name?: string; locale?: 'en' | 'de' }; actor: Actor }) => ({
      data: await dataSource.transaction((manager) => account.updateMe({ manager, actor }, body)),
    }),
  };
}
