// The account functions both apps share, bound to an app's two HTTP clients and to the app its
// e-mail links should open. Each app adds its own sign-up (owner or partner) beside them.
import type { Me, ResetPassword, Session, SignIn } from '@emberline/domain';
import type { HttpClient } from './http';
import * as accounts from './accounts';
import type { Accepted, LinkApp } from './accounts';

export interface AccountApiOptions {
  /** Sends the bearer token; for the signed-in user's own data. */
  http: HttpClient;
  /** For /api/auth/*, where the refresh cookie is the credential. */
  authHttp: HttpClient;
  app: LinkApp;
}

export interface AccountApi {
  resendVerification(email: string): Promise<Accepted>;
  signIn(body: SignIn): Promise<Session>;
  refreshSession(): Promise<Session>;
  signOut(): Promise<Accepted>;
  verifyEmail(token: string): Promise<Session>;
  forgotPassword(email: string): Promise<Accepted>;
  resetPassword(body: ResetPassword): Promise<Accepted>;
  getMe(signal?: AbortSignal): Promise<Me>;
  updateMe(body: { name?: string; locale?: 'en' | 'de' }): Promise<Me>;
}

export function createAccountApi({ http, authHttp, app }: AccountApiOptions): AccountApi {
  return {
    resendVerification: (email) => accounts.resendVerification(authHttp, { email, app }),
    signIn: (body) => accounts.signIn(authHttp, body),
    refreshSession: () => accounts.refreshSession(authHttp),
    signOut: () => accounts.signOut(authHttp),
    verifyEmail: (token) => accounts.verifyEmail(authHttp, token),
    forgotPassword: (email) => accounts.forgotPassword(authHttp, { email, app }),
    resetPassword: (body) => accounts.resetPassword(authHttp, body),
    getMe: (signal) => accounts.getMe(http, signal),
    updateMe: (body) => accounts.updateMe(http, body),
  };
}
