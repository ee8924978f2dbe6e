// The Directory's search calls: partners for a service at a place, places by name, partner
// profiles with their free slots, and the "tell me when someone covers this place" alert.
import * as client from '@emberline/api-client';
import type { CoverageAlertInput, PartnerProfile, PartnerSlots, Place, SearchRequest, SearchResponse } from '@emberline/domain';
import { http } from './http';

export function searchPartners(query: SearchRequest, signal?: AbortSignal): Promise<SearchResponse> {
  return client.searchPartners(http, query, signal);
}

export function findPlaces(q: string, limit?: number, signal?: AbortSignal): Promise<Place[]> {
  return client.findPlaces(http, q, limit, signal);
}

export function getPartnerProfile(partnerId: string, signal?: AbortSignal): Promise<PartnerProfile> {
  return client.getPartnerProfile(http, partnerId, signal);
}

export function getPartnerSlots(partnerId: string, query: client.SlotsRequest, signal?: AbortSignal): Promise<PartnerSlots> {
  return client.getPartnerSlots(http, partnerId, query, signal);
}

export function requestCoverageAlert(body: CoverageAlertInput): Promise<void> {
  return client.requestCoverageAlert(http, body);
}
