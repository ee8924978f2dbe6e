// The current organisation's bookings for the table: filters (status, dates, technician, search)
// turned into the API's query; loads again on a filter change and when the organisation changes.
import { reactive } from 'vue';
import { DateTime } from 'luxon';
import type { Booking, BookingStatus } from '@emberline/domain';
import { listPartnerBookings, type PartnerBookingsQuery } from '@/api/bookings';
import { useOrgData } from './use-org-data';

/** The most the API returns at once; the table pages through them. */
export const BOOKINGS_LIMIT = 500;

export interface BookingFilters {
  status: BookingStatus | '';
  /** Local dates (YYYY-MM-DD), both days included; empty for no bound. */
  from: string;
  to: string;
  technicianId: string;
  q: string;
}

/** The API query for the filters: dates become instants at the user's local midnights. */
export function bookingsQuery(f: BookingFilters): PartnerBookingsQuery {
  const query: PartnerBookingsQuery = { limit: BOOKINGS_LIMIT };
  if (f.status) query.status = f.status;
  const from = f.from ? DateTime.fromISO(f.from) : null;
  const to = f.to ? DateTime.fromISO(f.to) : null;
  if (from?.isValid) query.from = from.startOf('day').toISO()!;
  // "to" names the last day shown, so the bound is the midnight after it
  if (to?.isValid) query.to = to.plus({ days: 1 }).startOf('day').toISO()!;
  if (f.technicianId) query.technicianId = f.technicianId;
  if (f.q.trim()) query.q = f.q.trim();
  return query;
}

export function usePartnerBookings(initial: BookingFilters) {
  const filters = reactive<BookingFilters>({ ...initial });
  const list = useOrgData<Booking[]>((orgId, signal) => listPartnerBookings(orgId, bookingsQuery(filters), signal), () => [], [
    () => filters.status,
    () => filters.from,
    () => filters.to,
    () => filters.technicianId,
  ]);
  return { ...list, filters };
}
