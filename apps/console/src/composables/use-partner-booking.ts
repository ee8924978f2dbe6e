// One booking of the current organisation, for its detail page; loads again when the id or the
// organisation changes.
import type { Ref } from 'vue';
import type { Booking } from '@emberline/domain';
import { getPartnerBooking } from '@/api/bookings';
import { useOrgData } from './use-org-data';

export function usePartnerBooking(bookingId: Ref<string>) {
  return useOrgData<Booking | null>((orgId, signal) => getPartnerBooking(orgId, bookingId.value, signal), () => null, [bookingId]);
}
