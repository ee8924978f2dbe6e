// Partner and admin accounts: partner sign-up, sign-in, sessions, e-mail links, invitations and
// the signed-in user.
import * as client from '@emberline/api-client';
import type { AcceptInvitation, InvitationPreview, PartnerSignUp, Session } from '@emberline/domain';
import { authHttp, http } from './http';

export const { resendVerification, signIn, refreshSession, signOut, verifyEmail, forgotPassword, resetPassword, getMe, updateMe } =
  client.createAccountApi({ http, authHttp, app: 'console' });

export function signUpPartner(body: PartnerSignUp): Promise<client.Accepted> {
  return client.signUpPartner(authHttp, body);
}

export function previewInvitation(token: string, signal?: AbortSignal): Promise<InvitationPreview> {
  return client.previewInvitation(authHttp, token, signal);
}

export function acceptInvitation(body: AcceptInvitation): Promise<Session> {
  return client.acceptInvitation(authHttp, body);
}
