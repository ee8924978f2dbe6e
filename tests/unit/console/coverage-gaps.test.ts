// Coverage gaps for network admins: the table of ~10 km cells, the total and the filters.
import { beforeEach, describe, expect, it, vi } from 'vitest';
import { flushPromises, mount } from '@vue/test-utils';
import { createPinia, setActivePinia } from 'pinia';
import { i18n } from '@/locales';
import { getCoverageGaps } from '@/api/search-admin';
import { listCapabilities, listServiceTypes } from '@/api/catalogue';
import CoverageGaps from '@/views/admin/coverage-gaps/index.vue';

vi.mock('@/api/search-admin', () => ({ getCoverageGaps: vi.fn() }));
vi.mock('@/api/catalogue', () => ({ listCapabilities: vi.fn(), listServiceTypes: vi.fn() }));
vi.mock('@emberline/ui/demand-map', () => ({ __esModule: true, default: { props: ['points', 'label', 'selectedKey', 'tileUrl', 'tileAttribution'], template: '<div data-testid="demand-map">{{ points.length }} points</div>' } }));

const linzCell = { lat: 48.3111, lng: 14.2904, serviceTypeCode: 'parking-conversion-auto', searches: 4, alerts: 1, lastSearchedAt: '2026-11-28T09:00:00.000Z' };

describe('Coverage gaps', () => {
  beforeEach(() => {
    setActivePinia(createPinia());
    vi.clearAllMocks();
    vi.mocked(listServiceTypes).mockResolvedValue([{ code: 'parking-conversion-auto', name: 'Conversion (automatic)', summary: '', description: '', defaultDurationMinutes: 90, requiredCapabilities: [], cautions: [], retired: false }]);
    vi.mocked(listCapabilities).mockResolvedValue([]);
  });

  it('lists cells with their counts and a link to the Directory search for that place', async () => {
    vi.mocked(getCoverageGaps).mockResolvedValue({ data: [linzCell, { ...linzCell, serviceTypeCode: 'handset-pairing', searches: 2, alerts: 0 }], meta: { days: 90, totalSearches: 6 } });
    const wrapper = mount(CoverageGaps, { global: { plugins: [i18n] } });
    await flushPromises();
    expect(wrapper.find('[data-testid="gaps-total"]').text()).toBe('6 unanswered searches in the last 90 days');
    const table = wrapper.find('[data-testid="gaps-table"]').text();
    expect(table).toContain('Conversion (automatic)');
    expect(table).toContain('48.31°, 14.29°');
    const link = wrapper.find('a[href*="/search?"]').attributes('href')!;
    expect(new URL(link, 'http://x').searchParams.get('service')).toBe('parking-conversion-auto');
  });

  it('asks again when the period changes, and says so when nothing is unanswered', async () => {
    vi.mocked(getCoverageGaps).mockResolvedValue({ data: [], meta: { days: 90, totalSearches: 0 } });
    const wrapper = mount(CoverageGaps, { global: { plugins: [i18n] } });
    await flushPromises();
    expect(wrapper.text()).toContain('No unanswered searches');
    await wrapper.find('select').setValue('30');
    await flushPromises();
    expect(getCoverageGaps).toHaveBeenLastCalledWith({ days: 30, serviceType: undefined }, expect.anything());
  });
});
