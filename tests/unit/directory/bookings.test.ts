// The owner's bookings: the return page after paying polls until the payment's webhook has
// moved the booking on (held → requested) and then confirms it; after a cancelled payment it
// releases the time; a declined card says so. The list groups upcoming and past with status
// tags; the detail cancels with the fee and refund from cancellationNow, and reschedules or
// shows the server's reason.
import { afterEach, beforeAll, beforeEach, describe, expect, it, vi } from 'vitest';
import { flushPromises, mount } from '@vue/test-utils';
import { createPinia, setActivePinia } from 'pinia';
import { defineComponent, h } from 'vue';
import { createMemoryHistory, RouterView, type Router } from 'vue-router';
import { ApiError, type OwnerQuote } from '@emberline/api-client';
import type { Booking, PartnerSlots, ServiceType, Session } from '@emberline/domain';
import { refreshSession } from '@/api/auth';
import { cancelMyBooking, getMyBooking, listMyBookings, releaseMyBooking, rescheduleMyBooking } from '@/api/bookings';
import { listServiceTypes } from '@/api/catalogue';
import { getPartnerSlots } from '@/api/search';
import { POLL_EVERY_MS } from '@/composables/use-my-bookings';
import { i18n } from '@/locales';
import { createAppRouter } from '@/router';

vi.mock('@/api/auth', () => ({ refreshSession: vi.fn(), signIn: vi.fn(), signOut: vi.fn(), resendVerification: vi.fn() }));
vi.mock('@/api/catalogue', () => ({ listServiceTypes: vi.fn(), listCapabilities: vi.fn() }));
vi.mock('@/api/search', () => ({ searchPartners: vi.fn(), findPlaces: vi.fn(), getPartnerProfile: vi.fn(), getPartnerSlots: vi.fn(), requestCoverageAlert: vi.fn() }));
vi.mock('@/api/bookings', () => ({
  previewQuote: vi.fn(),
  createBooking: vi.fn(),
  listMyBookings: vi.fn(),
  getMyBooking: vi.fn(),
  cancelMyBooking: vi.fn(),
  rescheduleMyBooking: vi.fn(),
  releaseMyBooking: vi.fn(),
  bookingCalendarPath: (id: string) => `/api/bookings/${id}/calendar.ics`,
  fetchBookingCalendar: vi.fn(),
}));

const Shell = defineComponent({ render: () => h(RouterView) });
const PARTNER = '5b0f3a52-8f0e-4f3c-9d55-3c2f1b7e9a10';
const BOOKING = '7c9e6679-7425-40de-944b-e07fc1f90ae7';
const START = '2030-03-05T08:00:00.000Z';
const NEW_START = '2030-03-06T12:30:00.000Z';

const owner: Session = {
  accessToken: 'access-1',
  expiresIn: 900,
  user: { id: '0e6a3f3e-5d1c-4f0e-8a77-2c1b9f0d4e21', email: 'clara@owners.example', name: 'Clara Lind', locale: 'en', emailVerified: true, roles: ['owner'], memberships: [] },
};

const quote: OwnerQuote = {
  currency: 'EUR',
  minorUnits: 2,
  lines: [
    { kind: 'labour', description: 'Seasonal heater service', netMinor: 12_000, vatRateBp: 2000, vatMinor: 2_400, grossMinor: 14_400 },
    { kind: 'travel', description: 'Travel', netMinor: 480, vatRateBp: 2000, vatMinor: 96, grossMinor: 576 },
  ],
  netMinor: 12_480,
  vatMinor: 2_496,
  grossMinor: 14_976,
  vat: { treatment: 'standard', country: 'AT', rateBp: 2000, validFrom: '2016-01-01', note: null },
  depositMinor: 14_976,
  cancellation: { freeUntilHours: 48, feeMinor: 3_000 },
};

function bookingOf(patch: Partial<Booking> = {}): Booking {
  return {
    id: BOOKING,
    reference: 'EMB-7K2Q',
    status: 'requested',
    partner: { id: PARTNER, name: 'Glutwerk Mobil' },
    serviceType: { code: 'seasonal-heater-service', name: 'Seasonal heater service' },
    start: START,
    end: '2030-03-05T09:30:00.000Z',
    timeZone: 'Europe/Vienna',
    technician: null,
    jobAt: 'owner',
    address: { line: 'Museumstraße 12', postalCode: '6020', city: 'Innsbruck', country: 'AT', lat: 47.2655, lng: 11.3931 },
    workshopAddress: null,
    vehicle: { model: 'Korvan Cargo 4', year: 2021, fuel: 'diesel' },
    customer: { kind: 'consumer', name: 'Clara Lind', email: 'clara@owners.example', phone: null, companyName: null, vatId: null },
    notes: null,
    quote,
    partnerQuote: null,
    payment: { status: 'authorised', authorisedMinor: 14_976, capturedMinor: 0, refundedMinor: 0 },
    holdExpiresAt: null,
    checkoutUrl: null,
    cancellationNow: { allowed: true, feeMinor: 0, refundMinor: 14_976 },
    history: [],
    createdAt: '2030-03-01T10:00:00.000Z',
    ...patch,
  };
}
const held = bookingOf({ status: 'held', payment: { status: 'pending', authorisedMinor: 0, capturedMinor: 0, refundedMinor: 0 }, holdExpiresAt: '2030-03-01T10:10:00.000Z', checkoutUrl: 'http://127.0.0.1:4030/pay/cs_1' });

const serviceTypes: ServiceType[] = [
  {
    code: 'seasonal-heater-service',
    name: 'Seasonal heater service',
    summary: 'Before winter.',
    description: 'Combustion check, glow pin and fuel supply.',
    defaultDurationMinutes: 90,
    requiredCapabilities: [],
    cautions: ['exhaust-gas', 'fuel-system'],
    retired: false,
  },
];

const problem = (status: number, code: string, title: string, detail?: string) => new ApiError({ type: 'about:blank', title, status, code, detail });

let router: Router;
async function mountAt(path: string, query: Record<string, string> = {}) {
  router = createAppRouter(createMemoryHistory());
  await router.push({ path, query });
  await router.isReady();
  const wrapper = mount(Shell, { global: { plugins: [router, i18n] }, attachTo: document.body });
  await flushPromises();
  await vi.waitFor(() => expect(wrapper.find('h1').exists()).toBe(true));
  await flushPromises();
  return wrapper;
}

describe('Directory bookings', () => {
  beforeAll(async () => {
    await import('@/views/booking-detail/index.vue');
    await import('@/views/bookings/index.vue');
  }, 30_000);

  beforeEach(() => {
    document.body.innerHTML = '';
    setActivePinia(createPinia());
    vi.mocked(refreshSession).mockReset().mockResolvedValue(owner);
    vi.mocked(listServiceTypes).mockReset().mockResolvedValue(serviceTypes);
    for (const fn of [getMyBooking, listMyBookings, cancelMyBooking, rescheduleMyBooking, releaseMyBooking, getPartnerSlots]) vi.mocked(fn).mockReset();
  });
  afterEach(() => vi.useRealTimers());

  it('after paying, asks again until the payment is confirmed, then shows the booking waiting for the partner', async () => {
    vi.useFakeTimers({ toFake: ['setTimeout', 'clearTimeout'] });
    vi.mocked(getMyBooking).mockResolvedValueOnce(held).mockResolvedValueOnce(held).mockResolvedValueOnce(bookingOf());
    const wrapper = await mountAt(`/bookings/${BOOKING}`, { paid: '1' });

    expect(wrapper.find('h1').text()).toBe('Confirming your payment…');
    expect(wrapper.find('[data-testid="standing-text"]').attributes('role')).toBe('status');
    expect(getMyBooking).toHaveBeenCalledTimes(1);

    await vi.advanceTimersByTimeAsync(POLL_EVERY_MS);
    await flushPromises();
    expect(getMyBooking).toHaveBeenCalledTimes(2);
    expect(wrapper.find('h1').text()).toBe('Confirming your payment…');

    await vi.advanceTimersByTimeAsync(POLL_EVERY_MS);
    await flushPromises();
    expect(getMyBooking).toHaveBeenCalledTimes(3);
    expect(wrapper.find('h1').text()).toBe('Booked: waiting for Glutwerk Mobil to accept');
    expect(wrapper.find('[data-status="requested"]').text()).toBe('Waiting for the technician');
    expect(wrapper.find('[data-testid="standing-text"]').text()).toContain('Your payment of €149.76 is held on your card');
    expect(wrapper.find('[data-testid="detail-where"]').text()).toBe('Museumstraße 12, 6020 Innsbruck, Austria');
    expect(wrapper.find('[data-testid="detail-when"]').text()).toMatch(/Tuesday,? 5 March 2030, 09:00–10:30/);
    expect(wrapper.find('[data-testid="detail-payment"]').text()).toBe('€149.76 held on your card');
    expect(wrapper.find('[data-testid="calendar"]').attributes('href')).toBe(`/api/bookings/${BOOKING}/calendar.ics`);
    expect(wrapper.find('[data-testid="quote-total"]').text()).toBe('€149.76');
    expect(wrapper.find('[data-testid="quote-vat"]').text()).toContain('VAT 20% (Austria)');
    expect(wrapper.findAll('[data-caution]').map((c) => c.attributes('data-caution'))).toEqual(['exhaust-gas', 'fuel-system']);

    // no more asking once the status has moved on
    await vi.advanceTimersByTimeAsync(POLL_EVERY_MS * 3);
    expect(getMyBooking).toHaveBeenCalledTimes(3);
  });

  it('stops asking after about thirty seconds and offers to check again', async () => {
    vi.useFakeTimers({ toFake: ['setTimeout', 'clearTimeout', 'Date'] });
    vi.mocked(getMyBooking).mockResolvedValue(held);
    const wrapper = await mountAt(`/bookings/${BOOKING}`, { paid: '1' });
    await vi.advanceTimersByTimeAsync(31_000);
    await flushPromises();
    const calls = vi.mocked(getMyBooking).mock.calls.length;
    expect(calls).toBeGreaterThanOrEqual(15);
    expect(calls).toBeLessThanOrEqual(22);
    expect(wrapper.find('h1').text()).toBe('Your payment is still being confirmed');
    vi.mocked(getMyBooking).mockResolvedValue(bookingOf({ status: 'confirmed' }));
    await wrapper.find('[data-testid="check-again"]').trigger('click');
    await vi.advanceTimersByTimeAsync(POLL_EVERY_MS);
    await flushPromises();
    expect(wrapper.find('h1').text()).toBe('Your booking is confirmed');
  });

  it('after a cancelled payment, releases the held time and says nothing was charged', async () => {
    vi.mocked(releaseMyBooking).mockResolvedValue({ ...held, status: 'released', payment: { ...held.payment, status: 'cancelled' } });
    const wrapper = await mountAt(`/bookings/${BOOKING}`, { cancelled: '1' });
    expect(releaseMyBooking).toHaveBeenCalledWith(BOOKING);
    expect(wrapper.find('h1').text()).toBe('Payment cancelled: nothing is booked');
    expect(wrapper.find('[data-testid="standing-text"]').text()).toContain('released the time you held and nothing was charged');
    expect(wrapper.find('[data-status="released"]').text()).toBe('Not booked');
    expect(wrapper.find('[data-testid="try-again"]').attributes('href')).toBe(`/book/${PARTNER}?serviceType=seasonal-heater-service&start=${START}&lat=47.2655&lng=11.3931`);
    expect(wrapper.find('[data-testid="try-again"]').text()).toBe('Book this time again');
    expect(wrapper.find('[data-testid="detail-change"]').exists()).toBe(false);
    expect(wrapper.find('[data-testid="calendar"]').exists()).toBe(false);
  });

  it('says the card was declined and the time released when the payment failed', async () => {
    const declined = { ...held, status: 'released' as const, payment: { ...held.payment, status: 'failed' as const } };
    // the page is left with the declined card; coming back by "cancel" finds it already released
    vi.mocked(releaseMyBooking).mockRejectedValue(problem(409, 'INVALID_TRANSITION', 'This booking is no longer held'));
    vi.mocked(getMyBooking).mockResolvedValue(declined);
    const wrapper = await mountAt(`/bookings/${BOOKING}`, { cancelled: '1' });
    expect(getMyBooking).toHaveBeenCalled();
    expect(wrapper.find('h1').text()).toBe('Your card was declined');
    expect(wrapper.find('[data-testid="standing-text"]').text()).toContain('Nothing was charged and the time was released');
    expect(wrapper.find('[data-testid="try-again"]').text()).toBe('Try again with another card');
  });

  it('shows the cancellation fee and refund from cancellationNow, and cancels after confirming', async () => {
    vi.mocked(getMyBooking).mockResolvedValue(bookingOf({ status: 'confirmed', cancellationNow: { allowed: true, feeMinor: 3_000, refundMinor: 11_976 } }));
    vi.mocked(cancelMyBooking).mockResolvedValue(
      bookingOf({ status: 'cancelled_by_owner', payment: { status: 'partially_refunded', authorisedMinor: 14_976, capturedMinor: 14_976, refundedMinor: 11_976 }, cancellationNow: { allowed: false, feeMinor: 0, refundMinor: 0 } }),
    );
    const wrapper = await mountAt(`/bookings/${BOOKING}`);
    expect(wrapper.find('h1').text()).toBe('Your booking is confirmed');
    // moving is only possible while cancelling is free
    expect(wrapper.find('[data-testid="reschedule"]').exists()).toBe(false);
    expect(wrapper.find('[data-testid="reschedule-closed"]').text()).toContain('only while cancelling is free');
    expect(wrapper.find('[data-testid="cancel-now"]').text()).toBe('Cancelling now costs a fee of €30.00, taken from what is held on your card; the other €119.76 is released.');

    await wrapper.find('[data-testid="cancel-booking"]').trigger('click');
    await flushPromises();
    const dialog = document.body.querySelector('[data-testid="cancel-dialog"]')!;
    expect(dialog.querySelector('[data-testid="cancel-cost"]')!.textContent).toBe('Cancelling now costs a fee of €30.00, taken from what is held on your card; the other €119.76 is released.');
    expect(cancelMyBooking).not.toHaveBeenCalled();
    const reason = dialog.querySelector<HTMLTextAreaElement>('#cancel-reason')!;
    reason.value = 'The van is away that week';
    reason.dispatchEvent(new Event('input'));
    dialog.querySelector<HTMLButtonElement>('[data-testid="cancel-confirm"]')!.click();
    await flushPromises();
    expect(cancelMyBooking).toHaveBeenCalledWith(BOOKING, 'The van is away that week');
    await vi.waitFor(() => expect(wrapper.find('h1').text()).toBe('You cancelled this booking'));
    expect(wrapper.find('[data-testid="detail-payment"]').text()).toBe('€149.76 paid, €119.76 refunded');
    expect(wrapper.find('[data-testid="detail-change"]').exists()).toBe(false);
  });

  it('while the job is under way, offers to call or e-mail the partner and to report a problem', async () => {
    vi.mocked(getMyBooking).mockResolvedValue(
      bookingOf({ status: 'in_progress', partner: { id: PARTNER, name: 'Glutwerk Mobil', phone: '+43 512 987 654', email: 'office@glutwerk.example' }, cancellationNow: { allowed: false, feeMinor: 0, refundMinor: 0 } }),
    );
    const wrapper = await mountAt(`/bookings/${BOOKING}`);
    expect(wrapper.find('h1').text()).toBe('The job is under way');
    const help = wrapper.find('[data-testid="under-way"]');
    expect(help.find('[data-testid="call-partner"]').attributes('href')).toBe('tel:+43512987654');
    expect(help.find('[data-testid="call-partner"]').text()).toBe('Call +43 512 987 654');
    expect(help.find('[data-testid="mail-partner"]').attributes('href')).toBe('mailto:office@glutwerk.example');
    expect(help.find('[data-testid="report-problem"]').attributes('href')).toBe('mailto:office@glutwerk.example?subject=Problem%20with%20booking%20EMB-7K2Q');
  });

  it('says a free cancellation is free', async () => {
    vi.mocked(getMyBooking).mockResolvedValue(bookingOf());
    const wrapper = await mountAt(`/bookings/${BOOKING}`);
    expect(wrapper.find('[data-testid="cancel-now"]').text()).toBe('Cancelling now is free: all €149.76 held on your card is released.');
  });

  it('reschedules to a free time at the same place, and shows the reason when the server refuses', async () => {
    const slots: PartnerSlots = {
      partnerId: PARTNER,
      serviceTypeCode: 'seasonal-heater-service',
      durationMinutes: 90,
      timeZone: 'Europe/Vienna',
      organisation: [
        { start: START, end: '2030-03-05T09:30:00.000Z', localStart: '2030-03-05T09:00', technicianIds: [] },
        { start: NEW_START, end: '2030-03-06T14:00:00.000Z', localStart: '2030-03-06T13:30', technicianIds: [] },
      ],
      technicians: [],
      truncated: false,
    };
    vi.mocked(getMyBooking).mockResolvedValue(bookingOf({ status: 'confirmed' }));
    vi.mocked(getPartnerSlots).mockResolvedValue(slots);
    vi.mocked(rescheduleMyBooking)
      .mockRejectedValueOnce(problem(409, 'RESCHEDULE_NOT_ALLOWED', 'This booking cannot be moved', 'Times can be changed until 48 hours before the start.'))
      .mockResolvedValueOnce(bookingOf({ status: 'confirmed', start: NEW_START, end: '2030-03-06T14:00:00.000Z' }));
    const wrapper = await mountAt(`/bookings/${BOOKING}`);
    await wrapper.find('[data-testid="reschedule"]').trigger('click');
    await vi.waitFor(() => expect(getPartnerSlots).toHaveBeenCalled());
    await flushPromises();
    expect(vi.mocked(getPartnerSlots).mock.calls[0]!.slice(0, 2)).toEqual([PARTNER, { serviceType: 'seasonal-heater-service', lat: 47.2655, lng: 11.3931, from: undefined, days: 7 }]);
    // the booking's own time is not offered again
    const times = wrapper.findAll('[data-testid="pick-slot"]');
    expect(times.map((t) => t.text())).toEqual(['13:30']);
    await times[0]!.trigger('click');
    await wrapper.find('[data-testid="reschedule-confirm"]').trigger('click');
    await flushPromises();
    expect(rescheduleMyBooking).toHaveBeenCalledWith(BOOKING, NEW_START);
    const refused = wrapper.find('[data-testid="reschedule-problem"]');
    expect(refused.text()).toContain('This booking cannot be moved');
    expect(refused.text()).toContain('Times can be changed until 48 hours before the start.');

    await wrapper.find('[data-testid="reschedule-confirm"]').trigger('click');
    await flushPromises();
    expect(wrapper.find('[data-testid="detail-when"]').text()).toMatch(/Wednesday,? 6 March 2030, 13:30–15:00/);
    expect(wrapper.find('[data-testid="reschedule-problem"]').exists()).toBe(false);
  });

  it('lists upcoming and past bookings with their status, leaving out payments that never went through', async () => {
    const upcoming = bookingOf({ id: 'a1f0c2d4-1111-4c3a-8e5d-1f0a9b8c7d61', reference: 'EMB-UP01', status: 'confirmed' });
    const waiting = bookingOf({ id: 'b2f0c2d4-2222-4c3a-8e5d-1f0a9b8c7d61', reference: 'EMB-UP02', status: 'requested', start: '2030-03-01T08:00:00.000Z', end: '2030-03-01T09:30:00.000Z' });
    const done = bookingOf({ id: 'c3f0c2d4-3333-4c3a-8e5d-1f0a9b8c7d61', reference: 'EMB-PA01', status: 'completed', start: '2026-01-10T08:00:00.000Z', end: '2026-01-10T09:30:00.000Z' });
    const cancelled = bookingOf({ id: 'd4f0c2d4-4444-4c3a-8e5d-1f0a9b8c7d61', reference: 'EMB-PA02', status: 'cancelled_by_owner' });
    const abandoned = bookingOf({ id: 'e5f0c2d4-5555-4c3a-8e5d-1f0a9b8c7d61', reference: 'EMB-XX01', status: 'released' });
    vi.mocked(listMyBookings).mockResolvedValue([done, upcoming, abandoned, waiting, cancelled]);
    const wrapper = await mountAt('/bookings');
    expect(wrapper.find('h1').text()).toBe('Your bookings');
    const refs = (group: string) => wrapper.findAll(`[data-group="${group}"] .bookings__ref`).map((r) => r.text());
    expect(refs('upcoming')).toEqual(['EMB-UP02', 'EMB-UP01']);
    expect(refs('past')).toEqual(['EMB-PA02', 'EMB-PA01']);
    expect(wrapper.text()).not.toContain('EMB-XX01');
    const first = wrapper.find('[data-group="upcoming"] a');
    expect(first.attributes('href')).toBe(`/bookings/${waiting.id}`);
    expect(first.find('[data-status]').text()).toBe('Waiting for the technician');
    expect(first.text()).toContain('Glutwerk Mobil · Innsbruck');
    expect(first.text()).toContain('€149.76');
    expect(wrapper.find('[data-group="past"] [data-status="cancelled_by_owner"]').text()).toBe('Cancelled by you');
    // the pages' messages load with them and keep the first load's account-menu entry
    expect(i18n.global.t('bookings.nav')).toBe('Your bookings');
  });

  it('says what to do when there are no bookings yet, and retries a failed load', async () => {
    vi.mocked(listMyBookings).mockRejectedValueOnce(problem(500, 'INTERNAL', 'Internal')).mockResolvedValueOnce([]);
    const wrapper = await mountAt('/bookings');
    await wrapper.find('[data-state="error"] button').trigger('click');
    await flushPromises();
    const empty = wrapper.find('[data-state="empty"]');
    expect(empty.text()).toContain('No bookings yet');
    expect(empty.find('a').attributes('href')).toBe('/search');
  });
});
