// The capability codes the current organisation holds (its application's claims), to tell which
// service types it may offer. Null while unknown: the API still checks every offer.
import { computed } from 'vue';
import { useApplication } from './use-application';

export function useHeldCapabilities() {
  const application = useApplication();
  const held = computed<Set<string> | null>(() => (application.data.value ? new Set(application.data.value.capabilities.map((c) => c.code)) : null));
  return { held, loading: application.loading, error: application.error, refresh: application.refresh };
}
