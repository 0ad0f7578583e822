import { CrsError, fromLonLat, toLonLat, type Crs } from './crs';
import { demExtent, sampleDem, type Dem } from './demSampler';
import type { LineworkFeature } from './readLinework';

/**
 * Giving every station and every linework vertex a height: the height in the data when there
 * is one, else the terrain model's height at the point. A point with neither gets NaN and is
 * listed, with a sentence naming it and why: a missing height is never taken as zero.
 */

/** A terrain model and the CRS its x and y are in. */
export interface DemInCrs {
  readonly dem: Dem;
  readonly crs: Crs;
}

/** Where a point is and what height the data gave it. */
export interface HeightQuery {
  readonly id: string;
  /** Row in the source file, for messages. */
  readonly row?: number;
  readonly lon?: number;
  readonly lat?: number;
  /** Map coordinates in `xyCrs` (used when lon/lat are absent). */
  readonly x?: number;
  readonly y?: number;
  readonly elevation?: number;
}

/** Where a height came from. */
export type HeightSource = 'data' | 'dem';

/** A point (or run of vertices) left without a height. */
export interface MissingHeight {
  /** Station id, or the linework feature's id. */
  readonly id: string;
  readonly row?: number;
  /** Linework only: feature number, part and vertex range (1-based, inclusive). */
  readonly feature?: number;
  readonly part?: number;
  readonly vertices?: readonly [number, number];
  readonly message: string;
}

/** Heights of stations, index for index. */
export interface StationHeights {
  /** Metres; NaN where none could be found. */
  readonly heights: Float64Array;
  readonly sources: readonly (HeightSource | null)[];
  readonly missing: readonly MissingHeight[];
}

/** Heights of linework vertices: heights[f][k][v] for feature f, part k, vertex v. */
export interface LineworkHeights {
  readonly heights: readonly (readonly Float64Array[])[];
  readonly fromData: number;
  readonly fromDem: number;
  readonly missing: readonly MissingHeight[];
}

/**
 * The height of each station: its elevation when given, else the DEM's (bilinear, in the DEM's
 * CRS after converting the station's position with proj4). `xyCrs` is the CRS of x/y positions.
 * @example stationHeights([{ id: 'KR-1', lon: 15, lat: 24.62 }], { dem, crs }).heights[0]
 */
export function stationHeights(items: readonly HeightQuery[], dem?: DemInCrs, options: { readonly xyCrs?: Crs } = {}): StationHeights {
  const heights = new Float64Array(items.length).fill(Number.NaN);
  const sources: (HeightSource | null)[] = [];
  const missing: MissingHeight[] = [];
  items.forEach((item, i) => {
    const who = `station ${item.id}${item.row !== undefined ? ` (row ${item.row})` : ''}`;
    if (item.elevation !== undefined && Number.isFinite(item.elevation)) {
      heights[i] = item.elevation;
      sources.push('data');
      return;
    }
    const found = demHeight(item, dem, options.xyCrs);
    if (typeof found === 'number') {
      heights[i] = found;
      sources.push('dem');
      return;
    }
    sources.push(null);
    missing.push({ id: item.id, ...(item.row !== undefined && { row: item.row }), message: `${who} has no elevation in the data, and ${found}` });
  });
  return { heights, sources, missing };
}

/**
 * The height of every vertex of every linework feature: the file's third coordinate when given,
 * else the DEM's. Vertices left without one are listed as runs per part.
 * @example lineworkHeights(readLinework(text), { dem, crs }).missing.length // 0 when all are covered
 */
export function lineworkHeights(features: readonly LineworkFeature[], dem?: DemInCrs): LineworkHeights {
  let fromData = 0;
  let fromDem = 0;
  const missing: MissingHeight[] = [];
  const heights = features.map((f) =>
    f.parts.map((part, k) => {
      const n = part.heights.length;
      const out = new Float64Array(n).fill(Number.NaN);
      const reasons: (string | null)[] = new Array(n).fill(null);
      for (let v = 0; v < n; v++) {
        if (Number.isFinite(part.heights[v])) {
          out[v] = part.heights[v];
          fromData++;
          continue;
        }
        const found = demHeight({ id: f.id, lon: part.lonLat[2 * v], lat: part.lonLat[2 * v + 1] }, dem, undefined);
        if (typeof found === 'number') {
          out[v] = found;
          fromDem++;
        } else reasons[v] = found;
      }
      // One entry per run of vertices that share the same reason.
      for (let v = 0; v < n; ) {
        const reason = reasons[v];
        if (reason === null) {
          v++;
          continue;
        }
        let end = v;
        while (end + 1 < n && reasons[end + 1] !== null && sameKind(reasons[end + 1]!, reason)) end++;
        const range = end === v ? `vertex ${v + 1}` : `vertices ${v + 1} to ${end + 1}`;
        const partText = f.parts.length > 1 ? `, line ${k + 1}` : '';
        missing.push({
          id: f.id,
          feature: f.feature,
          part: k + 1,
          vertices: [v + 1, end + 1],
          message: `linework feature ${f.feature} (id ${f.id}${f.name ? `, ${f.name}` : ''})${partText}, ${range}: no height in the file, and ${end === v ? reason : generalise(reason)}`,
        });
        v = end + 1;
      }
      return out;
    }),
  );
  return { heights, fromData, fromDem, missing };
}

/** The DEM height at a point, or the reason there is none (a clause for "..., and <reason>"). */
function demHeight(item: HeightQuery, dem: DemInCrs | undefined, xyCrs: Crs | undefined): number | string {
  if (!dem) return 'no DEM was given to take one from';
  let x: number;
  let y: number;
  try {
    if (item.lon !== undefined && item.lat !== undefined && Number.isFinite(item.lon) && Number.isFinite(item.lat)) {
      if (dem.crs.geographic) [x, y] = [item.lon, item.lat];
      else ({ x, y } = fromLonLat(item.lon, item.lat, dem.crs));
    } else if (item.x !== undefined && item.y !== undefined && Number.isFinite(item.x) && Number.isFinite(item.y)) {
      if (!xyCrs) return 'its x/y have no CRS, so the DEM cannot be consulted';
      if (xyCrs.proj4 === dem.crs.proj4) [x, y] = [item.x, item.y];
      else {
        const ll = toLonLat(item.x, item.y, xyCrs);
        ({ x, y } = dem.crs.geographic ? { x: ll.lon, y: ll.lat } : fromLonLat(ll.lon, ll.lat, dem.crs));
      }
    } else return 'it has no location (longitude/latitude or x/y) to look one up in the DEM';
  } catch (e) {
    if (e instanceof CrsError) return `its position cannot be put into the DEM's CRS: ${e.message}`;
    throw e;
  }
  const h = sampleDem(dem.dem, x, y);
  if (h !== null) return h;
  const [minX, minY, maxX, maxY] = demExtent(dem.dem);
  const at = `(${dem.crs.code} x ${x.toFixed(dem.crs.geographic ? 6 : 1)}, y ${y.toFixed(dem.crs.geographic ? 6 : 1)})`;
  return x >= minX && x <= maxX && y >= minY && y <= maxY ? `it falls on a DEM cell without data ${at}` : `it lies outside the DEM ${at}`;
}

/** Reasons of the same kind (outside, no data, ...) differ only in their coordinates. */
function sameKind(a: string, b: string): boolean {
  return a.replace(/\(.*\)$/, '') === b.replace(/\(.*\)$/, '');
}

/** A reason for a run of vertices: without the first vertex's coordinates. */
function generalise(reason: string): string {
  return reason.replace(/^it lies/, 'they lie').replace(/^it falls/, 'they fall').replace(/ \(.*\)$/, '').replace(/^its /, 'their ');
}
