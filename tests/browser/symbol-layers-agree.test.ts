import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { inject } from 'vitest';
import { launchBrowser } from './browser';

/**
 * From zoom 15 a custom layer draws every symbol; below it MapLibre's symbol layer does. The two
 * must look the same where they meet: the same images, turned the same way, at the same size,
 * as sharp, also on a tilted map and at pixel ratio 2. Compared pixel by pixel just above and just
 * below zoom 15 on the symbol angle page (stations at known azimuths on a white ground).
 */
async function shot(page: Page, zoom: number, bearing: number, pitch: number): Promise<Buffer> {
  await page.evaluate(
    async ({ zoom, bearing, pitch }) => {
      const map = (window as unknown as { map: import('maplibre-gl').Map }).map;
      map.jumpTo({ zoom, bearing, pitch });
      await new Promise((r) => map.once('idle', r));
    },
    { zoom, bearing, pitch },
  );
  return page.screenshot({ type: 'png' });
}

/** Pixels that are ink (darker than the halo) in either image, and how many of them differ by more than `tolerance` in brightness. */
async function compare(page: Page, a: Buffer, b: Buffer, tolerance: number): Promise<{ ink: number; differing: number }> {
  return page.evaluate(
    async ({ a, b, tolerance }) => {
      const pixels = async (b64: string) => {
        const img = new Image();
        img.src = `data:image/png;base64,${b64}`;
        await img.decode();
        const c = document.createElement('canvas');
        c.width = img.width;
        c.height = img.height;
        const ctx = c.getContext('2d')!;
        ctx.drawImage(img, 0, 0);
        return ctx.getImageData(0, 0, c.width, c.height).data;
      };
      const [pa, pb] = [await pixels(a), await pixels(b)];
      let ink = 0;
      let differing = 0;
      for (let i = 0; i < pa.length; i += 4) {
        const la = 0.3 * pa[i] + 0.59 * pa[i + 1] + 0.11 * pa[i + 2];
        const lb = 0.3 * pb[i] + 0.59 * pb[i + 1] + 0.11 * pb[i + 2];
        if (la > 200 && lb > 200) continue;
        ink++;
        if (Math.abs(la - lb) > tolerance) differing++;
      }
      return { ink, differing };
    },
    { a: a.toString('base64'), b: b.toString('base64'), tolerance },
  );
}

describe('the custom symbol layer (zoom 15 and up) draws what the symbol layer draws below it', () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });

  for (const { ratio, pitch } of [{ ratio: 1, pitch: 0 }, { ratio: 2, pitch: 0 }, { ratio: 1, pitch: 45 }]) {
    it(`at pixel ratio ${ratio}, pitch ${pitch}°: the same symbols in the same places (under 3 % of ink pixels differ)`, async () => {
      const page = await browser.newPage({ viewport: { width: 900, height: 650 }, deviceScaleFactor: ratio });
      await page.goto(`${inject('demoUrl')}tests/browser/pages/symbol-angles.html`);
      await page.waitForSelector('body[data-map-ready="true"]', { timeout: 60_000 });
      const above = await shot(page, 15, 30, pitch);
      const drawn = await page.evaluate(() => (window as unknown as { overlay: { symbolsDrawnAtFullZoom: number } }).overlay.symbolsDrawnAtFullZoom);
      expect(drawn).toBe(16);
      const below = await shot(page, 14.9999, 30, pitch);
      expect(await page.evaluate(() => (window as unknown as { overlay: { symbolsDrawnAtFullZoom: number } }).overlay.symbolsDrawnAtFullZoom)).toBe(0);
      const { ink, differing } = await compare(page, above, below, 60);
      expect(ink).toBeGreaterThan(16 * 60 * ratio * ratio);
      expect(differing / ink).toBeLessThan(0.03);
      await page.close();
    });
  }

  it('on a globe, where the custom layer cannot draw, the symbol layer draws every symbol at zoom 15 too', async () => {
    const page = await browser.newPage({ viewport: { width: 900, height: 650 } });
    await page.goto(`${inject('demoUrl')}tests/browser/pages/symbol-angles.html`);
    await page.waitForSelector('body[data-map-ready="true"]', { timeout: 60_000 });
    const counts = await page.evaluate(async () => {
      const w = window as unknown as { map: import('maplibre-gl').Map; overlay: { symbolsDrawnAtFullZoom: number } };
      const drawn = () => ({ layer: w.map.queryRenderedFeatures({ layers: ['foldlens-symbols'] }).length, custom: w.overlay.symbolsDrawnAtFullZoom });
      w.map.jumpTo({ zoom: 15, bearing: 0, pitch: 0 });
      await new Promise((r) => w.map.once('idle', r));
      const flat = drawn();
      w.map.setProjection({ type: 'globe' });
      await new Promise((r) => w.map.once('idle', r));
      return { flat, globe: drawn() };
    });
    expect(counts.flat).toEqual({ layer: 0, custom: 16 });
    expect(counts.globe).toEqual({ layer: 16, custom: 0 });
    await page.close();
  });
});
