import { runAnalysisJob, type AnalysisJob, type AnalysisJobResult } from './analysisJob';
import { LatestJobClient } from './latestJobClient';

/**
 * Sends analysis jobs to a web worker, newest first: a job that is overtaken by a newer one
 * before its answer arrives is dropped, so the panel always shows the latest selection.
 * Falls back to running on the main thread where workers are unavailable.
 * @example
 * const client = new AnalysisClient();
 * const result = await client.run({ planes, lines: [], bootstrap: 500, seed: 1, density: 'kamb', net: 'equal-area' });
 * if (result) console.log(result.analysis.axis);
 */
export class AnalysisClient extends LatestJobClient<AnalysisJob, AnalysisJobResult> {
  constructor() {
    super({
      startWorker: () => new Worker(new URL('./analysis.worker.ts', import.meta.url), { type: 'module' }),
      runInThread: runAnalysisJob,
      laneOf: () => 'analysis',
      label: 'analysis',
    });
  }
}
