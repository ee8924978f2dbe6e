// Who is signed in, shared across pages. The access token lives in memory only; the refresh
// cookie (httpOnly) brings the session back after a reload.
import { computed, ref } from 'vue';
import { defineStore } from 'pinia';
import { ApiError } from '@emberline/api-client';
import type { Me, Role, Session, SignIn } from '@emberline/domain';
import * as auth from '@/api/auth';
import { connectSession } from '@/api/http';

export const useSessionStore = defineStore('session', () => {
  const user = ref<Me | null>(null);
  const accessToken = ref<string | null>(null);
  /** Owners act for no organisation; kept so both apps' stores read alike. */
  const currentOrganisationId = computed(() => user.value?.memberships[0]?.organisationId ?? null);
  const isSignedIn = computed(() => user.value !== null);
  const roles = computed<Role[]>(() => {
    if (!user.value) return [];
    const membership = user.value.memberships.find((m) => m.organisationId === currentOrganisationId.value);
    return [...new Set<Role>([...user.value.roles, ...(membership ? [membership.role] : [])])];
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

  function hasAnyRole(wanted: readonly Role[]): boolean {
    return wanted.some((r) => roles.value.includes(r));
  }

  connectSession({ getAccessToken: () => accessToken.value, refresh });

  return { user, accessToken, currentOrganisationId, isSignedIn, roles, setSession, setUser, refresh, restore, signIn, signOut, hasAnyRole };
});
