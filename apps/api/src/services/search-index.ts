// The search's index of approved partners, kept in memory: profile and base, service area,
// travel policy, capabilities, offers with their parts totals and the technicians (with working
// hours) assigned to each. Ten thousand partners take a few megabytes. A search asks the database
// one cheap question — are there change-log rows this index has not applied? (the log is written
// by triggers, see migration 1764690000000) — and reloads only the organisations they name before
// it answers, so a change is seen by the next search, on every API instance. Bookings are not in
// the index: they change all the time and are read per search (occupied-times.ts).
import type { DataSource, EntityManager } from 'typeorm';
import { LATITUDE_BANDS_PER_DEGREE } from '../lib/sql-geo';
import type { Currency, GeoPoint, WorkingHours, WorkMode } from '@emberline/domain';
import { APPROVED_PARTNER_SQL } from './partners.service';
import { parseHours } from './offer-technicians';

export interface IndexedOffer {
  offerId: string;
  serviceTypeId: number;
  currency: Currency;
  labourMinor: number;
  partsMinor: number;
  offerMinutes: number;
  /** Members assigned to the offer who have valid working hours, by user id. */
  technicians: { id: string; hours: WorkingHours }[];
}

export interface IndexedPartner {
  partnerId: string;
  name: string;
  city: string | null;
  base: GeoPoint;
  /** FLOOR(latitude × LATITUDE_BANDS_PER_DEGREE), as partner_profile.base_band. */
  band: number;
  mode: WorkMode;
  radiusKm: number | null;
  capabilityIds: ReadonlySet<number>;
  policy: { freeWithinKm: number; ratePerKmMinor: number; maxDistanceKm: number; currency: Currency } | null;
  offers: ReadonlyMap<number, IndexedOffer>;
}

/**
 * The partners of one latitude band offering one service, in order of longitude, with what the
 * search's scan reads kept in flat arrays beside them (so a scan over a few hundred bases reads
 * contiguous memory and touches a partner's object only when it is in reach).
 */
export interface Band {
  partners: readonly IndexedPartner[];
  lats: Float64Array;
  lngs: Float64Array;
  /** How far the partner comes to a customer, km; −1 when it does not (workshop only, or no radius). */
  comesKm: Float64Array;
  /** 1 when the partner has a workshop owners may come to. */
  hosts: Uint8Array;
}

/** One state of the index: replaced whole on a reload, never changed, so a search holding it sees one consistent network. */
export interface SearchIndexSnapshot {
  partners: ReadonlyMap<string, IndexedPartner>;
  /** Per service type id, the partners offering it by latitude band. */
  byService: ReadonlyMap<number, ReadonlyMap<number, Band>>;
  /** Per service type id, the largest radius any partner offering it comes within, km. */
  maxComesKm: ReadonlyMap<number, number>;
}

function bandOf(partners: IndexedPartner[]): Band {
  partners.sort((a, b) => a.base.lng - b.base.lng);
  return {
    partners,
    lats: Float64Array.from(partners, (p) => p.base.lat),
    lngs: Float64Array.from(partners, (p) => p.base.lng),
    comesKm: Float64Array.from(partners, (p) => (p.mode !== 'workshop' && p.radiusKm !== null ? p.radiusKm : -1)),
    hosts: Uint8Array.from(partners, (p) => (p.mode !== 'mobile' ? 1 : 0)),
  };
}

/**
 * A log row id below one already visible, but not visible itself, belongs to a transaction still
 * running, or to one rolled back (its id is never used). It is waited for until the visible row
 * after it is this old (by the database's clock), then given up; a transaction that writes
 * partner data and stays open longer is not seen until the next full load (at start, or after
 * MAX_CHANGES_APPLIED at once).
 */
export const CHANGE_HOLE_TIMEOUT_MS = 120_000;
/** Beyond this many changed organisations at once, the whole index is loaded again. */
export const MAX_CHANGES_APPLIED = 500;
/** Log rows are kept this long (see pruneSearchIndexChanges), far longer than any hole is waited for. */
export const CHANGE_LOG_RETENTION_HOURS = 24;

interface PartnerRow {
  id: string;
  name: string;
  city: string | null;
  base_lat: number;
  base_lng: number;
  mode: WorkMode;
  radius_km: number | null;
  free_within_km: number | null;
  rate_per_km_minor: string | number | null;
  policy_currency: Currency | null;
  max_distance_km: number | null;
}

interface OfferRow {
  id: string;
  organisation_id: string;
  service_type_id: number;
  price_minor: string | number;
  currency: Currency;
  duration_minutes: number;
  parts_minor: string | number;
}

/** Reads the partners (all approved ones, or those among `organisationIds`), in four queries. */
async function loadPartners(manager: EntityManager, organisationIds: readonly string[] | null): Promise<IndexedPartner[]> {
  if (organisationIds && !organisationIds.length) return [];
  const only = (column: string) => (organisationIds ? ` AND ${column} IN (?)` : '');
  const params = organisationIds ? [organisationIds] : [];
  const [partners, offers, capabilities, technicians] = (await Promise.all([
    manager.query(
      `SELECT o.id, COALESCE(p.trading_name, o.name) AS name, p.city, p.base_lat, p.base_lng, p.mode, p.radius_km,
         tp.free_within_km, tp.rate_per_km_minor, tp.currency AS policy_currency, tp.max_distance_km
       FROM organisation o JOIN partner_profile p ON p.organisation_id = o.id
       LEFT JOIN travel_policy tp ON tp.organisation_id = o.id
       WHERE ${APPROVED_PARTNER_SQL}${only('o.id')}`,
      params,
    ),
    manager.query(
      `SELECT f.id, f.organisation_id, f.service_type_id, f.price_minor, f.currency, f.duration_minutes,
         COALESCE((SELECT SUM(op.quantity * pt.unit_price_minor) FROM offer_part op JOIN part pt ON pt.id = op.part_id WHERE op.offer_id = f.id), 0) AS parts_minor
       FROM offer f JOIN organisation o ON o.id = f.organisation_id
       WHERE o.status = 'approved'${only('f.organisation_id')}`,
      params,
    ),
    manager.query(
      `SELECT oc.organisation_id, oc.capability_id FROM organisation_capability oc JOIN organisation o ON o.id = oc.organisation_id
       WHERE o.status = 'approved'${only('oc.organisation_id')}`,
      params,
    ),
    // the technicians still members, with saved hours (the same rule as offerTechnicians)
    manager.query(
      `SELECT ot.offer_id, ot.user_id, wh.hours FROM offer_technician ot
       JOIN organisation o ON o.id = ot.organisation_id
       JOIN membership m ON m.organisation_id = ot.organisation_id AND m.user_id = ot.user_id
       JOIN working_hours wh ON wh.organisation_id = ot.organisation_id AND wh.user_id = ot.user_id
       WHERE o.status = 'approved'${only('ot.organisation_id')}
       ORDER BY ot.offer_id, ot.user_id`,
      params,
    ),
  ])) as [PartnerRow[], OfferRow[], { organisation_id: string; capability_id: number }[], { offer_id: string; user_id: string; hours: unknown }[]];

  const teams = new Map<string, IndexedOffer['technicians']>();
  for (const r of technicians) {
    const hours = parseHours(r.hours);
    if (!hours) continue;
    const team = teams.get(r.offer_id);
    if (team) team.push({ id: r.user_id, hours });
    else teams.set(r.offer_id, [{ id: r.user_id, hours }]);
  }
  const offersOf = new Map<string, Map<number, IndexedOffer>>();
  for (const r of offers) {
    const serviceTypeId = Number(r.service_type_id);
    const list = offersOf.get(r.organisation_id) ?? new Map<number, IndexedOffer>();
    list.set(serviceTypeId, {
      offerId: r.id,
      serviceTypeId,
      currency: r.currency,
      labourMinor: Number(r.price_minor),
      partsMinor: Number(r.parts_minor),
      offerMinutes: Number(r.duration_minutes),
      technicians: teams.get(r.id) ?? [],
    });
    offersOf.set(r.organisation_id, list);
  }
  const capabilitiesOf = new Map<string, Set<number>>();
  for (const r of capabilities) {
    const set = capabilitiesOf.get(r.organisation_id) ?? new Set<number>();
    set.add(Number(r.capability_id));
    capabilitiesOf.set(r.organisation_id, set);
  }
  return partners.map((r) => {
    const base = { lat: Number(r.base_lat), lng: Number(r.base_lng) };
    return {
      partnerId: r.id,
      name: r.name,
      city: r.city,
      base,
      band: Math.floor(base.lat * LATITUDE_BANDS_PER_DEGREE),
      mode: r.mode,
      radiusKm: r.radius_km === null ? null : Number(r.radius_km),
      capabilityIds: capabilitiesOf.get(r.id) ?? new Set(),
      policy:
        r.free_within_km === null || r.policy_currency === null
          ? null
          : { freeWithinKm: Number(r.free_within_km), ratePerKmMinor: Number(r.rate_per_km_minor), maxDistanceKm: Number(r.max_distance_km), currency: r.policy_currency },
      offers: offersOf.get(r.id) ?? new Map(),
    };
  });
}

/** A snapshot of these partners, with the bands built (exported for tests). */
export function snapshotOf(partners: Map<string, IndexedPartner>): SearchIndexSnapshot {
  const byService = new Map<number, Map<number, IndexedPartner[]>>();
  for (const p of partners.values()) {
    for (const serviceTypeId of p.offers.keys()) {
      let bands = byService.get(serviceTypeId);
      if (!bands) byService.set(serviceTypeId, (bands = new Map()));
      const list = bands.get(p.band);
      if (list) list.push(p);
      else bands.set(p.band, [p]);
    }
  }
  const banded = new Map<number, Map<number, Band>>();
  const maxComesKm = new Map<number, number>();
  for (const [serviceTypeId, bands] of byService) {
    banded.set(serviceTypeId, new Map([...bands].map(([band, list]) => [band, bandOf(list)])));
    let max = 0;
    for (const band of banded.get(serviceTypeId)!.values()) for (const km of band.comesKm) if (km > max) max = km;
    maxComesKm.set(serviceTypeId, max);
  }
  return { partners, byService: banded, maxComesKm };
}

/**
 * Which change-log rows have been applied: every id up to `floor` (or given up, see
 * CHANGE_HOLE_TIMEOUT_MS), and the ids in `seen` above it, each with its row's time (ms, the
 * database's clock). A missing id between the floor and a seen one is a hole.
 */
interface LogPosition {
  floor: number;
  seen: Map<number, number>;
}

/**
 * A snapshot with the question that tells whether it is still current: `sql` is a SELECT of one
 * row (n, top) to run alone or join into the statement that reads what else the search needs, so
 * an up-to-date index costs no round trip of its own.
 */
export interface SearchIndexCheck {
  snapshot: SearchIndexSnapshot;
  sql: string;
  params: unknown[];
  /** Whether the row read shows no change beyond the snapshot. */
  isCurrent(state: LogState): boolean;
}

export interface LogState {
  n: string | number;
  top: string | number | null;
  /** The database's clock when it answered. */
  at: Date | string;
}

const LOG_STATE_SQL = 'SELECT COUNT(*) AS n, MAX(id) AS top, NOW(3) AS at FROM search_index_change WHERE id > ?';

const msOf = (value: Date | string) => (value instanceof Date ? value.getTime() : Date.parse(value));

/** True when the log rows above the floor are exactly those already applied. */
function nothingNew(state: LogState, seen: ReadonlySet<number> | ReadonlyMap<number, number>): boolean {
  const top = Number(state.top ?? 0);
  return Number(state.n) === seen.size && (!top || seen.has(top));
}

export class SearchIndex {
  private snapshot: SearchIndexSnapshot | null = null;
  private position: LogPosition = { floor: 0, seen: new Map() };
  /** One load at a time; searches that need it wait for the one running. */
  private loading: Promise<void> | null = null;
  /** Reloads done so far (for tests and the bench): full loads and organisations reloaded. */
  readonly stats = { fullLoads: 0, organisationsReloaded: 0 };

  /** The index, brought up to date with the change log first (one query when nothing changed). */
  async current(manager: EntityManager): Promise<SearchIndexSnapshot> {
    for (;;) {
      if (this.loading) {
        await this.loading;
        continue;
      }
      if (!this.snapshot) {
        await this.run(() => this.loadAll(manager));
        continue;
      }
      const [state]: LogState[] = await manager.query(LOG_STATE_SQL, [this.position.floor]);
      if (nothingNew(state!, this.position.seen)) {
        this.settle(msOf(state!.at));
        return this.snapshot;
      }
      if (this.loading) continue;
      await this.run(() => this.applyChanges(manager));
      return this.snapshot!;
    }
  }

  /**
   * The index as last brought up to date (loaded first if there is none yet), with the check to
   * send along with the search's own query; when it says "not current", call `current` and search
   * again. A reload by another search meanwhile also makes it "not current".
   */
  async check(manager: EntityManager): Promise<SearchIndexCheck> {
    const snapshot = this.snapshot && !this.loading ? this.snapshot : await this.current(manager);
    const seen = new Set(this.position.seen.keys());
    return {
      snapshot,
      sql: LOG_STATE_SQL,
      params: [this.position.floor],
      isCurrent: (state) => {
        if (this.snapshot !== snapshot || !nothingNew(state, seen)) return false;
        this.settle(msOf(state.at));
        return true;
      },
    };
  }

  private async run(load: () => Promise<void>): Promise<void> {
    this.loading = load().finally(() => {
      this.loading = null;
    });
    await this.loading;
  }

  /**
   * Loads every approved partner. The log position is read first, so a change committed while the
   * partners are read is applied again by the next search rather than lost: the floor is the last
   * row older than a hole is waited for (every id below it is settled), and every row above it
   * counts as seen; ids missing among those are holes like any other.
   */
  private async loadAll(manager: EntityManager): Promise<void> {
    const [settled]: { floor: string | number | null }[] = await manager.query('SELECT MAX(id) AS floor FROM search_index_change WHERE changed_at < NOW(3) - INTERVAL ? SECOND', [
      CHANGE_HOLE_TIMEOUT_MS / 1000,
    ]);
    const floor = Number(settled!.floor ?? 0);
    const rows: { id: string | number; changed_at: Date | string; at: Date | string }[] = await manager.query('SELECT id, changed_at, NOW(3) AS at FROM search_index_change WHERE id > ?', [floor]);
    const position: LogPosition = { floor, seen: new Map(rows.map((r) => [Number(r.id), msOf(r.changed_at)])) };
    const partners = await loadPartners(manager, null);
    this.snapshot = snapshotOf(new Map(partners.map((p) => [p.partnerId, p])));
    this.position = position;
    this.stats.fullLoads++;
    if (rows.length) this.settle(msOf(rows[0]!.at));
  }

  /** Reloads the organisations named by log rows not applied yet. */
  private async applyChanges(manager: EntityManager): Promise<void> {
    const rows: { id: string | number; organisation_id: string; changed_at: Date | string; at: Date | string }[] = await manager.query(
      'SELECT id, organisation_id, changed_at, NOW(3) AS at FROM search_index_change WHERE id > ? ORDER BY id',
      [this.position.floor],
    );
    const fresh = rows.filter((r) => !this.position.seen.has(Number(r.id)));
    const organisations = [...new Set(fresh.map((r) => r.organisation_id))];
    if (organisations.length > MAX_CHANGES_APPLIED) {
      await this.loadAll(manager);
      return;
    }
    const reloaded = await loadPartners(manager, organisations);
    const partners = new Map(this.snapshot!.partners);
    for (const id of organisations) partners.delete(id);
    for (const p of reloaded) partners.set(p.partnerId, p);
    this.snapshot = snapshotOf(partners);
    // another search may have moved the floor meanwhile (over holes given up)
    for (const r of fresh) if (Number(r.id) > this.position.floor) this.position.seen.set(Number(r.id), msOf(r.changed_at));
    this.stats.organisationsReloaded += organisations.length;
    if (rows.length) this.settle(msOf(rows[0]!.at));
  }

  /**
   * Moves the floor over every applied id, and over holes given up: the ids missing below the
   * lowest seen one were handed out before its row was written, so once that row is
   * CHANGE_HOLE_TIMEOUT_MS old (`nowMs`, the database's clock) their transactions have been open
   * at least that long.
   */
  private settle(nowMs: number): void {
    const p = this.position;
    for (;;) {
      if (p.seen.delete(p.floor + 1)) {
        p.floor++;
        continue;
      }
      let lowest = Number.POSITIVE_INFINITY;
      for (const id of p.seen.keys()) {
        if (id <= p.floor) p.seen.delete(id);
        else if (id < lowest) lowest = id;
      }
      if (lowest === Number.POSITIVE_INFINITY || nowMs - p.seen.get(lowest)! < CHANGE_HOLE_TIMEOUT_MS) return;
      p.floor = lowest - 1;
    }
  }
}

const indexes = new WeakMap<DataSource, SearchIndex>();

/** The index of the database `manager` talks to (one per data source, so tests with their own apps never share one). */
export function searchIndexFor(manager: EntityManager): SearchIndex {
  const dataSource = manager.connection;
  let index = indexes.get(dataSource);
  if (!index) indexes.set(dataSource, (index = new SearchIndex()));
  return index;
}

/** Deletes change-log rows older than CHANGE_LOG_RETENTION_HOURS (run by the daily retention job). */
export async function pruneSearchIndexChanges(manager: EntityManager, now: Date): Promise<number> {
  const result: { affectedRows?: number } = await manager.query('DELETE FROM search_index_change WHERE changed_at < ?', [new Date(now.getTime() - CHANGE_LOG_RETENTION_HOURS * 3_600_000)]);
  return result.affectedRows ?? 0;
}
