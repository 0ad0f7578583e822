import { featureCollection, polygon as turfPolygon, union } from '@turf/turf';
import type { Feature, MultiPolygon, Polygon } from 'geojson';

/** Mean Earth radius in metres (IUGG R1, as turf uses it). */
const EARTH_RADIUS_M = 6_371_008.8;

/** Vertices per half circle of a swath's rounded ends and bends. */
const HALF_CIRCLE_STEPS = 16;

/**
 * The outline, on the map, of the swath of a vertical section: every place within `halfWidth`
 * metres of the section line. That is the rule core/verticalSection.ts applies (distance to the
 * nearest point of the polyline), so the ends and the outer side of bends are round.
 *
 * Built as the union (turf union, polyclip-ts) of one capsule per segment, each a rectangle
 * with half circles of {@link HALF_CIRCLE_STEPS} steps at both ends, laid out in a local
 * equirectangular frame about the line's middle. For display only: over a section of a few
 * kilometres the frame's scale differs from the UTM frame the projection uses by well under 1%.
 *
 * Returns null for fewer than two distinct positions or a width that is not positive.
 * @example swathOutline([[14.98, 24.63], [15.0, 24.61]], 500)?.geometry.type // 'Polygon'
 */
export function swathOutline(line: ReadonlyArray<readonly [number, number]>, halfWidth: number): Feature<Polygon | MultiPolygon> | null {
  if (!(halfWidth > 0 && Number.isFinite(halfWidth)) || line.length < 2) return null;
  const lon0 = line.reduce((s, p) => s + p[0], 0) / line.length;
  const lat0 = line.reduce((s, p) => s + p[1], 0) / line.length;
  const my = (EARTH_RADIUS_M * Math.PI) / 180;
  const mx = my * Math.cos((lat0 * Math.PI) / 180);
  const toLocal = (p: readonly [number, number]): [number, number] => [(p[0] - lon0) * mx, (p[1] - lat0) * my];
  const toLonLat = (x: number, y: number): [number, number] => [lon0 + x / mx, lat0 + y / my];

  const capsules: Feature<Polygon>[] = [];
  for (let i = 1; i < line.length; i++) {
    const [ax, ay] = toLocal(line[i - 1]);
    const [bx, by] = toLocal(line[i]);
    if (Math.hypot(bx - ax, by - ay) < 1e-6) continue;
    const heading = Math.atan2(by - ay, bx - ax);
    const ring: [number, number][] = [];
    // Counter-clockwise: half circle about B from the right side to the left side, then about A back.
    for (let k = 0; k <= HALF_CIRCLE_STEPS; k++) {
      const t = heading - Math.PI / 2 + (Math.PI * k) / HALF_CIRCLE_STEPS;
      ring.push(toLonLat(bx + halfWidth * Math.cos(t), by + halfWidth * Math.sin(t)));
    }
    for (let k = 0; k <= HALF_CIRCLE_STEPS; k++) {
      const t = heading + Math.PI / 2 + (Math.PI * k) / HALF_CIRCLE_STEPS;
      ring.push(toLonLat(ax + halfWidth * Math.cos(t), ay + halfWidth * Math.sin(t)));
    }
    ring.push(ring[0]);
    capsules.push(turfPolygon([ring]));
  }
  if (capsules.length === 0) return null;
  if (capsules.length === 1) return capsules[0];
  return union(featureCollection(capsules));
}
