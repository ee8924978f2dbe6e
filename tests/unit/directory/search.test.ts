// Map search: the form builds the API query from a garage vehicle or typed details, results show
// itemised totals, a search nobody answers shows the nearest partners and the coverage alert, the
// vehicle rules' block offers a one-click switch, and phones switch between list and map.
import { afterEach, beforeAll, beforeEach, describe, expect, it, vi } from 'vitest';
import { flushPromises, mount } from '@vue/test-utils';
import { createPinia, setActivePinia } from 'pinia';
import { defineComponent, h } from 'vue';
import { createMemoryHistory, RouterView, type Router } from 'vue-router';
import { ApiError } from '@emberline/api-client';
import type { EligibilityResult, Place, SearchResponse, SearchResult, ServiceType, Session, Vehicle } from '@emberline/domain';
import { refreshSession } from '@/api/auth';
import { listCapabilities, listServiceTypes } from '@/api/catalogue';
import { listVehicles } from '@/api/garage';
import { findPlaces, requestCoverageAlert, searchPartners } from '@/api/search';
import { i18n } from '@/locales';
import { createAppRouter } from '@/router';

vi.mock('@/api/auth', () => ({ refreshSession: vi.fn(), signIn: vi.fn(), signOut: vi.fn(), resendVerification: vi.fn() }));
vi.mock('@/api/catalogue', () => ({ listServiceTypes: vi.fn(), listCapabilities: vi.fn() }));
vi.mock('@/api/garage', () => ({ listVehicles: vi.fn(), addVehicle: vi.fn(), updateVehicle: vi.fn(), removeVehicle: vi.fn() }));
vi.mock('@/api/search', () => ({ searchPartners: vi.fn(), findPlaces: vi.fn(), getPartnerProfile: vi.fn(), getPartnerSlots: vi.fn(), requestCoverageAlert: vi.fn() }));
// Leaflet needs a real layout engine; the stub lists the pins it is given and can pick a point.
vi.mock('@/components/maps-lazy', () => {
  const stub = defineComponent({
    props: ['markers', 'activeId', 'place', 'label', 'visible'],
    emits: ['select', 'pick'],
    setup(props, { emit }) {
      return () =>
        h('div', { 'data-testid': 'results-map', role: 'region', 'aria-label': props.label }, [
          ...((props.markers as { id: string; label: string }[] | undefined) ?? []).map((m) =>
            h('button', { type: 'button', 'data-pin': m.id, class: m.id === props.activeId ? 'is-active' : '', onClick: () => emit('select', m.id) }, m.label),
          ),
          h('button', { type: 'button', 'data-testid': 'map-pick', onClick: () => emit('pick', { lat: 47.5, lng: 12.1 }) }, 'pick'),
        ]);
    },
  });
  return { ResultsMap: stub, AreaMap: stub };
});

const Shell = defineComponent({ render: () => h(RouterView) });
/** happy-dom's window size, which its matchMedia answers from. */
const setViewport = (size: { width: number; height: number }) => (window as unknown as { happyDOM: { setViewport(s: { width: number; height: number }): void } }).happyDOM.setViewport(size);
const signedOut = () => new ApiError({ type: 'about:blank', title: 'Signed out', status: 401, code: 'SESSION_EXPIRED' });

const owner: Session = {
  accessToken: 'access-1',
  expiresIn: 900,
  user: { id: '0e6a3f3e-5d1c-4f0e-8a77-2c1b9f0d4e21', email: 'clara@owners.example', name: 'Clara Innerhofer', locale: 'en', emailVerified: true, roles: ['owner'], memberships: [] },
};
const basicVan: Vehicle = {
  id: '9c1d6a0e-2b7f-4c3a-8e5d-1f0a9b8c7d61',
  name: 'Work van',
  model: 'Korvan Cargo 4 Basic',
  year: 2019,
  fuel: 'diesel',
  factoryHeater: 'coolant_auxiliary',
  climateControl: 'manual',
  electricalSystemV: 12,
  batteryCapacityAh: 80,
  batteryType: 'flooded',
  createdAt: '2026-01-10T10:00:00.000Z',
  updatedAt: '2026-01-10T10:00:00.000Z',
};

const service = (code: string, name: string): ServiceType => ({
  code,
  name,
  summary: '',
  description: '',
  defaultDurationMinutes: 90,
  requiredCapabilities: [],
  cautions: ['exhaust-gas'],
  retired: false,
});
const serviceTypes = [
  service('parking-conversion-auto', 'Parking heater conversion (automatic climate control)'),
  service('parking-conversion-manual', 'Parking heater conversion (manual climate control)'),
  service('seasonal-heater-service', 'Seasonal heater service'),
];

const innsbruck: Place = { id: 1, name: 'Innsbruck', country: 'AT', lat: 47.2627, lng: 11.3945, population: 132_000 };
const INNSBRUCK_QUERY = { place: 'Innsbruck, Austria', lat: '47.2627', lng: '11.3945' };

const eligible: EligibilityResult = {
  serviceTypeCode: 'seasonal-heater-service',
  eligible: true,
  requiredCapabilities: ['digital-multimeter'],
  extraMinutes: 0,
  durationMinutes: 90,
  extraParts: [],
  warnings: [],
  unknown: [],
};
const result = (over: Partial<SearchResult>): SearchResult => ({
  partnerId: '5b0f3a52-8f0e-4f3c-9d55-3c2f1b7e9a10',
  name: 'Glutwerk Mobil',
  city: 'Innsbruck',
  baseLat: 47.2692,
  baseLng: 11.4041,
  mode: 'mobile',
  radiusKm: 80,
  jobAt: 'owner',
  distanceKm: 1.24,
  currency: 'EUR',
  labourMinor: 18_000,
  partsMinor: 9_500,
  travelFeeMinor: 0,
  totalMinor: 27_500,
  durationMinutes: 90,
  rating: null,
  reviewCount: 0,
  nextSlot: { start: '2026-12-03T07:00:00.000Z', localStart: '2026-12-03T08:00', timeZone: 'Europe/Vienna' },
  score: 0.81,
  ...over,
});
const response = (data: SearchResult[], meta: Partial<SearchResponse['meta']> = {}): SearchResponse => ({
  data,
  meta: {
    total: data.length,
    serviceType: { code: 'seasonal-heater-service', name: 'Seasonal heater service', cautions: ['exhaust-gas', 'fuel-system'] },
    eligibility: eligible,
    matchedCapabilities: [
      { code: 'digital-multimeter', name: 'Digital multimeter' },
      { code: 'exhaust-gas-analyser', name: 'Exhaust gas analyser' },
    ],
    nearestOutside: [],
    gapRecorded: false,
    ...meta,
  },
});
const workshop = result({
  partnerId: '3e2d1c0b-4a59-4687-9a1b-2c3d4e5f6a7b',
  name: 'Kaltstart Service Bayern',
  city: 'München',
  mode: 'workshop',
  jobAt: 'workshop',
  distanceKm: 108.6,
  labourMinor: 16_000,
  partsMinor: 9_000,
  travelFeeMinor: 0,
  totalMinor: 25_000,
  rating: 4.6,
  reviewCount: 12,
  nextSlot: null,
});

let router: Router;
async function mountSearch(query: Record<string, string> = {}) {
  router = createAppRouter(createMemoryHistory());
  await router.push({ path: '/search', query });
  await router.isReady();
  const wrapper = mount(Shell, { global: { plugins: [router, i18n] }, attachTo: document.body });
  await flushPromises();
  await vi.waitFor(() => expect(wrapper.find('form[aria-label="Search for technicians"]').exists()).toBe(true));
  await flushPromises();
  return wrapper;
}
type Wrapper = Awaited<ReturnType<typeof mountSearch>>;

async function choose(wrapper: Wrapper, selector: string, value: string) {
  await wrapper.find(selector).setValue(value);
  await flushPromises();
}
async function submit(wrapper: Wrapper) {
  await wrapper.find('[data-testid="search-submit"]').trigger('submit');
  await flushPromises();
}
const lastRequest = () => vi.mocked(searchPartners).mock.calls.at(-1)?.[0];

describe('Directory search', () => {
  beforeAll(() => import('@/views/search/index.vue'), 30_000);

  beforeEach(() => {
    document.body.innerHTML = '';
    setActivePinia(createPinia());
    vi.mocked(refreshSession).mockReset().mockRejectedValue(signedOut());
    vi.mocked(listServiceTypes).mockReset().mockResolvedValue(serviceTypes);
    vi.mocked(listCapabilities).mockReset().mockResolvedValue([]);
    vi.mocked(listVehicles).mockReset().mockResolvedValue([basicVan]);
    vi.mocked(findPlaces).mockReset().mockResolvedValue([innsbruck]);
    vi.mocked(searchPartners).mockReset().mockResolvedValue(response([result({})]));
    vi.mocked(requestCoverageAlert).mockReset().mockResolvedValue();
  });

  afterEach(() => {
    setViewport({ width: 1024, height: 768 });
  });

  it('builds the query from a vehicle in the signed-in owner’s garage', async () => {
    vi.mocked(refreshSession).mockResolvedValue(owner);
    const wrapper = await mountSearch(INNSBRUCK_QUERY);
    expect(searchPartners).not.toHaveBeenCalled();
    expect(wrapper.find('[data-testid="search-start"]').text()).toContain('Now choose the service');

    await choose(wrapper, 'select#search-service', 'parking-conversion-manual');
    await wrapper.find('[data-testid="vehicle-toggle"]').trigger('click');
    const picker = wrapper.find('select#search-vehicle');
    expect(picker.findAll('option').map((o) => o.text())).toEqual(['Enter the details myself', 'Work van (Korvan Cargo 4 Basic, 2019)']);
    await choose(wrapper, 'select#search-vehicle', basicVan.id);
    expect(wrapper.find('[data-testid="vehicle-summary"]').text()).toContain('Korvan Cargo 4 Basic, 2019');
    await submit(wrapper);

    expect(router.currentRoute.value.query).toMatchObject({
      ...INNSBRUCK_QUERY,
      service: 'parking-conversion-manual',
      vehicle: basicVan.id,
      model: 'Korvan Cargo 4 Basic',
      factoryHeater: 'coolant_auxiliary',
      climateControl: 'manual',
      electricalSystemV: '12',
      year: '2019',
    });
    expect(lastRequest()).toEqual({
      serviceType: 'parking-conversion-manual',
      lat: 47.2627,
      lng: 11.3945,
      radiusKm: 100,
      mode: 'any',
      sort: 'best',
      model: 'Korvan Cargo 4 Basic',
      fuel: 'diesel',
      factoryHeater: 'coolant_auxiliary',
      climateControl: 'manual',
      electricalSystemV: 12,
      year: 2019,
    });
  });

  it('builds the query from a place picked from the suggestions and typed vehicle details, refusing a bad year first', async () => {
    const wrapper = await mountSearch();
    expect(wrapper.find('select#search-vehicle').exists()).toBe(false);
    const place = wrapper.find('input#search-place');
    expect(place.attributes('role')).toBe('combobox');
    await place.setValue('Inns');
    await vi.waitFor(() => expect(findPlaces).toHaveBeenCalledWith('Inns', 6, expect.anything()));
    await flushPromises();
    expect(place.attributes('aria-expanded')).toBe('true');
    await place.trigger('keydown', { key: 'ArrowDown' });
    expect(place.attributes('aria-activedescendant')).toBe(wrapper.find('[role="option"]').attributes('id'));
    await place.trigger('keydown', { key: 'Enter' });
    expect((place.element as HTMLInputElement).value).toBe('Innsbruck, Austria');

    await choose(wrapper, 'select#search-service', 'seasonal-heater-service');
    await wrapper.find('[data-testid="vehicle-toggle"]').trigger('click');
    await wrapper.find('input#search-model').setValue('Maren Camper 2');
    await choose(wrapper, 'select#search-factoryHeater', 'none');
    await choose(wrapper, 'select#search-electricalSystemV', '24');
    await wrapper.find('input#search-year').setValue('1975');
    await submit(wrapper);

    expect(searchPartners).not.toHaveBeenCalled();
    expect(wrapper.find('#search-year-error').text()).toContain('The year must be between 1980');
    expect(wrapper.find('input#search-year').attributes('aria-invalid')).toBe('true');
    // nothing the owner entered is lost
    expect((wrapper.find('input#search-model').element as HTMLInputElement).value).toBe('Maren Camper 2');
    expect((place.element as HTMLInputElement).value).toBe('Innsbruck, Austria');

    await wrapper.find('input#search-year').setValue('2018');
    await submit(wrapper);
    expect(lastRequest()).toEqual({
      serviceType: 'seasonal-heater-service',
      lat: 47.2627,
      lng: 11.3945,
      radiusKm: 100,
      mode: 'any',
      sort: 'best',
      model: 'Maren Camper 2',
      factoryHeater: 'none',
      electricalSystemV: 24,
      year: 2018,
    });
    expect(router.currentRoute.value.query).not.toHaveProperty('vehicle');
  });

  it('says what is missing and that a typed place is unknown, keeping the text', async () => {
    vi.mocked(findPlaces).mockResolvedValue([]);
    const wrapper = await mountSearch();
    await submit(wrapper);
    expect(wrapper.find('#search-place-error').text()).toContain('Tell us where the van is');
    expect(wrapper.find('#search-service-error').text()).toContain('Choose the service');

    await wrapper.find('input#search-place').setValue('Atlantis');
    await choose(wrapper, 'select#search-service', 'seasonal-heater-service');
    await submit(wrapper);
    expect(wrapper.find('#search-place-error').text()).toContain('We know no place called “Atlantis”');
    expect((wrapper.find('input#search-place').element as HTMLInputElement).value).toBe('Atlantis');
    expect(searchPartners).not.toHaveBeenCalled();
  });

  it('looks up a place name from the header search and searches there', async () => {
    const wrapper = await mountSearch({ place: 'Innsbruck', service: 'seasonal-heater-service' });
    await vi.waitFor(() => expect(router.currentRoute.value.query).toMatchObject({ ...INNSBRUCK_QUERY, service: 'seasonal-heater-service' }));
    await flushPromises();
    expect(findPlaces).toHaveBeenCalledWith('Innsbruck', 5);
    expect(lastRequest()).toMatchObject({ serviceType: 'seasonal-heater-service', lat: 47.2627, lng: 11.3945 });
    expect(wrapper.find('h2#results-heading').text()).toBe('One technician for Seasonal heater service near Innsbruck, Austria');
  });

  it('explains a refused location and keeps the form usable', async () => {
    const getCurrentPosition = vi.fn((_ok: PositionCallback, fail?: PositionErrorCallback | null) =>
      fail?.({ code: 1, message: 'denied', PERMISSION_DENIED: 1, POSITION_UNAVAILABLE: 2, TIMEOUT: 3 } as GeolocationPositionError),
    );
    Object.defineProperty(navigator, 'geolocation', { value: { getCurrentPosition }, configurable: true });
    const wrapper = await mountSearch();
    await wrapper.find('[data-testid="use-my-location"]').trigger('click');
    await flushPromises();
    expect(wrapper.find('[data-testid="location-problem"]').text()).toContain('did not allow us to see your location');
    Object.defineProperty(navigator, 'geolocation', { value: undefined, configurable: true });
  });

  it('searches from the browser’s location, or from a point clicked on the map', async () => {
    const getCurrentPosition = vi.fn((ok: PositionCallback) => ok({ coords: { latitude: 47.26921, longitude: 11.40412 } } as GeolocationPosition));
    Object.defineProperty(navigator, 'geolocation', { value: { getCurrentPosition }, configurable: true });
    const wrapper = await mountSearch({ service: 'seasonal-heater-service' });
    await wrapper.find('[data-testid="use-my-location"]').trigger('click');
    await flushPromises();
    expect(router.currentRoute.value.query).toMatchObject({ place: 'Your location', lat: '47.269', lng: '11.404', service: 'seasonal-heater-service' });
    expect(lastRequest()).toMatchObject({ lat: 47.269, lng: 11.404 });
    Object.defineProperty(navigator, 'geolocation', { value: undefined, configurable: true });

    await wrapper.find('[data-testid="map-pick"]').trigger('click');
    await flushPromises();
    expect(router.currentRoute.value.query).toMatchObject({ place: 'Point on the map (47.5, 12.1)', lat: '47.5', lng: '12.1' });
    expect(lastRequest()).toMatchObject({ lat: 47.5, lng: 12.1 });
  });

  it('shows the server’s field errors beside the fields and keeps the entries', async () => {
    vi.mocked(searchPartners).mockRejectedValue(
      new ApiError({ type: 'about:blank', title: 'Some fields need attention', status: 400, code: 'VALIDATION_FAILED', errors: [{ path: 'query.model', message: 'Use letters, digits and spaces only' }] }),
    );
    const wrapper = await mountSearch({ ...INNSBRUCK_QUERY, service: 'seasonal-heater-service', model: 'Maren Camper 2' });
    expect(wrapper.find('#search-model-error').text()).toBe('Use letters, digits and spaces only');
    expect(wrapper.find('[data-testid="search-invalid"]').text()).toContain('Some search details need attention');
    expect((wrapper.find('input#search-model').element as HTMLInputElement).value).toBe('Maren Camper 2');
    expect((wrapper.find('input#search-place').element as HTMLInputElement).value).toBe('Innsbruck, Austria');
  });

  it('shows each result with labour, parts, travel and the net total, time, rating, next slot and matched equipment', async () => {
    vi.mocked(searchPartners).mockResolvedValue(response([result({}), workshop]));
    const wrapper = await mountSearch({ ...INNSBRUCK_QUERY, service: 'seasonal-heater-service' });
    const cards = wrapper.findAll('article[data-result]');
    expect(cards).toHaveLength(2);
    const [first, second] = cards;
    expect(first!.find('h3').text()).toBe('Glutwerk Mobil');
    expect(first!.text()).toContain('Innsbruck, 1.2 km away');
    expect(first!.text()).toContain('Comes to your place');
    expect(first!.text()).toContain('Labour€180.00');
    expect(first!.text()).toContain('Parts€95.00');
    expect(first!.text()).toContain('TravelNo charge');
    expect(first!.find('[data-testid="result-total"]').text()).toBe('Total€275.00');
    expect(first!.text()).toContain('Net; VAT is added at booking.');
    expect(first!.text()).toContain('Takes about 1 hr 30 mins');
    expect(first!.text()).toContain('No reviews yet');
    expect(first!.find('[data-testid="result-next-slot"]').text()).toMatch(/Next free: Thu 3 Dec(ember)?,? 08:00/);
    expect(first!.findAll('.result__tags li').map((li) => li.text())).toEqual(['Digital multimeter', 'Exhaust gas analyser']);
    expect(first!.find('a.result__name').attributes('href')).toBe(
      `/partners/${result({}).partnerId}?service=seasonal-heater-service&lat=47.2627&lng=11.3945&place=Innsbruck,+Austria`,
    );
    expect(second!.text()).toContain('At their workshop');
    expect(second!.text()).toContain('München, 109 km away');
    expect(second!.text()).toContain('4.6 out of 5 (12 reviews)');
    expect(second!.text()).toContain('No free time in the next two weeks');
    // the safety cautions of the service and the ordering note
    expect(wrapper.find('[data-caution="exhaust-gas"]').exists()).toBe(true);
    expect(wrapper.find('[data-caution="fuel-system"]').exists()).toBe(true);
    expect(wrapper.find('[data-testid="ordering-note"]').text()).toContain('how near the technician is (35%)');
    // pins carry the list's numbers; a pin click highlights its card
    expect(wrapper.findAll('[data-pin]').map((p) => p.text())).toEqual(['1. Glutwerk Mobil, €275.00', '2. Kaltstart Service Bayern, €250.00']);
    await wrapper.find(`[data-pin="${workshop.partnerId}"]`).trigger('click');
    await flushPromises();
    expect(second!.classes()).toContain('result--active');
  });

  it('applies sort and filters through the URL and sends them', async () => {
    vi.mocked(searchPartners).mockResolvedValue(response([result({}), workshop]));
    const wrapper = await mountSearch({ ...INNSBRUCK_QUERY, service: 'seasonal-heater-service' });
    await choose(wrapper, 'select#search-sort', 'price');
    await wrapper.find('input[name="search-mode"][value="mobile"]').setValue(true);
    await flushPromises();
    const price = wrapper.find('input#search-max-price');
    expect(wrapper.find('label[for="search-max-price"]').text()).toBe('Maximum total (EUR)');
    await price.setValue('300');
    await price.trigger('change');
    await flushPromises();
    expect(router.currentRoute.value.query).toMatchObject({ sort: 'price', mode: 'mobile', maxPriceMinor: '30000', currency: 'EUR' });
    expect(lastRequest()).toMatchObject({ sort: 'price', mode: 'mobile', maxPriceMinor: 30_000, currency: 'EUR' });
  });

  it('reads the maximum price to the cent and refuses part of a cent rather than round it', async () => {
    vi.mocked(searchPartners).mockResolvedValue(response([result({}), workshop]));
    const wrapper = await mountSearch({ ...INNSBRUCK_QUERY, service: 'seasonal-heater-service' });
    const price = wrapper.find('input#search-max-price');
    await price.setValue('10.005');
    await price.trigger('change');
    await flushPromises();
    // Math.round(10.005 * 100) is 1001 (10.005 × 100 is 1000.5000000000001): a limit the owner did not type
    expect(router.currentRoute.value.query.maxPriceMinor).toBeUndefined();
    expect(wrapper.text()).toContain('Enter an amount such as 250 or 250.50.');
    await price.setValue('19.99');
    await price.trigger('change');
    await flushPromises();
    expect(router.currentRoute.value.query).toMatchObject({ maxPriceMinor: '1999', currency: 'EUR' });
    expect((wrapper.find('input#search-max-price').element as HTMLInputElement).value).toBe('19.99');
  });

  it('when nobody matches: nearest partners outside, a wider radius and the coverage alert with its errors', async () => {
    vi.mocked(searchPartners).mockResolvedValue(
      response([], {
        nearestOutside: [{ partnerId: result({}).partnerId, name: 'Glutwerk Mobil', city: 'Innsbruck', distanceKm: 186.4, baseLat: 47.2692, baseLng: 11.4041 }],
        gapRecorded: true,
      }),
    );
    vi.mocked(requestCoverageAlert)
      .mockRejectedValueOnce(new ApiError({ type: 'about:blank', title: 'Some fields need attention', status: 400, code: 'VALIDATION_FAILED', errors: [{ path: 'email', message: 'This address cannot receive mail' }] }))
      .mockResolvedValueOnce();
    const wrapper = await mountSearch({ place: 'Linz, Austria', lat: '48.3069', lng: '14.2858', service: 'seasonal-heater-service' });
    const empty = wrapper.find('[data-testid="no-match"]');
    expect(empty.find('h3').text()).toBe('Nobody offers Seasonal heater service at Linz, Austria yet');
    const nearest = empty.find('[data-testid="nearest-outside"] li');
    expect(nearest.text()).toContain('Glutwerk Mobil');
    expect(nearest.text()).toContain('Innsbruck, 186 km away');
    expect(nearest.find('a').attributes('href')).toContain(`/partners/${result({}).partnerId}?service=seasonal-heater-service`);
    expect(wrapper.findAll('[data-pin]').map((p) => p.text())).toEqual(['Glutwerk Mobil, 186 km away, area does not reach your place']);
    expect(empty.text()).toContain('We use this address only to send you this one notice');
    expect(empty.text()).toContain('noted, without your details');

    const email = wrapper.find('input#coverage-email');
    await email.setValue('not-an-address');
    await wrapper.find('[data-testid="coverage-alert"]').trigger('submit');
    await flushPromises();
    expect(requestCoverageAlert).not.toHaveBeenCalled();
    expect(wrapper.find('#coverage-email-error').text()).toContain('Enter a valid e-mail address');

    await email.setValue('clara@owners.example');
    await wrapper.find('[data-testid="coverage-alert"]').trigger('submit');
    await flushPromises();
    expect(wrapper.find('#coverage-email-error').text()).toContain('This address cannot receive mail');
    expect((email.element as HTMLInputElement).value).toBe('clara@owners.example');

    await wrapper.find('[data-testid="coverage-alert"]').trigger('submit');
    await flushPromises();
    expect(requestCoverageAlert).toHaveBeenLastCalledWith({ email: 'clara@owners.example', serviceType: 'seasonal-heater-service', lat: 48.3069, lng: 14.2858 });
    expect(wrapper.find('[data-testid="alert-sent"]').text()).toContain('We will write to clara@owners.example once a technician offers Seasonal heater service at Linz, Austria.');

    await wrapper.find('[data-testid="widen-radius"]').trigger('click');
    await flushPromises();
    expect(router.currentRoute.value.query.radiusKm).toBe('200');
    expect(lastRequest()).toMatchObject({ radiusKm: 200 });
  });

  it('explains a service that does not fit the vehicle and switches to the suggestion in one click', async () => {
    vi.mocked(searchPartners).mockImplementation(async (q) =>
      q.serviceType === 'parking-conversion-auto'
        ? response([], {
            serviceType: { code: 'parking-conversion-auto', name: 'Parking heater conversion (automatic climate control)', cautions: ['stable-power-flashing'] },
            eligibility: {
              ...eligible,
              serviceTypeCode: 'parking-conversion-auto',
              eligible: false,
              warnings: [
                {
                  ruleCode: 'manual-climate-needs-manual-conversion',
                  severity: 'block',
                  message: 'With manual climate control the conversion needs extra wiring and parts and takes about twice as long: choose the conversion for manual climate control.',
                  suggestServiceTypes: ['parking-conversion-manual'],
                },
              ],
            },
          })
        : response([result({ durationMinutes: 195 })], {
            eligibility: {
              ...eligible,
              serviceTypeCode: 'parking-conversion-manual',
              extraMinutes: 15,
              durationMinutes: 195,
              extraParts: [{ description: 'Parts rated for 24 V instead of 12 V', quantity: 1 }],
              warnings: [{ ruleCode: 'twenty-four-volt-parts', severity: 'notice', message: 'A 24 V electrical system needs parts rated for 24 V.', suggestServiceTypes: [] }],
              unknown: ['year'],
            },
          }),
    );
    const wrapper = await mountSearch({ ...INNSBRUCK_QUERY, service: 'parking-conversion-auto', climateControl: 'manual', electricalSystemV: '24' });
    const block = wrapper.find('[data-testid="eligibility-block"]');
    expect(block.find('h3').text()).toBe('Parking heater conversion (automatic climate control) does not fit this vehicle');
    expect(block.text()).toContain('With manual climate control the conversion needs extra wiring');
    expect(wrapper.find('[data-testid="no-match"]').exists()).toBe(false);
    const suggestion = block.find('button[data-suggest="parking-conversion-manual"]');
    expect(suggestion.text()).toBe('Search for Parking heater conversion (manual climate control) instead');

    await suggestion.trigger('click');
    await flushPromises();
    expect(router.currentRoute.value.query).toMatchObject({ service: 'parking-conversion-manual', climateControl: 'manual', electricalSystemV: '24' });
    expect(lastRequest()).toMatchObject({ serviceType: 'parking-conversion-manual', climateControl: 'manual', electricalSystemV: 24 });
    expect((wrapper.find('select#search-service').element as HTMLSelectElement).value).toBe('parking-conversion-manual');
    const notice = wrapper.find('[data-testid="eligibility-notice"]');
    expect(notice.text()).toContain('This adds about 15 mins; the job takes about 3 hrs 15 mins in all.');
    expect(notice.text()).toContain('1 × Parts rated for 24 V instead of 12 V');
    // a missing detail: the prompt opens the vehicle fields at it
    const unknown = wrapper.find('[data-testid="eligibility-unknown"]');
    expect(unknown.text()).toContain('can depend on its year of manufacture');
    await unknown.find('button').trigger('click');
    await flushPromises();
    expect(document.activeElement?.id).toBe('search-year');
  });

  it('on a phone shows the list or the map, one at a time', async () => {
    setViewport({ width: 390, height: 844 });
    vi.mocked(searchPartners).mockResolvedValue(response([result({}), workshop]));
    const wrapper = await mountSearch({ ...INNSBRUCK_QUERY, service: 'seasonal-heater-service' });
    const list = wrapper.find('[data-testid="results-list"]');
    const map = wrapper.find('[data-testid="results-map"]').element.parentElement!;
    const listButton = wrapper.find('button[data-view="list"]');
    const mapButton = wrapper.find('button[data-view="map"]');
    expect(listButton.attributes('aria-pressed')).toBe('true');
    expect(list.isVisible()).toBe(true);
    expect(map.style.display).toBe('none');

    await mapButton.trigger('click');
    expect(mapButton.attributes('aria-pressed')).toBe('true');
    expect(list.isVisible()).toBe(false);
    expect(map.style.display).toBe('');
    // a pin on the phone's map shows that result under the map
    await wrapper.find(`[data-pin="${workshop.partnerId}"]`).trigger('click');
    await flushPromises();
    expect(wrapper.find('[data-testid="map-preview"]').text()).toContain('Kaltstart Service Bayern');

    // "Show on map" from the list switches views
    await listButton.trigger('click');
    await wrapper.findAll('article[data-result] .result__map')[0]!.trigger('click');
    expect(mapButton.attributes('aria-pressed')).toBe('true');
  });

  it('shows a failed search with a retry', async () => {
    vi.mocked(searchPartners)
      .mockRejectedValueOnce(new ApiError({ type: 'about:blank', title: 'Internal', status: 500, code: 'INTERNAL' }))
      .mockResolvedValueOnce(response([result({})]));
    const wrapper = await mountSearch({ ...INNSBRUCK_QUERY, service: 'seasonal-heater-service' });
    const alert = wrapper.find('[data-testid="results-list"] [data-state="error"]');
    expect(alert.text()).toContain('This could not be loaded');
    await alert.find('button').trigger('click');
    await flushPromises();
    expect(wrapper.findAll('article[data-result]')).toHaveLength(1);
  });
});
