import { booleanPointInPolygon, point } from '@turf/turf';
import type { Feature, MultiPolygon, Polygon } from 'geojson';
import { projectDownPlunge } from '../core/downPlunge';
import { normalizeAzimuth } from '../core/math';
import { formatLine, parseLine } from '../core/notation';
import { lineInProfile, planeTraceInProfile, type ProfileLineMark, type ProfileTrace } from '../core/profileAttitude';
import { keptRuns } from '../core/profileLayout';
import { isUsable, type Station } from '../core/station';
import type { Line } from '../core/types';
import { CrsError } from '../io/crs';
import { parseIsoDate } from '../io/declination';
import { lineworkHeights, stationHeights, type HeightSource } from '../io/elevations';
import { chooseLocalFrame, gridAxis, lonLatToLocal, type LocalFrame } from '../io/localFrame';
import { selectWithin } from '../io/within';
import { formatOptions, parseArgs, UsageError, type OptionSpec } from './args';
import { reportRows } from './convert';
import { INPUT_OPTIONS, loadInput, type CliIo } from './input';
import { profileSvg, type DrawnLine, type DrawnStation } from './profileSvg';
import { loadDem, readArea, readLines } from './optionFiles';

/**
 * `foldlens profile <stations.csv> --axis TREND/PLUNGE [--lines lines.geojson] [--dem dem.tif]
 * [--within area.geojson] [--json] [--svg out.svg]`
 *
 * Down-plunge projection (src/core/downPlunge.ts) of stations and linework onto the plane normal
 * to the fold axis, in a local UTM frame (src/io/localFrame.ts). Writes, per feature, the profile
 * x and y and the distance along the axis: CSV on stdout, or JSON with --json; --svg also draws
 * the profile. Exit codes: 0 all went well; 1 some rows could not be read, or some stations or
 * vertices had no height or no location (each listed on stderr; the rest is projected); 2 a
 * usage or file error.
 */

/** Said with every profile. */
export const PROFILE_CAUTION = 'Results are aids to interpretation; check in the field and defer to local codes and licensed professional practice.';

/** How the numbers were made, in one sentence. */
export const PROFILE_METHOD =
  'Down-plunge projection (down-structure view, Mackin 1950): each point moved parallel to the fold axis onto the plane normal to it; orthographic, true scale, no vertical exaggeration.';

export const PROFILE_OPTIONS: readonly OptionSpec[] = [
  { name: 'axis', value: 'trend/plunge', help: 'fold axis to look down, degrees referred to true north, e.g. 075/12 (required)' },
  { name: 'lines', value: 'file.geojson', help: 'linework to project: LineString/MultiLineString GeoJSON (lon/lat; a third number is the height)' },
  { name: 'dem', value: 'dem.tif', help: 'GeoTIFF terrain model giving heights to stations and vertices that have none' },
  { name: 'dem-crs', value: 'crs', help: 'CRS of the DEM when the file names no EPSG code (EPSG:<code>, "UTM 33N", ...)' },
  { name: 'within', value: 'area.geojson', help: 'only stations and vertices inside these polygons (the boundary counts as inside)' },
  { name: 'json', help: 'print JSON instead of CSV' },
  { name: 'svg', value: 'out.svg', help: 'also draw the profile as a standalone SVG' },
  { name: 'title', value: 'text', help: 'title of the SVG (default "Down-plunge profile")' },
  { name: 'drawn', value: 'YYYY-MM-DD', help: 'date written in the SVG title block (default today)' },
  { name: 'help', help: 'show this help' },
  ...INPUT_OPTIONS,
];

export const PROFILE_HELP = `Usage: foldlens profile <stations.csv|stations.geojson> --axis <trend/plunge> [options]

Projects stations (and map linework) down the plunge of a fold axis onto the plane normal to it,
looking down the plunge: profile x to the right (azimuth trend + 90), profile y up, and the
distance along the axis (larger = farther down the plunge). Planes get the angle of their trace
in the profile (an apparent-dip tick), lines their angle to the axis. Heights come from the data,
else from --dem; stations and vertices with neither are listed on stderr and left out.

Output: CSV on stdout (--json for JSON); --svg draws the profile at true scale.
Exit codes: 0 all went well; 1 some rows could not be read or some points had no height or
location (listed on stderr); 2 usage or file error.

${PROFILE_CAUTION}

Options:
${formatOptions(PROFILE_OPTIONS)}
`;

/** One projected station in the output. */
export interface ProfileStation {
  readonly id: string;
  readonly row: number;
  readonly kind: string;
  readonly x: number;
  readonly y: number;
  readonly alongAxis: number;
  readonly elevation: number;
  readonly elevationSource: HeightSource;
  /** Planes: the trace in the profile (angle from profile right, degrees) and the plane's angle to the axis. */
  readonly trace?: { readonly angle: number; readonly dx: number; readonly dy: number; readonly angleToAxis: number } | null;
  /** Lines: angle between the line and the axis. */
  readonly angleToAxis?: number;
}

/** One run of projected linework vertices. */
export interface ProfileLinePart {
  readonly feature: number;
  readonly id: string;
  readonly name?: string;
  /** Line number within a MultiLineString, from 1. */
  readonly part: number;
  /** Vertex numbers (from 1, within the part) of the vertices kept. */
  readonly vertices: readonly number[];
  /** [x', y', along axis] per vertex kept. */
  readonly points: readonly (readonly [number, number, number])[];
}

/** The JSON output. */
export interface ProfileReport {
  readonly method: string;
  readonly caution: string;
  readonly view: string;
  readonly units: 'metres';
  readonly axis: Line & { readonly reference: 'true north' };
  readonly frame: {
    readonly crs: string;
    readonly crsName: string;
    readonly originEasting: number;
    readonly originNorthing: number;
    readonly originElevation: 0;
    readonly convergence: number;
    readonly gridAxis: Line;
  };
  readonly input: {
    readonly file: string;
    readonly rows: number;
    readonly usable: number;
    readonly lines?: string;
    readonly dem?: string;
    readonly within?: { readonly file: string; readonly stationsInside: number; readonly stationsOutside: number; readonly verticesInside: number; readonly verticesOutside: number };
  };
  readonly stations: readonly ProfileStation[];
  readonly lines: readonly ProfileLinePart[];
  readonly leftOut: readonly string[];
}

/**
 * Runs `profile`; returns the exit code.
 * @example await runProfile(['field.csv', '--axis', '075/12', '--json'], io) // 0
 */
export async function runProfile(argv: readonly string[], io: CliIo): Promise<number> {
  const args = parseArgs(argv, PROFILE_OPTIONS);
  const o = args.options;
  if (o.help) {
    io.stdout.write(PROFILE_HELP);
    return 0;
  }
  if (args.positionals.length !== 1) throw new UsageError(`profile takes one stations file, got ${args.positionals.length} (see foldlens profile --help)`);
  if (o.axis === undefined) throw new UsageError('profile needs --axis <trend/plunge>, the fold axis to look down (e.g. --axis 075/12)');
  const axis = parseAxis(o.axis);
  const drawn = o.drawn === undefined ? new Date().toISOString().slice(0, 10) : checkedDate(o.drawn);
  if ((o.title !== undefined || o.drawn !== undefined) && o.svg === undefined) throw new UsageError(`--${o.title !== undefined ? 'title' : 'drawn'} applies to the SVG: give --svg <out.svg> too`);
  const area = o.within === undefined ? undefined : await readArea(o.within, io);
  const linework = o.lines === undefined ? [] : await readLines(o.lines, io);
  const dem = o.dem === undefined ? undefined : await loadDem(o.dem, o['dem-crs'], io);
  if (o['dem-crs'] !== undefined && o.dem === undefined) throw new UsageError('--dem-crs applies to a DEM: give --dem <dem.tif> too');

  const [path] = args.positionals;
  const input = await loadInput(path, args, io);
  for (const n of input.notes) io.stderr.write(`note: ${n}\n`);
  let code = reportRows(input.stations, io);
  const leftOut: string[] = [];
  const leave = (message: string): void => {
    leftOut.push(message);
    io.stderr.write(`${message}\n`);
    code = Math.max(code, 1);
  };

  // Stations: usable, located, inside the area.
  const usable = input.stations.filter(isUsable);
  const selection = area ? selectWithin(usable, area) : undefined;
  const candidates = selection ? selection.inside : usable.filter((s) => s.lon !== undefined && s.lat !== undefined);
  for (const s of selection ? selection.noLocation : usable.filter((st) => st.lon === undefined || st.lat === undefined)) {
    leave(`station ${s.id} (row ${s.row}) has no location (longitude/latitude or x/y with --crs), so it cannot be placed in the profile`);
  }
  const heights = stationHeights(
    candidates.map((s) => ({ id: s.id, row: s.row, lon: s.lon, lat: s.lat, elevation: s.elevation })),
    dem,
  );
  for (const m of heights.missing) leave(`${m.message}; left out`);
  const placed = candidates.map((s, i) => ({ s, h: heights.heights[i], source: heights.sources[i] })).filter((p) => p.source !== null);

  // Linework: vertices inside the area and with a height.
  const lineHeights = lineworkHeights(linework, dem);
  const insideMasks = linework.map((f) => f.parts.map((p) => vertexMask(p.lonLat, area)));
  let verticesInside = 0;
  let verticesOutside = 0;
  for (const masks of insideMasks) {
    for (const m of masks) {
      const inside = m.filter(Boolean).length;
      verticesInside += inside;
      verticesOutside += m.length - inside;
    }
  }
  for (const m of lineHeights.missing) {
    const [a, b] = m.vertices ?? [0, -1];
    const mask = insideMasks[(m.feature ?? 1) - 1][(m.part ?? 1) - 1];
    // Vertices outside the area are not wanted anyway: report only runs that reach inside it.
    if (mask.slice(a - 1, b).some(Boolean)) leave(`${m.message}; left out`);
  }

  // The frame: UTM zone of everything that will be projected.
  const lonLats: number[] = [];
  for (const p of placed) lonLats.push(p.s.lon!, p.s.lat!);
  linework.forEach((f, fi) =>
    f.parts.forEach((part, k) => {
      for (let v = 0; v < part.heights.length; v++) if (insideMasks[fi][k][v]) lonLats.push(part.lonLat[2 * v], part.lonLat[2 * v + 1]);
    }),
  );
  if (lonLats.length === 0) {
    io.stderr.write(`nothing to project: no station or vertex${area ? ' inside the area' : ''} has both a location and a height.\n`);
    return Math.max(code, 1);
  }
  let frame: LocalFrame;
  try {
    frame = chooseLocalFrame(lonLats);
  } catch (e) {
    if (e instanceof CrsError) throw new UsageError(`cannot choose a local frame: ${e.message}`);
    throw e;
  }
  const axisOnGrid = gridAxis(frame, axis);

  const stationXyz = lonLatToLocal(
    frame,
    placed.flatMap((p) => [p.s.lon!, p.s.lat!]),
    placed.map((p) => p.h),
  );
  const stationProfile = projectDownPlunge(stationXyz, axisOnGrid);
  const stations: ProfileStation[] = placed.map((p, i) => stationRecord(p.s, p.h, p.source!, stationProfile, i, axis));

  const lines: ProfileLinePart[] = [];
  linework.forEach((f, fi) =>
    f.parts.forEach((part, k) => {
      const z = lineHeights.heights[fi][k];
      const keep = insideMasks[fi][k].map((inside, v) => inside && Number.isFinite(z[v]));
      for (const [a, b] of keptRuns(keep)) {
        const xyz = lonLatToLocal(frame, part.lonLat.subarray(2 * a, 2 * b), z.subarray(a, b));
        const pr = projectDownPlunge(xyz, axisOnGrid);
        const points: [number, number, number][] = [];
        for (let i = 0; i < b - a; i++) points.push([round3(pr[3 * i]), round3(pr[3 * i + 1]), round3(pr[3 * i + 2])]);
        lines.push({ feature: f.feature, id: f.id, ...(f.name !== undefined && { name: f.name }), part: k + 1, vertices: Array.from({ length: b - a }, (_, i) => a + i + 1), points });
      }
    }),
  );

  const report: ProfileReport = {
    method: PROFILE_METHOD,
    caution: PROFILE_CAUTION,
    view: viewSentence(axis),
    units: 'metres',
    axis: { trend: axis.trend, plunge: axis.plunge, reference: 'true north' },
    frame: {
      crs: frame.crs.code,
      crsName: frame.crs.name,
      originEasting: frame.originEasting,
      originNorthing: frame.originNorthing,
      originElevation: 0,
      convergence: round6(frame.convergence),
      gridAxis: { trend: round6(axisOnGrid.trend), plunge: axisOnGrid.plunge },
    },
    input: {
      file: path,
      rows: input.stations.length,
      usable: usable.length,
      ...(o.lines !== undefined && { lines: o.lines }),
      ...(o.dem !== undefined && { dem: o.dem }),
      ...(selection &&
        o.within !== undefined && {
          within: { file: o.within, stationsInside: selection.inside.length, stationsOutside: selection.outside.length, verticesInside, verticesOutside },
        }),
    },
    stations,
    lines,
    leftOut,
  };
  io.stdout.write(o.json ? `${JSON.stringify(report, null, 2)}\n` : toCsv(report));

  if (o.svg !== undefined) {
    const svg = profileSvg({
      title: o.title ?? 'Down-plunge profile',
      notes: [
        `Axis ${formatLine(axis, 'azimuth', { decimals: 1 })} (trend/plunge, true north). ${report.view}`,
        `Method: ${PROFILE_METHOD}`,
        `Frame: ${frame.crs.code} (${frame.crs.name}), origin E ${frame.originEasting} N ${frame.originNorthing}, heights above sea level; grid convergence ${frame.convergence.toFixed(3)}°.`,
        `Data: ${path}${o.lines !== undefined ? `, ${o.lines}` : ''}${o.dem !== undefined ? `, heights from ${o.dem} where missing` : ''}${o.within !== undefined ? `, inside ${o.within}` : ''}. ${stations.length} stations, ${lines.reduce((n, l) => n + l.points.length, 0)} vertices.`,
        `Date: ${drawn}. Drawn by foldlens.`,
      ],
      caution: PROFILE_CAUTION,
      stations: stations.map((s): DrawnStation => ({ id: s.id, kind: s.kind, x: s.x, y: s.y, depth: s.alongAxis, ...(s.trace && { trace: { dx: s.trace.dx, dy: s.trace.dy } }) })),
      lines: lines.map((l): DrawnLine => ({ label: `${l.name ?? l.id} (feature ${l.feature}${l.part > 1 ? `, line ${l.part}` : ''})`, points: new Float64Array(l.points.flat()) })),
    });
    try {
      await io.writeFile(o.svg, svg);
    } catch (e) {
      throw new UsageError(`cannot write ${o.svg}: ${(e as Error).message}`);
    }
  }
  return code;
}

function parseAxis(text: string): Line {
  try {
    return parseLine(text);
  } catch (e) {
    throw new UsageError(`--axis ${text}: ${(e as Error).message}`);
  }
}

function checkedDate(text: string): string {
  if (!parseIsoDate(text)) throw new UsageError(`--drawn ${text}: expected a date written YYYY-MM-DD`);
  return text;
}




/** Which vertices (flat lon/lat pairs) lie inside the area (all, without one). */
function vertexMask(lonLat: Float64Array, area: readonly Feature<Polygon | MultiPolygon>[] | undefined): boolean[] {
  const n = lonLat.length / 2;
  if (!area) return new Array<boolean>(n).fill(true);
  // Same rule as selectWithin (io/within.ts): the boundary counts as inside.
  return Array.from({ length: n }, (_, v) => area.some((p) => booleanPointInPolygon(point([lonLat[2 * v], lonLat[2 * v + 1]]), p, { ignoreBoundary: false })));
}

function stationRecord(s: Station, h: number, source: HeightSource, profile: Float64Array, i: number, axis: Line): ProfileStation {
  const base = {
    id: s.id,
    row: s.row,
    kind: s.kind ?? '',
    x: round3(profile[3 * i]),
    y: round3(profile[3 * i + 1]),
    alongAxis: round3(profile[3 * i + 2]),
    elevation: round3(h),
    elevationSource: source,
  };
  // Attitudes are referred to true north and so is the axis: the trace depends only on their relative angle.
  if (s.plane) {
    const t: ProfileTrace | null = planeTraceInProfile(s.plane, axis);
    return { ...base, trace: t && { angle: round3(t.angle), dx: round6(t.dx), dy: round6(t.dy), angleToAxis: round3(t.axisToPlane) } };
  }
  const m: ProfileLineMark = lineInProfile(s.line!, axis);
  return { ...base, angleToAxis: round3(m.angleToAxis) };
}

function viewSentence(axis: Line): string {
  const right = normalizeAzimuth(axis.trend + 90);
  return `Looking down the plunge (toward ${formatLine(axis, 'azimuth', { decimals: 1 })}); profile right is azimuth ${right.toFixed(1)}, profile up is normal to the axis; distance along the axis grows down the plunge.`;
}

const CSV_HEADER = ['id', 'type', 'kind', 'name', 'part', 'vertex', 'profile_x_m', 'profile_y_m', 'along_axis_m', 'trace_angle_deg', 'angle_to_axis_deg'];

function toCsv(r: ProfileReport): string {
  const rows: string[] = [CSV_HEADER.join(',')];
  for (const s of r.stations) {
    const trace = s.trace ? String(s.trace.angle) : '';
    const toAxis = s.trace ? String(s.trace.angleToAxis) : s.angleToAxis !== undefined ? String(s.angleToAxis) : '';
    rows.push([s.id, 'station', s.kind, '', '', '', s.x, s.y, s.alongAxis, trace, toAxis].map(csvField).join(','));
  }
  for (const l of r.lines) {
    l.points.forEach((p, i) => rows.push([l.id, 'line', '', l.name ?? '', l.part, l.vertices[i], p[0], p[1], p[2], '', ''].map(csvField).join(',')));
  }
  return `${rows.join('\n')}\n`;
}

/** RFC 4180: quote a field holding a comma, a quote or a line break; double the quotes. */
function csvField(v: string | number): string {
  const s = String(v);
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

const round3 = (v: number): number => Math.round(v * 1000) / 1000;
const round6 = (v: number): number => Math.round(v * 1e6) / 1e6;
