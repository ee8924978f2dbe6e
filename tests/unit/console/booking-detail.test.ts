// Booking detail: only the moves the lifecycle allows for the partner per status, reasons for
// declining and cancelling, confirmations, plain errors with a reload on 409, a move to a free
// time, and the customer, quote, share and safety cautions on the page.
import { beforeEach, describe, expect, it, vi } from 'vitest';
import { DOMWrapper, flushPromises, mount } from '@vue/test-utils';
import { createPinia, setActivePinia } from 'pinia';
import { createMemoryHistory } from 'vue-router';
import { DateTime } from 'luxon';
import type { Booking, MemberRole } from '@emberline/domain';
import { refreshSession } from '@/api/auth';
import { decideBooking, getPartnerBooking } from '@/api/bookings';
import { listServiceTypes } from '@/api/catalogue';
import { getPartnerSlots } from '@/api/offers';
import { getTeam } from '@/api/team';
import { i18n } from '@/locales';
import { createAppRouter } from '@/router';
import BookingDetail from '@/views/bookings/booking-detail.vue';
import { ORG_A, me, member, problem, session, team } from './fixtures';
import { ADMIN_ID, BOOKING_ID, TECH_ID, booking, freeTimes, inStatus } from './booking-fixtures';

vi.mock('@/api/auth', () => ({ refreshSession: vi.fn(), signIn: vi.fn(), signOut: vi.fn() }));
vi.mock('@/api/team', () => ({ getTeam: vi.fn() }));
vi.mock('@/api/catalogue', () => ({ listServiceTypes: vi.fn(), listCapabilities: vi.fn() }));
vi.mock('@/api/offers', () => ({ getPartnerSlots: vi.fn(), getServiceArea: vi.fn(), getWorkingHours: vi.fn() }));
vi.mock('@/api/bookings', () => ({ getPartnerBooking: vi.fn(), decideBooking: vi.fn(), listPartnerBookings: vi.fn(), fetchBookingsCsv: vi.fn() }));
vi.mock('@emberline/ui/area-map', () => ({ __esModule: true, default: { name: 'AreaMapStub', props: ['lat', 'lng', 'label'], template: '<div data-testid="map-stub" :data-lat="lat" :data-lng="lng" :aria-label="label"></div>' } }));

async function mountDetail(first: Booking, role: MemberRole = 'partner_admin', userId = ADMIN_ID) {
  vi.mocked(getPartnerBooking).mockResolvedValue(first);
  vi.mocked(refreshSession).mockResolvedValue(session(me({ id: userId, memberships: [member(role)] })));
  const router = createAppRouter(createMemoryHistory());
  await router.push(`/bookings/${BOOKING_ID}`);
  await router.isReady();
  const wrapper = mount(BookingDetail, { global: { plugins: [router, i18n] }, attachTo: document.body });
  await flushPromises();
  return wrapper;
}

const actionsOf = (wrapper: ReturnType<typeof mount>) => wrapper.findAll('[data-testid="booking-actions"] [data-action]').map((b) => b.attributes('data-action'));
const $ = (selector: string) => new DOMWrapper(document.body.querySelector<HTMLElement>(selector)!);
const dialogButton = (text: string) => [...document.body.querySelectorAll<HTMLButtonElement>('.ant-modal .ant-btn')].find((b) => b.textContent?.trim() === text);
const hoursFromNow = (h: number) => new Date(Date.now() + h * 3_600_000).toISOString();

describe('Console booking detail', () => {
  beforeEach(() => {
    localStorage.clear();
    document.body.innerHTML = '';
    setActivePinia(createPinia());
    vi.clearAllMocks();
    vi.mocked(getTeam).mockResolvedValue(team);
    vi.mocked(listServiceTypes).mockResolvedValue([
      { code: 'handset-pairing', name: 'Handset pairing and range check', summary: '', description: '', defaultDurationMinutes: 30, requiredCapabilities: [], cautions: ['vehicle-electrics', 'exhaust-gas'], retired: false },
    ]);
  });

  it('offers accept and decline on a request', async () => {
    const wrapper = await mountDetail(inStatus('requested'));
    expect(getPartnerBooking).toHaveBeenCalledWith(ORG_A, BOOKING_ID, expect.anything());
    expect(actionsOf(wrapper)).toEqual(['accept', 'decline']);
  });

  it('offers start, move and cancel on a confirmed booking, and the no-show only once the start has passed', async () => {
    const upcoming = await mountDetail(inStatus('confirmed', { start: hoursFromNow(48), end: hoursFromNow(49.5) }));
    expect(actionsOf(upcoming)).toEqual(['start', 'reschedule', 'cancel']);
    upcoming.unmount();
    const started = await mountDetail(inStatus('confirmed', { start: hoursFromNow(-1), end: hoursFromNow(0.5) }));
    expect(actionsOf(started)).toEqual(['start', 'reschedule', 'no-show', 'cancel']);
  });

  it('offers only completion on a job under way, and nothing once it is closed', async () => {
    const running = await mountDetail(inStatus('in_progress'));
    expect(actionsOf(running)).toEqual(['complete']);
    running.unmount();
    for (const status of ['completed', 'declined', 'cancelled_by_owner', 'no_show', 'expired'] as const) {
      const closed = await mountDetail(inStatus(status));
      expect(actionsOf(closed)).toEqual([]);
      expect(closed.find('[data-testid="booking-actions"]').text()).toContain('Nothing to do here');
      closed.unmount();
    }
  });

  it('gives a technician the moves on their own jobs only', async () => {
    const own = await mountDetail(inStatus('requested'), 'technician', TECH_ID);
    expect(actionsOf(own)).toEqual(['accept', 'decline']);
    own.unmount();
    const other = await mountDetail(inStatus('requested', { technician: { id: ADMIN_ID, name: 'Mara Kessel' } }), 'technician', TECH_ID);
    expect(actionsOf(other)).toEqual([]);
    expect(other.find('[data-testid="booking-actions"]').text()).toContain('Only a partner admin or Mara Kessel, who does this job, can change this booking.');
  });

  it('accepts a request and shows the booking as it is now', async () => {
    const wrapper = await mountDetail(inStatus('requested'));
    vi.mocked(decideBooking).mockResolvedValue(inStatus('confirmed'));
    vi.mocked(getPartnerBooking).mockResolvedValue(inStatus('confirmed', { start: hoursFromNow(48), end: hoursFromNow(49.5) }));
    await wrapper.find('[data-action="accept"]').trigger('click');
    await flushPromises();
    expect(decideBooking).toHaveBeenCalledWith(ORG_A, BOOKING_ID, { action: 'accept' });
    expect(getPartnerBooking).toHaveBeenCalledTimes(2);
    expect(wrapper.find('[data-testid="booking-status"]').text()).toBe('Confirmed');
    expect(actionsOf(wrapper)).toEqual(['start', 'reschedule', 'cancel']);
  });

  it('asks for a reason before declining and sends it', async () => {
    const wrapper = await mountDetail(inStatus('requested'));
    vi.mocked(decideBooking).mockResolvedValue(inStatus('declined'));
    await wrapper.find('[data-action="decline"]').trigger('click');
    await flushPromises();
    expect($('.ant-modal-title').text()).toBe('Decline booking EMB-7K2Q?');
    dialogButton('Decline the request')!.click();
    await flushPromises();
    expect(decideBooking).not.toHaveBeenCalled();
    expect($('[data-testid="reason-error"]').text()).toBe('Say why, in a few words');
    expect($('[data-testid="decision-reason"]').attributes('aria-invalid')).toBe('true');

    await $('[data-testid="decision-reason"]').setValue('No technician free on that day');
    dialogButton('Decline the request')!.click();
    await flushPromises();
    expect(decideBooking).toHaveBeenCalledWith(ORG_A, BOOKING_ID, { action: 'decline', reason: 'No technician free on that day' });
    expect(getPartnerBooking).toHaveBeenCalledTimes(2);
  });

  it('shows the server\'s field error beside the reason', async () => {
    const wrapper = await mountDetail(inStatus('requested'));
    vi.mocked(decideBooking).mockRejectedValue(problem(400, 'VALIDATION_FAILED', 'Check the fields.', [{ path: 'body.reason', message: 'Use words the owner can read' }]));
    await wrapper.find('[data-action="decline"]').trigger('click');
    await flushPromises();
    await $('[data-testid="decision-reason"]').setValue('???');
    dialogButton('Decline the request')!.click();
    await flushPromises();
    expect($('[data-testid="reason-error"]').text()).toBe('Use words the owner can read');
    expect(document.body.querySelector('[data-testid="dialog-error"]')).toBeNull();
  });

  it('cancels with a reason, saying the owner gets a full refund', async () => {
    const wrapper = await mountDetail(inStatus('confirmed', { start: hoursFromNow(48), end: hoursFromNow(49.5) }));
    vi.mocked(decideBooking).mockResolvedValue(inStatus('cancelled_by_partner'));
    await wrapper.find('[data-action="cancel"]').trigger('click');
    await flushPromises();
    expect($('.ant-modal-body').text()).toContain('Pia Lechner gets all their money back (€65.52)');
    await $('[data-testid="decision-reason"]').setValue('Van of the technician broke down');
    dialogButton('Cancel and refund')!.click();
    await flushPromises();
    expect(decideBooking).toHaveBeenCalledWith(ORG_A, BOOKING_ID, { action: 'cancel', reason: 'Van of the technician broke down' });
  });

  it('asks before marking a job as done, saying the owner\'s payment is taken and the owner gets the receipt', async () => {
    const b = inStatus('in_progress');
    const wrapper = await mountDetail(b);
    vi.mocked(decideBooking).mockResolvedValue(inStatus('completed'));
    await wrapper.find('[data-action="complete"]').trigger('click');
    await flushPromises();
    expect(decideBooking).not.toHaveBeenCalled();
    expect(document.body.querySelector('[data-testid="decision-reason"]')).toBeNull();
    const text = $('.ant-modal-body').text();
    expect(text).toContain(`${b.customer.name}’s payment of €${(b.payment.authorisedMinor / 100).toFixed(2)}`);
    expect(text).toContain('gets the receipt by e-mail');
    dialogButton('Mark as done')!.click();
    await flushPromises();
    expect(decideBooking).toHaveBeenCalledWith(ORG_A, BOOKING_ID, { action: 'complete' });
  });

  it('keeps "Start" greyed out before the start window opens, saying from when, and after the job\'s day', async () => {
    const from = new Date(Date.now() + 46 * 3_600_000).toISOString();
    const early = await mountDetail(inStatus('confirmed', { start: hoursFromNow(48), end: hoursFromNow(49.5), startWindow: { from, until: hoursFromNow(60) } }));
    expect(actionsOf(early)).toEqual(['start', 'reschedule', 'cancel']);
    expect(early.find('[data-action="start"]').attributes('disabled')).toBeDefined();
    const time = new Intl.DateTimeFormat('en', { hour: '2-digit', minute: '2-digit', hourCycle: 'h23', timeZone: 'Europe/Vienna' }).format(new Date(from));
    expect(early.find('[data-testid="start-hint"]').text()).toContain(`You can start this job from`);
    expect(early.find('[data-testid="start-hint"]').text()).toContain(time);
    early.unmount();

    const open = await mountDetail(inStatus('confirmed', { start: hoursFromNow(1), end: hoursFromNow(1.5), startWindow: { from: hoursFromNow(-1), until: hoursFromNow(10) } }));
    expect(open.find('[data-action="start"]').attributes('disabled')).toBeUndefined();
    expect(open.find('[data-testid="start-hint"]').exists()).toBe(false);
    open.unmount();

    const over = await mountDetail(inStatus('confirmed', { start: hoursFromNow(-30), end: hoursFromNow(-29), startWindow: { from: hoursFromNow(-32), until: hoursFromNow(-10) } }));
    expect(over.find('[data-action="start"]').attributes('disabled')).toBeDefined();
    expect(over.find('[data-testid="start-hint"]').text()).toContain('no longer be started');
  });

  it('says plainly when the move is no longer allowed and reloads the booking', async () => {
    const wrapper = await mountDetail(inStatus('requested'));
    vi.mocked(decideBooking).mockRejectedValue(problem(409, 'BOOKING_STATE', 'The owner cancelled this booking a moment ago.'));
    vi.mocked(getPartnerBooking).mockResolvedValue(inStatus('cancelled_by_owner'));
    await wrapper.find('[data-action="accept"]').trigger('click');
    await flushPromises();
    const alert = wrapper.find('[data-testid="action-error"]');
    expect(alert.attributes('role')).toBe('alert');
    expect(alert.text()).toContain('The owner cancelled this booking a moment ago.');
    expect(getPartnerBooking).toHaveBeenCalledTimes(2);
    expect(wrapper.find('[data-testid="booking-status"]').text()).toBe('Cancelled by owner');
    expect(actionsOf(wrapper)).toEqual([]);
  });

  it('moves a confirmed booking to a free time of another technician, a day at a time', async () => {
    vi.mocked(getPartnerSlots).mockResolvedValue(freeTimes());
    const upcoming = inStatus('confirmed', { start: hoursFromNow(48), end: hoursFromNow(49.5) });
    const wrapper = await mountDetail(upcoming);
    vi.mocked(decideBooking).mockResolvedValue(inStatus('confirmed'));
    await wrapper.find('[data-action="reschedule"]').trigger('click');
    await flushPromises();
    // the booking's own day in its zone, from that day's midnight there
    const bookedDay = DateTime.fromISO(upcoming.start).setZone('Europe/Vienna').toISODate()!;
    expect(($('input[data-testid="reschedule-day"]').element as HTMLInputElement).value).toBe(bookedDay);
    expect(getPartnerSlots).toHaveBeenLastCalledWith(
      ORG_A,
      { serviceType: 'handset-pairing', lat: 47.2654, lng: 11.3927, from: DateTime.fromISO(bookedDay, { zone: 'Europe/Vienna' }).toISO(), days: 1 },
      expect.anything(),
    );

    await $('input[data-testid="reschedule-day"]').setValue('2026-03-16');
    await flushPromises();
    expect(getPartnerSlots).toHaveBeenLastCalledWith(ORG_A, expect.objectContaining({ from: '2026-03-16T00:00:00.000+01:00', days: 1 }), expect.anything());
    const technician = () => $('[data-testid="reschedule-technician"] select').element as HTMLSelectElement;
    expect(technician().value).toBe(TECH_ID);
    expect($('[data-testid="reschedule-times"]').text()).toBe('08:0010:00');

    // without a time nothing is sent
    dialogButton('Move the booking')!.click();
    await flushPromises();
    expect(decideBooking).not.toHaveBeenCalled();
    expect($('[data-testid="reschedule"]').text()).toContain('Choose one of the times');

    // on the 18th only Mara Kessel has a time
    await $('input[data-testid="reschedule-day"]').setValue('2026-03-18');
    await flushPromises();
    expect(technician().value).toBe(ADMIN_ID);
    expect($('[data-testid="reschedule-times"]').text()).toBe('13:00');
    await $('[data-testid="reschedule-times"] input[type="radio"]').setValue(true);
    dialogButton('Move the booking')!.click();
    await flushPromises();
    expect(decideBooking).toHaveBeenCalledWith(ORG_A, BOOKING_ID, { action: 'reschedule', start: '2026-03-18T12:00:00.000Z', technicianId: ADMIN_ID });
    expect(getPartnerBooking).toHaveBeenCalledTimes(2);
  });

  it('says plainly when the chosen time was taken meanwhile and loads the times again', async () => {
    vi.mocked(getPartnerSlots).mockResolvedValue(freeTimes());
    const wrapper = await mountDetail(inStatus('confirmed', { start: hoursFromNow(48), end: hoursFromNow(49.5) }));
    vi.mocked(decideBooking).mockRejectedValue(problem(409, 'SLOT_TAKEN', 'Someone booked this time a moment ago.'));
    await wrapper.find('[data-action="reschedule"]').trigger('click');
    await flushPromises();
    await $('input[data-testid="reschedule-day"]').setValue('2026-03-16');
    await flushPromises();
    const calls = vi.mocked(getPartnerSlots).mock.calls.length;
    await $('[data-testid="reschedule-times"] input[type="radio"]').setValue(true);
    dialogButton('Move the booking')!.click();
    await flushPromises();
    expect($('[data-testid="reschedule-error"]').text()).toContain('Someone booked this time a moment ago.');
    expect(vi.mocked(getPartnerSlots).mock.calls.length).toBe(calls + 1);
  });

  it('shows the customer, vehicle, place, quote, share, payment, cautions and history', async () => {
    const wrapper = await mountDetail(booking());
    expect(wrapper.find('h1').text()).toBe('Booking EMB-7K2Q');
    expect(wrapper.find('.booking__when').text()).toContain('Tuesday, 10 March 2026, 09:00 to 10:30 (Europe/Vienna)');
    const customer = wrapper.find('[data-testid="customer"]').text();
    for (const text of ['Pia Lechner', 'Lechner Transporte', 'ATU13585627', 'pia@lechner-transporte.example', '+43 512 555 010']) expect(customer).toContain(text);
    expect(wrapper.find('[data-testid="customer"] a[href^="tel:"]').attributes('href')).toBe('tel:+43512555010');
    expect(wrapper.find('[data-testid="vehicle"]').text()).toContain('Diesel');
    expect(wrapper.find('[data-testid="job-address"]').text()).toContain('6020 Innsbruck');
    const map = wrapper.find('[data-testid="map-stub"]');
    expect(map.attributes('data-lat')).toBe('47.2654');
    expect(wrapper.find('[data-testid="quote-gross"]').text()).toBe('€65.52');
    const share = wrapper.find('[data-testid="partner-share"]').text();
    expect(share).toContain('Network commission (12% of labour and travel)');
    expect(share).toContain('€45.48');
    expect(wrapper.find('[data-payment="authorised"]').text()).toBe('Held on the owner’s card');
    expect(wrapper.findAll('[data-testid="booking-cautions"] [data-caution]').map((c) => c.attributes('data-caution'))).toEqual(['vehicle-electrics', 'exhaust-gas']);
    expect(wrapper.findAll('[data-testid="booking-history"] li')).toHaveLength(2);
  });

  it('shows the partner\'s share line by line, and the lines add up: 318.00 − 53.00 VAT = 265.00 − 21.60 − 5.02 = 238.38', async () => {
    const quote = booking().quote;
    const wrapper = await mountDetail(
      booking({
        quote: { ...quote, netMinor: 26_500, vatMinor: 5_300, grossMinor: 31_800 },
        partnerQuote: { commissionBp: 1200, commissionMinor: 2_160, partnerShareMinor: 23_838, processingFeeEstimateMinor: 502 },
      }),
    );
    const rows = wrapper.findAll('[data-testid="share-lines"] > div').map((d) => [d.attributes('data-line'), d.find('dt').text(), d.find('dd').text()]);
    expect(rows).toEqual([
      ['gross', 'The owner pays', '€318.00'],
      ['vat', 'VAT for your VAT return (Austria, 20%)', '− €53.00'],
      ['net', 'Net price', '€265.00'],
      ['commission', 'Network commission (12% of labour and travel)', '− €21.60'],
      ['processing-fee', 'Payment fee (estimate)', '− €5.02'],
      ['share', 'Your share', '€238.38'],
    ]);
  });

  it('shows the workshop address for work at the workshop, without a map', async () => {
    const wrapper = await mountDetail(booking({ jobAt: 'workshop', address: null, workshopAddress: 'Gewerbepark 4, 6063 Rum' }));
    expect(wrapper.find('[data-testid="workshop-address"]').text()).toBe('Gewerbepark 4, 6063 Rum');
    expect(wrapper.find('[data-testid="map-stub"]').exists()).toBe(false);
  });
});
