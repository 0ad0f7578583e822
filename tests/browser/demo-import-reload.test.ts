import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import proj4 from 'proj4';
import type { Browser, Page } from 'playwright-core';
import { launchBrowser, openDemo } from './browser';

/**
 * The "done when" of issue #3, on the demo page itself (index.html): a new user drops a CSV exported
 * from a spreadsheet (UTF-8 with a byte-order mark, Windows line endings, quoted notes) with
 * attitudes in quadrant notation and UTM coordinates, confirms the mapping, sees every good station
 * on the map and every bad row explained, reloads the page and finds it all there.
 *
 * The stations are invented here (the "Velmora ridge" traverse, inside the frame of the synthetic
 * sample map so they are in view without moving the map). Outside references: proj4 with the UTM
 * zone 33N definition places them; the dip direction of a quadrant attitude is strike + 90° on the
 * side the dip quadrant names (common practice).
 */

const UTM33N = '+proj=utm +zone=33 +datum=WGS84 +units=m +no_defs';
const HEADER = ['Station', 'Type', 'Easting', 'Northing', 'Strike', 'Dip', 'Dip Quadrant', 'Trend', 'Plunge', 'Notes'];

interface Good {
  id: string;
  kind: 'Bedding' | 'Hinge';
  e: number;
  n: number;
  cells: string[];
  /** Dip direction/dip (bedding) or trend/plunge (hinge), as the table shows it. */
  attitude: string;
}

/** Quadrant strike text for a strike azimuth (N..E or N..W, as field books write it). */
function quadrantStrike(strike: number): string {
  const s = strike % 180;
  return s <= 90 ? `N${String(s).padStart(2, '0')}E` : `N${String(180 - s).padStart(2, '0')}W`;
}
/** The dip quadrant of a dip direction: the octant letters of the side the plane dips to. */
function dipQuadrant(dipDirection: number): string {
  const names = ['N', 'NE', 'E', 'SE', 'S', 'SW', 'W', 'NW'];
  return names[Math.round(dipDirection / 45) % 8];
}
const pad3 = (v: number): string => String(v).padStart(3, '0');
const pad2 = (v: number): string => String(v).padStart(2, '0');

/** 36 good stations on a grid inside the sample frame (497000-503000 E, 2721000-2725000 N), every sixth a hinge. */
function goodStations(): Good[] {
  const out: Good[] = [];
  for (let i = 0; i < 36; i++) {
    const e = 497600 + (i % 6) * 900 + ((i * 37) % 113);
    const n = 2721500 + Math.floor(i / 6) * 550 + ((i * 53) % 97);
    const id = `VR-${pad2(i + 1)}`;
    if (i % 6 === 5) {
      const trend = 60 + ((i * 7) % 30);
      const plunge = 5 + (i % 15);
      // Trend in quadrant notation too: N60E..N89E.
      out.push({ id, kind: 'Hinge', e, n, cells: [id, 'Hinge', String(e), String(n), '', '', '', `N${trend}E`, String(plunge), ''], attitude: `${pad3(trend)}/${pad2(plunge)}` });
    } else {
      // Strikes 10..169 (never exactly on a quadrant boundary); dip to the south-east or south-west side.
      const strike = 10 + ((i * 41) % 160);
      const dip = 8 + ((i * 13) % 70);
      const dipDirection = strike + 90;
      const note = i % 4 === 0 ? `"float, weathered; see photo ${i}"` : '';
      out.push({ id, kind: 'Bedding', e, n, cells: [id, 'Bedding', String(e), String(n), quadrantStrike(strike), String(dip), dipQuadrant(dipDirection), '', '', note], attitude: `${pad3(dipDirection)}/${pad2(dip)}` });
    }
  }
  return out;
}

/** The bad rows, each wrong in one way, with the row number, column and value the report must name. */
const BAD = [
  { cells: ['VR-90', 'Bedding', '499100', '2722300', 'N28E', '95', 'SE', '', '', ''], column: 'Dip', value: '"95"', expected: /expected a dip from 0 to 90/ },
  { cells: ['VR-91', 'Bedding', '499200', '2722400', 'N28E', '40', 'NE', '', '', ''], column: 'Dip Quadrant', value: '"NE"', expected: /expected a dip quadrant across strike 28/ },
  { cells: ['VR-92', '', '499300', '2722500', 'N10W', '30', 'E', '', '', ''], column: 'Type', value: 'empty', expected: /expected a kind such as bedding/ },
  { cells: ['VR-93', 'Bedding', '49B250', '2722600', 'N10W', '30', 'E', '', '', ''], column: 'Easting', value: '"49B250"', expected: /expected a number/ },
  { cells: ['VR-94', 'Bedding', '2722700', '499500', 'N10W', '30', 'E', '', '', ''], column: 'Easting', value: '"2722700"', expected: /x and y look swapped/ },
];

/** The file as a spreadsheet writes it: BOM, CRLF, bad rows among the good ones. Returns the text and each bad row's number. */
function spreadsheetCsv(good: Good[]): { text: string; badRows: number[] } {
  const rows: string[][] = [];
  const badRows: number[] = [];
  good.forEach((g, i) => {
    rows.push(g.cells);
    if (i % 7 === 3 && badRows.length < BAD.length) {
      rows.push(BAD[badRows.length].cells);
      badRows.push(rows.length); // data rows count from 1 (the header is row 0)
    }
  });
  while (badRows.length < BAD.length) {
    rows.push(BAD[badRows.length].cells);
    badRows.push(rows.length);
  }
  return { text: `\ufeff${[HEADER, ...rows].map((r) => r.join(',')).join('\r\n')}\r\n`, badRows };
}

type DemoWindow = { foldlensDemo: { map: import('maplibre-gl').Map; stations: Array<{ id: string; lon?: number; lat?: number; problems: unknown[] }> } };

/** Distinct station ids drawn on the map now (the overlay's dot layer). */
async function stationsOnMap(page: Page): Promise<string[]> {
  return page.evaluate(() => {
    const { map } = (window as unknown as DemoWindow).foldlensDemo;
    const ids = map.queryRenderedFeatures({ layers: ['foldlens-dots'] }).map((f) => String(f.properties.sid));
    return [...new Set(ids)].sort();
  });
}

async function positions(page: Page): Promise<Record<string, [number, number]>> {
  return page.evaluate(() => {
    const out: Record<string, [number, number]> = {};
    for (const s of (window as unknown as DemoWindow).foldlensDemo.stations) if (s.lon !== undefined && s.lat !== undefined) out[s.id] = [s.lon, s.lat];
    return out;
  });
}

describe('the demo page: drop a spreadsheet CSV, confirm, see it all, reload, find it all there', () => {
  let browser: Browser;
  let page: Page;
  let errors: string[];
  const good = goodStations();
  const { text, badRows } = spreadsheetCsv(good);
  const fileName = 'velmora-ridge.csv';
  const rowCount = good.length + BAD.length;

  beforeAll(async () => {
    browser = await launchBrowser();
    ({ page, errors } = await openDemo(browser));
  });
  afterAll(async () => {
    await browser?.close();
  });

  it('dropping the file on the import panel shows the mapping step with the spreadsheet\'s columns detected', async () => {
    await page.locator('#data-panel > summary').click();
    await page.locator('foldlens-import [part="panel"]').waitFor();
    // A drop as the browser delivers it: a DataTransfer holding the file, dispatched to the drop target.
    await page.evaluate(
      ([name, content]) => {
        const dt = new DataTransfer();
        dt.items.add(new File([content], name, { type: 'text/csv' }));
        const zone = document.querySelector('foldlens-import')!.shadowRoot!.querySelector('[part="panel"]')!;
        zone.dispatchEvent(new DragEvent('dragenter', { dataTransfer: dt, bubbles: true, composed: true, cancelable: true }));
        zone.dispatchEvent(new DragEvent('dragover', { dataTransfer: dt, bubbles: true, composed: true, cancelable: true }));
        zone.dispatchEvent(new DragEvent('drop', { dataTransfer: dt, bubbles: true, composed: true, cancelable: true }));
      },
      [fileName, text] as const,
    );
    await page.locator('foldlens-import form[part="mapping"]').waitFor({ timeout: 60_000 });
    const picked = (field: string) => page.locator(`foldlens-import select[data-field="${field}"]`).inputValue();
    expect(await picked('id')).toBe('Station');
    expect(await picked('kind')).toBe('Type');
    expect(await picked('strike')).toBe('Strike');
    expect(await picked('dipQuadrant')).toBe('Dip Quadrant');
    expect(await picked('trend')).toBe('Trend');
    expect(await picked('x')).toBe('Easting');
    expect(await picked('y')).toBe('Northing');
    // UTM coordinates need their zone: Import waits for it.
    expect(await page.locator('foldlens-import button[part="confirm"]').isDisabled()).toBe(true);
  });

  it('choosing "WGS 84 / UTM zone 33N" and Import puts every good station on the map where proj4 puts it', async () => {
    await page.locator('foldlens-import select[data-option="crs"]').selectOption({ label: 'WGS 84 / UTM zone 33N' });
    const confirm = page.locator('foldlens-import button[part="confirm"]');
    expect(await confirm.textContent()).toMatch(new RegExp(`Import ${rowCount} rows`));
    await confirm.click();
    await page.waitForFunction((name) => document.querySelector('#dataset-label')?.textContent?.startsWith(name), fileName, { timeout: 60_000 });
    expect(await page.locator('#dataset-label').textContent()).toBe(`${fileName} — ${rowCount} rows (your data, saved in this browser)`);
    await expect.poll(() => stationsOnMap(page), { timeout: 30_000 }).toEqual(good.map((g) => g.id).sort());
    const where = await positions(page);
    for (const g of good) {
      const [lon, lat] = proj4(UTM33N, 'WGS84', [g.e, g.n]);
      expect(where[g.id], g.id).toBeDefined();
      expect(Math.abs(where[g.id][0] - lon), `${g.id} longitude`).toBeLessThan(1e-9);
      expect(Math.abs(where[g.id][1] - lat), `${g.id} latitude`).toBeLessThan(1e-9);
    }
  });

  it('every bad row is explained, with its row, column, value and what was expected, in the import report and the demo\'s list', async () => {
    const summary = (await page.locator('foldlens-import [part="summary"]').textContent())!.replace(/\s+/g, ' ');
    expect(summary).toContain(`${fileName}: ${rowCount} rows read, ${good.length} usable, ${BAD.length} with problems (kept and flagged)`);
    const reported = await page.locator('foldlens-import [part="problems"] li').allTextContents();
    const listed = await page.locator('#problems-list li').allTextContents();
    expect(reported).toHaveLength(BAD.length);
    expect(listed).toEqual(reported);
    BAD.forEach((b, k) => {
      const line = reported[k];
      expect(line.startsWith(`row ${badRows[k]}, column ${b.column}: ${b.value}; `), line).toBe(true);
      expect(line).toMatch(b.expected);
    });
    expect(await page.locator('#problems-summary').textContent()).toMatch(new RegExp(`^${BAD.length} rows could not be used`));
  });

  it('the stations table lists every row, good and bad, with the attitudes read from quadrant notation', async () => {
    await page.locator('#table-panel > summary').click();
    expect(await page.locator('foldlens-table .toolbar .count').textContent()).toBe(`${rowCount} rows`);
    const first = (await page.locator('foldlens-table .row[data-index="0"] .cell').allTextContents()).map((t) => t.trim());
    expect(first.slice(2, 5)).toEqual([good[0].id, 'Bedding', good[0].attitude]);
  });

  it('after a reload the same stations are on the map, the same rows are explained, and the table is back', async () => {
    await page.waitForFunction(() => document.body.dataset.saveState === 'saved', null, { timeout: 60_000 });
    const before = await positions(page);
    await page.reload();
    await page.waitForSelector('body[data-map-ready="true"]', { timeout: 60_000 });
    expect(await page.locator('#dataset-label').textContent()).toBe(`${fileName} — ${rowCount} rows (your data, saved in this browser)`);
    await expect.poll(() => stationsOnMap(page), { timeout: 30_000 }).toEqual(good.map((g) => g.id).sort());
    expect(await positions(page)).toEqual(before);
    const listed = await page.locator('#problems-list li').allTextContents();
    expect(listed).toHaveLength(BAD.length);
    BAD.forEach((b, k) => expect(listed[k].startsWith(`row ${badRows[k]}, column ${b.column}: ${b.value}; `), listed[k]).toBe(true));
    await page.locator('#data-panel > summary').click();
    expect((await page.locator('foldlens-import [part="summary"]').textContent())!.replace(/\s+/g, ' ')).toContain(`${rowCount} rows read, ${good.length} usable, ${BAD.length} with problems`);
    await page.locator('#table-panel > summary').click();
    expect(await page.locator('foldlens-table .toolbar .count').textContent()).toBe(`${rowCount} rows`);
    expect(errors).toEqual([]);
  });
});
