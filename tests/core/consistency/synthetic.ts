/**
 * Seeded synthetic fold data with a known answer, for the consistency tests. Nothing here calls
 * the code under test: the geometry is written out from the definitions (REFERENCES.md
 * "Profiles": profile right u = (cos t, -sin t, 0), up v = (sin p sin t, sin p cos t, cos p) in
 * east-north-up), and every attitude is built so that its relation to the planted axis is exact
 * before noise is added.
 */
import { mulberry32 } from '../../helpers/prng';

export type V3 = [number, number, number];

/** North-east-down unit vector of a line (types.ts convention). */
export function ned(trend: number, plunge: number): V3 {
  const t = (trend * Math.PI) / 180;
  const p = (plunge * Math.PI) / 180;
  return [Math.cos(p) * Math.cos(t), Math.cos(p) * Math.sin(t), Math.sin(p)];
}

export const dot3 = (a: V3, b: V3): number => a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
export const cross3 = (a: V3, b: V3): V3 => [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];
export const unit3 = (a: V3): V3 => {
  const n = Math.hypot(a[0], a[1], a[2]);
  return [a[0] / n, a[1] / n, a[2] / n];
};
export const comb3 = (a: V3, s: number, b: V3, t: number): V3 => [a[0] * s + b[0] * t, a[1] * s + b[1] * t, a[2] * s + b[2] * t];

/** Trend/plunge (lower hemisphere) of a north-east-down vector. */
export function lineOf(v: V3): { trend: number; plunge: number } {
  const u = v[2] < 0 ? ([-v[0], -v[1], -v[2]] as V3) : v;
  const h = Math.hypot(u[0], u[1]);
  const plunge = (Math.atan2(u[2], h) * 180) / Math.PI;
  let trend = h < 1e-12 ? 0 : (Math.atan2(u[1], u[0]) * 180) / Math.PI;
  if (trend < 0) trend += 360;
  if (trend >= 360) trend -= 360;
  return { trend, plunge };
}

/** Dip direction/dip of the plane whose normal is v: pole trend + 180, dip = 90 - pole plunge. */
export function planeOfNormal(v: V3): { dipDirection: number; dip: number } {
  const pole = lineOf(v);
  return { dipDirection: (pole.trend + 180) % 360, dip: 90 - pole.plunge };
}

/** Two unit vectors at right angles to a (NED): the profile up direction (toward the zenith side) and the profile right. */
export function profileBasis(a: V3): { up: V3; right: V3 } {
  const h = Math.hypot(a[0], a[1]);
  // Profile right: horizontal, 90° clockwise from the trend (north-east-down: (-sin t, cos t, 0)).
  const right: V3 = h > 1e-12 ? [-a[1] / h, a[0] / h, 0] : [0, 1, 0];
  const up = unit3(cross3(right, a)); // normal to both, with z < 0 (upward) for a plunging axis
  return { up: up[2] <= 0 ? up : ([-up[0], -up[1], -up[2]] as V3), right };
}

/** A standard normal deviate (Box-Muller, common practice), redrawn beyond ±2.5. */
export function truncatedNormal(rnd: () => number): number {
  for (;;) {
    const z = Math.sqrt(-2 * Math.log(1 - rnd())) * Math.cos(2 * Math.PI * rnd());
    if (Math.abs(z) <= 2.5) return z;
  }
}

/**
 * Rotates v by a small random angle: a normal deviate of sigma degrees in each of two directions
 * normal to v, truncated at 2.5 sigma (redrawn beyond), so that clean readings stay provably within
 * 2.5·sqrt(2)·sigma of where they belong and within 2.5 sigma in any one direction.
 */
export function jitter(v: V3, sigmaDeg: number, rnd: () => number): V3 {
  if (sigmaDeg === 0) return v;
  const g = (): number => truncatedNormal(rnd);
  const { up, right } = profileBasis(v);
  const s = (sigmaDeg * Math.PI) / 180;
  return unit3(comb3(comb3(v, 1, up, s * g()), 1, right, s * g()));
}

/** A point at angular distance `angleDeg` from v, in a random direction about it. */
export function offAxis(v: V3, angleDeg: number, rnd: () => number): V3 {
  const { up, right } = profileBasis(v);
  const f = 2 * Math.PI * rnd();
  const t = (angleDeg * Math.PI) / 180;
  return unit3(comb3(v, Math.cos(t), comb3(up, Math.cos(f), right, Math.sin(f)), Math.sin(t)));
}

/** A station of the synthetic data sets. */
export interface SynthStation {
  readonly id: string;
  /** East, north metres. */
  readonly x: number;
  readonly y: number;
  readonly kind: 'bedding' | 'hinge';
  readonly plane?: { dipDirection: number; dip: number };
  readonly line?: { trend: number; plunge: number };
  /** Planted bad reading. */
  readonly bad: boolean;
  /** The domain the station belongs to (by construction). */
  readonly domain: string;
}

/** One cylindrical fold train. */
export interface FoldSpec {
  readonly axis: { trend: number; plunge: number };
  /** Limb dip swing in the profile, degrees (limbs dip up to ± this from the profile's horizontal). */
  readonly swing: number;
  readonly wavelength: number;
}

/**
 * Stations of a cylindrical fold: bedding normal n = cos φ·up + sin φ·right with φ = swing·sin(2π u/λ),
 * u the profile-right coordinate, so every pole is normal to the axis (exactly, before the noise:
 * sigma degrees across the girdle and along it, each truncated at 2.5 sigma, so a clean pole lies
 * at most 2.5 sigma off the girdle). Hinges are the axis plus noise. The first
 * `badPlanes`/`badLines` readings are planted 25-60° off the girdle / 30-60° off the axis.
 */
export function foldStations(options: {
  readonly seed: number;
  readonly n: number;
  readonly hinges: number;
  readonly box: readonly [number, number, number, number];
  readonly fold: (x: number, y: number) => FoldSpec & { readonly domain: string };
  readonly sigma?: number;
  readonly lineSigma?: number;
  readonly badPlanes?: number;
  readonly badLines?: number;
}): SynthStation[] {
  const rnd = mulberry32(options.seed);
  const [x0, y0, x1, y1] = options.box;
  const sigma = options.sigma ?? 2;
  const lineSigma = options.lineSigma ?? 3;
  const out: SynthStation[] = [];
  const total = options.n + options.hinges;
  for (let i = 0; i < total; i++) {
    const x = x0 + (x1 - x0) * rnd();
    const y = y0 + (y1 - y0) * rnd();
    const f = options.fold(x, y);
    const a = ned(f.axis.trend, f.axis.plunge);
    const id = `S${String(i + 1).padStart(4, '0')}`;
    if (i < options.n) {
      const bad = i < (options.badPlanes ?? 0);
      const t = (f.axis.trend * Math.PI) / 180;
      const u = x * Math.cos(t) - y * Math.sin(t);
      const s = (sigma * Math.PI) / 180;
      // Noise: e1 across the girdle (toward the axis), e2 along it, each truncated at 2.5 sigma.
      const e1 = s * truncatedNormal(rnd);
      const phi = ((f.swing * Math.PI) / 180) * Math.sin((2 * Math.PI * u) / f.wavelength) + s * truncatedNormal(rnd);
      const { up, right } = profileBasis(a);
      const n = bad ? offAxis(a, 90 - (25 + 35 * rnd()), rnd) : comb3(comb3(up, Math.cos(phi), right, Math.sin(phi)), Math.cos(e1), a, Math.sin(e1));
      out.push({ id, x, y, kind: 'bedding', plane: planeOfNormal(n), bad, domain: f.domain });
    } else {
      const bad = i - options.n < (options.badLines ?? 0);
      const l = bad ? offAxis(a, 30 + 30 * rnd(), rnd) : jitter(a, lineSigma, rnd);
      out.push({ id, x, y, kind: 'hinge', line: lineOf(l), bad, domain: f.domain });
    }
  }
  return out;
}

/** Flat x, y and north-east-down poles of the bedding stations. */
export function positionsAndPoles(stations: readonly SynthStation[]): { xy: Float64Array; poles: Float64Array; planes: SynthStation[] } {
  const planes = stations.filter((s) => s.plane);
  const xy = new Float64Array(2 * planes.length);
  const poles = new Float64Array(3 * planes.length);
  planes.forEach((s, i) => {
    xy[2 * i] = s.x;
    xy[2 * i + 1] = s.y;
    const v = ned((s.plane!.dipDirection + 180) % 360, 90 - s.plane!.dip);
    poles.set(v, 3 * i);
  });
  return { xy, poles, planes };
}

/**
 * A cylindrical contact surface over synthetic terrain, traced where it meets the ground.
 * Stratigraphic height (REFERENCES.md profile frame, east-north-up): F = v - A sin(2π u/λ), with
 * u = P·(cos t, -sin t, 0) and v = P·(sin p sin t, sin p cos t, cos p); the contact is F = level.
 * Terrain: z = base + relief·cos(2π x/valley)·(something varying along y) so that traces cross
 * valleys in Vs. The trace is found by marching squares on a grid of `cell` metres (linear
 * interpolation on cell edges), and the segments are chained into polylines.
 */
export function contactTraces(options: {
  readonly axis: { trend: number; plunge: number };
  readonly amplitude: number;
  readonly wavelength: number;
  readonly level: number;
  readonly box: readonly [number, number, number, number];
  readonly cell: number;
  readonly terrain: (x: number, y: number) => number;
}): Float64Array[] {
  const { axis, amplitude, wavelength, level, box, cell, terrain } = options;
  const t = (axis.trend * Math.PI) / 180;
  const p = (axis.plunge * Math.PI) / 180;
  const F = (x: number, y: number, z: number): number => {
    const u = x * Math.cos(t) - y * Math.sin(t);
    const v = x * Math.sin(p) * Math.sin(t) + y * Math.sin(p) * Math.cos(t) + z * Math.cos(p);
    return v - amplitude * Math.sin((2 * Math.PI * u) / wavelength) - level;
  };
  const [x0, y0, x1, y1] = box;
  const nx = Math.round((x1 - x0) / cell);
  const ny = Math.round((y1 - y0) / cell);
  const g = (i: number, j: number): number => {
    const x = x0 + i * cell;
    const y = y0 + j * cell;
    return F(x, y, terrain(x, y));
  };
  const values = new Float64Array((nx + 1) * (ny + 1));
  for (let j = 0; j <= ny; j++) for (let i = 0; i <= nx; i++) values[j * (nx + 1) + i] = g(i, j);
  const val = (i: number, j: number): number => values[j * (nx + 1) + i];
  // Edge keys: horizontal edge (i, j)-(i+1, j) = 2·(j·(nx+1)+i), vertical (i, j)-(i, j+1) = 2·(...)+1.
  const crossing = (key: number): [number, number, number] => {
    const base = key >> 1;
    const i = base % (nx + 1);
    const j = (base - i) / (nx + 1);
    const [i2, j2] = key & 1 ? [i, j + 1] : [i + 1, j];
    const a = val(i, j);
    const b = val(i2, j2);
    const s = a / (a - b);
    const x = x0 + (i + s * (i2 - i)) * cell;
    const y = y0 + (j + s * (j2 - j)) * cell;
    return [x, y, terrain(x, y)];
  };
  const hKey = (i: number, j: number): number => 2 * (j * (nx + 1) + i);
  const vKey = (i: number, j: number): number => 2 * (j * (nx + 1) + i) + 1;
  const links = new Map<number, number[]>();
  const link = (a: number, b: number): void => {
    for (const [p1, p2] of [[a, b], [b, a]]) {
      let l = links.get(p1);
      if (!l) links.set(p1, (l = []));
      l.push(p2);
    }
  };
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i < nx; i++) {
      const edges = [hKey(i, j), vKey(i + 1, j), hKey(i, j + 1), vKey(i, j)];
      const corners = [val(i, j), val(i + 1, j), val(i + 1, j + 1), val(i, j + 1)];
      const cut = edges.filter((_, k) => corners[k] > 0 !== corners[(k + 1) % 4] > 0);
      if (cut.length === 2) link(cut[0], cut[1]);
      else if (cut.length === 4) {
        // Saddle: pair the crossings by the sign of the cell centre (common practice in marching squares).
        const centre = (corners[0] + corners[1] + corners[2] + corners[3]) / 4;
        if (centre > 0 === corners[0] > 0) {
          link(cut[0], cut[3]);
          link(cut[1], cut[2]);
        } else {
          link(cut[0], cut[1]);
          link(cut[2], cut[3]);
        }
      }
    }
  }
  const used = new Set<number>();
  const pieces: Float64Array[] = [];
  const walk = (start: number): number[] => {
    const chain = [start];
    used.add(start);
    let prev = -1;
    let cur = start;
    for (;;) {
      const next = (links.get(cur) ?? []).find((k) => k !== prev && !used.has(k));
      if (next === undefined) break;
      chain.push(next);
      used.add(next);
      prev = cur;
      cur = next;
    }
    return chain;
  };
  const starts = [...links.keys()].sort((a, b) => (links.get(a)!.length - links.get(b)!.length) || a - b);
  for (const s of starts) {
    if (used.has(s)) continue;
    const chain = walk(s);
    if (chain.length >= 3) pieces.push(Float64Array.from(chain.flatMap(crossing)));
  }
  return pieces;
}

/**
 * Bedding readings of the same family as {@link contactTraces}'s surfaces (F = v - A sin(2π u/λ)),
 * at random places in the box: the normal is grad F = up - A(2π/λ) cos(2π u/λ)·right (derived),
 * rotated by `sigma` degrees of noise (see {@link jitter}).
 */
export function surfaceBedding(options: {
  readonly axis: { trend: number; plunge: number };
  readonly amplitude: number;
  readonly wavelength: number;
  readonly box: readonly [number, number, number, number];
  readonly count: number;
  readonly seed: number;
  readonly sigma?: number;
}): { x: number; y: number; dipDirection: number; dip: number; id: string }[] {
  const { axis, amplitude, wavelength, box, count } = options;
  const rnd = mulberry32(options.seed);
  const t = (axis.trend * Math.PI) / 180;
  const p = (axis.plunge * Math.PI) / 180;
  // Profile right and up in north-east-down.
  const right: V3 = [-Math.sin(t), Math.cos(t), 0];
  const up: V3 = [Math.sin(p) * Math.cos(t), Math.sin(p) * Math.sin(t), -Math.cos(p)];
  return Array.from({ length: count }, (_, i) => {
    const x = box[0] + (box[2] - box[0]) * rnd();
    const y = box[1] + (box[3] - box[1]) * rnd();
    const u = x * Math.cos(t) - y * Math.sin(t);
    const g = ((amplitude * 2 * Math.PI) / wavelength) * Math.cos((2 * Math.PI * u) / wavelength);
    const n = jitter(unit3(comb3(up, 1, right, -g)), options.sigma ?? 2, rnd);
    return { x, y, ...planeOfNormal(n), id: `B${i + 1}` };
  });
}

/**
 * The closures of a {@link contactTraces} contact at `level` on level ground z0, with their apex in
 * the box: on level ground v = s sin p + z0 cos p, so the trace is s(u) = (A sin(2π u/λ) + level -
 * z0 cos p)/sin p (derived), turning at u = λ/4 + kλ/2: crests (antiforms, pointing down the
 * plunge) for even k, troughs (synforms, pointing up it) for odd k.
 */
export function levelGroundClosures(options: {
  readonly axis: { trend: number; plunge: number };
  readonly amplitude: number;
  readonly wavelength: number;
  readonly level: number;
  readonly z0: number;
  readonly box: readonly [number, number, number, number];
}): { u: number; s: number; x: number; y: number; sense: 'antiform' | 'synform' }[] {
  const { axis, amplitude, wavelength, level, z0, box } = options;
  const t = (axis.trend * Math.PI) / 180;
  const p = (axis.plunge * Math.PI) / 180;
  const out: { u: number; s: number; x: number; y: number; sense: 'antiform' | 'synform' }[] = [];
  const reach = Math.ceil((2 * Math.hypot(box[2] - box[0], box[3] - box[1])) / wavelength) + 2;
  for (let k = -reach; k <= reach; k++) {
    const u = wavelength / 4 + (k * wavelength) / 2;
    const crest = k % 2 === 0;
    const s = ((crest ? amplitude : -amplitude) + level - z0 * Math.cos(p)) / Math.sin(p);
    const x = u * Math.cos(t) + s * Math.sin(t);
    const y = -u * Math.sin(t) + s * Math.cos(t);
    if (x > box[0] && x < box[2] && y > box[1] && y < box[3]) out.push({ u, s, x, y, sense: crest ? 'antiform' : 'synform' });
  }
  return out;
}
