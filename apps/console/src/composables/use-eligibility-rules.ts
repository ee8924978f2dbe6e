// The vehicle rules the Directory's search applies, as network admins edit them.
import type { EligibilityRuleView } from '@emberline/api-client';
import { useAsyncData } from '@emberline/ui';
import { listEligibilityRules } from '@/api/search-admin';

export function useEligibilityRules() {
  return useAsyncData<EligibilityRuleView[]>((signal) => listEligibilityRules(signal));
}
