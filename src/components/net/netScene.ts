/**
 * The net as a plain description of what to draw (a "scene"): layers of paths, markers and
 * text in SVG viewBox units, each tagged with a role that fixes its style (netStyle.ts). The
 * component draws a scene with d3; the SVG export writes the same scene as a file. Building
 * it needs no DOM, so every position can be checked in Node.
 *
 * Layers are built one by one (frame, contours, planes, data, analysis, highlight, legend) so
 * the component can rebuild only the layers whose inputs changed.
 */
import type { DensityGrid } from '../../core/density';
import type { FoldAnalysis } from '../../core/foldAnalysis';
import type { FoldDescription, FoldDescriptionFailure } from '../../core/foldDescription';
import { projectLine, type NetKind } from '../../core/netProjection';
import type { Line, Plane } from '../../core/types';
import { contourBands } from './contourPaths';
import { formatAngle, formatCount, formatLine } from './format';
import {
  centreCrossPathData,
  circlePathData,
  gridPathData,
  greatCirclesPathData,
  markerPathData,
  netToSvg,
  pointsPathData,
  POINTS_SCALE,
  smallCirclePathData,
  greatCirclePathData,
  ticksPathData,
  trianglesPathData,
  type MarkerSymbol,
  type NetFrame,
} from './netPaths';
import { POLE_DOT, contourOpacities, type NetRole } from './netStyle';

/** A path; with `at` it is a marker drawn at that point (translate), else in viewBox units. */
export interface ScenePath {
  readonly type: 'path';
  readonly role: NetRole;
  readonly d: string;
  readonly at?: { readonly x: number; readonly y: number };
  /** A stable name for the item (tests and exports find markers by it). */
  readonly name?: string;
  /** Tooltip text. */
  readonly title?: string;
  readonly fillRule?: 'evenodd';
  /** Overrides the role's fill opacity (contour bands and their key swatches). */
  readonly fillOpacity?: number;
  /** Drawn scaled by this factor about the origin (pole dots; see pointsPathData). */
  readonly scale?: number;
  /** Overrides the role's stroke width and opacity (pole dots for many poles). */
  readonly strokeWidth?: number;
  readonly strokeOpacity?: number;
}

/** A line of text. */
export interface SceneText {
  readonly type: 'text';
  readonly role: NetRole;
  readonly x: number;
  readonly y: number;
  readonly text: string;
  readonly anchor: 'start' | 'middle' | 'end';
  readonly name?: string;
}

export type SceneItem = ScenePath | SceneText;

/** A group of items; `clip` ones are clipped to the primitive. */
export interface SceneLayer {
  readonly id: string;
  readonly clip: boolean;
  readonly items: readonly SceneItem[];
}

/** Size of the drawing and the position of the net and its key in it. */
export interface NetLayout {
  readonly width: number;
  readonly height: number;
  readonly frame: NetFrame;
  /** Top left of the symbol key. */
  readonly legend: { readonly x: number; readonly y: number };
  /** Top left of the contour key; it follows the symbol key when absent. */
  readonly contourKey?: { readonly x: number; readonly y: number };
  /** Baseline of the caption under the net. */
  readonly captionY: number;
}

/** The wide layout: the net on the left, the key on the right. */
export const NET_LAYOUT: NetLayout = Object.freeze({
  width: 560,
  height: 426,
  frame: Object.freeze({ cx: 206, cy: 213, r: 180 }),
  legend: Object.freeze({ x: 414, y: 22 }),
  captionY: 422,
});

/** The narrow layout (phones): the net on top, the key below it in two columns, so its text stays legible. */
export const NET_LAYOUT_NARROW: NetLayout = Object.freeze({
  width: 400,
  height: 640,
  frame: Object.freeze({ cx: 200, cy: 213, r: 180 }),
  legend: Object.freeze({ x: 14, y: 452 }),
  contourKey: Object.freeze({ x: 214, y: 452 }),
  captionY: 422,
});

/** Which parts are drawn. */
export interface NetShow {
  readonly grid: boolean;
  readonly poles: boolean;
  readonly greatCircles: boolean;
  readonly contours: boolean;
  readonly girdle: boolean;
  readonly axis: boolean;
  readonly cone: boolean;
  readonly beta: boolean;
  readonly lines: boolean;
  /** Limb maxima and the axial-plane trace, when a description is given. */
  readonly limbs: boolean;
}

export const DEFAULT_SHOW: NetShow = Object.freeze({
  grid: true,
  poles: true,
  greatCircles: false,
  contours: true,
  girdle: true,
  axis: true,
  cone: true,
  beta: true,
  lines: true,
  limbs: true,
});

/** A measured line with the station it came from. */
export interface NetLine extends Line {
  /** Station index, reported by hover and pick events. */
  readonly id: number;
}

/** Sizes of markers in viewBox units. */
export const MARKER_SIZE = Object.freeze({ axis: 11, beta: 16, limb: 11, line: 9, highlight: 15 });

/** Default cap on great circles drawn. */
export const DEFAULT_MAX_GREAT_CIRCLES = 300;

/**
 * Primitive, face, grid, ticks, north mark and centre cross.
 * @example frameLayers('equal-area', true, NET_LAYOUT).map((l) => l.id) // ['face', 'frame']
 */
export function frameLayers(net: NetKind, grid: boolean, layout: NetLayout = NET_LAYOUT): SceneLayer[] {
  const f = layout.frame;
  const face: SceneItem[] = [{ type: 'path', role: 'face', d: circlePathData(f.cx, f.cy, f.r), name: 'face' }];
  if (grid) face.push({ type: 'path', role: 'grid', d: gridPathData(net, f), name: 'grid' });
  return [
    { id: 'face', clip: false, items: face },
    {
      id: 'frame',
      clip: false,
      items: [
        { type: 'path', role: 'primitive', d: circlePathData(f.cx, f.cy, f.r), name: 'primitive' },
        { type: 'path', role: 'tick', d: ticksPathData(f, 9), name: 'ticks' },
        { type: 'path', role: 'centre', d: centreCrossPathData(f, 5), name: 'centre' },
        { type: 'text', role: 'north', x: f.cx, y: f.cy - f.r - 14, text: 'N', anchor: 'middle', name: 'north' },
        { type: 'text', role: 'caption', x: layout.frame.cx - f.r - 6, y: layout.captionY, text: `${net === 'equal-area' ? 'Equal-area' : 'Equal-angle'} net, lower hemisphere`, anchor: 'start', name: 'caption' },
      ],
    },
  ];
}

/**
 * Density contours, lowest level first, clipped to the primitive. Empty when the grid was
 * computed for the other net (the host is then still recomputing it).
 * @example contourLayer(kambGrid(poles), 'equal-area').items.length // one path per level reached
 */
export function contourLayer(density: DensityGrid | null, net: NetKind, layout: NetLayout = NET_LAYOUT): SceneLayer {
  if (!density || density.net !== net) return { id: 'contours', clip: true, items: [] };
  const levels = drawnLevels(density.levels);
  const { layer } = contourOpacities(levels.length);
  const items: SceneItem[] = contourBands(density, layout.frame, levels).map((b) => ({
    type: 'path',
    role: 'contour',
    d: b.d,
    fillRule: 'evenodd',
    fillOpacity: round3(layer[Math.max(0, levels.indexOf(b.level))]),
    name: `contour-${b.level}`,
    title: `${roundLevel(b.level)}σ`,
  }));
  return { id: 'contours', clip: true, items };
}

/** Most contour levels drawn; more would merge into a dark smear. */
export const MAX_DRAWN_LEVELS = 10;

/**
 * The contour levels drawn: all of them up to `max`, else every k-th from the lowest, with k
 * the smallest step that brings the count within `max`, so the drawn levels stay evenly spaced.
 * @example drawnLevels([2, 4, 6]) // [2, 4, 6]
 * @example drawnLevels([2, 4, 6, 8, 10], 3) // [2, 6, 10]
 */
export function drawnLevels(levels: readonly number[], max = MAX_DRAWN_LEVELS): number[] {
  if (!(Number.isInteger(max) && max >= 1)) throw new RangeError(`drawnLevels: max ${String(max)} is not usable; expected a whole number from 1`);
  const finite = levels.filter((l) => Number.isFinite(l));
  const k = Math.ceil(finite.length / max);
  return k <= 1 ? finite : finite.filter((_, i) => i % k === 0);
}

/**
 * Dot diameter and opacity of pole dots for n poles: full size up to 500 poles, shrinking
 * (on a log scale) to 1.2 units at 20,000 and beyond, so dense data do not hide the contours.
 * @example poleDotStyle(100) // {width: 3.2, opacity: 1}
 */
export function poleDotStyle(n: number): { width: number; opacity: number } {
  const lo = Math.log(500);
  const hi = Math.log(20_000);
  const t = n <= 500 ? 0 : n >= 20_000 ? 1 : (Math.log(n) - lo) / (hi - lo);
  return { width: round3(POLE_DOT - t * (POLE_DOT - 1.2)), opacity: round3(1 - 0.5 * t) };
}

/**
 * Planes to draw as great circles when there are more than the cap: picks spread evenly over the list.
 * @example sampleForCap([0, 1, 2, 3, 4, 5, 6, 7, 8, 9], 5) // [0, 2, 4, 6, 8]
 */
export function sampleForCap<T>(items: readonly T[], cap: number): T[] {
  if (!(Number.isInteger(cap) && cap >= 0)) throw new RangeError(`great-circle cap ${String(cap)} is not usable; expected a whole number from 0`);
  if (items.length <= cap) return items.slice();
  const out: T[] = [];
  for (let i = 0; i < cap; i++) out.push(items[Math.floor((i * items.length) / cap)]);
  return out;
}

/**
 * Great circles of the planes, at most `cap` of them; `drawn` and `total` let the panel say
 * when it capped.
 * @example greatCircleLayer(planes, 'equal-area', 300).drawn
 */
export function greatCircleLayer(planes: readonly Plane[], net: NetKind, cap = DEFAULT_MAX_GREAT_CIRCLES, layout: NetLayout = NET_LAYOUT): SceneLayer & { drawn: number; total: number } {
  const chosen = sampleForCap(planes, cap);
  const items: SceneItem[] = chosen.length ? [{ type: 'path', role: 'great-circle', d: greatCirclesPathData(chosen, net, layout.frame), name: 'great-circles' }] : [];
  return { id: 'great-circles', clip: false, items, drawn: chosen.length, total: planes.length };
}

/**
 * All poles as one path of dots; `xy` are their net coordinates (projectVectors).
 * @example poleLayer(projectVectors(poles, 'equal-area')).items[0].role // 'pole'
 */
export function poleLayer(xy: Float64Array, layout: NetLayout = NET_LAYOUT): SceneLayer {
  const dot = poleDotStyle(xy.length / 2);
  const items: SceneItem[] = xy.length
    ? [{ type: 'path', role: 'pole', d: pointsPathData(xy, layout.frame), name: 'poles', scale: 1 / POINTS_SCALE, strokeWidth: dot.width * POINTS_SCALE, strokeOpacity: dot.opacity }]
    : [];
  return { id: 'poles', clip: false, items };
}

/**
 * All measured lines as one path of open triangles; `xy` are their net coordinates.
 * @example lineLayer(Float64Array.of(0, 0)).items[0].name // 'lines'
 */
export function lineLayer(xy: Float64Array, layout: NetLayout = NET_LAYOUT): SceneLayer {
  const items: SceneItem[] = xy.length ? [{ type: 'path', role: 'line', d: trianglesPathData(xy, layout.frame, MARKER_SIZE.line), name: 'lines' }] : [];
  return { id: 'lines', clip: false, items };
}

/**
 * Girdle, axial-plane trace, cone, limb maxima, beta axis and fold axis (drawn last, on top).
 * @example analysisLayer(analysis, null, 'equal-area', DEFAULT_SHOW).items.find((i) => i.name === 'axis')
 */
export function analysisLayer(
  analysis: FoldAnalysis | null,
  description: FoldDescription | FoldDescriptionFailure | null,
  net: NetKind,
  show: NetShow,
  layout: NetLayout = NET_LAYOUT,
): SceneLayer {
  const f = layout.frame;
  const items: SceneItem[] = [];
  const marker = (role: NetRole, name: string, symbol: MarkerSymbol, size: number, line: Line, title: string): void => {
    items.push({ type: 'path', role, d: markerPathData(symbol, size), at: netToSvg(projectLine(line, net), f), name, title });
  };
  const d = description?.ok ? description : null;
  if (analysis?.girdle && show.girdle) {
    items.push({ type: 'path', role: 'girdle', d: greatCirclePathData(analysis.girdle, net, f), name: 'girdle', title: 'Best-fit girdle' });
  }
  if (d?.axialPlane && show.limbs) {
    items.push({ type: 'path', role: 'axial-plane', d: greatCirclePathData(d.axialPlane, net, f), name: 'axial-plane', title: 'Axial plane' });
  }
  if (analysis?.axis && show.cone && analysis.cone95 !== null && Number.isFinite(analysis.cone95) && analysis.cone95 > 0) {
    items.push({ type: 'path', role: 'cone', d: smallCirclePathData(analysis.axis, Math.min(analysis.cone95, 90), net, f), name: 'cone', title: `95% cone ${formatAngle(analysis.cone95).text}` });
  }
  if (d && show.limbs) d.limbs.forEach((l, i) => marker('limb', `limb-${i + 1}`, 'disc', MARKER_SIZE.limb, l.pole, `Limb ${i + 1} maximum (pole) ${formatLine(l.pole).text}`));
  if (analysis?.beta && show.beta) marker('beta', 'beta', 'diamond', MARKER_SIZE.beta, analysis.beta, `β axis ${formatLine(analysis.beta).text}`);
  if (analysis?.axis && show.axis) marker('axis', 'axis', 'square', MARKER_SIZE.axis, analysis.axis, `Fold axis (π) ${formatLine(analysis.axis).text}`);
  return { id: 'analysis', clip: false, items };
}

/**
 * A ring around the emphasised point (net coordinates), or nothing.
 * @example highlightLayer({x: 0, y: 0}).items[0].role // 'highlight'
 */
export function highlightLayer(point: { x: number; y: number } | null, layout: NetLayout = NET_LAYOUT): SceneLayer {
  if (!point || !Number.isFinite(point.x) || !Number.isFinite(point.y)) return { id: 'highlight', clip: false, items: [] };
  return {
    id: 'highlight',
    clip: false,
    items: [{ type: 'path', role: 'highlight', d: markerPathData('ring', MARKER_SIZE.highlight), at: netToSvg(point, layout.frame), name: 'highlight' }],
  };
}

/** What the key lists. */
export interface LegendInput {
  readonly poles: number;
  readonly lines: number;
  readonly greatCircles: { readonly drawn: number; readonly total: number } | null;
  readonly analysis: FoldAnalysis | null;
  readonly description: FoldDescription | FoldDescriptionFailure | null;
  readonly density: DensityGrid | null;
  readonly show: NetShow;
}

/**
 * The key beside the net: one row per kind of thing drawn, then the contour levels in sigma.
 * Only what is on the net is listed.
 * @example legendLayer({poles: 10, lines: 0, greatCircles: null, analysis: null, description: null, density: null, show: DEFAULT_SHOW})
 */
export function legendLayer(input: LegendInput, layout: NetLayout = NET_LAYOUT): SceneLayer & { bottom: number } {
  let x = layout.legend.x;
  const items: SceneItem[] = [];
  let y = layout.legend.y;
  const rowH = 19;
  const glyph = (role: NetRole, d: string, name: string, label: string, at = true): void => {
    items.push({ type: 'path', role, d, ...(at ? { at: { x: x + 8, y: y - 4 } } : {}), name: `key-${name}` });
    items.push({ type: 'text', role: 'legend-text', x: x + 22, y, text: label, anchor: 'start', name: `key-${name}-label` });
    y += rowH;
  };
  const stroke = (role: NetRole, name: string, label: string): void => glyph(role, `M${x} ${y - 4}H${x + 16}`, name, label, false);
  const { analysis: a, show } = input;
  const d = input.description?.ok ? input.description : null;
  const title: SceneItem = { type: 'text', role: 'legend-title', x, y, text: 'KEY', anchor: 'start', name: 'key-title' };
  y += rowH;
  if (show.poles && input.poles > 0) glyph('pole', 'M0 0h0', 'poles', `Poles (${formatCount(input.poles).text})`);
  if (show.greatCircles && input.greatCircles && input.greatCircles.drawn > 0) {
    const g = input.greatCircles;
    stroke('great-circle', 'great-circles', g.drawn < g.total ? `Great circles (${formatCount(g.drawn).text} of ${formatCount(g.total).text})` : 'Great circles');
  }
  if (show.lines && input.lines > 0) glyph('line', markerPathData('triangle', MARKER_SIZE.line), 'lines', `Lines (${formatCount(input.lines).text})`);
  if (a?.axis && show.axis) glyph('axis', markerPathData('square', MARKER_SIZE.axis), 'axis', `π axis ${formatLine(a.axis).text}`);
  if (a?.axis && show.cone && a.cone95 !== null && a.cone95 > 0) glyph('cone', markerPathData('ring', 12), 'cone', `95% cone ${formatAngle(a.cone95).text}`);
  if (a?.girdle && show.girdle) stroke('girdle', 'girdle', 'Girdle');
  if (a?.beta && show.beta) glyph('beta', markerPathData('diamond', MARKER_SIZE.beta), 'beta', `β axis ${formatLine(a.beta).text}`);
  if (d && show.limbs) {
    glyph('limb', markerPathData('disc', MARKER_SIZE.limb), 'limbs', 'Limb maxima');
    if (d.axialPlane) stroke('axial-plane', 'axial-plane', 'Limb bisector');
  }
  const g = input.density;
  if (g && show.contours && g.levels.length > 0) {
    if (layout.contourKey) ({ x, y } = layout.contourKey);
    else y += 8;
    items.push({ type: 'text', role: 'legend-title', x, y, text: g.method === 'kamb' ? 'KAMB CONTOURS' : 'EXPONENTIAL CONTOURS', anchor: 'start', name: 'key-contours-title' });
    y += rowH - 2;
    const levels = drawnLevels(g.levels);
    const { cumulative } = contourOpacities(levels.length);
    levels.forEach((level, index) => {
      // A swatch shows the band above its level as it looks on the net: all layers below composited.
      items.push({ type: 'path', role: 'contour', d: `M${x} ${y - 10}h16v12h-16Z`, fillOpacity: round3(cumulative[index]), name: `key-level-${level}` });
      items.push({ type: 'text', role: 'legend-text', x: x + 22, y, text: `≥ ${roundLevel(level)}σ`, anchor: 'start', name: `key-level-${level}-label` });
      y += 15;
    });
    if (levels.length < g.levels.length) {
      items.push({ type: 'text', role: 'caption', x, y: y + 2, text: `${levels.length} of ${g.levels.length} levels drawn`, anchor: 'start', name: 'key-levels-note' });
      y += 15;
    }
  }
  // The title only when there is something to name; `bottom` lets the drawing end below the key.
  const keyed = items.length > 0;
  const bottom = keyed ? Math.max(y, ...items.map((i) => (i.type === 'text' ? i.y : (i.at?.y ?? 0)))) : 0;
  return { id: 'legend', clip: false, items: keyed ? [title, ...items] : [], bottom };
}

/**
 * The layout with its height cut to what is drawn: never below the net and its caption, and
 * (narrow layout) just below the key instead of the room kept for the longest key.
 * @example fitHeight(NET_LAYOUT_NARROW, 480).height // 492
 */
export function fitHeight(layout: NetLayout, legendBottom: number): NetLayout {
  const minimum = layout.captionY + 6;
  const height = layout.contourKey ? Math.max(minimum, Math.ceil(legendBottom + 12)) : layout.height;
  return height === layout.height ? layout : { ...layout, height };
}

/**
 * A one-sentence summary of the net for screen readers (the SVG's aria-label).
 * @example netAriaLabel(analysis, 120, 3, 'equal-area') // 'Equal-area net, lower hemisphere: 120 poles, 3 lines; fold axis 040/25, 95% cone 3.1°.'
 */
export function netAriaLabel(analysis: FoldAnalysis | null, poles: number, lines: number, net: NetKind): string {
  const head = `${net === 'equal-area' ? 'Equal-area' : 'Equal-angle'} net, lower hemisphere: ${formatCount(poles).text} pole${poles === 1 ? '' : 's'}, ${formatCount(lines).text} line${lines === 1 ? '' : 's'}`;
  if (!analysis || analysis.n === 0) return `${head}; no fold axis (no planes).`;
  if (!analysis.axis) {
    const parallel = analysis.warnings.some((w) => w.code === 'parallel-planes');
    return `${head}; no fold axis${parallel ? ' (all planes parallel)' : ''}.`;
  }
  const cone = analysis.cone95 !== null && Number.isFinite(analysis.cone95) ? `, 95% cone ${formatAngle(analysis.cone95).text}` : '';
  return `${head}; fold axis ${formatLine(analysis.axis).text}${cone}.`;
}

function round3(v: number): number {
  return Math.round(v * 1000) / 1000;
}

function roundLevel(v: number): string {
  return String(Math.round(v * 100) / 100);
}
