// Week calendar: bookings placed by day and quarter hour in the technician's time zone (Vienna
// here) whatever zone the runner is in (the suite runs under UTC and Pacific/Auckland), week
// navigation, the technician picker for partner admins and a technician's own week.
import { beforeEach, describe, expect, it, vi } from 'vitest';
import { flushPromises, mount } from '@vue/test-utils';
import { createPinia, setActivePinia } from 'pinia';
import { createMemoryHistory } from 'vue-router';
import type { Me, MemberRole } from '@emberline/domain';
import { refreshSession } from '@/api/auth';
import { listPartnerBookings } from '@/api/bookings';
import { getWorkingHours } from '@/api/offers';
import { getTeam } from '@/api/team';
import { placeWeek } from '@/components/booking-week';
import { i18n } from '@/locales';
import { createAppRouter } from '@/router';
import WeekPage from '@/views/bookings/bookings-week.vue';
import { ORG_A, me, member, session, team } from './fixtures';
import { ADMIN_ID, BOOKING_ID, SECOND_ID, TECH_ID, booking, secondBooking, viennaHours } from './booking-fixtures';

vi.mock('@/api/auth', () => ({ refreshSession: vi.fn(), signIn: vi.fn(), signOut: vi.fn() }));
vi.mock('@/api/team', () => ({ getTeam: vi.fn() }));
vi.mock('@/api/offers', () => ({ getWorkingHours: vi.fn() }));
vi.mock('@/api/bookings', () => ({ listPartnerBookings: vi.fn(), getPartnerBooking: vi.fn(), decideBooking: vi.fn(), fetchBookingsCsv: vi.fn() }));

async function mountWeek(path: string, role: MemberRole = 'technician', user: Partial<Me> = { id: TECH_ID, name: 'Jonas Brandt' }) {
  vi.mocked(refreshSession).mockResolvedValue(session(me({ ...user, memberships: [member(role)] })));
  const router = createAppRouter(createMemoryHistory());
  await router.push(path);
  await router.isReady();
  const wrapper = mount(WeekPage, { global: { plugins: [router, i18n] }, attachTo: document.body });
  await flushPromises();
  return { wrapper, router };
}

const block = (wrapper: ReturnType<typeof mount>, id: string) => wrapper.find(`[data-booking="${id}"]`);

describe('Console week calendar', () => {
  beforeEach(() => {
    localStorage.clear();
    document.body.innerHTML = '';
    setActivePinia(createPinia());
    vi.clearAllMocks();
    vi.mocked(getTeam).mockResolvedValue(team);
    vi.mocked(getWorkingHours).mockResolvedValue(viennaHours());
    vi.mocked(listPartnerBookings).mockResolvedValue([booking({ status: 'confirmed' }), secondBooking(), booking({ id: 'c0ffee00-0000-4000-8000-000000000001', status: 'cancelled_by_owner' })]);
  });

  it('places a 09:00–10:30 Vienna booking on Tuesday, rows 10 to 16 of a 07:00 grid', async () => {
    const { wrapper } = await mountWeek('/bookings/week?week=2026-03-11');
    expect(getWorkingHours).toHaveBeenCalledWith(ORG_A, TECH_ID, expect.anything());
    // a day either side in UTC, so the request does not depend on any zone
    expect(listPartnerBookings).toHaveBeenCalledWith(ORG_A, { technicianId: TECH_ID, from: '2026-03-08T00:00:00.000Z', to: '2026-03-17T00:00:00.000Z', limit: 500 }, expect.anything());
    expect(wrapper.find('h2#week-heading').text()).toBe('9 Mar – 15 Mar 2026');
    expect(wrapper.text()).toContain('Times in Europe/Vienna');

    const first = block(wrapper, BOOKING_ID);
    expect(first.attributes('data-column')).toBe('3');
    expect(first.attributes('data-row-start')).toBe('10');
    expect(first.attributes('data-row-end')).toBe('16');
    expect(first.attributes('style')).toContain('grid-row: 10 / 16');
    expect(first.attributes('style')).toContain('grid-column: 3');
    // the link reads day, time, service, customer and status
    expect(first.text().replace(/\s+/g, ' ')).toContain('Tuesday 10 March, 09:00–10:30Handset pairing and range checkPia LechnerConfirmed');
    expect(first.attributes('href')).toContain(`/bookings/${BOOKING_ID}`);
    // Thursday 14:00–15:00
    const second = block(wrapper, SECOND_ID);
    expect([second.attributes('data-column'), second.attributes('data-row-start'), second.attributes('data-row-end')]).toEqual(['5', '30', '34']);
    // cancelled bookings leave the calendar
    expect(wrapper.findAll('.week-grid__block')).toHaveLength(2);
    // the day headings run Monday to Sunday
    expect(wrapper.findAll('.week-grid__day').map((d) => d.attributes('data-date'))).toEqual(['2026-03-09', '2026-03-10', '2026-03-11', '2026-03-12', '2026-03-13', '2026-03-14', '2026-03-15']);
  });

  it('puts a job just after midnight in Vienna on Monday although it is still Sunday in UTC', () => {
    const late = booking({ start: '2026-03-08T23:30:00.000Z', end: '2026-03-09T00:15:00.000Z' });
    const [placed] = placeWeek([late], '2026-03-09', 'Europe/Vienna');
    expect(placed).toMatchObject({ day: 0, date: '2026-03-09', startTime: '00:30', endTime: '01:15', startMinute: 30, endMinute: 75 });
    expect(placeWeek([late], '2026-03-09', 'UTC')).toEqual([]);
    // summer time in Vienna from 29 March: 07:00 UTC is 09:00 there
    const [summer] = placeWeek([booking({ start: '2026-03-31T07:00:00.000Z', end: '2026-03-31T08:30:00.000Z' })], '2026-03-30', 'Europe/Vienna');
    expect(summer).toMatchObject({ day: 1, startTime: '09:00', endTime: '10:30' });
  });

  it('sets overlapping bookings side by side', () => {
    const a = booking();
    const b = booking({ id: SECOND_ID, start: '2026-03-10T09:00:00.000Z', end: '2026-03-10T10:00:00.000Z' });
    const placed = placeWeek([a, b], '2026-03-09', 'Europe/Vienna');
    expect(placed.map((p) => [p.booking.id, p.lane, p.lanes])).toEqual([
      [BOOKING_ID, 0, 2],
      [SECOND_ID, 1, 2],
    ]);
  });

  it('moves a week at a time and keeps the week in the address', async () => {
    const { wrapper, router } = await mountWeek('/bookings/week?week=2026-03-09');
    await wrapper.find('[data-testid="week-next"]').trigger('click');
    await flushPromises();
    expect(listPartnerBookings).toHaveBeenLastCalledWith(ORG_A, { technicianId: TECH_ID, from: '2026-03-15T00:00:00.000Z', to: '2026-03-24T00:00:00.000Z', limit: 500 }, expect.anything());
    expect(router.currentRoute.value.query.week).toBe('2026-03-16');
    expect(wrapper.find('h2#week-heading').text()).toBe('16 Mar – 22 Mar 2026');
    await wrapper.find('[data-testid="week-previous"]').trigger('click');
    await wrapper.find('[data-testid="week-previous"]').trigger('click');
    await flushPromises();
    expect(router.currentRoute.value.query.week).toBe('2026-03-02');
  });

  it('shows a technician their own week without a picker', async () => {
    const { wrapper } = await mountWeek('/bookings/week?week=2026-03-09');
    expect(wrapper.find('[data-testid="week-technician"]').exists()).toBe(false);
    expect(wrapper.text()).toContain('Week of Jonas Brandt');
  });

  it('lets a partner admin pick whose week to see, starting with the first technician', async () => {
    const { wrapper, router } = await mountWeek('/bookings/week?week=2026-03-09', 'partner_admin', {});
    const picker = wrapper.find<HTMLSelectElement>('[data-testid="week-technician"] select');
    expect(picker.element.value).toBe(TECH_ID);
    expect(picker.findAll('option').map((o) => o.text())).toEqual(['Jonas Brandt (Technician)', 'Mara Kessel (Partner admin)']);
    vi.mocked(listPartnerBookings).mockResolvedValue([]);
    await picker.setValue(ADMIN_ID);
    await flushPromises();
    expect(getWorkingHours).toHaveBeenLastCalledWith(ORG_A, ADMIN_ID, expect.anything());
    expect(listPartnerBookings).toHaveBeenLastCalledWith(ORG_A, expect.objectContaining({ technicianId: ADMIN_ID }), expect.anything());
    expect(router.currentRoute.value.query.technician).toBe(ADMIN_ID);
    expect(wrapper.find('[data-testid="week-empty"]').text()).toBe('No bookings for Mara Kessel this week.');
  });

  it('falls back to the bookings\' zone when the technician has no hours', async () => {
    vi.mocked(getWorkingHours).mockResolvedValue({ ...viennaHours(), hours: null });
    const { wrapper } = await mountWeek('/bookings/week?week=2026-03-09');
    expect(wrapper.text()).toContain('Times in Europe/Vienna');
    expect(block(wrapper, BOOKING_ID).attributes('data-row-start')).toBe('10');
  });

  it('shows the error with a retry when the week cannot be read', async () => {
    vi.mocked(listPartnerBookings).mockRejectedValueOnce(new Error('boom'));
    const { wrapper } = await mountWeek('/bookings/week?week=2026-03-09');
    expect(wrapper.find('[data-state="error"]').exists()).toBe(true);
    await wrapper.find('[data-state="error"] button').trigger('click');
    await flushPromises();
    expect(wrapper.findAll('.week-grid__block')).toHaveLength(2);
  });
});
