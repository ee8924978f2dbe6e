// Partner application wizard: step saves, server field errors, change-request notes, submit.
import { beforeEach, describe, expect, it, vi } from 'vitest';
import { flushPromises, mount } from '@vue/test-utils';
import { createPinia, setActivePinia } from 'pinia';
import { createMemoryHistory } from 'vue-router';
import { defineComponent, h } from 'vue';
import type { MemberRole } from '@emberline/domain';
import { refreshSession } from '@/api/auth';
import { listCapabilities, listServiceTypes } from '@/api/catalogue';
import { getApplication, saveArea, saveBusiness, saveCapabilities, submitApplication } from '@/api/onboarding';
import { i18n } from '@/locales';
import { createAppRouter } from '@/router';
import ApplicationPage from '@/views/application/index.vue';
import { ORG_A, me, member, problem, session } from './fixtures';
import { application, business, catalogue } from './onboarding-fixtures';

vi.mock('@/api/auth', () => ({ refreshSession: vi.fn(), signIn: vi.fn(), signOut: vi.fn() }));
vi.mock('@/api/catalogue', () => ({ listCapabilities: vi.fn(), listServiceTypes: vi.fn() }));
vi.mock('@/api/onboarding', () => ({
  getApplication: vi.fn(),
  saveBusiness: vi.fn(),
  saveArea: vi.fn(),
  saveCapabilities: vi.fn(),
  submitApplication: vi.fn(),
  uploadDocument: vi.fn(),
  fetchDocumentBlob: vi.fn(),
  deleteDocument: vi.fn(),
}));
// Leaflet needs a real layout engine; the stub renders the picked point and emits a pick on click.
vi.mock('@emberline/ui/area-map', () => ({
  __esModule: true,
  default: defineComponent({
    props: ['lat', 'lng', 'radiusKm', 'editable', 'label', 'tileUrl', 'tileAttribution', 'height'],
    emits: ['pick'],
    setup(props, { emit }) {
      return () => h('button', { type: 'button', 'data-testid': 'map-stub', 'data-radius': String(props.radiusKm), onClick: () => emit('pick', { lat: 47.2692, lng: 11.4041 }) }, props.label);
    },
  }),
}));

async function mountPage(step = 'business', role: MemberRole = 'partner_admin') {
  vi.mocked(refreshSession).mockResolvedValue(session(me({ memberships: [member(role)] })));
  const router = createAppRouter(createMemoryHistory());
  await router.push({ path: '/application', query: { step } });
  await router.isReady();
  const wrapper = mount(ApplicationPage, { global: { plugins: [router, i18n] }, attachTo: document.body });
  await flushPromises();
  return { wrapper, router };
}

describe('Partner application wizard', () => {
  beforeEach(() => {
    localStorage.clear();
    document.body.innerHTML = '';
    setActivePinia(createPinia());
    vi.clearAllMocks();
    vi.mocked(listCapabilities).mockResolvedValue(catalogue);
    vi.mocked(listServiceTypes).mockResolvedValue([]);
    vi.mocked(getApplication).mockResolvedValue(application());
  });

  it('saves the business step with the form values and moves on to the next step', async () => {
    vi.mocked(saveBusiness).mockResolvedValue(application({ business }));
    const { wrapper, router } = await mountPage('business');
    expect(getApplication).toHaveBeenCalledWith(ORG_A, expect.anything());
    await wrapper.find('input#business_legalName').setValue(business.legalName);
    await wrapper.find('input#business_tradingName').setValue(business.tradingName);
    await wrapper.find('select#business_country').setValue('AT');
    await wrapper.find('input#business_street').setValue(business.street);
    await wrapper.find('input#business_postalCode').setValue(business.postalCode);
    await wrapper.find('input#business_city').setValue(business.city);
    await wrapper.find('input#business_vatId').setValue('atu 13585627');
    await wrapper.find('input#business_phone').setValue(business.phone);
    await wrapper.find('form').trigger('submit');
    await flushPromises();
    expect(saveBusiness).toHaveBeenCalledWith(ORG_A, { ...business, vatId: 'ATU13585627' });
    expect(router.currentRoute.value.query.step).toBe('area');
  });

  it('refuses an invalid VAT ID before calling the API', async () => {
    const { wrapper } = await mountPage('business');
    await wrapper.find('input#business_vatId').setValue('ATU00000001');
    await wrapper.find('form').trigger('submit');
    await flushPromises();
    expect(saveBusiness).not.toHaveBeenCalled();
    expect(wrapper.find('input#business_vatId').element.closest('.ant-form-item')!.textContent).toContain('does not have a valid format');
  });

  it('shows the server field errors next to their fields', async () => {
    vi.mocked(getApplication).mockResolvedValue(application({ business }));
    vi.mocked(saveBusiness).mockRejectedValue(
      problem(400, 'VALIDATION_FAILED', 'Check the fields.', [{ path: 'business.phone', message: 'This number cannot be reached' }]),
    );
    const { wrapper } = await mountPage('business');
    await wrapper.find('form').trigger('submit');
    await flushPromises();
    expect(saveBusiness).toHaveBeenCalled();
    const phoneItem = wrapper.find('input#business_phone').element.closest('.ant-form-item')!;
    expect(phoneItem.textContent).toContain('This number cannot be reached');
    expect(wrapper.find('input#business_city').element.closest('.ant-form-item')!.textContent).not.toContain('This number cannot be reached');
  });

  it('saves the area with the picked base and the live radius', async () => {
    vi.mocked(saveArea).mockResolvedValue(application({ business }));
    const { wrapper } = await mountPage('area');
    await wrapper.find('input#area_baseLabel').setValue('Innsbruck West');
    await wrapper.find('[data-testid="map-stub"]').trigger('click');
    const radius = wrapper.find('input#area_radiusKm');
    await radius.setValue('80');
    await radius.trigger('blur');
    await flushPromises();
    expect(wrapper.find('[data-testid="map-stub"]').attributes('data-radius')).toBe('80');
    await wrapper.find('form').trigger('submit');
    await flushPromises();
    expect(saveArea).toHaveBeenCalledWith(ORG_A, { baseLabel: 'Innsbruck West', baseLat: 47.2692, baseLng: 11.4041, mode: 'mobile', radiusKm: 80, workshopAddress: null });
  });

  it('saves claimed capabilities with serial numbers', async () => {
    vi.mocked(saveCapabilities).mockResolvedValue(application());
    const { wrapper } = await mountPage('capabilities');
    expect(wrapper.text()).toContain('battery support unit');
    await wrapper.find('.cap[data-code="uds-flash-programming"] input[type="checkbox"]').setValue(true);
    await wrapper.find('input#cap-serial-uds-flash-programming').setValue('SN-4471');
    await wrapper.find('[data-testid="step-save"]').trigger('click');
    await flushPromises();
    expect(saveCapabilities).toHaveBeenCalledWith(ORG_A, { capabilities: [{ code: 'uds-flash-programming', notes: null, serial: 'SN-4471' }] });
  });

  it('shows the admin message and each change-request note beside its field', async () => {
    vi.mocked(getApplication).mockResolvedValue(
      application({
        status: 'changes_requested',
        business,
        changeRequest: { message: 'Please fix two things.', fields: { 'business.vatId': 'Add your VAT ID', 'area.radiusKm': 'Too wide for one technician' }, requestedAt: '2026-03-02T10:00:00.000Z' },
      }),
    );
    const { wrapper } = await mountPage('business');
    expect(wrapper.find('[data-testid="change-request"]').text()).toContain('Please fix two things.');
    const vatItem = wrapper.find('input#business_vatId').element.closest('.ant-form-item')!;
    expect(vatItem.querySelector('[data-testid="field-note"]')?.textContent).toContain('Add your VAT ID');
    expect(wrapper.findAll('[data-testid="field-note"]')).toHaveLength(1);
    expect(wrapper.find('input#business_phone').element.closest('.ant-form-item')!.querySelector('[data-testid="field-note"]')).toBeNull();
  });

  it('lists what is missing when the submit is refused, each linking back to its step', async () => {
    vi.mocked(getApplication).mockResolvedValue(application({ business }));
    vi.mocked(submitApplication).mockRejectedValue(
      problem(400, 'APPLICATION_INCOMPLETE', 'Some parts are missing.', [
        { path: 'documents.insurance', message: 'Upload your liability insurance certificate' },
        { path: 'area', message: 'Say where you work' },
      ]),
    );
    const { wrapper, router } = await mountPage('review');
    await wrapper.find('[data-testid="submit-application"]').trigger('click');
    await flushPromises();
    document.body.querySelector<HTMLButtonElement>('.ant-popconfirm .ant-btn-primary')!.click();
    await flushPromises();
    expect(submitApplication).toHaveBeenCalledWith(ORG_A);
    const missing = wrapper.find('[data-testid="missing"]');
    expect(missing.text()).toContain('Liability insurance certificate: Upload your liability insurance certificate');
    expect(missing.text()).toContain('Say where you work');
    await missing.findAll('a')[0]!.trigger('click');
    await flushPromises();
    expect(router.currentRoute.value.query.step).toBe('documents');
  });

  it('shows a submitted application read-only with a status banner', async () => {
    vi.mocked(getApplication).mockResolvedValue(application({ status: 'submitted', editable: false, business, submittedAt: '2026-03-01T09:00:00.000Z' }));
    const { wrapper } = await mountPage('business');
    expect(wrapper.find('[data-testid="status-banner"]').text()).toContain('Application submitted');
    expect(wrapper.find('form').exists()).toBe(false);
    expect(wrapper.text()).toContain('Ember Vans North GmbH');
  });
});
