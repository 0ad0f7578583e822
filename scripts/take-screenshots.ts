/**
 * Writes the screenshots under docs/ from the running demo in headless Chromium:
 * the overview with a lasso over the west domain, and the map at two zoom levels.
 * Run with `npx tsx scripts/take-screenshots.ts` (needs /usr/bin/chromium).
 */
import { createServer } from 'vite';
import { chromium } from 'playwright-core';
import { CHROMIUM_ARGS } from '../tests/browser/browser';
import truth from '../sample-maps/korvane/truth.json';

const server = await createServer({ configFile: 'vite.config.ts', server: { port: 0, host: '127.0.0.1' }, logLevel: 'error' });
await server.listen();
const address = server.httpServer!.address() as { port: number };
const browser = await chromium.launch({ executablePath: '/usr/bin/chromium', args: CHROMIUM_ARGS });
try {
  const page = await browser.newPage({ viewport: { width: 1440, height: 900 } });
  await page.goto(`http://127.0.0.1:${address.port}/`);
  await page.waitForSelector('body[data-map-ready="true"]', { timeout: 60_000 });

  // Overview: select the west domain with the lasso, as a user would.
  await page.locator('foldlens-toolbar').getByRole('button', { name: /Lasso/ }).click();
  const corners = await page.evaluate((ring) => {
    const map = (window as unknown as { foldlensDemo: { map: import('maplibre-gl').Map } }).foldlensDemo.map;
    const rect = map.getCanvasContainer().getBoundingClientRect();
    const pts = ring.slice(0, -1).map(([lon, lat]) => map.project([lon, lat]));
    const cx = pts.reduce((s, p) => s + p.x, 0) / pts.length;
    const cy = pts.reduce((s, p) => s + p.y, 0) / pts.length;
    return pts.map((p) => ({ x: rect.left + cx + (p.x - cx) * 0.85, y: rect.top + cy + (p.y - cy) * 0.85 }));
  }, truth.domains[0].polygon);
  const before = await page.evaluate(() => document.body.dataset.analysisReady);
  await page.mouse.move(corners[0].x, corners[0].y);
  await page.mouse.down();
  for (const c of [...corners.slice(1), corners[0]]) await page.mouse.move(c.x, c.y, { steps: 12 });
  await page.mouse.up();
  await page.waitForFunction((prev) => document.body.dataset.analysisReady !== prev, before, { timeout: 60_000 });
  await page.waitForTimeout(400);
  await page.screenshot({ path: 'docs/demo-overview.png' });

  // Two zoom levels of the symbols, with the selection cleared.
  await page.locator('foldlens-toolbar').getByRole('button', { name: 'Clear' }).click();
  for (const [zoom, name, center] of [[12.9, 'map-zoom-13.png', [15.0, 24.621]], [15.3, 'map-zoom-15.png', [14.985, 24.62]]] as const) {
    await page.evaluate(async ({ z, c }) => {
      const map = (window as unknown as { foldlensDemo: { map: import('maplibre-gl').Map } }).foldlensDemo.map;
      map.jumpTo({ center: [c[0], c[1]], zoom: z, bearing: 0 });
      await new Promise((r) => map.once('idle', r));
    }, { z: zoom, c: center });
    await page.locator('#map').screenshot({ path: `docs/${name}` });
  }
} finally {
  await browser.close();
  await server.close();
}
