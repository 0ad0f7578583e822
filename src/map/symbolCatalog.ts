import type { Line, LineKind, PlaneKind, PlaneMeasurement } from '../core/types';
import { LINE_KINDS, PLANE_KINDS, isLineKind, isPlaneKind } from '../core/types';
import type { Station } from '../core/station';
import type { Rgb, Shape } from './raster';

/**
 * The Foldlens symbol set: which mark a measurement gets and how it is turned.
 *
 * Every symbol image is drawn "north up": a plane's dip mark points up, a line's arrow points
 * up. The map then turns the image by the dip direction (planes) or trend (lines) with
 * map-aligned rotation, so marks stay true to north however the map is rotated or pitched.
 * The dip mark sits on the down-dip side of the strike line, as open geological map
 * standards prescribe (common practice); the shapes and colours themselves are our own.
 */

export type PlaneVariant = 'inclined' | 'horizontal' | 'vertical' | 'overturned';
export type LineVariant = 'plunging' | 'horizontal' | 'vertical';
export type HingeSense = 'antiform' | 'synform' | 'unknown';

/** A dip within this many degrees of 0 or 90 is drawn as horizontal or vertical (readings are whole degrees). */
export const LEVEL_TOLERANCE = 0.5;

/**
 * Colours per kind: distinct in hue and lightness, readable on light and dark basemaps behind a white halo.
 * @example
 * const [r, g, b] = KIND_COLORS.hinge;
 */
export const KIND_COLORS: Readonly<Record<PlaneKind | LineKind, Rgb>> = {
  bedding: [28, 43, 56],
  foliation: [118, 52, 140],
  cleavage: [24, 120, 88],
  joint: [150, 106, 12],
  fault: [196, 30, 36],
  vein: [120, 78, 45],
  'axial-plane': [70, 70, 200],
  contact: [60, 60, 60],
  plane: [60, 60, 60],
  lineation: [0, 110, 150],
  hinge: [214, 95, 0],
  intersection: [0, 140, 130],
  slickenline: [160, 40, 120],
  'mineral-lineation': [40, 100, 190],
  line: [60, 60, 60],
};

/**
 * Words for the legend.
 * @example
 * KIND_LABELS['axial-plane'] // 'Axial plane'
 */
export const KIND_LABELS: Readonly<Record<PlaneKind | LineKind, string>> = {
  bedding: 'Bedding',
  foliation: 'Foliation',
  cleavage: 'Cleavage',
  joint: 'Joint',
  fault: 'Fault plane',
  vein: 'Vein',
  'axial-plane': 'Axial plane',
  contact: 'Contact',
  plane: 'Other plane',
  lineation: 'Lineation',
  hinge: 'Fold hinge',
  intersection: 'Intersection lineation',
  slickenline: 'Slickenline',
  'mineral-lineation': 'Mineral lineation',
  line: 'Other line',
};

export const PLANE_VARIANT_LABELS: Readonly<Record<PlaneVariant, string>> = {
  inclined: 'inclined (mark on the down-dip side, dip in degrees)',
  horizontal: 'horizontal',
  vertical: 'vertical',
  overturned: 'overturned (looped mark)',
};

export const LINE_VARIANT_LABELS: Readonly<Record<LineVariant, string>> = {
  plunging: 'plunging (arrow points down-plunge, plunge in degrees)',
  horizontal: 'horizontal (both ways)',
  vertical: 'vertical',
};

/** Side length of every symbol image in CSS px. */
export const SYMBOL_SIZE = 44;

/** What a station is drawn as. */
export interface SymbolChoice {
  /** Image id in the map's style. */
  readonly image: string;
  /** Clockwise rotation from north in degrees, for `icon-rotate` with map alignment. */
  readonly rotation: number;
  /** Label text (dip or plunge in whole degrees), or '' for none. */
  readonly label: string;
}

export function planeVariant(plane: PlaneMeasurement): PlaneVariant {
  if (plane.overturned) return 'overturned';
  if (plane.dip < LEVEL_TOLERANCE) return 'horizontal';
  if (plane.dip > 90 - LEVEL_TOLERANCE) return 'vertical';
  return 'inclined';
}

export function lineVariant(line: Line): LineVariant {
  if (line.plunge < LEVEL_TOLERANCE) return 'horizontal';
  if (line.plunge > 90 - LEVEL_TOLERANCE) return 'vertical';
  return 'plunging';
}

export const planeImageId = (kind: PlaneKind, variant: PlaneVariant): string => `fl-sym/${kind}/${variant}`;
export const lineImageId = (kind: LineKind, variant: LineVariant, sense: HingeSense = 'unknown'): string =>
  kind === 'hinge' ? `fl-sym/${kind}/${variant}/${sense}` : `fl-sym/${kind}/${variant}`;
export const labelImageId = (text: string): string => `fl-num/${text}`;

/**
 * Every symbol image id the catalog can produce (labels excluded), e.g. to build a style
 * expression that covers them all.
 * @example allSymbolImageIds().includes('fl-sym/bedding/inclined') // true
 */
export function allSymbolImageIds(): string[] {
  const planes = PLANE_KINDS.flatMap((kind) => (['inclined', 'horizontal', 'vertical', 'overturned'] as const).map((v) => planeImageId(kind, v)));
  const lines = LINE_KINDS.flatMap((kind) =>
    (['plunging', 'horizontal', 'vertical'] as const).flatMap((v) =>
      kind === 'hinge' ? (['antiform', 'synform', 'unknown'] as const).map((sense) => lineImageId(kind, v, sense)) : [lineImageId(kind, v)],
    ),
  );
  return [...planes, ...lines];
}

/**
 * Chooses a station's symbol, its rotation and its label; null for stations that cannot be drawn
 * (unreadable rows are listed elsewhere, never drawn at a guessed attitude).
 * @example symbolFor({kind: 'bedding', plane: {dipDirection: 120, dip: 45}, ...}) // {image: 'fl-sym/bedding/inclined', rotation: 120, label: '45'}
 */
export function symbolFor(station: Pick<Station, 'kind' | 'plane' | 'line'>): SymbolChoice | null {
  const { kind } = station;
  if (kind && isPlaneKind(kind) && station.plane) {
    const variant = planeVariant(station.plane);
    const label = variant === 'inclined' || variant === 'overturned' ? String(Math.round(station.plane.dip)) : '';
    const rotation = variant === 'horizontal' ? 0 : station.plane.dipDirection;
    return { image: planeImageId(kind, variant), rotation, label };
  }
  if (kind && isLineKind(kind) && station.line) {
    const variant = lineVariant(station.line);
    const sense = station.line.sense ?? 'unknown';
    const label = variant === 'plunging' ? String(Math.round(station.line.plunge)) : '';
    const rotation = variant === 'vertical' ? 0 : station.line.trend;
    return { image: lineImageId(kind, variant, sense), rotation, label };
  }
  return null;
}

// ---------------------------------------------------------------------------------------------
// Shapes. Coordinates in CSS px, origin at the station, y up = the direction the symbol is turned to.

const STRIKE_HALF = 13;

function strikeLine(color: Rgb, width = 2.2): Shape {
  return { type: 'segment', a: [-STRIKE_HALF, 0], b: [STRIKE_HALF, 0], width, color };
}

/** The down-dip mark of each planar kind, drawn pointing up from the strike line. */
function dipMark(kind: PlaneKind, color: Rgb, side: 1 | -1): Shape[] {
  const s = side;
  switch (kind) {
    case 'foliation':
      return [{ type: 'polygon', points: [[-4, 0], [4, 0], [0, 8 * s]], color }];
    case 'cleavage':
      return [
        { type: 'segment', a: [-4, 0], b: [0, 8 * s], width: 1.6, color },
        { type: 'segment', a: [4, 0], b: [0, 8 * s], width: 1.6, color },
      ];
    case 'joint':
      return [
        { type: 'segment', a: [0, 0], b: [0, 7 * s], width: 2, color },
        { type: 'segment', a: [-3.5, 7 * s], b: [3.5, 7 * s], width: 2, color },
      ];
    case 'fault':
      return [
        { type: 'segment', a: [0, 0], b: [0, 6 * s], width: 2, color },
        { type: 'polygon', points: [[-3.5, 5 * s], [3.5, 5 * s], [0, 10 * s]], color },
      ];
    case 'vein':
      return [
        { type: 'segment', a: [0, 0], b: [0, 7 * s], width: 2, color },
        { type: 'disc', center: [0, 8.5 * s], radius: 2.2, color },
      ];
    case 'axial-plane':
      return [
        { type: 'segment', a: [-4, 0], b: [-4, 6 * s], width: 1.8, color },
        { type: 'segment', a: [4, 0], b: [4, 6 * s], width: 1.8, color },
      ];
    default:
      return [{ type: 'segment', a: [0, 0], b: [0, 7 * s], width: 2.2, color }];
  }
}

/** Shapes of a planar symbol. */
export function planeShapes(kind: PlaneKind, variant: PlaneVariant): Shape[] {
  const color = KIND_COLORS[kind];
  const strikeWidth = kind === 'fault' ? 3 : kind === 'vein' ? 1.4 : 2.2;
  switch (variant) {
    case 'horizontal':
      return [
        { type: 'ring', center: [0, 0], radius: 7, width: 1.8, color },
        { type: 'segment', a: [-7, 0], b: [7, 0], width: 1.6, color },
        { type: 'segment', a: [0, -7], b: [0, 7], width: 1.6, color },
      ];
    case 'vertical':
      return [strikeLine(color, strikeWidth), ...dipMark(kind, color, 1), ...dipMark(kind, color, -1)];
    case 'overturned':
      return [
        strikeLine(color, strikeWidth),
        { type: 'segment', a: [0, 0], b: [0, 6], width: 2, color },
        { type: 'ring', center: [0, 8.8], radius: 2.8, width: 1.6, color },
      ];
    case 'inclined':
      return [strikeLine(color, strikeWidth), ...dipMark(kind, color, 1)];
  }
}

const ARROW_TIP = 19;

function arrowHead(color: Rgb, y: number, open: boolean): Shape[] {
  return open
    ? [
        { type: 'segment', a: [-4, y - 6], b: [0, y], width: 1.8, color },
        { type: 'segment', a: [4, y - 6], b: [0, y], width: 1.8, color },
      ]
    : [{ type: 'polygon', points: [[-4, y - 7], [4, y - 7], [0, y]], color }];
}

/** Shapes of a linear symbol. */
export function lineShapes(kind: LineKind, variant: LineVariant, sense: HingeSense = 'unknown'): Shape[] {
  const color = KIND_COLORS[kind];
  if (variant === 'vertical') {
    return [
      { type: 'ring', center: [0, 0], radius: 6, width: 1.8, color },
      { type: 'disc', center: [0, 0], radius: 2.2, color },
    ];
  }
  const open = kind === 'intersection';
  const shapes: Shape[] = [{ type: 'segment', a: [0, variant === 'horizontal' ? -ARROW_TIP + 2 : 0], b: [0, ARROW_TIP - 2], width: 2, color }];
  shapes.push(...arrowHead(color, ARROW_TIP, open));
  if (variant === 'horizontal') shapes.push(...arrowHead(color, ARROW_TIP, open).map((s) => flipY(s)));
  if (kind === 'slickenline') shapes.push({ type: 'ring', center: [0, 0], radius: 2.6, width: 1.5, color });
  if (kind === 'mineral-lineation') shapes.push({ type: 'disc', center: [0, 7], radius: 2.2, color });
  if (kind === 'hinge') {
    // Antiform: chevron with its apex toward the plunge; synform: apex away; unknown: a bar.
    const y = 7;
    if (sense === 'antiform') shapes.push({ type: 'segment', a: [-5, y - 3], b: [0, y + 1], width: 1.8, color }, { type: 'segment', a: [5, y - 3], b: [0, y + 1], width: 1.8, color });
    else if (sense === 'synform') shapes.push({ type: 'segment', a: [-5, y + 1], b: [0, y - 3], width: 1.8, color }, { type: 'segment', a: [5, y + 1], b: [0, y - 3], width: 1.8, color });
    else shapes.push({ type: 'segment', a: [-5, y], b: [5, y], width: 1.8, color });
  }
  return shapes;
}

function flipY(shape: Shape): Shape {
  const f = (p: readonly [number, number]): [number, number] => [p[0], -p[1]];
  switch (shape.type) {
    case 'segment':
      return { ...shape, a: f(shape.a), b: f(shape.b) };
    case 'polygon':
      return { ...shape, points: shape.points.map(f) };
    default:
      return { ...shape, center: f(shape.center) };
  }
}

/** Parses an image id back into what it shows; null for ids that are not Foldlens symbols. */
export function parseImageId(id: string):
  | { readonly type: 'plane'; readonly kind: PlaneKind; readonly variant: PlaneVariant }
  | { readonly type: 'line'; readonly kind: LineKind; readonly variant: LineVariant; readonly sense: HingeSense }
  | { readonly type: 'label'; readonly text: string }
  | null {
  const parts = id.split('/');
  if (parts[0] === 'fl-num' && parts.length === 2 && /^[0-9]{1,3}$/.test(parts[1])) return { type: 'label', text: parts[1] };
  if (parts[0] !== 'fl-sym' || parts.length < 3) return null;
  const [, kind, variant, sense] = parts;
  if (isPlaneKind(kind) && ['inclined', 'horizontal', 'vertical', 'overturned'].includes(variant) && parts.length === 3) {
    return { type: 'plane', kind, variant: variant as PlaneVariant };
  }
  if (isLineKind(kind) && ['plunging', 'horizontal', 'vertical'].includes(variant)) {
    const s = (sense ?? 'unknown') as HingeSense;
    if (!['antiform', 'synform', 'unknown'].includes(s)) return null;
    return { type: 'line', kind, variant: variant as LineVariant, sense: s };
  }
  return null;
}
