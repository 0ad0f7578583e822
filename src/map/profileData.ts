import type { FeatureCollection } from 'geojson';
import { apparentDipInSection } from '../core/apparentDip';
import { checkAxis, projectDownPlunge } from '../core/downPlunge';
import { normalizeAzimuth } from '../core/math';
import { pointInRing } from '../core/polygon';
import { planeTraceInProfile } from '../core/profileAttitude';
import { keptRuns, type Extent } from '../core/profileLayout';
import { isUsable, type Station } from '../core/station';
import type { Line } from '../core/types';
import { projectAlongPlunge, sectionLine, topographicProfile, type SectionLine } from '../core/verticalSection';
import { builtInCrs, fromLonLat, toLonLat, type Crs } from '../io/crs';
import { sampleDem, type Dem } from '../io/demSampler';
import { lineworkHeights, stationHeights, type DemInCrs } from '../io/elevations';
import { chooseLocalFrame, gridAxis, lonLatToLocal, type LocalFrame } from '../io/localFrame';
import { LineworkError, readLinework, type LineworkFeature } from '../io/readLinework';

/**
 * Everything the profile panel (`<foldlens-profile>`) draws, prepared from map data: stations
 * and linework in longitude/latitude, an optional terrain model, a fold axis, and either an
 * area (a domain's ring) for a down-plunge profile or a section line drawn on the map.
 *
 * Steps (each one a core or io function, named beside it):
 * 1. A local metric frame: the UTM zone of the area or section line (io/localFrame.ts); the
 *    axis, referred to true north, is turned to grid north by the grid convergence.
 * 2. Stations: usable ones inside the area; heights from the data, else from the DEM
 *    (io/elevations.ts). A station with neither is not drawn and is NAMED in `noHeight`.
 * 3. Linework: vertices inside the area; a line that leaves the area is cut where it crosses
 *    the ring (the crossing point is inserted, its height interpolated between the two
 *    vertices), never bridged across the outside. Heights as for stations; runs without a
 *    height are broken there and described in `notes`.
 * 4. Down-plunge mode: core/downPlunge.ts; planes get the trace of the plane in the profile
 *    (core/profileAttitude.ts). Section mode: core/verticalSection.ts projects along the plunge
 *    onto the section, planes get their apparent dip in the segment they land on
 *    (core/apparentDip.ts), and the ground line is sampled from the DEM.
 *
 * No MapLibre and no DOM here: the demo and any host call it with plain data.
 */

/** Linework as a GeoJSON FeatureCollection (lon/lat) or as already read by io/readLinework.ts. */
export type LineworkInput = FeatureCollection | readonly LineworkFeature[];

/** A lon/lat position. */
export type LonLat = readonly [number, number];

/** What to build a profile from. */
export interface ProfileDataInput {
  /** All stations; indices into this array are what the panel reports on hover. */
  readonly stations: readonly Station[];
  /** Contact traces; the legend groups them by their `name` property (else `unit`). */
  readonly contacts?: LineworkInput;
  /** Fault traces, drawn as one layer. */
  readonly faults?: LineworkInput;
  /** Terrain model for heights the data does not give, and for the ground line of a section. */
  readonly dem?: Dem | null;
  /** CRS of the DEM, when `dem.epsg` is absent or not built in (io/crs.ts). */
  readonly demCrs?: Crs;
  /** Fold axis, degrees, referred to true north. */
  readonly axis: Line;
  /** Area (lon/lat ring, closed or not): only stations and linework inside it are used. */
  readonly ring?: readonly LonLat[];
  /** A vertical section instead of a down-plunge profile: the line drawn on the map and the swath half-width in metres (default 500). */
  readonly section?: { readonly line: readonly LonLat[]; readonly swath?: number };
  /** Name of the selection or domain, for titles. */
  readonly label?: string;
}

/** The stations drawn, index for index in every array. */
export interface ProfileStations {
  /** Index of each drawn station in the input `stations`. */
  readonly index: Int32Array;
  /** Id and kind of each drawn station (data text: shown as text only). */
  readonly ids: readonly string[];
  readonly kinds: readonly string[];
  /** (x, y) pairs in metres: profile x', y' (down-plunge) or distance along the section and elevation (section). */
  readonly xy: Float64Array;
  /**
   * Distance along the axis, metres, growing down the plunge: depth from the origin's profile
   * plane (down-plunge), or how far down the plunge the point lies from the section, i.e. minus
   * the distance it was moved along the axis to reach it (section; negative: up-plunge side).
   */
  readonly along: Float64Array;
  /** Unit direction (dx, dy) of a plane's tick in profile metres (true scale); NaN, NaN for lines and for planes without a trace. */
  readonly tick: Float64Array;
  /** Angle of the tick in degrees: trace angle from profile right (down-plunge) or signed apparent dip (section); NaN as for `tick`. */
  readonly tickAngle: Float64Array;
  /** 1 for planes, 0 for lines. */
  readonly isPlane: Uint8Array;
}

/** One legend layer of linework: every run of one contact name, or every fault. */
export interface ProfileLineLayer {
  readonly kind: 'contact' | 'fault';
  /** Place of the name among all the input's contact names (first appearance, 0-based), so a name keeps its colour in every area and mode; 0 for faults. */
  readonly order: number;
  /** Legend text (data text: shown as text only). */
  readonly name: string;
  /** (x, y, along) triples of every vertex drawn, run after run. */
  readonly xyd: Float64Array;
  /** Vertex index where each run starts, plus the total at the end (runs = length - 1). */
  readonly runStarts: Int32Array;
  /** Input vertices drawn (not counting points inserted at the area's edge). */
  readonly vertices: number;
  /** Points inserted where a line crosses the area's edge. */
  readonly edgePoints: number;
}

/** The section line, when in section mode. */
export interface ProfileSectionInfo {
  /** Length in metres. */
  readonly length: number;
  /** Distance along the section at each vertex. */
  readonly chainage: readonly number[];
  /** Azimuth of each segment, degrees referred to true north. */
  readonly azimuths: readonly number[];
  /** Apparent plunge of the axis in each segment's plane, degrees, positive toward the end of the section. */
  readonly axisApparentPlunge: readonly number[];
  /** Swath half-width in metres. */
  readonly swath: number;
  /** Spacing of the ground-line samples in metres (0 without a DEM). */
  readonly topographySpacing: number;
}

/** How many things went where. */
export interface ProfileCounts {
  readonly stations: number;
  readonly usable: number;
  /** Usable stations with a location inside the area (all located ones without an area). */
  readonly inArea: number;
  readonly drawn: number;
  readonly noLocation: number;
  readonly noHeight: number;
  /** Section mode: beyond the swath, or projected past the ends of the section. */
  readonly outsideSwath: number;
  readonly missedSection: number;
  /** Planes parallel to the profile plane (or a vertical plane along a section): drawn as open rings. */
  readonly untraced: number;
  readonly vertices: number;
  readonly verticesInArea: number;
  readonly verticesDrawn: number;
  readonly verticesNoHeight: number;
  readonly verticesOffSection: number;
  readonly edgePoints: number;
}

/** Everything the panel needs. */
export interface ProfileData {
  readonly mode: 'down-plunge' | 'section';
  readonly label: string;
  /** Whether an area (ring) limited the data. */
  readonly hasArea: boolean;
  /** The axis as given (true north). */
  readonly axis: Line;
  /** The axis on the frame's grid (what positions were projected with). */
  readonly gridAxis: Line;
  readonly frame: { readonly crs: string; readonly crsName: string; readonly originEasting: number; readonly originNorthing: number; readonly convergence: number };
  readonly stations: ProfileStations;
  readonly lines: readonly ProfileLineLayer[];
  /** Section mode with a DEM: (distance, elevation) pairs of the ground, elevation NaN where the DEM has none. */
  readonly topography: Float64Array | null;
  readonly section: ProfileSectionInfo | null;
  /** Extent of everything drawn, metres (null when nothing is). */
  readonly extent: Extent | null;
  /** Smallest and largest distance along the axis of what is drawn (null when nothing is). */
  readonly alongRange: readonly [number, number] | null;
  readonly counts: ProfileCounts;
  /** One sentence per station left out for want of a height, naming it. */
  readonly noHeight: readonly string[];
  /** Other things the user should know (linework without heights, stations without a location...). */
  readonly notes: readonly string[];
  /** How the drawing was made, in a few sentences. */
  readonly method: string;
  /** The view in words: "Looking down-plunge toward 075°, plunge 12°". */
  readonly view: string;
}

/** Default swath half-width of a section, metres. */
export const DEFAULT_SWATH = 500;

/**
 * Prepares a down-plunge profile (with `ring`) or a vertical section (with `section`) for the panel.
 * Throws a RangeError naming the bad value for an unusable axis, ring, section line or DEM CRS.
 * @example
 * const data = buildProfileData({ stations, contacts, faults, dem, axis: { trend: 75, plunge: 12 }, ring: westRing, label: 'West domain' });
 * panel.data = data;
 */
export function buildProfileData(input: ProfileDataInput): ProfileData {
  checkAxis(input.axis);
  const ring = input.ring ? checkedRing(input.ring) : null;
  const sectionLonLat = input.section ? checkedSectionLine(input.section.line) : null;
  const swath = input.section?.swath ?? DEFAULT_SWATH;
  if (sectionLonLat && !(swath > 0 && Number.isFinite(swath))) throw new RangeError(`section swath ${String(swath)} is not a half-width in metres (a positive number)`);
  const dem = input.dem ? { dem: input.dem, crs: demCrsOf(input.dem, input.demCrs) } : undefined;
  const contacts = lineworkOf(input.contacts, 'contacts');
  const faults = lineworkOf(input.faults, 'faults');
  const notes: string[] = [];

  // 1. Frame. With nothing located at all, any frame will do: nothing is drawn in it.
  const anchor = frameAnchor(ring, sectionLonLat, input.stations, [...contacts, ...faults]);
  const frame = chooseLocalFrame(anchor.length > 0 ? anchor : [0, 0]);
  if (anchor.length === 0) notes.push('Nothing with a longitude and latitude was given: there is nothing to draw.');
  const axisOnGrid = gridAxis(frame, input.axis);
  const section = sectionLonLat ? sectionLine(toMapPoints(frame, sectionLonLat)) : null;

  // 2. Stations inside the area, with heights.
  const usable: number[] = [];
  input.stations.forEach((s, i) => {
    if (isUsable(s)) usable.push(i);
  });
  const located = usable.filter((i) => isLocated(input.stations[i]));
  const noLocation = usable.filter((i) => !isLocated(input.stations[i]));
  if (noLocation.length > 0) notes.push(`${count(noLocation.length, 'usable station')} without a longitude and latitude cannot be placed: ${nameList(noLocation.map((i) => input.stations[i].id))}.`);
  const inArea = ring ? located.filter((i) => pointInRing(input.stations[i].lon!, input.stations[i].lat!, ring)) : located;
  const heights = stationHeights(
    inArea.map((i) => {
      const s = input.stations[i];
      return { id: s.id, row: s.row, lon: s.lon, lat: s.lat, elevation: s.elevation };
    }),
    dem,
  );
  const noHeight = heights.missing.map((m) => `${m.message}; not drawn.`);
  const placed = inArea.map((i, k) => ({ i, h: heights.heights[k] })).filter((p) => Number.isFinite(p.h));
  const stationXyz = lonLatToLocal(
    frame,
    placed.flatMap((p) => [input.stations[p.i].lon!, input.stations[p.i].lat!]),
    placed.map((p) => p.h),
  );

  // 3. Linework inside the area, with heights.
  const clipped = [...clipLayers(contacts, 'contact', ring, dem), ...clipLayers(faults, 'fault', ring, dem)];
  for (const layer of clipped) notes.push(...layer.missing);

  // 4. Projection.
  let stations: ProfileStations;
  let lines: ProfileLineLayer[];
  let topography: Float64Array | null = null;
  let sectionInfo: ProfileSectionInfo | null = null;
  let outsideSwath = 0;
  let missedSection = 0;
  let verticesOffSection = 0;
  if (!section) {
    stations = downPlungeStations(input.stations, placed, stationXyz, axisOnGrid, input.axis);
    lines = clipped.map((layer) => {
      const xyd = projectDownPlunge(lonLatToLocal(frame, layer.lonLat, layer.heights), axisOnGrid);
      return { kind: layer.kind, order: layer.order, name: layer.name, xyd, runStarts: Int32Array.from(layer.runStarts), vertices: layer.vertices, edgePoints: layer.edgePoints };
    });
  } else {
    const projected = projectAlongPlunge(section, stationXyz, axisOnGrid, { swath });
    outsideSwath = projected.outsideSwath;
    missedSection = projected.missed;
    const azimuthsTrue = section.azimuths.map((a) => normalizeAzimuth(a + frame.convergence));
    stations = sectionStations(input.stations, placed, projected, azimuthsTrue);
    lines = clipped.map((layer) => {
      const p = projectAlongPlunge(section, lonLatToLocal(frame, layer.lonLat, layer.heights), axisOnGrid, { swath });
      const split = splitOnSection(layer, p.distance, p.elevation, p.offset, p.segment);
      verticesOffSection += split.off;
      return { kind: layer.kind, order: layer.order, name: layer.name, xyd: split.xyd, runStarts: split.runStarts, vertices: split.vertices, edgePoints: split.edgePoints };
    }).filter((l) => l.xyd.length > 0);
    const spacing = dem ? Math.max(section.length / 1500, 1) : 0;
    if (dem) {
      const ground = topographicProfile(section, spacing, groundSampler(frame, dem));
      topography = new Float64Array(ground.length * 2);
      ground.forEach((g, k) => {
        topography![2 * k] = g.distance;
        topography![2 * k + 1] = g.elevation ?? Number.NaN;
      });
      const gaps = ground.filter((g) => g.elevation === null).length;
      if (gaps > 0) notes.push(`The DEM gives no height at ${count(gaps, 'point')} of the ${ground.length} along the section: the ground line is broken there.`);
    } else notes.push('No terrain model was given: the section has no ground line.');
    sectionInfo = {
      length: section.length,
      chainage: section.chainage,
      azimuths: azimuthsTrue,
      axisApparentPlunge: projected.axisApparentPlunge,
      swath,
      topographySpacing: spacing,
    };
    if (outsideSwath > 0) notes.push(`${count(outsideSwath, 'station')}${ring ? ' in the area' : ''} lie farther than ${fmt(swath)} m from the section line and are not drawn.`);
    if (missedSection > 0) notes.push(`${count(missedSection, 'station')} within the swath project along the plunge past the ends of the section and are not drawn.`);
    if (verticesOffSection > 0) notes.push(`${count(verticesOffSection, 'linework vertex', 'linework vertices')} lie beyond the swath or project past the ends of the section and are not drawn.`);
  }
  const untraced = countUntraced(stations);
  if (untraced > 0) {
    notes.push(section
      ? `${count(untraced, 'plane')} run along the section (vertical and parallel to it) and show no dip: drawn as open rings.`
      : `${count(untraced, 'plane')} lie at right angles to the axis (parallel to the profile plane) and have no trace in it: drawn as open rings.`);
  }

  const verticesDrawn = lines.reduce((n, l) => n + l.vertices, 0);
  const edgePoints = lines.reduce((n, l) => n + l.edgePoints, 0);
  const counts: ProfileCounts = {
    stations: input.stations.length,
    usable: usable.length,
    inArea: inArea.length,
    drawn: stations.index.length,
    noLocation: noLocation.length,
    noHeight: heights.missing.length,
    outsideSwath,
    missedSection,
    untraced,
    vertices: [...contacts, ...faults].reduce((n, f) => n + f.parts.reduce((m, p) => m + p.heights.length, 0), 0),
    verticesInArea: clipped.reduce((n, l) => n + l.inArea, 0),
    verticesDrawn,
    verticesNoHeight: clipped.reduce((n, l) => n + l.noHeight, 0),
    verticesOffSection,
    edgePoints,
  };
  const label = input.label ?? (ring ? 'Selected area' : 'All data');
  return {
    mode: section ? 'section' : 'down-plunge',
    label,
    hasArea: ring !== null,
    axis: { trend: input.axis.trend, plunge: input.axis.plunge },
    gridAxis: axisOnGrid,
    frame: { crs: frame.crs.code, crsName: frame.crs.name, originEasting: frame.originEasting, originNorthing: frame.originNorthing, convergence: frame.convergence },
    stations,
    lines,
    topography,
    section: sectionInfo,
    extent: extentOf(stations, lines, topography),
    alongRange: alongRangeOf(stations, lines),
    counts,
    noHeight,
    notes,
    method: methodText(section !== null, frame, sectionInfo, dem !== undefined, ring !== null),
    view: viewText(input.axis, sectionInfo),
  };
}

/**
 * The view in words.
 * @example viewText({ trend: 75, plunge: 12 }, null) // 'Looking down-plunge toward 075°, plunge 12°'
 */
export function viewText(axis: Line, section: Pick<ProfileSectionInfo, 'azimuths'> | null): string {
  if (!section) return `Looking down-plunge toward ${az3(axis.trend)}°, plunge ${deg(axis.plunge)}°`;
  const a = section.azimuths;
  // One straight segment, drawn start on the left: the viewer's right hand points along it, so they face 90° anticlockwise of it.
  const along = a.length === 1 ? `along ${az3(a[0])}°, looking toward ${az3((a[0] + 270) % 360)}°` : `in ${a.length} segments, ${az3(a[0])}° to ${az3(a[a.length - 1])}°`;
  return `Vertical section ${along}; axis ${az3(axis.trend)}/${deg(axis.plunge)} projected along the plunge`;
}

// ---- Steps ----------------------------------------------------------------------------

function downPlungeStations(all: readonly Station[], placed: readonly { i: number }[], xyz: Float64Array, axisOnGrid: Line, axis: Line): ProfileStations {
  const n = placed.length;
  const p = projectDownPlunge(xyz, axisOnGrid);
  const out = emptyStations(n);
  placed.forEach(({ i }, k) => {
    const s = all[i];
    out.index[k] = i;
    out.ids[k] = s.id;
    out.kinds[k] = s.kind ?? '';
    out.xy[2 * k] = p[3 * k];
    out.xy[2 * k + 1] = p[3 * k + 1];
    out.along[k] = p[3 * k + 2];
    if (s.plane) {
      out.isPlane[k] = 1;
      // Plane and axis are both referred to true north: the trace depends only on their relative angle.
      const t = planeTraceInProfile(s.plane, axis);
      if (t) {
        out.tick[2 * k] = t.dx;
        out.tick[2 * k + 1] = t.dy;
        out.tickAngle[k] = t.angle;
      }
    }
  });
  return out;
}

function sectionStations(
  all: readonly Station[],
  placed: readonly { i: number }[],
  p: ReturnType<typeof projectAlongPlunge>,
  azimuthsTrue: readonly number[],
): ProfileStations {
  const keep = placed.map((_, k) => k).filter((k) => p.segment[k] >= 0);
  const out = emptyStations(keep.length);
  keep.forEach((k, j) => {
    const s = all[placed[k].i];
    out.index[j] = placed[k].i;
    out.ids[j] = s.id;
    out.kinds[j] = s.kind ?? '';
    out.xy[2 * j] = p.distance[k];
    out.xy[2 * j + 1] = p.elevation[k];
    out.along[j] = -p.offset[k];
    if (s.plane) {
      out.isPlane[j] = 1;
      // Moving a plane along the axis keeps its direction, so its trace in the section is its
      // apparent dip there (apparentDip.ts); positive goes down toward increasing distance.
      const alpha = apparentDipInSection(s.plane, azimuthsTrue[p.segment[k]]);
      if (Number.isFinite(alpha)) {
        const r = (alpha * Math.PI) / 180;
        out.tick[2 * j] = Math.cos(r);
        out.tick[2 * j + 1] = -Math.sin(r);
        out.tickAngle[j] = alpha;
      }
    }
  });
  return out;
}

function emptyStations(n: number): ProfileStations & { index: Int32Array; ids: string[]; kinds: string[]; xy: Float64Array; along: Float64Array; tick: Float64Array; tickAngle: Float64Array; isPlane: Uint8Array } {
  return {
    index: new Int32Array(n),
    ids: new Array<string>(n).fill(''),
    kinds: new Array<string>(n).fill(''),
    xy: new Float64Array(2 * n),
    along: new Float64Array(n),
    tick: new Float64Array(2 * n).fill(Number.NaN),
    tickAngle: new Float64Array(n).fill(Number.NaN),
    isPlane: new Uint8Array(n),
  };
}

function countUntraced(s: ProfileStations): number {
  let n = 0;
  for (let k = 0; k < s.isPlane.length; k++) if (s.isPlane[k] === 1 && !Number.isFinite(s.tick[2 * k])) n++;
  return n;
}

/** Linework of one kind, clipped to the ring, with heights, grouped into legend layers. */
interface ClippedLayer {
  readonly kind: 'contact' | 'fault';
  readonly order: number;
  readonly name: string;
  readonly lonLat: number[];
  readonly heights: number[];
  readonly runStarts: number[];
  vertices: number;
  edgePoints: number;
  inArea: number;
  noHeight: number;
  readonly missing: string[];
  /** Whether each vertex (lon/lat pair) is an inserted edge point. */
  readonly edge: number[];
}

function clipLayers(features: readonly LineworkFeature[], kind: 'contact' | 'fault', ring: Float64Array | null, dem: DemInCrs | undefined): ClippedLayer[] {
  if (features.length === 0) return [];
  const heights = lineworkHeights(features, dem);
  const layers = new Map<string, ClippedLayer>();
  const layerOf = (f: LineworkFeature): ClippedLayer => {
    const name = kind === 'fault' ? 'Faults' : contactName(f);
    let layer = layers.get(name);
    if (!layer) {
      layer = { kind, order: layers.size, name, lonLat: [], heights: [], runStarts: [0], vertices: 0, edgePoints: 0, inArea: 0, noHeight: 0, missing: [], edge: [] };
      layers.set(name, layer);
    }
    return layer;
  };
  features.forEach((f, fi) => {
    const layer = layerOf(f);
    f.parts.forEach((part, k) => {
      const z = heights.heights[fi][k];
      const n = z.length;
      const inside = new Uint8Array(n);
      for (let v = 0; v < n; v++) inside[v] = !ring || pointInRing(part.lonLat[2 * v], part.lonLat[2 * v + 1], ring) ? 1 : 0;
      for (let v = 0; v < n; v++) layer.inArea += inside[v];
      // Runs inside the area, each with the edge crossings added at its ends.
      for (const [a, b] of keptRuns(inside)) {
        const lon: number[] = [];
        const lat: number[] = [];
        const h: number[] = [];
        const edge: number[] = [];
        const push = (x: number, y: number, height: number, isEdge: boolean): void => {
          lon.push(x);
          lat.push(y);
          h.push(height);
          edge.push(isEdge ? 1 : 0);
        };
        if (a > 0 && ring) {
          const c = edgeCrossing(part.lonLat, z, a - 1, a, ring, 'enter');
          if (c) push(c[0], c[1], c[2], true);
        }
        for (let v = a; v < b; v++) push(part.lonLat[2 * v], part.lonLat[2 * v + 1], z[v], false);
        if (b < n && ring) {
          const c = edgeCrossing(part.lonLat, z, b - 1, b, ring, 'exit');
          if (c) push(c[0], c[1], c[2], true);
        }
        // Then broken where a height is missing.
        const hasHeight = h.map((x) => Number.isFinite(x));
        for (let v = a; v < b; v++) if (!Number.isFinite(z[v])) layer.noHeight++;
        for (const [c0, c1] of keptRuns(hasHeight)) {
          for (let v = c0; v < c1; v++) {
            layer.lonLat.push(lon[v], lat[v]);
            layer.heights.push(h[v]);
            layer.edge.push(edge[v]);
            if (edge[v]) layer.edgePoints++;
            else layer.vertices++;
          }
          layer.runStarts.push(layer.heights.length);
        }
      }
    });
  });
  // Missing heights, only for runs that reach inside the area (the CLI's rule).
  for (const m of heights.missing) {
    const f = features[(m.feature ?? 1) - 1];
    const part = f.parts[(m.part ?? 1) - 1];
    const [a, b] = m.vertices ?? [1, 0];
    let reaches = !ring;
    for (let v = a - 1; v < b && !reaches; v++) reaches = pointInRing(part.lonLat[2 * v], part.lonLat[2 * v + 1], ring!);
    if (reaches) layerOf(f).missing.push(`${m.message}; not drawn.`);
  }
  // Names whose lines all lie outside the area have nothing to show (and no key entry).
  return [...layers.values()].filter((l) => l.heights.length > 0 || l.missing.length > 0);
}

/**
 * Where segment a→b crosses the ring, interpolated (lon, lat, height): the crossing nearest the
 * inside end, so the inserted point lies on the edge the line actually crosses.
 */
function edgeCrossing(lonLat: Float64Array, z: Float64Array, a: number, b: number, ring: Float64Array, way: 'enter' | 'exit'): [number, number, number] | null {
  const ax = lonLat[2 * a];
  const ay = lonLat[2 * a + 1];
  const bx = lonLat[2 * b];
  const by = lonLat[2 * b + 1];
  let best = way === 'enter' ? -Infinity : Infinity;
  const m = ring.length / 2;
  for (let i = 0, j = m - 1; i < m; j = i++) {
    const t = segmentIntersection(ax, ay, bx, by, ring[2 * j], ring[2 * j + 1], ring[2 * i], ring[2 * i + 1]);
    if (t === null) continue;
    if (way === 'enter' ? t > best : t < best) best = t;
  }
  if (!Number.isFinite(best)) return null;
  return [ax + best * (bx - ax), ay + best * (by - ay), z[a] + best * (z[b] - z[a])];
}

/** Parameter t in [0, 1] along p→q where it meets segment r→s, or null (parallel or missing). */
function segmentIntersection(px: number, py: number, qx: number, qy: number, rx: number, ry: number, sx: number, sy: number): number | null {
  // Two-segment intersection by cross products (common practice, e.g. O'Rourke, Computational Geometry in C, 1998, §7.2; from memory).
  const dx = qx - px;
  const dy = qy - py;
  const ex = sx - rx;
  const ey = sy - ry;
  const denom = dx * ey - dy * ex;
  if (denom === 0) return null;
  const t = ((rx - px) * ey - (ry - py) * ex) / denom;
  const u = ((rx - px) * dy - (ry - py) * dx) / denom;
  return t >= 0 && t <= 1 && u >= 0 && u <= 1 ? t : null;
}

/** Section mode: runs broken where a vertex is beyond the swath or misses the section. */
function splitOnSection(layer: ClippedLayer, distance: Float64Array, elevation: Float64Array, offset: Float64Array, segment: Int32Array) {
  const xyd: number[] = [];
  const runStarts: number[] = [0];
  let vertices = 0;
  let edgePoints = 0;
  let off = 0;
  for (let r = 0; r + 1 < layer.runStarts.length; r++) {
    const a = layer.runStarts[r];
    const b = layer.runStarts[r + 1];
    const on: boolean[] = [];
    for (let v = a; v < b; v++) {
      on.push(segment[v] >= 0);
      if (segment[v] < 0 && !layer.edge[v]) off++;
    }
    for (const [c0, c1] of keptRuns(on)) {
      for (let v = a + c0; v < a + c1; v++) {
        xyd.push(distance[v], elevation[v], -offset[v]);
        if (layer.edge[v]) edgePoints++;
        else vertices++;
      }
      runStarts.push(xyd.length / 3);
    }
  }
  return { xyd: Float64Array.from(xyd), runStarts: Int32Array.from(runStarts), vertices, edgePoints, off };
}

/** Heights of the ground at section points (local frame metres) from the DEM in its own CRS. */
function groundSampler(frame: LocalFrame, dem: DemInCrs): (x: number, y: number) => number | null {
  const same = !dem.crs.geographic && dem.crs.proj4 === frame.crs.proj4;
  return (x, y) => {
    const e = x + frame.originEasting;
    const n = y + frame.originNorthing;
    if (same) return sampleDem(dem.dem, e, n);
    const ll = toLonLat(e, n, frame.crs);
    const p = dem.crs.geographic ? { x: ll.lon, y: ll.lat } : fromLonLat(ll.lon, ll.lat, dem.crs);
    return sampleDem(dem.dem, p.x, p.y);
  };
}

// ---- Inputs ---------------------------------------------------------------------------

function checkedRing(ring: readonly LonLat[]): Float64Array {
  if (!Array.isArray(ring)) throw new RangeError('the area ring is not a list of [longitude, latitude] positions');
  ring.forEach((p, i) => {
    if (!Array.isArray(p) || !Number.isFinite(p[0]) || !Number.isFinite(p[1]) || Math.abs(p[0]) > 180 || Math.abs(p[1]) > 90) {
      throw new RangeError(`area ring, position ${i + 1}: ${JSON.stringify(p)} is not [longitude, latitude] in degrees`);
    }
  });
  // A closed ring repeats its first position; the even-odd test does not need it.
  const last = ring.length - 1;
  const open = last > 0 && ring[0][0] === ring[last][0] && ring[0][1] === ring[last][1] ? ring.slice(0, last) : ring;
  if (open.length < 3) throw new RangeError(`the area ring has ${open.length} distinct positions; an area needs at least 3`);
  return Float64Array.from(open.flatMap((p) => [p[0], p[1]]));
}

function checkedSectionLine(line: readonly LonLat[]): readonly LonLat[] {
  if (!Array.isArray(line) || line.length < 2) throw new RangeError(`a section line needs at least 2 positions, got ${Array.isArray(line) ? line.length : String(line)}`);
  line.forEach((p, i) => {
    if (!Array.isArray(p) || !Number.isFinite(p[0]) || !Number.isFinite(p[1]) || Math.abs(p[0]) > 180 || Math.abs(p[1]) > 90) {
      throw new RangeError(`section line, position ${i + 1}: ${JSON.stringify(p)} is not [longitude, latitude] in degrees`);
    }
  });
  return line;
}

function demCrsOf(dem: Dem, given: Crs | undefined): Crs {
  if (given) return given;
  if (dem.epsg !== undefined) {
    const crs = builtInCrs(dem.epsg);
    if (crs) return crs;
    throw new RangeError(`${dem.source ?? 'the DEM'}: EPSG:${dem.epsg} is not a built-in CRS; pass its CRS as demCrs`);
  }
  if (dem.geographic) return builtInCrs(4326)!;
  throw new RangeError(`${dem.source ?? 'the DEM'} names no CRS; pass it as demCrs`);
}

function lineworkOf(input: LineworkInput | undefined, what: string): readonly LineworkFeature[] {
  if (input === undefined) return [];
  if (Array.isArray(input)) return input as readonly LineworkFeature[];
  const fc = input as FeatureCollection;
  if (fc.type === 'FeatureCollection' && Array.isArray(fc.features) && fc.features.length === 0) return [];
  try {
    // The reader's checks and messages, for a collection given as an object.
    return readLinework(JSON.stringify(fc));
  } catch (e) {
    if (e instanceof LineworkError) throw new RangeError(`${what}: ${e.message}`);
    throw e;
  }
}

function contactName(f: LineworkFeature): string {
  const p = f.properties;
  if (typeof p.name === 'string' && p.name.trim() !== '') return p.name;
  if ((typeof p.unit === 'string' && p.unit.trim() !== '') || typeof p.unit === 'number') return `Contact of ${String(p.unit)}`;
  return 'Contacts';
}

const isLocated = (s: Station): boolean => s.lon !== undefined && s.lat !== undefined && Number.isFinite(s.lon) && Number.isFinite(s.lat);

/** Positions that fix the local frame: the ring, else the section line, else the data. */
function frameAnchor(ring: Float64Array | null, section: readonly LonLat[] | null, stations: readonly Station[], lines: readonly LineworkFeature[]): ArrayLike<number> {
  if (ring) return ring;
  if (section) return section.flatMap((p) => [p[0], p[1]]);
  const out: number[] = [];
  for (const s of stations) if (isUsable(s) && isLocated(s)) out.push(s.lon!, s.lat!);
  for (const f of lines) for (const p of f.parts) for (let v = 0; v < p.lonLat.length; v += 2) out.push(p.lonLat[v], p.lonLat[v + 1]);
  return out;
}

function toMapPoints(frame: LocalFrame, line: readonly LonLat[]): [number, number][] {
  const xyz = lonLatToLocal(frame, line.flatMap((p) => [p[0], p[1]]), new Float64Array(line.length));
  return line.map((_, i) => [xyz[3 * i], xyz[3 * i + 1]]);
}

// ---- Results --------------------------------------------------------------------------

function extentOf(s: ProfileStations, lines: readonly ProfileLineLayer[], topography: Float64Array | null): Extent | null {
  let minX = Infinity;
  let minY = Infinity;
  let maxX = -Infinity;
  let maxY = -Infinity;
  const take = (x: number, y: number): void => {
    if (!Number.isFinite(x) || !Number.isFinite(y)) return;
    if (x < minX) minX = x;
    if (x > maxX) maxX = x;
    if (y < minY) minY = y;
    if (y > maxY) maxY = y;
  };
  for (let k = 0; k < s.xy.length; k += 2) take(s.xy[k], s.xy[k + 1]);
  for (const l of lines) for (let k = 0; k < l.xyd.length; k += 3) take(l.xyd[k], l.xyd[k + 1]);
  if (topography) for (let k = 0; k < topography.length; k += 2) take(topography[k], topography[k + 1]);
  return minX <= maxX ? { minX, minY, maxX, maxY } : null;
}

function alongRangeOf(s: ProfileStations, lines: readonly ProfileLineLayer[]): [number, number] | null {
  let lo = Infinity;
  let hi = -Infinity;
  for (const v of s.along) {
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  for (const l of lines) {
    for (let k = 2; k < l.xyd.length; k += 3) {
      const v = l.xyd[k];
      if (v < lo) lo = v;
      if (v > hi) hi = v;
    }
  }
  return lo <= hi ? [lo, hi] : null;
}

function methodText(isSection: boolean, frame: LocalFrame, section: ProfileSectionInfo | null, hasDem: boolean, hasArea: boolean): string {
  const heights = hasDem ? 'Heights from the data, else from the DEM (bilinear).' : 'Heights from the data only (no DEM given).';
  const grid = `Positions in ${frame.crs.code} (${frame.crs.name}) about E ${frame.originEasting} N ${frame.originNorthing}; the axis turned to grid north by the grid convergence (${frame.convergence.toFixed(3)}°).`;
  const area = hasArea ? ' Linework is cut where it leaves the area, never bridged.' : '';
  if (!isSection || !section) {
    return `Down-plunge projection (down-structure view, Mackin 1950): each station and linework vertex moved parallel to the fold axis onto the plane normal to it; orthographic, true scale. Planes drawn as their trace in that plane (apparent-dip ticks), lines as dots. ${grid} ${heights}${area}`;
  }
  return `Vertical section along a line drawn on the map (${fmt(section.length)} m, ${count(section.azimuths.length, 'segment')}): stations and vertices within ${fmt(section.swath)} m of it moved parallel to the fold axis until they meet the section (along-plunge projection). Planes drawn with their apparent dip in the section. ${hasDem ? `Ground line from the DEM every ${fmt(section.topographySpacing)} m.` : ''} ${grid} ${heights}${area}`.replace(/\s+/g, ' ');
}

const az3 = (a: number): string => String(Math.round(normalizeAzimuth(a)) % 360).padStart(3, '0');
const deg = (a: number): string => String(Math.round(a));
const fmt = (m: number): string => (Math.abs(m) >= 100 ? Math.round(m).toString() : m.toFixed(1).replace(/\.0$/, ''));

function count(n: number, one: string, many = `${one}s`): string {
  return `${n} ${n === 1 ? one : many}`;
}

/** Up to 20 names, then "and N more". */
function nameList(names: readonly string[]): string {
  const shown = names.slice(0, 20).join(', ');
  return names.length > 20 ? `${shown} and ${names.length - 20} more` : shown;
}
