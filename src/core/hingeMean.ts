import { fisherLines } from './fisher';
import { isUsable, type Station } from './station';
import type { Line } from './types';

/** The mean of measured fold hinges, as a fold axis for a profile. */
export interface HingeMean {
  /** Fisher mean of the hinges as a lower-hemisphere line; null when there is none (see `reason`). */
  readonly axis: Line | null;
  /** Hinges used. */
  readonly n: number;
  /** 95% cone of confidence about the mean, degrees; null with fewer than 2 hinges or when undefined. */
  readonly alpha95: number | null;
  readonly kappa: number | null;
  /** Why there is no axis, in words; null when there is one. */
  readonly reason: string | null;
}

/**
 * The Fisher (1953) mean of the measured hinges among some stations (all, or those at
 * `indices`), treated as axes (fisher.ts): a measured alternative to the girdle's pi axis
 * for looking down a fold. Only usable stations whose kind is in `kinds` count (default:
 * 'hinge'); intersection lineations and other lines are left out unless asked for.
 * @example hingeMeanAxis(stations, selection).axis // e.g. {trend: 75.8, plunge: 12.6}
 */
export function hingeMeanAxis(stations: readonly Station[], indices?: ArrayLike<number>, kinds: readonly string[] = ['hinge']): HingeMean {
  const wanted = new Set(kinds);
  const lines: Line[] = [];
  const count = indices ? indices.length : stations.length;
  for (let k = 0; k < count; k++) {
    const s = stations[indices ? indices[k] : k];
    if (s && isUsable(s) && s.line && s.kind !== undefined && wanted.has(s.kind)) lines.push({ trend: s.line.trend, plunge: s.line.plunge });
  }
  if (lines.length === 0) {
    return { axis: null, n: 0, alpha95: null, kappa: null, reason: `no measured ${kinds.join(' or ')} ${indices ? 'in the selection' : 'in the data'}` };
  }
  const f = fisherLines(lines);
  return { axis: f.mean, n: f.n, alpha95: f.alpha95, kappa: f.kappa, reason: f.mean ? null : f.notes.join('; ') };
}
