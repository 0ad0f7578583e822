import { describe, expect, it } from 'vitest';
import {
  ProjectFileError,
  checkImportOptions,
  emptyProject,
  isProjectLike,
  parseProject,
  projectToJson,
  withDataset,
  withStationEdit,
  type FoldlensProject,
  type ProjectDataset,
} from '../../src/io/projectFile';

/** A small valid project to break one field at a time (the format is our own: docs/project-format.md). */
function valid(): FoldlensProject {
  const dataset: ProjectDataset = {
    id: 'ds-1',
    name: 'field.csv',
    table: { format: 'csv', headers: ['id', 'kind', 'dipdir', 'dip'], delimiter: ',', blankRows: [3], notes: [], extras: [] },
    mapping: { id: 'id', kind: 'kind', dipDirection: 'dipdir', dip: 'dip' },
    options: { planeNotation: 'auto', lineNotation: 'auto', north: 'true' },
    stations: [
      { id: 'A1', row: 1, kind: 'bedding', lon: 15, lat: 24.6, plane: { dipDirection: 120, dip: 40 }, source: { id: 'A1', kind: 'bedding', dipdir: '120', dip: '40' }, problems: [] },
      { id: 'A2', row: 2, kind: 'bedding', source: { id: 'A2', kind: 'bedding', dipdir: '130', dip: '95' }, problems: [{ row: 2, column: 'dip', value: '95', expected: 'a dip from 0 to 90' }] },
    ],
    edits: [],
  };
  return {
    ...withDataset(emptyProject('Test', '2025-06-01T00:00:00.000Z'), dataset),
    selections: [{ id: 's1', name: 'all', dataset: 'ds-1', indices: [0, 1] }],
    domains: [{ id: 'd1', name: 'West', ring: [[15, 24], [15.1, 24], [15.1, 24.1]] }],
  };
}

/** The project as plain JSON, changed by `edit`. */
function broken(edit: (p: any) => void): unknown {
  const p = JSON.parse(JSON.stringify(valid()));
  edit(p);
  return p;
}

function errorOf(input: unknown): ProjectFileError {
  try {
    parseProject(input);
  } catch (e) {
    if (e instanceof ProjectFileError) return e;
    throw e;
  }
  throw new Error('parseProject accepted it');
}

// Each row breaks one field; the message must name its path and say what was expected.
// Source of every expectation: the format description, docs/project-format.md (our own format).
const CASES: { name: string; edit: (p: any) => void; path: string; message: RegExp }[] = [
  { name: 'a missing format', edit: (p) => delete p.format, path: 'format', message: /not a Foldlens project file/ },
  { name: 'a GeoJSON file', edit: (p) => (p.format = 'FeatureCollection'), path: 'format', message: /expected "foldlens-project", found "FeatureCollection"/ },
  { name: 'a version that is not a whole number', edit: (p) => (p.version = '1'), path: 'version', message: /whole format version/ },
  { name: 'a dip over 90', edit: (p) => (p.datasets[0].stations[0].plane.dip = 95), path: 'datasets[0].stations[0].plane.dip', message: /expected a dip from 0 to 90, found 95/ },
  { name: 'a dip direction of 360', edit: (p) => (p.datasets[0].stations[0].plane.dipDirection = 360), path: 'datasets[0].stations[0].plane.dipDirection', message: /less than 360/ },
  { name: 'a dip written as text', edit: (p) => (p.datasets[0].stations[0].plane.dip = '40'), path: 'datasets[0].stations[0].plane.dip', message: /found "40"/ },
  { name: 'an unknown kind', edit: (p) => (p.datasets[0].stations[1].kind = 'pebble'), path: 'datasets[0].stations[1].kind', message: /one of "bedding"/ },
  { name: 'a misspelt field', edit: (p) => (p.datasets[0].stations[0].plane.dipp = 3), path: 'datasets[0].stations[0].plane.dipp', message: /unknown field; expected only dipDirection, dip, overturned/ },
  { name: 'a longitude without a latitude', edit: (p) => delete p.datasets[0].stations[0].lat, path: 'datasets[0].stations[0]', message: /one of lon and lat without the other/ },
  { name: 'a latitude of 95', edit: (p) => (p.datasets[0].stations[0].lat = 95), path: 'datasets[0].stations[0].lat', message: /latitude from -90 to 90/ },
  { name: 'an original field that is a number', edit: (p) => (p.datasets[0].stations[0].source.dip = 40), path: 'datasets[0].stations[0].source["dip"]', message: /the field as text/ },
  { name: 'a problem without what was expected', edit: (p) => delete p.datasets[0].stations[1].problems[0].expected, path: 'datasets[0].stations[1].problems[0].expected', message: /what was expected/ },
  { name: 'a row number of 0', edit: (p) => (p.datasets[0].stations[0].row = 0), path: 'datasets[0].stations[0].row', message: /whole number from 1/ },
  { name: 'a mapping to a column the file lacks', edit: (p) => (p.datasets[0].mapping.dip = 'Dip'), path: 'datasets[0].mapping.dip', message: /"Dip" is not one of the dataset's columns/ },
  { name: 'a mapping of an unknown field', edit: (p) => (p.datasets[0].mapping.azimuth = 'dipdir'), path: 'datasets[0].mapping', message: /"azimuth" is not a field/ },
  { name: 'an unknown notation', edit: (p) => (p.datasets[0].options.planeNotation = 'dip-dir'), path: 'datasets[0].options.planeNotation', message: /one of "dipdir", "rhr"/ },
  { name: 'a declination with true north', edit: (p) => (p.datasets[0].options.declination = 3), path: 'datasets[0].options.declination', message: /goes with "north": "magnetic"/ },
  { name: 'a date that is not ISO', edit: (p) => (p.datasets[0].options.date = '03/04/2025'), path: 'datasets[0].options.date', message: /YYYY-MM-DD/ },
  { name: 'two columns of one name', edit: (p) => p.datasets[0].table.headers.push('dip'), path: 'datasets[0].table.headers[4]', message: /appears twice/ },
  { name: 'two datasets with one id', edit: (p) => p.datasets.push(p.datasets[0]), path: 'datasets[1].id', message: /used by two datasets/ },
  { name: 'a selection of a station that is not there', edit: (p) => p.selections[0].indices.push(2), path: 'selections[0].indices[2]', message: /station index from 0 to 1, found 2/ },
  { name: 'a selection of an unknown dataset', edit: (p) => (p.selections[0].dataset = 'ds-9'), path: 'selections[0].dataset', message: /no dataset has the id "ds-9"/ },
  { name: 'a domain ring of two positions', edit: (p) => p.domains[0].ring.splice(2), path: 'domains[0].ring', message: /at least 3 positions, found 2/ },
  { name: 'a domain position out of range', edit: (p) => (p.domains[0].ring[1] = [15, 100]), path: 'domains[0].ring[1][1]', message: /latitude from -90 to 90/ },
  { name: 'GeoJSON locations in a CSV dataset', edit: (p) => (p.datasets[0].table.locations = [null, null]), path: 'datasets[0].table.locations', message: /GeoJSON datasets only/ },
];

describe('parseProject checks every field', () => {
  it('parseProject(projectToJson(valid())) reads the small project used below', () => {
    expect(parseProject(projectToJson(valid()))).toStrictEqual(valid());
  });

  for (const c of CASES) {
    it(`parseProject refuses ${c.name}, naming the path ${c.path}`, () => {
      const e = errorOf(broken(c.edit));
      expect(e.path).toBe(c.path);
      expect(e.message.startsWith(`${c.path}: `)).toBe(true);
      expect(e.message).toMatch(c.message);
    });
  }

  it('parseProject refuses a file from a newer format version and says so', () => {
    const e = errorOf(broken((p) => (p.version = 2)));
    expect(e.path).toBe('version');
    expect(e.message).toMatch(/written in format version 2, newer than this Foldlens reads \(version 1 and older\); open it with a newer Foldlens/);
  });

  it('parseProject refuses text that is not JSON with the parser\'s reason', () => {
    expect(errorOf('{"format": "foldlens-project",').message).toMatch(/^the project file is not valid JSON: /);
  });

  it('parseProject keeps the opaque fields of a domain as they were', () => {
    const p = broken((x) => (x.domains[0].analysis = { anything: [1, { deep: true }] }));
    expect((parseProject(p) as FoldlensProject).domains[0].analysis).toEqual({ anything: [1, { deep: true }] });
  });

  it('isProjectLike(json) recognises a project file of any version, and not GeoJSON', () => {
    expect(isProjectLike({ format: 'foldlens-project', version: 7 })).toBe(true);
    expect(isProjectLike({ type: 'FeatureCollection', features: [] })).toBe(false);
  });

  it('checkImportOptions(value) accepts magnetic north with a typed declination and a default date', () => {
    expect(checkImportOptions({ planeNotation: 'rhr', lineNotation: 'quadrant', north: 'magnetic', declination: -4.5, date: '2025-06-01' })).toMatchObject({ declination: -4.5 });
  });

  it('withStationEdit(dataset, index, station, edit) replaces one station, logs the edit, and leaves the input unchanged', () => {
    const d = valid().datasets[0];
    const fixed = { ...d.stations[1], problems: [], plane: { dipDirection: 130, dip: 59 } };
    const edit = { row: 2, column: 'dip', from: '95', to: '59', at: '2025-06-02T00:00:00.000Z' };
    const next = withStationEdit(d, 1, fixed, edit);
    expect(next.stations[1]).toBe(fixed);
    expect(next.stations[0]).toBe(d.stations[0]);
    expect(next.edits).toEqual([edit]);
    expect(d.stations[1].problems.length).toBe(1);
    expect(() => withStationEdit(d, 2, fixed, edit)).toThrow(/station index 2 is outside dataset "field.csv" \(0 to 1\)/);
  });
});
