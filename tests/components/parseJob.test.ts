import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import type { Station } from '../../src/core/station';
import { readCsv } from '../../src/io/csvTable';
import { detectColumns } from '../../src/io/columns';
import { readStations } from '../../src/io/readStations';
import { readGeoJsonStations } from '../../src/io/readGeoJson';
import { emptyProject, projectToJson, type DatasetTable, type ImportOptions } from '../../src/io/projectFile';
import { ImportFileError, readFileStations, scanFile, type ReadRequest } from '../../src/components/import/parseJob';
import { toReadOptions } from '../../src/components/import/importOptions';

/**
 * The import's reading, in Node: what it gives must be what the io readers give for the same
 * text (readCsv + readStations, readGeoJsonStations), whether the file is read whole or streamed.
 */

const KORVANE = readFileSync('sample-maps/korvane/stations-quadrant.csv', 'utf8');
const UTM: ImportOptions = { planeNotation: 'auto', lineNotation: 'auto', north: 'true', crs: 'EPSG:32633' };

async function readAll(file: Blob, request: ReadRequest): Promise<{ stations: Station[]; table: DatasetTable; progress: number }> {
  const stations: Station[] = [];
  let progress = 0;
  const { table } = await readFileStations(file, request, { batch: (b) => stations.push(...b.stations), progress: () => progress++ });
  return { stations, table, progress };
}

async function refusal(f: () => Promise<unknown>): Promise<ImportFileError> {
  try {
    await f();
  } catch (e) {
    if (e instanceof ImportFileError) return e;
    throw e;
  }
  throw new Error('accepted');
}

describe('scanFile', () => {
  it('scanFile(file) finds the columns, delimiter and row count of the Korvane quadrant-notation CSV', async () => {
    const scan = await scanFile(new Blob([KORVANE]), 'stations-quadrant.csv');
    expect(scan.format).toBe('csv');
    if (scan.format !== 'csv') return;
    const table = readCsv(KORVANE);
    expect(scan.headers).toEqual(table.headers);
    expect(scan.delimiter).toBe(',');
    expect(scan.rowCount).toBe(table.rows.length);
    expect(scan.preview).toEqual(table.rows.slice(0, 200));
  });

  it('scanFile(file) of a file longer than the head reads only the head and gives the same first rows', async () => {
    // Ten copies of the rows: 0.5 MB, more than the first piece read (256 kB).
    const body = KORVANE.slice(KORVANE.indexOf('\n') + 1);
    const text = KORVANE + body.repeat(9);
    const scan = await scanFile(new Blob([text]), 'big.csv', { headBytes: 4096 });
    expect(scan.format === 'csv' && scan.rowCount).toBe(undefined);
    expect(scan.format !== 'project' && scan.preview).toEqual(readCsv(KORVANE).rows.slice(0, 200));
  });

  it('scanFile(file) tells GeoJSON by its first character, whatever the name, and lists its property names', async () => {
    const text = readFileSync('tests/fixtures/fold-two-domains/in.geojson', 'utf8');
    const scan = await scanFile(new Blob([text]), 'points.csv');
    expect(scan.format).toBe('geojson');
    if (scan.format === 'geojson') expect(scan.headers).toEqual(readGeoJsonStations(text).headers);
  });

  it('scanFile(file) opens a project file and refuses one from a newer format version, saying so', async () => {
    const project = projectToJson(emptyProject('P'));
    expect((await scanFile(new Blob([project]), 'p.json')).format).toBe('project');
    const newer = project.replace('"version":1', '"version":2');
    const e = await refusal(() => scanFile(new Blob([newer]), 'p.json'));
    expect(e.message).toMatch(/cannot be opened: version: this project was written in format version 2, newer than this Foldlens reads/);
  });

  // Each row: a file that cannot be read at all, and the reader's message (io/csvTable.ts, io/readGeoJson.ts).
  const refused: { name: string; bytes: Uint8Array | string; fileName: string; code: string; message: RegExp }[] = [
    { name: 'an empty file', bytes: '', fileName: 'empty.csv', code: 'empty', message: /the file is empty/ },
    { name: 'a header with no rows', bytes: 'id,kind,dip\n', fileName: 'zero.csv', code: 'no-data-rows', message: /has a header \(id, kind, dip\) but no data rows/ },
    { name: 'a PNG renamed .csv', bytes: Uint8Array.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 0x0d]), fileName: 'photo.csv', code: 'binary', message: /binary data \(a NUL byte at offset 8\)/ },
    { name: 'a workbook renamed .csv', bytes: Uint8Array.from([0x50, 0x4b, 0x03, 0x04, 0x14, 0x00]), fileName: 'book.csv', code: 'binary', message: /zip archive \(perhaps a spreadsheet workbook\)/ },
    { name: 'two columns of one name', bytes: 'id,dip,dip\nA,30,40\n', fileName: 'dup.csv', code: 'duplicate-column', message: /columns 2 and 3 are both named "dip"/ },
    { name: 'a first row of data', bytes: '120,45\n130,50\n', fileName: 'nohead.csv', code: 'no-header', message: /looks like data, not column names/ },
    { name: 'broken JSON', bytes: '{"type": "FeatureCollection", "features": [', fileName: 'x.geojson', code: 'json', message: /not valid JSON/ },
    { name: 'JSON that is not GeoJSON', bytes: '{"rows": []}', fileName: 'x.json', code: 'geojson', message: /expected "type": "FeatureCollection" or "Feature"/ },
  ];
  for (const r of refused) {
    it(`scanFile(file) refuses ${r.name} with the reader's message`, async () => {
      const e = await refusal(() => scanFile(new Blob([r.bytes as BlobPart]), r.fileName));
      expect(e.code).toBe(r.code);
      expect(e.message).toMatch(r.message);
    });
  }
});

describe('readFileStations', () => {
  const mapping = detectColumns(readCsv(KORVANE).headers).mapping;
  const expected = readStations(readCsv(KORVANE), mapping, toReadOptions(UTM));

  it('readFileStations(file) gives the stations readStations gives, for a file read whole', async () => {
    const { stations, table } = await readAll(new Blob([KORVANE]), { format: 'csv', mapping, options: UTM });
    expect(stations).toEqual(expected);
    expect(table).toEqual({ format: 'csv', headers: readCsv(KORVANE).headers, delimiter: ',', blankRows: [], notes: [], extras: [] });
  });

  it('readFileStations(file) gives the same stations when the file is streamed in small pieces, in batches, with progress', async () => {
    const text = KORVANE.replace(/\n/g, '\r\n').replace('KR-0010', '\r\nKR-0010');
    const whole = readCsv(text);
    const { stations, table, progress } = await readAll(new Blob([text]), { format: 'csv', mapping, options: UTM, headBytes: 2048, batchSize: 37 });
    expect(stations).toEqual(readStations(whole, mapping, toReadOptions(UTM)));
    expect(table.blankRows).toEqual(whole.blankRows);
    expect(table.notes).toEqual(whole.notes);
    expect(progress).toBeGreaterThan(0);
  });

  it('readFileStations(file) keeps fields beyond the last column aside, by row', async () => {
    const { stations, table } = await readAll(new Blob(['id,kind,dipdir,dip\nA,bedding,120,40,extra\nB,bedding,130,45\n']), {
      format: 'csv',
      mapping: { id: 'id', kind: 'kind', dipDirection: 'dipdir', dip: 'dip' },
      options: UTM,
    });
    expect(table.extras).toEqual([{ row: 1, fields: ['extra'] }]);
    expect(stations[0].problems[0].column).toBe('(beyond the last column)');
  });

  it('readFileStations(file) reads GeoJSON as readGeoJsonStations does and returns each feature\'s location with the batch', async () => {
    const text = readFileSync('tests/fixtures/fold-two-domains/in.geojson', 'utf8');
    const reference = readGeoJsonStations(text);
    const locations: unknown[] = [];
    const stations: Station[] = [];
    await readFileStations(new Blob([text]), { format: 'geojson', mapping: reference.detection.mapping, options: { planeNotation: 'auto', lineNotation: 'auto', north: 'true' }, batchSize: 10 }, {
      batch: (b) => {
        stations.push(...b.stations);
        locations.push(...(b.locations ?? []));
      },
      progress: () => {},
    });
    expect(stations).toEqual(reference.stations);
    expect(locations.length).toBe(stations.length);
  });

  it('readFileStations(file) refuses options it cannot use before reading a row', async () => {
    const e = await refusal(() => readAll(new Blob([KORVANE]), { format: 'csv', mapping, options: { ...UTM, crs: 'EPSG:99999' } }));
    expect(e.code).toBe('options');
    expect(e.message).toMatch(/EPSG:99999 is not in the built-in table/);
  });

  it('readFileStations(file) stops when its signal is aborted', async () => {
    const controller = new AbortController();
    controller.abort();
    const e = await refusal(() => readFileStations(new Blob([KORVANE]), { format: 'csv', mapping, options: UTM, headBytes: 1024 }, { batch: () => {}, progress: () => {} }, controller.signal));
    expect(e.code).toBe('cancelled');
  });
});
