/**
 * Writes the screenshots under docs/ from the running demo in headless Chromium:
 * the overview with a lasso over the west domain, the map at two zoom levels, the map's dark
 * look, and a vertical section drawn across the west domain.
 * Run with `npx tsx scripts/take-screenshots.ts [overview] [zoom] [dark] [section]` (needs
 * /usr/bin/chromium); without names it writes them all.
 */
import { createServer } from 'vite';
import { chromium } from 'playwright-core';
import { CHROMIUM_ARGS } from '../tests/browser/browser';
import truth from '../sample-maps/korvane/truth.json';
import { builtInCrs, toLonLat } from '../src/io/crs';

const only = process.argv.slice(2);
const want = (name: string): boolean => only.length === 0 || only.includes(name);

const server = await createServer({ configFile: 'vite.config.ts', server: { port: 0, host: '127.0.0.1' }, logLevel: 'error' });
await server.listen();
const address = server.httpServer!.address() as { port: number };
const browser = await chromium.launch({ executablePath: '/usr/bin/chromium', args: CHROMIUM_ARGS });
try {
  const page = await browser.newPage({ viewport: { width: 1440, height: 900 } });
  // Nobody answers the dev server's reload channel: an edit to the sources while the pictures are
  // taken must not reload the page half way.
  await page.routeWebSocket(/./, () => {});
  await page.goto(`http://127.0.0.1:${address.port}/`);
  await page.waitForSelector('body[data-map-ready="true"]', { timeout: 60_000 });

  if (want('overview')) {
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
    await page.locator('foldlens-toolbar').getByRole('button', { name: 'Clear' }).click();
  }

  if (want('zoom')) {
    // Two zoom levels of the symbols, with the selection cleared.
    for (const [zoom, name, center] of [[12.9, 'map-zoom-13.png', [15.0, 24.621]], [15.3, 'map-zoom-15.png', [14.985, 24.62]]] as const) {
      await page.evaluate(async ({ z, c }) => {
        const map = (window as unknown as { foldlensDemo: { map: import('maplibre-gl').Map } }).foldlensDemo.map;
        map.jumpTo({ center: [c[0], c[1]], zoom: z, bearing: 0 });
        await new Promise((r) => map.once('idle', r));
      }, { z: zoom, c: center });
      await page.locator('#map').screenshot({ path: `docs/${name}` });
    }
  }

  if (want('dark')) {
    // The dark look, from the theme toggle, close enough in for the dip labels; then light again.
    await page.locator('#theme').click();
    await page.evaluate(async () => {
      const map = (window as unknown as { foldlensDemo: { map: import('maplibre-gl').Map } }).foldlensDemo.map;
      map.jumpTo({ center: [14.99, 24.62], zoom: 14.6, bearing: 0 });
      await new Promise((r) => map.once('idle', r));
    });
    await page.locator('#map').screenshot({ path: 'docs/map-dark.png' });
    await page.locator('#theme').click();
  }

  if (want('section')) {
    // A vertical section across the west domain: typed axis 075/12, swath ±500 m, drawn with the mouse.
    await page.setViewportSize({ width: 1440, height: 1250 });
    await page.evaluate(async (b) => {
      const map = (window as unknown as { foldlensDemo: { map: import('maplibre-gl').Map } }).foldlensDemo.map;
      map.fitBounds(b, { padding: 30, duration: 0 });
      await new Promise((r) => map.once('idle', r));
    }, truth.frame.bounds as [number, number, number, number]);
    const picker = page.locator('#axis-picker');
    await picker.getByLabel('Trend (°)').fill('075');
    await picker.getByLabel('Plunge (°)').fill('12');
    const west = truth.domains.find((d) => d.id === 'west')!;
    const utm = builtInCrs(truth.crs.epsg)!;
    const ends = [-1800, 1800].map((s) => {
      const [e0, n0] = west.profile.originUtm;
      const az = (150 * Math.PI) / 180;
      const ll = toLonLat(e0 + s * Math.sin(az), n0 + s * Math.cos(az), utm);
      return [ll.lon, ll.lat] as [number, number];
    });
    const [a, b] = await page.evaluate((pts) => {
      const map = (window as unknown as { foldlensDemo: { map: import('maplibre-gl').Map } }).foldlensDemo.map;
      const rect = map.getCanvasContainer().getBoundingClientRect();
      return pts.map((p) => ({ x: rect.left + map.project(p).x, y: rect.top + map.project(p).y }));
    }, ends);
    await page.getByRole('button', { name: 'Draw section line' }).click();
    await page.mouse.click(a.x, a.y);
    await page.mouse.dblclick(b.x, b.y);
    await page.waitForFunction(() => document.querySelector('foldlens-profile')!.data?.mode === 'section', null, { timeout: 120_000 });
    await page.locator('foldlens-profile').getByLabel('Vertical exaggeration').selectOption('2');
    // The panel covers the lower part of the map: show the line and its swath above it. Headless
    // Chromium's software compositor leaves the map blank above a scrolling dialog, so the
    // dialog's overflow is shown for the picture (its numbers column runs off the bottom).
    await page.evaluate(async (line) => {
      (document.querySelector('#profile-box') as HTMLElement).style.overflow = 'visible';
      const map = (window as unknown as { foldlensDemo: { map: import('maplibre-gl').Map } }).foldlensDemo.map;
      const box = document.querySelector('#profile-box')!.getBoundingClientRect();
      const mapBox = map.getContainer().getBoundingClientRect();
      const lons = line.map((p) => p[0]);
      const lats = line.map((p) => p[1]);
      map.fitBounds([Math.min(...lons), Math.min(...lats), Math.max(...lons), Math.max(...lats)], { padding: { top: 50, bottom: mapBox.bottom - box.top + 50, left: 80, right: 80 }, duration: 0 });
      await new Promise((r) => map.once('idle', r));
    }, ends);
    await page.mouse.move(5, 5);
    await page.waitForTimeout(600);
    await page.screenshot({ path: 'docs/demo-section.png' });
  }
} finally {
  await browser.close();
  await server.close();
}
