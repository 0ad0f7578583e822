import { describe, expect, it } from 'vitest';
import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import { readFile } from 'node:fs/promises';
import { join } from 'node:path';
import proj4 from 'proj4';
import { writeArrayBuffer } from 'geotiff';
import { runCli, type CliIo } from '../../src/cli/main';
import { PROFILE_CAUTION, type ProfileReport } from '../../src/cli/profile';
import { loadEpsgFromIndex } from '../../src/io/epsgNode';
import truth from '../../sample-maps/korvane/truth.json';
import { expectClose } from '../helpers/tolerance';

const DIR = join('tests', 'fixtures', 'profile-basic');
const f = (name: string): string => join(DIR, name);
const DEM = 'sample-maps/korvane/dem.tif';
/** REGEN=1 rewrites the expected outputs (never on CI); inspect the diff by eye before committing. */
const REGEN = process.env.REGEN === '1' && !process.env.CI;

interface MemoryIo extends CliIo {
  readonly out: () => string;
  readonly err: () => string;
  readonly written: Map<string, string>;
}

function memoryIo(extra: Record<string, string | Uint8Array> = {}): MemoryIo {
  let out = '';
  let err = '';
  const written = new Map<string, string>();
  return {
    stdout: { write: (t: string) => (out += t) },
    stderr: { write: (t: string) => (err += t) },
    readFile: async (path: string) => extra[path] ?? written.get(path) ?? readFile(path),
    writeFile: async (path: string, text: string) => {
      written.set(path, text);
    },
    epsg: loadEpsgFromIndex,
    out: () => out,
    err: () => err,
    written,
  };
}

async function run(argv: string[], extra: Record<string, string | Uint8Array> = {}) {
  const io = memoryIo(extra);
  const code = await runCli(argv, io);
  return { code, out: io.out(), err: io.err(), io };
}

function expectFile(name: string, actual: string): void {
  const path = f(name);
  if (REGEN || !existsSync(path)) {
    if (!REGEN) expect.fail(`${path} is missing: run REGEN=1 npx vitest run --project unit tests/cli/profile.test.ts and inspect it`);
    writeFileSync(path, actual);
    return;
  }
  expect(actual).toBe(readFileSync(path, 'utf8'));
}

const BASE = ['profile', f('stations.csv'), '--axis', '075/12', '--lines', f('lines.geojson'), '--dem', DEM];

describe('runCli(profile) on tests/fixtures/profile-basic', () => {
  it('runCli(profile stations.csv --axis 075/12 --lines --dem) writes the expected CSV and lists the unreadable row and the points without height', async () => {
    const { code, out, err } = await run(BASE);
    expect(code).toBe(1);
    expectFile('out.csv', out);
    expectFile('stderr.txt', err);
    expect(err).toMatch(/row 6, column dip: "95"/);
    expect(err).toMatch(/station PB-05 \(row 5\) has no elevation in the data, and it lies outside the DEM .*; left out/);
    expect(err).toMatch(/linework feature 2 \(id 2, form line\), line 2, vertex 3: no height in the file, and it lies outside the DEM/);
  });

  it('runCli(profile --json) gives station coordinates that match proj4 and the analytic down-plunge formula of REFERENCES.md', async () => {
    const { out } = await run([...BASE, '--json']);
    const r = JSON.parse(out) as ProfileReport;
    expect(r.frame.crs).toBe('EPSG:32633');
    expect(r.caution).toBe(PROFILE_CAUTION);
    // Grid trend = true trend - convergence (crs.ts); near the central meridian the convergence is tiny.
    expectClose(r.frame.gridAxis.trend, 75 - r.frame.convergence, 1e-6, 'grid trend');
    expect(Math.abs(r.frame.convergence)).toBeLessThan(0.05);
    const rows = readFileSync(f('stations.csv'), 'utf8').trim().split('\n').slice(1);
    const pb01 = rows.find((l) => l.startsWith('PB-01,'))!.split(',');
    // Outside reference: proj4's UTM zone 33N, then x' = P·u, y' = P·v, depth = P·a (REFERENCES.md "Profiles").
    const [e, n] = proj4('WGS84', truth.crs.proj4, [Number(pb01[2]), Number(pb01[3])]);
    const P = [e - r.frame.originEasting, n - r.frame.originNorthing, Number(pb01[4])];
    const t = (r.frame.gridAxis.trend * Math.PI) / 180;
    const p = (12 * Math.PI) / 180;
    const x = P[0] * Math.cos(t) - P[1] * Math.sin(t);
    const y = P[0] * Math.sin(p) * Math.sin(t) + P[1] * Math.sin(p) * Math.cos(t) + P[2] * Math.cos(p);
    const depth = P[0] * Math.cos(p) * Math.sin(t) + P[1] * Math.cos(p) * Math.cos(t) - P[2] * Math.sin(p);
    const s = r.stations.find((st) => st.id === 'PB-01')!;
    expectClose(s.x, x, 2e-3, "x'");
    expectClose(s.y, y, 2e-3, "y'");
    expectClose(s.alongAxis, depth, 2e-3, 'along axis');
    expect(s.elevationSource).toBe('data');
    // PB-02 had no height: it comes from the DEM.
    expect(r.stations.find((st) => st.id === 'PB-02')!.elevationSource).toBe('dem');
    // The hinge reading equals the axis: a point in the profile, 0° from the axis.
    expect(r.stations.find((st) => st.id === 'PB-03')!.angleToAxis).toBe(0);
    expect(r.leftOut).toHaveLength(2);
  });

  it('runCli(profile --within area.geojson --json) keeps stations and vertices inside the area and breaks lines where they leave it', async () => {
    const { code, out } = await run([...BASE, '--within', f('area.geojson'), '--json']);
    expect(code).toBe(1); // the unreadable row
    const r = JSON.parse(out) as ProfileReport;
    expectFile('out-within.json', out);
    expect(r.input.within).toMatchObject({ stationsInside: 5, stationsOutside: 1 });
    expect(r.stations.map((s) => s.id)).toEqual(['PB-01', 'PB-02', 'PB-03', '<b>&"x"', 'PB-07']);
    // The form line leaves the area after its first part: only that part remains.
    expect(r.lines.filter((l) => l.id === '2').map((l) => [l.part, l.vertices])).toEqual([[1, [1, 2]]]);
    // Outside the area nothing is reported missing: only the unreadable row is on stderr.
    expect(r.leftOut).toEqual([]);
  });

  it('runCli(profile --svg) writes a standalone SVG with escaped text, a scale bar, the title block and the caution, and no script', async () => {
    const { code, io } = await run([...BASE, '--svg', 'memory:profile.svg', '--title', 'Korvane <west> & "test"', '--drawn', '2025-01-15']);
    expect(code).toBe(1);
    const svg = io.written.get('memory:profile.svg')!;
    expect(svg.startsWith('<svg xmlns="http://www.w3.org/2000/svg"')).toBe(true);
    expect(svg).not.toMatch(/<script|javascript:|onload=|href=/i);
    expect(svg).toContain('Korvane &lt;west&gt; &amp; &quot;test&quot;');
    expect(svg).toContain('&lt;b&gt;&amp;&quot;x&quot; (bedding)');
    expect(svg).not.toContain('<b>');
    expect(svg).toContain('Date: 2025-01-15.');
    expect(svg).toMatch(/Axis 075\.0\/12\.0 \(trend\/plunge, true north\)/);
    expect(svg).toMatch(/>\d+ (m|km)<\/text>/);
    expect(svg.replace(/\s+/g, ' ')).toContain(PROFILE_CAUTION);
    // Five stations: four ticks (planes) and one dot (the hinge); two lines plus the kept parts.
    expect((svg.match(/<line x1=[^>]*stroke="#/g) ?? []).length).toBe(4);
    expect((svg.match(/<circle [^>]*r="3.2"/g) ?? []).length).toBe(1);
    expectFile('profile.svg', svg);
  });
});

describe('runCli(profile) on the SYNTHETIC Korvane sample map', () => {
  it('runCli(profile stations.csv --axis 074.994/12 --within west domain) shows bedding and hinges of the west domain close to the planted axis', async () => {
    const west = truth.domains.find((d) => d.id === 'west')!;
    const area = JSON.stringify({ type: 'Polygon', coordinates: [west.polygon] });
    const { code, out, err } = await run(
      ['profile', 'sample-maps/korvane/stations.csv', '--axis', '074.994/12', '--lines', 'sample-maps/korvane/contacts.geo.json', '--dem', DEM, '--within', 'memory:west.geojson', '--json'],
      { 'memory:west.geojson': area },
    );
    expect(code).toBe(1); // four planted bad rows cannot be read
    for (const id of ['32', '134', '376', '450']) expect(err).toMatch(new RegExp(`row ${id}, column`));
    const r = JSON.parse(out) as ProfileReport;
    expect(r.stations.length).toBeGreaterThan(200);
    const hinges = r.stations.filter((s) => s.kind === 'hinge');
    expect(hinges.length).toBeGreaterThanOrEqual(15);
    // Hinges scatter about the axis by about 3° of trend and 2° of plunge (truth.json noise): all within 10°.
    for (const h of hinges) expect(h.angleToAxis!, h.id).toBeLessThan(10);
    // Bedding contains the axis in a cylindrical fold: most planes are within a few degrees of it.
    const bedding = r.stations.filter((s) => s.kind === 'bedding' && s.trace);
    const close = bedding.filter((s) => s.trace!.angleToAxis < 6).length;
    expect(close / bedding.length).toBeGreaterThan(0.8);
    expect(r.lines.length).toBeGreaterThan(5);
  });
});

describe('runCli(profile) usage errors', () => {
  const cases: { argv: string[]; extra?: Record<string, string | Uint8Array>; message: RegExp }[] = [
    { argv: ['profile', f('stations.csv')], message: /profile needs --axis <trend\/plunge>/ },
    { argv: ['profile', f('stations.csv'), '--axis', '75/120'], message: /--axis 75\/120: / },
    { argv: ['profile', '--axis', '075/12'], message: /profile takes one stations file, got 0/ },
    { argv: ['profile', f('stations.csv'), '--axis', '075/12', '--title', 'x'], message: /--title applies to the SVG: give --svg/ },
    { argv: ['profile', f('stations.csv'), '--axis', '075/12', '--drawn', '15/01/2025', '--svg', 'x.svg'], message: /--drawn 15\/01\/2025: expected a date written YYYY-MM-DD/ },
    {
      argv: ['profile', f('stations.csv'), '--axis', '075/12', '--lines', 'memory:points.geojson'],
      extra: { 'memory:points.geojson': '{"type":"Feature","properties":{},"geometry":{"type":"Point","coordinates":[15,24.6]}}' },
      message: /--lines memory:points\.geojson: feature 1 is a Point; expected a LineString or MultiLineString/,
    },
    {
      argv: ['profile', f('stations.csv'), '--axis', '075/12', '--dem', 'memory:nocrs.tif'],
      extra: {
        'memory:nocrs.tif': new Uint8Array(
          writeArrayBuffer(new Float32Array([1, 2, 3, 4]), { width: 2, height: 2, ModelPixelScale: [40, 40, 0], ModelTiepoint: [0, 0, 0, 497000, 2725000, 0], GTModelTypeGeoKey: 1, ProjectedCSTypeGeoKey: 32767 }),
        ),
      },
      message: /--dem memory:nocrs\.tif: the file names no EPSG code for its CRS; give it with --dem-crs/,
    },
    { argv: ['profile', f('stations.csv'), '--axis', '075/12', '--dem', 'no-such.tif'], message: /cannot read no-such\.tif: no such file/ },
  ];
  for (const c of cases) {
    it(`runCli([${c.argv.slice(2).join(' ')}]) exits 2 with "${c.message.source}"`, async () => {
      const { code, err } = await run(c.argv, c.extra);
      expect(code).toBe(2);
      expect(err).toMatch(c.message);
    });
  }

  it('runCli([help, profile]) prints the profile help with the caution', async () => {
    const { code, out } = await run(['help', 'profile']);
    expect(code).toBe(0);
    expect(out).toMatch(/^Usage: foldlens profile/);
    expect(out).toContain(PROFILE_CAUTION);
  });
});
