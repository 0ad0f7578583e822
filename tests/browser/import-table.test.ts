import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { launchBrowser } from './browser';
import { openImportPage, waitForEvent, waitForMapping, type ImportPage } from './pages/import-harness';

/**
 * <foldlens-table> with 10^4 rows (generated on the import test page): only the rows in view are
 * in the DOM, the rows rendered always cover the visible area wherever it is scrolled, and the
 * frame times of a scripted scroll are printed (no time assertion: budgets belong in bench/).
 */

const ROWS = 10_000;

async function coverage(p: ImportPage): Promise<{ rendered: number; first: number; last: number; covers: boolean }> {
  return p.page.evaluate(() => {
    const root = (document.querySelector('#table') as HTMLElement).shadowRoot!;
    const viewport = root.querySelector('.viewport') as HTMLElement;
    const header = root.querySelector('.header') as HTMLElement;
    const rows = [...root.querySelectorAll<HTMLElement>('.row')];
    const v = viewport.getBoundingClientRect();
    const top = v.top + viewport.clientTop + header.getBoundingClientRect().height;
    const bottom = v.top + viewport.clientTop + viewport.clientHeight;
    const boxes = rows.map((r) => r.getBoundingClientRect());
    const firstBox = boxes[0];
    const lastBox = boxes[boxes.length - 1];
    const atEnd = Number(rows[rows.length - 1].getAttribute('aria-rowindex')) === Number(viewport.getAttribute('aria-rowcount'));
    return {
      rendered: rows.length,
      first: Number(rows[0].dataset.index),
      last: Number(rows[rows.length - 1].dataset.index),
      // Rendered rows reach from above the visible top to below the visible bottom (or to the last row).
      covers: firstBox.top <= top + 0.5 && (lastBox.bottom >= bottom - 0.5 || atEnd),
    };
  });
}

describe('<foldlens-table> with 10^4 rows', () => {
  let browser: Browser;
  let p: ImportPage;
  beforeAll(async () => {
    browser = await launchBrowser();
    p = await openImportPage(browser, `table-${Date.now()}`);
    await p.page.evaluate((n) => (window as any).importPage.dropRows(n), ROWS);
    await waitForMapping(p.page);
    await p.page.locator('foldlens-import button[part="confirm"]').click();
    await waitForEvent(p.page, 'foldlens-import');
  });
  afterAll(async () => {
    await browser?.close();
  });

  it('renders only the rows in view: under 40 of 10,000 in the DOM, covering the viewport', async () => {
    expect(await p.page.locator('foldlens-table .toolbar .count').textContent()).toBe('10,000 rows');
    const c = await coverage(p);
    expect(c.rendered).toBeLessThan(40);
    expect(c.first).toBe(0);
    expect(c.covers).toBe(true);
  });

  it('wherever it is scrolled, the rows rendered cover the visible area and are the right ones', async () => {
    for (const fraction of [0.1, 0.37, 0.5, 0.93, 1]) {
      await p.page.evaluate((f) => {
        const v = (document.querySelector('#table') as HTMLElement).shadowRoot!.querySelector('.viewport') as HTMLElement;
        v.scrollTop = f * (v.scrollHeight - v.clientHeight);
      }, fraction);
      await p.page.evaluate(() => new Promise((r) => requestAnimationFrame(() => requestAnimationFrame(r))));
      const c = await coverage(p);
      expect(c.covers, `at ${fraction}`).toBe(true);
      expect(c.rendered).toBeLessThan(40);
      // Unsorted and unfiltered, the row at a position is the station at that index.
      expect(c.last - c.first + 1).toBe(c.rendered);
      if (fraction === 1) expect(c.last).toBe(ROWS - 1);
    }
  });

  it('a scripted scroll through the table (120 frames) keeps rendering; frame times printed', async () => {
    const r = await p.page.evaluate(
      () =>
        new Promise<{ frames: number; mean: number; max: number }>((resolve) => {
          const v = (document.querySelector('#table') as HTMLElement).shadowRoot!.querySelector('.viewport') as HTMLElement;
          v.scrollTop = 0;
          const gaps: number[] = [];
          let last = performance.now();
          let k = 0;
          const step = (t: number): void => {
            gaps.push(t - last);
            last = t;
            v.scrollTop += 2000;
            if (++k < 120) requestAnimationFrame(step);
            else resolve({ frames: gaps.length, mean: gaps.reduce((a, b) => a + b, 0) / gaps.length, max: Math.max(...gaps) });
          };
          requestAnimationFrame(step);
        }),
    );
    console.log(`10^4-row table, scrolled 2000 px a frame: ${r.frames} frames, mean ${r.mean.toFixed(1)} ms, longest ${r.max.toFixed(1)} ms`);
    expect(r.frames).toBe(120);
    expect((await coverage(p)).covers).toBe(true);
  });

  it('highlight marks a row without scrolling (map hover), selectedIndex scrolls to it (map click)', async () => {
    const viewport = p.page.locator('foldlens-table .viewport');
    await viewport.evaluate((v) => (v.scrollTop = 0));
    await p.page.evaluate(() => ((document.querySelector('#table') as any).highlight = 2));
    await p.page.evaluate(() => new Promise((r) => requestAnimationFrame(() => requestAnimationFrame(r))));
    expect(await p.page.locator('foldlens-table .row.highlight').getAttribute('data-index')).toBe('2');
    await p.page.evaluate(() => ((document.querySelector('#table') as any).highlight = 7000));
    await p.page.evaluate(() => new Promise((r) => requestAnimationFrame(() => requestAnimationFrame(r))));
    expect(await viewport.evaluate((v) => v.scrollTop)).toBe(0);
    await p.page.evaluate(() => ((document.querySelector('#table') as any).selectedIndex = 7000));
    await p.page.locator('foldlens-table .row[data-index="7000"][aria-selected="true"]').waitFor();
    expect(await p.page.locator('foldlens-table .row[data-index="7000"]').getAttribute('class')).toMatch(/highlight/);
    expect((await coverage(p)).covers).toBe(true);
  });

  it('sorting 10,000 rows by an original column puts them in order and keeps the window covered', async () => {
    await p.page.locator('foldlens-table [role="columnheader"] button[aria-label="Sort by dip_direction"]').click();
    await p.page.evaluate(() => ((document.querySelector('#table') as HTMLElement).shadowRoot!.querySelector('.viewport') as HTMLElement).scrollTop = 0);
    await p.page.evaluate(() => new Promise((r) => requestAnimationFrame(() => requestAnimationFrame(r))));
    const values = (await p.page.locator('foldlens-table .row').evaluateAll((rows) => rows.map((r) => r.querySelectorAll('.cell')[9].textContent!.trim()))).map(Number);
    expect(values).toEqual([...values].sort((a, b) => a - b));
    expect(values[0]).toBe(0);
    expect((await coverage(p)).covers).toBe(true);
    expect(p.errors).toEqual([]);
  });
});
