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

/**
 * Runs the full analysis of a selection: fold analysis with bootstrap cone, fold description
 * and the density grid. Pure; the worker and the CLI call the same function, so the panel and
 * `foldlens analyze` give identical numbers for the same stations.
 * @example runAnalysisJob({id: 1, planes, lines: [], bootstrap: 500, seed: 1, density: 'kamb', net: 'equal-area'})
 */
export function runAnalysisJob(job: AnalysisJob): AnalysisJobResult {
  const t0 = performance.now();
  const analysis = analyzeFold({ planes: job.planes, lines: job.lines }, { bootstrap: job.bootstrap, seed: job.seed });
  const description: FoldDescription | FoldDescriptionFailure =
    job.planes.length >= 3 && analysis.axis ? describeFold(job.planes, { axis: analysis.axis }) : { ok: false, reason: 'A fold description needs at least three planes and a defined axis.' };
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
