/**
 * dem.tif read back with geotiff.js (fromArrayBuffer), an outside reader, and its frame checked
 * through proj4.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { fromArrayBuffer } from 'geotiff';
import proj4 from 'proj4';
import truth from '../../sample-maps/korvane/truth.json';
import { bounds, stations } from '../../sample-maps/korvane/index';
import { makeSampleMap } from '../../scripts/sample-map/generate';

const bytes = readFileSync(new URL('../../sample-maps/korvane/dem.tif', import.meta.url));
const open = async () => (await fromArrayBuffer(bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength))).getImage();

describe('dem.tif', () => {
  it('fromArrayBuffer(dem.tif) gives 150 x 100 Float32 cells of 40 m with the top-left corner at E 497000, N 2725000 in EPSG:32633', async () => {
    const image = await open();
    expect(image.getWidth()).toBe(150);
    expect(image.getHeight()).toBe(100);
    expect(image.getSamplesPerPixel()).toBe(1);
    expect(image.getBitsPerSample()).toBe(32);
    expect(image.getSampleFormat()).toBe(3); // IEEE float (TIFF 6.0 SampleFormat)
    expect(image.getOrigin()).toEqual([497000, 2725000, 0]);
    expect(image.getResolution()).toEqual([40, -40, 0]);
    expect(image.getBoundingBox()).toEqual([497000, 2721000, 503000, 2725000]);
    const keys = image.getGeoKeys() as Record<string, unknown>;
    expect(keys.ProjectedCSTypeGeoKey).toBe(32633);
    expect(keys.GTModelTypeGeoKey).toBe(1); // projected
    expect(keys.GTRasterTypeGeoKey).toBe(1); // pixel is area
    expect(String(keys.GTCitationGeoKey)).toMatch(/SYNTHETIC/);
    expect(truth.dem).toMatchObject({ cols: 150, rows: 100, cellSize: 40, topLeftCorner: [497000, 2725000] });
  });

  it('fromArrayBuffer(dem.tif).readRasters() returns exactly the elevations makeSampleMap(truth.seed) computes', async () => {
    const image = await open();
    const [values] = (await image.readRasters()) as unknown as [Float32Array];
    const { dem } = makeSampleMap(truth.seed);
    expect(values).toBeInstanceOf(Float32Array);
    expect(Array.from(values)).toEqual(Array.from(dem.values));
    let lo = Infinity;
    let hi = -Infinity;
    for (const v of values) [lo, hi] = [Math.min(lo, v), Math.max(hi, v)];
    // The design asks for relief of about 300 m.
    expect(hi - lo).toBeGreaterThan(250);
    expect(hi - lo).toBeLessThan(350);
    expect(Math.round(lo * 100) / 100).toBe(truth.dem.minElevation);
    expect(Math.round(hi * 100) / 100).toBe(truth.dem.maxElevation);
  });

  it('bounds (index.ts) enclose the proj4 longitudes/latitudes of the whole frame edge to within 1e-6°, and E 500000 is 15°E', () => {
    const utm = proj4(truth.crs.proj4, 'WGS84');
    // UTM zone 33 has its central meridian at 15°E and a false easting of 500 km (common practice).
    expect(utm.forward([500000, 2723000])[0]).toBeCloseTo(15, 10);
    const edge: number[][] = [];
    for (let e = 497000; e <= 503000; e += 10) edge.push([e, 2721000], [e, 2725000]);
    for (let n = 2721000; n <= 2725000; n += 10) edge.push([497000, n], [503000, n]);
    const ll = edge.map((p) => utm.forward(p));
    const expected = [Math.min(...ll.map((c) => c[0])), Math.min(...ll.map((c) => c[1])), Math.max(...ll.map((c) => c[0])), Math.max(...ll.map((c) => c[1]))];
    // Outward: west/south no greater, east/north no smaller, and never more than 1e-6° away.
    [-1, -1, 1, 1].forEach((sign, i) => {
      expect(sign * (bounds[i] - expected[i])).toBeGreaterThanOrEqual(0);
      expect(Math.abs(bounds[i] - expected[i])).toBeLessThan(1e-6);
    });
    // The top edge bulges north at the central meridian: its latitude there exceeds that of the corners.
    expect(utm.forward([500000, 2725000])[1]).toBeGreaterThan(utm.forward([497000, 2725000])[1]);
    expect(bounds).toEqual(truth.frame.bounds);
  });

  it('the elevation_m of every station is the DEM elevation at its easting/northing to the nearest metre', async () => {
    const image = await open();
    const [values] = (await image.readRasters()) as unknown as [Float32Array];
    const swapped = new Set(truth.plantedBadRows.filter((r) => r.defect === 'coordinates-swapped').map((r) => r.id));
    for (const s of stations.filter((r) => !swapped.has(r.station_id))) {
      // Bilinear between cell centres, pixel-is-area.
      const fi = (Number(s.easting) - 497000) / 40 - 0.5;
      const fj = (2725000 - Number(s.northing)) / 40 - 0.5;
      const i = Math.floor(fi);
      const j = Math.floor(fj);
      const [tx, ty] = [fi - i, fj - j];
      const at = (ii: number, jj: number) => values[jj * 150 + ii];
      const z = (1 - tx) * (1 - ty) * at(i, j) + tx * (1 - ty) * at(i + 1, j) + (1 - tx) * ty * at(i, j + 1) + tx * ty * at(i + 1, j + 1);
      expect(Math.abs(Number(s.elevation_m) - z), s.station_id).toBeLessThanOrEqual(0.5 + 1e-9);
    }
  });
});
