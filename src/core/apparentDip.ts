import { toDegrees, toRadians } from './math';
import type { Line, Plane } from './types';

/**
 * Apparent dips and plunges in a vertical section.
 *
 * A plane of true dip δ cut by a vertical section whose line makes the angle β with the
 * plane's strike shows the apparent dip α with tan α = tan δ · sin β (the standard formula of
 * structural geology texts; REFERENCES.md checks (δ, β) = (30, 45) -> 22.2077°). Since
 * β = azimuth − strike = azimuth − (dip direction − 90), sin β = cos(azimuth − dip direction),
 * which also gives the side the plane dips to (derived).
 *
 * A line of plunge p and trend t, projected orthographically onto a vertical section of
 * azimuth θ, keeps its vertical part sin p and keeps cos p · cos(θ − t) of its horizontal part,
 * so its apparent plunge is tan α = tan p / cos(θ − t) (derived from the same projection).
 *
 * Signs: a section is drawn with distance along it increasing to the right (toward its
 * azimuth) and up as up. Positive apparent dips and plunges go DOWN toward increasing
 * distance; negative ones go down toward the start of the section.
 */

/**
 * Apparent dip in degrees [0, 90] from the true dip and the angle between strike and section
 * line (degrees; any value, only |sin β| counts). NaN for a vertical plane striking along the
 * section: the section lies in the plane and shows no trace of it.
 * @example apparentDipAngle(30, 45) // 22.2077 (REFERENCES.md, Profiles)
 */
export function apparentDipAngle(trueDip: number, strikeToSection: number): number {
  if (!(trueDip >= 0 && trueDip <= 90)) throw new RangeError(`true dip ${String(trueDip)} is not a dip (0 to 90 degrees)`);
  if (!Number.isFinite(strikeToSection)) throw new RangeError(`angle between strike and section ${String(strikeToSection)} is not a number of degrees`);
  const d = toRadians(trueDip);
  const s = Math.abs(Math.sin(toRadians(strikeToSection)));
  // atan2(sin δ sin β, cos δ) = atan(tan δ sin β) without the infinity of tan 90°.
  const y = Math.sin(d) * s;
  const x = Math.cos(d);
  if (y < 1e-15 && x < 1e-15) return Number.NaN;
  return toDegrees(Math.atan2(y, x));
}

/**
 * Signed apparent dip of a plane in a vertical section of azimuth `sectionAzimuth` (degrees):
 * positive when the plane goes down toward increasing distance along the section.
 * NaN when the section lies in a vertical plane (see {@link apparentDipAngle}).
 * @example apparentDipInSection({ dipDirection: 120, dip: 30 }, 75) // 22.2077: strike 030, 45° from the section
 */
export function apparentDipInSection(plane: Plane, sectionAzimuth: number): number {
  if (!(plane.dip >= 0 && plane.dip <= 90)) throw new RangeError(`dip ${String(plane.dip)} is not a dip (0 to 90 degrees)`);
  if (!Number.isFinite(plane.dipDirection)) throw new RangeError(`dip direction ${String(plane.dipDirection)} is not an azimuth`);
  if (!Number.isFinite(sectionAzimuth)) throw new RangeError(`section azimuth ${String(sectionAzimuth)} is not an azimuth`);
  // Each azimuth reduced first (exact in floating point), so the difference cannot overflow.
  const c = Math.cos(toRadians((sectionAzimuth % 360) - (plane.dipDirection % 360)));
  const d = toRadians(plane.dip);
  const y = Math.sin(d) * Math.abs(c);
  const x = Math.cos(d);
  if (y < 1e-15 && x < 1e-15) return Number.NaN;
  return Math.sign(c || 1) * toDegrees(Math.atan2(y, x));
}

/**
 * Signed apparent plunge, degrees in [-90, 90], of a line (a fold axis) projected
 * orthographically onto a vertical section of azimuth `sectionAzimuth`: positive when it
 * plunges toward increasing distance. A line normal to the section shows as vertical (90).
 * @example apparentPlungeInSection({ trend: 90, plunge: 30 }, 135) // 39.23: tan α = tan 30° / cos 45°
 */
export function apparentPlungeInSection(line: Line, sectionAzimuth: number): number {
  if (!(line.plunge >= 0 && line.plunge <= 90)) throw new RangeError(`plunge ${String(line.plunge)} is not a plunge (0 to 90 degrees)`);
  if (!Number.isFinite(line.trend)) throw new RangeError(`trend ${String(line.trend)} is not an azimuth`);
  if (!Number.isFinite(sectionAzimuth)) throw new RangeError(`section azimuth ${String(sectionAzimuth)} is not an azimuth`);
  const p = toRadians(line.plunge);
  const along = Math.cos(p) * Math.cos(toRadians((sectionAzimuth % 360) - (line.trend % 360)));
  return Math.sign(along || 1) * toDegrees(Math.atan2(Math.sin(p), Math.abs(along)));
}

/**
 * How an angle from the horizontal looks when the vertical scale is multiplied by
 * `verticalExaggeration`: tan α' = k tan α (derived: only heights are stretched). Throws a
 * RangeError for an angle or exaggeration that is not a finite number.
 * @example exaggeratedAngle(10, 2) // 19.43
 */
export function exaggeratedAngle(angle: number, verticalExaggeration: number): number {
  if (!Number.isFinite(angle)) throw new RangeError(`angle ${String(angle)} is not a number of degrees`);
  if (!(verticalExaggeration > 0 && Number.isFinite(verticalExaggeration))) {
    throw new RangeError(`vertical exaggeration ${String(verticalExaggeration)} is not a positive number`);
  }
  const a = toRadians(angle);
  return toDegrees(Math.atan2(verticalExaggeration * Math.sin(a), Math.cos(a)));
}
