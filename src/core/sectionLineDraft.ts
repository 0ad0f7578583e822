import type { Feature, FeatureCollection, LineString, Point } from 'geojson';

/**
 * A section line being drawn on a map, vertex by vertex, as plain data: what each tap does,
 * when the line is finished, and what to draw for it. No map library here: the drawer
 * (src/map/sectionLineDrawer.ts) feeds taps in and draws the features out, and the rules can
 * be tested on their own.
 *
 * Rules (the same for mouse, pen and finger):
 * - a tap adds a vertex;
 * - a tap within `finishRadiusPx` of the last vertex (on screen, as the map shows it now)
 *   finishes the line when it has two vertices or more, so a double click or a double tap ends
 *   it; with one vertex such a tap is ignored (a repeated tap, not a segment);
 * - a finished line keeps only distinct consecutive positions and needs two of them.
 */

/** A lon/lat position in degrees. */
export type LonLatPair = readonly [number, number];

/** The vertices drawn so far (lon/lat, in order). */
export interface SectionLineDraft {
  readonly vertices: readonly LonLatPair[];
}

/**
 * Screen distance in CSS px within which a tap on the last vertex finishes the line.
 * @example tapOnDraft(draft, lonLat, screen, project, FINISH_RADIUS_PX)
 */
export const FINISH_RADIUS_PX = 10;

/**
 * A draft with no vertex.
 * @example let draft = EMPTY_DRAFT; draft = withVertex(draft, [15, 24.6]);
 */
export const EMPTY_DRAFT: SectionLineDraft = Object.freeze({ vertices: Object.freeze([]) as readonly LonLatPair[] });

/** What a tap did. */
export interface TapResult {
  readonly draft: SectionLineDraft;
  /** 'added': a new vertex; 'finish': the tap asks to finish the line; 'ignored': a repeat of the only vertex. */
  readonly action: 'added' | 'finish' | 'ignored';
}

/**
 * Applies one tap at `lonLat` (seen at `screen`, CSS px); `project` gives the screen position
 * of a lon/lat as the map shows it now (the map may have moved since the last vertex).
 * @example tapOnDraft(EMPTY_DRAFT, [15, 24.6], [100, 100], (p) => [p[0], p[1]]).action // 'added'
 */
export function tapOnDraft(draft: SectionLineDraft, lonLat: LonLatPair, screen: LonLatPair, project: (lonLat: LonLatPair) => LonLatPair, finishRadiusPx = FINISH_RADIUS_PX): TapResult {
  checkPosition(lonLat, 'tap');
  const n = draft.vertices.length;
  if (n > 0) {
    const last = project(draft.vertices[n - 1]);
    if (Math.hypot(screen[0] - last[0], screen[1] - last[1]) <= finishRadiusPx) return { draft, action: n >= 2 ? 'finish' : 'ignored' };
  }
  return { draft: { vertices: [...draft.vertices, [lonLat[0], lonLat[1]]] }, action: 'added' };
}

/**
 * The draft with a vertex added from code (a keyboard command, a typed point), without the
 * finishing rule.
 * @example withVertex(EMPTY_DRAFT, [15, 24.6]).vertices.length // 1
 */
export function withVertex(draft: SectionLineDraft, lonLat: LonLatPair): SectionLineDraft {
  checkPosition(lonLat, 'vertex');
  return { vertices: [...draft.vertices, [lonLat[0], lonLat[1]]] };
}

/**
 * The draft without its last vertex (Backspace while drawing).
 * @example withoutLastVertex({ vertices: [[15, 24.6], [15.01, 24.6]] }).vertices.length // 1
 */
export function withoutLastVertex(draft: SectionLineDraft): SectionLineDraft {
  return { vertices: draft.vertices.slice(0, -1) };
}

/** A finished section line, or why the draft is not one yet. */
export type FinishedSectionLine = { readonly line: readonly LonLatPair[]; readonly problem: null } | { readonly line: null; readonly problem: string };

/**
 * The section line the draft describes: repeated consecutive positions dropped, at least two left.
 * @example finishDraft({ vertices: [[15, 24.6], [15, 24.6], [15.02, 24.61]] }).line // [[15, 24.6], [15.02, 24.61]]
 */
export function finishDraft(draft: SectionLineDraft): FinishedSectionLine {
  const line: LonLatPair[] = [];
  for (const v of draft.vertices) {
    const last = line[line.length - 1];
    if (!last || last[0] !== v[0] || last[1] !== v[1]) line.push([v[0], v[1]]);
  }
  if (line.length < 2) {
    const had = line.length === 0 ? 'no point yet' : 'only one point';
    return { line: null, problem: `A section line needs a start and an end point; it has ${had}. Click where the section starts, then where it ends.` };
  }
  return { line, problem: null };
}

/** Role of a feature drawn for a section line (the `role` property). */
export type SectionFeatureRole = 'line' | 'pending' | 'start' | 'vertex' | 'end';

/**
 * What to draw: the line so far ('line'), the rubber band from the last vertex to the pointer
 * while drawing ('pending'), and the vertices, the first marked 'start' and, when finished, the
 * last 'end'. Every feature carries `role`.
 * @example sectionLineFeatures([[15, 24.6], [15.02, 24.61]], null, true).features.map((f) => f.properties.role)
 * // ['line', 'start', 'end']
 */
export function sectionLineFeatures(vertices: readonly LonLatPair[], pointer: LonLatPair | null, finished: boolean): FeatureCollection<LineString | Point, { role: SectionFeatureRole }> {
  const features: Feature<LineString | Point, { role: SectionFeatureRole }>[] = [];
  const coords = vertices.map((v) => [v[0], v[1]]);
  if (coords.length >= 2) features.push({ type: 'Feature', properties: { role: 'line' }, geometry: { type: 'LineString', coordinates: coords } });
  if (!finished && pointer && coords.length >= 1) {
    features.push({ type: 'Feature', properties: { role: 'pending' }, geometry: { type: 'LineString', coordinates: [coords[coords.length - 1], [pointer[0], pointer[1]]] } });
  }
  coords.forEach((c, i) => {
    const role: SectionFeatureRole = i === 0 ? 'start' : finished && i === coords.length - 1 ? 'end' : 'vertex';
    features.push({ type: 'Feature', properties: { role }, geometry: { type: 'Point', coordinates: c } });
  });
  return { type: 'FeatureCollection', features };
}

function checkPosition(p: LonLatPair, what: string): void {
  if (!Array.isArray(p) || !Number.isFinite(p[0]) || !Number.isFinite(p[1]) || Math.abs(p[0]) > 180 || Math.abs(p[1]) > 90) {
    throw new RangeError(`section line ${what}: ${JSON.stringify(p)} is not [longitude, latitude] in degrees`);
  }
}
