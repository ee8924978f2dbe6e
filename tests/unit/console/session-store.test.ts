// Console session store: restore at start, one refresh at a time, organisation choice, sign-out.
import { beforeEach, describe, expect, it, vi } from 'vitest';
import { createPinia, setActivePinia } from 'pinia';
import type { Session } from '@emberline/domain';
import { refreshSession, signIn, signOut } from '@/api/auth';
import { useSessionStore } from '@/stores/session';
import { ORG_A, ORG_B, me, member, session, signedOut } from './fixtures';

vi.mock('@/api/auth', () => ({ refreshSession: vi.fn(), signIn: vi.fn(), signOut: vi.fn() }));

describe('Console session store', () => {
  beforeEach(() => {
    localStorage.clear();
    setActivePinia(createPinia());
    vi.mocked(refreshSession).mockReset();
    vi.mocked(signIn).mockReset();
    vi.mocked(signOut).mockReset().mockResolvedValue({ accepted: true, message: 'Signed out' });
  });

  it('restores a session from the refresh cookie and derives the roles', async () => {
    vi.mocked(refreshSession).mockResolvedValue(session(me({ roles: ['network_admin'], memberships: [member('technician')] })));
    const store = useSessionStore();
    await store.restore();
    expect(store.isSignedIn).toBe(true);
    expect(store.accessToken).toBe('access-1');
    expect(store.currentOrganisationId).toBe(ORG_A);
    expect([...store.roles].sort()).toEqual(['network_admin', 'technician']);
    expect(store.hasAnyRole(['partner_admin'])).toBe(false);
    expect(store.hasAnyRole(['partner_admin', 'technician'])).toBe(true);
  });

  it('treats a 401 on restore as signed out, and restores only once', async () => {
    vi.mocked(refreshSession).mockRejectedValue(signedOut());
    const store = useSessionStore();
    await expect(store.restore()).resolves.toBeUndefined();
    await store.restore();
    expect(store.isSignedIn).toBe(false);
    expect(store.roles).toEqual([]);
    expect(refreshSession).toHaveBeenCalledTimes(1);
  });

  it('does not ask the server at start-up when the browser holds no session', async () => {
    document.cookie = 'emberline_session=; expires=Thu, 01 Jan 1970 00:00:00 GMT; path=/';
    const store = useSessionStore();
    await store.restore();
    expect(refreshSession).not.toHaveBeenCalled();
    expect(store.isSignedIn).toBe(false);
  });

  it('shares one refresh request between concurrent callers', async () => {
    let answer!: (s: Session) => void;
    vi.mocked(refreshSession).mockReturnValueOnce(new Promise((resolve) => (answer = resolve)));
    const store = useSessionStore();
    const calls = [store.refresh(), store.refresh(), store.restore(), store.refresh()];
    expect(refreshSession).toHaveBeenCalledTimes(1);
    answer(session(me({ memberships: [member('partner_admin')] }), 'access-2'));
    const results = await Promise.all(calls);
    expect(results).toEqual([true, true, undefined, true]);
    expect(store.accessToken).toBe('access-2');

    // Once settled, the next refresh is a new request (with the rotated cookie).
    vi.mocked(refreshSession).mockResolvedValueOnce(session(me({ memberships: [member('partner_admin')] }), 'access-3'));
    await store.refresh();
    expect(refreshSession).toHaveBeenCalledTimes(2);
    expect(store.accessToken).toBe('access-3');
  });

  it('signs out: clears user and token even when the server call fails', async () => {
    vi.mocked(signIn).mockResolvedValue(session(me({ memberships: [member('partner_admin')] })));
    vi.mocked(signOut).mockRejectedValue(signedOut());
    const store = useSessionStore();
    await store.signIn({ email: 'mara@partner.example', password: 'a long passphrase' });
    expect(store.isSignedIn).toBe(true);
    await store.signOut();
    expect(signOut).toHaveBeenCalledTimes(1);
    expect(store.user).toBeNull();
    expect(store.accessToken).toBeNull();
    expect(store.roles).toEqual([]);
  });

  it('switches organisation, remembers the choice and ignores organisations the user is not in', async () => {
    const user = me({ memberships: [member('partner_admin', ORG_A, 'Ember Vans North'), member('technician', ORG_B, 'Coolant Crew South')] });
    vi.mocked(refreshSession).mockResolvedValue(session(user));
    const store = useSessionStore();
    await store.restore();
    expect(store.currentOrganisationId).toBe(ORG_A);
    store.switchOrganisation(ORG_B);
    expect(store.currentOrganisationId).toBe(ORG_B);
    expect(store.roles).toEqual(['technician']);
    expect(localStorage.getItem('emberline.console.organisation')).toBe(ORG_B);
    store.switchOrganisation('00000000-0000-4000-8000-000000000000');
    expect(store.currentOrganisationId).toBe(ORG_B);

    // A fresh page load picks the remembered organisation.
    setActivePinia(createPinia());
    const next = useSessionStore();
    await next.restore();
    expect(next.currentOrganisationId).toBe(ORG_B);
  });

  it('falls back to the first membership when the remembered organisation is no longer one', async () => {
    localStorage.setItem('emberline.console.organisation', ORG_B);
    vi.mocked(refreshSession).mockResolvedValue(session(me({ memberships: [member('technician', ORG_A)] })));
    const store = useSessionStore();
    await store.restore();
    expect(store.currentOrganisationId).toBe(ORG_A);
  });
});
