// The partner's bookings: the list with its filters, one booking, the decisions on it, and the
// CSV export (fetched with the session's token, as document files are).
import * as client from '@emberline/api-client';
import { ApiError } from '@emberline/api-client';
import { ProblemDetailsSchema, type Booking, type BookingDecision } from '@emberline/domain';
import { appConfig } from '@/app-config';
import { useSessionStore } from '@/stores/session';
import { http } from './http';

export type { PartnerBookingsQuery } from '@emberline/api-client';

export function listPartnerBookings(orgId: string, query: client.PartnerBookingsQuery = {}, signal?: AbortSignal): Promise<Booking[]> {
  return client.listPartnerBookings(http, orgId, query, signal);
}

export function getPartnerBooking(orgId: string, bookingId: string, signal?: AbortSignal): Promise<Booking> {
  return client.getPartnerBooking(http, orgId, bookingId, signal);
}

export function decideBooking(orgId: string, bookingId: string, body: BookingDecision): Promise<Booking> {
  return client.decideBooking(http, orgId, bookingId, body);
}

/** Where the CSV of the bookings a query selects is served (it needs the bearer token); the export has no row limit. */
export function bookingsCsvUrl(orgId: string, query: client.PartnerBookingsQuery = {}): string {
  const { limit: _all, ...filters } = query;
  return `${appConfig.apiBaseUrl}${client.partnerBookingsCsvPath(orgId, filters)}`;
}

async function problemOf(res: Response): Promise<ApiError> {
  const text = await res.text().catch(() => '');
  try {
    const parsed = ProblemDetailsSchema.safeParse(JSON.parse(text));
    if (parsed.success) return new ApiError(parsed.data);
  } catch {
    /* not JSON: a generic problem below */
  }
  return new ApiError({ type: 'about:blank', title: res.statusText || 'Export failed', status: res.status >= 400 ? res.status : 500, code: 'UNEXPECTED_RESPONSE' });
}

/** The CSV export as a Blob and the file name the server suggests, fetched with the bearer token (one refresh on 401). */
export async function fetchBookingsCsv(orgId: string, query: client.PartnerBookingsQuery = {}, signal?: AbortSignal): Promise<{ blob: Blob; fileName: string | null }> {
  const session = useSessionStore();
  const url = bookingsCsvUrl(orgId, query);
  const send = () => {
    const token = session.accessToken;
    return globalThis.fetch(url, { headers: { accept: 'text/csv', ...(token ? { authorization: `Bearer ${token}` } : {}) }, credentials: 'same-origin', signal });
  };
  let res: Response;
  try {
    res = await send();
    if (res.status === 401 && (await session.refresh())) res = await send();
  } catch (err) {
    if ((err as Error).name === 'AbortError') throw err;
    throw new ApiError({ type: 'about:blank', title: 'The server could not be reached', status: 503, code: 'NETWORK_ERROR', detail: (err as Error).message });
  }
  if (!res.ok) throw await problemOf(res);
  const disposition = res.headers.get('content-disposition') ?? '';
  const fileName = /filename\*?=(?:UTF-8'')?"?([^";]+)"?/i.exec(disposition)?.[1] ?? null;
  return { blob: await res.blob(), fileName: fileName ? decodeURIComponent(fileName) : null };
}
