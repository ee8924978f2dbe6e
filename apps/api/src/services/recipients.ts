// Who hears about what: the partner admins of an organisation, the network admins, and the
// Console and Directory pages their e-mails link to.
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
  booking: (publicUrl: string, bookingId: string) => `${publicUrl}/console/bookings/${encodeURIComponent(bookingId)}`,
};

/** Directory pages the owners' e-mails open. */
export const directoryLinks = {
  /** The search for a service at a place (the Directory reads `service`, `lat` and `lng`). */
  search: (publicUrl: string, q: { service: string; lat: number; lng: number }) =>
    `${publicUrl}/search?${new URLSearchParams({ service: q.service, lat: String(q.lat), lng: String(q.lng) }).toString()}`,
  /** The owner's booking page; the payment page returns here (`?paid=1`, `?cancelled=1`). */
  booking: (publicUrl: string, bookingId: string) => `${publicUrl}/bookings/${encodeURIComponent(bookingId)}`,
};
