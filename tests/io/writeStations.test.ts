import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import Papa from 'papaparse';
import { readCsv } from '../../src/io/csvTable';
import { detectColumns } from '../../src/io/columns';
import { readStations } from '../../src/io/readStations';
import { readGeoJsonStations } from '../../src/io/readGeoJson';
import { stationsToCsv, stationsToGeoJson } from '../../src/io/writeStations';
import { addedColumns, describeCorrection, normalisedValues } from '../../src/io/normalisedColumns';
import { builtInCrs } from '../../src/io/crs';
import { parsePlane } from '../../src/core/notation';
import { expectDeepClose } from '../helpers/tolerance';

const FIELD_CSV = [
  'Station,Type,Strike,Dip,Quad,Trend,Plunge,E,N,Notes',
  'K1,bedding,008,12,E,,,512000,4980000,"Coe fig. 2.6, ""008/12E"""',
  'K2,S0,030,45,,,,512100,4980100, leading space',
  '',
  'K3,F1 hinge,,,,125,20,512200,4980200,',
  'K4,bedding,030,95,,,,512300,4980300,typo',
].join('\n');

describe('stationsToCsv(table, stations, options)', () => {
  const table = readCsv(FIELD_CSV);
  const mapping = detectColumns(table.headers).mapping;
  const crs = builtInCrs(32633)!;
  const stations = readStations(table, mapping, { crs });

  it('stationsToCsv keeps every original column and row exactly, blank rows included, and adds dip direction/dip', () => {
    const out = stationsToCsv(table, stations, { planeFormat: 'dipdir', location: true });
    const parsed = Papa.parse<string[]>(out, { skipEmptyLines: false }).data;
    const header = parsed[0];
    expect(header.slice(0, table.headers.length)).toEqual(table.headers);
    expect(header.slice(table.headers.length)).toEqual(['fl_kind', 'fl_dip_direction', 'fl_dip', 'fl_trend', 'fl_plunge', 'fl_lon', 'fl_lat', 'fl_problems']);
    // Input rows 1..5 (row 3 blank) are output rows 1..5: the same numbers in messages.
    expect(parsed.length).toBe(6);
    expect(parsed[3].every((v) => v === '')).toBe(true);
    const original = Papa.parse<string[]>(FIELD_CSV, { skipEmptyLines: false }).data;
    for (const n of [1, 2, 4, 5]) expect(parsed[n].slice(0, table.headers.length)).toEqual(original[n]);
    const col = (name: string, n: number): string => parsed[n][header.indexOf(name)];
    // 008/12E is 098/12 (Coe 2010, fig. 2.6); 030/45 by the right-hand rule is 120/45 (common practice).
    expect([col('fl_dip_direction', 1), col('fl_dip', 1)]).toEqual(['98', '12']);
    expect([col('fl_dip_direction', 2), col('fl_dip', 2)]).toEqual(['120', '45']);
    expect([col('fl_trend', 4), col('fl_plunge', 4), col('fl_kind', 4)]).toEqual(['125', '20', 'hinge']);
    expect(col('fl_problems', 5)).toBe('row 5, column Dip: "95"; expected a dip from 0 to 90');
    expect(col('fl_dip_direction', 5)).toBe('');
  });

  it('stationsToCsv writes the right-hand-rule strike with planeFormat rhr and text with strike-quadrant', () => {
    const rhr = Papa.parse<Record<string, string>>(stationsToCsv(table, stations, { planeFormat: 'rhr' }), { header: true }).data;
    expect(rhr.map((r) => r.fl_strike)).toEqual(['8', '30', '', '', '']);
    const sq = Papa.parse<Record<string, string>>(stationsToCsv(table, stations, { planeFormat: 'strike-quadrant', decimals: 0 }), { header: true }).data;
    // Coe (2010) fig. 2.6 writes this plane as 008/12E; formatPlane writes the quarter holding 098, SE.
    expect(sq[0].fl_plane).toBe('008/12SE');
    expect(parsePlane(sq[0].fl_plane, 'strike-quadrant')).toEqual({ dipDirection: 98, dip: 12 });
  });

  it('stationsToCsv output read again gives the same stations (round trip)', () => {
    const again = readCsv(stationsToCsv(table, stations, { planeFormat: 'dipdir' }));
    expect(again.delimiter).toBe(table.delimiter);
    const back = readStations(again, mapping, { crs });
    expect(back.map((s) => ({ ...s, source: undefined }))).toEqual(stations.map((s) => ({ ...s, source: undefined })));
    for (const [i, s] of back.entries()) for (const h of table.headers) expect(s.source[h]).toBe(stations[i].source[h]);
    // The added columns alone, read as dip direction/dip, give the planes back.
    const fromAdded = readStations(again, { kind: 'fl_kind', dipDirection: 'fl_dip_direction', dip: 'fl_dip', trend: 'fl_trend', plunge: 'fl_plunge' });
    expectDeepClose(fromAdded.filter((s) => s.plane).map((s) => s.plane), stations.filter((s) => s.plane).map((s) => s.plane), 0.005);
  });

  it('stationsToCsv keeps the delimiter of the input and any quoted text (property)', () => {
    const note = fc.string({ unit: fc.constantFrom('a', ' ', ',', ';', '"', '\n', 'é', '='), maxLength: 10 });
    fc.assert(
      fc.property(fc.constantFrom(',', ';', '\t'), fc.array(note, { minLength: 1, maxLength: 5 }), (delimiter, notes) => {
        const text = Papa.unparse({ fields: ['id', 'dipdir', 'dip', 'notes'], data: notes.map((n, i) => [`S${i}`, '120', '40', n]) }, { delimiter, newline: '\n' });
        const t = readCsv(text, { delimiter });
        const out = readCsv(stationsToCsv(t, readStations(t, detectColumns(t.headers).mapping), { planeFormat: 'dipdir' }), { delimiter });
        expect(out.rows.map((r) => r.values.notes)).toEqual(notes);
      }),
      { numRuns: 200 },
    );
  });

  it('stationsToCsv gives an added column a new name when the input already has one like it', () => {
    const t = readCsv('id,dipdir,dip,fl_dip\nA,120,40,x');
    const out = readCsv(stationsToCsv(t, readStations(t, { dipDirection: 'dipdir', dip: 'dip' }), { planeFormat: 'dipdir' }));
    expect(out.headers).toEqual(['id', 'dipdir', 'dip', 'fl_dip', 'fl_kind', 'fl_dip_direction', 'fl_dip_2', 'fl_trend', 'fl_plunge', 'fl_problems']);
    expect(out.rows[0].values.fl_dip).toBe('x');
    expect(out.rows[0].values.fl_dip_2).toBe('40');
  });

  it('stationsToCsv keeps fields beyond the header in fl_extra_fields', () => {
    const t = readCsv('id,dipdir,dip\nA,120,40,surplus,more');
    const out = readCsv(stationsToCsv(t, readStations(t, { dipDirection: 'dipdir', dip: 'dip' }), { planeFormat: 'dipdir' }));
    expect(JSON.parse(out.rows[0].values.fl_extra_fields)).toEqual(['surplus', 'more']);
  });
});

describe('stationsToGeoJson(stations, options)', () => {
  it('stationsToGeoJson writes RFC 7946 Points that readGeoJsonStations reads back to the same stations', () => {
    const table = readCsv(FIELD_CSV);
    const mapping = detectColumns(table.headers).mapping;
    const stations = readStations(table, mapping, { crs: builtInCrs(32633)! });
    const geojson = stationsToGeoJson(stations, { planeFormat: 'dipdir' });
    expect(geojson.type).toBe('FeatureCollection');
    expect(geojson.features).toHaveLength(stations.length);
    const f0 = geojson.features[0];
    expect(f0.geometry?.type).toBe('Point');
    expect(f0.properties).toMatchObject({ Station: 'K1', fl_id: 'K1', fl_row: 1, fl_kind: 'bedding', fl_dip_direction: 98, fl_dip: 12 });
    // RFC 7946 §3.1.1: positions are [longitude, latitude].
    expect(f0.geometry?.coordinates).toEqual([stations[0].lon, stations[0].lat]);
    const back = readGeoJsonStations(JSON.stringify(geojson), {}, { id: 'Station', kind: 'Type', strike: 'Strike', dip: 'Dip', dipQuadrant: 'Quad' }).stations;
    expect(back.map((s) => [s.id, s.lon, s.lat])).toEqual(stations.map((s) => [s.id, s.lon, s.lat]));
    expectDeepClose(back[0].plane, stations[0].plane, 1e-12);
  });

  it('stationsToGeoJson gives a station without a location a null geometry', () => {
    const t = readCsv('id,dipdir,dip\nA,120,40');
    const g = stationsToGeoJson(readStations(t, { dipDirection: 'dipdir', dip: 'dip' }), { planeFormat: 'dipdir' });
    expect(g.features[0].geometry).toBeNull();
  });
});

describe('normalised columns', () => {
  it('addedColumns(...) adds fl_overturned and fl_corrections only when some station needs them', () => {
    const t = readCsv('id,dipdir,dip,ot\nA,120,40,OT');
    const s = readStations(t, { dipDirection: 'dipdir', dip: 'dip', overturned: 'ot' }, { north: 'magnetic', declination: 2 });
    expect(addedColumns(t.headers, s, { planeFormat: 'dipdir' }).map((c) => c.name)).toEqual([
      'fl_kind', 'fl_dip_direction', 'fl_dip', 'fl_overturned', 'fl_trend', 'fl_plunge', 'fl_corrections', 'fl_problems',
    ]);
    expect(normalisedValues(s[0], { planeFormat: 'dipdir' })).toMatchObject({ fl_dip_direction: 122, fl_overturned: 'yes', fl_corrections: 'user-declination +2.00 (declination given by the user)' });
  });

  it('normalisedValues(...) rounds a dip direction of 359.999 to 0, never 360', () => {
    const t = readCsv('id,dipdir,dip\nA,359.999,40');
    const [s] = readStations(t, { dipDirection: 'dipdir', dip: 'dip' });
    expect(normalisedValues(s, { planeFormat: 'dipdir' }).fl_dip_direction).toBe(0);
    expect(normalisedValues(s, { planeFormat: 'dipdir', decimals: 3 }).fl_dip_direction).toBe(359.999);
  });

  it('describeCorrection(c) writes the sign and two decimals', () => {
    expect(describeCorrection({ type: 'magnetic-declination', degrees: 2.314, source: 'WMM2025 at 2025-06-01' })).toBe('magnetic-declination +2.31 (WMM2025 at 2025-06-01)');
  });
});
