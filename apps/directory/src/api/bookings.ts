// The owner's bookings: quote preview, book (a held slot with a checkout link), my bookings, and
// cancel, reschedule or release one; the calendar file is fetched with the session's token.
import * as client from '@emberline/api-client';
import type { Booking, BookingRequest } from '@emberline/domain';
import { appConfig } from '@/app-config';
import { useSessionStore } from '@/stores/session';
import { http } from './http';

export type { OwnerQuote, QuotePreviewRequest } from '@emberline/api-client';

export function previewQuote(partnerId: string, query: client.QuotePreviewRequest, signal?: AbortSignal): Promise<client.OwnerQuote> {
  return client.previewQuote(http, partnerId, query, signal);
}

export function createBooking(body: BookingRequest): Promise<Booking> {
  return client.createBooking(http, body);
}

export function listMyBookings(signal?: AbortSignal): Promise<Booking[]> {
  return client.listMyBookings(http, signal);
}

export function getMyBooking(bookingId: string, signal?: AbortSignal): Promise<Booking> {
  return client.getMyBooking(http, bookingId, signal);
}

export function cancelMyBooking(bookingId: string, reason?: string): Promise<Booking> {
  return client.cancelMyBooking(http, bookingId, reason);
}

export function rescheduleMyBooking(bookingId: string, start: string): Promise<Booking> {
  return client.rescheduleMyBooking(http, bookingId, start);
}

export function releaseMyBooking(bookingId: string): Promise<Booking> {
  return client.releaseMyBooking(http, bookingId);
}

/** Where a booking's calendar file is served (it needs the bearer token: fetch it with fetchBookingCalendar). */
export function bookingCalendarPath(bookingId: string): string {
  return `${appConfig.apiBaseUrl}/api/bookings/${encodeURIComponent(bookingId)}/calendar.ics`;
}

/** The booking's .ics file as a Blob, fetched with the bearer token (one refresh on a 401). */
export async function fetchBookingCalendar(bookingId: string): Promise<Blob> {
  const session = useSessionStore();
  const send = () => {
    const token = session.accessToken;
    return fetch(bookingCalendarPath(bookingId), { headers: token ? { authorization: `Bearer ${token}` } : {}, credentials: 'same-origin' });
  };
  let res = await send();
  if (res.status === 401 && (await session.refresh())) res = await send();
  if (!res.ok) throw new client.ApiError({ type: 'about:blank', title: res.statusText || 'The calendar file could not be loaded', status: res.status, code: 'CALENDAR_UNAVAILABLE' });
  return res.blob();
}
