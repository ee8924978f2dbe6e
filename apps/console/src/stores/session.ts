// Who is signed in and which organisation they act for, shared across pages (the shared core
// keeps the token in memory and restores the session from the refresh cookie after a reload).
import { computed, ref } from 'vue';
import { defineStore } from 'pinia';
import type { Membership, Role } from '@emberline/domain';
import { sessionSignals } from '@emberline/api-client';
import { createSessionCore } from '@emberline/ui/session';
import * as auth from '@/api/auth';
import { connectSession } from '@/api/http';

const ORGANISATION_KEY = 'emberline.console.organisation';

function readChoice(): string | null {
  try {
    return globalThis.localStorage?.getItem(ORGANISATION_KEY) ?? null;
  } catch {
    return null;
  }
}

function storeChoice(id: string): void {
  try {
    globalThis.localStorage?.setItem(ORGANISATION_KEY, id);
  } catch {
    // Private mode: the choice lasts for this page only.
  }
}

export const useSessionStore = defineStore('session', () => {
  const core = createSessionCore(auth, connectSession, sessionSignals);
  /** The organisation picked in the switcher; only used while the user is a member of it. */
  const chosenOrganisationId = ref<string | null>(readChoice());
  const memberships = computed<Membership[]>(() => core.user.value?.memberships ?? []);
  const currentMembership = computed<Membership | null>(
    () => memberships.value.find((m) => m.organisationId === chosenOrganisationId.value) ?? memberships.value[0] ?? null,
  );
  const currentOrganisationId = computed(() => currentMembership.value?.organisationId ?? null);
  /** Platform roles plus the role in the current organisation. */
  const roles = computed<Role[]>(() => {
    const user = core.user.value;
    if (!user) return [];
    return [...new Set<Role>([...user.roles, ...(currentMembership.value ? [currentMembership.value.role] : [])])];
  });

  function switchOrganisation(organisationId: string): void {
    if (!memberships.value.some((m) => m.organisationId === organisationId)) return;
    chosenOrganisationId.value = organisationId;
    storeChoice(organisationId);
  }

  const hasAnyRole = (wanted: readonly Role[]) => wanted.some((r) => roles.value.includes(r));

  return { ...core, memberships, currentMembership, currentOrganisationId, roles, switchOrganisation, hasAnyRole };
});
