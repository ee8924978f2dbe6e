// Partner onboarding calls: the application wizard, documents, the admin review and the
// capability catalogue as network admins edit it.
import * as client from '@emberline/api-client';
import type { Application, ApplicationReview, ApplicationSummary, AreaStep, BusinessStep, CapabilitiesStep, Capability, Decision, PartnerDocument, ReviewChecklist } from '@emberline/domain';
import { appConfig } from '@/app-config';
import { useSessionStore } from '@/stores/session';
import { http } from './http';

export type { ApplicationReview } from '@emberline/domain';
export type { ApplicationQuery, CapabilityInput, CapabilityPatch, UploadFields } from '@emberline/api-client';

/** The bearer token and refresh of the signed-in session, for the calls that bypass the JSON client. */
function credentials() {
  const session = useSessionStore();
  return { getAccessToken: () => session.accessToken, refresh: () => session.refresh() };
}

export function getApplication(orgId: string, signal?: AbortSignal): Promise<Application> {
  return client.getApplication(http, orgId, signal);
}

export function saveBusiness(orgId: string, body: BusinessStep): Promise<Application> {
  return client.saveBusiness(http, orgId, body);
}

export function saveArea(orgId: string, body: AreaStep): Promise<Application> {
  return client.saveArea(http, orgId, body);
}

export function saveCapabilities(orgId: string, body: CapabilitiesStep): Promise<Application> {
  return client.saveCapabilities(http, orgId, body);
}

export function submitApplication(orgId: string): Promise<Application> {
  return client.submitApplication(http, orgId);
}

export function uploadDocument(orgId: string, file: File, fields: client.UploadFields, onProgress?: (fraction: number) => void, signal?: AbortSignal): Promise<PartnerDocument> {
  return client.uploadDocument(orgId, file, fields, { baseUrl: appConfig.apiBaseUrl, ...credentials(), onProgress, signal });
}

export function fetchDocumentBlob(orgId: string, documentId: string, signal?: AbortSignal): Promise<Blob> {
  return client.fetchDocumentBlob(appConfig.apiBaseUrl, orgId, documentId, { ...credentials(), signal });
}

export function deleteDocument(orgId: string, documentId: string): Promise<void> {
  return client.deleteDocument(http, orgId, documentId);
}

export function listApplications(query: client.ApplicationQuery = {}, signal?: AbortSignal): Promise<ApplicationSummary[]> {
  return client.listApplications(http, query, signal);
}

export function getApplicationReview(orgId: string, signal?: AbortSignal): Promise<ApplicationReview> {
  return client.getApplicationReview(http, orgId, signal);
}

export function saveReview(orgId: string, body: { checklist: ReviewChecklist; internalNotes: string }): Promise<ApplicationReview> {
  return client.saveReview(http, orgId, body);
}

export function decide(orgId: string, body: Decision): Promise<ApplicationReview> {
  return client.decide(http, orgId, body);
}

export function listAllCapabilities(signal?: AbortSignal): Promise<Capability[]> {
  return client.listAllCapabilities(http, signal);
}

export function createCapability(body: client.CapabilityInput): Promise<Capability> {
  return client.createCapability(http, body);
}

export function updateCapability(code: string, body: client.CapabilityPatch): Promise<Capability> {
  return client.updateCapability(http, code, body);
}
