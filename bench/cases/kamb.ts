/**
 * Kamb counting of 10^5 poles on the default grid: bucketed search against the all-pairs loop.
 * Budget: under 100 ms (the speed target for this grid), and at least 10x the all-pairs loop.
 */
import { kambGrid } from '../../src/core/kamb';
import type { DensityGrid } from '../../src/core/density';
import type { BenchCase } from '../harness';
import { foldedPoles } from './data';
import { lazy } from './lazy';

const poles = lazy(() => foldedPoles(100_000, 1));

export const kambCase: BenchCase = {
  name: 'Kamb grid, 10^5 poles, 101-node equal-area net',
  unit: 'ms',
  setup: () => void poles(),
  run: () => kambGrid(poles()),
  // About 2 s a run: three timed runs and no warm-up keep the whole bench near a minute.
  baseline: { name: 'all-pairs loop', run: () => kambGrid(poles(), { strategy: 'all-pairs' }), warmups: 0, repetitions: 3 },
  budget: { maxMedianMs: 100, minRatio: 10 },
  check: (fast, naive) => {
    const a = (fast as DensityGrid).values;
    const b = (naive as DensityGrid).values;
    for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return `node ${i}: ${a[i]} against ${b[i]} (counts must agree exactly)`;
    return undefined;
  },
};
