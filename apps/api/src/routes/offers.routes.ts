// What an organisation sells, under /orgs/:orgId: offers, parts, booking settings, travel policy
// and technicians' working hours. Partner admins change them (technicians their own time off); the
// whole team and network admins read.
import { z } from 'zod';
import {
  BookingSettingsInputSchema,
  BookingSettingsSchema,
  IdSchema,
  OfferInputSchema,
  OfferPatchSchema,
  OfferSchema,
  PartInputSchema,
  PartPatchSchema,
  PartSchema,
  ServiceAreaInputSchema,
  ServiceAreaSchema,
  TechnicianHoursSchema,
  TravelPolicyInputSchema,
  TravelPolicySchema,
  WorkingHoursSchema,
} from '@emberline/domain';
import type { AppContext } from '../app-context';
import type { ApiRouter } from '../lib/api-router';
import { offersController } from '../controllers/offers.controller';

const OrgParams = z.object({ orgId: IdSchema });
const OfferParams = OrgParams.extend({ offerId: IdSchema });
const PartParams = OrgParams.extend({ partId: IdSchema });
const MemberParams = OrgParams.extend({ userId: IdSchema });
const ListMeta = z.object({ organisationId: IdSchema });
const Deleted = z.object({ data: z.object({ deleted: z.literal(true) }) });

export function registerOfferRoutes(api: ApiRouter, app: AppContext): void {
  const c = offersController(app);
  const readers = ['partner_admin', 'technician', 'network_admin'] as const;
  const read = { org: true, roles: [...readers] };
  const write = { org: true, roles: ['partner_admin' as const] };

  let tags = ['Offers'];
  api.route(
    { method: 'get', path: '/orgs/:orgId/offers', summary: 'The organisation\'s offers', tags, ...read, params: OrgParams, response: z.object({ data: z.array(OfferSchema), meta: ListMeta }) },
    c.listOffers,
  );
  api.route(
    {
      method: 'post',
      path: '/orgs/:orgId/offers',
      summary: 'Offer a service type',
      description:
        'The organisation must hold every capability the service type requires (else 400 on `serviceTypeCode` naming what is missing); technicians must be members and parts the organisation\'s own, in the offer\'s currency. One offer per service type (409 OFFER_EXISTS).',
      tags,
      ...write,
      params: OrgParams,
      body: OfferInputSchema,
      response: z.object({ data: OfferSchema }),
      status: 201,
      problems: [409],
    },
    c.createOffer,
  );
  api.route({ method: 'get', path: '/orgs/:orgId/offers/:offerId', summary: 'One offer', tags, ...read, params: OfferParams, response: z.object({ data: OfferSchema }) }, c.getOffer);
  api.route(
    {
      method: 'patch',
      path: '/orgs/:orgId/offers/:offerId',
      summary: 'Change an offer',
      description: 'Lists given replace the technicians or the parts kit as a whole; the service type cannot change.',
      tags,
      ...write,
      params: OfferParams,
      body: OfferPatchSchema,
      response: z.object({ data: OfferSchema }),
    },
    c.updateOffer,
  );
  api.route({ method: 'delete', path: '/orgs/:orgId/offers/:offerId', summary: 'Withdraw an offer', tags, ...write, params: OfferParams, response: Deleted }, c.deleteOffer);

  tags = ['Parts'];
  api.route(
    { method: 'get', path: '/orgs/:orgId/parts', summary: 'The organisation\'s parts', tags, ...read, params: OrgParams, response: z.object({ data: z.array(PartSchema), meta: ListMeta }) },
    c.listParts,
  );
  api.route(
    { method: 'post', path: '/orgs/:orgId/parts', summary: 'Add a part', tags, ...write, params: OrgParams, body: PartInputSchema, response: z.object({ data: PartSchema }), status: 201 },
    c.createPart,
  );
  api.route(
    { method: 'patch', path: '/orgs/:orgId/parts/:partId', summary: 'Change a part', tags, ...write, params: PartParams, body: PartPatchSchema, response: z.object({ data: PartSchema }) },
    c.updatePart,
  );
  api.route(
    { method: 'delete', path: '/orgs/:orgId/parts/:partId', summary: 'Delete a part that is in no parts kit', tags, ...write, params: PartParams, response: Deleted, problems: [409] },
    c.deletePart,
  );

  tags = ['Booking settings'];
  api.route(
    { method: 'get', path: '/orgs/:orgId/booking-settings', summary: 'How the organisation takes bookings', tags, ...read, params: OrgParams, response: z.object({ data: BookingSettingsSchema }) },
    c.getBookingSettings,
  );
  api.route(
    {
      method: 'put',
      path: '/orgs/:orgId/booking-settings',
      summary: 'Confirm paid bookings automatically, or accept each one',
      description: 'With `autoConfirmBookings` a booking is confirmed as soon as its payment is held; without it, it waits as a request for a partner to accept or decline.',
      tags,
      ...write,
      params: OrgParams,
      body: BookingSettingsInputSchema,
      response: z.object({ data: BookingSettingsSchema }),
    },
    c.saveBookingSettings,
  );

  tags = ['Travel and hours'];
  api.route(
    { method: 'get', path: '/orgs/:orgId/travel-policy', summary: 'How the organisation charges for driving', tags, ...read, params: OrgParams, response: z.object({ data: TravelPolicySchema }) },
    c.getTravelPolicy,
  );
  api.route(
    {
      method: 'put',
      path: '/orgs/:orgId/travel-policy',
      summary: 'Set the travel policy',
      description: 'Free within `freeWithinKm`, then `ratePerKmMinor` per km; no jobs further than `maxDistanceKm`.',
      tags,
      ...write,
      params: OrgParams,
      body: TravelPolicyInputSchema,
      response: z.object({ data: TravelPolicySchema }),
    },
    c.saveTravelPolicy,
  );
  api.route(
    { method: 'get', path: '/orgs/:orgId/service-area', summary: 'Where the organisation works', tags, ...read, params: OrgParams, response: z.object({ data: ServiceAreaSchema }) },
    c.getServiceArea,
  );
  api.route(
    {
      method: 'put',
      path: '/orgs/:orgId/service-area',
      summary: 'Move the base or change the service area',
      description: 'For approved (and suspended) organisations; before approval the area is a step of the application (409 AREA_IN_APPLICATION). The radius is 5 to 300 km.',
      tags,
      ...write,
      params: OrgParams,
      body: ServiceAreaInputSchema,
      response: z.object({ data: ServiceAreaSchema }),
      problems: [409],
    },
    c.saveServiceArea,
  );
  api.route(
    {
      method: 'get',
      path: '/orgs/:orgId/technicians/:userId/hours',
      summary: 'A member\'s working hours (null until set)',
      tags,
      ...read,
      params: MemberParams,
      response: z.object({ data: TechnicianHoursSchema }),
    },
    c.getHours,
  );
  api.route(
    {
      method: 'put',
      path: '/orgs/:orgId/technicians/:userId/hours',
      summary: 'Set a member\'s working hours',
      description: 'Weekly pattern in an IANA time zone, exceptions and booking rules; intervals on one day must not overlap. Partner admins change any member\'s hours; a technician may change only their own days off and time away (403 HOURS_ADMIN_ONLY otherwise).',
      tags,
      org: true,
      roles: ['partner_admin', 'technician'],
      params: MemberParams,
      body: WorkingHoursSchema,
      response: z.object({ data: TechnicianHoursSchema }),
    },
    c.saveHours,
  );
}
