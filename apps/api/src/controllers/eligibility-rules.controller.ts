// Handlers for the vehicle rules: the public list, and network admins' changes.
import type { EntityManager } from 'typeorm';
import type { EligibilityRule } from '@emberline/domain';
import type { AppContext } from '../app-context';
import type { Actor } from '../lib/context';
import * as rules from '../services/eligibility-rules.service';
import { forgetSearchCatalogue } from '../services/search-catalogue';

export function eligibilityRulesController({ dataSource }: AppContext) {
  // the search reads the rules from memory: forget them once the change is committed
  const tx = async <T>(actor: Actor, fn: (ctx: { manager: EntityManager; actor: Actor }) => Promise<T>) => {
    const result = await dataSource.transaction((manager) => fn({ manager, actor }));
    forgetSearchCatalogue();
    return result;
  };
  return {
    // signed-in network admins also see the rules switched off, to switch them on again
    list: async ({ actor }: { actor: Actor }) => ({ data: await rules.listRules({ manager: dataSource.manager, actor }, { includeInactive: actor.roles.includes('network_admin') }) }),
    create: async ({ body, actor }: { body: EligibilityRule; actor: Actor }) => ({ data: await tx(actor, (ctx) => rules.createRule(ctx, body)) }),
    update: async ({ params, body, actor }: { params: { code: string }; body: EligibilityRule; actor: Actor }) => ({ data: await tx(actor, (ctx) => rules.updateRule(ctx, params.code, body)) }),
    remove: async ({ params, actor }: { params: { code: string }; actor: Actor }) => {
      await tx(actor, (ctx) => rules.deleteRule(ctx, params.code));
      return { data: { deleted: true as const } };
    },
  };
}
