// Browser journeys over the built apps: the Directory home lists the catalogue from MariaDB,
// the Console shell works, unknown pages show a 404 page, and phones get a usable layout.
import { readdirSync, statSync } from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { SERVICE_TYPES } from '../../apps/api/src/db/seed/catalogue-data';
import { root } from '../../scripts/lib/project';
import { DESKTOP, expectAccessible, openPage, PHONE, screenshot, startHarness, type Harness } from './browser';

let h: Harness;
beforeAll(async () => {
  h = await startHarness();
});
afterAll(() => h?.close());

describe('Directory', () => {
  it('lists every service type from the database on the home page, with cautions', async () => {
    const { page, problems, context } = await openPage(h, DESKTOP);
    await page.goto('/');
    for (const s of SERVICE_TYPES) await page.getByRole('heading', { name: s.name }).first().waitFor();
    await page.getByText(/carbon monoxide|exhaust/i).first().waitFor();
    await screenshot(page, 'directory-home-1440');
    await expectAccessible(page, 'directory home');
    expect(problems).toEqual([]);
    await context.close();
  });

  it('shows a service type added to the database without a rebuild', async () => {
    await h.t.dataSource.query(
      "INSERT INTO service_type (code, name, summary, description, default_duration_minutes, cautions, sort_order) VALUES ('e2e-probe-service', 'Probe service for the browser test', 'Added by a test.', 'Added by a test.', 45, '[]', 999)",
    );
    try {
      const { page, context } = await openPage(h);
      await page.goto('/');
      await page.getByRole('heading', { name: 'Probe service for the browser test' }).waitFor();
      await context.close();
    } finally {
      await h.t.dataSource.query("DELETE FROM service_type WHERE code = 'e2e-probe-service'");
    }
  });

  it('works on a phone without sideways scrolling', async () => {
    const { page, problems, context } = await openPage(h, PHONE);
    await page.goto('/');
    await page.getByRole('heading', { name: SERVICE_TYPES[0]!.name }).first().waitFor();
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
    expect(overflow).toBeLessThanOrEqual(0);
    await screenshot(page, 'directory-home-390');
    await expectAccessible(page, 'directory home on a phone');
    expect(problems).toEqual([]);
    await context.close();
  });

  it('has a safety page reachable from the footer', async () => {
    const { page, context } = await openPage(h);
    await page.goto('/');
    await page.getByRole('contentinfo').getByRole('link', { name: /safety/i }).first().click();
    await page.getByRole('heading', { level: 1 }).waitFor();
    await page.getByText(/closed garage/i).first().waitFor();
    await page.getByText(/stable .*power|battery support/i).first().waitFor();
    await screenshot(page, 'directory-safety-1440');
    await expectAccessible(page, 'safety page');
    await context.close();
  });

  it('shows a 404 page for an unknown address, with a way home', async () => {
    const { page, context } = await openPage(h);
    await page.goto('/no/such/page');
    await page.getByText(/could not find that page/i).first().waitFor();
    await page.getByRole('link', { name: /home|directory|start/i }).first().click();
    await page.waitForURL(`${h.baseUrl}/`);
    await context.close();
  });

  it('shows an error with a retry when the catalogue cannot be loaded, and recovers', async () => {
    const { page, context } = await openPage(h);
    let fail = true;
    await page.route('**/api/catalogue/service-types', (route) => (fail ? route.fulfill({ status: 503, contentType: 'application/problem+json', body: JSON.stringify({ type: 'about:blank', title: 'Unavailable', status: 503, code: 'SERVICE_UNAVAILABLE' }) }) : route.continue()));
    await page.goto('/');
    const retry = page.getByRole('button', { name: /try again|retry/i }).first();
    await retry.waitFor();
    fail = false;
    await retry.click();
    await page.getByRole('heading', { name: SERVICE_TYPES[0]!.name }).first().waitFor();
    await context.close();
  });
});

describe('Console', () => {
  it('opens the shell with its navigation and the catalogue overview', async () => {
    const { page, problems, context } = await openPage(h, DESKTOP);
    await page.goto('/console/');
    await page.getByRole('navigation').first().waitFor();
    await page.getByText(SERVICE_TYPES[0]!.name).first().waitFor();
    await screenshot(page, 'console-shell-1440');
    await expectAccessible(page, 'console shell');
    expect(problems).toEqual([]);
    await context.close();
  });

  it('is usable on a phone', async () => {
    const { page, context } = await openPage(h, PHONE);
    await page.goto('/console/');
    await page.getByText(SERVICE_TYPES[0]!.name).first().waitFor();
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
    expect(overflow).toBeLessThanOrEqual(0);
    await screenshot(page, 'console-shell-390');
    await context.close();
  });

  it('serves the Console for deep links and a 404 page inside it', async () => {
    const { page, context } = await openPage(h);
    const res = await page.goto('/console/definitely-not-a-page');
    expect(res?.status()).toBe(200);
    await page.getByText(/could not find that page/i).first().waitFor();
    await context.close();
  });
});

describe('production build', () => {
  it('has no JavaScript chunk over 500 kB', () => {
    const assets = path.join(root, 'dist/assets');
    const js = readdirSync(assets).filter((f) => f.endsWith('.js'));
    expect(js.length).toBeGreaterThan(0);
    const big = js.map((f) => ({ f, kb: statSync(path.join(assets, f)).size / 1000 })).filter((x) => x.kb > 500);
    expect(big).toEqual([]);
  });

  it('ships Lato with the app and loads nothing from another origin', async () => {
    const { page, context } = await openPage(h);
    const foreign: string[] = [];
    page.on('request', (r) => {
      if (!r.url().startsWith(h.baseUrl) && !r.url().startsWith('data:')) foreign.push(r.url());
    });
    await page.goto('/');
    await page.getByRole('heading', { name: SERVICE_TYPES[0]!.name }).first().waitFor();
    const font = await page.evaluate(() => getComputedStyle(document.body).fontFamily);
    expect(font).toMatch(/Lato/);
    expect(await page.evaluate(() => document.fonts.check('16px Lato'))).toBe(true);
    expect(foreign).toEqual([]);
    await context.close();
  });
});
