import { describe, expect, it } from 'vitest';
import { LatestJobClient, type WorkerReply } from '../../src/worker/latestJobClient';

type Job = { id: number; lane: string; value: number };
type Result = { id: number; doubled: number };

/** A stand-in worker: keeps what was posted, answers when the test says so. */
class FakeWorker {
  onmessage: ((e: MessageEvent<WorkerReply<Result>>) => void) | null = null;
  onerror: (() => void) | null = null;
  readonly posted: Job[] = [];
  terminated = false;
  postMessage(job: Job): void {
    this.posted.push(job);
  }
  terminate(): void {
    this.terminated = true;
  }
  answer(reply: WorkerReply<Result>): void {
    this.onmessage?.({ data: reply } as MessageEvent<WorkerReply<Result>>);
  }
}

const double = (job: Job): Result => ({ id: job.id, doubled: job.value * 2 });

function clientWith(worker: FakeWorker | null): LatestJobClient<Job, Result> {
  return new LatestJobClient<Job, Result>({
    startWorker: () => {
      if (!worker) throw new Error('no workers here');
      return worker as unknown as Worker;
    },
    runInThread: double,
    laneOf: (job) => job.lane,
    label: 'test job',
  });
}

describe('LatestJobClient', () => {
  it('client.run(job) resolves the worker\'s answer to the latest job and null for one a newer job of its lane overtook', async () => {
    const worker = new FakeWorker();
    const client = clientWith(worker);
    const first = client.run({ lane: 'a', value: 1 });
    const second = client.run({ lane: 'a', value: 2 });
    expect(worker.posted.map((j) => j.value)).toEqual([1, 2]);
    // Answers may come back in any order.
    worker.answer({ ok: true, result: double(worker.posted[1]) });
    worker.answer({ ok: true, result: double(worker.posted[0]) });
    expect(await second).toEqual({ id: worker.posted[1].id, doubled: 4 });
    expect(await first).toBeNull();
  });

  it('client.run(job) in different lanes runs side by side: neither supersedes the other', async () => {
    const worker = new FakeWorker();
    const client = clientWith(worker);
    const a = client.run({ lane: 'a', value: 3 });
    const b = client.run({ lane: 'b', value: 5 });
    for (const job of worker.posted) worker.answer({ ok: true, result: double(job) });
    expect((await a)?.doubled).toBe(6);
    expect((await b)?.doubled).toBe(10);
  });

  it('a failed job rejects with the worker\'s message; the script URL the worker announces is kept', async () => {
    const worker = new FakeWorker();
    const client = clientWith(worker);
    worker.answer({ type: 'foldlens-worker-ready', url: 'http://example.test/w.js' });
    expect(client.workerScriptUrl).toBe('http://example.test/w.js');
    const job = client.run({ lane: 'a', value: 1 });
    worker.answer({ ok: false, id: worker.posted[0].id, message: 'bad input in row 3' });
    await expect(job).rejects.toThrow('bad input in row 3');
  });

  it('a worker that fails to start rejects the jobs it held, and later jobs run on the main thread', async () => {
    const worker = new FakeWorker();
    const client = clientWith(worker);
    const held = client.run({ lane: 'a', value: 1 });
    worker.onerror?.();
    await expect(held).rejects.toThrow(/test job \d+ lost: the worker failed to start/);
    expect(worker.terminated).toBe(true);
    expect(await client.run({ lane: 'a', value: 7 })).toMatchObject({ doubled: 14 });
  });

  it('without workers, jobs run on the main thread and the latest of a lane still wins', async () => {
    const client = clientWith(null);
    const first = client.run({ lane: 'a', value: 1 });
    const second = client.run({ lane: 'a', value: 2 });
    const other = client.run({ lane: 'b', value: 3 });
    expect(await first).toBeNull();
    expect((await second)?.doubled).toBe(4);
    expect((await other)?.doubled).toBe(6);
  });
});
