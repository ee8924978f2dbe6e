// Network-admin views: the e-mail log and the audit log.
import { In } from 'typeorm';
import type { MailLogEntry } from '@emberline/domain';
import { AuditLogEntity, MailOutboxEntity, UserAccountEntity } from '../entities';
import { newId } from '../lib/secure-token';
import { redactSecrets } from '../lib/redact';
import { audit } from './audit.service';
import { hashPassword } from '../lib/password-hash';
import type { ServiceContext } from '../lib/context';

export async function listMail(ctx: ServiceContext, filter: { status?: 'pending' | 'sent' | 'failed'; to?: string; limit: number }): Promise<MailLogEntry[]> {
  const qb = ctx.manager.getRepository(MailOutboxEntity).createQueryBuilder('m').orderBy('m.created_at', 'DESC').take(filter.limit);
  if (filter.status) qb.andWhere('m.status = :status', { status: filter.status });
  if (filter.to) qb.andWhere('m.to_address LIKE :to', { to: `%${filter.to.replace(/[%_\\]/g, '\\$&')}%` });
  const rows = await qb.getMany();
  // stored text is redacted already, except on rows queued before that and not yet sent
  return rows.map((m) => ({
    id: m.id,
    to: m.to,
    subject: redactSecrets(m.subject),
    template: m.template,
    status: m.status,
    attempts: m.attempts,
    lastError: m.lastError,
    createdAt: m.createdAt.toISOString(),
    sentAt: m.sentAt?.toISOString() ?? null,
    text: redactSecrets(m.text),
    html: redactSecrets(m.html),
  }));
}

export async function listAudit(ctx: ServiceContext, filter: { organisationId?: string; limit: number }) {
  const rows = await ctx.manager.getRepository(AuditLogEntity).find({
    where: filter.organisationId ? { organisationId: filter.organisationId } : {},
    order: { id: 'DESC' },
    take: filter.limit,
  });
  // names, not ids: one look-up for every actor on the page
  const actorIds = [...new Set(rows.map((r) => r.actorUserId).filter((id): id is string => !!id))];
  const actors = actorIds.length ? await ctx.manager.getRepository(UserAccountEntity).find({ where: { id: In(actorIds) }, select: { id: true, name: true } }) : [];
  const names = new Map(actors.map((u) => [u.id, u.name]));
  return rows.map((r) => ({
    id: String(r.id),
    actorUserId: r.actorUserId,
    actorName: (r.actorUserId && names.get(r.actorUserId)) ?? null,
    action: r.action,
    entityType: r.entityType,
    entityId: r.entityId,
    organisationId: r.organisationId,
    before: r.before ?? null,
    after: r.after ?? null,
    createdAt: r.createdAt.toISOString(),
  }));
}

/** Creates a network admin, or makes an existing account one (keeping its password). */
export async function createNetworkAdmin(
  ctx: ServiceContext,
  input: { email: string; name: string; password: string; passwordHashCost: number },
): Promise<'created' | 'promoted'> {
  const users = ctx.manager.getRepository(UserAccountEntity);
  const existing = await users.findOneBy({ email: input.email });
  if (existing) {
    await users.update({ id: existing.id }, { isNetworkAdmin: true, emailVerifiedAt: existing.emailVerifiedAt ?? new Date() });
    await audit(ctx, { action: 'user.grant-network-admin', entityType: 'user', entityId: existing.id, before: { isNetworkAdmin: existing.isNetworkAdmin }, after: { isNetworkAdmin: true } });
    return 'promoted';
  }
  const id = newId();
  await users.insert({
    id,
    email: input.email,
    name: input.name,
    locale: 'en',
    passwordHash: await hashPassword(input.password, input.passwordHashCost),
    isOwner: false,
    isNetworkAdmin: true,
    emailVerifiedAt: new Date(),
    lockedUntil: null,
  });
  await audit(ctx, { action: 'user.create-network-admin', entityType: 'user', entityId: id, after: { email: input.email, name: input.name } });
  return 'created';
}
