import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { launchBrowser, openDemo } from './browser';
import { brightnessAt, pngPixels } from './pngPixels';
import { analysisStamp, domainPath, dragThrough, waitForAnalysis } from './demoActions';
import truth from '../../sample-maps/korvane/truth.json';

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

  it('in the dark theme the text of the net and of the profile panel reads on the sheet it is drawn on (WCAG contrast of at least 4.5:1)', async () => {
    // A selection, so the net has its key.
    await page.evaluate(async () => {
      const { map } = (window as unknown as DemoWindow).foldlensDemo;
      map.jumpTo({ zoom: 13 });
      await new Promise((r) => map.once('idle', r));
    });
    await page.locator('foldlens-toolbar').getByRole('button', { name: /Lasso/ }).click();
    const before = await analysisStamp(page);
    await dragThrough(page, await domainPath(page, truth.domains[0].polygon));
    await waitForAnalysis(page, before);
    // And the profile of the selection is open, with its key.
    await page.getByRole('button', { name: 'Down-plunge profile of the selection' }).click();
    await page.waitForFunction(() => document.querySelector('foldlens-profile')?.shadowRoot?.querySelector('svg .p-legend-text') !== null, undefined, { timeout: 60_000 });
    await page.locator('#theme').click();
    expect(await page.locator('#theme').getAttribute('aria-pressed')).toBe('true');
    const pairs = await page.evaluate(() => {
      const colour = (el: Element, property: 'fill' | 'color' | 'backgroundColor'): string => getComputedStyle(el)[property];
      const net = document.querySelector('foldlens-net')!.shadowRoot!;
      const netSvg = net.querySelector('svg')!;
      const profile = document.querySelector('foldlens-profile')!.shadowRoot!;
      const profileSvg = profile.querySelector('svg')!;
      return {
        netKey: [colour(net.querySelector('.r-legend-text')!, 'fill'), colour(netSvg, 'backgroundColor')],
        netNorth: [colour(net.querySelector('.r-north')!, 'fill'), colour(netSvg, 'backgroundColor')],
        profileKey: [colour(profile.querySelector('.p-legend-text')!, 'fill'), colour(profileSvg, 'backgroundColor')],
        profileScale: [colour(profile.querySelector('.p-scale-text')!, 'fill'), colour(profileSvg, 'backgroundColor')],
        page: colour(document.body, 'backgroundColor'),
      };
    });
    // Relative luminance and contrast ratio as WCAG 2.1 defines them (W3C Recommendation, "contrast ratio" and
    // "relative luminance" in its glossary): 4.5:1 is the minimum for normal text (success criterion 1.4.3).
    const luminance = (css: string): number => {
      const [r, g, b] = (css.match(/[\d.]+/g) ?? []).slice(0, 3).map((v) => Number(v) / 255).map((c) => (c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4));
      return 0.2126 * r + 0.7152 * g + 0.0722 * b;
    };
    const contrast = (a: string, b: string): number => {
      const [hi, lo] = [luminance(a), luminance(b)].sort((x, y) => y - x);
      return (hi + 0.05) / (lo + 0.05);
    };
    expect(contrast(pairs.page, 'rgb(255, 255, 255)')).toBeGreaterThan(10); // the page really is dark
    expect(contrast(pairs.netKey[0], pairs.netKey[1])).toBeGreaterThanOrEqual(4.5);
    expect(contrast(pairs.netNorth[0], pairs.netNorth[1])).toBeGreaterThanOrEqual(4.5);
    expect(contrast(pairs.profileKey[0], pairs.profileKey[1])).toBeGreaterThanOrEqual(4.5);
    expect(contrast(pairs.profileScale[0], pairs.profileScale[1])).toBeGreaterThanOrEqual(4.5);
    await page.locator('#profile-close').click();
    await page.locator('#theme').click();
  });
});
