// Who hears about what: the partner admins of an organisation, the network admins, and the
// Console pages their e-mails link to.
import type { EntityManager } from 'typeorm';
import { MembershipEntity, UserAccountEntity } from '../entities';

export async function partnerAdminsOf(manager: EntityManager, organisationId: string): Promise<UserAccountEntity[]> {
  const rows = await manager.getRepository(MembershipEntity).find({ where: { organisationId, role: 'partner_admin' }, relations: { user: true }, order: { createdAt: 'ASC' } });
  return rows.map((m) => m.user);
}

export function networkAdmins(manager: EntityManager): Promise<UserAccountEntity[]> {
  return manager.getRepository(UserAccountEntity).find({ where: { isNetworkAdmin: true }, order: { createdAt: 'ASC' } });
}

/** Console pages the onboarding e-mails open. */
export const consoleLinks = {
  application: (publicUrl: string) => `${publicUrl}/console/application`,
  review: (publicUrl: string, organisationId: string) => `${publicUrl}/console/admin/applications/${encodeURIComponent(organisationId)}`,
};
