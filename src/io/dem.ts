import { fromArrayBuffer } from 'geotiff';
import { createDem, type Dem, type DemValues } from './demSampler';

/**
 * Reading a GeoTIFF terrain model (one band of heights) with geotiff.js into a plain {@link Dem}.
 *
 * Georeferencing (GeoTIFF 1.0 specification, sections 2.5.2.2 "Raster Space" and 2.6.1
 * "Coordinate Transformations"; OGC GeoTIFF 1.1, 19-008r4, the same rules):
 * - ModelTiepoint (I, J, K, X, Y, Z) ties raster point (I, J) to model point (X, Y), and
 *   ModelPixelScale (Sx, Sy, Sz) gives X = X_tie + (i - I)·Sx, Y = Y_tie - (j - J)·Sy.
 *   A ModelTransformation matrix without rotation is read the same way; rotated or sheared
 *   grids, and grids tied by several tie points, are refused with a message.
 * - GTRasterTypeGeoKey = 1 (RasterPixelIsArea, the default when absent) puts raster point
 *   (0, 0) at the top-left CORNER of the top-left cell, so the centre of cell (c, r) is at
 *   raster (c + 0.5, r + 0.5); 2 (RasterPixelIsPoint) puts raster (0, 0) at the CENTRE of that
 *   cell, so cell (c, r) is at raster (c, r).
 * - The no-data value is the GDAL_NODATA tag (ASCII, the convention of GDAL), when present.
 * - The CRS is ProjectedCSTypeGeoKey, or GeographicTypeGeoKey for a longitude/latitude grid;
 *   other codes (user-defined, 32767) leave `epsg` undefined for the caller to supply.
 */

/** Options of {@link readDem}. */
export interface ReadDemOptions {
  /** Band to read, counted from 1. Default 1. */
  readonly band?: number;
  /** Name of the file, for messages. */
  readonly source?: string;
}

/**
 * The only error readDem throws: a file that is not a GeoTIFF terrain model it can use.
 * @example try { await readDem(new Uint8Array(4)); } catch (e) { (e as DemError).message }
 */
export class DemError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'DemError';
  }
}

const USER_DEFINED = 32767;

/**
 * Reads a GeoTIFF DEM from its bytes.
 * @example const dem = await readDem(readFileSync('dem.tif'), { source: 'dem.tif' }); sampleDem(dem, 500000, 2723000)
 */
export async function readDem(bytes: ArrayBuffer | Uint8Array, options: ReadDemOptions = {}): Promise<Dem> {
  const source = options.source ?? 'the DEM';
  const band = options.band ?? 1;
  const buffer = bytes instanceof Uint8Array ? (bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength) as ArrayBuffer) : bytes;
  let image;
  try {
    image = await (await fromArrayBuffer(buffer)).getImage(0);
  } catch (e) {
    throw new DemError(`${source} is not a GeoTIFF that can be read: ${(e as Error).message}`);
  }
  const width = tags(source, () => image.getWidth());
  const height = tags(source, () => image.getHeight());
  const samples = tags(source, () => image.getSamplesPerPixel());
  if (!(Number.isInteger(band) && band >= 1 && band <= samples)) throw new DemError(`${source}: band ${band} does not exist; the file has ${samples} band(s)`);

  const fd = tags(source, () => image.getFileDirectory());
  const scale = tags(source, () => fd.getValue('ModelPixelScale')) as ArrayLike<number> | undefined;
  const tie = tags(source, () => fd.getValue('ModelTiepoint')) as ArrayLike<number> | undefined;
  const matrix = tags(source, () => fd.getValue('ModelTransformation')) as ArrayLike<number> | undefined;
  const keys = tags(source, () => image.getGeoKeys() ?? {}) as Record<string, unknown>;
  const rasterType = keys.GTRasterTypeGeoKey ?? 1;
  if (rasterType !== 1 && rasterType !== 2) throw new DemError(`${source}: GTRasterTypeGeoKey ${String(rasterType)} is neither 1 (pixel is area) nor 2 (pixel is point)`);
  // Raster position of the centre of cell (0, 0).
  const centre = rasterType === 1 ? 0.5 : 0;

  let x0: number;
  let y0: number;
  let dx: number;
  let dy: number;
  if (scale && tie) {
    if (tie.length !== 6) throw new DemError(`${source}: ${tie.length / 6} tie points; only a single tie point with a pixel scale (an affine grid) can be used`);
    const [I, J, , X, Y] = Array.from(tie);
    [dx, dy] = [scale[0], scale[1]];
    x0 = X + (centre - I) * dx;
    y0 = Y - (centre - J) * dy;
  } else if (matrix && matrix.length >= 16) {
    const m = Array.from(matrix);
    // X = m0·i + m1·j + m3, Y = m4·i + m5·j + m7 (GeoTIFF 1.0 §2.6.1).
    if (m[1] !== 0 || m[4] !== 0) throw new DemError(`${source}: the grid is rotated or sheared (ModelTransformation); only north-up grids can be used`);
    dx = m[0];
    dy = -m[5];
    x0 = m[3] + centre * m[0];
    y0 = m[7] + centre * m[5];
  } else {
    throw new DemError(`${source}: no georeferencing (expected ModelPixelScale with ModelTiepoint, or ModelTransformation)`);
  }

  let values: DemValues;
  try {
    const rasters = (await image.readRasters({ samples: [band - 1] })) as unknown as DemValues[];
    values = rasters[0];
  } catch (e) {
    throw new DemError(`${source}: the heights could not be read: ${(e as Error).message}`);
  }
  const projected = keys.ProjectedCSTypeGeoKey;
  const geographicCode = keys.GeographicTypeGeoKey;
  const epsg =
    typeof projected === 'number' && projected !== USER_DEFINED
      ? projected
      : typeof geographicCode === 'number' && geographicCode !== USER_DEFINED && projected === undefined
        ? geographicCode
        : undefined;
  const geographic = keys.GTModelTypeGeoKey === 2 || (projected === undefined && geographicCode !== undefined);
  try {
    return createDem({ width, height, values, x0, y0, dx, dy, noData: image.getGDALNoData(), ...(epsg !== undefined && { epsg }), geographic, source });
  } catch (e) {
    throw new DemError((e as Error).message);
  }
}

/** A tag read through geotiff.js, which throws plain Errors for tags it cannot decode: here a DemError. */
function tags<T>(source: string, read: () => T): T {
  try {
    return read();
  } catch (e) {
    throw new DemError(`${source}: the GeoTIFF tags could not be read: ${(e as Error).message}`);
  }
}
