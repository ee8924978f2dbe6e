// Pre-heat planner: presets fill the form, the page shows what planPreheat computes for the same
// input, out-of-range values show the field's error with its range, a garage vehicle fills in.
import { beforeAll, beforeEach, describe, expect, it, vi } from 'vitest';
import { flushPromises, mount } from '@vue/test-utils';
import { createPinia, setActivePinia } from 'pinia';
import { defineComponent, h } from 'vue';
import { createMemoryHistory, RouterView } from 'vue-router';
import { ApiError } from '@emberline/api-client';
import { MOTORHOME_PRESET, PANEL_VAN_PRESET, PREHEAT_LIMITS, planPreheat, type PreheatInputDraft, type Vehicle } from '@emberline/domain';
import { formatDate, formatDuration, formatNumber } from '@emberline/ui';
import { refreshSession } from '@/api/auth';
import { listVehicles } from '@/api/garage';
import { i18n } from '@/locales';
import { createAppRouter } from '@/router';

vi.mock('@/api/auth', () => ({ refreshSession: vi.fn(), signIn: vi.fn(), signOut: vi.fn(), resendVerification: vi.fn() }));
vi.mock('@/api/garage', () => ({ listVehicles: vi.fn(), addVehicle: vi.fn(), updateVehicle: vi.fn(), removeVehicle: vi.fn() }));
// echarts needs a real canvas; the chart's words and table are tested instead.
vi.mock('@/views/planner/planner-chart.vue', () => ({ __esModule: true, default: defineComponent({ props: ['plan', 'label'], render: () => h('div', { 'data-testid': 'chart-stub' }) }) }));

const Shell = defineComponent({ render: () => h(RouterView) });
const signedOut = () => new ApiError({ type: 'about:blank', title: 'Signed out', status: 401, code: 'SESSION_EXPIRED' });

async function mountPlanner(path = '/tools/pre-heat') {
  const router = createAppRouter(createMemoryHistory());
  await router.push(path);
  await router.isReady();
  const wrapper = mount(Shell, { global: { plugins: [router, i18n] }, attachTo: document.body });
  await flushPromises();
  await vi.waitFor(() => expect(wrapper.find('form[id="preheat"], form').exists()).toBe(true));
  return wrapper;
}

type Wrapper = Awaited<ReturnType<typeof mountPlanner>>;

const input = (wrapper: Wrapper, field: string) => wrapper.find(`input#preheat_${field}`);
const numberIn = (wrapper: Wrapper, field: string) => Number((input(wrapper, field).element as HTMLInputElement).value);
const itemOf = (wrapper: Wrapper, field: string) => wrapper.find(`#preheat_${field}`).element.closest('.ant-form-item')!;
/** The text of the option a native select shows as chosen. */
const chosen = (wrapper: Wrapper, field: string) => (wrapper.find(`select#preheat_${field}`).element as HTMLSelectElement).selectedOptions[0]?.textContent?.trim();

async function type(wrapper: Wrapper, field: string, value: string) {
  const el = input(wrapper, field);
  await el.setValue(value);
  await el.trigger('blur');
  await flushPromises();
}

/** The departure the test types in, as ISO with this machine's offset, built independently of the app. */
function isoWithOffset(y: number, m: number, d: number, hh: number, mm: number): string {
  const local = new Date(y, m - 1, d, hh, mm);
  const offset = -local.getTimezoneOffset();
  const p = (n: number) => String(n).padStart(2, '0');
  const sign = offset < 0 ? '-' : '+';
  return `${y}-${p(m)}-${p(d)}T${p(hh)}:${p(mm)}:00${sign}${p(Math.floor(Math.abs(offset) / 60))}:${p(Math.abs(offset) % 60)}`;
}

const NUMERIC_FIELDS = [
  'targetCoolantTemperatureC',
  'heaterOutputKw',
  'engineMassKg',
  'coolantVolumeL',
  'cabinVolumeM3',
  'interiorHeatCapacityKjPerK',
  'engineLossWPerK',
  'heaterMatrixWPerK',
  'cabinLossWPerK',
  'batteryCapacityAh',
  'heaterDrawW',
  'startStateOfChargePercent',
] as const;

describe('Pre-heat planner', () => {
  // The route's view is lazy: load it once here, so the first test does not pay for compiling it.
  beforeAll(() => import('@/views/planner/index.vue'), 30_000);

  beforeEach(() => {
    document.body.innerHTML = '';
    setActivePinia(createPinia());
    vi.mocked(refreshSession).mockReset().mockRejectedValue(signedOut());
    vi.mocked(listVehicles).mockReset();
  });

  it('fills every field from the chosen preset', async () => {
    const wrapper = await mountPlanner();
    for (const field of NUMERIC_FIELDS) expect(numberIn(wrapper, field), field).toBe(PANEL_VAN_PRESET.values[field]);
    expect(numberIn(wrapper, 'efficiencyPercent')).toBe(PANEL_VAN_PRESET.values.combustionEfficiency * 100);

    await wrapper.find(`input[type="radio"][value="${MOTORHOME_PRESET.id}"]`).setValue(true);
    await flushPromises();
    for (const field of NUMERIC_FIELDS) expect(numberIn(wrapper, field), field).toBe(MOTORHOME_PRESET.values[field]);
    expect(numberIn(wrapper, 'efficiencyPercent')).toBe(MOTORHOME_PRESET.values.combustionEfficiency * 100);
    expect(chosen(wrapper, 'batteryType')).toBe('Flooded (wet)');
    // The van and the motorhome differ, so the fields really changed.
    expect(MOTORHOME_PRESET.values.engineMassKg).not.toBe(PANEL_VAN_PRESET.values.engineMassKg);
  });

  it('shows what planPreheat computes for the same input, and follows changes', async () => {
    const wrapper = await mountPlanner();
    await input(wrapper, 'departureDate').setValue('2026-01-15');
    await input(wrapper, 'departureTime').setValue('07:30');
    await flushPromises();

    const draft: PreheatInputDraft = { ...PANEL_VAN_PRESET.values, outsideTemperatureC: -15, departure: isoWithOffset(2026, 1, 15, 7, 30) };
    for (const outside of [-15, -5]) {
      if (outside !== -15) await type(wrapper, 'outsideTemperatureC', String(outside));
      const plan = planPreheat({ ...draft, outsideTemperatureC: outside });
      expect(plan.reachable).toBe(true);
      const result = (name: string) => wrapper.find(`[data-result="${name}"]`).text();
      expect(result('time-to-target')).toBe(formatDuration(plan.timeToTargetMinutes!, 'en'));
      expect(result('recommended-start')).toBe(
        formatDate(plan.recommendedStart!, 'en', { weekday: 'short', day: 'numeric', month: 'short', hour: '2-digit', minute: '2-digit' }),
      );
      expect(result('fuel')).toContain(formatNumber(plan.fuel.litres, 'en', { style: 'unit', unit: 'liter', maximumFractionDigits: 2, minimumFractionDigits: 2 }));
      expect(result('fuel')).toContain(formatNumber(plan.fuel.kg, 'en', { style: 'unit', unit: 'kilogram', maximumFractionDigits: 2, minimumFractionDigits: 2 }));
      expect(result('battery-used')).toBe(`${formatNumber(plan.battery!.chargeUsedAh, 'en', { maximumFractionDigits: 1, minimumFractionDigits: 1 })} Ah`);
      expect(result('state-of-charge')).toContain(formatNumber(plan.battery!.endStateOfChargePercent / 100, 'en', { style: 'percent', maximumFractionDigits: 0 }));
      expect(result('state-of-charge')).toContain(`${formatNumber(plan.battery!.endOpenCircuitVoltage, 'en', { maximumFractionDigits: 2, minimumFractionDigits: 2 })} V`);
      expect(wrapper.findAll('[data-testid="assumptions"] li').map((li) => li.text())).toEqual(plan.assumptions);
      // The chart's table ends where the curve ends.
      const rows = wrapper.findAll('.curve-table tbody tr');
      const last = plan.curve[plan.curve.length - 1]!;
      expect(rows[rows.length - 1]!.find('td').text()).toBe(formatNumber(last.coolantC, 'en', { style: 'unit', unit: 'celsius', maximumFractionDigits: 1, minimumFractionDigits: 1 }));
    }
    expect(wrapper.find('[data-testid="chart-stub"]').exists()).toBe(true);
    expect(wrapper.find('[data-caution="exhaust-gas"]').exists()).toBe(true);
    expect(wrapper.find('[data-testid="book-check"]').attributes('href')).toBe('/#services');
  });

  it('puts an error with the allowed range on the target when it is below the outside temperature', async () => {
    const wrapper = await mountPlanner();
    await type(wrapper, 'outsideTemperatureC', '20');
    await type(wrapper, 'targetCoolantTemperatureC', '10');
    const target = itemOf(wrapper, 'targetCoolantTemperatureC');
    expect(target.querySelector('[data-field-error]')?.textContent).toBe(
      `Target coolant temperature must be above the outside temperature (20 °C) and at most ${PREHEAT_LIMITS.targetCoolantTemperatureC.max} °C`,
    );
    expect(input(wrapper, 'targetCoolantTemperatureC').attributes('aria-invalid')).toBe('true');
    expect(itemOf(wrapper, 'outsideTemperatureC').querySelector('[data-field-error]')).toBeNull();
    expect(wrapper.find('[data-testid="plan"]').exists()).toBe(false);
    expect(wrapper.find('[data-testid="plan-invalid"]').exists()).toBe(true);

    await type(wrapper, 'targetCoolantTemperatureC', '60');
    expect(itemOf(wrapper, 'targetCoolantTemperatureC').querySelector('[data-field-error]')).toBeNull();
    expect(wrapper.find('[data-testid="plan"]').exists()).toBe(true);
  });

  it('refuses a heat output of zero with the range beside the field', async () => {
    const wrapper = await mountPlanner();
    await type(wrapper, 'heaterOutputKw', '0');
    const limits = PREHEAT_LIMITS.heaterOutputKw;
    const error = itemOf(wrapper, 'heaterOutputKw').querySelector('[data-field-error]');
    expect(error?.textContent).toBe(`Heater heat output must be more than ${limits.min} kW and at most ${limits.max} kW`);
    expect(input(wrapper, 'heaterOutputKw').attributes('aria-describedby')).toContain(error!.id);
    expect(wrapper.find('[data-testid="plan"]').exists()).toBe(false);
  });

  it("fills battery, voltage and fuel from the owner's garage vehicle", async () => {
    const vehicle: Vehicle = {
      id: '5b0f3a52-8f0e-4f3c-9d55-3c2f1b7e9a10',
      name: 'Depot truck',
      model: 'Tessaro Transit 9',
      year: 2021,
      fuel: 'diesel',
      factoryHeater: 'coolant_parking',
      climateControl: 'automatic',
      electricalSystemV: 24,
      batteryCapacityAh: 180,
      batteryType: 'flooded',
      createdAt: '2026-01-10T10:00:00.000Z',
      updatedAt: '2026-01-10T10:00:00.000Z',
    };
    vi.mocked(refreshSession).mockResolvedValue({
      accessToken: 'access-1',
      expiresIn: 900,
      user: { id: '0e6a3f3e-5d1c-4f0e-8a77-2c1b9f0d4e21', email: 'ida@owners.example', name: 'Ida Winter', locale: 'en', emailVerified: true, roles: ['owner'], memberships: [] },
    });
    vi.mocked(listVehicles).mockResolvedValue([vehicle]);
    const wrapper = await mountPlanner(`/tools/pre-heat?vehicle=${vehicle.id}`);
    await flushPromises();
    expect(listVehicles).toHaveBeenCalled();
    expect(numberIn(wrapper, 'batteryCapacityAh')).toBe(180);
    expect(chosen(wrapper, 'systemVoltage')).toBe('24 V');
    expect(chosen(wrapper, 'batteryType')).toBe('Flooded (wet)');
    expect(wrapper.find('[data-testid="planner-vehicle"]').text()).toContain('Planning for Depot truck (Tessaro Transit 9)');
  });

  it('asks a visitor to sign in before using a garage vehicle, and still plans', async () => {
    const wrapper = await mountPlanner('/tools/pre-heat?vehicle=5b0f3a52-8f0e-4f3c-9d55-3c2f1b7e9a10');
    expect(listVehicles).not.toHaveBeenCalled();
    const note = wrapper.find('[data-testid="planner-vehicle"]');
    expect(note.text()).toContain('Sign in to use the battery and voltage');
    expect(note.find('a').attributes('href')).toContain('/sign-in?redirect=');
    expect(wrapper.find('[data-testid="plan"]').exists()).toBe(true);
  });
});
