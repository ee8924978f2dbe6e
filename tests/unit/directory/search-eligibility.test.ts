// A service that does not fit this vehicle says so and offers the one that does; it no longer
// lists the extra time and parts that would only come with doing it.
import { describe, expect, it } from 'vitest';
import { mount } from '@vue/test-utils';
import type { EligibilityResult } from '@emberline/domain';
import { i18n } from '@/locales';
import SearchEligibility from '@/views/search/search-eligibility.vue';

const result = (overrides: Partial<EligibilityResult>): EligibilityResult => ({
  serviceTypeCode: 'remote-start-conversion',
  eligible: true,
  requiredCapabilities: [],
  extraMinutes: 45,
  durationMinutes: 165,
  extraParts: [{ description: 'Fuse tap', quantity: 1 }],
  warnings: [{ ruleCode: 'climate-panel-extra-wiring', severity: 'notice', message: 'This climate panel needs one more wire.', suggestServiceTypes: [] }],
  unknown: [],
  ...overrides,
});
const mountWith = (eligibility: EligibilityResult) =>
  mount(SearchEligibility, { props: { eligibility, serviceNames: { 'aux-remote-start': 'Remote start for a parking heater' }, serviceName: 'Remote start conversion' }, global: { plugins: [i18n] } });

describe('search eligibility', () => {
  it('shows the extra time and parts of a service that fits', () => {
    const w = mountWith(result({}));
    const notice = w.find('[data-testid="eligibility-notice"]');
    expect(notice.text()).toContain('This adds about 45 mins');
    expect(notice.text()).toContain('Fuse tap');
  });

  it('shows only the refusal and the switch for a service that does not fit', () => {
    const w = mountWith(
      result({
        eligible: false,
        warnings: [
          { ruleCode: 'needs-factory-heater', severity: 'block', message: 'This van has no factory heater to convert.', suggestServiceTypes: ['aux-remote-start'] },
          { ruleCode: 'climate-panel-extra-wiring', severity: 'notice', message: 'This climate panel needs one more wire.', suggestServiceTypes: [] },
        ],
      }),
    );
    expect(w.find('[data-testid="eligibility-block"]').text()).toContain('Remote start conversion does not fit this vehicle');
    expect(w.find('[data-suggest="aux-remote-start"]').exists()).toBe(true);
    expect(w.find('[data-testid="eligibility-notice"]').exists()).toBe(false);
    expect(w.text()).not.toContain('This adds about');
    expect(w.text()).not.toContain('Fuse tap');
  });
});
