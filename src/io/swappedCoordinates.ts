import type { RowProblem, Station } from '../core/station';

/** A station this many times farther from the middle of the data than the typical station is far out. */
const FAR_FACTOR = 20;

/**
 * Finds stations whose longitude and latitude look swapped: far from all the others, yet
 * among them once the two numbers trade places. Per row both readings are valid coordinates,
 * so only the data set as a whole can tell (common practice: a swapped pair lands the point
 * in another country). Returns the stations with a problem added, others unchanged; the
 * stations keep their position and every field, so the user can fix the row.
 * @example flagSwappedCoordinates(stations).filter((s) => s.problems.length).length
 */
export function flagSwappedCoordinates(stations: readonly Station[]): Station[] {
  const placed = stations.filter((s) => s.lon !== undefined && s.lat !== undefined && s.problems.length === 0);
  if (placed.length < 5) return stations.slice();
  const lons = placed.map((s) => s.lon!).sort((a, b) => a - b);
  const lats = placed.map((s) => s.lat!).sort((a, b) => a - b);
  const mid = (v: number[]) => v[Math.floor(v.length / 2)];
  const cLon = mid(lons);
  const cLat = mid(lats);
  const spread = mid(placed.map((s) => Math.hypot(s.lon! - cLon, s.lat! - cLat)).sort((a, b) => a - b));
  // Typical distance from the middle; a floor keeps a one-outcrop data set from flagging metres.
  const typical = Math.max(spread, 1e-3);
  return stations.map((s) => {
    if (s.lon === undefined || s.lat === undefined) return s;
    const far = Math.hypot(s.lon - cLon, s.lat - cLat) > FAR_FACTOR * typical;
    const swappedNear = Math.hypot(s.lat - cLon, s.lon - cLat) <= 3 * typical;
    if (!far || !swappedNear) return s;
    const column = Object.keys(s.source).find((k) => /^(lon|lng|long|longitude)$/i.test(k)) ?? 'lon/lat';
    const problem: RowProblem = {
      row: s.row,
      column,
      value: `${s.lon}, ${s.lat}`,
      expected: `a position near the other stations; longitude and latitude look swapped (swapped, the point ${s.lat.toFixed(5)}, ${s.lon.toFixed(5)} falls among them)`,
    };
    const { plane: _p, line: _l, ...rest } = s;
    return { ...rest, problems: [...s.problems, problem] };
  });
}
