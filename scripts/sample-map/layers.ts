/**
 * The map layers as GeoJSON (RFC 7946: WGS 84 longitude/latitude, 6 decimals, outer rings
 * counter-clockwise): topographic contours, contacts, geology polygons, the fault, places.
 */
import * as turf from '@turf/turf';
import type { Feature, FeatureCollection, MultiPolygon, Polygon, Position } from 'geojson';
import { CONTACT_LEVELS, FAULT, HILLS, SYNTHETIC_NOTICE, UNITS, WADIS } from './district';
import { clipLine, contourLines, contourRegion, type Line, type Rings, type XY } from './contours';
import { DOMAIN_RINGS, faultSide } from './domains';
import { surfaceElevation, type FoldDomain } from './fold';
import { localToUtm, round6, utmToLonLat } from './crs';
import { columnX, demAt, rowY, type DemGrid } from './terrain';

/** A FeatureCollection with foreign members that say plainly the data are synthetic. */
export interface SyntheticCollection extends FeatureCollection {
  readonly name: string;
  readonly synthetic: true;
  readonly description: string;
}

const collection = (name: string, features: Feature[]): SyntheticCollection => ({
  type: 'FeatureCollection',
  name,
  synthetic: true,
  description: SYNTHETIC_NOTICE,
  features,
});

/**
 * Local metres to [lon, lat] rounded to 6 decimals.
 * @example localToLonLat([3000, 2000]) // [15, 24.621156]
 */
export function localToLonLat(p: XY): Position {
  const [lon, lat] = utmToLonLat(...localToUtm(p[0], p[1]));
  return [round6(lon), round6(lat)];
}

/** Converts a line, dropping vertices that round onto their predecessor. */
function lineToLonLat(line: readonly XY[]): Position[] {
  const out: Position[] = [];
  for (const p of line) {
    const q = localToLonLat(p);
    const last = out[out.length - 1];
    if (!last || last[0] !== q[0] || last[1] !== q[1]) out.push(q);
  }
  return out;
}

/**
 * Topographic contours every `interval` metres; index contours every 100 m.
 * @example topoContours(dem, 20).features[0].properties // {elevation: 640, index: false}
 */
export function topoContours(dem: DemGrid, interval: number): SyntheticCollection {
  let lo = Infinity;
  let hi = -Infinity;
  for (const v of dem.values) [lo, hi] = [Math.min(lo, v), Math.max(hi, v)];
  const features: Feature[] = [];
  for (let z = Math.ceil(lo / interval) * interval; z <= hi; z += interval) {
    const lines = contourLines(dem.values, z).map(lineToLonLat).filter((l) => l.length >= 2);
    if (lines.length === 0) continue;
    features.push({ type: 'Feature', properties: { elevation: z, index: z % 100 === 0 }, geometry: { type: 'MultiLineString', coordinates: lines } });
  }
  return collection('Korvane topographic contours (SYNTHETIC)', features);
}

/** The field dem - surfaceElevation(level) at every DEM node: >= 0 where the ground is above the surface. */
function heightAboveSurface(dem: DemGrid, d: FoldDomain, level: number): Float64Array {
  const g = new Float64Array(dem.cols * dem.rows);
  for (let j = 0; j < dem.rows; j++) {
    for (let i = 0; i < dem.cols; i++) g[j * dem.cols + i] = dem.values[j * dem.cols + i] - surfaceElevation(d, level, columnX(i), rowY(j));
  }
  return g;
}

const sideOf = (id: 'west' | 'east') => (p: XY): number => (id === 'west' ? faultSide(p[0], p[1]) : -faultSide(p[0], p[1]));

/**
 * Contact name from the two units it separates (k = index of the lower unit).
 * @example contactName(0) // 'Oskaran Quartzite / Tamsel Siltstone contact'
 */
export const contactName = (k: number): string => `${UNITS[k].name} / ${UNITS[k + 1].name} contact`;

/**
 * Contacts (where each contact surface meets the ground) and geology polygons (the unit that
 * crops out), for every domain. Both come from the same grids, dem - surfaceElevation, so the
 * polygon edges run exactly along the contact lines.
 * @example geologyAndContacts(dem, buildDomains()).contacts.features.length
 */
export function geologyAndContacts(dem: DemGrid, domains: readonly FoldDomain[]): { geology: SyntheticCollection; contacts: SyntheticCollection } {
  const contactFeatures: Feature[] = [];
  const unitFeatures: Feature[] = [];
  const frame = turf.polygon([[[0, 0], [dem.cols * dem.cell, 0], [dem.cols * dem.cell, dem.rows * dem.cell], [0, dem.rows * dem.cell], [0, 0]]]);
  for (const d of domains) {
    const side = sideOf(d.id);
    const above: Feature<Polygon | MultiPolygon>[] = [];
    CONTACT_LEVELS.forEach((level, k) => {
      const g = heightAboveSurface(dem, d, level);
      for (const line of contourLines(g, 0)) {
        for (const piece of clipLine(line, side)) {
          const coordinates = lineToLonLat(piece);
          if (coordinates.length < 2) continue;
          contactFeatures.push({
            type: 'Feature',
            properties: { name: contactName(k), unitBelow: UNITS[k].code, unitAbove: UNITS[k + 1].code, level, domain: d.id },
            geometry: { type: 'LineString', coordinates },
          });
        }
      }
      above.push(turf.multiPolygon(contourRegion(g, 0) as unknown as Position[][][]));
    });
    const domainPolygon = turf.polygon([DOMAIN_RINGS[d.id] as unknown as Position[]]);
    UNITS.forEach((unit, i) => {
      let region: Feature<Polygon | MultiPolygon> | null = i === 0 ? frame : above[i - 1];
      if (i < UNITS.length - 1 && region) region = turf.difference(turf.featureCollection([region, above[i]]));
      if (region) region = turf.intersect(turf.featureCollection([region, domainPolygon]));
      if (!region) return;
      const polygons: Rings[] = region.geometry.type === 'Polygon' ? [region.geometry.coordinates as unknown as Rings] : (region.geometry.coordinates as unknown as Rings[]);
      const coordinates = polygons
        .map((rings) => rings.map((ring) => lineToLonLat(ring)).filter((ring) => ring.length >= 4))
        .filter((rings) => rings.length > 0);
      const feature: Feature<MultiPolygon> = {
        type: 'Feature',
        properties: { unit: unit.code, name: unit.name, lithology: unit.lithology, order: i + 1, domain: d.id },
        geometry: { type: 'MultiPolygon', coordinates },
      };
      unitFeatures.push(turf.rewind(feature, { reverse: false }) as Feature<MultiPolygon>);
    });
  }
  return {
    geology: collection('Korvane geology (SYNTHETIC)', unitFeatures),
    contacts: collection('Korvane contacts (SYNTHETIC)', contactFeatures),
  };
}

/**
 * The Kell Fault trace.
 * @example faultLayer().features[0].properties.name // 'Kell Fault'
 */
export function faultLayer(): SyntheticCollection {
  return collection('Korvane faults (SYNTHETIC)', [
    {
      type: 'Feature',
      properties: { name: FAULT.name, kind: 'fault', note: 'steep fault between the west and east structural domains; east side up' },
      geometry: { type: 'LineString', coordinates: [localToLonLat(FAULT.trace.from), localToLonLat(FAULT.trace.to)] },
    },
  ]);
}

/**
 * Named hills (points, with the DEM elevation) and wadis (dry stream beds, lines).
 * @example placesLayer(dem).features.length // 6
 */
export function placesLayer(dem: DemGrid): SyntheticCollection {
  const hills: Feature[] = HILLS.map((h) => ({
    type: 'Feature',
    properties: { name: h.name, kind: 'hill', elevation: Math.round(demAt(dem, h.at[0], h.at[1])) },
    geometry: { type: 'Point', coordinates: localToLonLat(h.at) },
  }));
  const wadis: Feature[] = WADIS.map((w) => ({
    type: 'Feature',
    properties: { name: w.name, kind: 'wadi' },
    geometry: { type: 'LineString', coordinates: lineToLonLat(w.path as Line) },
  }));
  return collection('Korvane places (SYNTHETIC)', [...hills, ...wadis]);
}
