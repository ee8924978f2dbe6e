// Shared test data for the services, parts, area and hours screens: a small catalogue, parts,
// an offer with a kit, a travel policy, an area and a technician's hours (all invented).
import type { Capability, Offer, Part, ServiceArea, ServiceType, TechnicianHours, TravelPolicy, WorkingHours } from '@emberline/domain';
import { ORG_A, team } from './fixtures';

export const ADMIN_ID = team.members[0]!.userId;
export const TECH_ID = team.members[1]!.userId;

export const capabilities: Capability[] = [
  { code: 'digital-multimeter', name: 'Digital multimeter', description: '', category: 'measurement', standards: [], retired: false },
  { code: 'vci-pass-thru', name: 'Vehicle communication interface', description: '', category: 'diagnostics', standards: [], retired: false },
  { code: 'uds-flash-programming', name: 'Control-unit flashing over UDS', description: '', category: 'diagnostics', standards: ['ISO 14229'], retired: false },
];

export const serviceTypes: ServiceType[] = [
  {
    code: 'handset-pairing',
    name: 'Handset pairing and range check',
    summary: '',
    description: '',
    defaultDurationMinutes: 30,
    requiredCapabilities: ['digital-multimeter'],
    cautions: ['exhaust-gas'],
    retired: false,
  },
  {
    code: 'control-unit-firmware-update',
    name: 'Heater control-unit firmware update',
    summary: '',
    description: '',
    defaultDurationMinutes: 60,
    requiredCapabilities: ['vci-pass-thru', 'uds-flash-programming'],
    cautions: ['stable-power-flashing'],
    retired: false,
  },
  {
    code: 'remote-kit-fitting',
    name: 'Remote-control kit fitting',
    summary: '',
    description: '',
    defaultDurationMinutes: 90,
    requiredCapabilities: ['digital-multimeter'],
    cautions: ['vehicle-electrics'],
    retired: false,
  },
];

/** What the organisation holds: no flashing interface, so no firmware updates. */
export const held = ['digital-multimeter', 'vci-pass-thru'];

const stamp = { createdAt: '2026-02-01T09:00:00.000Z', updatedAt: '2026-02-01T09:00:00.000Z', organisationId: ORG_A };
export const RECEIVER = 'd2950c6a-e5c8-4d63-9092-617de1c4db2b';
export const HANDSET = '16a9df07-ae71-4610-8613-32c825a7e725';
export const FUSE_TAP = '2b3cb233-4a6c-49f4-95c6-1b600212069a';
export const parts: Part[] = [
  { ...stamp, id: FUSE_TAP, name: 'Fuse tap with 1 A fuse', partType: 'fuse', unitPriceMinor: 250, currency: 'EUR', stock: 3 },
  { ...stamp, id: HANDSET, name: 'Handset', partType: 'handset', unitPriceMinor: 1500, currency: 'EUR', stock: 12 },
  { ...stamp, id: RECEIVER, name: 'Remote receiver', partType: 'receiver', unitPriceMinor: 3200, currency: 'EUR', stock: 4 },
];

export const OFFER_ID = '36acdfa2-2a8e-4640-91a4-41df67290975';
export const kitOffer: Offer = {
  ...stamp,
  id: OFFER_ID,
  serviceTypeCode: 'remote-kit-fitting',
  serviceTypeName: 'Remote-control kit fitting',
  priceMinor: 18_000,
  currency: 'EUR',
  durationMinutes: 90,
  technicianUserIds: [TECH_ID],
  partsKit: [
    { partId: HANDSET, quantity: 2, name: 'Handset', unitPriceMinor: 1500, currency: 'EUR' },
    { partId: RECEIVER, quantity: 1, name: 'Remote receiver', unitPriceMinor: 3200, currency: 'EUR' },
  ],
  partsTotalMinor: 6200,
  deposit: { kind: 'percent', percent: 20 },
  cancellation: { freeUntilHours: 24, feeMinor: 3000 },
};

export const policy: TravelPolicy = { organisationId: ORG_A, configured: true, freeWithinKm: 20, ratePerKmMinor: 80, currency: 'EUR', maxDistanceKm: 150 };
export const area: ServiceArea = {
  organisationId: ORG_A,
  area: { baseLabel: 'Innsbruck', baseLat: 47.2692, baseLng: 11.4041, mode: 'mobile', radiusKm: 80, workshopAddress: null },
};

export function weekdayHours(overrides: Partial<WorkingHours> = {}): WorkingHours {
  const day = [{ start: '08:00', end: '17:00' }];
  return {
    timeZone: 'Europe/Vienna',
    weekly: { monday: day, tuesday: day, wednesday: day, thursday: day, friday: day, saturday: [], sunday: [] },
    exceptions: [],
    minimumNoticeMinutes: 120,
    bookingHorizonDays: 90,
    bufferMinutes: 15,
    ...overrides,
  };
}

export const techHours = (hours: WorkingHours | null = weekdayHours()): TechnicianHours => ({ organisationId: ORG_A, userId: TECH_ID, hours });
