// The invented demo scenario (see the project's demo brief): one network, partner
// organisations in the Alps and the Nordics, their people, and van owners. Names are invented;
// e-mail addresses use the reserved example domain.
import type { MemberRole, OrganisationStatus, VehicleInput } from '@emberline/domain';

export const DEMO_PASSWORD = 'ember-demo-2026';

export interface DemoPerson {
  name: string;
  email: string;
  locale?: 'en' | 'de';
}

export interface DemoOrganisation {
  name: string;
  status: OrganisationStatus;
  statusReason?: string;
  members: (DemoPerson & { role: MemberRole })[];
}

export const DEMO_NETWORK_ADMINS: DemoPerson[] = [{ name: 'Mira Castell', email: 'admin@emberline.example' }];

export const DEMO_ORGANISATIONS: DemoOrganisation[] = [
  {
    name: 'Glutwerk Mobil',
    status: 'approved',
    members: [
      { name: 'Lena Hofer', email: 'lena@glutwerk.example', role: 'partner_admin', locale: 'de' },
      { name: 'Tobias Reiter', email: 'tobias@glutwerk.example', role: 'technician', locale: 'de' },
    ],
  },
  {
    name: 'Nordlys Varme',
    status: 'approved',
    members: [{ name: 'Sigrun Aasen', email: 'sigrun@nordlys-varme.example', role: 'partner_admin' }],
  },
  {
    name: 'Kaltstart Service Bayern',
    status: 'approved',
    members: [
      { name: 'Florian Huber', email: 'florian@kaltstart.example', role: 'partner_admin', locale: 'de' },
      { name: 'Anja Brandl', email: 'anja@kaltstart.example', role: 'technician', locale: 'de' },
      { name: 'Deniz Yilmaz', email: 'deniz@kaltstart.example', role: 'technician', locale: 'de' },
    ],
  },
  {
    name: 'Fjällvärme',
    status: 'approved',
    members: [{ name: 'Erik Lindqvist', email: 'erik@fjallvarme.example', role: 'partner_admin' }],
  },
  {
    name: 'Alpenglut Technik',
    status: 'submitted',
    members: [{ name: 'Paul Kernstock', email: 'paul@alpenglut.example', role: 'partner_admin', locale: 'de' }],
  },
  {
    name: 'Brennpunkt Kfz-Elektrik',
    status: 'suspended',
    statusReason: 'insurance expired',
    members: [
      { name: 'Sabine Moser', email: 'sabine@brennpunkt.example', role: 'partner_admin', locale: 'de' },
      { name: 'Lukas Gruber', email: 'lukas@brennpunkt.example', role: 'technician', locale: 'de' },
    ],
  },
  {
    name: 'Varmebil Sjælland',
    status: 'approved',
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
