import { booleanPointInPolygon, point } from '@turf/turf';
import type { Feature, MultiPolygon, Polygon } from 'geojson';
import { checkDomain, type DomainCheck, type DomainCheckOptions, type DomainSurface } from '../core/consistency/domainCheck';
import { axisFieldInputs, domainMeasurements } from '../core/consistency/domainMeasurements';
import { partitionAxisField } from '../core/consistency/domainBoundaries';
import { localAxisField } from '../core/consistency/localAxisField';
import { buildConsistencyReport, CONSISTENCY_CAUTION, type ConsistencyReport } from '../core/consistency/report';
import { consistencyReportHtml } from '../core/consistency/reportHtml';
import { DEFAULT_AXIS_LINE_KINDS, DEFAULT_FOLDED_KINDS } from '../core/foldInput';
import { formatLine } from '../core/notation';
import { keptRuns } from '../core/profileLayout';
import { isUsable, type Station } from '../core/station';
import { isLineKind, isPlaneKind, LINE_KINDS, PLANE_KINDS, type MeasurementKind } from '../core/types';
import { CrsError, toLonLat } from '../io/crs';
import { parseIsoDate } from '../io/declination';
import { lineworkHeights } from '../io/elevations';
import { normalizeKind } from '../io/kinds';
import { chooseLocalFrame, lonLatToLocal, pointInFrame, type LocalFrame } from '../io/localFrame';
import type { LineworkFeature } from '../io/readLinework';
import { AreaError, readPolygons, selectWithin } from '../io/within';
import { formatOptions, parseArgs, UsageError, type OptionSpec } from './args';
import { reportRows } from './convert';
import { loadDem, readLines } from './optionFiles';
import { INPUT_OPTIONS, loadInput, readText, type CliIo } from './input';

/**
 * `foldlens check <stations.csv> [--domains domains.geojson] [--lines lines.geojson] [--dem dem.tif]
 * [--json] [--html out.html]`
 *
 * The consistency report (src/core/consistency): per structural domain, the measured lines
 * against the pi axis, the poles against their girdle with outliers and cylindricity, and, with
 * contact traces and heights, the map pattern against the axis (profile coherence, map-only
 * axis, predicted attitudes, fold closures against the plunge); over the whole map, the local
 * fold axis field and the domains it suggests. Every number comes from src/core/consistency
 * (checkDomain, localAxisField, partitionAxisField, buildConsistencyReport).
 *
 * Exit codes: 0 all went well; 1 some rows could not be read, some trace vertices had no height,
 * or no domain had planes to check (each said on stderr); 2 a usage or file error.
 */

/**
 * Options of `check`.
 * @example parseArgs(['a.csv', '--json'], CHECK_OPTIONS).options.json // 'true'
 */
export const CHECK_OPTIONS: readonly OptionSpec[] = [
  { name: 'domains', value: 'domains.geojson', help: 'structural domains as polygons (one feature each; its "name" property names it). Without it all stations form one domain' },
  { name: 'lines', value: 'lines.geojson', help: 'contact traces (LineString/MultiLineString, lon/lat; a third number is the height) for the map-pattern checks' },
  { name: 'surface-property', value: 'name', help: 'feature property that says which surface (contact) a trace belongs to (default: name, else the feature id)' },
  { name: 'dem', value: 'dem.tif', help: 'GeoTIFF terrain model giving heights to trace vertices that have none' },
  { name: 'dem-crs', value: 'crs', help: 'CRS of the DEM when the file names no EPSG code' },
  { name: 'json', help: 'print the report as JSON' },
  { name: 'html', value: 'out.html', help: 'also write the report as a printable HTML page' },
  { name: 'title', value: 'text', help: 'title of the report (default "Fold consistency report")' },
  { name: 'date', value: 'YYYY-MM-DD', help: 'date written in the report (default today)' },
  { name: 'threshold', value: 'deg', help: 'flag measured lines farther than this from the axis (default 15)' },
  { name: 'outlier-angle', value: 'deg', help: 'flag planes farther than this from the girdle (default: 3.5 robust standard deviations, at least 5°)' },
  { name: 'bootstrap', value: 'N', help: 'bootstrap resamples for the 95% cone about each axis (default 500)' },
  { name: 'seed', value: 'S', help: 'seed of the bootstrap (default 1)' },
  { name: 'search-angle', value: 'deg', help: 'search for the map-only axis within this angle of the pi axis (default 30)' },
  { name: 'skip-search', help: 'do not search for the map-only axis (the slowest check)' },
  { name: 'field-grid', value: 'N', help: 'nodes of the local axis field along the longer side of the map (default 40)' },
  { name: 'field-k', value: 'K', help: 'planes in each window of the local axis field (default 30)' },
  { name: 'field-angle', value: 'deg', help: 'largest turn of the axis within one suggested domain (default 10)' },
  { name: 'skip-field', help: 'do not compute the local axis field' },
  { name: 'plane-kinds', value: 'list', help: 'planar kinds of the folded surface, comma-separated (default: bedding)' },
  { name: 'line-kinds', value: 'list', help: 'linear kinds compared with the axis, comma-separated (default: hinge, intersection, lineation)' },
  { name: 'help', help: 'show this help' },
  ...INPUT_OPTIONS,
];

/**
 * Help text of `check`.
 * @example io.stdout.write(CHECK_HELP)
 */
export const CHECK_HELP = `Usage: foldlens check <stations.csv|stations.geojson> [options]

Checks a fold interpretation against itself, domain by domain: measured hinges and
intersection lineations against the pi axis of the bedding; each bedding pole against the
best-fit girdle (outliers, cylindricity); and, given contact traces with heights (--lines,
--dem), the map pattern against the plunge: do the traces collapse onto one profile down the
axis, which axis makes them tightest, do measured planes near the traces have the
attitude the axis and the trace predict, and do the fold closures on the map point the way
the axis plunges (antiform closures down the plunge, synform closures up it, as hinge
readings with a sense or the limb dips say)? Over the whole map it computes the local fold
axis on a grid and suggests domains where the axis turns.

Output: a text summary (--json for the full report); --html also writes a printable page.
Exit codes: 0 all went well; 1 some rows or trace vertices could not be used, or no domain
had planes to check (listed on stderr); 2 usage or file error.

${CONSISTENCY_CAUTION}

Options:
${formatOptions(CHECK_OPTIONS)}
`;

/**
 * Runs `check`; returns the exit code.
 * @example await runCheck(['field.csv', '--domains', 'domains.geojson', '--json'], io) // 0
 */
export async function runCheck(argv: readonly string[], io: CliIo): Promise<number> {
  const args = parseArgs(argv, CHECK_OPTIONS);
  const o = args.options;
  if (o.help) {
    io.stdout.write(CHECK_HELP);
    return 0;
  }
  if (args.positionals.length !== 1) throw new UsageError(`check takes one stations file, got ${args.positionals.length} (see foldlens check --help)`);
  if (o['dem-crs'] !== undefined && o.dem === undefined) throw new UsageError('--dem-crs applies to a DEM: give --dem <dem.tif> too');
  if (o['surface-property'] !== undefined && o.lines === undefined) throw new UsageError('--surface-property applies to traces: give --lines <lines.geojson> too');
  const date = o.date === undefined ? new Date().toISOString().slice(0, 10) : checkedDate(o.date);
  const options: DomainCheckOptions = {
    ...(o.threshold !== undefined && { lineThreshold: angle(o.threshold, '--threshold') }),
    ...(o['outlier-angle'] !== undefined && { outlierAngle: angle(o['outlier-angle'], '--outlier-angle') }),
    ...(o.bootstrap !== undefined && { bootstrap: whole(o.bootstrap, '--bootstrap', 0) }),
    ...(o.seed !== undefined && { seed: whole(o.seed, '--seed', Number.MIN_SAFE_INTEGER) }),
    ...(o['search-angle'] !== undefined && { searchAngle: angle(o['search-angle'], '--search-angle') }),
    ...(o['skip-search'] !== undefined && { searchAxis: false }),
  };
  const fieldGrid = o['field-grid'] === undefined ? 40 : whole(o['field-grid'], '--field-grid', 2);
  const fieldK = o['field-k'] === undefined ? 30 : whole(o['field-k'], '--field-k', 8);
  const fieldAngle = o['field-angle'] === undefined ? 10 : angle(o['field-angle'], '--field-angle');
  const planeKinds = kindList(o['plane-kinds'], '--plane-kinds', isPlaneKind, PLANE_KINDS, DEFAULT_FOLDED_KINDS);
  const lineKinds = kindList(o['line-kinds'], '--line-kinds', isLineKind, LINE_KINDS, DEFAULT_AXIS_LINE_KINDS);
  const domains = o.domains === undefined ? undefined : await readDomains(o.domains, io);
  const linework = o.lines === undefined ? [] : await readLines(o.lines, io);
  const dem = o.dem === undefined ? undefined : await loadDem(o.dem, o['dem-crs'], io);

  const [path] = args.positionals;
  const input = await loadInput(path, args, io);
  for (const n of input.notes) io.stderr.write(`note: ${n}\n`);
  let code = reportRows(input.stations, io);
  const notes: string[] = [];
  const tell = (message: string, failing: boolean): void => {
    notes.push(message);
    io.stderr.write(`${message}\n`);
    if (failing) code = Math.max(code, 1);
  };

  const usable = input.stations.filter(isUsable);
  const located = usable.filter((s) => s.lon !== undefined && s.lat !== undefined);
  // The frame: UTM zone of the located stations and the trace vertices.
  const lonLats: number[] = located.flatMap((s) => [s.lon!, s.lat!]);
  for (const f of linework) for (const p of f.parts) lonLats.push(...p.lonLat);
  let frame: LocalFrame | null = null;
  if (lonLats.length > 0) {
    try {
      frame = chooseLocalFrame(lonLats);
    } catch (e) {
      if (!(e instanceof CrsError)) throw e;
      tell(`no local frame could be placed (${e.message}); the map-pattern checks and the axis field are skipped`, false);
    }
  }

  // Trace vertices with heights.
  const heights = lineworkHeights(linework, dem);
  for (const m of heights.missing) tell(`${m.message}; left out of the map-pattern checks`, true);

  const areas: { id: string; name: string; polygon: Feature<Polygon | MultiPolygon> | null }[] = domains ?? [{ id: 'all', name: 'All stations', polygon: null }];
  const checks: DomainCheck[] = [];
  const counts: Record<string, number> = {};
  for (const area of areas) {
    const chosen = area.polygon ? selectWithin(usable, [area.polygon]).inside : usable;
    const place = (s: Station) => (frame && s.lon !== undefined && s.lat !== undefined ? pointInFrame(frame, s.lon, s.lat) : undefined);
    const { planes, lines } = domainMeasurements(chosen, place, { planeKinds, lineKinds });
    counts[`${area.id} planes`] = planes.length;
    counts[`${area.id} lines`] = lines.length;
    if (planes.length === 0) {
      tell(`domain ${area.name}: no usable plane of the kinds ${planeKinds.join(', ')} lies inside it, so it cannot be checked`, true);
      continue;
    }
    const traced = frame ? tracesInside(linework, heights.heights, area.polygon, frame, o['surface-property'] ?? 'name') : { surfaces: [], lone: 0 };
    const surfaces = traced.surfaces;
    if (traced.lone > 0) tell(`domain ${area.name}: ${traced.lone} trace vertex${traced.lone === 1 ? '' : 'es'} inside it without a neighbour inside (no direction to take) were left out of the map-pattern checks`, false);
    checks.push(checkDomain({ id: area.id, name: area.name, planes, lines, ...(surfaces.length > 0 && { surfaces }), convergence: frame?.convergence ?? 0 }, options));
  }
  if (domains) {
    const inNone = usable.filter((s) => s.lon !== undefined && s.lat !== undefined && !domains.some((d) => booleanPointInPolygon(point([s.lon!, s.lat!]), d.polygon!, { ignoreBoundary: false })));
    if (inNone.length > 0) tell(`${inNone.length} usable station${inNone.length === 1 ? '' : 's'} lie outside every domain and are not checked: ${inNone.slice(0, 10).map((s) => s.id).join(', ')}${inNone.length > 10 ? ', ...' : ''}`, false);
  }

  let field: Parameters<typeof buildConsistencyReport>[0]['field'];
  if (o['skip-field'] === undefined && frame) {
    const { xy, poles, count } = axisFieldInputs(located, (s) => pointInFrame(frame!, s.lon!, s.lat!), { planeKinds, lineKinds });
    if (count < 2 * fieldK) {
      tell(`local axis field skipped: ${count} located planes, fewer than twice the window of ${fieldK} (--field-k)`, false);
    } else {
      const [minX, minY, maxX, maxY] = extent(xy);
      const wide = maxX - minX >= maxY - minY;
      const span = Math.max(maxX - minX, maxY - minY) || 1;
      const nx = wide ? fieldGrid : Math.max(1, Math.round((fieldGrid * (maxX - minX)) / span));
      const ny = wide ? Math.max(1, Math.round((fieldGrid * (maxY - minY)) / span)) : fieldGrid;
      const f = localAxisField(xy, poles, { nx, ny, k: fieldK });
      const fr = frame;
      field = {
        field: f,
        partition: partitionAxisField(f, { angle: fieldAngle }),
        coordinates: `metres east and north of E ${fr.originEasting}, N ${fr.originNorthing} in ${fr.crs.code} (${fr.crs.name}); grid convergence ${fr.convergence.toFixed(3)}°`,
        toLonLat: (x, y) => {
          const ll = toLonLat(x + fr.originEasting, y + fr.originNorthing, fr.crs);
          return [round6(ll.lon), round6(ll.lat)];
        },
      };
    }
  }

  const report = buildConsistencyReport({
    ...(o.title !== undefined && { title: o.title }),
    generated: date,
    input: {
      stations: path,
      rows: input.stations.length,
      usable: usable.length,
      domains: o.domains ?? null,
      lines: o.lines ?? null,
      dem: o.dem ?? null,
      ...counts,
    },
    domains: checks,
    ...(field && { field }),
    notes,
  });
  io.stdout.write(o.json ? `${JSON.stringify(report, null, 2)}\n` : summary(report));
  if (o.html !== undefined) {
    try {
      await io.writeFile(o.html, consistencyReportHtml(report));
    } catch (e) {
      throw new UsageError(`cannot write ${o.html}: ${(e as Error).message}`);
    }
  }
  if (checks.length === 0) {
    io.stderr.write('no domain had planes to check.\n');
    code = Math.max(code, 1);
  }
  return code;
}

/** Trace pieces inside a domain (all, without one), with heights, grouped by surface; `lone` counts runs of one vertex, left out. */
function tracesInside(
  linework: readonly LineworkFeature[],
  heights: readonly (readonly Float64Array[])[],
  polygon: Feature<Polygon | MultiPolygon> | null,
  frame: LocalFrame,
  property: string,
): { surfaces: DomainSurface[]; lone: number } {
  const bySurface = new Map<string, Float64Array[]>();
  let lone = 0;
  linework.forEach((f, fi) => {
    const value = f.properties[property];
    const surface = typeof value === 'string' || typeof value === 'number' ? String(value) : f.id;
    f.parts.forEach((part, k) => {
      const z = heights[fi][k];
      const n = z.length;
      const keep = Array.from({ length: n }, (_, v) => Number.isFinite(z[v]) && (!polygon || booleanPointInPolygon(point([part.lonLat[2 * v], part.lonLat[2 * v + 1]]), polygon, { ignoreBoundary: false })));
      for (const [a, b] of keptRuns(keep)) {
        if (b - a < 2) {
          lone++;
          continue;
        }
        let list = bySurface.get(surface);
        if (!list) bySurface.set(surface, (list = []));
        list.push(lonLatToLocal(frame, part.lonLat.subarray(2 * a, 2 * b), z.subarray(a, b)));
      }
    });
  });
  return { surfaces: [...bySurface.entries()].map(([name, pieces]) => ({ name, pieces })), lone };
}

function extent(xy: Float64Array): [number, number, number, number] {
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
  for (let i = 0; i < xy.length; i += 2) {
    minX = Math.min(minX, xy[i]);
    maxX = Math.max(maxX, xy[i]);
    minY = Math.min(minY, xy[i + 1]);
    maxY = Math.max(maxY, xy[i + 1]);
  }
  return [minX, minY, maxX, maxY];
}

async function readDomains(path: string, io: CliIo): Promise<{ id: string; name: string; polygon: Feature<Polygon | MultiPolygon> }[]> {
  const text = await readText(path, io);
  let polygons: Feature<Polygon | MultiPolygon>[];
  try {
    polygons = readPolygons(text);
  } catch (e) {
    if (e instanceof AreaError) throw new UsageError(`--domains ${path}: ${e.message}`);
    throw e;
  }
  // readPolygons keeps the geometry only; the names come from the features' own properties.
  const json = JSON.parse(text.charCodeAt(0) === 0xfeff ? text.slice(1) : text) as { type?: string; features?: { id?: unknown; properties?: Record<string, unknown> | null }[] };
  const features = json.type === 'FeatureCollection' ? (json.features ?? []) : json.type === 'Feature' ? [json as { id?: unknown; properties?: Record<string, unknown> | null }] : [];
  const used = new Set<string>();
  return polygons.map((polygon, i) => {
    const props = features[i]?.properties ?? {};
    const rawId = features[i]?.id ?? props.id;
    let id = typeof rawId === 'string' || typeof rawId === 'number' ? String(rawId) : `domain-${i + 1}`;
    if (used.has(id)) throw new UsageError(`--domains ${path}: feature ${i + 1} has the id "${id}", already used by another domain`);
    used.add(id);
    const name = typeof props.name === 'string' && props.name.trim() !== '' ? props.name : `Domain ${i + 1}`;
    id = id.trim() === '' ? `domain-${i + 1}` : id;
    return { id, name, polygon };
  });
}



function checkedDate(text: string): string {
  if (!parseIsoDate(text)) throw new UsageError(`--date ${text}: expected a date written YYYY-MM-DD`);
  return text;
}

function angle(text: string, option: string): number {
  const v = Number(text);
  if (text.trim() === '' || !(v > 0 && v <= 90)) throw new UsageError(`${option} ${text}: expected degrees above 0, up to 90`);
  return v;
}

function whole(text: string, option: string, min: number): number {
  const v = Number(text);
  if (text.trim() === '' || !Number.isSafeInteger(v) || v < min) throw new UsageError(`${option} ${text}: expected a whole number of at least ${min}`);
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

const round6 = (v: number): number => Math.round(v * 1e6) / 1e6;
const fmtLine = (l: { trend: number; plunge: number } | null): string => (l ? formatLine(l, 'azimuth', { decimals: 1 }) : 'undefined');
const fmtDeg = (v: number | null | undefined): string => (v === null || v === undefined ? '—' : `${v.toFixed(1)}°`);

function summary(r: ConsistencyReport): string {
  const out: string[] = [r.title, `Made ${r.generated}.`];
  for (const d of r.domains) {
    out.push('', `${d.name} (${d.counts.planes} planes, ${d.counts.lines} lines)`);
    out.push(`  Pi axis ${fmtLine(d.axis)}, 95% cone ${fmtDeg(d.cone95)}. ${d.reading}`);
    if (d.lines) out.push(`  Lines: ${d.lines.reading}`);
    out.push(`  Girdle: ${d.girdle.reading}`);
    const mp = d.mapPattern;
    if (mp) {
      if (mp.coherence) out.push(`  Map pattern: ${mp.coherence.reading}`);
      if (mp.search) out.push(`  Map-only axis: ${mp.search.reading}`);
      if (mp.predictions) out.push(`  Predicted attitudes: ${mp.predictions.reading}`);
      if (mp.closures) out.push(`  Closures: ${mp.closures.reading}`);
      for (const n of mp.notes) out.push(`  ${n}`);
    }
    for (const f of d.flags) out.push(`  Flag (${f.code}): ${f.message}`);
  }
  for (const p of r.pairs) {
    out.push('', `Axes of ${p.a} and ${p.b}: ${fmtDeg(p.angle)} apart${p.conesOverlap === null ? '' : p.conesOverlap ? '; the 95% cones overlap' : '; the 95% cones do not overlap'}.`);
  }
  if (r.field) {
    const f = r.field;
    out.push('', `Local axis field: ${f.grid.nx} × ${f.grid.ny} nodes, ${f.nodesWithAxis} with an axis; up to ${fmtDeg(f.maxAngleToReference)} from ${fmtLine(f.reference)}.`);
    out.push(`  ${f.partition.regions.length} suggested domain${f.partition.regions.length === 1 ? '' : 's'}: ${f.partition.regions.map((g) => `${g.label + 1}: ${fmtLine(g.axis)} (${g.nodes} nodes)`).join('; ')}.`);
  }
  out.push('', `Caution: ${r.caution}`);
  return `${out.join('\n')}\n`;
}
