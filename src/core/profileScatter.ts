/**
 * How well points in a profile lie on ONE smooth curve.
 *
 * Projected down the right axis, the traces of one surface of a cylindrical fold collapse onto
 * one curve, however many times the surface crosses the ground; projected along a wrong axis,
 * the pieces land beside one another and the points form a band. This module measures the
 * band's thickness, with no knowledge of the curve:
 *
 * For each point p, the neighbours within `radius` (p included) get tricube weights
 * w = (1 - (d/r)^3)^3; their weighted principal direction gives a local frame (s along,
 * t across, origin p); a weighted least-squares quadratic t = c0 + c1 s + c2 s^2 is fitted and
 * the residual of p is |c0|, its distance across from the local curve. This is a local
 * quadratic regression with tricube weights as in LOWESS (Cleveland 1979, "Robust locally
 * weighted regression and smoothing scatterplots", JASA 74, 829-836; from memory), in a frame
 * turned to the local direction so that steep limbs and hinges fit as well as flat ones.
 *
 * profileScatter = RMS of the residuals, in the units of the points (metres). For points
 * exactly on a straight line it is 0; on a smooth curve it is small (the quadratic absorbs the
 * curvature); for a band of width w it approaches the band's standard deviation across.
 * Points with fewer than `minNeighbours` neighbours within the radius get no residual (NaN)
 * and are left out of the RMS.
 *
 * What it can and cannot see: a wrong axis only shows where pieces of a surface's trace that lie
 * at different depths along the axis cover the same part of the profile (a trace crossing a
 * valley in a V, separate outcrops of one surface); there they land side by side instead of on
 * top of one another. A single trace that crosses the fold train once projects to a smooth
 * curve along ANY axis, so it cannot tell axes apart on its own.
 */

/** Options of the scatter measure. */
export interface ScatterOptions {
  /**
   * Neighbourhood radius, in the units of the points. Default: 1/40 of the diagonal of the
   * points' bounding box, small enough for a hinge of a profile a few wavelengths long to fit a
   * quadratic. When comparing axes, pass the SAME radius for each.
   */
  readonly radius?: number;
  /** Fewest neighbours (the point included) for a residual; default 6, at least 4. */
  readonly minNeighbours?: number;
}

/** The scatter measure with the numbers behind it. */
export interface ScatterDetail {
  /** RMS of the residuals used (NaN when none could be computed). */
  readonly rms: number;
  /** Residual of each point, NaN where it had too few neighbours. */
  readonly residuals: Float64Array;
  /** How many points had a residual. */
  readonly used: number;
  readonly radius: number;
}

/**
 * RMS distance of 2D points (flat [x0, y0, x1, y1, ...]) from a local smoothing curve; see the
 * module comment. Small when the points form one continuous curve.
 * @example profileScatter(new Float64Array([0, 0, 1, 1, 2, 2, 3, 3, 4, 4, 5, 5]), { radius: 10 }) // 0
 */
export function profileScatter(points: Float64Array, options: ScatterOptions = {}): number {
  return profileScatterDetail(points, options).rms;
}

/**
 * {@link profileScatter} with every residual, the count used and the radius.
 * @example profileScatterDetail(points).residuals[0]
 */
export function profileScatterDetail(points: Float64Array, options: ScatterOptions = {}): ScatterDetail {
  if (points.length % 2 !== 0) throw new RangeError(`profileScatter: ${points.length} numbers is not a list of x, y pairs`);
  const n = points.length / 2;
  for (let i = 0; i < points.length; i++) {
    if (!Number.isFinite(points[i])) throw new RangeError(`profileScatter: point ${(i >> 1) + 1} has a non-finite ${i % 2 === 0 ? 'x' : 'y'} (${points[i]})`);
  }
  const minNeighbours = options.minNeighbours ?? 6;
  if (!(Number.isInteger(minNeighbours) && minNeighbours >= 4)) throw new RangeError(`minNeighbours ${String(minNeighbours)}: expected a whole number of at least 4`);
  let minX = Infinity;
  let minY = Infinity;
  let maxX = -Infinity;
  let maxY = -Infinity;
  for (let i = 0; i < n; i++) {
    minX = Math.min(minX, points[2 * i]);
    maxX = Math.max(maxX, points[2 * i]);
    minY = Math.min(minY, points[2 * i + 1]);
    maxY = Math.max(maxY, points[2 * i + 1]);
  }
  const radius = options.radius ?? Math.hypot(maxX - minX, maxY - minY) / 40;
  if (options.radius !== undefined && !(radius > 0 && Number.isFinite(radius))) throw new RangeError(`profileScatter: radius ${String(radius)} is not a positive distance`);
  const residuals = new Float64Array(n).fill(Number.NaN);
  if (n === 0 || !(radius > 0)) return { rms: Number.NaN, residuals, used: 0, radius };

  const grid = buildGrid(points, minX, minY, radius);
  const r2 = radius * radius;
  let sum = 0;
  let used = 0;
  const nbr: number[] = [];
  for (let i = 0; i < n; i++) {
    const px = points[2 * i];
    const py = points[2 * i + 1];
    nbr.length = 0;
    // Cells are at least `radius` wide, so the 3 x 3 block around p holds every neighbour.
    const cx = Math.min(grid.cols - 1, Math.floor((px - minX) / grid.cell));
    const cy = Math.min(grid.rows - 1, Math.floor((py - minY) / grid.cell));
    for (let gy = cy - 1; gy <= cy + 1; gy++) {
      if (gy < 0 || gy >= grid.rows) continue;
      for (let gx = cx - 1; gx <= cx + 1; gx++) {
        if (gx < 0 || gx >= grid.cols) continue;
        const cell = gy * grid.cols + gx;
        for (let k = grid.start[cell]; k < grid.start[cell + 1]; k++) {
          const j = grid.items[k];
          const dx = points[2 * j] - px;
          const dy = points[2 * j + 1] - py;
          if (dx * dx + dy * dy <= r2) nbr.push(j);
        }
      }
    }
    if (nbr.length < minNeighbours) continue;
    const r = localResidual(points, px, py, nbr, radius);
    if (Number.isFinite(r)) {
      residuals[i] = r;
      sum += r * r;
      used++;
    }
  }
  return { rms: used > 0 ? Math.sqrt(sum / used) : Number.NaN, residuals, used, radius };
}

/** Points bucketed in square cells of side `cell` (compressed rows: start[c]..start[c+1] in items). */
function buildGrid(points: Float64Array, minX: number, minY: number, cell: number) {
  const n = points.length / 2;
  let maxX = minX;
  let maxY = minY;
  for (let i = 0; i < n; i++) {
    maxX = Math.max(maxX, points[2 * i]);
    maxY = Math.max(maxY, points[2 * i + 1]);
  }
  // Few points spread far in a tiny radius would need too many cells: use fewer, larger ones.
  const limit = 4 * n + 16;
  while ((Math.floor((maxX - minX) / cell) + 1) * (Math.floor((maxY - minY) / cell) + 1) > limit) cell *= 2;
  const cols = Math.floor((maxX - minX) / cell) + 1;
  const rows = Math.floor((maxY - minY) / cell) + 1;
  const cellOf = new Int32Array(n);
  const start = new Int32Array(cols * rows + 1);
  for (let i = 0; i < n; i++) {
    const c = Math.min(rows - 1, Math.floor((points[2 * i + 1] - minY) / cell)) * cols + Math.min(cols - 1, Math.floor((points[2 * i] - minX) / cell));
    cellOf[i] = c;
    start[c + 1]++;
  }
  for (let c = 0; c < cols * rows; c++) start[c + 1] += start[c];
  const fill = start.slice(0, cols * rows);
  const items = new Int32Array(n);
  for (let i = 0; i < n; i++) items[fill[cellOf[i]]++] = i;
  return { cols, rows, start, items, cell };
}

/** |c0| of the tricube-weighted local quadratic through the neighbours, in their principal frame. */
function localResidual(points: Float64Array, px: number, py: number, nbr: readonly number[], radius: number): number {
  // Weighted mean and covariance for the principal direction.
  let sw = 0;
  let mx = 0;
  let my = 0;
  const w = new Float64Array(nbr.length);
  for (let k = 0; k < nbr.length; k++) {
    const j = nbr[k];
    const d = Math.hypot(points[2 * j] - px, points[2 * j + 1] - py) / radius;
    const q = 1 - d * d * d;
    w[k] = q * q * q;
    sw += w[k];
    mx += w[k] * (points[2 * j] - px);
    my += w[k] * (points[2 * j + 1] - py);
  }
  if (!(sw > 0)) return Number.NaN;
  mx /= sw;
  my /= sw;
  let sxx = 0;
  let sxy = 0;
  let syy = 0;
  for (let k = 0; k < nbr.length; k++) {
    const j = nbr[k];
    const dx = points[2 * j] - px - mx;
    const dy = points[2 * j + 1] - py - my;
    sxx += w[k] * dx * dx;
    sxy += w[k] * dx * dy;
    syy += w[k] * dy * dy;
  }
  // Major axis of a 2 x 2 symmetric matrix: angle 0.5·atan2(2 sxy, sxx - syy) (common practice).
  const theta = 0.5 * Math.atan2(2 * sxy, sxx - syy);
  const ex = Math.cos(theta);
  const ey = Math.sin(theta);
  // Weighted normal equations of t = c0 + c1 s + c2 s^2.
  let m00 = 0, m01 = 0, m02 = 0, m11 = 0, m12 = 0, m22 = 0, b0 = 0, b1 = 0, b2 = 0;
  for (let k = 0; k < nbr.length; k++) {
    const j = nbr[k];
    const dx = points[2 * j] - px;
    const dy = points[2 * j + 1] - py;
    // Scaled by the radius so the matrix stays well conditioned whatever the units.
    const s = (dx * ex + dy * ey) / radius;
    const t = (-dx * ey + dy * ex) / radius;
    const wk = w[k];
    const s2 = s * s;
    m00 += wk;
    m01 += wk * s;
    m02 += wk * s2;
    m11 += wk * s2;
    m12 += wk * s2 * s;
    m22 += wk * s2 * s2;
    b0 += wk * t;
    b1 += wk * t * s;
    b2 += wk * t * s2;
  }
  const c0 = solve3(m00, m01, m02, m11, m12, m22, b0, b1, b2);
  if (Number.isFinite(c0)) return Math.abs(c0) * radius;
  // Too few distinct positions along the curve for a quadratic: fall back to a straight line.
  const det = m00 * m11 - m01 * m01;
  if (!(Math.abs(det) > 1e-12 * m00 * m00)) return Number.NaN;
  return (Math.abs(b0 * m11 - b1 * m01) / det) * radius;
}

/** First unknown of a symmetric 3 x 3 system by Cramer's rule; NaN when (nearly) singular. */
function solve3(a: number, b: number, c: number, d: number, e: number, f: number, y0: number, y1: number, y2: number): number {
  // | a b c |       | y0 |
  // | b d e | x  =  | y1 |
  // | c e f |       | y2 |
  const det = a * (d * f - e * e) - b * (b * f - e * c) + c * (b * e - d * c);
  const scale = a * d * f;
  if (!(Math.abs(det) > 1e-10 * Math.abs(scale)) || scale === 0) return Number.NaN;
  const det0 = y0 * (d * f - e * e) - b * (y1 * f - e * y2) + c * (y1 * e - d * y2);
  return det0 / det;
}
