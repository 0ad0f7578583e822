/**
 * The committed sample map is exactly what the generator makes now: makeSampleMap(seed) is a pure
 * function of the seed, and the files in sample-maps/korvane are its output byte for byte.
 * If this fails after a deliberate change, run `npm run sample-map` and review the diff.
 */
import { describe, expect, it } from 'vitest';
import { readdirSync, readFileSync } from 'node:fs';
import truth from '../../sample-maps/korvane/truth.json';
import { makeSampleMap } from '../../scripts/sample-map/generate';

const dir = new URL('../../sample-maps/korvane/', import.meta.url);
const asBytes = (c: string | Uint8Array): Buffer => (typeof c === 'string' ? Buffer.from(c, 'utf8') : Buffer.from(c));

describe('makeSampleMap', () => {
  const map = makeSampleMap(truth.seed);

  it('makeSampleMap(truth.seed) reproduces every committed file of sample-maps/korvane byte for byte', () => {
    const committed = readdirSync(dir).filter((f) => f !== 'index.ts').sort();
    expect(committed).toEqual(Object.keys(map.files).sort());
    for (const [name, contents] of Object.entries(map.files)) {
      const onDisk = readFileSync(new URL(name, dir));
      expect(onDisk.equals(asBytes(contents)), `${name} differs from makeSampleMap(${truth.seed}); rerun npm run sample-map`).toBe(true);
    }
  });

  it('makeSampleMap(seed) gives the same bytes twice, and another seed other stations and terrain but the same planted axes', () => {
    const again = makeSampleMap(truth.seed);
    for (const [name, contents] of Object.entries(map.files)) expect(asBytes(again.files[name]).equals(asBytes(contents)), name).toBe(true);
    const other = makeSampleMap(truth.seed + 1);
    expect(other.files['stations.csv']).not.toEqual(map.files['stations.csv']);
    expect(Buffer.from(other.files['dem.tif'] as Uint8Array).equals(Buffer.from(map.files['dem.tif'] as Uint8Array))).toBe(false);
    expect(other.truth.domains.map((d) => d.axis)).toEqual(map.truth.domains.map((d) => d.axis));
  });

  it('every file made by makeSampleMap says plainly that the data are SYNTHETIC', () => {
    for (const [name, contents] of Object.entries(map.files)) {
      const text = typeof contents === 'string' ? contents : Buffer.from(contents).toString('latin1');
      expect(text, name).toMatch(/SYNTHETIC/);
    }
  });
});
