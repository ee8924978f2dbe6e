// What the public Directory may see of partners. Only approved organisations, ever: every
// Directory-facing read starts from approvedPartnersQuery, which enforces that in SQL.
import type { EntityManager, SelectQueryBuilder } from 'typeorm';
import { weeklyUnion, type CautionCode, type Currency, type PartnerProfile, type PublicPartner, type WorkingHours, type WorkMode } from '@emberline/domain';
import { CapabilityEntity, OrganisationCapabilityEntity, OrganisationEntity, PartnerProfileEntity } from '../entities';
import type { ServiceContext } from '../lib/context';
import { NotFound } from '../lib/errors';
import { json } from '../lib/json-column';
import { offerTechnicians } from './offer-technicians';

/**
 * What "listed in the Directory" means, in SQL over `organisation o JOIN partner_profile p ON
 * p.organisation_id = o.id`: approved (so never draft, pending, rejected or suspended) and with a
 * base on the map. approvedPartnersQuery uses it; hand-written SQL (the search) must AND it in.
 */
export const APPROVED_PARTNER_SQL = "o.status = 'approved' AND p.base_lat IS NOT NULL AND p.base_lng IS NOT NULL AND p.mode IS NOT NULL";

/**
 * Organisations (alias `o`) with their profile (alias `p`) that are approved and have a base on
 * the map. Add conditions with `andWhere`; never replace the `where`.
 */
export function approvedPartnersQuery(manager: EntityManager): SelectQueryBuilder<OrganisationEntity> {
  return manager
    .getRepository(OrganisationEntity)
    .createQueryBuilder('o')
    .innerJoin(PartnerProfileEntity, 'p', 'p.organisation_id = o.id')
    .where(APPROVED_PARTNER_SQL);
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

/** The public profile page of an approved partner (404 for any other organisation). */
export async function getPartnerProfile(ctx: ServiceContext, partnerId: string, now: Date): Promise<PartnerProfile> {
  const partner:
    | { id: string; name: string; city: string | null; country: string | null; base_lat: number; base_lng: number; mode: WorkMode; radius_km: number | null; workshop_address: string | null }
    | undefined = await approvedPartnersQuery(ctx.manager)
    .andWhere('o.id = :partnerId', { partnerId })
    .select(['o.id AS id', 'COALESCE(p.trading_name, o.name) AS name', 'p.city AS city', 'p.country AS country', 'p.base_lat AS base_lat', 'p.base_lng AS base_lng', 'p.mode AS mode', 'p.radius_km AS radius_km', 'p.workshop_address AS workshop_address'])
    .getRawOne();
  if (!partner) throw NotFound('There is no such partner.');
  const offers: { id: string; code: string; name: string; summary: string; cautions: unknown; currency: Currency; price_minor: string | number; duration_minutes: number; parts_minor: string | number }[] =
    await ctx.manager.query(
      `SELECT f.id, st.code, st.name, st.summary, st.cautions, f.currency, f.price_minor, f.duration_minutes,
         (SELECT COALESCE(SUM(op.quantity * pt.unit_price_minor), 0) FROM offer_part op JOIN part pt ON pt.id = op.part_id WHERE op.offer_id = f.id) AS parts_minor
       FROM offer f JOIN service_type st ON st.id = f.service_type_id
       WHERE f.organisation_id = ? AND st.retired = 0 ORDER BY st.sort_order, st.code`,
      [partner.id],
    );
  const equipment: { code: string; name: string; category: string }[] = await ctx.manager.query(
    'SELECT c.code, c.name, c.category FROM organisation_capability oc JOIN capability c ON c.id = oc.capability_id WHERE oc.organisation_id = ? AND c.retired = 0 ORDER BY c.category, c.name',
    [partner.id],
  );
  const [policy]: { free_within_km: number; rate_per_km_minor: string | number; currency: Currency; max_distance_km: number }[] = await ctx.manager.query(
    'SELECT free_within_km, rate_per_km_minor, currency, max_distance_km FROM travel_policy WHERE organisation_id = ?',
    [partner.id],
  );
  // each technician once, whichever offers they are on; the first by id sets the zone
  const technicians = new Map<string, WorkingHours>();
  for (const team of (await offerTechnicians(ctx.manager, offers.map((o) => o.id))).values()) for (const t of team) technicians.set(t.id, t.hours);
  const patterns = [...technicians].sort((a, b) => (a[0] < b[0] ? -1 : 1)).map(([, hours]) => hours);
  const timeZone = patterns[0]?.timeZone ?? null;
  return {
    partnerId: partner.id,
    name: partner.name,
    city: partner.city,
    country: partner.country,
    baseLat: Number(partner.base_lat),
    baseLng: Number(partner.base_lng),
    mode: partner.mode,
    radiusKm: partner.radius_km === null ? null : Number(partner.radius_km),
    workshopAddress: partner.mode === 'mobile' ? null : partner.workshop_address,
    timeZone,
    weeklyHours: timeZone ? weeklyUnion(patterns, timeZone, now) : [],
    services: offers.map((o) => ({
      serviceTypeCode: o.code,
      name: o.name,
      summary: o.summary,
      cautions: json<CautionCode[]>(o.cautions),
      currency: o.currency,
      labourMinor: Number(o.price_minor),
      partsMinor: Number(o.parts_minor),
      durationMinutes: Number(o.duration_minutes),
    })),
    equipment,
    travelPolicy: policy
      ? { freeWithinKm: Number(policy.free_within_km), ratePerKmMinor: Number(policy.rate_per_km_minor), currency: policy.currency, maxDistanceKm: Number(policy.max_distance_km) }
      : null,
    rating: null,
    reviewCount: 0,
    reviews: [],
  };
}
