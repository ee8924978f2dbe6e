// Browser journeys for booking (issue #7) on the seeded demo network and the local payments fake:
// Clara opens Glutwerk Mobil's profile, picks a free time, keeps her garage van, gives an address
// in Innsbruck with the pin, reads the quote and pays on the test payment page, and comes back to
// the confirmation and her bookings; then a declined card, which keeps the time held for another
// card, and the way back from the payment page, which resumes her own hold. Desktop and phone screenshots, axe on each of our pages.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { TEST_CARD } from '../setup/payments';
import { bookingIdOf, bookUpToPay, ignoreProviderPageLoads, payOnProviderPage, payWith, signInTo } from './booking-steps';
import { DESKTOP, expectAccessible, openPage, PHONE, screenshot, startHarness, type Harness } from './browser';

let h: Harness;
let partnerId = '';
beforeAll(async () => {
  h = await startHarness();
  const res = await fetch(`${h.baseUrl}/api/partners`);
  const partners = ((await res.json()) as { data: { id: string; tradingName: string }[] }).data;
  partnerId = partners.find((p) => p.tradingName === 'Glutwerk Mobil')!.id;
});
afterAll(() => h?.close());

describe('booking', () => {
  it('an owner books a free time, pays with a test card and sees the confirmation and her bookings', { timeout: 180_000 }, async () => {
    const { page, context, problems } = await openPage(h, DESKTOP);
    await bookUpToPay(page, partnerId, '1440');
    const leftProviderPage = await payWith(h, page, problems, TEST_CARD.succeeds);

    // back from the payment page: the webhook confirms the payment, the page waits for it
    await page.waitForURL(/\/bookings\/[0-9a-f-]+\?paid=1$/);
    leftProviderPage();
    await page.getByRole('heading', { level: 1, name: /Your booking is confirmed|waiting for Glutwerk Mobil to accept/ }).waitFor({ timeout: 30_000 });
    const tag = await page.locator('[data-testid="standing"] [data-status]').getAttribute('data-status');
    expect(['requested', 'confirmed']).toContain(tag);
    expect(await page.getByTestId('detail-where').textContent()).toBe('Anichstraße 7, 6020 Innsbruck, Austria');
    expect(await page.getByTestId('detail-payment').textContent()).toMatch(/held on your card/);
    await page.getByTestId('calendar').waitFor();
    await page.locator('[data-caution="exhaust-gas"]').first().waitFor();
    await screenshot(page, 'directory-booking-confirmed-1440');
    await expectAccessible(page, 'booking confirmation');

    // the calendar file, fetched with the session
    const download = page.waitForEvent('download');
    await page.getByTestId('calendar').click();
    expect((await download).suggestedFilename()).toMatch(/^emberline-EMB-[A-Z0-9]+\.ics$/);

    // change or cancel: the dialog says what cancelling now costs before anything happens
    await page.getByTestId('detail-change').scrollIntoViewIfNeeded();
    await screenshot(page, 'directory-booking-change-1440');
    await page.getByTestId('cancel-booking').click();
    await page.getByTestId('cancel-dialog').waitFor();
    expect(await page.getByTestId('cancel-cost').textContent()).toMatch(/^Cancelling now (is free|costs a fee of €\d+\.\d{2})/);
    await screenshot(page, 'directory-booking-cancel-1440');
    await expectAccessible(page, 'cancel dialog');
    await page.getByRole('button', { name: 'Keep the booking' }).click();
    await page.getByTestId('cancel-dialog').waitFor({ state: 'hidden' });

    await page.setViewportSize(PHONE);
    await page.getByRole('heading', { level: 1 }).scrollIntoViewIfNeeded();
    await screenshot(page, 'directory-booking-confirmed-390');
    expect(await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth)).toBeLessThanOrEqual(0);

    // her bookings, from the account menu
    await page.setViewportSize(DESKTOP);
    const reference = (await page.locator('.booking-detail__ref').textContent())!.replace('Reference ', '');
    await page.getByRole('button', { name: /Clara/ }).click();
    await page.getByRole('menuitem', { name: 'Your bookings' }).click();
    await page.getByRole('heading', { level: 1, name: 'Your bookings' }).waitFor();
    await page.locator('[data-group="upcoming"]').getByText(reference).waitFor();
    await page.locator('[data-group="past"] [data-status="completed"]').first().waitFor();
    await screenshot(page, 'directory-bookings-1440');
    await expectAccessible(page, 'my bookings');
    await page.setViewportSize(PHONE);
    await screenshot(page, 'directory-bookings-390');
    expect(await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth)).toBeLessThanOrEqual(0);

    expect(problems).toEqual([]);
    await context.close();
  });

  it('a declined card keeps the time held: the booking waits in her list and another card pays it', { timeout: 150_000 }, async () => {
    const { page, context, problems } = await openPage(h, PHONE);
    await bookUpToPay(page, partnerId, '390');
    expect(await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth)).toBeLessThanOrEqual(0);
    const leftProviderPage = await payWith(h, page, problems, TEST_CARD.declined);
    await page.getByText(/Payment declined/).waitFor();
    // the decline's webhook keeps the hold; the owner looks at her bookings before trying again
    await h.payments.idle();
    const id = bookingIdOf((await page.getByRole('link', { name: 'go back to the shop', exact: true }).getAttribute('href'))!);
    await page.goto('/bookings');
    leftProviderPage();
    await page.getByRole('heading', { level: 1, name: 'Your bookings' }).waitFor();
    await page.locator(`[data-group="upcoming"] [data-booking="${id}"] [data-status="held"]`).waitFor();
    await page.locator(`[data-booking="${id}"]`).click();

    await page.getByRole('heading', { level: 1, name: 'Your card was declined' }).waitFor();
    expect(await page.locator('[data-testid="standing"] [data-status]').getAttribute('data-status')).toBe('held');
    expect(await page.getByTestId('standing-text').textContent()).toMatch(/Nothing was charged\. The time is still held for you until \d{1,2}:\d{2}/);
    await screenshot(page, 'directory-booking-declined-390');
    await expectAccessible(page, 'declined payment');

    // the same payment page takes another card
    await page.getByTestId('finish-paying').click();
    await page.waitForURL((url) => url.origin !== h.baseUrl);
    const paid = await payOnProviderPage(h, page, problems, TEST_CARD.succeeds);
    await page.waitForURL(new RegExp(`/bookings/${id}\\?paid=1$`));
    paid();
    await page.getByRole('heading', { level: 1, name: /Your booking is confirmed|waiting for Glutwerk Mobil to accept/ }).waitFor({ timeout: 30_000 });

    expect(problems).toEqual([]);
    await context.close();
  });

  it('after a decline, another card on the same payment page books the time and it is among her bookings', { timeout: 150_000 }, async () => {
    const { page, context, problems } = await openPage(h, DESKTOP);
    await bookUpToPay(page, partnerId, null);
    const declined = await payWith(h, page, problems, TEST_CARD.declined);
    await page.getByText(/Payment declined/).waitFor();
    await h.payments.idle();
    declined();
    const paid = await payOnProviderPage(h, page, problems, TEST_CARD.succeeds);
    await page.waitForURL(/\/bookings\/[0-9a-f-]+\?paid=1$/);
    paid();
    const id = bookingIdOf(page.url());
    await page.getByRole('heading', { level: 1, name: /Your booking is confirmed|waiting for Glutwerk Mobil to accept/ }).waitFor({ timeout: 30_000 });
    expect(await page.getByTestId('detail-payment').textContent()).toMatch(/held on your card/);
    await screenshot(page, 'directory-booking-paid-after-decline-1440');

    await page.goto('/bookings');
    await page.getByRole('heading', { level: 1, name: 'Your bookings' }).waitFor();
    const status = await page.locator(`[data-group="upcoming"] [data-booking="${id}"] [data-status]`).getAttribute('data-status');
    expect(['requested', 'confirmed']).toContain(status);

    expect(problems).toEqual([]);
    await context.close();
  });

  it('back from the payment page keeps everything entered and resumes her own hold: the same booking and payment page', { timeout: 150_000 }, async () => {
    const { page, context, problems } = await openPage(h, DESKTOP);
    await bookUpToPay(page, partnerId, null);
    const back = () => page.getByRole('button', { name: 'Back', exact: true }).click();
    await back();
    await back();
    await page.getByLabel('Phone').fill('+43 512 123456');
    await page.getByTestId('details-continue').click();
    await page.getByTestId('quote-continue').click();
    const visit = problems.length;
    await page.getByTestId('pay').click();
    await page.waitForURL((url) => url.origin !== h.baseUrl);
    const providerUrl = page.url();
    // the provider's page links back to the booking it is for
    const bookingOnPage = async () => bookingIdOf((await page.getByRole('link', { name: 'Cancel and go back to the shop' }).getAttribute('href'))!);
    const first = await bookingOnPage();

    await page.goBack();
    await page.waitForURL((url) => url.origin === h.baseUrl && url.pathname === `/book/${partnerId}`);
    ignoreProviderPageLoads(problems, visit);
    // the pay step again, with what she entered
    await page.getByTestId('book-pay').waitFor();
    expect(await page.locator('.book-page__aside').textContent()).toContain('Anichstraße 7, 6020 Innsbruck, Austria');
    await screenshot(page, 'directory-book-back-from-payment-1440');
    await back();
    await back();
    expect(await page.getByLabel('Street and number').inputValue()).toBe('Anichstraße 7');
    expect(await page.getByLabel('Phone').inputValue()).toBe('+43 512 123456');
    expect(await page.getByTestId('vehicle-summary').textContent()).toContain('Korvan Cargo 4');
    await page.getByTestId('details-continue').click();
    await page.getByTestId('quote-continue').click();

    const again = page.waitForResponse((r) => r.url().endsWith('/api/bookings') && r.request().method() === 'POST');
    await page.getByTestId('pay').click();
    expect((await again).status()).toBe(201);
    await page.waitForURL((url) => url.origin !== h.baseUrl);
    expect(page.url()).toBe(providerUrl);
    expect(await bookingOnPage()).toBe(first);
    const paid = await payOnProviderPage(h, page, problems, TEST_CARD.succeeds);
    await page.waitForURL(new RegExp(`/bookings/${first}\\?paid=1$`));
    paid();
    await page.getByRole('heading', { level: 1, name: /Your booking is confirmed|waiting for Glutwerk Mobil to accept/ }).waitFor({ timeout: 30_000 });

    expect(problems).toEqual([]);
    await context.close();
  });
  it('the vehicle typed into the search is the one in the booking form; a garage van starts a search of its own', { timeout: 120_000 }, async () => {
    const { page, context, problems } = await openPage(h, DESKTOP);
    const typed = 'model=Test+van&fuel=diesel&factoryHeater=coolant_auxiliary&climateControl=automatic&electricalSystemV=12&year=2021';
    await signInTo(page, `/search?service=seasonal-heater-service&place=Innsbruck%2C+Austria&lat=47.2627&lng=11.3945&${typed}`);
    await page.getByRole('link', { name: 'Glutwerk Mobil', exact: true }).first().click();
    await page.getByRole('heading', { level: 1, name: 'Glutwerk Mobil' }).waitFor();
    await page.getByTestId('book-slot').first().click();
    await page.getByTestId('slot-continue').click();
    // not Clara's garage van, which the form would otherwise choose: the one she searched with
    await page.getByTestId('book-details').waitFor();
    expect(await page.locator('#book-vehicle-model').inputValue()).toBe('Test van');
    expect(await page.locator('#book-vehicle-year').inputValue()).toBe('2021');
    expect(await page.getByTestId('vehicle-summary').count()).toBe(0);
    await screenshot(page, 'directory-book-searched-vehicle-1440');

    await page.goto('/garage');
    await page.getByTestId('find-technician').first().click();
    await page.waitForURL((url) => url.pathname === '/search' && url.searchParams.get('model') === 'Korvan Cargo 4' && !!url.searchParams.get('vehicle'));

    expect(problems).toEqual([]);
    await context.close();
  });
});
