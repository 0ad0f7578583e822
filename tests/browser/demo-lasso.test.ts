import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { launchBrowser, openDemo } from './browser';
import { analysisStamp, domainPath, dragThrough as dragLasso, netPanelText as panelText, waitForAnalysis } from './demoActions';
import truth from '../../sample-maps/korvane/truth.json';
import { angleBetweenLines } from '../../src/core/geometry';

/**
 * Uses the demo as a geologist would: picks the lasso, draws with the mouse around one
 * structural domain of the sample map, and reads the fold axis the net panel prints.
 * The sample's planted axes (truth.json) are the right answer. Tolerance: 3°, several times
 * the sampling error of a few hundred bedding readings with 2-5° reading scatter (the
 * generator's own fit of all readings misses by under 0.4°), plus 0.5° for whole-degree display.
 */
const AXIS_TOLERANCE_DEGREES = 3;

describe('lasso to net panel on the sample map', () => {
  let browser: Browser;
  let page: Page;
  let errors: string[];
  beforeAll(async () => {
    browser = await launchBrowser();
    ({ page, errors } = await openDemo(browser));
    await page.locator('foldlens-toolbar').getByRole('button', { name: /Lasso/ }).click();
  });
  afterAll(async () => {
    await browser?.close();
  });

  for (const domain of truth.domains) {
    it(`a mouse lasso over the ${domain.id} domain gives a fold axis within ${AXIS_TOLERANCE_DEGREES}° of the planted ${domain.axis.trend.toFixed(0)}/${domain.axis.plunge}`, async () => {
      const before = await analysisStamp(page);
      await dragLasso(page, await domainPath(page, domain.polygon));
      await waitForAnalysis(page, before);
      const text = await panelText(page);
      const m = /Fold axis \(π\)\s*(\d{3})\/(\d{2})/.exec(text);
      expect(m, `no fold axis in the panel: ${text.slice(0, 400)}`).not.toBeNull();
      const shown = { trend: Number(m![1]), plunge: Number(m![2]) };
      expect(angleBetweenLines(shown, domain.axis)).toBeLessThan(AXIS_TOLERANCE_DEGREES);
      const count = await page.locator('foldlens-toolbar').evaluate((el) => (el as HTMLElement & { selectedCount: number }).selectedCount);
      expect(count).toBeGreaterThan(100);
      expect(text).not.toMatch(/NaN|undefined|Infinity/);
    });
  }

  it('the lassoed area saves as a named domain and is still there, with its axis, after a reload', async () => {
    const before = await analysisStamp(page);
    await dragLasso(page, await domainPath(page, truth.domains[0].polygon));
    await waitForAnalysis(page, before);
    const panel = page.locator('foldlens-domains');
    await panel.getByRole('textbox', { name: 'Name of the new domain' }).fill('Oskaran <b>west</b>');
    await panel.getByRole('button', { name: 'Save selection as domain' }).click();
    await page.waitForFunction(() => document.body.dataset.domainsSaved === '1', null, { timeout: 60_000 });
    await page.reload();
    await page.waitForSelector('body[data-map-ready="true"]', { timeout: 60_000 });
    const row = panel.getByRole('row', { name: /Oskaran <b>west<\/b>/ });
    await expect.poll(() => row.count()).toBe(1);
    const cells = await row.getByRole('cell').allTextContents();
    const m = /(\d{3})\/(\d{2})/.exec(cells[2]);
    expect(m, `axis cell: ${cells.join(' | ')}`).not.toBeNull();
    expect(angleBetweenLines({ trend: Number(m![1]), plunge: Number(m![2]) }, truth.domains[0].axis)).toBeLessThan(AXIS_TOLERANCE_DEGREES);
    // The name typed by the user is shown as text on the map label, never as HTML.
    const label = await page.locator('.foldlens-domain-label').first().textContent();
    expect(label).toContain('Oskaran <b>west</b>');
    expect(await page.locator('.foldlens-domain-label b').count()).toBe(0);
    await page.locator('foldlens-toolbar').getByRole('button', { name: /Lasso/ }).click();
  });

  it('a lasso around two stations shows a clear message instead of an axis, and never NaN', async () => {
    const before = await analysisStamp(page);
    // A tiny lasso around the first usable bedding station.
    const p = await page.evaluate(() => {
      const d = (window as unknown as { foldlensDemo: { map: import('maplibre-gl').Map; stations: Array<{ kind?: string; lon?: number; lat?: number; problems: unknown[] }> } }).foldlensDemo;
      const s = d.stations.find((x) => x.kind === 'bedding' && x.problems.length === 0)!;
      const rect = d.map.getCanvasContainer().getBoundingClientRect();
      const q = d.map.project([s.lon!, s.lat!]);
      return { x: rect.left + q.x, y: rect.top + q.y };
    });
    await dragLasso(page, [{ x: p.x - 4, y: p.y - 4 }, { x: p.x + 4, y: p.y - 4 }, { x: p.x + 4, y: p.y + 4 }, { x: p.x - 4, y: p.y + 4 }]);
    await waitForAnalysis(page, before);
    const text = await panelText(page);
    expect(text).toMatch(/at least (three|3) planes|fewer than 3|only 1 plane|only one plane/i);
    expect(text).not.toMatch(/NaN|undefined|Infinity/);
    expect(errors).toEqual([]);
  });
});
