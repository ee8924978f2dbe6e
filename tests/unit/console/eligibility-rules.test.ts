// Vehicle rules in the Console: read-only for everyone, edited by network admins with the API's
// schema checked before sending and the server's field errors beside the fields.
import { beforeEach, describe, expect, it, vi } from 'vitest';
import { flushPromises, mount } from '@vue/test-utils';
import { createPinia, setActivePinia } from 'pinia';
import type { EligibilityRuleView } from '@emberline/api-client';
import { i18n } from '@/locales';
import { createEligibilityRule, listEligibilityRules, updateEligibilityRule } from '@/api/search-admin';
import EligibilityRules from '@/views/catalogue/eligibility-rules.vue';
import { problem } from './fixtures';
import { catalogue } from './onboarding-fixtures';

vi.mock('@/api/search-admin', () => ({ listEligibilityRules: vi.fn(), createEligibilityRule: vi.fn(), updateEligibilityRule: vi.fn(), deleteEligibilityRule: vi.fn() }));

const serviceTypes = [
  { code: 'parking-conversion-auto', name: 'Conversion (automatic)', summary: '', description: '', defaultDurationMinutes: 90, requiredCapabilities: [], cautions: [], retired: false },
  { code: 'parking-conversion-manual', name: 'Conversion (manual)', summary: '', description: '', defaultDurationMinutes: 180, requiredCapabilities: [], cautions: [], retired: false },
];
const rule: EligibilityRuleView = {
  code: 'manual-climate-needs-manual-conversion',
  serviceTypes: ['parking-conversion-auto'],
  when: { climateControl: ['manual'] },
  effect: { severity: 'block', message: 'Manual climate control needs the other conversion.', suggestServiceTypes: ['parking-conversion-manual'], addCapabilities: [], extraMinutes: 0, extraParts: [] },
  active: true,
  updatedAt: '2026-12-01T10:00:00.000Z',
};

function mountRules(editable: boolean) {
  return mount(EligibilityRules, { props: { editable, serviceTypes, capabilities: catalogue }, global: { plugins: [i18n] }, attachTo: document.body });
}

describe('Vehicle rules', () => {
  beforeEach(() => {
    document.body.innerHTML = '';
    setActivePinia(createPinia());
    vi.clearAllMocks();
    vi.mocked(listEligibilityRules).mockResolvedValue([rule]);
  });

  it('shows each rule in plain words, without edit buttons for readers', async () => {
    const wrapper = mountRules(false);
    await flushPromises();
    const text = wrapper.text();
    expect(text).toContain('Conversion (automatic)');
    expect(text).toContain('Climate control: manual');
    expect(text).toContain('Does not fit');
    expect(text).toContain('Suggests: Conversion (manual)');
    expect(wrapper.find('[data-testid="add-rule"]').exists()).toBe(false);
  });

  it('switches a rule off by saving it whole with active false', async () => {
    vi.mocked(updateEligibilityRule).mockResolvedValue({ ...rule, active: false });
    const wrapper = mountRules(true);
    await flushPromises();
    const off = wrapper.findAll('button').find((b) => b.text() === 'Switch off')!;
    await off.trigger('click');
    await flushPromises();
    const { updatedAt: _u, ...input } = rule;
    expect(updateEligibilityRule).toHaveBeenCalledWith(rule.code, { ...input, active: false });
  });

  it('refuses a rule without any condition before calling the API, then shows a server field error', async () => {
    const wrapper = mountRules(true);
    await flushPromises();
    await wrapper.find('[data-testid="add-rule"]').trigger('click');
    await flushPromises();
    const form = document.body.querySelector<HTMLFormElement>('[data-testid="rule-form"]')!;
    const code = form.querySelector<HTMLInputElement>('input[type="text"], input:not([type])')!;
    code.value = 'twenty-four-volt-check';
    code.dispatchEvent(new Event('input'));
    const message = form.querySelector<HTMLTextAreaElement>('textarea')!;
    message.value = 'A 24 V van needs parts rated for 24 V.';
    message.dispatchEvent(new Event('input'));
    form.dispatchEvent(new Event('submit'));
    await flushPromises();
    expect(createEligibilityRule).not.toHaveBeenCalled();
    expect(form.textContent).toContain('Give at least one condition');

    // tick "24 V", then the server refuses an unknown capability (as the API would)
    const v24 = [...form.querySelectorAll<HTMLInputElement>('input[type="checkbox"]')].find((i) => i.value === '24')!;
    v24.checked = true;
    v24.dispatchEvent(new Event('change'));
    vi.mocked(createEligibilityRule).mockRejectedValue(problem(400, 'VALIDATION_FAILED', 'Please correct the highlighted fields.', [{ path: 'effect.message', message: 'Say what the owner should do' }]));
    form.dispatchEvent(new Event('submit'));
    await flushPromises();
    expect(createEligibilityRule).toHaveBeenCalledWith(expect.objectContaining({ code: 'twenty-four-volt-check', when: expect.objectContaining({ electricalSystemV: [24] }) }));
    expect(form.textContent).toContain('Say what the owner should do');
    // nothing typed is lost
    expect(form.querySelector<HTMLTextAreaElement>('textarea')!.value).toBe('A 24 V van needs parts rated for 24 V.');
  });
});
