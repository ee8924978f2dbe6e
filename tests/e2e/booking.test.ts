// Browser journeys for booking (issue #7) on the seeded demo network and the local payments fake:
// Clara opens Glutwerk Mobil's profile, picks a free time, keeps her garage van, gives an address
// in Innsbruck with the pin, reads the quote and pays on the test payment page, and comes back to
// the confirmation and her bookings; then a declined card, which leaves nothing booked and the
// time released. Desktop and phone screenshots, axe on each of our pages.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { DEMO_PASSWORD } from '../../apps/api/src/db/seed/demo-data';
import { TEST_CARD } from '../setup/payments';
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

/** Clara's search: the seasonal service at Innsbruck (the town's coordinates). */
const profilePath = () => `/partners/${partnerId}?service=seasonal-heater-service&place=Innsbruck%2C+Austria&lat=47.2627&lng=11.3945`;

async function signInTo(page: Page, to: string) {
  await page.goto(`/sign-in?redirect=${encodeURIComponent(to)}`);
  await page.getByLabel('E-mail address').fill('clara@owners.example');
  await page.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).last().click();
}

/** From the profile to the pay step: the first free time, the garage van, an address with the pin. */
async function bookUpToPay(page: Page, shots: string | null): Promise<void> {
  await signInTo(page, profilePath());
  await page.getByRole('heading', { level: 1, name: 'Glutwerk Mobil' }).waitFor();
  await page.getByTestId('book-slot').first().click();

  // 1. the time
  await page.getByRole('heading', { level: 1, name: 'Book Seasonal heater service' }).waitFor();
  await page.getByTestId('slot-local').waitFor();
  expect(await page.getByTestId('book-slot').textContent()).toContain('Europe/Vienna');
  if (shots) await screenshot(page, `directory-book-slot-${shots}`);
  await page.getByTestId('slot-continue').click();

  // 2. vehicle (Clara's garage van is chosen), where, and who books
  await page.getByTestId('vehicle-summary').waitFor();
  expect(await page.getByTestId('vehicle-summary').textContent()).toContain('Korvan Cargo 4');
  await page.getByLabel('Street and number').fill('Anichstraße 7');
  await page.getByLabel('Postal code').fill('6020');
  await page.getByLabel('Town').fill('Innsbruck');
  // the pin starts at the searched town; zoomed in, a click near the base moves it to the street
  const map = page.locator('[data-testid="book-pin"] .leaflet-container');
  await map.waitFor();
  await page.locator('[data-testid="book-pin"] .leaflet-interactive').first().waitFor();
  const before = await page.getByLabel('Latitude').inputValue();
  for (let i = 0; i < 3; i++) await page.locator('[data-testid="book-pin"] .leaflet-control-zoom-in').click();
  const box = (await map.boundingBox())!;
  await map.click({ position: { x: box.width / 2 + 24, y: box.height / 2 + 16 } });
  await expect.poll(() => page.getByLabel('Latitude').inputValue()).not.toBe(before);
  expect(await page.getByTestId('pin-outside').count()).toBe(0);
  if (shots) {
    await screenshot(page, `directory-book-details-${shots}`);
    await expectAccessible(page, 'booking details');
  }
  await page.getByTestId('details-continue').click();

  // 3. the quote, line by line, with the cautions
  await page.getByTestId('quote-total').waitFor();
  expect(await page.locator('[data-testid="quote"] tbody tr').count()).toBeGreaterThanOrEqual(2);
  expect(await page.getByTestId('quote-vat').textContent()).toContain('VAT 20% (Austria)');
  await page.locator('[data-testid="book-quote"] [data-caution="exhaust-gas"]').waitFor();
  if (shots) {
    await screenshot(page, `directory-book-quote-${shots}`);
    await expectAccessible(page, 'booking quote');
  }
  await page.getByTestId('quote-continue').click();

  // 4. pay
  await page.getByText('we hold this time for you for 10 minutes').waitFor();
  if (shots) await screenshot(page, `directory-book-pay-${shots}`);
}

/**
 * Pays on the provider's page. That page is not ours: its own failed loads (it has no favicon; a
 * declined card answers 402) are left out of the page's problems, everything else stays.
 */
async function payWith(page: Page, problems: string[], card: string) {
  const from = problems.length;
  await page.getByTestId('pay').click();
  // the payments provider's page: another origin
  await page.waitForURL((url) => url.origin !== h.baseUrl);
  await page.getByLabel('Card number').fill(card);
  await page.getByLabel('Expiry date').fill('12/34');
  await page.getByLabel('Security code (CVC)').fill('123');
  await page.getByRole('button', { name: /^Pay / }).click();
  return () => {
    const mine = problems.slice(from).filter((p) => !/^console: Failed to load resource: the server responded with a status of (404|402)/.test(p));
    problems.splice(from, problems.length - from, ...mine);
  };
}

describe('booking', () => {
  it('an owner books a free time, pays with a test card and sees the confirmation and her bookings', { timeout: 180_000 }, async () => {
    const { page, context, problems } = await openPage(h, DESKTOP);
    await bookUpToPay(page, '1440');
    const leftProviderPage = await payWith(page, problems, TEST_CARD.succeeds);

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

  it('a declined card books nothing and releases the time', { timeout: 150_000 }, async () => {
    const { page, context, problems } = await openPage(h, PHONE);
    await bookUpToPay(page, '390');
    expect(await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth)).toBeLessThanOrEqual(0);
    const leftProviderPage = await payWith(page, problems, TEST_CARD.declined);
    await page.getByText(/Payment declined/).waitFor();
    // the decline's webhook releases the booking; then the owner goes back from the payment page
    await h.payments.idle();
    await page.getByRole('link', { name: 'go back to the shop', exact: true }).click();

    await page.waitForURL(/\/bookings\/[0-9a-f-]+\?cancelled=1$/);
    leftProviderPage();
    await page.getByRole('heading', { level: 1, name: 'Your card was declined' }).waitFor();
    expect(await page.locator('[data-testid="standing"] [data-status]').getAttribute('data-status')).toBe('released');
    expect(await page.getByTestId('standing-text').textContent()).toContain('Nothing was charged and the time was released');
    await page.getByTestId('try-again').waitFor();
    await screenshot(page, 'directory-booking-declined-390');
    await expectAccessible(page, 'declined payment');

    // a released attempt is not among her bookings
    const id = new URL(page.url()).pathname.split('/').at(-1)!;
    await page.goto('/bookings');
    await page.getByRole('heading', { level: 1, name: 'Your bookings' }).waitFor();
    await page.locator('[data-group="upcoming"]').waitFor();
    expect(await page.locator(`[data-booking="${id}"]`).count()).toBe(0);

    expect(problems).toEqual([]);
    await context.close();
  });
});
