// What the public Directory may see of partners. Only approved organisations, ever: every
// Directory-facing read starts from approvedPartnersQuery, which enforces that in SQL.
import type { EntityManager, SelectQueryBuilder } from 'typeorm';
import type { PublicPartner, WorkMode } from '@emberline/domain';
import { CapabilityEntity, OrganisationCapabilityEntity, OrganisationEntity, PartnerProfileEntity } from '../entities';
import type { ServiceContext } from '../lib/context';

/**
 * Organisations (alias `o`) with their profile (alias `p`) that are approved and have a base on
 * the map. Add conditions with `andWhere`; never replace the `where`.
 */
export function approvedPartnersQuery(manager: EntityManager): SelectQueryBuilder<OrganisationEntity> {
  return manager
    .getRepository(OrganisationEntity)
    .createQueryBuilder('o')
    .innerJoin(PartnerProfileEntity, 'p', 'p.organisation_id = o.id')
    .where("o.status = 'approved'")
    .andWhere('p.base_lat IS NOT NULL AND p.base_lng IS NOT NULL AND p.mode IS NOT NULL');
}

export async function listPublicPartners(ctx: ServiceContext): Promise<PublicPartner[]> {
  const rows: { id: string; name: string; trading_name: string | null; city: string | null; country: string | null; base_lat: number; base_lng: number; mode: WorkMode; radius_km: number | null }[] =
    await approvedPartnersQuery(ctx.manager)
      .select(['o.id AS id', 'o.name AS name', 'p.trading_name AS trading_name', 'p.city AS city', 'p.country AS country', 'p.base_lat AS base_lat', 'p.base_lng AS base_lng', 'p.mode AS mode', 'p.radius_km AS radius_km'])
      .orderBy('COALESCE(p.trading_name, o.name)', 'ASC')
      .addOrderBy('o.id', 'ASC')
      .getRawMany();
  const capabilities = new Map<string, string[]>();
  if (rows.length) {
    const claims: { organisation_id: string; code: string }[] = await ctx.manager
      .getRepository(OrganisationCapabilityEntity)
      .createQueryBuilder('oc')
      .innerJoin(CapabilityEntity, 'c', 'c.id = oc.capability_id AND c.retired = 0')
      .select(['oc.organisation_id AS organisation_id', 'c.code AS code'])
      .where('oc.organisation_id IN (:...ids)', { ids: rows.map((r) => r.id) })
      .orderBy('c.code', 'ASC')
      .getRawMany();
    for (const c of claims) capabilities.set(c.organisation_id, [...(capabilities.get(c.organisation_id) ?? []), c.code]);
  }
  return rows.map((r) => ({
    id: r.id,
    tradingName: r.trading_name ?? r.name,
    city: r.city ?? '',
    country: r.country ?? '',
    baseLat: Number(r.base_lat),
    baseLng: Number(r.base_lng),
    mode: r.mode,
    radiusKm: r.radius_km === null ? null : Number(r.radius_km),
    capabilities: capabilities.get(r.id) ?? [],
  }));
}
