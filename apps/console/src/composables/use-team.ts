// The current organisation's members and pending invitations; reloads when the user switches organisation.
import { watch } from 'vue';
import type { Team } from '@emberline/domain';
import { useAsyncData } from '@emberline/ui';
import { getTeam } from '@/api/team';
import { useSessionStore } from '@/stores/session';

export function useTeam() {
  const session = useSessionStore();
  const team = useAsyncData<Team>(async (signal) => {
    const orgId = session.currentOrganisationId;
    return orgId ? getTeam(orgId, signal) : { members: [], invitations: [] };
  });
  watch(
    () => session.currentOrganisationId,
    () => void team.refresh(),
  );
  return team;
}
