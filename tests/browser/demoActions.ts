import type { Page } from 'playwright-core';

/** What the demo page exposes on window for tests (src/app/main.ts). */
export type DemoWindow = {
  foldlensDemo: {
    map: import('maplibre-gl').Map;
    foldlens: import('../../src/map/foldlens').Foldlens;
    stations: ReadonlyArray<import('../../src/core/station').Station>;
  };
};

export type ScreenPoint = { x: number; y: number };

/** Page coordinates of a lon/lat ring (closed, as in truth.json), pulled 15% toward its centre so a lasso along them stays inside. */
export async function domainPath(page: Page, ring: number[][]): Promise<ScreenPoint[]> {
  return page.evaluate((r) => {
    const map = (window as unknown as DemoWindow).foldlensDemo.map;
    const rect = map.getCanvasContainer().getBoundingClientRect();
    const pts = r.slice(0, -1).map(([lon, lat]) => map.project([lon, lat]));
    const cx = pts.reduce((s, p) => s + p.x, 0) / pts.length;
    const cy = pts.reduce((s, p) => s + p.y, 0) / pts.length;
    return pts.map((p) => ({ x: rect.left + cx + (p.x - cx) * 0.85, y: rect.top + cy + (p.y - cy) * 0.85 }));
  }, ring);
}

/** Drags the mouse through the points with the button held, in small steps; `closed` returns to the first point (a lasso). */
export async function dragThrough(page: Page, points: ScreenPoint[], closed = true): Promise<void> {
  const path = closed ? [...points, points[0]] : points;
  await page.mouse.move(path[0].x, path[0].y);
  await page.mouse.down();
  for (let k = 1; k < path.length; k++) {
    const a = path[k - 1];
    const b = path[k];
    for (let s = 1; s <= 15; s++) await page.mouse.move(a.x + ((b.x - a.x) * s) / 15, a.y + ((b.y - a.y) * s) / 15);
  }
  await page.mouse.up();
}

/** The selected-station count the toolbar shows. */
export const selectedCount = (page: Page): Promise<number> =>
  page.locator('foldlens-toolbar').evaluate((el) => (el as HTMLElement & { selectedCount: number }).selectedCount);

/** The demo's stamp of the last finished analysis; pass it to {@link waitForAnalysis} after an action. */
export const analysisStamp = (page: Page): Promise<string | undefined> => page.evaluate(() => document.body.dataset.analysisReady);

/** Waits until the net panel has shown an analysis newer than `before`. */
export async function waitForAnalysis(page: Page, before: string | undefined): Promise<void> {
  await page.waitForFunction((prev) => document.body.dataset.analysisReady && document.body.dataset.analysisReady !== prev, before, { timeout: 60_000 });
}

/** The net panel's text, whitespace collapsed. */
export const netPanelText = (page: Page): Promise<string> =>
  page.evaluate(() => (document.querySelector('foldlens-net')!.shadowRoot?.textContent ?? '').replace(/\s+/g, ' '));
