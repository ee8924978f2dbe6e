// Coverage: searches nobody answered (anonymous cells, for the network's map) and owners'
// "tell me when someone covers this" alerts, which are answered once a partner who can do the
// service works there.
//
// Retention: a gap row holds only a ~10 km cell, the service and a rough vehicle class, and is
// deleted after COVERAGE_RETENTION_DAYS. An alert holds the e-mail address until the owner has been
// told; then the address is erased (the row stays, without it, for the counts) — and an alert
// nobody answered is deleted with its address after COVERAGE_RETENTION_DAYS.
import type { EntityManager } from 'typeorm';
import {
  boundingBox,
  DEFAULT_SEARCH_RADIUS_KM,
  gapCell,
  greatCircleDistanceM,
  type CoverageAlertInput,
  type CoverageGaps,
  type GeoPoint,
  type WorkMode,
} from '@emberline/domain';
import type { ServiceContext } from '../lib/context';
import { ValidationFailed } from '../lib/errors';
import { boxCondition } from '../lib/sql-geo';
import { newId } from '../lib/secure-token';
import { enqueueMail } from '../mail/outbox';
import { APPROVED_PARTNER_SQL } from './partners.service';
import { directoryLinks } from './recipients';

export const COVERAGE_RETENTION_DAYS = 365;
/** The most cells the admin map gets at once (newest first). */
export const COVERAGE_GAP_CELLS_MAX = 5000;
const DAY_MS = 86_400_000;

const key = (lat: number, lng: number, service: string) => `${lat}|${lng}|${service}`;

/** Records a search nobody could answer: the cell of the place, never the place itself. */
export async function recordGap(manager: EntityManager, place: GeoPoint, serviceTypeCode: string, vehicleClass: string): Promise<void> {
  const cell = gapCell(place);
  await manager.query('INSERT INTO coverage_gap_search (cell_lat, cell_lng, service_type_code, vehicle_class) VALUES (?, ?, ?, ?)', [cell.lat, cell.lng, serviceTypeCode, vehicleClass]);
}

export async function listGaps(ctx: ServiceContext, q: { days: number; serviceType?: string }, now: Date): Promise<CoverageGaps> {
  const since = new Date(now.getTime() - q.days * DAY_MS);
  const serviceFilter = q.serviceType ? ' AND service_type_code = ?' : '';
  const serviceParam = q.serviceType ? [q.serviceType] : [];
  const cells: { cell_lat: number; cell_lng: number; service_type_code: string; searches: number | string; last_at: Date }[] = await ctx.manager.query(
    `SELECT cell_lat, cell_lng, service_type_code, COUNT(*) AS searches, MAX(created_at) AS last_at
     FROM coverage_gap_search WHERE created_at >= ?${serviceFilter}
     GROUP BY cell_lat, cell_lng, service_type_code ORDER BY last_at DESC, cell_lat, cell_lng, service_type_code LIMIT ?`,
    [since, ...serviceParam, COVERAGE_GAP_CELLS_MAX],
  );
  const [total]: { n: number | string }[] = await ctx.manager.query(`SELECT COUNT(*) AS n FROM coverage_gap_search WHERE created_at >= ?${serviceFilter}`, [since, ...serviceParam]);
  const alerts: { cell_lat: number; cell_lng: number; service_type_code: string; n: number | string }[] = await ctx.manager.query(
    `SELECT cell_lat, cell_lng, service_type_code, COUNT(*) AS n FROM coverage_alert WHERE notified_at IS NULL${serviceFilter} GROUP BY cell_lat, cell_lng, service_type_code`,
    serviceParam,
  );
  const waiting = new Map(alerts.map((a) => [key(Number(a.cell_lat), Number(a.cell_lng), a.service_type_code), Number(a.n)]));
  return {
    data: cells.map((c) => ({
      lat: Number(c.cell_lat),
      lng: Number(c.cell_lng),
      serviceTypeCode: c.service_type_code,
      searches: Number(c.searches),
      alerts: waiting.get(key(Number(c.cell_lat), Number(c.cell_lng), c.service_type_code)) ?? 0,
      lastSearchedAt: new Date(c.last_at).toISOString(),
    })),
    meta: { days: q.days, totalSearches: Number(total?.n ?? 0) },
  };
}

/**
 * Stores an alert for the cell of the place (never the place) and sends the confirmation. The
 * same address waiting for the same service and cell is stored once and confirmed once; the
 * caller answers the same either way, so the answer says nothing about the address.
 */
export async function createAlert(ctx: ServiceContext, input: CoverageAlertInput, o: { locale: string }): Promise<void> {
  const [st]: { code: string; name: string; retired: number }[] = await ctx.manager.query('SELECT code, name, retired FROM service_type WHERE code = ?', [input.serviceType]);
  if (!st || Number(st.retired)) {
    throw ValidationFailed('Please correct the highlighted fields.', [{ path: 'serviceType', message: `There is no service type "${input.serviceType}" in the catalogue` }]);
  }
  const cell = gapCell(input);
  const email = input.email.trim().toLowerCase();
  const [existing] = await ctx.manager.query(
    'SELECT id FROM coverage_alert WHERE email = ? AND service_type_code = ? AND cell_lat = ? AND cell_lng = ? AND notified_at IS NULL FOR UPDATE',
    [email, st.code, cell.lat, cell.lng],
  );
  if (existing) return;
  await ctx.manager.query('INSERT INTO coverage_alert (id, email, locale, service_type_code, cell_lat, cell_lng) VALUES (?, ?, ?, ?, ?, ?)', [newId(), email, o.locale, st.code, cell.lat, cell.lng]);
  await enqueueMail(ctx.manager, { to: email, locale: o.locale, template: 'coverage-alert-confirmed', data: { serviceName: st.name, days: COVERAGE_RETENTION_DAYS } });
}

/**
 * Tells the owners waiting in this partner's area about it: alerts whose cell centre lies within
 * the partner's mobile radius, or within DEFAULT_SEARCH_RADIUS_KM of its workshop, for a service
 * type it holds every required capability for (`serviceTypeCodes` narrows them, e.g. to a new
 * offer's). One e-mail per alert, with a link to the Directory's search for that cell and
 * service; the address is then erased, so each owner hears once. Call it in the transaction of
 * the change (approval, reinstatement, new offer); returns how many owners were told.
 */
export async function notifyCoverageAlerts(manager: EntityManager, organisationId: string, o: { publicUrl: string; serviceTypeCodes?: string[] }): Promise<number> {
  const [partner]: { name: string; base_lat: number; base_lng: number; mode: WorkMode; radius_km: number | null }[] = await manager.query(
    `SELECT COALESCE(p.trading_name, o.name) AS name, p.base_lat, p.base_lng, p.mode, p.radius_km
     FROM organisation o JOIN partner_profile p ON p.organisation_id = o.id WHERE o.id = ? AND ${APPROVED_PARTNER_SQL}`,
    [organisationId],
  );
  if (!partner) return 0;
  const base = { lat: Number(partner.base_lat), lng: Number(partner.base_lng) };
  const mobileKm = partner.mode !== 'workshop' && partner.radius_km !== null ? Number(partner.radius_km) : 0;
  const workshopKm = partner.mode !== 'mobile' ? DEFAULT_SEARCH_RADIUS_KM : 0;
  const reachKm = Math.max(mobileKm, workshopKm);
  if (reachKm <= 0 || o.serviceTypeCodes?.length === 0) return 0;

  // service types whose every required capability the partner holds
  const services: { code: string; name: string }[] = await manager.query(
    `SELECT st.code, st.name FROM service_type st
     WHERE st.retired = 0${o.serviceTypeCodes ? ' AND st.code IN (?)' : ''} AND NOT EXISTS (
       SELECT 1 FROM service_type_capability stc WHERE stc.service_type_id = st.id
       AND NOT EXISTS (SELECT 1 FROM organisation_capability oc WHERE oc.organisation_id = ? AND oc.capability_id = stc.capability_id))`,
    [...(o.serviceTypeCodes ? [o.serviceTypeCodes] : []), organisationId],
  );
  if (!services.length) return 0;
  const serviceName = new Map(services.map((s) => [s.code, s.name]));

  const box = boxCondition(boundingBox(base, reachKm * 1000), 'cell_lat', 'cell_lng');
  const alerts: { id: string; email: string; locale: string; service_type_code: string; cell_lat: number; cell_lng: number }[] = await manager.query(
    `SELECT id, email, locale, service_type_code, cell_lat, cell_lng FROM coverage_alert
     WHERE notified_at IS NULL AND ${box.sql} AND service_type_code IN (?) ORDER BY created_at, id FOR UPDATE`,
    [...box.params, [...serviceName.keys()]],
  );
  const told: string[] = [];
  for (const a of alerts) {
    const cell = { lat: Number(a.cell_lat), lng: Number(a.cell_lng) };
    const km = greatCircleDistanceM(base, cell) / 1000;
    if (km > mobileKm && km > workshopKm) continue;
    await enqueueMail(manager, {
      to: a.email,
      locale: a.locale,
      template: 'coverage-alert-match',
      data: { serviceName: serviceName.get(a.service_type_code)!, organisationName: partner.name, link: directoryLinks.search(o.publicUrl, { service: a.service_type_code, ...cell }) },
    });
    told.push(a.id);
  }
  if (told.length) await manager.query('UPDATE coverage_alert SET notified_at = CURRENT_TIMESTAMP(3), email = NULL WHERE id IN (?)', [told]);
  return told.length;
}

/** Deletes gap rows and alerts older than the retention period (the daily coverage-retention job). */
export async function purgeCoverage(manager: EntityManager, now: Date): Promise<{ gaps: number; alerts: number }> {
  const before = new Date(now.getTime() - COVERAGE_RETENTION_DAYS * DAY_MS);
  const gaps: { affectedRows?: number } = await manager.query('DELETE FROM coverage_gap_search WHERE created_at < ?', [before]);
  const alerts: { affectedRows?: number } = await manager.query('DELETE FROM coverage_alert WHERE created_at < ?', [before]);
  return { gaps: gaps.affectedRows ?? 0, alerts: alerts.affectedRows ?? 0 };
}
