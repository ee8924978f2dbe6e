// Handlers for an organisation's offers, parts, travel policy and working hours (org guard ran first).
import type { EntityManager } from 'typeorm';
import type { BookingSettingsInput, OfferInput, OfferPatch, PartInput, PartPatch, ServiceAreaInput, TravelPolicyInput, WorkingHoursDraft } from '@emberline/domain';
import type { AppContext } from '../app-context';
import type { Actor } from '../lib/context';
import * as offers from '../services/offers.service';
import { notifyCoverageAlerts } from '../services/coverage.service';

const DELETED = { deleted: true as const };

export function offersController({ dataSource, config }: AppContext) {
  const tx = <T>(actor: Actor, fn: (ctx: { manager: EntityManager; actor: Actor }) => Promise<T>) => dataSource.transaction((manager) => fn({ manager, actor }));
  const read = (actor: Actor) => ({ manager: dataSource.manager, actor });
  const meta = (actor: Actor) => ({ organisationId: actor.organisationId! });

  return {
    listOffers: async ({ actor }: { actor: Actor }) => ({ data: await offers.listOffers(read(actor)), meta: meta(actor) }),
    getOffer: async ({ params, actor }: { params: { offerId: string }; actor: Actor }) => ({ data: await offers.getOffer(read(actor), params.offerId) }),
    createOffer: async ({ body, actor }: { body: OfferInput; actor: Actor }) => ({
      data: await tx(actor, async (ctx) => {
        const offer = await offers.createOffer(ctx, body);
        // owners waiting for this service where the (approved) partner works hear about it now
        await notifyCoverageAlerts(ctx.manager, offer.organisationId, { publicUrl: config.publicUrl, serviceTypeCodes: [offer.serviceTypeCode] });
        return offer;
      }),
    }),
    updateOffer: async ({ params, body, actor }: { params: { offerId: string }; body: OfferPatch; actor: Actor }) => ({
      data: await tx(actor, (ctx) => offers.updateOffer(ctx, params.offerId, body)),
    }),
    deleteOffer: async ({ params, actor }: { params: { offerId: string }; actor: Actor }) => {
      await tx(actor, (ctx) => offers.deleteOffer(ctx, params.offerId));
      return { data: DELETED };
    },

    listParts: async ({ actor }: { actor: Actor }) => ({ data: await offers.listParts(read(actor)), meta: meta(actor) }),
    createPart: async ({ body, actor }: { body: PartInput; actor: Actor }) => ({ data: await tx(actor, (ctx) => offers.createPart(ctx, body)) }),
    updatePart: async ({ params, body, actor }: { params: { partId: string }; body: PartPatch; actor: Actor }) => ({
      data: await tx(actor, (ctx) => offers.updatePart(ctx, params.partId, body)),
    }),
    deletePart: async ({ params, actor }: { params: { partId: string }; actor: Actor }) => {
      await tx(actor, (ctx) => offers.deletePart(ctx, params.partId));
      return { data: DELETED };
    },

    getBookingSettings: async ({ actor }: { actor: Actor }) => ({ data: await offers.getBookingSettings(read(actor)) }),
    saveBookingSettings: async ({ body, actor }: { body: BookingSettingsInput; actor: Actor }) => ({ data: await tx(actor, (ctx) => offers.saveBookingSettings(ctx, body)) }),
    getTravelPolicy: async ({ actor }: { actor: Actor }) => ({ data: await offers.getTravelPolicy(read(actor)) }),
    saveTravelPolicy: async ({ body, actor }: { body: TravelPolicyInput; actor: Actor }) => ({ data: await tx(actor, (ctx) => offers.saveTravelPolicy(ctx, body)) }),

    getServiceArea: async ({ actor }: { actor: Actor }) => ({ data: await offers.getServiceArea(read(actor)) }),
    saveServiceArea: async ({ body, actor }: { body: ServiceAreaInput; actor: Actor }) => ({ data: await tx(actor, (ctx) => offers.saveServiceArea(ctx, body)) }),

    getHours: async ({ params, actor }: { params: { userId: string }; actor: Actor }) => ({ data: await offers.getHours(read(actor), params.userId) }),
    saveHours: async ({ params, body, actor }: { params: { userId: string }; body: WorkingHoursDraft; actor: Actor }) => ({
      data: await tx(actor, (ctx) => offers.saveHours(ctx, params.userId, body)),
    }),
  };
}
