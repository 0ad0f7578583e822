import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { UsageError } from '../../src/cli/args';
import type { CliIo } from '../../src/cli/input';
import { loadInput } from '../../src/cli/input';
import { loadDem, readArea, readLines } from '../../src/cli/optionFiles';
import { nonFiniteNumbers } from '../helpers/finite';
import { textFrom } from '../helpers/fuzzArbitraries';
import { fuzzRuns, fuzzTimeout } from '../helpers/fuzzRuns';

/**
 * Fuzzing the files the command line reads for its options (issue #8, point 5): `--within`
 * (readArea), `--lines` (readLines), `--dem` (loadDem) and `--columns` (a saved column mapping,
 * read by loadInput). Every problem must reach the user as a UsageError naming the option and
 * the file (exit code 2), never as another exception.
 */

/** A CliIo that serves `files` and records nothing. */
function io(files: Record<string, string | Uint8Array>): CliIo {
  return {
    stdout: { write: () => true },
    stderr: { write: () => true },
    readFile: async (path: string) => {
      const f = files[path];
      if (f === undefined) throw Object.assign(new Error(`ENOENT: ${path}`), { code: 'ENOENT' });
      return f;
    },
    writeFile: async () => {},
  };
}

async function onlyUsageErrors<T>(what: string, f: () => Promise<T>): Promise<T | undefined> {
  try {
    return await f();
  } catch (e) {
    if (!(e instanceof UsageError)) throw new Error(`${what} threw ${String(e)}`);
    return undefined;
  }
}

const json = fc.oneof(textFrom(['{', '}', '[', ']', '"type"', ':', '"Polygon"', '"LineString"', '"Feature"', '"coordinates"', ',', '0', '1', '15', '24.6', '1e999', 'null'], 40), fc.json({ maxDepth: 3 }));

describe('command-line option files give only UsageError (fuzz)', () => {
  it('readArea(--within file) and readLines(--lines file) on arbitrary text or bytes throw only UsageError', async () => {
    const content = fc.oneof(json, fc.uint8Array({ maxLength: 40 }));
    await fc.assert(
      fc.asyncProperty(content, async (c) => {
        const files = io({ 'area.json': c });
        const area = await onlyUsageErrors('readArea', () => readArea('area.json', files));
        if (area) expect(nonFiniteNumbers(area)).toEqual([]);
        const lines = await onlyUsageErrors('readLines', () => readLines('area.json', files));
        if (lines) expect(nonFiniteNumbers(lines, { allowNaNAt: (p) => /\.heights\[\d+\]$/.test(p) })).toEqual([]);
      }),
      { numRuns: fuzzRuns(1000) },
    );
  }, fuzzTimeout());

  it('loadInput with --columns naming a file of arbitrary text throws only UsageError', async () => {
    const csv = 'Stn,Type,Dip Dir,Dip,Notes\nA1,bedding,120,40,\nA2,bedding,300,35,x\nA3,bedding,210,60,\n';
    const mapping = fc.oneof(
      json,
      fc.dictionary(fc.constantFrom('id', 'kind', 'dipDirection', 'dip', 'notes', 'bogus', '__proto__', 'constructor'), fc.oneof(fc.constantFrom('Stn', 'Type', 'Dip Dir', 'Dip', 'Notes', 'Nope', ''), fc.jsonValue({ maxDepth: 1 })), { maxKeys: 4 }).map((o) => JSON.stringify(o)),
    );
    await fc.assert(
      fc.asyncProperty(mapping, async (m) => {
        const read = await onlyUsageErrors('loadInput --columns', () => loadInput('field.csv', { positionals: ['field.csv'], options: { columns: 'map.json' } }, io({ 'field.csv': csv, 'map.json': m })));
        if (read) expect(nonFiniteNumbers(read.stations)).toEqual([]);
      }),
      { numRuns: fuzzRuns(1000) },
    );
  }, fuzzTimeout());

  it('loadDem(--dem file) on arbitrary bytes, and on the sample DEM with bytes changed, throws only UsageError', async () => {
    const sample = new Uint8Array(readFileSync('sample-maps/korvane/dem.tif'));
    // The header and the tag directories (the first and last few kB) hold what a reader trusts.
    const corrupt = fc.array(fc.record({ at: fc.oneof(fc.nat({ max: 4096 }), fc.nat({ max: sample.length - 1 })), byte: fc.integer({ min: 0, max: 255 }) }), { minLength: 1, maxLength: 6 }).map((changes) => {
      const b = sample.slice();
      for (const c of changes) b[c.at] = c.byte;
      return b;
    });
    const TIFF = [0x49, 0x49, 0x2a, 0x00];
    const bytes = fc.oneof(fc.uint8Array({ maxLength: 64 }), fc.uint8Array({ maxLength: 60 }).map((b) => Uint8Array.from([...TIFF, ...b])), corrupt);
    await fc.assert(
      fc.asyncProperty(bytes, fc.constantFrom(undefined, 'EPSG:32633', 'bogus'), async (b, crs) => {
        const dem = await onlyUsageErrors('loadDem', () => loadDem('dem.tif', crs, io({ 'dem.tif': b })));
        if (dem) expect(dem.crs.code.length).toBeGreaterThan(0);
      }),
      { numRuns: fuzzRuns(200) },
    );
  }, fuzzTimeout());
});
