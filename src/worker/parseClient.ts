import type { Station } from '../core/station';
import type { DatasetTable } from '../io/projectFile';
import type { GivenLocation } from '../io/readStations';
import {
  ImportFileError,
  readFileStations,
  scanFile,
  type ReadProgress,
  type ReadRequest,
  type ScanResult,
  type StationBatch,
} from '../components/import/parseJob';

/** Messages to the parse worker. */
export type ParseRequest =
  | { readonly type: 'scan'; readonly id: number; readonly file: Blob; readonly fileName: string; readonly options: { delimiter?: string } }
  | { readonly type: 'read'; readonly id: number; readonly file: Blob; readonly request: ReadRequest };

/** Messages from the parse worker. */
export type ParseReply =
  | { readonly type: 'scanned'; readonly id: number; readonly scan: ScanResult }
  | { readonly type: 'batch'; readonly id: number; readonly batch: StationBatch }
  | { readonly type: 'progress'; readonly id: number; readonly progress: ReadProgress }
  | { readonly type: 'done'; readonly id: number; readonly table: DatasetTable; readonly rowCount: number }
  | { readonly type: 'error'; readonly id: number; readonly code: string; readonly message: string };

/** Every station of a file, with the table's shape. */
export interface ParsedFile {
  readonly stations: Station[];
  readonly table: DatasetTable;
}

interface Job {
  resolve(value: unknown): void;
  reject(error: Error): void;
  onBatch?(batch: StationBatch): void;
  onProgress?(progress: ReadProgress): void;
  /** The same job run on the page, for when the worker cannot start at all. */
  inPage(): Promise<unknown>;
}

/**
 * Reads files for import in a web worker (src/worker/parse.worker.ts): `scan` for the mapping
 * step, `read` for every row, with progress. `cancel()` stops whatever is running at once (the
 * worker is terminated and a fresh one started for the next job); the promises of the jobs
 * stopped reject with an ImportFileError of code `cancelled`. Where workers cannot start
 * (a strict content security policy, file://), the same code runs on the page.
 * @example
 * const client = new ParseClient();
 * const scan = await client.scan(file, file.name);
 * const { stations } = await client.read(file, { format: 'csv', mapping, options }, (p) => bar.value = p.bytes / p.totalBytes);
 */
export class ParseClient {
  private worker: Worker | null = null;
  private workerFailed = false;
  private nextId = 1;
  private readonly jobs = new Map<number, Job>();
  private inPage: AbortController | null = null;

  /** Looks at a file: format, columns, first rows. Rejects with ImportFileError. */
  scan(file: Blob, fileName: string, options: { delimiter?: string } = {}): Promise<ScanResult> {
    const inPage = (): Promise<ScanResult> => this.runInPage(() => scanFile(file, fileName, options));
    const worker = this.ensureWorker();
    if (!worker) return inPage();
    return this.start<ScanResult>({ type: 'scan', id: this.nextId++, file, fileName, options: { ...options } }, worker, inPage);
  }

  /** Reads every row; `onProgress` hears how far it has got. Rejects with ImportFileError. */
  read(file: Blob, request: ReadRequest, onProgress?: (p: ReadProgress) => void): Promise<ParsedFile> {
    const stations: Station[] = [];
    const locations: (GivenLocation | null)[] = [];
    const onBatch = (b: StationBatch): void => {
      // A loop, not push(...b.stations): batches can be long.
      for (const s of b.stations) stations.push(s);
      if (b.locations) for (const l of b.locations) locations.push(l);
    };
    const finish = ({ table }: { table: DatasetTable }): ParsedFile => ({ stations, table: table.format === 'geojson' ? { ...table, locations } : table });
    const inPage = (): Promise<{ table: DatasetTable }> =>
      this.runInPage((signal) => readFileStations(file, request, { batch: onBatch, progress: onProgress ?? (() => {}) }, signal));
    const worker = this.ensureWorker();
    if (!worker) return inPage().then(finish);
    return this.start<{ table: DatasetTable }>({ type: 'read', id: this.nextId++, file, request }, worker, inPage, onBatch, onProgress).then(finish);
  }

  /** Stops every running job now; their promises reject with code `cancelled`. */
  cancel(): void {
    this.inPage?.abort();
    this.inPage = null;
    if (this.worker) {
      this.worker.terminate();
      this.worker = null;
    }
    this.failAll(new ImportFileError('cancelled', 'the import was cancelled; nothing was changed'));
  }

  /** Ends the worker for good. */
  dispose(): void {
    this.cancel();
  }

  private ensureWorker(): Worker | null {
    if (this.worker || this.workerFailed || typeof Worker === 'undefined') return this.worker;
    try {
      const worker = new Worker(new URL('./parse.worker.ts', import.meta.url), { type: 'module' });
      let heard = false;
      worker.onmessage = (e: MessageEvent<ParseReply>) => {
        heard = true;
        this.onReply(e.data);
      };
      worker.onerror = (e: ErrorEvent) => {
        e.preventDefault();
        worker.terminate();
        if (this.worker === worker) this.worker = null;
        if (!heard) {
          // The worker never started (module workers refused here): run the same jobs on the page.
          this.workerFailed = true;
          const jobs = [...this.jobs.values()];
          this.jobs.clear();
          for (const job of jobs) job.inPage().then(job.resolve, job.reject);
          return;
        }
        this.failAll(
          new ImportFileError(
            'worker',
            `the file reader stopped unexpectedly${e.message ? ` (${e.message})` : ''}; perhaps the file is too large for this device's memory. Nothing was changed`,
          ),
        );
      };
      this.worker = worker;
    } catch {
      this.workerFailed = true;
    }
    return this.worker;
  }

  private start<T>(message: ParseRequest, worker: Worker, inPage: () => Promise<unknown>, onBatch?: (b: StationBatch) => void, onProgress?: (p: ReadProgress) => void): Promise<T> {
    return new Promise<T>((resolve, reject) => {
      this.jobs.set(message.id, { resolve: resolve as (v: unknown) => void, reject, onBatch, onProgress, inPage });
      worker.postMessage(message);
    });
  }

  private async runInPage<T>(f: (signal: AbortSignal) => Promise<T>): Promise<T> {
    const controller = new AbortController();
    this.inPage = controller;
    try {
      return await f(controller.signal);
    } finally {
      if (this.inPage === controller) this.inPage = null;
    }
  }

  private onReply(reply: ParseReply): void {
    const job = this.jobs.get(reply.id);
    if (!job) return;
    switch (reply.type) {
      case 'batch':
        job.onBatch?.(reply.batch);
        return;
      case 'progress':
        job.onProgress?.(reply.progress);
        return;
      case 'scanned':
        this.jobs.delete(reply.id);
        job.resolve(reply.scan);
        return;
      case 'done':
        this.jobs.delete(reply.id);
        job.resolve({ table: reply.table });
        return;
      case 'error':
        this.jobs.delete(reply.id);
        job.reject(new ImportFileError(reply.code, reply.message));
    }
  }

  private failAll(error: Error): void {
    const jobs = [...this.jobs.values()];
    this.jobs.clear();
    for (const job of jobs) job.reject(error);
  }
}
