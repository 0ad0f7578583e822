import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import type { Station } from '../../src/core/station';
import {
  ProjectFileError,
  SELECTION_TOOLS,
  emptyProject,
  parseProject,
  projectToJson,
  withDataset,
  type FoldlensProject,
  type ProjectDataset,
  type ProjectSelection,
} from '../../src/io/projectFile';
import { namedSelection, newSelectionId, nextSelectionName, resolveSelection, selectionAppliesTo } from '../../src/io/namedSelection';

/**
 * Named selections in the project file (docs/project-format.md, "Selection"; the format is our
 * own, so that description is the reference): every form round-trips exactly, files written
 * before outlines and station ids were added still read, and a bad field is named by its path.
 */

const station = (id: string, row: number): Station => ({
  id,
  row,
  kind: 'bedding',
  lon: 15 + row / 100,
  lat: 24.6,
  plane: { dipDirection: (row * 37) % 360, dip: row % 90 },
  source: { id, dd: String((row * 37) % 360), dip: String(row % 90) },
  problems: [],
});

function dataset(stations: Station[], id = 'ds-1'): ProjectDataset {
  return {
    id,
    name: 'traverse.csv',
    table: { format: 'csv', headers: ['id', 'dd', 'dip'], delimiter: ',', blankRows: [], notes: [], extras: [] },
    mapping: { id: 'id', dipDirection: 'dd', dip: 'dip' },
    options: { planeNotation: 'auto', lineNotation: 'auto', north: 'true', defaultKind: 'bedding' },
    stations,
    edits: [],
  };
}

const RING = [[15.01, 24.59], [15.04, 24.59], [15.04, 24.62], [15.01, 24.62]] as const;
const STATIONS = ['TV-01', 'TV-02', 'TV-03', 'TV-04', 'TV-05'].map((id, i) => station(id, i + 1));

/** A project holding one selection of each form the description lists. */
function withEveryForm(): FoldlensProject {
  const selections: ProjectSelection[] = [
    { id: 'sel-1', name: 'West limb', dataset: 'ds-1', indices: [0, 2], shape: { tool: 'lasso', ring: RING.map((p) => [p[0], p[1]] as const) }, savedAt: '2025-06-01T10:00:00.000Z' },
    { id: 'sel-2', name: 'Hinge <b>zone</b>', dataset: 'ds-1', stationIds: ['TV-04', 'TV-05'] },
    { id: 'sel-3', name: 'Sample stations', stationIds: ['KR-0001', 'KR-0002'], shape: { ring: RING.map((p) => [p[0], p[1]] as const) } },
    { id: 'sel-4', name: 'Outline only', shape: { tool: 'rectangle', ring: RING.map((p) => [p[0], p[1]] as const) } },
    { id: 'sel-5', name: 'Before outlines', dataset: 'ds-1', indices: [1] },
  ];
  return { ...withDataset(emptyProject('Tovan traverse', '2025-06-01T12:00:00.000Z'), dataset(STATIONS)), selections };
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

function broken(edit: (p: any) => void): unknown {
  const p = JSON.parse(JSON.stringify(withEveryForm()));
  edit(p);
  return p;
}

describe('named selections in the project file', () => {
  it('parseProject(projectToJson(project)) gives back every form of selection exactly: indices, station ids, outline with its tool, saved time', () => {
    const project = withEveryForm();
    const text = projectToJson(project);
    expect(parseProject(text)).toStrictEqual(project);
    // The outline is kept vertex for vertex, not rounded.
    expect(JSON.parse(text).selections[0].shape).toEqual({ tool: 'lasso', ring: RING });
  });

  it('a project file written before outlines and station ids were added (only dataset and indices) still reads, at the same version', () => {
    const text = readFileSync('tests/fixtures/project-v1-indices-only/in.foldlens.json', 'utf8');
    const project = parseProject(text);
    expect(project.version).toBe(1);
    expect(project.selections).toEqual([{ id: 'sel-1', name: 'West limb', dataset: 'ds-m1x2k3-4f9a0c1e', indices: [0] }]);
    expect(resolveSelection(project.selections[0], project.datasets[0].stations)).toEqual({ indices: [0], missing: 0 });
  });

  it('projectToJson round-trips any selection made by namedSelection from any subset of stations, with or without a dataset (property)', () => {
    // JSON has no negative zero (RFC 8259 numbers), so -0 is left out: it reads back as 0.
    const lon = fc.double({ min: -180, max: 180, noNaN: true }).filter((v) => !Object.is(v, -0));
    const lat = fc.double({ min: -90, max: 90, noNaN: true }).filter((v) => !Object.is(v, -0));
    fc.assert(
      fc.property(
        fc.uniqueArray(fc.nat({ max: STATIONS.length - 1 }), { minLength: 1 }),
        fc.boolean(),
        fc.option(fc.record({ tool: fc.option(fc.constantFrom(...SELECTION_TOOLS), { nil: undefined }), ring: fc.array(fc.tuple(lon, lat), { minLength: 3, maxLength: 40 }) }), { nil: null }),
        fc.string(),
        (picked, inDataset, shape, name) => {
          const record = namedSelection({ id: 'sel-x', name, stations: STATIONS, indices: picked, dataset: inDataset ? 'ds-1' : undefined, shape, savedAt: '2025-06-01T00:00:00.000Z' });
          const project = { ...withDataset(emptyProject('P', '2025-06-01T00:00:00.000Z'), dataset(STATIONS)), selections: [record] };
          const back = parseProject(projectToJson(project));
          expect(back).toStrictEqual(project);
          // And the stations come back as they were picked, in station order.
          expect(resolveSelection(back.selections[0], STATIONS).indices).toEqual([...picked].sort((a, b) => a - b));
        },
      ),
      { numRuns: 200 },
    );
  });
});

// Each row breaks one field of a selection; the message must name its path and say what was expected.
// Source of every expectation: docs/project-format.md, "Selection" (our own format).
const CASES: { name: string; edit: (p: any) => void; path: string; message: RegExp }[] = [
  { name: 'an outline latitude of 95', edit: (p) => (p.selections[0].shape.ring[1][1] = 95), path: 'selections[0].shape.ring[1][1]', message: /expected a latitude from -90 to 90, found 95/ },
  { name: 'an outline of two positions', edit: (p) => (p.selections[0].shape.ring = p.selections[0].shape.ring.slice(0, 2)), path: 'selections[0].shape.ring', message: /expected at least 3 positions, found 2/ },
  { name: 'an outline position that is not a pair', edit: (p) => (p.selections[0].shape.ring[2] = [15]), path: 'selections[0].shape.ring[2]', message: /expected \[longitude, latitude\], found a list/ },
  { name: 'a drawing tool it does not know', edit: (p) => (p.selections[0].shape.tool = 'freehand'), path: 'selections[0].shape.tool', message: /expected one of "lasso", "polygon", "rectangle", found "freehand"/ },
  { name: 'an unknown field in the outline', edit: (p) => (p.selections[0].shape.colour = 'red'), path: 'selections[0].shape.colour', message: /unknown field; expected only tool, ring/ },
  { name: 'an unknown field in a selection', edit: (p) => (p.selections[1].colour = 'red'), path: 'selections[1].colour', message: /unknown field; expected only id, name, dataset, indices, stationIds, shape, savedAt/ },
  { name: 'an empty station id', edit: (p) => (p.selections[1].stationIds[1] = ''), path: 'selections[1].stationIds[1]', message: /expected a station id \(non-empty text\), found ""/ },
  { name: 'a station id the dataset does not have', edit: (p) => (p.selections[1].stationIds[0] = 'TV-99'), path: 'selections[1].stationIds[0]', message: /no station of dataset "ds-1" has the id "TV-99"/ },
  { name: 'indices without the dataset they point into', edit: (p) => delete p.selections[0].dataset, path: 'selections[0].dataset', message: /expected the id of the dataset the indices point into, found nothing/ },
  { name: 'an index past the last station', edit: (p) => p.selections[4].indices.push(5), path: 'selections[4].indices[1]', message: /expected a station index from 0 to 4, found 5/ },
  { name: 'a selection with neither stations nor outline', edit: (p) => delete p.selections[3].shape, path: 'selections[3]', message: /expected the stations of the selection \(indices or stationIds\) or its outline \(shape\), found none of them/ },
  { name: 'a saved time that is not a time', edit: (p) => (p.selections[0].savedAt = 'yesterday'), path: 'selections[0].savedAt', message: /expected a date and time, ISO 8601, found "yesterday"/ },
  { name: 'two selections with one id', edit: (p) => (p.selections[2].id = 'sel-1'), path: 'selections[2].id', message: /the id "sel-1" is used by two selections/ },
];

describe('parseProject checks every field of a selection', () => {
  for (const c of CASES) {
    it(`parseProject refuses ${c.name}, naming the path ${c.path}`, () => {
      const e = errorOf(broken(c.edit));
      expect(e.path).toBe(c.path);
      expect(e.message.startsWith(`${c.path}: `)).toBe(true);
      expect(e.message).toMatch(c.message);
    });
  }
});

describe('namedSelection and resolveSelection', () => {
  it('namedSelection(...) names a dataset\'s stations by index and stations of no dataset by id, and keeps the outline and its tool', () => {
    const ring = RING.map((p) => [p[0], p[1]] as const);
    expect(namedSelection({ id: 's', name: 'A', stations: STATIONS, indices: Int32Array.from([1, 3]), dataset: 'ds-1', shape: { tool: 'polygon', ring }, savedAt: '2025-06-01T00:00:00.000Z' })).toEqual({
      id: 's',
      name: 'A',
      dataset: 'ds-1',
      indices: [1, 3],
      shape: { tool: 'polygon', ring: RING },
      savedAt: '2025-06-01T00:00:00.000Z',
    });
    const sample = namedSelection({ id: 's', name: 'B', stations: STATIONS, indices: [4, 0], shape: { tool: undefined, ring } });
    expect(sample.stationIds).toEqual(['TV-05', 'TV-01']);
    expect(sample.dataset).toBeUndefined();
    expect(sample.shape).toEqual({ ring: RING });
    expect(() => namedSelection({ id: 's', name: 'C', stations: STATIONS, indices: [5] })).toThrow(/station index 5 is outside the 5 stations shown/);
  });

  it('resolveSelection(selection, stations) finds stations by index, by id (every station of that id), and counts those gone', () => {
    expect(resolveSelection({ id: 's', name: 'A', dataset: 'ds-1', indices: [3, 1, 9] }, STATIONS)).toEqual({ indices: [1, 3], missing: 1 });
    const twice = [...STATIONS, station('TV-02', 6)];
    expect(resolveSelection({ id: 's', name: 'B', stationIds: ['TV-02', 'TV-77'] }, twice)).toEqual({ indices: [1, 5], missing: 1 });
    expect(resolveSelection({ id: 's', name: 'C', shape: { ring: RING.map((p) => [p[0], p[1]] as const) } }, STATIONS)).toEqual({ indices: null, missing: 0 });
  });

  it('selectionAppliesTo(selection, dataset) matches a dataset\'s own selections, and those of no dataset to the stations of none', () => {
    expect(selectionAppliesTo({ id: 's', name: 'A', dataset: 'ds-1', indices: [0] }, 'ds-1')).toBe(true);
    expect(selectionAppliesTo({ id: 's', name: 'A', dataset: 'ds-1', indices: [0] }, undefined)).toBe(false);
    expect(selectionAppliesTo({ id: 's', name: 'B', stationIds: ['KR-0001'] }, undefined)).toBe(true);
    expect(selectionAppliesTo({ id: 's', name: 'B', stationIds: ['KR-0001'] }, 'ds-1')).toBe(false);
  });

  it('nextSelectionName(existing) counts up past the names in use; newSelectionId(now, random) is sel-<time>-<random>', () => {
    expect(nextSelectionName([])).toBe('Selection 1');
    expect(nextSelectionName([{ name: 'Selection 1' }, { name: 'Selection 3' }])).toBe('Selection 2');
    expect(newSelectionId(36 ** 3, () => 0.5)).toBe('sel-1000-i000');
  });
});
