// Service area and travel: the travel-fee preview follows the domain rule (worked example), the
// radius follows the map's handle and the slider, the area before approval links to the
// application, and the customer preview lists slots by day or the server's refusal.
import { beforeEach, describe, expect, it, vi } from 'vitest';
import { DOMWrapper, flushPromises, mount } from '@vue/test-utils';
import { createPinia, setActivePinia } from 'pinia';
import { createMemoryHistory } from 'vue-router';
import { defineComponent, h } from 'vue';
import { MEAN_EARTH_RADIUS_M, greatCircleDistanceM, type MemberRole, type OrganisationStatus, type PartnerSlots } from '@emberline/domain';
import { refreshSession } from '@/api/auth';
import { getPartnerSlots, getServiceArea, getTravelPolicy, listOffers, saveServiceArea, saveTravelPolicy } from '@/api/offers';
import { i18n } from '@/locales';
import { createAppRouter } from '@/router';
import AreaPage from '@/views/service-area/index.vue';
import TravelFeePreview from '@/views/service-area/travel-fee-preview.vue';
import { ORG_A, me, member, problem, session } from './fixtures';
import { TECH_ID, area, kitOffer, policy } from './offer-fixtures';

vi.mock('@/api/auth', () => ({ refreshSession: vi.fn(), signIn: vi.fn(), signOut: vi.fn() }));
vi.mock('@/api/offers', () => ({
  getServiceArea: vi.fn(),
  saveServiceArea: vi.fn(),
  getTravelPolicy: vi.fn(),
  saveTravelPolicy: vi.fn(),
  listOffers: vi.fn(),
  getPartnerSlots: vi.fn(),
}));
// Leaflet needs a real layout engine: the stub shows the radius it draws and stands in for the
// handle (a drag to 120 km) and a click on the map (a customer's place).
vi.mock('@emberline/ui/area-map', () => ({
  __esModule: true,
  default: defineComponent({
    props: ['lat', 'lng', 'radiusKm', 'editable', 'label', 'tileUrl', 'tileAttribution', 'height', 'radiusEditable', 'radiusMin', 'radiusMax', 'clickAction', 'probe'],
    emits: ['pick', 'radius', 'probe'],
    setup(props, { emit }) {
      return () =>
        h('div', { 'data-testid': 'map-stub', 'data-radius': String(props.radiusKm), 'data-handle': String(props.radiusEditable) }, [
          h('button', { type: 'button', 'data-testid': 'map-handle', onClick: () => emit('radius', 120) }, 'handle'),
          h('button', { type: 'button', 'data-testid': 'map-click', onClick: () => emit('probe', { lat: NORTH_40_KM.lat, lng: NORTH_40_KM.lng }) }, 'click'),
        ]);
    },
  }),
}));

const BASE = { lat: 47.2692, lng: 11.4041 };
/** 40 km due north of the base on the domain's sphere: 40 / R radians of latitude. */
const NORTH_40_KM = { lat: BASE.lat + (40_000 / MEAN_EARTH_RADIUS_M) * (180 / Math.PI), lng: BASE.lng };
const feePolicy = { freeWithinKm: 20, ratePerKmMinor: 80, maxDistanceKm: 150, currency: 'EUR' as const };

// these mount whole pages with ant-design-vue; a busy machine needs more than the default 5 s
describe('Travel fee preview', { timeout: 30_000 }, () => {
  const mountPreview = (props: Record<string, unknown>) =>
    mount(TravelFeePreview, { props: { base: BASE, point: NORTH_40_KM, radiusKm: 80, mode: 'mobile', policy: feePolicy, ...props }, global: { plugins: [i18n] } });

  it('charges a place 40 km away by the domain rule: 52 road km, 32 charged × 80 cents = 25.60', () => {
    expect(greatCircleDistanceM(BASE, NORTH_40_KM) / 1000).toBeCloseTo(40, 9);
    // worked example, by hand: 40 km × road factor 1.3 = 52 road km; 52 − 20 free = 32 km; 32 × 80 = 2,560 cents
    const wrapper = mountPreview({});
    expect(wrapper.attributes('data-outcome')).toBe('fee');
    expect(wrapper.find('[data-testid="fee-straight"]').text()).toBe('40 km');
    expect(wrapper.find('[data-testid="fee-road"]').text()).toBe('52 km');
    expect(wrapper.text()).toContain('32 km');
    expect(wrapper.find('[data-testid="fee-amount"]').text()).toBe('€25.60');
    expect(wrapper.find('[data-testid="fee-rule"]').text()).toBe(
      'The road distance is the straight line × 1.3, rounded up to whole km; the first 20 km are free and each further km costs €0.80, up to 150 km by road.',
    );
  });

  it('says when the place is outside the service area or beyond the longest drive', () => {
    expect(mountPreview({ radiusKm: 30 }).find('[data-testid="fee-amount"]').text()).toBe('Outside the service area');
    const far = mountPreview({ policy: { ...feePolicy, maxDistanceKm: 50 } });
    expect(far.attributes('data-outcome')).toBe('out-of-reach');
    expect(far.find('[data-testid="fee-amount"]').text()).toBe('Out of reach');
    expect(far.text()).toContain('longer than your longest drive of 50 km');
    expect(mountPreview({ mode: 'workshop' }).text()).toContain('Workshop only');
  });
});

function slots(): PartnerSlots {
  const slot = (start: string, localStart: string) => ({ start, end: start, localStart, technicianIds: [TECH_ID] });
  return {
    partnerId: ORG_A,
    serviceTypeCode: 'remote-kit-fitting',
    durationMinutes: 90,
    timeZone: 'Europe/Vienna',
    organisation: [
      slot('2026-03-30T06:00:00.000Z', '2026-03-30T08:00+02:00'),
      slot('2026-03-30T06:15:00.000Z', '2026-03-30T08:15+02:00'),
      slot('2026-03-31T13:30:00.000Z', '2026-03-31T15:30+02:00'),
    ],
    technicians: [{ technicianId: TECH_ID, timeZone: 'Europe/Vienna', slots: [] }],
    truncated: false,
  };
}

async function mountPage(role: MemberRole = 'partner_admin', status: OrganisationStatus = 'approved') {
  vi.mocked(refreshSession).mockResolvedValue(session(me({ memberships: [{ ...member(role), organisationStatus: status }] })));
  const router = createAppRouter(createMemoryHistory());
  await router.push('/area');
  await router.isReady();
  const wrapper = mount(AreaPage, { global: { plugins: [router, i18n] }, attachTo: document.body });
  await flushPromises();
  // the map loads as an async component
  await new Promise((r) => setTimeout(r, 150));
  await flushPromises();
  return wrapper;
}

describe('Service area page', { timeout: 30_000 }, () => {
  beforeEach(() => {
    localStorage.clear();
    document.body.innerHTML = '';
    setActivePinia(createPinia());
    vi.clearAllMocks();
    vi.mocked(getServiceArea).mockResolvedValue(area);
    vi.mocked(getTravelPolicy).mockResolvedValue(policy);
    vi.mocked(listOffers).mockResolvedValue([kitOffer]);
  });

  it('moves the radius with the handle on the map and the slider, and saves it', async () => {
    vi.mocked(saveServiceArea).mockImplementation(async (_org, body) => ({ organisationId: ORG_A, area: { ...area.area!, radiusKm: body.radiusKm ?? null } }));
    const wrapper = await mountPage();
    const map = () => wrapper.find('[data-testid="map-stub"]');
    expect(map().attributes('data-radius')).toBe('80');
    expect(map().attributes('data-handle')).toBe('true');
    await wrapper.find('[data-testid="map-handle"]').trigger('click');
    expect(wrapper.find<HTMLInputElement>('[data-testid="radius-slider"]').element.value).toBe('120');
    expect(wrapper.find<HTMLInputElement>('#area_radiusKm').element.value).toBe('120');
    await wrapper.find('[data-testid="radius-slider"]').setValue('95');
    expect(map().attributes('data-radius')).toBe('95');
    await wrapper.find('[data-testid="area-form"]').trigger('submit');
    await flushPromises();
    expect(saveServiceArea).toHaveBeenCalledWith(ORG_A, { baseLabel: 'Innsbruck', baseLat: 47.2692, baseLng: 11.4041, mode: 'mobile', radiusKm: 95, workshopAddress: null });
  });

  it('previews the fee for a clicked place with the policy as it is typed', async () => {
    const wrapper = await mountPage();
    expect(wrapper.find('[data-testid="fee-preview"]').attributes('data-outcome')).toBe('no-point');
    await wrapper.find('[data-testid="map-click"]').trigger('click');
    expect(wrapper.find('[data-testid="fee-amount"]').text()).toBe('€25.60');
    // 1.00 per km from now on: 32 km × 100 cents
    const rate = wrapper.find('#policy_ratePerKm');
    await rate.setValue('1');
    await rate.trigger('blur');
    expect(wrapper.find('[data-testid="fee-amount"]').text()).toBe('€32.00');
  });

  it('saves the travel policy with the rate in minor units', async () => {
    vi.mocked(saveTravelPolicy).mockResolvedValue({ ...policy, ratePerKmMinor: 95 });
    const wrapper = await mountPage();
    const rate = wrapper.find('#policy_ratePerKm');
    await rate.setValue('0.95');
    await rate.trigger('blur');
    await wrapper.find('[data-testid="policy-form"]').trigger('submit');
    await flushPromises();
    expect(saveTravelPolicy).toHaveBeenCalledWith(ORG_A, { freeWithinKm: 20, ratePerKmMinor: 95, currency: 'EUR', maxDistanceKm: 150 });
  });

  it('links to the application instead of editing the area before approval', async () => {
    const wrapper = await mountPage('partner_admin', 'draft');
    const note = wrapper.find('[data-testid="area-in-application"]');
    expect(note.text()).toContain('Your service area is part of your application');
    expect(note.find('a').attributes('href')).toBe('/application?step=area');
    expect(wrapper.find('[data-testid="area-form"]').exists()).toBe(false);
    expect(wrapper.find('[data-testid="preview-unavailable"]').exists()).toBe(true);
  });

  it('switches to the note when the server answers AREA_IN_APPLICATION', async () => {
    vi.mocked(saveServiceArea).mockRejectedValue(problem(409, 'AREA_IN_APPLICATION', 'Until your organisation is approved, change the service area in your application.'));
    const wrapper = await mountPage();
    await wrapper.find('[data-testid="area-form"]').trigger('submit');
    await flushPromises();
    expect(wrapper.find('[data-testid="area-in-application"]').exists()).toBe(true);
  });

  it('lists the next bookable times by day in the technicians\' time, with the fee for the place', async () => {
    vi.mocked(getPartnerSlots).mockResolvedValue(slots());
    const wrapper = await mountPage();
    expect(wrapper.find('[data-testid="preview-place"]').text()).toContain('At your base (Innsbruck)');
    await wrapper.find('[data-testid="show-slots"]').trigger('click');
    await flushPromises();
    expect(getPartnerSlots).toHaveBeenCalledWith(ORG_A, { serviceType: 'remote-kit-fitting', lat: 47.2692, lng: 11.4041, days: 7 }, expect.anything());
    const days = wrapper.findAll('[data-testid="preview-slots"] section');
    expect(days.map((d) => d.find('h4').text())).toEqual(['Monday 30 March', 'Tuesday 31 March']);
    expect(days[0]!.findAll('li').map((li) => li.text())).toEqual(['08:00', '08:15']);
    expect(days[1]!.text()).toContain('15:30');
    expect(wrapper.text()).toContain('Times in Europe/Vienna');
    // a click on the map moves the customer and searches again
    await wrapper.find('[data-testid="map-click"]').trigger('click');
    await flushPromises();
    expect(getPartnerSlots).toHaveBeenLastCalledWith(ORG_A, expect.objectContaining({ lat: NORTH_40_KM.lat, lng: NORTH_40_KM.lng }), expect.anything());
    expect(wrapper.find('#customer-preview [data-testid="fee-amount"]').text()).toBe('€25.60');
  });

  it('shows the server\'s refusal plainly when the place is outside the area', async () => {
    const message = 'This place is outside the partner\'s service area (80 km around its base)';
    vi.mocked(getPartnerSlots).mockRejectedValue(
      problem(400, 'VALIDATION_FAILED', 'Please correct the highlighted fields.', [
        { path: 'query.lat', message },
        { path: 'query.lng', message },
      ]),
    );
    const wrapper = await mountPage();
    await wrapper.find('[data-testid="show-slots"]').trigger('click');
    await flushPromises();
    const refused = wrapper.find('[data-testid="preview-refused"]');
    expect(refused.findAll('li').map((li) => li.text())).toEqual([message]);
  });

  it('lets a technician look without changing anything', async () => {
    const wrapper = await mountPage('technician');
    expect(wrapper.find('[data-testid="save-area"]').exists()).toBe(false);
    expect(wrapper.find('[data-testid="save-policy"]').exists()).toBe(false);
    expect(wrapper.find('[data-testid="map-stub"]').attributes('data-handle')).toBe('false');
    expect(new DOMWrapper(document.body).find<HTMLInputElement>('[data-testid="radius-slider"]').element.disabled).toBe(true);
  });
});
