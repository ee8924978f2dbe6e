// Steps of the owner's booking journey shared by the browser tests: sign in, book the first free
// time of a partner's seasonal service in Innsbruck up to the pay step, and pay on the provider's page.
import { expect } from 'vitest';
import type { Page } from 'playwright-core';
import { DEMO_PASSWORD } from '../../apps/api/src/db/seed/demo-data';
import { expectAccessible, screenshot, type Harness } from './browser';

/** Clara's search: the seasonal service at Innsbruck (the town's coordinates). */
export const profilePath = (partnerId: string) => `/partners/${partnerId}?service=seasonal-heater-service&place=Innsbruck%2C+Austria&lat=47.2627&lng=11.3945`;

export async function signInTo(page: Page, to: string) {
  await page.goto(`/sign-in?redirect=${encodeURIComponent(to)}`);
  await page.getByLabel('E-mail address').fill('clara@owners.example');
  await page.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).last().click();
}

/** From the profile to the pay step: the first free time, the garage van, an address with the pin. */
export async function bookUpToPay(page: Page, partnerId: string, shots: string | null): Promise<void> {
  await signInTo(page, profilePath(partnerId));
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
export async function payWith(h: Harness, page: Page, problems: string[], card: string) {
  await page.getByTestId('pay').click();
  // the payments provider's page: another origin
  await page.waitForURL((url) => url.origin !== h.baseUrl);
  return payOnProviderPage(h, page, problems, card);
}

/** Fills in and sends the provider's card form (already open); answers the problems filter as payWith. */
export async function payOnProviderPage(_h: Harness, page: Page, problems: string[], card: string) {
  const from = problems.length;
  await page.getByLabel('Card number').fill(card);
  await page.getByLabel('Expiry date').fill('12/34');
  await page.getByLabel('Security code (CVC)').fill('123');
  await page.getByRole('button', { name: /^Pay / }).click();
  return () => ignoreProviderPageLoads(problems, from);
}

/** Leaves out the provider page's own failed loads (no favicon; 402 on a decline) logged since `from`. */
export function ignoreProviderPageLoads(problems: string[], from: number): void {
  const mine = problems.slice(from).filter((p) => !/^console: Failed to load resource: the server responded with a status of (404|402)/.test(p));
  problems.splice(from, problems.length - from, ...mine);
}

/** The booking id in a Directory booking address (/bookings/:id, with or without a query). */
export const bookingIdOf = (url: string) => new URL(url, 'http://x').pathname.split('/').at(-1)!;
