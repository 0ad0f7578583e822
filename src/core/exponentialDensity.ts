/**
 * Exponential smoothing of axes over the net (Vollmer 1995, a smooth variant of Kamb counting).
 *
 * Each axis v adds w = exp(k(|u·v| - 1)) at node u, with k = 2(1 + N/9) (Vollmer 1995, from
 * memory). The published normalisation to sigma units was not at hand, so Foldlens uses its own,
 * derived here: for axes drawn from a uniform distribution c = |u·v| is uniform on [0, 1]
 * (Archimedes' hat-box theorem), so one weight has
 *   mean   m = (1 - e^-k)/k,
 *   second moment s = (1 - e^-2k)/(2k),
 * and the summed weight at a node has expected value E = N·m and sigma = √(N·(s - m²)).
 * Dropping the e^-k terms gives E = N/k and sigma = N/(3k) when k = 2(1 + N/9), so E = 3·sigma:
 * the same criterion as Kamb's counting area, which is why k has that form. Grid values are the
 * summed weight divided by sigma. The reported counting angle acos(1 - 1/k) is where the weight
 * has fallen to 1/e; a cap of that size has the same area as the integral of the weight.
 *
 * Truncation: the bucketed search ignores axes whose weight is below
 * w_cut = tolerance·sigma/N, so the dropped weight at any node is below N·w_cut, i.e. below
 * `tolerance` (default 1e-6) in sigma units however the data lie. That cut is always far below
 * 1e-6 of the peak weight (the peak is 1); a fixed 1e-6-of-peak cut would bound the error only
 * by N·1e-6 in weight, up to 0.07 sigma for 10^5 axes.
 */
import { capAngleDegrees, contourLevels, netGridNodes, readAxes, resolveDensityOptions } from './density';
import type { DensityGrid, DensityOptions } from './density';
import type { Line } from './types';
import { densityAtNodes } from './densityNodes';

/** Options of the exponential estimate. */
export interface ExponentialDensityOptions extends DensityOptions {
  /** Largest error, in sigma, allowed from truncating the weight (bucketed search only). Default 1e-6. */
  readonly tolerance?: number;
}

/** Parameters of exponential smoothing for n directions. */
export interface ExponentialParameters {
  /** Exponent of the weight exp(k(cos θ - 1)): 2(1 + n/9). */
  readonly k: number;
  /** Expected summed weight at a node for uniform data. */
  readonly expected: number;
  /** Standard deviation of the summed weight for uniform data. */
  readonly sigma: number;
  /** Angle in degrees at which the weight is 1/e: acos(1 - 1/k). */
  readonly countingAngle: number;
}

/**
 * Default truncation tolerance in sigma.
 * @example
 * const tolerance = DEFAULT_EXPONENTIAL_TOLERANCE / 10; // a finer truncation
 */
export const DEFAULT_EXPONENTIAL_TOLERANCE = 1e-6;

/**
 * Exponent, expected weight, sigma and counting angle of exponential smoothing.
 * @example exponentialParameters(100) // {k: 24.222, expected: 4.1284, sigma: 1.3761, countingAngle: 16.5, ...}
 */
export function exponentialParameters(n: number): ExponentialParameters {
  if (!(Number.isInteger(n) && n >= 1)) throw new RangeError(`direction count ${String(n)} is not usable; expected a whole number from 1`);
  const k = 2 * (1 + n / 9);
  const mean = -Math.expm1(-k) / k;
  const second = -Math.expm1(-2 * k) / (2 * k);
  return {
    k,
    expected: n * mean,
    sigma: Math.sqrt(n * (second - mean * mean)),
    countingAngle: capAngleDegrees(1 - 1 / k),
  };
}

/**
 * Exponentially smoothed density over a grid on the net, in multiples of sigma, with contour
 * levels at `interval` (default 2) sigma.
 * @example
 * const grid = exponentialGrid([{trend: 120, plunge: 40}, {trend: 125, plunge: 38}], {net: 'equal-area'});
 * grid.values.length === grid.width * grid.height // true
 */
export function exponentialGrid(input: Float64Array | readonly Line[], options: ExponentialDensityOptions = {}): DensityGrid {
  const { resolution, net, interval, strategy } = resolveDensityOptions(options);
  const tolerance = options.tolerance ?? DEFAULT_EXPONENTIAL_TOLERANCE;
  if (!(Number.isFinite(tolerance) && tolerance > 0)) {
    throw new RangeError(`option tolerance: ${String(tolerance)} is not usable; expected a positive number of sigma`);
  }
  const vectors = readAxes(input);
  const n = vectors.length / 3;
  const { k, expected, sigma, countingAngle } = exponentialParameters(n);
  const nodes = netGridNodes(resolution, net);
  const weight = (c: number): number => Math.exp(k * (c - 1));
  // w < w_cut  <=>  |u·v| < 1 + ln(w_cut)/k. When the cut reaches past 90° every axis matters,
  // so there is nothing to search for and all pairs are summed.
  const minCos = 1 + Math.log((tolerance * sigma) / n) / k;
  const values = densityAtNodes(nodes, vectors, { allPairs: strategy === 'all-pairs' || !(minCos > 0), minCos, allPairsMinCos: 0 }, weight, sigma);
  return {
    method: 'exponential',
    net,
    n,
    width: nodes.width,
    height: nodes.height,
    values,
    levels: contourLevels(values, interval),
    expected,
    sigma,
    countingAngle,
    k,
    x0: nodes.x0,
    y0: nodes.y0,
    step: nodes.step,
  };
}
