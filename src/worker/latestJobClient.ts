/** A worker's answer: a result, a failure of one job, or the worker announcing its script URL. */
export type WorkerReply<R> = { ok: true; result: R } | { ok: false; id: number; message: string } | { type: 'foldlens-worker-ready'; url: string };

/** How a {@link LatestJobClient} starts its worker and runs jobs without one. */
export interface LatestJobClientOptions<J extends { id: number }, R extends { id: number }> {
  /**
   * Starts the worker. Each client writes its `new Worker(...)` call, with the script's URL made
   * from `import.meta.url`, out in its own file, so the bundler finds and builds the worker script.
   */
  readonly startWorker: () => Worker;
  /** Runs a job on the main thread, where workers are unavailable or failed to start. */
  readonly runInThread: (job: J) => R;
  /** Jobs in one lane supersede each other; jobs in different lanes run side by side. */
  readonly laneOf: (job: Omit<J, 'id'>) => string;
  /** Names the work in error messages ("analysis", "consistency job"). */
  readonly label: string;
}

/**
 * Sends jobs to a web worker, newest first per lane: a job overtaken by a newer one of its lane
 * before its answer arrives resolves null, so a panel always shows the answer to the latest
 * request. Falls back to running on the main thread when the worker cannot be made or fails to
 * start (strict CSP, file://), and then rejects the jobs the failed worker held.
 * @example
 * const client = new LatestJobClient<Job, Result>({
 *   startWorker: () => new Worker(myWorkerUrl, { type: 'module' }),
 *   runInThread: runMyJob, laneOf: () => 'all', label: 'my job',
 * });
 * const result = await client.run({ ... }); // null when a newer job took over
 */
export class LatestJobClient<J extends { id: number }, R extends { id: number }> {
  /** URL of the worker script once it has started (for offline caching); null before or without a worker. */
  workerScriptUrl: string | null = null;
  private worker: Worker | null = null;
  private nextId = 1;
  private readonly latest = new Map<string, number>();
  private readonly pending = new Map<number, { lane: string; resolve: (r: R | null) => void; reject: (e: Error) => void }>();
  private readonly options: LatestJobClientOptions<J, R>;

  constructor(options: LatestJobClientOptions<J, R>) {
    this.options = options;
    try {
      this.worker = options.startWorker();
      this.worker.onmessage = (e: MessageEvent<WorkerReply<R>>) => this.onReply(e.data);
      this.worker.onerror = () => {
        this.worker?.terminate();
        this.worker = null;
        for (const [id, p] of this.pending) p.reject(new Error(`${options.label} ${id} lost: the worker failed to start`));
        this.pending.clear();
      };
    } catch {
      this.worker = null;
    }
  }

  /** Runs a job; resolves null when a newer job of its lane superseded it. */
  run(job: Omit<J, 'id'>): Promise<R | null> {
    const id = this.nextId++;
    const lane = this.options.laneOf(job);
    this.latest.set(lane, id);
    const full = { ...job, id } as J;
    if (!this.worker) return Promise.resolve().then(() => (this.latest.get(lane) === id ? this.options.runInThread(full) : null));
    return new Promise((resolve, reject) => {
      this.pending.set(id, { lane, resolve, reject });
      this.worker!.postMessage(full);
    });
  }

  /** Stops the worker; later jobs run on the main thread. */
  terminate(): void {
    this.worker?.terminate();
    this.worker = null;
  }

  private onReply(reply: WorkerReply<R>): void {
    if ('type' in reply) {
      this.workerScriptUrl = reply.url;
      return;
    }
    const id = reply.ok ? reply.result.id : reply.id;
    const p = this.pending.get(id);
    if (!p) return;
    this.pending.delete(id);
    if (!reply.ok) p.reject(new Error(reply.message));
    else p.resolve(this.latest.get(p.lane) === id ? reply.result : null);
  }
}
