// Rate limits for the endpoints people abuse: per IP address and per account (e-mail address or
// signed-in user). Counters live in memory per instance; behind a load balancer use a shared
// store (express-rate-limit supports Redis and others) so limits hold across instances.
import type { Request, RequestHandler } from 'express';
import { rateLimit, type Options } from 'express-rate-limit';
import { createError } from '../lib/errors';

const TooManyRequests = createError('TOO_MANY_REQUESTS', 429, 'Too many attempts');

export interface LimitSettings {
  /** Requests per window per IP and per account for each group. */
  signIn: { perIp: number; perAccount: number; windowMinutes: number };
  signUp: { perIp: number; perAccount: number; windowMinutes: number };
  reset: { perIp: number; perAccount: number; windowMinutes: number };
  invitation: { perIp: number; perAccount: number; windowMinutes: number };
}

export const DEFAULT_LIMITS: LimitSettings = {
  signIn: { perIp: 50, perAccount: 20, windowMinutes: 15 },
  signUp: { perIp: 20, perAccount: 5, windowMinutes: 60 },
  reset: { perIp: 20, perAccount: 5, windowMinutes: 60 },
  invitation: { perIp: 60, perAccount: 30, windowMinutes: 60 },
};

const accountKey = (req: Request): string => {
  const email = typeof req.body?.email === 'string' ? req.body.email.trim().toLowerCase() : '';
  return req.account?.id ? `user:${req.account.id}` : `email:${email || 'none'}`;
};

function limiter(limit: number, windowMinutes: number, key: 'ip' | 'account', what: string): RequestHandler {
  const options: Partial<Options> = {
    windowMs: windowMinutes * 60_000,
    limit,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    handler: (_req, _res, next) => next(TooManyRequests(`Too many ${what} attempts. Please wait a few minutes and try again.`)),
  };
  if (key === 'account') options.keyGenerator = accountKey;
  return rateLimit(options);
}

export type Limiters = Record<keyof LimitSettings, RequestHandler[]>;

export function createLimiters(settings: LimitSettings = DEFAULT_LIMITS): Limiters {
  const pair = (s: LimitSettings[keyof LimitSettings], what: string) => [limiter(s.perIp, s.windowMinutes, 'ip', what), limiter(s.perAccount, s.windowMinutes, 'account', what)];
  return {
    signIn: pair(settings.signIn, 'sign-in'),
    signUp: pair(settings.signUp, 'sign-up'),
    reset: pair(settings.reset, 'password reset'),
    invitation: pair(settings.invitation, 'invitation'),
  };
}
