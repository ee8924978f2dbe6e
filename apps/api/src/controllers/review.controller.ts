// Network-admin handlers: the application review queue, reviews, decisions and the capability catalogue.
import type { EntityManager } from 'typeorm';
import type { z } from 'zod';
import type { CapabilityInputSchema, CapabilityPatchSchema, DecisionSchema, ReviewChecklist } from '@emberline/domain';
import type { AppContext } from '../app-context';
import type { Actor } from '../lib/context';
import * as catalogue from '../services/catalogue.service';
import { todayUtc } from '../services/onboarding.service';
import * as review from '../services/review.service';
import { forgetSearchCatalogue } from '../services/search-catalogue';

export function reviewController({ dataSource, config }: AppContext) {
  const tx = <T>(actor: Actor, fn: (ctx: { manager: EntityManager; actor: Actor }) => Promise<T>) => dataSource.transaction((manager) => fn({ manager, actor }));
  const read = (actor: Actor) => ({ manager: dataSource.manager, actor });
  return {
    list: async ({ query, actor }: { query: review.ApplicationFilter; actor: Actor }) => ({ data: await review.listApplications(read(actor), query) }),
    get: async ({ params, actor }: { params: { orgId: string }; actor: Actor }) => ({ data: await review.getReview(read(actor), params.orgId, todayUtc()) }),
    saveReview: async ({ params, body, actor }: { params: { orgId: string }; body: { checklist: ReviewChecklist; internalNotes: string }; actor: Actor }) => {
      await tx(actor, (ctx) => review.updateReview(ctx, params.orgId, body));
      return { data: await review.getReview(read(actor), params.orgId, todayUtc()) };
    },
    decide: async ({ params, body, actor }: { params: { orgId: string }; body: z.output<typeof DecisionSchema>; actor: Actor }) => {
      await tx(actor, (ctx) => review.decide(ctx, params.orgId, body, { publicUrl: config.publicUrl }));
      return { data: await review.getReview(read(actor), params.orgId, todayUtc()) };
    },
    listCapabilities: async ({ actor }: { actor: Actor }) => ({ data: await catalogue.listAllCapabilities(read(actor)) }),
    // the search keeps capability names in memory: forget them once a change is committed
    createCapability: async ({ body, actor }: { body: z.output<typeof CapabilityInputSchema>; actor: Actor }) => {
      const data = await tx(actor, (ctx) => catalogue.createCapability(ctx, body));
      forgetSearchCatalogue();
      return { data };
    },
    updateCapability: async ({ params, body, actor }: { params: { code: string }; body: z.output<typeof CapabilityPatchSchema>; actor: Actor }) => {
      const data = await tx(actor, (ctx) => catalogue.updateCapability(ctx, params.code, body));
      forgetSearchCatalogue();
      return { data };
    },
  };
}
