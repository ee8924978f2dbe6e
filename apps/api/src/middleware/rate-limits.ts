// Rate limits for the endpoints people abuse: per IP address and per account (e-mail address or
// signed-in user). Counters live in memory per instance; behind a load balancer use a shared
// store (express-rate-limit supports Redis and others) so limits hold across instances.
import type { Request, RequestHandler } from 'express';
import { rateLimit, type Options } from 'express-rate-limit';
import { createError } from '../lib/errors';

const TooManyRequests = createError('TOO_MANY_REQUESTS', 429, 'Too many attempts');

type PairLimit = { perIp: number; perAccount: number; windowMinutes: number };
type IpLimit = { perIp: number; windowMinutes: number };

export interface LimitSettings {
  /** Requests per window per IP and per account for each group. */
  signIn: PairLimit;
  signUp: PairLimit;
  reset: PairLimit;
  invitation: PairLimit;
  /** "Tell me when someone covers this": per IP and per e-mail address, like sign-up. */
  coverageAlert: PairLimit;
  /** The public search and place look-up are anonymous: per IP only. */
  search: IpLimit;
  places: IpLimit;
}

export const DEFAULT_LIMITS: LimitSettings = {
  signIn: { perIp: 50, perAccount: 20, windowMinutes: 15 },
  signUp: { perIp: 20, perAccount: 5, windowMinutes: 60 },
  reset: { perIp: 20, perAccount: 5, windowMinutes: 60 },
  invitation: { perIp: 60, perAccount: 30, windowMinutes: 60 },
  coverageAlert: { perIp: 20, perAccount: 5, windowMinutes: 60 },
  // a person filtering a result list or typing a place name, with room for a shared address
  search: { perIp: 300, windowMinutes: 1 },
  places: { perIp: 600, windowMinutes: 1 },
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

/** Settings left out (tests, benchmarks) keep their defaults. */
export function createLimiters(overrides: Partial<LimitSettings> = {}): Limiters {
  const settings: LimitSettings = { ...DEFAULT_LIMITS, ...overrides };
  const pair = (s: PairLimit, what: string) => [limiter(s.perIp, s.windowMinutes, 'ip', what), limiter(s.perAccount, s.windowMinutes, 'account', what)];
  const ip = (s: IpLimit, what: string) => [limiter(s.perIp, s.windowMinutes, 'ip', what)];
  return {
    signIn: pair(settings.signIn, 'sign-in'),
    signUp: pair(settings.signUp, 'sign-up'),
    reset: pair(settings.reset, 'password reset'),
    invitation: pair(settings.invitation, 'invitation'),
    coverageAlert: pair(settings.coverageAlert, 'coverage alert'),
    search: ip(settings.search, 'search'),
    places: ip(settings.places, 'place look-up'),
  };
}
