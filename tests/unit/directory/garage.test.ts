// The owner's garage: vehicles as cards with plain-word notes, the empty state's next step, the
// form's client and server field errors, and removal after a confirm.
import { beforeAll, beforeEach, describe, expect, it, vi } from 'vitest';
import { flushPromises, mount } from '@vue/test-utils';
import { createPinia, setActivePinia } from 'pinia';
import { defineComponent, h } from 'vue';
import { createMemoryHistory, RouterView } from 'vue-router';
import { ApiError } from '@emberline/api-client';
import type { Session, Vehicle } from '@emberline/domain';
import { refreshSession } from '@/api/auth';
import { addVehicle, listVehicles, removeVehicle } from '@/api/garage';
import { i18n } from '@/locales';
import { createAppRouter } from '@/router';

vi.mock('@/api/auth', () => ({ refreshSession: vi.fn(), signIn: vi.fn(), signOut: vi.fn(), resendVerification: vi.fn() }));
vi.mock('@/api/garage', () => ({ listVehicles: vi.fn(), addVehicle: vi.fn(), updateVehicle: vi.fn(), removeVehicle: vi.fn() }));

const Shell = defineComponent({ render: () => h(RouterView) });

const owner: Session = {
  accessToken: 'access-1',
  expiresIn: 900,
  user: { id: '0e6a3f3e-5d1c-4f0e-8a77-2c1b9f0d4e21', email: 'clara@owners.example', name: 'Clara Lind', locale: 'en', emailVerified: true, roles: ['owner'], memberships: [] },
};

const basic: Vehicle = {
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
const transit: Vehicle = {
  ...basic,
  id: '5b0f3a52-8f0e-4f3c-9d55-3c2f1b7e9a10',
  name: 'Depot truck',
  model: 'Tessaro Transit 9',
  year: 2021,
  factoryHeater: 'coolant_parking',
  climateControl: 'automatic',
  electricalSystemV: 24,
  batteryCapacityAh: 180,
  batteryType: 'agm',
};
const camper: Vehicle = { ...basic, id: '3e2d1c0b-4a59-4687-9a1b-2c3d4e5f6a7b', name: 'Our camper', model: 'Maren Camper 2', factoryHeater: 'none' };

const problem = (status: number, code: string, detail?: string, errors?: { path: string; message: string }[]) =>
  new ApiError({ type: 'about:blank', title: code === 'VALIDATION_FAILED' ? 'Some fields need attention' : code, status, code, detail, errors });

async function mountGarage() {
  const router = createAppRouter(createMemoryHistory());
  await router.push('/garage');
  await router.isReady();
  const wrapper = mount(Shell, { global: { plugins: [router, i18n] }, attachTo: document.body });
  await flushPromises();
  return { wrapper, router };
}

type Wrapper = Awaited<ReturnType<typeof mountGarage>>['wrapper'];
const cards = (wrapper: Wrapper) => wrapper.findAll('article[data-vehicle]');
const itemOf = (wrapper: Wrapper, field: string) => wrapper.find(`label[for="vehicle_${field}"]`).element.closest('.ant-form-item')!;

async function fillNewVehicle(wrapper: Wrapper, values: { name: string; model: string; year: string; battery: string }) {
  await wrapper.find('input#vehicle_name').setValue(values.name);
  await wrapper.find('input#vehicle_model').setValue(values.model);
  await wrapper.find('input#vehicle_year').setValue(values.year);
  await wrapper.find('input#vehicle_batteryCapacityAh').setValue(values.battery);
  await wrapper.find('[data-testid="vehicle-form"] form').trigger('submit');
  await flushPromises();
}

describe('Directory garage', () => {
  beforeAll(() => import('@/views/garage/index.vue'), 30_000);

  beforeEach(() => {
    document.body.innerHTML = '';
    setActivePinia(createPinia());
    vi.mocked(refreshSession).mockReset().mockResolvedValue(owner);
    for (const fn of [listVehicles, addVehicle, removeVehicle]) vi.mocked(fn).mockReset();
  });

  it("lists the owner's vehicles with what they have fitted and plain-word notes", async () => {
    vi.mocked(listVehicles).mockResolvedValue([basic, transit, camper]);
    const { wrapper } = await mountGarage();
    expect(wrapper.find('h1').text()).toBe('Your garage');
    const [first, second, third] = cards(wrapper);
    expect(cards(wrapper)).toHaveLength(3);
    expect(first!.find('h2').text()).toBe('Work van');
    expect(first!.text()).toContain('Korvan Cargo 4 Basic, 2019');
    expect(first!.text()).toContain('Coolant heater, auxiliary only');
    expect(first!.text()).toContain('Manual');
    expect(first!.text()).toContain('80 Ah, Flooded (wet)');
    expect(first!.find('[data-note="manualClimate"]').text()).toContain('needs extra wiring and parts, and takes longer');
    expect(first!.find('[data-note="manualClimate"] svg').exists()).toBe(true);
    expect(second!.text()).toContain('24 V');
    expect(second!.find('[data-note="volts24"]').exists()).toBe(true);
    expect(second!.find('[data-note="manualClimate"]').exists()).toBe(false);
    expect(third!.find('[data-note="noHeater"]').text()).toContain('a retrofit, not a conversion');
    expect(first!.find('[data-testid="plan-vehicle"]').attributes('href')).toBe(`/tools/pre-heat?vehicle=${basic.id}`);
  });

  it('says what to do next when the garage is empty, and opens the form', async () => {
    vi.mocked(listVehicles).mockResolvedValue([]);
    const { wrapper } = await mountGarage();
    const empty = wrapper.find('[data-state="empty"]');
    expect(empty.text()).toContain('Your garage is empty');
    expect(empty.text()).toContain('Add your van or motorhome');
    await empty.find('[data-testid="add-first-vehicle"]').trigger('click');
    await flushPromises();
    expect(wrapper.find('[data-testid="vehicle-form"]').exists()).toBe(true);
    expect(wrapper.find('label[for="vehicle_batteryCapacityAh"]').text()).toBe('Battery capacity');
  });

  it('checks the form before sending, then shows the server field errors beside their fields', async () => {
    vi.mocked(listVehicles).mockResolvedValue([]);
    vi.mocked(addVehicle).mockRejectedValue(
      problem(400, 'VALIDATION_FAILED', 'Check the marked fields.', [{ path: 'model', message: 'Enter the model as it appears on the registration' }]),
    );
    const { wrapper } = await mountGarage();
    await wrapper.find('[data-testid="add-first-vehicle"]').trigger('click');
    await flushPromises();

    await fillNewVehicle(wrapper, { name: 'Winter van', model: 'Korvan Cargo 4', year: '1975', battery: '95' });
    expect(addVehicle).not.toHaveBeenCalled();
    expect(itemOf(wrapper, 'year').textContent).toContain('The year must be between 1980');

    await fillNewVehicle(wrapper, { name: 'Winter van', model: 'Korvan Cargo 4', year: '2022', battery: '95' });
    expect(addVehicle).toHaveBeenCalledWith({
      name: 'Winter van',
      model: 'Korvan Cargo 4',
      year: 2022,
      fuel: 'diesel',
      factoryHeater: 'coolant_auxiliary',
      climateControl: 'automatic',
      electricalSystemV: 12,
      batteryCapacityAh: 95,
      batteryType: 'agm',
    });
    expect(itemOf(wrapper, 'model').textContent).toContain('Enter the model as it appears on the registration');
    expect(itemOf(wrapper, 'year').textContent).not.toContain('The year must be between');
    expect(wrapper.find('input#vehicle_model').attributes('aria-invalid')).toBe('true');
  });

  it('adds a saved vehicle to the list', async () => {
    vi.mocked(listVehicles).mockResolvedValue([]);
    vi.mocked(addVehicle).mockImplementation(async (body) => ({ ...body, id: transit.id, createdAt: transit.createdAt, updatedAt: transit.updatedAt }));
    const { wrapper } = await mountGarage();
    await wrapper.find('[data-testid="add-first-vehicle"]').trigger('click');
    await flushPromises();
    await fillNewVehicle(wrapper, { name: 'Winter van', model: 'Korvan Cargo 4', year: '2022', battery: '95' });
    expect(wrapper.find('[data-testid="vehicle-form"]').exists()).toBe(false);
    expect(cards(wrapper).map((c) => c.find('h2').text())).toEqual(['Winter van']);
    expect(wrapper.find('[role="status"]').text()).toBe('Winter van is in your garage.');
  });

  it('removes a vehicle through the API after a confirm', async () => {
    vi.mocked(listVehicles).mockResolvedValue([basic, transit]);
    vi.mocked(removeVehicle).mockResolvedValue();
    const { wrapper } = await mountGarage();
    const button = cards(wrapper)[0]!.find('[data-testid="remove-vehicle"]');
    expect(button.attributes('aria-label')).toBe('Remove Work van');
    await button.trigger('click');
    await flushPromises();
    expect(removeVehicle).not.toHaveBeenCalled();
    const confirm = document.body.querySelector<HTMLButtonElement>('.ant-popconfirm .ant-btn-dangerous');
    expect(confirm?.textContent).toContain('Remove');
    confirm!.click();
    await flushPromises();
    expect(removeVehicle).toHaveBeenCalledWith(basic.id);
    expect(cards(wrapper).map((c) => c.find('h2').text())).toEqual(['Depot truck']);
    expect(wrapper.find('[role="status"]').text()).toBe('Work van is removed from your garage.');
  });

  it('keeps the vehicle and says why when removing fails', async () => {
    vi.mocked(listVehicles).mockResolvedValue([basic]);
    vi.mocked(removeVehicle).mockRejectedValue(problem(404, 'NOT_FOUND', 'This vehicle is not in your garage.'));
    const { wrapper } = await mountGarage();
    await cards(wrapper)[0]!.find('[data-testid="remove-vehicle"]').trigger('click');
    await flushPromises();
    document.body.querySelector<HTMLButtonElement>('.ant-popconfirm .ant-btn-dangerous')!.click();
    await flushPromises();
    expect(removeVehicle).toHaveBeenCalledWith(basic.id);
    expect(wrapper.find('[data-testid="garage-action-error"]').text()).toContain('This vehicle is not in your garage.');
    expect(cards(wrapper)).toHaveLength(1);
  });

  it('shows a load error with a retry', async () => {
    vi.mocked(listVehicles).mockRejectedValueOnce(problem(500, 'INTERNAL')).mockResolvedValueOnce([basic]);
    const { wrapper } = await mountGarage();
    const alert = wrapper.find('[data-state="error"]');
    expect(alert.text()).toContain('This could not be loaded');
    await alert.find('button').trigger('click');
    await flushPromises();
    expect(listVehicles).toHaveBeenCalledTimes(2);
    expect(cards(wrapper)).toHaveLength(1);
  });

  it('sends a visitor who is not signed in to sign-in', async () => {
    vi.mocked(refreshSession).mockRejectedValue(problem(401, 'SESSION_EXPIRED'));
    const { router } = await mountGarage();
    expect(router.currentRoute.value.name).toBe('sign-in');
    expect(router.currentRoute.value.query.redirect).toBe('/garage');
    expect(listVehicles).not.toHaveBeenCalled();
  });
});
