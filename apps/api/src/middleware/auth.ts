// Authentication and authorisation guards: passport-jwt checks the bearer access token on every
// protected route; organisation routes resolve the caller's membership; roles are checked last.
import type { NextFunction, Request, RequestHandler, Response } from 'express';
import passport from 'passport';
import { ExtractJwt, Strategy as JwtStrategy } from 'passport-jwt';
import type { DataSource } from 'typeorm';
import { IdSchema, type Role } from '@emberline/domain';
import { MembershipEntity, OrganisationEntity, UserAccountEntity } from '../entities';
import type { Actor } from '../lib/context';
import { createError } from '../lib/errors';
import { JWT_AUDIENCE, JWT_ISSUER, platformRoles } from '../services/session.service';

export const NotSignedIn = createError('NOT_SIGNED_IN', 401, 'Please sign in');
export const Forbidden = createError('FORBIDDEN', 403, 'You are not allowed to do this');
const OrganisationNotFound = createError('NOT_FOUND', 404, 'Not found');

declare module 'express-serve-static-core' {
  interface Request {
    actor?: Actor;
    account?: UserAccountEntity;
  }
}

export interface Guards {
  authenticate: RequestHandler;
  /** Signs the caller in when a bearer token is sent (a bad one is still 401); anonymous otherwise. */
  optionalAuthenticate: RequestHandler;
  orgScope: RequestHandler;
  requireRoles(roles: Role[]): RequestHandler;
}

export function createGuards(dataSource: DataSource, jwtSecret: string): Guards {
  const authenticator = new passport.Passport();
  authenticator.use(
    new JwtStrategy(
      {
        jwtFromRequest: ExtractJwt.fromAuthHeaderAsBearerToken(),
        secretOrKey: jwtSecret,
        algorithms: ['HS256'],
        issuer: JWT_ISSUER,
        audience: JWT_AUDIENCE,
      },
      (payload: { sub?: string; typ?: string; ver?: unknown }, done: (err: unknown, user?: UserAccountEntity | false) => void) => {
        if (payload.typ !== 'access' || !payload.sub) return done(null, false);
        // tokens from before versions existed count as version 0
        const version = payload.ver ?? 0;
        dataSource
          .getRepository(UserAccountEntity)
          .findOneBy({ id: payload.sub })
          // a password reset raised the account's version: tokens issued before it are void
          .then((user) => done(null, user && user.tokenVersion === version ? user : false), done);
      },
    ),
  );

  const authenticate: RequestHandler = (req, res, next) => {
    authenticator.authenticate('jwt', { session: false }, (err: unknown, user: UserAccountEntity | false, info?: { message?: string; name?: string }) => {
      if (err) return next(err);
      if (!user) {
        const expired = info?.name === 'TokenExpiredError';
        return next(NotSignedIn(expired ? 'Your session has expired: please sign in again.' : 'This needs a signed-in account.'));
      }
      req.account = user;
      req.actor = { userId: user.id, roles: platformRoles(user), organisationId: null, ip: req.ip ?? null };
      next();
    })(req, res, next);
  };

  const optionalAuthenticate: RequestHandler = (req, res, next) => {
    if (!req.headers.authorization) return next();
    authenticate(req, res, next);
  };

  /** For /orgs/:orgId/… — members act in their organisation; network admins in any. Others get 404. */
  const orgScope: RequestHandler = async (req: Request, _res: Response, next: NextFunction) => {
    const user = req.account;
    if (!user || !req.actor) return next(NotSignedIn());
    const orgId = IdSchema.safeParse(req.params.orgId);
    if (!orgId.success) return next(OrganisationNotFound('There is no such organisation.'));
    const membership = await dataSource.getRepository(MembershipEntity).findOneBy({ organisationId: orgId.data, userId: user.id });
    if (membership) {
      req.actor = { ...req.actor, organisationId: orgId.data, roles: [...req.actor.roles, membership.role] };
      return next();
    }
    if (user.isNetworkAdmin && (await dataSource.getRepository(OrganisationEntity).existsBy({ id: orgId.data }))) {
      req.actor = { ...req.actor, organisationId: orgId.data };
      return next();
    }
    next(OrganisationNotFound('There is no such organisation.'));
  };

  const requireRoles = (roles: Role[]): RequestHandler => (req, _res, next) => {
    const held = req.actor?.roles ?? [];
    if (!req.actor?.userId) return next(NotSignedIn());
    if (!roles.some((r) => held.includes(r))) return next(Forbidden(`This needs one of these roles: ${roles.join(', ')}.`));
    next();
  };

  return { authenticate, optionalAuthenticate, orgScope, requireRoles };
}
