/**
 * Kamb (1959) counting of axes over the net.
 *
 * Kamb chose the counting area so that, for N directions drawn from a uniform distribution,
 * the expected count in it is three standard deviations of that count: with A the counting
 * area as a fraction of the hemisphere, the count is binomial(N, A), E = N·A and
 * sigma = √(N·A·(1 - A)); E = 3·sigma gives A = 9/(N + 9) (Kamb 1959, from memory; the algebra
 * is derived in REFERENCES.md). A spherical cap of half-angle φ covers 1 - cos φ of a
 * hemisphere, so φ = acos(1 - A). Axes have no sense, so a node counts every axis whose either
 * end lies in its cap: |u·v| >= 1 - A.
 *
 * Grid values are counts divided by sigma ("multiples of sigma"); uniform data average 3.
 * Contours are drawn at 2-sigma intervals (common practice).
 */
import { capAngleDegrees, contourLevels, netGridNodes, readAxes, resolveDensityOptions } from './density';
import type { DensityGrid, DensityOptions } from './density';
import type { Line } from './types';
import { densityAtNodes } from './densityNodes';

/** Kamb counting parameters for n directions. */
export interface KambParameters {
  /** Counting area as a fraction of the hemisphere: 9/(n + 9). */
  readonly area: number;
  /** Expected count for uniform data: n·area. */
  readonly expected: number;
  /** Standard deviation of the count for uniform data: √(n·area·(1 - area)). */
  readonly sigma: number;
  /** Cosine of the cap half-angle: 1 - area. */
  readonly minCos: number;
  /** Cap half-angle in degrees: acos(1 - area). */
  readonly countingAngle: number;
}

/**
 * Counting area, expected count, sigma and cap half-angle of Kamb (1959) counting.
 * @example kambParameters(100) // {area: 0.082569, expected: 8.2569, sigma: 2.7523, countingAngle: 23.447, ...}
 */
export function kambParameters(n: number): KambParameters {
  if (!(Number.isInteger(n) && n >= 1)) throw new RangeError(`direction count ${String(n)} is not usable; expected a whole number from 1`);
  const area = 9 / (n + 9);
  const minCos = 1 - area;
  return {
    area,
    expected: n * area,
    sigma: Math.sqrt(n * area * (1 - area)),
    minCos,
    countingAngle: capAngleDegrees(minCos),
  };
}

/**
 * Kamb counts over a grid on the net, in multiples of sigma, with contour levels at
 * `interval` (default 2) sigma. Input: interleaved north-east-down unit vectors (either
 * hemisphere; treated as axes) or lines.
 * @example
 * const grid = kambGrid([{trend: 120, plunge: 40}, {trend: 125, plunge: 38}]);
 * const rings = contours().size([grid.width, grid.height]).thresholds(grid.levels)(Array.from(grid.values));
 */
export function kambGrid(input: Float64Array | readonly Line[], options: DensityOptions = {}): DensityGrid {
  const { resolution, net, interval, strategy } = resolveDensityOptions(options);
  const vectors = readAxes(input);
  const n = vectors.length / 3;
  const { expected, sigma, minCos, countingAngle } = kambParameters(n);
  const nodes = netGridNodes(resolution, net);
  const values = densityAtNodes(nodes, vectors, { allPairs: strategy === 'all-pairs', minCos, allPairsMinCos: minCos }, () => 1, sigma);
  return {
    method: 'kamb',
    net,
    n,
    width: nodes.width,
    height: nodes.height,
    values,
    levels: contourLevels(values, interval),
    expected,
    sigma,
    countingAngle,
    x0: nodes.x0,
    y0: nodes.y0,
    step: nodes.step,
  };
}
