import { assertLines, fisherLines } from '../fisher';
import { checkAxis } from '../downPlunge';
import type { Line } from '../types';
import { axialAngle, lineToVector } from '../vectors';

/**
 * Do the measured lines agree with the computed fold axis? In a cylindrical fold, hinges and
 * bedding-cleavage intersection lineations parallel the fold axis (Ramsay 1967, *Folding and
 * Fracturing of Rocks*; common practice), so each should lie near the pi axis, and their mean
 * should lie within the axis's cone of confidence.
 *
 * - Each line: its angle to the axis (lines have no sense: 0..90°), flagged when larger than
 *   `threshold` (default 15°; Foldlens convention: hinge and intersection readings scatter by a
 *   few degrees, about ±3° in trend and ±2° in plunge for a compass-clinometer (common practice),
 *   and curved hinges add more, so 15° leaves room for honest scatter while catching a line that
 *   belongs to another fold, another generation or a misread).
 * - The lines' Fisher (1953) mean as axes (fisher.ts), alpha95 and kappa, and the angle between
 *   that mean and the axis, judged two ways: inside the axis cone (angle <= cone95, the bootstrap
 *   cone of the pi axis), and axis inside the lines' cone (angle <= alpha95). Both cones are 95%
 *   regions for a different estimate; when neither holds, the two estimates differ.
 */

/** A measured line with an optional id (station id) for messages. */
export interface MeasuredLine extends Line {
  readonly id?: string;
}

/** Options of {@link compareAxisWithLines}. */
export interface AxisVsLinesOptions {
  /** Flag lines more than this many degrees from the axis (default 15). */
  readonly threshold?: number;
  /** 95% cone about the axis in degrees (e.g. FoldAnalysis.cone95); null or absent: not judged. */
  readonly cone95?: number | null;
}

/**
 * Defaults of {@link AxisVsLinesOptions}.
 * @example compareAxisWithLines(axis, lines, { threshold: AXIS_LINE_DEFAULTS.threshold })
 */
export const AXIS_LINE_DEFAULTS = Object.freeze({ threshold: 15 });

/** One line against the axis. */
export interface LineAgreement {
  /** Position in the input. */
  readonly index: number;
  readonly id?: string;
  readonly line: Line;
  /** Angle to the axis in degrees, 0..90. */
  readonly angle: number;
  readonly flagged: boolean;
}

/** Fisher mean of a set of lines and its angle to the axis. */
export interface LineMeanAgreement {
  readonly n: number;
  readonly mean: Line | null;
  readonly alpha95: number | null;
  readonly kappa: number | null;
  /** Angle between the mean and the axis (degrees), null without a mean. */
  readonly angle: number | null;
}

/** The result of {@link compareAxisWithLines}; JSON-friendly. */
export interface AxisVsLines {
  readonly axis: Line;
  readonly threshold: number;
  readonly cone95: number | null;
  readonly lines: readonly LineAgreement[];
  /** Fisher statistics of all lines. */
  readonly all: LineMeanAgreement;
  /** The same without the flagged lines (equal to `all` when none is flagged). */
  readonly unflagged: LineMeanAgreement;
  /** Mean of all lines within the axis cone (angle <= cone95); null without a cone or a mean. */
  readonly meanInsideAxisCone: boolean | null;
  /** Axis within the lines' cone (angle <= alpha95); null without alpha95. */
  readonly axisInsideLineCone: boolean | null;
  readonly flagged: number;
  /** The result in words. */
  readonly reading: string;
}

/**
 * Compares the fold axis with measured lines. Throws a RangeError naming the bad line, axis or option.
 * @example
 * compareAxisWithLines({trend: 75, plunge: 12}, [{trend: 78, plunge: 10}, {trend: 160, plunge: 40}], { cone95: 3 })
 * // lines[1].flagged === true; all.angle: angle between their mean and 075/12
 */
export function compareAxisWithLines(axis: Line, lines: readonly MeasuredLine[], options: AxisVsLinesOptions = {}): AxisVsLines {
  checkAxis(axis, 'compareAxisWithLines: axis');
  assertLines(lines, 'lines');
  const threshold = options.threshold ?? AXIS_LINE_DEFAULTS.threshold;
  if (!(threshold > 0 && threshold <= 90)) throw new RangeError(`compareAxisWithLines: threshold ${String(threshold)} (expected degrees above 0, up to 90)`);
  const cone95 = options.cone95 ?? null;
  if (cone95 !== null && !(cone95 >= 0 && cone95 <= 90)) throw new RangeError(`compareAxisWithLines: cone95 ${String(cone95)} (expected degrees from 0 to 90)`);
  const a = lineToVector(axis);
  const agreements = lines.map((l, index): LineAgreement => {
    const angle = axialAngle(lineToVector(l), a);
    return { index, ...(l.id !== undefined && { id: l.id }), line: { trend: l.trend, plunge: l.plunge }, angle, flagged: angle > threshold };
  });
  const all = meanAgreement(lines, a);
  const kept = lines.filter((_, i) => !agreements[i].flagged);
  const unflagged = kept.length === lines.length ? all : meanAgreement(kept, a);
  const meanInsideAxisCone = cone95 === null || all.angle === null ? null : all.angle <= cone95;
  const axisInsideLineCone = all.alpha95 === null || all.angle === null ? null : all.angle <= all.alpha95;
  const flagged = agreements.filter((g) => g.flagged).length;
  return {
    axis: { trend: axis.trend, plunge: axis.plunge },
    threshold,
    cone95,
    lines: agreements,
    all,
    unflagged,
    meanInsideAxisCone,
    axisInsideLineCone,
    flagged,
    reading: readingOf(lines.length, flagged, threshold, all, cone95, meanInsideAxisCone, axisInsideLineCone),
  };
}

function meanAgreement(lines: readonly Line[], axis: { x: number; y: number; z: number }): LineMeanAgreement {
  const f = fisherLines(lines.map((l) => ({ trend: l.trend, plunge: l.plunge })));
  return { n: f.n, mean: f.mean, alpha95: f.alpha95, kappa: f.kappa, angle: f.meanVector ? axialAngle(f.meanVector, axis) : null };
}

function readingOf(
  n: number,
  flagged: number,
  threshold: number,
  all: LineMeanAgreement,
  cone95: number | null,
  insideAxisCone: boolean | null,
  axisInsideLineCone: boolean | null,
): string {
  if (n === 0) return 'No measured lines to compare with the axis.';
  const parts: string[] = [];
  parts.push(flagged === 0 ? `All ${n} line${n === 1 ? '' : 's'} lie within ${threshold}° of the axis.` : `${flagged} of ${n} line${n === 1 ? '' : 's'} lie more than ${threshold}° from the axis.`);
  if (all.angle !== null) {
    const cones: string[] = [];
    if (insideAxisCone !== null) cones.push(insideAxisCone ? `inside the axis's 95% cone (${cone95!.toFixed(1)}°)` : `outside the axis's 95% cone (${cone95!.toFixed(1)}°)`);
    if (axisInsideLineCone !== null) cones.push(axisInsideLineCone ? `the axis lies inside the lines' alpha95 (${all.alpha95!.toFixed(1)}°)` : `the axis lies outside the lines' alpha95 (${all.alpha95!.toFixed(1)}°)`);
    parts.push(`Their mean is ${all.angle.toFixed(1)}° from the axis${cones.length > 0 ? `: ${cones.join('; ')}` : ''}.`);
    if (insideAxisCone === false && axisInsideLineCone === false) parts.push('The lines and the poles point to different axes: check for a second fold generation, a curved hinge, or lines of another kind.');
  }
  return parts.join(' ');
}
