import { createStore, delMany, get, getMany, keys, set, setMany, type UseStore } from 'idb-keyval';
import type { Station } from '../core/station';
import { checkProject, type FoldlensProject, type ProjectDataset } from './projectFile';

/**
 * Keeping the working project in the browser's IndexedDB (through idb-keyval), so a reload, a
 * crash or a closed tab loses nothing that was saved.
 *
 * Crash safety: a save never overwrites anything. It writes the new state under new keys in one
 * transaction, and only after that transaction has committed does it switch the `pointer` key
 * to the new state (a second transaction); the keys of the old state are deleted after that.
 * A page killed at any moment therefore leaves the pointer on a complete state: the old one, or
 * the new one once the switch has committed. Keys no state points to are cleared on the next load.
 *
 * Layout: `pointer` -> {manifest, savedAt}; `m-<stamp>` -> the project with each dataset's
 * stations replaced by a list of chunk keys; `c-<stamp>-<n>` -> up to CHUNK stations. A chunk
 * whose stations are the very same objects as at the last save is not written again, so an edit
 * to one row of 10^6 rewrites one chunk, not the whole project.
 *
 * One writer at a time is assumed (one tab); `Autosave` keeps the saves of one page in order,
 * latest wins.
 */

/** Stations per stored chunk. */
export const CHUNK = 5000;

const POINTER = 'pointer';

/** Options for {@link openProjectStore}. */
export interface ProjectStoreOptions {
  /** IndexedDB database name (default `foldlens`). */
  readonly dbName?: string;
  /** Object store name (default `project`). */
  readonly storeName?: string;
  /**
   * Called after a save's new state has committed and before the pointer is switched to it;
   * the save waits for it. For diagnostics and tests (a test stops here to kill the page).
   */
  readonly afterWrite?: (manifestKey: string) => void | Promise<void>;
}

/** What {@link ProjectStore.load} found. */
export interface StoredProject {
  readonly project: FoldlensProject;
  readonly savedAt: string;
}

/** The working project in IndexedDB. */
export interface ProjectStore {
  /** Saves the project crash-safely (its `savedAt` set to now); resolves once the pointer is switched. */
  save(project: FoldlensProject): Promise<void>;
  /** The last project saved, checked (io/projectFile.ts), or undefined when there is none. Throws ProjectFileError if it no longer reads. */
  load(): Promise<StoredProject | undefined>;
  /** Forgets the stored project. */
  clear(): Promise<void>;
  /** Every key in the store (for tests and diagnostics). */
  keys(): Promise<string[]>;
}

interface Pointer {
  readonly manifest: string;
  readonly savedAt: string;
}

type StoredDataset = Omit<ProjectDataset, 'stations'> & { readonly stationChunks: readonly string[]; readonly stationCount: number };
type Manifest = Omit<FoldlensProject, 'datasets'> & { readonly datasets: readonly StoredDataset[] };

/**
 * Opens (creating if need be) the project store.
 * @example
 * const store = openProjectStore();
 * await store.save(project);
 * const restored = (await store.load())?.project;
 */
export function openProjectStore(options: ProjectStoreOptions = {}): ProjectStore {
  const db: UseStore = createStore(options.dbName ?? 'foldlens', options.storeName ?? 'project');
  // Chunks as last written or read, by key: their station objects, to see what has not changed.
  let written = new Map<string, readonly Station[]>();
  let lastChunks = new Map<string, readonly string[]>();
  let sequence = 0;

  const stampOf = (): string => `${Date.now().toString(36).padStart(10, '0')}-${(sequence++).toString(36)}`;

  const clearUnused = async (live: ReadonlySet<string>): Promise<void> => {
    const stale = (await keys<string>(db)).filter((k) => k !== POINTER && !live.has(k));
    if (stale.length > 0) await delMany(stale, db);
  };

  return {
    async save(project) {
      const stamp = stampOf();
      const entries: [string, unknown][] = [];
      const nextWritten = new Map<string, readonly Station[]>();
      const nextChunks = new Map<string, readonly string[]>();
      let n = 0;
      const datasets = project.datasets.map((d): StoredDataset => {
        const previous = lastChunks.get(d.id) ?? [];
        const chunkKeys: string[] = [];
        for (let from = 0, k = 0; from < d.stations.length; from += CHUNK, k++) {
          const part = d.stations.slice(from, from + CHUNK);
          const old = previous[k];
          const oldPart = old !== undefined ? written.get(old) : undefined;
          if (old !== undefined && oldPart && sameObjects(oldPart, part)) {
            chunkKeys.push(old);
            nextWritten.set(old, oldPart);
          } else {
            const key = `c-${stamp}-${n++}`;
            entries.push([key, part]);
            chunkKeys.push(key);
            nextWritten.set(key, part);
          }
        }
        nextChunks.set(d.id, chunkKeys);
        const { stations: _stations, ...rest } = d;
        return { ...rest, stationChunks: chunkKeys, stationCount: d.stations.length };
      });
      const manifestKey = `m-${stamp}`;
      const savedAt = new Date().toISOString();
      entries.push([manifestKey, { ...project, savedAt, datasets } satisfies Manifest]);
      // 1. The new state, all of it, in one transaction (idb-keyval resolves when it commits).
      await setMany(entries, db);
      await options.afterWrite?.(manifestKey);
      // 2. Only now does the pointer move to it.
      await set(POINTER, { manifest: manifestKey, savedAt } satisfies Pointer, db);
      written = nextWritten;
      lastChunks = nextChunks;
      // 3. The old state is no longer pointed to.
      await clearUnused(new Set([manifestKey, ...nextWritten.keys()]));
    },

    async load() {
      const pointer = await get<Pointer>(POINTER, db);
      if (!pointer) return undefined;
      const manifest = await get<Manifest>(pointer.manifest, db);
      if (!manifest) throw new Error(`the saved project is incomplete: ${pointer.manifest} is missing`);
      const nextWritten = new Map<string, readonly Station[]>();
      const nextChunks = new Map<string, readonly string[]>();
      const datasets: ProjectDataset[] = [];
      for (const d of manifest.datasets) {
        const chunks = await getMany<Station[]>([...d.stationChunks], db);
        const stations: Station[] = [];
        chunks.forEach((chunk, k) => {
          if (!chunk) throw new Error(`the saved project is incomplete: ${d.stationChunks[k]} is missing`);
          nextWritten.set(d.stationChunks[k], chunk);
          for (const s of chunk) stations.push(s);
        });
        if (stations.length !== d.stationCount) throw new Error(`the saved project is incomplete: ${d.name} has ${stations.length} of ${d.stationCount} stations`);
        nextChunks.set(d.id, d.stationChunks);
        const { stationChunks: _c, stationCount: _n, ...rest } = d;
        datasets.push({ ...rest, stations });
      }
      const project = checkProject({ ...manifest, datasets });
      written = nextWritten;
      lastChunks = nextChunks;
      // What a save killed half-way left behind.
      await clearUnused(new Set([pointer.manifest, ...nextWritten.keys()]));
      return { project, savedAt: pointer.savedAt };
    },

    async clear() {
      written = new Map();
      lastChunks = new Map();
      await delMany(await keys<string>(db), db);
    },

    keys: () => keys<string>(db),
  };
}

function sameObjects(a: readonly Station[], b: readonly Station[]): boolean {
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return false;
  return true;
}

/** Where an {@link Autosave} stands. */
export type AutosaveState = 'idle' | 'pending' | 'saving' | 'saved' | 'error';

/**
 * Saves a project a short while after each change: changes within `delayMs` (default 500) are
 * saved once, saves never overlap, and the latest project always wins (one queued while a save
 * runs replaces any queued before it).
 * @example
 * const autosave = new Autosave(openProjectStore(), { onState: (s) => (badge.textContent = s) });
 * autosave.schedule(project); // after every change
 * addEventListener('pagehide', () => void autosave.flush());
 */
export class Autosave {
  private timer: ReturnType<typeof setTimeout> | undefined;
  private queued: FoldlensProject | null = null;
  private running: Promise<void> | null = null;
  private current: AutosaveState = 'idle';
  /** The last error, when the state is `error`. */
  lastError: Error | null = null;

  constructor(
    private readonly store: ProjectStore,
    private readonly options: { delayMs?: number; onState?: (state: AutosaveState, error?: Error) => void } = {},
  ) {}

  get state(): AutosaveState {
    return this.current;
  }

  /** Saves `project` after the delay, unless a newer one comes first. */
  schedule(project: FoldlensProject): void {
    this.queued = project;
    clearTimeout(this.timer);
    this.setState('pending');
    this.timer = setTimeout(() => void this.drain(), this.options.delayMs ?? 500);
  }

  /** Saves what is queued now; resolves when nothing is left to save. */
  async flush(): Promise<void> {
    clearTimeout(this.timer);
    await this.drain();
  }

  private async drain(): Promise<void> {
    if (this.running) {
      await this.running;
      if (this.queued) await this.drain();
      return;
    }
    const project = this.queued;
    if (!project) return;
    this.queued = null;
    this.setState('saving');
    this.running = this.store.save(project).then(
      () => {
        this.lastError = null;
        if (!this.queued) this.setState('saved');
      },
      (e: unknown) => {
        this.lastError = e instanceof Error ? e : new Error(String(e));
        this.setState('error', this.lastError);
      },
    );
    try {
      await this.running;
    } finally {
      this.running = null;
    }
    if (this.queued) {
      clearTimeout(this.timer);
      await this.drain();
    }
  }

  private setState(state: AutosaveState, error?: Error): void {
    this.current = state;
    this.options.onState?.(state, error);
  }
}
