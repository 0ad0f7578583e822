import { beforeAll, describe, expect, it } from 'vitest';
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { REPO, buildAndListPack, readPackageJson, type PackResult } from './buildPackage';
import { embeddingGuide } from './embeddingGuide';

// What `npm pack` ships: the library's ES modules, their type declarations, the CSS, the README
// and the command line; nothing of the tests, the demo or the sample map.
const ALLOWED: readonly RegExp[] = [
  /^package\.json$/,
  /^README\.md$/,
  /^LICENSE(\.md|\.txt)?$/i,
  /^styles\/foldlens\.css$/,
  /^dist\/lib\/[\w.-]+\.js(\.map)?$/,
  /^dist\/lib\/assets\/[\w.-]+\.worker-[\w-]+\.js(\.map)?$/,
  // The EPSG register table, loaded on first use of a code outside the built-in list (src/io/epsgTable.ts).
  /^dist\/lib\/assets\/epsgTable-[\w-]+\.js(\.map)?$/,
  /^dist\/types\/(?!app\/|cli\/)[\w/.-]+\.d\.ts$/,
  /^dist\/cli\/foldlens\.js(\.map)?$/,
];

/** The package a bare specifier names ('@turf/turf/x' -> '@turf/turf'), or null for a relative or built-in one. */
function packageOf(specifier: string): string | null {
  const bare = specifier.split('?')[0];
  if (/^(\.|\/|node:|data:)/.test(bare)) return null;
  const parts = bare.split('/');
  return bare.startsWith('@') ? parts.slice(0, 2).join('/') : parts[0];
}

/** Every module specifier a JS or .d.ts file imports or re-exports, as written (JSDoc and TSDoc aside). */
function importsOf(source: string): string[] {
  const code = source.replace(/\/\*[\s\S]*?\*\//g, '');
  const found: string[] = [];
  for (const m of code.matchAll(/^\s*(?:import|export)\s[^;]*?\bfrom\s*["']([^"']+)["']/gm)) found.push(m[1]);
  for (const m of code.matchAll(/^\s*import\s*["']([^"']+)["']/gm)) found.push(m[1]);
  for (const m of code.matchAll(/\bimport\(\s*["']([^"']+)["']\s*\)/g)) found.push(m[1]);
  return found;
}

const pkg = readPackageJson();
const dependencies = Object.keys(pkg.dependencies ?? {});
const peers = Object.keys(pkg.peerDependencies ?? {});

describe('npm pack (after npm run build:lib and build:cli)', () => {
  let pack: PackResult;
  let paths: string[];
  const read = (path: string) => readFileSync(join(REPO, path), 'utf8');

  beforeAll(async () => {
    pack = await buildAndListPack();
    paths = pack.files.map((f) => f.path).sort();
  }, 300_000);

  it('npm pack ships only the library, its types, its CSS, the README and the command line', () => {
    expect(paths.filter((p) => !ALLOWED.some((re) => re.test(p)))).toEqual([]);
    // Named so a failure says what leaked, should the patterns above ever be loosened.
    expect(paths.filter((p) => /(^|\/)(tests?|sample-maps|public|src|bench|scripts|docs)\//.test(p) || /\.test\.|demo|foldlens-sw|index\.html/.test(p))).toEqual([]);
  });

  it('npm pack holds every file that package.json points to (exports, main, module, types, bin)', () => {
    const targets = new Set<string>(['README.md', 'package.json', 'styles/foldlens.css']);
    for (const value of Object.values(pkg.exports ?? {})) {
      for (const target of typeof value === 'string' ? [value] : Object.values(value)) targets.add(target);
    }
    for (const target of [pkg.main, pkg.module, pkg.types, ...Object.values(pkg.bin ?? {})]) if (target) targets.add(target);
    const missing = [...targets].map((t) => t.replace(/^\.\//, '')).filter((t) => !paths.includes(t));
    expect(missing).toEqual([]);
    expect(paths.filter((p) => p.startsWith('dist/types/')).length).toBeGreaterThan(20);
  });

  it('the library is ES modules that import every dependency and MapLibre rather than bundle them', () => {
    const entries = paths.filter((p) => /^dist\/lib\/[^/]+\.js$/.test(p));
    expect(entries).toEqual(expect.arrayContaining(['dist/lib/foldlens.js', 'dist/lib/core.js']));
    const imported = new Set<string>();
    for (const path of entries) {
      const code = read(path);
      expect(code, path).toMatch(/^export\s*\{/m);
      expect(code, path).not.toMatch(/\brequire\(/);
      for (const s of importsOf(code)) {
        const name = packageOf(s);
        if (name) imported.add(name);
      }
    }
    expect([...imported].filter((name) => !dependencies.includes(name) && !peers.includes(name))).toEqual([]);
    expect(imported.has('maplibre-gl')).toBe(true);
    // A bundled package shows up among the source map's sources; the main thread bundles none.
    for (const path of entries.filter((p) => paths.includes(`${p}.map`))) {
      const sources = (JSON.parse(read(`${path}.map`)) as { sources: string[] }).sources;
      expect(sources.filter((s) => s.includes('node_modules/')), path).toEqual([]);
    }
  });

  it('the library has no bundler-only imports (?url, ?worker, ?raw), which break a host\'s dev server and other bundlers', () => {
    for (const path of paths.filter((p) => p.startsWith('dist/lib/') && p.endsWith('.js'))) {
      expect(importsOf(read(path)).filter((s) => s.includes('?')), path).toEqual([]);
    }
  });

  it('the workers are shipped self-contained and found relative to the module that starts them', () => {
    const code = read('dist/lib/foldlens.js');
    const workerUrls = [...code.matchAll(/new URL\(\s*["']([^"']*worker[^"']*)["']\s*,\s*import\.meta\.url\s*\)/g)].map((m) => m[1]);
    expect(workerUrls.length).toBeGreaterThanOrEqual(2); // analysis and file parsing
    for (const url of workerUrls) {
      expect(url, 'a root-absolute URL would point at the host site').not.toMatch(/^\//);
      const path = join('dist/lib', url).replace(/\\/g, '/');
      expect(paths).toContain(path);
      expect(importsOf(read(path)).map(packageOf).filter(Boolean), `${path} must not import packages: a worker cannot resolve them`).toEqual([]);
    }
  });

  it('every package the type declarations import is one a consumer gets installed', () => {
    const installed = new Set([...dependencies, ...peers]);
    const transitive = new Set<string>();
    for (const dep of installed) {
      const file = join(REPO, 'node_modules', dep, 'package.json');
      if (existsSync(file)) for (const d of Object.keys((JSON.parse(readFileSync(file, 'utf8')) as { dependencies?: object }).dependencies ?? {})) transitive.add(d);
    }
    const unresolved = new Set<string>();
    for (const path of paths.filter((p) => p.endsWith('.d.ts'))) {
      for (const s of importsOf(read(path))) {
        const name = packageOf(s);
        if (name && !installed.has(name) && !installed.has(`@types/${name}`) && !transitive.has(name)) unresolved.add(`${path}: ${name}`);
      }
    }
    expect([...unresolved]).toEqual([]);
  });

  it('the command line is an executable ES module that needs only the dependencies (no MapLibre, no dev tools)', () => {
    const code = read('dist/cli/foldlens.js');
    expect(code.startsWith('#!/usr/bin/env node\n')).toBe(true);
    const needed = importsOf(code).map(packageOf).filter((n): n is string => n !== null);
    expect(needed.filter((n) => !dependencies.includes(n))).toEqual([]);
  });

  it('no source map in the package comes from tests, the demo or the sample map', () => {
    for (const path of paths.filter((p) => p.endsWith('.map'))) {
      const sources = (JSON.parse(read(path)) as { sources: string[] }).sources;
      expect(sources.filter((s) => /(^|\/)(tests|sample-maps|bench|scripts)\/|\/src\/app\//.test(s)), path).toEqual([]);
    }
  });
});

describe('package.json: MapLibre is the host\'s', () => {
  it('maplibre-gl is a peer dependency whose range holds the pinned development version, and not a dependency', () => {
    expect(pkg.dependencies?.['maplibre-gl']).toBeUndefined();
    const range = pkg.peerDependencies?.['maplibre-gl'] ?? '';
    const m = /^>=(\d+)\.(\d+)\.(\d+) <(\d+)$/.exec(range);
    expect(m, `peer range "${range}"`).not.toBeNull();
    const dev = (pkg.devDependencies?.['maplibre-gl'] ?? '').split('.').map(Number);
    const low = m!.slice(1, 4).map(Number);
    const atLeast = dev[0] !== low[0] ? dev[0] > low[0] : dev[1] !== low[1] ? dev[1] > low[1] : dev[2] >= low[2];
    expect(atLeast && dev[0] < Number(m![4]), `devDependency ${dev.join('.')} within ${range}`).toBe(true);
  });

  it("the README's install line installs foldlens with a MapLibre major inside the peer range", () => {
    const { install } = embeddingGuide(readFileSync(join(REPO, 'README.md'), 'utf8'));
    const words = install.split(/\s+/);
    expect(words.slice(0, 2)).toEqual(['npm', 'install']);
    expect(words).toContain('foldlens');
    const maplibre = words.find((w) => w.startsWith('maplibre-gl'));
    expect(maplibre, install).toBeDefined();
    const major = /^maplibre-gl@(\d+)$/.exec(maplibre!)?.[1];
    const peerMajor = /<(\d+)$/.exec(pkg.peerDependencies?.['maplibre-gl'] ?? '')?.[1];
    expect(Number(major), `${maplibre} should name the major the peer range allows`).toBe(Number(peerMajor) - 1);
  });
});
