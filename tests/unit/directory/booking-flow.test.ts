// The owner's booking flow: the chosen time in both zones, a garage vehicle, a mobile address
// with a pin, a business customer, the quote line by line with the reverse-charge note and the
// cautions, then pay: the exact BookingRequest and the full navigation to the checkout URL. Also
// the server's field errors beside the address, SLOT_TAKEN with another time, payments down, and
// sign-in first.
import { afterEach, beforeAll, beforeEach, describe, expect, it, vi } from 'vitest';
import { flushPromises, mount, type VueWrapper } from '@vue/test-utils';
import { createPinia, setActivePinia } from 'pinia';
import { defineComponent, h } from 'vue';
import { createMemoryHistory, RouterView, type Router } from 'vue-router';
import { ApiError, type OwnerQuote } from '@emberline/api-client';
import type { Booking, PartnerProfile, PartnerSlots, Session, Vehicle } from '@emberline/domain';
import { refreshSession } from '@/api/auth';
import { createBooking, previewQuote } from '@/api/bookings';
import { listVehicles } from '@/api/garage';
import { getPartnerProfile, getPartnerSlots } from '@/api/search';
import { i18n } from '@/locales';
import { createAppRouter } from '@/router';

vi.mock('@/api/auth', () => ({ refreshSession: vi.fn(), signIn: vi.fn(), signOut: vi.fn(), resendVerification: vi.fn() }));
vi.mock('@/api/garage', () => ({ listVehicles: vi.fn(), addVehicle: vi.fn(), updateVehicle: vi.fn(), removeVehicle: vi.fn() }));
vi.mock('@/api/search', () => ({ searchPartners: vi.fn(), findPlaces: vi.fn(), getPartnerProfile: vi.fn(), getPartnerSlots: vi.fn(), requestCoverageAlert: vi.fn() }));
vi.mock('@/api/bookings', () => ({
  previewQuote: vi.fn(),
  createBooking: vi.fn(),
  listMyBookings: vi.fn(),
  getMyBooking: vi.fn(),
  cancelMyBooking: vi.fn(),
  rescheduleMyBooking: vi.fn(),
  releaseMyBooking: vi.fn(),
  bookingCalendarPath: (id: string) => `/api/bookings/${id}/calendar.ics`,
  fetchBookingCalendar: vi.fn(),
}));
const MapStub = defineComponent({
  name: 'AreaMapStub',
  props: ['label', 'probe', 'radiusKm', 'lat', 'lng'],
  emits: ['probe'],
  setup: (props) => () => h('div', { 'data-testid': 'area-map', 'aria-label': props.label, 'data-probe': props.probe ? `${props.probe.lat},${props.probe.lng}` : '' }),
});
vi.mock('@/components/maps-lazy', () => ({ AreaMap: MapStub, ResultsMap: MapStub }));

const Shell = defineComponent({ render: () => h(RouterView) });
const PARTNER = '5b0f3a52-8f0e-4f3c-9d55-3c2f1b7e9a10';
const BOOKING = '7c9e6679-7425-40de-944b-e07fc1f90ae7';
const START = '2030-03-05T08:00:00.000Z';
const LATER = '2030-03-05T12:30:00.000Z';

const owner: Session = {
  accessToken: 'access-1',
  expiresIn: 900,
  user: { id: '0e6a3f3e-5d1c-4f0e-8a77-2c1b9f0d4e21', email: 'clara@owners.example', name: 'Clara Lind', locale: 'en', emailVerified: true, roles: ['owner'], memberships: [] },
};

const van: Vehicle = {
  id: '9c1d6a0e-2b7f-4c3a-8e5d-1f0a9b8c7d61',
  name: 'Work van',
  model: 'Korvan Cargo 4',
  year: 2021,
  fuel: 'diesel',
  factoryHeater: 'coolant_auxiliary',
  climateControl: 'automatic',
  electricalSystemV: 12,
  batteryCapacityAh: 95,
  batteryType: 'agm',
  createdAt: '2026-01-10T10:00:00.000Z',
  updatedAt: '2026-01-10T10:00:00.000Z',
};

const profile: PartnerProfile = {
  partnerId: PARTNER,
  name: 'Glutwerk Mobil',
  city: 'Innsbruck',
  country: 'AT',
  baseLat: 47.2692,
  baseLng: 11.4041,
  mode: 'mobile',
  radiusKm: 80,
  workshopAddress: null,
  timeZone: 'Europe/Vienna',
  weeklyHours: [],
  services: [
    {
      serviceTypeCode: 'seasonal-heater-service',
      name: 'Seasonal heater service',
      summary: 'Before winter: combustion check, glow pin and fuel supply.',
      cautions: ['exhaust-gas', 'fuel-system', 'hot-coolant'],
      currency: 'EUR',
      labourMinor: 12_000,
      partsMinor: 0,
      durationMinutes: 90,
    },
  ],
  equipment: [],
  travelPolicy: { freeWithinKm: 20, ratePerKmMinor: 80, currency: 'EUR', maxDistanceKm: 80 },
  rating: null,
  reviewCount: 0,
  reviews: [],
};

const slots: PartnerSlots = {
  partnerId: PARTNER,
  serviceTypeCode: 'seasonal-heater-service',
  durationMinutes: 90,
  timeZone: 'Europe/Vienna',
  organisation: [
    { start: START, end: '2030-03-05T09:30:00.000Z', localStart: '2030-03-05T09:00', technicianIds: [] },
    { start: LATER, end: '2030-03-05T14:00:00.000Z', localStart: '2030-03-05T13:30', technicianIds: [] },
  ],
  technicians: [],
  truncated: false,
};

/** A business customer from another EU country: no VAT charged, the note says why. */
const reverseQuote: OwnerQuote = {
  currency: 'EUR',
  minorUnits: 2,
  lines: [
    { kind: 'labour', description: 'Seasonal heater service', netMinor: 12_000, vatRateBp: 0, vatMinor: 0, grossMinor: 12_000 },
    { kind: 'parts', description: 'Glow pin and fuel filter', netMinor: 3_500, vatRateBp: 0, vatMinor: 0, grossMinor: 3_500 },
    { kind: 'travel', description: 'Travel, 6 km beyond the free 20 km', netMinor: 480, vatRateBp: 0, vatMinor: 0, grossMinor: 480 },
  ],
  netMinor: 15_980,
  vatMinor: 0,
  grossMinor: 15_980,
  vat: { treatment: 'reverse-charge', country: 'AT', rateBp: 0, validFrom: null, note: 'Reverse charge: VAT to be accounted for by the recipient.' },
  depositMinor: 4_000,
  cancellation: { freeUntilHours: 48, feeMinor: 3_000 },
};

function bookingOf(patch: Partial<Booking> = {}): Booking {
  return {
    id: BOOKING,
    reference: 'EMB-7K2Q',
    status: 'held',
    partner: { id: PARTNER, name: 'Glutwerk Mobil' },
    serviceType: { code: 'seasonal-heater-service', name: 'Seasonal heater service' },
    start: START,
    end: '2030-03-05T09:30:00.000Z',
    timeZone: 'Europe/Vienna',
    technician: null,
    jobAt: 'owner',
    address: { line: 'Museumstraße 12', postalCode: '6020', city: 'Innsbruck', country: 'AT', lat: 47.2655, lng: 11.3931 },
    workshopAddress: null,
    vehicle: { model: 'Korvan Cargo 4' },
    customer: { kind: 'business', name: 'Clara Lind', email: 'clara@owners.example', phone: null, companyName: 'Lind Vans GmbH', vatId: 'DE136695976' },
    notes: null,
    quote: reverseQuote,
    partnerQuote: null,
    payment: { status: 'pending', authorisedMinor: 0, capturedMinor: 0, refundedMinor: 0 },
    holdExpiresAt: '2030-03-01T10:10:00.000Z',
    checkoutUrl: 'http://127.0.0.1:4030/pay/cs_test_1',
    cancellationNow: { allowed: true, feeMinor: 0, refundMinor: 0 },
    history: [],
    createdAt: '2030-03-01T10:00:00.000Z',
    ...patch,
  };
}

const problem = (status: number, code: string, title: string, errors?: { path: string; message: string }[]) => new ApiError({ type: 'about:blank', title, status, code, errors });

const QUERY = { serviceType: 'seasonal-heater-service', start: START, lat: '47.2627', lng: '11.3945' };
let router: Router;
let assign: ReturnType<typeof vi.fn<(url: string | URL) => void>>;

async function mountFlow(query: Record<string, string> = QUERY) {
  router = createAppRouter(createMemoryHistory());
  await router.push({ path: `/book/${PARTNER}`, query });
  await router.isReady();
  const wrapper = mount(Shell, { global: { plugins: [router, i18n] }, attachTo: document.body });
  await flushPromises();
  await vi.waitFor(() => expect(wrapper.find('h1').exists()).toBe(true));
  await flushPromises();
  return wrapper;
}

async function toDetails(wrapper: VueWrapper) {
  await wrapper.find('[data-testid="slot-continue"]').trigger('click');
  await flushPromises();
  expect(wrapper.find('[data-testid="book-details"]').exists()).toBe(true);
}

async function fillAddress(wrapper: VueWrapper) {
  await wrapper.find('#book-address-line').setValue('Museumstraße 12');
  await wrapper.find('#book-address-postalCode').setValue('6020');
  await wrapper.find('#book-address-city').setValue('Innsbruck');
  // the owner moves the pin from the town centre to where the van will stand
  wrapper.findComponent(MapStub).vm.$emit('probe', { lat: 47.2655, lng: 11.3931 });
  await flushPromises();
}

async function chooseBusiness(wrapper: VueWrapper) {
  await wrapper.find('[data-testid="customer-business"]').setValue(true);
  await wrapper.find('#book-company').setValue('Lind Vans GmbH');
  await wrapper.find('#book-vat-id').setValue('DE 136695976');
}

async function submitDetails(wrapper: VueWrapper) {
  await wrapper.find('[data-testid="book-details"]').trigger('submit');
  await flushPromises();
}

async function toPay(wrapper: VueWrapper) {
  await toDetails(wrapper);
  await fillAddress(wrapper);
  await chooseBusiness(wrapper);
  await submitDetails(wrapper);
  await wrapper.find('[data-testid="quote-continue"]').trigger('click');
  await flushPromises();
}

const expectedRequest = (start = START) => ({
  partnerId: PARTNER,
  serviceType: 'seasonal-heater-service',
  start,
  jobAt: 'owner',
  address: { line: 'Museumstraße 12', postalCode: '6020', city: 'Innsbruck', country: 'AT', lat: 47.2655, lng: 11.3931 },
  vehicleId: van.id,
  vehicle: { model: 'Korvan Cargo 4', fuel: 'diesel', factoryHeater: 'coolant_auxiliary', climateControl: 'automatic', electricalSystemV: 12, year: 2021 },
  customer: { kind: 'business', companyName: 'Lind Vans GmbH', vatId: 'DE136695976' },
});

describe('Directory booking flow', () => {
  beforeAll(() => import('@/views/book/index.vue'), 30_000);

  beforeEach(() => {
    document.body.innerHTML = '';
    sessionStorage.clear();
    setActivePinia(createPinia());
    vi.mocked(refreshSession).mockReset().mockResolvedValue(owner);
    vi.mocked(listVehicles).mockReset().mockResolvedValue([van]);
    vi.mocked(getPartnerProfile).mockReset().mockResolvedValue(profile);
    vi.mocked(getPartnerSlots).mockReset().mockResolvedValue(slots);
    vi.mocked(previewQuote).mockReset().mockResolvedValue(reverseQuote);
    vi.mocked(createBooking).mockReset();
    assign = vi.fn<(url: string | URL) => void>();
    vi.spyOn(window.location, 'assign').mockImplementation(assign);
  });
  afterEach(() => vi.restoreAllMocks());

  it('shows the chosen time in the technician’s zone and the owner’s, and leads back to the profile to change it', async () => {
    const wrapper = await mountFlow();
    expect(wrapper.find('h1').text()).toBe('Book Seasonal heater service');
    const slot = wrapper.find('[data-testid="book-slot"]');
    // the weekday's comma depends on the ICU version
    expect(slot.find('[data-testid="slot-local"]').text()).toMatch(/^Tuesday,? 5 March 2030, 09:00–10:30$/);
    expect(slot.text()).toContain('Shown in the technician’s time zone, Europe/Vienna.');
    const own = Intl.DateTimeFormat().resolvedOptions().timeZone;
    if (own !== 'Europe/Vienna') expect(slot.find('[data-testid="slot-own"]').text()).toContain(`(${own.replace(/_/g, ' ')} time)`);
    expect(slot.text()).toContain('Seasonal heater service, about 1 hr 30 mins');
    expect(slot.text()).toContain('At your place');
    const change = slot.find('a');
    expect(change.text()).toBe('Choose another time');
    expect(change.attributes('href')).toBe(`/partners/${PARTNER}?service=seasonal-heater-service&lat=47.2627&lng=11.3945`);
    expect(wrapper.find('[aria-current="step"]').text()).toContain('Time');
  });

  it('sends the garage vehicle, the address with the pin and the business customer, shows the quote, and goes to the checkout page', async () => {
    vi.mocked(createBooking).mockResolvedValue(bookingOf());
    const wrapper = await mountFlow();
    await toDetails(wrapper);

    // the garage's van is chosen, the country is the partner's and the pin starts at the searched place
    expect(wrapper.find<HTMLSelectElement>('#book-vehicle').element.value).toBe(van.id);
    expect(wrapper.find('[data-testid="vehicle-summary"]').text()).toContain('Korvan Cargo 4, 2021');
    expect(wrapper.find<HTMLSelectElement>('#book-address-country').element.value).toBe('AT');
    expect(wrapper.find('[data-testid="area-map"]').attributes('data-probe')).toBe('47.2627,11.3945');
    expect(wrapper.find('[data-testid="area-map"]').attributes('aria-label')).toContain('Map of the area of Glutwerk Mobil');

    await fillAddress(wrapper);
    expect(wrapper.find<HTMLInputElement>('#book-pin-lat').element.value).toBe('47.2655');
    expect(wrapper.find('[data-testid="pin-outside"]').exists()).toBe(false);
    await chooseBusiness(wrapper);
    await submitDetails(wrapper);

    expect(previewQuote).toHaveBeenCalledWith(PARTNER, {
      serviceType: 'seasonal-heater-service',
      jobAt: 'owner',
      lat: 47.2655,
      lng: 11.3931,
      country: 'AT',
      start: START,
      vatId: 'DE136695976',
      model: 'Korvan Cargo 4',
      fuel: 'diesel',
      factoryHeater: 'coolant_auxiliary',
      climateControl: 'automatic',
      electricalSystemV: 12,
      year: 2021,
    });

    // the quote, line by line, with VAT per line, totals, the reverse-charge note, policy and deposit
    const quote = wrapper.find('[data-testid="quote"]');
    const lines = quote.findAll('tbody tr');
    expect(lines.map((l) => l.attributes('data-line'))).toEqual(['labour', 'parts', 'travel']);
    expect(lines[0]!.text()).toContain('Labour');
    expect(lines[0]!.text()).toContain('€120.00');
    expect(lines[1]!.text()).toContain('Glow pin and fuel filter');
    expect(lines[2]!.text()).toContain('€4.80');
    expect(lines[2]!.text()).toContain('0%: €0.00');
    expect(quote.find('[data-testid="quote-vat"]').text()).toContain('VAT, reverse charge (Austria)');
    expect(quote.find('[data-testid="quote-total"]').text()).toBe('€159.80');
    expect(quote.find('[data-testid="reverse-charge"]').text()).toContain('Reverse charge: VAT to be accounted for by the recipient.');
    expect(quote.find('[data-testid="quote-policy"]').text()).toContain('Cancelling is free until 48 hours before the start. After that, cancelling costs €30.00.');
    expect(quote.find('[data-testid="quote-due"]').text()).toContain('When you book, €159.80 is held on your card: reserved, not taken.');
    expect(quote.find('[data-testid="quote-due"]').text()).toContain('Deposit under the technician’s terms: €40.00.');
    // the service's cautions, deferring to the heater maker and local codes
    expect(wrapper.findAll('[data-testid="book-quote"] [data-caution]').map((c) => c.attributes('data-caution'))).toEqual(['exhaust-gas', 'fuel-system', 'hot-coolant']);
    expect(wrapper.find('[data-testid="book-quote"]').text()).toContain('local codes');

    await wrapper.find('[data-testid="quote-continue"]').trigger('click');
    await flushPromises();
    const payStep = wrapper.find('[data-testid="book-pay"]');
    expect(payStep.text()).toContain('we hold this time for you for 10 minutes');
    expect(payStep.find('[data-testid="pay-due"]').text()).toBe('€159.80');

    await payStep.find('[data-testid="pay"]').trigger('click');
    await flushPromises();
    expect(createBooking).toHaveBeenCalledTimes(1);
    expect(vi.mocked(createBooking).mock.calls[0]![0]).toEqual(expectedRequest());
    expect(assign).toHaveBeenCalledWith('http://127.0.0.1:4030/pay/cs_test_1');
    expect(wrapper.find('[data-testid="held"]').text()).toContain('Taking you to the payment page');
  });

  it('shows the server’s field errors beside the address and the pin, keeping everything entered', async () => {
    vi.mocked(createBooking).mockRejectedValue(
      problem(400, 'VALIDATION_FAILED', 'Some fields need attention', [
        { path: 'address.lat', message: 'This place is outside the area Glutwerk Mobil travels to' },
        { path: 'address.postalCode', message: 'Enter the postal code' },
      ]),
    );
    const wrapper = await mountFlow();
    await toPay(wrapper);
    await wrapper.find('[data-testid="pay"]').trigger('click');
    await flushPromises();

    // back on the details step, each message beside its field
    expect(wrapper.find('[data-testid="book-details"]').exists()).toBe(true);
    expect(wrapper.find('[data-testid="pin-error"]').text()).toContain('outside the area Glutwerk Mobil travels to');
    expect(wrapper.find('#book-pin-lat').attributes('aria-invalid')).toBe('true');
    expect(wrapper.find('#book-pin-lat').attributes('aria-describedby')).toContain('book-pin-error');
    expect(wrapper.find('#book-address-postalCode-error').text()).toContain('Enter the postal code');
    expect(wrapper.find('#book-address-postalCode').attributes('aria-invalid')).toBe('true');
    expect(wrapper.find('[data-testid="details-alert"]').exists()).toBe(false);
    // nothing entered is lost
    expect(wrapper.find<HTMLInputElement>('#book-address-line').element.value).toBe('Museumstraße 12');
    expect(wrapper.find<HTMLInputElement>('#book-company').element.value).toBe('Lind Vans GmbH');
    expect(wrapper.find<HTMLInputElement>('#book-vat-id').element.value).toBe('DE 136695976');
    expect(wrapper.find('[data-testid="area-map"]').attributes('data-probe')).toBe('47.2655,11.3931');
    expect(assign).not.toHaveBeenCalled();
  });

  it('warns when the pin is outside the partner’s circle before the server does', async () => {
    const wrapper = await mountFlow();
    await toDetails(wrapper);
    wrapper.findComponent(MapStub).vm.$emit('probe', { lat: 48.3069, lng: 14.2858 });
    await flushPromises();
    const warning = wrapper.find('[data-testid="pin-outside"]');
    expect(warning.text()).toContain('from the base of Glutwerk Mobil in Innsbruck; they travel up to 80 km');
    // typed coordinates move the pin too
    await wrapper.find('#book-pin-lat').setValue('47.27');
    await wrapper.find('#book-pin-lng').setValue('11.40');
    await wrapper.find('#book-pin-lng').trigger('change');
    await flushPromises();
    expect(wrapper.find('[data-testid="area-map"]').attributes('data-probe')).toBe('47.27,11.4');
    expect(wrapper.find('[data-testid="pin-outside"]').exists()).toBe(false);
  });

  it('offers another time when someone else was faster, and books that one', async () => {
    vi.mocked(createBooking)
      .mockRejectedValueOnce(problem(409, 'SLOT_TAKEN', 'This time was just booked by someone else'))
      .mockResolvedValueOnce(bookingOf({ start: LATER }));
    const wrapper = await mountFlow();
    await toPay(wrapper);
    await wrapper.find('[data-testid="pay"]').trigger('click');
    await flushPromises();

    expect(wrapper.find('[data-testid="slot-taken"]').text()).toContain('This time is no longer free');
    expect(wrapper.find('[data-testid="slot-taken"]').text()).toContain('Someone else was faster');
    expect(wrapper.find('[data-testid="slot-taken"]').text()).toContain('Nothing was charged');
    await vi.waitFor(() => expect(getPartnerSlots).toHaveBeenCalled());
    await flushPromises();
    // the free times where the pin is, without the one just taken
    expect(vi.mocked(getPartnerSlots).mock.calls[0]!.slice(0, 2)).toEqual([PARTNER, { serviceType: 'seasonal-heater-service', lat: 47.2655, lng: 11.3931, from: undefined, days: 7 }]);
    const times = wrapper.findAll('[data-testid="pick-slot"]');
    expect(times.map((b) => b.text())).toEqual(['13:30']);

    await times[0]!.trigger('click');
    await flushPromises();
    expect(router.currentRoute.value.query.start).toBe(LATER);
    expect(previewQuote).toHaveBeenCalledTimes(2);
    expect(vi.mocked(previewQuote).mock.calls[1]![1]).toMatchObject({ start: LATER });
    await wrapper.find('[data-testid="quote-continue"]').trigger('click');
    await flushPromises();
    await wrapper.find('[data-testid="pay"]').trigger('click');
    await flushPromises();
    expect(vi.mocked(createBooking).mock.calls[1]![0]).toEqual(expectedRequest(LATER));
    expect(assign).toHaveBeenCalledWith('http://127.0.0.1:4030/pay/cs_test_1');
  });

  it('says plainly when payments are down: nothing booked, try again', async () => {
    vi.mocked(createBooking)
      .mockRejectedValueOnce(problem(503, 'PAYMENTS_UNAVAILABLE', 'Payments are unavailable'))
      .mockResolvedValueOnce(bookingOf());
    const wrapper = await mountFlow();
    await toPay(wrapper);
    await wrapper.find('[data-testid="pay"]').trigger('click');
    await flushPromises();
    const alert = wrapper.find('[data-testid="payments-unavailable"]');
    expect(alert.text()).toContain('Payments are not available right now');
    expect(alert.text()).toContain('Nothing is booked and nothing was charged');
    expect(wrapper.find('[data-testid="pay"]').text()).toBe('Try again');
    await wrapper.find('[data-testid="pay"]').trigger('click');
    await flushPromises();
    expect(createBooking).toHaveBeenCalledTimes(2);
    expect(assign).toHaveBeenCalled();
  });

  it('checks the details with the booking schema before asking for a quote', async () => {
    vi.mocked(listVehicles).mockResolvedValue([]);
    const wrapper = await mountFlow();
    await toDetails(wrapper);
    expect(wrapper.find('[data-testid="book-vehicle"]').text()).toContain('Your garage is empty');
    await submitDetails(wrapper);
    expect(previewQuote).not.toHaveBeenCalled();
    expect(wrapper.find('#book-vehicle-model-error').text()).toBe('Enter the model');
    expect(wrapper.find('#book-address-line-error').text()).toBe('Enter the street and number');
    expect(document.activeElement?.id).toBe('book-vehicle-model');
  });

  it('sends visitors to sign in first and back to the same time afterwards', async () => {
    vi.mocked(refreshSession).mockRejectedValue(problem(401, 'SESSION_EXPIRED', 'Signed out'));
    router = createAppRouter(createMemoryHistory());
    await router.push({ path: `/book/${PARTNER}`, query: QUERY });
    await router.isReady();
    expect(router.currentRoute.value.name).toBe('sign-in');
    expect(router.currentRoute.value.query.redirect).toBe(`/book/${PARTNER}?serviceType=seasonal-heater-service&start=${START}&lat=47.2627&lng=11.3945`);
  });

  it('says when the time in the link has passed', async () => {
    const wrapper = await mountFlow({ ...QUERY, start: '2020-01-07T08:00:00.000Z' });
    expect(wrapper.find('[data-testid="book-blocked"] h1').text()).toBe('This time has passed');
    expect(wrapper.find('[data-testid="book-blocked"] a').text()).toBe('See the free times of Glutwerk Mobil');
  });
});
