import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import Papa from 'papaparse';
import type { FeatureCollection } from 'geojson';
import type { Browser, BrowserContext, Download, Page } from 'playwright-core';
import { launchBrowser, openDemo } from './browser';
import { readCsv } from '../../src/io/csvTable';
import { detectColumns } from '../../src/io/columns';
import { readStations } from '../../src/io/readStations';
import { emptyProject, projectToJson, withDataset, type FoldlensProject, type ProjectDataset } from '../../src/io/projectFile';
import { KIND_LABELS } from '../../src/map/symbolCatalog';
import { findActiveContent, markupText } from '../helpers/activeContent';
import { HOSTILE_HEADERS, HOSTILE_PAYLOADS, PAYLOAD_ELEMENT_SELECTORS, PWNED_FLAG } from '../helpers/hostilePayloads';

/**
 * The security payload suite (issue #8, point 4) on the demo, driven as a user would: hostile
 * text (tests/helpers/hostilePayloads.ts) goes in through every text field the demo takes, and
 * is read back from every place it shows:
 *
 * - a CSV dropped on the import panel, with payloads as station ids, notes, kind text, column
 *   names and the file's own name: the mapping step (column choices, first rows), the import
 *   report (summary, problems), the page's problem list, the data table (cells, headings,
 *   titles), the station card (opened from the table and by a click on the map symbol), and the
 *   station CSV and GeoJSON downloads;
 * - the net panel's selection label (set from code, as a host page would): the panel text and
 *   its SVG, CSV and JSON exports;
 * - domain names typed when saving and renaming a domain: the domain list, the comparison
 *   lists, the map labels, the axis picker, the profile button, and the profile's label and SVG
 *   export; named selections;
 * - the consistency panel's flags and its printable report (src/core/consistency/reportHtml.ts),
 *   made from those domains and stations, fetched as text and opened in a page of its own;
 * - a project file with payload names dropped on the import panel, and the page reloaded from
 *   the autosaved project.
 *
 * After each step: `window.__pwned` is still undefined, no dialog opened, no console error or
 * page error, and no element a payload could have made exists anywhere (shadow roots walked).
 * Every exported SVG is checked by tests/helpers/activeContent.ts and parsed by the browser's
 * own XML parser. The page's Content-Security-Policy is bypassed on purpose (the plugin is
 * embedded in pages without one): a payload that became markup would really run. The last test
 * is the control: the same checks catch a payload deliberately inserted as HTML.
 */

const DATE = '2025-06-01';
const FILE_NAME = `${HOSTILE_PAYLOADS[0].text}.csv`;
/** Kind text that is not a kind: the row is kept and flagged, and the value quoted in the report. */
const KIND_PAYLOADS = [HOSTILE_PAYLOADS[0].text, HOSTILE_PAYLOADS[5].text, HOSTILE_PAYLOADS[10].text];
const HEADERS = ['id', 'kind', 'dipdir', 'dip', 'lon', 'lat', 'notes', ...HOSTILE_HEADERS];
/** Column number of an original column in the table (7 columns of Foldlens's own come first: tableModel.ts). */
const tableColumn = (header: string): number => 7 + HEADERS.indexOf(header);

/** Rows of the dropped CSV: one station per payload, west of the Korvane fault, then the bad kinds. */
const ROWS: string[][] = [
  ...HOSTILE_PAYLOADS.map((p, i) => [p.text, 'bedding', String((40 + i * 23) % 360), String(20 + (i % 5) * 12), (14.984 + (i % 5) * 0.0012).toFixed(5), (24.618 + Math.floor(i / 5) * 0.0012).toFixed(5), p.text, ...HOSTILE_HEADERS.map(() => p.text)]),
  ...KIND_PAYLOADS.map((k, i) => [`bad-kind-${i + 1}`, k, '100', '30', '14.99', '24.62', 'kind is hostile', ...HOSTILE_HEADERS.map(() => '')]),
];
// Reference writer: papaparse quotes every field that needs it (RFC 4180).
const CSV = Papa.unparse({ fields: HEADERS, data: ROWS }, { newline: '\n' });

/** A project file written with the project's own writer, names and texts all hostile. */
function hostileProject(): { text: string; project: FoldlensProject } {
  const table = readCsv(CSV);
  const mapping = detectColumns(table.headers).mapping;
  const stations = readStations(table, mapping);
  const dataset: ProjectDataset = {
    id: 'ds-hostile',
    name: HOSTILE_PAYLOADS[2].text,
    table: { format: 'csv', headers: table.headers, delimiter: table.delimiter, blankRows: table.blankRows, notes: table.notes, extras: [] },
    mapping,
    options: { planeNotation: 'auto', lineNotation: 'auto', north: 'true' },
    stations,
    edits: [],
  };
  const ring = (x: number, y: number): [number, number][] => [[x, y], [x + 0.004, y], [x + 0.004, y + 0.004], [x, y + 0.004]];
  const base = withDataset(emptyProject(HOSTILE_PAYLOADS[3].text, '2025-06-01T00:00:00.000Z'), dataset);
  const project: FoldlensProject = {
    ...base,
    domains: [
      { id: 'dm-1', name: HOSTILE_PAYLOADS[1].text, ring: ring(14.982, 24.616), analysis: null, stationIds: [], updated: '2025-06-01T00:00:00.000Z' },
      { id: 'dm-2', name: HOSTILE_PAYLOADS[4].text, ring: ring(14.988, 24.616), analysis: null, stationIds: [], updated: '2025-06-01T00:00:00.000Z' },
    ],
    selections: [{ id: 'sel-1', name: HOSTILE_PAYLOADS[7].text, dataset: 'ds-hostile', indices: [0, 1, 2], savedAt: '2025-06-01T00:00:00.000Z' }],
  };
  return { text: projectToJson(project), project };
}

interface Demo {
  readonly page: Page;
  readonly errors: string[];
  readonly dialogs: string[];
}

/** Drops a file on the demo's import panel, as a user dragging it from the desktop. */
async function dropOnImport(page: Page, name: string, content: string, type: string): Promise<void> {
  await page.evaluate(
    ([n, c, t]) => {
      const dt = new DataTransfer();
      dt.items.add(new File([c], n, { type: t }));
      const zone = document.querySelector('#import')!.shadowRoot!.querySelector('[part="panel"]')!;
      zone.dispatchEvent(new DragEvent('dragover', { dataTransfer: dt, bubbles: true, composed: true, cancelable: true }));
      zone.dispatchEvent(new DragEvent('drop', { dataTransfer: dt, bubbles: true, composed: true, cancelable: true }));
    },
    [name, content, type] as const,
  );
}

/**
 * Everything in the page (document and every open shadow root, recursively) that only a payload
 * parsed as markup could have made: payload elements, event-handler attributes, script that
 * mentions the flag, javascript: links.
 */
async function payloadMarkupInPage(page: Page): Promise<string[]> {
  return page.evaluate(([selectors, flag]) => {
    const found: string[] = [];
    const roots: (Document | ShadowRoot)[] = [document];
    for (let r = 0; r < roots.length; r++) {
      const root = roots[r];
      const where = root === document ? 'document' : `shadow root of <${(root as ShadowRoot).host.localName}>`;
      for (const s of selectors) if (root.querySelector(s)) found.push(`${s} in the ${where}`);
      for (const el of root.querySelectorAll('*')) {
        if (el.shadowRoot) roots.push(el.shadowRoot);
        for (const a of el.getAttributeNames()) {
          if (/^on/i.test(a)) found.push(`${a} on <${el.localName}> in the ${where}`);
          if (/^(href|src|xlink:href|action|formaction)$/i.test(a) && /^\s*javascript:/i.test(el.getAttribute(a) ?? '')) found.push(`${a}=javascript: on <${el.localName}> in the ${where}`);
        }
        if (el.localName === 'script' && (el.textContent ?? '').includes(flag)) found.push(`a script mentioning ${flag} in the ${where}`);
      }
    }
    return found;
  }, [PAYLOAD_ELEMENT_SELECTORS, PWNED_FLAG] as const);
}

/** Nothing ran, nothing opened, nothing logged an error, no payload became markup. */
async function expectNothingRan(d: Demo, step: string): Promise<void> {
  expect(await d.page.evaluate((flag) => (window as unknown as Record<string, unknown>)[flag], PWNED_FLAG), `${step}: window.${PWNED_FLAG}`).toBeUndefined();
  expect(d.dialogs, `${step}: dialogs`).toEqual([]);
  expect(d.errors, `${step}: console and page errors`).toEqual([]);
  expect(await payloadMarkupInPage(d.page), `${step}: markup from a payload`).toEqual([]);
}

/** An exported SVG is inert (activeContent.ts), parses as XML in the browser, and holds `text` as text. */
async function expectInertSvg(page: Page, svg: string, text: string): Promise<void> {
  expect(findActiveContent(svg)).toEqual([]);
  const parsed = await page.evaluate((s) => {
    const doc = new DOMParser().parseFromString(s, 'image/svg+xml');
    return { error: doc.querySelector('parsererror')?.textContent ?? null, root: doc.documentElement.localName, text: doc.documentElement.textContent ?? '', elements: [...doc.querySelectorAll('*')].map((e) => e.localName) };
  }, svg);
  expect(parsed.error).toBeNull();
  expect(parsed.root).toBe('svg');
  expect(parsed.elements.filter((n) => ['script', 'foreignObject', 'img', 'iframe', 'body', 'a'].includes(n))).toEqual([]);
  const squash = (s: string): string => s.replace(/\s+/g, '');
  expect(squash(parsed.text)).toContain(squash(text));
  expect(squash(markupText(svg))).toContain(squash(text));
}

/** Scrolls the data table (it renders only the rows in view) until the row of station `index` is there. */
async function showRow(page: Page, index: number): Promise<void> {
  await page.evaluate((i) => (document.querySelector('#table') as HTMLElement & { scrollToIndex(i: number): void }).scrollToIndex(i), index);
  await page.locator(`foldlens-table .row[data-index="${index}"]`).waitFor();
}

async function downloadText(download: Download): Promise<string> {
  return readFileSync((await download.path())!, 'utf8');
}

async function waitForAnalysis(page: Page, before: string | undefined): Promise<void> {
  await page.waitForFunction((prev) => document.body.dataset.analysisReady && document.body.dataset.analysisReady !== prev, before, { timeout: 60_000 });
}

describe('security payload suite on the demo: hostile text is only ever shown as text', () => {
  let browser: Browser;
  let context: BrowserContext;
  let d: Demo;
  let fileName = FILE_NAME;

  beforeAll(async () => {
    browser = await launchBrowser();
    // The demo's own CSP would block an injected handler; a host page may have none, so the
    // suite bypasses it and lets anything injected really run. openDemo is given this context.
    context = await browser.newContext({ viewport: { width: 1400, height: 900 }, bypassCSP: true, acceptDownloads: true });
    // The dev server's reload channel is answered by a silent stand-in: an edit to the source
    // while the suite runs must not reload the page (and its state) halfway through.
    await context.routeWebSocket(() => true, () => {});
    const opened = await openDemo({ newPage: () => context.newPage() } as unknown as Browser);
    const dialogs: string[] = [];
    opened.page.on('dialog', (dialog) => {
      dialogs.push(`${dialog.type()}: ${dialog.message()}`);
      void dialog.dismiss();
    });
    d = { page: opened.page, errors: opened.errors, dialogs };
    await expectNothingRan(d, 'demo opened');
  });
  afterAll(async () => {
    await browser?.close();
  });

  it('a CSV named with markup, with markup in its column names and cells, shows every name literally in the mapping step', async () => {
    const { page } = d;
    await page.locator('#data-panel > summary').click();
    await dropOnImport(page, FILE_NAME, CSV, 'text/csv');
    await page.locator('foldlens-import form[part="mapping"]').waitFor({ timeout: 30_000 });
    // The browser's File keeps the name as given (any change to it would be the browser's own).
    fileName = await page.evaluate((n) => new File([], n).name, FILE_NAME);
    expect(await page.locator('foldlens-import form[part="mapping"] .file .name').textContent()).toBe(fileName);
    const options = await page.locator('foldlens-import select[data-field="notes"] option').allTextContents();
    for (const h of HOSTILE_HEADERS) expect(options).toContain(h);
    expect(await page.locator('foldlens-import select[data-field="id"]').inputValue()).toBe('id');
    // A heading is the column name as text, then a chip saying what it is read as.
    const headings = await page.locator('foldlens-import [part="preview"] thead th').evaluateAll((ths) => ths.map((th) => [...th.childNodes].filter((n) => n.nodeType === Node.TEXT_NODE).map((n) => n.textContent).join('')));
    for (const h of HOSTILE_HEADERS) expect(headings).toContain(h);
    const firstRow = await page.locator('foldlens-import [part="preview"] tbody tr').first().locator('td').allTextContents();
    expect(firstRow).toContain(HOSTILE_PAYLOADS[0].text);
    await expectNothingRan(d, 'mapping step');
  });

  it('importing it lists the bad kinds in the report and the page, quoted as text, and names the file literally', async () => {
    const { page } = d;
    await page.locator('foldlens-import button[part="confirm"]').click();
    await page.locator('foldlens-import [part="summary"]').waitFor({ timeout: 60_000 });
    const summary = (await page.locator('foldlens-import [part="summary"]').textContent())!;
    expect(summary).toContain(fileName);
    expect(summary.replace(/\s+/g, ' ')).toMatch(new RegExp(`${ROWS.length} rows read, ${HOSTILE_PAYLOADS.length} usable, ${KIND_PAYLOADS.length} with problems`));
    const problems = await page.locator('foldlens-import [part="problems"] li').allTextContents();
    const pageProblems = await page.locator('#problems-list li').allTextContents();
    KIND_PAYLOADS.forEach((k, i) => {
      const row = HOSTILE_PAYLOADS.length + i + 1;
      expect(problems.find((p) => p.startsWith(`row ${row}, column kind:`))).toContain(`"${k}"`);
      expect(pageProblems.find((p) => p.startsWith(`row ${row}, column kind:`))).toContain(`"${k}"`);
    });
    expect(await page.locator('#dataset-label').textContent()).toBe(`${fileName} — ${ROWS.length} rows (your data, saved in this browser)`);
    await expectNothingRan(d, 'import report');
  });

  it('the data table shows every id, note, kind, column name and cell exactly as written, in text and in titles', async () => {
    const { page } = d;
    await page.locator('#table-panel > summary').click();
    expect(await page.locator('foldlens-table .toolbar .count').textContent()).toBe(`${ROWS.length} rows`);
    const headings = await page.locator('foldlens-table [role="columnheader"] button').allTextContents();
    for (const h of HEADERS) expect(headings.map((t) => t.trim())).toContain(h);
    for (const [i, p] of HOSTILE_PAYLOADS.entries()) {
      await showRow(page, i);
      const cells = page.locator(`foldlens-table .row[data-index="${i}"] .cell`);
      const texts = (await cells.allTextContents()).map((t) => t.trim());
      expect(texts[2], `${p.name}: id`).toBe(p.text);
      expect(texts[tableColumn('notes')], `${p.name}: notes`).toBe(p.text);
      for (const h of HOSTILE_HEADERS) expect(texts[tableColumn(h)], `${p.name}: column ${h}`).toBe(p.text);
      expect(await cells.nth(2).getAttribute('title')).toBe(p.text);
    }
    // A kind that is not a kind leaves Foldlens's Kind column empty; the original column shows it as written.
    for (const [j, k] of KIND_PAYLOADS.entries()) {
      await showRow(page, HOSTILE_PAYLOADS.length + j);
      const cells = page.locator(`foldlens-table .row[data-index="${HOSTILE_PAYLOADS.length + j}"] .cell`);
      expect((await cells.nth(tableColumn('kind')).textContent())!.trim()).toBe(k);
    }
    await expectNothingRan(d, 'data table');
  });

  it('the station card, opened from the table and from the map symbol, shows the id, column names and fields literally', async () => {
    const { page } = d;
    for (const [i, p] of HOSTILE_PAYLOADS.entries()) {
      await showRow(page, i);
      await page.locator(`foldlens-table .row[data-index="${i}"] .cell`).nth(2).click();
      await expect.poll(() => page.locator('foldlens-station-card h3').textContent()).toBe(`${KIND_LABELS.bedding} · ${p.text}`);
      expect(await page.locator('foldlens-station-card section').getAttribute('aria-label')).toBe(`Station ${p.text}`);
      expect(await page.locator('foldlens-station-card dl dt').allTextContents()).toEqual(HEADERS);
      expect(await page.locator('foldlens-station-card dl dd').allTextContents()).toEqual(ROWS[i]);
    }
    // A click on the symbol itself: fold the table away (the map gets its room back), centre
    // the map on the first station, close in, click it.
    await page.locator('foldlens-station-card button[part="close"]').click();
    await page.locator('#table-panel > summary').click();
    const at = await page.evaluate(
      ([lon, lat]) =>
        new Promise<{ x: number; y: number }>((resolve) => {
          const map = (window as unknown as { foldlensDemo: { map: import('maplibre-gl').Map } }).foldlensDemo.map;
          map.jumpTo({ center: [lon, lat], zoom: 17, pitch: 0, bearing: 0 });
          map.once('idle', () => {
            const rect = map.getCanvasContainer().getBoundingClientRect();
            const q = map.project([lon, lat]);
            resolve({ x: rect.left + q.x, y: rect.top + q.y });
          });
        }),
      [Number(ROWS[0][4]), Number(ROWS[0][5])],
    );
    await page.mouse.click(at.x, at.y);
    await expect.poll(() => page.locator('foldlens-station-card h3').textContent()).toBe(`${KIND_LABELS.bedding} · ${HOSTILE_PAYLOADS[0].text}`);
    await expectNothingRan(d, 'station card');
  }, 300_000);

  it('the station CSV and GeoJSON downloads give every hostile name and field back exactly (formulas as written, by design)', async () => {
    const { page } = d;
    await page.locator('#table-panel > summary').click();
    const [csvDownload] = await Promise.all([page.waitForEvent('download'), page.locator('foldlens-table button:has-text("Export CSV")').click()]);
    const parsed = Papa.parse<string[]>(await downloadText(csvDownload), { skipEmptyLines: true }).data;
    expect(parsed[0].slice(0, HEADERS.length)).toEqual(HEADERS);
    ROWS.forEach((r, i) => expect(parsed[i + 1].slice(0, HEADERS.length)).toEqual(r));
    const [geoDownload] = await Promise.all([page.waitForEvent('download'), page.locator('foldlens-table button:has-text("GeoJSON")').click()]);
    const fc = JSON.parse(await downloadText(geoDownload)) as FeatureCollection;
    fc.features.forEach((f, i) => {
      for (const [c, h] of HEADERS.entries()) expect(f.properties![h], `feature ${i}, ${h}`).toBe(ROWS[i][c]);
    });
    await page.locator('#table-panel > summary').click();
    await expectNothingRan(d, 'station exports');
  });

  it('a lasso over the stations feeds the net; a hostile selection label shows as text and every net export is inert', async () => {
    const { page } = d;
    // Frame the imported stations, then draw a lasso around them with the mouse.
    const box = await page.evaluate(
      (points) =>
        new Promise<{ left: number; top: number; right: number; bottom: number }>((resolve) => {
          const map = (window as unknown as { foldlensDemo: { map: import('maplibre-gl').Map } }).foldlensDemo.map;
          const lons = points.map((p) => p[0]);
          const lats = points.map((p) => p[1]);
          map.fitBounds([[Math.min(...lons), Math.min(...lats)], [Math.max(...lons), Math.max(...lats)]], { padding: 180, duration: 0 });
          map.once('idle', () => {
            const rect = map.getCanvasContainer().getBoundingClientRect();
            const xy = points.map((p) => map.project(p as [number, number]));
            resolve({ left: rect.left + Math.min(...xy.map((q) => q.x)) - 25, right: rect.left + Math.max(...xy.map((q) => q.x)) + 25, top: rect.top + Math.min(...xy.map((q) => q.y)) - 25, bottom: rect.top + Math.max(...xy.map((q) => q.y)) + 25 });
          });
        }),
      HOSTILE_PAYLOADS.map((_, i) => [Number(ROWS[i][4]), Number(ROWS[i][5])]),
    );
    await page.locator('foldlens-toolbar').getByRole('button', { name: /Lasso/ }).click();
    const before = await page.evaluate(() => document.body.dataset.analysisReady);
    const corners = [{ x: box.left, y: box.top }, { x: box.right, y: box.top }, { x: box.right, y: box.bottom }, { x: box.left, y: box.bottom }, { x: box.left, y: box.top }];
    await page.mouse.move(corners[0].x, corners[0].y);
    await page.mouse.down();
    for (let k = 1; k < corners.length; k++) for (let s = 1; s <= 10; s++) await page.mouse.move(corners[k - 1].x + ((corners[k].x - corners[k - 1].x) * s) / 10, corners[k - 1].y + ((corners[k].y - corners[k - 1].y) * s) / 10);
    await page.mouse.up();
    await waitForAnalysis(page, before);
    expect(await page.locator('foldlens-toolbar').evaluate((el) => (el as HTMLElement & { selectedCount: number }).selectedCount)).toBe(HOSTILE_PAYLOADS.length);
    for (const p of HOSTILE_PAYLOADS) {
      const out = await page.evaluate(
        ([label, date]) => {
          const net = document.querySelector('#net') as HTMLElement & { selectionLabel: string; updateComplete: Promise<boolean>; toSvg(d: string): string; toCsv(d: string): string; toJson(d: string): string };
          net.selectionLabel = label;
          return net.updateComplete.then(() => ({
            shown: net.shadowRoot!.querySelector('.selection')!.textContent,
            svg: net.toSvg(date),
            csv: net.toCsv(date),
            json: net.toJson(date),
          }));
        },
        [p.text, DATE] as const,
      );
      expect(out.shown, p.name).toBe(p.text);
      await expectInertSvg(page, out.svg, `Foldlens net: ${p.text}`);
      // The numbers CSV prefixes formula-like text with an apostrophe (net/exportNumbers.ts, OWASP advice).
      const selection = Papa.parse<string[]>(out.csv, { skipEmptyLines: true }).data.find((r) => r[0] === 'selection')!;
      expect(selection[2]).toBe(/^[=+\-@]/.test(p.text) ? `'${p.text}` : p.text);
      expect(out.json).not.toMatch(/[<>&]/);
      expect(JSON.parse(out.json).selection).toBe(p.text);
    }
    // The SVG button downloads the same inert file.
    const [svgDownload] = await Promise.all([page.waitForEvent('download'), page.locator('foldlens-net [part="exports"] button:has-text("SVG")').click()]);
    await expectInertSvg(page, await downloadText(svgDownload), HOSTILE_PAYLOADS.at(-1)!.text);
    // Hovering the net names angles only, never data text.
    const netBox = (await page.locator('foldlens-net svg[part="net"]').boundingBox())!;
    await page.mouse.move(netBox.x + netBox.width * 0.4, netBox.y + netBox.height * 0.45);
    expect(await page.locator('foldlens-net .readout').textContent()).toMatch(/^(Pointer \d{3}\/\d{2} \(trend\/plunge\))?$/);
    await expectNothingRan(d, 'net panel');
  }, 300_000);

  it('named selections saved under hostile names list them as text', async () => {
    const { page } = d;
    const panel = page.locator('foldlens-selections');
    for (const p of HOSTILE_PAYLOADS.slice(0, 4)) {
      const n = Number(await page.evaluate(() => document.body.dataset.selectionsSaved ?? '0'));
      await panel.getByRole('textbox', { name: 'Name of the selection to save' }).fill(p.text);
      await panel.getByRole('button', { name: 'Save selection' }).click();
      await page.waitForFunction((k) => document.body.dataset.selectionsSaved === String(k), n + 1, { timeout: 60_000 });
      expect(await panel.locator('li .name').last().textContent()).toBe(p.text);
      expect(await panel.locator('[part="status"]').textContent()).toBe(`Saved “${p.text}”: ${HOSTILE_PAYLOADS.length} stations.`);
    }
    await expectNothingRan(d, 'named selections');
  });

  it('a domain saved and renamed through every payload shows the name as text in the list, the comparison, the map label, the axis picker, the profile button, and the profile and its SVG', async () => {
    const { page } = d;
    const panel = page.locator('foldlens-domains');
    for (const [k, name] of ['first', 'second'].entries()) {
      await panel.getByRole('textbox', { name: 'Name of the new domain' }).fill(name);
      await panel.getByRole('button', { name: 'Save selection as domain' }).click();
      await page.waitForFunction((n) => document.body.dataset.domainsSaved === String(n), k + 1, { timeout: 60_000 });
    }
    await page.locator('foldlens-axis-picker input[type="radio"][value="domain"]').check();
    for (const p of HOSTILE_PAYLOADS) {
      await panel.locator('td.actions button:has-text("Rename")').first().click();
      const input = panel.locator('td.name input');
      await input.fill(p.text);
      // A one-line text box drops line breaks as the user types (HTML's value sanitization);
      // the name is what the box holds, trimmed.
      const typed = (await input.inputValue()).trim();
      expect(typed.replace(/\s+/g, '')).toBe(p.text.replace(/\s+/g, ''));
      await input.press('Enter');
      await expect.poll(() => panel.locator('td.name').first().textContent(), { timeout: 30_000 }).toBe(typed);
      expect(await panel.locator('td.actions button').first().getAttribute('aria-label')).toBe(`Show ${typed}`);
      expect(await panel.locator('select[aria-label="First domain to compare"] option').allTextContents()).toContain(typed);
      const labels = await page.locator('.foldlens-domain-label').allTextContents();
      expect(labels.some((l) => l.startsWith(`${typed} · `)), `map label for ${p.name}`).toBe(true);
      const picker = page.locator('foldlens-axis-picker select[aria-label="Domain whose axis to use"]');
      expect(await picker.locator('option').allTextContents()).toContain(typed);
      await picker.selectOption({ index: 0 });
      const button = page.locator('#profile-domain-button');
      await expect.poll(() => button.textContent()).toBe(`Down-plunge profile of domain “${typed}”`);
      await button.click();
      const label = page.locator('foldlens-profile .selection');
      await expect.poll(() => label.textContent(), { timeout: 60_000 }).toContain(`Domain “${typed}”`);
      const svg = await page.evaluate((date) => (document.querySelector('#profile') as HTMLElement & { toSvg(d: string): string }).toSvg(date), DATE);
      await expectInertSvg(page, svg, `Domain “${typed}”`);
      if (p === HOSTILE_PAYLOADS.at(-1)) {
        // The SVG button downloads the same inert file.
        const [download] = await Promise.all([page.waitForEvent('download'), page.locator('foldlens-profile [part="exports"] button:has-text("SVG")').click()]);
        await expectInertSvg(page, await downloadText(download), `Domain “${typed}”`);
      }
      await page.locator('#profile-close').click();
      await expectNothingRan(d, `domain named ${p.name}`);
    }
    // Deleting offers undo, naming the domain as text.
    await panel.locator('td.actions button:has-text("Delete")').first().click();
    expect(await panel.locator('[part="undo"]').textContent()).toContain(`Deleted “${HOSTILE_PAYLOADS.at(-1)!.text}”.`);
    await panel.locator('[part="undo"] button').click();
    await expectNothingRan(d, 'domains');
  }, 600_000);

  it('the consistency report of domains with hostile names, over stations with hostile ids and kinds, is an inert page that shows them as text', async () => {
    const { page } = d;
    // Give the second domain a hostile name too (the first holds the last payload).
    const second = HOSTILE_PAYLOADS[2].text;
    const domains = page.locator('foldlens-domains');
    await domains.locator('td.actions button:has-text("Rename")').nth(1).click();
    await domains.locator('td.name input').fill(second);
    await domains.locator('td.name input').press('Enter');
    await expect.poll(() => domains.locator('td.name').nth(1).textContent(), { timeout: 30_000 }).toBe(second);
    const names = await domains.locator('td.name').allTextContents();

    const panel = page.locator('foldlens-consistency');
    await panel.getByRole('button', { name: 'Make report' }).click();
    const link = panel.getByRole('link', { name: 'Open the printable report' });
    await link.waitFor({ timeout: 120_000 });
    // The flags in the panel name their domain as text.
    for (const strong of await panel.locator('[part="flags"] li strong').allTextContents()) expect(names).toContain(strong);

    const html = await page.evaluate((url) => fetch(url).then((r) => r.text()), (await link.getAttribute('href'))!);
    expect(findActiveContent(html)).toEqual([]);
    const text = markupText(html).replace(/\s+/g, '');
    for (const expected of [...names, fileName, ...KIND_PAYLOADS]) expect(text, expected.slice(0, 60)).toContain(expected.replace(/\s+/g, ''));

    // Opened as a user would, in a page of its own: nothing runs there either.
    const [report] = await Promise.all([context.waitForEvent('page'), link.click()]);
    const reportDialogs: string[] = [];
    report.on('dialog', (dialog) => {
      reportDialogs.push(dialog.message());
      void dialog.dismiss();
    });
    await report.waitForLoadState('load');
    const reportErrors: string[] = [];
    report.on('console', (m) => m.type() === 'error' && reportErrors.push(m.text()));
    await expectNothingRan({ page: report, errors: reportErrors, dialogs: reportDialogs }, 'consistency report page');
    expect(await report.locator('script').count()).toBe(0);
    const body = (await report.locator('body').textContent())!.replace(/\s+/g, '');
    for (const n of names) expect(body).toContain(n.replace(/\s+/g, ''));
    await report.close();
    await expectNothingRan(d, 'consistency report');
  }, 300_000);

  it('a project file with hostile names opens with every name shown as text, and so it is after a reload', async () => {
    const { page } = d;
    const { text, project } = hostileProject();
    const projectFile = `${HOSTILE_PAYLOADS[1].text}.foldlens.json`;
    await dropOnImport(page, projectFile, text, 'application/json');
    const notice = page.locator('foldlens-import .notice');
    const droppedAs = await page.evaluate((n) => new File([], n).name, projectFile);
    await expect.poll(() => notice.textContent(), { timeout: 30_000 }).toBe(`Opened the project "${project.name}" from ${droppedAs}.`);
    const check = async (step: string): Promise<void> => {
      await expect.poll(() => page.locator('foldlens-table .toolbar .count').textContent(), { timeout: 30_000 }).toBe(`${ROWS.length} rows`);
      await showRow(page, 3);
      expect((await page.locator('foldlens-table .row[data-index="3"] .cell').nth(2).textContent())!.trim()).toBe(HOSTILE_PAYLOADS[3].text);
      await expect.poll(() => page.locator('foldlens-domains td.name').allTextContents()).toEqual(project.domains.map((x) => x.name));
      const labels = await page.locator('.foldlens-domain-label').allTextContents();
      for (const x of project.domains) expect(labels).toContain(`${x.name} · no axis`);
      expect(await page.locator('foldlens-selections li .name').allTextContents()).toEqual([HOSTILE_PAYLOADS[7].text]);
      expect((await page.locator('#dataset-label').textContent())!.startsWith(`${HOSTILE_PAYLOADS[2].text} — `)).toBe(true);
      await expectNothingRan(d, step);
    };
    await page.locator('#table-panel > summary').click();
    await check('project opened');
    // Give the autosave its moment (it flushes on pagehide too).
    await page.evaluate(() => new Promise((r) => setTimeout(r, 1000)));
    await page.reload();
    await page.waitForSelector('body[data-map-ready="true"]', { timeout: 60_000 });
    await page.locator('#table-panel > summary').click();
    await check('project restored after a reload');
  });

  it('the checks themselves catch a payload inserted as HTML: the element is found inside a shadow root and the flag is set', async () => {
    // Control experiment on a blank page of the same context (no CSP): what the suite guards against.
    const page = await context.newPage();
    const control: Demo = { page, errors: [], dialogs: [] };
    await page.setContent('<div id="host"></div>');
    await page.evaluate((html) => {
      const root = document.querySelector('#host')!.attachShadow({ mode: 'open' });
      root.innerHTML = html; // deliberately unsafe: the mistake this suite exists to catch
    }, HOSTILE_PAYLOADS[0].text);
    await page.waitForFunction((flag) => (window as unknown as Record<string, unknown>)[flag] === 1, PWNED_FLAG);
    expect(await payloadMarkupInPage(page)).toEqual(expect.arrayContaining(['img[src="x"] in the shadow root of <div>', 'onerror on <img> in the shadow root of <div>']));
    await expect(expectNothingRan(control, 'control')).rejects.toThrow(/__pwned/);
    await page.close();
  });
});
