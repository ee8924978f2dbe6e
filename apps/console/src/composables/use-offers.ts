// The current organisation's offers.
import type { Offer } from '@emberline/domain';
import { listOffers } from '@/api/offers';
import { useOrgData } from './use-org-data';

export function useOffers() {
  return useOrgData<Offer[]>((orgId, signal) => listOffers(orgId, signal), () => []);
}
