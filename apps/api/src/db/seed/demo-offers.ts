// Demo offers, parts, travel policies and working hours for the approved demo partners, each in
// its own currency (EUR prices from the demo brief; the NOK, SEK and DKK prices are invented demo
// prices, rounded as a local price list would be), and a few anonymous coverage-gap searches so
// the network's map has something to show. Idempotent: parts are found by name and currency,
// offers by service type, policy and hours are only written when missing, and the gap searches
// only when none were seeded before.
import type { EntityManager } from 'typeorm';
import { gapCell, WorkingHoursSchema, type Currency, type WorkingHoursDraft } from '@emberline/domain';
import { newId } from '../../lib/secure-token';
import { DEMO_ORGANISATIONS } from './demo-data';

/** Parts the kits are made of. */
const DEMO_PARTS = [
  { name: 'Remote receiver', partType: 'receiver' },
  { name: 'Handset', partType: 'handset' },
  { name: 'Connector with pins', partType: 'connector' },
  { name: 'Fuse tap with 1 A fuse', partType: 'fuse' },
  { name: 'Ring terminal', partType: 'terminal' },
  { name: 'Nut set', partType: 'fastener' },
  { name: 'Wire, 2 m', partType: 'wire' },
  { name: 'Antenna', partType: 'antenna' },
  { name: 'Manual climate panel harness', partType: 'harness' },
] as const;
type PartName = (typeof DEMO_PARTS)[number]['name'];

/** Receiver, two handsets, connector, fuse tap, ring terminal, nuts, three wires, antenna (85 EUR). */
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
/** The same plus the harness a manual climate panel needs (140 EUR). */
const MANUAL_KIT: [PartName, number][] = [...AUTO_KIT, ['Manual climate panel harness', 1]];

interface PriceBook {
  currency: Currency;
  /** Unit prices in minor units (cents, øre, öre). */
  parts: Record<PartName, number>;
  /** Offered where the organisation holds every capability the service type requires. */
  offers: { serviceTypeCode: string; priceMinor: number; kit: [PartName, number][] }[];
  travel: { freeWithinKm: number; ratePerKmMinor: number; maxDistanceKm: number };
}

/** The demo brief's prices: conversion 180 + kit 85, manual 320 + kit 140, firmware 90, service 120; travel free within 20 km, then 0.80/km. */
const EUR: PriceBook = {
  currency: 'EUR',
  parts: {
    'Remote receiver': 3200,
    Handset: 1500,
    'Connector with pins': 600,
    'Fuse tap with 1 A fuse': 250,
    'Ring terminal': 50,
    'Nut set': 50,
    'Wire, 2 m': 150,
    Antenna: 900,
    'Manual climate panel harness': 5500,
  },
  offers: [
    { serviceTypeCode: 'parking-conversion-auto', priceMinor: 18_000, kit: AUTO_KIT },
    { serviceTypeCode: 'parking-conversion-manual', priceMinor: 32_000, kit: MANUAL_KIT },
    { serviceTypeCode: 'control-unit-firmware-update', priceMinor: 9_000, kit: [] },
    { serviceTypeCode: 'seasonal-heater-service', priceMinor: 12_000, kit: [] },
  ],
  travel: { freeWithinKm: 20, ratePerKmMinor: 80, maxDistanceKm: 150 },
};

/** Invented demo prices: conversion 2 100 NOK + kit 990 NOK, manual 3 700 + 1 640, firmware 1 050, service 1 400; 8 NOK/km after 20 km. */
const NOK: PriceBook = {
  currency: 'NOK',
  parts: {
    'Remote receiver': 37_000,
    Handset: 17_500,
    'Connector with pins': 7_000,
    'Fuse tap with 1 A fuse': 3_000,
    'Ring terminal': 500,
    'Nut set': 500,
    'Wire, 2 m': 2_000,
    Antenna: 10_000,
    'Manual climate panel harness': 65_000,
  },
  offers: [
    { serviceTypeCode: 'parking-conversion-auto', priceMinor: 210_000, kit: AUTO_KIT },
    { serviceTypeCode: 'parking-conversion-manual', priceMinor: 370_000, kit: MANUAL_KIT },
    { serviceTypeCode: 'control-unit-firmware-update', priceMinor: 105_000, kit: [] },
    { serviceTypeCode: 'seasonal-heater-service', priceMinor: 140_000, kit: [] },
  ],
  travel: { freeWithinKm: 20, ratePerKmMinor: 800, maxDistanceKm: 200 },
};

/** Invented demo prices: conversion 1 990 SEK + kit 960 SEK, manual 3 590 + 1 590, firmware 990, service 1 390; 7 SEK/km after 25 km. */
const SEK: PriceBook = {
  currency: 'SEK',
  parts: {
    'Remote receiver': 36_000,
    Handset: 17_000,
    'Connector with pins': 7_000,
    'Fuse tap with 1 A fuse': 3_000,
    'Ring terminal': 500,
    'Nut set': 500,
    'Wire, 2 m': 2_000,
    Antenna: 9_000,
    'Manual climate panel harness': 63_000,
  },
  offers: [
    { serviceTypeCode: 'parking-conversion-auto', priceMinor: 199_000, kit: AUTO_KIT },
    { serviceTypeCode: 'parking-conversion-manual', priceMinor: 359_000, kit: MANUAL_KIT },
    { serviceTypeCode: 'control-unit-firmware-update', priceMinor: 99_000, kit: [] },
    { serviceTypeCode: 'seasonal-heater-service', priceMinor: 139_000, kit: [] },
  ],
  travel: { freeWithinKm: 25, ratePerKmMinor: 700, maxDistanceKm: 200 },
};

/**
 * Invented demo prices for a fitting-and-service workshop (no flashing kit): remote kit fitting
 * 995 DKK + kit 650 DKK, handset pairing 395 + one handset 110, seasonal service 895, air heater
 * fitting 4 500 (the heater itself is quoted separately); 6 DKK/km after 15 km.
 */
const DKK: PriceBook = {
  currency: 'DKK',
  parts: {
    'Remote receiver': 24_000,
    Handset: 11_000,
    'Connector with pins': 4_500,
    'Fuse tap with 1 A fuse': 2_000,
    'Ring terminal': 500,
    'Nut set': 500,
    'Wire, 2 m': 1_500,
    Antenna: 7_000,
    'Manual climate panel harness': 41_000,
  },
  offers: [
    { serviceTypeCode: 'remote-kit-fitting', priceMinor: 99_500, kit: AUTO_KIT },
    { serviceTypeCode: 'handset-pairing', priceMinor: 39_500, kit: [['Handset', 1]] },
    { serviceTypeCode: 'seasonal-heater-service', priceMinor: 89_500, kit: [] },
    { serviceTypeCode: 'air-heater-installation', priceMinor: 450_000, kit: [] },
  ],
  travel: { freeWithinKm: 15, ratePerKmMinor: 600, maxDistanceKm: 60 },
};

/** Which price list each approved demo partner sells from. */
export const DEMO_PRICE_BOOKS: Record<string, PriceBook> = {
  'Glutwerk Mobil': EUR,
  'Kaltstart Service Bayern': EUR,
  'Nordlys Varme': NOK,
  'Fjällvärme': SEK,
  'Varmebil Sjælland': DKK,
};

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

/**
 * Searches nobody answered, days ago: around Linz (where the demo brief's owner lives and no
 * partner works) and one in Vienna. Stored as the search stores them: the cell, never the place.
 */
export const DEMO_GAP_SEARCHES: { lat: number; lng: number; serviceTypeCode: string; vehicleClass: string; daysAgo: number }[] = [
  { lat: 48.3069, lng: 14.2858, serviceTypeCode: 'parking-conversion-manual', vehicleClass: 'coolant_auxiliary/12v', daysAgo: 2 },
  { lat: 48.3069, lng: 14.2858, serviceTypeCode: 'parking-conversion-manual', vehicleClass: 'coolant_auxiliary/12v', daysAgo: 9 },
  { lat: 48.3069, lng: 14.2858, serviceTypeCode: 'parking-conversion-auto', vehicleClass: 'coolant_auxiliary/12v', daysAgo: 15 },
  { lat: 48.2792, lng: 14.2528, serviceTypeCode: 'seasonal-heater-service', vehicleClass: 'coolant_parking/24v', daysAgo: 4 },
  { lat: 48.1575, lng: 14.0289, serviceTypeCode: 'parking-conversion-auto', vehicleClass: 'coolant_auxiliary/12v', daysAgo: 21 },
  { lat: 48.0427, lng: 14.4213, serviceTypeCode: 'air-heater-installation', vehicleClass: 'none/12v', daysAgo: 30 },
  { lat: 48.2085, lng: 16.3721, serviceTypeCode: 'parking-conversion-auto', vehicleClass: 'coolant_auxiliary/unknown-voltage', daysAgo: 6 },
];

const DAY_MS = 86_400_000;

async function seedGapSearches(manager: EntityManager, now: Date): Promise<number> {
  const cells = DEMO_GAP_SEARCHES.map((g) => ({ ...g, cell: gapCell(g) }));
  // seeded once: any row in the first demo cell means the demo searches are there (or were, and aged out)
  const first = cells[0]!.cell;
  const [seen] = await manager.query('SELECT 1 AS x FROM coverage_gap_search WHERE cell_lat = ? AND cell_lng = ? LIMIT 1', [first.lat, first.lng]);
  if (seen) return 0;
  for (const g of cells) {
    await manager.query('INSERT INTO coverage_gap_search (cell_lat, cell_lng, service_type_code, vehicle_class, created_at) VALUES (?, ?, ?, ?, ?)', [
      g.cell.lat,
      g.cell.lng,
      g.serviceTypeCode,
      g.vehicleClass,
      new Date(now.getTime() - g.daysAgo * DAY_MS),
    ]);
  }
  return cells.length;
}

export async function seedDemoOffers(manager: EntityManager, now: Date = new Date()): Promise<{ offersAdded: number; gapSearchesAdded: number }> {
  let offersAdded = 0;
  const q = <T = unknown>(sql: string, params: unknown[] = []): Promise<T[]> => manager.query(sql, params);
  for (const demo of DEMO_ORGANISATIONS) {
    const book = DEMO_PRICE_BOOKS[demo.name];
    if (demo.status !== 'approved' || !book) continue;
    const [org] = await q<{ id: string }>('SELECT id FROM organisation WHERE name = ?', [demo.name]);
    if (!org) continue;
    // technicians work; an organisation of one is its admin
    const members = await q<{ user_id: string; role: string }>('SELECT user_id, role FROM membership WHERE organisation_id = ? ORDER BY user_id', [org.id]);
    const technicians = members.filter((m) => m.role === 'technician');
    const workers = (technicians.length ? technicians : members.filter((m) => m.role === 'partner_admin')).map((m) => m.user_id);

    const partIds = new Map<string, string>();
    for (const part of DEMO_PARTS) {
      const [existing] = await q<{ id: string }>('SELECT id FROM part WHERE organisation_id = ? AND name = ? AND currency = ?', [org.id, part.name, book.currency]);
      const id = existing?.id ?? newId();
      if (!existing) {
        await q('INSERT INTO part (id, organisation_id, name, part_type, unit_price_minor, currency, stock) VALUES (?, ?, ?, ?, ?, ?, ?)', [
          id,
          org.id,
          part.name,
          part.partType,
          book.parts[part.name],
          book.currency,
          20,
        ]);
      }
      partIds.set(part.name, id);
    }

    for (const offer of book.offers) {
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
        book.currency,
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
      book.travel.freeWithinKm,
      book.travel.ratePerKmMinor,
      book.currency,
      book.travel.maxDistanceKm,
    ]);
    const zone = ZONE_BY_CITY[demo.profile.city];
    if (!zone) throw new Error(`Seed: no time zone for ${demo.profile.city}`);
    const hours = JSON.stringify(WorkingHoursSchema.parse(demoHours(zone)));
    for (const userId of workers) await q('INSERT IGNORE INTO working_hours (organisation_id, user_id, hours) VALUES (?, ?, ?)', [org.id, userId, hours]);
  }
  return { offersAdded, gapSearchesAdded: await seedGapSearches(manager, now) };
}
