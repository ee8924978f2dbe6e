// Parts list and low stock: the tag at or below the shared threshold, adding a part in major units,
// a part still in a kit (409 PART_IN_USE), and the dashboard card for members of approved organisations.
import { beforeEach, describe, expect, it, vi } from 'vitest';
import { DOMWrapper, flushPromises, mount } from '@vue/test-utils';
import { createPinia, setActivePinia } from 'pinia';
import { createMemoryHistory } from 'vue-router';
import { LOW_STOCK_THRESHOLD, type MemberRole, type OrganisationStatus } from '@emberline/domain';
import { refreshSession } from '@/api/auth';
import { listCapabilities, listServiceTypes } from '@/api/catalogue';
import { createPart, deletePart, listOffers, listParts } from '@/api/offers';
import { i18n } from '@/locales';
import { createAppRouter } from '@/router';
import Dashboard from '@/views/dashboard/index.vue';
import PartsPage from '@/views/parts/index.vue';
import { ORG_A, me, member, problem, session } from './fixtures';
import { FUSE_TAP, HANDSET, RECEIVER, kitOffer, parts } from './offer-fixtures';

vi.mock('@/api/auth', () => ({ refreshSession: vi.fn(), signIn: vi.fn(), signOut: vi.fn() }));
vi.mock('@/api/catalogue', () => ({ listCapabilities: vi.fn(), listServiceTypes: vi.fn() }));
vi.mock('@/api/offers', () => ({ listOffers: vi.fn(), listParts: vi.fn(), createPart: vi.fn(), updatePart: vi.fn(), deletePart: vi.fn() }));

function signedIn(role: MemberRole, status: OrganisationStatus = 'approved') {
  vi.mocked(refreshSession).mockResolvedValue(session(me({ memberships: [{ ...member(role), organisationStatus: status }] })));
}

async function mountAt(path: string, component: object) {
  const router = createAppRouter(createMemoryHistory());
  await router.push(path);
  await router.isReady();
  const wrapper = mount(component, { global: { plugins: [router, i18n] }, attachTo: document.body });
  await flushPromises();
  return wrapper;
}

const $ = <E extends Element = HTMLElement>(selector: string) => new DOMWrapper(document.body.querySelector<E>(selector)!);

// these mount whole pages with ant-design-vue; a busy machine needs more than the default 5 s
describe('Parts list', { timeout: 30_000 }, () => {
  beforeEach(() => {
    localStorage.clear();
    document.body.innerHTML = '';
    setActivePinia(createPinia());
    vi.clearAllMocks();
    vi.mocked(listParts).mockResolvedValue(parts);
    vi.mocked(listOffers).mockResolvedValue([kitOffer]);
  });

  it('tags parts at or below the low-stock threshold, and only those', async () => {
    expect(LOW_STOCK_THRESHOLD).toBe(3);
    signedIn('technician');
    const wrapper = await mountAt('/parts', PartsPage);
    // stock 3 is at the threshold; 4 and 12 are above it
    expect(wrapper.find(`[data-testid="stock-${FUSE_TAP}"]`).text()).toBe('3 Low stock');
    expect(wrapper.find(`[data-testid="stock-${RECEIVER}"] [data-testid="low-stock"]`).exists()).toBe(false);
    expect(wrapper.find(`[data-testid="stock-${HANDSET}"] [data-testid="low-stock"]`).exists()).toBe(false);
    expect(wrapper.findAll('[data-testid="low-stock"]')).toHaveLength(1);
    expect(wrapper.find('[data-testid="low-stock-count"]').text()).toBe('One part is low.');
    // the kits that use a part are named beside it
    const handsetRow = wrapper.findAll('tbody tr.ant-table-row').find((r) => r.text().includes('Handset'))!;
    expect(handsetRow.text()).toContain('Remote-control kit fitting');
    expect(handsetRow.text()).toContain('€15.00');
    expect(wrapper.find('[data-testid="edit-part"]').exists()).toBe(false);
  });

  it('adds a part with its unit price typed in major units', async () => {
    signedIn('partner_admin');
    vi.mocked(createPart).mockResolvedValue({ ...parts[0]!, id: '9befc938-404f-4f9f-ad5d-5b991cce7841', name: 'Antenna' });
    const wrapper = await mountAt('/parts', PartsPage);
    await wrapper.find('[data-testid="add-part"]').trigger('click');
    await flushPromises();
    await $('#part_name').setValue('Antenna');
    await $('#part_partType').setValue('antenna');
    await $('#part_unitPrice').setValue('9.5');
    await $('#part_unitPrice').trigger('blur');
    await $('#part_stock').setValue('2');
    await $('#part_stock').trigger('blur');
    await $('[data-testid="part-form"]').trigger('submit');
    await flushPromises();
    expect(createPart).toHaveBeenCalledWith(ORG_A, { name: 'Antenna', partType: 'antenna', unitPriceMinor: 950, currency: 'EUR', stock: 2 });
  });

  it('explains a part that is still in a parts kit (409 PART_IN_USE) and names the kits', async () => {
    signedIn('partner_admin');
    vi.mocked(deletePart).mockRejectedValue(problem(409, 'PART_IN_USE', 'Remove the part from every parts kit before deleting it.'));
    const wrapper = await mountAt('/parts', PartsPage);
    const handsetRow = wrapper.findAll('tbody tr.ant-table-row').find((r) => r.text().includes('Handset'))!;
    await handsetRow.find('[data-testid="delete-part"]').trigger('click');
    await flushPromises();
    const confirm = [...document.body.querySelectorAll<HTMLButtonElement>('.ant-popover button')].find((b) => b.textContent?.includes('Delete'))!;
    confirm.click();
    await flushPromises();
    expect(deletePart).toHaveBeenCalledWith(ORG_A, HANDSET);
    const alert = wrapper.find('[data-testid="parts-action-error"]');
    expect(alert.text()).toContain('Handset is still in a parts kit');
    expect(alert.text()).toContain('Remote-control kit fitting');
  });
});

describe('Dashboard low-stock card', { timeout: 30_000 }, () => {
  beforeEach(() => {
    localStorage.clear();
    document.body.innerHTML = '';
    setActivePinia(createPinia());
    vi.clearAllMocks();
    vi.mocked(listServiceTypes).mockResolvedValue([]);
    vi.mocked(listCapabilities).mockResolvedValue([]);
    vi.mocked(listParts).mockResolvedValue(parts);
  });

  it('lists the parts at or below the threshold with a link to the parts list', async () => {
    signedIn('technician');
    const wrapper = await mountAt('/dashboard', Dashboard);
    const card = wrapper.find('[data-testid="low-stock-card"]');
    expect(card.text()).toContain('Fuse tap with 1 A fuse');
    expect(card.text()).toContain('3 left');
    expect(card.text()).not.toContain('Remote receiver');
    expect(card.find('a').attributes('href')).toBe('/parts');
  });

  it('shows nothing when no part runs low', async () => {
    vi.mocked(listParts).mockResolvedValue(parts.map((p) => ({ ...p, stock: 10 })));
    signedIn('technician');
    const wrapper = await mountAt('/dashboard', Dashboard);
    expect(listParts).toHaveBeenCalled();
    expect(wrapper.find('[data-testid="low-stock-card"]').exists()).toBe(false);
  });

  it('does not look at parts before the organisation is approved', async () => {
    signedIn('partner_admin', 'draft');
    const wrapper = await mountAt('/dashboard', Dashboard);
    expect(wrapper.find('[data-testid="low-stock-card"]').exists()).toBe(false);
    expect(listParts).not.toHaveBeenCalled();
  });
});
