// Node-side helpers for the import browser tests (tests/browser/import*.test.ts): open the
// import test page (pages/import.html) in a browser context of its own, and read what the
// components show. Playwright's CSS locators pierce open shadow roots, so `foldlens-import .x`
// finds `.x` inside the component.
import { inject } from 'vitest';
import type { Browser, BrowserContext, Page } from 'playwright-core';

export interface ImportPage {
  readonly context: BrowserContext;
  readonly page: Page;
  readonly errors: string[];
  readonly url: string;
}

/** Opens pages/import.html with its own IndexedDB database (`db`), failing on page errors. */
export async function openImportPage(browser: Browser, db: string, viewport = { width: 1400, height: 1000 }, context?: BrowserContext): Promise<ImportPage> {
  const ctx = context ?? (await browser.newContext({ viewport, acceptDownloads: true }));
  const page = await ctx.newPage();
  const errors: string[] = [];
  watch(page, errors);
  const url = `${inject('demoUrl')}tests/browser/pages/import.html?db=${encodeURIComponent(db)}`;
  await page.goto(url);
  await page.waitForSelector('body[data-ready="true"]', { timeout: 60_000 });
  return { context: ctx, page, errors, url };
}

/** Collects page errors and console errors into `errors`. */
export function watch(page: Page, errors: string[]): void {
  page.on('pageerror', (e) => errors.push(`pageerror: ${e.message}`));
  page.on('console', (m) => {
    if (m.type() === 'error') errors.push(`console: ${m.text()}`);
  });
}

/** Events the page has logged (see pages/import.ts). */
export async function pageEvents(page: Page): Promise<{ type: string; detail: any }[]> {
  return page.evaluate(() => (window as any).importPage.events.slice());
}

/** Waits until the page has logged an event of `type` beyond the first `after`. */
export async function waitForEvent(page: Page, type: string, after = 0, timeout = 60_000): Promise<any> {
  await page.waitForFunction(([t, n]) => (window as any).importPage.events.filter((e: { type: string }) => e.type === t).length > n, [type, after] as const, { timeout });
  return (await pageEvents(page)).filter((e) => e.type === type)[after].detail;
}

/** Drops a file on the import component, as a user would. */
export async function dropFile(page: Page, name: string, content: string | Uint8Array, type = ''): Promise<void> {
  await page.evaluate(([n, c, t]) => (window as any).importPage.drop(n, c, t), [name, typeof content === 'string' ? content : [...content], type] as const);
}

/** Waits for the mapping step. */
export async function waitForMapping(page: Page): Promise<void> {
  await page.locator('foldlens-import form[part="mapping"]').waitFor({ timeout: 30_000 });
}

/** The text of the import component's error box, once it shows. */
export async function importError(page: Page): Promise<string> {
  const box = page.locator('foldlens-import [part="error"]');
  await box.waitFor({ timeout: 30_000 });
  return (await box.textContent())?.replace(/\s+/g, ' ').trim() ?? '';
}

/** The messages of the mapping step, as "Fix: ...", "Check: ...", "Note: ...". */
export async function mappingMessages(page: Page): Promise<string[]> {
  return page.locator('foldlens-import [part="messages"] li').allTextContents();
}

/** Waits until the autosave reports everything saved. */
export async function waitSaved(page: Page): Promise<void> {
  await page.evaluate(() => (window as any).importPage.flush());
  await page.waitForSelector('body[data-save-state="saved"]', { timeout: 60_000 });
}
