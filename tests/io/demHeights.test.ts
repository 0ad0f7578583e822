import { readFileSync } from 'node:fs';
import { beforeAll, describe, expect, it } from 'vitest';
import proj4 from 'proj4';
import { builtInCrs } from '../../src/io/crs';
import { readDem } from '../../src/io/dem';
import { createDem, sampleDem, type Dem } from '../../src/io/demSampler';
import { lineworkHeights, stationHeights } from '../../src/io/elevations';
import { chooseLocalFrame, gridAxis, lonLatToLocal } from '../../src/io/localFrame';
import { LineworkError, readLinework } from '../../src/io/readLinework';
import truth from '../../sample-maps/korvane/truth.json';
import { expectClose } from '../helpers/tolerance';

const UTM33N = builtInCrs(32633)!;
let dem: Dem;
beforeAll(async () => {
  dem = await readDem(readFileSync('sample-maps/korvane/dem.tif'), { source: 'dem.tif' });
});

/** A Korvane position as longitude/latitude through proj4 (the outside reference). */
const lonLatOf = (e: number, n: number): [number, number] => proj4(truth.crs.proj4, 'WGS84', [e, n]) as [number, number];

describe('stationHeights(items, dem)', () => {
  it('stationHeights keeps a height given in the data, takes the DEM height otherwise, and lists stations with neither by id and row', () => {
    const [lon, lat] = lonLatOf(500000, 2723000);
    const [farLon, farLat] = lonLatOf(510000, 2723000);
    const result = stationHeights(
      [
        { id: 'A', row: 1, lon, lat, elevation: 812.5 },
        { id: 'B', row: 2, lon, lat },
        { id: 'C', row: 3, lon: farLon, lat: farLat },
        { id: 'D', row: 4 },
        { id: 'E', row: 5, x: 500000, y: 2723000 },
      ],
      { dem, crs: UTM33N },
      { xyCrs: UTM33N },
    );
    expect(result.heights[0]).toBe(812.5);
    expectClose(result.heights[1], sampleDem(dem, 500000, 2723000)!, 1e-6, 'B from the DEM');
    expect(Number.isNaN(result.heights[2])).toBe(true);
    expect(Number.isNaN(result.heights[3])).toBe(true);
    expect(result.heights[4]).toBe(sampleDem(dem, 500000, 2723000));
    expect(result.sources).toEqual(['data', 'dem', null, null, 'dem']);
    expect(result.missing.map((m) => m.id)).toEqual(['C', 'D']);
    expect(result.missing[0].message).toMatch(/^station C \(row 3\) has no elevation in the data, and it lies outside the DEM \(EPSG:32633 x 510000\.0, y 2723000\.0\)$/);
    expect(result.missing[1].message).toMatch(/station D \(row 4\) .* no location/);
  });

  it('stationHeights without a DEM names every station lacking an elevation instead of using zero', () => {
    const r = stationHeights([{ id: 'KR-9', row: 9, lon: 15, lat: 24.62 }]);
    expect(Number.isNaN(r.heights[0])).toBe(true);
    expect(r.missing[0].message).toBe('station KR-9 (row 9) has no elevation in the data, and no DEM was given to take one from');
  });

  it('stationHeights says when a station falls on a DEM cell without data', () => {
    const holey = createDem({ width: 2, height: 1, values: new Float32Array([Number.NaN, 5]), x0: 500000, y0: 2723000, dx: 40, dy: 40, noData: null });
    const [lon, lat] = lonLatOf(500000, 2723000);
    const r = stationHeights([{ id: 'H', lon, lat }], { dem: holey, crs: UTM33N });
    expect(r.missing[0].message).toMatch(/falls on a DEM cell without data/);
  });
});

describe('readLinework(text) and lineworkHeights(features, dem)', () => {
  const text = JSON.stringify({
    type: 'FeatureCollection',
    features: [
      { type: 'Feature', id: 'c-1', properties: { name: 'Base of <Quennet>' }, geometry: { type: 'LineString', coordinates: [[...lonLatOf(499000, 2722000), 700], lonLatOf(499040, 2722000), lonLatOf(520000, 2722000), lonLatOf(521000, 2722000)] } },
      { type: 'Feature', properties: { id: 7 }, geometry: { type: 'MultiLineString', coordinates: [[lonLatOf(501000, 2722000), lonLatOf(501100, 2722100)], [lonLatOf(502000, 2722000), lonLatOf(502100, 2722100)]] } },
    ],
  });

  it('readLinework keeps ids, names, parts and third coordinates (heights), NaN where none was given', () => {
    const f = readLinework(text);
    expect(f.map((x) => [x.feature, x.id, x.name, x.parts.length])).toEqual([
      [1, 'c-1', 'Base of <Quennet>', 1],
      [2, '7', undefined, 2],
    ]);
    expect(f[0].parts[0].heights[0]).toBe(700);
    expect(Number.isNaN(f[0].parts[0].heights[1])).toBe(true);
  });

  it('lineworkHeights takes the file height, else the DEM, and lists runs of vertices outside the DEM once per run', () => {
    const h = lineworkHeights(readLinework(text), { dem, crs: UTM33N });
    expect(h.heights[0][0][0]).toBe(700);
    expectClose(h.heights[0][0][1], sampleDem(dem, 499040, 2722000)!, 1e-6, 'second vertex from the DEM');
    expect(h.fromData).toBe(1);
    expect(h.fromDem).toBe(5);
    expect(h.missing).toHaveLength(1);
    expect(h.missing[0]).toMatchObject({ id: 'c-1', feature: 1, part: 1, vertices: [3, 4] });
    expect(h.missing[0].message).toBe('linework feature 1 (id c-1, Base of <Quennet>), vertices 3 to 4: no height in the file, and they lie outside the DEM');
  });

  it('readLinework rejects other geometries, projected coordinates and broken JSON, naming the feature and position', () => {
    expect(() => readLinework('{"type":"Feature","properties":{},"geometry":{"type":"Point","coordinates":[15,24]}}')).toThrow(/feature 1 is a Point; expected a LineString or MultiLineString/);
    expect(() => readLinework('{"type":"LineString","coordinates":[[499000,2722000],[499100,2722000]]}')).toThrow(/feature 1, position 1: \(499000, 2722000\) is not a longitude/);
    expect(() => readLinework('{"type":"LineString","coordinates":[[15,24]]}')).toThrow(/at least 2 positions/);
    expect(() => readLinework('{"type":"MultiLineString","coordinates":[[[15,24],[15,"x"]]]}')).toThrow(/feature 1, line 1, position 2/);
    expect(() => readLinework('{')).toThrow(LineworkError);
  });
});

describe('chooseLocalFrame and lonLatToLocal', () => {
  it('chooseLocalFrame(Korvane positions) picks UTM zone 33N and lonLatToLocal agrees with proj4 to a millimetre', () => {
    const pts = [lonLatOf(498000, 2722000), lonLatOf(502000, 2724000)];
    const frame = chooseLocalFrame(pts.flat());
    expect(frame.crs.code).toBe('EPSG:32633');
    const local = lonLatToLocal(frame, pts.flat(), [650, 900]);
    expectClose(local[0] + frame.originEasting, 498000, 1e-3, 'easting');
    expectClose(local[1] + frame.originNorthing, 2722000, 1e-3, 'northing');
    expect(local[2]).toBe(650);
    expectClose(local[3] + frame.originEasting, 502000, 1e-3, 'easting');
    expect(Number.isInteger(frame.originEasting) && Number.isInteger(frame.originNorthing)).toBe(true);
  });

  it('gridAxis turns a true-north axis by the grid convergence: truth.json west axis 074.994/12 is 075/12 on the grid', () => {
    const west = truth.domains[0];
    const frame = chooseLocalFrame(lonLatOf(498500, 2723000));
    // truth.json gives the grid azimuth of true north at the domain origin; grid = true + that angle.
    expectClose(frame.convergence, -west.gridAzimuthOfTrueNorthAtOrigin, 1e-4, 'convergence');
    expectClose(gridAxis(frame, west.axis).trend, west.axisGrid.trend, 1e-3, 'grid trend');
  });

  it('chooseLocalFrame without any finite position says so', () => {
    expect(() => chooseLocalFrame([Number.NaN, 1])).toThrow(/no point with a longitude and latitude/);
  });
});
