import type { FoldAnalysis } from './foldAnalysis';
import { angleBetweenLines } from './geometry';

/**
 * A structural domain: a named map area (lon/lat ring, not closed) with the fold analysis of
 * the stations inside it. JSON-friendly so it can be saved with the project.
 */
export interface Domain {
  readonly id: string;
  readonly name: string;
  readonly ring: ReadonlyArray<readonly [number, number]>;
  readonly analysis: FoldAnalysis | null;
  /** Ids of the stations inside when the analysis was made. */
  readonly stationIds: readonly string[];
  /** ISO time of the last change. */
  readonly updated: string;
}

/** How two domains' fold axes compare. */
export interface DomainComparison {
  /** Angle between the axes in degrees (0..90); null when either axis is undefined. */
  readonly angle: number | null;
  /** Whether the 95% cones overlap (angle <= cone A + cone B); null when a cone is missing. */
  readonly conesOverlap: boolean | null;
  /** The comparison in words. */
  readonly text: string;
}

/**
 * Compares the fold axes of two domains. Two cones overlap when the angle between the axes is
 * no more than the sum of their half-angles; overlapping cones mean the data do not show the
 * axes to differ at the 95% level (a conservative reading: common practice).
 * @example compareDomains(west, east) // {angle: 24.9, conesOverlap: false, text: '...'}
 */
export function compareDomains(a: Pick<Domain, 'name' | 'analysis'>, b: Pick<Domain, 'name' | 'analysis'>): DomainComparison {
  const axA = a.analysis?.axis ?? null;
  const axB = b.analysis?.axis ?? null;
  if (!axA || !axB) {
    const missing = !axA ? a.name : b.name;
    return { angle: null, conesOverlap: null, text: `No comparison: ${missing} has no defined fold axis.` };
  }
  const angle = angleBetweenLines(axA, axB);
  const cA = a.analysis?.cone95 ?? null;
  const cB = b.analysis?.cone95 ?? null;
  if (cA === null || cB === null) {
    return { angle, conesOverlap: null, text: `The axes are ${angle.toFixed(1)}° apart; a confidence cone is missing, so their difference cannot be judged.` };
  }
  const conesOverlap = angle <= cA + cB;
  const text = conesOverlap
    ? `The axes are ${angle.toFixed(1)}° apart and their 95% cones (${cA.toFixed(1)}° and ${cB.toFixed(1)}°) overlap: the data do not show them to differ.`
    : `The axes are ${angle.toFixed(1)}° apart, more than their 95% cones (${cA.toFixed(1)}° and ${cB.toFixed(1)}°) together: the domains' axes differ.`;
  return { angle, conesOverlap, text };
}

/**
 * A fresh id for a domain (time plus a random part; stable once saved).
 * @example
 * newDomainId(0, () => 0) // 'd-0-0000'
 */
export function newDomainId(now = Date.now(), random = Math.random): string {
  return `d-${now.toString(36)}-${Math.floor(random() * 36 ** 4).toString(36).padStart(4, '0')}`;
}

/**
 * The next default name: "Domain 1", "Domain 2", ... skipping names in use.
 * @example
 * nextDomainName([{ name: 'Domain 1' }]) // 'Domain 2'
 */
export function nextDomainName(existing: readonly Pick<Domain, 'name'>[]): string {
  const used = new Set(existing.map((d) => d.name));
  for (let k = 1; ; k++) if (!used.has(`Domain ${k}`)) return `Domain ${k}`;
}

/**
 * Centroid of a lon/lat ring (area-weighted; falls back to the vertex mean for degenerate rings).
 * @example
 * ringCentroid([[0, 0], [2, 0], [2, 2], [0, 2], [0, 0]]) // [1, 1]
 */
export function ringCentroid(ring: ReadonlyArray<readonly [number, number]>): [number, number] {
  let a = 0;
  let cx = 0;
  let cy = 0;
  for (let i = 0, j = ring.length - 1; i < ring.length; j = i++) {
    const f = ring[j][0] * ring[i][1] - ring[i][0] * ring[j][1];
    a += f;
    cx += (ring[j][0] + ring[i][0]) * f;
    cy += (ring[j][1] + ring[i][1]) * f;
  }
  if (Math.abs(a) < 1e-18) {
    const n = Math.max(1, ring.length);
    return [ring.reduce((s, p) => s + p[0], 0) / n, ring.reduce((s, p) => s + p[1], 0) / n];
  }
  return [cx / (3 * a), cy / (3 * a)];
}
