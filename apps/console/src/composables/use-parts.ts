// The current organisation's parts.
import type { Part } from '@emberline/domain';
import { listParts } from '@/api/offers';
import { useOrgData } from './use-org-data';

export function useParts() {
  return useOrgData<Part[]>((orgId, signal) => listParts(orgId, signal), () => []);
}
