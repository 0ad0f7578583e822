import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import proj4 from 'proj4';
import type { Browser, Page } from 'playwright-core';
import { launchBrowser, openDemo } from './browser';

/**
 * An EPSG code outside the built-in list, typed on the demo page: the EPSG table is fetched only
 * then (a module of its own), the form names the system, and the stations land where proj4 puts
 * them with the definition the EPSG register gives (epsg-index 2.0.0, s/2263.json). With the
 * network cut on first use, the form says plainly why the code cannot be used, and it works once
 * the network is back.
 */

const PUBLISHED_2263 = (JSON.parse(readFileSync('node_modules/epsg-index/s/2263.json', 'utf8')) as { proj4: string }).proj4;
// Invented stations in New York State Plane, Long Island zone (US survey feet).
const CSV = 'Station,Type,X_ft,Y_ft,Dip Dir,Dip\nHP-1,Bedding,1000000,200000,120,30\nHP-2,Bedding,1012000,204500,95,42\nHP-3,Bedding,1020500,199000,310,12\n';
const XY: Record<string, [number, number]> = { 'HP-1': [1000000, 200000], 'HP-2': [1012000, 204500], 'HP-3': [1020500, 199000] };

async function dropCsv(page: Page): Promise<void> {
  await page.locator('#data-panel > summary').click();
  await page.locator('foldlens-import [part="panel"]').waitFor();
  await page.evaluate((content) => {
    const dt = new DataTransfer();
    dt.items.add(new File([content], 'harrow-point.csv', { type: 'text/csv' }));
    const zone = document.querySelector('foldlens-import')!.shadowRoot!.querySelector('[part="panel"]')!;
    zone.dispatchEvent(new DragEvent('dragover', { dataTransfer: dt, bubbles: true, composed: true, cancelable: true }));
    zone.dispatchEvent(new DragEvent('drop', { dataTransfer: dt, bubbles: true, composed: true, cancelable: true }));
  }, CSV);
  await page.locator('foldlens-import form[part="mapping"]').waitFor({ timeout: 60_000 });
  // The headers X_ft / Y_ft are not guessed; the user picks them.
  await page.locator('foldlens-import select[data-field="x"]').selectOption('X_ft');
  await page.locator('foldlens-import select[data-field="y"]').selectOption('Y_ft');
}

async function typeCrs(page: Page, text: string): Promise<void> {
  await page.locator('foldlens-import select[data-option="crs"]').selectOption({ label: 'Other: EPSG code or proj4 definition…' });
  const input = page.locator('foldlens-import input[data-option="crs-text"]');
  await input.fill(text);
  await input.press('Enter');
  await input.blur();
}

const note = (page: Page) => page.locator('foldlens-import .crs-note');

describe('an EPSG code from the table on the demo page', () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it('EPSG:2263 is looked up on first use only, named in the form, and the stations are placed with the published definition', async () => {
    const { page, errors } = await openDemo(browser);
    const tableRequests: string[] = [];
    page.on('request', (r) => {
      if (/epsgTable\.json/.test(r.url())) tableRequests.push(r.url());
    });
    await dropCsv(page);
    expect(tableRequests).toEqual([]); // not loaded with the page, nor for the mapping step
    await typeCrs(page, 'EPSG:2263');
    await expect.poll(() => note(page).textContent(), { timeout: 60_000 }).toBe('Using NAD83 / New York Long Island (ftUS) (EPSG:2263)');
    expect(tableRequests.length).toBeGreaterThan(0);
    await page.locator('foldlens-import button[part="confirm"]').click();
    await page.waitForFunction(() => document.querySelector('#dataset-label')?.textContent?.startsWith('harrow-point.csv'), null, { timeout: 60_000 });
    const where = await page.evaluate(() => {
      const stations = (window as unknown as { foldlensDemo: { stations: Array<{ id: string; lon?: number; lat?: number; problems: unknown[] }> } }).foldlensDemo.stations;
      return stations.map((s) => ({ id: s.id, lon: s.lon, lat: s.lat, problems: s.problems.length }));
    });
    expect(where).toHaveLength(3);
    for (const s of where) {
      const [lon, lat] = proj4(PUBLISHED_2263, 'WGS84', XY[s.id]);
      expect(s.problems).toBe(0);
      expect(Math.abs(s.lon! - lon), `${s.id} longitude`).toBeLessThan(1e-9);
      expect(Math.abs(s.lat! - lat), `${s.id} latitude`).toBeLessThan(1e-9);
    }
    expect(errors).toEqual([]);
    await page.context().close();
  });

  it('with the network cut before the table was ever fetched, the form says why EPSG:2263 cannot be used, and Import waits; with the network back it works', async () => {
    const { page } = await openDemo(browser);
    await dropCsv(page);
    await page.context().setOffline(true);
    await typeCrs(page, 'EPSG:2263');
    await expect.poll(() => note(page).textContent(), { timeout: 60_000 }).toMatch(/the EPSG table could not be loaded\. It is downloaded \(about 0\.2 MB\) the first time .* this device may be offline/);
    expect(await note(page).getAttribute('class')).toMatch(/\bbad\b/);
    expect(await page.locator('foldlens-import button[part="confirm"]').isDisabled()).toBe(true);
    await page.context().setOffline(false);
    await typeCrs(page, ' EPSG:2263'); // the user tries again (a change of the field)
    await expect.poll(() => note(page).textContent(), { timeout: 60_000 }).toBe('Using NAD83 / New York Long Island (ftUS) (EPSG:2263)');
    expect(await page.locator('foldlens-import button[part="confirm"]').isEnabled()).toBe(true);
    await page.context().close();
  });
});
