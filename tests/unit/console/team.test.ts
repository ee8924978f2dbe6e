// Team page: members and invitations for everyone in the organisation; actions for partner admins only.
import { beforeEach, describe, expect, it, vi } from 'vitest';
import { flushPromises, mount } from '@vue/test-utils';
import { createPinia, setActivePinia } from 'pinia';
import { createMemoryHistory } from 'vue-router';
import type { MemberRole } from '@emberline/domain';
import { refreshSession } from '@/api/auth';
import { changeMemberRole, getTeam, inviteMember, removeMember, revokeInvitation } from '@/api/team';
import { i18n } from '@/locales';
import { createAppRouter } from '@/router';
import Team from '@/views/team/index.vue';
import { ORG_A, me, member, problem, session, team } from './fixtures';

vi.mock('@/api/auth', () => ({ refreshSession: vi.fn(), signIn: vi.fn(), signOut: vi.fn() }));
vi.mock('@/api/team', () => ({
  getTeam: vi.fn(),
  inviteMember: vi.fn(),
  revokeInvitation: vi.fn(),
  changeMemberRole: vi.fn(),
  removeMember: vi.fn(),
}));

async function mountTeam(role: MemberRole) {
  vi.mocked(refreshSession).mockResolvedValue(session(me({ memberships: [member(role)] })));
  const router = createAppRouter(createMemoryHistory());
  await router.push('/team');
  await router.isReady();
  const wrapper = mount(Team, { global: { plugins: [router, i18n] }, attachTo: document.body });
  await flushPromises();
  return wrapper;
}

const rowsOf = (wrapper: ReturnType<typeof mount>, section: string) =>
  wrapper.find(`section[aria-labelledby="${section}"]`).findAll('tbody tr.ant-table-row');

describe('Console team page', () => {
  beforeEach(() => {
    localStorage.clear();
    document.body.innerHTML = '';
    setActivePinia(createPinia());
    for (const fn of [refreshSession, getTeam, inviteMember, revokeInvitation, changeMemberRole, removeMember]) vi.mocked(fn).mockReset();
    vi.mocked(getTeam).mockResolvedValue(team);
  });

  it('lists members and pending invitations of the current organisation', async () => {
    const wrapper = await mountTeam('technician');
    expect(getTeam).toHaveBeenCalledWith(ORG_A, expect.anything());
    const members = rowsOf(wrapper, 'members-heading');
    expect(members).toHaveLength(2);
    const first = members[0]!.findAll('td').map((td) => td.text());
    expect(first[0]).toContain('Mara Kessel');
    expect(first[1]).toBe('mara@partner.example');
    expect(first[2]).toBe('Partner admin');
    expect(first[3]).toBe('12 Jan 2026');
    expect(members[1]!.find('[data-role="technician"]').text()).toBe('Technician');
    const invitations = rowsOf(wrapper, 'invitations-heading');
    expect(invitations).toHaveLength(1);
    const cells = invitations[0]!.findAll('td').map((td) => td.text());
    expect(cells.slice(0, 3)).toEqual(['new.tech@partner.example', 'Technician', 'Mara Kessel']);
    expect(cells[3]).toContain('8 Mar 2026');
  });

  it('shows a technician the team without any actions', async () => {
    const wrapper = await mountTeam('technician');
    expect(wrapper.findAll('thead th').map((th) => th.text())).not.toContain('Actions');
    expect(wrapper.find('[data-testid="change-role"]').exists()).toBe(false);
    expect(wrapper.find('[data-testid="remove-member"]').exists()).toBe(false);
    expect(wrapper.find('[data-testid="withdraw-invitation"]').exists()).toBe(false);
    expect(wrapper.find('section[aria-labelledby="invite-heading"] form').exists()).toBe(false);
    expect(wrapper.text()).toContain('Partner admins manage the team.');
  });

  it('gives a partner admin role changes, removal, withdrawal and the invite form', async () => {
    const wrapper = await mountTeam('partner_admin');
    expect(wrapper.findAll('[data-testid="change-role"]')).toHaveLength(2);
    expect(wrapper.findAll('[data-testid="remove-member"]')).toHaveLength(2);
    expect(wrapper.find('[data-testid="remove-member"]').attributes('aria-label')).toBe('Remove Mara Kessel');
    expect(wrapper.findAll('[data-testid="withdraw-invitation"]')).toHaveLength(1);
    const invite = wrapper.find('section[aria-labelledby="invite-heading"] form');
    expect(invite.exists()).toBe(true);
    expect(invite.find('label[for="invite_email"]').text()).toBe('E-mail address');
  });

  it('asks for the invitee\'s e-mail address, not the inviter\'s own', async () => {
    const wrapper = await mountTeam('partner_admin');
    await wrapper.find('section[aria-labelledby="invite-heading"] form').trigger('submit');
    await flushPromises();
    const item = wrapper.find('label[for="invite_email"]').element.closest('.ant-form-item')!;
    expect(item.textContent).toContain('Enter the e-mail address of the person you are inviting');
    expect(item.textContent).not.toContain('your e-mail');
    expect(inviteMember).not.toHaveBeenCalled();
  });

  it('shows the LAST_ADMIN refusal when removing the only partner admin', async () => {
    vi.mocked(removeMember).mockRejectedValue(problem(409, 'LAST_ADMIN', 'An organisation needs at least one partner admin.'));
    const wrapper = await mountTeam('partner_admin');
    await wrapper.find('[data-testid="remove-member"]').trigger('click');
    await flushPromises();
    const confirm = document.body.querySelector<HTMLButtonElement>('.ant-popconfirm .ant-btn-dangerous');
    expect(confirm?.textContent).toContain('Remove');
    confirm!.click();
    await flushPromises();
    expect(removeMember).toHaveBeenCalledWith(ORG_A, team.members[0]!.userId);
    const alert = wrapper.find('[data-testid="team-action-error"]');
    expect(alert.exists()).toBe(true);
    expect(alert.attributes('role')).toBe('alert');
    expect(alert.text()).toContain('An organisation needs at least one partner admin.');
    // The team is unchanged.
    expect(rowsOf(wrapper, 'members-heading')).toHaveLength(2);
  });

  it('shows the server field error next to the e-mail when inviting fails validation', async () => {
    vi.mocked(inviteMember).mockRejectedValue(problem(400, 'VALIDATION_FAILED', 'Check the fields.', [{ path: 'email', message: 'This address already has an invitation' }]));
    const wrapper = await mountTeam('partner_admin');
    await wrapper.find('input#invite_email').setValue('jonas@partner.example');
    await wrapper.find('section[aria-labelledby="invite-heading"] form').trigger('submit');
    await flushPromises();
    expect(inviteMember).toHaveBeenCalledWith(ORG_A, { email: 'jonas@partner.example', role: 'technician' });
    expect(wrapper.find('section[aria-labelledby="invite-heading"] form').text()).toContain('This address already has an invitation');
  });
});
