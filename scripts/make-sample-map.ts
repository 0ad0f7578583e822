/**
 * Writes the SYNTHETIC Korvane sample map into sample-maps/korvane/ (npm run sample-map).
 * All computation lives in makeSampleMap(seed); this script only writes files.
 * Usage: tsx scripts/make-sample-map.ts [--seed <integer>]
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { makeSampleMap, SAMPLE_MAP_DIR } from './sample-map/generate';
import { DISTRICT } from './sample-map/district';

function parseSeed(argv: readonly string[]): number {
  const i = argv.indexOf('--seed');
  if (i < 0) return DISTRICT.defaultSeed;
  const text = argv[i + 1] ?? '';
  const seed = Number(text);
  if (!/^\d+$/.test(text) || !Number.isSafeInteger(seed)) {
    throw new Error(`--seed: "${text}" is not a seed; expected a non-negative integer`);
  }
  return seed;
}

const seed = parseSeed(process.argv.slice(2));
const map = makeSampleMap(seed);
mkdirSync(SAMPLE_MAP_DIR, { recursive: true });
let total = 0;
for (const [name, contents] of Object.entries(map.files)) {
  writeFileSync(join(SAMPLE_MAP_DIR, name), contents);
  const size = typeof contents === 'string' ? Buffer.byteLength(contents) : contents.byteLength;
  total += size;
  console.log(`${name.padEnd(24)} ${(size / 1024).toFixed(1).padStart(8)} kB`);
}
console.log(`${'total'.padEnd(24)} ${(total / 1024).toFixed(1).padStart(8)} kB  (seed ${seed})`);
