// Admin review of one application: only the decisions its status allows; request changes sends
// the message and per-field notes.
import { beforeEach, describe, expect, it, vi } from 'vitest';
import { flushPromises, mount } from '@vue/test-utils';
import { createPinia, setActivePinia } from 'pinia';
import { createMemoryHistory } from 'vue-router';
import type { AuditEntry, OrganisationStatus } from '@emberline/domain';
import { refreshSession } from '@/api/auth';
import { decide, getApplicationReview } from '@/api/onboarding';
import { i18n } from '@/locales';
import { createAppRouter } from '@/router';
import ReviewPage from '@/views/admin/application-review/index.vue';
import { ORG_A, me, session } from './fixtures';
import { application, business } from './onboarding-fixtures';

vi.mock('@/api/auth', () => ({ refreshSession: vi.fn(), signIn: vi.fn(), signOut: vi.fn() }));
vi.mock('@/api/onboarding', () => ({ getApplicationReview: vi.fn(), saveReview: vi.fn(), decide: vi.fn(), fetchDocumentBlob: vi.fn(), deleteDocument: vi.fn() }));
vi.mock('@emberline/ui/area-map', () => ({ __esModule: true, default: { name: 'AreaMapStub', render: () => null } }));

async function mountReview(status: OrganisationStatus, history: AuditEntry[] = []) {
  vi.mocked(refreshSession).mockResolvedValue(session(me({ roles: ['network_admin'] })));
  vi.mocked(getApplicationReview).mockResolvedValue({ application: application({ status, business, editable: false }), checklist: null, internalNotes: '', history });
  const router = createAppRouter(createMemoryHistory());
  await router.push(`/admin/applications/${ORG_A}`);
  await router.isReady();
  const wrapper = mount(ReviewPage, { props: { orgId: ORG_A }, global: { plugins: [router, i18n] }, attachTo: document.body });
  await flushPromises();
  return wrapper;
}

const offered = (wrapper: Awaited<ReturnType<typeof mountReview>>) => wrapper.findAll('[data-decision]').map((r) => r.attributes('data-decision'));

describe('Application review', () => {
  beforeEach(() => {
    localStorage.clear();
    document.body.innerHTML = '';
    setActivePinia(createPinia());
    vi.clearAllMocks();
  });

  it('offers approve, request changes and reject for a submitted application', async () => {
    const wrapper = await mountReview('submitted');
    expect(getApplicationReview).toHaveBeenCalledWith(ORG_A, expect.anything());
    expect(offered(wrapper)).toEqual(['approve', 'request_changes', 'reject']);
  });

  it('offers only suspend for an approved organisation and only reinstate for a suspended one', async () => {
    expect(offered(await mountReview('approved'))).toEqual(['suspend']);
    document.body.innerHTML = '';
    expect(offered(await mountReview('suspended'))).toEqual(['reinstate']);
  });

  it('shows the history in words: who acted by name, the decision and the admin\'s message', async () => {
    const entry = (id: string, action: string, createdAt: string, actor: { id: string | null; name: string | null }, after: unknown = null): AuditEntry => ({
      id, actorUserId: actor.id, actorName: actor.name, action, entityType: 'organisation', entityId: ORG_A, organisationId: ORG_A, before: null, after, createdAt,
    });
    const admin = { id: '3c5b9a0e-1f2d-4c3b-8a7e-6d5c4b3a2f10', name: 'Vera Lindqvist' };
    const wrapper = await mountReview('changes_requested', [
      entry('1', 'application.submit', '2026-03-01T09:00:00.000Z', { id: '7a1e0c52-0b8d-4f6e-9c3a-2d4b6e8f0a12', name: 'Lukas Moser' }),
      entry('2', 'application.request-changes', '2026-03-02T09:00:00.000Z', admin, { status: 'changes_requested', changeRequest: { message: 'Please upload the insurance certificate for mobile work.', fields: [] } }),
      entry('3', 'organisation.suspend', '2026-03-03T09:00:00.000Z', { id: null, name: null }, { status: 'suspended', statusReason: 'Insurance expired' }),
      entry('4', 'booking.frobnicate', '2026-03-04T09:00:00.000Z', { id: 'deadbeef-0000-4000-8000-000000000000', name: null }),
    ]);
    const items = wrapper.findAll('.history li').map((li) => li.text());
    expect(items).toHaveLength(4);
    expect(items[0]).toContain('Other change (booking.frobnicate)');
    expect(items[0]).toContain('by a former user');
    expect(items[1]).toContain('Suspended');
    expect(items[1]).toContain('by the system');
    expect(items[1]).toContain('Insurance expired');
    expect(items[2]).toContain('Changes requested');
    expect(items[2]).toContain('by Vera Lindqvist');
    expect(items[2]).toContain('Please upload the insurance certificate for mobile work.');
    expect(items[3]).toContain('Application submitted');
    expect(items[3]).toContain('by Lukas Moser');
    for (const text of items) expect(text).not.toMatch(/3c5b|application\.request-changes/);
  });

  it('offers no decision for a draft', async () => {
    const wrapper = await mountReview('draft');
    expect(offered(wrapper)).toEqual([]);
    expect(wrapper.find('[data-testid="no-decisions"]').exists()).toBe(true);
  });

  it('sends request changes with the message and the per-field notes after confirming', async () => {
    vi.mocked(decide).mockResolvedValue({ application: application({ status: 'changes_requested', business, editable: false }), checklist: null, internalNotes: '', history: [] });
    const wrapper = await mountReview('in_review');
    await wrapper.find('[data-decision="request_changes"] input').setValue(true);
    await wrapper.find('[data-testid="decision-message"]').setValue('Two things need fixing.');
    await wrapper.find('[data-testid="add-note"]').trigger('click');
    const row = wrapper.find('[data-testid="field-note-row"]');
    await row.find('select').setValue('business.vatId');
    await row.find('input').setValue('Add the VAT ID with its country prefix');
    await wrapper.find('[data-testid="send-decision"]').trigger('click');
    await flushPromises();
    expect(decide).not.toHaveBeenCalled();
    document.body.querySelector<HTMLButtonElement>('.ant-popconfirm .ant-btn-primary')!.click();
    await flushPromises();
    expect(decide).toHaveBeenCalledWith(ORG_A, {
      decision: 'request_changes',
      message: 'Two things need fixing.',
      fields: { 'business.vatId': 'Add the VAT ID with its country prefix' },
    });
  });

  it('shows only the error, not the confirmation, when the message is missing; the confirmation opens once it is written', async () => {
    const wrapper = await mountReview('in_review');
    await wrapper.find('[data-decision="request_changes"] input').setValue(true);
    await wrapper.find('[data-testid="send-decision"]').trigger('click');
    await flushPromises();
    expect(wrapper.text()).toContain('Tell the partner why');
    // the confirmation is drawn on first opening: none at all means it never opened
    const confirmations = () => document.body.querySelectorAll('.ant-popconfirm');
    expect(confirmations()).toHaveLength(0);
    await wrapper.find('[data-testid="decision-message"]').setValue('Please add the VAT ID.');
    await wrapper.find('[data-testid="send-decision"]').trigger('click');
    await flushPromises();
    expect(confirmations()).toHaveLength(1);
  });

  it('refuses a rejection without a reason', async () => {
    const wrapper = await mountReview('submitted');
    await wrapper.find('[data-decision="reject"] input').setValue(true);
    await wrapper.find('[data-testid="send-decision"]').trigger('click');
    await flushPromises();
    // nothing to confirm: the error alone is shown
    expect(document.body.querySelector('.ant-popconfirm')).toBeNull();
    expect(decide).not.toHaveBeenCalled();
    expect(wrapper.text()).toContain('Tell the partner why');
  });
});
