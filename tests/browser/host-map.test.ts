import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { inject } from 'vitest';
import { launchBrowser } from './browser';
import { analyzeFold } from '../../src/core/foldAnalysis';
import { foldInputFromStations } from '../../src/core/foldInput';
import type { Station } from '../../src/core/station';
import type { AxisComputedDetail, DomainSavedDetail } from '../../src/map/foldlens';

type HostWindow = {
  map: import('maplibre-gl').Map;
  foldlens: import('../../src/map/foldlens').Foldlens;
  hostStyle: (c: string) => import('maplibre-gl').StyleSpecification;
  stations: Station[];
  heard: Array<{ type: string; detail: unknown }>;
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

  it('the finished lasso brings an axiscomputed event with the same analysis the core gives in Node', async () => {
    await page.waitForFunction(() => (window as unknown as HostWindow).heard.some((h) => h.type === 'axiscomputed'), null, { timeout: 30_000 });
    const { detail, stations } = await page.evaluate(() => {
      const w = window as unknown as HostWindow;
      const last = w.heard.filter((h) => h.type === 'axiscomputed').at(-1)!.detail as AxisComputedDetail;
      return { detail: { indices: Array.from(last.indices), analysis: last.analysis }, stations: w.stations };
    });
    expect(detail.indices).toEqual([0, 1, 2, 3]);
    // Same stations, same default settings (500 resamples, seed 1): the worker's numbers are the core's.
    const expected = analyzeFold(foldInputFromStations(stations, detail.indices), { bootstrap: 500, seed: 1 });
    expect(detail.analysis.n).toBe(3);
    expect(detail.analysis.axis).not.toBeNull();
    expect(detail.analysis.axis!.trend).toBeCloseTo(expected.axis!.trend, 9);
    expect(detail.analysis.axis!.plunge).toBeCloseTo(expected.axis!.plunge, 9);
    expect(detail.analysis.cone95).toBeCloseTo(expected.cone95!, 9);
  });

  it('saveDomain(name) keeps the lassoed area with its analysis, draws it and announces domainsaved', async () => {
    const saved = await page.evaluate(async () => {
      const w = window as unknown as HostWindow;
      const domain = await w.foldlens.saveDomain('Ridge <b>east</b>');
      await new Promise((r) => w.map.once('idle', r));
      const heard = w.heard.filter((h) => h.type === 'domainsaved').map((h) => (h.detail as DomainSavedDetail).domain.id);
      const labels = [...document.querySelectorAll('.foldlens-domain-label')].map((el) => el.textContent ?? '');
      const bold = document.querySelectorAll('.foldlens-domain-label b').length;
      return { domain, heard, labels, bold, layers: w.map.getStyle().layers.map((l) => l.id), listed: w.foldlens.domains.length };
    });
    expect(saved.heard).toEqual([saved.domain.id]);
    expect(saved.listed).toBe(1);
    expect(saved.domain.name).toBe('Ridge <b>east</b>');
    expect(saved.domain.stationIds).toEqual(['H1', 'H2', 'H3', 'H4']);
    expect(saved.domain.ring.length).toBeGreaterThan(3);
    expect(saved.domain.analysis?.n).toBe(3);
    expect(saved.labels.some((t) => t.includes('Ridge <b>east</b>'))).toBe(true); // shown as text
    expect(saved.bold).toBe(0);
    expect(saved.layers.some((id) => id.startsWith('foldlens-domain'))).toBe(true);
    await page.evaluate(() => (window as unknown as HostWindow).foldlens.clearSelection());
    const refused = await page.evaluate(() => (window as unknown as HostWindow).foldlens.saveDomain().then(() => 'saved', (e: Error) => e.message));
    expect(refused).toMatch(/needs a selection drawn as one shape/);
    expect(errors).toEqual([]);
  });

  for (const pointerType of ['touch', 'pen'] as const) {
    it(`a lasso drawn with ${pointerType} pointer events selects the stations inside it`, async () => {
      await page.evaluate(() => (window as unknown as HostWindow).foldlens.clearSelection());
      const selected = await page.evaluate(async (type) => {
        const w = window as unknown as HostWindow;
        w.foldlens.setTool('lasso');
        const el = w.map.getCanvasContainer();
        const r = w.map.getContainer().getBoundingClientRect(); // the canvas container itself has no height
        const cx = r.left + r.width / 2;
        const cy = r.top + r.height / 2;
        const fire = (kind: string, x: number, y: number) =>
          el.dispatchEvent(new PointerEvent(kind, { pointerType: type, pointerId: 7, isPrimary: true, clientX: x, clientY: y, button: 0, buttons: kind === 'pointerup' ? 0 : 1, bubbles: true, cancelable: true }));
        // A ring around the whole view, drawn in small steps as a finger or pen would.
        const ring = [[-250, -250], [250, -250], [250, 250], [-250, 250], [-250, -250]];
        fire('pointerdown', cx + ring[0][0], cy + ring[0][1]);
        for (let k = 1; k < ring.length; k++) {
          for (let s = 1; s <= 10; s++) {
            const x = ring[k - 1][0] + ((ring[k][0] - ring[k - 1][0]) * s) / 10;
            const y = ring[k - 1][1] + ((ring[k][1] - ring[k - 1][1]) * s) / 10;
            fire('pointermove', cx + x, cy + y);
          }
        }
        fire('pointerup', cx + ring[0][0], cy + ring[0][1]);
        return Array.from(w.foldlens.selectedIndices());
      }, pointerType);
      expect(selected).toEqual([0, 1, 2, 3]);
    });
  }

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
    expect(await page.locator('.foldlens-domain-label').count()).toBe(0);
    // The map pans again with the pointer once the tools are gone.
    expect(await page.evaluate(() => (window as unknown as HostWindow).map.dragPan.isEnabled())).toBe(true);
    expect(errors).toEqual([]);
  });
});
