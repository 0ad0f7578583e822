import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { inject } from 'vitest';
import { launchBrowser, openDemo } from './browser';

type TooltipWindow = {
  map: import('maplibre-gl').Map;
  stations: Array<{ id: string; lon: number; lat: number }>;
  clicks: number[];
  __injected?: number;
};

/** Page coordinates of station i, at the map's current view. */
async function stationAt(page: Page, i: number): Promise<{ x: number; y: number }> {
  return page.evaluate((k) => {
    const w = window as unknown as TooltipWindow;
    const rect = w.map.getCanvasContainer().getBoundingClientRect();
    const p = w.map.project([w.stations[k].lon, w.stations[k].lat]);
    return { x: rect.left + p.x, y: rect.top + p.y };
  }, i);
}

const tooltip = (page: Page) => page.locator('.foldlens-tooltip');

describe('hover tooltip of a station on the map', () => {
  let browser: Browser;
  let page: Page;
  const errors: string[] = [];
  beforeAll(async () => {
    browser = await launchBrowser();
    page = await browser.newPage({ viewport: { width: 900, height: 600 } });
    page.on('pageerror', (e) => errors.push(e.message));
    page.on('console', (m) => m.type() === 'error' && errors.push(m.text()));
    await page.goto(`${inject('demoUrl')}tests/browser/pages/station-tooltip.html`);
    await page.waitForSelector('body[data-map-ready="true"]', { timeout: 60_000 });
  });
  afterAll(async () => {
    await browser?.close();
  });

  it('hovering a station shows its id, kind and attitude; an id with markup in it is shown as text, never run', async () => {
    const at = await stationAt(page, 0);
    await page.mouse.move(at.x + 40, at.y + 40);
    await page.mouse.move(at.x + 3, at.y - 2, { steps: 4 });
    await expect.poll(() => tooltip(page).isVisible()).toBe(true);
    expect(await tooltip(page).locator('.foldlens-tooltip__id').textContent()).toBe('<img src=x onerror="window.__injected=1"><b>T-1</b>');
    expect(await tooltip(page).textContent()).toBe('<img src=x onerror="window.__injected=1"><b>T-1</b>Bedding · 120/35 (dip direction/dip)');
    expect(await tooltip(page).locator('img, b').count()).toBe(0);
    expect(await page.evaluate(() => (window as unknown as TooltipWindow).__injected)).toBeUndefined();
    // Pointer users only: the station card carries the same for keyboard and screen readers.
    expect(await tooltip(page).getAttribute('aria-hidden')).toBe('true');
  });

  it('moving to another station changes the tooltip, moving off every station hides it', async () => {
    const at = await stationAt(page, 1);
    await page.mouse.move(at.x, at.y, { steps: 6 });
    await expect.poll(() => tooltip(page).textContent()).toBe('T-2Fold hinge · 074/12 antiform (trend/plunge)');
    await page.mouse.move(at.x + 60, at.y + 60, { steps: 4 });
    await expect.poll(() => tooltip(page).isVisible()).toBe(false);
  });

  it('the tooltip follows its station when the map moves under it, and a click on the station reports it', async () => {
    const before = await stationAt(page, 1);
    await page.mouse.move(before.x + 2, before.y + 2, { steps: 3 });
    await expect.poll(() => tooltip(page).isVisible()).toBe(true);
    // The map turns, tilts and zooms out under the resting pointer: the tooltip goes with the station.
    await page.evaluate(async () => {
      const w = window as unknown as TooltipWindow;
      w.map.jumpTo({ zoom: 13.5, bearing: 40, pitch: 30 });
      await new Promise((r) => w.map.once('idle', r));
    });
    const at = await stationAt(page, 1);
    expect(Math.hypot(at.x - before.x, at.y - before.y)).toBeGreaterThan(20);
    const box = (await tooltip(page).boundingBox())!;
    // Beside the station: its nearest corner 12 px away, up and to the right.
    expect(Math.abs(box.x - (at.x + 12))).toBeLessThan(2);
    expect(Math.abs(box.y + box.height - (at.y - 12))).toBeLessThan(2);
    await page.mouse.click(at.x + 2, at.y + 2);
    expect(await page.evaluate(() => (window as unknown as TooltipWindow).clicks)).toEqual([1]);
    expect(errors).toEqual([]);
  });
});

describe('the demo viewer', () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it('shows the hover tooltip of a sample station under the mouse', async () => {
    const { page, errors } = await openDemo(browser);
    const target = await page.evaluate(async () => {
      const d = (window as unknown as { foldlensDemo: { map: import('maplibre-gl').Map; stations: Array<{ id: string; lon?: number; lat?: number; plane?: unknown; line?: unknown; problems: unknown[] }> } }).foldlensDemo;
      const s = d.stations.find((x) => x.lon !== undefined && x.problems.length === 0 && (x.plane || x.line))!;
      d.map.jumpTo({ center: [s.lon!, s.lat!], zoom: 16, bearing: 0, pitch: 0 });
      await new Promise((r) => d.map.once('idle', r));
      const rect = d.map.getCanvasContainer().getBoundingClientRect();
      const p = d.map.project([s.lon!, s.lat!]);
      return { id: s.id, x: rect.left + p.x, y: rect.top + p.y };
    });
    await page.mouse.move(target.x + 30, target.y + 30);
    await page.mouse.move(target.x, target.y, { steps: 4 });
    await expect.poll(() => page.locator('#map .foldlens-tooltip .foldlens-tooltip__id').textContent()).toBe(target.id);
    expect(errors).toEqual([]);
    await page.close();
  });
});
