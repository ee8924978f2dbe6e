// Sign-up, sign-in, e-mail verification and password reset. Answers that could tell whether an
// address has an account are the same either way, in status, body and (as far as work goes) time.
//
// Lock-out: a stranger must not be able to lock an owner out. Failed passwords are throttled per
// address and client IP (sign-in-throttle.service.ts: 5 free, then pauses of 1, 2, 4 … 60 minutes),
// so a guesser's pauses do not touch the owner elsewhere. Unknown addresses are throttled alike,
// so a pause says nothing about an account. Only a spread-out attack (100 failures on one address
// in a day, from many IPs) locks the account itself, for 24 hours or until the owner proves the
// address with the e-mailed reset link; a locked account answers exactly like a wrong password.
import { randomBytes } from 'node:crypto';
import { setTimeout as sleep } from 'node:timers/promises';
import { IsNull, type EntityManager } from 'typeorm';
import { PASSWORD_IS_EMAIL_MESSAGE, passwordMatchesEmail, type OwnerSignUp, type PartnerSignUp } from '@emberline/domain';
import { MembershipEntity, OneTimeTokenEntity, OrganisationEntity, UserAccountEntity, type OneTimePurpose } from '../entities';
import type { ServiceContext } from '../lib/context';
import { createError, ValidationFailed } from '../lib/errors';
import { hashPassword, needsRehash, verifyPassword } from '../lib/password-hash';
import { hashToken, newId, newToken } from '../lib/secure-token';
import { enqueueMail } from '../mail/outbox';
import { audit } from './audit.service';
import { issueSession, revokeAllSessions, type IssuedSession, type SessionSettings } from './session.service';
import { beginPasswordAttempt, forgetFailures, passwordAccepted, sweepThrottle, throttleKeys } from './sign-in-throttle.service';

export interface AuthSettings extends SessionSettings {
  /** log2 of scrypt's N for new password hashes (lib/password-hash.ts). */
  passwordHashCost: number;
  publicUrl: string;
}

/** Failed passwords on one address within a day (from any IPs) that lock the account. */
export const ACCOUNT_LOCK_FAILURES = 100;
export const ACCOUNT_LOCK_HOURS = 24;
/** Forgot-password answers no sooner than this, so the work done only for a known address does not show. */
export const FORGOT_PASSWORD_MIN_MS = 250;
export const VERIFY_HOURS = 48;
export const RESET_MINUTES = 30;

export const InvalidCredentials = createError('INVALID_CREDENTIALS', 401, 'E-mail address or password is not right');
export const EmailNotVerified = createError('EMAIL_NOT_VERIFIED', 403, 'Please confirm your e-mail address first');
export const InvalidLink = createError('INVALID_LINK', 400, 'This link is no longer valid');

// a hash of a random secret at the configured cost: checking an unknown address costs what a
// real check costs
const dummyHashes = new Map<number, Promise<string>>();
function dummyHash(cost: number): Promise<string> {
  let hash = dummyHashes.get(cost);
  if (!hash) dummyHashes.set(cost, (hash = hashPassword(randomBytes(32).toString('base64url'), cost)));
  return hash;
}

export const ACCEPTED_SIGN_UP = 'Thanks! If this address can be used, we have sent a link to confirm it. Please check your inbox.';
export const ACCEPTED_RESET = 'If an account uses this address, we have sent a link to choose a new password. Please check your inbox.';
export const ACCEPTED_RESEND = 'If this address has an account waiting for confirmation, we have sent a new link.';

/** A one-time link; other parameters go before the token, which stays last (redacted to its end). */
export function appLink(settings: AuthSettings, app: 'directory' | 'console', route: string, token: string, params: Record<string, string> = {}): string {
  const base = app === 'console' ? `${settings.publicUrl}/console` : settings.publicUrl;
  const query = new URLSearchParams({ ...params, token }).toString();
  return `${base}/${route}?${query}`;
}

async function createOneTimeToken(manager: EntityManager, userId: string, purpose: OneTimePurpose, minutes: number): Promise<string> {
  const repo = manager.getRepository(OneTimeTokenEntity);
  // a new link replaces older unused ones of the same kind
  await repo.update({ userId, purpose, usedAt: IsNull() }, { usedAt: new Date() });
  const { token, hash } = newToken();
  await repo.insert({ id: newId(), userId, purpose, tokenHash: hash, expiresAt: new Date(Date.now() + minutes * 60_000), usedAt: null });
  return token;
}

/** Marks a one-time token used and returns its user; throws InvalidLink when unknown, used or expired. */
async function consumeOneTimeToken(manager: EntityManager, token: string, purpose: OneTimePurpose): Promise<UserAccountEntity> {
  const repo = manager.getRepository(OneTimeTokenEntity);
  const row = await repo.findOne({ where: { tokenHash: hashToken(token), purpose }, lock: { mode: 'pessimistic_write' } });
  if (!row || row.usedAt || row.expiresAt.getTime() <= Date.now()) {
    throw InvalidLink(purpose === 'verify_email' ? 'Please ask for a new confirmation link.' : 'Please ask for a new password link.');
  }
  await repo.update({ id: row.id }, { usedAt: new Date() });
  return manager.getRepository(UserAccountEntity).findOneByOrFail({ id: row.userId });
}

/** `returnTo` (validated as a same-app path by the route's schema) rides along as `next`, so the link lands where sign-up began. */
async function sendVerification(manager: EntityManager, user: UserAccountEntity, app: 'directory' | 'console', settings: AuthSettings, returnTo?: string) {
  const token = await createOneTimeToken(manager, user.id, 'verify_email', VERIFY_HOURS * 60);
  await enqueueMail(manager, {
    to: user.email,
    template: 'verify-email',
    locale: user.locale,
    data: { name: user.name, link: appLink(settings, app, 'verify-email', token, returnTo ? { next: returnTo } : {}) },
  });
}

async function createUser(manager: EntityManager, input: { name: string; email: string; password: string; locale: 'en' | 'de' }, settings: AuthSettings, flags: Partial<UserAccountEntity>) {
  const user = manager.getRepository(UserAccountEntity).create({
    id: newId(),
    email: input.email,
    name: input.name,
    locale: input.locale,
    passwordHash: await hashPassword(input.password, settings.passwordHashCost),
    isOwner: false,
    isNetworkAdmin: false,
    emailVerifiedAt: null,
    lockedUntil: null,
    ...flags,
  });
  return manager.getRepository(UserAccountEntity).save(user);
}

/** Existing addresses get the same answer; an unconfirmed one gets a fresh link. */
async function handleExistingAddress(manager: EntityManager, existing: UserAccountEntity, password: string, app: 'directory' | 'console', settings: AuthSettings, returnTo?: string) {
  await hashPassword(password, settings.passwordHashCost); // same work as a real sign-up
  if (!existing.emailVerifiedAt) await sendVerification(manager, existing, app, settings, returnTo);
}

export async function signUpOwner(ctx: ServiceContext, input: OwnerSignUp & { locale: 'en' | 'de' }, settings: AuthSettings): Promise<void> {
  const existing = await ctx.manager.getRepository(UserAccountEntity).findOneBy({ email: input.email });
  if (existing) return handleExistingAddress(ctx.manager, existing, input.password, 'directory', settings, input.returnTo);
  const user = await createUser(ctx.manager, input, settings, { isOwner: true });
  await sendVerification(ctx.manager, user, 'directory', settings, input.returnTo);
}

export async function signUpPartner(ctx: ServiceContext, input: PartnerSignUp & { locale: 'en' | 'de' }, settings: AuthSettings): Promise<void> {
  const existing = await ctx.manager.getRepository(UserAccountEntity).findOneBy({ email: input.email });
  if (existing) return handleExistingAddress(ctx.manager, existing, input.password, 'console', settings);
  const user = await createUser(ctx.manager, input, settings, {});
  const organisation = await ctx.manager.getRepository(OrganisationEntity).save({ id: newId(), name: input.organisationName, status: 'draft', statusReason: null });
  await ctx.manager.getRepository(MembershipEntity).insert({ organisationId: organisation.id, userId: user.id, role: 'partner_admin' });
  await audit({ ...ctx, actor: { ...ctx.actor, userId: user.id } }, {
    action: 'organisation.create',
    entityType: 'organisation',
    entityId: organisation.id,
    organisationId: organisation.id,
    after: { name: organisation.name, status: organisation.status },
  });
  await sendVerification(ctx.manager, user, 'console', settings);
}

export async function resendVerification(ctx: ServiceContext, email: string, app: 'directory' | 'console', settings: AuthSettings): Promise<void> {
  const user = await ctx.manager.getRepository(UserAccountEntity).findOneBy({ email });
  if (user && !user.emailVerifiedAt) await sendVerification(ctx.manager, user, app, settings);
}

/** Locks the account and e-mails its owner a reset link (which lifts the lock); once per lock. */
async function lockAccount(manager: EntityManager, user: UserAccountEntity, settings: AuthSettings): Promise<void> {
  await manager.connection.transaction(async (m) => {
    const now = new Date();
    const locked = await m
      .createQueryBuilder()
      .update(UserAccountEntity)
      .set({ lockedUntil: new Date(now.getTime() + ACCOUNT_LOCK_HOURS * 3_600_000) })
      .where('id = :id AND (locked_until IS NULL OR locked_until <= :now)', { id: user.id, now })
      .execute();
    if (!locked.affected) return;
    const resetToken = await createOneTimeToken(m, user.id, 'reset_password', RESET_MINUTES);
    await enqueueMail(m, {
      to: user.email,
      template: 'account-locked',
      locale: user.locale,
      data: { name: user.name, minutes: ACCOUNT_LOCK_HOURS * 60, resetLink: appLink(settings, user.isOwner ? 'directory' : 'console', 'reset-password', resetToken) },
    });
  });
}

/**
 * The one check of a password against an address, known (`user`) or not (null): throttled per
 * address and IP (throws SignInPaused), counted toward the account lock, and as slow either way.
 * True only when the account exists, is not locked and the password is right. The bookkeeping
 * is written outside the caller's transaction, so a failure that rolls it back still counts.
 * A right password whose hash is older (bcrypt, or another cost) is stored again as today's.
 */
export async function checkPassword(ctx: ServiceContext, email: string, user: UserAccountEntity | null, password: string, settings: AuthSettings): Promise<boolean> {
  const keys = throttleKeys(email, ctx.actor.ip);
  const { addressFailures } = await beginPasswordAttempt(ctx.manager, keys);
  const matches = await verifyPassword(password, user?.passwordHash ?? (await dummyHash(settings.passwordHashCost)));
  const locked = user?.lockedUntil != null && user.lockedUntil.getTime() > Date.now();
  if (user && matches && !locked) {
    await passwordAccepted(ctx.manager, keys);
    if (needsRehash(user.passwordHash, settings.passwordHashCost)) {
      // only over the hash just checked: a password reset meanwhile wins
      const fresh = await hashPassword(password, settings.passwordHashCost);
      await ctx.manager.getRepository(UserAccountEntity).update({ id: user.id, passwordHash: user.passwordHash }, { passwordHash: fresh });
      user.passwordHash = fresh;
    }
    return true;
  }
  if (user && !locked && addressFailures >= ACCOUNT_LOCK_FAILURES) await lockAccount(ctx.manager, user, settings);
  return false;
}

export async function signIn(ctx: ServiceContext, input: { email: string; password: string }, settings: AuthSettings): Promise<IssuedSession> {
  const users = ctx.manager.getRepository(UserAccountEntity);
  const user = await users.findOneBy({ email: input.email });
  const accepted = await checkPassword(ctx, input.email, user, input.password, settings);
  if (!accepted || !user) throw InvalidCredentials('Check the address and password, or reset your password.');
  if (!user.emailVerifiedAt) throw EmailNotVerified('Open the link we e-mailed you, or ask for a new one.');
  if (user.lockedUntil) await users.update({ id: user.id }, { lockedUntil: null });
  await sweepThrottle(ctx.manager);
  return issueSession(ctx.manager, user, settings);
}

export async function verifyEmail(ctx: ServiceContext, token: string, settings: AuthSettings): Promise<IssuedSession> {
  const user = await consumeOneTimeToken(ctx.manager, token, 'verify_email');
  if (!user.emailVerifiedAt) {
    user.emailVerifiedAt = new Date();
    await ctx.manager.getRepository(UserAccountEntity).update({ id: user.id }, { emailVerifiedAt: user.emailVerifiedAt });
  }
  return issueSession(ctx.manager, user, settings);
}

/**
 * Runs in its own transaction on `ctx.manager` (pass one outside any transaction) and answers no
 * sooner than FORGOT_PASSWORD_MIN_MS after it began, commit included: a known address costs a
 * token, a rendered mail and a commit that writes, an unknown one a single read.
 */
export async function forgotPassword(ctx: ServiceContext, email: string, app: 'directory' | 'console', settings: AuthSettings): Promise<void> {
  const started = performance.now();
  try {
    await ctx.manager.transaction(async (manager) => {
      const user = await manager.getRepository(UserAccountEntity).findOneBy({ email });
      if (!user) return;
      const token = await createOneTimeToken(manager, user.id, 'reset_password', RESET_MINUTES);
      await enqueueMail(manager, {
        to: user.email,
        template: 'reset-password',
        locale: user.locale,
        data: { name: user.name, link: appLink(settings, app, 'reset-password', token), minutes: RESET_MINUTES },
      });
    });
  } finally {
    await sleep(Math.max(0, started + FORGOT_PASSWORD_MIN_MS - performance.now()));
  }
}

export async function resetPassword(ctx: ServiceContext, input: { token: string; password: string }, settings: AuthSettings): Promise<void> {
  const user = await consumeOneTimeToken(ctx.manager, input.token, 'reset_password');
  if (passwordMatchesEmail(user.email, input.password)) {
    throw ValidationFailed('Please correct the highlighted fields.', [{ path: 'password', message: PASSWORD_IS_EMAIL_MESSAGE }]);
  }
  await ctx.manager.getRepository(UserAccountEntity).update(
    { id: user.id },
    // the link arrived by e-mail, so the address is confirmed too; a new token version ends
    // every access token issued before
    {
      passwordHash: await hashPassword(input.password, settings.passwordHashCost),
      lockedUntil: null,
      emailVerifiedAt: user.emailVerifiedAt ?? new Date(),
      tokenVersion: () => 'token_version + 1',
    },
  );
  await revokeAllSessions(ctx.manager, user.id);
  // the owner proved the address: its failure count and this IP's pause start afresh
  await forgetFailures(ctx.manager, throttleKeys(user.email, ctx.actor.ip));
  await enqueueMail(ctx.manager, { to: user.email, template: 'password-changed', locale: user.locale, data: { name: user.name } });
}
