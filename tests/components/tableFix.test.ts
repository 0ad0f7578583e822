import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import Papa from 'papaparse';
import { isUsable } from '../../src/core/station';
import { readCsv } from '../../src/io/csvTable';
import { detectColumns } from '../../src/io/columns';
import { readStations } from '../../src/io/readStations';
import { readGeoJsonStations } from '../../src/io/readGeoJson';
import { stationsToCsv } from '../../src/io/writeStations';
import { withStationEdit, type ImportOptions, type ProjectDataset } from '../../src/io/projectFile';
import { toReadOptions } from '../../src/components/import/importOptions';
import { rereadRow } from '../../src/components/table/fixRow';
import { datasetTable, datasetToCsv, datasetToGeoJson } from '../../src/components/table/exportTable';
import { problemsToCsv, reportOf } from '../../src/components/import/importReport';

const KORVANE = readFileSync('sample-maps/korvane/stations-quadrant.csv', 'utf8');
const OPTIONS: ImportOptions = { planeNotation: 'auto', lineNotation: 'auto', north: 'true', crs: 'EPSG:32633' };

function korvane(): ProjectDataset {
  const table = readCsv(KORVANE);
  const mapping = detectColumns(table.headers).mapping;
  return {
    id: 'k',
    name: 'stations-quadrant.csv',
    table: { format: 'csv', headers: table.headers, delimiter: table.delimiter, blankRows: table.blankRows, notes: table.notes, extras: [] },
    mapping,
    options: OPTIONS,
    stations: readStations(table, mapping, toReadOptions(OPTIONS)),
    edits: [],
  };
}

const indexOf = (d: ProjectDataset, id: string) => d.stations.findIndex((s) => s.id === id);

describe('rereadRow', () => {
  it('rereadRow(dataset, index, "Dip", "59") brings KR-0032 (dip 95, a planted bad row) back to life with strike N..E and its quadrant', () => {
    const d = korvane();
    const i = indexOf(d, 'KR-0032');
    expect(isUsable(d.stations[i])).toBe(false);
    const { station, edit } = rereadRow(d, i, 'Dip', '59', new Date('2025-06-02T00:00:00Z'));
    expect(isUsable(station)).toBe(true);
    expect(station.plane?.dip).toBe(59);
    // The rest of the row is read as at import: same position, same strike and quadrant.
    expect(station.lon).toBe(d.stations[i].lon);
    const reference = readStations({ ...readCsv(KORVANE), rows: [{ row: station.row, values: { ...d.stations[i].source, Dip: '59' } }] }, d.mapping, toReadOptions(OPTIONS))[0];
    expect(station).toEqual(reference);
    expect(edit).toEqual({ row: 32, column: 'Dip', from: '95', to: '59', at: '2025-06-02T00:00:00.000Z' });
    expect(d.stations[i].source.Dip).toBe('95');
  });

  it('rereadRow(dataset, index, column, value) twice fixes swapped coordinates (KR-0449) once E and N are swapped back', () => {
    const d = korvane();
    const i = indexOf(d, 'KR-0449');
    const { E, N } = d.stations[i].source;
    const half = rereadRow(d, i, 'E', N);
    const d2 = withStationEdit(d, i, half.station, half.edit);
    const full = rereadRow(d2, i, 'N', E);
    expect(isUsable(full.station)).toBe(true);
    expect(full.station.source).toMatchObject({ E: N, N: E });
    expect(withStationEdit(d2, i, full.station, full.edit).edits.map((e) => [e.column, e.from, e.to])).toEqual([['E', E, N], ['N', N, E]]);
  });

  it('rereadRow keeps a row flagged when the new value is still wrong, naming the new value', () => {
    const d = korvane();
    const { station } = rereadRow(d, indexOf(d, 'KR-0376'), 'Dip', '3 O');
    expect(station.problems[0]).toMatchObject({ column: 'Dip', value: '3 O' });
  });

  it('rereadRow of a GeoJSON feature keeps the location its geometry gave', () => {
    const text = JSON.stringify({ type: 'FeatureCollection', features: [{ type: 'Feature', geometry: { type: 'Point', coordinates: [15.1, 24.6, 700] }, properties: { kind: 'bedding', dipdir: 120, dip: 95 } }] });
    const read = readGeoJsonStations(text);
    const d: ProjectDataset = {
      id: 'g', name: 'g.geojson', mapping: read.detection.mapping, options: OPTIONS, edits: [], stations: read.stations,
      table: { format: 'geojson', headers: read.headers, delimiter: ',', blankRows: [], notes: [], extras: [], locations: [{ lon: 15.1, lat: 24.6, elevation: 700 }] },
    };
    const { station } = rereadRow(d, 0, 'dip', '45');
    expect(station).toMatchObject({ lon: 15.1, lat: 24.6, elevation: 700, plane: { dipDirection: 120, dip: 45 }, problems: [] });
  });

  it('rereadRow refuses a column the dataset does not have', () => {
    expect(() => rereadRow(korvane(), 0, 'Dip angle', '3')).toThrow(/"Dip angle" is not a column of dataset "stations-quadrant.csv"/);
  });
});

describe('exporting a dataset', () => {
  it('datasetToCsv(dataset) writes what stationsToCsv writes for the table as read, plus positions (the file had x/y only)', () => {
    const d = korvane();
    const csv = datasetToCsv(d, { planeFormat: 'dipdir' });
    expect(csv).toBe(stationsToCsv(readCsv(KORVANE), d.stations, { planeFormat: 'dipdir', location: true }));
    // Papa (an outside parser) reads it back with every original column and row.
    const back = Papa.parse<Record<string, string>>(csv, { header: true }).data;
    expect(back.length).toBe(d.stations.length);
    expect(back[31].Dip).toBe('95');
    expect(back[31].fl_problems).toMatch(/row 32, column Dip: "95"; expected a dip from 0 to 90/);
    expect(Object.keys(back[0]).slice(0, 14)).toEqual(d.table.headers);
  });

  it('datasetToCsv(dataset) writes an edited cell with its new value and the row no longer flagged', () => {
    const d = korvane();
    const i = indexOf(d, 'KR-0032');
    const { station, edit } = rereadRow(d, i, 'Dip', '59');
    const back = Papa.parse<Record<string, string>>(datasetToCsv(withStationEdit(d, i, station, edit), { planeFormat: 'dipdir' }), { header: true }).data;
    expect(back[i]).toMatchObject({ Dip: '59', fl_problems: '' });
  });

  it('datasetTable(dataset) rebuilds the rows the file was read into', () => {
    const d = korvane();
    expect(datasetTable(d).rows).toEqual(readCsv(KORVANE).rows);
  });

  it('datasetToGeoJson(dataset) writes one Point feature per station with its original fields (RFC 7946)', () => {
    const d = korvane();
    const fc = JSON.parse(datasetToGeoJson(d, { planeFormat: 'rhr' }));
    expect(fc.type).toBe('FeatureCollection');
    expect(fc.features.length).toBe(d.stations.length);
    const s0 = d.stations[0];
    expect(fc.features[0].geometry).toEqual({ type: 'Point', coordinates: [s0.lon, s0.lat, ...(s0.elevation !== undefined ? [s0.elevation] : [])] });
    expect(fc.features[0].properties).toMatchObject({ Stn: 'KR-0001', Strike: 'N28E', fl_strike: 28, fl_dip: 19 });
  });
});

describe('importReport', () => {
  it('reportOf(dataset) counts the Korvane sample: 494 rows, 5 planted bad rows (sample-maps/korvane/README.md)', () => {
    const r = reportOf(korvane());
    expect(r).toMatchObject({ rows: 494, usable: 489, withProblems: 5 });
    expect(r.problems.map((p) => p.row)).toEqual([32, 134, 376, 449, 450]);
    expect(r.byColumn[0]).toEqual({ column: 'Dip', count: 2 });
  });

  it('problemsToCsv(problems) writes one line per problem that Papa reads back to the same fields', () => {
    const problems = reportOf(korvane()).problems;
    const back = Papa.parse<Record<string, string>>(problemsToCsv(problems), { header: true }).data;
    expect(back.map((b) => [Number(b.row), b.column, b.value, b.expected])).toEqual(problems.map((p) => [p.row, p.column, p.value, p.expected]));
  });
});
