// A partner's public profile, and its free slots for one service at one place, as
// { data, loading, error, refresh } that reload when their inputs change.
import { watch, type Ref } from 'vue';
import type { PartnerProfile, PartnerSlots } from '@emberline/domain';
import { useAsyncData } from '@emberline/ui';
import { getPartnerProfile, getPartnerSlots } from '@/api/search';

export function usePartnerProfile(partnerId: Ref<string>) {
  const result = useAsyncData<PartnerProfile>((signal) => getPartnerProfile(partnerId.value, signal), { immediate: false });
  watch(
    partnerId,
    (id) => {
      if (id) void result.refresh();
    },
    { immediate: true },
  );
  return result;
}

export interface SlotsInput {
  partnerId: string;
  serviceType: string;
  lat: number;
  lng: number;
  /** ISO 8601 start of the window; now when left out. */
  from?: string;
  days: number;
}

export function usePartnerSlots(input: Ref<SlotsInput | null>) {
  const result = useAsyncData<PartnerSlots | null>(async (signal) => {
    const q = input.value;
    if (!q) return null;
    return getPartnerSlots(q.partnerId, { serviceType: q.serviceType, lat: q.lat, lng: q.lng, from: q.from, days: q.days }, signal);
  }, { immediate: false });
  watch(() => JSON.stringify(input.value), () => void result.refresh(), { immediate: true });
  return result;
}
