/// <reference lib="webworker" />
import { ImportFileError, readFileStations, scanFile } from '../components/import/parseJob';
import type { ParseReply, ParseRequest } from './parseClient';

// Reads files for import off the main thread, so the page stays responsive while a large file
// is parsed; stations go back in batches as they are read. Cancelling terminates the worker.
const post = (reply: ParseReply): void => self.postMessage(reply);

self.onmessage = async (e: MessageEvent<ParseRequest>) => {
  const m = e.data;
  try {
    if (m.type === 'scan') {
      post({ type: 'scanned', id: m.id, scan: await scanFile(m.file, m.fileName, m.options) });
    } else {
      const { table, rowCount } = await readFileStations(m.file, m.request, {
        batch: (batch) => post({ type: 'batch', id: m.id, batch }),
        progress: (progress) => post({ type: 'progress', id: m.id, progress }),
      });
      post({ type: 'done', id: m.id, table, rowCount });
    }
  } catch (error) {
    const code = error instanceof ImportFileError ? error.code : 'internal';
    const message = error instanceof Error ? error.message : String(error);
    post({ type: 'error', id: m.id, code, message: code === 'internal' ? `the file could not be read (${message})` : message });
  }
};
