// The Directory's English messages. Shared strings (brand, states, cautions) live in @emberline/ui.
const en = {
  nav: {
    label: 'Main',
    services: 'Services',
    howItWorks: 'How it works',
    safety: 'Safety',
    forTechnicians: 'For technicians',
  },
  find: {
    heading: 'Find a technician',
    open: 'Find a technician',
    placeLabel: 'Where is your van?',
    placePlaceholder: 'Town or postcode',
    placeRequired: 'Enter a town or postcode so we know where to look.',
    serviceLabel: 'What do you need?',
    servicePlaceholder: 'Any service',
    submit: 'Search',
  },
  footer: {
    label: 'Footer',
    safety: 'Safety & cautions',
    forTechnicians: 'Technician and partner sign-in',
    note: 'Fuel-fired heaters make exhaust gas (carbon monoxide). Never run one in a closed garage.',
    copyright: '© {year} {network}',
  },
  home: {
    metaTitle: 'Parking-heater technicians near you',
    eyebrow: 'Mobile parking-heater technicians',
    title: 'Find a technician with the right equipment for your van',
    lead: 'Conversions, firmware updates, coding and servicing need diagnostic kit few owners have. Emberline shows you nearby technicians who bring exactly that kit, with the full price before you book.',
    ctaFind: 'Find a technician',
    ctaServices: 'See what you can book',
    promises: {
      label: 'What you get',
      equipment: 'Equipment checked for your job',
      price: 'Full price up front: labour, parts, travel and VAT',
      report: 'A job report when the work is done',
    },
    services: {
      heading: 'Services you can book',
      lead: 'Each service lists the equipment a technician needs for it. You only see technicians who hold all of it.',
      duration: 'Typical time',
      equipment: 'Equipment needed',
      noEquipment: 'No special equipment',
      cautions: 'Cautions',
      book: 'Find a technician for this',
      bookFor: 'Find a technician for {service}',
      loading: 'Loading the services you can book…',
      emptyTitle: 'No services are listed yet',
      emptyText: 'The service catalogue is being set up. Check back soon; meanwhile, read our safety notes for parking heaters.',
      emptyAction: 'Read the safety notes',
    },
    how: {
      heading: 'How it works',
      steps: {
        where: {
          title: 'Tell us where and what',
          text: 'Enter where your van is and the job you need: a conversion, a firmware update, a remote kit or a service.',
        },
        compare: {
          title: 'Compare technicians who have the kit',
          text: 'See partners near you whose equipment fits your van and job, each with an itemised price.',
        },
        book: {
          title: 'Book, pay and get a report',
          text: 'Pick a slot, pay securely, and receive a job report once the work is signed off.',
        },
      },
    },
    safety: {
      heading: 'Safety comes first',
      text: 'A parking heater burns fuel. Its exhaust gas contains carbon monoxide, so never run it in a closed garage. Technicians follow the heater maker’s instructions and local regulations.',
      link: 'Read all safety cautions',
    },
  },
  search: {
    metaTitle: 'Search',
    title: 'Map search is on its way',
    lead: 'Soon you will see technicians near you on a map, with the equipment your job needs and the full price. Here is what you asked for:',
    place: 'Place',
    service: 'Service',
    anyPlace: 'No place given',
    anyService: 'Any service',
    meanwhile: 'Meanwhile',
    browseServices: 'Browse the services you can book',
    readSafety: 'Read the safety cautions',
  },
  safety: {
    metaTitle: 'Safety & cautions',
    title: 'Safety & cautions',
    lead: 'Parking heaters burn fuel inside a vehicle’s systems. These cautions apply to every job booked through Emberline and to everyday use of your heater.',
    cautionsHeading: 'What every job observes',
    useHeading: 'Running your heater safely',
    use: {
      outdoors: 'Run the heater only in the open air, never in a closed garage, car park level without airflow or other enclosed space.',
      exhaust: 'Keep the exhaust outlet clear of snow, mud and obstacles, and park so exhaust cannot drift into the cabin or a building.',
      alarm: 'Fit a carbon monoxide alarm in the living area of a camper.',
      unwell: 'If you get a headache, feel dizzy or sick while a heater runs, switch it off, get into fresh air and seek medical help.',
      fuel: 'Refuel in good time: heaters lock out when the tank is nearly empty.',
    },
    deferHeading: 'Local codes and licensed practice',
  },
  header: {
    account: 'Account',
    console: 'Open the Console',
    menuLabel: 'Account',
  },
  signIn: {
    metaTitle: 'Sign in',
    title: 'Sign in',
    lead: 'See your bookings, vehicles and job reports.',
    noAccount: 'New to Emberline?',
    createAccount: 'Create an account',
  },
  signUp: {
    metaTitle: 'Create an account',
    title: 'Create your account',
    lead: 'Book technicians, pay securely and keep your job reports in one place.',
    haveAccount: 'Already have an account?',
  },
  checkInbox: {
    metaTitle: 'Check your inbox',
  },
  verifyEmail: {
    metaTitle: 'Confirm your e-mail address',
    findTechnician: 'Find a technician',
    toAccount: 'Go to your account',
  },
  forgotPassword: {
    metaTitle: 'Forgot your password?',
  },
  resetPassword: {
    metaTitle: 'Choose a new password',
  },
  accountPage: {
    metaTitle: 'Your account',
    title: 'Your account',
  },
  notFound: {
    metaTitle: 'Page not found',
    title: 'We could not find that page',
    text: 'The link may be old or mistyped. Start again from the home page.',
    home: 'Go to the home page',
  },
};

export default en;
