import { runConsistencyJob, type AxisFieldJob, type AxisFieldJobResult, type ConsistencyJob, type ConsistencyJobResult, type DomainChecksJob, type DomainChecksJobResult } from './consistencyJob';
import { LatestJobClient } from './latestJobClient';

/**
 * Sends consistency jobs to a web worker. Jobs of one kind supersede each other: a field job
 * overtaken by a newer field job resolves null, while a field job and a checks job run side by
 * side. Falls back to running on the main thread where workers are unavailable.
 * @example
 * const client = new ConsistencyClient();
 * const result = await client.field({ xy, poles, nx: 50, ny: 34, k: 25, bounds, angle: 10, minShare: 0.05 });
 */
export class ConsistencyClient extends LatestJobClient<ConsistencyJob, ConsistencyJobResult> {
  constructor() {
    super({
      startWorker: () => new Worker(new URL('./consistency.worker.ts', import.meta.url), { type: 'module' }),
      runInThread: runConsistencyJob,
      laneOf: (job) => job.kind,
      label: 'consistency job',
    });
  }

  /** The local axis field and its suggested domains; null when a newer field job took over. */
  field(job: Omit<AxisFieldJob, 'id' | 'kind'>): Promise<AxisFieldJobResult | null> {
    return this.run({ ...job, kind: 'field' }) as Promise<AxisFieldJobResult | null>;
  }

  /** Every check of each domain; null when a newer checks job took over. */
  checks(job: Omit<DomainChecksJob, 'id' | 'kind'>): Promise<DomainChecksJobResult | null> {
    return this.run({ ...job, kind: 'checks' }) as Promise<DomainChecksJobResult | null>;
  }
}
