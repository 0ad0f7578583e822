import type { Map as MapLibreMap } from 'maplibre-gl';
import type { FeatureCollection } from 'geojson';
import '../components/foldlens-consistency';
import type { ConsistencyCheckRequest, ConsistencyFieldRequest, ConsistencyLayers, FoldlensConsistency } from '../components/foldlens-consistency';
import { downloadBlob } from '../components/exportFiles';
import type { DomainCheck, DomainCheckInput, DomainSurface } from '../core/consistency/domainCheck';
import { axisFieldInputs, domainMeasurements } from '../core/consistency/domainMeasurements';
import { buildConsistencyReport, type ConsistencyReport } from '../core/consistency/report';
import { consistencyReportHtml } from '../core/consistency/reportHtml';
import type { Domain } from '../core/domain';
import { foldInputFromStations } from '../core/foldInput';
import { pointInRing } from '../core/polygon';
import { keptRuns } from '../core/profileLayout';
import { describeProblem, isUsable, type Station } from '../core/station';
import { builtInCrs, toLonLat } from '../io/crs';
import type { Dem } from '../io/demSampler';
import { lineworkHeights, type LineworkHeights } from '../io/elevations';
import { chooseLocalFrame, lonLatToLocal, pointInFrame, type LocalFrame } from '../io/localFrame';
import { readLinework, type LineworkFeature } from '../io/readLinework';
import { ANGLE_CLASSES, AxisFieldLayer, axisFieldFeatures } from '../map/axisFieldLayer';
import { ConsistencyFlagsLayer, flagFeatures } from '../map/consistencyFlagsLayer';
import { ConsistencyClient } from '../worker/consistencyClient';
import type { AxisFieldJobResult } from '../worker/consistencyJob';

/**
 * Demo wiring of the consistency panel (`<foldlens-consistency>`): the local fold axis field and
 * its suggested domains on the map, flags of the domain checks, accepting the suggestion as saved
 * domains, and the report (a printable page opened from a blob URL, and a JSON download). The
 * numbers come from src/core/consistency through a web worker (src/worker/consistencyClient.ts).
 */

/** What the wiring needs from the rest of the demo. */
export interface ConsistencyDeps {
  readonly map: MapLibreMap;
  readonly panel: FoldlensConsistency;
  readonly stations: () => readonly Station[];
  readonly domains: () => readonly Domain[];
  /** Saves suggested areas as domains (with their analysis), as the domains panel does. */
  readonly saveDomains: (areas: readonly { readonly name: string; readonly ring: Array<[number, number]> }[]) => Promise<void>;
  /** Contact traces of the base map (lon/lat), and the terrain model that gives them heights. */
  readonly contacts: FeatureCollection;
  readonly dem: () => Promise<Dem>;
  /**
   * Whether the base map's contacts and terrain belong to the stations shown (the sample map
   * under its own stations); when not, the map-pattern checks leave them out and say why.
   */
  readonly mapLinesApply: () => boolean;
  /** A label for the data set shown, for the report. */
  readonly datasetLabel: () => string;
}

interface FieldState {
  /** The station list the field was computed from (a new list means new data). */
  readonly stations: readonly Station[];
  readonly result: AxisFieldJobResult;
  readonly frame: LocalFrame;
  readonly planes: number;
  readonly reference: string;
}

/** Contact traces with a height at every vertex (NaN where none), or why there are none. */
type TraceSet = { readonly features: readonly LineworkFeature[]; readonly heights: LineworkHeights } | { readonly problem: string };

interface Area {
  readonly id: string;
  readonly name: string;
  /** Lon/lat ring (not closed); null: every station. */
  readonly ring: ReadonlyArray<readonly [number, number]> | null;
}

const pad = (n: number, w: number): string => String(Math.round(n) % 360).padStart(w, '0');
const lineText = (l: { trend: number; plunge: number } | null): string => (l ? `${pad(l.trend, 3)}/${pad(l.plunge, 2)}` : 'undefined');

/**
 * Wires the consistency panel to the map and the worker.
 * @example setUpConsistency({ map, panel, stations: () => stations, domains: () => domains, saveDomains, contacts, dem, mapLinesApply: () => true, datasetLabel })
 */
export function setUpConsistency(deps: ConsistencyDeps): { workerScriptUrl: () => string | null } {
  const { map, panel } = deps;
  const client = new ConsistencyClient();
  let fieldLayer: AxisFieldLayer | null = null;
  let flagsLayer: ConsistencyFlagsLayer | null = null;
  let field: FieldState | null = null;
  let lastChecks: { key: string; stations: readonly Station[]; checks: readonly DomainCheck[]; areas: readonly Area[]; source: string; frame: LocalFrame; traces: string } | null = null;
  let report: ConsistencyReport | null = null;
  let layersShown: ConsistencyLayers = { arrows: true, angles: true, boundaries: true, flags: true };
  let traces: Promise<TraceSet> | null = null;
  panel.angleLegend = ANGLE_CLASSES.map((c) => ({ colour: c.colour, label: c.label }));

  /** The layers are made on first use, once the style (and the station layers to sit under) are there. */
  const layers = (): { field: AxisFieldLayer; flags: ConsistencyFlagsLayer } => {
    if (!fieldLayer || !flagsLayer) {
      const beforeId = map.getStyle().layers.find((l) => l.id.startsWith('foldlens-'))?.id;
      fieldLayer = new AxisFieldLayer(map, { ...(beforeId && { beforeId }) });
      flagsLayer = new ConsistencyFlagsLayer(map);
      fieldLayer.setVisibility({ arrows: layersShown.arrows, angles: layersShown.angles });
      flagsLayer.setVisibility({ flags: layersShown.flags, boundaries: layersShown.boundaries });
    }
    return { field: fieldLayer, flags: flagsLayer };
  };

  const located = (): Station[] => deps.stations().filter((s) => isUsable(s) && s.lon !== undefined && s.lat !== undefined);
  const frameOf = (stations: readonly Station[]): LocalFrame => chooseLocalFrame(stations.flatMap((s) => [s.lon!, s.lat!]));
  const frameToLonLat = (frame: LocalFrame) => (x: number, y: number): [number, number] => {
    const ll = toLonLat(x + frame.originEasting, y + frame.originNorthing, frame.crs);
    return [ll.lon, ll.lat];
  };
  const fail = (e: unknown): void => {
    panel.problem = e instanceof Error ? e.message : String(e);
  };
  /** Forgets a field computed from data that has since been replaced, and says so. */
  const dropStaleField = (): void => {
    if (!field || field.stations === deps.stations()) return;
    field = null;
    fieldLayer?.setFeatures(null);
    flagsLayer?.setBoundaries([]);
    panel.regions = [];
    panel.canAccept = false;
    panel.fieldSummary = 'The data have changed since the axis field was shown: show it again.';
  };

  // ---- The local axis field and its suggested domains --------------------------------------

  panel.addEventListener('foldlens-consistency-field', async (e) => {
    const request = (e as CustomEvent<ConsistencyFieldRequest>).detail;
    panel.problem = '';
    const stations = located();
    const planeCount = foldInputFromStations(stations).planes.length;
    if (planeCount < Math.max(request.k, 8)) {
      panel.problem = `The field needs at least ${Math.max(request.k, 8)} located bedding planes (the window); there are ${planeCount}.`;
      return;
    }
    panel.busy = 'field';
    try {
      const frame = frameOf(stations);
      const { xy, poles } = axisFieldInputs(stations, (s) => pointInFrame(frame, s.lon!, s.lat!));
      let [minX, minY, maxX, maxY] = [Infinity, Infinity, -Infinity, -Infinity];
      for (let i = 0; i < xy.length; i += 2) {
        minX = Math.min(minX, xy[i]);
        maxX = Math.max(maxX, xy[i]);
        minY = Math.min(minY, xy[i + 1]);
        maxY = Math.max(maxY, xy[i + 1]);
      }
      // A margin, so that the outlines of the suggested domains hold the outermost stations.
      const margin = Math.max(10, 0.01 * Math.max(maxX - minX, maxY - minY));
      const bounds = [minX - margin, minY - margin, maxX + margin, maxY + margin] as const;
      const w = bounds[2] - bounds[0];
      const h = bounds[3] - bounds[1];
      const nx = w >= h ? request.grid : Math.max(1, Math.round((request.grid * w) / h));
      const ny = w >= h ? Math.max(1, Math.round((request.grid * h) / w)) : request.grid;
      const result = await client.field({ xy, poles, nx, ny, k: request.k, bounds, angle: request.angle, minShare: request.minShare, ...(request.reference && { reference: request.reference }) });
      if (!result) return; // a newer request took over
      field = { stations: deps.stations(), result, frame, planes: planeCount, reference: request.reference ? `${lineText(request.reference)} (given)` : `${lineText(result.field.reference)} (π axis of all planes)` };
      showField(field);
    } catch (error) {
      fail(error);
    } finally {
      panel.busy = '';
    }
  });

  function showField(f: FieldState): void {
    const { field: axes, partition } = f.result;
    const toLL = frameToLonLat(f.frame);
    const { field: fl, flags } = layers();
    fl.setFeatures(axisFieldFeatures(axes, toLL));
    flags.setBoundaries(partition.boundaries.map((b) => pairs(b.points).map(([x, y]) => toLL(x, y))));
    let defined = 0;
    let most = 0;
    for (let i = 0; i < axes.trend.length; i++) {
      if (!Number.isFinite(axes.trend[i])) continue;
      defined++;
      if (Number.isFinite(axes.angleToReference[i])) most = Math.max(most, axes.angleToReference[i]);
    }
    const window = axes.window.mode === 'nearest' ? `${axes.window.k} nearest` : `within ${axes.window.radius.toFixed(0)} m`;
    panel.fieldSummary = `π axis of the ${window} of ${f.planes} bedding planes at ${axes.grid.nx} × ${axes.grid.ny} cells (${defined} with an axis), up to ${most.toFixed(1)}° from the reference ${f.reference}. ${partition.regions.length} suggested domain${partition.regions.length === 1 ? '' : 's'}.`;
    panel.regions = partition.regions.map((r) => ({ label: r.label, axis: r.axis, nodes: r.nodes, spread: r.spread }));
    panel.canAccept = partition.regions.length > 0;
    document.body.dataset.consistencyField = String(partition.regions.length);
  }

  panel.addEventListener('foldlens-consistency-layers', (e) => {
    layersShown = (e as CustomEvent<ConsistencyLayers>).detail;
    fieldLayer?.setVisibility({ arrows: layersShown.arrows, angles: layersShown.angles });
    flagsLayer?.setVisibility({ flags: layersShown.flags, boundaries: layersShown.boundaries });
  });

  /** The suggested domains as lon/lat rings (outer rings; a region in several pieces gives several). */
  function suggestedAreas(f: FieldState): Area[] {
    const toLL = frameToLonLat(f.frame);
    const count = new Map<number, number>();
    for (const p of f.result.partition.polygons) count.set(p.label, (count.get(p.label) ?? 0) + 1);
    const seen = new Map<number, number>();
    return f.result.partition.polygons.map((p) => {
      const k = (seen.get(p.label) ?? 0) + 1;
      seen.set(p.label, k);
      const part = count.get(p.label)! > 1 ? String.fromCharCode(96 + Math.min(k, 26)) : '';
      return { id: `suggested-${p.label + 1}${part}`, name: `Suggested domain ${p.label + 1}${part}`, ring: withoutStraightCorners(pairs(p.outer).slice(0, -1)).map(([x, y]) => toLL(x, y)) };
    });
  }

  panel.addEventListener('foldlens-consistency-accept', async () => {
    dropStaleField();
    if (!field) return;
    panel.problem = '';
    try {
      const areas = suggestedAreas(field);
      await deps.saveDomains(areas.map((a) => ({ name: a.name, ring: a.ring!.map((p) => [p[0], p[1]] as [number, number]) })));
      panel.checkSummary = `Saved ${areas.length} suggested domain${areas.length === 1 ? '' : 's'}; the checks now run on the saved domains.`;
    } catch (error) {
      fail(error);
    }
  });

  // ---- Checks and flags -----------------------------------------------------------------------

  /** Which areas to check: the saved domains, else the suggested ones, else every station. */
  function areasToCheck(): { areas: Area[]; source: string } {
    const saved = deps.domains();
    if (saved.length > 0) return { areas: saved.map((d) => ({ id: d.id, name: d.name, ring: d.ring })), source: `the ${saved.length} saved domain${saved.length === 1 ? '' : 's'}` };
    if (field && field.result.partition.polygons.length > 0) return { areas: suggestedAreas(field), source: 'the suggested domains (none saved)' };
    return { areas: [{ id: 'all', name: 'All stations', ring: null }], source: 'all stations as one domain (no domains saved or suggested)' };
  }

  /** Trace vertices of the base map's contacts with heights from its terrain model, read once. */
  function contactTraces(): Promise<TraceSet> {
    traces ??= deps
      .dem()
      .then((dem): TraceSet => {
        const crs = dem.epsg !== undefined ? builtInCrs(dem.epsg) : undefined;
        if (!crs) return { problem: `the terrain model names no built-in CRS (EPSG:${dem.epsg ?? 'none'})` };
        const features = readLinework(JSON.stringify(deps.contacts));
        return { features, heights: lineworkHeights(features, { dem, crs }) };
      })
      .catch((e: unknown): TraceSet => ({ problem: e instanceof Error ? e.message : String(e) }));
    return traces;
  }

  /** The traces inside an area, grouped by contact, in frame metres. */
  function surfacesIn(t: Exclude<TraceSet, { problem: string }>, area: Area, frame: LocalFrame): DomainSurface[] {
    const flat = area.ring ? Float64Array.from(area.ring.flat()) : null;
    const bySurface = new Map<string, Float64Array[]>();
    t.features.forEach((f, fi) => {
      const value = f.properties.name;
      const surface = typeof value === 'string' || typeof value === 'number' ? String(value) : f.id;
      f.parts.forEach((part, k) => {
        const z = t.heights.heights[fi][k];
        const keep = Array.from(z, (h, v) => Number.isFinite(h) && (!flat || pointInRing(part.lonLat[2 * v], part.lonLat[2 * v + 1], flat)));
        for (const [a, b] of keptRuns(keep)) {
          if (b - a < 2) continue;
          bySurface.set(surface, [...(bySurface.get(surface) ?? []), lonLatToLocal(frame, part.lonLat.subarray(2 * a, 2 * b), z.subarray(a, b))]);
        }
      });
    });
    return [...bySurface].map(([name, pieces]) => ({ name, pieces }));
  }

  async function runChecks(request: ConsistencyCheckRequest): Promise<NonNullable<typeof lastChecks>> {
    dropStaleField();
    const stations = located();
    if (stations.length === 0) throw new Error('No located station to check.');
    const frame = frameOf(stations);
    const { areas, source } = areasToCheck();
    const mapLines = deps.mapLinesApply();
    const key = JSON.stringify([request, areas, stations.length, deps.stations().length, frame.originEasting, frame.originNorthing, mapLines]);
    if (lastChecks && lastChecks.key === key && lastChecks.stations === deps.stations()) return lastChecks;
    // Another district's contacts under these stations would make the map-pattern checks say nothing true.
    const t: TraceSet = mapLines ? await contactTraces() : { problem: "the base map's contacts and terrain belong to the sample district, not to the data shown" };
    const inputs: DomainCheckInput[] = [];
    for (const area of areas) {
      const flat = area.ring ? Float64Array.from(area.ring.flat()) : null;
      const chosen = flat ? stations.filter((s) => pointInRing(s.lon!, s.lat!, flat)) : stations;
      const { planes, lines } = domainMeasurements(chosen, (s) => pointInFrame(frame, s.lon!, s.lat!));
      if (planes.length === 0) continue;
      const surfaces = 'problem' in t ? [] : surfacesIn(t, area, frame);
      inputs.push({ id: area.id, name: area.name, planes, lines, ...(surfaces.length > 0 && { surfaces }), convergence: frame.convergence });
    }
    if (inputs.length === 0) throw new Error(`No bedding plane lies inside ${source}, so there is nothing to check.`);
    const result = await client.checks({
      domains: inputs,
      options: { bootstrap: 500, seed: 1, lineThreshold: request.lineThreshold, searchAxis: request.searchAxis, ...(request.outlierAngle !== null && { outlierAngle: request.outlierAngle }) },
    });
    if (!result) throw new Error('The checks were superseded by newer ones.');
    lastChecks = { key, stations: deps.stations(), checks: result.checks, areas, source, frame, traces: 'problem' in t ? `Contact traces not used: ${t.problem}.` : `Contact traces: those of the base map where they lie inside a domain, with heights from its terrain model (${t.heights.fromDem} vertices${t.heights.missing.length > 0 ? `; ${t.heights.missing.length} runs without a height left out` : ''}).` };
    return lastChecks;
  }

  function showChecks(c: NonNullable<typeof lastChecks>): void {
    const byId = new Map(deps.stations().flatMap((s) => (s.lon !== undefined && s.lat !== undefined ? [[s.id, [s.lon, s.lat] as const]] : [])));
    const toLL = frameToLonLat(c.frame);
    // Closure apexes come back in the frame turned to true north (domainCheck.ts); turn them back.
    const g = (c.frame.convergence * Math.PI) / 180;
    const apexToLonLat = (x: number, y: number) => toLL(x * Math.cos(g) - y * Math.sin(g), x * Math.sin(g) + y * Math.cos(g));
    const { points, unplaced } = flagFeatures(c.checks, (id) => byId.get(id), apexToLonLat);
    layers().flags.setFlags(points);
    const parts = c.checks.map((d) => {
      const planes = d.girdle.outliers;
      const lines = d.lines?.flagged ?? 0;
      const closures = d.mapPattern?.closures?.disagreeing ?? 0;
      return `${d.name}: axis ${lineText(d.axis)}${d.cone95 !== null ? ` ±${d.cone95.toFixed(1)}°` : ''}, ${planes} pole${planes === 1 ? '' : 's'} off the girdle, ${lines} line${lines === 1 ? '' : 's'} off the axis${d.mapPattern?.closures ? `, ${closures} closure${closures === 1 ? '' : 's'} pointing the wrong way` : ''}`;
    });
    const traces = c.traces.startsWith('Contact traces not used') ? ` ${c.traces}` : '';
    panel.checkSummary = `Checked ${c.source}. ${parts.join('; ')}. ${points.features.length} flag${points.features.length === 1 ? '' : 's'} on the map${unplaced > 0 ? ` (${unplaced} without a position)` : ''}.${traces}`;
    panel.flags = c.checks.flatMap((d) => d.flags.map((f) => ({ domain: d.name, code: f.code, severity: f.severity, message: f.message })));
    document.body.dataset.consistencyFlags = String(points.features.length);
  }

  panel.addEventListener('foldlens-consistency-check', async (e) => {
    panel.problem = '';
    panel.busy = 'checks';
    try {
      showChecks(await runChecks((e as CustomEvent<ConsistencyCheckRequest>).detail));
    } catch (error) {
      fail(error);
    } finally {
      panel.busy = '';
    }
  });

  // ---- The report -------------------------------------------------------------------------------

  panel.addEventListener('foldlens-consistency-report', async (e) => {
    panel.problem = '';
    panel.busy = 'report';
    try {
      const c = await runChecks((e as CustomEvent<ConsistencyCheckRequest>).detail);
      showChecks(c);
      const all = deps.stations();
      const unusable = all.filter((s) => s.problems.length > 0);
      const notes = [
        `Domains checked: ${c.source}.`,
        c.traces,
        ...(unusable.length > 0 ? [`${unusable.length} row${unusable.length === 1 ? '' : 's'} could not be read and ${unusable.length === 1 ? 'is' : 'are'} left out of every check:`] : []),
        ...unusable.flatMap((s) => s.problems.map((p) => `Left out: ${s.id}, ${describeProblem(p)}`)),
      ];
      // The field goes into the report in the frame of the checks (the same data give the same frame).
      const f = field && field.frame.originEasting === c.frame.originEasting && field.frame.originNorthing === c.frame.originNorthing ? field : null;
      const fr = c.frame;
      report = buildConsistencyReport({
        generated: new Date().toISOString().slice(0, 10),
        input: { data: deps.datasetLabel(), rows: all.length, usable: all.length - unusable.length, 'rows left out': unusable.length, domains: c.source },
        domains: c.checks,
        ...(f && {
          field: {
            field: f.result.field,
            partition: f.result.partition,
            coordinates: `metres east and north of E ${fr.originEasting}, N ${fr.originNorthing} in ${fr.crs.code} (${fr.crs.name}); grid convergence ${fr.convergence.toFixed(3)}°`,
            toLonLat: (x: number, y: number) => frameToLonLat(fr)(x, y).map((v) => Math.round(v * 1e6) / 1e6) as [number, number],
          },
        }),
        notes,
      });
      if (panel.reportUrl) URL.revokeObjectURL(panel.reportUrl);
      panel.reportUrl = URL.createObjectURL(new Blob([consistencyReportHtml(report)], { type: 'text/html' }));
      document.body.dataset.consistencyReport = String(report.domains.length);
    } catch (error) {
      fail(error);
    } finally {
      panel.busy = '';
    }
  });

  panel.addEventListener('foldlens-consistency-export', () => {
    if (report) downloadBlob(new Blob([`${JSON.stringify(report, null, 2)}\n`], { type: 'application/json' }), 'foldlens-consistency-report.json');
  });

  return { workerScriptUrl: () => client.workerScriptUrl };
}

/** [x0, y0, x1, y1, ...] as pairs. */
function pairs(flat: readonly number[]): Array<[number, number]> {
  const out: Array<[number, number]> = [];
  for (let i = 0; i + 1 < flat.length; i += 2) out.push([flat[i], flat[i + 1]]);
  return out;
}

/** A ring of cell corners without the corners where it runs straight on (fewer handles to edit). */
function withoutStraightCorners(ring: Array<[number, number]>): Array<[number, number]> {
  const n = ring.length;
  if (n <= 4) return ring;
  return ring.filter((p, i) => {
    const a = ring[(i + n - 1) % n];
    const b = ring[(i + 1) % n];
    // Corners of one grid are exact multiples of the cell size, so "straight on" is an exact zero.
    return Math.abs((p[0] - a[0]) * (b[1] - p[1]) - (p[1] - a[1]) * (b[0] - p[0])) > 1e-6;
  });
}
