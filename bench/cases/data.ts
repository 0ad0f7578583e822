/**
 * Invented input data for the benchmarks: poles to the limbs of a cylindrical fold (a girdle
 * about a gently plunging axis, with scatter) mixed with uniformly scattered poles, from a
 * seeded generator so every run times the same data.
 */

/** Seeded uniform numbers in [0, 1) (mulberry32, public domain). */
export function seededUniform(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/**
 * n interleaved unit poles (north-east-down): 70 % on a girdle normal to the axis 030/20 with
 * about 8° of scatter, 30 % uniform on the sphere.
 * @example foldedPoles(1000, 1).length // 3000
 */
export function foldedPoles(n: number, seed: number): Float64Array {
  const rnd = seededUniform(seed);
  const t = (30 * Math.PI) / 180;
  const p = (20 * Math.PI) / 180;
  const axis = [Math.cos(p) * Math.cos(t), Math.cos(p) * Math.sin(t), Math.sin(p)];
  // Two unit vectors normal to the axis span the girdle.
  const a = [-Math.sin(t), Math.cos(t), 0];
  const b = [axis[1] * a[2] - axis[2] * a[1], axis[2] * a[0] - axis[0] * a[2], axis[0] * a[1] - axis[1] * a[0]];
  const out = new Float64Array(3 * n);
  const scatter = (8 * Math.PI) / 180;
  for (let i = 0; i < n; i++) {
    let v: number[];
    if (rnd() < 0.7) {
      const phi = Math.PI * rnd();
      const off = scatter * (rnd() + rnd() + rnd() - 1.5);
      v = [0, 1, 2].map((k) => Math.cos(phi) * a[k] + Math.sin(phi) * b[k] + off * axis[k]);
    } else {
      const z = 2 * rnd() - 1;
      const phi = 2 * Math.PI * rnd();
      const r = Math.sqrt(1 - z * z);
      v = [r * Math.cos(phi), r * Math.sin(phi), z];
    }
    const len = Math.hypot(v[0], v[1], v[2]);
    out[3 * i] = v[0] / len;
    out[3 * i + 1] = v[1] / len;
    out[3 * i + 2] = v[2] / len;
  }
  return out;
}
