// The part of a session store both apps share: the signed-in user, the access token in memory
// only, one refresh at a time (reusing a refresh token revokes the whole session family), and a
// restore at start-up that runs only when the browser holds a session to restore.
import { computed, ref } from 'vue';
import type { Me, Session, SignIn } from '@emberline/domain';

/** What the HTTP client asks of the session (the same shape as the API client's hooks). */
export interface SessionHooks {
  getAccessToken: () => string | null;
  /** Resolves true when a new access token is in place. */
  refresh: () => Promise<boolean>;
}

/** What the core needs to know from the API client; passed in so this package does not depend on it. */
export interface SessionSignals {
  /** True when the browser holds a session worth restoring. */
  hasSessionHint: () => boolean;
  /** True when an error means the session is over (the server answered 401). */
  isSessionEnded: (error: unknown) => boolean;
}

export interface SessionAuthApi {
  refreshSession(): Promise<Session>;
  signIn(credentials: SignIn): Promise<Session>;
  signOut(): Promise<unknown>;
}

export function createSessionCore(auth: SessionAuthApi, connectSession: (hooks: SessionHooks) => void, signals: SessionSignals) {
  const user = ref<Me | null>(null);
  const accessToken = ref<string | null>(null);
  const isSignedIn = computed(() => user.value !== null);
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
        if (signals.isSessionEnded(error) || !accessToken.value) clear();
        return false;
      } finally {
        refreshing = null;
      }
    })();
    return refreshing;
  }

  /** Once per page load, before the first navigation; without a session hint there is nothing to ask. */
  function restore(): Promise<void> {
    restoring ??= signals.hasSessionHint() ? refresh().then(() => undefined) : Promise.resolve();
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

  connectSession({ getAccessToken: () => accessToken.value, refresh });

  return { user, accessToken, isSignedIn, setSession, setUser, refresh, restore, signIn, signOut };
}
