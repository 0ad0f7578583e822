// Test-only page: <foldlens-import> and <foldlens-table> wired as the demo would wire them, with
// the project autosaved to IndexedDB and restored on load. window.importPage lets the browser
// tests drive it (drop files, read events, save large projects, time a large read).
import '../../../src/components/foldlens-import';
import '../../../src/components/foldlens-table';
import type { FoldlensImport, ImportEventDetail, ProjectOpenDetail } from '../../../src/components/foldlens-import';
import type { FoldlensTable, RowEditDetail, RowSelectDetail } from '../../../src/components/foldlens-table';
import { reportOf } from '../../../src/components/import/importReport';
import { ParseClient } from '../../../src/worker/parseClient';
import { emptyProject, projectToJson, withDataset, withStationEdit, type FoldlensProject, type ProjectDataset } from '../../../src/io/projectFile';
import { Autosave, openProjectStore } from '../../../src/io/projectStore';
import type { Station } from '../../../src/core/station';

const params = new URLSearchParams(location.search);
const importEl = document.querySelector('#import') as FoldlensImport;
const table = document.querySelector('#table') as FoldlensTable;
const saveState = document.querySelector('#save-state') as HTMLElement;

let holdAfterWrite = false;
const store = openProjectStore({
  dbName: params.get('db') ?? 'foldlens-test',
  afterWrite: async () => {
    document.body.dataset.phase = 'written';
    // A test stops a save here, between the write and the pointer switch, and kills the page.
    if (holdAfterWrite) await new Promise<never>(() => {});
  },
});
const autosave = new Autosave(store, {
  delayMs: 150,
  onState: (state, error) => {
    saveState.textContent = state === 'saved' ? 'All changes saved.' : state === 'error' ? `Could not save: ${error?.message}` : state === 'saving' || state === 'pending' ? 'Saving…' : '';
    document.body.dataset.saveState = state;
  },
});

let project: FoldlensProject | null = null;
const events: { type: string; detail: unknown }[] = [];

function show(p: FoldlensProject): void {
  project = p;
  const dataset = p.datasets.at(-1) ?? null;
  table.data = dataset;
  importEl.current = dataset ? reportOf(dataset) : null;
}

importEl.addEventListener('foldlens-import', (e) => {
  const d = (e as CustomEvent<ImportEventDetail>).detail;
  events.push({ type: e.type, detail: { fileName: d.fileName, stations: d.stations.length, mapping: d.mapping, options: d.options, report: { ...d.report, problems: d.report.problems.length } } });
  // The demo keeps one dataset: a new import replaces the last.
  show(withDataset(emptyProject(project?.name ?? 'Field data'), d.dataset));
  autosave.schedule(project!);
});
importEl.addEventListener('foldlens-project-open', (e) => {
  const d = (e as CustomEvent<ProjectOpenDetail>).detail;
  events.push({ type: e.type, detail: { fileName: d.fileName, name: d.project.name } });
  show(d.project);
  autosave.schedule(project!);
});
importEl.addEventListener('foldlens-import-error', (e) => events.push({ type: e.type, detail: (e as CustomEvent).detail }));
table.addEventListener('foldlens-row-select', (e) => events.push({ type: e.type, detail: (e as CustomEvent<RowSelectDetail>).detail }));
for (const type of ['foldlens-row-edit', 'foldlens-row-fixed']) {
  table.addEventListener(type, (e) => {
    const d = (e as CustomEvent<RowEditDetail>).detail;
    events.push({ type, detail: { index: d.index, edit: d.edit, problems: d.station.problems.length } });
    if (type === 'foldlens-row-edit' && project) {
      project = withDataset(project, d.dataset);
      importEl.current = reportOf(d.dataset);
      autosave.schedule(project);
    }
  });
}
addEventListener('pagehide', () => void autosave.flush());

/** Synthetic rows for the benchmarks: every 40th row has a bad dip. */
function syntheticCsvParts(rows: number, notesLength = 0): string[] {
  const parts = ['id,kind,dip_direction,dip,lon,lat,notes\n'];
  const note = 'n'.repeat(notesLength);
  const block = 10_000;
  for (let from = 0; from < rows; from += block) {
    let s = '';
    for (let i = from; i < Math.min(rows, from + block); i++) {
      const dip = i % 40 === 39 ? '9O' : String(i % 90);
      s += `B${i},bedding,${(i * 37) % 360},${dip},${(14 + (i % 1000) / 1000).toFixed(5)},${(24 + (i % 997) / 997).toFixed(5)},${note}\n`;
    }
    parts.push(s);
  }
  return parts;
}

function bigProject(n: number): FoldlensProject {
  const stations: Station[] = Array.from({ length: n }, (_, i) => ({
    id: `Z${i}`,
    row: i + 1,
    kind: 'bedding',
    lon: 15 + (i % 1000) / 1e4,
    lat: 24.6 + (i % 997) / 1e4,
    plane: { dipDirection: (i * 7) % 360, dip: i % 90 },
    source: { id: `Z${i}`, dd: String((i * 7) % 360), dip: String(i % 90), notes: 'x'.repeat(40) },
    problems: [],
  }));
  const dataset: ProjectDataset = {
    id: 'big',
    name: 'big.csv',
    table: { format: 'csv', headers: ['id', 'dd', 'dip', 'notes'], delimiter: ',', blankRows: [], notes: [], extras: [] },
    mapping: { id: 'id', dipDirection: 'dd', dip: 'dip', notes: 'notes' },
    options: { planeNotation: 'auto', lineNotation: 'auto', north: 'true', defaultKind: 'bedding' },
    stations,
    edits: [],
  };
  return withDataset(emptyProject('Big'), dataset);
}

let bigSaves = 0;

const api = {
  events,
  project: () => project,
  /** Drops a file on the import component's drop zone, as a user would. */
  drop(name: string, content: string | number[], type = ''): void {
    const data = typeof content === 'string' ? content : new Uint8Array(content);
    const dt = new DataTransfer();
    dt.items.add(new File([data], name, { type }));
    const zone = importEl.shadowRoot!.querySelector('[part="panel"]')!;
    zone.dispatchEvent(new DragEvent('dragover', { dataTransfer: dt, bubbles: true, composed: true, cancelable: true }));
    zone.dispatchEvent(new DragEvent('drop', { dataTransfer: dt, bubbles: true, composed: true, cancelable: true }));
  },
  flush: () => autosave.flush(),
  /** Scans and reads a CSV with a Worker that fails to start (as under a policy refusing module workers). */
  async withoutWorker(text: string): Promise<{ format: string; rowCount?: number; stations: number }> {
    const Real = window.Worker;
    (window as unknown as { Worker: unknown }).Worker = class {
      onerror: ((e: unknown) => void) | null = null;
      constructor() {
        setTimeout(() => this.onerror?.({ message: '', preventDefault() {} }), 5);
      }
      postMessage(): void {}
      terminate(): void {}
    };
    try {
      const client = new ParseClient();
      const scan = await client.scan(new File([text], 'x.csv'), 'x.csv');
      if (scan.format !== 'csv') throw new Error(scan.format);
      const { stations } = await client.read(new File([text], 'x.csv'), { format: 'csv', mapping: { id: 'id', kind: 'kind', dipDirection: 'dipdir', dip: 'dip' }, options: { planeNotation: 'auto', lineNotation: 'auto', north: 'true' } });
      return { format: scan.format, rowCount: scan.rowCount, stations: stations.length };
    } finally {
      window.Worker = Real;
    }
  },
  /** The project as a project file (io/projectFile.ts). */
  exportProject: (): string => projectToJson(project!),
  storeKeys: () => store.keys(),
  /** Saves a project of n stations; with `hold`, the save stops after its write and never switches the pointer. */
  async bigSave(n: number, hold: boolean): Promise<void> {
    holdAfterWrite = hold;
    project = bigProject(n);
    document.body.dataset.phase = 'writing';
    const done = store.save(project).then(() => {
      document.body.dataset.phase = 'saved';
      document.body.dataset.bigSaves = String(++bigSaves);
    });
    if (!hold) await done;
  },
  /** Restores from the store (when the page was opened with ?noload). */
  async restore(): Promise<string> {
    const stored = await store.load();
    if (stored) show(stored.project);
    return stored ? String(stored.project.datasets.reduce((n, d) => n + d.stations.length, 0)) : 'none';
  },
  /** Changes station `index` of the first dataset (its notes) and saves at once. */
  async editAndSave(index: number): Promise<void> {
    const d = project!.datasets[0];
    const s = d.stations[index];
    const changed = { ...s, source: { ...s.source, notes: `edited ${Date.now()}` } };
    project = withDataset(project!, withStationEdit(d, index, changed, { row: s.row, column: 'notes', from: s.source.notes ?? '', to: changed.source.notes, at: new Date().toISOString() }));
    await store.save(project);
  },
  /** Schedules `n` projects named p1..pn in quick succession through the autosave, then flushes. */
  async autosaveBurst(n: number): Promise<void> {
    for (let i = 1; i <= n; i++) {
      autosave.schedule({ ...emptyProject(`p${i}`), datasets: project?.datasets ?? [] });
      await new Promise((r) => setTimeout(r, 20));
    }
    await autosave.flush();
  },
  /** Drops a generated CSV of `rows` rows (every 40th with a bad dip) on the import component. */
  dropRows(rows: number): number {
    const file = new File(syntheticCsvParts(rows), `generated-${rows}.csv`, { type: 'text/csv' });
    const dt = new DataTransfer();
    dt.items.add(file);
    importEl.shadowRoot!.querySelector('[part="panel"]')!.dispatchEvent(new DragEvent('drop', { dataTransfer: dt, bubbles: true, composed: true, cancelable: true }));
    return file.size;
  },
  /** Drops a generated CSV of about `megabytes` MB on the import component (a long notes column keeps the row count moderate). */
  dropLarge(megabytes: number, notesLength: number): { bytes: number; rows: number } {
    const rowBytes = 60 + notesLength;
    const rows = Math.round((megabytes * 1024 * 1024) / rowBytes);
    const file = new File(syntheticCsvParts(rows, notesLength), `large-${megabytes}MB.csv`, { type: 'text/csv' });
    const dt = new DataTransfer();
    dt.items.add(file);
    importEl.shadowRoot!.querySelector('[part="panel"]')!.dispatchEvent(new DragEvent('drop', { dataTransfer: dt, bubbles: true, composed: true, cancelable: true }));
    return { bytes: file.size, rows };
  },
  /** Reads n generated rows through the parse worker, timing it and watching the main thread. */
  async bench(n: number): Promise<{ rows: number; bytes: number; ms: number; rowsPerSecond: number; maxFrameGapMs: number; frames: number; heapPeakMB: number | null; problems: number }> {
    const file = new File(syntheticCsvParts(n), 'bench.csv');
    const memory = (performance as Performance & { memory?: { usedJSHeapSize: number } }).memory;
    let heapPeak = memory?.usedJSHeapSize ?? 0;
    let maxGap = 0;
    let frames = 0;
    let last = performance.now();
    let running = true;
    const tick = (t: number): void => {
      maxGap = Math.max(maxGap, t - last);
      last = t;
      frames++;
      if (memory) heapPeak = Math.max(heapPeak, memory.usedJSHeapSize);
      if (running) requestAnimationFrame(tick);
    };
    requestAnimationFrame(tick);
    const client = new ParseClient();
    const t0 = performance.now();
    const { stations } = await client.read(file, { format: 'csv', mapping: { id: 'id', kind: 'kind', dipDirection: 'dip_direction', dip: 'dip', lon: 'lon', lat: 'lat', notes: 'notes' }, options: { planeNotation: 'auto', lineNotation: 'auto', north: 'true' } });
    const ms = performance.now() - t0;
    running = false;
    client.dispose();
    if (memory) heapPeak = Math.max(heapPeak, memory.usedJSHeapSize);
    const problems = stations.reduce((k, s) => k + (s.problems.length > 0 ? 1 : 0), 0);
    return { rows: stations.length, bytes: file.size, ms, rowsPerSecond: (stations.length / ms) * 1000, maxFrameGapMs: maxGap, frames, heapPeakMB: memory ? heapPeak / 2 ** 20 : null, problems };
  },
};
(window as unknown as { importPage: typeof api }).importPage = api;

(params.has('noload') ? Promise.resolve(undefined) : store.load())
  .then((stored) => {
    if (stored) show(stored.project);
    document.body.dataset.restored = stored ? String(stored.project.datasets.reduce((n, d) => n + d.stations.length, 0)) : params.has('noload') ? 'skipped' : 'none';
  })
  .catch((e: Error) => {
    saveState.textContent = `The saved project could not be restored: ${e.message}`;
    document.body.dataset.restored = 'error';
  })
  .finally(() => {
    document.body.dataset.ready = 'true';
  });
