/**
 * Thinning by zoom, computed once on the CPU: for every point, the lowest whole zoom from
 * which it is drawn, so that at each zoom at most one point is drawn per cell of a grid whose
 * cells are a given number of screen pixels. The map layer then filters on that zoom.
 *
 * Why: MapLibre lays out every feature of a tile and only then lets the collision test drop
 * the ones that overlap. With 10^5 stations that is 10^5 labels laid out and tested on every
 * placement, and, zoomed out, more symbols in one tile than a symbol bucket can hold (65535).
 * A cell no wider and no taller than the smallest collision box of the marks never holds two
 * points whose marks could both be placed (their boxes overlap), so the pre-thinning removes
 * only marks the collision test would have rejected next to the one kept; the collision test
 * still runs on the rest. A point kept at one zoom is kept at every higher zoom (each zoom
 * starts from the points kept below it), so marks never blink out when zooming in.
 */

/** Side of MapLibre's world at zoom 0, in CSS px (the zoom of a map is defined on 512 px tiles). */
const WORLD_PX = 512;

/** What to thin: cell size per zoom and the zoom range. */
export interface ZoomThinningOptions {
  /** Lowest zoom considered; every point is drawn from here at the latest if kept. */
  readonly minZoom: number;
  /** From this whole zoom on every point is drawn (no thinning). */
  readonly fullZoom: number;
  /** Cell width and height in CSS px at a zoom (e.g. the smallest collision box of the marks at that zoom). */
  readonly cellPx: (zoom: number) => readonly [number, number];
}

/**
 * For each point (Web Mercator unit square, interleaved x, y; NaN for points not drawn), the
 * lowest whole zoom from which it is drawn: `minZoom` .. `fullZoom` for drawable points, and
 * Infinity for NaN points. Points earlier in the input win a cell at equal zoom, so the result
 * is the same on every run.
 * @example
 * thinningZooms(new Float64Array([0.5, 0.5, 0.5, 0.5]), { minZoom: 0, fullZoom: 3, cellPx: () => [10, 10] })
 * // Float64Array [0, 3]: two points on one spot share every cell until thinning stops
 */
export function thinningZooms(xy: Float64Array, options: ZoomThinningOptions): Float64Array {
  const { minZoom, fullZoom } = options;
  if (!(Number.isInteger(minZoom) && Number.isInteger(fullZoom) && minZoom <= fullZoom)) {
    throw new RangeError(`thinningZooms: minZoom ${minZoom} and fullZoom ${fullZoom} must be whole zooms with minZoom <= fullZoom`);
  }
  const n = xy.length >> 1;
  const from = new Float64Array(n).fill(fullZoom);
  let pending: number[] = [];
  for (let i = 0; i < n; i++) {
    if (Number.isNaN(xy[2 * i]) || Number.isNaN(xy[2 * i + 1])) from[i] = Infinity;
    else pending.push(i);
  }
  const kept: number[] = [];
  for (let z = minZoom; z < fullZoom && pending.length > 0; z++) {
    const [cw, ch] = options.cellPx(z);
    if (!(cw > 0 && ch > 0)) throw new RangeError(`thinningZooms: cell ${cw} × ${ch} px at zoom ${z}; expected positive sizes`);
    const world = WORLD_PX * 2 ** z;
    // column * rows + row is an exact integer key while the grid has fewer than 2^53 cells.
    const rows = Math.ceil(world / ch) + 1;
    if ((Math.ceil(world / cw) + 1) * rows > Number.MAX_SAFE_INTEGER) {
      throw new RangeError(`thinningZooms: a grid of ${cw} × ${ch} px cells at zoom ${z} has too many cells to number; thin to a lower fullZoom`);
    }
    const key = (i: number) => Math.floor((xy[2 * i] * world) / cw) * rows + Math.floor((xy[2 * i + 1] * world) / ch);
    const taken = new Set<number>();
    for (const i of kept) taken.add(key(i));
    const still: number[] = [];
    for (const i of pending) {
      const k = key(i);
      if (taken.has(k)) still.push(i);
      else {
        taken.add(k);
        from[i] = z;
        kept.push(i);
      }
    }
    pending = still;
  }
  return from;
}
