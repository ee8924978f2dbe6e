// What a partner organisation sells: offers, parts, travel policy and technicians' working
// hours. Every query is scoped by the organisation the caller acts in; anything outside it is
// 404 (path ids) or a field error that says nothing of the other organisation (body ids).
import type { EntityManager } from 'typeorm';
import {
  changesOnlyTimeOff,
  WorkingHoursSchema,
  type BookingSettings,
  type BookingSettingsInput,
  type Cancellation,
  type Currency,
  type Deposit,
  type FieldError,
  type Offer,
  type OfferInput,
  type OfferPatch,
  type Part,
  type PartInput,
  type PartPatch,
  type ServiceArea,
  type ServiceAreaInput,
  type TechnicianHours,
  type TravelPolicy,
  type TravelPolicyInput,
  type WorkingHours,
  type WorkingHoursDraft,
} from '@emberline/domain';
import type { ServiceContext } from '../lib/context';
import { createError, NotFound, ValidationFailed } from '../lib/errors';
import { audit } from './audit.service';
import { newId } from '../lib/secure-token';
import { json } from '../lib/json-column';

export const OfferExists = createError('OFFER_EXISTS', 409, 'The service type is already offered');
export const PartInUse = createError('PART_IN_USE', 409, 'The part is in a parts kit');
export const AreaLocked = createError('AREA_IN_APPLICATION', 409, 'The service area is part of the application');
export const HoursAdminOnly = createError('HOURS_ADMIN_ONLY', 403, 'Only a partner admin changes these working hours');

/** Audits a change to one of the organisation's records with its state before and after. */
function record(ctx: ServiceContext, action: string, entityType: string, entityId: string, before: object | null, after: object | null): Promise<void> {
  return audit(ctx, { action, entityType, entityId, organisationId: orgOf(ctx), before, after });
}

function orgOf(ctx: ServiceContext): string {
  if (!ctx.actor.organisationId) throw new Error('offers service called outside an organisation scope');
  return ctx.actor.organisationId;
}

const iso = (v: Date | string) => (v instanceof Date ? v : new Date(v)).toISOString();

// ---- parts ----

interface PartRow {
  id: string;
  organisation_id: string;
  name: string;
  part_type: string;
  unit_price_minor: string | number;
  currency: Currency;
  stock: number;
  created_at: Date;
  updated_at: Date;
}

const toPart = (r: PartRow): Part => ({
  id: r.id,
  organisationId: r.organisation_id,
  name: r.name,
  partType: r.part_type,
  unitPriceMinor: Number(r.unit_price_minor),
  currency: r.currency,
  stock: Number(r.stock),
  createdAt: iso(r.created_at),
  updatedAt: iso(r.updated_at),
});

export async function listParts(ctx: ServiceContext): Promise<Part[]> {
  const rows: PartRow[] = await ctx.manager.query('SELECT * FROM part WHERE organisation_id = ? ORDER BY name, id', [orgOf(ctx)]);
  return rows.map(toPart);
}

async function findPartRow(ctx: ServiceContext, partId: string, lock = false): Promise<PartRow> {
  const [row]: PartRow[] = await ctx.manager.query(`SELECT * FROM part WHERE id = ? AND organisation_id = ?${lock ? ' FOR UPDATE' : ''}`, [partId, orgOf(ctx)]);
  if (!row) throw NotFound('There is no such part.');
  return row;
}

export async function createPart(ctx: ServiceContext, input: PartInput): Promise<Part> {
  const id = newId();
  await ctx.manager.query('INSERT INTO part (id, organisation_id, name, part_type, unit_price_minor, currency, stock) VALUES (?, ?, ?, ?, ?, ?, ?)', [
    id,
    orgOf(ctx),
    input.name,
    input.partType,
    input.unitPriceMinor,
    input.currency,
    input.stock,
  ]);
  const part = toPart(await findPartRow(ctx, id));
  await record(ctx, 'part.create', 'part', id, null, part);
  return part;
}

export async function updatePart(ctx: ServiceContext, partId: string, patch: PartPatch): Promise<Part> {
  const row = await findPartRow(ctx, partId, true);
  const next = { name: patch.name ?? row.name, partType: patch.partType ?? row.part_type, unitPriceMinor: patch.unitPriceMinor ?? Number(row.unit_price_minor), currency: patch.currency ?? row.currency, stock: patch.stock ?? Number(row.stock) };
  if (next.currency !== row.currency) {
    // a kit is priced in its offer's currency; a part in a kit keeps that currency
    const kits: { currency: Currency }[] = await ctx.manager.query('SELECT DISTINCT o.currency FROM offer_part op JOIN offer o ON o.id = op.offer_id WHERE op.part_id = ?', [partId]);
    if (kits.some((k) => k.currency !== next.currency)) {
      throw ValidationFailed('Please correct the highlighted fields.', [{ path: 'currency', message: `The part is in a parts kit priced in ${kits[0]!.currency}: remove it from the kit first` }]);
    }
  }
  await ctx.manager.query('UPDATE part SET name = ?, part_type = ?, unit_price_minor = ?, currency = ?, stock = ? WHERE id = ? AND organisation_id = ?', [
    next.name,
    next.partType,
    next.unitPriceMinor,
    next.currency,
    next.stock,
    partId,
    orgOf(ctx),
  ]);
  const part = toPart(await findPartRow(ctx, partId));
  await record(ctx, 'part.update', 'part', partId, toPart(row), part);
  return part;
}

export async function deletePart(ctx: ServiceContext, partId: string): Promise<void> {
  const row = await findPartRow(ctx, partId, true);
  const [use]: { n: number | string }[] = await ctx.manager.query('SELECT COUNT(*) AS n FROM offer_part WHERE part_id = ?', [partId]);
  if (Number(use!.n) > 0) throw PartInUse('Remove the part from every parts kit before deleting it.');
  await ctx.manager.query('DELETE FROM part WHERE id = ? AND organisation_id = ?', [partId, orgOf(ctx)]);
  await record(ctx, 'part.delete', 'part', partId, toPart(row), null);
}

// ---- offers ----

interface OfferRow {
  id: string;
  organisation_id: string;
  service_type_id: number;
  code: string;
  service_type_name: string;
  price_minor: string | number;
  currency: Currency;
  duration_minutes: number;
  deposit: unknown;
  cancellation: unknown;
  created_at: Date;
  updated_at: Date;
}

const OFFER_SELECT =
  'SELECT o.*, st.code AS code, st.name AS service_type_name FROM offer o JOIN service_type st ON st.id = o.service_type_id WHERE o.organisation_id = ?';

async function shapeOffers(manager: EntityManager, rows: OfferRow[]): Promise<Offer[]> {
  if (!rows.length) return [];
  const ids = rows.map((r) => r.id);
  const techs: { offer_id: string; user_id: string }[] = await manager.query('SELECT offer_id, user_id FROM offer_technician WHERE offer_id IN (?) ORDER BY user_id', [ids]);
  const lines: { offer_id: string; part_id: string; quantity: number; name: string; unit_price_minor: string | number; currency: Currency }[] = await manager.query(
    'SELECT op.offer_id, op.part_id, op.quantity, p.name, p.unit_price_minor, p.currency FROM offer_part op JOIN part p ON p.id = op.part_id WHERE op.offer_id IN (?) ORDER BY p.name, p.id',
    [ids],
  );
  return rows.map((r) => {
    const kit = lines.filter((l) => l.offer_id === r.id).map((l) => ({ partId: l.part_id, quantity: Number(l.quantity), name: l.name, unitPriceMinor: Number(l.unit_price_minor), currency: l.currency }));
    return {
      id: r.id,
      organisationId: r.organisation_id,
      serviceTypeCode: r.code,
      serviceTypeName: r.service_type_name,
      priceMinor: Number(r.price_minor),
      currency: r.currency,
      durationMinutes: Number(r.duration_minutes),
      technicianUserIds: techs.filter((t) => t.offer_id === r.id).map((t) => t.user_id),
      partsKit: kit,
      partsTotalMinor: kit.reduce((sum, l) => sum + l.unitPriceMinor * l.quantity, 0),
      deposit: json<Deposit>(r.deposit),
      cancellation: json<Cancellation>(r.cancellation),
      createdAt: iso(r.created_at),
      updatedAt: iso(r.updated_at),
    };
  });
}

export async function listOffers(ctx: ServiceContext): Promise<Offer[]> {
  const rows: OfferRow[] = await ctx.manager.query(`${OFFER_SELECT} ORDER BY st.sort_order, st.code`, [orgOf(ctx)]);
  return shapeOffers(ctx.manager, rows);
}

async function findOfferRow(ctx: ServiceContext, offerId: string, lock = false): Promise<OfferRow> {
  const [row]: OfferRow[] = await ctx.manager.query(`${OFFER_SELECT} AND o.id = ?${lock ? ' FOR UPDATE' : ''}`, [orgOf(ctx), offerId]);
  if (!row) throw NotFound('There is no such offer.');
  return row;
}

export async function getOffer(ctx: ServiceContext, offerId: string): Promise<Offer> {
  return (await shapeOffers(ctx.manager, [await findOfferRow(ctx, offerId)]))[0]!;
}

/** The service type by code, and field errors when it is unknown, retired, or needs capabilities the organisation does not hold. */
async function checkServiceType(ctx: ServiceContext, code: string, errors: FieldError[]): Promise<number | null> {
  const [st]: { id: number; retired: number }[] = await ctx.manager.query('SELECT id, retired FROM service_type WHERE code = ?', [code]);
  if (!st) {
    errors.push({ path: 'serviceTypeCode', message: `There is no service type "${code}" in the catalogue` });
    return null;
  }
  if (Number(st.retired)) {
    errors.push({ path: 'serviceTypeCode', message: `The service type "${code}" is retired and cannot be offered` });
    return null;
  }
  const missing: { code: string }[] = await ctx.manager.query(
    `SELECT c.code FROM service_type_capability stc JOIN capability c ON c.id = stc.capability_id
     WHERE stc.service_type_id = ? AND NOT EXISTS (SELECT 1 FROM organisation_capability oc WHERE oc.organisation_id = ? AND oc.capability_id = stc.capability_id)
     ORDER BY c.code`,
    [st.id, orgOf(ctx)],
  );
  if (missing.length) {
    errors.push({ path: 'serviceTypeCode', message: `Your organisation does not hold every capability "${code}" requires; missing: ${missing.map((m) => m.code).join(', ')}` });
  }
  return st.id;
}

/** Field errors for technicians who are not members and parts that are not the organisation's (or in another currency). */
async function checkPeopleAndParts(ctx: ServiceContext, v: { technicianUserIds?: string[]; partsKit?: { partId: string }[]; currency: Currency }, errors: FieldError[]): Promise<void> {
  if (v.technicianUserIds?.length) {
    const members: { user_id: string }[] = await ctx.manager.query('SELECT user_id FROM membership WHERE organisation_id = ? AND user_id IN (?)', [orgOf(ctx), v.technicianUserIds]);
    const known = new Set(members.map((m) => m.user_id));
    v.technicianUserIds.forEach((id, i) => {
      if (!known.has(id)) errors.push({ path: `technicianUserIds.${i}`, message: 'This person is not a member of your organisation' });
    });
  }
  if (v.partsKit?.length) {
    const parts: { id: string; currency: Currency }[] = await ctx.manager.query('SELECT id, currency FROM part WHERE organisation_id = ? AND id IN (?)', [orgOf(ctx), v.partsKit.map((l) => l.partId)]);
    const byId = new Map(parts.map((p) => [p.id, p.currency]));
    v.partsKit.forEach((line, i) => {
      const currency = byId.get(line.partId);
      if (!currency) errors.push({ path: `partsKit.${i}.partId`, message: 'There is no such part in your organisation' });
      else if (currency !== v.currency) errors.push({ path: `partsKit.${i}.partId`, message: `The part is priced in ${currency}, the offer in ${v.currency}` });
    });
  }
}

function checkDeposit(v: { deposit: Deposit; priceMinor: number }, errors: FieldError[]): void {
  if (v.deposit.kind === 'fixed' && v.deposit.amountMinor > v.priceMinor) errors.push({ path: 'deposit.amountMinor', message: 'The deposit cannot be more than the price' });
}

async function writeLinks(ctx: ServiceContext, offerId: string, v: { technicianUserIds?: string[]; partsKit?: { partId: string; quantity: number }[] }): Promise<void> {
  if (v.technicianUserIds) {
    await ctx.manager.query('DELETE FROM offer_technician WHERE offer_id = ?', [offerId]);
    for (const userId of v.technicianUserIds) await ctx.manager.query('INSERT INTO offer_technician (offer_id, organisation_id, user_id) VALUES (?, ?, ?)', [offerId, orgOf(ctx), userId]);
  }
  if (v.partsKit) {
    await ctx.manager.query('DELETE FROM offer_part WHERE offer_id = ?', [offerId]);
    for (const line of v.partsKit) await ctx.manager.query('INSERT INTO offer_part (offer_id, part_id, quantity) VALUES (?, ?, ?)', [offerId, line.partId, line.quantity]);
  }
}

export async function createOffer(ctx: ServiceContext, input: OfferInput): Promise<Offer> {
  const errors: FieldError[] = [];
  const serviceTypeId = await checkServiceType(ctx, input.serviceTypeCode, errors);
  await checkPeopleAndParts(ctx, input, errors);
  checkDeposit(input, errors);
  if (errors.length) throw ValidationFailed('Please correct the highlighted fields.', errors);
  const [dup]: unknown[] = await ctx.manager.query('SELECT id FROM offer WHERE organisation_id = ? AND service_type_id = ? FOR UPDATE', [orgOf(ctx), serviceTypeId]);
  if (dup) throw OfferExists(`Your organisation already offers "${input.serviceTypeCode}": change that offer instead.`);
  const id = newId();
  await ctx.manager.query(
    'INSERT INTO offer (id, organisation_id, service_type_id, price_minor, currency, duration_minutes, deposit, cancellation) VALUES (?, ?, ?, ?, ?, ?, ?, ?)',
    [id, orgOf(ctx), serviceTypeId, input.priceMinor, input.currency, input.durationMinutes, JSON.stringify(input.deposit), JSON.stringify(input.cancellation)],
  );
  await writeLinks(ctx, id, input);
  const offer = await getOffer(ctx, id);
  await record(ctx, 'offer.create', 'offer', id, null, offer);
  return offer;
}

export async function updateOffer(ctx: ServiceContext, offerId: string, patch: OfferPatch): Promise<Offer> {
  const row = await findOfferRow(ctx, offerId, true);
  const current = (await shapeOffers(ctx.manager, [row]))[0]!;
  const next = {
    priceMinor: patch.priceMinor ?? current.priceMinor,
    currency: patch.currency ?? current.currency,
    durationMinutes: patch.durationMinutes ?? current.durationMinutes,
    deposit: patch.deposit ?? current.deposit,
    cancellation: patch.cancellation ?? current.cancellation,
  };
  const errors: FieldError[] = [];
  await checkPeopleAndParts(ctx, { technicianUserIds: patch.technicianUserIds, partsKit: patch.partsKit ?? current.partsKit, currency: next.currency }, errors);
  checkDeposit(next, errors);
  if (errors.length) throw ValidationFailed('Please correct the highlighted fields.', errors);
  await ctx.manager.query('UPDATE offer SET price_minor = ?, currency = ?, duration_minutes = ?, deposit = ?, cancellation = ? WHERE id = ? AND organisation_id = ?', [
    next.priceMinor,
    next.currency,
    next.durationMinutes,
    JSON.stringify(next.deposit),
    JSON.stringify(next.cancellation),
    offerId,
    orgOf(ctx),
  ]);
  await writeLinks(ctx, offerId, patch);
  const offer = await getOffer(ctx, offerId);
  await record(ctx, 'offer.update', 'offer', offerId, current, offer);
  return offer;
}

export async function deleteOffer(ctx: ServiceContext, offerId: string): Promise<void> {
  const before = (await shapeOffers(ctx.manager, [await findOfferRow(ctx, offerId, true)]))[0]!;
  await ctx.manager.query('DELETE FROM offer WHERE id = ? AND organisation_id = ?', [offerId, orgOf(ctx)]);
  await record(ctx, 'offer.delete', 'offer', offerId, before, null);
}

// ---- travel policy ----

export async function getTravelPolicy(ctx: ServiceContext): Promise<TravelPolicy> {
  const [row]: { free_within_km: number; rate_per_km_minor: string | number; currency: Currency; max_distance_km: number }[] = await ctx.manager.query(
    'SELECT free_within_km, rate_per_km_minor, currency, max_distance_km FROM travel_policy WHERE organisation_id = ?',
    [orgOf(ctx)],
  );
  if (!row) return { organisationId: orgOf(ctx), configured: false, freeWithinKm: null, ratePerKmMinor: null, currency: null, maxDistanceKm: null };
  return {
    organisationId: orgOf(ctx),
    configured: true,
    freeWithinKm: Number(row.free_within_km),
    ratePerKmMinor: Number(row.rate_per_km_minor),
    currency: row.currency,
    maxDistanceKm: Number(row.max_distance_km),
  };
}

export async function saveTravelPolicy(ctx: ServiceContext, input: TravelPolicyInput): Promise<TravelPolicy> {
  const before = await getTravelPolicy(ctx);
  await ctx.manager.query(
    `INSERT INTO travel_policy (organisation_id, free_within_km, rate_per_km_minor, currency, max_distance_km) VALUES (?, ?, ?, ?, ?)
     ON DUPLICATE KEY UPDATE free_within_km = VALUES(free_within_km), rate_per_km_minor = VALUES(rate_per_km_minor), currency = VALUES(currency), max_distance_km = VALUES(max_distance_km)`,
    [orgOf(ctx), input.freeWithinKm, input.ratePerKmMinor, input.currency, input.maxDistanceKm],
  );
  const after = await getTravelPolicy(ctx);
  await record(ctx, 'travel-policy.save', 'organisation', orgOf(ctx), before.configured ? before : null, after);
  return after;
}

// ---- booking settings ----

export async function getBookingSettings(ctx: ServiceContext): Promise<BookingSettings> {
  const [row]: { auto_confirm_bookings: number }[] = await ctx.manager.query('SELECT auto_confirm_bookings FROM organisation WHERE id = ?', [orgOf(ctx)]);
  if (!row) throw NotFound('No such organisation.');
  return { organisationId: orgOf(ctx), autoConfirmBookings: Boolean(Number(row.auto_confirm_bookings)) };
}

export async function saveBookingSettings(ctx: ServiceContext, input: BookingSettingsInput): Promise<BookingSettings> {
  const before = await getBookingSettings(ctx);
  await ctx.manager.query('UPDATE organisation SET auto_confirm_bookings = ? WHERE id = ?', [input.autoConfirmBookings ? 1 : 0, orgOf(ctx)]);
  const after = { ...before, autoConfirmBookings: input.autoConfirmBookings };
  await record(ctx, 'booking-settings.save', 'organisation', orgOf(ctx), before, after);
  return after;
}

// ---- service area ----

interface AreaRow {
  status: string;
  base_label: string | null;
  base_lat: number | null;
  base_lng: number | null;
  mode: 'mobile' | 'workshop' | 'both' | null;
  radius_km: number | null;
  workshop_address: string | null;
}

async function areaRow(ctx: ServiceContext, lock = false): Promise<AreaRow> {
  const [row]: AreaRow[] = await ctx.manager.query(
    `SELECT o.status, p.base_label, p.base_lat, p.base_lng, p.mode, p.radius_km, p.workshop_address
     FROM organisation o LEFT JOIN partner_profile p ON p.organisation_id = o.id WHERE o.id = ?${lock ? ' FOR UPDATE' : ''}`,
    [orgOf(ctx)],
  );
  if (!row) throw NotFound('There is no such organisation.');
  return row;
}

const toArea = (ctx: ServiceContext, r: AreaRow): ServiceArea => ({
  organisationId: orgOf(ctx),
  area:
    r.base_lat === null || r.base_lng === null || !r.mode
      ? null
      : { baseLabel: r.base_label ?? '', baseLat: Number(r.base_lat), baseLng: Number(r.base_lng), mode: r.mode, radiusKm: r.radius_km === null ? null : Number(r.radius_km), workshopAddress: r.workshop_address },
});

export async function getServiceArea(ctx: ServiceContext): Promise<ServiceArea> {
  return toArea(ctx, await areaRow(ctx));
}

/** Approved (or suspended) organisations move their area here; before approval it is a step of the application. */
export async function saveServiceArea(ctx: ServiceContext, input: ServiceAreaInput): Promise<ServiceArea> {
  const row = await areaRow(ctx, true);
  if (row.status !== 'approved' && row.status !== 'suspended') throw AreaLocked('Until your organisation is approved, change the service area in your application.');
  const before = toArea(ctx, row).area;
  const workshopAddress = input.mode === 'mobile' ? null : (input.workshopAddress ?? null);
  await ctx.manager.query('UPDATE partner_profile SET base_label = ?, base_lat = ?, base_lng = ?, mode = ?, radius_km = ?, workshop_address = ? WHERE organisation_id = ?', [
    input.baseLabel,
    input.baseLat,
    input.baseLng,
    input.mode,
    input.radiusKm,
    workshopAddress,
    orgOf(ctx),
  ]);
  const after = await getServiceArea(ctx);
  await record(ctx, 'service-area.save', 'organisation', orgOf(ctx), before, after.area);
  return after;
}

// ---- working hours ----

async function assertMember(ctx: ServiceContext, userId: string): Promise<void> {
  const [m]: unknown[] = await ctx.manager.query('SELECT 1 AS x FROM membership WHERE organisation_id = ? AND user_id = ?', [orgOf(ctx), userId]);
  if (!m) throw NotFound('There is no such member.');
}

export async function getHours(ctx: ServiceContext, userId: string): Promise<TechnicianHours> {
  await assertMember(ctx, userId);
  const [row]: { hours: unknown }[] = await ctx.manager.query('SELECT hours FROM working_hours WHERE organisation_id = ? AND user_id = ?', [orgOf(ctx), userId]);
  return { organisationId: orgOf(ctx), userId, hours: row ? json<WorkingHours>(row.hours) : null };
}

export async function saveHours(ctx: ServiceContext, userId: string, draft: WorkingHoursDraft): Promise<TechnicianHours> {
  await assertMember(ctx, userId);
  // the route validated already; parse again so only the schema's output is ever stored
  const hours = WorkingHoursSchema.parse(draft);
  const before = (await getHours(ctx, userId)).hours;
  // a technician keeps their own time off; everything else is the partner admin's (domain rule)
  if (!ctx.actor.roles.includes('partner_admin') && (userId !== ctx.actor.userId || !changesOnlyTimeOff(before, hours))) {
    throw HoursAdminOnly(userId === ctx.actor.userId ? 'You can add and remove your own days off and time away; ask a partner admin to change your weekly hours, extra hours or booking rules.' : 'Only a partner admin changes a colleague’s working hours.');
  }
  await ctx.manager.query('INSERT INTO working_hours (organisation_id, user_id, hours) VALUES (?, ?, ?) ON DUPLICATE KEY UPDATE hours = VALUES(hours)', [
    orgOf(ctx),
    userId,
    JSON.stringify(hours),
  ]);
  await record(ctx, 'working-hours.save', 'user', userId, before, hours);
  return getHours(ctx, userId);
}
