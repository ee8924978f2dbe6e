// The starting platform catalogue. Wording is Emberline's own; network admins edit it later,
// so the seed only adds entries that are missing and never overwrites.
import type { Capability, ServiceType } from '@emberline/domain';

type CapabilitySeed = Omit<Capability, 'retired'>;
type ServiceTypeSeed = Omit<ServiceType, 'retired'>;

export const CAPABILITIES: CapabilitySeed[] = [
  {
    code: 'vci-pass-thru',
    name: 'Vehicle communication interface',
    category: 'diagnostics',
    standards: ['ISO 22900-2 (D-PDU API)', 'SAE J2534'],
    description:
      'A dealer-level diagnostic interface on the vehicle diagnostic connector, with current diagnostic software that can reach the heater control unit.',
  },
  {
    code: 'uds-flash-programming',
    name: 'Control-unit flash programming',
    category: 'diagnostics',
    standards: ['ISO 14229 (UDS)', 'ISO 15765 (diagnostics on CAN)'],
    description:
      'Software, access rights and firmware files to reprogram a heater control unit over the diagnostic bus, including verification after the flash.',
  },
  {
    code: 'control-unit-coding',
    name: 'Control-unit configuration',
    category: 'diagnostics',
    standards: ['ISO 14229 (UDS)'],
    description: 'Reading and writing configuration values of heater and climate control units, with a saved copy of the original values.',
  },
  {
    code: 'battery-support-unit',
    name: 'Battery support unit',
    category: 'electrical',
    standards: [],
    description:
      'A regulated power supply that holds the vehicle voltage steady for the whole of a flash or configuration session, for 12 V and 24 V systems.',
  },
  {
    code: 'lin-can-tools',
    name: 'LIN and CAN bus tools',
    category: 'electrical',
    standards: ['ISO 17987 (LIN)', 'ISO 11898 (CAN)'],
    description: 'Breakout leads and a bus monitor to check single-wire data lines and CAN traffic between heater, receiver and vehicle.',
  },
  {
    code: 'sealed-connector-crimping',
    name: 'Sealed-connector crimp tooling',
    category: 'electrical',
    standards: [],
    description: 'Crimp tools, pin extractors and heat-shrink for sealed vehicle connectors, so new wires are added without cutting the loom.',
  },
  {
    code: 'digital-multimeter',
    name: 'Digital multimeter with current clamp',
    category: 'measurement',
    standards: ['IEC 61010-1'],
    description: 'For supply voltage, voltage drop, continuity and current draw measurements on 12 V and 24 V circuits.',
  },
  {
    code: 'exhaust-gas-analyser',
    name: 'Exhaust gas analyser',
    category: 'measurement',
    standards: [],
    description: 'Measures CO and CO₂ in the heater exhaust to set up and check combustion after service or installation.',
  },
  {
    code: 'coolant-pressure-tester',
    name: 'Cooling-system pressure tester',
    category: 'mechanical',
    standards: [],
    description: 'Pressurises the cooling circuit to find leaks after work on coolant hoses or the heater.',
  },
  {
    code: 'fuel-line-tooling',
    name: 'Fuel line and metering pump tooling',
    category: 'mechanical',
    standards: [],
    description: 'Tank standpipe, fuel line connectors and a metering-pump test set for retrofits and fuel delivery checks.',
  },
  {
    code: 'air-heater-installation',
    name: 'Air heater installation skills',
    category: 'skill',
    standards: [],
    description: 'Planning and building the mounting, combustion air intake, exhaust route, fuel supply and warm-air ducting of an air heater.',
  },
];

export const SERVICE_TYPES: ServiceTypeSeed[] = [
  {
    code: 'parking-conversion-auto',
    name: 'Parking heater conversion (automatic climate control)',
    summary: 'Turn a factory auxiliary coolant heater into a parking heater you start by remote or timer.',
    description:
      'For vans that already have a fuel-fired coolant heater working as an auxiliary heater and automatic climate control. The technician fits a remote receiver (ground, a fused 12 V supply through a fuse tap, and a single-wire data line), updates and configures the heater control unit with a stable power supply connected, pairs your handsets and does a test run outdoors.',
    defaultDurationMinutes: 90,
    requiredCapabilities: ['vci-pass-thru', 'uds-flash-programming', 'control-unit-coding', 'battery-support-unit', 'sealed-connector-crimping', 'digital-multimeter'],
    cautions: ['stable-power-flashing', 'vehicle-electrics', 'exhaust-gas'],
  },
  {
    code: 'parking-conversion-manual',
    name: 'Parking heater conversion (manual climate control)',
    summary: 'The same conversion for vans with manual climate control: extra wiring and parts, a longer job.',
    description:
      'Vans with manual climate control need extra wiring so the blower and coolant flow follow the heater. Expect more parts and about twice the time of a conversion on a van with automatic climate control.',
    defaultDurationMinutes: 180,
    requiredCapabilities: ['vci-pass-thru', 'uds-flash-programming', 'control-unit-coding', 'battery-support-unit', 'sealed-connector-crimping', 'digital-multimeter', 'lin-can-tools'],
    cautions: ['stable-power-flashing', 'vehicle-electrics', 'exhaust-gas'],
  },
  {
    code: 'remote-kit-fitting',
    name: 'Remote-control kit fitting',
    summary: 'Receiver, handsets and antenna for a heater that already runs as a parking heater.',
    description:
      'Fitting and wiring a remote receiver and antenna, pairing up to five handsets and checking the range. The receiver needs ground, a fused supply of about 1 A and the heater data line.',
    defaultDurationMinutes: 90,
    requiredCapabilities: ['sealed-connector-crimping', 'digital-multimeter', 'lin-can-tools'],
    cautions: ['vehicle-electrics', 'exhaust-gas'],
  },
  {
    code: 'control-unit-firmware-update',
    name: 'Heater control-unit firmware update',
    summary: 'Bring the heater control unit to current firmware, with the vehicle on a support supply.',
    description:
      'The technician reads the installed version, connects a battery support unit, flashes the new firmware over the diagnostic bus, verifies it and clears stored faults.',
    defaultDurationMinutes: 60,
    requiredCapabilities: ['vci-pass-thru', 'uds-flash-programming', 'battery-support-unit'],
    cautions: ['stable-power-flashing', 'vehicle-electrics'],
  },
  {
    code: 'control-unit-configuration',
    name: 'Control-unit configuration',
    summary: 'Set heater and climate control options such as parking-heater mode and run time.',
    description: 'Reading, saving and changing configuration values of the heater and climate control units, then a function check.',
    defaultDurationMinutes: 45,
    requiredCapabilities: ['vci-pass-thru', 'control-unit-coding', 'battery-support-unit'],
    cautions: ['stable-power-flashing', 'vehicle-electrics'],
  },
  {
    code: 'handset-pairing',
    name: 'Handset pairing and range check',
    summary: 'Pair new or replacement handsets and check that they reach the van.',
    description:
      'Pairing handsets with the receiver, a battery check of each handset, and a range test. Without an external antenna a handset usually reaches 15–20 m.',
    defaultDurationMinutes: 30,
    requiredCapabilities: ['digital-multimeter'],
    cautions: ['exhaust-gas'],
  },
  {
    code: 'seasonal-heater-service',
    name: 'Seasonal heater service',
    summary: 'Before winter: combustion check, glow pin and fuel supply, coolant circuit and a test run.',
    description:
      'Inspection of the burner, glow pin, fuel supply and exhaust, a combustion check with an exhaust gas analyser, a pressure test of the coolant circuit and a full test run.',
    defaultDurationMinutes: 90,
    requiredCapabilities: ['digital-multimeter', 'exhaust-gas-analyser', 'coolant-pressure-tester'],
    cautions: ['exhaust-gas', 'fuel-system', 'hot-coolant'],
  },
  {
    code: 'heater-fault-diagnosis',
    name: 'Heater fault diagnosis',
    summary: 'The heater does not start, stops, or smokes: find out why.',
    description:
      'Reading fault memory, checking supply voltage under load, fuel delivery, glow pin, data line and handsets. Common causes are a near-empty tank, low handset batteries and unpaired handsets.',
    defaultDurationMinutes: 60,
    requiredCapabilities: ['vci-pass-thru', 'digital-multimeter', 'lin-can-tools'],
    cautions: ['exhaust-gas', 'fuel-system', 'vehicle-electrics'],
  },
  {
    code: 'air-heater-installation',
    name: 'Diesel air heater installation',
    summary: 'Retrofit a diesel air heater in a camper or van without a factory heater.',
    description:
      'Planning and fitting the heater, combustion air intake, exhaust outlet, fuel supply from the tank, warm-air ducting and controls, then a combustion check and test run.',
    defaultDurationMinutes: 300,
    requiredCapabilities: ['air-heater-installation', 'fuel-line-tooling', 'sealed-connector-crimping', 'digital-multimeter', 'exhaust-gas-analyser'],
    cautions: ['exhaust-gas', 'fuel-system', 'vehicle-electrics'],
  },
];
