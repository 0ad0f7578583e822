import { describe, it, expect } from 'vitest';
import { readFileSync, writeFileSync, existsSync } from 'node:fs';
import { readFile } from 'node:fs/promises';
import { execFile } from 'node:child_process';
import { join } from 'node:path';
import { runCli, type CliIo } from '../../src/cli/main';
import { loadEpsgFromIndex } from '../../src/io/epsgNode';
import { readCsv } from '../../src/io/csvTable';
import { expectAzimuth, expectClose, expectDeepClose } from '../helpers/tolerance';

const FIXTURES = join('tests', 'fixtures');
/** REGEN=1 rewrites the expected outputs (never on CI); inspect the diff by eye before committing. */
const REGEN = process.env.REGEN === '1' && !process.env.CI;

interface MemoryIo extends CliIo {
  readonly out: () => string;
  readonly err: () => string;
  readonly written: Map<string, string>;
}

/** Streams that collect text, files read from disk unless written during the run. */
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

async function run(argv: string[], extra: Record<string, string | Uint8Array> = {}): Promise<{ code: number; out: string; err: string; io: MemoryIo }> {
  const io = memoryIo(extra);
  const code = await runCli(argv, io);
  return { code, out: io.out(), err: io.err(), io };
}

/** Compares with the expected file, or writes it under REGEN. */
function expectFile(dir: string, name: string, actual: string, compare: (a: string, e: string) => void = (a, e) => expect(a).toBe(e)): void {
  const path = join(FIXTURES, dir, name);
  if (REGEN || !existsSync(path)) {
    if (!REGEN) expect.fail(`${path} is missing: run REGEN=1 npx vitest run --project unit tests/cli and inspect it`);
    writeFileSync(path, actual);
    return;
  }
  compare(actual, readFileSync(path, 'utf8'));
}

/** The numeric core of an analyze --json result: what the golden files keep. */
function analysisCore(json: string): unknown {
  const r = JSON.parse(json);
  return { n: r.n, axis: r.axis, girdle: r.girdle, eigenvalues: r.eigenvalues, woodcock: r.woodcock, cone95: r.cone95, beta: r.beta, lines: r.lines, input: r.input };
}

describe('runCli on fixtures (tests/fixtures/<name>/in -> expected out)', () => {
  const f = (dir: string, name: string): string => join(FIXTURES, dir, name);
  const cases = [
    {
      title: 'convert field notebook --to dipdir',
      dir: 'convert-notebook',
      argv: ['convert', f('convert-notebook', 'in.csv'), '--to', 'dipdir'],
      code: 1,
      stdout: 'out-dipdir.csv',
      stderr: 'stderr.txt',
    },
    {
      title: 'convert field notebook --to quadrant --lines-to quadrant --decimals 0 --out',
      dir: 'convert-notebook',
      argv: ['convert', f('convert-notebook', 'in.csv'), '--to', 'quadrant', '--lines-to', 'quadrant', '--decimals', '0', '--out', 'memory:out.csv'],
      code: 1,
      file: ['memory:out.csv', 'out-quadrant.csv'],
    },
    {
      title: 'convert semicolon file in UTM with grid north --to rhr',
      dir: 'convert-grid-semicolon',
      argv: ['convert', f('convert-grid-semicolon', 'in.csv'), '--to', 'rhr', '--crs', 'EPSG:32633', '--north', 'grid'],
      code: 1,
      stdout: 'out-rhr.csv',
      stderr: 'stderr.txt',
    },
    {
      title: 'convert semicolon file in UTM to GeoJSON',
      dir: 'convert-grid-semicolon',
      argv: ['convert', f('convert-grid-semicolon', 'in.csv'), '--to', 'dipdir', '--crs', 'UTM 33N', '--out', 'memory:out.geojson'],
      code: 1,
      file: ['memory:out.geojson', 'out.geojson'],
    },
  ] as const;
  for (const c of cases) {
    it(`runCli([${c.argv.slice(0, 1)}...]) matches the fixture: ${c.title}`, async () => {
      const r = await run([...c.argv]);
      expect(r.code, r.err).toBe(c.code);
      if ('stdout' in c) expectFile(c.dir, c.stdout, r.out);
      if ('stderr' in c) expectFile(c.dir, c.stderr, r.err);
      if ('file' in c) expectFile(c.dir, c.file[1], r.io.written.get(c.file[0]) ?? '');
    });
  }

  it('runCli(["analyze", in.csv, "--within", area, "--json"]) matches the fixture fold-two-domains/out-within.json', async () => {
    const r = await run(['analyze', f('fold-two-domains', 'in.csv'), '--crs', 'EPSG:32633', '--within', f('fold-two-domains', 'area.geojson'), '--json']);
    expect(r.code, r.err).toBe(0);
    expectFile('fold-two-domains', 'out-within.json', `${JSON.stringify(analysisCore(r.out), null, 2)}\n`, (a, e) => expectDeepClose(JSON.parse(a), JSON.parse(e), 1e-9));
  });
});

describe('runCli convert', () => {
  it('runCli convert writes every original row and column back, and the added dip directions are right', async () => {
    // 008/12E is 098/12 (Coe 2010, fig. 2.6); 030/45SE and 210/45SE are both 120/45; S55E is 125 (common practice).
    const r = await run(['convert', join(FIXTURES, 'convert-notebook', 'in.csv'), '--to', 'dipdir']);
    const input = readCsv(readFileSync(join(FIXTURES, 'convert-notebook', 'in.csv'), 'utf8'));
    const output = readCsv(r.out);
    expect(output.rows.map((x) => x.row)).toEqual(input.rows.map((x) => x.row));
    for (const [i, row] of output.rows.entries()) for (const h of input.headers) expect(row.values[h]).toBe(input.rows[i].values[h]);
    const byId = new Map(output.rows.map((x) => [x.values.Stn, x.values]));
    expect([byId.get('BH-01')!.fl_dip_direction, byId.get('BH-01')!.fl_dip]).toEqual(['98', '12']);
    expect(byId.get('BH-02')!.fl_dip_direction).toBe('120');
    expect(byId.get('BH-03')!.fl_dip_direction).toBe('120');
    expect(byId.get('BH-04')!.fl_dip_direction).toBe('225');
    expect(byId.get('BH-06')!.fl_trend).toBe('125');
    expect(r.err).toContain('row 9, column Dip: "95"; expected a dip from 0 to 90');
  });

  it('runCli convert output converted again gives the same normalised columns (round trip)', async () => {
    const first = await run(['convert', join(FIXTURES, 'convert-notebook', 'in.csv'), '--to', 'rhr', '--out', 'memory:a.csv']);
    const again = await run(['convert', 'memory:a.csv', '--to', 'rhr', '--kind-column', 'Type', '--dip-column', 'Dip', '--strike-column', 'Strike', '--trend-column', 'Trend', '--plunge-column', 'Plunge'], {
      'memory:a.csv': first.io.written.get('memory:a.csv')!,
    });
    const a = readCsv(first.io.written.get('memory:a.csv')!);
    const b = readCsv(again.out);
    for (const [i, row] of b.rows.entries()) {
      expect(row.values.fl_strike_2).toBe(a.rows[i].values.fl_strike);
      expect(row.values.fl_trend_2).toBe(a.rows[i].values.fl_trend);
    }
  });

  it('runCli convert exits 0 when every row is read, and --save-columns writes a mapping --columns reads back', async () => {
    const csv = 'site,kind,azimuth,angle\nQ1,bedding,120,40\nQ2,bedding,130,42\n';
    const first = await run(['convert', 'memory:q.csv', '--to', 'rhr', '--dip-direction-column', 'azimuth', '--dip-column', 'angle', '--save-columns', 'memory:cols.json'], { 'memory:q.csv': csv });
    expect(first.code, first.err).toBe(0);
    expect(first.err).toBe('');
    const saved = first.io.written.get('memory:cols.json')!;
    expect(JSON.parse(saved)).toEqual({ id: 'site', kind: 'kind', dipDirection: 'azimuth', dip: 'angle' });
    const second = await run(['convert', 'memory:q.csv', '--to', 'rhr', '--columns', 'memory:cols.json'], { 'memory:q.csv': csv, 'memory:cols.json': saved });
    expect(second.out).toBe(first.out);
  });
});

describe('runCli analyze', () => {
  const dir = join(FIXTURES, 'fold-two-domains');
  const truth = JSON.parse(readFileSync(join(dir, 'truth.json'), 'utf8'));

  it('runCli analyze --within --json recovers the axis of the synthetic fold within 0.5° (truth from scripts/make-fold-fixture.ts)', async () => {
    const r = await run(['analyze', join(dir, 'in.csv'), '--crs', 'EPSG:32633', '--within', join(dir, 'area.geojson'), '--json', '--bootstrap', '200', '--seed', '7']);
    expect(r.code, r.err).toBe(0);
    const j = JSON.parse(r.out);
    expectAzimuth(j.axis.trend, truth.inside.axis.trend, 0.5, 'axis trend');
    expectClose(j.axis.plunge, truth.inside.axis.plunge, 0.5, 'axis plunge');
    // The girdle is the plane whose pole is the axis: dip direction = trend + 180, dip = 90 - plunge.
    expectAzimuth(j.girdle.dipDirection, truth.inside.axis.trend + 180, 0.5, 'girdle dip direction');
    expectClose(j.girdle.dip, 90 - truth.inside.axis.plunge, 0.5, 'girdle dip');
    expect(j.n).toBe(26);
    expect(j.eigenvalues).toHaveLength(3);
    expect(j.eigenvalues[0] >= j.eigenvalues[1] && j.eigenvalues[1] >= j.eigenvalues[2]).toBe(true);
    expectClose(j.eigenvalues[0] + j.eigenvalues[1] + j.eigenvalues[2], 1, 1e-12, 'eigenvalue sum');
    // The fixture tilts every pole 3° off the girdle, so S3 = sin² 3° (derived in the script's header).
    expectClose(j.eigenvalues[2], Math.sin((3 * Math.PI) / 180) ** 2, 1e-4, 'S3');
    expect(typeof j.woodcock.K).toBe('number');
    expect(typeof j.woodcock.C).toBe('number');
    expect(j.cone95).toBeGreaterThan(0);
    expect(j.lines.n).toBe(3);
    expectAzimuth(j.lines.mean.trend, truth.inside.axis.trend, 0.5, 'mean hinge trend');
    expectClose(j.lines.mean.plunge, truth.inside.axis.plunge, 0.5, 'mean hinge plunge');
    expect(typeof j.lines.alpha95).toBe('number');
    expect(j.caution).toMatch(/defer to local codes and licensed professional practice/);
    expect(typeof j.method).toBe('string');
    expect(j.input.within).toEqual({ file: join(dir, 'area.geojson'), inside: 29, outside: 25, noLocation: 0 });
  });

  it('runCli analyze reads the same stations from GeoJSON and finds the same axis', async () => {
    const r = await run(['analyze', join(dir, 'in.geojson'), '--within', join(dir, 'area.geojson'), '--json', '--bootstrap', '0']);
    expect(r.code, r.err).toBe(0);
    const j = JSON.parse(r.out);
    expectAzimuth(j.axis.trend, truth.inside.axis.trend, 0.5, 'axis trend');
    expectClose(j.axis.plunge, truth.inside.axis.plunge, 0.5, 'axis plunge');
    expect(j.cone95).toBeNull();
  });

  it('runCli analyze without --within mixes the two folds, and the other domain alone gives its own axis', async () => {
    const all = JSON.parse((await run(['analyze', join(dir, 'in.csv'), '--crs', 'EPSG:32633', '--json', '--bootstrap', '0'])).out);
    expect(all.n).toBe(48);
    const r = await run(['analyze', 'memory:b.csv', '--crs', 'EPSG:32633', '--json', '--bootstrap', '0'], {
      'memory:b.csv': readFileSync(join(dir, 'in.csv'), 'utf8').split('\n').filter((l) => !l.startsWith('BH-A')).join('\n'),
    });
    const b = JSON.parse(r.out);
    expectAzimuth(b.axis.trend, truth.outside.axis.trend, 0.5, 'domain B trend');
    expectClose(b.axis.plunge, truth.outside.axis.plunge, 0.5, 'domain B plunge');
  });

  it('runCli analyze counts a station on the boundary of the area as inside', async () => {
    const csv = 'id,kind,dipdir,dip,lon,lat\nIN,bedding,120,40,0.5,0.5\nEDGE,bedding,130,40,1,0.5\nCORNER,bedding,140,40,1,1\nOUT,bedding,150,40,1.5,0.5\nNOWHERE,bedding,160,40,,\n';
    const area = JSON.stringify({ type: 'Polygon', coordinates: [[[0, 0], [1, 0], [1, 1], [0, 1], [0, 0]]] });
    const r = await run(['analyze', 'memory:s.csv', '--within', 'memory:a.geojson', '--json', '--bootstrap', '0'], { 'memory:s.csv': csv, 'memory:a.geojson': area });
    const j = JSON.parse(r.out);
    expect(j.input.within).toMatchObject({ inside: 3, outside: 1, noLocation: 1 });
    expect(j.n).toBe(3);
  });

  it('runCli analyze prints a readable summary with the caution', async () => {
    const r = await run(['analyze', join(dir, 'in.csv'), '--crs', 'EPSG:32633', '--within', join(dir, 'area.geojson'), '--bootstrap', '50']);
    expect(r.code, r.err).toBe(0);
    expect(r.out).toContain('Fold axis (pi axis): 120.0/25.0 (trend/plunge)');
    expect(r.out).toContain('Girdle: 300.0/65.0 (dip direction/dip)');
    expect(r.out).toContain('Planes: 26 (bedding 26); lines: 3 (hinge 3)');
    expect(r.out).toMatch(/Caution: .*defer to local codes and licensed professional practice/);
  });

  it('runCli analyze --plane-kinds keeps only the kinds named, and exits 1 when no plane is left', async () => {
    const r = await run(['analyze', join(dir, 'in.csv'), '--crs', 'EPSG:32633', '--plane-kinds', 'foliation', '--json', '--bootstrap', '0']);
    expect(r.code).toBe(1);
    expect(JSON.parse(r.out).n).toBe(0);
    expect(r.err).toContain('no usable plane to analyse');
  });

  it('runCli analyze of the whole Korvane sample (two domains with axes 24.9° apart) warns poor-girdle-fit and prints the girdle fit and the fold description', async () => {
    const r = await run(['analyze', join('sample-maps', 'korvane', 'stations.csv'), '--bootstrap', '50']);
    expect(r.code).toBe(1); // the sample's planted bad rows, as documented
    expect(r.out).toMatch(/^Girdle fit: poles \d+\.\d° \(RMS\) from the girdle, cylindricity S2\/\(S2\+S3\) = 0\.\d{3}$/m);
    expect(r.out).toMatch(/^Warning: The poles scatter \d+\.\d° \(root mean square\) from the best-fit great circle/m);
    expect(r.out).toMatch(/^Fold: .*interlimb angle \d+°\. Limb maxima/m);
    const j = JSON.parse((await run(['analyze', join('sample-maps', 'korvane', 'stations.csv'), '--json', '--bootstrap', '0'])).out);
    expect(j.cylindricity.misfit).toBeGreaterThan(6);
    expect(j.warnings.map((w: { code: string }) => w.code)).toContain('poor-girdle-fit');
    expect(j.description.ok).toBe(true);
    expect(j.description.limbs.map((l: { estimate: string }) => l.estimate)).toEqual(['mode', 'mode']);
  });
});

describe('runCli usage and file errors (exit 2)', () => {
  const cases: { argv: string[]; extra?: Record<string, string | Uint8Array>; message: RegExp }[] = [
    { argv: ['fold'], message: /unknown command "fold": expected convert or analyze/ },
    { argv: ['convert', 'x.csv', '--to', 'rhr', '--colour', 'red'], message: /unknown option --colour/ },
    { argv: ['convert', 'missing.csv', '--to', 'rhr'], message: /cannot read missing.csv: no such file/ },
    { argv: ['convert', 'memory:a.csv'], extra: { 'memory:a.csv': 'dipdir,dip\n1,2' }, message: /convert needs --to/ },
    { argv: ['convert', 'memory:a.csv', '--to', 'lhr'], extra: { 'memory:a.csv': 'dipdir,dip\n1,2' }, message: /--to lhr: expected one of dipdir, rhr, strike-quadrant, quadrant/ },
    { argv: ['convert', 'memory:a.csv', 'b.csv', '--to', 'rhr'], message: /convert takes one input file, got 2/ },
    { argv: ['convert', 'memory:a.csv', '--to', 'rhr'], extra: { 'memory:a.csv': 'id,dip,Dip\nA,1,2' }, message: /columns "dip" and "Dip" could each be dip; say which one to use \(--dip-column\)/ },
    { argv: ['convert', 'memory:a.csv', '--to', 'rhr'], extra: { 'memory:a.csv': 'id,kind,dipdir,dip,x,y\nA,bedding,1,2,500000,5000000' }, message: /give their CRS with --crs/ },
    { argv: ['convert', 'memory:a.csv', '--to', 'rhr', '--crs', 'EPSG:99999'], extra: { 'memory:a.csv': 'dipdir,dip\n1,2' }, message: /--crs: EPSG:99999 is not a coordinate reference system/ },
    { argv: ['convert', 'memory:a.csv', '--to', 'rhr'], extra: { 'memory:a.csv': 'id,kind,attitude\nA,bedding,120/45\nB,bedding,130/40' }, message: /give --notation dipdir or --notation rhr/ },
    { argv: ['convert', 'memory:a.csv', '--to', 'rhr'], extra: { 'memory:a.csv': 'site,geologist,weather\nA,b,c' }, message: /no column holds an attitude/ },
    { argv: ['convert', 'memory:a.csv', '--to', 'rhr'], extra: { 'memory:a.csv': Uint8Array.from([0x50, 0x4b, 0x03, 0x04, 0, 0]) }, message: /memory:a.csv: this is a zip archive/ },
    { argv: ['convert', 'memory:a.csv', '--to', 'rhr'], extra: { 'memory:a.csv': '120,40\n130,42' }, message: /looks like data, not column names/ },
    { argv: ['convert', 'memory:a.csv', '--to', 'rhr', '--north', 'grid'], extra: { 'memory:a.csv': 'dipdir,dip\n1,2' }, message: /--north grid needs --crs/ },
    { argv: ['convert', 'memory:a.csv', '--to', 'rhr', '--declination', 'east'], extra: { 'memory:a.csv': 'dipdir,dip\n1,2' }, message: /--declination east: expected degrees east/ },
    { argv: ['convert', 'memory:a.csv', '--to', 'rhr', '--date', '01/06/2025'], extra: { 'memory:a.csv': 'dipdir,dip\n1,2' }, message: /--date 01\/06\/2025: expected a date written YYYY-MM-DD/ },
    { argv: ['convert', 'memory:a.csv', '--to', 'rhr', '--kind', 'pebble'], extra: { 'memory:a.csv': 'dipdir,dip\n1,2' }, message: /--kind pebble: expected a kind/ },
    { argv: ['convert', 'memory:a.csv', '--to', 'rhr', '--dip-column', 'Slope'], extra: { 'memory:a.csv': 'dipdir,dip\n1,2' }, message: /no column is named "Slope" \(given for dip\)/ },
    { argv: ['analyze', 'memory:a.csv', '--bootstrap', 'many'], extra: { 'memory:a.csv': 'dipdir,dip\n1,2' }, message: /--bootstrap many: expected a whole number from 0/ },
    { argv: ['analyze', 'memory:a.csv', '--within', 'memory:area.geojson'], extra: { 'memory:a.csv': 'dipdir,dip\n1,2', 'memory:area.geojson': '{"type":"Point","coordinates":[0,0]}' }, message: /--within memory:area.geojson: the area file holds no polygons/ },
    { argv: ['analyze', 'memory:a.geojson'], extra: { 'memory:a.geojson': '{"type":"FeatureCollection","features":[]}' }, message: /memory:a.geojson: the FeatureCollection has no features/ },
    { argv: ['analyze', 'memory:a.csv', '--line-kinds', 'bedding'], extra: { 'memory:a.csv': 'dipdir,dip\n1,2' }, message: /--line-kinds: "bedding" is not one of lineation/ },
  ];
  for (const c of cases) {
    it(`runCli(${JSON.stringify(c.argv)}) exits 2 and says ${c.message}`, async () => {
      const r = await run(c.argv, c.extra);
      expect(r.code).toBe(2);
      expect(r.err).toMatch(/^foldlens: /);
      expect(r.err).toMatch(c.message);
      expect(r.out).toBe('');
    });
  }

  it('runCli with no command prints the commands on stderr and exits 2', async () => {
    const r = await run([]);
    expect(r.code).toBe(2);
    expect(r.err).toContain('Commands:');
  });

  for (const argv of [['--help'], ['convert', '--help'], ['analyze', '--help'], ['help', 'analyze']]) {
    it(`runCli(${JSON.stringify(argv)}) prints help on stdout and exits 0`, async () => {
      const r = await run(argv);
      expect(r.code).toBe(0);
      expect(r.out).toMatch(/^Usage: foldlens/);
      expect(r.err).toBe('');
    });
  }

  it('runCli analyze --help lists the column options and the caution', async () => {
    const r = await run(['analyze', '--help']);
    expect(r.out).toContain('--dip-direction-column <name>');
    expect(r.out).toContain('--within <area.geojson>');
    expect(r.out).toMatch(/defer to local codes and licensed professional practice/);
  });
});

describe('the foldlens entry point', () => {
  const tsx = (args: string[]): Promise<{ code: number; stdout: string; stderr: string }> =>
    new Promise((resolve) => {
      execFile('npx', ['tsx', 'src/cli/main.ts', ...args], { cwd: process.cwd(), timeout: 60_000 }, (error, stdout, stderr) => {
        resolve({ code: error ? Number((error as { code?: number }).code ?? 1) : 0, stdout, stderr });
      });
    });

  it('npx tsx src/cli/main.ts analyze ... --json runs as a real process and prints the axis', async () => {
    const dir = join(FIXTURES, 'fold-two-domains');
    const r = await tsx(['analyze', join(dir, 'in.csv'), '--crs', 'EPSG:32633', '--within', join(dir, 'area.geojson'), '--json', '--bootstrap', '0']);
    expect(r.code, r.stderr).toBe(0);
    const j = JSON.parse(r.stdout);
    expectAzimuth(j.axis.trend, 120, 0.5, 'axis trend');
    expectClose(j.axis.plunge, 25, 0.5, 'axis plunge');
  });

  it('npx tsx src/cli/main.ts convert exits 1 and lists the unreadable rows on stderr', async () => {
    const r = await tsx(['convert', join(FIXTURES, 'convert-notebook', 'in.csv'), '--to', 'rhr']);
    expect(r.code).toBe(1);
    expect(r.stderr).toContain('row 10, column Type: "pebble"');
    expect(r.stdout.split('\n')[0]).toMatch(/^Stn,Type,Strike/);
  });

  it('npx tsx src/cli/main.ts with an unknown option exits 2', async () => {
    const r = await tsx(['analyze', 'x.csv', '--nope']);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/unknown option --nope/);
  });
});
