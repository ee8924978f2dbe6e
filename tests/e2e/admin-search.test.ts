// The network admin's side of the Directory search in the browser: the coverage-gaps map and
// table on the seeded unanswered searches (around Linz), and the vehicle rules in the catalogue,
// edited in the drawer and switched off and on again. Desktop and phone screenshots, axe.
import { afterAll, beforeAll, expect, it } from 'vitest';
import { DEMO_PASSWORD } from '../../apps/api/src/db/seed/demo-data';
import { DESKTOP, expectAccessible, openPage, PHONE, screenshot, startHarness, type Harness } from './browser';

let h: Harness;
beforeAll(async () => {
  h = await startHarness();
});
afterAll(() => h?.close());

it('a network admin sees where owners searched in vain and edits a vehicle rule', { timeout: 180_000 }, async () => {
  const { page, context, problems } = await openPage(h, DESKTOP);
  await page.goto(`/console/sign-in?redirect=${encodeURIComponent('/admin/coverage-gaps')}`);
  await page.getByLabel('E-mail address').fill('admin@emberline.example');
  await page.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).last().click();

  // ---- coverage gaps: the seeded searches, on the map and in the table ----
  await page.getByRole('heading', { level: 1, name: 'Coverage gaps' }).waitFor();
  await page.getByTestId('gaps-total').waitFor();
  expect(await page.getByTestId('gaps-total').textContent()).toMatch(/^\d+ unanswered searches in the last 90 days$/);
  const rows = page.locator('[data-testid="gaps-table"] tbody tr.ant-table-row');
  await rows.first().waitFor();
  expect(await rows.count()).toBeGreaterThanOrEqual(1);
  await page.locator('.demand-map .leaflet-interactive').first().waitFor();
  // a row's place selects its circle; its link opens the Directory search there
  await rows.first().locator('.gaps-place').click();
  await rows.first().locator('td').first().waitFor();
  expect(await rows.first().getAttribute('class')).toContain('gaps-row--selected');
  const href = (await rows.first().getByRole('link', { name: 'See the search' }).getAttribute('href'))!;
  expect(new URL(href, h.baseUrl).searchParams.get('service')).toBeTruthy();
  await screenshot(page, 'console-coverage-gaps-1440');
  await expectAccessible(page, 'coverage gaps');
  await page.setViewportSize(PHONE);
  await screenshot(page, 'console-coverage-gaps-390');
  await expectAccessible(page, 'coverage gaps on a phone');
  await page.setViewportSize(DESKTOP);

  // ---- vehicle rules in the catalogue: edit one in the drawer, switch it off and on ----
  await page.goto('/console/admin/catalogue');
  await page.getByRole('heading', { level: 2, name: 'Vehicle rules' }).waitFor();
  const rules = page.getByTestId('rules-table');
  // at 1440 px the rules table stays inside its card (it scrolls there) and the page does not scroll sideways
  await rules.waitFor();
  const widths = await page.evaluate(() => {
    const card = document.querySelector('.rules')!.closest('.page__card')!;
    const siblings = [...document.querySelectorAll('#console-main .page__card')].map((c) => Math.round(c.getBoundingClientRect().width));
    return { card: Math.round(card.getBoundingClientRect().width), widest: Math.max(...siblings), narrowest: Math.min(...siblings), page: document.documentElement.scrollWidth, viewport: window.innerWidth };
  });
  // as wide as the other cards of the page, not wider
  expect(widths.card).toBeLessThanOrEqual(widths.narrowest + 1);
  expect(widths.page).toBeLessThanOrEqual(widths.viewport);
  const rule = rules.locator('tr', { hasText: 'twenty-four-volt-parts' });
  await rule.waitFor();
  await rule.getByRole('button', { name: 'Edit rule twenty-four-volt-parts' }).click();
  const form = page.getByTestId('rule-form');
  await form.waitFor();
  const message = form.locator('textarea');
  expect(await message.inputValue()).toContain('24 V');
  // too short a message is refused beside the field, and nothing typed is lost
  await message.fill('Too short');
  await page.getByTestId('save-rule').click();
  await form.getByText('Write at least 10 characters').waitFor();
  expect(await message.inputValue()).toBe('Too short');
  await screenshot(page, 'console-rule-form-1440');
  await expectAccessible(page, 'rule form');
  await message.fill('A 24 V electrical system needs a receiver and heater parts rated for 24 V; the technician brings them.');
  await page.getByTestId('save-rule').click();
  await form.waitFor({ state: 'hidden' });
  await rule.getByText('the technician brings them.').waitFor();

  await rule.getByRole('button', { name: 'Switch off' }).click();
  await rule.getByText('Switched off').waitFor();
  await rule.getByRole('button', { name: 'Switch on' }).click();
  await rule.getByRole('button', { name: 'Switch off' }).waitFor();
  await rules.scrollIntoViewIfNeeded();
  await screenshot(page, 'console-rules-1440');
  await expectAccessible(page, 'vehicle rules');

  expect(problems).toEqual([]);
  await context.close();
});
