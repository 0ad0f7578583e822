import { describe, expect, it } from 'vitest';
import proj4 from 'proj4';
import { builtInCrs, toLonLat } from '../../src/io/crs';
import { ImportOptionsError, crsChoiceGroups, describeCrsText, toReadOptions } from '../../src/components/import/importOptions';

describe('toReadOptions', () => {
  it('toReadOptions(options) resolves the CRS text, parses the default date and keeps the notations', () => {
    const r = toReadOptions({ planeNotation: 'rhr', lineNotation: 'quadrant', north: 'magnetic', declination: 'wmm', crs: 'UTM 33N', date: '2025-06-01', defaultKind: 'bedding' });
    expect(r.crs?.code).toBe('EPSG:32633');
    expect(r.date?.toISOString()).toBe('2025-06-01T00:00:00.000Z');
    expect(r).toMatchObject({ planeNotation: 'rhr', lineNotation: 'quadrant', north: 'magnetic', declination: 'wmm', defaultKind: 'bedding' });
  });

  it('toReadOptions(options) reads any proj4 definition: the UTM 33N one converts as proj4 itself does', () => {
    // Outside reference: proj4 (the library) on its own, with the same definition.
    const def = '+proj=utm +zone=33 +datum=WGS84 +units=m +no_defs';
    const crs = toReadOptions({ planeNotation: 'auto', lineNotation: 'auto', north: 'true', crs: def }).crs!;
    expect(crs.proj4).toBe(def);
    const [lon, lat] = proj4(def, 'WGS84', [497342, 2721139]);
    const ours = toLonLat(497342, 2721139, crs);
    expect(ours.lon).toBeCloseTo(lon, 9);
    expect(ours.lat).toBeCloseTo(lat, 9);
    // And the zone's central meridian, 15°E, is where easting 500000 lies (UTM definition, common practice).
    expect(toLonLat(500000, 2721139, crs).lon).toBeCloseTo(15, 9);
  });

  it('toReadOptions(options) gives magnetic north the World Magnetic Model unless a declination is typed', () => {
    expect(toReadOptions({ planeNotation: 'auto', lineNotation: 'auto', north: 'magnetic' }).declination).toBe('wmm');
    expect(toReadOptions({ planeNotation: 'auto', lineNotation: 'auto', north: 'magnetic', declination: -3.5 }).declination).toBe(-3.5);
    expect(toReadOptions({ planeNotation: 'auto', lineNotation: 'auto', north: 'true', declination: 4 }).declination).toBeUndefined();
  });

  const bad: { name: string; options: Parameters<typeof toReadOptions>[0]; field: string; message: RegExp }[] = [
    { name: 'a CRS it does not know', options: { planeNotation: 'auto', lineNotation: 'auto', north: 'true', crs: 'Gauss 7' }, field: 'crs', message: /"Gauss 7" is not a CRS Foldlens can read/ },
    { name: 'an EPSG code not built in and not looked up', options: { planeNotation: 'auto', lineNotation: 'auto', north: 'true', crs: 'EPSG:2263' }, field: 'crs', message: /EPSG:2263 is not in the built-in table and has not been looked up in the EPSG index yet \(prepareCrs\)/ },
    { name: 'grid north without a projected CRS', options: { planeNotation: 'auto', lineNotation: 'auto', north: 'grid', crs: 'EPSG:4326' }, field: 'north', message: /grid north needs the projected coordinate system/ },
    { name: 'a default date that is not a date', options: { planeNotation: 'auto', lineNotation: 'auto', north: 'magnetic', date: '2025-02-30' }, field: 'date', message: /"2025-02-30" is not a date/ },
    { name: 'a declination beyond 180', options: { planeNotation: 'auto', lineNotation: 'auto', north: 'magnetic', declination: 200 }, field: 'declination', message: /200 is not a declination/ },
  ];
  for (const b of bad) {
    it(`toReadOptions(options) refuses ${b.name}, naming the option`, () => {
      try {
        toReadOptions(b.options);
        expect.fail('accepted');
      } catch (e) {
        expect(e).toBeInstanceOf(ImportOptionsError);
        expect((e as ImportOptionsError).field).toBe(b.field);
        expect((e as Error).message).toMatch(b.message);
      }
    });
  }
});

describe('crsChoiceGroups', () => {
  it('crsChoiceGroups() offers every WGS 84 UTM zone by name, e.g. "WGS 84 / UTM zone 33N" for EPSG:32633', () => {
    const groups = crsChoiceGroups();
    const north = groups.find((g) => g.label === 'UTM, WGS 84, north')!;
    expect(north.choices.length).toBe(60);
    expect(north.choices.find((c) => c.value === 'EPSG:32633')?.label).toBe('WGS 84 / UTM zone 33N');
    expect(groups.find((g) => g.label === 'UTM, WGS 84, south')!.choices[0]).toEqual({ value: 'EPSG:32701', label: 'WGS 84 / UTM zone 1S' });
  });

  it('crsChoiceGroups() offers the national grids built into crs.ts under their own names', () => {
    const grids = crsChoiceGroups().find((g) => g.label === 'National and regional grids')!.choices;
    expect(grids.find((c) => c.value === 'EPSG:27700')?.label).toBe(builtInCrs(27700)!.name);
    expect(grids.every((c) => toReadOptions({ planeNotation: 'auto', lineNotation: 'auto', north: 'true', crs: c.value }).crs !== undefined)).toBe(true);
  });

  it('describeCrsText(text) names a CRS or says why it cannot be used', () => {
    expect(describeCrsText('utm 33n')).toEqual({ ok: true, text: 'WGS 84 / UTM zone 33N (EPSG:32633)' });
    expect(describeCrsText('+proj=longlat +datum=WGS84').text).toMatch(/^proj4 definition \(longitude\/latitude\)/);
    expect(describeCrsText('EPSG:2263')).toMatchObject({ ok: false });
  });
});
