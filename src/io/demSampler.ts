/**
 * A terrain model as a plain object, and bilinear sampling of it in its own CRS.
 *
 * The grid holds one value per cell; cell (c, r) (column c from the west, row r from the top)
 * has its CENTRE at x = x0 + c·dx, y = y0 - r·dy. Readers convert their own georeferencing to
 * this (dem.ts does it for GeoTIFF's PixelIsArea and PixelIsPoint; terrainRgb.ts for map tiles).
 *
 * Sampling (sampleDem): bilinear between the four surrounding cell centres (common practice;
 * the same weights as MapLibre's DEMData.sampleBilinear in maplibre-gl 6). Each cell
 * covers half a cell either side of its centre, so between the outermost centres and the edge
 * of the grid the value is held at the edge cells' values (clamped, not extrapolated). Outside
 * the grid, or where a cell with a non-zero weight holds no data, the answer is null: never 0.
 *
 * No DOM and no file access here, so the browser can build a Dem from raster-dem tiles.
 */

/** Numeric arrays a terrain grid may come in (what geotiff.js returns, or decoded tiles). */
export type DemValues = Float32Array | Float64Array | Int8Array | Uint8Array | Int16Array | Uint16Array | Int32Array | Uint32Array;

/** A terrain model: heights in metres on a regular grid in a projected or geographic CRS. */
export interface Dem {
  readonly width: number;
  readonly height: number;
  /** Row-major from the top row, width × height values. */
  readonly values: DemValues;
  /** x and y of the centre of cell (0, 0), in the DEM's CRS. */
  readonly x0: number;
  readonly y0: number;
  /** Cell size: x grows by dx per column, y falls by dy per row (both positive for a north-up grid). */
  readonly dx: number;
  readonly dy: number;
  /** Value that marks a cell without data (NaN cells are always without data). */
  readonly noData: number | null;
  /** EPSG code of the CRS, when known. */
  readonly epsg?: number;
  /** Whether x and y are longitude and latitude in degrees. */
  readonly geographic?: boolean;
  /** Where the model came from, for messages. */
  readonly source?: string;
}

/**
 * A Dem from its parts, checked: sizes agree, cell sizes are finite and non-zero.
 * @example createDem({ width: 2, height: 2, values: new Float32Array([1, 2, 3, 4]), x0: 5, y0: 15, dx: 10, dy: 10, noData: null })
 */
export function createDem(dem: Dem): Dem {
  const what = dem.source ?? 'the terrain model';
  if (!(Number.isInteger(dem.width) && dem.width >= 1 && Number.isInteger(dem.height) && dem.height >= 1)) {
    throw new RangeError(`${what}: size ${dem.width} x ${dem.height} is not a grid (whole numbers of at least 1)`);
  }
  if (dem.values.length !== dem.width * dem.height) {
    throw new RangeError(`${what}: ${dem.values.length} values for a ${dem.width} x ${dem.height} grid; expected ${dem.width * dem.height}`);
  }
  for (const k of ['x0', 'y0'] as const) if (!Number.isFinite(dem[k])) throw new RangeError(`${what}: ${k} ${dem[k]} is not a finite coordinate`);
  for (const k of ['dx', 'dy'] as const) {
    if (!Number.isFinite(dem[k]) || dem[k] === 0) throw new RangeError(`${what}: cell size ${k} ${dem[k]} is not a finite non-zero number`);
  }
  if (dem.noData !== null && typeof dem.noData !== 'number') throw new RangeError(`${what}: no-data value ${String(dem.noData)} is not a number`);
  return { ...dem };
}

/**
 * Bilinear height at (x, y) in the DEM's CRS, or null outside the grid or on cells without data.
 * @example sampleDem(dem, 10, 10) // mean of the four cell values of the 2 x 2 example above: 2.5
 */
export function sampleDem(dem: Dem, x: number, y: number): number | null {
  const fc = (x - dem.x0) / dem.dx;
  const fr = (dem.y0 - y) / dem.dy;
  // The grid covers half a cell beyond the outermost centres.
  if (!(fc >= -0.5 && fc <= dem.width - 0.5 && fr >= -0.5 && fr <= dem.height - 0.5)) return null;
  const c = Math.min(Math.max(fc, 0), dem.width - 1);
  const r = Math.min(Math.max(fr, 0), dem.height - 1);
  const c0 = Math.min(Math.floor(c), dem.width - 1);
  const r0 = Math.min(Math.floor(r), dem.height - 1);
  const c1 = Math.min(c0 + 1, dem.width - 1);
  const r1 = Math.min(r0 + 1, dem.height - 1);
  const tx = c - c0;
  const ty = r - r0;
  const v = dem.values;
  const w = dem.width;
  // Corners with zero weight are not read, so a no-data cell next to an exact hit does not spoil it.
  let sum = 0;
  const w00 = (1 - tx) * (1 - ty);
  const w10 = tx * (1 - ty);
  const w01 = (1 - tx) * ty;
  const w11 = tx * ty;
  if (w00 !== 0) {
    const z = v[r0 * w + c0];
    if (isNoData(dem, z)) return null;
    sum += w00 * z;
  }
  if (w10 !== 0) {
    const z = v[r0 * w + c1];
    if (isNoData(dem, z)) return null;
    sum += w10 * z;
  }
  if (w01 !== 0) {
    const z = v[r1 * w + c0];
    if (isNoData(dem, z)) return null;
    sum += w01 * z;
  }
  if (w11 !== 0) {
    const z = v[r1 * w + c1];
    if (isNoData(dem, z)) return null;
    sum += w11 * z;
  }
  return sum;
}

/**
 * Whether a raw grid value means "no data": NaN, or equal to the no-data value (also after
 * rounding that value to 32-bit float, as a Float32 grid stores it).
 * @example isNoData({ ...dem, noData: -9999 }, -9999) // true
 */
export function isNoData(dem: Pick<Dem, 'noData'>, value: number): boolean {
  if (Number.isNaN(value)) return true;
  const nd = dem.noData;
  return nd !== null && (value === nd || value === Math.fround(nd));
}

/**
 * The extent covered by the grid's cells, [minX, minY, maxX, maxY] in the DEM's CRS.
 * @example demExtent(dem) // [0, 0, 20, 20] for the 2 x 2 example
 */
export function demExtent(dem: Dem): [number, number, number, number] {
  const xa = dem.x0 - dem.dx / 2;
  const xb = dem.x0 + (dem.width - 0.5) * dem.dx;
  const ya = dem.y0 + dem.dy / 2;
  const yb = dem.y0 - (dem.height - 0.5) * dem.dy;
  return [Math.min(xa, xb), Math.min(ya, yb), Math.max(xa, xb), Math.max(ya, yb)];
}
