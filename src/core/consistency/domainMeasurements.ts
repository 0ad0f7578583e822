import type { Station } from '../station';
import { foldInputFromStations, type FoldInputOptions } from '../foldInput';
import { planeNormal } from '../vectors';
import type { DomainLine, DomainPlane } from './domainCheck';

/** Where a station lies in a local east-north frame (metres), or undefined when it has no place there. */
export type PlaceStation = (station: Station) => { readonly x: number; readonly y: number } | undefined;

/**
 * The planes and lines of some stations as the consistency checks take them: the folded-surface
 * planes and axis-parallel lines that {@link foldInputFromStations} picks, each with its station
 * id, its place in the local frame where `place` gives one, and for lines the fold sense
 * recorded with a hinge. The map viewer and the command line both build their domains with
 * this, so the two check the same measurements.
 * @example
 * const { planes, lines } = domainMeasurements(stationsInside, (s) => ({ x: east(s), y: north(s) }));
 * checkDomain({ id: 'west', name: 'West limb', planes, lines, convergence: 0 });
 */
export function domainMeasurements(stations: readonly Station[], place: PlaceStation, kinds: FoldInputOptions = {}): { planes: DomainPlane[]; lines: DomainLine[] } {
  const fold = foldInputFromStations(stations, undefined, kinds);
  const planes = Array.from(fold.planeIds, (i, k): DomainPlane => ({ ...fold.planes[k], id: stations[i].id, ...place(stations[i]) }));
  const lines = Array.from(fold.lineIds, (i, k): DomainLine => {
    const s = stations[i];
    const sense = s.line?.sense;
    return { trend: fold.lines[k].trend, plunge: fold.lines[k].plunge, id: s.id, ...(sense !== undefined && { sense }), ...place(s) };
  });
  return { planes, lines };
}

/**
 * The inputs of the local axis field: for each folded-surface plane of the stations, its place
 * (interleaved x, y in metres) and its pole as a unit vector (interleaved x, y, z, north-east-down).
 * Every station must be placed; `place` is called once per plane.
 * @example
 * const { xy, poles } = axisFieldInputs(located, (s) => ({ x: east(s), y: north(s) }));
 * localAxisField(xy, poles, { nx: 40, ny: 30, k: 25 });
 */
export function axisFieldInputs(
  stations: readonly Station[],
  place: (station: Station) => { readonly x: number; readonly y: number },
  kinds: FoldInputOptions = {},
): { xy: Float64Array; poles: Float64Array; count: number } {
  const fold = foldInputFromStations(stations, undefined, kinds);
  const n = fold.planes.length;
  const xy = new Float64Array(2 * n);
  const poles = new Float64Array(3 * n);
  Array.from(fold.planeIds).forEach((i, k) => {
    const p = place(stations[i]);
    xy[2 * k] = p.x;
    xy[2 * k + 1] = p.y;
    const v = planeNormal(fold.planes[k]);
    poles[3 * k] = v.x;
    poles[3 * k + 1] = v.y;
    poles[3 * k + 2] = v.z;
  });
  return { xy, poles, count: n };
}
