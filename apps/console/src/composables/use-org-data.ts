// Page data of the current organisation as { data, loading, error, refresh }; loads again when the
// user switches organisation (or when one of `sources` changes).
import { watch, type WatchSource } from 'vue';
import { useAsyncData, type AsyncData } from '@emberline/ui';
import { useSessionStore } from '@/stores/session';

export function useOrgData<T>(load: (orgId: string, signal: AbortSignal) => Promise<T>, empty: () => T, sources: WatchSource[] = []): AsyncData<T> {
  const session = useSessionStore();
  const result = useAsyncData<T>((signal) => {
    const orgId = session.currentOrganisationId;
    return orgId ? load(orgId, signal) : Promise.resolve(empty());
  });
  watch([() => session.currentOrganisationId, ...sources], () => void result.refresh());
  return result;
}
