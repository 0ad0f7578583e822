import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import Papa from 'papaparse';
import proj4 from 'proj4';
import type { Browser } from 'playwright-core';
import { launchBrowser } from './browser';
import { dropFile, openImportPage, pageEvents, waitForEvent, waitForMapping, mappingMessages, waitSaved, type ImportPage } from './pages/import-harness';

/**
 * Drop -> confirm -> reload on the import test page (pages/import.*), with the Korvane sample in
 * quadrant notation and UTM coordinates (sample-maps/korvane/stations-quadrant.csv): the
 * stations listed, the planted bad rows explained (sample-maps/korvane/README.md), a bad value
 * fixed in the table, and everything found again after a reload.
 */

const KORVANE = readFileSync('sample-maps/korvane/stations-quadrant.csv', 'utf8');
const require = createRequire(import.meta.url);
const axeSource = readFileSync(require.resolve('axe-core/axe.min.js'), 'utf8');

interface AxeResult { violations: { id: string; impact: string | null; help: string; nodes: { target: string[] }[] }[] }

async function seriousA11yViolations(p: ImportPage): Promise<string[]> {
  const r: AxeResult = await p.page.evaluate(async (src) => {
    if (!(window as any).axe) (0, eval)(src);
    return (window as any).axe.run(document, { resultTypes: ['violations'] });
  }, axeSource);
  return r.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical').map((v) => `${v.id}: ${v.help} (${v.nodes.map((n) => n.target.join(' ')).slice(0, 3).join('; ')})`);
}

describe('<foldlens-import> and <foldlens-table>: drop, confirm, reload', () => {
  let browser: Browser;
  let p: ImportPage;
  beforeAll(async () => {
    browser = await launchBrowser();
    p = await openImportPage(browser, `flow-${Date.now()}`);
  });
  afterAll(async () => {
    await browser?.close();
  });

  it('dropping stations-quadrant.csv shows the mapping step with the detected columns, and asks for the coordinate system of E and N', async () => {
    await dropFile(p.page, 'stations-quadrant.csv', KORVANE, 'text/csv');
    await waitForMapping(p.page);
    const picked = async (field: string) => p.page.locator(`foldlens-import select[data-field="${field}"]`).inputValue();
    expect(await picked('id')).toBe('Stn');
    expect(await picked('strike')).toBe('Strike');
    expect(await picked('dipQuadrant')).toBe('DipQuad');
    expect(await picked('x')).toBe('E');
    expect(await picked('y')).toBe('N');
    expect(await mappingMessages(p.page)).toContain('Fix:Columns "E", "N" hold map coordinates: choose their coordinate system.');
    expect(await p.page.locator('foldlens-import button[part="confirm"]').isDisabled()).toBe(true);
    // The first rows are shown as read, text as text.
    expect(await p.page.locator('foldlens-import [part="preview"] tbody tr').count()).toBe(5);
    expect(await seriousA11yViolations(p)).toEqual([]);
  });

  it('choosing "WGS 84 / UTM zone 33N" by name settles it, and Import reads every row in the worker', async () => {
    await p.page.locator('foldlens-import select[data-option="crs"]').selectOption({ label: 'WGS 84 / UTM zone 33N' });
    expect(await p.page.locator('foldlens-import .crs-note').textContent()).toMatch(/Using WGS 84 \/ UTM zone 33N \(EPSG:32633\)/);
    const confirm = p.page.locator('foldlens-import button[part="confirm"]');
    expect(await confirm.isDisabled()).toBe(false);
    expect(await confirm.textContent()).toMatch(/Import 494 rows/);
    await confirm.click();
    const detail = await waitForEvent(p.page, 'foldlens-import');
    expect(detail).toMatchObject({ fileName: 'stations-quadrant.csv', stations: 494, options: { crs: 'EPSG:32633', north: 'true' }, report: { rows: 494, usable: 489, withProblems: 5 } });
  });

  it('the report lists every planted bad row with its row, column, value and what was expected', async () => {
    const summary = (await p.page.locator('foldlens-import [part="summary"]').textContent())!.replace(/\s+/g, ' ');
    expect(summary).toMatch(/stations-quadrant\.csv: 494 rows read, 489 usable, 5 with problems \(kept and flagged\)/);
    const problems = await p.page.locator('foldlens-import [part="problems"] li').allTextContents();
    // sample-maps/korvane/README.md, "Planted bad rows".
    expect(problems).toHaveLength(5);
    expect(problems[0]).toBe('row 32, column Dip: "95"; expected a dip from 0 to 90');
    expect(problems[1]).toMatch(/^row 134, column Type: empty; expected a kind such as bedding/);
    expect(problems[2]).toMatch(/^row 376, column Dip: "3O"; expected a dip from 0 to 90/);
    expect(problems[3]).toMatch(/^row 449, column E: "2724417"; expected an easting here: x and y look swapped/);
    expect(problems[4]).toMatch(/^row 450, column DipQuad: "E"; expected a dip quadrant/);
  });

  it('the table lists the stations: KR-0001 as 118/19 at the place proj4 puts 497342 E, 2721139 N of zone 33N, with only the rows in view in the DOM', async () => {
    expect(await p.page.locator('foldlens-table .toolbar .count').textContent()).toBe('494 rows');
    const first = p.page.locator('foldlens-table .row[data-index="0"] .cell');
    const texts = await first.allTextContents();
    // Strike N28E with the dip quadrant SE: dip direction 028 + 90 = 118 (common practice).
    expect(texts.map((t) => t.trim()).slice(0, 5)).toEqual(['1', '', 'KR-0001', 'Bedding', '118/19']);
    // Outside reference: proj4 itself, with the UTM zone 33N definition.
    const [lon, lat] = proj4('+proj=utm +zone=33 +datum=WGS84 +units=m +no_defs', 'WGS84', [497342, 2721139]);
    expect(texts[6].trim()).toBe(`${lat.toFixed(5)}, ${lon.toFixed(5)}`);
    expect(await p.page.locator('foldlens-table .row').count()).toBeLessThan(40);
  });

  it('a row click fires foldlens-row-select, and setting selectedIndex scrolls row 450 into view and marks it', async () => {
    await p.page.locator('foldlens-table .row[data-index="2"] .cell').nth(2).click();
    expect((await pageEvents(p.page)).filter((e) => e.type === 'foldlens-row-select').at(-1)?.detail).toEqual({ index: 2 });
    await p.page.evaluate(() => ((document.querySelector('#table') as any).selectedIndex = 449));
    const row = p.page.locator('foldlens-table .row[data-index="449"]');
    await row.waitFor();
    expect(await row.getAttribute('aria-selected')).toBe('true');
    const box = (await row.boundingBox())!;
    const view = (await p.page.locator('foldlens-table .viewport').boundingBox())!;
    expect(box.y).toBeGreaterThanOrEqual(view.y);
    expect(box.y + box.height).toBeLessThanOrEqual(view.y + view.height + 1);
  });

  it('the keyboard moves through the grid (arrows, Ctrl+Home) and Enter selects the row', async () => {
    const grid = p.page.locator('foldlens-table .viewport');
    await grid.focus();
    await p.page.keyboard.press('Control+Home');
    await p.page.keyboard.press('ArrowDown');
    await p.page.keyboard.press('ArrowDown');
    await p.page.keyboard.press('Enter');
    expect((await pageEvents(p.page)).filter((e) => e.type === 'foldlens-row-select').at(-1)?.detail).toEqual({ index: 2 });
    expect(await grid.getAttribute('aria-activedescendant')).toMatch(/^cell-2-/);
  });

  it('the Rows and Kind filters show the 5 rows with problems and the 40 hinges; a heading sorts', async () => {
    const rows = p.page.locator('foldlens-table select[aria-label="Show rows"]');
    await rows.selectOption('problems');
    expect(await p.page.locator('foldlens-table .toolbar .count').textContent()).toBe('5 of 494 rows');
    await rows.selectOption('all');
    await p.page.locator('foldlens-table select[aria-label="Show rows of kind"]').selectOption('hinge');
    expect(await p.page.locator('foldlens-table .toolbar .count').textContent()).toBe('40 of 494 rows');
    await p.page.locator('foldlens-table select[aria-label="Show rows of kind"]').selectOption('all');
    await p.page.locator('foldlens-table [role="columnheader"] button[aria-label="Sort by Id"]').click();
    await p.page.locator('foldlens-table [role="columnheader"] button[aria-label="Sort by Id"]').click();
    expect(await p.page.locator('foldlens-table [role="columnheader"]:has(button[aria-label="Sort by Id"])').getAttribute('aria-sort')).toBe('descending');
    expect((await p.page.locator('foldlens-table .row').first().locator('.cell').nth(2).textContent())?.trim()).toBe('KR-0494');
    await p.page.locator('foldlens-table [role="columnheader"] button[aria-label="Sort by Row"]').click();
  });

  it('editing the flagged dip "3O" of row 376 to 30 reads the row again and fires foldlens-row-fixed', async () => {
    await p.page.locator('foldlens-table select[aria-label="Show rows"]').selectOption('problems');
    const cell = p.page.locator('foldlens-table .row[data-index="375"] .cell.flagged');
    expect((await cell.textContent())?.trim()).toBe('3O');
    await cell.dblclick();
    const input = p.page.locator('foldlens-table .cell input');
    await input.fill('30');
    await input.press('Enter');
    const fixed = await waitForEvent(p.page, 'foldlens-row-fixed');
    expect(fixed).toMatchObject({ index: 375, problems: 0, edit: { row: 376, column: 'Dip', from: '3O', to: '30' } });
    expect(await p.page.locator('foldlens-table .message').textContent()).toBe('Row 376 is usable now.');
    expect((await p.page.locator('foldlens-import [part="summary"]').textContent())!.replace(/\s+/g, ' ')).toMatch(/490 usable, 4 with problems/);
    // A value still wrong keeps the row flagged, and says why.
    await p.page.locator('foldlens-table .row[data-index="31"] .cell.flagged').dblclick();
    await p.page.locator('foldlens-table .cell input').fill('91');
    await p.page.locator('foldlens-table .cell input').press('Enter');
    expect(await p.page.locator('foldlens-table .message').textContent()).toBe('Row 32 still cannot be used: row 32, column Dip: "91"; expected a dip from 0 to 90');
    expect(await seriousA11yViolations(p)).toEqual([]);
  });

  it('Export CSV and GeoJSON download every original column and row, with the edit and the problems (read back with papaparse)', async () => {
    const [csvDownload] = await Promise.all([p.page.waitForEvent('download'), p.page.locator('foldlens-table button:has-text("Export CSV")').click()]);
    expect(csvDownload.suggestedFilename()).toBe('stations-quadrant.foldlens.csv');
    const csv = readFileSync((await csvDownload.path())!, 'utf8');
    const parsed = Papa.parse<Record<string, string>>(csv, { header: true, skipEmptyLines: true });
    expect(parsed.data).toHaveLength(494);
    expect(parsed.meta.fields!.slice(0, 14)).toEqual(KORVANE.split('\n')[0].split(','));
    expect(parsed.data[375]).toMatchObject({ Stn: 'KR-0376', Dip: '30', fl_problems: '' });
    expect(parsed.data[31].fl_problems).toBe('row 32, column Dip: "91"; expected a dip from 0 to 90');
    const [geoDownload] = await Promise.all([p.page.waitForEvent('download'), p.page.locator('foldlens-table button:has-text("GeoJSON")').click()]);
    const fc = JSON.parse(readFileSync((await geoDownload.path())!, 'utf8'));
    expect(fc.features).toHaveLength(494);
    expect(fc.features[0].properties).toMatchObject({ Stn: 'KR-0001', Strike: 'N28E', fl_dip_direction: 118, fl_dip: 19 });
  });

  it('after a reload the project is restored from IndexedDB: the same stations, the edits, the report and the table', async () => {
    await waitSaved(p.page);
    const before = await p.page.evaluate(() => JSON.stringify((window as any).importPage.project().datasets));
    await p.page.reload();
    await p.page.waitForSelector('body[data-ready="true"]');
    expect(await p.page.evaluate(() => document.body.dataset.restored)).toBe('494');
    const after = await p.page.evaluate(() => JSON.stringify((window as any).importPage.project().datasets));
    expect(JSON.parse(after)).toEqual(JSON.parse(before));
    expect(JSON.parse(after)[0].edits.map((e: { to: string }) => e.to)).toEqual(['30', '91']);
    expect((await p.page.locator('foldlens-import [part="summary"]').textContent())!.replace(/\s+/g, ' ')).toMatch(/494 rows read, 490 usable, 4 with problems/);
    expect(await p.page.locator('foldlens-import [part="problems"] li').count()).toBe(4);
    expect(await p.page.locator('foldlens-table .toolbar .count').textContent()).toBe('494 rows');
    expect(p.errors).toEqual([]);
  });

  it('a project file written by projectToJson and dropped back opens as the same project (foldlens-project-open)', async () => {
    const file = await p.page.evaluate(() => (window as any).importPage.exportProject());
    const before = JSON.parse(file);
    await p.page.evaluate(() => ((document.querySelector('#table') as any).data = null));
    await dropFile(p.page, 'korvane.foldlens.json', file, 'application/json');
    const opened = await waitForEvent(p.page, 'foldlens-project-open');
    expect(opened).toEqual({ fileName: 'korvane.foldlens.json', name: before.name });
    expect(await p.page.locator('foldlens-import .notice').textContent()).toBe(`Opened the project "${before.name}" from korvane.foldlens.json.`);
    expect(await p.page.locator('foldlens-table .toolbar .count').textContent()).toBe('494 rows');
    expect(await p.page.evaluate(() => JSON.stringify((window as any).importPage.project().datasets))).toBe(JSON.stringify(before.datasets));
  });

  it('ParseClient runs the same reading on the page when its worker cannot start', async () => {
    const r = await p.page.evaluate(() => (window as any).importPage.withoutWorker('id,kind,dipdir,dip\nA,bedding,120,40\nB,bedding,130,95\n'));
    expect(r).toEqual({ format: 'csv', rowCount: 2, stations: 2 });
  });

  it('dropping a file with the same headers offers the mapping saved with the first, and using it needs nothing more', async () => {
    const lines = KORVANE.split('\n');
    await dropFile(p.page, 'second-traverse.csv', [lines[0], ...lines.slice(100, 120)].join('\n'), 'text/csv');
    await waitForMapping(p.page);
    const offer = p.page.locator('foldlens-import .offer');
    expect((await offer.textContent())!.replace(/\s+/g, ' ')).toMatch(/A mapping was saved for these columns with stations-quadrant\.csv/);
    await offer.locator('button:has-text("Use saved mapping")').click();
    expect(await p.page.locator('foldlens-import select[data-option="crs"]').inputValue()).toBe('EPSG:32633');
    expect((await mappingMessages(p.page)).filter((m) => m.startsWith('Fix:'))).toEqual([]);
    await p.page.locator('foldlens-import button[part="cancel"]').click();
    // Cancelling changed nothing: the table still holds the first file.
    expect(await p.page.locator('foldlens-table .toolbar .count').textContent()).toBe('494 rows');
    expect(p.errors).toEqual([]);
  });
});
