// Sign-up, sign-in, session refresh and sign-out, verification, password reset and invitations.
// Mutations run in one transaction each, so an e-mail is queued only with the change it reports.
import type { Request, Response } from 'express';
import { passwordProblems, type AcceptInvitation, type OwnerSignUp, type PartnerSignUp } from '@emberline/domain';
import type { AppContext } from '../app-context';
import type { Actor } from '../lib/context';
import { ValidationFailed } from '../lib/errors';
import * as auth from '../services/auth.service';
import * as sessions from '../services/session.service';
import * as team from '../services/team.service';

export const REFRESH_COOKIE = 'emberline_refresh';
/**
 * A harmless, readable companion of the httpOnly refresh cookie: it only says "a session may
 * exist", so the apps try to restore a session at start-up only when there is one to restore.
 */
export const SESSION_HINT_COOKIE = 'emberline_session';
const REFRESH_PATH = '/api/auth';

export function authController({ dataSource, authSettings }: AppContext) {
  const secure = authSettings.publicUrl.startsWith('https:');
  const tx = <T>(actor: Actor, fn: (ctx: { manager: import('typeorm').EntityManager; actor: Actor }) => Promise<T>) =>
    dataSource.transaction((manager) => fn({ manager, actor }));

  function respondWithSession(res: Response, session: sessions.IssuedSession) {
    res.cookie(REFRESH_COOKIE, session.refreshToken, { httpOnly: true, sameSite: 'strict', secure, path: REFRESH_PATH, expires: session.refreshExpiresAt });
    res.cookie(SESSION_HINT_COOKIE, '1', { httpOnly: false, sameSite: 'strict', secure, path: '/', expires: session.refreshExpiresAt });
    res.set('cache-control', 'no-store');
    const { refreshToken: _hidden, refreshExpiresAt: _expires, ...body } = session;
    return { data: body };
  }
  const clearCookie = (res: Response) => {
    res.clearCookie(REFRESH_COOKIE, { httpOnly: true, sameSite: 'strict', secure, path: REFRESH_PATH });
    res.clearCookie(SESSION_HINT_COOKIE, { httpOnly: false, sameSite: 'strict', secure, path: '/' });
  };
  const cookieOf = (req: Request): string | undefined => (req.cookies as Record<string, string> | undefined)?.[REFRESH_COOKIE];
  const accepted = (message: string) => ({ data: { accepted: true as const, message } });
  // these routes are anonymous; the password throttle keys on the client's address
  const withIp = (actor: Actor, req: Request): Actor => ({ ...actor, ip: actor.ip ?? req.ip ?? null });

  return {
    signUpOwner: async ({ body, actor }: { body: OwnerSignUp & { email: string; locale: 'en' | 'de' }; actor: Actor }) => {
      await tx(actor, (ctx) => auth.signUpOwner(ctx, body, authSettings));
      return accepted(auth.ACCEPTED_SIGN_UP);
    },
    signUpPartner: async ({ body, actor }: { body: PartnerSignUp & { email: string; locale: 'en' | 'de' }; actor: Actor }) => {
      await tx(actor, (ctx) => auth.signUpPartner(ctx, body, authSettings));
      return accepted(auth.ACCEPTED_SIGN_UP);
    },
    resendVerification: async ({ body, actor }: { body: { email: string; app: 'directory' | 'console' }; actor: Actor }) => {
      await tx(actor, (ctx) => auth.resendVerification(ctx, body.email, body.app, authSettings));
      return accepted(auth.ACCEPTED_RESEND);
    },
    signIn: async ({ body, req, res, actor }: { body: { email: string; password: string }; req: Request; res: Response; actor: Actor }) => {
      // lock-out bookkeeping must persist even though sign-in fails, so this runs without a wrapping transaction
      const session = await auth.signIn({ manager: dataSource.manager, actor: withIp(actor, req) }, body, authSettings);
      return respondWithSession(res, session);
    },
    refresh: async ({ req, res, actor }: { req: Request; res: Response; actor: Actor }) => {
      const outcome = await tx(actor, (ctx) => sessions.rotateRefreshToken(ctx.manager, cookieOf(req), authSettings));
      if ('session' in outcome) return respondWithSession(res, outcome.session);
      if (outcome.reusedFamily) await sessions.revokeFamily(dataSource.manager, outcome.reusedFamily);
      clearCookie(res);
      throw outcome.error;
    },
    signOut: async ({ req, res }: { req: Request; res: Response }) => {
      await sessions.revokeRefreshToken(dataSource.manager, cookieOf(req));
      clearCookie(res);
      return accepted('You are signed out.');
    },
    verifyEmail: async ({ body, res, actor }: { body: { token: string }; res: Response; actor: Actor }) =>
      respondWithSession(res, await tx(actor, (ctx) => auth.verifyEmail(ctx, body.token, authSettings))),
    forgotPassword: async ({ body, actor }: { body: { email: string; app: 'directory' | 'console' }; actor: Actor }) => {
      // its own transaction, so its minimum answer time covers the commit too
      await auth.forgotPassword({ manager: dataSource.manager, actor }, body.email, body.app, authSettings);
      return accepted(auth.ACCEPTED_RESET);
    },
    resetPassword: async ({ body, req, actor }: { body: { token: string; password: string }; req: Request; actor: Actor }) => {
      await tx(withIp(actor, req), (ctx) => auth.resetPassword(ctx, body, authSettings));
      return accepted('Your password has been changed. Please sign in with the new one.');
    },
    previewInvitation: async ({ params }: { params: { token: string } }) => ({ data: await team.previewInvitation(dataSource.manager, params.token) }),
    acceptInvitation: async ({ body, req, res, actor }: { body: AcceptInvitation; req: Request; res: Response; actor: Actor }) => {
      const validateNewPassword = (email: string, password: string, name?: string) => {
        const errors = passwordProblems(email, password).map((message) => ({ path: 'password', message }));
        if (!name?.trim()) errors.unshift({ path: 'name', message: 'Enter your name' });
        if (errors.length) throw ValidationFailed('Please correct the highlighted fields.', errors);
      };
      return respondWithSession(res, await tx(withIp(actor, req), (ctx) => team.acceptInvitation(ctx, body, authSettings, validateNewPassword)));
    },
  };
}
