// Demo offers, parts, travel policy and working hours for the approved demo partners that hold a
// flashing kit (prices from the demo brief, net, in EUR minor units). Idempotent: parts are found
// by name, offers by service type, and policy and hours are only written when missing.
import type { EntityManager } from 'typeorm';
import { WorkingHoursSchema, type Currency, type WorkingHoursDraft } from '@emberline/domain';
import { newId } from '../../lib/secure-token';
import { DEMO_ORGANISATIONS } from './demo-data';

const CURRENCY: Currency = 'EUR';

/** Parts the kits are made of, unit prices in cents. */
const DEMO_PARTS = [
  { name: 'Remote receiver', partType: 'receiver', unitPriceMinor: 3200 },
  { name: 'Handset', partType: 'handset', unitPriceMinor: 1500 },
  { name: 'Connector with pins', partType: 'connector', unitPriceMinor: 600 },
  { name: 'Fuse tap with 1 A fuse', partType: 'fuse', unitPriceMinor: 250 },
  { name: 'Ring terminal', partType: 'terminal', unitPriceMinor: 50 },
  { name: 'Nut set', partType: 'fastener', unitPriceMinor: 50 },
  { name: 'Wire, 2 m', partType: 'wire', unitPriceMinor: 150 },
  { name: 'Antenna', partType: 'antenna', unitPriceMinor: 900 },
  { name: 'Manual climate panel harness', partType: 'harness', unitPriceMinor: 5500 },
] as const;
type PartName = (typeof DEMO_PARTS)[number]['name'];

/** 85 EUR: receiver, two handsets, connector, fuse tap, ring terminal, nuts, three wires, antenna. */
const AUTO_KIT: [PartName, number][] = [
  ['Remote receiver', 1],
  ['Handset', 2],
  ['Connector with pins', 1],
  ['Fuse tap with 1 A fuse', 1],
  ['Ring terminal', 1],
  ['Nut set', 1],
  ['Wire, 2 m', 3],
  ['Antenna', 1],
];
/** 140 EUR: the same plus the harness a manual climate panel needs. */
const MANUAL_KIT: [PartName, number][] = [...AUTO_KIT, ['Manual climate panel harness', 1]];

export const DEMO_OFFERS: { serviceTypeCode: string; priceMinor: number; kit: [PartName, number][] }[] = [
  { serviceTypeCode: 'parking-conversion-auto', priceMinor: 18_000, kit: AUTO_KIT },
  { serviceTypeCode: 'parking-conversion-manual', priceMinor: 32_000, kit: MANUAL_KIT },
  { serviceTypeCode: 'control-unit-firmware-update', priceMinor: 9_000, kit: [] },
  { serviceTypeCode: 'seasonal-heater-service', priceMinor: 12_000, kit: [] },
];

export const DEMO_TRAVEL_POLICY = { freeWithinKm: 20, ratePerKmMinor: 80, maxDistanceKm: 150 };

const ZONE_BY_CITY: Record<string, string> = {
  Innsbruck: 'Europe/Vienna',
  München: 'Europe/Berlin',
  Tromsø: 'Europe/Oslo',
  Östersund: 'Europe/Stockholm',
  Roskilde: 'Europe/Copenhagen',
};

export function demoHours(timeZone: string): WorkingHoursDraft {
  const day = [{ start: '08:00', end: '17:00' }];
  return { timeZone, weekly: { monday: day, tuesday: day, wednesday: day, thursday: day, friday: day }, exceptions: [], minimumNoticeMinutes: 120, bookingHorizonDays: 90, bufferMinutes: 15 };
}

export async function seedDemoOffers(manager: EntityManager): Promise<{ offersAdded: number }> {
  let offersAdded = 0;
  const q = <T = unknown>(sql: string, params: unknown[] = []): Promise<T[]> => manager.query(sql, params);
  for (const demo of DEMO_ORGANISATIONS) {
    if (demo.status !== 'approved' || !demo.capabilities.includes('uds-flash-programming')) continue;
    const [org] = await q<{ id: string }>('SELECT id FROM organisation WHERE name = ?', [demo.name]);
    if (!org) continue;
    // technicians work; an organisation of one is its admin
    const members = await q<{ user_id: string; role: string }>('SELECT user_id, role FROM membership WHERE organisation_id = ? ORDER BY user_id', [org.id]);
    const technicians = members.filter((m) => m.role === 'technician');
    const workers = (technicians.length ? technicians : members.filter((m) => m.role === 'partner_admin')).map((m) => m.user_id);

    const partIds = new Map<string, string>();
    for (const part of DEMO_PARTS) {
      const [existing] = await q<{ id: string }>('SELECT id FROM part WHERE organisation_id = ? AND name = ?', [org.id, part.name]);
      const id = existing?.id ?? newId();
      if (!existing) {
        await q('INSERT INTO part (id, organisation_id, name, part_type, unit_price_minor, currency, stock) VALUES (?, ?, ?, ?, ?, ?, ?)', [id, org.id, part.name, part.partType, part.unitPriceMinor, CURRENCY, 20]);
      }
      partIds.set(part.name, id);
    }

    for (const offer of DEMO_OFFERS) {
      const [st] = await q<{ id: number; default_duration_minutes: number }>('SELECT id, default_duration_minutes FROM service_type WHERE code = ? AND retired = 0', [offer.serviceTypeCode]);
      if (!st) continue;
      // the same rule as the API: only what the organisation holds every capability for
      const missing = await q(
        'SELECT 1 FROM service_type_capability stc WHERE stc.service_type_id = ? AND NOT EXISTS (SELECT 1 FROM organisation_capability oc WHERE oc.organisation_id = ? AND oc.capability_id = stc.capability_id)',
        [st.id, org.id],
      );
      if (missing.length) continue;
      const [existing] = await q('SELECT id FROM offer WHERE organisation_id = ? AND service_type_id = ?', [org.id, st.id]);
      if (existing) continue;
      const id = newId();
      await q('INSERT INTO offer (id, organisation_id, service_type_id, price_minor, currency, duration_minutes, deposit, cancellation) VALUES (?, ?, ?, ?, ?, ?, ?, ?)', [
        id,
        org.id,
        st.id,
        offer.priceMinor,
        CURRENCY,
        st.default_duration_minutes,
        JSON.stringify({ kind: 'none' }),
        JSON.stringify({ freeUntilHours: 24, feeMinor: 0 }),
      ]);
      for (const userId of workers) await q('INSERT INTO offer_technician (offer_id, organisation_id, user_id) VALUES (?, ?, ?)', [id, org.id, userId]);
      for (const [name, quantity] of offer.kit) await q('INSERT INTO offer_part (offer_id, part_id, quantity) VALUES (?, ?, ?)', [id, partIds.get(name)!, quantity]);
      offersAdded++;
    }

    await q('INSERT IGNORE INTO travel_policy (organisation_id, free_within_km, rate_per_km_minor, currency, max_distance_km) VALUES (?, ?, ?, ?, ?)', [
      org.id,
      DEMO_TRAVEL_POLICY.freeWithinKm,
      DEMO_TRAVEL_POLICY.ratePerKmMinor,
      CURRENCY,
      DEMO_TRAVEL_POLICY.maxDistanceKm,
    ]);
    const zone = ZONE_BY_CITY[demo.profile.city];
    if (!zone) throw new Error(`Seed: no time zone for ${demo.profile.city}`);
    const hours = JSON.stringify(WorkingHoursSchema.parse(demoHours(zone)));
    for (const userId of workers) await q('INSERT IGNORE INTO working_hours (organisation_id, user_id, hours) VALUES (?, ?, ?)', [org.id, userId, hours]);
  }
  return { offersAdded };
}
