// What a partner organisation sells (offers, parts, travel policy, working hours) and the public
// bookable slots of a partner.
import { z } from 'zod';
import {
  BookingSettingsSchema,
  OfferInputSchema,
  OfferPatchSchema,
  OfferSchema,
  PartInputSchema,
  PartPatchSchema,
  PartnerSlotsSchema,
  PartSchema,
  ServiceAreaInputSchema,
  ServiceAreaSchema,
  TechnicianHoursSchema,
  TravelPolicyInputSchema,
  TravelPolicySchema,
  type BookingSettings,
  type BookingSettingsInput,
  type Offer,
  type Part,
  type PartnerSlots,
  type ServiceArea,
  type TechnicianHours,
  type TravelPolicy,
  type WorkingHoursDraft,
} from '@emberline/domain';
import type { HttpClient } from './http';

const seg = encodeURIComponent;

const OfferResponse = z.object({ data: OfferSchema });
const OfferListResponse = z.object({ data: z.array(OfferSchema) });
const PartResponse = z.object({ data: PartSchema });
const PartListResponse = z.object({ data: z.array(PartSchema) });
const TravelPolicyResponse = z.object({ data: TravelPolicySchema });
const BookingSettingsResponse = z.object({ data: BookingSettingsSchema });
const ServiceAreaResponse = z.object({ data: ServiceAreaSchema });
const HoursResponse = z.object({ data: TechnicianHoursSchema });
const SlotsResponse = z.object({ data: PartnerSlotsSchema });
const Deleted = z.unknown();

export type OfferDraft = z.input<typeof OfferInputSchema>;
export type OfferChange = z.input<typeof OfferPatchSchema>;
export type PartDraft = z.input<typeof PartInputSchema>;
export type PartChange = z.input<typeof PartPatchSchema>;
export type TravelPolicyDraft = z.input<typeof TravelPolicyInputSchema>;
export type ServiceAreaDraft = z.input<typeof ServiceAreaInputSchema>;

export interface SlotsRequest {
  serviceType: string;
  lat: number;
  lng: number;
  /** ISO 8601 with an offset; defaults to now on the server. */
  from?: string;
  days?: number;
}

const org = (orgId: string) => `/api/orgs/${seg(orgId)}`;

export async function listOffers(http: HttpClient, orgId: string, signal?: AbortSignal): Promise<Offer[]> {
  return (await http.request('GET', `${org(orgId)}/offers`, { schema: OfferListResponse, signal })).data;
}
export async function getOffer(http: HttpClient, orgId: string, offerId: string, signal?: AbortSignal): Promise<Offer> {
  return (await http.request('GET', `${org(orgId)}/offers/${seg(offerId)}`, { schema: OfferResponse, signal })).data;
}
export async function createOffer(http: HttpClient, orgId: string, body: OfferDraft): Promise<Offer> {
  return (await http.request('POST', `${org(orgId)}/offers`, { body, schema: OfferResponse })).data;
}
export async function updateOffer(http: HttpClient, orgId: string, offerId: string, body: OfferChange): Promise<Offer> {
  return (await http.request('PATCH', `${org(orgId)}/offers/${seg(offerId)}`, { body, schema: OfferResponse })).data;
}
export async function deleteOffer(http: HttpClient, orgId: string, offerId: string): Promise<void> {
  await http.request('DELETE', `${org(orgId)}/offers/${seg(offerId)}`, { schema: Deleted });
}

export async function listParts(http: HttpClient, orgId: string, signal?: AbortSignal): Promise<Part[]> {
  return (await http.request('GET', `${org(orgId)}/parts`, { schema: PartListResponse, signal })).data;
}
export async function createPart(http: HttpClient, orgId: string, body: PartDraft): Promise<Part> {
  return (await http.request('POST', `${org(orgId)}/parts`, { body, schema: PartResponse })).data;
}
export async function updatePart(http: HttpClient, orgId: string, partId: string, body: PartChange): Promise<Part> {
  return (await http.request('PATCH', `${org(orgId)}/parts/${seg(partId)}`, { body, schema: PartResponse })).data;
}
export async function deletePart(http: HttpClient, orgId: string, partId: string): Promise<void> {
  await http.request('DELETE', `${org(orgId)}/parts/${seg(partId)}`, { schema: Deleted });
}

export async function getBookingSettings(http: HttpClient, orgId: string, signal?: AbortSignal): Promise<BookingSettings> {
  return (await http.request('GET', `${org(orgId)}/booking-settings`, { schema: BookingSettingsResponse, signal })).data;
}
export async function saveBookingSettings(http: HttpClient, orgId: string, body: BookingSettingsInput): Promise<BookingSettings> {
  return (await http.request('PUT', `${org(orgId)}/booking-settings`, { body, schema: BookingSettingsResponse })).data;
}

export async function getTravelPolicy(http: HttpClient, orgId: string, signal?: AbortSignal): Promise<TravelPolicy> {
  return (await http.request('GET', `${org(orgId)}/travel-policy`, { schema: TravelPolicyResponse, signal })).data;
}
export async function saveTravelPolicy(http: HttpClient, orgId: string, body: TravelPolicyDraft): Promise<TravelPolicy> {
  return (await http.request('PUT', `${org(orgId)}/travel-policy`, { body, schema: TravelPolicyResponse })).data;
}

export async function getServiceArea(http: HttpClient, orgId: string, signal?: AbortSignal): Promise<ServiceArea> {
  return (await http.request('GET', `${org(orgId)}/service-area`, { schema: ServiceAreaResponse, signal })).data;
}
export async function saveServiceArea(http: HttpClient, orgId: string, body: ServiceAreaDraft): Promise<ServiceArea> {
  return (await http.request('PUT', `${org(orgId)}/service-area`, { body, schema: ServiceAreaResponse })).data;
}

export async function getWorkingHours(http: HttpClient, orgId: string, userId: string, signal?: AbortSignal): Promise<TechnicianHours> {
  return (await http.request('GET', `${org(orgId)}/technicians/${seg(userId)}/hours`, { schema: HoursResponse, signal })).data;
}
export async function saveWorkingHours(http: HttpClient, orgId: string, userId: string, body: WorkingHoursDraft): Promise<TechnicianHours> {
  return (await http.request('PUT', `${org(orgId)}/technicians/${seg(userId)}/hours`, { body, schema: HoursResponse })).data;
}

export async function getPartnerSlots(http: HttpClient, partnerId: string, q: SlotsRequest, signal?: AbortSignal): Promise<PartnerSlots> {
  const query = { serviceType: q.serviceType, lat: q.lat, lng: q.lng, from: q.from, days: q.days };
  return (await http.request('GET', `/api/partners/${seg(partnerId)}/slots`, { query, schema: SlotsResponse, signal })).data;
}
