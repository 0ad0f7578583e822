import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { readCsv, type CsvRow } from '../../src/io/csvTable';
import { detectColumns, type ColumnMapping } from '../../src/io/columns';
import { DEFAULT_IMPORT_OPTIONS, type ImportOptions } from '../../src/io/projectFile';
import { checkMapping, type MappingMessage } from '../../src/components/import/mappingCheck';

/** The mapping step's checks, on small invented tables and on the Korvane sample (sample-maps/korvane). */

function context(text: string, options: Partial<ImportOptions> = {}, mapping?: ColumnMapping) {
  const table = readCsv(text);
  const detection = detectColumns(table.headers);
  return { format: 'csv' as const, headers: table.headers, preview: table.rows.slice(0, 200) as CsvRow[], mapping: mapping ?? detection.mapping, options: { ...DEFAULT_IMPORT_OPTIONS, ...options }, issues: detection.issues };
}

const errors = (m: readonly MappingMessage[]) => m.filter((x) => x.level === 'error').map((x) => x.text);
const warnings = (m: readonly MappingMessage[]) => m.filter((x) => x.level === 'warning').map((x) => x.text);

describe('checkMapping', () => {
  const korvane = readFileSync('sample-maps/korvane/stations-quadrant.csv', 'utf8');

  it('checkMapping(ctx) asks for the coordinate system of the Korvane E/N columns, and nothing else', () => {
    const m = checkMapping(context(korvane));
    expect(errors(m)).toEqual(['Columns "E", "N" hold map coordinates: choose their coordinate system.']);
  });

  it('checkMapping(ctx) with UTM zone 33N warns of the two planted bad rows among the first 200, naming them', () => {
    const m = checkMapping(context(korvane, { crs: 'EPSG:32633' }));
    expect(errors(m)).toEqual([]);
    const w = warnings(m).join('\n');
    // sample-maps/korvane/README.md "Planted bad rows": KR-0032 dip 95 and KR-0134 kind missing lie in rows 1-200.
    expect(w).toMatch(/^2 of the first 200 rows cannot be used as they are \(row 32, column Dip: "95"; expected a dip from 0 to 90; row 134, column Type: empty/);
    expect(m.find((x) => x.level === 'info' && /not read: (.*, )?"Dataset"\.$/.test(x.text))).toBeDefined();
  });

  // Each row: a table and choices, and the message the user must see (wording from mappingCheck.ts).
  const cases: { name: string; text: string; options?: Partial<ImportOptions>; mapping?: ColumnMapping; level: 'error' | 'warning'; message: RegExp }[] = [
    { name: 'a single column (wrong delimiter)', text: 'id:kind:dipdir:dip\nA:bedding:120:40\n', level: 'error', message: /^Only one column was found, named "id:kind:dipdir:dip"\. The fields look separated by ":": choose it under Delimiter\./ },
    { name: 'a first row of values (no header row)', text: 'TV-01,bedding,120,40,15.02,24.61\nTV-02,bedding,131,38,15.03,24.62\n', level: 'error', message: /^The first row holds values such as "120", "40", "15\.02" where the column names belong/ },
    { name: 'no attitude column', text: 'id,notes\nA,x\n', level: 'error', message: /^No column holds an attitude/ },
    { name: 'a dip without its direction', text: 'id,kind,dip\nA,bedding,40\n', level: 'error', message: /^Dip is chosen but neither Dip direction nor Strike is/ },
    { name: 'one column for two fields', text: 'id,kind,dipdir,dip\nA,bedding,120,40\n', mapping: { id: 'id', kind: 'kind', dipDirection: 'dipdir', dip: 'dipdir' }, level: 'error', message: /^Column "dipdir" is chosen for Dip direction and Dip/ },
    { name: 'mixed notations in one attitude column', text: 'id,kind,attitude\nA,bedding,120/45\nB,bedding,030/45SE\nC,bedding,N30E 45SE\n', level: 'error', message: /^Column "attitude": 1 of 3 readable samples have no dip quadrant while the rest do; name the notation/ },
    { name: 'bare values in auto', text: 'id,kind,attitude\nA,bedding,120/45\nB,bedding,130/40\n', level: 'error', message: /could be dip direction\/dip or right-hand-rule strike\/dip; name the notation\. Choose the notation\./ },
    { name: 'values the named notation cannot read', text: 'id,kind,attitude\nA,bedding,120/45\nB,bedding,030/45SE\n', options: { planeNotation: 'dipdir' }, level: 'warning', message: /^1 of the first 2 plane values in column "attitude" cannot be read as dip direction \/ dip \(120\/45\) \(e\.g\. row 2: "030\/45SE"\)/ },
    { name: 'an attitude column without kinds', text: 'id,attitude\nA,030/45SE\n', level: 'error', message: /^An attitude column needs a kind column/ },
    { name: 'x without y', text: 'id,kind,dipdir,dip,x\nA,bedding,120,40,500000\n', level: 'error', message: /^Choose both x and y columns \(only x is chosen\)/ },
    { name: 'the World Magnetic Model without a date', text: 'id,kind,dipdir,dip,lon,lat\nA,bedding,120,40,15,45\n', options: { north: 'magnetic', declination: 'wmm' }, level: 'error', message: /^The World Magnetic Model needs a date/ },
    { name: 'grid north with longitude and latitude', text: 'id,kind,dipdir,dip,lon,lat\nA,bedding,120,40,15,45\n', options: { north: 'grid', crs: 'EPSG:4326' }, level: 'error', message: /^Grid north needs the projected coordinate system/ },
    { name: 'a CRS that cannot be read', text: 'id,kind,dipdir,dip,x,y\nA,bedding,120,40,500000,4980000\n', options: { crs: 'Gauss 7' }, level: 'error', message: /^"Gauss 7" is not a CRS Foldlens can read/ },
    { name: 'no location', text: 'id,kind,dipdir,dip\nA,bedding,120,40\n', level: 'warning', message: /^No location columns are chosen/ },
    { name: 'angles in grads, negative dips and degree signs', text: 'id,kind,dipdir,dip\nA,bedding,120,50g\nB,bedding,130,-30\nC,bedding,140°,45°\n', level: 'warning', message: /^2 of the first 3 rows cannot be used as they are \(row 1, column dip: "50g"; expected angles in degrees.*grads \(g, gon\) are not accepted; row 2, column dip: "-30"; expected angles of 0 or more/ },
    { name: 'latitude and longitude swapped', text: 'id,kind,dipdir,dip,lon,lat\nA,bedding,120,40,45.2,120.5\n', level: 'warning', message: /latitude and longitude look swapped/ },
  ];
  for (const c of cases) {
    it(`checkMapping(ctx) says so for ${c.name}`, () => {
      const m = checkMapping(context(c.text, c.options, c.mapping));
      const texts = c.level === 'error' ? errors(m) : warnings(m);
      expect(texts.some((t) => c.message.test(t)), `${c.level}s were: ${JSON.stringify(texts)}`).toBe(true);
    });
  }

  it('checkMapping(ctx) lists errors before warnings before notes', () => {
    const m = checkMapping(context('id:kind\nA:b\n'));
    const ranks = m.map((x) => ({ error: 0, warning: 1, info: 2 })[x.level]);
    expect(ranks).toEqual([...ranks].sort((a, b) => a - b));
  });

  it('checkMapping(ctx) of GeoJSON takes locations from the geometry and asks for no coordinate columns', () => {
    const m = checkMapping({ format: 'geojson', headers: ['kind', 'dipdir', 'dip'], preview: [{ row: 1, values: { kind: 'bedding', dipdir: '120', dip: '40' } }], mapping: { kind: 'kind', dipDirection: 'dipdir', dip: 'dip' }, options: DEFAULT_IMPORT_OPTIONS });
    expect(errors(m)).toEqual([]);
    expect(warnings(m)).toEqual([]);
    expect(m.some((x) => /Point geometries/.test(x.text))).toBe(true);
  });
});
