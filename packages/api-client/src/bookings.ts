// Quotes and bookings: the owner's side (quote preview, book, my bookings, cancel, reschedule)
// and the partner's side under /orgs/:orgId (list, detail, decisions).
import { z } from 'zod';
import {
  BookingSchema,
  OwnerQuoteSchema,
  type Booking,
  type BookingDecision,
  type BookingRequest,
  type BookingStatus,
} from '@emberline/domain';
import type { HttpClient } from './http';

const seg = encodeURIComponent;
type Query = Record<string, string | number | boolean | undefined | null>;
const One = z.object({ data: BookingSchema });
const Many = z.object({ data: z.array(BookingSchema) });

export type OwnerQuote = z.infer<typeof OwnerQuoteSchema>;
export interface QuotePreviewRequest {
  serviceType: string;
  jobAt: 'owner' | 'workshop';
  lat?: number;
  lng?: number;
  country?: string;
  start?: string;
  vatId?: string;
  model?: string;
  fuel?: string;
  factoryHeater?: string;
  climateControl?: string;
  electricalSystemV?: number;
  year?: number;
}
export interface PartnerBookingsQuery {
  status?: BookingStatus;
  from?: string;
  to?: string;
  technicianId?: string;
  q?: string;
  limit?: number;
}

export async function previewQuote(http: HttpClient, partnerId: string, q: QuotePreviewRequest, signal?: AbortSignal): Promise<OwnerQuote> {
  return (await http.request('GET', `/api/partners/${seg(partnerId)}/quote`, { query: q as unknown as Query, schema: z.object({ data: OwnerQuoteSchema }), signal })).data;
}

export async function createBooking(http: HttpClient, body: BookingRequest): Promise<Booking> {
  return (await http.request('POST', '/api/bookings', { body, schema: One })).data;
}
export async function listMyBookings(http: HttpClient, signal?: AbortSignal): Promise<Booking[]> {
  return (await http.request('GET', '/api/bookings', { schema: Many, signal })).data;
}
export async function getMyBooking(http: HttpClient, bookingId: string, signal?: AbortSignal): Promise<Booking> {
  return (await http.request('GET', `/api/bookings/${seg(bookingId)}`, { schema: One, signal })).data;
}
export async function cancelMyBooking(http: HttpClient, bookingId: string, reason?: string): Promise<Booking> {
  return (await http.request('POST', `/api/bookings/${seg(bookingId)}/cancel`, { body: { reason }, schema: One })).data;
}
export async function rescheduleMyBooking(http: HttpClient, bookingId: string, start: string): Promise<Booking> {
  return (await http.request('POST', `/api/bookings/${seg(bookingId)}/reschedule`, { body: { start }, schema: One })).data;
}
/** Gives up a held slot (the owner left the payment page). */
export async function releaseMyBooking(http: HttpClient, bookingId: string): Promise<Booking> {
  return (await http.request('POST', `/api/bookings/${seg(bookingId)}/release`, { schema: One })).data;
}

const org = (orgId: string) => `/api/orgs/${seg(orgId)}`;
export async function listPartnerBookings(http: HttpClient, orgId: string, q: PartnerBookingsQuery = {}, signal?: AbortSignal): Promise<Booking[]> {
  return (await http.request('GET', `${org(orgId)}/bookings`, { query: q as Query, schema: Many, signal })).data;
}
export async function getPartnerBooking(http: HttpClient, orgId: string, bookingId: string, signal?: AbortSignal): Promise<Booking> {
  return (await http.request('GET', `${org(orgId)}/bookings/${seg(bookingId)}`, { schema: One, signal })).data;
}
export async function decideBooking(http: HttpClient, orgId: string, bookingId: string, body: BookingDecision): Promise<Booking> {
  return (await http.request('POST', `${org(orgId)}/bookings/${seg(bookingId)}/decision`, { body, schema: One })).data;
}
/** Path of the CSV export (the Console downloads it with the session's token). */
export function partnerBookingsCsvPath(orgId: string, q: PartnerBookingsQuery = {}): string {
  const params = new URLSearchParams();
  for (const [k, v] of Object.entries(q)) if (v !== undefined && v !== '') params.set(k, String(v));
  const qs = params.toString();
  return `${org(orgId)}/bookings.csv${qs ? `?${qs}` : ''}`;
}
