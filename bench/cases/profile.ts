/**
 * Down-plunge projection of 10^6 linework vertices and 10^5 station positions
 * (src/core/downPlunge.ts, projectDownPlunge into preallocated arrays) against the plainest
 * possible loop: a hand-written 3 x 3 matrix multiply over the same typed arrays.
 * Budget: median under 50 ms, and no more than twice the plain loop's median
 * (minRatio 0.5 = baseline median / case median, so case median <= 2 x baseline median).
 * The check compares every output number of the two.
 */
import { projectDownPlunge } from '../../src/core/downPlunge';
import type { BenchCase } from '../harness';
import { seededUniform } from './data';
import { lazy } from './lazy';

const AXIS = { trend: 75, plunge: 12 };

/** n east-north-up positions in a 6 km x 4 km district with 300 m of relief, seeded. */
function positions(n: number, seed: number): Float64Array {
  const rnd = seededUniform(seed);
  const out = new Float64Array(3 * n);
  for (let i = 0; i < n; i++) {
    out[3 * i] = 6000 * rnd() - 3000;
    out[3 * i + 1] = 4000 * rnd() - 2000;
    out[3 * i + 2] = 670 + 300 * rnd();
  }
  return out;
}

const vertices = lazy(() => positions(1_000_000, 11));
const stations = lazy(() => positions(100_000, 12));
const outputs = lazy(() => ({ vertices: new Float64Array(3_000_000), stations: new Float64Array(300_000) }));
const baselineOutputs = lazy(() => ({ vertices: new Float64Array(3_000_000), stations: new Float64Array(300_000) }));

/** The same matrix as REFERENCES.md "Profiles", written out once, applied in a bare loop. */
function plainMultiply(xyz: Float64Array, out: Float64Array): void {
  const t = (AXIS.trend * Math.PI) / 180;
  const p = (AXIS.plunge * Math.PI) / 180;
  const m = [Math.cos(t), -Math.sin(t), 0, Math.sin(p) * Math.sin(t), Math.sin(p) * Math.cos(t), Math.cos(p), Math.cos(p) * Math.sin(t), Math.cos(p) * Math.cos(t), -Math.sin(p)];
  const [m0, m1, m2, m3, m4, m5, m6, m7, m8] = m;
  for (let i = 0; i < xyz.length; i += 3) {
    const x = xyz[i];
    const y = xyz[i + 1];
    const z = xyz[i + 2];
    out[i] = m0 * x + m1 * y + m2 * z;
    out[i + 1] = m3 * x + m4 * y + m5 * z;
    out[i + 2] = m6 * x + m7 * y + m8 * z;
  }
}

export const profileCase: BenchCase = {
  name: 'down-plunge 10^6 vertices + 10^5 stations',
  unit: 'ms',
  // A few milliseconds a run and bound by memory: many runs steady the medians against load.
  warmups: 5,
  repetitions: 40,
  setup: () => {
    vertices();
    stations();
    outputs();
    baselineOutputs();
  },
  run: () => {
    const o = outputs();
    projectDownPlunge(vertices(), AXIS, o.vertices);
    projectDownPlunge(stations(), AXIS, o.stations);
    return o;
  },
  baseline: {
    name: 'plain typed-array loop doing only the matrix multiply',
    warmups: 5,
    repetitions: 40,
    run: () => {
      const o = baselineOutputs();
      plainMultiply(vertices(), o.vertices);
      plainMultiply(stations(), o.stations);
      return o;
    },
  },
  budget: { maxMedianMs: 50, minRatio: 0.5 },
  check: (fast, plain) => {
    const a = fast as { vertices: Float64Array; stations: Float64Array };
    const b = plain as { vertices: Float64Array; stations: Float64Array };
    for (const k of ['vertices', 'stations'] as const) {
      for (let i = 0; i < a[k].length; i++) {
        // Same products in a different order of terms can differ in the last bits only.
        if (!(Math.abs(a[k][i] - b[k][i]) <= 1e-9 * Math.max(1, Math.abs(b[k][i])))) return `${k}[${i}]: ${a[k][i]} against ${b[k][i]}`;
      }
    }
    return undefined;
  },
};
