// Browser journeys for the map search (issue #6) on the seeded demo network: a place typed into
// the place field, results on the list and the map, filters and sort, a profile with free times
// and their Book links; a garage van a service does not fit; a place nobody covers (Linz) with the
// nearest partners and the coverage alert; phone and desktop screenshots; and the Directory's
// first-load size.
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { gzipSync } from 'node:zlib';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD } from '../../apps/api/src/db/seed/demo-data';
import { root } from '../../scripts/lib/project';
import { DESKTOP, expectAccessible, openPage, PHONE, screenshot, startHarness, type Harness } from './browser';

let h: Harness;
beforeAll(async () => {
  h = await startHarness();
});
afterAll(() => h?.close());

/** The demo brief's owner in Linz, where no partner works. */
const LINZ = '/search?place=Linz%2C+Austria&lat=48.3069&lng=14.2858&service=seasonal-heater-service';
const cards = '[data-testid="results-list"] article[data-result]';
const pins = '.results-map .results-map__pin-icon, .results-map .results-map__cluster-icon';

describe('map search', () => {
  it('finds technicians near a typed place on the list and the map, filters, sorts, and opens a profile with free times', async () => {
    const { page, context, problems } = await openPage(h, DESKTOP);
    await page.goto('/search');
    const placeField = page.getByRole('combobox', { name: 'Where is your van?' });
    await placeField.fill('Innsbruck');
    await page.getByRole('option', { name: /^Innsbruck/ }).first().click();
    await expect.poll(() => placeField.inputValue()).toBe('Innsbruck, Austria');
    await page.getByLabel('What does it need?').selectOption('seasonal-heater-service');
    await page.getByTestId('search-submit').click();

    // the mobile partner in Innsbruck and the workshop in Munich, within the default 100 km
    await expect.poll(() => page.locator(cards).count()).toBe(2);
    await expect.poll(() => page.locator(pins).count()).toBeGreaterThan(0);
    await page.locator('.results-map .leaflet-marker-icon.results-map__place-icon').waitFor();
    const first = page.locator(cards).first();
    await expect.poll(() => first.locator('h3').textContent()).toBe('Glutwerk Mobil');
    expect(await first.textContent()).toContain('Net; VAT is added at booking.');
    expect(await first.getByTestId('result-total').textContent()).toMatch(/^Total€\d+\.\d{2}$/);
    await page.getByText('Kaltstart Service Bayern').first().waitFor();
    await page.getByText('At their workshop').first().waitFor();
    await page.locator('[data-caution="exhaust-gas"]').first().waitFor();
    expect(page.url()).toContain('service=seasonal-heater-service');

    // how results are ordered, from the domain's weights
    await page.getByText('How results are ordered').click();
    await page.getByText(/how near the technician is \(35%\)/).waitFor();
    await screenshot(page, 'directory-search-results-1440');
    await expectAccessible(page, 'search results');

    // only technicians who come to the van
    await page.getByLabel('At my place').check();
    await expect.poll(() => page.locator(cards).count()).toBe(1);
    expect(page.url()).toContain('mode=mobile');
    // a maximum below every price leaves nobody, and says so
    await page.getByLabel('Maximum total (EUR)').fill('50');
    await page.getByLabel('Maximum total (EUR)').press('Enter');
    await page.getByTestId('no-match').waitFor();
    await page.getByText('Your filters leave nobody').waitFor();
    expect(page.url()).toContain('maxPriceMinor=5000');
    await page.getByTestId('no-match-clear').click();
    await expect.poll(() => page.locator(cards).count()).toBe(2);

    // order by distance; back returns to the previous order
    await page.getByLabel('Order by').selectOption('distance');
    await expect.poll(() => page.url()).toContain('sort=distance');
    await expect.poll(() => first.locator('h3').textContent()).toBe('Glutwerk Mobil');
    await page.goBack();
    await expect.poll(() => page.url()).not.toContain('sort=distance');
    await expect.poll(() => page.getByLabel('Order by').inputValue()).toBe('best');

    // list item and pin light up together
    await first.hover();
    await expect.poll(() => page.locator('.results-map .results-map__pin-icon.is-active, .results-map .results-map__cluster-icon.is-active').count()).toBe(1);

    // the profile: services, free times, and the placeholder behind "Book"
    await first.getByRole('link', { name: 'Profile and free times' }).click();
    await page.getByRole('heading', { level: 1, name: 'Glutwerk Mobil' }).waitFor();
    await page.getByRole('heading', { name: 'Services and prices' }).waitFor();
    await page.getByTestId('slots-at').waitFor();
    expect(await page.getByTestId('slots-at').textContent()).toContain('The technician comes to Innsbruck, Austria.');
    const book = page.getByTestId('book-slot').first();
    await book.waitFor();
    await page.getByText('No reviews yet').first().waitFor();
    await page.locator('.area-map .leaflet-marker-icon').first().waitFor();
    await screenshot(page, 'directory-partner-profile-1440');
    await expectAccessible(page, 'partner profile');
    // "Book" opens the booking flow for that time (issue #7)
    expect(await book.getAttribute('href')).toMatch(/^\/book\/[0-9a-f-]{36}\?serviceType=seasonal-heater-service&start=/);
    expect(problems).toEqual([]);
    await context.close();
  }, 150_000);

  it('on a phone shows the results as a list or a map, and the profile stacked', async () => {
    const { page, context, problems } = await openPage(h, PHONE);
    await page.goto('/search?place=Innsbruck%2C+Austria&lat=47.2627&lng=11.3945&service=seasonal-heater-service');
    await expect.poll(() => page.locator(cards).count()).toBe(2);
    await page.getByRole('heading', { name: /technicians for Seasonal heater service/ }).scrollIntoViewIfNeeded();
    await screenshot(page, 'directory-search-results-390');
    await expectAccessible(page, 'search results on a phone');
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
    expect(overflow).toBeLessThanOrEqual(0);

    await page.getByRole('button', { name: 'Map', exact: true }).click();
    await expect.poll(() => page.locator(cards).first().isVisible()).toBe(false);
    await expect.poll(() => page.locator(pins).count()).toBeGreaterThan(0);
    await screenshot(page, 'directory-search-map-390');
    await expectAccessible(page, 'search map on a phone');

    await page.getByRole('button', { name: 'List', exact: true }).click();
    await page.locator(cards).first().getByRole('link', { name: 'Profile and free times' }).click();
    await page.getByRole('heading', { level: 1, name: 'Glutwerk Mobil' }).waitFor();
    await page.getByTestId('book-slot').first().waitFor();
    await screenshot(page, 'directory-partner-profile-390');
    expect(await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth)).toBeLessThanOrEqual(0);
    expect(problems).toEqual([]);
    await context.close();
  });

  it('for a place nobody covers shows the nearest partners, a wider radius and the coverage alert', async () => {
    const { page, context, problems } = await openPage(h, DESKTOP);
    await page.goto(LINZ);
    const empty = page.getByTestId('no-match');
    await empty.waitFor();
    await page.getByRole('heading', { name: 'Nobody offers Seasonal heater service at Linz, Austria yet' }).waitFor();
    const nearest = page.getByTestId('nearest-outside').locator('li');
    await expect.poll(() => nearest.count()).toBeGreaterThan(0);
    expect(await nearest.first().textContent()).toMatch(/km away; their area does not reach your place/);
    await page.getByTestId('widen-radius').waitFor();
    await page.getByLabel('Your e-mail address').fill('not an address');
    await page.getByRole('button', { name: 'Notify me' }).click();
    await page.locator('#coverage-email-error').waitFor();
    expect(await page.getByLabel('Your e-mail address').inputValue()).toBe('not an address');
    await screenshot(page, 'directory-search-empty-1440');
    await expectAccessible(page, 'search without results');

    await page.getByLabel('Your e-mail address').fill('linz-owner@owners.example');
    await page.getByRole('button', { name: 'Notify me' }).click();
    await page.getByTestId('alert-sent').waitFor();
    expect(await page.getByTestId('alert-sent').textContent()).toContain('linz-owner@owners.example');

    // the mobile partner's profile says Linz is outside its area and offers to pick a place
    await nearest.filter({ hasText: 'Glutwerk Mobil' }).getByRole('link').click();
    await page.getByRole('heading', { level: 1, name: 'Glutwerk Mobil' }).waitFor();
    await page.getByRole('heading', { name: 'This place is outside their area' }).waitFor();
    await page.getByRole('combobox', { name: 'Place' }).waitFor();
    expect(problems).toEqual([]);
    await context.close();
  }, 120_000);

  it('shows the empty state on a phone', async () => {
    const { page, context, problems } = await openPage(h, PHONE);
    await page.goto(LINZ);
    await page.getByTestId('no-match').waitFor();
    await page.getByTestId('no-match').scrollIntoViewIfNeeded();
    await screenshot(page, 'directory-search-empty-390');
    await expectAccessible(page, 'search without results on a phone');
    expect(await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth)).toBeLessThanOrEqual(0);
    expect(problems).toEqual([]);
    await context.close();
  });

  it('searches with a van from the garage; a conversion that does not fit it offers the one that does', async () => {
    const { page, context, problems } = await openPage(h, DESKTOP);
    await page.goto('/sign-in?redirect=/search');
    await page.getByLabel('E-mail address').fill('max@owners.example');
    await page.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD);
    await page.getByRole('button', { name: 'Sign in' }).last().click();
    await page.getByRole('heading', { level: 1, name: 'Find a technician' }).waitFor();
    await page.getByRole('combobox', { name: 'Where is your van?' }).fill('Innsbruck');
    await page.getByRole('option', { name: /^Innsbruck/ }).first().click();
    await page.getByLabel('What does it need?').selectOption('parking-conversion-auto');
    await page.getByTestId('vehicle-toggle').click();
    await page.getByLabel('Vehicle from your garage').selectOption({ label: 'Delivery van (Korvan Cargo 4 Basic, 2019)' });
    await page.getByTestId('vehicle-summary').waitFor();
    await page.getByTestId('search-submit').click();

    const block = page.getByTestId('eligibility-block');
    await block.waitFor();
    expect(await block.textContent()).toContain('manual climate control');
    await screenshot(page, 'directory-search-eligibility-1440');
    await expectAccessible(page, 'search with a vehicle that does not fit');
    await block.getByRole('button', { name: /Search for Parking heater conversion \(manual climate control\) instead/ }).click();
    await expect.poll(() => page.url()).toContain('service=parking-conversion-manual');
    await expect.poll(() => page.locator(cards).count()).toBeGreaterThan(0);
    expect(page.url()).toContain('climateControl=manual');
    expect(problems).toEqual([]);
    await context.close();
  }, 120_000);

  it('says why "use my location" gives nothing when the browser refuses it', async () => {
    const { page, context } = await openPage(h, DESKTOP);
    await page.goto('/search');
    await page.getByTestId('use-my-location').click();
    await page.getByTestId('location-problem').waitFor();
    expect(await page.getByTestId('location-problem').textContent()).toMatch(/location/);
    await context.close();
  });
});

describe('Directory first load', () => {
  const dist = path.join(root, 'dist');
  /** The entry script and every module it preloads: what the browser fetches before the first page renders. */
  const firstLoad = () => {
    const html = readFileSync(path.join(dist, 'index.html'), 'utf8');
    return [...html.matchAll(/<script[^>]*\ssrc="([^"]+\.js)"|<link[^>]*rel="modulepreload"[^>]*href="([^"]+\.js)"/g)].map((m) => (m[1] ?? m[2])!);
  };

  it('stays under 200 kB of gzipped JavaScript', () => {
    const files = firstLoad();
    expect(files.length).toBeGreaterThan(1);
    const sizes = files.map((f) => ({ f, gzip: gzipSync(readFileSync(path.join(dist, f))).length }));
    const total = sizes.reduce((sum, s) => sum + s.gzip, 0);
    expect(total, `first load: ${sizes.map((s) => `${path.basename(s.f)} ${s.gzip}`).join(', ')}`).toBeLessThan(200_000);
  });

  it('keeps the search, the profile and the map code out of it, with Leaflet bundled once', () => {
    const names = firstLoad().map((f) => path.basename(f));
    expect(names.filter((n) => /^(search|partner|results-map|area-map|leaflet)/.test(n))).toEqual([]);
    const assets = path.join(dist, 'assets');
    const withLeaflet = readdirSync(assets).filter((f) => f.endsWith('.js') && readFileSync(path.join(assets, f), 'utf8').includes('_leaflet_id'));
    expect(withLeaflet).toHaveLength(1);
    expect(withLeaflet[0]).toMatch(/^leaflet-src/);
  });
});
