import { runConsistencyJob, type AxisFieldJob, type AxisFieldJobResult, type ConsistencyJob, type ConsistencyJobResult, type DomainChecksJob, type DomainChecksJobResult } from './consistencyJob';

type Reply = { ok: true; result: ConsistencyJobResult } | { ok: false; id: number; message: string } | { type: 'foldlens-worker-ready'; url: string };
type Kind = ConsistencyJob['kind'];

/**
 * Sends consistency jobs to a web worker. Jobs of one kind supersede each other: a field job
 * overtaken by a newer field job resolves null, while a field job and a checks job run side by
 * side. Falls back to running on the main thread where workers are unavailable.
 * @example
 * const client = new ConsistencyClient();
 * const result = await client.field({ xy, poles, nx: 50, ny: 34, k: 25, bounds, angle: 10, minShare: 0.05 });
 */
export class ConsistencyClient {
  private worker: Worker | null = null;
  private nextId = 1;
  private readonly latest: Record<Kind, number> = { field: 0, checks: 0 };
  /** URL of the worker script once it has started (for offline caching); null before or without a worker. */
  workerScriptUrl: string | null = null;
  private readonly pending = new Map<number, { kind: Kind; resolve: (r: ConsistencyJobResult | null) => void; reject: (e: Error) => void }>();

  constructor() {
    try {
      this.worker = new Worker(new URL('./consistency.worker.ts', import.meta.url), { type: 'module' });
      this.worker.onmessage = (e: MessageEvent<Reply>) => this.onReply(e.data);
      this.worker.onerror = () => {
        // A worker that fails to load (strict CSP, file://) is replaced by in-thread runs.
        this.worker?.terminate();
        this.worker = null;
        for (const [id, p] of this.pending) p.reject(new Error(`consistency job ${id} lost: the consistency worker failed to start`));
        this.pending.clear();
      };
    } catch {
      this.worker = null;
    }
  }

  /** The local axis field and its suggested domains; null when a newer field job took over. */
  field(job: Omit<AxisFieldJob, 'id' | 'kind'>): Promise<AxisFieldJobResult | null> {
    return this.run({ ...job, kind: 'field' }) as Promise<AxisFieldJobResult | null>;
  }

  /** Every check of each domain; null when a newer checks job took over. */
  checks(job: Omit<DomainChecksJob, 'id' | 'kind'>): Promise<DomainChecksJobResult | null> {
    return this.run({ ...job, kind: 'checks' }) as Promise<DomainChecksJobResult | null>;
  }

  terminate(): void {
    this.worker?.terminate();
    this.worker = null;
  }

  private run(job: Omit<AxisFieldJob, 'id'> | Omit<DomainChecksJob, 'id'>): Promise<ConsistencyJobResult | null> {
    const id = this.nextId++;
    this.latest[job.kind] = id;
    const full = { ...job, id } as ConsistencyJob;
    if (!this.worker) return Promise.resolve().then(() => (id === this.latest[job.kind] ? runConsistencyJob(full) : null));
    return new Promise((resolve, reject) => {
      this.pending.set(id, { kind: job.kind, resolve, reject });
      this.worker!.postMessage(full);
    });
  }

  private onReply(reply: Reply): void {
    if ('type' in reply) {
      this.workerScriptUrl = reply.url;
      return;
    }
    const id = reply.ok ? reply.result.id : reply.id;
    const p = this.pending.get(id);
    if (!p) return;
    this.pending.delete(id);
    if (!reply.ok) p.reject(new Error(reply.message));
    else p.resolve(id === this.latest[p.kind] ? reply.result : null);
  }
}
