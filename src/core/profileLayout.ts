/**
 * Laying out a profile for drawing at true scale: one scale for both axes, a frame with
 * margins, a scale bar of a round length, and runs of consecutive usable vertices so a line
 * is broken (never bridged) where vertices are left out. Numbers only: the drawing itself is
 * done by a writer outside src/core.
 */

/** An extent in profile metres. */
export interface Extent {
  readonly minX: number;
  readonly minY: number;
  readonly maxX: number;
  readonly maxY: number;
}

/** Where and how big to draw. */
export interface ProfileLayout {
  /** Drawing units (px) per metre, the same across and up: true scale. */
  readonly scale: number;
  /** The extent drawn, in metres (the data plus padding). */
  readonly extent: Extent;
  /** The plot area in drawing units. */
  readonly plot: { readonly left: number; readonly top: number; readonly width: number; readonly height: number };
  /** Scale bar: a round length in metres and its drawn length. */
  readonly scaleBar: { readonly metres: number; readonly length: number };
}

/** Layout options, in drawing units. */
export interface LayoutOptions {
  /** Largest plot width. Default 900. */
  readonly maxWidth?: number;
  /** Largest plot height. Default 600. */
  readonly maxHeight?: number;
  /** Left and top offset of the plot area. Default 40. */
  readonly margin?: number;
  /** Padding around the data as a fraction of the larger span. Default 0.04. */
  readonly padding?: number;
}

/**
 * The extent of the finite (x', y') of profile triples (x', y', depth), or null when none is finite.
 * @example extentOfTriples(new Float64Array([0, 0, 5, 10, 20, 7])) // { minX: 0, minY: 0, maxX: 10, maxY: 20 }
 */
export function extentOfTriples(xyd: Float64Array, into: Extent | null = null): Extent | null {
  let minX = into?.minX ?? Infinity;
  let minY = into?.minY ?? Infinity;
  let maxX = into?.maxX ?? -Infinity;
  let maxY = into?.maxY ?? -Infinity;
  for (let i = 0; i + 2 < xyd.length; i += 3) {
    const x = xyd[i];
    const y = xyd[i + 1];
    if (!Number.isFinite(x) || !Number.isFinite(y)) continue;
    if (x < minX) minX = x;
    if (x > maxX) maxX = x;
    if (y < minY) minY = y;
    if (y > maxY) maxY = y;
  }
  return minX <= maxX ? { minX, minY, maxX, maxY } : null;
}

/**
 * The largest length of the form 1, 2 or 5 × 10^k not above `max` (a round scale-bar length).
 * @example niceLength(730) // 500
 */
export function niceLength(max: number): number {
  if (!(max > 0 && Number.isFinite(max))) throw new RangeError(`niceLength: ${String(max)} is not a positive length`);
  const p = 10 ** Math.floor(Math.log10(max));
  // Rounding guards against 10^k computed a hair above max (log10(1000) is exact, others may not be).
  for (const m of [5, 2, 1]) if (m * p <= max * (1 + 1e-12)) return m * p;
  return p / 2;
}

/**
 * A true-scale layout of `extent` within the size limits; the scale bar is about a fifth of the
 * plot width.
 * @example layoutProfile({ minX: 0, minY: 0, maxX: 1000, maxY: 500 }).scale // px per metre
 */
export function layoutProfile(extent: Extent, options: LayoutOptions = {}): ProfileLayout {
  const maxWidth = options.maxWidth ?? 900;
  const maxHeight = options.maxHeight ?? 600;
  const margin = options.margin ?? 40;
  const padding = options.padding ?? 0.04;
  for (const [k, v] of Object.entries(extent)) if (!Number.isFinite(v)) throw new RangeError(`layoutProfile: extent ${k} is ${String(v)}; expected a finite number`);
  if (!(extent.maxX >= extent.minX && extent.maxY >= extent.minY)) throw new RangeError('layoutProfile: the extent is empty (max below min)');
  // A single point or a flat line still gets a drawable area.
  const span = Math.max(extent.maxX - extent.minX, extent.maxY - extent.minY, 1);
  const pad = span * padding;
  const padded: Extent = { minX: extent.minX - pad, minY: extent.minY - pad, maxX: extent.maxX + pad, maxY: extent.maxY + pad };
  const w = Math.max(padded.maxX - padded.minX, span * 0.02);
  const h = Math.max(padded.maxY - padded.minY, span * 0.02);
  const scale = Math.min(maxWidth / w, maxHeight / h);
  const plot = { left: margin, top: margin, width: w * scale, height: h * scale };
  const metres = niceLength(w / 5);
  return { scale, extent: { ...padded, maxX: padded.minX + w, maxY: padded.minY + h }, plot, scaleBar: { metres, length: metres * scale } };
}

/**
 * Drawing coordinates of a profile point (y grows downward in the drawing, upward in the profile).
 * @example toDrawing(layout, 0, 0) // [left, top + height] for a point at the lower left of the extent
 */
export function toDrawing(layout: ProfileLayout, x: number, y: number): [number, number] {
  return [layout.plot.left + (x - layout.extent.minX) * layout.scale, layout.plot.top + (layout.extent.maxY - y) * layout.scale];
}

/**
 * Runs [start, end) of consecutive kept items: where a vertex is left out (outside an area,
 * without a height) the line is broken there, never bridged. Runs of one vertex are kept.
 * @example keptRuns([1, 1, 0, 1]) // [[0, 2], [3, 4]]
 */
export function keptRuns(keep: ArrayLike<boolean | number>): [number, number][] {
  const runs: [number, number][] = [];
  let start = -1;
  for (let i = 0; i <= keep.length; i++) {
    const k = i < keep.length && Boolean(keep[i]);
    if (k && start < 0) start = i;
    if (!k && start >= 0) {
      runs.push([start, i]);
      start = -1;
    }
  }
  return runs;
}
