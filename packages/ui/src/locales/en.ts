// Strings shared by both apps: brand, common states, errors and the safety cautions.
// Caution keys are the CautionCode values from @emberline/domain.
const en = {
  brand: {
    name: 'Emberline',
    network: 'Emberline Northern Network',
  },
  common: {
    loading: 'Loading…',
    retry: 'Try again',
    emptyTitle: 'Nothing here yet',
    errorTitle: 'This could not be loaded',
    close: 'Close',
    skipToContent: 'Skip to main content',
  },
  errors: {
    network: 'We could not reach Emberline. Check your connection, then try again.',
    unexpected: 'Something went wrong on our side. Please try again in a moment.',
    reference: 'Reference: {id}',
  },
  caution: {
    heading: 'Safety cautions',
    'exhaust-gas': {
      title: 'Exhaust gas (carbon monoxide)',
      text: 'Fuel-fired heaters make exhaust gas that contains carbon monoxide, which you cannot see or smell. Never run a heater in a closed garage or any enclosed space, and keep the exhaust outlet clear.',
    },
    'fuel-system': {
      title: 'Fuel and exhaust work',
      text: "Work on fuel lines, the fuel pump and the exhaust follows the heater maker's instructions and local regulations. Keep flames and sparks away from fuel.",
    },
    'vehicle-electrics': {
      title: 'Vehicle electrics',
      text: "Wiring, fuses and connections to the vehicle's electrical system follow the heater maker's instructions and local regulations.",
    },
    'stable-power-flashing': {
      title: 'Stable power while flashing',
      text: 'Firmware updates and coding run only with a stable external power supply (a battery support unit) connected, so the vehicle voltage never drops during the update.',
    },
    'hot-coolant': {
      title: 'Hot coolant',
      text: 'Coolant can be hot and under pressure. Let the engine and heater cool before the coolant circuit is opened, and bleed it as the maker describes.',
    },
    defer: "Emberline puts you in touch with technicians. It does not replace the heater maker's instructions, local codes or licensed practice: where they say otherwise, they apply.",
  },
};

export default en;
export type SharedMessages = typeof en;
