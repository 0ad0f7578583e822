import type { Line, PlaneMeasurement } from '../core/types';
import { analyzeFold, type FoldAnalysis } from '../core/foldAnalysis';
import { describeFold, type FoldDescription, type FoldDescriptionFailure } from '../core/foldDescription';
import { kambGrid } from '../core/kamb';
import { exponentialGrid } from '../core/exponentialDensity';
import type { DensityGrid } from '../core/density';
import { lineToVector, poleOf } from '../core/vectors';

/** What the net panel needs computed for one selection. */
export interface AnalysisJob {
  readonly id: number;
  readonly planes: readonly PlaneMeasurement[];
  readonly lines: readonly Line[];
  readonly bootstrap: number;
  readonly seed: number;
  readonly density: 'kamb' | 'exponential' | 'off';
  readonly net: 'equal-area' | 'equal-angle';
}

export interface AnalysisJobResult {
  readonly id: number;
  readonly analysis: FoldAnalysis;
  readonly description: FoldDescription | FoldDescriptionFailure;
  readonly density: DensityGrid | null;
  /** Milliseconds spent, for the status line. */
  readonly elapsedMs: number;
}

/** Warnings after which limbs, interlimb angle and fold class would describe noise, not a fold. */
const NO_DESCRIPTION: ReadonlySet<string> = new Set(['no-planes', 'few-planes', 'parallel-planes', 'nearly-parallel-planes', 'axis-undefined', 'cluster-not-girdle', 'uniform-spread']);

/**
 * Describes the fold (limbs, interlimb angle, axial plane, Fleuty class) only when the poles
 * outline a girdle with a defined axis; otherwise says why not.
 */
export function describeIfGirdle(planes: readonly PlaneMeasurement[], analysis: FoldAnalysis): FoldDescription | FoldDescriptionFailure {
  const blocking = analysis.warnings.find((w) => NO_DESCRIPTION.has(w.code));
  if (blocking || !analysis.axis || planes.length < 3) {
    return { ok: false, reason: `No fold description: ${blocking ? blocking.message : 'it needs at least three planes and a defined axis.'}` };
  }
  return describeFold(planes, { axis: analysis.axis });
}

/**
 * Runs the full analysis of a selection: fold analysis with bootstrap cone, fold description
 * and the density grid. Pure; the worker and the CLI call the same function, so the panel and
 * `foldlens analyze` give identical numbers for the same stations.
 * @example runAnalysisJob({id: 1, planes, lines: [], bootstrap: 500, seed: 1, density: 'kamb', net: 'equal-area'})
 */
export function runAnalysisJob(job: AnalysisJob): AnalysisJobResult {
  const t0 = performance.now();
  const analysis = analyzeFold({ planes: job.planes, lines: job.lines }, { bootstrap: job.bootstrap, seed: job.seed });
  const description = describeIfGirdle(job.planes, analysis);
  let density: DensityGrid | null = null;
  if (job.density !== 'off' && job.planes.length > 0) {
    const poles = new Float64Array(job.planes.length * 3);
    job.planes.forEach((p, i) => {
      const v = lineToVector(poleOf(p));
      poles[3 * i] = v.x;
      poles[3 * i + 1] = v.y;
      poles[3 * i + 2] = v.z;
    });
    density = job.density === 'kamb' ? kambGrid(poles, { net: job.net }) : exponentialGrid(poles, { net: job.net });
  }
  return { id: job.id, analysis, description, density, elapsedMs: performance.now() - t0 };
}
