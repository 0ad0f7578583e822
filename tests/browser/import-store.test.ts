import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { inject } from 'vitest';
import { isDeepStrictEqual } from 'node:util';
import { launchBrowser } from './browser';
import { openImportPage, watch } from './pages/import-harness';

/**
 * The project store (src/io/projectStore.ts) in a real browser's IndexedDB, through the import
 * test page (pages/import.*): save, reload, restore; only changed chunks rewritten; the autosave's
 * latest project wins; and a page closed in the middle of a large save finds the previous state
 * when it is opened again.
 */

async function reopen(context: BrowserContext, db: string, errors: string[], noload = false): Promise<Page> {
  const page = await context.newPage();
  watch(page, errors);
  await page.goto(`${inject('demoUrl')}tests/browser/pages/import.html?db=${db}${noload ? '&noload' : ''}`);
  await page.waitForSelector('body[data-ready="true"]', { timeout: 60_000 });
  return page;
}

const keysOf = (page: Page): Promise<string[]> => page.evaluate(() => (window as any).importPage.storeKeys());
const restored = (page: Page): Promise<string | undefined> => page.evaluate(() => document.body.dataset.restored);

describe('projectStore in IndexedDB', () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it('save(project) then a reload restores it: 20,000 stations in 4 chunks of 5000 behind one pointer', async () => {
    const db = `store-a-${Date.now()}`;
    const p = await openImportPage(browser, db);
    await p.page.evaluate(() => (window as any).importPage.bigSave(20_000, false));
    const keys = await keysOf(p.page);
    expect(keys.filter((k) => k.startsWith('c-'))).toHaveLength(4);
    expect(keys.filter((k) => k.startsWith('m-'))).toHaveLength(1);
    expect(keys).toContain('pointer');
    const before = await p.page.evaluate(() => JSON.stringify((window as any).importPage.project().datasets));
    await p.page.reload();
    await p.page.waitForSelector('body[data-ready="true"]');
    expect(await restored(p.page)).toBe('20000');
    const after = await p.page.evaluate(() => JSON.stringify((window as any).importPage.project().datasets));
    // Compared as objects (key order aside); a boolean, so a failure does not print 20,000 stations.
    expect(isDeepStrictEqual(JSON.parse(after), JSON.parse(before))).toBe(true);
    expect(await p.page.locator('foldlens-table .toolbar .count').textContent()).toBe('20,000 rows');
    expect(p.errors).toEqual([]);
    await p.context.close();
  });

  it('an edit to one station rewrites only its chunk: the other chunks keep their keys', async () => {
    const db = `store-b-${Date.now()}`;
    const p = await openImportPage(browser, db);
    await p.page.evaluate(() => (window as any).importPage.bigSave(20_000, false));
    const before = (await keysOf(p.page)).filter((k) => k.startsWith('c-')).sort();
    await p.page.evaluate(() => (window as any).importPage.editAndSave(12_345));
    const after = (await keysOf(p.page)).filter((k) => k.startsWith('c-')).sort();
    expect(after).toHaveLength(4);
    expect(after.filter((k) => before.includes(k))).toHaveLength(3);
    await p.page.reload();
    await p.page.waitForSelector('body[data-ready="true"]');
    const edited = await p.page.evaluate(() => (window as any).importPage.project().datasets[0]);
    expect(edited.stations[12_345].source.notes).toMatch(/^edited /);
    expect(edited.edits).toHaveLength(1);
    await p.context.close();
  });

  it('Autosave keeps the latest of a burst of changes: p5 of p1..p5 is what a reload restores', async () => {
    const db = `store-c-${Date.now()}`;
    const p = await openImportPage(browser, db);
    await p.page.evaluate(() => (window as any).importPage.autosaveBurst(5));
    await p.page.reload();
    await p.page.waitForSelector('body[data-ready="true"]');
    expect(await p.page.evaluate(() => (window as any).importPage.project().name)).toBe('p5');
    await p.context.close();
  });

  it('a page closed in the middle of a 300,000-station save finds the previous state (1000 stations) when opened again', async () => {
    const db = `store-d-${Date.now()}`;
    const errors: string[] = [];
    const p = await openImportPage(browser, db);
    await p.page.evaluate(() => (window as any).importPage.bigSave(1000, false));
    // The large save is stopped before it can move the pointer; the page is closed while it writes.
    await p.page.evaluate(() => (window as any).importPage.bigSave(300_000, true));
    // Closed at once: usually while the chunks are still being written; on a busy machine the write may
    // have committed already, but the pointer never moves (the page holds the save before the switch).
    expect(['writing', 'written']).toContain(await p.page.evaluate(() => document.body.dataset.phase));
    await p.page.close({ runBeforeUnload: false });
    const page = await reopen(p.context, db, errors);
    expect(await restored(page)).toBe('1000');
    // Whatever the killed save left behind was cleared on load: one manifest, one chunk, the pointer.
    expect((await keysOf(page)).sort()).toHaveLength(3);
    expect(errors).toEqual([]);
    await p.context.close();
  });

  it('a page closed after a large save was written but before the pointer switched finds the previous state, and the orphans are cleared', async () => {
    const db = `store-e-${Date.now()}`;
    const errors: string[] = [];
    const p = await openImportPage(browser, db);
    await p.page.evaluate(() => (window as any).importPage.bigSave(1000, false));
    await p.page.evaluate(() => (window as any).importPage.bigSave(100_000, true));
    await p.page.waitForSelector('body[data-phase="written"]', { timeout: 60_000 });
    await p.page.close({ runBeforeUnload: false });
    // Opened without restoring first: the new state's chunks are there, but nothing points to them.
    const look = await reopen(p.context, db, errors, true);
    const keys = await keysOf(look);
    expect(keys.filter((k) => k.startsWith('c-')).length).toBe(1 + 20);
    expect(keys.filter((k) => k.startsWith('m-')).length).toBe(2);
    expect(await look.evaluate(() => (window as any).importPage.restore())).toBe('1000');
    expect((await keysOf(look)).length).toBe(3);
    expect(errors).toEqual([]);
    await p.context.close();
  });
});
