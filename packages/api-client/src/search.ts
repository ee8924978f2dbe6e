// The Directory's search: partners for a service at a place, places by name, partner profiles,
// coverage alerts; and for network admins coverage gaps and the vehicle rules.
import { z } from 'zod';
import {
  CoverageGapsSchema,
  EligibilityRuleListSchema,
  EligibilityRuleSchema,
  PartnerProfileSchema,
  PlaceListSchema,
  SearchResponseSchema,
  type CoverageAlertInput,
  type CoverageGaps,
  type EligibilityRuleInput,
  type PartnerProfile,
  type Place,
  type SearchRequest,
  type SearchResponse,
} from '@emberline/domain';
import type { HttpClient } from './http';

const seg = encodeURIComponent;
type Query = Record<string, string | number | boolean | undefined | null>;

export type EligibilityRuleView = z.infer<typeof EligibilityRuleSchema>;

export async function searchPartners(http: HttpClient, q: SearchRequest, signal?: AbortSignal): Promise<SearchResponse> {
  return http.request('GET', '/api/search', { query: q as Query, schema: SearchResponseSchema, signal });
}

export async function findPlaces(http: HttpClient, q: string, limit = 8, signal?: AbortSignal): Promise<Place[]> {
  return (await http.request('GET', '/api/places', { query: { q, limit }, schema: PlaceListSchema, signal })).data;
}

export async function getPartnerProfile(http: HttpClient, partnerId: string, signal?: AbortSignal): Promise<PartnerProfile> {
  return (await http.request('GET', `/api/partners/${seg(partnerId)}`, { schema: z.object({ data: PartnerProfileSchema }), signal })).data;
}

export async function requestCoverageAlert(http: HttpClient, body: CoverageAlertInput): Promise<void> {
  await http.request('POST', '/api/coverage-alerts', { body, schema: z.unknown() });
}

export async function getCoverageGaps(http: HttpClient, q: { days?: number; serviceType?: string } = {}, signal?: AbortSignal): Promise<CoverageGaps> {
  return http.request('GET', '/api/admin/coverage-gaps', { query: q, schema: CoverageGapsSchema, signal });
}

export async function listEligibilityRules(http: HttpClient, signal?: AbortSignal): Promise<EligibilityRuleView[]> {
  return (await http.request('GET', '/api/catalogue/eligibility-rules', { schema: EligibilityRuleListSchema, signal })).data;
}
export async function createEligibilityRule(http: HttpClient, body: EligibilityRuleInput): Promise<EligibilityRuleView> {
  return (await http.request('POST', '/api/admin/eligibility-rules', { body, schema: z.object({ data: EligibilityRuleSchema }) })).data;
}
export async function updateEligibilityRule(http: HttpClient, code: string, body: EligibilityRuleInput): Promise<EligibilityRuleView> {
  return (await http.request('PUT', `/api/admin/eligibility-rules/${seg(code)}`, { body, schema: z.object({ data: EligibilityRuleSchema }) })).data;
}
export async function deleteEligibilityRule(http: HttpClient, code: string): Promise<void> {
  await http.request('DELETE', `/api/admin/eligibility-rules/${seg(code)}`, { schema: z.unknown() });
}
