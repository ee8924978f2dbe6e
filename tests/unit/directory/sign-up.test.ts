// Owner sign-up: the shared password rules block weak passwords before any request, the
// server's field errors show beside their fields, success leads to "check your inbox".
import { beforeEach, describe, expect, it, vi } from 'vitest';
import { flushPromises, mount } from '@vue/test-utils';
import { createPinia, setActivePinia } from 'pinia';
import { defineComponent, h } from 'vue';
import { createMemoryHistory, RouterView } from 'vue-router';
import { ApiError } from '@emberline/api-client';
import { refreshSession, resendVerification, signUp } from '@/api/auth';
import { i18n } from '@/locales';
import { createAppRouter } from '@/router';

vi.mock('@/api/auth', () => ({ refreshSession: vi.fn(), signUp: vi.fn(), resendVerification: vi.fn(), signIn: vi.fn(), signOut: vi.fn() }));

const Shell = defineComponent({ render: () => h(RouterView) });

async function mountSignUp() {
  const router = createAppRouter(createMemoryHistory());
  await router.push('/sign-up');
  await router.isReady();
  const wrapper = mount(Shell, { global: { plugins: [router, i18n] } });
  await flushPromises();
  return { wrapper, router };
}

async function fill(wrapper: Awaited<ReturnType<typeof mountSignUp>>['wrapper'], values: { name: string; email: string; password: string }) {
  await wrapper.find('input#owner-sign-up_name').setValue(values.name);
  await wrapper.find('input#owner-sign-up_email').setValue(values.email);
  await wrapper.find('input#owner-sign-up_password').setValue(values.password);
  await wrapper.find('form').trigger('submit');
  await flushPromises();
}

const fieldOf = (wrapper: Awaited<ReturnType<typeof mountSignUp>>['wrapper'], name: string) =>
  wrapper.find(`label[for="owner-sign-up_${name}"]`).element.closest('.ant-form-item')!;

describe('Directory sign-up', () => {
  beforeEach(() => {
    setActivePinia(createPinia());
    vi.mocked(refreshSession).mockReset().mockRejectedValue(new ApiError({ type: 'about:blank', title: 'Signed out', status: 401, code: 'SESSION_EXPIRED' }));
    vi.mocked(signUp).mockReset();
    vi.mocked(resendVerification).mockReset();
  });

  it('labels every field and states the password rules beside the password', async () => {
    const { wrapper } = await mountSignUp();
    for (const field of ['name', 'email', 'password']) expect(wrapper.find(`label[for="owner-sign-up_${field}"]`).exists()).toBe(true);
    const hintId = wrapper.find('input#owner-sign-up_password').attributes('aria-describedby');
    expect(wrapper.find(`#${hintId}`).text()).toBe('At least 10 characters, not your e-mail address, not a common password.');
  });

  it('blocks a weak password on the client, without calling the API', async () => {
    const { wrapper } = await mountSignUp();
    await fill(wrapper, { name: 'Ida Winter', email: 'ida@owners.example', password: 'password1' });
    expect(signUp).not.toHaveBeenCalled();
    expect(fieldOf(wrapper, 'password').textContent).toContain('Use at least 10 characters');
    expect(wrapper.find('input#owner-sign-up_password').attributes('aria-invalid')).toBe('true');

    await fill(wrapper, { name: 'Ida Winter', email: 'ida@owners.example', password: 'Password2026!' });
    expect(signUp).not.toHaveBeenCalled();
    expect(fieldOf(wrapper, 'password').textContent).toContain('This password is too common');

    await fill(wrapper, { name: 'Ida Winter', email: 'ida.winter@owners.example', password: 'ida.winter@owners.example' });
    expect(signUp).not.toHaveBeenCalled();
    expect(fieldOf(wrapper, 'password').textContent).toContain('Your password must not be your e-mail address');
  });

  it("shows the server's field errors next to their fields", async () => {
    vi.mocked(signUp).mockRejectedValue(
      new ApiError({
        type: 'about:blank',
        title: 'Some fields need attention',
        status: 400,
        code: 'VALIDATION_FAILED',
        errors: [{ path: 'email', message: 'This domain does not receive e-mail' }],
      }),
    );
    const { wrapper } = await mountSignUp();
    await fill(wrapper, { name: 'Ida Winter', email: 'ida@nowhere.example', password: 'kettle-birch-lantern' });
    expect(signUp).toHaveBeenCalledWith({ name: 'Ida Winter', email: 'ida@nowhere.example', password: 'kettle-birch-lantern', locale: 'en' });
    expect(fieldOf(wrapper, 'email').textContent).toContain('This domain does not receive e-mail');
    expect(fieldOf(wrapper, 'email').querySelector('[role="alert"]')).not.toBeNull();
    expect(fieldOf(wrapper, 'password').textContent).not.toContain('This domain');
  });

  it('shows other problems in an alert with their detail', async () => {
    vi.mocked(signUp).mockRejectedValue(new ApiError({ type: 'about:blank', title: 'Too many requests', status: 429, code: 'TOO_MANY_REQUESTS', detail: 'Try again in 10 minutes.' }));
    const { wrapper } = await mountSignUp();
    await fill(wrapper, { name: 'Ida Winter', email: 'ida@owners.example', password: 'kettle-birch-lantern' });
    expect(wrapper.find('.ant-alert-error').text()).toContain('Try again in 10 minutes.');
  });

  it('asks the owner to check their inbox after signing up, with a resend option', async () => {
    vi.mocked(signUp).mockResolvedValue({ accepted: true, message: 'Check your inbox' });
    vi.mocked(resendVerification).mockResolvedValue({ accepted: true, message: 'Sent' });
    const { wrapper, router } = await mountSignUp();
    await fill(wrapper, { name: 'Ida Winter', email: 'Ida@Owners.example', password: 'kettle-birch-lantern' });
    await vi.waitFor(() => expect(router.currentRoute.value.name).toBe('check-inbox'));
    await flushPromises();
    expect(wrapper.find('h1').text()).toBe('Check your inbox');
    expect(wrapper.text()).toContain('We have sent a confirmation link to ida@owners.example.');
    await wrapper.find('form').trigger('submit');
    await flushPromises();
    expect(resendVerification).toHaveBeenCalledWith('ida@owners.example');
    expect(wrapper.find('[role="status"].account-form__status').text()).toContain('we have sent it a new link');
  });
});
