// Network-admin handlers: e-mail log and audit log.
import type { AppContext } from '../app-context';
import type { Actor } from '../lib/context';
import * as admin from '../services/admin.service';

export function adminController({ dataSource }: AppContext) {
  return {
    listMail: async ({ query, actor }: { query: { status?: 'pending' | 'sent' | 'failed'; to?: string; limit: number }; actor: Actor }) => ({
      data: await admin.listMail({ manager: dataSource.manager, actor }, query),
    }),
    listAudit: async ({ query, actor }: { query: { organisationId?: string; limit: number }; actor: Actor }) => ({
      data: await admin.listAudit({ manager: dataSource.manager, actor }, query),
    }),
  };
}
