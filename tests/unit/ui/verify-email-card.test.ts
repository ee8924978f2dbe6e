// VerifyEmailCard: opening a confirmation link confirms the address once and hands the session
// to the app; a used link, or none, offers a new one instead.
import { describe, expect, it, vi } from 'vitest';
import { flushPromises, mount } from '@vue/test-utils';
import { createI18n } from 'vue-i18n';
import { ApiError } from '@emberline/api-client';
import type { Session } from '@emberline/domain';
import VerifyEmailCard from '../../../packages/ui/src/components/account/verify-email-card.vue';
import sharedEn from '../../../packages/ui/src/locales/en';

const session: Session = {
  accessToken: 'access-1',
  expiresIn: 900,
  user: { id: '939bd5f8-c1a7-4b68-8087-035df3220c08', email: 'ella@owners.example', name: 'Ella Owner', locale: 'en', emailVerified: true, roles: ['owner'], memberships: [] },
};

async function mountCard(token: string, verify: (token: string) => Promise<Session>) {
  const i18n = createI18n({ legacy: false, locale: 'en', messages: { en: sharedEn } });
  const wrapper = mount(VerifyEmailCard, {
    props: { token, verify, resend: vi.fn().mockResolvedValue({ accepted: true, message: 'Sent' }) },
    slots: { links: '<a href="/next" class="next">Go on</a>' },
    global: { plugins: [i18n] },
  });
  await flushPromises();
  return wrapper;
}

describe('VerifyEmailCard', () => {
  it('confirms the token once, hands over the session and greets the user with the next links', async () => {
    const verify = vi.fn().mockResolvedValue(session);
    const wrapper = await mountCard('token-1', verify);
    expect(verify).toHaveBeenCalledTimes(1);
    expect(verify).toHaveBeenCalledWith('token-1');
    expect(wrapper.emitted('verified')).toEqual([[session]]);
    expect(wrapper.find('h1').text()).toBe('Your e-mail address is confirmed');
    expect(wrapper.find('[role="status"]').text()).toContain('Welcome, Ella Owner.');
    expect(wrapper.find('.account-card__links .next').exists()).toBe(true);
  });

  it('offers a new link when the link was used already', async () => {
    const used = new ApiError({ type: 'about:blank', title: 'Invalid link', status: 400, code: 'INVALID_TOKEN' });
    const wrapper = await mountCard('token-1', vi.fn().mockRejectedValue(used));
    expect(wrapper.emitted('verified')).toBeUndefined();
    expect(wrapper.find('h1').text()).toBe('This link no longer works');
    expect(wrapper.find('input#verify-resend_email').exists()).toBe(true);
    expect(wrapper.find('.ant-alert-error').exists()).toBe(false);
    expect(wrapper.find('.next').exists()).toBe(false);
  });

  it('says when the server failed, and asks nothing of the API without a token', async () => {
    const down = new ApiError({ type: 'about:blank', title: 'Server error', status: 503, code: 'UNAVAILABLE', detail: 'Try again shortly.' });
    const failing = await mountCard('token-1', vi.fn().mockRejectedValue(down));
    expect(failing.find('.ant-alert-error').text()).toContain('This could not be loaded');

    const verify = vi.fn();
    const empty = await mountCard('', verify);
    expect(verify).not.toHaveBeenCalled();
    expect(empty.find('h1').text()).toBe('This link no longer works');
  });
});
