// What the organisation sells: offers, parts, travel policy, service area, working hours, and the
// public slots a customer would see.
import * as client from '@emberline/api-client';
import type { BookingSettings, Offer, Part, PartnerSlots, ServiceArea, TechnicianHours, TravelPolicy, WorkingHoursDraft } from '@emberline/domain';
import { http } from './http';

export type { OfferChange, OfferDraft, PartChange, PartDraft, ServiceAreaDraft, SlotsRequest, TravelPolicyDraft } from '@emberline/api-client';

export function getBookingSettings(orgId: string, signal?: AbortSignal): Promise<BookingSettings> {
  return client.getBookingSettings(http, orgId, signal);
}
export function saveBookingSettings(orgId: string, body: { autoConfirmBookings: boolean }): Promise<BookingSettings> {
  return client.saveBookingSettings(http, orgId, body);
}

export function listOffers(orgId: string, signal?: AbortSignal): Promise<Offer[]> {
  return client.listOffers(http, orgId, signal);
}

export function createOffer(orgId: string, body: client.OfferDraft): Promise<Offer> {
  return client.createOffer(http, orgId, body);
}

export function updateOffer(orgId: string, offerId: string, body: client.OfferChange): Promise<Offer> {
  return client.updateOffer(http, orgId, offerId, body);
}

export function deleteOffer(orgId: string, offerId: string): Promise<void> {
  return client.deleteOffer(http, orgId, offerId);
}

export function listParts(orgId: string, signal?: AbortSignal): Promise<Part[]> {
  return client.listParts(http, orgId, signal);
}

export function createPart(orgId: string, body: client.PartDraft): Promise<Part> {
  return client.createPart(http, orgId, body);
}

export function updatePart(orgId: string, partId: string, body: client.PartChange): Promise<Part> {
  return client.updatePart(http, orgId, partId, body);
}

export function deletePart(orgId: string, partId: string): Promise<void> {
  return client.deletePart(http, orgId, partId);
}

export function getTravelPolicy(orgId: string, signal?: AbortSignal): Promise<TravelPolicy> {
  return client.getTravelPolicy(http, orgId, signal);
}

export function saveTravelPolicy(orgId: string, body: client.TravelPolicyDraft): Promise<TravelPolicy> {
  return client.saveTravelPolicy(http, orgId, body);
}

export function getServiceArea(orgId: string, signal?: AbortSignal): Promise<ServiceArea> {
  return client.getServiceArea(http, orgId, signal);
}

export function saveServiceArea(orgId: string, body: client.ServiceAreaDraft): Promise<ServiceArea> {
  return client.saveServiceArea(http, orgId, body);
}

export function getWorkingHours(orgId: string, userId: string, signal?: AbortSignal): Promise<TechnicianHours> {
  return client.getWorkingHours(http, orgId, userId, signal);
}

export function saveWorkingHours(orgId: string, userId: string, body: WorkingHoursDraft): Promise<TechnicianHours> {
  return client.saveWorkingHours(http, orgId, userId, body);
}

/** Public: what a customer would be offered at a place (approved partners only). */
export function getPartnerSlots(partnerId: string, query: client.SlotsRequest, signal?: AbortSignal): Promise<PartnerSlots> {
  return client.getPartnerSlots(http, partnerId, query, signal);
}
