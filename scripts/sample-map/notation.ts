/**
 * Text forms of attitudes used in the sample files. Three-digit azimuths, whole degrees.
 * Strike with dip quadrant ("305/42SW") follows the field-handbook form (Coe, ed., Geological
 * Field Techniques, 2010, fig. 2.6); quadrant bearings ("N55W") are common practice.
 */

const pad3 = (v: number): string => String(v).padStart(3, '0');
const pad2 = (v: number): string => String(v).padStart(2, '0');
const wrap = (a: number): number => ((a % 360) + 360) % 360;

const COMPASS8 = ['N', 'NE', 'E', 'SE', 'S', 'SW', 'W', 'NW'] as const;

/**
 * The nearest of the eight compass points to an azimuth; always within 22.5 degrees.
 * @example compassPoint(215) // 'SW'
 */
export function compassPoint(azimuth: number): string {
  return COMPASS8[Math.round(wrap(azimuth) / 45) % 8];
}

/**
 * Right-hand-rule strike of a plane (dip direction - 90), whole degrees.
 * @example rhrStrike(35) // 305
 */
export const rhrStrike = (dipDirection: number): number => wrap(dipDirection - 90);

/**
 * Strike/dip with dip quadrant: "305/42SW" for dip direction 215, dip 42.
 * @example strikeDipQuadrant(215, 42) // '305/42SW'
 */
export function strikeDipQuadrant(dipDirection: number, dip: number): string {
  return `${pad3(rhrStrike(dipDirection))}/${pad2(dip)}${compassPoint(dipDirection)}`;
}

/**
 * Trend/plunge of a line: "075/12".
 * @example trendPlunge(75, 12) // '075/12'
 */
export const trendPlunge = (trend: number, plunge: number): string => `${pad3(trend)}/${pad2(plunge)}`;

/**
 * Quadrant bearing of a strike line, quoted from its northern end: 305 -> "N55W", 120 -> "N60W".
 * @example strikeBearing(305) // 'N55W'
 */
export function strikeBearing(strike: number): string {
  let s = wrap(strike);
  if (s > 90 && s < 270) s = wrap(s + 180);
  return s <= 90 ? `N${pad2(s)}E` : `N${pad2(360 - s)}W`;
}

/**
 * Quadrant bearing of a directed line (trend): 075 -> "N75E", 100 -> "S80E".
 * @example lineBearing(100) // 'S80E'
 */
export function lineBearing(trend: number): string {
  const t = wrap(trend);
  if (t <= 90) return `N${pad2(t)}E`;
  if (t < 180) return `S${pad2(180 - t)}E`;
  if (t < 270) return `S${pad2(t - 180)}W`;
  return `N${pad2(360 - t)}W`;
}

/**
 * One CSV line (RFC 4180 quoting: fields with a comma, quote or line break are quoted).
 * @example csvLine(['a', 'b,c']) // 'a,"b,c"'
 */
export function csvLine(fields: readonly string[]): string {
  return fields.map((f) => (/[",\n\r]/.test(f) ? `"${f.replace(/"/g, '""')}"` : f)).join(',');
}
