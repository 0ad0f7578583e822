/**
 * Station symbols in headless Chromium on the software rasteriser (SwiftShader): the first full
 * render of n bedding stations drawn as Foldlens symbols, against the same points drawn as one
 * plain circle layer, in the same run; then the frame time while panning. n is 10^5, the size
 * of the issue's budget (BENCH_SYMBOLS_N sets another).
 *
 * What is drawn: a MapLibre map with a blank style, 1280 x 800 CSS px at device pixel ratio 1,
 * zoom 15, where every symbol is drawn, overlapping or not (the check counts them). The symbols
 * are the overlay as the product shows it by default: dots, labels and symbols on (labels still
 * give way to each other and are not all drawn). The circles are one circle layer of radius
 * 2.2 px, the size of the overlay's dots, on a GeoJSON source with the same (default) options
 * as the overlay's and plain features (no properties: the overlay's carry some, so the baseline
 * is, if anything, the cheaper of the two). Both start from the same seeded stations.
 * First full render: from handing the stations to the map (overlay.setStations; for circles,
 * building the GeoJSON and setData) to the map's 'idle' event, and on until the GPU has
 * finished that frame (see bench/browser/symbols.ts), so no drawing escapes the clock.
 * Pan (first repetition only): map.panBy 12 px per frame, each step issued when the previous
 * frame has rendered, 6 frames or 8 s of panning, whichever comes first; reported: the median
 * time between successive 'render' events.
 * Budget: symbols' median first render at most 3x the circles' (maxSlowdown 3). Pan: reported only.
 * Each row hands the harness one reported time, the median the page measured (over the
 * repetitions, or over the pan's frames), so a run cut short still shows its figures; the check
 * fails it then.
 *
 * Where the time went, and what changed (measured with bench/browser pages, per-process CPU
 * time and Chromium traces, 10^5 stations): with the symbols as MapLibre symbol layers the
 * first render took 3-5.6x the circles'. The map's worker laid out every icon (quads, collision
 * boxes) and the main thread placed all 10^5 on every frame (the map fades nothing, so each
 * frame places in full); the 44 px square images were filled whole by the software rasteriser
 * (about four fifths of each square is empty); an invisible selection-ring circle layer made
 * every station a 22 px square for the GPU; a hit-test circle layer and the labels cost the
 * worker about as much as the circles themselves; and in headless Chromium each frame's
 * compositing waits for the GPU (a read-back), so GPU time lands on the main thread. Now, from
 * zoom 15 (all symbols shown) a custom layer draws every symbol from one vertex buffer into a
 * cached texture (redrawn only when the view or the data changes), images are cropped to their
 * painted rows, rings are drawn only once something is selected or highlighted, the pointer is
 * resolved with a kd-tree instead of a hit layer, and labels and symbols below zoom 15 are
 * thinned on a grid before MapLibre lays them out.
 * Measured here (2 cores shared with other work, load average 1-7), medians of 3, symbols / circles:
 * before 24.9 s / 4.2 s (5.9x) and 24.5 s / 3.8 s (6.5x), pan frames 9.0 s and 5.9 s against 0.3 s;
 * after 5.8 s / 3.6 s (1.6x), 7.2 s / 4.4 s (1.7x), 6.1 s / 3.9 s (1.6x), pan frames 1.2-1.3 s
 * against 0.3 s (the symbols are still drawn in full on every frame that moves the view).
 *
 * The driver runs in a child process (bench/browser/symbolsDriver.ts) because the harness is
 * synchronous; the page measures its own times, which reach the harness through reportedTime.
 * Each repetition is a fresh page, sharing only the HTTP cache with the others, so no map state
 * carries over. The driver starts no repetition that would pass its deadline, and the check then
 * reports the missing ones.
 */
import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { median, reportedTime, type BenchCase } from '../harness';
import type { DriverReport, PageRender, RenderKind } from '../browser/protocol';
import { lazy } from './lazy';

const N = stationCount(process.env.BENCH_SYMBOLS_N);
const REPETITIONS = 3;
const PAN_STEPS = 6;
const PAN_MAX_S = 8;
/** The driver starts no repetition that would end after this (seconds); a hard stop follows a minute later. */
const DEADLINE_S = 180;
const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const DRIVER = fileURLToPath(new URL('../browser/symbolsDriver.ts', import.meta.url));

function stationCount(text: string | undefined): number {
  if (text === undefined || text === '') return 100_000;
  const n = Number(text);
  if (!(Number.isInteger(n) && n >= 1)) throw new RangeError(`BENCH_SYMBOLS_N "${text}": expected a whole number of stations from 1`);
  return n;
}

/** "10^4" or "2 x 10^4" for a digit times a power of ten, else the number. */
function sizeName(n: number): string {
  const k = Math.floor(Math.log10(n));
  const digit = n / 10 ** k;
  if (k < 2 || !Number.isInteger(digit)) return String(n);
  return digit === 1 ? `10^${k}` : `${digit} x 10^${k}`;
}

/** The driver's report, or why there is none. Runs the browser once for both rows below. */
const report = lazy((): DriverReport => {
  const child = spawnSync(process.execPath, ['--import', 'tsx', DRIVER, String(N), String(REPETITIONS), String(PAN_STEPS), String(PAN_MAX_S), String(DEADLINE_S)], {
    cwd: ROOT,
    encoding: 'utf8',
    stdio: ['ignore', 'pipe', 'inherit'],
    timeout: (DEADLINE_S + 60) * 1000,
    maxBuffer: 64 * 1024 * 1024,
  });
  const last = child.stdout?.trim().split('\n').pop() ?? '';
  try {
    return JSON.parse(last) as DriverReport;
  } catch {
    const why = child.error ? child.error.message : `exit code ${child.status}, signal ${child.signal}`;
    return { n: N, viewport: { width: 0, height: 0 }, renders: [], repetitions: REPETITIONS, problems: [`browser driver gave no report (${why})`] };
  }
});

function rendersOf(kind: RenderKind): PageRender[] {
  return report().renders.filter((r) => r.kind === kind);
}

/** A run reporting the median of what the page measured (NaN when it measured nothing). */
function pageMedian(samplesMs: () => number[]): () => unknown {
  return () => {
    const ms = samplesMs();
    return reportedTime(ms.length > 0 ? median(ms) * 1e6 : NaN, ms);
  };
}

/**
 * Problems of the browser run: the driver's own, features not drawn, and, for the render row,
 * repetitions the deadline left out; for the pan row, too few frames timed.
 */
function browserProblems(row: 'render' | 'pan'): string | undefined {
  const r = report();
  const problems = [...r.problems];
  for (const kind of ['symbols', 'circles'] as const) {
    const renders = rendersOf(kind);
    const counted = renders.find((x) => x.drawn >= 0);
    if (counted && counted.drawn !== N) problems.push(`${kind}: ${counted.drawn} of ${N} stations drawn after the first render`);
    if (row === 'render' && renders.length < r.repetitions) {
      problems.push(`${kind}: ${renders.length} of ${r.repetitions} repetitions ran before the deadline`);
    }
    const frames = renders.reduce((k, x) => k + x.frameMs.length, 0);
    if (row === 'pan' && frames < 2) problems.push(`${kind}: ${frames} pan frames timed`);
  }
  return problems.length > 0 ? problems.join('; ') : undefined;
}

export const symbolsRenderCase: BenchCase = {
  name: `first render, ${sizeName(N)} station symbols (overlay defaults, zoom 15), headless Chromium`,
  unit: 'ms',
  setup: () => void report(),
  run: pageMedian(() => rendersOf('symbols').map((r) => r.firstRenderMs)),
  warmups: 0,
  repetitions: 1,
  baseline: {
    name: 'one plain circle layer, same points',
    run: pageMedian(() => rendersOf('circles').map((r) => r.firstRenderMs)),
    warmups: 0,
    repetitions: 1,
  },
  budget: { maxSlowdown: 3 },
  check: () => browserProblems('render'),
};

export const symbolsPanCase: BenchCase = {
  name: `pan frame, ${sizeName(N)} station symbols (overlay defaults, zoom 15), headless Chromium`,
  unit: 'ms',
  setup: () => void report(),
  run: pageMedian(() => rendersOf('symbols').flatMap((r) => r.frameMs)),
  warmups: 0,
  repetitions: 1,
  baseline: {
    name: 'one plain circle layer, same points',
    run: pageMedian(() => rendersOf('circles').flatMap((r) => r.frameMs)),
    warmups: 0,
    repetitions: 1,
  },
  check: () => browserProblems('pan'),
};
