import { parseColumnMapping, type ColumnMapping } from '../../io/columns';
import { checkImportOptions, type ImportOptions } from '../../io/projectFile';

/**
 * Column mappings remembered between files: a mapping saved for one file is offered again for
 * the next file with exactly the same headers (same names, same order). Kept in localStorage
 * (or any Storage given) as JSON; entries that no longer read as a mapping are passed over.
 */

/** One remembered mapping. */
export interface SavedMapping {
  readonly headers: readonly string[];
  readonly mapping: ColumnMapping;
  readonly options: ImportOptions;
  /** The file it was saved with. */
  readonly fileName: string;
  /** When, ISO 8601. */
  readonly savedAt: string;
}

/** Finds and saves mappings by headers. */
export interface MappingMemory {
  find(headers: readonly string[]): SavedMapping | undefined;
  save(entry: SavedMapping): void;
  forget(headers: readonly string[]): void;
}

/** The localStorage key used by default. */
export const SAVED_MAPPINGS_KEY = 'foldlens.savedMappings.v1';

/**
 * A memory of mappings in `storage` (default: localStorage where there is one, else memory
 * only), newest first, at most `max` entries.
 * @example
 * const memory = mappingMemory();
 * memory.save({ headers, mapping, options, fileName: 'a.csv', savedAt: new Date().toISOString() });
 * memory.find(headers)?.mapping
 */
export function mappingMemory(storage: Pick<Storage, 'getItem' | 'setItem'> | undefined = defaultStorage(), key = SAVED_MAPPINGS_KEY, max = 30): MappingMemory {
  let fallback: SavedMapping[] = [];
  const sameHeaders = (a: readonly string[], b: readonly string[]): boolean => a.length === b.length && a.every((h, i) => h === b[i]);
  const load = (): SavedMapping[] => {
    if (!storage) return fallback;
    let json: unknown;
    try {
      json = JSON.parse(storage.getItem(key) ?? '[]');
    } catch {
      return [];
    }
    return Array.isArray(json) ? json.filter(isSavedMapping) : [];
  };
  const store = (entries: SavedMapping[]): void => {
    if (!storage) {
      fallback = entries;
      return;
    }
    try {
      storage.setItem(key, JSON.stringify(entries));
    } catch {
      // Storage full or refused (private browsing): the mapping is simply not remembered.
    }
  };
  return {
    find: (headers) => load().find((e) => sameHeaders(e.headers, headers)),
    save: (entry) => store([entry, ...load().filter((e) => !sameHeaders(e.headers, entry.headers))].slice(0, max)),
    forget: (headers) => store(load().filter((e) => !sameHeaders(e.headers, headers))),
  };
}

function isSavedMapping(v: unknown): v is SavedMapping {
  if (v === null || typeof v !== 'object') return false;
  const e = v as Record<string, unknown>;
  if (!Array.isArray(e.headers) || !e.headers.every((h) => typeof h === 'string')) return false;
  if (typeof e.fileName !== 'string' || typeof e.savedAt !== 'string') return false;
  try {
    parseColumnMapping(e.mapping);
    checkImportOptions(e.options);
    return Object.values(e.mapping as Record<string, string>).every((c) => (e.headers as string[]).includes(c));
  } catch {
    return false;
  }
}

function defaultStorage(): Storage | undefined {
  try {
    return typeof localStorage !== 'undefined' ? localStorage : undefined;
  } catch {
    return undefined;
  }
}
