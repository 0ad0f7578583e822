import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { launchBrowser, openDemo } from './browser';
import { brightnessAt, pngPixels } from './pngPixels';

type DemoWindow = { foldlensDemo: { map: import('maplibre-gl').Map; foldlens: { overlay: { symbolsDrawnAtFullZoom: number } } } };

/** The map's background paint, Foldlens's layer ids, symbols drawn, and the colour of a canvas pixel away from the data. */
async function mapState(page: Page) {
  return page.evaluate(async () => {
    const { map, foldlens } = (window as unknown as DemoWindow).foldlensDemo;
    await new Promise((r) => (map.loaded() ? r(null) : map.once('idle', r)));
    const layers = map.getStyle().layers.map((l) => l.id).filter((id) => id.startsWith('foldlens-'));
    const symbols = map.getZoom() < 15 ? map.queryRenderedFeatures({ layers: ['foldlens-symbols'] }).length : foldlens.overlay.symbolsDrawnAtFullZoom;
    return { background: map.getPaintProperty('korvane-background', 'background-color') as string, layers, symbols };
  });
}

/** Mean brightness (0-255) of the map's screenshot. */
async function brightness(page: Page): Promise<number> {
  const { data } = await pngPixels(page, await page.locator('#map').screenshot({ type: 'png' }));
  let sum = 0;
  for (let i = 0; i < data.length; i += 4) sum += brightnessAt(data, i);
  return sum / (data.length / 4);
}

describe('the demo map follows the light/dark theme toggle', () => {
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

  it('toggling the theme repaints the map dark and back, and the symbols are still drawn at two zooms', async () => {
    const light = await mapState(page);
    expect(light.symbols).toBeGreaterThan(20);
    const lightBrightness = await brightness(page);
    await page.locator('#theme').click();
    expect(await page.locator('#theme').getAttribute('aria-pressed')).toBe('true');
    await expect.poll(async () => (await mapState(page)).background).not.toBe(light.background);
    const dark = await mapState(page);
    expect(dark.background).toBe('#1c2124');
    // Foldlens's layers were not dropped (the map is repainted, not restyled), and draw as many symbols.
    expect(dark.layers).toEqual(light.layers);
    expect(dark.symbols).toBe(light.symbols);
    expect(await brightness(page)).toBeLessThan(lightBrightness - 40);
    // Closer in, where one custom layer draws every symbol.
    await page.evaluate(async () => {
      const { map } = (window as unknown as DemoWindow).foldlensDemo;
      map.jumpTo({ zoom: 15.3 });
      await new Promise((r) => map.once('idle', r));
    });
    expect((await mapState(page)).symbols).toBeGreaterThan(5);
    await page.locator('#theme').click();
    await expect.poll(async () => (await mapState(page)).background).toBe(light.background);
    expect(errors).toEqual([]);
  });
});
