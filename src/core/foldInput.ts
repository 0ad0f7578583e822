import type { Line, LineKind, PlaneKind, PlaneMeasurement } from './types';
import { isLineKind, isPlaneKind } from './types';
import { isUsable, type Station } from './station';

/**
 * Planar kinds analysed as the folded surface by default. Cleavage, axial planes, joints,
 * faults and veins are left out: they are not the surface that was folded (axial-planar
 * cleavage, for one, would pull the girdle toward the axial plane). Common practice.
 * @example
 * foldInputFromStations(stations, selected, { planeKinds: [...DEFAULT_FOLDED_KINDS, 'foliation'] });
 */
export const DEFAULT_FOLDED_KINDS: readonly PlaneKind[] = ['bedding'];

/**
 * Linear kinds compared with the fold axis by default: fold hinges, intersection lineations and
 * generic lineations. Slickenlines and mineral (stretching) lineations need not parallel the
 * axis and are left out. Common practice.
 * @example
 * DEFAULT_AXIS_LINE_KINDS.includes('slickenline') // false
 */
export const DEFAULT_AXIS_LINE_KINDS: readonly LineKind[] = ['hinge', 'intersection', 'lineation'];

/** What a fold analysis of some stations takes, with the station index of each item. */
export interface FoldInput {
  readonly planes: PlaneMeasurement[];
  readonly planeIds: Int32Array;
  readonly lines: Array<Line & { readonly id: number }>;
  readonly lineIds: Int32Array;
}

/** Which kinds to take; defaults {@link DEFAULT_FOLDED_KINDS} and {@link DEFAULT_AXIS_LINE_KINDS}. */
export interface FoldInputOptions {
  readonly planeKinds?: readonly string[];
  readonly lineKinds?: readonly string[];
}

/**
 * Picks the folded-surface planes and the axis-parallel lines among usable stations (all, or
 * those at `indices`). The map panel and the command line both call this, so they analyse the
 * same measurements for the same selection.
 * @example foldInputFromStations(stations).planes.length // number of usable bedding readings
 */
export function foldInputFromStations(stations: readonly Station[], indices?: ArrayLike<number>, options: FoldInputOptions = {}): FoldInput {
  const planeKinds = new Set<string>(options.planeKinds ?? DEFAULT_FOLDED_KINDS);
  const lineKinds = new Set<string>(options.lineKinds ?? DEFAULT_AXIS_LINE_KINDS);
  const planes: PlaneMeasurement[] = [];
  const planeIds: number[] = [];
  const lines: Array<Line & { id: number }> = [];
  const lineIds: number[] = [];
  const count = indices ? indices.length : stations.length;
  for (let k = 0; k < count; k++) {
    const i = indices ? indices[k] : k;
    const s = stations[i];
    if (!s || !isUsable(s) || !s.kind) continue;
    if (s.plane && isPlaneKind(s.kind) && planeKinds.has(s.kind)) {
      planes.push(s.plane);
      planeIds.push(i);
    } else if (s.line && isLineKind(s.kind) && lineKinds.has(s.kind)) {
      lines.push({ trend: s.line.trend, plunge: s.line.plunge, id: i });
      lineIds.push(i);
    }
  }
  return { planes, planeIds: Int32Array.from(planeIds), lines, lineIds: Int32Array.from(lineIds) };
}
