import type { RowProblem, Station } from '../core/station';
import { detectColumns, type ColumnDetection } from './columns';
import type { CsvRow } from './csvTable';
import { lonLatProblem } from './crs';
import { readStation, type GivenLocation, type StationReadOptions } from './readStations';

/**
 * Reading stations from GeoJSON (RFC 7946): a FeatureCollection (or a single Feature) of Point
 * features whose properties hold the measurement, named as in a CSV header (columns.ts).
 *
 * Row numbers are feature numbers counted from 1 in file order, so "row 3" is the third feature.
 * The Point gives the location (RFC 7946 §4: WGS84 longitude, latitude, optional height in
 * metres, which fills the elevation when no property does); any lon/lat properties are then
 * left unused (a CRS in the options serves only grid convergence). A feature with no geometry
 * (null) has no location. Any other geometry type is a
 * problem for that feature. Property values that are not strings are kept as text: numbers and
 * booleans as written by JSON, null as empty, objects and arrays as JSON.
 */

/**
 * The only error thrown when the text is not GeoJSON this reader can use.
 * @example try { readGeoJsonStations('[]'); } catch (e) { (e as GeoJsonError).message }
 */
export class GeoJsonError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'GeoJsonError';
  }
}

/** Result of {@link readGeoJsonStations}: the property names seen, the column detection used, and the stations. */
export interface GeoJsonStations {
  readonly headers: readonly string[];
  readonly detection: ColumnDetection;
  readonly stations: readonly Station[];
}

interface FeatureLike {
  readonly type?: unknown;
  readonly geometry?: unknown;
  readonly properties?: unknown;
}

/**
 * Reads stations from GeoJSON text or an already parsed object. `overrides` name columns
 * (property names) as in `detectColumns`.
 * @example
 * const text = '{"type":"FeatureCollection","features":[{"type":"Feature","geometry":{"type":"Point","coordinates":[15.1,45.2]},"properties":{"kind":"bedding","dipdir":120,"dip":40}}]}';
 * readGeoJsonStations(text).stations[0].plane // {dipDirection: 120, dip: 40}
 */
export function readGeoJsonStations(
  input: string | unknown,
  options: StationReadOptions = {},
  overrides: Readonly<Record<string, string | undefined>> = {},
): GeoJsonStations {
  const features = featuresOf(typeof input === 'string' ? parseJson(input) : input);
  const headers: string[] = [];
  const seen = new Set<string>();
  const rows: CsvRow[] = features.map((f, i) => {
    const values = propertiesAsText(f.properties);
    for (const k of Object.keys(values)) {
      if (!seen.has(k)) {
        seen.add(k);
        headers.push(k);
      }
    }
    return { row: i + 1, values };
  });
  const detection = detectColumns(headers, overrides);
  // The geometry gives the location; coordinate properties are not read.
  const { lon: _lon, lat: _lat, x: _x, y: _y, ...mapping } = detection.mapping;
  const stations = rows.map((row, i) => readStation(row, mapping, options, locationOf(features[i], row.row)));
  return { headers, detection, stations };
}

function parseJson(text: string): unknown {
  try {
    return JSON.parse(text.charCodeAt(0) === 0xfeff ? text.slice(1) : text);
  } catch (e) {
    throw new GeoJsonError(`the file is not valid JSON: ${(e as Error).message}`);
  }
}

function featuresOf(json: unknown): FeatureLike[] {
  if (json === null || typeof json !== 'object' || Array.isArray(json)) {
    throw new GeoJsonError('expected a GeoJSON object with "type": "FeatureCollection" (RFC 7946)');
  }
  const o = json as { type?: unknown; features?: unknown; crs?: unknown };
  checkLegacyCrs(o.crs);
  if (o.type === 'Feature') return [o as FeatureLike];
  if (o.type !== 'FeatureCollection') {
    throw new GeoJsonError(`expected "type": "FeatureCollection" or "Feature", found ${JSON.stringify(o.type ?? null)}`);
  }
  if (!Array.isArray(o.features)) throw new GeoJsonError('the FeatureCollection has no "features" array');
  if (o.features.length === 0) throw new GeoJsonError('the FeatureCollection has no features');
  o.features.forEach((f, i) => {
    if (f === null || typeof f !== 'object' || (f as FeatureLike).type !== 'Feature') {
      throw new GeoJsonError(`feature ${i + 1} is not a GeoJSON Feature (expected "type": "Feature")`);
    }
  });
  return o.features as FeatureLike[];
}

/** The 2008 GeoJSON "crs" member: accept only names of WGS84 longitude/latitude. */
function checkLegacyCrs(crs: unknown): void {
  if (crs === undefined || crs === null) return;
  const name = (crs as { properties?: { name?: unknown } }).properties?.name;
  if (typeof name === 'string' && /(CRS84|EPSG:+4326)$/i.test(name)) return;
  throw new GeoJsonError(
    `the file declares a "crs" of ${JSON.stringify(name ?? crs)}; GeoJSON (RFC 7946) coordinates must be WGS84 longitude and latitude, so reproject the file first`,
  );
}

function propertiesAsText(properties: unknown): Record<string, string> {
  if (properties === null || properties === undefined || typeof properties !== 'object' || Array.isArray(properties)) return {};
  return Object.fromEntries(
    Object.entries(properties as Record<string, unknown>).map(([k, v]) => [
      k,
      v === null || v === undefined ? '' : typeof v === 'string' ? v : typeof v === 'object' ? JSON.stringify(v) : String(v),
    ]),
  );
}

function locationOf(feature: FeatureLike, row: number): GivenLocation {
  const g = feature.geometry;
  if (g === null || g === undefined) return {};
  const problem = (value: string, expected: string): GivenLocation => ({ problems: [{ row, column: 'geometry', value, expected } satisfies RowProblem] });
  const type = (g as { type?: unknown }).type;
  if (type !== 'Point') {
    return problem(String(type), 'a Point geometry (one location per measurement); this feature is not a point');
  }
  const c = (g as { coordinates?: unknown }).coordinates;
  if (!Array.isArray(c) || c.length < 2 || c.length > 3 || !c.every((v) => typeof v === 'number' && Number.isFinite(v))) {
    return problem(JSON.stringify(c ?? null).slice(0, 80), 'Point coordinates [longitude, latitude] or [longitude, latitude, height]');
  }
  const [lon, lat, height] = c as number[];
  const why = lonLatProblem(lon, lat);
  if (why) return problem(`[${lon}, ${lat}]`, why);
  return height === undefined ? { lon, lat } : { lon, lat, elevation: height };
}
