import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import type { Station } from '../../src/core/station';
import {
  MAX_SECTION_SWATH,
  ProjectFileError,
  emptyProject,
  parseProject,
  projectToJson,
  withDataset,
  type FoldlensProject,
  type ProjectDataset,
  type ProjectSectionLine,
  type ProjectTrace,
} from '../../src/io/projectFile';
import { drawnLinesOf, newTraceId, nextTraceName, withDrawnLines } from '../../src/io/drawnLines';

/**
 * The lines drawn on the map in the project file (docs/project-format.md, "Traces" and "Section
 * line"; the format is our own, so that description is the reference): they round-trip exactly,
 * files written before they were kept still read at the same version, and a bad field is named
 * by its path with what was expected.
 */

const station: Station = {
  id: 'TV-01',
  row: 1,
  kind: 'bedding',
  lon: 15.01,
  lat: 24.6,
  plane: { dipDirection: 37, dip: 20 },
  source: { id: 'TV-01', dd: '37', dip: '20' },
  problems: [],
};

const dataset: ProjectDataset = {
  id: 'ds-1',
  name: 'traverse.csv',
  table: { format: 'csv', headers: ['id', 'dd', 'dip'], delimiter: ',', blankRows: [], notes: [], extras: [] },
  mapping: { id: 'id', dipDirection: 'dd', dip: 'dip' },
  options: { planeNotation: 'auto', lineNotation: 'auto', north: 'true', defaultKind: 'bedding' },
  stations: [station],
  edits: [],
};

const TRACES: ProjectTrace[] = [
  { id: 'trace-1', name: 'Drawn trace 1', line: [[15.01, 24.59], [15.02, 24.6], [15.04, 24.62]] },
  { id: 'trace-2', name: 'Marker <b>bed</b>', line: [[15.0, 24.6], [15.03, 24.6]] },
];
const SECTION: ProjectSectionLine = { line: [[14.99, 24.58], [15.05, 24.63]], swath: 600 };

function withLines(): FoldlensProject {
  return { ...withDataset(emptyProject('Tovan traverse', '2025-06-01T12:00:00.000Z'), dataset), traces: TRACES, sectionLine: SECTION };
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
  const p = JSON.parse(JSON.stringify(withLines()));
  edit(p);
  return p;
}

describe('traces and the section line in the project file', () => {
  it('parseProject(projectToJson(project)) gives back the traces (id, name, every vertex) and the section line with its swath exactly', () => {
    const project = withLines();
    const text = projectToJson(project);
    const back = parseProject(text);
    expect(back).toStrictEqual(project);
    expect(back.version).toBe(1);
    // The name is kept as the text it is: markup in it is not read, changed or dropped.
    expect(back.traces![1].name).toBe('Marker <b>bed</b>');
    expect(JSON.parse(text).sectionLine).toEqual({ line: [[14.99, 24.58], [15.05, 24.63]], swath: 600 });
  });

  it('a project file written before the drawn lines were kept (no traces, no sectionLine) still reads, at the same version, with none', () => {
    const text = readFileSync('tests/fixtures/project-v1-indices-only/in.foldlens.json', 'utf8');
    expect(text).not.toMatch(/"traces"|"sectionLine"/);
    const project = parseProject(text);
    expect(project.version).toBe(1);
    expect(project.traces).toBeUndefined();
    expect(project.sectionLine).toBeUndefined();
    expect(drawnLinesOf(project)).toEqual({ traces: [], sectionLine: null });
  });

  it('projectToJson round-trips any traces and section line withDrawnLines puts in a project (property)', () => {
    // JSON has no negative zero (RFC 8259 numbers), so -0 is left out: it reads back as 0.
    const lon = fc.double({ min: -180, max: 180, noNaN: true }).filter((v) => !Object.is(v, -0));
    const lat = fc.double({ min: -90, max: 90, noNaN: true }).filter((v) => !Object.is(v, -0));
    const line = fc
      .array(fc.tuple(lon, lat), { minLength: 2, maxLength: 30 })
      .filter((l) => l.some((p) => p[0] !== l[0][0] || p[1] !== l[0][1]));
    const swath = fc.double({ min: Number.MIN_VALUE, max: MAX_SECTION_SWATH, noNaN: true });
    const traces = fc.uniqueArray(fc.record({ id: fc.string({ minLength: 1 }), name: fc.string(), line }), { selector: (t) => t.id, maxLength: 6 });
    fc.assert(
      fc.property(traces, fc.option(fc.record({ line, swath }), { nil: null }), (t, s) => {
        const project = withDrawnLines(withDataset(emptyProject('P', '2025-06-01T00:00:00.000Z'), dataset), { traces: t, sectionLine: s });
        const back = parseProject(projectToJson(project));
        expect(back).toStrictEqual(project);
        expect(drawnLinesOf(back)).toEqual({ traces: t, sectionLine: s });
        // Nothing to keep: the fields are left out, as in files written before they existed.
        expect('traces' in back).toBe(t.length > 0);
        expect('sectionLine' in back).toBe(s !== null);
      }),
      { numRuns: 200 },
    );
  });
});

// Each row breaks one field of the drawn lines; the message must name its path and say what was expected.
// Source of every expectation: docs/project-format.md, "Traces" and "Section line" (our own format).
const CASES: { name: string; edit: (p: any) => void; path: string; message: RegExp }[] = [
  { name: 'traces that are not a list', edit: (p) => (p.traces = { id: 't' }), path: 'traces', message: /expected a list of traces, found an object/ },
  { name: 'a trace that is not an object', edit: (p) => (p.traces[0] = 'line'), path: 'traces[0]', message: /expected a trace \{id, name, line\}, found "line"/ },
  { name: 'a trace without an id', edit: (p) => delete p.traces[0].id, path: 'traces[0].id', message: /expected an id \(non-empty text\), found nothing/ },
  { name: 'a trace name that is a number', edit: (p) => (p.traces[1].name = 7), path: 'traces[1].name', message: /expected a name \(text\), found 7/ },
  { name: 'a trace of one position', edit: (p) => (p.traces[0].line = [[15, 24.6]]), path: 'traces[0].line', message: /expected at least 2 positions, found 1/ },
  { name: 'a trace whose positions are all one place', edit: (p) => (p.traces[1].line = [[15, 24.6], [15, 24.6], [15, 24.6]]), path: 'traces[1].line', message: /expected at least 2 different positions, found 3 at one place/ },
  { name: 'a trace longitude of 200', edit: (p) => (p.traces[0].line[1][0] = 200), path: 'traces[0].line[1][0]', message: /expected a longitude from -180 to 180, found 200/ },
  { name: 'a trace latitude written as text', edit: (p) => (p.traces[0].line[2][1] = '24.6'), path: 'traces[0].line[2][1]', message: /expected a latitude from -90 to 90, found "24.6"/ },
  { name: 'a trace position of three numbers', edit: (p) => p.traces[0].line[0].push(120), path: 'traces[0].line[0]', message: /expected \[longitude, latitude\], found a list/ },
  { name: 'a trace line that is not a list', edit: (p) => (p.traces[0].line = 'LINESTRING(15 24, 16 25)'), path: 'traces[0].line', message: /expected a line of \[longitude, latitude\] positions, found "LINESTRING/ },
  { name: 'an unknown field in a trace', edit: (p) => (p.traces[0].colour = 'green'), path: 'traces[0].colour', message: /unknown field; expected only id, name, line/ },
  { name: 'two traces with one id', edit: (p) => (p.traces[1].id = 'trace-1'), path: 'traces[1].id', message: /the id "trace-1" is used by two traces/ },
  { name: 'a section line that is a list', edit: (p) => (p.sectionLine = [[15, 24], [15.1, 24]]), path: 'sectionLine', message: /expected a section line \{line, swath\}, found a list/ },
  { name: 'a section line of one position', edit: (p) => p.sectionLine.line.splice(1), path: 'sectionLine.line', message: /expected at least 2 positions, found 1/ },
  { name: 'a section latitude of -91', edit: (p) => (p.sectionLine.line[0][1] = -91), path: 'sectionLine.line[0][1]', message: /expected a latitude from -90 to 90, found -91/ },
  { name: 'a section line without a swath', edit: (p) => delete p.sectionLine.swath, path: 'sectionLine.swath', message: /expected a swath half-width in metres, more than 0 and at most 20000, found nothing/ },
  { name: 'a swath of 0', edit: (p) => (p.sectionLine.swath = 0), path: 'sectionLine.swath', message: /more than 0 and at most 20000, found 0/ },
  { name: 'a negative swath', edit: (p) => (p.sectionLine.swath = -50), path: 'sectionLine.swath', message: /found -50/ },
  { name: 'a swath wider than 20 km', edit: (p) => (p.sectionLine.swath = 25000), path: 'sectionLine.swath', message: /at most 20000, found 25000/ },
  { name: 'a swath written as text', edit: (p) => (p.sectionLine.swath = '500'), path: 'sectionLine.swath', message: /found "500"/ },
  { name: 'an unknown field in the section line', edit: (p) => (p.sectionLine.azimuth = 135), path: 'sectionLine.azimuth', message: /unknown field; expected only line, swath/ },
];

describe('parseProject checks every field of the drawn lines', () => {
  for (const c of CASES) {
    it(`parseProject refuses ${c.name}, naming the path ${c.path}`, () => {
      const e = errorOf(broken(c.edit));
      expect(e.path).toBe(c.path);
      expect(e.message.startsWith(`${c.path}: `)).toBe(true);
      expect(e.message).toMatch(c.message);
    });
  }

  it('parseProject refuses a swath that JSON text writes as 1e999 (Infinity once read), naming sectionLine.swath', () => {
    const text = projectToJson(withLines()).replace('"swath":600', '"swath":1e999');
    const e = errorOf(text);
    expect(e.path).toBe('sectionLine.swath');
    expect(e.message).toBe('sectionLine.swath: expected a swath half-width in metres, more than 0 and at most 20000, found Infinity');
  });

  it('docs/project-format.md shows, word for word, the messages parseProject gives for a trace of one position and a swath of 0', () => {
    const doc = readFileSync('docs/project-format.md', 'utf8');
    const oneVertex = errorOf(broken((p) => (p.traces[0].line = [[15, 24.6]]))).message;
    const zeroSwath = errorOf(broken((p) => (p.sectionLine.swath = 0))).message;
    expect(doc).toContain(`\`${oneVertex}\``);
    expect(doc).toContain(`\`${zeroSwath}\``);
  });

  it('projectToJson refuses to write a project whose section line has a NaN swath, naming the field', () => {
    expect(() => projectToJson({ ...withLines(), sectionLine: { line: SECTION.line, swath: Number.NaN } })).toThrow(/^sectionLine\.swath: expected a swath half-width in metres, more than 0 and at most 20000, found NaN$/);
  });
});

describe('drawnLinesOf, withDrawnLines, nextTraceName, newTraceId', () => {
  it('withDrawnLines(project, lines) puts the lines in a copy, leaves a field out when empty, and does not change the project given', () => {
    const base = withLines();
    const cleared = withDrawnLines(base, { traces: [], sectionLine: null });
    expect('traces' in cleared).toBe(false);
    expect('sectionLine' in cleared).toBe(false);
    expect(cleared.datasets).toBe(base.datasets);
    expect(base.traces).toBe(TRACES);
    const only = withDrawnLines(cleared, { traces: [], sectionLine: SECTION });
    expect(only.sectionLine).toEqual(SECTION);
    expect(only.sectionLine).not.toBe(SECTION);
    expect(drawnLinesOf(only)).toEqual({ traces: [], sectionLine: SECTION });
  });

  it('nextTraceName(existing) counts up past the names in use; newTraceId(now, random) is trace-<time>-<random>', () => {
    expect(nextTraceName([])).toBe('Drawn trace 1');
    expect(nextTraceName([{ name: 'Drawn trace 1' }, { name: 'Drawn trace 3' }])).toBe('Drawn trace 2');
    expect(newTraceId(36 ** 3, () => 0.5)).toBe('trace-1000-i000');
  });
});
