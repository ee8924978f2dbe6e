// Writes the audit log: who did what to which record, with the state before and after.
import { AuditLogEntity } from '../entities';
import type { ServiceContext } from '../lib/context';

export interface AuditEntry {
  action: string;
  entityType: string;
  entityId?: string | null;
  organisationId?: string | null;
  before?: object | null;
  after?: object | null;
}

export async function audit(ctx: ServiceContext, entry: AuditEntry): Promise<void> {
  await ctx.manager.getRepository(AuditLogEntity).insert({
    actorUserId: ctx.actor.userId,
    action: entry.action,
    entityType: entry.entityType,
    entityId: entry.entityId ?? null,
    organisationId: entry.organisationId ?? null,
    before: entry.before ?? null,
    after: entry.after ?? null,
    ip: ctx.actor.ip ?? null,
  });
}
