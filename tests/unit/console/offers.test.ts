// Services and prices: the offers table, the offer form (major -> minor units, a kit with a live
// total, unavailable service types with the reason, server field errors beside the field) and
// withdrawing an offer.
import { beforeEach, describe, expect, it, vi } from 'vitest';
import { DOMWrapper, flushPromises, mount } from '@vue/test-utils';
import { createPinia, setActivePinia } from 'pinia';
import { createMemoryHistory } from 'vue-router';
import type { MemberRole } from '@emberline/domain';
import { refreshSession } from '@/api/auth';
import { listCapabilities, listServiceTypes } from '@/api/catalogue';
import { getApplication } from '@/api/onboarding';
import { createOffer, deleteOffer, getBookingSettings, listOffers, listParts, saveBookingSettings, updateOffer } from '@/api/offers';
import { getTeam } from '@/api/team';
import { i18n } from '@/locales';
import { createAppRouter } from '@/router';
import OffersPage from '@/views/offers/index.vue';
import { ORG_A, me, member, problem, session, team } from './fixtures';
import { application } from './onboarding-fixtures';
import { HANDSET, OFFER_ID, RECEIVER, TECH_ID, capabilities, held, kitOffer, parts, serviceTypes } from './offer-fixtures';

vi.mock('@/api/auth', () => ({ refreshSession: vi.fn(), signIn: vi.fn(), signOut: vi.fn() }));
vi.mock('@/api/catalogue', () => ({ listCapabilities: vi.fn(), listServiceTypes: vi.fn() }));
vi.mock('@/api/onboarding', () => ({ getApplication: vi.fn() }));
vi.mock('@/api/team', () => ({ getTeam: vi.fn() }));
vi.mock('@/api/offers', () => ({ listOffers: vi.fn(), createOffer: vi.fn(), updateOffer: vi.fn(), deleteOffer: vi.fn(), listParts: vi.fn(), getBookingSettings: vi.fn(), saveBookingSettings: vi.fn() }));

async function mountPage(role: MemberRole = 'partner_admin') {
  vi.mocked(refreshSession).mockResolvedValue(session(me({ memberships: [member(role)] })));
  const router = createAppRouter(createMemoryHistory());
  await router.push('/services');
  await router.isReady();
  const wrapper = mount(OffersPage, { global: { plugins: [router, i18n] }, attachTo: document.body });
  await flushPromises();
  return wrapper;
}

const $ = <E extends Element = HTMLElement>(selector: string) => {
  const el = document.body.querySelector<E>(selector);
  if (!el) throw new Error(`nothing matches ${selector}`);
  return new DOMWrapper(el);
};

async function openCreate(wrapper: Awaited<ReturnType<typeof mountPage>>) {
  await wrapper.find('[data-testid="add-offer"]').trigger('click');
  await flushPromises();
}

async function typeNumber(selector: string, value: string) {
  const input = $<HTMLInputElement>(selector);
  await input.setValue(value);
  await input.trigger('blur');
}

// these mount whole pages with ant-design-vue; a busy machine needs more than the default 5 s
describe('Services and prices', { timeout: 30_000 }, () => {
  beforeEach(() => {
    localStorage.clear();
    document.body.innerHTML = '';
    setActivePinia(createPinia());
    vi.clearAllMocks();
    vi.mocked(listCapabilities).mockResolvedValue(capabilities);
    vi.mocked(listServiceTypes).mockResolvedValue(serviceTypes);
    vi.mocked(getApplication).mockResolvedValue(
      application({ status: 'approved', editable: false, capabilities: held.map((code) => ({ code, name: code, category: 'diagnostics', notes: null, serial: null })) }),
    );
    vi.mocked(getTeam).mockResolvedValue(team);
    vi.mocked(listParts).mockResolvedValue(parts);
    vi.mocked(listOffers).mockResolvedValue([kitOffer]);
    vi.mocked(getBookingSettings).mockResolvedValue({ organisationId: ORG_A, autoConfirmBookings: false });
  });

  it('lists offers with money in the offer currency, the kit total, deposit and cancellation terms', async () => {
    const wrapper = await mountPage('technician');
    expect(listOffers).toHaveBeenCalledWith(ORG_A, expect.anything());
    const cells = wrapper.findAll('tbody tr.ant-table-row td').map((td) => td.text());
    expect(cells[0]).toContain('Remote-control kit fitting');
    expect(cells[1]).toBe('€180.00');
    expect(cells[2]).toBe('1 hr 30 mins');
    expect(cells[3]).toBe('Jonas Brandt');
    expect(cells[4]).toContain('€62.00');
    expect(cells[4]).toContain('2 lines');
    expect(cells[5]).toBe('20%');
    expect(cells[6]).toBe('Free until 24 hours before the start, then €30.00');
    // technicians look, partner admins change
    expect(wrapper.find('[data-testid="edit-offer"]').exists()).toBe(false);
    expect(wrapper.find('[data-testid="add-offer"]').exists()).toBe(false);
  });

  it('shows service types the organisation lacks equipment for as unavailable, with the missing capability', async () => {
    const wrapper = await mountPage();
    await openCreate(wrapper);
    const firmware = $('[data-code="control-unit-firmware-update"]');
    expect(firmware.find<HTMLInputElement>('input').element.disabled).toBe(true);
    expect(firmware.text()).toContain('Not available: your organisation does not hold Control-unit flashing over UDS');
    // already offered: pick the existing offer instead
    expect($<HTMLInputElement>('[data-code="remote-kit-fitting"] input').element.disabled).toBe(true);
    expect($('[data-code="remote-kit-fitting"]').text()).toContain('Already offered');
    expect($<HTMLInputElement>('[data-code="handset-pairing"] input').element.disabled).toBe(false);
  });

  it('sends the price typed in major units as integer minor units, with the kit and its live total', async () => {
    vi.mocked(createOffer).mockResolvedValue({ ...kitOffer, id: OFFER_ID, serviceTypeCode: 'handset-pairing', serviceTypeName: 'Handset pairing and range check' });
    const wrapper = await mountPage();
    await openCreate(wrapper);
    await $('[data-code="handset-pairing"] input').setValue(true);
    await flushPromises();
    // the duration starts at the service type's usual length
    expect($<HTMLInputElement>('#offer_durationMinutes').element.value).toBe('30');
    await typeNumber('#offer_price', '180.1');
    await $(`[data-user="${TECH_ID}"] input`).setValue(true);
    await $('[data-testid="add-kit-line"]').trigger('click');
    await $('[data-testid="add-kit-line"]').trigger('click');
    const selects = document.body.querySelectorAll<HTMLSelectElement>('[data-testid="offer-kit"] select');
    expect(selects).toHaveLength(2);
    // a part already on another line is not offered again: free the handset first
    await new DOMWrapper(selects[1]!).setValue(RECEIVER);
    await new DOMWrapper(selects[0]!).setValue(HANDSET);
    const qty = document.body.querySelectorAll<HTMLInputElement>('[data-testid="offer-kit"] .offer-form__qty input');
    await new DOMWrapper(qty[0]!).setValue('2');
    await new DOMWrapper(qty[0]!).trigger('blur');
    await flushPromises();
    // 2 × 15.00 + 1 × 32.00
    expect($('[data-testid="kit-total"]').text()).toContain('€62.00');
    await $('[data-testid="offer-form"]').trigger('submit');
    await flushPromises();
    expect(createOffer).toHaveBeenCalledWith(ORG_A, {
      serviceTypeCode: 'handset-pairing',
      priceMinor: 18010,
      currency: 'EUR',
      durationMinutes: 30,
      technicianUserIds: [TECH_ID],
      partsKit: [
        { partId: HANDSET, quantity: 2 },
        { partId: RECEIVER, quantity: 1 },
      ],
      deposit: { kind: 'none' },
      cancellation: { freeUntilHours: 24, feeMinor: 0 },
    });
  });

  it('shows the server field error beside the field and keeps everything typed', async () => {
    vi.mocked(createOffer).mockRejectedValue(
      problem(400, 'VALIDATION_FAILED', 'Please correct the highlighted fields.', [
        { path: 'serviceTypeCode', message: 'Your organisation does not hold every capability "handset-pairing" requires; missing: digital-multimeter' },
        { path: 'priceMinor', message: 'The amount must be at most 10000000 minor units' },
      ]),
    );
    const wrapper = await mountPage();
    await openCreate(wrapper);
    await $('[data-code="handset-pairing"] input').setValue(true);
    await typeNumber('#offer_price', '95');
    await $('[data-testid="offer-form"]').trigger('submit');
    await flushPromises();
    expect(createOffer).toHaveBeenCalledWith(ORG_A, expect.objectContaining({ priceMinor: 9500 }));
    expect($('[data-testid="error-serviceTypeCode"]').text()).toContain('missing: digital-multimeter');
    // the price error sits in the price field's help, not in a page alert
    const priceItem = $<HTMLInputElement>('#offer_price').element.closest('.ant-form-item')!;
    expect(priceItem.textContent).toContain('The amount must be at most 10000000 minor units');
    expect(document.body.querySelector('[data-testid="offer-form-alert"]')).toBeNull();
    expect($<HTMLInputElement>('#offer_price').element.value).toBe('95.00');
    expect(document.body.querySelector('[data-testid="offer-form"]')).not.toBeNull();
  });

  it('refuses a price it cannot read with a field error, keeps what was typed, and saves 0 only when ticked free', async () => {
    vi.mocked(createOffer).mockResolvedValue({ ...kitOffer, id: OFFER_ID, serviceTypeCode: 'handset-pairing', serviceTypeName: 'Handset pairing and range check', priceMinor: 0 });
    const wrapper = await mountPage();
    await openCreate(wrapper);
    await $('[data-code="handset-pairing"] input').setValue(true);
    const priceHelp = () => $<HTMLInputElement>('#offer_price').element.closest('.ant-form-item')!.textContent;
    const trySave = async (typed: string) => {
      await typeNumber('#offer_price', typed);
      // what was typed stays as typed: no silent 0.00 or 100000.00
      expect($<HTMLInputElement>('#offer_price').element.value).toBe(typed);
      await $('[data-testid="offer-form"]').trigger('submit');
      await flushPromises();
      expect(createOffer).not.toHaveBeenCalled();
    };
    await trySave('-5');
    expect(priceHelp()).toContain('The price cannot be negative');
    await trySave('abc');
    expect(priceHelp()).toContain('Enter the price as a number, e.g. 180.00');
    await trySave('99999999');
    expect(priceHelp()).toContain('The price can be at most €100,000.00');
    await trySave('12.345');
    expect(priceHelp()).toContain('Use at most 2 decimal places');
    await typeNumber('#offer_price', '0');
    expect($<HTMLInputElement>('#offer_price').element.value).toBe('0.00');
    await $('[data-testid="offer-form"]').trigger('submit');
    await flushPromises();
    expect(createOffer).not.toHaveBeenCalled();
    expect(priceHelp()).toContain('Enter a price above 0, or tick that the service is free');
    // the partner says the service is free: now 0 is meant
    await $('.offer-form__free input').setValue(true);
    await $('[data-testid="offer-form"]').trigger('submit');
    await flushPromises();
    expect(createOffer).toHaveBeenCalledWith(ORG_A, expect.objectContaining({ priceMinor: 0, free: true }));
  });

  it('lets a partner admin turn automatic confirmation on; a technician only sees it', async () => {
    vi.mocked(saveBookingSettings).mockResolvedValue({ organisationId: ORG_A, autoConfirmBookings: true });
    const wrapper = await mountPage();
    expect(getBookingSettings).toHaveBeenCalledWith(ORG_A, expect.anything());
    const state = () => wrapper.find('[data-testid="auto-confirm-state"]').text();
    expect(state()).toContain('Off: each paid booking waits as a request');
    expect(wrapper.find('[data-testid="booking-settings"] label').text()).toBe('Confirm paid bookings automatically');
    await wrapper.find('[data-testid="booking-settings"] button[role="switch"]').trigger('click');
    await flushPromises();
    expect(saveBookingSettings).toHaveBeenCalledWith(ORG_A, { autoConfirmBookings: true });
    expect(state()).toContain('On: a booking is confirmed as soon as the owner’s payment is held');
    wrapper.unmount();
    document.body.innerHTML = '';
    setActivePinia(createPinia());
    const member = await mountPage('technician');
    expect(member.find<HTMLButtonElement>('[data-testid="booking-settings"] button[role="switch"]').element.disabled).toBe(true);
  });

  it('words cancellation without a fee the same in the table and the form: free until the start, not at any time', async () => {
    vi.mocked(listOffers).mockResolvedValue([{ ...kitOffer, cancellation: { freeUntilHours: 24, feeMinor: 0 } }]);
    const wrapper = await mountPage();
    const cells = wrapper.findAll('tbody tr.ant-table-row td').map((td) => td.text());
    expect(cells[6]).toBe('Free until the start');
    expect(wrapper.text()).not.toContain('any time');
    await wrapper.find('[data-testid="edit-offer"]').trigger('click');
    await flushPromises();
    expect($('[data-testid="cancellation-words"]').text()).toBe('Owners read: Free until the start.');
    await typeNumber('#offer_cancellationFee', '30');
    await flushPromises();
    expect($('[data-testid="cancellation-words"]').text()).toBe('Owners read: Free until 24 hours before the start, then €30.00.');
  });

  it('asks for the price in words a person typing euros understands', async () => {
    const wrapper = await mountPage();
    await openCreate(wrapper);
    await $('[data-code="handset-pairing"] input').setValue(true);
    await $('[data-testid="offer-form"]').trigger('submit');
    await flushPromises();
    expect(createOffer).not.toHaveBeenCalled();
    expect($<HTMLInputElement>('#offer_price').element.closest('.ant-form-item')!.textContent).toContain('Enter the net price, e.g. 180.00');
  });

  it('edits an offer without its service type, and withdraws one after confirming', async () => {
    vi.mocked(updateOffer).mockResolvedValue({ ...kitOffer, priceMinor: 19_950 });
    vi.mocked(deleteOffer).mockResolvedValue();
    const wrapper = await mountPage();
    await wrapper.find('[data-testid="edit-offer"]').trigger('click');
    await flushPromises();
    expect($<HTMLInputElement>('#offer_price').element.value).toBe('180.00');
    await typeNumber('#offer_price', '199.5');
    await $('[data-testid="offer-form"]').trigger('submit');
    await flushPromises();
    expect(updateOffer).toHaveBeenCalledWith(ORG_A, OFFER_ID, expect.objectContaining({ priceMinor: 19950, partsKit: [{ partId: HANDSET, quantity: 2 }, { partId: RECEIVER, quantity: 1 }] }));
    expect(vi.mocked(updateOffer).mock.calls[0]![2]).not.toHaveProperty('serviceTypeCode');

    await wrapper.find('[data-testid="withdraw-offer"]').trigger('click');
    await flushPromises();
    const confirm = [...document.body.querySelectorAll<HTMLButtonElement>('.ant-popover button')].find((b) => b.textContent?.includes('Withdraw'))!;
    confirm.click();
    await flushPromises();
    expect(deleteOffer).toHaveBeenCalledWith(ORG_A, OFFER_ID);
  });
});
