// Directory home: the service catalogue from the API in its loading, data, empty and error states.
import { beforeAll, beforeEach, describe, expect, it, vi } from 'vitest';
import { flushPromises, mount } from '@vue/test-utils';
import { createPinia, setActivePinia } from 'pinia';
import { createMemoryHistory } from 'vue-router';
import { ApiError } from '@emberline/api-client';
import type { Capability, ServiceType } from '@emberline/domain';
import { listCapabilities, listServiceTypes } from '@/api/catalogue';
import { i18n } from '@/locales';
import { createAppRouter } from '@/router';
import App from '@/app.vue';
import Home from '@/views/home/index.vue';

vi.mock('@/api/catalogue', () => ({ listServiceTypes: vi.fn(), listCapabilities: vi.fn() }));
// Nobody is signed in: the guard's restore gets a 401.
vi.mock('@/api/auth', () => ({
  refreshSession: vi.fn(() => Promise.reject(new ApiError({ type: 'about:blank', title: 'Signed out', status: 401, code: 'SESSION_EXPIRED' }))),
}));

const capabilities: Capability[] = [
  { code: 'uds-flash-programming', name: 'UDS flashing interface', description: '', category: 'diagnostics', standards: ['ISO 14229'], retired: false },
  { code: 'battery-support-unit', name: 'Battery support unit', description: '', category: 'electrical', standards: [], retired: false },
];
const serviceTypes: ServiceType[] = [
  {
    code: 'parking-conversion',
    name: 'Parking heater conversion',
    summary: 'Turn the auxiliary coolant heater into a parking heater.',
    description: '',
    defaultDurationMinutes: 90,
    requiredCapabilities: ['uds-flash-programming', 'battery-support-unit'],
    cautions: ['stable-power-flashing', 'exhaust-gas'],
    retired: false,
  },
  {
    code: 'handset-pairing',
    name: 'Handset pairing',
    summary: 'Pair new handsets with the receiver.',
    description: '',
    defaultDurationMinutes: 15,
    requiredCapabilities: [],
    cautions: [],
    retired: false,
  },
  {
    code: 'old-service',
    name: 'Withdrawn service',
    summary: 'No longer offered.',
    description: '',
    defaultDurationMinutes: 30,
    requiredCapabilities: [],
    cautions: [],
    retired: true,
  },
];

async function mountHome() {
  const router = createAppRouter(createMemoryHistory());
  await router.push('/');
  await router.isReady();
  const wrapper = mount(Home, { global: { plugins: [router, i18n] } });
  return { wrapper, router };
}

describe('Directory home', () => {
  // the search view is lazy and large: compiled once up front, a navigation to it settles in time
  beforeAll(() => import('@/views/search/index.vue'), 30_000);

  beforeEach(() => {
    setActivePinia(createPinia());
    vi.mocked(listServiceTypes).mockReset();
    vi.mocked(listCapabilities).mockReset().mockResolvedValue(capabilities);
  });

  it('promises van owners the right equipment in its one h1', async () => {
    vi.mocked(listServiceTypes).mockResolvedValue(serviceTypes);
    const { wrapper } = await mountHome();
    const h1 = wrapper.findAll('h1');
    expect(h1).toHaveLength(1);
    expect(h1[0]!.text()).toBe('Find a technician with the right equipment for your van');
    expect(wrapper.find('#how-it-works').findAll('li')).toHaveLength(3);
  });

  it('shows a loading state while the catalogue loads', async () => {
    vi.mocked(listServiceTypes).mockReturnValue(new Promise(() => {}));
    const { wrapper } = await mountHome();
    const services = wrapper.find('#services');
    expect(services.find('[data-state="loading"]').exists()).toBe(true);
    expect(services.find('[role="status"]').text()).toBe('Loading the services you can book…');
  });

  it('shows each bookable service with duration, equipment names and cautions', async () => {
    vi.mocked(listServiceTypes).mockResolvedValue(serviceTypes);
    const { wrapper } = await mountHome();
    await flushPromises();
    const cards = wrapper.findAll('#services article');
    expect(cards).toHaveLength(2);
    const first = cards[0]!;
    expect(first.find('h3').text()).toBe('Parking heater conversion');
    expect(first.text()).toContain('Turn the auxiliary coolant heater into a parking heater.');
    expect(first.text()).toContain('1 hr 30 mins');
    expect(first.text()).toContain('UDS flashing interface');
    expect(first.text()).toContain('Battery support unit');
    expect(first.find('[data-caution="stable-power-flashing"]').text()).toContain('Stable power while flashing');
    expect(first.find('[data-caution="exhaust-gas"] svg').exists()).toBe(true);
    expect(cards[1]!.text()).toContain('15 mins');
    expect(cards[1]!.text()).toContain('No special equipment');
    expect(wrapper.text()).not.toContain('Withdrawn service');
  });

  it('sends the owner to search for a chosen service', async () => {
    vi.mocked(listServiceTypes).mockResolvedValue(serviceTypes);
    const { wrapper, router } = await mountHome();
    await flushPromises();
    await wrapper.find('#services article button').trigger('click');
    // The search view is lazy, so navigation settles after its chunk loads.
    await vi.waitFor(() => expect(router.currentRoute.value.name).toBe('search'));
    expect(router.currentRoute.value.query).toEqual({ service: 'parking-conversion' });
  });

  it('says what to do next when no services are listed', async () => {
    vi.mocked(listServiceTypes).mockResolvedValue([]);
    const { wrapper } = await mountHome();
    await flushPromises();
    const empty = wrapper.find('#services [data-state="empty"]');
    expect(empty.text()).toContain('No services are listed yet');
    expect(empty.find('a').attributes('href')).toBe('/safety');
  });

  it('asks for the service types once for the header form and the catalogue together', async () => {
    vi.mocked(listServiceTypes).mockResolvedValue(serviceTypes);
    const router = createAppRouter(createMemoryHistory());
    await router.push('/');
    await router.isReady();
    const wrapper = mount(App, { global: { plugins: [router, i18n] } });
    await flushPromises();
    expect(wrapper.findAll('#services article')).toHaveLength(2);
    expect(wrapper.find('.site-header__search').text()).toContain('Handset pairing');
    expect(listServiceTypes).toHaveBeenCalledTimes(1);
  });

  it('shows an error with a retry that loads the catalogue again', async () => {
    vi.mocked(listServiceTypes)
      .mockRejectedValueOnce(new ApiError({ type: 'about:blank', title: 'Internal', status: 500, code: 'INTERNAL' }))
      .mockResolvedValueOnce(serviceTypes);
    const { wrapper } = await mountHome();
    await flushPromises();
    const alert = wrapper.find('#services [role="alert"]');
    expect(alert.text()).toContain('This could not be loaded');
    await alert.find('button').trigger('click');
    await flushPromises();
    expect(listServiceTypes).toHaveBeenCalledTimes(2);
    expect(wrapper.find('#services [role="alert"]').exists()).toBe(false);
    expect(wrapper.findAll('#services article')).toHaveLength(2);
  });
});
