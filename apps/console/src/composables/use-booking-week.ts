// One technician's bookings in one week, with the time zone the calendar draws them in: the
// technician's working-hours zone, else the zone the bookings carry, else the browser's.
import type { Ref } from 'vue';
import type { Booking } from '@emberline/domain';
import { listPartnerBookings } from '@/api/bookings';
import { getWorkingHours } from '@/api/offers';
import { browserZone, weekQueryRange } from '@/components/booking-week';
import { useOrgData } from './use-org-data';
import { BOOKINGS_LIMIT } from './use-partner-bookings';

export interface BookingWeek {
  timeZone: string;
  bookings: Booking[];
}

export function useBookingWeek(technicianId: Ref<string | null>, monday: Ref<string>) {
  return useOrgData<BookingWeek | null>(
    async (orgId, signal) => {
      const technician = technicianId.value;
      if (!technician) return null;
      const zone = getWorkingHours(orgId, technician, signal).then(
        (h) => h.hours?.timeZone ?? null,
        (err: unknown) => {
          if ((err as Error)?.name === 'AbortError') throw err;
          // the hours only choose the zone; the week still shows without them
          return null;
        },
      );
      const [hoursZone, bookings] = await Promise.all([zone, listPartnerBookings(orgId, { technicianId: technician, ...weekQueryRange(monday.value), limit: BOOKINGS_LIMIT }, signal)]);
      return { timeZone: hoursZone ?? bookings[0]?.timeZone ?? browserZone(), bookings };
    },
    () => null,
    [technicianId, monday],
  );
}
