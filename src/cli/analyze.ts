import { DEFAULT_AXIS_LINE_KINDS, DEFAULT_FOLDED_KINDS, foldInputFromStations } from '../core/foldInput';
import { analyzeFold, type FoldAnalysis } from '../core/foldAnalysis';
import type { FoldDescription, FoldDescriptionFailure } from '../core/foldDescription';
import { describeIfGirdle } from '../worker/analysisJob';
import { formatLine, formatPlane } from '../core/notation';
import { isLineKind, isPlaneKind, LINE_KINDS, PLANE_KINDS, type Line, type MeasurementKind, type PlaneMeasurement } from '../core/types';
import { isUsable, type Station } from '../core/station';
import { normalizeKind } from '../io/kinds';
import { selectWithin } from '../io/within';
import { formatOptions, parseArgs, UsageError, type OptionSpec } from './args';
import { reportRows } from './convert';
import { INPUT_OPTIONS, loadInput, type CliIo } from './input';
import { readArea } from './optionFiles';

/**
 * `foldlens analyze <file.csv|file.geojson> [--within area.geojson] [--json] [--bootstrap N] [--seed S]`
 *
 * Fold analysis (src/core/foldAnalysis.ts) of the usable planes and measured lines of a file,
 * optionally only those inside an area. Exit codes: 0 every row was read and there were planes
 * to analyse; 1 some rows could not be read (listed on stderr; the analysis of the rest is still
 * printed) or no plane was left to analyse; 2 a usage or file error.
 */

/** Said with every result. */
export const CAUTION =
  'Results are aids to interpretation, not conclusions: check them against the field evidence, and defer to local codes and licensed professional practice.';

export const ANALYZE_OPTIONS: readonly OptionSpec[] = [
  { name: 'within', value: 'area.geojson', help: 'only stations inside these polygons (a station on the boundary counts as inside)' },
  { name: 'json', help: 'print the result as JSON' },
  { name: 'bootstrap', value: 'N', help: 'bootstrap resamples for the 95% cone about the axis (default 500; 0 skips it)' },
  { name: 'seed', value: 'S', help: 'seed of the bootstrap, so results can be repeated (default 1)' },
  { name: 'plane-kinds', value: 'list', help: 'planar kinds to analyse as the folded surface, comma-separated (default: bedding)' },
  { name: 'line-kinds', value: 'list', help: 'linear kinds to compare with the axis, comma-separated (default: hinge, intersection, lineation)' },
  { name: 'help', help: 'show this help' },
  ...INPUT_OPTIONS,
];

export const ANALYZE_HELP = `Usage: foldlens analyze <file.csv|file.geojson> [options]

Finds the fold axis of the usable planes of the folded surface (bedding unless
--plane-kinds says otherwise; cleavage and other axial-planar fabrics are left out) as
the pole of their best-fit girdle, with the eigenvalues of the orientation tensor,
Woodcock's K and C, how far the poles lie from one great circle (a warning when they
scatter too far to share one axis), a bootstrap cone about the axis, the Fisher mean of
measured lines (hinges, lineations) with its angle to the axis, and for a two-limbed
fold its limb maxima (the densest pole directions of each limb), interlimb angle,
limb-bisector axial plane and Fleuty (1964) classes, as the map's net panel shows them.
Rows that cannot be read are listed on stderr (row numbers: header = row 0).

Exit codes: 0 all rows read; 1 some rows could not be read, or no plane to analyse;
2 usage or file error.

${CAUTION}

Options:
${formatOptions(ANALYZE_OPTIONS)}
`;

/** What the JSON output holds besides the analysis itself. */
export interface AnalyzeReport extends FoldAnalysis {
  /** The fold description the net panel shows (worker/analysisJob.ts), or why there is none. */
  readonly description: FoldDescription | FoldDescriptionFailure;
  readonly caution: string;
  readonly input: {
    readonly file: string;
    readonly rows: number;
    readonly usable: number;
    readonly unreadable: number;
    readonly within?: { readonly file: string; readonly inside: number; readonly outside: number; readonly noLocation: number };
    readonly planes: Readonly<Record<string, number>>;
    readonly lines: Readonly<Record<string, number>>;
  };
}

/**
 * Runs `analyze`; returns the exit code.
 * @example await runAnalyze(['field.csv', '--json'], io) // 0
 */
export async function runAnalyze(argv: readonly string[], io: CliIo): Promise<number> {
  const args = parseArgs(argv, ANALYZE_OPTIONS);
  const o = args.options;
  if (o.help) {
    io.stdout.write(ANALYZE_HELP);
    return 0;
  }
  if (args.positionals.length !== 1) throw new UsageError(`analyze takes one input file, got ${args.positionals.length} (see foldlens analyze --help)`);
  const bootstrap = o.bootstrap === undefined ? undefined : wholeNumber(o.bootstrap, '--bootstrap', 0);
  const seed = o.seed === undefined ? undefined : wholeNumber(o.seed, '--seed', Number.MIN_SAFE_INTEGER);
  const planeKinds = kindList(o['plane-kinds'], '--plane-kinds', isPlaneKind, PLANE_KINDS, DEFAULT_FOLDED_KINDS);
  const lineKinds = kindList(o['line-kinds'], '--line-kinds', isLineKind, LINE_KINDS, DEFAULT_AXIS_LINE_KINDS);
  const polygons = o.within === undefined ? undefined : await readArea(o.within, io);

  const [path] = args.positionals;
  const input = await loadInput(path, args, io);
  for (const n of input.notes) io.stderr.write(`note: ${n}\n`);
  const rowsCode = reportRows(input.stations, io);

  const usable = input.stations.filter(isUsable);
  const selection = polygons ? selectWithin(usable, polygons) : undefined;
  const chosen = selection ? selection.inside : usable;
  // The same choice of measurements as the map's net panel (core/foldInput.ts).
  const input2 = foldInputFromStations(chosen, undefined, { planeKinds, lineKinds });
  const planeStations = Array.from(input2.planeIds, (i) => chosen[i]);
  const lineStations = Array.from(input2.lineIds, (i) => chosen[i]);
  const planes: PlaneMeasurement[] = input2.planes;
  const lines: Line[] = input2.lines.map(({ trend, plunge }) => ({ trend, plunge }));

  const analysis = analyzeFold({ planes, ...(lines.length > 0 && { lines }) }, { ...(bootstrap !== undefined && { bootstrap }), ...(seed !== undefined && { seed }) });
  const report: AnalyzeReport = {
    ...analysis,
    description: describeIfGirdle(planes, analysis),
    caution: CAUTION,
    input: {
      file: path,
      rows: input.stations.length,
      usable: usable.length,
      unreadable: input.stations.length - usable.length,
      ...(selection && o.within !== undefined && {
        within: { file: o.within, inside: selection.inside.length, outside: selection.outside.length, noLocation: selection.noLocation.length },
      }),
      planes: countKinds(planeStations),
      lines: countKinds(lineStations),
    },
  };
  io.stdout.write(o.json ? `${JSON.stringify(report, null, 2)}\n` : summary(report, bootstrap, seed));
  if (planes.length === 0) {
    io.stderr.write('no usable plane to analyse' + (selection ? ' inside the area' : '') + '.\n');
    return 1;
  }
  return rowsCode;
}

function wholeNumber(text: string, option: string, min: number): number {
  const v = Number(text);
  if (text.trim() === '' || !Number.isSafeInteger(v) || v < min) throw new UsageError(`${option} ${text}: expected a whole number${min === 0 ? ' from 0' : ''}`);
  return v;
}

function kindList(text: string | undefined, option: string, accept: (k: string) => boolean, all: readonly MeasurementKind[], defaults: readonly MeasurementKind[]): readonly MeasurementKind[] {
  if (text === undefined) return defaults;
  return text.split(',').map((word) => {
    const k = normalizeKind(word);
    if (k === undefined || !accept(k)) throw new UsageError(`${option}: "${word.trim()}" is not one of ${all.join(', ')}`);
    return k;
  });
}


function countKinds(stations: readonly Station[]): Record<string, number> {
  const out: Record<string, number> = {};
  for (const s of stations) out[s.kind!] = (out[s.kind!] ?? 0) + 1;
  return out;
}

const kinds = (counts: Readonly<Record<string, number>>): string =>
  Object.keys(counts).length === 0 ? '' : ` (${Object.entries(counts).map(([k, n]) => `${k} ${n}`).join(', ')})`;

const line = (l: Line | null): string => (l === null ? 'undefined' : `${formatLine(l, 'azimuth', { decimals: 1 })} (trend/plunge)`);
const fixed = (x: number | null, d: number): string => (x === null ? 'unbounded' : x.toFixed(d));

function summary(r: AnalyzeReport, bootstrap: number | undefined, seed: number | undefined): string {
  const i = r.input;
  const out: string[] = [`Fold analysis of ${i.file}`];
  out.push(`Rows: ${i.rows}, usable ${i.usable}${i.unreadable > 0 ? `, ${i.unreadable} could not be read (listed on stderr)` : ''}`);
  if (i.within) {
    out.push(
      `Inside ${i.within.file}: ${i.within.inside} of ${i.usable} usable stations (boundary counts as inside)` +
        (i.within.noLocation > 0 ? `; ${i.within.noLocation} without a location left out` : ''),
    );
  }
  const nLines = Object.values(i.lines).reduce((a, b) => a + b, 0);
  out.push(`Planes: ${r.n}${kinds(i.planes)}; lines: ${nLines}${kinds(i.lines)}`);
  out.push(`Fold axis (pi axis): ${line(r.axis)}`);
  out.push(`Girdle: ${r.girdle === null ? 'undefined' : `${formatPlane(r.girdle, 'dipdir', { decimals: 1 })} (dip direction/dip)`}`);
  if (r.cone95 !== null) out.push(`95% cone about the axis: ${r.cone95.toFixed(1)}° (bootstrap, ${bootstrap ?? 500} resamples, seed ${seed ?? 1})`);
  if (r.eigenvalues) out.push(`Eigenvalues S1, S2, S3: ${r.eigenvalues.map((e) => e.toFixed(4)).join(', ')}`);
  if (r.woodcock) out.push(`Woodcock K = ${fixed(r.woodcock.K, 2)}, C = ${fixed(r.woodcock.C, 2)}`);
  if (r.cylindricity) out.push(`Girdle fit: poles ${r.cylindricity.misfit.toFixed(1)}° (RMS) from the girdle, cylindricity S2/(S2+S3) = ${r.cylindricity.cylindricity.toFixed(3)}`);
  out.push(`Beta axis: ${line(r.beta)}`);
  if (r.lines) {
    const l = r.lines;
    out.push(
      `Lines: n ${l.n}, mean ${line(l.mean)}, alpha95 ${l.alpha95 === null ? 'undefined' : `${l.alpha95.toFixed(1)}°`}, angle to axis ${l.angleToAxis === null ? 'undefined' : `${l.angleToAxis.toFixed(1)}°`}`,
    );
  }
  out.push(`Reading: ${r.reading}`);
  out.push(r.description.ok ? `Fold: ${r.description.text}` : r.description.reason);
  for (const w of r.warnings) out.push(`Warning: ${w.message}`);
  out.push(`Method: ${r.method}`);
  out.push(`Caution: ${r.caution}`);
  return `${out.join('\n')}\n`;
}
