// The Console's HTTP clients (same origin). The session store connects itself here, so the
// client gets the bearer token and a refresh on 401 without importing the store (no cycle).
import { createHttpClient } from '@emberline/api-client';
import { appConfig } from '@/app-config';

export interface SessionHooks {
  getAccessToken: () => string | null;
  /** Resolves true when a new access token is in place. */
  refresh: () => Promise<boolean>;
}

let hooks: SessionHooks | null = null;

export function connectSession(next: SessionHooks): void {
  hooks = next;
}

export const http = createHttpClient({
  baseUrl: appConfig.apiBaseUrl,
  getAccessToken: () => hooks?.getAccessToken() ?? null,
  refresh: () => (hooks ? hooks.refresh() : Promise.resolve(false)),
});

/** For /api/auth/*: the refresh cookie is the credential, and a 401 there must not trigger a refresh. */
export const authHttp = createHttpClient({ baseUrl: appConfig.apiBaseUrl });
