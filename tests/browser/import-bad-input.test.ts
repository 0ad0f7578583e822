import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import type { Browser } from 'playwright-core';
import { launchBrowser } from './browser';
import { dropFile, importError, mappingMessages, openImportPage, pageEvents, waitForEvent, waitForMapping, waitSaved, type ImportPage } from './pages/import-harness';

/**
 * Bad input dropped on <foldlens-import> (files in tests/fixtures/import, described in its
 * README): each gets a clear message in the component, nothing crashes, and the data loaded
 * before is still there (in the table and in the saved project). The messages are the readers'
 * own (io/csvTable.ts, io/readStations.ts, core/notation, io/projectFile.ts); these tests check
 * that the user sees them.
 */

const fixture = (name: string): Uint8Array => new Uint8Array(readFileSync(`tests/fixtures/import/${name}`));
const text = (name: string): string => readFileSync(`tests/fixtures/import/${name}`, 'utf8');

describe('<foldlens-import> with bad input', () => {
  let browser: Browser;
  let p: ImportPage;
  let imports = 0;

  /** Drops a file expected to import, confirms, and returns the report and the problems listed. */
  async function importOk(name: string): Promise<{ report: any; problems: string[]; summary: string }> {
    await dropFile(p.page, name, text(name));
    await waitForMapping(p.page);
    await p.page.locator('foldlens-import button[part="confirm"]').click();
    const detail = await waitForEvent(p.page, 'foldlens-import', imports++);
    const summary = (await p.page.locator('foldlens-import [part="summary"]').textContent())!.replace(/\s+/g, ' ');
    return { report: detail.report, problems: await p.page.locator('foldlens-import [part="problems"] li').allTextContents(), summary };
  }

  beforeAll(async () => {
    browser = await launchBrowser();
    p = await openImportPage(browser, `bad-${Date.now()}`);
  });
  afterAll(async () => {
    await browser?.close();
  });

  it('trailing commas on every line import cleanly: no nameless columns, no stray fields', async () => {
    const { report, summary } = await importOk('trailing-commas.csv');
    expect(report).toMatchObject({ rows: 2, usable: 2, withProblems: 0, notes: [] });
    expect(summary).toMatch(/trailing-commas\.csv: 2 rows read, 2 usable\./);
    expect(await p.page.locator('foldlens-table [role="columnheader"].original').count()).toBe(6);
    await waitSaved(p.page);
  });

  // Files that cannot be read at all: the message shown, and the data loaded before kept.
  const refused: { file: string; message: RegExp }[] = [
    { file: 'duplicate-columns.csv', message: /^Could not import duplicate-columns\.csv: columns 3 and 4 are both named "dip"; rename one so every column has its own name$/ },
    { file: 'zero-rows.csv', message: /^Could not import zero-rows\.csv: the file has a header \(station, kind, dip_dir, dip, lon, lat\) but no data rows$/ },
    { file: 'binary-renamed.csv', message: /^Could not import binary-renamed\.csv: the file holds binary data \(a NUL byte at offset 8\), not delimited text$/ },
    { file: 'newer-version.json', message: /^Could not import newer-version\.json: this Foldlens project file cannot be opened: version: this project was written in format version 2, newer than this Foldlens reads \(version 1 and older\); open it with a newer Foldlens$/ },
  ];
  for (const r of refused) {
    it(`dropping ${r.file} shows why it cannot be read and keeps the data loaded before`, async () => {
      await dropFile(p.page, r.file, fixture(r.file));
      expect(await importError(p.page)).toMatch(r.message);
      expect(await p.page.locator('foldlens-table .toolbar .count').textContent()).toBe('2 rows');
      expect((await pageEvents(p.page)).filter((e) => e.type === 'foldlens-import-error').at(-1)?.detail.fileName).toBe(r.file);
    });
  }

  it('a file without a header row is refused: numbers only by the reader, values with words by the mapping step', async () => {
    await dropFile(p.page, 'numbers.csv', '120,45\n130,50\n');
    expect(await importError(p.page)).toBe('Could not import numbers.csv: the first row (120,45) looks like data, not column names; add a header row naming the columns');
    await dropFile(p.page, 'missing-header.csv', fixture('missing-header.csv'));
    await waitForMapping(p.page);
    expect((await mappingMessages(p.page)).find((m) => m.startsWith('Fix:'))).toBe(
      'Fix:The first row holds values such as "120", "40", "15.02" where the column names belong: the file seems to have no header row. Add a first row naming the columns (for example station, kind, dip_direction, dip).',
    );
    expect(await p.page.locator('foldlens-import button[part="confirm"]').isDisabled()).toBe(true);
    await p.page.locator('foldlens-import button[part="cancel"]').click();
    expect(await p.page.locator('foldlens-table .toolbar .count').textContent()).toBe('2 rows');
  });

  it('dropping an empty file says it is empty', async () => {
    await dropFile(p.page, 'empty.csv', '');
    expect(await importError(p.page)).toBe('Could not import empty.csv: the file is empty: expected a header row and at least one data row');
  });

  it('a file with the wrong delimiter shows one column and says which character seems to separate the fields; choosing it reads the file', async () => {
    await dropFile(p.page, 'wrong-delimiter.csv', text('wrong-delimiter.csv'));
    await waitForMapping(p.page);
    expect(await mappingMessages(p.page)).toContain('Fix:Only one column was found, named "station:kind:dip_dir:dip:lon:lat". The fields look separated by ":": choose it under Delimiter.');
    await p.page.locator('foldlens-import select[aria-label="Delimiter"]').selectOption(':');
    await p.page.locator('foldlens-import select[data-field="dip"]').waitFor();
    await p.page.waitForFunction(() => (document.querySelector('#import') as any).scan?.headers.length === 6);
    expect((await mappingMessages(p.page)).filter((m) => m.startsWith('Fix:'))).toEqual([]);
    await p.page.locator('foldlens-import button[part="confirm"]').click();
    const detail = await waitForEvent(p.page, 'foldlens-import', imports++);
    expect(detail.report).toMatchObject({ rows: 2, usable: 2 });
    expect(detail.options.delimiter).toBe(':');
  });

  it('mixed notations in one attitude column must be named first; rows the named notation cannot read are kept and explained', async () => {
    await dropFile(p.page, 'mixed-notations.csv', text('mixed-notations.csv'));
    await waitForMapping(p.page);
    expect((await mappingMessages(p.page)).find((m) => m.startsWith('Fix:'))).toMatch(/^Fix:Column "attitude": 1 of 3 readable samples have no dip quadrant while the rest do; name the notation/);
    expect(await p.page.locator('foldlens-import button[part="confirm"]').isDisabled()).toBe(true);
    await p.page.locator('foldlens-import select[data-option="planeNotation"]').selectOption('dipdir');
    expect((await mappingMessages(p.page)).find((m) => m.startsWith('Check:'))).toMatch(/^Check:2 of the first 3 plane values in column "attitude" cannot be read as dip direction \/ dip/);
    await p.page.locator('foldlens-import button[part="confirm"]').click();
    const detail = await waitForEvent(p.page, 'foldlens-import', imports++);
    expect(detail.report).toMatchObject({ rows: 3, usable: 1, withProblems: 2 });
    const problems = await p.page.locator('foldlens-import [part="problems"] li').allTextContents();
    expect(problems[0]).toMatch(/^row 2, column attitude: "030\/45SE"; expected /);
    expect(problems[1]).toMatch(/^row 3, column attitude: "N30E 45SE"; expected /);
  });

  it('blank lines are skipped but keep their row numbers, and the report says how many', async () => {
    const { report, summary } = await importOk('blank-lines.csv');
    expect(report).toMatchObject({ rows: 2, usable: 2, blankRows: [1, 3, 4, 6] });
    expect(summary).toMatch(/4 blank rows skipped/);
    expect((await p.page.locator('foldlens-table .row .cell:first-child').allTextContents()).map((t) => t.trim())).toEqual(['2', '5']);
  });

  // Files that import, with rows kept and flagged: the problems listed for them.
  const flagged: { file: string; rows: number; usable: number; problems: RegExp[] }[] = [
    { file: 'non-numeric-angles.csv', rows: 3, usable: 1, problems: [/^row 1, column dip: "forty"; expected a dip from 0 to 90/, /^row 2, column dip_dir: "1x1"; expected /] },
    {
      file: 'grads-and-degree-signs.csv',
      rows: 3,
      usable: 1,
      problems: [/^row 2, column dip: "50g"; expected angles in degrees .*grads \(g, gon\) are not accepted/, /^row 3, column dip: "42 gon"; expected angles in degrees/],
    },
    { file: 'negative-dips.csv', rows: 2, usable: 1, problems: [/^row 1, column dip: "-40"; expected angles of 0 or more/] },
    { file: 'swapped-latlon.csv', rows: 2, usable: 1, problems: [/^row 1, column lat: "115\.02"; expected a latitude from -90 to 90; latitude and longitude look swapped/] },
    { file: 'non-point.geojson', rows: 4, usable: 2, problems: [/^row 2, column geometry: "LineString"; expected a Point geometry/, /^row 3, column geometry: "Polygon"; expected a Point geometry/] },
  ];
  for (const f of flagged) {
    it(`${f.file} imports with its bad rows kept, flagged and explained`, async () => {
      const { report, problems } = await importOk(f.file);
      expect(report).toMatchObject({ rows: f.rows, usable: f.usable });
      expect(problems).toHaveLength(f.problems.length);
      f.problems.forEach((re, i) => expect(problems[i]).toMatch(re));
      expect(await p.page.locator('foldlens-table .toolbar .count').textContent()).toBe(`${f.rows} rows`);
      expect(await p.page.locator('foldlens-table .row.problem').count()).toBe(f.rows - f.usable);
    });
  }

  it('a degree sign is read as degrees: row 1 of grads-and-degree-signs.csv is 120/40', async () => {
    await importOk('grads-and-degree-signs.csv');
    expect((await p.page.locator('foldlens-table .row[data-index="0"] .cell').nth(4).textContent())?.trim()).toBe('120/40');
  });

  it('nothing crashed, and the last project imported is what a reload restores', async () => {
    await waitSaved(p.page);
    await p.page.reload();
    await p.page.waitForSelector('body[data-ready="true"]');
    expect(await p.page.evaluate(() => document.body.dataset.restored)).toBe('3');
    expect(p.errors).toEqual([]);
  });
});
