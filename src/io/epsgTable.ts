import type { EpsgLoader, EpsgRecord } from './crs';

/**
 * EPSG definitions anywhere, offline, with no file system: the browser (page and workers) and
 * Node alike. Every code of the `epsg-index` package, compacted by scripts/make-epsg-table.ts into
 * `epsgTable.json` (1.4 MB, 0.2 MB gzipped), is loaded by a dynamic import the first time a code
 * outside the built-in table of crs.ts is asked for. Bundlers put it in a chunk of its own, so
 * the main bundle does not carry it and a user who never types an EPSG code never downloads it.
 *
 * Once fetched, the demo's service worker (public/foldlens-sw.js) keeps the chunk with every other
 * file it has fetched, so it works offline from then on. Fetched for the first time without a
 * network, the import fails and {@link EpsgTableUnavailableError} says so plainly.
 */

/** The shape of epsgTable.json: see scripts/make-epsg-table.ts. */
interface EpsgTable {
  readonly source: string;
  readonly kinds: readonly string[];
  /** code -> [kind index, name, proj4 or "", north?, west?, south?, east?] */
  readonly crs: Readonly<Record<string, readonly (string | number)[]>>;
}

/**
 * The EPSG table could not be loaded (the chunk could not be fetched: offline on first use, or
 * the server is gone). The message says what happened and what to do instead.
 */
export class EpsgTableUnavailableError extends Error {
  constructor(cause: unknown) {
    super(
      'the EPSG table could not be loaded. It is downloaded (about 0.2 MB) the first time an EPSG code outside the built-in list is used, ' +
        'and kept for offline use after that; this device may be offline and has not fetched it yet. ' +
        `Connect once and try again, choose a coordinate system from the list, or give its proj4 definition (+proj=...) (${cause instanceof Error ? cause.message : String(cause)})`,
    );
    this.name = 'EpsgTableUnavailableError';
  }
}

let table: Promise<EpsgTable> | null = null;

/** Starts loading the table (once); a failed load is tried again on the next call. */
function loadTable(): Promise<EpsgTable> {
  table ??= import('./epsgTable.json').then(
    (m) => (m.default ?? m) as unknown as EpsgTable,
    (e: unknown) => {
      table = null;
      throw new EpsgTableUnavailableError(e);
    },
  );
  return table;
}

/**
 * Finds an EPSG record by code in the lazily loaded table; undefined when the code is not in the
 * EPSG index. Rejects with {@link EpsgTableUnavailableError} when the table cannot be fetched.
 * @example
 * const crs = await resolveCrs('EPSG:2263', loadEpsgFromTable); // NAD83 / New York Long Island (ftUS)
 */
export const loadEpsgFromTable: EpsgLoader = async (code: number): Promise<EpsgRecord | undefined> => {
  if (!Number.isInteger(code) || code <= 0) return undefined;
  const t = await loadTable();
  const row = t.crs[String(code)];
  if (!row) return undefined;
  const [kind, name, proj4, ...bbox] = row as [number, string, string, ...number[]];
  return { code: String(code), kind: t.kinds[kind], name, proj4, ...(bbox.length === 4 && { bbox }) };
};

/**
 * Where the table's definitions come from, as the table says (for notes and reports).
 * @example await epsgTableSource() // 'epsg-index 2.0.0 all.json (...)'
 */
export async function epsgTableSource(): Promise<string> {
  return (await loadTable()).source;
}
