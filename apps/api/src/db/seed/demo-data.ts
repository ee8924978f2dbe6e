// The invented demo scenario (see the project's demo brief): one network, partner
// organisations in the Alps and the Nordics, their people, and van owners. Names are invented;
// e-mail addresses use the reserved example domain.
import type { Country, MemberRole, OrganisationStatus, VehicleInput, WorkMode } from '@emberline/domain';

export const DEMO_PASSWORD = 'ember-demo-2026';

export interface DemoPerson {
  name: string;
  email: string;
  locale?: 'en' | 'de';
}

export interface DemoProfile {
  legalName: string;
  country: Country;
  street: string;
  postalCode: string;
  city: string;
  /** Invented numbers that only have the right format and check digits. */
  vatId: string | null;
  phone: string;
  baseLabel: string;
  baseLat: number;
  baseLng: number;
  mode: WorkMode;
  radiusKm: number | null;
  workshopAddress: string | null;
}

export interface DemoOrganisation {
  name: string;
  status: OrganisationStatus;
  statusReason?: string;
  members: (DemoPerson & { role: MemberRole })[];
  profile: DemoProfile;
  /** Capability codes the organisation claims. */
  capabilities: string[];
  /** Days from the seed date to the insurance expiry (negative: expired), and to the submission (negative: in the past). */
  insuranceDays: number;
  submittedDays: number;
}

/** Everything a partner needs to convert, flash, configure and service heaters. */
const FULL_KIT = [
  'vci-pass-thru',
  'uds-flash-programming',
  'control-unit-coding',
  'battery-support-unit',
  'lin-can-tools',
  'sealed-connector-crimping',
  'digital-multimeter',
  'coolant-pressure-tester',
];
/** Fitting and service only: no diagnostic interface, so no flashing or configuration. */
const FITTING_KIT = ['lin-can-tools', 'sealed-connector-crimping', 'digital-multimeter', 'exhaust-gas-analyser', 'coolant-pressure-tester', 'fuel-line-tooling', 'air-heater-installation'];

export const DEMO_NETWORK_ADMINS: DemoPerson[] = [{ name: 'Mira Castell', email: 'admin@emberline.example' }];

export const DEMO_ORGANISATIONS: DemoOrganisation[] = [
  {
    name: 'Glutwerk Mobil',
    status: 'approved',
    profile: {
      legalName: 'Glutwerk Mobil Lena Hofer e.U.',
      country: 'AT',
      street: 'Amraser Straße 41',
      postalCode: '6020',
      city: 'Innsbruck',
      vatId: 'ATU48735212',
      phone: '+43 512 908 114',
      baseLabel: 'Innsbruck',
      baseLat: 47.2692,
      baseLng: 11.4041,
      mode: 'mobile',
      radiusKm: 80,
      workshopAddress: null,
    },
    capabilities: [...FULL_KIT, 'exhaust-gas-analyser', 'fuel-line-tooling'],
    insuranceDays: 240,
    submittedDays: -120,
    members: [
      { name: 'Lena Hofer', email: 'lena@glutwerk.example', role: 'partner_admin', locale: 'de' },
      { name: 'Tobias Reiter', email: 'tobias@glutwerk.example', role: 'technician', locale: 'de' },
    ],
  },
  {
    name: 'Nordlys Varme',
    status: 'approved',
    profile: {
      legalName: 'Nordlys Varme AS',
      country: 'NO',
      street: 'Strandvegen 88',
      postalCode: '9006',
      city: 'Tromsø',
      vatId: 'NO973128450MVA',
      phone: '+47 776 50 213',
      baseLabel: 'Tromsø',
      baseLat: 69.6492,
      baseLng: 18.9553,
      mode: 'both',
      radiusKm: 120,
      workshopAddress: 'Strandvegen 88, 9006 Tromsø',
    },
    capabilities: [...FULL_KIT, 'air-heater-installation', 'fuel-line-tooling'],
    insuranceDays: 300,
    submittedDays: -150,
    members: [{ name: 'Sigrun Aasen', email: 'sigrun@nordlys-varme.example', role: 'partner_admin' }],
  },
  {
    name: 'Kaltstart Service Bayern',
    status: 'approved',
    profile: {
      legalName: 'Kaltstart Service Bayern GmbH',
      country: 'DE',
      street: 'Landsberger Straße 302',
      postalCode: '80687',
      city: 'München',
      vatId: 'DE814627599',
      phone: '+49 89 5521 780',
      baseLabel: 'Munich',
      baseLat: 48.1351,
      baseLng: 11.582,
      mode: 'workshop',
      radiusKm: 40,
      workshopAddress: 'Landsberger Straße 302, 80687 München',
    },
    capabilities: [...FULL_KIT, 'exhaust-gas-analyser', 'fuel-line-tooling', 'air-heater-installation'],
    insuranceDays: 180,
    submittedDays: -200,
    members: [
      { name: 'Florian Huber', email: 'florian@kaltstart.example', role: 'partner_admin', locale: 'de' },
      { name: 'Anja Brandl', email: 'anja@kaltstart.example', role: 'technician', locale: 'de' },
      { name: 'Deniz Yilmaz', email: 'deniz@kaltstart.example', role: 'technician', locale: 'de' },
    ],
  },
  {
    name: 'Fjällvärme',
    status: 'approved',
    profile: {
      legalName: 'Fjällvärme Erik Lindqvist',
      country: 'SE',
      street: 'Storgatan 19',
      postalCode: '831 30',
      city: 'Östersund',
      vatId: 'SE556781230901',
      phone: '+46 63 512 440',
      baseLabel: 'Östersund',
      baseLat: 63.1792,
      baseLng: 14.6357,
      mode: 'mobile',
      radiusKm: 150,
      workshopAddress: null,
    },
    capabilities: [...FULL_KIT],
    insuranceDays: 90,
    submittedDays: -90,
    members: [{ name: 'Erik Lindqvist', email: 'erik@fjallvarme.example', role: 'partner_admin' }],
  },
  {
    name: 'Alpenglut Technik',
    status: 'submitted',
    profile: {
      legalName: 'Alpenglut Technik Paul Kernstock',
      country: 'AT',
      street: 'Lendplatz 7',
      postalCode: '8020',
      city: 'Graz',
      vatId: 'ATU61928472',
      phone: '+43 316 720 455',
      baseLabel: 'Graz',
      baseLat: 47.0707,
      baseLng: 15.4395,
      mode: 'mobile',
      radiusKm: 60,
      workshopAddress: null,
    },
    capabilities: ['vci-pass-thru', 'uds-flash-programming', 'battery-support-unit', 'sealed-connector-crimping', 'digital-multimeter'],
    insuranceDays: 330,
    submittedDays: -2,
    members: [{ name: 'Paul Kernstock', email: 'paul@alpenglut.example', role: 'partner_admin', locale: 'de' }],
  },
  {
    name: 'Brennpunkt Kfz-Elektrik',
    status: 'suspended',
    statusReason: 'insurance expired',
    profile: {
      legalName: 'Brennpunkt Kfz-Elektrik OG',
      country: 'AT',
      street: 'Sterneckstraße 23',
      postalCode: '5020',
      city: 'Salzburg',
      vatId: 'ATU55301863',
      phone: '+43 662 873 300',
      baseLabel: 'Salzburg',
      baseLat: 47.8095,
      baseLng: 13.055,
      mode: 'mobile',
      radiusKm: 70,
      workshopAddress: null,
    },
    capabilities: [...FULL_KIT, 'exhaust-gas-analyser'],
    insuranceDays: -12,
    submittedDays: -400,
    members: [
      { name: 'Sabine Moser', email: 'sabine@brennpunkt.example', role: 'partner_admin', locale: 'de' },
      { name: 'Lukas Gruber', email: 'lukas@brennpunkt.example', role: 'technician', locale: 'de' },
    ],
  },
  {
    name: 'Varmebil Sjælland',
    status: 'approved',
    profile: {
      legalName: 'Varmebil Sjælland ApS',
      country: 'DK',
      street: 'Københavnsvej 64',
      postalCode: '4000',
      city: 'Roskilde',
      vatId: 'DK38147250',
      phone: '+45 46 35 72 10',
      baseLabel: 'Roskilde',
      baseLat: 55.6415,
      baseLng: 12.0803,
      mode: 'workshop',
      radiusKm: 35,
      workshopAddress: 'Københavnsvej 64, 4000 Roskilde',
    },
    capabilities: FITTING_KIT,
    insuranceDays: 150,
    submittedDays: -60,
    members: [{ name: 'Mads Kjær', email: 'mads@varmebil.example', role: 'partner_admin' }],
  },
];

/** Owners in Innsbruck, Munich, Salzburg, Vienna and Tromsø, and one in Linz where no partner works. */
export const DEMO_OWNERS: DemoPerson[] = [
  { name: 'Clara Innerhofer', email: 'clara@owners.example', locale: 'de' },
  { name: 'Maximilian Wendt', email: 'max@owners.example', locale: 'de' },
  { name: 'Theresa Pichler', email: 'theresa@owners.example', locale: 'de' },
  { name: 'Jakob Steiner', email: 'jakob@owners.example', locale: 'de' },
  { name: 'Ingrid Solheim', email: 'ingrid@owners.example' },
  { name: 'Hannes Auer', email: 'hannes@owners.example', locale: 'de' },
];

/** Invented van models: a straightforward conversion, the same with manual climate control, a
 * camper for a retrofit, and a 24 V heavy van. */
const CARGO_4: Omit<VehicleInput, 'name' | 'year'> = { model: 'Korvan Cargo 4', fuel: 'diesel', factoryHeater: 'coolant_auxiliary', climateControl: 'automatic', electricalSystemV: 12, batteryCapacityAh: 95, batteryType: 'agm' };
const CARGO_4_BASIC: Omit<VehicleInput, 'name' | 'year'> = { ...CARGO_4, model: 'Korvan Cargo 4 Basic', climateControl: 'manual', batteryCapacityAh: 80, batteryType: 'flooded' };
const CAMPER_2: Omit<VehicleInput, 'name' | 'year'> = { model: 'Maren Camper 2', fuel: 'diesel', factoryHeater: 'none', climateControl: 'manual', electricalSystemV: 12, batteryCapacityAh: 100, batteryType: 'flooded' };
const TRANSIT_9: Omit<VehicleInput, 'name' | 'year'> = { model: 'Tessaro Transit 9', fuel: 'diesel', factoryHeater: 'coolant_parking', climateControl: 'automatic', electricalSystemV: 24, batteryCapacityAh: 180, batteryType: 'agm' };

export const DEMO_VEHICLES: Record<string, VehicleInput[]> = {
  'clara@owners.example': [{ ...CARGO_4, name: 'Work van', year: 2021 }],
  'max@owners.example': [{ ...CARGO_4_BASIC, name: 'Delivery van', year: 2019 }, { ...CAMPER_2, name: 'Family camper', year: 2017 }],
  'theresa@owners.example': [{ ...CAMPER_2, name: 'Weekend camper', year: 2022 }],
  'jakob@owners.example': [{ ...TRANSIT_9, name: 'Site van', year: 2020 }],
  'ingrid@owners.example': [{ ...CARGO_4, name: 'Winter van', year: 2023 }],
  'hannes@owners.example': [{ ...CARGO_4_BASIC, name: 'Van', year: 2018 }],
};
