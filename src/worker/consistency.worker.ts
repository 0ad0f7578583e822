/// <reference lib="webworker" />
import { runConsistencyJob, type ConsistencyJob } from './consistencyJob';

// Runs the local axis field and the domain checks off the main thread, so the map stays live.
// First, say where this script lives, so the page can keep a copy for offline use.
self.postMessage({ type: 'foldlens-worker-ready', url: self.location.href });

self.onmessage = (e: MessageEvent<ConsistencyJob>) => {
  try {
    self.postMessage({ ok: true, result: runConsistencyJob(e.data) });
  } catch (error) {
    self.postMessage({ ok: false, id: e.data.id, message: error instanceof Error ? error.message : String(error) });
  }
};
