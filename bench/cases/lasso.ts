/**
 * Live lasso over 10^5 stations: one move of a freehand lasso is appending a vertex to the ring,
 * updating the selection and refitting the girdle of the selected poles.
 *
 * Case: LiveSelection.addLassoVertex (only the points in the new triangle's bounding box, found
 * with flatbush, are tested) + its running tensor sums + fitGirdleFromSums, one move per run,
 * median over the moves of a 400-vertex path.
 * Baseline, at moves spread evenly along the same path: turf's booleanPointInPolygon for every
 * station against the current ring, then tensorSumsOfArray of the selected poles and
 * fitGirdleFromSums (the refit from scratch).
 * Budget: median move under 16 ms (one frame at 60 Hz) and at least 20x the baseline.
 * Check: at the last vertex both select the same stations and fit the same axis.
 * A second row replays the whole path and reports its slowest move (no budget): on a shared
 * machine that is mostly a garbage-collection pause or another process taking the core, which a
 * user would feel as one late frame; the median row is what the budget judges.
 */
import { booleanPointInPolygon, polygon } from '@turf/turf';
import { LiveSelection } from '../../src/core/liveSelection';
import { fitGirdleFromSums, type GirdleFit } from '../../src/core/girdle';
import { tensorSumsOfArray } from '../../src/core/orientationTensor';
import { reportedTime, type BenchCase } from '../harness';
import { foldedPoles, seededUniform } from './data';
import { lazy } from './lazy';

const STATIONS = 100_000;
/** Lasso vertices; the first two make no move (a ring needs three vertices). */
const PATH_VERTICES = 402;
const CASE_WARMUPS = 20;
/** Warm-ups plus timed runs use up the path exactly, so the case's last run is at the last vertex. */
const CASE_REPETITIONS = PATH_VERTICES - 2 - CASE_WARMUPS;
const BASELINE_RUNS = 16;

/** Station positions, uniform over the unit square, seeded. */
const positions = lazy(() => {
  const rnd = seededUniform(21);
  const xy = new Float64Array(2 * STATIONS);
  for (let i = 0; i < xy.length; i++) xy[i] = rnd();
  return xy;
});
const poles = lazy(() => foldedPoles(STATIONS, 22));
/** The same positions as [x, y] pairs, made untimed (the input turf takes). */
const coords = lazy(() => {
  const xy = positions();
  return Array.from({ length: STATIONS }, (_, i) => [xy[2 * i], xy[2 * i + 1]]);
});

/**
 * A hand-drawn loop: a wobbly closed curve about (0.5, 0.5) enclosing about a quarter of the
 * square, with a little jitter on each vertex as a hand would give. The last vertex stops short
 * of the first; the ring closes itself.
 */
const path = lazy(() => {
  const rnd = seededUniform(23);
  const out = new Float64Array(2 * PATH_VERTICES);
  for (let k = 0; k < PATH_VERTICES; k++) {
    const t = (2 * Math.PI * k) / (PATH_VERTICES + 4);
    const r = 0.28 + 0.06 * Math.sin(3 * t + 0.4) + 0.03 * Math.sin(7 * t) + 0.004 * (rnd() - 0.5);
    out[2 * k] = 0.5 + r * Math.cos(t);
    out[2 * k + 1] = 0.5 + 0.9 * r * Math.sin(t);
  }
  return out;
});

/** What one move leaves: the selection count and the girdle of the selected poles (null while none). */
interface MoveResult {
  readonly count: number;
  readonly fit: GirdleFit | null;
}

/** A selection that walks the path one move per call, starting over when the path is used up. */
function walker(): { selection: LiveSelection; move: () => MoveResult; restart: () => void } {
  const selection = new LiveSelection(positions(), poles());
  const p = path();
  let next = 0;
  const restart = (): void => {
    selection.begin('replace');
    selection.addLassoVertex(p[0], p[1]);
    selection.addLassoVertex(p[2], p[3]);
    next = 2;
  };
  const move = (): MoveResult => {
    if (next >= PATH_VERTICES) restart();
    selection.addLassoVertex(p[2 * next], p[2 * next + 1]);
    next++;
    const sums = selection.tensorSums();
    return { count: selection.selectedCount, fit: sums.n > 0 ? fitGirdleFromSums(sums) : null };
  };
  restart();
  return { selection, move, restart };
}

const timedWalk = lazy(walker);
const worstWalk = lazy(walker);

/** Baseline move at vertex `last` (index): every station against the ring of vertices 0..last, then a fresh fit. */
function fromScratch(last: number): MoveResult {
  const p = path();
  const ring: number[][] = [];
  for (let k = 0; k <= last; k++) ring.push([p[2 * k], p[2 * k + 1]]);
  ring.push(ring[0]);
  const shape = polygon([ring]);
  const pts = coords();
  const picked: number[] = [];
  for (let i = 0; i < pts.length; i++) if (booleanPointInPolygon(pts[i], shape)) picked.push(i);
  const sums = tensorSumsOfArray(poles(), picked);
  return { count: picked.length, fit: sums.n > 0 ? fitGirdleFromSums(sums) : null };
}

/** Baseline runs at vertices spread evenly from a third of the path to its last vertex. */
let baselineRun = 0;
function nextBaselineVertex(): number {
  const j = baselineRun++ % BASELINE_RUNS;
  const first = Math.floor(PATH_VERTICES / 3);
  return Math.round(first + ((PATH_VERTICES - 1 - first) * (j + 1)) / BASELINE_RUNS);
}

export const lassoCase: BenchCase = {
  name: 'lasso move + girdle fit, 10^5 stations',
  unit: 'ms',
  warmups: CASE_WARMUPS,
  repetitions: CASE_REPETITIONS,
  setup: () => {
    coords();
    timedWalk();
  },
  run: () => timedWalk().move(),
  baseline: {
    name: 'turf booleanPointInPolygon per station + refit',
    // The first baseline vertex is a third of the way along: the early, small rings are cheap for both.
    run: () => fromScratch(nextBaselineVertex()),
    warmups: 0,
    repetitions: BASELINE_RUNS,
  },
  budget: { maxMedianMs: 16, minRatio: 20 },
  check: (live, scratch) => {
    const a = live as MoveResult;
    const b = scratch as MoveResult;
    if (a.count !== b.count) return `at the last vertex the lasso selects ${a.count} stations, turf ${b.count}`;
    if (!a.fit || !b.fit) return 'no stations selected at the last vertex';
    const u = a.fit.axisVector;
    const v = b.fit.axisVector;
    const sin = Math.hypot(u.y * v.z - u.z * v.y, u.z * v.x - u.x * v.z, u.x * v.y - u.y * v.x);
    const angle = (Math.atan2(sin, Math.abs(u.x * v.x + u.y * v.y + u.z * v.z)) * 180) / Math.PI;
    // Running sums after hundreds of add/remove updates drift in the last bits only.
    if (!(angle < 1e-6)) return `girdle axes differ by ${angle}°`;
    return undefined;
  },
};

export const lassoWorstCase: BenchCase = {
  name: 'lasso move + girdle fit, 10^5 stations, slowest move of the path',
  unit: 'ms',
  setup: () => void worstWalk(),
  // Each run replays the whole path, timing every move, and reports the slowest.
  run: () => {
    const walk = worstWalk();
    walk.restart();
    let worst = 0;
    for (let k = 2; k < PATH_VERTICES; k++) {
      const start = process.hrtime.bigint();
      walk.move();
      const ns = Number(process.hrtime.bigint() - start);
      if (ns > worst) worst = ns;
    }
    return reportedTime(worst);
  },
  warmups: 1,
  repetitions: 5,
};
