import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { booleanPointInPolygon } from '@turf/turf';
import { launchBrowser, openDemo } from './browser';
import { analysisStamp, domainPath, dragThrough, waitForAnalysis, type ScreenPoint as Point } from './demoActions';
import truth from '../../sample-maps/korvane/truth.json';

/**
 * Editing a saved domain's outline like a user: save a lassoed area as a domain, press Edit,
 * drag one vertex of the outline on the map with the mouse, and check that the outline moved and
 * the domain's analysis followed. The expected number of planes is counted independently here,
 * with turf's booleanPointInPolygon over the demo's usable bedding readings inside the edited
 * outline (the demo analyses bedding by default, core/foldInput.ts).
 */

/** The outline's vertex handles as drawn on the map: index, lon/lat and page position. */
async function vertexHandles(page: Page): Promise<Array<{ i: number; lngLat: [number, number]; x: number; y: number }>> {
  return page.evaluate(() => {
    const map = (window as unknown as { foldlensDemo: { map: import('maplibre-gl').Map } }).foldlensDemo.map;
    const rect = map.getCanvasContainer().getBoundingClientRect();
    const seen = new Map<number, { i: number; lngLat: [number, number]; x: number; y: number }>();
    for (const f of map.queryRenderedFeatures({ layers: ['foldlens-domains-vertices'] })) {
      const [lon, lat] = (f.geometry as unknown as { coordinates: [number, number] }).coordinates;
      const p = map.project([lon, lat]);
      seen.set(f.properties.i as number, { i: f.properties.i as number, lngLat: [lon, lat], x: rect.left + p.x, y: rect.top + p.y });
    }
    return [...seen.values()].sort((a, b) => a.i - b.i);
  });
}

async function domainRow(page: Page, name: string): Promise<string[]> {
  return page.locator('foldlens-domains').getByRole('row', { name: new RegExp(name) }).getByRole('cell').allTextContents();
}

describe('editing a domain outline on the map', () => {
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

  it('dragging a vertex of a saved domain moves its outline and updates its n and axis in the domains list', async () => {
    // 1. Lasso the west domain and save it.
    await page.locator('foldlens-toolbar').getByRole('button', { name: /Lasso/ }).click();
    const before = await analysisStamp(page);
    await dragThrough(page, await domainPath(page, truth.domains[0].polygon), true);
    await waitForAnalysis(page, before);
    const panel = page.locator('foldlens-domains');
    await panel.getByRole('textbox', { name: 'Name of the new domain' }).fill('Edit test');
    await panel.getByRole('button', { name: 'Save selection as domain' }).click();
    await page.waitForFunction(() => document.body.dataset.domainsSaved === '1', null, { timeout: 60_000 });
    const saved = await domainRow(page, 'Edit test');
    const nBefore = Number(saved[1]);
    expect(nBefore, `row: ${saved.join(' | ')}`).toBeGreaterThan(50);
    expect(saved[2]).toMatch(/^\d{3}\/\d{2}$/);

    // 2. Edit: the vertex handles appear on the outline.
    await panel.getByRole('button', { name: 'Edit the outline of Edit test' }).click();
    await expect.poll(async () => (await vertexHandles(page)).length, { timeout: 20_000 }).toBeGreaterThan(2);
    const handles = await vertexHandles(page);

    // 3. Drag the easternmost vertex 180 px further east, across the fault into the east domain.
    const grab = handles.reduce((a, b) => (b.x > a.x ? b : a));
    const drop = { x: grab.x + 180, y: grab.y };
    await dragThrough(page, [{ x: grab.x, y: grab.y }, drop], false);

    // 4. The outline moved: a handle sits where the vertex was dropped, none where it was.
    await expect.poll(async () => (await vertexHandles(page)).some((h) => Math.hypot(h.x - drop.x, h.y - drop.y) < 3), { timeout: 20_000 }).toBe(true);
    const after = await vertexHandles(page);
    expect(after.length).toBe(handles.length);
    expect(after.some((h) => Math.hypot(h.x - grab.x, h.y - grab.y) < 3)).toBe(false);
    const moved = after.find((h) => h.i === grab.i)!;
    expect(Math.hypot(moved.x - drop.x, moved.y - drop.y)).toBeLessThan(3);

    // 5. The analysis followed: n equals the usable bedding readings inside the new outline, counted with turf.
    const ring = after.map((h) => h.lngLat);
    const bedding = await page.evaluate(() =>
      (window as unknown as { foldlensDemo: { stations: Array<{ kind?: string; lon?: number; lat?: number; problems: unknown[]; plane?: unknown }> } }).foldlensDemo.stations
        .filter((s) => s.kind === 'bedding' && s.problems.length === 0 && s.plane !== undefined && s.lon !== undefined && s.lat !== undefined)
        .map((s) => [s.lon!, s.lat!] as [number, number]),
    );
    const polygon = { type: 'Polygon' as const, coordinates: [[...ring, ring[0]]] };
    const expectedN = bedding.filter((p) => booleanPointInPolygon(p, polygon)).length;
    expect(expectedN).toBeGreaterThan(nBefore);
    await expect.poll(async () => Number((await domainRow(page, 'Edit test'))[1]), { timeout: 60_000 }).toBe(expectedN);
    const edited = await domainRow(page, 'Edit test');
    expect(edited[2]).toMatch(/^\d{3}\/\d{2}$/);
    // The map label follows the domain too.
    const label = await page.locator('.foldlens-domain-label').first().textContent();
    expect(label).toContain(`axis ${edited[2]}`);
    expect(errors).toEqual([]);
  });
});
