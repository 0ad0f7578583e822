import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { launchBrowser, openDemo } from './browser';
import { analysisStamp, netPanelText, selectedCount, waitForAnalysis, type DemoWindow } from './demoActions';
import truth from '../../sample-maps/korvane/truth.json';

/**
 * A selection polygon drawn with the keyboard alone, as someone without a pointer would: the
 * polygon tool picked with its key in the toolbar, the map moved with its arrow keys under the
 * centre cross, corners dropped with Space, one taken back with Backspace, Enter to finish.
 * The selection must then be exactly the stations inside the corners that were dropped, and
 * the net must show a fold axis.
 */

async function press(page: Page, key: string): Promise<void> {
  await page.keyboard.press(key);
  // MapLibre eases keyboard pans; wait until the map is still before the next key.
  await page.waitForFunction(() => !(window as unknown as DemoWindow).foldlensDemo.map.isMoving());
}

const announcement = (page: Page): Promise<string> => page.locator('.foldlens-announcer').innerText();

describe('keyboard polygon selection in the demo', () => {
  let browser: Browser;
  let page: Page;
  let errors: string[];
  beforeAll(async () => {
    browser = await launchBrowser();
    ({ page, errors } = await openDemo(browser));
  });
  afterAll(async () => {
    await browser?.close();
  });

  it('Space drops corners at the centre cross, Backspace takes one back, Enter selects the stations inside', async () => {
    const west = truth.domains[0].polygon;
    const centre = west.slice(0, -1).reduce((s, p) => [s[0] + p[0] / (west.length - 1), s[1] + p[1] / (west.length - 1)], [0, 0]);
    // Start over the middle of the west domain, zoomed so that 100 px steps stay inside it.
    await page.evaluate((c) => (window as unknown as DemoWindow).foldlensDemo.map.jumpTo({ center: c as [number, number], zoom: 14, bearing: 0, pitch: 0 }), centre);

    await page.locator('foldlens-toolbar').getByRole('button', { name: /Pan/ }).focus();
    await page.keyboard.press('g');
    expect(await page.locator('foldlens-toolbar').getByRole('button', { name: /Polygon/ }).getAttribute('aria-pressed')).toBe('true');

    await page.locator('canvas.maplibregl-canvas').focus();
    await expect.poll(() => page.locator('.foldlens-crosshair').isVisible()).toBe(true);

    const corners: Array<[number, number]> = [];
    const dropCorner = async (): Promise<void> => {
      corners.push(await page.evaluate(() => {
        const c = (window as unknown as DemoWindow).foldlensDemo.map.getCenter();
        return [c.lng, c.lat] as [number, number];
      }));
      await page.keyboard.press(' ');
    };
    await press(page, 'ArrowUp');
    await press(page, 'ArrowLeft');
    await dropCorner();
    await press(page, 'ArrowRight');
    await press(page, 'ArrowRight');
    await dropCorner();
    // A stray corner, taken back.
    await press(page, 'ArrowRight');
    await dropCorner();
    await page.keyboard.press('Backspace');
    corners.pop();
    expect(await announcement(page)).toMatch(/removed; 2 left/);
    await press(page, 'ArrowLeft');
    await press(page, 'ArrowDown');
    await press(page, 'ArrowDown');
    await dropCorner();
    await press(page, 'ArrowLeft');
    await press(page, 'ArrowLeft');
    await dropCorner();
    expect(await announcement(page)).toMatch(/Corner 4 .*Enter finishes/);

    const before = await analysisStamp(page);
    await page.keyboard.press('Enter');
    expect(await announcement(page)).toMatch(/Polygon of 4 corners finished/);
    await waitForAnalysis(page, before);

    // The stations inside the dropped corners, counted here by an even-odd test on lon/lat
    // (the square is a few hundred metres across, so the map's projection bends it negligibly).
    const expected = await page.evaluate((ring) => {
      const inside = (x: number, y: number): boolean => {
        let odd = false;
        for (let i = 0, j = ring.length - 1; i < ring.length; j = i++) {
          const [xi, yi] = ring[i];
          const [xj, yj] = ring[j];
          if (yi > y !== yj > y && x < ((xj - xi) * (y - yi)) / (yj - yi) + xi) odd = !odd;
        }
        return odd;
      };
      return (window as unknown as DemoWindow).foldlensDemo.foldlens
        .getStations().filter((s) => s.lon !== undefined && s.lat !== undefined && inside(s.lon, s.lat)).length;
    }, corners);
    const count = await selectedCount(page);
    expect(corners).toHaveLength(4);
    expect(expected).toBeGreaterThan(10);
    expect(count).toBe(expected);
    const netText = await netPanelText(page);
    expect(netText).toMatch(/Fold axis \(π\)\s*\d{3}\/\d{2}/);
    expect(errors).toEqual([]);
  });
});
