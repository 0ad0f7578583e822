import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { inject } from 'vitest';
import { launchBrowser } from './browser';
import { brightnessAt, pngPixels } from './pngPixels';

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
  const [pa, pb] = [(await pngPixels(page, a)).data, (await pngPixels(page, b)).data];
  let ink = 0;
  let differing = 0;
  for (let i = 0; i < pa.length; i += 4) {
    const la = brightnessAt(pa, i);
    const lb = brightnessAt(pb, i);
    if (la > 200 && lb > 200) continue;
    ink++;
    if (Math.abs(la - lb) > tolerance) differing++;
  }
  return { ink, differing };
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

  it('on the next copy of the world (a map panned across the antimeridian) symbols are drawn and picked as on the first', async () => {
    const page = await browser.newPage({ viewport: { width: 900, height: 650 } });
    await page.goto(`${inject('demoUrl')}tests/browser/pages/symbol-angles.html`);
    await page.waitForSelector('body[data-map-ready="true"]', { timeout: 60_000 });
    const home = await shot(page, 15, 30, 0);
    // The same view, one world east: longitude 15° + 360°.
    const shifted = await page.evaluate(async () => {
      const w = window as unknown as { map: import('maplibre-gl').Map; stations: Array<{ id: string; lon: number; lat: number }> };
      w.map.jumpTo({ center: [15 + 360, 46] });
      await new Promise((r) => w.map.once('idle', r));
      const s = w.stations[5];
      const p = w.map.project([s.lon + 360, s.lat]);
      return { centre: w.map.getCenter().lng, id: s.id, x: p.x, y: p.y };
    });
    expect(shifted.centre).toBeCloseTo(375, 6); // the map really shows the next copy
    const copy = await page.screenshot({ type: 'png' });
    const { ink, differing } = await compare(page, home, copy, 60);
    expect(ink).toBeGreaterThan(16 * 60);
    expect(differing / ink).toBeLessThan(0.03);
    // The listener is in place before the click, and the answer is polled (a missed click fails, it does not hang).
    await page.evaluate(() => {
      const w = window as unknown as { overlay: EventTarget; clickedStation?: string };
      w.overlay.addEventListener('stationclick', (e) => (w.clickedStation = (e as CustomEvent<{ station: { id: string } }>).detail.station.id));
    });
    await page.mouse.click(shifted.x, shifted.y);
    await expect.poll(() => page.evaluate(() => (window as unknown as { clickedStation?: string }).clickedStation), { timeout: 15_000 }).toBe(shifted.id);
    await page.close();
  });

  it('after the WebGL context is lost and restored, the custom layer draws the symbols again', async () => {
    const page = await browser.newPage({ viewport: { width: 900, height: 650 } });
    const errors: string[] = [];
    page.on('pageerror', (e) => errors.push(e.message));
    await page.goto(`${inject('demoUrl')}tests/browser/pages/symbol-angles.html`);
    await page.waitForSelector('body[data-map-ready="true"]', { timeout: 60_000 });
    const before = await shot(page, 15.5, 30, 0);
    await page.evaluate(async () => {
      const w = window as unknown as { map: import('maplibre-gl').Map };
      const gl = w.map.getCanvas().getContext('webgl2')!;
      const lose = gl.getExtension('WEBGL_lose_context')!;
      const restored = new Promise((r) => w.map.once('webglcontextrestored', r));
      lose.loseContext();
      await new Promise((r) => setTimeout(r, 200));
      lose.restoreContext();
      await restored;
      w.map.triggerRepaint();
      await new Promise((r) => w.map.once('idle', r));
    });
    const after = await page.screenshot({ type: 'png' });
    expect(await page.evaluate(() => (window as unknown as { overlay: { symbolsDrawnAtFullZoom: number } }).overlay.symbolsDrawnAtFullZoom)).toBe(16);
    const { ink, differing } = await compare(page, before, after, 60);
    expect(ink).toBeGreaterThan(16 * 60);
    expect(differing / ink).toBeLessThan(0.03);
    expect(errors).toEqual([]);
    await page.close();
  });

  it('the kind filter (setVisibleKinds) hides a kind from both symbol layers and from picking, and shows it again', async () => {
    const page = await browser.newPage({ viewport: { width: 900, height: 650 } });
    await page.goto(`${inject('demoUrl')}tests/browser/pages/symbol-angles.html`);
    await page.waitForSelector('body[data-map-ready="true"]', { timeout: 60_000 });
    type W = { map: import('maplibre-gl').Map; overlay: { symbolsDrawnAtFullZoom: number; setVisibleKinds(k: string[] | null): void; layerId(r: string): string } & EventTarget; stations: Array<{ id: string; kind: string; lon: number; lat: number }>; picked?: string };
    const counts = await page.evaluate(async () => {
      const w = window as unknown as W;
      const idle = () => new Promise((r) => w.map.once('idle', r));
      const below = () => w.map.queryRenderedFeatures({ layers: [w.overlay.layerId('symbols')] }).length;
      w.overlay.addEventListener('stationclick', (e) => (w.picked = (e as CustomEvent<{ station: { id: string } }>).detail.station.id));
      w.map.jumpTo({ zoom: 15, bearing: 0, pitch: 0 });
      await idle();
      const all = w.overlay.symbolsDrawnAtFullZoom;
      w.overlay.setVisibleKinds(['bedding']);
      w.map.triggerRepaint();
      await idle();
      const bedding = w.overlay.symbolsDrawnAtFullZoom;
      w.map.jumpTo({ zoom: 14.5 });
      await idle();
      const beddingBelow = below();
      const kindsBelow = [...new Set(w.map.queryRenderedFeatures({ layers: [w.overlay.layerId('symbols')] }).map((f) => f.properties.k))];
      w.map.jumpTo({ zoom: 15 });
      await idle();
      const lineation = w.stations.find((s) => s.kind === 'lineation')!;
      const p = w.map.project([lineation.lon, lineation.lat]);
      return { all, bedding, beddingBelow, kindsBelow, lineation: { id: lineation.id, x: p.x, y: p.y } };
    });
    expect(counts.all).toBe(16);
    expect(counts.bedding).toBe(8);
    expect(counts.beddingBelow).toBe(8);
    expect(counts.kindsBelow).toHaveLength(1);
    // A hidden lineation cannot be clicked; shown again, it can.
    await page.mouse.click(counts.lineation.x, counts.lineation.y);
    await page.waitForTimeout(300);
    expect(await page.evaluate(() => (window as unknown as W).picked)).toBeUndefined();
    await page.evaluate(async () => {
      const w = window as unknown as W;
      w.overlay.setVisibleKinds(null);
      w.map.triggerRepaint();
      await new Promise((r) => w.map.once('idle', r));
    });
    expect(await page.evaluate(() => (window as unknown as W).overlay.symbolsDrawnAtFullZoom)).toBe(16);
    await page.mouse.click(counts.lineation.x, counts.lineation.y);
    await expect.poll(() => page.evaluate(() => (window as unknown as W).picked), { timeout: 15_000 }).toBe(counts.lineation.id);
    await page.close();
  });

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
