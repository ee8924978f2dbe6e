// The Console's one guard: restore first, then meta.roles; guests to sign-in with redirect.
import { beforeEach, describe, expect, it, vi } from 'vitest';
import { createPinia, setActivePinia } from 'pinia';
import { createMemoryHistory } from 'vue-router';
import { refreshSession } from '@/api/auth';
import { createAppRouter } from '@/router';
import { me, member, session, signedOut } from './fixtures';

vi.mock('@/api/auth', () => ({ refreshSession: vi.fn(), signIn: vi.fn(), signOut: vi.fn() }));

describe('Console route guard', () => {
  beforeEach(() => {
    localStorage.clear();
    setActivePinia(createPinia());
    vi.mocked(refreshSession).mockReset();
  });

  it('sends a signed-out visitor of a protected page to sign-in with a redirect back', async () => {
    vi.mocked(refreshSession).mockRejectedValue(signedOut());
    const router = createAppRouter(createMemoryHistory());
    await router.push('/team');
    expect(router.currentRoute.value.name).toBe('sign-in');
    expect(router.currentRoute.value.query).toEqual({ redirect: '/team' });
    expect(refreshSession).toHaveBeenCalledTimes(1);
  });

  it('lets public pages through for signed-out visitors', async () => {
    vi.mocked(refreshSession).mockRejectedValue(signedOut());
    const router = createAppRouter(createMemoryHistory());
    await router.push('/dashboard');
    expect(router.currentRoute.value.name).toBe('dashboard');
  });

  it('opens the page once the restored session holds a required role', async () => {
    vi.mocked(refreshSession).mockResolvedValue(session(me({ memberships: [member('technician')] })));
    const router = createAppRouter(createMemoryHistory());
    await router.push('/team');
    expect(router.currentRoute.value.name).toBe('team');
  });

  it('sends a signed-in user without the role to the no-access page, not to sign-in', async () => {
    vi.mocked(refreshSession).mockResolvedValue(session(me({ memberships: [member('technician')] })));
    const router = createAppRouter(createMemoryHistory());
    await router.push('/admin/mail-log');
    expect(router.currentRoute.value.name).toBe('no-access');
    expect(router.currentRoute.value.query.page).toBe('mail-log');
  });

  it('takes signed-in users from sign-in to where they were going, or the dashboard', async () => {
    vi.mocked(refreshSession).mockResolvedValue(session(me({ roles: ['network_admin'] })));
    const router = createAppRouter(createMemoryHistory());
    await router.push('/sign-in');
    expect(router.currentRoute.value.name).toBe('dashboard');
    await router.push('/sign-in?redirect=/admin/mail-log');
    expect(router.currentRoute.value.name).toBe('mail-log');
    await router.push('/sign-in?redirect=//elsewhere.example/');
    expect(router.currentRoute.value.name).toBe('dashboard');
  });
});
