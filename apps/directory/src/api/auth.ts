// Owner accounts: sign-up, sign-in, sessions, e-mail links and the signed-in user.
import { createAccountApi, signUpOwner, type Accepted } from '@emberline/api-client';
import type { OwnerSignUp } from '@emberline/domain';
import { authHttp, http } from './http';

export const { resendVerification, signIn, refreshSession, signOut, verifyEmail, forgotPassword, resetPassword, getMe, updateMe } =
  createAccountApi({ http, authHttp, app: 'directory' });

export function signUp(body: OwnerSignUp): Promise<Accepted> {
  return signUpOwner(authHttp, body);
}
