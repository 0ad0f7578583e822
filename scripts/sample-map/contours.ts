/**
 * Contour lines and filled regions from a grid with d3-contour (marching squares with linear
 * interpolation along cell edges), returned in local metres.
 *
 * d3-contour places grid value (i, j) at (i + 0.5, j + 0.5) and closes every ring along the grid
 * border (x = 0 or cols, y = 0 or rows). For filled regions that border is just the DEM frame
 * (pixel-is-area), so the regions tile the frame exactly; for lines the border vertices are
 * artefacts and are removed.
 */
import { contours } from 'd3';
import { FRAME, FRAME_HEIGHT } from './district';

export type XY = readonly [number, number];
export type Line = readonly XY[];
/** Polygon rings (outer first) in local metres. */
export type Rings = readonly (readonly XY[])[];

/** Grid coordinates of d3-contour (row 0 north) to local metres. */
const toLocal = (p: readonly number[]): XY => [p[0] * FRAME.cell, FRAME_HEIGHT - p[1] * FRAME.cell];

const isBorder = (p: readonly number[]): boolean => p[0] < 0.5 || p[0] > FRAME.cols - 0.5 || p[1] < 0.5 || p[1] > FRAME.rows - 0.5;

function regionInGridUnits(values: ArrayLike<number>, threshold: number): number[][][][] {
  const generator = contours().size([FRAME.cols, FRAME.rows]).thresholds([threshold]);
  return generator(Array.from(values))[0].coordinates as number[][][][];
}

/**
 * The region where values >= threshold, as polygons in local metres (clipped to the frame).
 * @example contourRegion(dem.values, 800) // polygons of ground above 800 m
 */
export function contourRegion(values: ArrayLike<number>, threshold: number): Rings[] {
  return regionInGridUnits(values, threshold).map((polygon) => polygon.map((ring) => ring.map(toLocal)));
}

/**
 * The contour lines at threshold, in local metres: region boundaries with the artificial border
 * runs removed; a ring that never touches the border stays closed.
 * @example contourLines(dem.values, 800)
 */
export function contourLines(values: ArrayLike<number>, threshold: number): Line[] {
  const lines: Line[] = [];
  for (const polygon of regionInGridUnits(values, threshold)) {
    for (const ring of polygon) {
      const open = ring.slice(0, -1); // d3 repeats the first vertex at the end
      const start = open.findIndex(isBorder);
      if (start < 0) {
        lines.push(ring.map(toLocal));
        continue;
      }
      // Rotate so the ring starts on the border; then every interior run is whole.
      const rotated = [...open.slice(start), ...open.slice(0, start)];
      let run: XY[] = [];
      for (const p of rotated) {
        if (isBorder(p)) {
          if (run.length >= 2) lines.push(run);
          run = [];
        } else run.push(toLocal(p));
      }
      if (run.length >= 2) lines.push(run);
    }
  }
  return lines;
}

/**
 * Keeps the parts of a polyline where side(p) >= 0, cutting at the crossing points found by
 * linear interpolation of side() along each segment.
 * @example clipLine([[0, 0], [10, 0]], ([x]) => 5 - x) // [[[0, 0], [5, 0]]]
 */
export function clipLine(line: Line, side: (p: XY) => number): Line[] {
  const out: Line[] = [];
  let run: XY[] = [];
  for (let i = 0; i < line.length; i++) {
    const p = line[i];
    const s = side(p);
    if (i > 0) {
      const q = line[i - 1];
      const sq = side(q);
      if ((sq >= 0) !== (s >= 0)) {
        const t = sq / (sq - s);
        const cut: XY = [q[0] + t * (p[0] - q[0]), q[1] + t * (p[1] - q[1])];
        run.push(cut);
        if (s < 0) {
          if (run.length >= 2) out.push(run);
          run = [];
        }
      }
    }
    if (s >= 0) run.push(p);
  }
  if (run.length >= 2) out.push(run);
  // A closed ring cut open: its last piece continues into its first.
  const closed = line.length > 2 && line[0][0] === line[line.length - 1][0] && line[0][1] === line[line.length - 1][1];
  if (closed && out.length > 1 && side(line[0]) >= 0) {
    const first = out.shift() as Line;
    const last = out.pop() as Line;
    out.push([...last, ...first.slice(1)]);
  }
  return out;
}
