import { checkDomain, type DomainCheck, type DomainCheckInput, type DomainCheckOptions } from '../core/consistency/domainCheck';
import { partitionAxisField, type AxisPartition } from '../core/consistency/domainBoundaries';
import { localAxisField, type LocalAxisField } from '../core/consistency/localAxisField';
import type { Line } from '../core/types';

/**
 * The consistency computations the demo runs off the main thread: the local fold axis field with
 * its suggested domains, and every check of a set of domains. Pure; the worker
 * (consistency.worker.ts) and its in-thread fallback call the same function, so the map shows
 * the numbers `foldlens check` prints for the same inputs.
 */

/** The local axis field of planes and its partition into suggested domains. */
export interface AxisFieldJob {
  readonly kind: 'field';
  readonly id: number;
  /** Positions (x, y pairs, frame metres) and unit poles (north-east-down triples) of the planes. */
  readonly xy: Float64Array;
  readonly poles: Float64Array;
  readonly nx: number;
  readonly ny: number;
  /** Planes per window (k nearest). */
  readonly k: number;
  readonly bounds: readonly [number, number, number, number];
  /** Largest angle between a node's axis and its region's mean axis, degrees. */
  readonly angle: number;
  /** Regions with fewer than this share of the nodes with an axis are merged into a neighbour (0 to 1). */
  readonly minShare: number;
  /** Axis every local axis is compared with; absent: the pi axis of all the planes. */
  readonly reference?: Line;
}

/** Every check of each domain (domainCheck.ts). */
export interface DomainChecksJob {
  readonly kind: 'checks';
  readonly id: number;
  readonly domains: readonly DomainCheckInput[];
  readonly options: DomainCheckOptions;
}

export type ConsistencyJob = AxisFieldJob | DomainChecksJob;

/** Answer to an {@link AxisFieldJob}. */
export interface AxisFieldJobResult {
  readonly kind: 'field';
  readonly id: number;
  readonly field: LocalAxisField;
  readonly partition: AxisPartition;
  readonly elapsedMs: number;
}

/** Answer to a {@link DomainChecksJob}. */
export interface DomainChecksJobResult {
  readonly kind: 'checks';
  readonly id: number;
  readonly checks: readonly DomainCheck[];
  readonly elapsedMs: number;
}

export type ConsistencyJobResult = AxisFieldJobResult | DomainChecksJobResult;

/**
 * Runs one consistency job. Throws a RangeError naming the bad input (from core).
 * @example
 * runConsistencyJob({ kind: 'field', id: 1, xy, poles, nx: 50, ny: 34, k: 25, bounds, angle: 10, minShare: 0.05 })
 */
export function runConsistencyJob(job: AxisFieldJob): AxisFieldJobResult;
export function runConsistencyJob(job: DomainChecksJob): DomainChecksJobResult;
export function runConsistencyJob(job: ConsistencyJob): ConsistencyJobResult;
export function runConsistencyJob(job: ConsistencyJob): ConsistencyJobResult {
  const t0 = performance.now();
  if (job.kind === 'checks') {
    const checks = job.domains.map((d) => checkDomain(d, job.options));
    return { kind: 'checks', id: job.id, checks, elapsedMs: performance.now() - t0 };
  }
  if (!(job.minShare >= 0 && job.minShare < 1)) throw new RangeError(`axis field: smallest domain ${String(job.minShare)} is not a share of the field (0 to under 1)`);
  const field = localAxisField(job.xy, job.poles, { nx: job.nx, ny: job.ny, k: job.k, bounds: job.bounds, ...(job.reference && { reference: job.reference }) });
  let defined = 0;
  for (let i = 0; i < field.trend.length; i++) if (Number.isFinite(field.trend[i])) defined++;
  // Speckle of a few nodes where windows straddle a boundary is merged away (domainBoundaries.ts).
  const partition = partitionAxisField(field, { angle: job.angle, minNodes: Math.max(1, Math.round(job.minShare * defined)) });
  return { kind: 'field', id: job.id, field, partition, elapsedMs: performance.now() - t0 };
}
