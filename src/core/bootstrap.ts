/**
 * Bootstrap cone of confidence for the pi (girdle) axis (Efron 1979, "Bootstrap methods:
 * another look at the jackknife", Ann. Statist. 7; applied to orientation data as in
 * Fisher, Lewis & Embleton 1987, *Statistical Analysis of Spherical Data*, section 8.3; from
 * memory).
 *
 * The poles are resampled with replacement `samples` times; each resample is refitted and
 * the angle between its axis and the full-sample axis is recorded. The cone half-angle is
 * the `confidence` quantile of those angles, by the nearest-rank rule (the ceil(q·B)-th
 * smallest of B angles).
 *
 * Speed: a resample is never built. Each draw adds the six products of the drawn pole to
 * running sums, so a resample costs n multiply-adds and one 3 x 3 eigen-solve.
 *
 * Large n: each resample draws at most `maxDraws` poles (default 20,000). When n is larger,
 * this is an "m out of n" bootstrap (Bickel, Götze & van Zwet 1997, Statistica Sinica 7;
 * from memory): resamples of m < n poles scatter about sqrt(n/m) times more than resamples
 * of n, so each angle is multiplied by sqrt(m/n). The rescaling assumes small angles, which
 * holds at such n unless the girdle is nearly formless (then the cone is wide anyway).
 */
import { acosClamped, toDegrees } from './math';
import { eigenSymmetric3 } from './eigen';
import { AXIS_DEGENERACY } from './girdle';
import { createRandom } from './random';
import type { Vec3 } from './types';

/** Options for the bootstrap cone. */
export interface BootstrapOptions {
  /** Number of resamples B (default 500). */
  readonly samples?: number;
  /** PRNG seed (default 1): the same seed gives the same cone. */
  readonly seed?: number;
  /** Confidence level (default 0.95). */
  readonly confidence?: number;
  /** Most poles drawn per resample (default 20,000); see the file comment for n above it. */
  readonly maxDraws?: number;
}

/**
 * Defaults of `BootstrapOptions`.
 * @example bootstrapAxisCone(poles, axis, { ...BOOTSTRAP_DEFAULTS, samples: 1000 })
 */
export const BOOTSTRAP_DEFAULTS = Object.freeze({ samples: 500, seed: 1, confidence: 0.95, maxDraws: 20_000 });

/** A bootstrap cone about an axis. */
export interface AxisCone {
  /** Cone half-angle in degrees, or null (see `note`). */
  readonly cone: number | null;
  readonly samples: number;
  readonly seed: number;
  readonly confidence: number;
  /** Poles drawn per resample (n, or `maxDraws` when n is larger). */
  readonly drawsPerSample: number;
  /** True when angles were rescaled by sqrt(m/n) (m-out-of-n bootstrap). */
  readonly rescaled: boolean;
  /** Resamples whose axis was undefined (S2 = S3); each counts as 90°, the widest an axis can miss by. */
  readonly degenerateSamples: number;
  /** Why `cone` is null, else null. */
  readonly note: string | null;
}

/**
 * Bootstrap cone of confidence about `axis` (unit vector: the pi axis of the same poles)
 * for interleaved unit poles [x0, y0, z0, x1, ...].
 * @example
 * const fit = fitGirdleToArray(poles);
 * bootstrapAxisCone(poles, fit.axisVector, { samples: 500, seed: 7 }).cone // degrees
 */
export function bootstrapAxisCone(xyz: ArrayLike<number>, axis: Vec3, options: BootstrapOptions = {}): AxisCone {
  const samples = options.samples ?? BOOTSTRAP_DEFAULTS.samples;
  const seed = options.seed ?? BOOTSTRAP_DEFAULTS.seed;
  const confidence = options.confidence ?? BOOTSTRAP_DEFAULTS.confidence;
  const maxDraws = options.maxDraws ?? BOOTSTRAP_DEFAULTS.maxDraws;
  if (!(Number.isInteger(samples) && samples >= 1)) throw new RangeError(`bootstrap samples: ${samples} (expected a whole number of at least 1)`);
  if (!(confidence > 0 && confidence < 1)) throw new RangeError(`bootstrap confidence: ${confidence} (expected a level between 0 and 1, e.g. 0.95)`);
  if (!(Number.isInteger(maxDraws) && maxDraws >= 3)) throw new RangeError(`bootstrap maxDraws: ${maxDraws} (expected a whole number of at least 3)`);
  if (xyz.length % 3 !== 0) throw new RangeError(`interleaved poles: length ${xyz.length} is not a multiple of 3`);
  const rng = createRandom(seed); // validates the seed

  const n = xyz.length / 3;
  const m = Math.min(n, maxDraws);
  const rescaled = m < n;
  const scale = rescaled ? Math.sqrt(m / n) : 1;
  const base = { samples, seed, confidence, drawsPerSample: m, rescaled };
  const axisLength = Math.hypot(axis.x, axis.y, axis.z);
  if (!(axisLength > 0) || !Number.isFinite(axisLength)) throw new RangeError(`bootstrap axis: (${axis.x}, ${axis.y}, ${axis.z}) is not a direction`);
  if (n < 3) return { ...base, cone: null, degenerateSamples: 0, note: `a bootstrap cone needs at least 3 poles (got ${n})` };
  for (let o = 0; o < xyz.length; o++) {
    if (!Number.isFinite(xyz[o])) throw new RangeError(`interleaved poles: pole ${Math.floor(o / 3)}, component ${'xyz'[o % 3]} is ${xyz[o]} (expected a finite number)`);
  }
  const ax = axis.x / axisLength, ay = axis.y / axisLength, az = axis.z / axisLength;

  const next = rng.next;
  const angles = new Float64Array(samples);
  let degenerate = 0;
  for (let b = 0; b < samples; b++) {
    let xx = 0, xy = 0, xz = 0, yy = 0, yz = 0, zz = 0;
    for (let k = 0; k < m; k++) {
      const o = 3 * Math.floor(next() * n); // next() is in [0, 1), so the index is in [0, n)
      const x = xyz[o], y = xyz[o + 1], z = xyz[o + 2];
      xx += x * x; xy += x * y; xz += x * z;
      yy += y * y; yz += y * z; zz += z * z;
    }
    const { values, vectors } = eigenSymmetric3({ xx, xy, xz, yy, yz, zz });
    const total = values[0] + values[1] + values[2];
    if (!((values[1] - values[2]) / total > AXIS_DEGENERACY)) {
      degenerate++;
      angles[b] = 90;
      continue;
    }
    const v = vectors[2];
    // Axes have no sense: the angle between them is taken in [0, 90].
    angles[b] = scale * toDegrees(acosClamped(Math.abs(v.x * ax + v.y * ay + v.z * az)));
  }
  angles.sort();
  const rank = Math.max(1, Math.ceil(confidence * samples));
  return { ...base, cone: Math.min(angles[rank - 1], 90), degenerateSamples: degenerate, note: null };
}
