/**
 * The numbers of the net panel, in two forms built from the same values:
 * - `netFields`: one atomic value per row (a number, a word, or null with the reason), for
 *   the CSV and JSON exports;
 * - `netDisplayRows`: the same values grouped for reading ("040/25", "0.612 · 0.371 · 0.017"),
 *   for the numbers block, which is also the text alternative of the net.
 * Nothing here prints NaN, Infinity or undefined: a value that cannot be given is null (fields)
 * or a dash (rows), always with a reason.
 */
import type { FoldAnalysis } from '../../core/foldAnalysis';
import { CYLINDRICAL_MISFIT } from '../../core/cylindricity';
import type { FoldDescription, FoldDescriptionFailure } from '../../core/foldDescription';
import type { DensityGrid } from '../../core/density';
import type { Line, Plane } from '../../core/types';
import {
  DASH,
  formatAngle,
  formatCount,
  formatLine,
  formatNumber,
  formatPlane,
  isFiniteNumber,
  joinFormatted,
  type Formatted,
} from './format';

/** What the numbers are computed from. */
export interface NetNumbersInput {
  readonly analysis: FoldAnalysis | null;
  readonly description?: FoldDescription | FoldDescriptionFailure | null;
  readonly density?: DensityGrid | null;
  /** Lines on the net, used when the analysis carries no line summary. */
  readonly linesCount?: number;
}

/** One atomic value for export. */
export interface NetField {
  /** Stable snake_case key. */
  readonly key: string;
  readonly label: string;
  /** A finite number, a word, or null (see `note`). */
  readonly value: number | string | null;
  /** Unit of a number ('deg', '' for none). */
  readonly unit: string;
  /** Why `value` is null; null otherwise. */
  readonly note: string | null;
}

/** One line of the numbers block. */
export interface NetDisplayRow {
  readonly key: string;
  readonly label: string;
  /** What the value means, for a tooltip and screen readers ("trend/plunge"). */
  readonly hint: string;
  readonly text: string;
  /** Why the value is a dash; null otherwise. */
  readonly reason: string | null;
}

/** Reason given everywhere when there is no analysis at all. */
export const NO_ANALYSIS = 'no planes selected';

/**
 * Atomic values for export, in a fixed order.
 * @example netFields({ analysis: null }).find((f) => f.key === 'axis_trend') // {value: null, note: 'no planes selected', ...}
 */
export function netFields(input: NetNumbersInput): NetField[] {
  const a = input.analysis;
  const r = reasons(input);
  const fields: NetField[] = [];
  const num = (key: string, label: string, v: number | null | undefined, unit: string, note: string): void => {
    fields.push({ key, label, value: isFiniteNumber(v) ? v : null, unit, note: isFiniteNumber(v) ? null : note });
  };
  const word = (key: string, label: string, v: string | null | undefined, note: string): void => {
    const ok = typeof v === 'string' && v !== '' && !UNSAFE_WORDS.test(v);
    fields.push({ key, label, value: ok ? v : null, unit: '', note: ok ? null : note });
  };
  const line = (key: string, label: string, l: Line | null | undefined, note: string): void => {
    num(`${key}_trend`, `${label} trend`, l?.trend, 'deg', note);
    num(`${key}_plunge`, `${label} plunge`, l?.plunge, 'deg', note);
  };
  const plane = (key: string, label: string, p: Plane | null | undefined, note: string): void => {
    num(`${key}_dip_direction`, `${label} dip direction`, p?.dipDirection, 'deg', note);
    num(`${key}_dip`, `${label} dip`, p?.dip, 'deg', note);
  };

  num('n_planes', 'Planes', a?.n, '', NO_ANALYSIS);
  line('axis', 'Fold axis (pi)', a?.axis, r.axis);
  num('cone95', '95% cone about the axis', a?.cone95, 'deg', r.cone);
  line('beta', 'Beta axis', a?.beta, r.beta);
  plane('girdle', 'Girdle', a?.girdle, r.axis);
  num('girdle_misfit', 'RMS distance of the poles from the girdle', a?.cylindricity?.misfit, 'deg', r.axis);
  num('cylindricity', 'Cylindricity S2/(S2+S3)', a?.cylindricity?.cylindricity, '', r.axis);
  (['S1', 'S2', 'S3'] as const).forEach((s, i) => num(s.toLowerCase(), `Eigenvalue ${s}`, a?.eigenvalues?.[i], '', r.eigen));
  num('woodcock_k', 'Woodcock K', a?.woodcock?.K, '', r.K);
  num('woodcock_c', 'Woodcock C', a?.woodcock?.C, '', r.C);
  num('vollmer_p', 'Vollmer P', a?.vollmer?.P, '', r.eigen);
  num('vollmer_g', 'Vollmer G', a?.vollmer?.G, '', r.eigen);
  num('vollmer_r', 'Vollmer R', a?.vollmer?.R, '', r.eigen);
  word('reading', 'Reading', a?.reading, NO_ANALYSIS);
  num('n_lines', 'Lines', a?.lines?.n ?? input.linesCount ?? 0, '', 'no lines');
  line('lines_mean', 'Lines Fisher mean', a?.lines?.mean, r.linesMean);
  num('lines_alpha95', 'Lines alpha95', a?.lines?.alpha95, 'deg', r.alpha95);
  num('lines_kappa', 'Lines kappa', a?.lines?.kappa, '', r.alpha95);
  num('lines_angle_to_axis', 'Lines mean to pi axis', a?.lines?.angleToAxis, 'deg', r.angleToAxis);
  const d = input.description?.ok ? input.description : null;
  num('interlimb_angle', 'Interlimb angle (between limb maxima)', d?.interlimbAngle, 'deg', r.description);
  num('interlimb_angle_limb_means', 'Interlimb angle between limb mean poles (for comparison)', d?.interlimbAngleOfMeans, 'deg', r.description);
  num('limb_mode_bandwidth', 'Kernel bandwidth of the limb maxima', d?.bandwidth, 'deg', r.description);
  word('fleuty_interlimb', 'Interlimb class (Fleuty 1964)', d?.classes.interlimb, r.description);
  word('fleuty_hinge', 'Hinge plunge class (Fleuty 1964)', d?.classes.hingePlunge, r.description);
  word('fleuty_axial_surface', 'Axial surface class (Fleuty 1964)', d?.classes.axialSurface, r.axialPlane);
  plane('axial_plane', 'Axial plane (limb bisector)', d?.axialPlane, r.axialPlane);
  plane('limb1', 'Limb 1 maximum', d?.limbs[0].plane, r.description);
  word('limb1_estimate', 'Limb 1 maximum from', d?.limbs[0].estimate, r.description);
  plane('limb2', 'Limb 2 maximum', d?.limbs[1].plane, r.description);
  word('limb2_estimate', 'Limb 2 maximum from', d?.limbs[1].estimate, r.description);
  const g = input.density ?? null;
  word('density_method', 'Density method', g ? g.method : null, r.density);
  num('density_counting_angle', 'Density counting angle', g?.countingAngle, 'deg', r.density);
  word('density_levels', 'Contour levels (sigma)', g ? levelsText(g.levels) : null, g ? 'no contour reaches 2 sigma' : r.density);
  return fields;
}

/**
 * Rows of the numbers block, in reading order.
 * @example netDisplayRows({ analysis }).find((row) => row.key === 'axis')?.text // '040/25'
 */
export function netDisplayRows(input: NetNumbersInput): NetDisplayRow[] {
  const a = input.analysis;
  const r = reasons(input);
  const rows: NetDisplayRow[] = [];
  const row = (key: string, label: string, hint: string, f: Formatted): void => {
    rows.push({ key, label, hint, text: f.text, reason: f.reason });
  };
  row('n', 'Planes (n)', 'number of planes analysed', formatCount(a?.n, NO_ANALYSIS));
  row('axis', 'Fold axis (π)', 'trend/plunge of the pi axis, pole of the best-fit girdle', formatLine(a?.axis, r.axis));
  row('cone95', '95% cone', 'bootstrap cone of confidence about the axis', formatAngle(a?.cone95, r.cone));
  row('beta', 'β axis', 'trend/plunge of the mean intersection of pairs of planes', formatLine(a?.beta, r.beta));
  row('girdle', 'Girdle', 'dip direction/dip of the best-fit girdle plane', formatPlane(a?.girdle, r.axis));
  row('girdleFit', 'Girdle fit', `root-mean-square distance of the poles from the girdle, and cylindricity S2/(S2+S3) (1 = all on one great circle); above ${CYLINDRICAL_MISFIT}° the poles do not share one fold axis`, girdleFitText(a, r));
  const ev = a?.eigenvalues;
  row('eigenvalues', 'S1 · S2 · S3', 'eigenvalues of the orientation tensor of the poles', joinFormatted([0, 1, 2].map((i) => formatNumber(ev?.[i], 3, '', r.eigen)), ' · '));
  row('woodcock', 'Woodcock K, C', 'shape K (below 1 girdle, above 1 cluster) and strength C', woodcockText(a, r));
  row('vollmer', 'Vollmer P, G, R', 'point, girdle and random components', joinFormatted([a?.vollmer?.P, a?.vollmer?.G, a?.vollmer?.R].map((v) => formatNumber(v, 2, '', r.eigen)), ', '));
  const reading = a?.reading;
  row('reading', 'Reading', 'the result in words', typeof reading === 'string' && reading !== '' && !UNSAFE_WORDS.test(reading) ? { text: reading, reason: null } : { text: DASH, reason: NO_ANALYSIS });
  const ls = a?.lines;
  row('lines', 'Lines (n)', 'measured hinges and lineations', formatCount(ls?.n ?? input.linesCount ?? 0));
  const mean = formatLine(ls?.mean, r.linesMean);
  const alpha = formatAngle(ls?.alpha95, r.alpha95);
  row('linesMean', 'Lines mean', 'Fisher mean trend/plunge with its 95% cone (alpha95)', mean.reason !== null ? mean : { text: `${mean.text}, α95 ${alpha.reason === null ? alpha.text : `${DASH} (${alpha.reason})`}`, reason: null });
  row('linesToAxis', 'Lines to π axis', 'angle between the lines mean and the pi axis', formatAngle(ls?.angleToAxis, r.angleToAxis));
  const d = input.description?.ok ? input.description : null;
  const interlimb = formatAngle(d?.interlimbAngle, r.description, 0);
  row('interlimb', 'Interlimb angle', 'angle between the limb maxima in the profile plane (Fleuty 1964 class); the limb maxima are the densest pole directions of each limb along the girdle, which a rounded hinge does not pull inward', interlimb.reason === null ? { text: `${interlimb.text} (${d?.classes.interlimb})`, reason: null } : interlimb);
  row('fleuty', 'Fleuty class', 'hinge plunge and axial surface classes (Fleuty 1964)', d ? { text: [d.classes.hingePlunge, d.classes.axialSurface ?? 'axial surface not defined', d.classes.interlimb].join(', '), reason: null } : { text: DASH, reason: r.description });
  row('axialPlane', 'Axial plane (limb bisector)', 'dip direction/dip of the plane through the axis bisecting the limb maxima; an inclined or asymmetric fold\'s axial surface can differ — compare with axial-planar cleavage', formatPlane(d?.axialPlane, r.axialPlane));
  row('limbs', 'Limb maxima (planes)', 'dip direction/dip of the plane of each limb\'s densest pole direction (kernel density mode along the girdle; the mean pole for a limb of fewer than 5 planes)', joinFormatted([formatPlane(d?.limbs[0].plane, r.description), formatPlane(d?.limbs[1].plane, r.description)], ' · '));
  row('density', 'Contours', 'density method and contour levels in multiples of sigma', densityText(input.density ?? null, r.density));
  return rows;
}

/**
 * Contour levels as a short text: "2, 4, 6σ", or the first, second and last for many levels.
 * @example levelsText([2, 4, 6]) // '2, 4, 6σ'
 */
export function levelsText(levels: readonly number[]): string {
  const finite = levels.filter(isFiniteNumber);
  if (finite.length === 0) return 'none';
  const t = (v: number): string => String(Math.round(v * 100) / 100);
  const shown = finite.length <= 6 ? finite.map(t).join(', ') : `${t(finite[0])}, ${t(finite[1])} … ${t(finite[finite.length - 1])}`;
  return `${shown}σ`;
}

/** Words that must never reach the screen from a number gone wrong. */
const UNSAFE_WORDS = /\b(NaN|Infinity|undefined)\b/;

interface Reasons {
  axis: string;
  cone: string;
  beta: string;
  eigen: string;
  K: string;
  C: string;
  linesMean: string;
  alpha95: string;
  angleToAxis: string;
  description: string;
  axialPlane: string;
  density: string;
}

/** Why each value may be missing, in a few words, from the analysis' warnings and counts. */
function reasons(input: NetNumbersInput): Reasons {
  const a = input.analysis;
  const codes = new Set((a?.warnings ?? []).map((w) => w.code));
  const n = a?.n ?? 0;
  const axis = !a || n === 0
    ? NO_ANALYSIS
    : codes.has('parallel-planes')
      ? 'all planes parallel'
      : codes.has('axis-undefined')
        ? 'S2 = S3, no single axis'
        : 'not defined, see messages';
  const cone = !a || n === 0 ? NO_ANALYSIS : a.axis == null ? 'no axis' : n < 3 ? 'needs 3 or more planes' : 'not computed yet';
  const beta = !a || n === 0 ? NO_ANALYSIS : n < 2 ? 'needs 2 or more planes' : 'no pair of planes 10° or more apart';
  const eigen = !a || n === 0 ? NO_ANALYSIS : 'not available';
  const ev = a?.eigenvalues ?? null;
  const K = !ev ? eigen : ev[1] < 1e-10 ? 'not defined: all poles parallel' : 'unbounded: S2 = S3';
  const C = !ev ? eigen : ev[1] < 1e-10 ? 'not defined: all poles parallel' : 'unbounded: S3 = 0, poles on one great circle';
  const ls = a?.lines;
  const nLines = ls?.n ?? input.linesCount ?? 0;
  const linesMean = nLines === 0 ? 'no lines' : 'lines cancel out, no mean';
  const alpha95 = nLines === 0 ? 'no lines' : nLines < 2 ? 'needs 2 or more lines' : 'not defined for these lines';
  const angleToAxis = nLines === 0 ? 'no lines' : a?.axis == null ? 'no fold axis' : 'no lines mean';
  const desc = input.description;
  // A failed description's own reason is long; it is shown once in the messages.
  const description = desc == null ? (a && n > 0 ? 'no fold description' : NO_ANALYSIS) : desc.ok ? 'not available' : 'fold not described, see messages';
  const axialPlane = desc?.ok ? 'limbs face the same way' : description;
  const g = input.density;
  const density = g == null ? 'contours off or not computed' : 'not available';
  return { axis, cone, beta, eigen, K, C, linesMean, alpha95, angleToAxis, description, axialPlane, density };
}

function woodcockText(a: FoldAnalysis | null, r: Reasons): Formatted {
  const K = formatNumber(a?.woodcock?.K, 2, '', r.K);
  const C = formatNumber(a?.woodcock?.C, 2, '', r.C);
  if (K.reason !== null && C.reason !== null) return K.reason === C.reason ? K : { text: DASH, reason: `${K.reason}; ${C.reason}` };
  // One of the two is a number: show it and say why the other is not.
  return { text: `${K.reason === null ? K.text : `${DASH} (${K.reason})`}, ${C.reason === null ? C.text : `${DASH} (${C.reason})`}`, reason: null };
}

function girdleFitText(a: FoldAnalysis | null, r: Reasons): Formatted {
  const misfit = formatAngle(a?.cylindricity?.misfit, r.axis);
  const ratio = formatNumber(a?.cylindricity?.cylindricity, 3, '', r.axis);
  if (misfit.reason !== null || ratio.reason !== null) return misfit.reason !== null ? misfit : ratio;
  return { text: `${misfit.text} RMS, cylindricity ${ratio.text}`, reason: null };
}

function densityText(g: DensityGrid | null, reason: string): Formatted {
  if (!g) return { text: DASH, reason };
  const method = g.method === 'kamb' ? 'Kamb counting' : 'exponential smoothing';
  const cone = formatAngle(g.countingAngle, 'unknown');
  return { text: `${method}, ${levelsText(g.levels)}; counting cone ${cone.reason === null ? cone.text : DASH}`, reason: null };
}
