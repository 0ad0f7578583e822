/**
 * Exponential smoothing of 10^5 poles: truncated, bucketed sum against the all-pairs sum.
 * The all-pairs sum costs about 25 ns per node and pole (1e9 exponentials on the default
 * grid, near half a minute), so the comparison runs on a coarse 25-node grid; the default grid
 * is timed on its own.
 */
import { exponentialGrid } from '../../src/core/exponentialDensity';
import type { DensityGrid } from '../../src/core/density';
import type { BenchCase } from '../harness';
import { foldedPoles } from './data';
import { lazy } from './lazy';

const poles = lazy(() => foldedPoles(100_000, 2));

export const exponentialCoarseCase: BenchCase = {
  name: 'exponential density, 10^5 poles, 25-node equal-area net',
  unit: 'ms',
  setup: () => void poles(),
  run: () => exponentialGrid(poles(), { resolution: 25 }),
  baseline: {
    name: 'all-pairs sum',
    run: () => exponentialGrid(poles(), { resolution: 25, strategy: 'all-pairs' }),
    warmups: 0,
    repetitions: 3,
  },
  budget: { minRatio: 10 },
  check: (fast, naive) => {
    const a = (fast as DensityGrid).values;
    const b = (naive as DensityGrid).values;
    // Truncation is bounded by the default tolerance, 1e-6 sigma, at every node.
    for (let i = 0; i < a.length; i++) if (!(Math.abs(a[i] - b[i]) <= 1e-6)) return `node ${i}: ${a[i]} against ${b[i]} sigma`;
    return undefined;
  },
};

export const exponentialCase: BenchCase = {
  name: 'exponential density, 10^5 poles, 101-node equal-area net',
  unit: 'ms',
  setup: () => void poles(),
  run: () => exponentialGrid(poles()),
  repetitions: 7,
};
