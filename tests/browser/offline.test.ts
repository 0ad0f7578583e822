import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { build, preview, type PreviewServer } from 'vite';
import type { Browser } from 'playwright-core';
import { launchBrowser } from './browser';

/**
 * Field use: the built demo keeps working with the network cut after a first visit, and says so.
 * Builds the demo into a temporary folder and serves it with vite preview (service workers need
 * a real origin; the dev server is not what users get).
 */
describe('the demo offline', () => {
  let browser: Browser;
  let server: PreviewServer;
  let outDir: string;
  let url: string;
  beforeAll(async () => {
    outDir = mkdtempSync(join(tmpdir(), 'foldlens-offline-'));
    await build({ configFile: 'vite.config.ts', logLevel: 'error', build: { outDir, emptyOutDir: true, sourcemap: false } });
    server = await preview({ configFile: 'vite.config.ts', logLevel: 'error', build: { outDir }, preview: { port: 0, host: '127.0.0.1' } });
    const address = server.httpServer.address();
    if (!address || typeof address === 'string') throw new Error('preview server has no port');
    url = `http://127.0.0.1:${address.port}/`;
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
    await new Promise<void>((r) => server?.httpServer.close(() => r()));
    rmSync(outDir, { recursive: true, force: true });
  });

  it('after one visit the demo reloads, draws its map and analyses a selection with the network cut', async () => {
    const context = await browser.newContext({ viewport: { width: 1280, height: 800 } });
    const page = await context.newPage();
    const errors: string[] = [];
    page.on('pageerror', (e) => errors.push(e.message));
    await page.goto(url);
    await page.waitForSelector('body[data-map-ready="true"]', { timeout: 60_000 });
    await page.waitForSelector('#offline-status[data-offline-ready="true"]', { timeout: 60_000 });
    expect(await page.locator('#offline-status').textContent()).toBe('Saved for offline use');

    await context.setOffline(true);
    await page.reload();
    await page.waitForSelector('body[data-map-ready="true"]', { timeout: 60_000 });
    const rendered = await page.evaluate(() => {
      const d = (window as unknown as { foldlensDemo: { map: import('maplibre-gl').Map } }).foldlensDemo;
      return d.map.queryRenderedFeatures({ layers: ['foldlens-dots'] }).length;
    });
    expect(rendered).toBeGreaterThan(400);
    await page.evaluate(async () => {
      const before = document.body.dataset.analysisReady;
      const d = (window as unknown as { foldlensDemo: { foldlens: { selectKinds(k: string[]): void } } }).foldlensDemo;
      d.foldlens.selectKinds(['bedding']);
      const deadline = Date.now() + 60_000;
      while (document.body.dataset.analysisReady === before && Date.now() < deadline) await new Promise((r) => setTimeout(r, 100));
      if (document.body.dataset.analysisReady === before) throw new Error('no analysis offline');
    });
    await page.waitForFunction(() => document.querySelector('#offline-status')?.textContent === 'Offline: working from the saved copy', null, { timeout: 10_000 });
    // The built demo has every panel: a bundler that took the components' imports for
    // side-effect-free would drop their registration, and the panels would stay empty tags.
    const undefinedPanels = await page.evaluate(() =>
      [...new Set([...document.querySelectorAll('*')].map((el) => el.localName).filter((n) => n.startsWith('foldlens-')))].filter((n) => !customElements.get(n)),
    );
    expect(undefinedPanels).toEqual([]);
    const netText = await page.evaluate(() => document.querySelector('foldlens-net')?.shadowRoot?.textContent ?? '');
    expect(netText).toMatch(/Fold axis/);
    expect(errors).toEqual([]);
    await context.close();
  });
});
