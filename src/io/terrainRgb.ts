import { createDem, type Dem } from './demSampler';

/**
 * Decoding terrain-RGB raster-dem tiles (heights packed into the red, green and blue bytes of
 * each pixel) given as RGBA arrays, so the raster-dem source of a map style can serve as a
 * terrain model. Pure: the browser code that fetches and unpacks the images is elsewhere.
 *
 * Formulas, height in metres from bytes R, G, B:
 * - "mapbox": h = -10000 + (R·256·256 + G·256 + B)·0.1 (Mapbox Terrain-RGB v1 tileset
 *   reference, docs.mapbox.com/data/tilesets/reference/mapbox-terrain-rgb-v1/).
 * - "terrarium": h = (R·256 + G + B/256) - 32768 (Tilezen joerd, docs/formats.md, "terrarium").
 * - custom: h = R·redFactor + G·greenFactor + B·blueFactor - baseShift (MapLibre style
 *   specification, raster-dem source, `encoding: "custom"`).
 * MapLibre GL JS decodes with the same factors (maplibre-gl 6 DEMData: mapbox 6553.6, 25.6,
 * 0.1, shift 10000; terrarium 256, 1, 1/256, shift 32768).
 *
 * A pixel with alpha 0 holds no data and decodes to NaN (a transparent pixel is not a height).
 */

/** Unpacking factors of a terrain-RGB encoding. */
export interface TerrainRgbFactors {
  readonly redFactor: number;
  readonly greenFactor: number;
  readonly blueFactor: number;
  readonly baseShift: number;
}

/** The encodings a raster-dem source names, or explicit factors. */
export type TerrainEncoding = 'mapbox' | 'terrarium' | TerrainRgbFactors;

/** A tile address in the XYZ scheme (y = 0 at the north). */
export interface TileAddress {
  readonly z: number;
  readonly x: number;
  readonly y: number;
}

/** Half the width of the Web Mercator square in metres: π · 6378137 (EPSG:3857, common practice). */
export const WEB_MERCATOR_HALF_WORLD = Math.PI * 6378137;

/**
 * The factors of an encoding.
 * @example terrainRgbFactors('terrarium') // { redFactor: 256, greenFactor: 1, blueFactor: 1 / 256, baseShift: 32768 }
 */
export function terrainRgbFactors(encoding: TerrainEncoding): TerrainRgbFactors {
  if (encoding === 'mapbox') return { redFactor: 256 * 256 * 0.1, greenFactor: 256 * 0.1, blueFactor: 0.1, baseShift: 10000 };
  if (encoding === 'terrarium') return { redFactor: 256, greenFactor: 1, blueFactor: 1 / 256, baseShift: 32768 };
  if (encoding && typeof encoding === 'object') {
    for (const k of ['redFactor', 'greenFactor', 'blueFactor', 'baseShift'] as const) {
      if (!Number.isFinite(encoding[k])) throw new RangeError(`terrain-RGB encoding: ${k} ${String(encoding[k])} is not a finite number`);
    }
    return { ...encoding };
  }
  throw new RangeError(`terrain-RGB encoding ${JSON.stringify(encoding)}: expected "mapbox", "terrarium" or custom factors`);
}

/**
 * Heights of every pixel of an RGBA array (4 bytes a pixel, row-major), NaN where alpha is 0.
 * @example decodeTerrainRgb(new Uint8Array([1, 134, 160, 255]), 'mapbox') // Float64Array [0]
 */
export function decodeTerrainRgb(rgba: Uint8Array | Uint8ClampedArray, encoding: TerrainEncoding): Float64Array {
  if (rgba.length % 4 !== 0) throw new RangeError(`terrain-RGB: ${rgba.length} bytes is not a whole number of RGBA pixels (4 bytes each)`);
  const f = terrainRgbFactors(encoding);
  // Mapbox's integer form first, then scaled: (R·65536 + G·256 + B)·0.1 loses less than summing scaled bytes.
  const mapbox = encoding === 'mapbox';
  const out = new Float64Array(rgba.length / 4);
  for (let i = 0, p = 0; i < out.length; i++, p += 4) {
    if (rgba[p + 3] === 0) {
      out[i] = Number.NaN;
      continue;
    }
    const r = rgba[p];
    const g = rgba[p + 1];
    const b = rgba[p + 2];
    out[i] = mapbox ? (r * 65536 + g * 256 + b) / 10 - 10000 : r * f.redFactor + g * f.greenFactor + b * f.blueFactor - f.baseShift;
  }
  return out;
}

/**
 * A terrain model from one decoded tile, in Web Mercator metres (EPSG:3857): the tile's square
 * is split into width × height cells (pixel is area), row 0 at the north.
 * @example const dem = demFromTerrainTile(rgba, 256, 256, { z: 12, x: 2218, y: 1755 }, 'terrarium')
 */
export function demFromTerrainTile(rgba: Uint8Array | Uint8ClampedArray, width: number, height: number, tile: TileAddress, encoding: TerrainEncoding): Dem {
  const { z, x, y } = tile;
  if (!(Number.isInteger(z) && z >= 0 && z <= 30)) throw new RangeError(`tile zoom ${z} is not a whole number from 0 to 30`);
  const n = 2 ** z;
  if (!(Number.isInteger(x) && x >= 0 && x < n && Number.isInteger(y) && y >= 0 && y < n)) {
    throw new RangeError(`tile ${z}/${x}/${y}: x and y must be whole numbers from 0 to ${n - 1} at zoom ${z}`);
  }
  if (rgba.length !== width * height * 4) throw new RangeError(`terrain tile ${z}/${x}/${y}: ${rgba.length} bytes for ${width} x ${height} RGBA pixels; expected ${width * height * 4}`);
  const size = (2 * WEB_MERCATOR_HALF_WORLD) / n;
  const dx = size / width;
  const dy = size / height;
  return createDem({
    width,
    height,
    values: decodeTerrainRgb(rgba, encoding),
    x0: -WEB_MERCATOR_HALF_WORLD + x * size + dx / 2,
    y0: WEB_MERCATOR_HALF_WORLD - y * size - dy / 2,
    dx,
    dy,
    noData: null,
    epsg: 3857,
    geographic: false,
    source: `terrain tile ${z}/${x}/${y}`,
  });
}
