// Sign-up, sign-in with lock-out, e-mail verification and password reset. Answers that could
// tell whether an address has an account are the same either way.
import bcrypt from 'bcryptjs';
import { IsNull, type EntityManager } from 'typeorm';
import { PASSWORD_IS_EMAIL_MESSAGE, passwordMatchesEmail, type OwnerSignUp, type PartnerSignUp } from '@emberline/domain';
import { MembershipEntity, OneTimeTokenEntity, OrganisationEntity, UserAccountEntity, type OneTimePurpose } from '../entities';
import type { ServiceContext } from '../lib/context';
import { createError, ValidationFailed } from '../lib/errors';
import { hashToken, newId, newToken } from '../lib/secure-token';
import { enqueueMail } from '../mail/outbox';
import { audit } from './audit.service';
import { issueSession, revokeAllSessions, type IssuedSession, type SessionSettings } from './session.service';

export interface AuthSettings extends SessionSettings {
  bcryptCost: number;
  publicUrl: string;
}

export const LOCKOUT_THRESHOLD = 10;
export const LOCKOUT_MINUTES = 15;
export const VERIFY_HOURS = 48;
export const RESET_MINUTES = 30;

export const InvalidCredentials = createError('INVALID_CREDENTIALS', 401, 'E-mail address or password is not right');
export const AccountLocked = createError('ACCOUNT_LOCKED', 429, 'Too many failed sign-ins');
export const EmailNotVerified = createError('EMAIL_NOT_VERIFIED', 403, 'Please confirm your e-mail address first');
export const InvalidLink = createError('INVALID_LINK', 400, 'This link is no longer valid');

// a real bcrypt hash of a random string: comparing against it costs the same time as a real check
const DUMMY_HASH = '$2b$12$a6jiy7a4w1e2j6Wx7E62JOsrl/LLmv6tjMQT8DtBB1yDVq1I3H2rG';

export const ACCEPTED_SIGN_UP = 'Thanks! If this address can be used, we have sent a link to confirm it. Please check your inbox.';
export const ACCEPTED_RESET = 'If an account uses this address, we have sent a link to choose a new password. Please check your inbox.';
export const ACCEPTED_RESEND = 'If this address has an account waiting for confirmation, we have sent a new link.';

export const hashPassword = (password: string, cost: number) => bcrypt.hash(password, cost);

export function appLink(settings: AuthSettings, app: 'directory' | 'console', route: string, token: string): string {
  const base = app === 'console' ? `${settings.publicUrl}/console` : settings.publicUrl;
  return `${base}/${route}?token=${encodeURIComponent(token)}`;
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

async function sendVerification(manager: EntityManager, user: UserAccountEntity, app: 'directory' | 'console', settings: AuthSettings) {
  const token = await createOneTimeToken(manager, user.id, 'verify_email', VERIFY_HOURS * 60);
  await enqueueMail(manager, {
    to: user.email,
    template: 'verify-email',
    locale: user.locale,
    data: { name: user.name, link: appLink(settings, app, 'verify-email', token) },
  });
}

async function createUser(manager: EntityManager, input: { name: string; email: string; password: string; locale: 'en' | 'de' }, settings: AuthSettings, flags: Partial<UserAccountEntity>) {
  const user = manager.getRepository(UserAccountEntity).create({
    id: newId(),
    email: input.email,
    name: input.name,
    locale: input.locale,
    passwordHash: await hashPassword(input.password, settings.bcryptCost),
    isOwner: false,
    isNetworkAdmin: false,
    emailVerifiedAt: null,
    failedSignIns: 0,
    lockedUntil: null,
    ...flags,
  });
  return manager.getRepository(UserAccountEntity).save(user);
}

/** Existing addresses get the same answer; an unconfirmed one gets a fresh link. */
async function handleExistingAddress(manager: EntityManager, existing: UserAccountEntity, password: string, app: 'directory' | 'console', settings: AuthSettings) {
  await bcrypt.hash(password, settings.bcryptCost); // same work as a real sign-up
  if (!existing.emailVerifiedAt) await sendVerification(manager, existing, app, settings);
}

export async function signUpOwner(ctx: ServiceContext, input: OwnerSignUp & { locale: 'en' | 'de' }, settings: AuthSettings): Promise<void> {
  const existing = await ctx.manager.getRepository(UserAccountEntity).findOneBy({ email: input.email });
  if (existing) return handleExistingAddress(ctx.manager, existing, input.password, 'directory', settings);
  const user = await createUser(ctx.manager, input, settings, { isOwner: true });
  await sendVerification(ctx.manager, user, 'directory', settings);
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

export async function signIn(ctx: ServiceContext, input: { email: string; password: string }, settings: AuthSettings): Promise<IssuedSession> {
  const users = ctx.manager.getRepository(UserAccountEntity);
  const user = await users.findOneBy({ email: input.email });
  if (!user) {
    await bcrypt.compare(input.password, DUMMY_HASH);
    throw InvalidCredentials('Check the address and password, or reset your password.');
  }
  if (user.lockedUntil && user.lockedUntil.getTime() > Date.now()) {
    const minutes = Math.ceil((user.lockedUntil.getTime() - Date.now()) / 60_000);
    throw AccountLocked(`Sign-in is paused for this account for ${minutes} more minute(s). You can reset your password meanwhile.`);
  }
  if (!(await bcrypt.compare(input.password, user.passwordHash))) {
    await users.increment({ id: user.id }, 'failedSignIns', 1);
    const failed = user.failedSignIns + 1;
    if (failed >= LOCKOUT_THRESHOLD) {
      await users.update({ id: user.id }, { failedSignIns: 0, lockedUntil: new Date(Date.now() + LOCKOUT_MINUTES * 60_000) });
      const resetToken = await createOneTimeToken(ctx.manager, user.id, 'reset_password', RESET_MINUTES);
      await enqueueMail(ctx.manager, {
        to: user.email,
        template: 'account-locked',
        locale: user.locale,
        data: { name: user.name, minutes: LOCKOUT_MINUTES, resetLink: appLink(settings, user.isOwner ? 'directory' : 'console', 'reset-password', resetToken) },
      });
      throw AccountLocked(`After ${LOCKOUT_THRESHOLD} failed attempts, sign-in is paused for ${LOCKOUT_MINUTES} minutes. We have e-mailed you.`);
    }
    throw InvalidCredentials('Check the address and password, or reset your password.');
  }
  if (!user.emailVerifiedAt) throw EmailNotVerified('Open the link we e-mailed you, or ask for a new one.');
  if (user.failedSignIns || user.lockedUntil) await users.update({ id: user.id }, { failedSignIns: 0, lockedUntil: null });
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

export async function forgotPassword(ctx: ServiceContext, email: string, app: 'directory' | 'console', settings: AuthSettings): Promise<void> {
  const user = await ctx.manager.getRepository(UserAccountEntity).findOneBy({ email });
  if (!user) return;
  const token = await createOneTimeToken(ctx.manager, user.id, 'reset_password', RESET_MINUTES);
  await enqueueMail(ctx.manager, {
    to: user.email,
    template: 'reset-password',
    locale: user.locale,
    data: { name: user.name, link: appLink(settings, app, 'reset-password', token), minutes: RESET_MINUTES },
  });
}

export async function resetPassword(ctx: ServiceContext, input: { token: string; password: string }, settings: AuthSettings): Promise<void> {
  const user = await consumeOneTimeToken(ctx.manager, input.token, 'reset_password');
  if (passwordMatchesEmail(user.email, input.password)) {
    throw ValidationFailed('Please correct the highlighted fields.', [{ path: 'password', message: PASSWORD_IS_EMAIL_MESSAGE }]);
  }
  await ctx.manager.getRepository(UserAccountEntity).update(
    { id: user.id },
    // the link arrived by e-mail, so the address is confirmed too
    { passwordHash: await hashPassword(input.password, settings.bcryptCost), failedSignIns: 0, lockedUntil: null, emailVerifiedAt: user.emailVerifiedAt ?? new Date() },
  );
  await revokeAllSessions(ctx.manager, user.id);
  await enqueueMail(ctx.manager, { to: user.email, template: 'password-changed', locale: user.locale, data: { name: user.name } });
}
