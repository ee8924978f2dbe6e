// Where the current organisation works and what it charges for driving, loaded together.
import type { ServiceArea, TravelPolicy } from '@emberline/domain';
import { getServiceArea, getTravelPolicy } from '@/api/offers';
import { useOrgData } from './use-org-data';

export interface AreaAndPolicy {
  area: ServiceArea['area'];
  policy: TravelPolicy | null;
}

export function useServiceArea() {
  return useOrgData<AreaAndPolicy>(
    async (orgId, signal) => {
      const [area, policy] = await Promise.all([getServiceArea(orgId, signal), getTravelPolicy(orgId, signal)]);
      return { area: area.area, policy };
    },
    () => ({ area: null, policy: null }),
  );
}
