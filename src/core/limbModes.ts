/**
 * The mode (densest direction) of axial angles on a circle, for the limb maxima of a fold.
 *
 * Why a mode: the poles of a fold with rounded hinges sweep from one limb to the other, so a
 * limb's MEAN pole is pulled toward the hinge and the interlimb angle from means comes out too
 * open (on the Korvane sample about 116° where the profile's steepest limbs give 98°). The
 * straight parts of the limbs, where most readings pile up, are the DENSEST part of each limb's
 * arc; the mode of the angular density finds them and ignores the hinge tail. Limb maxima as the
 * density maxima of a contoured pi diagram are common practice; this is the same idea along the
 * girdle.
 *
 * Known limit: where a limb curves all the way to the next hinge (a sinusoid-like profile with no
 * straight part), the steepest dip is a sharp edge of the density, and reading scatter blurs it
 * inward, so the mode still sits a little inside it: on synthetic profiles of that kind with 2.5°
 * scatter the interlimb angle from modes reads 2-10° too open (from means 10-28°), the most for
 * gentle, nearly sinusoidal folds; on the Korvane folds +4 to +5° (means +18°). With straight
 * limbs and rounded hinges (150 or more readings, up to half of them in the hinges) the interlimb
 * angle from modes is within 5°, typically 1°. A limb of a few tens of readings next to a broad,
 * well-sampled hinge can lose its mode to a chance clump of hinge readings.
 *
 * Method (Foldlens's choices, stated so they can be checked):
 * - Axial angles θ (θ and θ + 180° are the same direction) are doubled, 2θ, so that the data
 *   live on an ordinary circle (common practice for axial data; Mardia & Jupp 2000, Directional
 *   Statistics, §1.3, from memory).
 * - Density: a kernel density on the circle (Hall, Watson & Cabrera 1987, Biometrika 74, from
 *   memory) with the von Mises kernel exp(κ(cos(φ - φi) - 1)). For the doubled angle the
 *   concentration is κ = 1/(2h)² (h in radians), which for large κ is a Gaussian kernel of
 *   standard deviation 2h on the doubled angle, i.e. h on the profile angle (the von Mises
 *   distribution tends to a normal of variance 1/κ; Mardia & Jupp 2000, §3.5, from memory).
 * - Bandwidth h = 4° by default ({@link LIMB_MODE_BANDWIDTH}): about twice the reading precision
 *   of a compass-clinometer (common practice), so that single readings do not make modes of
 *   their own, and small enough that the hinge tail does not drag the mode inward (a wider
 *   kernel moves the mode toward the mean). Foldlens convention, checked on synthetic folds.
 * - Search: the density is evaluated on a grid of 720 cells of the doubled circle (0.25° of
 *   profile angle) from a histogram of the angles, the highest cell is taken, and the mode is
 *   then refined on the exact angles by Newton steps on the density's derivative where the
 *   density curves downward, and mean-shift steps otherwise (Comaniciu & Meer 2002, IEEE PAMI
 *   24, from memory). For the von Mises kernel a mean-shift step is the kernel-weighted circular
 *   mean, φ ← atan2(Σ wi sin φi, Σ wi cos φi); both stop where the derivative
 *   κ Σ wi sin(φi - φ) is zero (derived). The result is deterministic.
 */

/**
 * Default kernel bandwidth h in degrees of profile angle (see the module comment; Foldlens convention).
 * @example axialMode(angles, LIMB_MODE_BANDWIDTH)
 */
export const LIMB_MODE_BANDWIDTH = 4;

/** Cells of the doubled circle on which the density is first evaluated. */
const GRID = 720;
const TWO_PI = 2 * Math.PI;
/** Kernel weights below this are left out of the grid convolution. */
const KERNEL_FLOOR = 1e-12;
const MAX_SHIFTS = 100;
/** The refinement stops when a step moves the doubled angle by less than this (radians). */
const SHIFT_TOLERANCE = 1e-13;

/**
 * Mode of the kernel density of axial angles (radians; θ and θ + π are one direction), in
 * (-π/2, π/2]; null when there are no finite angles. NaN entries are skipped. Throws a
 * RangeError for a bandwidth that is not a positive number of degrees up to 90.
 * @example axialMode([0.1, 0.12, 0.5]) // about 0.11 (the two close readings), not their mean 0.24
 */
export function axialMode(angles: ArrayLike<number>, bandwidthDegrees = LIMB_MODE_BANDWIDTH): number | null {
  if (!(bandwidthDegrees > 0 && bandwidthDegrees <= 90)) {
    throw new RangeError(`axialMode: bandwidth ${String(bandwidthDegrees)} (expected degrees above 0, up to 90)`);
  }
  const doubled: number[] = [];
  for (let i = 0; i < angles.length; i++) if (Number.isFinite(angles[i])) doubled.push(wrap(2 * angles[i]));
  if (doubled.length === 0) return null;
  const kappa = 1 / (2 * (bandwidthDegrees * Math.PI) / 180) ** 2;

  // Histogram on the grid, then the circular convolution with the kernel.
  const cell = TWO_PI / GRID;
  const counts = new Float64Array(GRID);
  for (const phi of doubled) counts[((Math.round((phi + Math.PI) / cell) % GRID) + GRID) % GRID]++;
  const kernel: number[] = [];
  for (let d = 0; d <= GRID / 2; d++) {
    const k = Math.exp(kappa * (Math.cos(d * cell) - 1));
    if (k < KERNEL_FLOOR) break;
    kernel.push(k);
  }
  let best = 0;
  let bestDensity = -1;
  for (let j = 0; j < GRID; j++) {
    let density = counts[j] * kernel[0];
    for (let d = 1; d < kernel.length; d++) density += (counts[(j + d) % GRID] + counts[(j - d + GRID) % GRID]) * kernel[d];
    if (density > bestDensity + 1e-12 * bestDensity) {
      bestDensity = density;
      best = j;
    }
  }

  // Refine from the best cell on the exact angles: Newton steps on the density where it is
  // curved downward and the step stays within a cell, mean-shift steps otherwise.
  const cosines = doubled.map(Math.cos);
  const sines = doubled.map(Math.sin);
  let phi = best * cell - Math.PI;
  for (let step = 0; step < MAX_SHIFTS; step++) {
    const cp = Math.cos(phi), sp = Math.sin(phi);
    // With Δ = φi - φ: S = Σ w sin Δ (f'/κ), C = Σ w cos Δ, Q = Σ w sin² Δ, so f''/κ = κQ - C (derived).
    let S = 0, C = 0, Q = 0;
    for (let i = 0; i < doubled.length; i++) {
      const cd = cosines[i] * cp + sines[i] * sp;
      const sd = sines[i] * cp - cosines[i] * sp;
      const w = Math.exp(kappa * (cd - 1));
      S += w * sd;
      C += w * cd;
      Q += w * sd * sd;
    }
    if (Math.hypot(S, C) === 0) break;
    const curvature = kappa * Q - C;
    const newton = curvature < 0 ? -S / curvature : Number.POSITIVE_INFINITY;
    const move = Math.abs(newton) <= cell ? newton : Math.atan2(S, C);
    phi = wrap(phi + move);
    if (Math.abs(move) < SHIFT_TOLERANCE) break;
  }
  const mode = phi / 2;
  return mode <= -Math.PI / 2 ? mode + Math.PI : mode;
}

/** An angle in [-π, π). */
function wrap(a: number): number {
  return a - TWO_PI * Math.floor((a + Math.PI) / TWO_PI);
}
