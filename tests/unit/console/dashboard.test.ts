// Console dashboard: the catalogue overview table in its loading, data, empty and error states.
import { beforeEach, describe, expect, it, vi } from 'vitest';
import { flushPromises, mount } from '@vue/test-utils';
import { createPinia, setActivePinia } from 'pinia';
import { createMemoryHistory } from 'vue-router';
import { ApiError } from '@emberline/api-client';
import type { Capability, ServiceType } from '@emberline/domain';
import { listCapabilities, listServiceTypes } from '@/api/catalogue';
import { i18n } from '@/locales';
import { createAppRouter } from '@/router';
import Dashboard from '@/views/dashboard/index.vue';

vi.mock('@/api/catalogue', () => ({ listServiceTypes: vi.fn(), listCapabilities: vi.fn() }));
// Nobody is signed in: the guard's restore gets a 401.
vi.mock('@/api/auth', () => ({
  refreshSession: vi.fn(() => Promise.reject(new ApiError({ type: 'about:blank', title: 'Signed out', status: 401, code: 'SESSION_EXPIRED' }))),
}));

const capabilities: Capability[] = [
  { code: 'uds-flash-programming', name: 'UDS flashing interface', description: '', category: 'diagnostics', standards: ['ISO 14229'], retired: false },
  { code: 'coolant-bleeding-kit', name: 'Coolant bleeding kit', description: '', category: 'mechanical', standards: [], retired: false },
];
const serviceTypes: ServiceType[] = [
  {
    code: 'firmware-update',
    name: 'Heater firmware update',
    summary: 'Update the control unit.',
    description: '',
    defaultDurationMinutes: 45,
    requiredCapabilities: ['uds-flash-programming'],
    cautions: ['stable-power-flashing'],
    retired: false,
  },
  {
    code: 'seasonal-service',
    name: 'Seasonal service',
    summary: 'Before winter.',
    description: '',
    defaultDurationMinutes: 120,
    requiredCapabilities: ['coolant-bleeding-kit'],
    cautions: ['exhaust-gas', 'hot-coolant'],
    retired: false,
  },
];

async function mountDashboard() {
  const router = createAppRouter(createMemoryHistory());
  await router.push('/dashboard');
  await router.isReady();
  return mount(Dashboard, { global: { plugins: [router, i18n] } });
}

describe('Console dashboard', () => {
  beforeEach(() => {
    setActivePinia(createPinia());
    vi.mocked(listServiceTypes).mockReset();
    vi.mocked(listCapabilities).mockReset().mockResolvedValue(capabilities);
  });

  it('welcomes the user in its h1', async () => {
    vi.mocked(listServiceTypes).mockResolvedValue(serviceTypes);
    const wrapper = await mountDashboard();
    expect(wrapper.find('h1').text()).toBe('Welcome to the Emberline Console');
  });

  it('shows a loading state while the catalogue loads', async () => {
    vi.mocked(listServiceTypes).mockReturnValue(new Promise(() => {}));
    const wrapper = await mountDashboard();
    expect(wrapper.find('[data-state="loading"]').exists()).toBe(true);
    expect(wrapper.find('table').exists()).toBe(false);
  });

  it('lists service types with duration, capability names and cautions', async () => {
    vi.mocked(listServiceTypes).mockResolvedValue(serviceTypes);
    const wrapper = await mountDashboard();
    await flushPromises();
    const headers = wrapper.findAll('thead th').map((th) => th.text());
    expect(headers).toEqual(['Name', 'Default duration', 'Required capabilities', 'Cautions']);
    const rows = wrapper.findAll('tbody tr.ant-table-row');
    expect(rows).toHaveLength(2);
    const cells = rows[0]!.findAll('td').map((td) => td.text());
    expect(cells[0]).toContain('Heater firmware update');
    expect(cells[1]).toBe('45 mins');
    expect(cells[2]).toBe('UDS flashing interface');
    expect(cells[3]).toContain('Stable power while flashing');
    const second = rows[1]!.findAll('td').map((td) => td.text());
    expect(second[1]).toBe('2 hrs');
    expect(second[2]).toBe('Coolant bleeding kit');
    expect(second[3]).toContain('Exhaust gas (carbon monoxide)');
    expect(second[3]).toContain('Hot coolant');
    expect(wrapper.text()).toContain('Need stable power for flashing');
  });

  it('says what happens next when the catalogue is empty', async () => {
    vi.mocked(listServiceTypes).mockResolvedValue([]);
    const wrapper = await mountDashboard();
    await flushPromises();
    const empty = wrapper.find('[data-state="empty"]');
    expect(empty.text()).toContain('No service types yet');
    expect(empty.text()).toContain('Network admins add them');
  });

  it('shows an error with a retry that loads again', async () => {
    vi.mocked(listServiceTypes)
      .mockRejectedValueOnce(new ApiError({ type: 'about:blank', title: 'x', status: 503, code: 'NETWORK_ERROR' }))
      .mockResolvedValueOnce(serviceTypes);
    const wrapper = await mountDashboard();
    await flushPromises();
    const alert = wrapper.find('[role="alert"]');
    expect(alert.text()).toContain('We could not reach Emberline');
    await alert.find('button').trigger('click');
    await flushPromises();
    expect(listServiceTypes).toHaveBeenCalledTimes(2);
    expect(wrapper.findAll('tbody tr.ant-table-row')).toHaveLength(2);
  });
});
