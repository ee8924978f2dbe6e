// The current organisation's application; reloads when the user switches organisation.
import { watch } from 'vue';
import type { Application } from '@emberline/domain';
import { useAsyncData } from '@emberline/ui';
import { getApplication } from '@/api/onboarding';
import { useSessionStore } from '@/stores/session';

export function useApplication() {
  const session = useSessionStore();
  const application = useAsyncData<Application | null>(async (signal) => {
    const orgId = session.currentOrganisationId;
    return orgId ? getApplication(orgId, signal) : null;
  });
  watch(
    () => session.currentOrganisationId,
    () => void application.refresh(),
  );
  return application;
}
