import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { readCsv } from '../../src/io/csvTable';
import { detectColumns } from '../../src/io/columns';
import { readStations } from '../../src/io/readStations';
import { builtInCrs } from '../../src/io/crs';
import { ProjectFileError, emptyProject, parseProject, projectToJson, withDataset, type FoldlensProject, type ProjectDataset } from '../../src/io/projectFile';
import { nonFiniteNumbers } from '../helpers/finite';
import { mutatedJson, textFrom } from '../helpers/fuzzArbitraries';
import { fuzzRuns, fuzzTimeout } from '../helpers/fuzzRuns';

/**
 * Fuzzing parseProject (issue #8, point 5): arbitrary text, arbitrary JSON, and a valid project
 * file changed at one random place (a value replaced, a key removed or added, a number made
 * 1e999). Only ProjectFileError may escape, and what is accepted holds no NaN or Infinity
 * outside a domain's opaque fields (the file format keeps those as given: projectFile.ts).
 */

function validProject(): FoldlensProject {
  const table = readCsv(
    ['id,kind,dipdir,dip,trend,plunge,x,y,date,notes', 'A1,bedding,120,40,,,500000,2720000,2025-06-01,first', 'A2,hinge,,,075,12,500100,2720100,,', 'A3,bedding,130,95,,,500200,2720200,,bad dip'].join('\n'),
  );
  const mapping = detectColumns(table.headers).mapping;
  const crs = builtInCrs(32633)!;
  const stations = readStations(table, mapping, { crs, north: 'grid' });
  const dataset: ProjectDataset = {
    id: 'ds-1',
    name: 'field.csv',
    table: { format: 'csv', headers: table.headers, delimiter: table.delimiter, blankRows: table.blankRows, notes: table.notes, extras: [{ row: 2, fields: ['spare'] }] },
    mapping,
    options: { planeNotation: 'auto', lineNotation: 'auto', north: 'grid', crs: 'EPSG:32633' },
    stations,
    edits: [{ row: 3, column: 'dip', from: '9O', to: '95', at: '2025-06-01T10:00:00.000Z' }],
  };
  const project = withDataset(emptyProject('Fuzz', '2025-06-01T00:00:00.000Z'), dataset);
  const ring: [number, number][] = [[15, 24.6], [15.01, 24.6], [15.01, 24.61], [15, 24.61]];
  return {
    ...project,
    selections: [{ id: 's-1', name: 'ridge', dataset: 'ds-1', indices: [0, 1], stationIds: ['A1', 'A2'], shape: { tool: 'lasso', ring }, savedAt: '2025-06-01T00:00:00.000Z' }],
    domains: [{ id: 'd-1', name: 'west', ring, analysis: { axis: { trend: 75, plunge: 12 }, n: 2 } }],
    traces: [{ id: 't-1', name: 'Drawn trace 1', line: [[15, 24.6], [15.005, 24.603], [15.01, 24.61]] }],
    sectionLine: { line: [[14.99, 24.59], [15.02, 24.62]], swath: 500 },
  };
}

/** Calls parseProject; a throw must be a ProjectFileError; a result must be finite outside domains' opaque fields. */
function onlyProjectErrors(input: unknown): void {
  let p: FoldlensProject;
  try {
    p = parseProject(input);
  } catch (e) {
    if (!(e instanceof ProjectFileError)) throw new Error(`parseProject threw ${String(e)} for ${String(JSON.stringify(input)).slice(0, 300)}`);
    expect(e.message.length).toBeGreaterThan(0);
    return;
  }
  const opaque = (path: string): boolean => /^domains\[\d+\]\.(?!ring\b)/.test(path);
  const bad = nonFiniteNumbers(p).filter((path) => !opaque(path));
  expect(bad).toEqual([]);
}

describe('parseProject never lets anything but ProjectFileError escape (fuzz)', () => {
  const valid = validProject();
  const text = projectToJson(valid);

  it('parseProject(projectToJson(p)) gives p back: the valid document the mutations start from is valid', () => {
    expect(parseProject(text)).toEqual(JSON.parse(text));
  });

  it('parseProject(text) on arbitrary text and arbitrary JSON throws only ProjectFileError', () => {
    const pieces = ['{', '}', '[', ']', '"format"', ':', '"foldlens-project"', ',', '"version"', '1', '"datasets"', '"domains"', '"selections"', '"name"', '"x"', 'null', '1e999', '-0', '\ufeff', ' '];
    fc.assert(
      fc.property(fc.oneof(textFrom(pieces, 40), fc.json({ maxDepth: 3 })), (t) => onlyProjectErrors(t)),
      { numRuns: fuzzRuns(1000) },
    );
  }, fuzzTimeout());

  it('parseProject(doc) on a valid project changed at one random place throws only ProjectFileError, and accepts nothing non-finite', () => {
    fc.assert(
      fc.property(mutatedJson(JSON.parse(text)), (doc) => {
        onlyProjectErrors(doc);
        onlyProjectErrors(JSON.stringify(doc));
      }),
      { numRuns: fuzzRuns(1000) },
    );
  }, fuzzTimeout());

  it('parseProject(text) with a number of the valid file written as 1e999, -1e999 or 1e-999 throws only ProjectFileError', () => {
    const numbers = [...text.matchAll(/(?<=[:,[])-?\d+(?:\.\d+)?(?:e[+-]?\d+)?(?=[,\]}])/g)];
    expect(numbers.length).toBeGreaterThan(10);
    fc.assert(
      fc.property(fc.nat({ max: numbers.length - 1 }), fc.constantFrom('1e999', '-1e999', '1e-999', '-0', '0.5', '360', '91'), (k, replacement) => {
        const m = numbers[k];
        onlyProjectErrors(text.slice(0, m.index) + replacement + text.slice(m.index! + m[0].length));
      }),
      { numRuns: fuzzRuns(500) },
    );
  }, fuzzTimeout());
});
