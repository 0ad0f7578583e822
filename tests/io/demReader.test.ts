import { readFileSync } from 'node:fs';
import { beforeAll, describe, expect, it } from 'vitest';
import { fromArrayBuffer, writeArrayBuffer, type GeotiffWriterMetadata } from 'geotiff';
import { DemError, readDem } from '../../src/io/dem';
import { createDem, demExtent, isNoData, sampleDem, type Dem } from '../../src/io/demSampler';
import { stations } from '../../sample-maps/korvane/index';
import truth from '../../sample-maps/korvane/truth.json';
import { expectClose } from '../helpers/tolerance';

const korvaneBytes = readFileSync('sample-maps/korvane/dem.tif');

/** Raw heights of the Korvane DEM read by geotiff.js directly (the outside reader). */
async function rawKorvane(): Promise<Float32Array> {
  const tiff = await fromArrayBuffer(korvaneBytes.buffer.slice(korvaneBytes.byteOffset, korvaneBytes.byteOffset + korvaneBytes.byteLength) as ArrayBuffer);
  const [values] = (await (await tiff.getImage()).readRasters()) as unknown as [Float32Array];
  return values;
}

/** A small GeoTIFF written with geotiff.js for the georeferencing cases. */
function tiff(values: number[], width: number, height: number, extra: Partial<GeotiffWriterMetadata>): Uint8Array {
  const metadata: GeotiffWriterMetadata = {
    width,
    height,
    ModelPixelScale: [10, 10, 0],
    ModelTiepoint: [0, 0, 0, 1000, 2000, 0],
    GTModelTypeGeoKey: 1,
    ProjectedCSTypeGeoKey: 32633,
    ...extra,
  };
  return new Uint8Array(writeArrayBuffer(new Float32Array(values), metadata));
}

describe('readDem(Korvane dem.tif)', () => {
  let dem: Dem;
  let raw: Float32Array;
  beforeAll(async () => {
    dem = await readDem(korvaneBytes, { source: 'dem.tif' });
    raw = await rawKorvane();
  });

  it('readDem reads the georeferencing documented in truth.json: 150 x 100 cells of 40 m, first cell centre half a cell in from E 497000, N 2725000 (pixel is area), EPSG:32633', () => {
    expect([dem.width, dem.height, dem.dx, dem.dy]).toEqual([truth.dem.cols, truth.dem.rows, truth.dem.cellSize, truth.dem.cellSize]);
    // GeoTIFF 1.0 §2.5.2.2: with RasterPixelIsArea the tie point is the corner of the cell, so its centre is half a cell in.
    expect([dem.x0, dem.y0]).toEqual([truth.dem.topLeftCorner[0] + 20, truth.dem.topLeftCorner[1] - 20]);
    expect(dem.epsg).toBe(truth.crs.epsg);
    expect(dem.geographic).toBe(false);
    expect(dem.noData).toBeNull();
    expect(demExtent(dem)).toEqual([497000, 2721000, 503000, 2725000]);
  });

  it('sampleDem at every cell centre returns the value geotiff.js reads directly for that cell', () => {
    for (let r = 0; r < dem.height; r += 7) {
      for (let c = 0; c < dem.width; c += 5) {
        const x = 497000 + 40 * c + 20;
        const y = 2725000 - 40 * r - 20;
        expect(sampleDem(dem, x, y)).toBe(raw[r * 150 + c]);
      }
    }
  });

  it('sampleDem between cell centres matches the bilinear formula computed by hand from the four raw values', () => {
    // Bilinear interpolation on the unit square (common practice): f = (1-tx)(1-ty) f00 + tx(1-ty) f10 + (1-tx) ty f01 + tx ty f11.
    const rows = [
      { c: 10, r: 20, tx: 0.25, ty: 0.75 },
      { c: 74, r: 49, tx: 0.5, ty: 0.5 },
      { c: 148, r: 98, tx: 0.9, ty: 0.1 },
    ];
    for (const { c, r, tx, ty } of rows) {
      const f = (cc: number, rr: number) => raw[rr * 150 + cc];
      const expected = (1 - tx) * (1 - ty) * f(c, r) + tx * (1 - ty) * f(c + 1, r) + (1 - tx) * ty * f(c, r + 1) + tx * ty * f(c + 1, r + 1);
      const x = 497000 + 40 * (c + tx) + 20;
      const y = 2725000 - 40 * (r + ty) - 20;
      expectClose(sampleDem(dem, x, y)!, expected, 1e-9, `cell (${c}, ${r}) + (${tx}, ${ty})`);
    }
  });

  it('sampleDem gives the elevation_m column of the sample stations to the nearest metre (the generator sampled the same DEM)', () => {
    const swapped = new Set(truth.plantedBadRows.filter((b) => b.defect === 'coordinates-swapped').map((b) => b.id));
    for (const s of stations.filter((row) => !swapped.has(row.station_id))) {
      const z = sampleDem(dem, Number(s.easting), Number(s.northing));
      expect(z, s.station_id).not.toBeNull();
      expect(Math.abs(z! - Number(s.elevation_m)), s.station_id).toBeLessThanOrEqual(0.5 + 1e-9);
    }
  });

  it('sampleDem returns null outside the grid and holds the edge value in the outer half cell', () => {
    expect(sampleDem(dem, 496999, 2723000)).toBeNull();
    expect(sampleDem(dem, 500000, 2725000.01)).toBeNull();
    // Between the edge (E 497000) and the first centre (E 497020) the first column's value is kept.
    expect(sampleDem(dem, 497005, 2725000 - 20)).toBe(raw[0]);
    expect(sampleDem(dem, 497000, 2721000)).toBe(raw[99 * 150]);
  });
});

describe('readDem georeferencing and no data (small GeoTIFFs written with geotiff.js)', () => {
  it('readDem of a PixelIsPoint grid puts the first cell centre at the tie point itself (GeoTIFF 1.0 §2.5.2.2)', async () => {
    const area = await readDem(tiff([1, 2, 3, 4, 5, 6], 3, 2, { GTRasterTypeGeoKey: 1 }));
    const point = await readDem(tiff([1, 2, 3, 4, 5, 6], 3, 2, { GTRasterTypeGeoKey: 2 }));
    expect([area.x0, area.y0]).toEqual([1005, 1995]);
    expect([point.x0, point.y0]).toEqual([1000, 2000]);
    expect(sampleDem(point, 1000, 2000)).toBe(1);
    expect(sampleDem(area, 1000, 2000)).toBe(1); // the corner of cell 0 holds its value
    // Halfway between the centres of cells (0,0) and (1,0) in each convention.
    expect(sampleDem(point, 1005, 2000)).toBe(1.5);
    expect(sampleDem(area, 1010, 1995)).toBe(1.5);
  });

  it('readDem with a tie point at another raster position (I, J) = (1, 1) shifts the grid accordingly', async () => {
    const dem = await readDem(tiff([1, 2, 3, 4, 5, 6], 3, 2, { GTRasterTypeGeoKey: 1, ModelTiepoint: [1, 1, 0, 1010, 1990, 0] }));
    // Raster (1, 1) is at (1010, 1990), so raster (0, 0) is at (1000, 2000) again (X = X_tie + (i - I) Sx).
    expect([dem.x0, dem.y0]).toEqual([1005, 1995]);
  });

  it('readDem reads GDAL_NODATA and sampleDem returns null next to a no-data cell but a value at a good cell centre', async () => {
    const dem = await readDem(tiff([10, -9999, 30, 40, 50, 60], 3, 2, { GTRasterTypeGeoKey: 1, GDAL_NODATA: '-9999' }));
    expect(dem.noData).toBe(-9999);
    expect(isNoData(dem, -9999)).toBe(true);
    expect(sampleDem(dem, 1015, 1995)).toBeNull(); // the no-data cell's centre
    expect(sampleDem(dem, 1010, 1995)).toBeNull(); // half its weight
    expect(sampleDem(dem, 1005, 1995)).toBe(10); // exactly on a good centre: the neighbour has no weight
    expect(sampleDem(dem, 1015, 1985)).toBe(50);
  });

  it('readDem leaves the EPSG code undefined for a user-defined CRS (32767) and reads a geographic grid', async () => {
    const user = await readDem(tiff([1, 2, 3, 4], 2, 2, { ProjectedCSTypeGeoKey: 32767 }));
    expect(user.epsg).toBeUndefined();
    const geo = await readDem(
      tiff([1, 2, 3, 4], 2, 2, { ProjectedCSTypeGeoKey: undefined, GeographicTypeGeoKey: 4326, GTModelTypeGeoKey: 2, ModelPixelScale: [0.001, 0.001, 0], ModelTiepoint: [0, 0, 0, 15, 24.6, 0] }),
    );
    expect(geo.epsg).toBe(4326);
    expect(geo.geographic).toBe(true);
  });

  it('readDem rejects bytes that are not a TIFF and a band that does not exist, naming the file', async () => {
    await expect(readDem(new Uint8Array([1, 2, 3, 4, 5, 6, 7, 8]), { source: 'broken.tif' })).rejects.toThrow(DemError);
    await expect(readDem(new Uint8Array([1, 2, 3, 4, 5, 6, 7, 8]), { source: 'broken.tif' })).rejects.toThrow(/broken\.tif is not a GeoTIFF/);
    await expect(readDem(korvaneBytes, { source: 'dem.tif', band: 2 })).rejects.toThrow(/dem\.tif: band 2 does not exist; the file has 1 band/);
  });
});

describe('createDem', () => {
  it('createDem checks that the values fill the grid and that cell sizes are finite and non-zero', () => {
    const base = { width: 2, height: 2, values: new Float32Array(4), x0: 0, y0: 0, dx: 1, dy: 1, noData: null };
    expect(() => createDem({ ...base, values: new Float32Array(3) })).toThrow(/3 values for a 2 x 2 grid; expected 4/);
    expect(() => createDem({ ...base, dx: 0 })).toThrow(/cell size dx 0/);
    expect(() => createDem({ ...base, width: 1.5 })).toThrow(/is not a grid/);
    expect(sampleDem(createDem({ ...base, values: new Float32Array([1, 2, 3, 4]), x0: 5, y0: 15, dx: 10, dy: 10 }), 10, 10)).toBe(2.5);
  });
});
