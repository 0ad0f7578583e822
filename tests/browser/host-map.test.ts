import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { inject } from 'vitest';
import { launchBrowser } from './browser';

type HostWindow = {
  map: import('maplibre-gl').Map;
  foldlens: import('../../src/map/foldlens').Foldlens;
  hostStyle: (c: string) => import('maplibre-gl').StyleSpecification;
};

describe('Foldlens attached to an unrelated host map', () => {
  let browser: Browser;
  let page: Page;
  const errors: string[] = [];
  beforeAll(async () => {
    browser = await launchBrowser();
    page = await browser.newPage({ viewport: { width: 900, height: 600 } });
    page.on('pageerror', (e) => errors.push(e.message));
    page.on('console', (m) => m.type() === 'error' && errors.push(m.text()));
    await page.goto(`${inject('demoUrl')}tests/browser/pages/host-map.html`);
    await page.waitForSelector('body[data-map-ready="true"]', { timeout: 60_000 });
  });
  afterAll(async () => {
    await browser?.close();
  });

  const state = () =>
    page.evaluate(() => {
      const w = window as unknown as HostWindow;
      const style = w.map.getStyle();
      return {
        layers: style.layers.map((l) => l.id),
        sources: Object.keys(style.sources),
        images: w.map.listImages(),
        rendered: w.map.queryRenderedFeatures({ layers: style.layers.some((l) => l.id === 'foldlens-symbols') ? ['foldlens-symbols'] : [] }).length,
      };
    });

  it('attachFoldlens(map) adds prefixed layers on top of the host style and draws the stations', async () => {
    const s = await state();
    expect(s.layers.slice(0, 2)).toEqual(['background', 'parcels']);
    expect(s.layers.filter((id) => id.startsWith('foldlens-')).length).toBeGreaterThan(4);
    expect(s.layers.every((id) => id === 'background' || id === 'parcels' || id.startsWith('foldlens-'))).toBe(true);
    expect(s.rendered).toBe(4);
    expect(errors).toEqual([]);
  });

  it('a lasso drawn on the host map selects its stations', async () => {
    await page.evaluate(() => (window as unknown as HostWindow).foldlens.setTool('lasso'));
    const box = (await page.locator('#host').boundingBox())!;
    const cx = box.x + box.width / 2;
    const cy = box.y + box.height / 2;
    await page.mouse.move(cx - 250, cy - 250);
    await page.mouse.down();
    for (const [x, y] of [[cx + 250, cy - 250], [cx + 250, cy + 250], [cx - 250, cy + 250], [cx - 250, cy - 250]]) await page.mouse.move(x, y, { steps: 8 });
    await page.mouse.up();
    const selected = await page.evaluate(() => Array.from((window as unknown as HostWindow).foldlens.selectedIndices()));
    expect(selected).toEqual([0, 1, 2, 3]);
  });

  it('Foldlens puts itself back after the host swaps its style', async () => {
    await page.evaluate(async () => {
      const w = window as unknown as HostWindow;
      w.map.setStyle(w.hostStyle('#20262a'));
      await new Promise((r) => w.map.once('idle', r));
    });
    const s = await state();
    expect(s.layers).toContain('foldlens-symbols');
    expect(s.rendered).toBe(4);
  });

  it('remove() leaves the host map exactly as it was: no Foldlens layer, source or image', async () => {
    await page.evaluate(async () => {
      const w = window as unknown as HostWindow;
      w.foldlens.remove();
      w.map.triggerRepaint();
      await new Promise((r) => w.map.once('idle', r));
    });
    const s = await state();
    expect(s.layers).toEqual(['background', 'parcels']);
    expect(s.sources).toEqual(['parcels']);
    expect(s.images.filter((id) => id.startsWith('fl-'))).toEqual([]);
    // The map pans again with the pointer once the tools are gone.
    expect(await page.evaluate(() => (window as unknown as HostWindow).map.dragPan.isEnabled())).toBe(true);
    expect(errors).toEqual([]);
  });
});
