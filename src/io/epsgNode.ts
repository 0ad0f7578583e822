import { readFile } from 'node:fs/promises';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import type { EpsgLoader, EpsgRecord } from './crs';

/**
 * EPSG definitions for Node (the command line): reads the one small `s/<code>.json` file of
 * the `epsg-index` package that is asked for, rather than its 8 MB `all.json`.
 * Node only: it uses the file system. Resolves to undefined when the code is not in the index.
 * @example
 * const crs = await resolveCrs('EPSG:2263', loadEpsgFromIndex);
 */
export const loadEpsgFromIndex: EpsgLoader = async (code: number): Promise<EpsgRecord | undefined> => {
  if (!Number.isInteger(code) || code <= 0) return undefined;
  const require = createRequire(import.meta.url);
  const root = dirname(require.resolve('epsg-index/package.json'));
  try {
    return JSON.parse(await readFile(join(root, 's', `${code}.json`), 'utf8')) as EpsgRecord;
  } catch (e) {
    if ((e as NodeJS.ErrnoException).code === 'ENOENT') return undefined;
    throw e;
  }
};
