// Who is signed in and which organisation they act for, shared across pages. The access token
// lives in memory only; the refresh cookie (httpOnly) brings the session back after a reload.
import { computed, ref } from 'vue';
import { defineStore } from 'pinia';
import { ApiError } from '@emberline/api-client';
import type { Me, Membership, Role, Session, SignIn } from '@emberline/domain';
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
  const user = ref<Me | null>(null);
  const accessToken = ref<string | null>(null);
  /** The organisation picked in the switcher; only used while the user is a member of it. */
  const chosenOrganisationId = ref<string | null>(readChoice());

  const isSignedIn = computed(() => user.value !== null);
  const memberships = computed<Membership[]>(() => user.value?.memberships ?? []);
  const currentMembership = computed<Membership | null>(
    () => memberships.value.find((m) => m.organisationId === chosenOrganisationId.value) ?? memberships.value[0] ?? null,
  );
  const currentOrganisationId = computed(() => currentMembership.value?.organisationId ?? null);
  /** Platform roles plus the role in the current organisation. */
  const roles = computed<Role[]>(() => {
    if (!user.value) return [];
    const all = new Set<Role>(user.value.roles);
    if (currentMembership.value) all.add(currentMembership.value.role);
    return [...all];
  });

  // Reusing a refresh token revokes the whole session family, so at most one refresh runs at a time.
  let refreshing: Promise<boolean> | null = null;
  let restoring: Promise<void> | null = null;

  function setSession(session: Session): void {
    accessToken.value = session.accessToken;
    user.value = session.user;
  }

  function setUser(me: Me): void {
    user.value = me;
  }

  function clear(): void {
    accessToken.value = null;
    user.value = null;
  }

  function refresh(): Promise<boolean> {
    refreshing ??= (async () => {
      try {
        setSession(await auth.refreshSession());
        return true;
      } catch (error) {
        // 401: the session is over. Anything else (offline) leaves us without a usable token too.
        if ((error instanceof ApiError && error.status === 401) || !accessToken.value) clear();
        return false;
      } finally {
        refreshing = null;
      }
    })();
    return refreshing;
  }

  /** Once per page load, before the first navigation: a 401 just means nobody is signed in. */
  function restore(): Promise<void> {
    restoring ??= refresh().then(() => undefined);
    return restoring;
  }

  async function signIn(credentials: SignIn): Promise<void> {
    setSession(await auth.signIn(credentials));
  }

  async function signOut(): Promise<void> {
    try {
      await auth.signOut();
    } catch {
      // The cookie may already be gone; locally we sign out regardless.
    } finally {
      clear();
    }
  }

  function switchOrganisation(organisationId: string): void {
    if (!memberships.value.some((m) => m.organisationId === organisationId)) return;
    chosenOrganisationId.value = organisationId;
    storeChoice(organisationId);
  }

  function hasAnyRole(wanted: readonly Role[]): boolean {
    return wanted.some((r) => roles.value.includes(r));
  }

  connectSession({ getAccessToken: () => accessToken.value, refresh });

  return {
    user,
    accessToken,
    isSignedIn,
    memberships,
    currentMembership,
    currentOrganisationId,
    roles,
    setSession,
    setUser,
    refresh,
    restore,
    signIn,
    signOut,
    switchOrganisation,
    hasAnyRole,
  };
});
