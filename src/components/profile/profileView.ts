/**
 * Where the profile sits in the panel's drawing and how metres map to drawing units.
 *
 * The mapping is one affine map per axis, X = sx·x + tx and Y = sy·y + ty, with sy = -ve·sx:
 * the same scale across and up (true scale) unless a vertical exaggeration ve is asked for,
 * and y up in the profile but down in SVG. The scale is fitted with core/profileLayout.ts
 * (layoutProfile: one scale for both axes, round scale-bar lengths from niceLength), then the
 * data is centred in the plot box. Pan and zoom (d3-zoom) compose a transform k, x, y on top:
 * X' = k·X + x, which is again such a map (applyZoom), so every helper works on either.
 */
import { layoutProfile, niceLength, type Extent } from '../../core/profileLayout';
import { normalizeAzimuth } from '../../core/math';

/** A rectangle in drawing units. */
export interface PlotBox {
  readonly left: number;
  readonly top: number;
  readonly width: number;
  readonly height: number;
}

/** Metres to drawing units: X = sx·x + tx, Y = sy·y + ty. */
export interface ProfileAffine {
  readonly sx: number;
  readonly tx: number;
  readonly sy: number;
  readonly ty: number;
}

/** A pan-and-zoom transform as d3-zoom gives it: X' = k·X + x, Y' = k·Y + y. */
export interface ZoomTransform {
  readonly k: number;
  readonly x: number;
  readonly y: number;
}

/** The drawing: its size, the plot box and where the key goes. */
export interface ProfileLayout {
  readonly width: number;
  readonly height: number;
  readonly plot: PlotBox;
  /** Top left of the key and its width. */
  readonly legend: { readonly x: number; readonly y: number; readonly width: number };
  /** Whether the key is below the plot (narrow panels). */
  readonly narrow: boolean;
}

/** Extent used when there is nothing to draw: 100 m about the origin. */
const EMPTY_EXTENT: Extent = { minX: -50, minY: -50, maxX: 50, maxY: 50 };

/**
 * The affine map that fits `extent` (metres) into `box` at one scale (times `verticalExaggeration`
 * up), centred, with `padding` (a fraction of the larger span) around the data.
 * @example fitAffine({ minX: 0, minY: 0, maxX: 1000, maxY: 500 }, { left: 0, top: 0, width: 500, height: 500 }).sx // 0.48...
 */
export function fitAffine(extent: Extent | null, box: PlotBox, verticalExaggeration = 1, padding = 0.04): ProfileAffine {
  const ve = checkedExaggeration(verticalExaggeration);
  const e = extent ?? EMPTY_EXTENT;
  const stretched: Extent = { minX: e.minX, maxX: e.maxX, minY: e.minY * ve, maxY: e.maxY * ve };
  const layout = layoutProfile(stretched, { maxWidth: box.width, maxHeight: box.height, margin: 0, padding });
  const s = layout.scale;
  const left = box.left + (box.width - layout.plot.width) / 2;
  const top = box.top + (box.height - layout.plot.height) / 2;
  return { sx: s, tx: left - layout.extent.minX * s, sy: -ve * s, ty: top + layout.extent.maxY * s };
}

/**
 * The map after a pan-and-zoom transform.
 * @example applyZoom({ sx: 1, tx: 0, sy: -1, ty: 100 }, { k: 2, x: 10, y: 0 }) // { sx: 2, tx: 10, sy: -2, ty: 200 }
 */
export function applyZoom(a: ProfileAffine, t: ZoomTransform): ProfileAffine {
  return { sx: t.k * a.sx, tx: t.k * a.tx + t.x, sy: t.k * a.sy, ty: t.k * a.ty + t.y };
}

/**
 * Drawing position of a profile point.
 * @example toScreen({ sx: 2, tx: 5, sy: -2, ty: 100 }, 10, 10) // [25, 80]
 */
export function toScreen(a: ProfileAffine, x: number, y: number): [number, number] {
  return [a.sx * x + a.tx, a.sy * y + a.ty];
}

/**
 * Profile metres of a drawing position (the inverse of {@link toScreen}).
 * @example fromScreen({ sx: 2, tx: 5, sy: -2, ty: 100 }, 25, 80) // [10, 10]
 */
export function fromScreen(a: ProfileAffine, X: number, Y: number): [number, number] {
  return [(X - a.tx) / a.sx, (Y - a.ty) / a.sy];
}

/**
 * A scale bar of a round length (1, 2 or 5 × 10^k metres) no longer than `maxLength` drawing units.
 * @example scaleBar({ sx: 0.2, tx: 0, sy: -0.2, ty: 0 }, 150) // { metres: 500, length: 100 }
 */
export function scaleBar(a: ProfileAffine, maxLength: number): { metres: number; length: number } {
  if (!(a.sx > 0 && Number.isFinite(a.sx))) throw new RangeError(`scaleBar: scale ${String(a.sx)} is not a positive number of drawing units per metre`);
  const metres = niceLength(maxLength / a.sx);
  return { metres, length: metres * a.sx };
}

/**
 * The vertical exaggeration of a map: |sy| / sx.
 * @example exaggerationOf({ sx: 1, tx: 0, sy: -2, ty: 0 }) // 2
 */
export function exaggerationOf(a: ProfileAffine): number {
  return Math.abs(a.sy) / a.sx;
}

/**
 * The layout of the drawing for data of `extent` shown with `verticalExaggeration`: a plot box
 * whose height follows the data's shape (within limits), the key beside it, or below it when
 * `narrow`. `legendHeight` is the height the key needs; `headingLines` the lines of the view
 * annotation over the plot (each moves the plot 16 units down).
 * @example profileLayout({ minX: 0, minY: 0, maxX: 3000, maxY: 1000 }, 1, false, 200).plot.width // 640
 */
export function profileLayout(extent: Extent | null, verticalExaggeration: number, narrow: boolean, legendHeight: number, headingLines = 1): ProfileLayout {
  const ve = checkedExaggeration(verticalExaggeration);
  const e = extent ?? EMPTY_EXTENT;
  const span = Math.max(e.maxX - e.minX, (e.maxY - e.minY) * ve, 1);
  // Padding as fitAffine adds it, so the plot box hugs the padded data.
  const w = e.maxX - e.minX + 0.08 * span;
  const h = (e.maxY - e.minY) * ve + 0.08 * span;
  const aspect = h / Math.max(w, 1e-9);
  const legend = Math.max(0, Number.isFinite(legendHeight) ? legendHeight : 0);
  const extra = 16 * Math.max(0, Math.round(Number.isFinite(headingLines) ? headingLines : 1) - 1);
  if (!narrow) {
    const plot = { left: 16, top: 66 + extra, width: 640, height: clampNumber(640 * aspect, 220, 470) };
    const height = Math.max(plot.top + plot.height + 34, plot.top + legend + 12);
    return { width: 900, height, plot, legend: { x: 680, y: plot.top, width: 206 }, narrow: false };
  }
  const plot = { left: 12, top: 72 + extra, width: 416, height: clampNumber(416 * aspect, 170, 420) };
  const legendY = plot.top + plot.height + 58;
  return { width: 440, height: legendY + legend + 12, plot, legend: { x: 12, y: legendY, width: 416 }, narrow: true };
}

/** The 16 points of the compass, clockwise from north (common practice). */
const COMPASS = ['N', 'NNE', 'NE', 'ENE', 'E', 'ESE', 'SE', 'SSE', 'S', 'SSW', 'SW', 'WSW', 'W', 'WNW', 'NW', 'NNW'] as const;

/**
 * The nearest of the 16 compass points to an azimuth.
 * @example compassPoint(165) // 'SSE'
 */
export function compassPoint(azimuth: number): string {
  if (!Number.isFinite(azimuth)) return '';
  return COMPASS[Math.round(normalizeAzimuth(azimuth) / 22.5) % 16];
}

/**
 * Which way the edges of the drawing face. Down-plunge: right is horizontal, 90° clockwise from
 * the trend; up is normal to the axis, leaning by the plunge toward the trend (downPlunge.ts).
 * Section: left is the start of the line and right its end; up is vertical.
 * @example edgeAzimuths({ trend: 75, plunge: 12 }, null) // { left: 345, right: 165, upLean: 12, upToward: 75 }
 */
export function edgeAzimuths(
  axis: { readonly trend: number; readonly plunge: number },
  sectionAzimuths: readonly number[] | null,
): { left: number; right: number; upLean: number; upToward: number } {
  if (sectionAzimuths && sectionAzimuths.length > 0) {
    return { left: normalizeAzimuth(sectionAzimuths[0] + 180), right: normalizeAzimuth(sectionAzimuths[sectionAzimuths.length - 1]), upLean: 0, upToward: 0 };
  }
  return { left: normalizeAzimuth(axis.trend - 90), right: normalizeAzimuth(axis.trend + 90), upLean: axis.plunge, upToward: normalizeAzimuth(axis.trend) };
}

function checkedExaggeration(ve: number): number {
  if (!(ve > 0 && Number.isFinite(ve))) throw new RangeError(`vertical exaggeration ${String(ve)} is not a positive number`);
  return ve;
}

function clampNumber(v: number, lo: number, hi: number): number {
  return Number.isFinite(v) ? Math.min(hi, Math.max(lo, v)) : lo;
}
