/**
 * The profile as a plain description of what to draw (a "scene"): layers of paths and text in
 * drawing units, each item tagged with a role that fixes its style (profileStyle.ts). The
 * component draws a scene with d3; the SVG export writes the same scene as a file. Building it
 * needs no DOM, so every position is checked in Node.
 *
 * Layers in `data` space are built with the map of the unzoomed view and drawn inside a group
 * that carries the pan-and-zoom transform (lines stay sharp: their strokes do not scale).
 * Layers in `screen` space (stations, markers, labels) are built with the zoomed map, so ticks
 * and dots keep their size. The export builds every layer with the zoomed map.
 */
import type { ProfileData, ProfileLineLayer } from '../../map/profileData';
import { exaggeratedAngle } from '../../core/apparentDip';
import { wrapText } from '../net/exportSvg';
import { formatCount } from '../net/format';
import { circleAt, c1, dotsPathData, ringsPathData, runsPathDataBinned, ticksPathData, xyPathData } from './profilePaths';
import { DOT_DIAMETER, TICK_HALF_LENGTH, contactStyle, distanceColour, type ProfileRole } from './profileStyle';
import { angleText, annotationText, axisMarkText, axisText, edgeLabels, metresText, subtitleText, veText } from './profileText';
import { scaleBar, toScreen, type PlotBox, type ProfileAffine, type ProfileLayout } from './profileView';

/** A path. `stroke`, `fill` and `dash` override the role's style (layer colours, ramp bins). */
export interface ScenePath {
  readonly type: 'path';
  readonly role: ProfileRole;
  readonly d: string;
  /** A stable name (tests and exports find items by it). */
  readonly name?: string;
  /** Tooltip text (data text: written as text only). */
  readonly title?: string;
  readonly stroke?: string;
  readonly fill?: string;
  readonly dash?: string;
}

/** A line of text. */
export interface SceneText {
  readonly type: 'text';
  readonly role: ProfileRole;
  readonly x: number;
  readonly y: number;
  readonly text: string;
  readonly anchor: 'start' | 'middle' | 'end';
  readonly name?: string;
}

export type SceneItem = ScenePath | SceneText;

/** A group of items. `clip`: clipped to the plot box; `space`: see the module comment. */
export interface SceneLayer {
  readonly id: string;
  readonly clip: boolean;
  readonly space: 'data' | 'screen';
  readonly items: readonly SceneItem[];
}

/** How lines and stations are coloured: by legend layer, or by distance along the axis. */
export type ColourBy = 'layer' | 'distance';

/** Which parts are drawn. */
export interface ProfileShow {
  readonly stations: boolean;
  readonly contacts: boolean;
  readonly faults: boolean;
  readonly topography: boolean;
}

export const DEFAULT_PROFILE_SHOW: ProfileShow = Object.freeze({ stations: true, contacts: true, faults: true, topography: true });

/** Number of colour steps of the distance ramp (one path per step and layer kind). */
export const DISTANCE_BINS = 8;

/**
 * Layers with more vertices than this are drawn solid: at that density a dash pattern cannot be
 * seen, and dashing 10^5 segments costs the browser seconds a frame (measured here).
 */
export const DASH_VERTEX_LIMIT = 20_000;

/**
 * Colour and dash of a contact layer as drawn (and keyed): by the name's place in the input
 * (`order`), so a name keeps its look in every area and mode; solid above DASH_VERTEX_LIMIT vertices.
 * @example layerStyle(data.lines[2]) // { colour: '#2e7d4a', dash: '6 3' } for the third name
 */
export function layerStyle(layer: ProfileLineLayer): { colour: string; dash: string } {
  const s = contactStyle(layer.order);
  return layer.xyd.length / 3 > DASH_VERTEX_LIMIT ? { colour: s.colour, dash: '' } : s;
}

/** Approximate width of a character of 11.5 px system sans in drawing units (measured in Chromium here). */
const CHAR_WIDTH = 6.3;

/**
 * The bin of a distance along the axis: DISTANCE_BINS equal steps between the smallest and
 * largest distance drawn (the middle bin when they are equal or unknown).
 * @example distanceBins([0, 80]).binOf(79) // 7
 */
export function distanceBins(range: readonly [number, number] | null): { bins: number; binOf: (along: number) => number; colour: (bin: number) => string } {
  const bins = DISTANCE_BINS;
  const lo = range?.[0] ?? 0;
  const hi = range?.[1] ?? 0;
  const span = hi - lo;
  const binOf = (v: number): number => (span > 0 && Number.isFinite(v) ? Math.min(bins - 1, Math.max(0, Math.floor(((v - lo) / span) * bins))) : Math.floor(bins / 2));
  return { bins, binOf, colour: (b) => distanceColour((b + 0.5) / bins) };
}

/**
 * The plot's face (background of the data area).
 * @example faceLayer(layout).items[0].name // 'plot-face'
 */
export function faceLayer(layout: ProfileLayout): SceneLayer {
  return { id: 'face', clip: false, space: 'screen', items: [{ type: 'path', role: 'face', d: rectPath(layout.plot), name: 'plot-face' }] };
}

/**
 * The plot's frame, drawn over the data.
 * @example frameLayer(layout).items[0].name // 'plot-frame'
 */
export function frameLayer(layout: ProfileLayout): SceneLayer {
  return { id: 'frame', clip: false, space: 'screen', items: [{ type: 'path', role: 'frame', d: rectPath(layout.plot), name: 'plot-frame' }] };
}

/**
 * The ground line of a section (empty in down-plunge mode or without a DEM).
 * @example topographyLayer(data, affine, DEFAULT_PROFILE_SHOW).items.length // 1 for a section with a DEM
 */
export function topographyLayer(data: ProfileData | null, a: ProfileAffine, show: ProfileShow, cull?: PlotBox): SceneLayer {
  const items: SceneItem[] = [];
  if (data?.topography && show.topography) {
    items.push({ type: 'path', role: 'topography', d: xyPathData(data.topography, a, cull ? { cull } : {}), name: 'topography', title: 'Ground surface (DEM)' });
  }
  return { id: 'topography', clip: true, space: 'data', items };
}

/**
 * Contacts and faults: by layer, one path per contact name and one for the faults; by distance,
 * one path per ramp step for contacts and one per step for faults.
 * @example linesLayer(data, affine, 'layer', DEFAULT_PROFILE_SHOW).items.map((i) => i.name) // ['contact-0', 'contact-1', 'faults']
 */
export function linesLayer(data: ProfileData | null, a: ProfileAffine, colourBy: ColourBy, show: ProfileShow, cull?: PlotBox): SceneLayer {
  const items: SceneItem[] = [];
  if (!data) return { id: 'lines', clip: true, space: 'data', items };
  const options = cull ? { cull } : {};
  const shown = (l: ProfileLineLayer): boolean => (l.kind === 'contact' ? show.contacts : show.faults);
  if (colourBy === 'layer') {
    let k = 0;
    for (const l of data.lines) {
      if (l.kind !== 'contact') continue;
      const style = layerStyle(l);
      const name = `contact-${k++}`;
      if (!shown(l)) continue;
      const d = runsPathDataBinned(l.xyd, l.runStarts, a, 1, () => 0, options)[0];
      items.push({ type: 'path', role: 'contact', d, name, title: l.name, stroke: style.colour, ...(style.dash !== '' && { dash: style.dash }) });
    }
    const faults = data.lines.filter((l) => l.kind === 'fault' && shown(l));
    if (faults.length > 0) {
      const d = faults.map((l) => runsPathDataBinned(l.xyd, l.runStarts, a, 1, () => 0, options)[0]).join('');
      items.push({ type: 'path', role: 'fault', d, name: 'faults', title: 'Faults' });
    }
    return { id: 'lines', clip: true, space: 'data', items };
  }
  const bins = distanceBins(data.alongRange);
  for (const kind of ['contact', 'fault'] as const) {
    const layers = data.lines.filter((l) => l.kind === kind && shown(l));
    if (layers.length === 0) continue;
    const paths = new Array<string>(bins.bins).fill('');
    for (const l of layers) runsPathDataBinned(l.xyd, l.runStarts, a, bins.bins, bins.binOf, options).forEach((d, b) => (paths[b] += d));
    paths.forEach((d, b) => {
      if (d !== '') items.push({ type: 'path', role: kind, d, name: `${kind}s-step-${b}`, stroke: bins.colour(b) });
    });
  }
  return { id: 'lines', clip: true, space: 'data', items };
}

/**
 * Stations: planes as apparent-dip ticks, lines as dots (over a white halo), planes without a
 * trace as open rings; by distance, one path of each per ramp step.
 * @example stationsLayer(data, affine, 'layer', DEFAULT_PROFILE_SHOW, layout.plot).items.map((i) => i.name) // ['ticks', 'dot-halo', 'dots']
 */
export function stationsLayer(data: ProfileData | null, a: ProfileAffine, colourBy: ColourBy, show: ProfileShow, cull?: PlotBox): SceneLayer {
  const items: SceneItem[] = [];
  if (!data || !show.stations || data.stations.index.length === 0) return { id: 'stations', clip: true, space: 'screen', items };
  const s = data.stations;
  const options = cull ? { cull } : {};
  const isLine = (k: number): boolean => s.isPlane[k] === 0;
  const isUntraced = (k: number): boolean => s.isPlane[k] === 1 && !Number.isFinite(s.tick[2 * k]);
  const add = (select: (k: number) => boolean, suffix: string, stroke?: string): void => {
    const colour = stroke ? { stroke } : {};
    const ticks = ticksPathData(s.xy, s.tick, a, TICK_HALF_LENGTH, select, options);
    if (ticks !== '') items.push({ type: 'path', role: 'tick', d: ticks, name: `ticks${suffix}`, ...colour });
    const rings = ringsPathData(s.xy, a, 3.2, (k) => select(k) && isUntraced(k), options);
    if (rings !== '') items.push({ type: 'path', role: 'untraced', d: rings, name: `untraced${suffix}`, ...colour });
    const dots = dotsPathData(s.xy, a, (k) => select(k) && isLine(k), options);
    if (dots !== '') {
      items.push({ type: 'path', role: 'dot-halo', d: dots, name: `dot-halo${suffix}` });
      items.push({ type: 'path', role: 'dot', d: dots, name: `dots${suffix}`, ...colour });
    }
  };
  if (colourBy === 'layer') add(() => true, '');
  else {
    const bins = distanceBins(data.alongRange);
    const bin = new Int8Array(s.along.length);
    for (let k = 0; k < bin.length; k++) bin[k] = bins.binOf(s.along[k]);
    for (let b = 0; b < bins.bins; b++) add((k) => bin[k] === b, `-step-${b}`, bins.colour(b));
  }
  return { id: 'stations', clip: true, space: 'screen', items };
}

/**
 * A ring on the station with input index `index` (nothing when it is not drawn).
 * @example highlightLayer(data, affine, 17).items[0]?.name // 'highlight'
 */
export function highlightLayer(data: ProfileData | null, a: ProfileAffine, index: number, role: 'highlight' | 'hover' = 'highlight'): SceneLayer {
  const items: SceneItem[] = [];
  const k = data && Number.isInteger(index) && index >= 0 ? data.stations.index.indexOf(index) : -1;
  if (data && k >= 0) {
    const [X, Y] = toScreen(a, data.stations.xy[2 * k], data.stations.xy[2 * k + 1]);
    if (Number.isFinite(X) && Number.isFinite(Y)) items.push({ type: 'path', role, d: circleAt(X, Y, role === 'highlight' ? 9 : 7), name: role });
  }
  return { id: role, clip: true, space: 'screen', items };
}

/**
 * The words and marks around the plot: the view line, the counts, the edge labels, the scale
 * bar (with the vertical exaggeration when there is one) and the axis mark.
 * @example annotationLayer(data, layout, affine, 1).items.find((i) => i.name === 'scale-text')
 */
export function annotationLayer(data: ProfileData | null, layout: ProfileLayout, a: ProfileAffine, ve: number): SceneLayer {
  const items: SceneItem[] = [];
  const p = layout.plot;
  const right = p.left + p.width;
  const bottom = p.top + p.height;
  if (!data) {
    items.push({ type: 'text', role: 'annotation', x: p.left, y: 20, text: 'Profile: no data yet', anchor: 'start', name: 'annotation' });
    return { id: 'annotations', clip: false, space: 'screen', items };
  }
  const heading = headingLines(data, ve, layout.narrow);
  heading.forEach((text, i) => items.push({ type: 'text', role: 'annotation', x: p.left, y: 20 + 16 * i, text, anchor: 'start', name: i === 0 ? 'annotation' : `annotation-${i}` }));
  items.push({ type: 'text', role: 'edge-label', x: p.left, y: 20 + 16 * heading.length + 2, text: subtitleText(data), anchor: 'start', name: 'subtitle' });

  const edges = edgeLabels(data);
  items.push({ type: 'text', role: 'edge-label', x: p.left + p.width / 2, y: p.top - 8, text: edges.up, anchor: 'middle', name: 'edge-up' });
  items.push({ type: 'text', role: 'edge-label', x: p.left, y: bottom + 20, text: edges.left, anchor: 'start', name: 'edge-left' });
  items.push({ type: 'text', role: 'edge-label', x: right, y: bottom + 20, text: edges.right, anchor: 'end', name: 'edge-right' });

  // Scale bar: centred under the plot (a second row on narrow panels, clear of the edge labels).
  const bar = scaleBar(a, Math.min(p.width / 4, 200));
  const barY = layout.narrow ? bottom + 40 : bottom + 16;
  const label = ve !== 1 ? `${metresText(bar.metres)} · ${veText(ve)}` : metresText(bar.metres);
  const x0 = p.left + p.width / 2 - (bar.length + 6 + label.length * CHAR_WIDTH) / 2;
  items.push({
    type: 'path',
    role: 'scale-bar',
    d: `M${c1(x0)} ${c1(barY)}H${c1(x0 + bar.length)}M${c1(x0)} ${c1(barY - 4)}V${c1(barY + 4)}M${c1(x0 + bar.length)} ${c1(barY - 4)}V${c1(barY + 4)}`,
    name: 'scale-bar',
    title: `Scale bar: ${metresText(bar.metres)} across${ve !== 1 ? `; heights stretched ${ve} times (${veText(ve)})` : ' and up (true scale)'}`,
  });
  items.push({ type: 'text', role: 'scale-text', x: x0 + bar.length + 6, y: barY + 4, text: label, anchor: 'start', name: 'scale-text' });

  items.push(...axisMark(data, p, ve));
  return { id: 'annotations', clip: false, space: 'screen', items };
}

/**
 * The view annotation over the plot, wrapped to the drawing's width (profileLayout makes room
 * for every line).
 * @example headingLines(data, 1, false) // ['Looking down-plunge toward 075°, plunge 12° · true scale']
 */
export function headingLines(data: ProfileData | null, ve: number, narrow: boolean): string[] {
  if (!data) return ['Profile: no data yet'];
  // Bold 13-unit text: about 7.8 units a character (measured in Chromium here).
  const width = Math.floor(((narrow ? 440 : 900) - (narrow ? 24 : 32)) / 7.8);
  return wrapText(annotationText(data, ve), Math.max(20, width));
}

/** The axis mark in the plot's top right corner, on a light halo. */
function axisMark(data: ProfileData, p: PlotBox, ve: number): SceneItem[] {
  const right = p.left + p.width;
  const section = data.mode === 'section' && data.section ? data.section : null;
  // A short line at the apparent plunge as drawn (steepened by the exaggeration) for a section;
  // ⊗, the axis seen end-on pointing away from the viewer, for a down-plunge view (common drafting sign).
  const alpha = section ? section.axisApparentPlunge[0] : 0;
  const drawn = section ? exaggeratedAngle(Number.isFinite(alpha) ? alpha : 0, ve) : undefined;
  const L = 30;
  const t = ((drawn === undefined ? 0 : Math.abs(drawn)) * Math.PI) / 180;
  const dx = (alpha >= 0 ? 1 : -1) * L * Math.cos(t);
  const dy = L * Math.sin(t);
  const glyphWidth = section ? Math.max(Math.abs(dx), 4) : 12;
  const glyphHeight = section ? Math.max(14, dy + 4) : 14;
  // The middle of the glyph; the text's baseline sits 4 units below it.
  const cy = p.top + 8 + glyphHeight / 2;
  const cx = right - 10 - glyphWidth / 2;
  let glyph: string;
  if (!section) {
    const r = 6;
    const q = r * 0.7;
    glyph = `${circleAt(cx, cy, r)}M${c1(cx - q)} ${c1(cy - q)}L${c1(cx + q)} ${c1(cy + q)}M${c1(cx - q)} ${c1(cy + q)}L${c1(cx + q)} ${c1(cy - q)}`;
  } else {
    const x1 = cx - dx / 2;
    const y1 = cy - dy / 2;
    const x2 = cx + dx / 2;
    const y2 = cy + dy / 2;
    // Arrow head at the down-plunge end: two strokes 6 units long, 25° either side of the line.
    const back = Math.atan2(y1 - y2, x1 - x2);
    const h1 = [x2 + 6 * Math.cos(back + 0.44), y2 + 6 * Math.sin(back + 0.44)];
    const h2 = [x2 + 6 * Math.cos(back - 0.44), y2 + 6 * Math.sin(back - 0.44)];
    glyph = `M${c1(x1)} ${c1(y1)}L${c1(x2)} ${c1(y2)}M${c1(h1[0])} ${c1(h1[1])}L${c1(x2)} ${c1(y2)}L${c1(h2[0])} ${c1(h2[1])}`;
  }
  const text = axisMarkText(data, ve, drawn);
  const textRight = right - 10 - glyphWidth - 8;
  const textWidth = text.length * CHAR_WIDTH;
  const halo = { left: textRight - textWidth - 6, top: p.top + 3, width: right - 4 - (textRight - textWidth - 6), height: glyphHeight + 10 };
  return [
    { type: 'path', role: 'scale-halo', d: rectPath(halo), name: 'axis-halo' },
    { type: 'path', role: 'axis-mark', d: glyph, name: 'axis-mark', title: `Fold axis ${axisText(data.axis)}` },
    { type: 'text', role: 'legend-text', x: textRight, y: cy + 4, text, anchor: 'end', name: 'axis-text' },
  ];
}

/** Options of {@link legendLayer}. */
export interface LegendOptions {
  readonly colourBy: ColourBy;
  readonly show: ProfileShow;
  readonly x: number;
  readonly y: number;
  readonly width: number;
}

/**
 * The key: contact layers (colour and dash) or the distance ramp, faults, ground line, station
 * symbols with their counts, and the axis. Returns the layer and the y of its bottom.
 * @example legendLayer(data, { colourBy: 'layer', show: DEFAULT_PROFILE_SHOW, x: 680, y: 66, width: 206 }).bottom
 */
export function legendLayer(data: ProfileData | null, o: LegendOptions): { layer: SceneLayer; bottom: number } {
  const items: SceneItem[] = [];
  const chars = Math.max(12, Math.floor((o.width - 34) / CHAR_WIDTH));
  let y = o.y + 10;
  const title = (text: string, name: string): void => {
    // Upper-case 10.5-unit bold text is about 7 units a character.
    wrapText(text.toUpperCase(), Math.max(12, Math.floor(o.width / 7))).forEach((line, i) => {
      items.push({ type: 'text', role: 'legend-title', x: o.x, y, text: line, anchor: 'start', name: i === 0 ? name : `${name}-${i}` });
      y += 14;
    });
    y += 2;
  };
  const entry = (swatch: (sy: number) => ScenePath[], text: string, name: string): void => {
    const lines = wrapText(text, chars);
    items.push(...swatch(y - 4));
    lines.forEach((line, i) => items.push({ type: 'text', role: 'legend-text', x: o.x + 32, y: y + 14 * i, text: line, anchor: 'start', name: i === 0 ? name : `${name}-${i}` }));
    y += 14 * lines.length + 5;
  };
  const lineSwatch = (role: ProfileRole, extra: Partial<ScenePath> = {}) => (sy: number): ScenePath[] => [
    { type: 'path', role, d: `M${c1(o.x)} ${c1(sy)}H${c1(o.x + 24)}`, ...extra },
  ];
  if (!data) {
    title('Key', 'key-title');
    items.push({ type: 'text', role: 'note', x: o.x, y, text: 'Nothing to show yet.', anchor: 'start', name: 'key-empty' });
    return { layer: { id: 'legend', clip: false, space: 'screen', items }, bottom: y + 6 };
  }
  title('Key', 'key-title');
  const contacts = data.lines.filter((l) => l.kind === 'contact');
  const hasFaults = data.lines.some((l) => l.kind === 'fault');
  if (o.colourBy === 'layer') {
    contacts.forEach((l, k) => {
      const s = layerStyle(l);
      entry(lineSwatch('contact', { stroke: s.colour, ...(s.dash !== '' && { dash: s.dash }), name: `key-contact-${k}-swatch` }), l.name, `key-contact-${k}`);
    });
  } else if (contacts.length > 0) {
    entry(lineSwatch('contact', { stroke: distanceColour(0.5), name: 'key-contacts-swatch' }), `Contacts (${contacts.length} layer${contacts.length === 1 ? '' : 's'})`, 'key-contacts');
  }
  if (hasFaults) entry(lineSwatch('fault', o.colourBy === 'distance' ? { stroke: distanceColour(0.5), name: 'key-faults-swatch' } : { name: 'key-faults-swatch' }), 'Faults', 'key-faults');
  if (data.topography) entry(lineSwatch('topography', { name: 'key-topography-swatch' }), 'Ground surface (DEM)', 'key-topography');
  const s = data.stations;
  let planes = 0;
  let lines = 0;
  let untraced = 0;
  for (let k = 0; k < s.isPlane.length; k++) {
    if (s.isPlane[k] === 0) lines++;
    else if (Number.isFinite(s.tick[2 * k])) planes++;
    else untraced++;
  }
  const tickLabel = data.mode === 'down-plunge' ? 'trace in the profile' : 'apparent dip';
  if (planes > 0) {
    entry((sy) => [{ type: 'path', role: 'tick', d: `M${c1(o.x + 5)} ${c1(sy + 4)}L${c1(o.x + 19)} ${c1(sy - 4)}`, name: 'key-tick-swatch' }], `Planes: ${tickLabel} (${formatCount(planes).text})`, 'key-ticks');
  }
  if (lines > 0) {
    entry(
      (sy) => [
        { type: 'path', role: 'dot-halo', d: `M${c1(o.x + 12)} ${c1(sy)}h0` },
        { type: 'path', role: 'dot', d: `M${c1(o.x + 12)} ${c1(sy)}h0`, name: 'key-dot-swatch' },
      ],
      `Lines: hinges, lineations (${formatCount(lines).text})`,
      'key-dots',
    );
  }
  if (untraced > 0) entry((sy) => [{ type: 'path', role: 'untraced', d: circleAt(o.x + 12, sy, 3.2), name: 'key-untraced-swatch' }], `Planes with no trace here (${formatCount(untraced).text})`, 'key-untraced');

  if (o.colourBy === 'distance') {
    y += 4;
    title(data.mode === 'down-plunge' ? 'Distance along the axis' : 'Distance from the section along the axis', 'key-ramp-title');
    const bins = distanceBins(data.alongRange);
    const w = Math.min(o.width, 200) / bins.bins;
    for (let b = 0; b < bins.bins; b++) {
      items.push({ type: 'path', role: 'legend-swatch', d: rectPath({ left: o.x + b * w, top: y - 8, width: w, height: 10 }), fill: bins.colour(b), stroke: 'none', name: `key-ramp-${b}` });
    }
    y += 16;
    const range = data.alongRange;
    const near = data.mode === 'down-plunge' ? 'near (up-plunge)' : 'up-plunge side';
    const far = data.mode === 'down-plunge' ? 'far (down-plunge)' : 'down-plunge side';
    items.push({ type: 'text', role: 'legend-text', x: o.x, y, text: range ? metresText(range[0]) : '—', anchor: 'start', name: 'key-ramp-min' });
    items.push({ type: 'text', role: 'legend-text', x: o.x + bins.bins * w, y, text: range ? metresText(range[1]) : '—', anchor: 'end', name: 'key-ramp-max' });
    y += 14;
    items.push({ type: 'text', role: 'note', x: o.x, y, text: near, anchor: 'start', name: 'key-ramp-near' });
    items.push({ type: 'text', role: 'note', x: o.x + bins.bins * w, y, text: far, anchor: 'end', name: 'key-ramp-far' });
    y += 18;
  }
  return { layer: { id: 'legend', clip: false, space: 'screen', items }, bottom: y };
}

/** Path data of a rectangle. */
function rectPath(b: PlotBox): string {
  return `M${c1(b.left)} ${c1(b.top)}H${c1(b.left + b.width)}V${c1(b.top + b.height)}H${c1(b.left)}Z`;
}
