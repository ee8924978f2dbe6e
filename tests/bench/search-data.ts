// Generates the search benchmark's network into a bench database: 10,000 approved partners
// across Europe (random bases, radii 20–150 km, modes, equipment, travel policies, weekday hours)
// with 50,000 offers, written with multi-row INSERTs. Seeded, so every run builds the same network.
import { randomUUID } from 'node:crypto';
import type { DataSource } from 'typeorm';
import { WorkingHoursSchema, type WorkingHoursDraft } from '../../packages/domain/src';

/** Small seeded generator (mulberry32), as the slot bench uses. */
export function random(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Where the bases and the searched places fall: Europe from Portugal to Finland, Sicily to Lapland. */
export const EUROPE = { south: 36, north: 70, west: -10, east: 30 } as const;

export const randomPlace = (rnd: () => number) => ({ lat: EUROPE.south + rnd() * (EUROPE.north - EUROPE.south), lng: EUROPE.west + rnd() * (EUROPE.east - EUROPE.west) });

export interface BenchNetwork {
  partners: number;
  offers: number;
  ms: number;
}

const ZONES: [maxLng: number, zone: string][] = [
  [-5, 'Europe/Lisbon'],
  [2, 'Europe/Paris'],
  [15, 'Europe/Berlin'],
  [24, 'Europe/Warsaw'],
  [180, 'Europe/Helsinki'],
];

function hoursFor(zone: string, saturday: boolean): string {
  const day = [{ start: '08:00', end: '12:00' }, { start: '13:00', end: '17:00' }];
  const draft: WorkingHoursDraft = {
    timeZone: zone,
    weekly: { monday: day, tuesday: day, wednesday: day, thursday: day, friday: day, ...(saturday ? { saturday: [{ start: '09:00', end: '13:00' }] } : {}) },
    exceptions: [],
    minimumNoticeMinutes: 120,
    bookingHorizonDays: 60,
    bufferMinutes: 15,
  };
  return JSON.stringify(WorkingHoursSchema.parse(draft));
}

/** Inserts rows in statements of `batch` rows each. */
async function insertRows(ds: DataSource, table: string, columns: string[], rows: unknown[][], batch = 1000): Promise<void> {
  const tuple = `(${columns.map(() => '?').join(', ')})`;
  for (let i = 0; i < rows.length; i += batch) {
    const chunk = rows.slice(i, i + batch);
    await ds.query(`INSERT INTO ${table} (${columns.join(', ')}) VALUES ${chunk.map(() => tuple).join(', ')}`, chunk.flat());
  }
}

/**
 * Fills an empty, migrated database (catalogue seeded) with the bench network. Each partner holds
 * each capability with probability 0.9, and then whatever five of the service types it picked
 * still need, so every offer is one the API would accept.
 */
export async function generateNetwork(ds: DataSource, o: { partners?: number; offersPerPartner?: number; seed?: number } = {}): Promise<BenchNetwork> {
  const t0 = performance.now();
  const partners = o.partners ?? 10_000;
  const perPartner = o.offersPerPartner ?? 5;
  const rnd = random(o.seed ?? 20260601);
  const pick = <T>(list: readonly T[]) => list[Math.floor(rnd() * list.length)]!;
  const int = (min: number, max: number) => min + Math.floor(rnd() * (max - min + 1));

  const capabilities: { id: number; code: string }[] = await ds.query('SELECT id, code FROM capability WHERE retired = 0');
  const types: { id: number; code: string; default_duration_minutes: number }[] = await ds.query('SELECT id, code, default_duration_minutes FROM service_type WHERE retired = 0');
  const needs: { service_type_id: number; capability_id: number }[] = await ds.query('SELECT service_type_id, capability_id FROM service_type_capability');
  const required = new Map(types.map((t) => [t.id, needs.filter((n) => n.service_type_id === t.id).map((n) => n.capability_id)]));
  if (types.length < perPartner) throw new Error(`The catalogue has ${types.length} service types; ${perPartner} offers per partner need more`);
  const hours = new Map(ZONES.flatMap(([, zone]) => [[`${zone}|0`, hoursFor(zone, false)], [`${zone}|1`, hoursFor(zone, true)]]));

  const users: unknown[][] = [];
  const orgs: unknown[][] = [];
  const memberships: unknown[][] = [];
  const profiles: unknown[][] = [];
  const claims: unknown[][] = [];
  const policies: unknown[][] = [];
  const workingHours: unknown[][] = [];
  const parts: unknown[][] = [];
  const offers: unknown[][] = [];
  const offerTechnicians: unknown[][] = [];
  const offerParts: unknown[][] = [];
  // nobody signs in to the bench network
  const passwordHash = 'bench-no-sign-in';

  for (let i = 0; i < partners; i++) {
    const orgId = randomUUID();
    const userId = randomUUID();
    const base = randomPlace(rnd);
    const roll = rnd();
    const mode = roll < 0.5 ? 'mobile' : roll < 0.75 ? 'both' : 'workshop';
    const radiusKm = mode === 'workshop' ? null : int(20, 150);
    const currency = base.lat >= 55 ? pick(['EUR', 'SEK', 'NOK', 'DKK'] as const) : 'EUR';
    const zone = ZONES.find(([maxLng]) => base.lng < maxLng)![1];
    users.push([userId, `bench-${i}@bench.example`, `Bench technician ${i}`, passwordHash]);
    orgs.push([orgId, `Bench partner ${i}`, 'approved']);
    memberships.push([orgId, userId, 'partner_admin']);
    profiles.push([orgId, `Bench partner ${i}`, `Bench ${i}`, base.lat, base.lng, mode, radiusKm, mode === 'mobile' ? null : `Bench street ${i}`]);

    const held = new Set(capabilities.filter(() => rnd() < 0.9).map((c) => c.id));
    const shuffled = [...types];
    for (let k = shuffled.length - 1; k > 0; k--) {
      const j = Math.floor(rnd() * (k + 1));
      [shuffled[k], shuffled[j]] = [shuffled[j]!, shuffled[k]!];
    }
    const chosen = shuffled.slice(0, perPartner);
    for (const t of chosen) for (const c of required.get(t.id)!) held.add(c);
    for (const c of held) claims.push([orgId, c]);

    if (mode !== 'workshop' || rnd() < 0.3) {
      const free = int(0, 30);
      // some policies reach less far than the radius, so a place inside the area can be out of reach
      policies.push([orgId, free, int(50, 150), currency, Math.max(free, Math.round((radiusKm ?? 60) * (1 + rnd() * 0.6)))]);
    }
    workingHours.push([orgId, userId, hours.get(`${zone}|${rnd() < 0.3 ? 1 : 0}`)]);
    const receiver = randomUUID();
    const handset = randomUUID();
    parts.push([receiver, orgId, 'Receiver', 'receiver', int(20, 45) * 100, currency, 10], [handset, orgId, 'Handset', 'handset', int(10, 20) * 100, currency, 10]);

    for (const t of chosen) {
      const offerId = randomUUID();
      offers.push([offerId, orgId, t.id, int(40, 400) * 100, currency, t.default_duration_minutes, '{"kind":"none"}', '{"freeUntilHours":24,"feeMinor":0}']);
      offerTechnicians.push([offerId, orgId, userId]);
      if (rnd() < 0.5) offerParts.push([offerId, receiver, 1], [offerId, handset, int(1, 2)]);
    }
  }

  await insertRows(ds, 'user_account', ['id', 'email', 'name', 'password_hash'], users);
  await insertRows(ds, 'organisation', ['id', 'name', 'status'], orgs);
  await insertRows(ds, 'membership', ['organisation_id', 'user_id', 'role'], memberships);
  await insertRows(ds, 'partner_profile', ['organisation_id', 'trading_name', 'city', 'base_lat', 'base_lng', 'mode', 'radius_km', 'workshop_address'], profiles);
  await insertRows(ds, 'organisation_capability', ['organisation_id', 'capability_id'], claims);
  await insertRows(ds, 'travel_policy', ['organisation_id', 'free_within_km', 'rate_per_km_minor', 'currency', 'max_distance_km'], policies);
  await insertRows(ds, 'working_hours', ['organisation_id', 'user_id', 'hours'], workingHours, 500);
  await insertRows(ds, 'part', ['id', 'organisation_id', 'name', 'part_type', 'unit_price_minor', 'currency', 'stock'], parts);
  await insertRows(ds, 'offer', ['id', 'organisation_id', 'service_type_id', 'price_minor', 'currency', 'duration_minutes', 'deposit', 'cancellation'], offers);
  await insertRows(ds, 'offer_technician', ['offer_id', 'organisation_id', 'user_id'], offerTechnicians);
  await insertRows(ds, 'offer_part', ['offer_id', 'part_id', 'quantity'], offerParts);
  await ds.query('ANALYZE TABLE partner_profile, organisation, offer, organisation_capability, travel_policy, offer_technician, working_hours, offer_part, part');
  return { partners, offers: offers.length, ms: performance.now() - t0 };
}
