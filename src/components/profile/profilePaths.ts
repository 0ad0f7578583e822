/**
 * SVG path data for the profile: linework runs, the ground line, apparent-dip ticks and dots.
 * Many items go into ONE path string per layer (or per colour bin), so 10^6 vertices and 10^5
 * stations make a handful of DOM nodes, not millions. Pure string builders, no DOM.
 *
 * Positions go through a {@link ProfileAffine} (profileView.ts). Segments and markers wholly
 * beyond one edge of an optional `cull` box are left out of the string (the pen is lifted),
 * which keeps a zoomed-in export small; what is drawn is unchanged because the plot is clipped
 * to that box anyway.
 */
import type { PlotBox, ProfileAffine } from './profileView';

/** Options shared by the builders. */
export interface PathOptions {
  /** Leave out what lies wholly beyond one edge of this box (plus `margin`). */
  readonly cull?: PlotBox;
  /** Extra room around `cull`, drawing units. Default 12. */
  readonly margin?: number;
}

/**
 * A coordinate with one decimal (a tenth of a drawing unit is below what a screen shows); no "-0".
 * @example c1(12.345) // '12.3'
 */
export function c1(v: number): string {
  const r = Math.round(v * 10) / 10;
  return String(r === 0 ? 0 : r);
}

/**
 * Writes path commands into a growing byte buffer, coordinates in tenths exactly as {@link c1}
 * writes them. For 10^6 vertices this is several times faster than concatenating strings,
 * because a number with a fraction is slow to turn into a string (measured here: about 1 s
 * against 3.5 s for 10^6 vertices).
 * @example const w = new PathWriter(); w.move(1, 2); w.line(3.25, -4); w.toString() // 'M1 2L3.3 -4'
 */
export class PathWriter {
  private buf = new Uint8Array(1 << 12);
  private p = 0;

  /** Bytes written so far. */
  get length(): number {
    return this.p;
  }

  /** "M x y". */
  move(x: number, y: number): void {
    this.command(77, x, y);
  }

  /** "L x y". */
  line(x: number, y: number): void {
    this.command(76, x, y);
  }

  /** "M x y h0": a zero-length segment, drawn as a dot by a round line cap. */
  dot(x: number, y: number): void {
    this.command(77, x, y);
    this.buf[this.p++] = 104; // h
    this.buf[this.p++] = 48; // 0
  }

  /** Appends text as it is (ASCII path data only). */
  raw(text: string): void {
    this.ensure(text.length);
    for (let i = 0; i < text.length; i++) this.buf[this.p++] = text.charCodeAt(i) & 0x7f;
  }

  toString(): string {
    return DECODER.decode(this.buf.subarray(0, this.p));
  }

  private command(letter: number, x: number, y: number): void {
    this.ensure(48);
    this.buf[this.p++] = letter;
    this.number(x);
    this.buf[this.p++] = 32;
    this.number(y);
  }

  private number(v: number): void {
    const buf = this.buf;
    let p = this.p;
    let t = Math.round(v * 10);
    // Math.round gives -0 for small negatives: written as 0, like c1.
    if (t < 0) {
      buf[p++] = 45;
      t = -t;
    }
    let whole = Math.floor(t / 10);
    const tenth = t - whole * 10;
    if (whole === 0) buf[p++] = 48;
    else {
      const start = p;
      while (whole > 0) {
        const q = Math.floor(whole / 10);
        buf[p++] = 48 + whole - q * 10;
        whole = q;
      }
      for (let a = start, b = p - 1; a < b; a++, b--) {
        const c = buf[a];
        buf[a] = buf[b];
        buf[b] = c;
      }
    }
    if (tenth !== 0) {
      buf[p++] = 46;
      buf[p++] = 48 + tenth;
    }
    this.p = p;
  }

  private ensure(extra: number): void {
    if (this.p + extra <= this.buf.length) return;
    const next = new Uint8Array(Math.max(this.buf.length * 2, this.p + extra));
    next.set(this.buf.subarray(0, this.p));
    this.buf = next;
  }
}

const DECODER = new TextDecoder();

/**
 * Path data of linework runs, one string per colour bin. `xyd` holds (x, y, along) triples,
 * `runStarts` the first vertex of each run and the total at the end. Each segment goes to the
 * bin `binOf(mean along of its ends)` (0 for every segment when `bins` is 1); a run is drawn
 * as one subpath per stretch of segments in the same bin. Non-finite vertices break the line.
 * A run of one vertex is a zero-length segment (a dot with round caps).
 * @example runsPathDataBinned(Float64Array.of(0, 0, 0, 10, 0, 1, 20, 0, 2), Int32Array.of(0, 3), { sx: 1, tx: 0, sy: -1, ty: 0 }, 2, (d) => d) // ['M0 0L10 0', 'M10 0L20 0']
 */
export function runsPathDataBinned(
  xyd: Float64Array,
  runStarts: Int32Array,
  a: ProfileAffine,
  bins: number,
  binOf: (along: number) => number,
  options: PathOptions = {},
): string[] {
  if (!(Number.isInteger(bins) && bins >= 1)) throw new RangeError(`runsPathData: ${String(bins)} bins; expected a whole number from 1`);
  const out = Array.from({ length: bins }, () => new PathWriter());
  const pen = new Int32Array(bins).fill(-1);
  const cull = cullTest(options);
  const n = xyd.length / 3;
  const { sx, tx, sy, ty } = a;
  for (let r = 0; r + 1 < runStarts.length; r++) {
    const start = Math.max(0, runStarts[r]);
    const end = Math.min(n, runStarts[r + 1]);
    if (end - start === 1) {
      const X = sx * xyd[3 * start] + tx;
      const Y = sy * xyd[3 * start + 1] + ty;
      if (!Number.isFinite(X) || !Number.isFinite(Y) || cull(X, Y, X, Y)) continue;
      const b = bins === 1 ? 0 : clampBin(binOf(xyd[3 * start + 2]), bins);
      out[b].dot(X, Y);
      pen[b] = -1;
      continue;
    }
    for (let v = start; v + 1 < end; v++) {
      const X0 = sx * xyd[3 * v] + tx;
      const Y0 = sy * xyd[3 * v + 1] + ty;
      const X1 = sx * xyd[3 * v + 3] + tx;
      const Y1 = sy * xyd[3 * v + 4] + ty;
      if (!Number.isFinite(X0) || !Number.isFinite(Y0) || !Number.isFinite(X1) || !Number.isFinite(Y1)) continue;
      if (cull(X0, Y0, X1, Y1)) continue;
      const b = bins === 1 ? 0 : clampBin(binOf((xyd[3 * v + 2] + xyd[3 * v + 5]) / 2), bins);
      if (pen[b] !== v) out[b].move(X0, Y0);
      out[b].line(X1, Y1);
      pen[b] = v + 1;
    }
  }
  return out.map((w) => w.toString());
}

/**
 * {@link runsPathDataBinned} with one bin: one path for all the runs.
 * @example runsPathData(Float64Array.of(0, 0, 0, 10, 0, 0), Int32Array.of(0, 2), { sx: 1, tx: 0, sy: -1, ty: 0 }) // 'M0 0L10 0'
 */
export function runsPathData(xyd: Float64Array, runStarts: Int32Array, a: ProfileAffine, options: PathOptions = {}): string {
  return runsPathDataBinned(xyd, runStarts, a, 1, () => 0, options)[0];
}

/**
 * Path data of a polyline given as (x, y) pairs, broken where a pair is not finite (the ground
 * line where the DEM has no height).
 * @example xyPathData(Float64Array.of(0, 0, 10, NaN, 20, 0), { sx: 1, tx: 0, sy: -1, ty: 0 }) // 'M0 0h0M20 0h0'
 */
export function xyPathData(xy: Float64Array, a: ProfileAffine, options: PathOptions = {}): string {
  const n = xy.length >> 1;
  const xyd = new Float64Array(3 * n);
  for (let i = 0; i < n; i++) {
    xyd[3 * i] = xy[2 * i];
    xyd[3 * i + 1] = xy[2 * i + 1];
  }
  // Runs of finite points, so a gap breaks the line instead of joining across it.
  const starts: number[] = [];
  let inRun = false;
  for (let i = 0; i < n; i++) {
    const ok = Number.isFinite(xy[2 * i]) && Number.isFinite(xy[2 * i + 1]);
    if (ok && !inRun) starts.push(i);
    if (!ok && inRun) starts.push(i);
    inRun = ok;
  }
  if (inRun) starts.push(n);
  // starts holds [s0, e0, s1, e1, ...]: turn into runStarts with the gaps left out.
  let d = '';
  for (let k = 0; k + 1 < starts.length; k += 2) d += runsPathData(xyd, Int32Array.of(starts[k], starts[k + 1]), a, options);
  return d;
}

/**
 * Drawing-unit ends of a tick through (x, y) with profile direction (dx, dy), `half` drawing
 * units each side. The direction is mapped by the affine map, so a vertical exaggeration
 * steepens the tick as it steepens the profile (tan α' = ve · tan α).
 * @example tickEnds(0, 0, 1, 0, { sx: 1, tx: 0, sy: -1, ty: 0 }, 5) // [-5, 0, 5, 0]
 */
export function tickEnds(x: number, y: number, dx: number, dy: number, a: ProfileAffine, half: number): [number, number, number, number] {
  const X = a.sx * x + a.tx;
  const Y = a.sy * y + a.ty;
  const ux = dx * a.sx;
  const uy = dy * a.sy;
  const len = Math.hypot(ux, uy);
  const k = len > 0 ? half / len : 0;
  return [X - ux * k, Y - uy * k, X + ux * k, Y + uy * k];
}

/**
 * One path of ticks for the stations k with `select(k)` true and a finite tick direction.
 * @example ticksPathData(Float64Array.of(0, 0), Float64Array.of(1, 0), { sx: 1, tx: 0, sy: -1, ty: 0 }, 5) // 'M-5 0L5 0'
 */
export function ticksPathData(
  xy: Float64Array,
  tick: Float64Array,
  a: ProfileAffine,
  half: number,
  select: (k: number) => boolean = () => true,
  options: PathOptions = {},
): string {
  const cull = cullTest(options);
  const w = new PathWriter();
  const n = xy.length >> 1;
  for (let k = 0; k < n; k++) {
    const dx = tick[2 * k];
    const dy = tick[2 * k + 1];
    if (!Number.isFinite(dx) || !Number.isFinite(dy) || !select(k)) continue;
    const [x0, y0, x1, y1] = tickEnds(xy[2 * k], xy[2 * k + 1], dx, dy, a, half);
    if (!Number.isFinite(x0) || !Number.isFinite(y0) || cull(x0, y0, x1, y1)) continue;
    w.move(x0, y0);
    w.line(x1, y1);
  }
  return w.toString();
}

/**
 * One path of dots (zero-length round-capped segments) for the stations k with `select(k)` true.
 * @example dotsPathData(Float64Array.of(1, 2), { sx: 1, tx: 0, sy: -1, ty: 0 }) // 'M1 -2h0'
 */
export function dotsPathData(xy: Float64Array, a: ProfileAffine, select: (k: number) => boolean = () => true, options: PathOptions = {}): string {
  const cull = cullTest(options);
  const w = new PathWriter();
  const n = xy.length >> 1;
  for (let k = 0; k < n; k++) {
    if (!select(k)) continue;
    const X = a.sx * xy[2 * k] + a.tx;
    const Y = a.sy * xy[2 * k + 1] + a.ty;
    if (!Number.isFinite(X) || !Number.isFinite(Y) || cull(X, Y, X, Y)) continue;
    w.dot(X, Y);
  }
  return w.toString();
}

/**
 * One path of small circles of radius r (two arcs each) for the stations k with `select(k)` true.
 * @example ringsPathData(Float64Array.of(0, 0), { sx: 1, tx: 0, sy: -1, ty: 0 }, 3) // 'M3 0A3 3 0 1 0 -3 0A3 3 0 1 0 3 0Z'
 */
export function ringsPathData(xy: Float64Array, a: ProfileAffine, r: number, select: (k: number) => boolean = () => true, options: PathOptions = {}): string {
  const cull = cullTest(options);
  let d = '';
  const n = xy.length >> 1;
  for (let k = 0; k < n; k++) {
    if (!select(k)) continue;
    const X = a.sx * xy[2 * k] + a.tx;
    const Y = a.sy * xy[2 * k + 1] + a.ty;
    if (!Number.isFinite(X) || !Number.isFinite(Y) || cull(X, Y, X, Y)) continue;
    d += circleAt(X, Y, r);
  }
  return d;
}

/**
 * A circle as path data (two arcs).
 * @example circleAt(0, 0, 1) // 'M1 0A1 1 0 1 0 -1 0A1 1 0 1 0 1 0Z'
 */
export function circleAt(X: number, Y: number, r: number): string {
  return `M${c1(X + r)} ${c1(Y)}A${c1(r)} ${c1(r)} 0 1 0 ${c1(X - r)} ${c1(Y)}A${c1(r)} ${c1(r)} 0 1 0 ${c1(X + r)} ${c1(Y)}Z`;
}

/** A test for "wholly beyond one edge of the cull box" (never true without a box). */
function cullTest(options: PathOptions): (x0: number, y0: number, x1: number, y1: number) => boolean {
  const box = options.cull;
  if (!box) return () => false;
  const m = options.margin ?? 12;
  const left = box.left - m;
  const right = box.left + box.width + m;
  const top = box.top - m;
  const bottom = box.top + box.height + m;
  return (x0, y0, x1, y1) => (x0 < left && x1 < left) || (x0 > right && x1 > right) || (y0 < top && y1 < top) || (y0 > bottom && y1 > bottom);
}

function clampBin(b: number, bins: number): number {
  return Number.isFinite(b) ? Math.min(bins - 1, Math.max(0, Math.floor(b))) : Math.floor(bins / 2);
}
