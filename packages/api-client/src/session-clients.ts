// The two HTTP clients an app needs once people sign in: `http` sends the bearer token and
// refreshes once on a 401; `authHttp` is for /api/auth/*, where the refresh cookie is the
// credential and a 401 must not trigger a refresh. The session store connects itself later,
// so the clients never import the store.
import { ApiError, createHttpClient, type HttpClient } from './http';

export interface SessionHooks {
  getAccessToken: () => string | null;
  /** Resolves true when a new access token is in place. */
  refresh: () => Promise<boolean>;
}

export interface SessionClients {
  http: HttpClient;
  authHttp: HttpClient;
  connectSession(hooks: SessionHooks): void;
}

export function createSessionClients(baseUrl: string, fetchImpl?: typeof fetch): SessionClients {
  let hooks: SessionHooks | null = null;
  return {
    http: createHttpClient({
      baseUrl,
      fetch: fetchImpl,
      getAccessToken: () => hooks?.getAccessToken() ?? null,
      refresh: () => (hooks ? hooks.refresh() : Promise.resolve(false)),
    }),
    authHttp: createHttpClient({ baseUrl, fetch: fetchImpl }),
    connectSession(next) {
      hooks = next;
    },
  };
}

/** Name of the readable cookie the API sets beside the httpOnly refresh cookie. */
export const SESSION_HINT_COOKIE = 'emberline_session';

/** True when the browser holds a session that a refresh could restore. */
export function hasSessionHint(cookie: string = globalThis.document?.cookie ?? ''): boolean {
  return cookie.split(';').some((c) => c.trim().startsWith(`${SESSION_HINT_COOKIE}=`));
}

/** What a session store asks of this client: is there a session to restore, has it ended. */
export const sessionSignals = {
  hasSessionHint: () => hasSessionHint(),
  isSessionEnded: (error: unknown) => error instanceof ApiError && error.status === 401,
};
