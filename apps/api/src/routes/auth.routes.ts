// Public account routes: sign-up, sign-in, sessions, verification, reset, invitations.
import { z } from 'zod';
import {
  AcceptInvitationSchema,
  AcceptedSchema,
  ForgotPasswordSchema,
  InvitationPreviewSchema,
  OwnerSignUpSchema,
  PartnerSignUpSchema,
  ResetPasswordSchema,
  SessionResponseSchema,
  SignInSchema,
  TokenSchema,
  VerifyEmailSchema,
} from '@emberline/domain';
import type { AppContext } from '../app-context';
import type { ApiRouter } from '../lib/api-router';
import { authController } from '../controllers/auth.controller';

export function registerAuthRoutes(api: ApiRouter, app: AppContext): void {
  const c = authController(app);
  const { limiters } = app;
  const tags = ['Accounts'];
  api.route(
    { method: 'post', path: '/auth/sign-up', summary: 'Van owner sign-up; sends a confirmation link', description: 'Answers the same whether or not the address already has an account.', tags, body: OwnerSignUpSchema, response: AcceptedSchema, status: 202, before: limiters.signUp },
    c.signUpOwner,
  );
  api.route(
    { method: 'post', path: '/auth/partner-sign-up', summary: 'Partner sign-up: creates a draft organisation with the caller as partner admin', tags, body: PartnerSignUpSchema, response: AcceptedSchema, status: 202, before: limiters.signUp },
    c.signUpPartner,
  );
  api.route(
    { method: 'post', path: '/auth/resend-verification', summary: 'Send a new confirmation link', tags, body: ForgotPasswordSchema, response: AcceptedSchema, status: 202, before: limiters.reset },
    c.resendVerification,
  );
  api.route(
    {
      method: 'post',
      path: '/auth/sign-in',
      summary: 'Sign in; returns an access token and sets the refresh cookie',
      description:
        'Failed passwords are throttled per address and client IP (after 5, pauses of 1, 2, 4 … 60 minutes answer 429), alike for addresses with and without an account. 100 failures on one address in a day lock the account for 24 hours or until its owner uses the e-mailed reset link; a locked account answers like a wrong password.',
      tags,
      body: SignInSchema,
      response: SessionResponseSchema,
      before: limiters.signIn,
      problems: [401, 403],
    },
    c.signIn,
  );
  api.route(
    { method: 'post', path: '/auth/refresh', summary: 'Swap the refresh cookie for a new access token (rotating)', tags, response: SessionResponseSchema, problems: [401] },
    c.refresh,
  );
  api.route(
    { method: 'post', path: '/auth/sign-out', summary: 'Sign out: revokes this session', tags, response: AcceptedSchema },
    c.signOut,
  );
  api.route(
    { method: 'post', path: '/auth/verify-email', summary: 'Confirm the e-mail address with the link token; signs in', tags, body: VerifyEmailSchema, response: SessionResponseSchema },
    c.verifyEmail,
  );
  api.route(
    { method: 'post', path: '/auth/forgot-password', summary: 'E-mail a link to choose a new password', description: 'Answers the same whether or not the address has an account.', tags, body: ForgotPasswordSchema, response: AcceptedSchema, status: 202, before: limiters.reset },
    c.forgotPassword,
  );
  api.route(
    { method: 'post', path: '/auth/reset-password', summary: 'Choose a new password with the link token; ends every session', tags, body: ResetPasswordSchema, response: AcceptedSchema, before: limiters.reset },
    c.resetPassword,
  );
  api.route(
    { method: 'get', path: '/auth/invitations/:token', summary: 'What an invitation link offers', tags, params: z.object({ token: TokenSchema }), response: z.object({ data: InvitationPreviewSchema }), problems: [404] },
    c.previewInvitation,
  );
  api.route(
    { method: 'post', path: '/auth/invitations/accept', summary: 'Accept an invitation: creates or links the account; signs in', tags, body: AcceptInvitationSchema, response: SessionResponseSchema, before: limiters.invitation, problems: [401, 404] },
    c.acceptInvitation,
  );
}
