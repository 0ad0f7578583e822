import { describeProblem, type Station } from '../core/station';
import type { LineFormat, PlaneFormat } from '../core/notation';
import { stationsToCsv, stationsToGeoJson } from '../io/writeStations';
import { formatOptions, parseArgs, UsageError, type OptionSpec } from './args';
import { INPUT_OPTIONS, isGeoJsonPath, loadInput, type CliIo } from './input';

/**
 * `foldlens convert <file.csv> --to dipdir|rhr|strike-quadrant|quadrant [--out file]`
 *
 * Writes the table back with every original column and row, and normalised columns added
 * (see src/io/normalisedColumns.ts). Exit codes: 0 every row was read; 1 some rows could not
 * be read (they are still written, with fl_problems filled, and listed on stderr); 2 a usage
 * or file error, nothing written.
 */

const PLANE_FORMATS: readonly PlaneFormat[] = ['dipdir', 'rhr', 'strike-quadrant', 'quadrant'];
const LINE_FORMATS: readonly LineFormat[] = ['azimuth', 'quadrant'];

export const CONVERT_OPTIONS: readonly OptionSpec[] = [
  { name: 'to', value: 'notation', help: `how to write planes: ${PLANE_FORMATS.join(', ')} (required)` },
  { name: 'lines-to', value: 'notation', help: `how to write lines: ${LINE_FORMATS.join(', ')} (default azimuth)` },
  { name: 'decimals', value: 'N', help: 'decimal places of the angles written, 0 to 6 (default 2)' },
  { name: 'out', value: 'file', help: 'write here instead of to standard output; a .geojson name writes GeoJSON' },
  { name: 'help', help: 'show this help' },
  ...INPUT_OPTIONS,
];

export const CONVERT_HELP = `Usage: foldlens convert <file.csv> --to <notation> [options]

Writes the table back with every original column and row kept, and columns added:
fl_kind, the plane (fl_dip_direction + fl_dip, fl_strike + fl_dip, or fl_plane as text),
the line (fl_trend + fl_plunge), fl_lon/fl_lat when the file has map coordinates,
fl_corrections and fl_problems. Unreadable rows are kept, listed on stderr with their
row number (header = row 0) and reason.

Exit codes: 0 every row was read; 1 some rows could not be read; 2 usage or file error.

Options:
${formatOptions(CONVERT_OPTIONS)}
`;

/**
 * Runs `convert`; returns the exit code.
 * @example await runConvert(['field.csv', '--to', 'rhr'], io) // 0
 */
export async function runConvert(argv: readonly string[], io: CliIo): Promise<number> {
  const args = parseArgs(argv, CONVERT_OPTIONS);
  if (args.options.help) {
    io.stdout.write(CONVERT_HELP);
    return 0;
  }
  if (args.positionals.length !== 1) throw new UsageError(`convert takes one input file, got ${args.positionals.length} (see foldlens convert --help)`);
  const [path] = args.positionals;
  if (isGeoJsonPath(path)) throw new UsageError('convert reads CSV files; for GeoJSON input use analyze');
  const to = args.options.to;
  if (to === undefined) throw new UsageError(`convert needs --to: one of ${PLANE_FORMATS.join(', ')}`);
  if (!(PLANE_FORMATS as readonly string[]).includes(to)) throw new UsageError(`--to ${to}: expected one of ${PLANE_FORMATS.join(', ')}`);
  const linesTo = args.options['lines-to'] ?? 'azimuth';
  if (!(LINE_FORMATS as readonly string[]).includes(linesTo)) throw new UsageError(`--lines-to ${linesTo}: expected one of ${LINE_FORMATS.join(', ')}`);
  const decimals = args.options.decimals === undefined ? 2 : Number(args.options.decimals);
  if (!Number.isInteger(decimals) || decimals < 0 || decimals > 6) throw new UsageError(`--decimals ${args.options.decimals}: expected a whole number from 0 to 6`);

  const input = await loadInput(path, args, io);
  for (const n of input.notes) io.stderr.write(`note: ${n}\n`);
  const options = {
    planeFormat: to as PlaneFormat,
    lineFormat: linesTo as LineFormat,
    decimals,
    location: Boolean((input.mapping.x || input.mapping.y) && !(input.mapping.lon || input.mapping.lat)),
  };
  const out = args.options.out;
  const text = out !== undefined && isGeoJsonPath(out)
    ? `${JSON.stringify(stationsToGeoJson(input.stations, options), null, 1)}\n`
    : stationsToCsv(input.table!, input.stations, options) + '\n';
  if (out !== undefined) {
    try {
      await io.writeFile(out, text);
    } catch (e) {
      throw new UsageError(`cannot write ${out}: ${(e as Error).message}`);
    }
  } else {
    io.stdout.write(text);
  }
  return reportRows(input.stations, io);
}

/**
 * Lists the unreadable rows on stderr and returns 1 when there are any, else 0.
 * @example reportRows(stations, io) // 1, after "row 5, column dip: ..." lines
 */
export function reportRows(stations: readonly Station[], io: CliIo): number {
  const bad = stations.filter((s) => s.problems.length > 0);
  for (const s of bad) for (const p of s.problems) io.stderr.write(`${describeProblem(p)}\n`);
  if (bad.length > 0) {
    io.stderr.write(`${bad.length} of ${stations.length} rows could not be read (listed above); ${stations.length - bad.length} were read.\n`);
    return 1;
  }
  return 0;
}
