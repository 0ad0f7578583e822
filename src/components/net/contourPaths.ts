/**
 * Density contours as SVG path data: d3-contour (marching squares) on the values of a
 * DensityGrid at its levels, each point taken back to net coordinates with contourPointToNet
 * and placed in the SVG frame. The grid runs one node past the primitive, so rings close
 * outside it; the renderer clips them to the primitive circle.
 */
import { contours } from 'd3';
import { contourPointToNet, type DensityGrid } from '../../core/density';
import { coord, type NetFrame } from './netPaths';

/** The region where the density is at or above `level` (multiples of sigma). */
export interface ContourBand {
  readonly level: number;
  /** Path data; draw with fill-rule evenodd (holes are separate rings). */
  readonly d: string;
}

/**
 * One path per contour level (the grid's levels, or `only` these), lowest level first, so
 * drawing them in order with a light fill darkens the net where the density is higher.
 * Levels whose region is empty are left out.
 * @example contourBands(kambGrid(poles), {cx: 200, cy: 200, r: 180})[0].level // 2
 */
export function contourBands(grid: DensityGrid, frame: NetFrame, only?: readonly number[]): ContourBand[] {
  const levels = (only ?? grid.levels).filter((l) => Number.isFinite(l));
  if (levels.length === 0) return [];
  if (grid.values.length !== grid.width * grid.height) {
    throw new RangeError(`contourBands: grid has ${grid.values.length} values; expected width × height = ${grid.width * grid.height}`);
  }
  const generator = contours().size([grid.width, grid.height]).thresholds(levels);
  const bands: ContourBand[] = [];
  for (const multi of generator(Array.from(grid.values))) {
    let d = '';
    for (const polygon of multi.coordinates) {
      for (const ring of polygon) {
        ring.forEach((point, i) => {
          const p = contourPointToNet(grid, point);
          d += `${i === 0 ? 'M' : 'L'}${coord(frame.cx + frame.r * p.x)} ${coord(frame.cy - frame.r * p.y)}`;
        });
        d += 'Z';
      }
    }
    if (d !== '') bands.push({ level: multi.value, d });
  }
  return bands;
}
