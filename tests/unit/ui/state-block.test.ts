// StateBlock: one component for the loading, empty, error-with-retry and data states.
import { describe, expect, it } from 'vitest';
import { mount } from '@vue/test-utils';
import { createI18n } from 'vue-i18n';
import StateBlock from '../../../packages/ui/src/components/state-block.vue';
import sharedEn from '../../../packages/ui/src/locales/en';

function mountBlock(props: Record<string, unknown>) {
  const i18n = createI18n({ legacy: false, locale: 'en', messages: { en: sharedEn } });
  return mount(StateBlock, {
    props: { loading: false, ...props },
    slots: { default: '<p class="payload">the list</p>', 'empty-action': '<a href="/next" class="next">Do this next</a>' },
    global: { plugins: [i18n] },
  });
}

describe('StateBlock', () => {
  it('shows a loading state with a status message and no data', () => {
    const w = mountBlock({ loading: true, loadingText: 'Loading services…' });
    expect(w.find('[data-state="loading"]').exists()).toBe(true);
    expect(w.find('[role="status"]').text()).toBe('Loading services…');
    expect(w.attributes('aria-busy')).toBe('true');
    expect(w.find('.payload').exists()).toBe(false);
  });

  it('falls back to the shared loading text', () => {
    expect(mountBlock({ loading: true }).find('[role="status"]').text()).toBe('Loading…');
  });

  it('shows the data slot when ready', () => {
    const w = mountBlock({ loading: false, empty: false });
    expect(w.find('.payload').text()).toBe('the list');
    expect(w.find('[data-state]').exists()).toBe(false);
  });

  it('shows an empty state that says what to do next', () => {
    const w = mountBlock({ empty: true, emptyTitle: 'No services yet', emptyText: 'Check back soon.' });
    const empty = w.find('[data-state="empty"]');
    expect(empty.text()).toContain('No services yet');
    expect(empty.text()).toContain('Check back soon.');
    expect(empty.find('a.next').text()).toBe('Do this next');
    expect(w.find('.payload').exists()).toBe(false);
  });

  it('shows an error with a retry button that emits retry', async () => {
    const error = { problem: { type: 'about:blank', title: 'Boom', status: 500, code: 'INTERNAL', requestId: 'req-7' } };
    const w = mountBlock({ error });
    const alert = w.find('[role="alert"]');
    expect(alert.exists()).toBe(true);
    expect(alert.text()).toContain('This could not be loaded');
    expect(alert.text()).toContain('Something went wrong on our side');
    expect(alert.text()).not.toContain('Boom');
    expect(alert.text()).toContain('Reference: req-7');
    await alert.find('button').trigger('click');
    expect(w.emitted('retry')).toHaveLength(1);
  });

  it('prefers the error over a stale loading flag', () => {
    const w = mountBlock({ loading: true, error: new Error('x') });
    expect(w.find('[data-state="error"]').exists()).toBe(true);
  });

  it('explains network errors in its own words and shows client problems as sent', () => {
    const network = mountBlock({ error: { problem: { type: 'about:blank', title: 'x', status: 503, code: 'NETWORK_ERROR' } } });
    expect(network.text()).toContain('We could not reach Emberline');
    const client = mountBlock({ error: { problem: { type: 'about:blank', title: 'Not allowed', status: 403, code: 'FORBIDDEN', detail: 'Ask a network admin.' } } });
    expect(client.text()).toContain('Not allowed');
    expect(client.text()).toContain('Ask a network admin.');
  });
});
