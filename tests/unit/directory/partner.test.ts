// Partner profile: services with prices, equipment, hours, reviews' empty state and cautions; the
// next free times for the chosen service at the owner's place (at the workshop when the place is
// outside the travel area), a plain "outside the area" or "no place" with a way to pick one, and
// "Book" leading to the booking flow.
import { beforeAll, beforeEach, describe, expect, it, vi } from 'vitest';
import { flushPromises, mount } from '@vue/test-utils';
import { createPinia, setActivePinia } from 'pinia';
import { defineComponent, h } from 'vue';
import { createMemoryHistory, RouterView, type Router } from 'vue-router';
import { ApiError } from '@emberline/api-client';
import { greatCircleDistanceM, type PartnerProfile, type PartnerSlots, type Place } from '@emberline/domain';
import { formatNumber } from '@emberline/ui';
import { refreshSession } from '@/api/auth';
import { findPlaces, getPartnerProfile, getPartnerSlots } from '@/api/search';
import { i18n } from '@/locales';
import { createAppRouter } from '@/router';

vi.mock('@/api/auth', () => ({ refreshSession: vi.fn(), signIn: vi.fn(), signOut: vi.fn(), resendVerification: vi.fn() }));
vi.mock('@/api/search', () => ({ searchPartners: vi.fn(), findPlaces: vi.fn(), getPartnerProfile: vi.fn(), getPartnerSlots: vi.fn(), requestCoverageAlert: vi.fn() }));
vi.mock('@/components/maps-lazy', () => {
  const stub = defineComponent({ props: ['label', 'probe', 'radiusKm'], setup: (props) => () => h('div', { 'data-testid': 'area-map', 'aria-label': props.label }) });
  return { ResultsMap: stub, AreaMap: stub };
});

const Shell = defineComponent({ render: () => h(RouterView) });
const PARTNER = '5b0f3a52-8f0e-4f3c-9d55-3c2f1b7e9a10';

const mobile: PartnerProfile = {
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
  weeklyHours: [
    { weekday: 1, intervals: [{ start: '08:00', end: '12:00' }, { start: '13:00', end: '17:00' }] },
    { weekday: 2, intervals: [{ start: '08:00', end: '17:00' }] },
  ],
  services: [
    {
      serviceTypeCode: 'seasonal-heater-service',
      name: 'Seasonal heater service',
      summary: 'Before winter: combustion check, glow pin and fuel supply.',
      cautions: ['exhaust-gas', 'fuel-system', 'hot-coolant'],
      currency: 'EUR',
      labourMinor: 14_000,
      partsMinor: 3_500,
      durationMinutes: 90,
    },
    {
      serviceTypeCode: 'handset-pairing',
      name: 'Handset pairing and range check',
      summary: 'Pair new handsets.',
      cautions: ['exhaust-gas'],
      currency: 'EUR',
      labourMinor: 4_500,
      partsMinor: 0,
      durationMinutes: 30,
    },
  ],
  equipment: [
    { code: 'digital-multimeter', name: 'Digital multimeter', category: 'measurement' },
    { code: 'uds-flash-programming', name: 'UDS flashing interface', category: 'diagnostics' },
  ],
  travelPolicy: { freeWithinKm: 20, ratePerKmMinor: 80, currency: 'EUR', maxDistanceKm: 80 },
  rating: null,
  reviewCount: 0,
  reviews: [],
};
const workshopOnly: PartnerProfile = { ...mobile, name: 'Kaltstart Service Bayern', city: 'München', country: 'DE', baseLat: 48.1351, baseLng: 11.582, mode: 'workshop', radiusKm: 40, workshopAddress: 'Landsberger Straße 302, 80687 München' };

const slots: PartnerSlots = {
  partnerId: PARTNER,
  serviceTypeCode: 'seasonal-heater-service',
  durationMinutes: 90,
  timeZone: 'Europe/Vienna',
  organisation: [
    { start: '2026-12-03T07:00:00.000Z', end: '2026-12-03T08:30:00.000Z', localStart: '2026-12-03T08:00', technicianIds: [] },
    { start: '2026-12-03T09:30:00.000Z', end: '2026-12-03T11:00:00.000Z', localStart: '2026-12-03T10:30', technicianIds: [] },
    { start: '2026-12-04T07:00:00.000Z', end: '2026-12-04T08:30:00.000Z', localStart: '2026-12-04T08:00', technicianIds: [] },
  ],
  technicians: [],
  truncated: false,
};
const INNSBRUCK = { place: 'Innsbruck, Austria', lat: '47.2627', lng: '11.3945' };
const LINZ = { place: 'Linz, Austria', lat: '48.3069', lng: '14.2858' };

let router: Router;
async function mountAt(path: string, query: Record<string, string> = {}, ready = 'h1') {
  router = createAppRouter(createMemoryHistory());
  await router.push({ path, query });
  await router.isReady();
  const wrapper = mount(Shell, { global: { plugins: [router, i18n] }, attachTo: document.body });
  await flushPromises();
  await vi.waitFor(() => expect(wrapper.find(ready).exists()).toBe(true));
  await flushPromises();
  return wrapper;
}

describe('Directory partner profile', () => {
  beforeAll(async () => {
    await import('@/views/partner/index.vue');
  }, 30_000);

  beforeEach(() => {
    document.body.innerHTML = '';
    setActivePinia(createPinia());
    vi.mocked(refreshSession).mockReset().mockRejectedValue(new ApiError({ type: 'about:blank', title: 'Signed out', status: 401, code: 'SESSION_EXPIRED' }));
    vi.mocked(getPartnerProfile).mockReset().mockResolvedValue(mobile);
    vi.mocked(getPartnerSlots).mockReset().mockResolvedValue(slots);
    vi.mocked(findPlaces).mockReset();
  });

  it('shows services with labour and parts, equipment, weekly hours, no reviews yet, and cautions per service', async () => {
    const wrapper = await mountAt(`/partners/${PARTNER}`, { service: 'seasonal-heater-service', ...INNSBRUCK });
    expect(getPartnerProfile).toHaveBeenCalledWith(PARTNER, expect.anything());
    expect(wrapper.find('h1').text()).toBe('Glutwerk Mobil');
    expect(wrapper.text()).toContain('Comes to you within 80 km of Innsbruck');
    expect(wrapper.find('[data-testid="partner-rating"]').text()).toBe('No reviews yet');

    const seasonal = wrapper.find('[data-service="seasonal-heater-service"]');
    expect(seasonal.text()).toContain('Your search');
    expect(seasonal.text()).toContain('Labour€140.00');
    expect(seasonal.text()).toContain('Parts€35.00');
    expect(seasonal.text()).toContain('Labour and parts€175.00');
    expect(seasonal.text()).toContain('Takes about 1 hr 30 mins');
    expect(seasonal.findAll('[data-caution]').map((c) => c.attributes('data-caution'))).toEqual(['exhaust-gas', 'fuel-system', 'hot-coolant']);
    expect(wrapper.text()).toContain('Free within 20 km, then €0.80 per km, up to 80 km.');
    expect(wrapper.text()).toContain('Measurement');
    expect(wrapper.text()).toContain('UDS flashing interface');
    const hours = wrapper.findAll('.partner__hours tbody tr').map((r) => r.text());
    expect(hours[0]).toBe('Monday08:00–12:00, 13:00–17:00');
    expect(hours[6]).toBe('SundayClosed');
    expect(wrapper.text()).toContain('Times are Europe/Vienna time.');
    expect(wrapper.find('[aria-labelledby="reviews-title"] [data-state="empty"]').text()).toContain('No reviews yet');
    expect(wrapper.find('[data-testid="area-map"]').attributes('aria-label')).toBe('Map of the area of Glutwerk Mobil');
  });

  it('lists the next free times at the owner’s place by day, each with a Book link to the placeholder', async () => {
    const wrapper = await mountAt(`/partners/${PARTNER}`, { service: 'seasonal-heater-service', ...INNSBRUCK });
    await vi.waitFor(() => expect(getPartnerSlots).toHaveBeenCalled());
    await flushPromises();
    expect(getPartnerSlots).toHaveBeenCalledWith(PARTNER, { serviceType: 'seasonal-heater-service', lat: 47.2627, lng: 11.3945, from: undefined, days: 7 }, expect.anything());
    const panel = wrapper.find('[data-testid="partner-slots"]');
    expect(panel.find('[data-testid="slots-at"]').text()).toContain('The technician comes to Innsbruck, Austria.');
    expect(panel.findAll('.slots__day h3').map((d) => d.text())).toEqual(['Thursday 3 December', 'Friday 4 December']);
    const book = panel.findAll('[data-testid="book-slot"]');
    expect(book.map((b) => b.text())).toEqual(['Book 08:00', 'Book 10:30', 'Book 08:00']);
    expect(book[0]!.attributes('aria-label')).toBe('Book 08:00 on Thursday 3 December for Seasonal heater service');
    // "Book" opens the booking flow for that time (issue #7), with the owner's place when the technician comes to it
    expect(book[0]!.attributes('href')).toBe(`/book/${PARTNER}?serviceType=seasonal-heater-service&start=2026-12-03T07:00:00.000Z&lat=47.2627&lng=11.3945&place=Innsbruck,+Austria`);
    expect(panel.findAll('[data-caution]')).toHaveLength(3);

    // later times continue right after the last one shown
    await panel.find('[data-testid="later-slots"]').trigger('click');
    await flushPromises();
    expect(vi.mocked(getPartnerSlots).mock.calls.at(-1)![1]).toMatchObject({ from: '2026-12-04T07:01:00.000Z', days: 7 });

  });

  it('says when the place is outside a mobile partner’s area and lets the owner pick another', async () => {
    const innsbruck: Place = { id: 1, name: 'Innsbruck', country: 'AT', lat: 47.2627, lng: 11.3945, population: 132_000 };
    vi.mocked(findPlaces).mockResolvedValue([innsbruck]);
    const wrapper = await mountAt(`/partners/${PARTNER}`, { service: 'seasonal-heater-service', ...LINZ });
    const where = wrapper.find('[data-testid="slots-where"]');
    expect(where.find('h3').text()).toBe('This place is outside their area');
    const km = formatNumber(greatCircleDistanceM({ lat: mobile.baseLat, lng: mobile.baseLng }, { lat: 48.3069, lng: 14.2858 }) / 1000, 'en', { maximumFractionDigits: 0 });
    expect(where.text()).toContain(`Glutwerk Mobil comes to places within 80 km of Innsbruck; Linz, Austria is ${km} km away.`);
    expect(where.find('a').attributes('href')).toContain('/search?service=seasonal-heater-service&place=Linz');
    expect(getPartnerSlots).not.toHaveBeenCalled();

    // picking nothing says so; picking a place from the list loads its free times
    await where.find('form').trigger('submit');
    expect(wrapper.find('#slots-place-error').text()).toContain('Tell us where the van is');
    const input = wrapper.find('input#slots-place');
    await input.setValue('Inns');
    await vi.waitFor(() => expect(findPlaces).toHaveBeenCalled());
    await flushPromises();
    await input.trigger('keydown', { key: 'ArrowDown' });
    await input.trigger('keydown', { key: 'Enter' });
    await wrapper.find('[data-testid="slots-where"] form').trigger('submit');
    await vi.waitFor(() => expect(router.currentRoute.value.query).toMatchObject({ place: 'Innsbruck, Austria', lat: '47.2627', lng: '11.3945' }));
    await vi.waitFor(() => expect(getPartnerSlots).toHaveBeenCalled());
  });

  it('asks for a place when none is given', async () => {
    const wrapper = await mountAt(`/partners/${PARTNER}`, { service: 'seasonal-heater-service' });
    expect(wrapper.find('[data-testid="slots-where"] h3').text()).toBe('Where should the job happen?');
    expect(getPartnerSlots).not.toHaveBeenCalled();
  });

  it('shows a workshop’s free times at the workshop, whatever the owner’s place', async () => {
    vi.mocked(getPartnerProfile).mockResolvedValue(workshopOnly);
    const wrapper = await mountAt(`/partners/${PARTNER}`, { service: 'seasonal-heater-service', ...INNSBRUCK });
    await vi.waitFor(() => expect(getPartnerSlots).toHaveBeenCalled());
    expect(vi.mocked(getPartnerSlots).mock.calls[0]![1]).toMatchObject({ lat: 48.1351, lng: 11.582 });
    expect(wrapper.find('[data-testid="slots-at"]').text()).toContain('At the workshop in München.');
    expect(wrapper.text()).toContain('Workshop: Landsberger Straße 302, 80687 München');
  });

  it('switches the service from the list and shows a failed profile with a retry', async () => {
    vi.mocked(getPartnerProfile).mockRejectedValueOnce(new ApiError({ type: 'about:blank', title: 'Internal', status: 500, code: 'INTERNAL' })).mockResolvedValueOnce(mobile);
    const wrapper = await mountAt(`/partners/${PARTNER}`, { ...INNSBRUCK }, '[data-state="error"]');
    await wrapper.find('[data-state="error"] button').trigger('click');
    await flushPromises();
    expect(wrapper.find('h1').text()).toBe('Glutwerk Mobil');
    expect(wrapper.find('[data-testid="partner-slots"]').text()).toContain('Choose a service to see free times.');
    await wrapper.find('[data-service="handset-pairing"] .partner__choose').trigger('click');
    await vi.waitFor(() => expect(router.currentRoute.value.query.service).toBe('handset-pairing'));
    await vi.waitFor(() => expect(getPartnerSlots).toHaveBeenCalledWith(PARTNER, expect.objectContaining({ serviceType: 'handset-pairing' }), expect.anything()));
  });
});
