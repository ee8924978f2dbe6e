// Working hours: overlaps flagged beside the interval before saving, server field errors beside the
// interval, and exceptions (days off, time off turned into an instant with the zone's offset) saved
// with the whole hours object.
import { beforeEach, describe, expect, it, vi } from 'vitest';
import { DOMWrapper, flushPromises, mount } from '@vue/test-utils';
import { createPinia, setActivePinia } from 'pinia';
import { createMemoryHistory } from 'vue-router';
import { DateTime } from 'luxon';
import type { MemberRole } from '@emberline/domain';
import { refreshSession } from '@/api/auth';
import { getWorkingHours, saveWorkingHours } from '@/api/offers';
import { getTeam } from '@/api/team';
import { i18n } from '@/locales';
import { createAppRouter } from '@/router';
import HoursPage from '@/views/working-hours/index.vue';
import { ORG_A, me, member, problem, session, team } from './fixtures';
import { TECH_ID, techHours, weekdayHours } from './offer-fixtures';

vi.mock('@/api/auth', () => ({ refreshSession: vi.fn(), signIn: vi.fn(), signOut: vi.fn() }));
vi.mock('@/api/team', () => ({ getTeam: vi.fn() }));
vi.mock('@/api/offers', () => ({ getWorkingHours: vi.fn(), saveWorkingHours: vi.fn() }));

async function mountPage(role: MemberRole = 'partner_admin', userId?: string) {
  vi.mocked(refreshSession).mockResolvedValue(session(me({ ...(userId ? { id: userId } : {}), memberships: [member(role)] })));
  const router = createAppRouter(createMemoryHistory());
  await router.push('/hours');
  await router.isReady();
  const wrapper = mount(HoursPage, { global: { plugins: [router, i18n] }, attachTo: document.body });
  await flushPromises();
  return wrapper;
}

const interval = (wrapper: ReturnType<typeof mount>, day: string, index: number) => wrapper.find(`[data-day="${day}"] [data-index="${index}"]`);
const $ = <E extends Element = HTMLElement>(selector: string) => new DOMWrapper(document.body.querySelector<E>(selector)!);

// these mount whole pages with ant-design-vue; a busy machine needs more than the default 5 s
describe('Working hours', { timeout: 30_000 }, () => {
  beforeEach(() => {
    localStorage.clear();
    document.body.innerHTML = '';
    setActivePinia(createPinia());
    vi.clearAllMocks();
    vi.mocked(getTeam).mockResolvedValue(team);
    vi.mocked(getWorkingHours).mockResolvedValue(techHours());
  });

  it('opens the first technician\'s hours in their time zone', async () => {
    const wrapper = await mountPage();
    expect(getWorkingHours).toHaveBeenCalledWith(ORG_A, TECH_ID, expect.anything());
    expect(wrapper.find<HTMLSelectElement>('#hours_timeZone').element.value).toBe('Europe/Vienna');
    expect(interval(wrapper, 'monday', 0).find<HTMLSelectElement>('[data-testid="interval-start"] select').element.value).toBe('08:00');
    expect(wrapper.find('[data-day="saturday"]').text()).toContain('Day off');
  });

  it('flags an overlapping interval beside it before saving, and does not save', async () => {
    const wrapper = await mountPage();
    await wrapper.find('[data-day="monday"] [data-testid="add-interval"]').trigger('click');
    // the new interval starts after the last one: no overlap yet
    expect(interval(wrapper, 'monday', 1).find<HTMLSelectElement>('[data-testid="interval-start"] select').element.value).toBe('17:30');
    expect(wrapper.find('[data-testid="interval-error"]').exists()).toBe(false);
    await interval(wrapper, 'monday', 1).find('[data-testid="interval-start"] select').setValue('12:00');
    const error = interval(wrapper, 'monday', 1).find('[data-testid="interval-error"]');
    expect(error.text()).toBe('12:00–21:30 overlaps 08:00–17:00 on Monday');
    expect(wrapper.find('[data-testid="hours-save-bar"]').text()).toContain('One problem to fix before saving');
    // a reversed interval is flagged on its end
    await interval(wrapper, 'tuesday', 0).find('[data-testid="interval-end"] select').setValue('07:00');
    expect(interval(wrapper, 'tuesday', 0).find('[data-testid="interval-error"]').text()).toBe('The end (07:00) must be after the start (08:00)');
    await wrapper.find('[data-testid="save-hours"]').trigger('click');
    await flushPromises();
    expect(saveWorkingHours).not.toHaveBeenCalled();
    // fixing it clears the message
    await interval(wrapper, 'monday', 1).find('[data-testid="interval-start"] select').setValue('17:30');
    expect(interval(wrapper, 'monday', 1).find('[data-testid="interval-error"]').exists()).toBe(false);
  });

  it('shows the server\'s field errors beside the interval and keeps the edits', async () => {
    vi.mocked(saveWorkingHours).mockRejectedValue(problem(400, 'VALIDATION_FAILED', 'Please correct the highlighted fields.', [{ path: 'weekly.wednesday.0.end', message: 'The server refuses this end' }]));
    const wrapper = await mountPage();
    await interval(wrapper, 'wednesday', 0).find('[data-testid="interval-end"] select').setValue('16:00');
    await wrapper.find('[data-testid="save-hours"]').trigger('click');
    await flushPromises();
    expect(saveWorkingHours).toHaveBeenCalled();
    expect(interval(wrapper, 'wednesday', 0).find('[data-testid="interval-error"]').text()).toBe('The server refuses this end');
    expect(interval(wrapper, 'wednesday', 0).find<HTMLSelectElement>('[data-testid="interval-end"] select').element.value).toBe('16:00');
    expect(wrapper.text()).toContain('Unsaved changes');
  });

  it('adds days off and time off on the calendar and saves the whole hours object', async () => {
    vi.mocked(saveWorkingHours).mockImplementation(async (_org, userId, body) => ({ organisationId: ORG_A, userId, hours: weekdayHours({ exceptions: body.exceptions as never }) }));
    const wrapper = await mountPage();
    const today = DateTime.now().toISODate()!;
    // days off: today only, so the mark shows in the month on screen
    await $('#exception_from').setValue(today);
    await $('#exception_to').setValue(today);
    await $('[data-testid="exception-form"]').trigger('submit');
    await flushPromises();
    expect(wrapper.find(`[data-date="${today}"]`).text()).toContain('Day off');
    // time off on the technician's wall clock: 30 March 2026 is summer time in Vienna (UTC+2)
    await $('input[value="time-off"]').setValue(true);
    await flushPromises();
    await $('#exception_startLocal').setValue('2026-03-30T09:00');
    await $('#exception_endLocal').setValue('2026-03-30T12:30');
    await $('[data-testid="exception-form"]').trigger('submit');
    await flushPromises();
    expect(wrapper.find('[data-testid="exception-list"]').text()).toContain('Time off on 30 Mar 2026, 09:00–12:30');
    await wrapper.find('[data-testid="save-hours"]').trigger('click');
    await flushPromises();
    expect(saveWorkingHours).toHaveBeenCalledTimes(1);
    const [org, userId, body] = vi.mocked(saveWorkingHours).mock.calls[0]!;
    expect([org, userId]).toEqual([ORG_A, TECH_ID]);
    expect(body).toMatchObject({ timeZone: 'Europe/Vienna', minimumNoticeMinutes: 120, bookingHorizonDays: 90, bufferMinutes: 15, weekly: { monday: [{ start: '08:00', end: '17:00' }] } });
    expect(body.exceptions).toEqual([
      { kind: 'days-off', from: today, to: today },
      { kind: 'time-off', start: '2026-03-30T09:00:00+02:00', end: '2026-03-30T12:30:00+02:00' },
    ]);
    expect(wrapper.text()).toContain('All changes are saved.');
  });

  it('refuses time off that ends before it starts, beside the field', async () => {
    await mountPage();
    await $('input[value="time-off"]').setValue(true);
    await flushPromises();
    await $('#exception_startLocal').setValue('2026-03-30T12:00');
    await $('#exception_endLocal').setValue('2026-03-30T09:00');
    await $('[data-testid="exception-form"]').trigger('submit');
    await flushPromises();
    expect($<HTMLInputElement>('#exception_endLocal').element.closest('.ant-form-item')!.textContent).toContain('The time off must end after it starts');
    expect(document.body.querySelector('[data-testid="exception-list"]')).toBeNull();
  });

  it('starts someone without hours from weekdays 08:00–17:00', async () => {
    vi.mocked(getWorkingHours).mockResolvedValue(techHours(null));
    const wrapper = await mountPage();
    expect(wrapper.find('[data-testid="hours-fresh"]').text()).toContain('Jonas Brandt has no working hours yet');
    expect(interval(wrapper, 'friday', 0).find<HTMLSelectElement>('[data-testid="interval-end"] select').element.value).toBe('17:00');
  });

  it('shows a technician the hours without any way to change them', async () => {
    const wrapper = await mountPage('technician');
    expect(wrapper.find('[data-testid="save-hours"]').exists()).toBe(false);
    expect(wrapper.find('[data-testid="add-interval"]').exists()).toBe(false);
    expect(wrapper.find('[data-testid="exception-form"]').exists()).toBe(false);
    expect(wrapper.find<HTMLSelectElement>('[data-day="monday"] select').element.disabled).toBe(true);
  });

  it('lets a technician add their own days off and save them, but not extra hours or the week', async () => {
    vi.mocked(saveWorkingHours).mockImplementation(async (_org, userId, body) => ({ organisationId: ORG_A, userId, hours: weekdayHours({ exceptions: body.exceptions as never }) }));
    const wrapper = await mountPage('technician', TECH_ID);
    expect(wrapper.find('[data-testid="add-interval"]').exists()).toBe(false);
    expect(wrapper.find<HTMLSelectElement>('[data-day="monday"] select').element.disabled).toBe(true);
    expect(document.body.querySelector('input[value="extra-hours"]')).toBeNull();
    const today = DateTime.now().toISODate()!;
    await $('#exception_from').setValue(today);
    await $('#exception_to').setValue(today);
    await $('[data-testid="exception-form"]').trigger('submit');
    await flushPromises();
    await wrapper.find('[data-testid="save-hours"]').trigger('click');
    await flushPromises();
    const [, userId, body] = vi.mocked(saveWorkingHours).mock.calls[0]!;
    expect(userId).toBe(TECH_ID);
    expect(body.exceptions).toEqual([{ kind: 'days-off', from: today, to: today }]);
    expect(body.weekly).toMatchObject({ monday: [{ start: '08:00', end: '17:00' }] });
  });
});
