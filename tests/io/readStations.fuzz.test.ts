import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import Papa from 'papaparse';
import { CsvError, readCsv } from '../../src/io/csvTable';
import { detectColumns } from '../../src/io/columns';
import { readStations, type StationReadOptions } from '../../src/io/readStations';
import { builtInCrs } from '../../src/io/crs';
import { describeProblem, type Station } from '../../src/core/station';
import { nonFiniteNumbers } from '../helpers/finite';
import { fuzzRuns, fuzzTimeout } from '../helpers/fuzzRuns';

/**
 * Fuzzing the whole reading of a CSV file into stations, as the import and the command line do
 * it (readCsv -> detectColumns -> readStations; issue #8, point 5): columns the detector knows,
 * cells from the alphabets of attitudes, coordinates, dates and kinds, every north reference.
 * Only CsvError escapes (from readCsv; readStations keeps bad rows as problems and never
 * throws), and no station holds NaN or Infinity: angles in range, positions in WGS 84.
 */

const HEADERS = ['Station', 'Kind', 'Dip Dir', 'Dip', 'Strike', 'DipQuad', 'Trend', 'Plunge', 'Rake', 'Attitude', 'E', 'N', 'Longitude', 'Latitude', 'Elevation', 'Date', 'Overturned', 'Sense', 'Notes', 'extra'];
const CELL_PIECES = ['0', '1', '9', '12', '45', '090', '359.9', '360', '400', '-5', '.', ',', '/', ' ', '°', 'N', 'E', 'S', 'W', 'SE', 'NW', 'g', 'e9', '1e400', '-0', 'NaN', 'Infinity', 'bedding', 'hinge', 'S1', 'OT', 'yes', 'antiform', '2025-06-01', '1999-13-40', '500000', '2720000', '15.0', '24.6', '"'];
const cell = fc.oneof(fc.array(fc.constantFrom(...CELL_PIECES), { maxLength: 5 }).map((a) => a.join('')), fc.string({ maxLength: 8 }));
const crs = builtInCrs(32633)!;
const OPTIONS: readonly StationReadOptions[] = [
  {},
  { crs },
  { crs, north: 'grid' },
  { north: 'magnetic' },
  { north: 'magnetic', declination: -3.5, crs },
  { north: 'magnetic', declination: 'wmm', date: new Date('2025-06-01T00:00:00Z') },
  { planeNotation: 'rhr', lineNotation: 'quadrant', defaultKind: 'bedding' },
  { planeNotation: 'strike-quadrant', defaultKind: 'hinge', crs },
];

function checkStation(s: Station): void {
  expect(nonFiniteNumbers(s), `station row ${s.row}`).toEqual([]);
  if (s.plane) expect(s.plane.dipDirection >= 0 && s.plane.dipDirection < 360 && s.plane.dip >= 0 && s.plane.dip <= 90, JSON.stringify(s.plane)).toBe(true);
  if (s.line) expect(s.line.trend >= 0 && s.line.trend < 360 && s.line.plunge >= 0 && s.line.plunge <= 90, JSON.stringify(s.line)).toBe(true);
  if (s.lat !== undefined) expect(Math.abs(s.lat)).toBeLessThanOrEqual(90);
  for (const p of s.problems) expect(describeProblem(p)).toMatch(/^row \d+/);
}

describe('readCsv -> detectColumns -> readStations never lets anything but CsvError escape (fuzz)', () => {
  it('a CSV of known columns and attitude-, coordinate-, date- and kind-like cells reads to finite stations, or to a CsvError', () => {
    const table = fc.record({
      headers: fc.uniqueArray(fc.constantFrom(...HEADERS), { minLength: 1, maxLength: 8 }),
      rows: fc.array(fc.array(cell, { maxLength: 9 }), { minLength: 1, maxLength: 6 }),
      delimiter: fc.constantFrom(',', ';', '\t'),
      options: fc.constantFrom(...OPTIONS),
    });
    fc.assert(
      fc.property(table, ({ headers, rows, delimiter, options }) => {
        const text = Papa.unparse([headers, ...rows], { delimiter, newline: '\n' });
        let t;
        try {
          t = readCsv(text);
        } catch (e) {
          if (!(e instanceof CsvError)) throw new Error(`readCsv threw ${String(e)} for ${JSON.stringify(text)}`);
          return;
        }
        const mapping = detectColumns(t.headers).mapping;
        const stations = readStations(t, mapping, options);
        expect(stations).toHaveLength(t.rows.length);
        stations.forEach(checkStation);
      }),
      { numRuns: fuzzRuns(500) },
    );
  }, fuzzTimeout());
});
