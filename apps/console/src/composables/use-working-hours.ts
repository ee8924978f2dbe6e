// One member's working hours in the current organisation; loads again when the member changes.
import type { Ref } from 'vue';
import type { TechnicianHours } from '@emberline/domain';
import { getWorkingHours } from '@/api/offers';
import { useOrgData } from './use-org-data';

export function useWorkingHours(userId: Ref<string | null>) {
  return useOrgData<TechnicianHours | null>((orgId, signal) => (userId.value ? getWorkingHours(orgId, userId.value, signal) : Promise.resolve(null)), () => null, [userId]);
}
