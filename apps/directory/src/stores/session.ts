// Who is signed in, shared across pages (the shared core keeps the token in memory and
// restores the session from the refresh cookie after a reload).
import { computed } from 'vue';
import { defineStore } from 'pinia';
import type { Role } from '@emberline/domain';
import { sessionSignals } from '@emberline/api-client';
import { createSessionCore } from '@emberline/ui/session';
import * as auth from '@/api/auth';
import { connectSession } from '@/api/http';

export const useSessionStore = defineStore('session', () => {
  const core = createSessionCore(auth, connectSession, sessionSignals);
  /** Owners act for no organisation; kept so both apps' stores read alike. */
  const currentOrganisationId = computed(() => core.user.value?.memberships[0]?.organisationId ?? null);
  const roles = computed<Role[]>(() => {
    const user = core.user.value;
    if (!user) return [];
    const membership = user.memberships.find((m) => m.organisationId === currentOrganisationId.value);
    return [...new Set<Role>([...user.roles, ...(membership ? [membership.role] : [])])];
  });
  const hasAnyRole = (wanted: readonly Role[]) => wanted.some((r) => roles.value.includes(r));
  return { ...core, currentOrganisationId, roles, hasAnyRole };
});
