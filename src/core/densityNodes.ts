import type { NetGridNodes } from './density';
import { bucketAxes, capChord, sumAllAxes, sumNearAxis } from './sphereBuckets';

/** How to find the axes that count at a node. */
export interface NodeSearch {
  /** Test every axis at every node (the slow reference) rather than nearby buckets. */
  readonly allPairs: boolean;
  /** Axes with |cos| below this do not count (the counting cap or the weight's cut-off). */
  readonly minCos: number;
  /** The cut used by the all-pairs loop (Kamb: the cap; exponential: none, 0). */
  readonly allPairsMinCos: number;
}

/**
 * The weighted count of axes about every evaluated node of a net grid, divided by sigma.
 * Shared by Kamb counting (weight 1 inside the cap) and exponential smoothing; the bucketed
 * search visits only axes within the cut, the all-pairs loop every axis.
 * @example densityAtNodes(nodes, axes, { allPairs: false, minCos: 0.9, allPairsMinCos: 0.9 }, () => 1, 2.75)
 */
export function densityAtNodes(nodes: NetGridNodes, vectors: Float64Array, search: NodeSearch, weight: (cos: number) => number, sigma: number): Float64Array {
  const { directions: dirs, evaluated } = nodes;
  const values = new Float64Array(nodes.width * nodes.height);
  if (search.allPairs) {
    for (let j = 0; j < values.length; j++) {
      if (evaluated[j] === 0) continue;
      values[j] = sumAllAxes(vectors, dirs[3 * j], dirs[3 * j + 1], dirs[3 * j + 2], search.allPairsMinCos, weight) / sigma;
    }
    return values;
  }
  const buckets = bucketAxes(vectors, capChord(search.minCos));
  for (let j = 0; j < values.length; j++) {
    if (evaluated[j] === 0) continue;
    values[j] = sumNearAxis(buckets, dirs[3 * j], dirs[3 * j + 1], dirs[3 * j + 2], search.minCos, weight) / sigma;
  }
  return values;
}
