import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { detectColumns, headerKey, parseColumnMapping, COLUMN_SYNONYMS, FIELDS, type Field } from '../../src/io/columns';
import { fuzzRuns, fuzzTimeout } from '../helpers/fuzzRuns';

describe('detectColumns(headers)', () => {
  // Headers as they are commonly written in field spreadsheets (common practice), and the field each holds.
  const rows: { header: string; field: Field }[] = [
    { header: 'Station', field: 'id' },
    { header: 'STN', field: 'id' },
    { header: 'Locality', field: 'id' },
    { header: 'Type', field: 'kind' },
    { header: 'Structure', field: 'kind' },
    { header: 'Dip Dir', field: 'dipDirection' },
    { header: 'dip_direction', field: 'dipDirection' },
    { header: 'DD', field: 'dipDirection' },
    { header: 'Dip (°)', field: 'dip' },
    { header: 'Strike', field: 'strike' },
    { header: 'Dip Quadrant', field: 'dipQuadrant' },
    { header: 'Trend', field: 'trend' },
    { header: 'Plunge', field: 'plunge' },
    { header: 'Pitch', field: 'rake' },
    { header: 'Attitude', field: 'attitude' },
    { header: 'Easting', field: 'x' },
    { header: 'UTM_N', field: 'y' },
    { header: 'Longitude', field: 'lon' },
    { header: 'lng', field: 'lon' },
    { header: 'Lat', field: 'lat' },
    { header: 'Elev [m]', field: 'elevation' },
    { header: 'Z', field: 'elevation' },
    { header: 'elevation_m', field: 'elevation' }, // a unit written into the name, as in the sample map (common practice)
    { header: 'Date', field: 'date' },
    { header: 'Remarks', field: 'notes' },
    { header: 'OT', field: 'overturned' },
    { header: 'Fold sense', field: 'sense' },
  ];
  for (const { header, field } of rows) {
    it(`detectColumns(['${header}']) maps it to ${field}`, () => {
      const d = detectColumns([header]);
      expect(d.mapping).toEqual({ [field]: header });
      expect(d.issues).toEqual([]);
    });
  }

  it('detectColumns(headers) leaves columns it does not know unused, and says so', () => {
    const d = detectColumns(['id', 'dip', 'dipdir', 'geologist', 'weather']);
    expect(d.unused).toEqual(['geologist', 'weather']);
  });

  it('detectColumns(headers, overrides) lets an explicit column win over detection', () => {
    const d = detectColumns(['dip', 'corrected dip', 'dipdir'], { dip: 'corrected dip' });
    expect(d.mapping).toEqual({ dipDirection: 'dipdir', dip: 'corrected dip' });
    expect(d.unused).toEqual(['dip']);
    expect(d.issues).toEqual([]);
  });

  it('detectColumns(headers, overrides) matches an override case-insensitively when that is unique', () => {
    expect(detectColumns(['Dip', 'Azi'], { dip: 'dip', dipDirection: 'AZI' }).mapping).toEqual({ dipDirection: 'Azi', dip: 'Dip' });
  });

  it('detectColumns(headers, overrides) reports an override naming a column that is not there', () => {
    const d = detectColumns(['dip', 'dipdir'], { kind: 'Type' });
    expect(d.issues).toHaveLength(1);
    expect(d.issues[0].kind).toBe('missing-column');
    expect(d.issues[0].message).toBe('no column is named "Type" (given for kind); the columns are: "dip", "dipdir"');
  });

  it('detectColumns(headers, overrides) reports an override for a field that does not exist', () => {
    expect(detectColumns(['dip'], { dipp: 'dip' }).issues[0].kind).toBe('unknown-field');
  });

  it('detectColumns(headers) reports two columns naming one field instead of picking one', () => {
    const d = detectColumns(['dip', 'Dip angle', 'dipdir']);
    expect(d.mapping.dip).toBeUndefined();
    expect(d.issues).toEqual([
      { kind: 'ambiguous', field: 'dip', columns: ['dip', 'Dip angle'], message: 'columns "dip" and "Dip angle" could each be dip; say which one to use' },
    ]);
  });

  it('detectColumns(headers) reads "azimuth" as dip direction beside a dip and as trend beside a plunge', () => {
    expect(detectColumns(['azimuth', 'dip']).mapping).toEqual({ dipDirection: 'azimuth', dip: 'dip' });
    expect(detectColumns(['azimuth', 'plunge']).mapping).toEqual({ trend: 'azimuth', plunge: 'plunge' });
    expect(detectColumns(['Dip Dir', 'angle']).mapping).toEqual({ dipDirection: 'Dip Dir', dip: 'angle' });
    expect(detectColumns(['trend', 'inclination']).mapping).toEqual({ trend: 'trend', plunge: 'inclination' });
  });

  it('detectColumns(headers) reports "azimuth" and "angle" as ambiguous when nothing else says which', () => {
    const d = detectColumns(['azimuth', 'angle']);
    expect(d.mapping).toEqual({});
    expect(d.issues.map((i) => i.field)).toEqual(['dipDirection or trend', 'dip or plunge']);
  });

  it('headerKey(header) drops case, units in brackets and punctuation', () => {
    expect(headerKey('Dip-Dir (deg)')).toBe('dipdir');
    expect(headerKey('  Elevation [m a.s.l.] ')).toBe('elevation');
    expect(headerKey('Höhe')).toBe('höhe');
  });

  it('COLUMN_SYNONYMS gives every header key to one field only', () => {
    const owner = new Map<string, string>();
    for (const [field, keys] of Object.entries(COLUMN_SYNONYMS)) {
      for (const k of keys) {
        expect(owner.get(k), `"${k}" is listed for ${owner.get(k)} and ${field}`).toBeUndefined();
        owner.set(k, field);
        expect(headerKey(k)).toBe(k);
      }
    }
    expect(Object.keys(COLUMN_SYNONYMS).sort()).toEqual([...FIELDS].sort());
  });

  it('parseColumnMapping(JSON.parse(JSON.stringify(mapping))) gives the mapping back', () => {
    const { mapping } = detectColumns(['Station', 'Type', 'Dip Dir', 'Dip', 'E', 'N']);
    expect(parseColumnMapping(JSON.parse(JSON.stringify(mapping)))).toEqual(mapping);
  });

  it('parseColumnMapping(json) names a bad field or a value that is not a header name', () => {
    expect(() => parseColumnMapping({ slope: 'x' })).toThrow(/"slope" is not a field/);
    expect(() => parseColumnMapping({ dip: 3 })).toThrow(/the column for dip must be a header name/);
    expect(() => parseColumnMapping([])).toThrow(TypeError);
  });

  it('detectColumns(headers, overrides) never throws and maps each column at most once (fuzz)', () => {
    const word = fc.oneof(fc.string({ maxLength: 10 }), fc.constantFrom(...Object.values(COLUMN_SYNONYMS).flat(), 'azimuth', 'angle', 'Dip (°)'));
    fc.assert(
      fc.property(fc.uniqueArray(word, { maxLength: 8 }), fc.dictionary(fc.constantFrom(...FIELDS, 'bogus'), word, { maxKeys: 3 }), (headers, overrides) => {
        const d = detectColumns(headers, overrides);
        const used = Object.values(d.mapping);
        expect(new Set(used).size).toBe(used.length);
        for (const c of used) expect(headers).toContain(c);
        for (const [field, c] of Object.entries(overrides)) {
          if ((FIELDS as readonly string[]).includes(field) && headers.includes(c) && d.issues.every((i) => i.field !== field)) {
            expect(d.mapping[field as Field]).toBe(c);
          }
        }
      }),
      { numRuns: fuzzRuns(1500) },
    );
  }, fuzzTimeout());
});
