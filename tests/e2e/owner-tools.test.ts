// Browser journeys for the owner tools: the pre-heat planner (computed in the page by the
// domain's planPreheat, so the page must show what that function gives for the same input) and
// the garage, whose "Plan pre-heating" fills the planner from a saved vehicle.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { PANEL_VAN_PRESET, planPreheat } from '@emberline/domain';
import { DEMO_PASSWORD } from '../../apps/api/src/db/seed/demo-data';
import { DESKTOP, expectAccessible, openPage, PHONE, screenshot, startHarness, type Harness } from './browser';

let h: Harness;
beforeAll(async () => {
  h = await startHarness();
});
afterAll(() => h?.close());

describe('pre-heat planner', () => {
  it('shows the warm-up time the domain model gives for the van preset, with chart and cautions', async () => {
    const { page, context, problems } = await openPage(h, DESKTOP);
    await page.goto('/tools/pre-heat');
    await page.getByRole('heading', { name: 'Warm-up curve' }).waitFor();
    await page.locator('canvas').first().waitFor();

    const outside = Number(await page.getByLabel('Outside temperature').inputValue());
    const expected = planPreheat({ ...PANEL_VAN_PRESET.values, outsideTemperatureC: outside, departure: '2026-12-02T07:30:00+01:00' });
    expect(expected.reachable).toBe(true);
    const minutes = Math.round(expected.timeToTargetMinutes!);
    await page.getByText(`${minutes} mins`).first().waitFor();
    await page.getByText(/closed garage/i).first().waitFor();
    await screenshot(page, 'directory-pre-heat-1440');
    await expectAccessible(page, 'pre-heat planner');
    expect(problems).toEqual([]);
    await context.close();
  });

  it('refuses a target below the outside temperature with the allowed range, and recovers', async () => {
    const { page, context } = await openPage(h, PHONE);
    await page.goto('/tools/pre-heat');
    await page.getByLabel('Outside temperature').waitFor();
    await page.getByLabel('Outside temperature').fill('25');
    await page.getByLabel('Target coolant temperature').fill('15');
    await page.getByText(/must be above the outside temperature/).first().waitFor();
    await screenshot(page, 'directory-pre-heat-error-390');
    await page.getByLabel('Target coolant temperature').fill('60');
    await page.getByRole('heading', { name: 'Warm-up curve' }).waitFor();
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
    expect(overflow).toBeLessThanOrEqual(0);
    await context.close();
  });
});

describe('garage', () => {
  it('an owner signs in, sees the seeded van, adds one, and plans pre-heating for it', async () => {
    const { page, context, problems } = await openPage(h, DESKTOP);
    await page.goto('/sign-in?redirect=/garage');
    await page.getByLabel('E-mail address').fill('jakob@owners.example');
    await page.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD);
    await page.getByRole('button', { name: 'Sign in' }).last().click();
    await page.getByRole('heading', { name: 'Your garage' }).waitFor();
    await page.getByText('Site van').first().waitFor();
    await page.getByText('Tessaro Transit 9').first().waitFor();

    await page.getByRole('button', { name: 'Add a vehicle' }).first().click();
    await page.getByLabel('Name', { exact: true }).fill('Browser test camper');
    await page.getByLabel('Model').fill('Maren Camper 2');
    await page.getByLabel('Year of manufacture').fill('2019');
    await page.getByLabel('Battery capacity').fill('110');
    await page.getByRole('button', { name: 'Save vehicle' }).click();
    await page.getByText('Browser test camper is in your garage.').waitFor();
    await screenshot(page, 'directory-garage-1440');
    await expectAccessible(page, 'garage');

    await page.getByRole('link', { name: 'Plan pre-heating for Site van' }).click();
    await page.getByRole('heading', { name: 'Warm-up curve' }).waitFor();
    // the saved 24 V van fills the planner's electrical fields
    await expect.poll(() => page.getByLabel('Battery capacity').inputValue()).toBe('180');
    await screenshot(page, 'directory-pre-heat-vehicle-1440');
    expect(problems).toEqual([]);
    await context.close();
  });
});
