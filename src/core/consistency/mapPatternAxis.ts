import { checkAxis, projectDownPlunge } from '../downPlunge';
import { toRadians } from '../math';
import { profileScatterDetail } from '../profileScatter';
import type { Line, Vec3 } from '../types';
import { axialAngle, cross, lineToVector, normalize, vectorToLine } from '../vectors';

/**
 * The map pattern against the plunge: do the contact traces, projected down the fold axis,
 * collapse onto one profile curve per surface? (The down-structure view of Mackin 1950,
 * downPlunge.ts; the measure of "one curve" is profileScatter.ts, a local quadratic fit in the
 * manner of LOWESS, Cleveland 1979.)
 *
 * - profileCoherence: the scatter at the given axis and at axes tilted 3° and 6° from it in eight
 *   directions each; the axis is "at the best" when no tilted axis does better, "near" when the
 *   best is on the 3° ring.
 * - searchMapAxis: the axis that minimises the scatter, found by a coarse-to-fine search over the
 *   sphere within `maxAngle` (default 30°) of a starting axis: a lattice of axes about `step`
 *   apart over the whole cap, then finer lattices about the best so far, halving the step down
 *   to `finalStep`. An estimate of the axis from the map alone, independent of the planes.
 *
 * What the traces can and cannot tell (profileScatter.ts): a wrong axis shows only where pieces of
 * one surface's traces lie at different depths along the axis yet cover the same part of the
 * profile (a trace crossing a valley in a V, separate outcrops of one surface). A trace that
 * crosses the fold train once projects to a smooth curve down any axis. So every result carries
 * a `contrast`: the scatter on a ring of axes 6° from the best over the scatter at the best. Where
 * it is small (below 1.5, Foldlens convention) the traces do not constrain the axis, and the
 * "best" axis means nothing.
 *
 * Positions are east-north-up metres (downPlunge.ts), one Float64Array of x, y, z triples per
 * surface (all pieces of one contact together; different surfaces apart, as they project to
 * different curves). Axes are referred to the same north as the positions (grid north in a
 * projected frame; see io/localFrame.ts gridAxis).
 */

/** One folded surface's trace points, east-north-up triples in metres. */
export type TraceSurface = Float64Array;

/** Options shared by the measures here. */
export interface MapPatternOptions {
  /** Neighbourhood radius of the scatter measure, metres; default 1/40 of the profile's diagonal at the first axis. */
  readonly radius?: number;
  /** Fewest neighbours for a residual (profileScatter.ts, default 6). */
  readonly minNeighbours?: number;
}

/** Scatter of all surfaces down one axis. */
export interface TraceScatter {
  readonly axis: Line;
  /** RMS over every residual of every surface, metres; null when no point had enough neighbours. */
  readonly scatter: number | null;
  /** Points that had a residual. */
  readonly used: number;
}

/**
 * Combined profile scatter of several surfaces down one axis: the RMS of all residuals, each
 * surface fitted on its own.
 * @example traceScatter([contactA, contactB], {trend: 75, plunge: 12}, { radius: 100 }).scatter // metres
 */
export function traceScatter(surfaces: readonly TraceSurface[], axis: Line, options: MapPatternOptions & { readonly radius: number }): TraceScatter {
  checkAxis(axis);
  let sum = 0;
  let used = 0;
  for (const xyz of surfaces) {
    if (xyz.length < 3) continue;
    const p = projectDownPlunge(xyz, axis);
    const xy = new Float64Array((2 * p.length) / 3);
    for (let i = 0, j = 0; i < p.length; i += 3, j += 2) {
      xy[j] = p[i];
      xy[j + 1] = p[i + 1];
    }
    const d = profileScatterDetail(xy, { radius: options.radius, ...(options.minNeighbours !== undefined && { minNeighbours: options.minNeighbours }) });
    for (let i = 0; i < d.residuals.length; i++) {
      const r = d.residuals[i];
      if (Number.isFinite(r)) {
        sum += r * r;
        used++;
      }
    }
  }
  return { axis, scatter: used > 0 ? Math.sqrt(sum / used) : null, used };
}

/**
 * The default scatter radius: 1/40 of the diagonal of the bounding box of all surfaces projected
 * down `axis` (the default of profileScatter.ts, taken once so that every axis compared uses the same).
 * @example defaultScatterRadius(surfaces, {trend: 75, plunge: 12}) // about 100 for a 4 km profile
 */
export function defaultScatterRadius(surfaces: readonly TraceSurface[], axis: Line): number {
  checkSurfaces(surfaces);
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
  for (const xyz of surfaces) {
    const p = projectDownPlunge(xyz, axis);
    for (let i = 0; i < p.length; i += 3) {
      minX = Math.min(minX, p[i]);
      maxX = Math.max(maxX, p[i]);
      minY = Math.min(minY, p[i + 1]);
      maxY = Math.max(maxY, p[i + 1]);
    }
  }
  const diagonal = Math.hypot(maxX - minX, maxY - minY);
  if (!(diagonal > 0)) throw new RangeError('map pattern: the trace points have no extent in the profile (all at one point)');
  return diagonal / 40;
}

/** One tilted axis of a coherence test. */
export interface RingAxis {
  /** Tilt from the tested axis, degrees. */
  readonly offset: number;
  /** Direction of the tilt about the axis, degrees (0 = toward steeper plunge). */
  readonly around: number;
  readonly axis: Line;
  readonly scatter: number | null;
}

/** Result of {@link profileCoherence}. */
export interface ProfileCoherence {
  readonly axis: Line;
  readonly radius: number;
  readonly scatter: number | null;
  readonly used: number;
  readonly ring: readonly RingAxis[];
  /** The tested or tilted axis with the least scatter. */
  readonly best: { readonly offset: number; readonly axis: Line; readonly scatter: number } | null;
  /** No tilted axis has less scatter. */
  readonly atBest: boolean | null;
  /** The best is the axis itself or on the nearest ring. */
  readonly nearBest: boolean | null;
  /** Mean scatter on the outermost ring over the least scatter found; below 1.5 the traces do not constrain the axis. */
  readonly contrast: number | null;
  readonly constrained: boolean | null;
  readonly reading: string;
}

/** Options of {@link profileCoherence}. */
export interface CoherenceOptions extends MapPatternOptions {
  /** Tilts in degrees (default [3, 6]). */
  readonly rings?: readonly number[];
  /** Tilted axes per ring (default 8). */
  readonly perRing?: number;
}

/**
 * Contrast below which the traces are taken not to constrain the axis (Foldlens convention: a
 * 6° tilt must raise the scatter by half).
 * @example result.contrast !== null && result.contrast < CONSTRAINT_CONTRAST
 */
export const CONSTRAINT_CONTRAST = 1.5;

/**
 * Scatter of the traces down an axis and down axes tilted a few degrees from it.
 * @example
 * const c = profileCoherence([contact], {trend: 75, plunge: 12});
 * c.atBest // true when no tilted axis gives a tighter profile
 */
export function profileCoherence(surfaces: readonly TraceSurface[], axis: Line, options: CoherenceOptions = {}): ProfileCoherence {
  checkAxis(axis, 'profileCoherence: axis');
  checkSurfaces(surfaces);
  const rings = options.rings ?? [3, 6];
  const perRing = options.perRing ?? 8;
  if (!(rings.length >= 1 && rings.every((r) => r > 0 && r < 90))) throw new RangeError(`profileCoherence: rings [${rings.join(', ')}] (expected tilts in degrees between 0 and 90)`);
  if (!(Number.isInteger(perRing) && perRing >= 3)) throw new RangeError(`profileCoherence: perRing ${String(perRing)} (expected a whole number of at least 3)`);
  const radius = checkedRadius(options.radius, surfaces, axis);
  const opts = { radius, ...(options.minNeighbours !== undefined && { minNeighbours: options.minNeighbours }) };
  const centre = traceScatter(surfaces, axis, opts);
  const a = lineToVector(axis);
  const ring: RingAxis[] = [];
  for (const offset of [...rings].sort((p, q) => p - q)) {
    for (let k = 0; k < perRing; k++) {
      const around = (360 * k) / perRing;
      const tilted = vectorToLine(tilt(a, offset, around));
      ring.push({ offset, around, axis: tilted, scatter: traceScatter(surfaces, tilted, opts).scatter });
    }
  }
  const candidates = [{ offset: 0, axis, scatter: centre.scatter }, ...ring];
  let best: ProfileCoherence['best'] = null;
  for (const c of candidates) if (c.scatter !== null && (best === null || c.scatter < best.scatter)) best = { offset: c.offset, axis: c.axis, scatter: c.scatter };
  const outer = Math.max(...rings);
  const outerScatters = ring.filter((r) => r.offset === outer && r.scatter !== null).map((r) => r.scatter!);
  const contrast = best && best.scatter > 0 && outerScatters.length > 0 ? outerScatters.reduce((s, v) => s + v, 0) / outerScatters.length / best.scatter : null;
  const atBest = best === null || centre.scatter === null ? null : best.offset === 0;
  const nearBest = best === null || centre.scatter === null ? null : best.offset <= Math.min(...rings);
  const constrained = contrast === null ? null : contrast >= CONSTRAINT_CONTRAST;
  return { axis, radius, scatter: centre.scatter, used: centre.used, ring, best, atBest, nearBest, contrast, constrained, reading: coherenceReading(centre.scatter, best, contrast, constrained, rings) };
}

/** Options of {@link searchMapAxis}. */
export interface MapAxisSearchOptions extends MapPatternOptions {
  /** Search within this angle of the starting axis, degrees (default 30). */
  readonly maxAngle?: number;
  /** Spacing of the first lattice, degrees (default 3). */
  readonly step?: number;
  /** Stop refining below this spacing, degrees (default 0.25). */
  readonly finalStep?: number;
}

/**
 * Defaults of {@link MapAxisSearchOptions}.
 * @example searchMapAxis(surfaces, piAxis, { ...MAP_AXIS_SEARCH_DEFAULTS, maxAngle: 20 })
 */
export const MAP_AXIS_SEARCH_DEFAULTS = Object.freeze({ maxAngle: 30, step: 3, finalStep: 0.25 });

/** Result of {@link searchMapAxis}. */
export interface MapAxisSearch {
  readonly start: Line;
  readonly radius: number;
  /** The axis of least scatter; null when no axis gave a scatter. */
  readonly axis: Line | null;
  readonly scatter: number | null;
  readonly scatterAtStart: number | null;
  /** Angle between the axis found and the starting axis, degrees. */
  readonly angleToStart: number | null;
  /** Mean, over 12 directions, of the scatter 6° from the axis found over its scatter (see the module comment). */
  readonly contrast: number | null;
  /** The least of those 12 ratios: how much the scatter rises in the direction it rises least. */
  readonly weakestContrast: number | null;
  /** The axis 6° away in that direction: with the axis found, it marks the line along which the traces cannot tell axes apart. */
  readonly weakestDirection: Line | null;
  /**
   * 'all-directions' when a 6° tilt raises the scatter by half or more in every direction;
   * 'one-direction' when it does on average but not in the weakest direction (the traces pin the
   * axis only across a line of axes, as one valley crossing does); 'none' otherwise.
   */
  readonly constraint: 'all-directions' | 'one-direction' | 'none' | null;
  readonly constrained: boolean | null;
  /** The best lies at the rim of the searched cap, so the true minimum may lie beyond it. */
  readonly atRim: boolean;
  /** Axes evaluated. */
  readonly evaluated: number;
  readonly maxAngle: number;
  readonly reading: string;
}

/**
 * The axis that makes the traces' down-plunge profile tightest, searched within `maxAngle` of
 * `start` (see the module comment).
 * @example
 * const s = searchMapAxis(surfaces, piAxis);
 * s.constrained ? s.angleToStart : 'the traces cannot tell'
 */
export function searchMapAxis(surfaces: readonly TraceSurface[], start: Line, options: MapAxisSearchOptions = {}): MapAxisSearch {
  checkAxis(start, 'searchMapAxis: start');
  checkSurfaces(surfaces);
  const maxAngle = options.maxAngle ?? MAP_AXIS_SEARCH_DEFAULTS.maxAngle;
  const step = options.step ?? MAP_AXIS_SEARCH_DEFAULTS.step;
  const finalStep = options.finalStep ?? MAP_AXIS_SEARCH_DEFAULTS.finalStep;
  if (!(maxAngle > 0 && maxAngle <= 90)) throw new RangeError(`searchMapAxis: maxAngle ${String(maxAngle)} (expected degrees above 0, up to 90)`);
  if (!(step > 0 && step <= maxAngle)) throw new RangeError(`searchMapAxis: step ${String(step)} (expected degrees above 0, up to maxAngle)`);
  if (!(finalStep > 0 && finalStep <= step)) throw new RangeError(`searchMapAxis: finalStep ${String(finalStep)} (expected degrees above 0, up to step)`);
  const radius = checkedRadius(options.radius, surfaces, start);
  const opts = { radius, ...(options.minNeighbours !== undefined && { minNeighbours: options.minNeighbours }) };
  const s0 = lineToVector(start);
  let evaluated = 0;
  const score = (v: Vec3, r: number): number | null => {
    evaluated++;
    return traceScatter(surfaces, vectorToLine(v), { ...opts, radius: r }).scatter;
  };
  const scatterAtStart = score(s0, radius);
  // Coarse to fine in two senses at once (in the manner of graduated non-convexity, Blake &
  // Zisserman 1987, *Visual Reconstruction*; from memory): the first lattice spans the whole cap
  // with a neighbourhood COARSE_RADIUS times wider, where pieces a few degrees out of register
  // still share neighbourhoods and the scatter falls smoothly toward the right axis; each later
  // lattice halves both the spacing and the radius (down to `radius`) about the best few axes
  // so far. At the final radius alone the scatter has a pit only a few degrees wide at the right
  // axis, ringed by higher scatter and a plain of low scatter beyond, where the pieces no longer
  // overlap at all; a single-scale search over the cap can settle on that plain.
  let r = COARSE_RADIUS * radius;
  let h = step;
  let seeds = pickSeeds(
    [s0, ...capLattice(s0, maxAngle, step)].map((v) => ({ v, s: score(v, r) })),
    h,
  );
  const refineAbout = (c: Vec3, spacing: number, rr: number): { v: Vec3; s: number | null } => {
    let local = { v: c, s: score(c, rr) };
    for (const v of capLattice(c, 2 * spacing, spacing)) {
      // Stay inside the cap about the start.
      if (axialAngle(v, s0) > maxAngle + 1e-9) continue;
      const sv = score(v, rr);
      if (sv !== null && (local.s === null || sv < local.s)) local = { v, s: sv };
    }
    return local;
  };
  // The starting axis is the hypothesis under test: its own track is refined at every scale and
  // stays in the running even when other axes score better at a coarse scale.
  let startTrack: Vec3 = s0;
  while (seeds.length > 0 && (h / 2 >= finalStep - 1e-12 || r > radius)) {
    h /= 2;
    r = Math.max(radius, r / 2);
    const track = refineAbout(startTrack, h, r);
    startTrack = track.v;
    seeds = pickSeeds(seeds.map((seed) => refineAbout(seed.v, h, r)), h);
    if (track.s !== null && !seeds.some((q) => axialAngle(q.v, track.v) <= h)) seeds.push({ v: track.v, s: track.s });
  }
  let best: { v: Vec3; s: number } | null = null;
  for (const seed of seeds) {
    // Every seed ends scored at the final radius; make sure of it before comparing.
    const sv = r === radius ? seed.s : score(seed.v, radius);
    if (sv !== null && (best === null || sv < best.s)) best = { v: seed.v, s: sv };
  }
  if (best === null) {
    return { start, radius, axis: null, scatter: null, scatterAtStart, angleToStart: null, contrast: null, weakestContrast: null, weakestDirection: null, constraint: null, constrained: null, atRim: false, evaluated, maxAngle, reading: 'No trace point had enough neighbours for a scatter: the traces are too sparse for this radius.' };
  }
  const found = best as { v: Vec3; s: number };
  const axis = vectorToLine(found.v);
  const angleToStart = axialAngle(found.v, s0);
  const rim: number[] = [];
  for (let k = 0; k < RIM_DIRECTIONS; k++) {
    const s = traceScatter(surfaces, vectorToLine(tilt(found.v, RIM_TILT, (360 * k) / RIM_DIRECTIONS)), opts).scatter;
    evaluated++;
    rim.push(s ?? Number.POSITIVE_INFINITY);
  }
  const ratios = rim.map((s) => (found.s > 0 ? s / found.s : Number.POSITIVE_INFINITY));
  const finite = ratios.filter(Number.isFinite);
  const contrast = finite.length > 0 ? finite.reduce((a, b) => a + b, 0) / finite.length : null;
  const weakest = finite.length > 0 ? Math.min(...finite) : null;
  const constraint: MapAxisSearch['constraint'] =
    contrast === null || contrast < CONSTRAINT_CONTRAST ? 'none' : weakest !== null && weakest < CONSTRAINT_CONTRAST ? 'one-direction' : 'all-directions';
  // The tilt direction (about the axis found) in which the scatter rises least: the line of ambiguity.
  const flatAround = weakest === null ? null : (360 * ratios.indexOf(weakest)) / RIM_DIRECTIONS;
  const atRim = angleToStart > maxAngle - step;
  return {
    start,
    radius,
    axis,
    scatter: found.s,
    scatterAtStart,
    angleToStart,
    contrast,
    weakestContrast: weakest,
    weakestDirection: flatAround === null ? null : vectorToLine(tilt(found.v, RIM_TILT, flatAround)),
    constraint,
    constrained: constraint !== 'none',
    atRim,
    evaluated,
    maxAngle,
    reading: searchReading(axis, found.s, angleToStart, contrast, weakest, constraint, atRim, maxAngle),
  };
}

/** Axes carried from one lattice to the next (the best few, at least two spacings apart). */
const REFINE_SEEDS = 3;
/** The first lattice's radius, in multiples of the final radius. */
const COARSE_RADIUS = 4;

/** The best few scored axes, at least two spacings apart, best first. */
function pickSeeds(scored: readonly { v: Vec3; s: number | null }[], spacing: number): { v: Vec3; s: number }[] {
  const ranked = scored.filter((c): c is { v: Vec3; s: number } => c.s !== null).sort((p, q) => p.s - q.s);
  const seeds: { v: Vec3; s: number }[] = [];
  for (const c of ranked) {
    if (seeds.length >= REFINE_SEEDS) break;
    if (seeds.every((q) => axialAngle(q.v, c.v) > 2 * spacing)) seeds.push(c);
  }
  return seeds;
}

/** Tilt (degrees) and number of directions of the ring that judges how well the axis found is constrained. */
const RIM_TILT = 6;
const RIM_DIRECTIONS = 12;

/** The axis a tilted by `offset` degrees toward the direction `around` degrees about it (0 = toward steeper plunge). */
function tilt(a: Vec3, offsetDegrees: number, aroundDegrees: number): Vec3 {
  const [u, w] = perpendiculars(a);
  const t = toRadians(offsetDegrees);
  const f = toRadians(aroundDegrees);
  const c = Math.cos(t);
  const s = Math.sin(t);
  return {
    x: c * a.x + s * (Math.cos(f) * u.x + Math.sin(f) * w.x),
    y: c * a.y + s * (Math.cos(f) * u.y + Math.sin(f) * w.y),
    z: c * a.z + s * (Math.cos(f) * u.z + Math.sin(f) * w.z),
  };
}

/** Two unit vectors at right angles to a and to each other: u in a's vertical plane (steeper side), w = a × u. */
function perpendiculars(a: Vec3): [Vec3, Vec3] {
  const horizontal = Math.hypot(a.x, a.y);
  const u: Vec3 = horizontal > 1e-9 ? { x: (-a.z * a.x) / horizontal, y: (-a.z * a.y) / horizontal, z: horizontal } : { x: 1, y: 0, z: 0 };
  // u points toward steeper plunge when a points down (z >= 0); keep the sense for any a.
  return [normalize(u), normalize(cross(a, u))];
}

/** Axes spaced about `step` degrees apart over the cap of radius `cap` degrees about c (c itself excluded). */
function capLattice(c: Vec3, cap: number, step: number): Vec3[] {
  const out: Vec3[] = [];
  for (let t = step; t <= cap + 1e-9; t += step) {
    const count = Math.max(6, Math.round((2 * Math.PI * Math.sin(toRadians(t))) / toRadians(step)));
    for (let k = 0; k < count; k++) out.push(tilt(c, t, (360 * k) / count));
  }
  return out;
}

function checkSurfaces(surfaces: readonly TraceSurface[]): void {
  if (!Array.isArray(surfaces) || surfaces.length === 0) throw new RangeError('map pattern: no trace surfaces given (expected one array of east, north, up triples per surface)');
  surfaces.forEach((xyz, s) => {
    if (!(xyz instanceof Float64Array) || xyz.length % 3 !== 0) throw new RangeError(`map pattern: surface ${s} is not a Float64Array of east, north, up triples`);
    for (let i = 0; i < xyz.length; i++) {
      if (!Number.isFinite(xyz[i])) throw new RangeError(`map pattern: surface ${s}, point ${Math.floor(i / 3)} has a non-finite ${'enu'[i % 3]} (${xyz[i]}); leave points without a height out`);
    }
  });
}

function checkedRadius(radius: number | undefined, surfaces: readonly TraceSurface[], axis: Line): number {
  if (radius === undefined) return defaultScatterRadius(surfaces, axis);
  if (!(radius > 0 && Number.isFinite(radius))) throw new RangeError(`map pattern: radius ${String(radius)} is not a positive distance in metres`);
  return radius;
}

const fmt = (l: Line): string => `${String(Math.round(l.trend) % 360).padStart(3, '0')}/${String(Math.round(l.plunge)).padStart(2, '0')}`;

function coherenceReading(scatter: number | null, best: ProfileCoherence['best'], contrast: number | null, constrained: boolean | null, rings: readonly number[]): string {
  if (scatter === null || best === null) return 'The traces are too sparse for a scatter at this radius.';
  const base = `Down this axis the traces scatter ${scatter.toFixed(1)} m about one profile curve per surface.`;
  if (constrained === false) {
    return `${base} Axes tilted ${Math.max(...rings)}° give almost the same (contrast ${contrast!.toFixed(2)}), so the traces do not constrain the axis: each crosses the folds about once, and such a trace projects to a smooth curve down any nearby axis.`;
  }
  if (best.offset === 0) return `${base} No axis tilted ${rings.join('° or ')}° does better: the map pattern agrees with the axis.`;
  return `${base} An axis tilted ${best.offset}° (${fmt(best.axis)}) gives ${best.scatter.toFixed(1)} m${best.offset <= Math.min(...rings) ? ', so the axis is near the best' : ': the map pattern prefers a different axis; search for it'}.`;
}

function searchReading(axis: Line, scatter: number, angle: number, contrast: number | null, weakest: number | null, constraint: MapAxisSearch['constraint'], atRim: boolean, maxAngle: number): string {
  if (constraint === 'none') {
    return `The traces do not constrain the axis (the scatter rises by a factor of only ${contrast === null ? 'unknown' : contrast.toFixed(2)} ${RIM_TILT}° away from the best), so no axis can be read from the map pattern alone.`;
  }
  const rim = atRim ? ` It lies at the rim of the ${maxAngle}° search, so the tightest axis may lie beyond it.` : '';
  const oneWay =
    constraint === 'one-direction'
      ? ` The traces pin the axis in one direction only: tilted ${RIM_TILT}° the other way the scatter rises by a factor of only ${weakest!.toFixed(2)}, so the estimate may slide along that line.`
      : '';
  return `From the map pattern alone, the traces are tightest down ${fmt(axis)} (scatter ${scatter.toFixed(1)} m), ${angle.toFixed(1)}° from the starting axis.${oneWay}${rim}`;
}
