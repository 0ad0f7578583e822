import { runAnalysisJob, type AnalysisJob, type AnalysisJobResult } from './analysisJob';

type Reply = { ok: true; result: AnalysisJobResult } | { ok: false; id: number; message: string } | { type: 'foldlens-worker-ready'; url: string };

/**
 * Sends analysis jobs to a web worker, newest first: a job that is overtaken by a newer one
 * before its answer arrives is dropped, so the panel always shows the latest selection.
 * Falls back to running on the main thread where workers are unavailable.
 * @example
 * const client = new AnalysisClient();
 * const result = await client.run({ planes, lines: [], bootstrap: 500, seed: 1, density: 'kamb', net: 'equal-area' });
 * if (result) console.log(result.analysis.axis);
 */
export class AnalysisClient {
  private worker: Worker | null = null;
  private nextId = 1;
  private latest = 0;
  /** URL of the worker script once it has started (for offline caching); null before or without a worker. */
  workerScriptUrl: string | null = null;
  private readonly pending = new Map<number, { resolve: (r: AnalysisJobResult | null) => void; reject: (e: Error) => void }>();

  constructor() {
    try {
      this.worker = new Worker(new URL('./analysis.worker.ts', import.meta.url), { type: 'module' });
      this.worker.onmessage = (e: MessageEvent<Reply>) => this.onReply(e.data);
      this.worker.onerror = () => {
        // A worker that fails to load (strict CSP, file://) is replaced by in-thread runs.
        this.worker?.terminate();
        this.worker = null;
        for (const [id, p] of this.pending) p.reject(new Error(`analysis ${id} lost: the analysis worker failed to start`));
        this.pending.clear();
      };
    } catch {
      this.worker = null;
    }
  }

  /** Runs a job; resolves null when a newer job superseded it. */
  run(job: Omit<AnalysisJob, 'id'>): Promise<AnalysisJobResult | null> {
    const id = this.nextId++;
    this.latest = id;
    if (!this.worker) {
      return Promise.resolve().then(() => (id === this.latest ? runAnalysisJob({ ...job, id }) : null));
    }
    return new Promise((resolve, reject) => {
      this.pending.set(id, { resolve, reject });
      this.worker!.postMessage({ ...job, id });
    });
  }

  terminate(): void {
    this.worker?.terminate();
    this.worker = null;
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
    else p.resolve(id === this.latest ? reply.result : null);
  }
}
