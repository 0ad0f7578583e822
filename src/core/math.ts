/**
 * Shared numeric helpers. Every inverse trig call in Foldlens goes through the clamped
 * versions here, so a dot product that rounds to 1.0000000000000002 can never produce NaN.
 */

/** Tolerance for "numerically zero" in unit-vector arithmetic. */
export const EPSILON = 1e-12;

export const DEG = Math.PI / 180;
export const RAD = 180 / Math.PI;

/** Degrees to radians. */
export const toRadians = (degrees: number): number => degrees * DEG;

/** Radians to degrees. */
export const toDegrees = (radians: number): number => radians * RAD;

/** asin clamped to [-1, 1] so that rounding never yields NaN. */
export function asinClamped(x: number): number {
  return x >= 1 ? Math.PI / 2 : x <= -1 ? -Math.PI / 2 : Math.asin(x);
}

/** acos clamped to [-1, 1] so that rounding never yields NaN. */
export function acosClamped(x: number): number {
  return x >= 1 ? 0 : x <= -1 ? Math.PI : Math.acos(x);
}

/** Wraps an azimuth in degrees into [0, 360). */
export function normalizeAzimuth(degrees: number): number {
  const a = degrees % 360;
  const wrapped = a < 0 ? a + 360 : a;
  // -1e-15 % 360 + 360 rounds to exactly 360: fold it back to 0.
  return wrapped >= 360 ? 0 : wrapped;
}

/** Smallest difference between two azimuths in degrees, in [0, 180]. */
export function azimuthDifference(a: number, b: number): number {
  const d = Math.abs(normalizeAzimuth(a) - normalizeAzimuth(b));
  return d > 180 ? 360 - d : d;
}

/** Clamps x into [lo, hi]. */
export function clamp(x: number, lo: number, hi: number): number {
  return x < lo ? lo : x > hi ? hi : x;
}
