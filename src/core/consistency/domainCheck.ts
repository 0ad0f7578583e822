import { analyzeFold, type FoldWarning } from '../foldAnalysis';
import type { FoldSense, Line, Plane } from '../types';
import { compareAxisWithLines, type AxisVsLines, type MeasuredLine } from './axisVsLines';
import { checkClosures, type ClosureCheck, type ClosurePiece } from './closures';
import { girdleResiduals, type GirdleResiduals, type MeasuredPlane } from './girdleResiduals';
import { profileCoherence, searchMapAxis, type MapAxisSearch, type ProfileCoherence } from './mapPatternAxis';
import { compareWithMeasured, predictAttitudes, type PredictionCheck } from './predictedAttitudes';

/**
 * Every consistency check of one structural domain, run in one call: the fold analysis
 * (foldAnalysis.ts), measured lines against the axis (axisVsLines.ts), poles against the girdle
 * (girdleResiduals.ts) and, when contact traces are given, the map pattern against the axis
 * (mapPatternAxis.ts, predictedAttitudes.ts, closures.ts). The flags of all of them are gathered into one
 * list with stable codes. The command line and the map both call this, so they report the
 * same numbers.
 *
 * Frames: attitudes are referred to true north. Trace and station positions are east-north-up
 * metres in a projected frame whose grid north differs from true north by `convergence` degrees
 * (true = grid + convergence; io/localFrame.ts). The positions are turned about the vertical by
 * the convergence before the map-pattern checks, so every azimuth, given or reported, stays
 * referred to true north.
 *
 * Results are aids to interpretation; check in the field and defer to local codes and licensed
 * professional practice.
 */

/** A planar reading, optionally placed on the map (east, north metres in the frame). */
export interface DomainPlane extends MeasuredPlane {
  readonly x?: number;
  readonly y?: number;
}

/** A measured line, optionally placed on the map; hinges may say which fold they close. */
export interface DomainLine extends MeasuredLine {
  readonly x?: number;
  readonly y?: number;
  readonly sense?: FoldSense;
}

/** The traces of one folded surface (one contact): its pieces, each east-north-up triples in order. */
export interface DomainSurface {
  readonly name: string;
  readonly pieces: readonly Float64Array[];
}

/** What to check. */
export interface DomainCheckInput {
  readonly id: string;
  readonly name: string;
  /** Planes of the folded surface (bedding by default; core/foldInput.ts chooses). */
  readonly planes: readonly DomainPlane[];
  /** Lines that should parallel the axis (hinges, intersection lineations). */
  readonly lines: readonly DomainLine[];
  /** Contact traces inside the domain, grouped by surface, with heights. */
  readonly surfaces?: readonly DomainSurface[];
  /** Grid convergence of the frame of the positions, degrees (true = grid + convergence); default 0. */
  readonly convergence?: number;
}

/** Options of {@link checkDomain}. */
export interface DomainCheckOptions {
  /** Bootstrap resamples for the axis cone (default 500). */
  readonly bootstrap?: number;
  readonly seed?: number;
  /** Lines farther than this from the axis are flagged, degrees (default 15). */
  readonly lineThreshold?: number;
  /** k of the robust girdle-distance rule (default 3.5). */
  readonly outlierFactor?: number;
  /** Floor of the robust rule, degrees (default 5). */
  readonly outlierFloor?: number;
  /** A user angle replacing the robust rule, degrees. */
  readonly outlierAngle?: number;
  /** Scatter radius for the map pattern, metres (default: 1/40 of the profile's diagonal). */
  readonly scatterRadius?: number;
  /** Search for the map-only axis (default true; it costs a few hundred scatter evaluations). */
  readonly searchAxis?: boolean;
  /** Search cap about the pi axis, degrees (default 30). */
  readonly searchAngle?: number;
  /** Map distance for comparing measured planes with predicted attitudes, metres (default 150). */
  readonly predictionRadius?: number;
  /** Flag predicted-versus-measured differences above this, degrees (default 20). */
  readonly predictionThreshold?: number;
  /** Least fall along the trend on both sides of a closure on the map, metres (default 50). */
  readonly closureDepth?: number;
  /** Readings within this map distance of a closure's hinge say its sense, metres (default 250). */
  readonly closureRadius?: number;
}

/** Stable codes of the flags. */
export type ConsistencyFlagCode =
  | 'axis-undefined'
  | 'lines-off-axis'
  | 'line-mean-outside-cone'
  | 'planes-off-girdle'
  | 'not-cylindrical'
  | 'traces-unconstrained'
  | 'map-pattern-prefers-other-axis'
  | 'map-axis-differs'
  | 'predicted-attitudes-differ'
  | 'closures-disagree';

/** One finding worth a look. */
export interface ConsistencyFlag {
  readonly code: ConsistencyFlagCode;
  readonly severity: 'note' | 'warning';
  readonly message: string;
  /** Ids of the readings concerned, when any. */
  readonly ids?: readonly string[];
}

/** The map-pattern checks of a domain, axes referred to true north. */
export interface DomainMapPattern {
  readonly surfaces: number;
  readonly vertices: number;
  readonly coherence: ProfileCoherence | null;
  readonly search: MapAxisSearch | null;
  readonly predictions: PredictionCheck | null;
  /** Fold closures on the map against the plunge and the fold's sense. */
  readonly closures: ClosureCheck | null;
  readonly notes: readonly string[];
}

/** Every check of one domain; JSON-friendly. */
export interface DomainCheck {
  readonly id: string;
  readonly name: string;
  readonly counts: { readonly planes: number; readonly lines: number };
  readonly axis: Line | null;
  readonly girdlePlane: Plane | null;
  readonly cone95: number | null;
  readonly eigenvalues: readonly [number, number, number] | null;
  readonly reading: string;
  readonly warnings: readonly FoldWarning[];
  readonly lines: AxisVsLines | null;
  readonly girdle: GirdleResiduals;
  readonly mapPattern: DomainMapPattern | null;
  readonly flags: readonly ConsistencyFlag[];
}

/**
 * Angles below this (degrees) are within what one hand-held compass-clinometer reading resolves
 * (common practice: readings are good to a few degrees), so a statistically significant
 * difference smaller than this is reported as a note.
 */
const COMPASS_PRECISION_DEG = 3;

/**
 * Runs every check on one domain. Throws a RangeError naming the bad reading or option.
 * @example
 * const check = checkDomain({ id: 'west', name: 'West', planes, lines, surfaces, convergence: 0.006 });
 * check.flags.map((f) => f.message)
 */
export function checkDomain(input: DomainCheckInput, options: DomainCheckOptions = {}): DomainCheck {
  const convergence = input.convergence ?? 0;
  if (!Number.isFinite(convergence)) throw new RangeError(`checkDomain ${input.id}: convergence ${String(convergence)} is not a number of degrees`);
  const fold = analyzeFold(
    { planes: input.planes.map((p) => ({ dipDirection: p.dipDirection, dip: p.dip })), ...(input.lines.length > 0 && { lines: input.lines.map((l) => ({ trend: l.trend, plunge: l.plunge })) }) },
    { ...(options.bootstrap !== undefined && { bootstrap: options.bootstrap }), ...(options.seed !== undefined && { seed: options.seed }) },
  );
  const flags: ConsistencyFlag[] = [];
  if (fold.axis === null) flags.push({ code: 'axis-undefined', severity: 'warning', message: `No fold axis: ${fold.warnings.map((w) => w.message).join(' ') || fold.reading}` });

  const lines = fold.axis && input.lines.length > 0 ? compareAxisWithLines(fold.axis, input.lines, { cone95: fold.cone95, ...(options.lineThreshold !== undefined && { threshold: options.lineThreshold }) }) : null;
  if (lines && lines.flagged > 0) {
    const ids = lines.lines.filter((l) => l.flagged).map((l) => l.id ?? `line ${l.index + 1}`);
    flags.push({ code: 'lines-off-axis', severity: 'warning', message: `${lines.flagged} measured line${lines.flagged === 1 ? ' lies' : 's lie'} more than ${lines.threshold}° from the axis: ${ids.join(', ')}.`, ids });
  }
  if (lines && lines.meanInsideAxisCone === false && lines.axisInsideLineCone === false) {
    // Many readings make both cones narrow, so a difference below what a compass reading can
    // resolve may still be "significant": then it is a note, not a warning.
    const angle = lines.all.angle!;
    const small = angle < COMPASS_PRECISION_DEG;
    flags.push({
      code: 'line-mean-outside-cone',
      severity: small ? 'note' : 'warning',
      message: `The mean of the measured lines is ${angle.toFixed(1)}° from the axis, outside both the axis's 95% cone and the lines' alpha95${small ? `; that is less than the ${COMPASS_PRECISION_DEG}° a single compass reading can resolve, so it is unlikely to matter` : ''}.`,
    });
  }

  const girdle = girdleResiduals(input.planes, {
    ...(options.outlierFactor !== undefined && { madFactor: options.outlierFactor }),
    ...(options.outlierFloor !== undefined && { minAngle: options.outlierFloor }),
    ...(options.outlierAngle !== undefined && { maxAngle: options.outlierAngle }),
  });
  if (girdle.outliers > 0) {
    const ids = girdle.residuals.filter((r) => r.flagged).map((r) => r.id ?? `plane ${r.index + 1}`);
    flags.push({ code: 'planes-off-girdle', severity: 'warning', message: `${girdle.outliers} plane${girdle.outliers === 1 ? ' lies' : 's lie'} more than ${girdle.threshold.toFixed(1)}° from the girdle: ${ids.join(', ')}.`, ids });
  }
  const cyl = girdle.cylindricityWithoutOutliers ?? girdle.cylindricity;
  if (cyl && (cyl.shape === 'not-cylindrical' || cyl.shape === 'nearly-cylindrical')) {
    flags.push({ code: 'not-cylindrical', severity: cyl.shape === 'not-cylindrical' ? 'warning' : 'note', message: cyl.reading });
  }

  const mapPattern = input.surfaces && input.surfaces.length > 0 && fold.axis ? checkMapPattern(input, fold.axis, fold.cone95, convergence, options, flags) : null;
  return {
    id: input.id,
    name: input.name,
    counts: { planes: input.planes.length, lines: input.lines.length },
    axis: fold.axis,
    girdlePlane: fold.girdle,
    cone95: fold.cone95,
    eigenvalues: fold.eigenvalues,
    reading: fold.reading,
    warnings: fold.warnings,
    lines,
    girdle,
    mapPattern,
    flags,
  };
}

function checkMapPattern(input: DomainCheckInput, axis: Line, cone95: number | null, convergence: number, options: DomainCheckOptions, flags: ConsistencyFlag[]): DomainMapPattern {
  // Turn the positions from grid north to true north once, so that every axis and plane below
  // stays referred to true north (a point at grid azimuth φ lies at true azimuth φ + convergence).
  const rotate = rotationToTrue(convergence);
  const surfaces = input.surfaces!.map((s) => rotate(concat(s.pieces))).filter((xyz) => xyz.length >= 3);
  const vertices = surfaces.reduce((n, s) => n + s.length / 3, 0);
  const notes: string[] = [];
  let coherence: ProfileCoherence | null = null;
  let search: MapAxisSearch | null = null;
  if (vertices < 20) {
    notes.push(`Only ${vertices} trace vertices with heights: too few for the map-pattern checks.`);
  } else {
    coherence = profileCoherence(surfaces, axis, options.scatterRadius !== undefined ? { radius: options.scatterRadius } : {});
    if (coherence.constrained === false) {
      flags.push({ code: 'traces-unconstrained', severity: 'note', message: coherence.reading });
    } else if (coherence.nearBest === false) {
      flags.push({ code: 'map-pattern-prefers-other-axis', severity: 'warning', message: coherence.reading });
    }
    if (options.searchAxis ?? true) {
      search = searchMapAxis(surfaces, axis, { radius: coherence.radius, ...(options.searchAngle !== undefined && { maxAngle: options.searchAngle }) });
      // Foldlens convention: a map-only axis more than 5° (or twice the axis cone) away is worth a look.
      const limit = Math.max(MAP_AXIS_FLAG_ANGLE, 2 * (cone95 ?? 0));
      if (search.constraint !== 'none' && search.angleToStart !== null && search.angleToStart > limit) {
        flags.push({ code: 'map-axis-differs', severity: 'warning', message: `The map pattern alone gives an axis ${search.angleToStart.toFixed(1)}° from the pi axis of the planes. ${search.reading}` });
      }
    }
  }
  let predictions: PredictionCheck | null = null;
  const placed = input.planes.filter((p) => p.x !== undefined && p.y !== undefined && Number.isFinite(p.x) && Number.isFinite(p.y));
  const named: ClosurePiece[] = input.surfaces!.flatMap((s) => s.pieces.filter((p) => p.length >= 6).map((p) => ({ surface: s.name, xyz: rotate(p) })));
  const pieces = named.map((p) => p.xyz);
  const xy = rotate(Float64Array.from(placed.flatMap((p) => [p.x!, p.y!, 0])));
  if (pieces.length > 0 && placed.length > 0) {
    predictions = compareWithMeasured(
      predictAttitudes(pieces, axis),
      placed.map((p, i) => ({ x: xy[3 * i], y: xy[3 * i + 1], dipDirection: p.dipDirection, dip: p.dip, ...(p.id !== undefined && { id: p.id }) })),
      { ...(options.predictionRadius !== undefined && { radius: options.predictionRadius }), ...(options.predictionThreshold !== undefined && { threshold: options.predictionThreshold }) },
    );
    if (predictions.medianAngle !== null && predictions.medianAngle > predictions.threshold / 2) {
      flags.push({ code: 'predicted-attitudes-differ', severity: 'warning', message: `Measured planes near the traces differ from the attitudes the axis predicts there by ${predictions.medianAngle.toFixed(1)}° (median). ${predictions.reading}` });
    }
  } else if (pieces.length > 0) {
    notes.push('No plane has a map position, so measured planes were not compared with predicted attitudes.');
  }
  let closures: ClosureCheck | null = null;
  if (pieces.length > 0) {
    const lines = input.lines.filter((l) => l.x !== undefined && l.y !== undefined && Number.isFinite(l.x) && Number.isFinite(l.y));
    const lxy = rotate(Float64Array.from(lines.flatMap((l) => [l.x!, l.y!, 0])));
    closures = checkClosures(
      named,
      axis,
      {
        planes: placed.map((p, i) => ({ x: xy[3 * i], y: xy[3 * i + 1], dipDirection: p.dipDirection, dip: p.dip, ...(p.id !== undefined && { id: p.id }) })),
        lines: lines.map((l, i) => ({ x: lxy[3 * i], y: lxy[3 * i + 1], trend: l.trend, plunge: l.plunge, ...(l.sense !== undefined && { sense: l.sense }), ...(l.id !== undefined && { id: l.id }) })),
      },
      { ...(options.closureDepth !== undefined && { depth: options.closureDepth }), ...(options.closureRadius !== undefined && { radius: options.closureRadius }) },
    );
    if (closures.disagreeing > 0) {
      const bad = closures.closures.filter((c) => c.agrees === false);
      const ids = [...new Set(bad.flatMap((c) => (c.senseFrom === 'hinges' ? c.hinges.ids : [])))];
      flags.push({
        code: 'closures-disagree',
        severity: 'warning',
        message: `${closures.disagreeing} of ${closures.judged} fold closures on the map point the wrong way for the axis ${fmtLine(axis)} and the fold's sense there. ${bad.slice(0, 5).map((c) => c.reading).join(' ')}${bad.length > 5 ? ` And ${bad.length - 5} more.` : ''}`,
        ...(ids.length > 0 && { ids }),
      });
    }
  }
  return { surfaces: surfaces.length, vertices, coherence, search, predictions, closures, notes };
}

/**
 * Angle (degrees) beyond which a map-only axis that the traces constrain is flagged against the pi
 * axis, unless twice the axis cone is wider (Foldlens convention).
 * @example search.angleToStart > MAP_AXIS_FLAG_ANGLE
 */
export const MAP_AXIS_FLAG_ANGLE = 5;

const fmtLine = (l: Line): string => `${String(Math.round(l.trend) % 360).padStart(3, '0')}/${String(Math.round(l.plunge)).padStart(2, '0')}`;

/** East-north-up triples in a grid frame to a frame whose y axis is true north (rotation about the vertical). */
function rotationToTrue(convergence: number): (xyz: Float64Array) => Float64Array {
  const g = (convergence * Math.PI) / 180;
  const c = Math.cos(g);
  const s = Math.sin(g);
  return (xyz) => {
    if (convergence === 0) return xyz;
    const out = new Float64Array(xyz.length);
    for (let i = 0; i < xyz.length; i += 3) {
      out[i] = xyz[i] * c + xyz[i + 1] * s;
      out[i + 1] = -xyz[i] * s + xyz[i + 1] * c;
      out[i + 2] = xyz[i + 2];
    }
    return out;
  };
}

function concat(pieces: readonly Float64Array[]): Float64Array {
  const out = new Float64Array(pieces.reduce((n, p) => n + p.length, 0));
  let o = 0;
  for (const p of pieces) {
    out.set(p, o);
    o += p.length;
  }
  return out;
}
