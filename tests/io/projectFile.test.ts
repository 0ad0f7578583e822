import { describe, expect, it } from 'vitest';
import Papa from 'papaparse';
import { formatLine, formatPlane, type LineNotation, type PlaneNotation } from '../../src/core/notation';
import { LINE_KINDS, PLANE_KINDS, isLineKind, type MeasurementKind } from '../../src/core/types';
import type { Station } from '../../src/core/station';
import { readCsv } from '../../src/io/csvTable';
import { detectColumns, type ColumnMapping } from '../../src/io/columns';
import { readStations } from '../../src/io/readStations';
import { readGeoJsonStations } from '../../src/io/readGeoJson';
import { fromLonLat, builtInCrs } from '../../src/io/crs';
import {
  PROJECT_VERSION,
  emptyProject,
  parseProject,
  projectToJson,
  withDataset,
  withStationEdit,
  type FoldlensProject,
  type ImportOptions,
  type ProjectDataset,
} from '../../src/io/projectFile';
import { toReadOptions } from '../../src/components/import/importOptions';
import { mulberry32 } from '../helpers/prng';

/**
 * Project files written then read must come back equal, field for field (the format is our own;
 * JSON.stringify and JSON.parse are the outside reference for number text: ECMA-262 writes the
 * shortest text that reads back to the same double).
 */

const KINDS: readonly MeasurementKind[] = [...PLANE_KINDS, ...LINE_KINDS];
const PLANE_FORMATS = ['dipdir', 'rhr', 'strike-quadrant', 'quadrant'] as const;
const LINE_FORMATS = ['azimuth', 'quadrant'] as const;
const UTM33 = builtInCrs(32633)!;

/** A dataset read from a generated CSV through the io readers, as an import makes it. */
function csvDataset(id: string, text: string, options: ImportOptions, overrides: Record<string, string> = {}): ProjectDataset {
  const table = readCsv(text);
  const mapping: ColumnMapping = detectColumns(table.headers, overrides).mapping;
  const stations = readStations(table, mapping, toReadOptions(options));
  return {
    id,
    name: `${id}.csv`,
    table: { format: 'csv', headers: table.headers, delimiter: table.delimiter, blankRows: table.blankRows, notes: table.notes, extras: table.rows.filter((r) => r.extra).map((r) => ({ row: r.row, fields: r.extra! })) },
    mapping,
    options,
    stations,
    edits: [],
  };
}

/** Rows with an attitude column written in one notation, every kind in turn, a few of them bad. */
function attitudeCsv(n: number, planeFormat: (typeof PLANE_FORMATS)[number], lineFormat: (typeof LINE_FORMATS)[number], seed: number): string {
  const rnd = mulberry32(seed);
  const rows: string[][] = [['id', 'kind', 'attitude', 'lon', 'lat', 'elevation', 'notes']];
  for (let i = 0; i < n; i++) {
    const kind = KINDS[i % KINDS.length];
    const plane = { dipDirection: Math.round(rnd() * 3599) / 10, dip: Math.round(rnd() * 900) / 10, ...(i % 11 === 0 && { overturned: true }) };
    const line = { trend: Math.round(rnd() * 3599) / 10, plunge: Math.round(rnd() * 900) / 10 };
    let attitude = isLineKind(kind) ? formatLine(line, lineFormat, { decimals: 1 }) : formatPlane(plane, planeFormat, { decimals: 1 });
    if (i % 97 === 5) attitude = '95/1x0'; // a bad row: kept, with its problem
    const lon = (14 + rnd() * 2).toFixed(6);
    const lat = (24 + rnd()).toFixed(6);
    rows.push([`S${seed}-${i}`, kind, attitude, lon, lat, i % 3 === 0 ? '' : String(Math.round(600 + rnd() * 300)), i % 5 === 0 ? 'note, with "quotes"' : '']);
  }
  return Papa.unparse(rows, { newline: '\n' });
}

/** Rows with separate columns: dip direction/dip, strike/dip/quadrant, trend/plunge, rake and sense, in UTM. */
function columnsCsv(n: number, seed: number): string {
  const rnd = mulberry32(seed);
  const rows: string[][] = [['Stn', 'Type', 'E', 'N', 'Elev', 'DipDir', 'Dip', 'Strike', 'DipQuad', 'Trend', 'Plunge', 'Rake', 'Sense', 'OT', 'Date']];
  for (let i = 0; i < n; i++) {
    const kind = KINDS[i % KINDS.length];
    const { x, y } = fromLonLat(14 + rnd() * 2, 24 + rnd(), UTM33);
    const dd = Math.round(rnd() * 359);
    const dip = Math.round(rnd() * 89) + 1;
    const useStrike = i % 2 === 0;
    const strike = (dd + 270) % 360;
    const quad = dd < 90 ? 'NE' : dd < 180 ? 'SE' : dd < 270 ? 'SW' : 'NW';
    const plane = isLineKind(kind) && i % 4 !== 1 ? ['', '', '', ''] : useStrike ? ['', String(dip), `${strike}`, dd % 90 === 0 ? '' : quad] : [String(dd), String(dip), '', ''];
    const line = isLineKind(kind) ? (i % 4 === 1 ? ['', '', String(Math.round(rnd() * 180))] : [String(Math.round(rnd() * 359)), String(Math.round(rnd() * 90)), '']) : ['', '', ''];
    const sense = kind === 'hinge' ? ['antiform', 'synform', ''][i % 3] : '';
    rows.push([`K${i}`, kind, x.toFixed(1), y.toFixed(1), String(700 + (i % 50)), ...plane, ...line, sense, i % 13 === 0 && !isLineKind(kind) ? 'yes' : '', `2025-0${1 + (i % 9)}-1${i % 10}`]);
  }
  return Papa.unparse(rows, { newline: '\n' });
}

function geoJsonDataset(n: number, seed: number): ProjectDataset {
  const rnd = mulberry32(seed);
  const features = Array.from({ length: n }, (_, i) => ({
    type: 'Feature',
    geometry: i % 50 === 7 ? { type: 'LineString', coordinates: [[0, 0], [1, 1]] } : i % 50 === 8 ? null : { type: 'Point', coordinates: [14 + rnd(), 24 + rnd(), ...(i % 2 ? [650 + i] : [])] },
    properties: { station: `G${i}`, kind: KINDS[i % KINDS.length], dip_direction: Math.round(rnd() * 359), dip: Math.round(rnd() * 90), trend: Math.round(rnd() * 359), plunge: Math.round(rnd() * 90), flag: i % 2 === 0, extra: { a: i } },
  }));
  const json = { type: 'FeatureCollection', features };
  const read = readGeoJsonStations(json);
  return {
    id: 'geo',
    name: 'points.geojson',
    table: {
      format: 'geojson',
      headers: read.headers,
      delimiter: ',',
      blankRows: [],
      notes: [],
      extras: [],
      locations: read.stations.map((s) => (s.lon !== undefined && s.lat !== undefined ? { lon: s.lon, lat: s.lat, ...(s.elevation !== undefined && { elevation: s.elevation }) } : null)),
    },
    mapping: read.detection.mapping,
    options: { planeNotation: 'auto', lineNotation: 'auto', north: 'true' },
    stations: read.stations,
    edits: [],
  };
}

function bigProject(): FoldlensProject {
  let project = emptyProject('Round trip', '2025-06-01T12:00:00.000Z');
  let seed = 1;
  for (const pf of PLANE_FORMATS) {
    for (const lf of LINE_FORMATS) {
      const notation: PlaneNotation = pf === 'strike-quadrant' && lf === 'quadrant' ? 'auto' : pf;
      const lineNotation: LineNotation = lf === 'quadrant' && pf === 'dipdir' ? 'auto' : lf;
      const options: ImportOptions = { planeNotation: notation, lineNotation, north: seed % 2 ? 'true' : 'magnetic', ...(seed % 2 ? {} : { declination: -2.75 }) };
      project = withDataset(project, csvDataset(`att-${pf}-${lf}`, attitudeCsv(1000, pf, lf, seed++), options));
    }
  }
  project = withDataset(project, csvDataset('cols-grid', columnsCsv(1000, 91), { planeNotation: 'auto', lineNotation: 'auto', north: 'grid', crs: 'EPSG:32633' }));
  project = withDataset(project, csvDataset('cols-wmm', columnsCsv(1000, 92), { planeNotation: 'auto', lineNotation: 'auto', north: 'magnetic', declination: 'wmm', crs: 'UTM 33N', date: '2025-06-01' }));
  project = withDataset(project, geoJsonDataset(600, 93));
  const first = project.datasets[0];
  const fixed = { ...first.stations[5], problems: [], plane: { dipDirection: 95, dip: 10 } } satisfies Station;
  project = withDataset(project, withStationEdit(first, 5, fixed, { row: first.stations[5].row, column: 'attitude', from: '95/1x0', to: '095/10', at: '2025-06-02T08:00:00.000Z' }));
  return {
    ...project,
    selections: [{ id: 'sel-1', name: 'West limb', dataset: 'cols-grid', indices: [0, 4, 999] }],
    domains: [
      { id: 'd-1', name: 'West domain', ring: [[14.9, 24.6], [15, 24.6], [15, 24.7], [14.9, 24.6]], analysis: { axis: { trend: 75, plunge: 12 }, cone95: 1.8, eigenvalues: [0.6, 0.39, 0.01] }, stationIds: ['K1'], updated: '2025-06-01T00:00:00Z' },
      { id: 'd-2', name: 'East domain', ring: [[15, 24.6], [15.1, 24.6], [15.1, 24.7]], analysis: null },
    ],
  };
}

describe('project file round trip', () => {
  const project = bigProject();
  const stations = project.datasets.flatMap((d) => d.stations);

  it('the generated project holds 10^4 stations of every kind, read in every notation, with problems, corrections and edits', () => {
    expect(stations.length).toBeGreaterThanOrEqual(10_000);
    expect(new Set(stations.map((s) => s.kind))).toEqual(new Set([...KINDS, undefined].filter((k) => k !== undefined)));
    expect(new Set(project.datasets.map((d) => d.options.planeNotation))).toEqual(new Set(['dipdir', 'rhr', 'strike-quadrant', 'quadrant', 'auto']));
    expect(stations.some((s) => s.problems.length > 0)).toBe(true);
    expect(new Set(stations.flatMap((s) => (s.corrections ?? []).map((c) => c.type)))).toEqual(new Set(['grid-convergence', 'user-declination', 'magnetic-declination']));
    expect(stations.some((s) => s.plane?.overturned)).toBe(true);
    expect(stations.some((s) => s.line?.sense === 'synform')).toBe(true);
    expect(project.datasets.some((d) => d.table.locations?.includes(null))).toBe(true);
  });

  it('parseProject(projectToJson(project)) gives back a deeply equal project', () => {
    const text = projectToJson(project);
    expect(JSON.parse(text).format).toBe('foldlens-project');
    expect(JSON.parse(text).version).toBe(PROJECT_VERSION);
    expect(parseProject(text)).toStrictEqual(project);
  });

  it('parseProject(projectToJson(project, 2)) reads the indented form to the same project', () => {
    expect(parseProject(projectToJson(project, 2))).toStrictEqual(project);
  });

  it('projectToJson(parseProject(text)) writes the same text again (a fixed point)', () => {
    const text = projectToJson(project);
    expect(projectToJson(parseProject(text))).toBe(text);
  });
});
