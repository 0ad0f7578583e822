import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { launchBrowser, openDemo } from './browser';
import truth from '../../sample-maps/korvane/truth.json';

/**
 * Named selections on the demo page (index.html), as a user keeps one: draws a lasso with the
 * mouse on the sample map, saves the selection under a name from the keyboard, reloads the page,
 * and applies the saved selection again from the keyboard. The same stations must come back: the
 * count the toolbar shows after the lasso is the reference, and the stations' ids are compared too.
 */

/** Screen points of a domain polygon of the sample map, pulled 15% toward its centre (as demo-lasso.test.ts does). */
async function domainPath(page: Page, ring: number[][]): Promise<Array<{ x: number; y: number }>> {
  return page.evaluate((r) => {
    const map = (window as unknown as { foldlensDemo: { map: import('maplibre-gl').Map } }).foldlensDemo.map;
    const rect = map.getCanvasContainer().getBoundingClientRect();
    const pts = r.slice(0, -1).map(([lon, lat]) => map.project([lon, lat]));
    const cx = pts.reduce((s, p) => s + p.x, 0) / pts.length;
    const cy = pts.reduce((s, p) => s + p.y, 0) / pts.length;
    return pts.map((p) => ({ x: rect.left + cx + (p.x - cx) * 0.85, y: rect.top + cy + (p.y - cy) * 0.85 }));
  }, ring);
}

/** A freehand lasso with the mouse: press, drag along the corners, release. */
async function dragLasso(page: Page, corners: Array<{ x: number; y: number }>): Promise<void> {
  await page.mouse.move(corners[0].x, corners[0].y);
  await page.mouse.down();
  const closed = [...corners, corners[0]];
  for (let k = 1; k < closed.length; k++) {
    const a = closed[k - 1];
    const b = closed[k];
    for (let s = 1; s <= 15; s++) await page.mouse.move(a.x + ((b.x - a.x) * s) / 15, a.y + ((b.y - a.y) * s) / 15);
  }
  await page.mouse.up();
}

const selectedCount = (page: Page): Promise<number> =>
  page.locator('foldlens-toolbar').evaluate((el) => (el as HTMLElement & { selectedCount: number }).selectedCount);

/** Ids of the selected stations, read from the plugin's own selection. */
const selectedIds = (page: Page): Promise<string[]> =>
  page.evaluate(() => {
    const d = (window as unknown as { foldlensDemo: { foldlens: { selectedIndices(): Int32Array }; stations: Array<{ id: string }> } }).foldlensDemo;
    return Array.from(d.foldlens.selectedIndices(), (i) => d.stations[i].id);
  });

describe('named selections on the demo page', () => {
  let browser: Browser;
  let page: Page;
  let errors: string[];
  let lassoed: number;
  let lassoedIds: string[];
  beforeAll(async () => {
    browser = await launchBrowser();
    ({ page, errors } = await openDemo(browser));
  });
  afterAll(async () => {
    await browser?.close();
  });

  it('a mouse lasso over a domain of the sample map selects its stations, and Save selection becomes available', async () => {
    const panel = page.locator('foldlens-selections');
    expect(await panel.getByRole('button', { name: 'Save selection' }).isDisabled()).toBe(true);
    await page.locator('foldlens-toolbar').getByRole('button', { name: /Lasso/ }).click();
    await dragLasso(page, await domainPath(page, truth.domains[1].polygon));
    await expect.poll(() => selectedCount(page), { timeout: 30_000 }).toBeGreaterThan(50);
    lassoed = await selectedCount(page);
    lassoedIds = await selectedIds(page);
    expect(lassoedIds).toHaveLength(lassoed);
    expect(await panel.getByRole('button', { name: 'Save selection' }).isEnabled()).toBe(true);
  });

  it('the selection is saved under a typed name with the keyboard (Enter in the name field) and listed with its count and tool', async () => {
    const panel = page.locator('foldlens-selections');
    const name = panel.getByRole('textbox', { name: 'Name of the selection to save' });
    await name.focus();
    await page.keyboard.type('Oskaran <i>east</i> limb');
    await page.keyboard.press('Enter');
    await page.waitForFunction(() => document.body.dataset.selectionsSaved === '1', null, { timeout: 30_000 });
    const rows = panel.getByRole('listitem');
    expect(await rows.count()).toBe(1);
    // The name is shown as typed, as text: no <i> element is made from it.
    expect((await rows.first().textContent())!.replace(/\s+/g, ' ')).toContain(`Oskaran <i>east</i> limb ${lassoed} stations, lasso`);
    expect(await panel.locator('li i').count()).toBe(0);
    expect(await panel.getByRole('status').textContent()).toBe(`Saved “Oskaran <i>east</i> limb”: ${lassoed} stations.`);
  });

  it('after a reload nothing is selected, the saved selection is listed, and Apply from the keyboard selects the same stations with their outline', async () => {
    await page.reload();
    await page.waitForSelector('body[data-map-ready="true"]', { timeout: 60_000 });
    expect(await selectedCount(page)).toBe(0);
    const panel = page.locator('foldlens-selections');
    const apply = panel.getByRole('button', { name: 'Apply the selection Oskaran <i>east</i> limb' });
    await apply.waitFor({ timeout: 30_000 });
    const before = await page.evaluate(() => document.body.dataset.analysisReady);
    await apply.focus();
    await page.keyboard.press('Enter');
    await expect.poll(() => selectedCount(page), { timeout: 30_000 }).toBe(lassoed);
    expect(await selectedIds(page)).toEqual(lassoedIds);
    expect(await panel.getByRole('status').textContent()).toBe(`Applied “Oskaran <i>east</i> limb”: ${lassoed} stations selected.`);
    // The outline comes back with it: the profile button (which needs one) is enabled again.
    const outline = await page.evaluate(() => (window as unknown as { foldlensDemo: { foldlens: { shape: unknown[] | null } } }).foldlensDemo.foldlens.shape?.length ?? 0);
    expect(outline).toBeGreaterThan(10);
    expect(await page.locator('#profile-button').isEnabled()).toBe(true);
    // And the net panel analyses it as any selection.
    await page.waitForFunction((prev) => document.body.dataset.analysisReady && document.body.dataset.analysisReady !== prev, before, { timeout: 60_000 });
    const label = await page.evaluate(() => (document.querySelector('foldlens-net') as HTMLElement & { selectionLabel: string }).selectionLabel);
    expect(label).toMatch(new RegExp(`^${lassoed} stations selected`));
  });

  it('Delete removes the saved selection, and that too survives a reload', async () => {
    const panel = page.locator('foldlens-selections');
    await panel.getByRole('button', { name: 'Delete the selection Oskaran <i>east</i> limb' }).click();
    expect(await panel.getByRole('listitem').count()).toBe(0);
    expect(await panel.getByRole('status').textContent()).toBe('Deleted “Oskaran <i>east</i> limb”.');
    await page.waitForFunction(() => document.body.dataset.selectionsSaved === '0', null, { timeout: 30_000 });
    await page.reload();
    await page.waitForSelector('body[data-map-ready="true"]', { timeout: 60_000 });
    expect(await page.locator('foldlens-selections').getByText('No named selections yet').count()).toBe(1);
    expect(errors).toEqual([]);
  });
});
