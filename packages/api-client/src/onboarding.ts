// Partner onboarding: the application steps, documents (multipart upload with progress), the
// admin review queue, decisions, and the capability catalogue as network admins edit it.
import { z } from 'zod';
import {
  ApplicationReviewSchema,
  ApplicationSchema,
  ApplicationSummarySchema,
  CapabilitySchema,
  DocumentSchema,
  ProblemDetailsSchema,
  type Application,
  type ApplicationReview,
  type ApplicationSummary,
  type AreaStep,
  type BusinessStep,
  type CapabilitiesStep,
  type Capability,
  type Decision,
  type DocumentKind,
  type OrganisationStatus,
  type PartnerDocument,
  type ReviewChecklist,
  CapabilityInputSchema,
  CapabilityPatchSchema,
} from '@emberline/domain';
import { ApiError, type HttpClient } from './http';

const seg = encodeURIComponent;

const ApplicationResponseSchema = z.object({ data: ApplicationSchema });
const DocumentResponseSchema = z.object({ data: DocumentSchema });
const SummaryListSchema = z.object({ data: z.array(ApplicationSummarySchema) });
const CapabilityResponseSchema = z.object({ data: CapabilitySchema });
const CapabilityListResponseSchema = z.object({ data: z.array(CapabilitySchema) });
const AnyResponseSchema = z.unknown();

const ApplicationReviewResponseSchema = z.object({ data: ApplicationReviewSchema });

export type CapabilityInput = z.input<typeof CapabilityInputSchema>;
export type CapabilityPatch = z.input<typeof CapabilityPatchSchema>;

// --- the partner's own application -------------------------------------------------------

export async function getApplication(http: HttpClient, orgId: string, signal?: AbortSignal): Promise<Application> {
  return (await http.request('GET', `/api/orgs/${seg(orgId)}/application`, { schema: ApplicationResponseSchema, signal })).data;
}

export async function saveBusiness(http: HttpClient, orgId: string, body: BusinessStep): Promise<Application> {
  return (await http.request('PUT', `/api/orgs/${seg(orgId)}/application/business`, { body, schema: ApplicationResponseSchema })).data;
}

export async function saveArea(http: HttpClient, orgId: string, body: AreaStep): Promise<Application> {
  return (await http.request('PUT', `/api/orgs/${seg(orgId)}/application/area`, { body, schema: ApplicationResponseSchema })).data;
}

export async function saveCapabilities(http: HttpClient, orgId: string, body: CapabilitiesStep): Promise<Application> {
  return (await http.request('PUT', `/api/orgs/${seg(orgId)}/application/capabilities`, { body, schema: ApplicationResponseSchema })).data;
}

export async function submitApplication(http: HttpClient, orgId: string): Promise<Application> {
  return (await http.request('POST', `/api/orgs/${seg(orgId)}/application/submit`, { schema: ApplicationResponseSchema })).data;
}

export async function deleteDocument(http: HttpClient, orgId: string, documentId: string): Promise<void> {
  await http.request('DELETE', `/api/orgs/${seg(orgId)}/documents/${seg(documentId)}`, { schema: AnyResponseSchema });
}

export interface UploadFields {
  kind: DocumentKind;
  expiresOn?: string;
  capabilityCode?: string;
}

export interface UploadOptions {
  /** Prefix for the path, as for the HTTP client ("" in the browser). */
  baseUrl: string;
  getAccessToken: () => string | null | undefined;
  /** Called once on a 401; resolve true to retry with a fresh token. */
  refresh?: () => Promise<boolean>;
  /** Fraction sent, 0..1. */
  onProgress?: (fraction: number) => void;
  signal?: AbortSignal;
  /** For tests: the XMLHttpRequest constructor to use. */
  xhr?: () => XMLHttpRequest;
}

function uploadProblem(status: number, text: string, statusText: string): ApiError {
  try {
    const parsed = ProblemDetailsSchema.safeParse(JSON.parse(text));
    if (parsed.success) return new ApiError(parsed.data);
  } catch {
    /* not JSON: fall through */
  }
  if (status === 0) return new ApiError({ type: 'about:blank', title: 'The server could not be reached', status: 503, code: 'NETWORK_ERROR' });
  return new ApiError({ type: 'about:blank', title: statusText || 'Upload failed', status: status >= 400 ? status : 500, code: 'UNEXPECTED_RESPONSE' });
}

function sendUpload(url: string, form: FormData, o: UploadOptions): Promise<{ status: number; text: string; statusText: string }> {
  return new Promise((resolve, reject) => {
    const xhr = o.xhr ? o.xhr() : new XMLHttpRequest();
    xhr.open('POST', url);
    xhr.setRequestHeader('accept', 'application/json');
    const token = o.getAccessToken();
    if (token) xhr.setRequestHeader('authorization', `Bearer ${token}`);
    xhr.withCredentials = true;
    xhr.upload.onprogress = (e) => {
      if (e.lengthComputable && e.total > 0) o.onProgress?.(e.loaded / e.total);
    };
    xhr.onload = () => resolve({ status: xhr.status, text: xhr.responseText, statusText: xhr.statusText });
    xhr.onerror = () => resolve({ status: 0, text: '', statusText: '' });
    xhr.onabort = () => reject(new DOMException('The upload was cancelled', 'AbortError'));
    o.signal?.addEventListener('abort', () => xhr.abort(), { once: true });
    xhr.send(form);
  });
}

/** Uploads one document as multipart form-data, reporting progress; problem details become ApiError. */
export async function uploadDocument(orgId: string, file: Blob & { name?: string }, fields: UploadFields, o: UploadOptions): Promise<PartnerDocument> {
  const url = `${o.baseUrl}/api/orgs/${seg(orgId)}/documents`;
  const build = () => {
    const form = new FormData();
    form.append('kind', fields.kind);
    if (fields.expiresOn) form.append('expiresOn', fields.expiresOn);
    if (fields.capabilityCode) form.append('capabilityCode', fields.capabilityCode);
    form.append('file', file, file.name ?? 'upload');
    return form;
  };
  let res = await sendUpload(url, build(), o);
  if (res.status === 401 && o.refresh && (await o.refresh())) res = await sendUpload(url, build(), o);
  if (res.status < 200 || res.status >= 300) throw uploadProblem(res.status, res.text, res.statusText);
  o.onProgress?.(1);
  let json: unknown;
  try {
    json = JSON.parse(res.text);
  } catch {
    json = null;
  }
  const parsed = DocumentResponseSchema.safeParse(json);
  if (!parsed.success) {
    throw new ApiError({ type: 'about:blank', title: 'The server sent an answer this app does not understand', status: 502, code: 'UNEXPECTED_RESPONSE' });
  }
  return parsed.data.data;
}

/** Where a document's file is served; it needs the bearer token, so fetch it with fetchDocumentBlob. */
export function documentFileUrl(baseUrl: string, orgId: string, documentId: string): string {
  return `${baseUrl}/api/orgs/${seg(orgId)}/documents/${seg(documentId)}/file`;
}

/** The file of one document as a Blob (for an object URL), fetched with the bearer token. */
export async function fetchDocumentBlob(
  baseUrl: string,
  orgId: string,
  documentId: string,
  o: { getAccessToken: () => string | null | undefined; refresh?: () => Promise<boolean>; fetch?: typeof fetch; signal?: AbortSignal },
): Promise<Blob> {
  const doFetch = o.fetch ?? globalThis.fetch.bind(globalThis);
  const send = () => {
    const token = o.getAccessToken();
    return doFetch(documentFileUrl(baseUrl, orgId, documentId), {
      headers: token ? { authorization: `Bearer ${token}` } : {},
      credentials: 'same-origin',
      signal: o.signal,
    });
  };
  let res: Response;
  try {
    res = await send();
    if (res.status === 401 && o.refresh && (await o.refresh())) res = await send();
  } catch (err) {
    if ((err as Error).name === 'AbortError') throw err;
    throw new ApiError({ type: 'about:blank', title: 'The server could not be reached', status: 503, code: 'NETWORK_ERROR', detail: (err as Error).message });
  }
  if (!res.ok) throw uploadProblem(res.status, await res.text().catch(() => ''), res.statusText);
  return res.blob();
}

// --- network admin: review queue, review and decisions -----------------------------------

export interface ApplicationQuery {
  status?: OrganisationStatus;
  country?: string;
  q?: string;
  sort?: 'waiting' | 'name' | 'submitted';
  order?: 'asc' | 'desc';
}

export async function listApplications(http: HttpClient, query: ApplicationQuery = {}, signal?: AbortSignal): Promise<ApplicationSummary[]> {
  return (await http.request('GET', '/api/admin/applications', { query: { ...query }, schema: SummaryListSchema, signal })).data;
}

export async function getApplicationReview(http: HttpClient, orgId: string, signal?: AbortSignal): Promise<ApplicationReview> {
  return (await http.request('GET', `/api/admin/applications/${seg(orgId)}`, { schema: ApplicationReviewResponseSchema, signal })).data;
}

export async function saveReview(http: HttpClient, orgId: string, body: { checklist: ReviewChecklist; internalNotes: string }): Promise<ApplicationReview> {
  return (await http.request('PUT', `/api/admin/applications/${seg(orgId)}/review`, { body, schema: ApplicationReviewResponseSchema })).data;
}

export async function decide(http: HttpClient, orgId: string, body: Decision): Promise<ApplicationReview> {
  return (await http.request('POST', `/api/admin/applications/${seg(orgId)}/decision`, { body, schema: ApplicationReviewResponseSchema })).data;
}

export async function listAllCapabilities(http: HttpClient, signal?: AbortSignal): Promise<Capability[]> {
  return (await http.request('GET', '/api/admin/capabilities', { schema: CapabilityListResponseSchema, signal })).data;
}

export async function createCapability(http: HttpClient, body: CapabilityInput): Promise<Capability> {
  return (await http.request('POST', '/api/admin/capabilities', { body, schema: CapabilityResponseSchema })).data;
}

export async function updateCapability(http: HttpClient, code: string, body: CapabilityPatch): Promise<Capability> {
  return (await http.request('PATCH', `/api/admin/capabilities/${seg(code)}`, { body, schema: CapabilityResponseSchema })).data;
}
