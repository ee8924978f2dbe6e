// Capability management for network admins: the create form is checked with the API's schema.
import { beforeEach, describe, expect, it, vi } from 'vitest';
import { flushPromises, mount } from '@vue/test-utils';
import { createPinia, setActivePinia } from 'pinia';
import { createMemoryHistory } from 'vue-router';
import { refreshSession } from '@/api/auth';
import { listCapabilities, listServiceTypes } from '@/api/catalogue';
import { createCapability, listAllCapabilities } from '@/api/onboarding';
import { i18n } from '@/locales';
import { createAppRouter } from '@/router';
import Catalogue from '@/views/catalogue/index.vue';
import { me, problem, session } from './fixtures';
import { catalogue } from './onboarding-fixtures';

vi.mock('@/api/auth', () => ({ refreshSession: vi.fn(), signIn: vi.fn(), signOut: vi.fn() }));
vi.mock('@/api/catalogue', () => ({ listCapabilities: vi.fn(), listServiceTypes: vi.fn() }));
vi.mock('@/api/onboarding', () => ({ listAllCapabilities: vi.fn(), createCapability: vi.fn(), updateCapability: vi.fn() }));
vi.mock('@/api/search-admin', () => ({ listEligibilityRules: vi.fn().mockResolvedValue([]) }));

async function mountCatalogue() {
  vi.mocked(refreshSession).mockResolvedValue(session(me({ roles: ['network_admin'] })));
  const router = createAppRouter(createMemoryHistory());
  await router.push('/admin/catalogue');
  await router.isReady();
  const wrapper = mount(Catalogue, { global: { plugins: [router, i18n] }, attachTo: document.body });
  await flushPromises();
  await wrapper.find('[data-testid="add-capability"]').trigger('click');
  await flushPromises();
  const form = document.body.querySelector<HTMLFormElement>('[data-testid="capability-form"]')!;
  return { wrapper, form };
}

function type(form: HTMLElement, id: string, value: string) {
  const input = form.querySelector<HTMLInputElement>(`#capability_${id}`)!;
  input.value = value;
  input.dispatchEvent(new Event('input'));
}

describe('Capability management', () => {
  beforeEach(() => {
    localStorage.clear();
    document.body.innerHTML = '';
    setActivePinia(createPinia());
    vi.clearAllMocks();
    vi.mocked(listCapabilities).mockResolvedValue(catalogue);
    vi.mocked(listServiceTypes).mockResolvedValue([]);
    vi.mocked(listAllCapabilities).mockResolvedValue([...catalogue, { ...catalogue[1]!, code: 'old-meter', name: 'Old meter', retired: true }]);
  });

  it('lists retired capabilities too, with a way to bring them back', async () => {
    const { wrapper } = await mountCatalogue();
    expect(listAllCapabilities).toHaveBeenCalled();
    expect(wrapper.text()).toContain('Old meter');
    expect(wrapper.find('[aria-label="Bring back Old meter"]').exists()).toBe(true);
  });

  it('refuses a malformed code before calling the API', async () => {
    const { form } = await mountCatalogue();
    type(form, 'code', 'Bad Code');
    type(form, 'name', 'Glow pin tester');
    form.dispatchEvent(new Event('submit'));
    await flushPromises();
    expect(createCapability).not.toHaveBeenCalled();
    expect(form.textContent).toContain('Use lower-case letters, digits and single hyphens');
  });

  it('creates a capability with the standards split into a list, and shows a server field error', async () => {
    vi.mocked(createCapability).mockRejectedValue(problem(409, 'CODE_TAKEN', 'Taken.', [{ path: 'code', message: 'This code is already in use' }]));
    const { form } = await mountCatalogue();
    type(form, 'code', 'glow-pin-tester');
    type(form, 'name', 'Glow pin tester');
    type(form, 'standards', 'ISO 14229, SAE J2534');
    form.dispatchEvent(new Event('submit'));
    await flushPromises();
    expect(createCapability).toHaveBeenCalledWith({ code: 'glow-pin-tester', name: 'Glow pin tester', description: '', category: 'diagnostics', standards: ['ISO 14229', 'SAE J2534'] });
    expect(form.textContent).toContain('This code is already in use');
  });
});
