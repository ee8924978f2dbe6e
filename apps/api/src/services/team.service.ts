// A partner organisation's team: members, roles and invitations. Every query is scoped by the
// organisation the caller acts in; ids of another organisation's records are simply not found.
import { IsNull, MoreThan, type EntityManager } from 'typeorm';
import type { Invitation, InvitationPreview, Invite, MemberRole, Team } from '@emberline/domain';
import { InvitationEntity, MembershipEntity, OrganisationEntity, UserAccountEntity } from '../entities';
import type { ServiceContext } from '../lib/context';
import { createError, NotFound } from '../lib/errors';
import { hashToken, newId, newToken } from '../lib/secure-token';
import { enqueueMail } from '../mail/outbox';
import { audit } from './audit.service';
import { hashPassword } from '../lib/password-hash';
import { appLink, checkPassword, InvalidCredentials, type AuthSettings } from './auth.service';
import { issueSession, type IssuedSession } from './session.service';

export const INVITATION_DAYS = 7;
export const AlreadyMember = createError('ALREADY_MEMBER', 409, 'This person is already in your team');
export const LastAdmin = createError('LAST_ADMIN', 409, 'An organisation needs at least one partner admin');
export const InvitationInvalid = createError('INVITATION_INVALID', 404, 'This invitation is no longer valid');

function orgOf(ctx: ServiceContext): string {
  if (!ctx.actor.organisationId) throw new Error('team service called outside an organisation scope');
  return ctx.actor.organisationId;
}

function toInvitation(i: InvitationEntity & { invitedByName?: string }): Invitation {
  return { id: i.id, email: i.email, role: i.role, invitedBy: i.invitedByName ?? '', createdAt: i.createdAt.toISOString(), expiresAt: i.expiresAt.toISOString() };
}

async function pendingInvitations(manager: EntityManager, organisationId: string): Promise<Invitation[]> {
  const rows = await manager
    .getRepository(InvitationEntity)
    .createQueryBuilder('i')
    .leftJoin(UserAccountEntity, 'u', 'u.id = i.invited_by_user_id')
    .addSelect('u.name', 'invited_by_name')
    .where('i.organisation_id = :organisationId', { organisationId })
    .andWhere('i.accepted_at IS NULL AND i.revoked_at IS NULL AND i.expires_at > :now', { now: new Date() })
    .orderBy('i.created_at', 'DESC')
    .getRawAndEntities();
  return rows.entities.map((e, index) => toInvitation({ ...e, invitedByName: rows.raw[index]?.invited_by_name ?? '' }));
}

export async function getTeam(ctx: ServiceContext): Promise<Team> {
  const organisationId = orgOf(ctx);
  const members = await ctx.manager.getRepository(MembershipEntity).find({ where: { organisationId }, relations: { user: true }, order: { createdAt: 'ASC' } });
  return {
    members: members.map((m) => ({ userId: m.userId, name: m.user.name, email: m.user.email, role: m.role, joinedAt: m.createdAt.toISOString() })),
    invitations: await pendingInvitations(ctx.manager, organisationId),
  };
}

export async function getOrganisationSummary(ctx: ServiceContext) {
  const org = await ctx.manager.getRepository(OrganisationEntity).findOneByOrFail({ id: orgOf(ctx) });
  const members = await ctx.manager.getRepository(MembershipEntity).countBy({ organisationId: org.id });
  return { id: org.id, name: org.name, status: org.status, statusReason: org.statusReason, members, createdAt: org.createdAt.toISOString() };
}

export async function invite(ctx: ServiceContext, input: Invite & { email: string }, settings: AuthSettings): Promise<Invitation> {
  const organisationId = orgOf(ctx);
  const existingUser = await ctx.manager.getRepository(UserAccountEntity).findOneBy({ email: input.email });
  if (existingUser && (await ctx.manager.getRepository(MembershipEntity).existsBy({ organisationId, userId: existingUser.id }))) {
    throw AlreadyMember(`${input.email} is already a member of this organisation.`);
  }
  const invitations = ctx.manager.getRepository(InvitationEntity);
  // inviting the same address again replaces the earlier link
  await invitations.update({ organisationId, email: input.email, acceptedAt: IsNull(), revokedAt: IsNull() }, { revokedAt: new Date() });
  const { token, hash } = newToken();
  const row = invitations.create({
    id: newId(),
    organisationId,
    email: input.email,
    role: input.role,
    tokenHash: hash,
    invitedByUserId: ctx.actor.userId!,
    expiresAt: new Date(Date.now() + INVITATION_DAYS * 86_400_000),
    acceptedAt: null,
    revokedAt: null,
  });
  await invitations.insert(row);
  const [org, inviter] = await Promise.all([
    ctx.manager.getRepository(OrganisationEntity).findOneByOrFail({ id: organisationId }),
    ctx.manager.getRepository(UserAccountEntity).findOneByOrFail({ id: ctx.actor.userId! }),
  ]);
  await enqueueMail(ctx.manager, {
    to: input.email,
    template: 'invitation',
    locale: existingUser?.locale ?? inviter.locale,
    data: { inviterName: inviter.name, organisationName: org.name, role: input.role, link: appLink(settings, 'console', 'accept-invitation', token), days: INVITATION_DAYS },
  });
  await audit(ctx, { action: 'invitation.create', entityType: 'invitation', entityId: row.id, organisationId, after: { email: row.email, role: row.role } });
  const saved = await invitations.findOneByOrFail({ id: row.id });
  return toInvitation({ ...saved, invitedByName: inviter.name });
}

export async function revokeInvitation(ctx: ServiceContext, invitationId: string): Promise<void> {
  const organisationId = orgOf(ctx);
  const invitations = ctx.manager.getRepository(InvitationEntity);
  const row = await invitations.findOneBy({ id: invitationId, organisationId, acceptedAt: IsNull(), revokedAt: IsNull() });
  if (!row) throw NotFound('There is no such pending invitation.');
  await invitations.update({ id: row.id }, { revokedAt: new Date() });
  await audit(ctx, { action: 'invitation.revoke', entityType: 'invitation', entityId: row.id, organisationId, before: { email: row.email, role: row.role } });
}

async function findMember(ctx: ServiceContext, userId: string): Promise<MembershipEntity> {
  const m = await ctx.manager.getRepository(MembershipEntity).findOne({ where: { organisationId: orgOf(ctx), userId }, lock: { mode: 'pessimistic_write' } });
  if (!m) throw NotFound('There is no such member in this organisation.');
  return m;
}

async function assertAnotherAdmin(ctx: ServiceContext, userId: string): Promise<void> {
  const admins = await ctx.manager.getRepository(MembershipEntity).find({ where: { organisationId: orgOf(ctx), role: 'partner_admin' }, lock: { mode: 'pessimistic_write' } });
  if (!admins.some((a) => a.userId !== userId)) throw LastAdmin('Make someone else a partner admin first.');
}

export async function changeRole(ctx: ServiceContext, userId: string, role: MemberRole): Promise<void> {
  const member = await findMember(ctx, userId);
  if (member.role === role) return;
  if (member.role === 'partner_admin') await assertAnotherAdmin(ctx, userId);
  await ctx.manager.getRepository(MembershipEntity).update({ organisationId: member.organisationId, userId }, { role });
  await audit(ctx, { action: 'membership.change-role', entityType: 'membership', entityId: userId, organisationId: member.organisationId, before: { role: member.role }, after: { role } });
}

export async function removeMember(ctx: ServiceContext, userId: string): Promise<void> {
  const member = await findMember(ctx, userId);
  if (member.role === 'partner_admin') await assertAnotherAdmin(ctx, userId);
  await ctx.manager.getRepository(MembershipEntity).delete({ organisationId: member.organisationId, userId });
  await audit(ctx, { action: 'membership.remove', entityType: 'membership', entityId: userId, organisationId: member.organisationId, before: { role: member.role } });
}

async function findValidInvitation(manager: EntityManager, token: string, lock = false): Promise<InvitationEntity> {
  const row = await manager.getRepository(InvitationEntity).findOne({
    where: { tokenHash: hashToken(token), acceptedAt: IsNull(), revokedAt: IsNull(), expiresAt: MoreThan(new Date()) },
    ...(lock ? { lock: { mode: 'pessimistic_write' as const } } : {}),
  });
  if (!row) throw InvitationInvalid('Ask the person who invited you to send a new invitation.');
  return row;
}

export async function previewInvitation(manager: EntityManager, token: string): Promise<InvitationPreview> {
  const row = await findValidInvitation(manager, token);
  const org = await manager.getRepository(OrganisationEntity).findOneByOrFail({ id: row.organisationId });
  const accountExists = await manager.getRepository(UserAccountEntity).existsBy({ email: row.email });
  return { organisationName: org.name, role: row.role, email: row.email, accountExists };
}

export interface AcceptInput {
  token: string;
  name?: string;
  password: string;
}

/**
 * Accepting creates the account (the link proves the address) or checks the existing account's
 * password, through the same throttle and lock as sign-in (an invitation is no way around them).
 */
export async function acceptInvitation(ctx: ServiceContext, input: AcceptInput, settings: AuthSettings, validateNewPassword: (email: string, password: string, name?: string) => void): Promise<IssuedSession> {
  const invitation = await findValidInvitation(ctx.manager, input.token, true);
  const users = ctx.manager.getRepository(UserAccountEntity);
  let user = await users.findOneBy({ email: invitation.email });
  if (user) {
    if (!(await checkPassword(ctx, user.email, user, input.password, settings))) throw InvalidCredentials('Enter the password of your existing Emberline account.');
    if (!user.emailVerifiedAt) await users.update({ id: user.id }, { emailVerifiedAt: new Date() });
  } else {
    validateNewPassword(invitation.email, input.password, input.name);
    user = users.create({
      id: newId(),
      email: invitation.email,
      name: input.name!.trim(),
      locale: 'en',
      passwordHash: await hashPassword(input.password, settings.passwordHashCost),
      isOwner: false,
      isNetworkAdmin: false,
      emailVerifiedAt: new Date(),
      lockedUntil: null,
    });
    await users.save(user);
  }
  const memberships = ctx.manager.getRepository(MembershipEntity);
  if (!(await memberships.existsBy({ organisationId: invitation.organisationId, userId: user.id }))) {
    await memberships.insert({ organisationId: invitation.organisationId, userId: user.id, role: invitation.role });
  }
  await ctx.manager.getRepository(InvitationEntity).update({ id: invitation.id }, { acceptedAt: new Date() });
  await audit({ ...ctx, actor: { ...ctx.actor, userId: user.id } }, {
    action: 'invitation.accept',
    entityType: 'invitation',
    entityId: invitation.id,
    organisationId: invitation.organisationId,
    after: { userId: user.id, role: invitation.role },
  });
  return issueSession(ctx.manager, (await users.findOneByOrFail({ id: user.id })), settings);
}
