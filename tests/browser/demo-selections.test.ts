import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { launchBrowser, openDemo } from './browser';
import { analysisStamp, domainPath, dragThrough as dragLasso, selectedCount, waitForAnalysis } from './demoActions';
import truth from '../../sample-maps/korvane/truth.json';

/**
 * Named selections on the demo page (index.html), as a user keeps one: draws a lasso with the
 * mouse on the sample map, saves the selection under a name from the keyboard, reloads the page,
 * and applies the saved selection again from the keyboard. The same stations must come back: the
 * count the toolbar shows after the lasso is the reference, and the stations' ids are compared too.
 */

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
    const before = await analysisStamp(page);
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
    await waitForAnalysis(page, before);
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
