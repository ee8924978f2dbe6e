// The network admin's queue of partner applications, filtered and sorted by the API.
import { reactive, watch } from 'vue';
import type { ApplicationSummary, OrganisationStatus } from '@emberline/domain';
import { useAsyncData } from '@emberline/ui';
import { listApplications } from '@/api/onboarding';

export interface ApplicationFilters {
  status: OrganisationStatus | '';
  country: string;
  q: string;
  sort: 'waiting' | 'name' | 'submitted';
  order: 'asc' | 'desc';
}

export function useApplications() {
  const filters = reactive<ApplicationFilters>({ status: '', country: '', q: '', sort: 'waiting', order: 'desc' });
  const list = useAsyncData<ApplicationSummary[]>((signal) =>
    listApplications(
      { status: filters.status || undefined, country: filters.country || undefined, q: filters.q.trim() || undefined, sort: filters.sort, order: filters.order },
      signal,
    ),
  );
  watch(
    () => [filters.status, filters.country, filters.sort, filters.order],
    () => void list.refresh(),
  );
  return { ...list, filters };
}
