import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { readCsv } from '../../src/io/csvTable';
import { detectColumns, FIELDS, type ColumnMapping } from '../../src/io/columns';
import { readStations, readStation, parseNumberCell, type StationReadOptions } from '../../src/io/readStations';
import { builtInCrs, gridConvergence, toLonLat } from '../../src/io/crs';
import { describeProblem, isUsable, type Station } from '../../src/core/station';
import { expectAzimuth, expectClose, expectDeepClose } from '../helpers/tolerance';
import { fuzzRuns, fuzzTimeout } from '../helpers/fuzzRuns';

/** Reads CSV text with detected columns. */
function read(text: string, options: StationReadOptions = {}): Station[] {
  const table = readCsv(text);
  const d = detectColumns(table.headers);
  expect(d.issues).toEqual([]);
  return readStations(table, d.mapping, options);
}

describe('readStations(table, mapping, options) attitudes', () => {
  it('readStations reads strike 008, dip 12, quadrant E as dip direction 098/12 (Coe 2010, fig. 2.6)', () => {
    // Published: Coe (ed.), Geological Field Techniques (2010), fig. 2.6: 008/12E is dip direction/dip 098/12.
    const [s] = read('id,kind,strike,dip,dip quadrant\nK1,bedding,008,12,E');
    expectDeepClose(s.plane, { dipDirection: 98, dip: 12 }, 1e-12);
    const [t] = read('id,kind,attitude\nK1,bedding,008/12E');
    expectDeepClose(t.plane, { dipDirection: 98, dip: 12 }, 1e-12);
  });

  it('readStations reads a strike without quadrant by the right-hand rule (dip direction = strike + 90, common practice)', () => {
    const [s] = read('id,kind,strike,dip\nK1,bedding,030,45');
    expectDeepClose(s.plane, { dipDirection: 120, dip: 45 }, 1e-12);
  });

  it('readStations reads the attitude column in the notation named', () => {
    const rows = 'id,kind,attitude\nA,bedding,120/45\nB,bedding,030/45';
    expectDeepClose(read(rows, { planeNotation: 'dipdir' }).map((s) => s.plane), [{ dipDirection: 120, dip: 45 }, { dipDirection: 30, dip: 45 }], 1e-12);
    expectDeepClose(read(rows, { planeNotation: 'rhr' }).map((s) => s.plane), [{ dipDirection: 210, dip: 45 }, { dipDirection: 120, dip: 45 }], 1e-12);
  });

  it('readStations reads trend/plunge columns, and lines in the attitude column as azimuth or quadrant bearing', () => {
    const s = read('id,kind,trend,plunge\nH1,hinge,125,20');
    expectDeepClose(s[0].line, { trend: 125, plunge: 20 }, 1e-12);
    // S55E is 180 - 55 = 125 (quadrant bearings, common practice).
    const t = read('id,kind,attitude\nH1,F1 hinge,S55E 20\nH2,lineation,125/20');
    expectDeepClose(t.map((x) => x.line), [{ trend: 125, plunge: 20 }, { trend: 125, plunge: 20 }], 1e-12);
    expect(t.map((x) => x.kind)).toEqual(['hinge', 'lineation']);
  });

  it('readStations turns a rake in a plane into a line: 60° from the RHR strike in 030/45 gives 080.7685/37.7612', () => {
    // Derived (REFERENCES.md): plunge = asin(sin dip · sin rake).
    const [s] = read('id,kind,strike,dip,rake\nF1,slickenline,030,45,60');
    expectDeepClose(s.line, { trend: 80.7685, plunge: 37.7612 }, 1e-4);
    expectDeepClose(s.plane, { dipDirection: 120, dip: 45 }, 1e-12);
    const [f] = read('id,kind,strike,dip,rake\nF2,fault,030,45,60');
    expectDeepClose(f.line, { trend: 80.7685, plunge: 37.7612 }, 1e-4);
  });

  it('readStations carries an overturned flag without changing the numbers', () => {
    const [s] = read('id,kind,dipdir,dip,overturned\nB1,bedding,120,70,OT');
    expect(s.plane).toEqual({ dipDirection: 120, dip: 70, overturned: true });
  });

  it('readStations reads a kind-less file as planes or lines from the columns filled, or a default kind', () => {
    expect(read('dipdir,dip\n120,40').map((s) => s.kind)).toEqual(['plane']);
    expect(read('trend,plunge\n120,40').map((s) => s.kind)).toEqual(['line']);
    expect(read('dipdir,dip\n120,40', { defaultKind: 'bedding' }).map((s) => s.kind)).toEqual(['bedding']);
    expect(read('dipdir,dip\n120,40').map((s) => s.id)).toEqual(['row-1']);
  });
});

describe('readStations(table, mapping, options) problems', () => {
  // Each row: a CSV with one bad row, and the problem expected (column, value, expected text pattern).
  const rows = [
    { name: 'dip 95', csv: 'id,kind,dipdir,dip\nA,bedding,120,95', column: 'dip', value: '95', expected: /a dip from 0 to 90/ },
    { name: 'dip direction 360', csv: 'id,kind,dipdir,dip\nA,bedding,360,45', column: 'dipdir', value: '360', expected: /less than 360/ },
    { name: 'a missing dip', csv: 'id,kind,dipdir,dip\nA,bedding,120,', column: 'dip', value: '', expected: /dip is missing/ },
    { name: 'an unknown kind word', csv: 'id,kind,dipdir,dip\nA,pebble,120,40', column: 'kind', value: 'pebble', expected: /a kind such as bedding/ },
    { name: 'a missing kind', csv: 'id,kind,dipdir,dip\nA,,120,40', column: 'kind', value: '', expected: /kind is missing/ },
    { name: 'a quadrant along the strike', csv: 'id,kind,strike,dip,quad\nA,bedding,030,45,NE', column: 'quad', value: 'NE', expected: /across strike 30: E, SE, S for dip direction 120/ },
    { name: 'a quadrant that does not hold the dip direction', csv: 'id,kind,dipdir,dip,quad\nA,bedding,120,45,NW', column: 'quad', value: 'NW', expected: /holds dip direction 120/ },
    { name: 'a strike not across the dip direction', csv: 'id,kind,dipdir,dip,strike\nA,bedding,120,45,100', column: 'strike', value: '100', expected: /right angles to dip direction 120/ },
    { name: 'a bare 120/45 read with auto', csv: 'id,kind,attitude\nA,bedding,030/45SE\nB,bedding,120/45', column: 'attitude', value: '120/45', expected: /dip direction\/dip|dipdir/ },
    { name: 'a latitude beyond 90 beside a longitude within it', csv: 'id,kind,dipdir,dip,lon,lat\nA,bedding,120,45,45.2,120.1', column: 'lat', value: '120.1', expected: /look swapped/ },
    { name: 'a longitude beyond 180', csv: 'id,kind,dipdir,dip,lon,lat\nA,bedding,120,45,200,45', column: 'lon', value: '200', expected: /a longitude from -180 to 180/ },
    { name: 'a decimal comma in a coordinate', csv: 'id;kind;dipdir;dip;lon;lat\nA;bedding;120;45;15,2;45.1', column: 'lon', value: '15,2', expected: /decimal point/ },
    { name: 'a field beyond the header', csv: 'id,kind,dipdir,dip\nA,bedding,120,45,extra', column: '(beyond the last column)', value: 'extra', expected: /no more fields than the header/ },
    { name: 'a fold sense that is not one', csv: 'id,kind,trend,plunge,fold sense\nA,hinge,120,20,upward', column: 'fold sense', value: 'upward', expected: /antiform, synform or unknown/ },
    { name: 'a row with plane and line values and no kind column', csv: 'dipdir,dip,trend,plunge\n120,40,100,20', column: 'kind', value: '', expected: /both plane and line values/ },
  ];
  for (const r of rows) {
    it(`readStations reports ${r.name} as a row problem naming column, value and what was expected`, () => {
      const stations = read(r.csv);
      const bad = stations[stations.length - 1];
      expect(bad.problems).toHaveLength(1);
      const p = bad.problems[0];
      expect({ row: p.row, column: p.column, value: p.value }).toEqual({ row: stations.length, column: r.column, value: r.value });
      expect(p.expected).toMatch(r.expected);
      expect(bad.plane).toBeUndefined();
      expect(bad.line).toBeUndefined();
      expect(isUsable(bad)).toBe(false);
      // The row is kept with every field as written.
      expect(Object.keys(bad.source).length).toBe(readCsv(r.csv).headers.length);
    });
  }

  it('readStations keeps every row and numbers problems by the row the user sees (header = row 0, blank rows counted)', () => {
    const stations = read('id,kind,dipdir,dip\nA,bedding,120,40\n\nB,bedding,120,95\nC,bedding,130,45');
    expect(stations.map((s) => [s.id, s.row, s.problems.length])).toEqual([
      ['A', 1, 0],
      ['B', 3, 1],
      ['C', 4, 0],
    ]);
    expect(describeProblem(stations[1].problems[0])).toBe('row 3, column dip: "95"; expected a dip from 0 to 90');
  });
});

describe('readStations(table, mapping, options) locations and corrections', () => {
  it('readStations converts UTM x/y to longitude and latitude with the CRS given', () => {
    const crs = builtInCrs(32633)!;
    const [s] = read('id,kind,dipdir,dip,easting,northing\nA,bedding,120,40,512000,4980000', { crs });
    const expected = toLonLat(512000, 4980000, crs);
    expect([s.lon, s.lat]).toEqual([expected.lon, expected.lat]);
    expectClose(s.lon!, 15.152, 0.001, 'lon'); // zone 33 central meridian 15°E, 12 km east
  });

  it('readStations reports x/y without a CRS, outside the CRS area, and swapped x/y', () => {
    const noCrs = read('id,kind,dipdir,dip,x,y\nA,bedding,120,40,512000,4980000');
    expect(noCrs[0].problems[0].expected).toMatch(/coordinate reference system for the x\/y columns/);
    const crs = builtInCrs(32633)!;
    const swapped = read('id,kind,dipdir,dip,x,y\nA,bedding,120,40,4980000,512000', { crs });
    expect(swapped[0].problems[0]).toMatchObject({ column: 'x', value: '4980000' });
    expect(swapped[0].problems[0].expected).toMatch(/x and y look swapped/);
    const outside = read('id,kind,dipdir,dip,x,y\nA,bedding,120,40,512000,-4980000', { crs });
    expect(outside[0].problems[0].expected).toBe('a point inside the area of use of EPSG:32633 (12°E to 18°E, 0°N to 84°N)');
  });

  it('readStations adds the WMM declination for magnetic north: 1.28° at 80°N 0°E on 2025-01-01 (NOAA WMM2025 test value)', () => {
    const [s] = read('id,kind,dipdir,dip,lon,lat,date\nA,bedding,100,30,0,80,2025-01-01', { north: 'magnetic' });
    expectAzimuth(s.plane!.dipDirection, 101.28, 0.01);
    expect(s.corrections).toHaveLength(1);
    expect(s.corrections![0]).toMatchObject({ type: 'magnetic-declination', source: 'WMM2025 at 2025-01-01' });
  });

  it('readStations applies a typed declination to planes and lines alike, and keeps it on the station', () => {
    const s = read('id,kind,dipdir,dip,trend,plunge\nA,bedding,100,30,,\nB,hinge,,,358,10', { north: 'magnetic', declination: -3 });
    expectAzimuth(s[0].plane!.dipDirection, 97, 1e-12);
    expectAzimuth(s[1].line!.trend, 355, 1e-12);
    expect(s[1].corrections).toEqual([{ type: 'user-declination', degrees: -3, source: 'declination given by the user' }]);
  });

  it('readStations reports a date outside the models, a date that is not ISO, and no location for magnetic north', () => {
    const s = read('id,kind,dipdir,dip,lon,lat,date\nA,bedding,100,30,15,45,2010-05-01\nB,bedding,100,30,15,45,05/01/2024\nC,bedding,100,30,,,2025-05-01', { north: 'magnetic' });
    expect(s[0].problems[0]).toMatchObject({ column: 'date', value: '2010-05-01' });
    expect(s[0].problems[0].expected).toMatch(/from 2014-12-15 to 2029-11-13/);
    expect(s[1].problems[0].expected).toMatch(/YYYY-MM-DD/);
    expect(s[2].problems[0].expected).toMatch(/a location, needed for the magnetic declination/);
  });

  it('readStations uses the default date when a row has none', () => {
    const [s] = read('id,kind,dipdir,dip,lon,lat\nA,bedding,100,30,0,80', { north: 'magnetic', date: new Date(Date.UTC(2025, 0, 1)) });
    expectAzimuth(s.plane!.dipDirection, 101.28, 0.01); // NOAA WMM2025 test value
  });

  it('readStations adds the grid convergence for grid north', () => {
    const crs = builtInCrs(32633)!;
    const [s] = read('id,kind,dipdir,dip,x,y\nA,bedding,100,30,700000,5000000', { crs, north: 'grid' });
    const gamma = gridConvergence(s.lon!, s.lat!, crs);
    // Derived: east of the central meridian in the north, γ ≈ Δλ sin φ > 0.
    expectClose(gamma, (s.lon! - 15) * Math.sin((s.lat! * Math.PI) / 180), 0.01, 'γ');
    expectAzimuth(s.plane!.dipDirection, 100 + gamma, 1e-9);
    expect(s.corrections![0].type).toBe('grid-convergence');
  });
});

describe('readStations never throws on arbitrary cells (fuzz)', () => {
  it('readStation(row, mapping, options) returns a Station for any text in any mapped column', () => {
    const cell = fc.oneof(fc.string({ maxLength: 12 }), fc.constantFrom('120', '95', '030/45SE', 'N30E 45SE', 'S55E 20', 'OT', 'NE', '1e400', '-0', '2025-06-01', 'bedding', 'hinge'));
    const headers = FIELDS.map((f) => `c_${f}`);
    const mapping: ColumnMapping = Object.fromEntries(FIELDS.map((f) => [f, `c_${f}`]));
    const crs = builtInCrs(32633)!;
    fc.assert(
      fc.property(fc.array(cell, { minLength: headers.length, maxLength: headers.length }), fc.constantFrom<StationReadOptions>({}, { crs, north: 'grid' }, { north: 'magnetic' }, { north: 'magnetic', declination: 2 }), (cells, options) => {
        const values = Object.fromEntries(headers.map((h, i) => [h, cells[i]]));
        const s = readStation({ row: 7, values }, mapping, options);
        expect(s.row).toBe(7);
        expect(s.source).toEqual(values);
        if (s.problems.length > 0) expect(s.plane === undefined && s.line === undefined).toBe(true);
        if (s.plane) expect(s.plane.dipDirection >= 0 && s.plane.dipDirection < 360 && s.plane.dip >= 0 && s.plane.dip <= 90).toBe(true);
        for (const p of s.problems) expect(typeof describeProblem(p)).toBe('string');
      }),
      { numRuns: fuzzRuns(1500) },
    );
  }, fuzzTimeout());

  it('parseNumberCell(text) reads decimal points and exponents, and refuses decimal commas', () => {
    expect(parseNumberCell(' 512034.5 ')).toBe(512034.5);
    expect(parseNumberCell('-1.5e3')).toBe(-1500);
    expect(parseNumberCell('45,3')).toBeUndefined();
    expect(parseNumberCell('')).toBeUndefined();
    expect(parseNumberCell('0x10')).toBeUndefined();
  });
});

describe('the sample map through the importer', () => {
  it('readStations(sample stations.csv) keeps every row, reads elevation_m, and flags exactly the planted bad rows', async () => {
    const { readFileSync } = await import('node:fs');
    const { readCsv } = await import('../../src/io/csvTable');
    const { detectColumns } = await import('../../src/io/columns');
    const { readStations } = await import('../../src/io/readStations');
    const truth = JSON.parse(readFileSync('sample-maps/korvane/truth.json', 'utf8')) as { plantedBadRows: unknown[]; counts: { stations?: number } };
    const table = readCsv(readFileSync('sample-maps/korvane/stations.csv', 'utf8'));
    const stations = readStations(table, detectColumns(table.headers).mapping);
    expect(stations.length).toBe(table.rows.length);
    expect(stations.filter((s) => s.problems.length > 0).length).toBe(truth.plantedBadRows.length);
    const good = stations.filter((s) => s.problems.length === 0);
    expect(good.every((s) => typeof s.elevation === 'number' && s.elevation > 600 && s.elevation < 1000)).toBe(true);
  });
});
