/**
 * The invented terrain: a smooth sum of ridges and hills, carved by wadis, sampled at the
 * centres of the DEM cells. Heights are rounded to centimetres and stored as Float32, and every
 * later step (contours, contacts, station elevations) uses exactly the stored values.
 */
import { FRAME, FRAME_HEIGHT, WADIS, type Segment, type WadiDesign } from './district';
import type { Random } from './prng';

/** The DEM grid: row 0 is the northern row, as in the GeoTIFF. */
export interface DemGrid {
  readonly cols: number;
  readonly rows: number;
  readonly cell: number;
  /** Elevations in metres, row-major from the north-west cell. */
  readonly values: Float32Array;
}

interface Bump {
  readonly x: number;
  readonly y: number;
  readonly height: number;
  readonly sigma: number;
}

/** Distance from (x, y) to a segment and the fraction t in [0, 1] of the nearest point along it. */
function nearestOnSegment(x: number, y: number, s: Segment): { distance: number; t: number } {
  const [ax, ay] = s.from;
  const [bx, by] = s.to;
  const dx = bx - ax;
  const dy = by - ay;
  const t = Math.max(0, Math.min(1, ((x - ax) * dx + (y - ay) * dy) / (dx * dx + dy * dy)));
  return { distance: Math.hypot(x - (ax + t * dx), y - (ay + t * dy)), t };
}

/**
 * Distance to a path and the arc-length fraction (0 at the start, 1 at the end) of its nearest point.
 * @example nearestOnPath(5, 3, [[0, 0], [10, 0]]) // {distance: 3, along: 0.5}
 */
export function nearestOnPath(x: number, y: number, path: readonly (readonly [number, number])[]): { distance: number; along: number } {
  const lengths = path.slice(1).map((p, i) => Math.hypot(p[0] - path[i][0], p[1] - path[i][1]));
  const total = lengths.reduce((a, b) => a + b, 0);
  let best = { distance: Infinity, along: 0 };
  let before = 0;
  for (let i = 1; i < path.length; i++) {
    const { distance, t } = nearestOnSegment(x, y, { from: path[i - 1], to: path[i] });
    if (distance < best.distance) best = { distance, along: (before + t * lengths[i - 1]) / total };
    before += lengths[i - 1];
  }
  return best;
}

const gauss = (d: number, sigma: number): number => Math.exp(-(d * d) / (2 * sigma * sigma));

/** Half-width (Gaussian sigma) of a wadi's valley, metres. */
const WADI_SIGMA = 150;

/**
 * Builds the analytic terrain function for one seed: fixed named landforms plus 18 small random
 * swells and hollows, then each wadi blended in: z <- z (1 - w) + floor w, w = exp(-d^2 / 2 sigma^2),
 * with the floor falling linearly along the wadi.
 * @example
 * const z = terrainFunction(createRandom(1)); z(3000, 2000) // metres above sea level
 */
export function terrainFunction(rnd: Random, wadis: readonly WadiDesign[] = WADIS): (x: number, y: number) => number {
  const bumps: Bump[] = [];
  for (let i = 0; i < 18; i++) {
    bumps.push({ x: rnd.uniform(0, 6000), y: rnd.uniform(0, 4000), height: rnd.gaussian(16), sigma: rnd.uniform(180, 450) });
  }
  const vardel: Segment = { from: [600, 2650], to: [2700, 3350] };
  const brellow: Segment = { from: [4300, 700], to: [5700, 1200] };
  return (x, y) => {
    let z = 700 + 0.012 * y + 4e-6 * (x - 3000) ** 2; // a broad trough along the fault, falling south
    z += 170 * gauss(nearestOnSegment(x, y, vardel).distance, 380);
    z += 215 * Math.exp(-((x - 4400) ** 2) / (2 * 620 ** 2) - ((y - 2500) ** 2) / (2 * 520 ** 2));
    z += 120 * gauss(Math.hypot(x - 1400, y - 900), 360);
    z += 95 * gauss(nearestOnSegment(x, y, brellow).distance, 320);
    for (const b of bumps) z += b.height * gauss(Math.hypot(x - b.x, y - b.y), b.sigma);
    for (const wadi of wadis) {
      const { distance, along } = nearestOnPath(x, y, wadi.path);
      const w = gauss(distance, WADI_SIGMA);
      const floor = wadi.floor[0] + (wadi.floor[1] - wadi.floor[0]) * along;
      z = z * (1 - w) + floor * w;
    }
    return z;
  };
}

/**
 * Local x of the centre of column i.
 * @example columnX(0) // 20
 */
export const columnX = (i: number): number => (i + 0.5) * FRAME.cell;
/**
 * Local y of the centre of row j (row 0 is the northern row).
 * @example rowY(0) // 3980
 */
export const rowY = (j: number): number => FRAME_HEIGHT - (j + 0.5) * FRAME.cell;

/**
 * Samples the terrain at cell centres, rounded to 0.01 m and to Float32.
 * @example sampleDem((x, y) => 700).values[0] // 700
 */
export function sampleDem(terrain: (x: number, y: number) => number): DemGrid {
  const values = new Float32Array(FRAME.cols * FRAME.rows);
  for (let j = 0; j < FRAME.rows; j++) {
    for (let i = 0; i < FRAME.cols; i++) values[j * FRAME.cols + i] = Math.round(terrain(columnX(i), rowY(j)) * 100) / 100;
  }
  return { cols: FRAME.cols, rows: FRAME.rows, cell: FRAME.cell, values };
}

/**
 * Bilinear interpolation of the stored DEM at local (x, y); clamps to the outermost cell centres.
 * @example demAt(grid, 3000, 2000)
 */
export function demAt(grid: DemGrid, x: number, y: number): number {
  const fi = Math.min(Math.max(x / grid.cell - 0.5, 0), grid.cols - 1);
  const fj = Math.min(Math.max((grid.rows * grid.cell - y) / grid.cell - 0.5, 0), grid.rows - 1);
  const i0 = Math.min(Math.floor(fi), grid.cols - 2);
  const j0 = Math.min(Math.floor(fj), grid.rows - 2);
  const tx = fi - i0;
  const ty = fj - j0;
  const v = (i: number, j: number): number => grid.values[j * grid.cols + i];
  return (
    (1 - tx) * (1 - ty) * v(i0, j0) + tx * (1 - ty) * v(i0 + 1, j0) + (1 - tx) * ty * v(i0, j0 + 1) + tx * ty * v(i0 + 1, j0 + 1)
  );
}
