// Mounts the Console dashboard signed in with the given membership and platform roles (the test
// file mocks '@/api/auth' and the APIs the cards call).
import { vi } from 'vitest';
import { flushPromises, mount } from '@vue/test-utils';
import { createMemoryHistory } from 'vue-router';
import type { MemberRole, Role } from '@emberline/domain';
import { refreshSession } from '@/api/auth';
import { i18n } from '@/locales';
import { createAppRouter } from '@/router';
import Dashboard from '@/views/dashboard/index.vue';
import { me, member, session } from './fixtures';

export async function mountDashboard(membership: MemberRole | null, roles: Role[] = []) {
  vi.mocked(refreshSession).mockResolvedValue(session(me({ roles, memberships: membership ? [member(membership)] : [] })));
  const router = createAppRouter(createMemoryHistory());
  await router.push('/dashboard');
  await router.isReady();
  const wrapper = mount(Dashboard, { global: { plugins: [router, i18n] } });
  await flushPromises();
  return wrapper;
}
