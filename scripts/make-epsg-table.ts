/**
 * Writes src/io/epsgTable.json, the EPSG table the browser loads on first use (src/io/epsgTable.ts),
 * from the `epsg-index` package's all.json (npm run epsg-table; rerun after updating epsg-index).
 *
 * all.json is 7.8 MB, most of it WKT text no reader here needs. The table keeps, for every code,
 * only the kind, the name, the proj4 definition (exactly as the package writes it) and the
 * [north, west, south, east] area: about 1.4 MB, 0.2 MB gzipped (measured when written; the
 * script prints the sizes). Codes are in ascending order and the output is deterministic, so a
 * test can check the committed file against this function's output.
 *
 * Usage: tsx scripts/make-epsg-table.ts
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { gzipSync } from 'node:zlib';

/** One record of epsg-index's all.json (the fields used). */
export interface EpsgIndexRecord {
  readonly code: string;
  readonly kind: string;
  readonly name: string;
  readonly proj4?: string;
  readonly bbox?: readonly number[];
}

/** Where the table is written, relative to the repository. */
export const EPSG_TABLE_PATH = 'src/io/epsgTable.json';

/** The epsg-index package's all.json, parsed, and its version. */
export function readEpsgIndex(): { version: string; records: Record<string, EpsgIndexRecord> } {
  const require = createRequire(import.meta.url);
  const root = dirname(require.resolve('epsg-index/package.json'));
  const version = (JSON.parse(readFileSync(join(root, 'package.json'), 'utf8')) as { version: string }).version;
  return { version, records: JSON.parse(readFileSync(join(root, 'all.json'), 'utf8')) as Record<string, EpsgIndexRecord> };
}

/**
 * The text of src/io/epsgTable.json for the records of all.json: `{source, kinds, crs}` where
 * `crs[code]` is `[kind index, name, proj4 ("" when the index has none), north, west, south, east]`
 * (the area left out when the index has none).
 * @example makeEpsgTable('2.0.0', { '2263': { code: '2263', kind: 'CRS-PROJCRS', name: 'NAD83 / New York Long Island (ftUS)', proj4: '+proj=lcc ...' } })
 */
export function makeEpsgTable(version: string, records: Record<string, EpsgIndexRecord>): string {
  const codes = Object.keys(records)
    .filter((c) => /^\d+$/.test(c))
    .sort((a, b) => Number(a) - Number(b));
  const kinds = [...new Set(codes.map((c) => records[c].kind))].sort();
  const crs: Record<string, unknown[]> = {};
  for (const c of codes) {
    const r = records[c];
    const row: unknown[] = [kinds.indexOf(r.kind), r.name, r.proj4 ?? ''];
    if (r.bbox && r.bbox.length === 4) row.push(...r.bbox);
    crs[c] = row;
  }
  const source = `epsg-index ${version} all.json (the EPSG register's definitions as that package carries them); written by scripts/make-epsg-table.ts`;
  // One code per line: readable diffs when the index is updated.
  const lines = codes.map((c) => `${JSON.stringify(c)}:${JSON.stringify(crs[c])}`);
  return `{"source":${JSON.stringify(source)},\n"kinds":${JSON.stringify(kinds)},\n"crs":{\n${lines.join(',\n')}\n}}\n`;
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  const { version, records } = readEpsgIndex();
  const text = makeEpsgTable(version, records);
  writeFileSync(EPSG_TABLE_PATH, text);
  const kb = (n: number): string => `${(n / 1024).toFixed(0)} kB`;
  console.log(`${EPSG_TABLE_PATH}: ${Object.keys(records).length} codes, ${kb(Buffer.byteLength(text))}, ${kb(gzipSync(text).length)} gzipped (all.json: ${kb(JSON.stringify(records).length)})`);
}
