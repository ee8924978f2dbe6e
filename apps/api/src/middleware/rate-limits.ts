// Rate limits for the endpoints people abuse: per IP address, per link token and per account.
// Counters of the account routes live in MariaDB, shared by every API instance; the public
// search's stay in memory (see createLimiters).
import type { Request, RequestHandler } from 'express';
import { ipKeyGenerator, rateLimit, type Options, type Store } from 'express-rate-limit';
import type { DataSource } from 'typeorm';
import { InvitationEntity, OneTimeTokenEntity } from '../entities';
import { createError } from '../lib/errors';
import type { Logger } from '../lib/logger';
import { hashToken } from '../lib/secure-token';
import { MariaDbStore, RateLimitTable } from './rate-limit-store';

const TooManyRequests = createError('TOO_MANY_REQUESTS', 429, 'Too many attempts');

type PairLimit = { perIp: number; perAccount: number; windowMinutes: number };
type IpLimit = { perIp: number; windowMinutes: number };

export interface LimitSettings {
  /** Requests per window per IP and per account (and per link token) for each group. */
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
  // per address well above what the sign-in throttle lets a stranger try (5 a pair, then growing
  // pauses), so guesses from a few addresses cannot stop the owner signing in
  signIn: { perIp: 50, perAccount: 200, windowMinutes: 15 },
  signUp: { perIp: 20, perAccount: 5, windowMinutes: 60 },
  reset: { perIp: 20, perAccount: 5, windowMinutes: 60 },
  invitation: { perIp: 60, perAccount: 30, windowMinutes: 60 },
  coverageAlert: { perIp: 20, perAccount: 5, windowMinutes: 60 },
  // a person filtering a result list or typing a place name, with room for a shared address
  search: { perIp: 300, windowMinutes: 1 },
  places: { perIp: 600, windowMinutes: 1 },
};

/** The account a link token of a group belongs to, as a counter key; null when no account has it. */
type AccountOfToken = (dataSource: DataSource, tokenHash: string) => Promise<string | null>;

// Used or lapsed links still name their account: a run of tries is counted against it all the same.
const ACCOUNT_OF_TOKEN: Partial<Record<keyof LimitSettings, AccountOfToken>> = {
  reset: async (ds, tokenHash) => {
    const row = await ds.getRepository(OneTimeTokenEntity).findOne({ select: { userId: true }, where: { tokenHash, purpose: 'reset_password' } });
    return row ? `user:${row.userId}` : null;
  },
  // the invited address, whether or not it has an account yet; apart from the "email:" keys the
  // invite route counts, so that an admin's resending does not use up the invitee's acceptances
  invitation: async (ds, tokenHash) => {
    const row = await ds.getRepository(InvitationEntity).findOne({ select: { email: true }, where: { tokenHash } });
    return row ? `invitee:${row.email.toLowerCase()}` : null;
  },
};

/** Who a request speaks for: a link token (by its hash) and the account, when anything names them. */
type Identity = { tokenKey: string | null; accountKey: string | null };

/**
 * The routes of the reset and invitation groups carry a link token instead of an address. Keying
 * them all on "no address" made one bucket for the whole platform; each token is its own bucket
 * now, and a token that names an account also counts against that account. Every identifier in
 * the body counts, so adding a made-up token or address never takes a request out of a count.
 */
async function identify(req: Request, accountOfToken: AccountOfToken | undefined, dataSource: DataSource): Promise<Identity> {
  const body = req.body as { token?: unknown; email?: unknown } | undefined;
  const email = typeof body?.email === 'string' ? body.email.trim().toLowerCase() : '';
  const emailKey = email ? `email:${email}` : null;
  // groups without link tokens ignore a token field
  if (!accountOfToken || typeof body?.token !== 'string' || !body.token) return { tokenKey: null, accountKey: emailKey };
  // the raw token never becomes a key: the key is its hash, as the database keeps it
  const tokenHash = hashToken(body.token);
  return { tokenKey: `token:${tokenHash}`, accountKey: (await accountOfToken(dataSource, tokenHash)) ?? emailKey };
}

const ipKey = (req: Request): string => ipKeyGenerator(req.ip ?? '');

const WHAT: Record<keyof LimitSettings, string> = {
  signIn: 'sign-in',
  signUp: 'sign-up',
  reset: 'password reset',
  invitation: 'invitation',
  coverageAlert: 'coverage alert',
  search: 'search',
  places: 'place look-up',
};

export type Limiters = Record<keyof LimitSettings, RequestHandler[]>;

export interface LimiterDeps {
  dataSource: DataSource;
  logger: Logger;
  /**
   * Prepended to every counter key. Instances that should share limits (all of one deployment)
   * share a scope; the tests give each app its own, so one test's requests never count in another's.
   */
  scope?: string;
}

/** Settings left out (tests, benchmarks) keep their defaults. */
export function createLimiters(deps: LimiterDeps, overrides: Partial<LimitSettings> = {}): Limiters {
  const settings: LimitSettings = { ...DEFAULT_LIMITS, ...overrides };
  const table = new RateLimitTable(deps.dataSource, deps.logger);
  const scope = deps.scope ?? '';
  const limiter = (group: keyof LimitSettings, limit: number, windowMinutes: number, store: Store | undefined, o: Pick<Partial<Options>, 'keyGenerator' | 'skip'> = {}): RequestHandler =>
    rateLimit({
      windowMs: windowMinutes * 60_000,
      limit,
      standardHeaders: 'draft-8',
      legacyHeaders: false,
      // no store given: express-rate-limit's memory store, per instance
      ...(store ? { store } : {}),
      handler: (_req, _res, next) => next(TooManyRequests(`Too many ${WHAT[group]} attempts. Please wait a few minutes and try again.`)),
      keyGenerator: ipKey,
      ...o,
    });

  const shared = (group: keyof LimitSettings, kind: string) => new MariaDbStore(table, `${scope}${group}:${kind}:`);

  const pair = (group: keyof LimitSettings, s: PairLimit): RequestHandler[] => {
    // the limiters of one request ask once; the account look-up is a query for token routes
    const identities = new WeakMap<Request, Promise<Identity>>();
    const identity = (req: Request): Promise<Identity> => {
      let found = identities.get(req);
      if (!found) identities.set(req, (found = identify(req, ACCOUNT_OF_TOKEN[group], deps.dataSource)));
      return found;
    };
    return [
      limiter(group, s.perIp, s.windowMinutes, shared(group, 'ip')),
      limiter(group, s.perAccount, s.windowMinutes, shared(group, 'token'), {
        skip: async (req) => !(await identity(req)).tokenKey,
        keyGenerator: async (req) => (await identity(req)).tokenKey!,
      }),
      limiter(group, s.perAccount, s.windowMinutes, shared(group, 'account'), {
        // a token that names no account is already counted on its own; a request that names
        // nothing at all is counted per IP, so that it uses up nobody else's tries
        skip: async (req) => {
          const { tokenKey, accountKey } = await identity(req);
          return !!tokenKey && !accountKey;
        },
        keyGenerator: async (req) => (await identity(req)).accountKey ?? `ip:${ipKey(req)}`,
      }),
    ];
  };
  const local = (group: keyof LimitSettings, s: IpLimit): RequestHandler[] => [limiter(group, s.perIp, s.windowMinutes, undefined)];

  return {
    signIn: pair('signIn', settings.signIn),
    signUp: pair('signUp', settings.signUp),
    reset: pair('reset', settings.reset),
    invitation: pair('invitation', settings.invitation),
    coverageAlert: pair('coverageAlert', settings.coverageAlert),
    // Kept in memory, per instance: a shared counter costs a database write per search (measured
    // 0.4-1.5 ms a hit, against a search of about 1.7 ms), and these generous anonymous per-IP limits
    // only smooth out floods; with n instances an address gets up to n times the limit.
    search: local('search', settings.search),
    places: local('places', settings.places),
  };
}
