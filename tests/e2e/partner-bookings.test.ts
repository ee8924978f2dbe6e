// The partner's bookings in the browser, on the demo data: Kaltstart Service Bayern's admin filters
// the table, downloads the CSV, opens a requested booking and accepts it, sees it on the
// technician's week and the dashboard's "Waiting for you"; the same screens at phone size; a
// technician sees only their own jobs. Every screen is captured at desktop and phone size and
// checked with axe.
import { afterAll, beforeAll, expect, it, onTestFailed } from 'vitest';
import type { Page } from 'playwright-core';
import { DEMO_PASSWORD } from '../../apps/api/src/db/seed/demo-data';
import { DESKTOP, expectAccessible, openPage, PHONE, screenshot, startHarness, type Harness } from './browser';

let h: Harness;
beforeAll(async () => {
  h = await startHarness();
});
afterAll(() => h?.close());

async function signInConsole(page: Page, email: string, to: string) {
  await page.goto(`/console/sign-in?redirect=${encodeURIComponent(to)}`);
  await page.getByLabel('E-mail address').fill(email);
  await page.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).last().click();
}

/** The page must not scroll sideways (wide tables and the week scroll inside their cards). */
async function expectNoSideScroll(page: Page) {
  const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
  expect(overflow).toBeLessThanOrEqual(0);
}

const rows = (page: Page) => page.locator('[data-testid="bookings-table"] tbody tr.ant-table-row');

it('a partner admin filters the bookings, exports them, accepts a request and sees it on the week', async () => {
  const { page, context, problems } = await openPage(h, DESKTOP);
  onTestFailed(() => screenshot(page, 'console-bookings-failed'));

  // ---- the table: the demo week ahead, then only what waits for an answer ----
  await signInConsole(page, 'florian@kaltstart.example', '/bookings');
  await page.getByRole('heading', { name: 'Bookings', exact: true }).waitFor();
  await rows(page).first().waitFor();
  expect(await rows(page).count()).toBeGreaterThanOrEqual(6);
  await page.getByLabel('Status').selectOption('requested');
  await expect.poll(() => rows(page).count()).toBe(2);
  for (const ref of ['EMB-DEMOK3', 'EMB-DEMOK5']) await rows(page).filter({ hasText: ref }).getByText('Needs your answer').waitFor();
  await screenshot(page, 'console-bookings-1440');
  await expectAccessible(page, 'bookings table');

  // ---- CSV of what the filters select, fetched with the session's token ----
  const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'Download CSV' }).click()]);
  expect(download.suggestedFilename()).toMatch(/^bookings-\d{4}-\d{2}-\d{2}\.csv$/);
  const csv = await (await download.createReadStream()).toArray();
  const text = Buffer.concat(csv as Buffer[]).toString('utf8');
  expect(text).toContain('EMB-DEMOK3');
  expect(text).toContain('EMB-DEMOK5');
  expect(text).not.toContain('EMB-DEMOK1');

  // ---- search narrows to one; its reference opens the booking ----
  await page.getByLabel('Search', { exact: true }).fill('DEMOK3');
  await page.getByRole('button', { name: 'Search', exact: true }).click();
  await expect.poll(() => rows(page).count()).toBe(1);
  await page.getByRole('link', { name: 'Open booking EMB-DEMOK3' }).click();
  await page.getByRole('heading', { name: 'Booking EMB-DEMOK3' }).waitFor();
  const actions = page.getByTestId('booking-actions');
  await actions.getByRole('button', { name: 'Accept' }).waitFor();
  expect(await actions.getByRole('button').allTextContents()).toEqual(['Accept', 'Decline']);
  await page.getByTestId('workshop-address').getByText('Landsberger Straße 302').waitFor();
  await page.getByTestId('booking-cautions').waitFor();
  await page.getByTestId('partner-share').getByText('Your share', { exact: true }).last().waitFor();
  await screenshot(page, 'console-booking-requested-1440');
  await expectAccessible(page, 'booking detail');

  // ---- declining asks for a reason first; going back keeps the booking as it was ----
  await actions.getByRole('button', { name: 'Decline' }).click();
  const dialog = page.locator('.ant-modal');
  await dialog.getByRole('button', { name: 'Decline the request' }).click();
  await dialog.getByText('Say why, in a few words').waitFor();
  await screenshot(page, 'console-booking-decline-1440');
  await expectAccessible(page, 'decline dialog');
  await dialog.getByRole('button', { name: 'Go back' }).click();
  await dialog.waitFor({ state: 'hidden' });

  // ---- accept: the page reloads as confirmed with the next moves ----
  await actions.getByRole('button', { name: 'Accept' }).click();
  await page.getByTestId('booking-status').getByText('Confirmed').waitFor();
  await actions.getByRole('button', { name: 'Start the job' }).waitFor();
  expect(await actions.getByRole('button').allTextContents()).toEqual(['Start the job', 'Move to another time', 'Cancel the booking']);
  await page.getByTestId('booking-history').getByText('by your team').waitFor();
  await screenshot(page, 'console-booking-confirmed-1440');

  // ---- the move dialog lists free times for the same service ----
  await actions.getByRole('button', { name: 'Move to another time' }).click();
  await page.getByTestId('reschedule').waitFor();
  await page.locator('[data-testid="reschedule"] [data-state="loading"]').waitFor({ state: 'detached' });
  await screenshot(page, 'console-booking-move-1440');
  await expectAccessible(page, 'move dialog');
  await page.locator('.ant-modal').getByRole('button', { name: 'Go back' }).click();

  // ---- the week of the booking's technician: the accepted job sits on Monday at 14:00 ----
  await page.getByRole('link', { name: 'All bookings' }).click();
  await page.getByRole('link', { name: 'Week' }).click();
  await page.getByRole('heading', { name: 'Week calendar' }).waitFor();
  const picker = page.getByLabel('Whose week');
  await picker.selectOption({ label: 'Anja Brandl (Technician)' });
  await page.getByRole('button', { name: 'Next week' }).click();
  const block = page.locator('.week-grid__block').filter({ has: page.locator('.week-grid__time', { hasText: /14:00–/ }) });
  await block.waitFor();
  expect(await block.getAttribute('data-column')).toBe('2');
  expect(await block.getAttribute('data-status')).toBe('confirmed');
  await page.getByText(/Times in Europe\//).waitFor();
  await screenshot(page, 'console-bookings-week-1440');
  await block.scrollIntoViewIfNeeded();
  await screenshot(page, 'console-bookings-week-afternoon-1440');
  await expectAccessible(page, 'week calendar');
  await block.click();
  await page.getByRole('heading', { name: /^Booking EMB-DEMOK/ }).waitFor();

  // ---- the dashboard: one request still waits ----
  await page.getByRole('link', { name: 'Dashboard' }).click();
  const waiting = page.getByTestId('waiting-card');
  await waiting.getByText('One request needs your answer').waitFor();
  await waiting.getByText(/EMB-DEMOK5/).waitFor();
  await waiting.scrollIntoViewIfNeeded();
  await screenshot(page, 'console-dashboard-waiting-1440');
  await expectAccessible(page, 'dashboard');

  expect(problems).toEqual([]);
  await context.close();
}, 180_000);

it('the same screens work on a phone', async () => {
  const { page, context, problems } = await openPage(h, PHONE);
  onTestFailed(() => screenshot(page, 'console-bookings-failed-390'));
  await signInConsole(page, 'florian@kaltstart.example', '/bookings?from=');
  await page.getByRole('heading', { name: 'Bookings', exact: true }).waitFor();
  await page.getByTestId('bookings-cards').locator('li').first().waitFor();
  await expectNoSideScroll(page);
  await screenshot(page, 'console-bookings-390');
  await expectAccessible(page, 'bookings on a phone');
  // the filters fold away on a phone
  expect(await page.getByLabel('Status').isVisible()).toBe(false);
  await page.getByRole('button', { name: 'Filters' }).click();
  await page.getByLabel('Status').selectOption('confirmed');
  const cards = page.getByTestId('bookings-cards');
  await expect.poll(() => cards.getByText('Needs your answer').count()).toBe(0);
  expect(await cards.getByText('Confirmed').count()).toBeGreaterThanOrEqual(4);
  await screenshot(page, 'console-bookings-filters-390');
  await expectAccessible(page, 'bookings filters on a phone');

  await page.getByRole('link', { name: 'Open booking EMB-DEMOK1' }).click();
  await page.getByRole('heading', { name: 'Booking EMB-DEMOK1' }).waitFor();
  await page.getByTestId('booking-actions').getByRole('button', { name: 'Start the job' }).waitFor();
  await expectNoSideScroll(page);
  await screenshot(page, 'console-booking-390');
  await expectAccessible(page, 'booking on a phone');

  await page.goto('/console/bookings/week');
  await page.getByRole('heading', { name: 'Week calendar' }).waitFor();
  await page.getByRole('button', { name: 'Next week' }).click();
  await page.getByTestId('week-agenda').locator('a').first().waitFor();
  await expectNoSideScroll(page);
  await screenshot(page, 'console-bookings-week-390');
  await expectAccessible(page, 'week on a phone');

  expect(problems).toEqual([]);
  await context.close();
}, 120_000);

it('a technician sees and downloads only the jobs assigned to them', async () => {
  const { page, context, problems } = await openPage(h, DESKTOP);
  onTestFailed(() => screenshot(page, 'console-bookings-technician-failed'));
  await signInConsole(page, 'anja@kaltstart.example', '/bookings?from=');
  await page.getByRole('heading', { name: 'Your jobs' }).waitFor();
  await rows(page).first().waitFor();
  const text = await page.getByTestId('bookings-table').innerText();
  for (const ref of ['EMB-DEMOK1', 'EMB-DEMOK3', 'EMB-DEMOK5']) expect(text).toContain(ref);
  for (const ref of ['EMB-DEMOK2', 'EMB-DEMOK4', 'EMB-DEMOK6']) expect(text).not.toContain(ref);
  // nobody else's jobs to pick
  expect(await page.getByLabel('Technician', { exact: true }).count()).toBe(0);
  const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'Download CSV' }).click()]);
  const csv = Buffer.concat((await (await download.createReadStream()).toArray()) as Buffer[]).toString('utf8');
  expect(csv).toContain('EMB-DEMOK1');
  expect(csv).not.toContain('EMB-DEMOK2');
  await screenshot(page, 'console-bookings-technician-1440');
  await expectAccessible(page, 'a technician\'s bookings');
  expect(problems).toEqual([]);
  await context.close();
}, 120_000);

it('a job at the owner\'s place shows its address on the map', async () => {
  const { page, context, problems } = await openPage(h, DESKTOP);
  onTestFailed(() => screenshot(page, 'console-bookings-failed'));
  await signInConsole(page, 'lena@glutwerk.example', '/bookings');
  await page.getByRole('heading', { name: 'Bookings', exact: true }).waitFor();
  await page.getByRole('link', { name: 'Open booking EMB-DEMOC1' }).click();
  await page.getByRole('heading', { name: 'Booking EMB-DEMOC1' }).waitFor();
  await page.getByTestId('job-address').getByText('6020 Innsbruck').waitFor();
  await page.locator('.leaflet-marker-icon .area-map__pin').waitFor();
  await screenshot(page, 'console-booking-map-1440');
  await expectAccessible(page, 'booking with a map');
  expect(problems).toEqual([]);
  await context.close();
}, 120_000);
