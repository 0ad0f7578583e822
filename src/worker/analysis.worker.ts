/// <reference lib="webworker" />
import { runAnalysisJob, type AnalysisJob } from './analysisJob';

// Runs selection analyses off the main thread so drawing a lasso never stutters.
// First, say where this script lives, so the page can keep a copy for offline use.
self.postMessage({ type: 'foldlens-worker-ready', url: self.location.href });

self.onmessage = (e: MessageEvent<AnalysisJob>) => {
  try {
    self.postMessage({ ok: true, result: runAnalysisJob(e.data) });
  } catch (error) {
    self.postMessage({ ok: false, id: e.data.id, message: error instanceof Error ? error.message : String(error) });
  }
};
