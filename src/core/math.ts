/**
 * Shared numeric helpers. Every inverse trig call in Foldlens goes through the clamped
 * versions here, so a dot product that rounds to 1.0000000000000002 can never produce NaN.
 */

/**
 * Tolerance for "numerically zero" in unit-vector arithmetic.
 * @example
 * if (norm(v) < EPSILON) throw new RangeError('zero vector');
 */
export const EPSILON = 1e-12;

/**
 * Radians per degree.
 * @example
 * const radians = 30 * DEG; // 0.5236
 */
export const DEG = Math.PI / 180;
/**
 * Degrees per radian.
 * @example
 * const degrees = Math.PI / 6 * RAD; // 30
 */
export const RAD = 180 / Math.PI;

/**
 * Degrees to radians.
 * @example
 * toRadians(180) // Math.PI
 */
export const toRadians = (degrees: number): number => degrees * DEG;

/**
 * Radians to degrees.
 * @example
 * toDegrees(Math.PI / 2) // 90
 */
export const toDegrees = (radians: number): number => radians * RAD;

/**
 * asin clamped to [-1, 1] so that rounding never yields NaN.
 * @example
 * asinClamped(1.0000000001) // Math.PI / 2, not NaN
 */
export function asinClamped(x: number): number {
  return x >= 1 ? Math.PI / 2 : x <= -1 ? -Math.PI / 2 : Math.asin(x);
}

/**
 * acos clamped to [-1, 1] so that rounding never yields NaN.
 * @example
 * acosClamped(-1.0000000001) // Math.PI, not NaN
 */
export function acosClamped(x: number): number {
  return x >= 1 ? 0 : x <= -1 ? Math.PI : Math.acos(x);
}

/**
 * Wraps an azimuth in degrees into [0, 360).
 * @example
 * normalizeAzimuth(-30) // 330
 */
export function normalizeAzimuth(degrees: number): number {
  const a = degrees % 360;
  const wrapped = a < 0 ? a + 360 : a;
  // -1e-15 % 360 + 360 rounds to exactly 360: fold it back to 0.
  return wrapped >= 360 ? 0 : wrapped;
}

/**
 * Smallest difference between two azimuths in degrees, in [0, 180].
 * @example
 * azimuthDifference(350, 10) // 20
 */
export function azimuthDifference(a: number, b: number): number {
  const d = Math.abs(normalizeAzimuth(a) - normalizeAzimuth(b));
  return d > 180 ? 360 - d : d;
}

/**
 * Clamps x into [lo, hi].
 * @example
 * clamp(95, 0, 90) // 90
 */
export function clamp(x: number, lo: number, hi: number): number {
  return x < lo ? lo : x > hi ? hi : x;
}
