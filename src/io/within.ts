import { booleanPointInPolygon, point } from '@turf/turf';
import type { Feature, MultiPolygon, Polygon, Position } from 'geojson';
import type { Station } from '../core/station';

/**
 * Selecting stations inside an area drawn as GeoJSON polygons (RFC 7946 §3.1.6-3.1.7).
 * A station on the boundary counts as inside (Turf's booleanPointInPolygon with
 * `ignoreBoundary: false`); with several polygons, inside any of them is inside. Holes are
 * respected. A station without a location is neither inside nor outside: it is counted apart.
 */

/**
 * The only error thrown for an area file that is not polygons.
 * @example try { readPolygons('{}'); } catch (e) { (e as AreaError).message }
 */
export class AreaError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'AreaError';
  }
}

/** Result of {@link selectWithin}. */
export interface WithinSelection {
  readonly inside: readonly Station[];
  readonly outside: readonly Station[];
  readonly noLocation: readonly Station[];
}

/**
 * Reads the polygons of a GeoJSON text: a Polygon or MultiPolygon geometry, a Feature holding
 * one, or a FeatureCollection of them. Rings must be closed with at least four positions
 * (RFC 7946 §3.1.6). Throws {@link AreaError} naming the feature at fault.
 * @example readPolygons('{"type":"Polygon","coordinates":[[[0,0],[1,0],[1,1],[0,0]]]}').length // 1
 */
export function readPolygons(text: string): Feature<Polygon | MultiPolygon>[] {
  let json: unknown;
  try {
    json = JSON.parse(text.charCodeAt(0) === 0xfeff ? text.slice(1) : text);
  } catch (e) {
    throw new AreaError(`the area file is not valid JSON: ${(e as Error).message}`);
  }
  const type = (json as { type?: unknown } | null)?.type;
  const items: unknown[] =
    type === 'FeatureCollection' && Array.isArray((json as { features?: unknown }).features)
      ? ((json as { features: unknown[] }).features)
      : type === 'Feature'
        ? [json]
        : type === 'Polygon' || type === 'MultiPolygon'
          ? [{ type: 'Feature', geometry: json, properties: {} }]
          : [];
  if (items.length === 0) throw new AreaError('the area file holds no polygons: expected a Polygon, a MultiPolygon, or features holding them');
  return items.map((item, i) => {
    const g = (item as { geometry?: { type?: unknown; coordinates?: unknown } } | null)?.geometry;
    const what = items.length > 1 ? `area feature ${i + 1}` : 'the area';
    if (!g || (g.type !== 'Polygon' && g.type !== 'MultiPolygon')) {
      throw new AreaError(`${what} is a ${String(g?.type ?? 'feature without geometry')}, not a Polygon or MultiPolygon`);
    }
    const polygons = (g.type === 'Polygon' ? [g.coordinates] : g.coordinates) as unknown;
    if (!Array.isArray(polygons) || polygons.length === 0 || !polygons.every((p) => Array.isArray(p) && p.length > 0 && p.every(isClosedRing))) {
      throw new AreaError(`${what}: every ring must be a closed list of at least four [longitude, latitude] positions, first equal to last`);
    }
    return { type: 'Feature', geometry: g as Polygon | MultiPolygon, properties: {} };
  });
}

/**
 * Splits stations into inside (boundary included), outside, and without a location.
 * @example selectWithin(stations, readPolygons(areaText)).inside.length
 */
export function selectWithin(stations: readonly Station[], polygons: readonly Feature<Polygon | MultiPolygon>[]): WithinSelection {
  const inside: Station[] = [];
  const outside: Station[] = [];
  const noLocation: Station[] = [];
  for (const s of stations) {
    if (s.lon === undefined || s.lat === undefined) noLocation.push(s);
    else if (polygons.some((p) => booleanPointInPolygon(point([s.lon!, s.lat!]), p, { ignoreBoundary: false }))) inside.push(s);
    else outside.push(s);
  }
  return { inside, outside, noLocation };
}

function isClosedRing(ring: unknown): boolean {
  if (!Array.isArray(ring) || ring.length < 4) return false;
  if (!ring.every((p) => Array.isArray(p) && p.length >= 2 && p.every((v) => typeof v === 'number' && Number.isFinite(v)))) return false;
  const a = ring[0] as Position;
  const b = ring[ring.length - 1] as Position;
  return a[0] === b[0] && a[1] === b[1];
}
