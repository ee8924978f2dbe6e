// Searches nobody answered, by ~10 km cell and service, for the chosen window and service.
import { reactive, watch } from 'vue';
import type { CoverageGaps } from '@emberline/domain';
import { useAsyncData } from '@emberline/ui';
import { getCoverageGaps } from '@/api/search-admin';

export function useCoverageGaps() {
  const filters = reactive({ days: 90, serviceType: '' });
  const gaps = useAsyncData<CoverageGaps>((signal) => getCoverageGaps({ days: filters.days, serviceType: filters.serviceType || undefined }, signal));
  watch(
    () => [filters.days, filters.serviceType],
    () => void gaps.refresh(),
  );
  return { ...gaps, filters };
}
