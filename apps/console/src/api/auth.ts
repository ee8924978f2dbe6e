// Partner and admin accounts: partner sign-up, sign-in, sessions, e-mail links, invitations and
// the signed-in user.
import * as client from '@emberline/api-client';
import type { AcceptInvitation, InvitationPreview, Me, PartnerSignUp, ResetPassword, Session, SignIn } from '@emberline/domain';
import { authHttp, http } from './http';

const app = 'console' as const;

export function signUpPartner(body: PartnerSignUp): Promise<client.Accepted> {
  return client.signUpPartner(authHttp, body);
}

export function resendVerification(email: string): Promise<client.Accepted> {
  return client.resendVerification(authHttp, { email, app });
}

export function signIn(body: SignIn): Promise<Session> {
  return client.signIn(authHttp, body);
}

export function refreshSession(): Promise<Session> {
  return client.refreshSession(authHttp);
}

export function signOut(): Promise<client.Accepted> {
  return client.signOut(authHttp);
}

export function verifyEmail(token: string): Promise<Session> {
  return client.verifyEmail(authHttp, token);
}

export function forgotPassword(email: string): Promise<client.Accepted> {
  return client.forgotPassword(authHttp, { email, app });
}

export function resetPassword(body: ResetPassword): Promise<client.Accepted> {
  return client.resetPassword(authHttp, body);
}

export function previewInvitation(token: string, signal?: AbortSignal): Promise<InvitationPreview> {
  return client.previewInvitation(authHttp, token, signal);
}

export function acceptInvitation(body: AcceptInvitation): Promise<Session> {
  return client.acceptInvitation(authHttp, body);
}

export function getMe(signal?: AbortSignal): Promise<Me> {
  return client.getMe(http, signal);
}

export function updateMe(body: { name?: string; locale?: 'en' | 'de' }): Promise<Me> {
  return client.updateMe(http, body);
}
