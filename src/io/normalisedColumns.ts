import { formatLine, formatPlane, type LineFormat, type PlaneFormat } from '../core/notation';
import { normalizeAzimuth } from '../core/math';
import { describeProblem, type AzimuthCorrection, type Station } from '../core/station';

/**
 * The columns Foldlens adds when it writes stations back out (CSV or GeoJSON properties),
 * beside every original column, which is kept as it was. Names start with `fl_` so they are
 * easy to tell apart; a name already taken by an original column gets `_2`, `_3`... added.
 *
 * | column | holds |
 * |---|---|
 * | fl_kind | the kind as read (bedding, hinge...) |
 * | fl_dip_direction, fl_dip | the plane, with `planeFormat` `dipdir` |
 * | fl_strike, fl_dip | the plane, right-hand-rule strike, with `rhr` |
 * | fl_plane | the plane as text, with `strike-quadrant` or `quadrant` (e.g. 030/45SE) |
 * | fl_overturned | `yes` for overturned planes (numeric plane formats only; text formats write OT) |
 * | fl_trend, fl_plunge | the line, with `lineFormat` `azimuth` (default) |
 * | fl_line | the line as text, with `lineFormat` `quadrant` (e.g. S55E 20) |
 * | fl_lon, fl_lat | WGS84 position to 8 decimals, when asked for (coordinates were projected) |
 * | fl_corrections | corrections applied, e.g. `magnetic-declination +2.31 (WMM2025 at 2025-06-01)` |
 * | fl_problems | why the row cannot be used, one sentence per problem, `; ` between |
 *
 * Every attitude is referred to true north after the corrections listed. Empty where there is
 * nothing to write (no plane, no line, a row with problems).
 */

/** How to write the added columns. */
export interface NormalisedOptions {
  readonly planeFormat: PlaneFormat;
  /** Default `azimuth`. */
  readonly lineFormat?: LineFormat;
  /** Decimal places of angles (trailing zeros dropped in numeric columns), 0 to 6; default 2. */
  readonly decimals?: number;
  /** Add fl_lon and fl_lat. */
  readonly location?: boolean;
}

/** A value of an added column: numbers stay numbers (GeoJSON), CSV writes them as text. */
export type NormalisedValue = string | number | null;

/** One added column: its key (the base name) and the name used in this file. */
export interface AddedColumn {
  readonly key: string;
  readonly name: string;
}

/**
 * The columns to add for these stations, named so that none clashes with `existing`.
 * @example addedColumns(['dip'], [], { planeFormat: 'dipdir' }).map((c) => c.name)
 * // ['fl_kind', 'fl_dip_direction', 'fl_dip', 'fl_trend', 'fl_plunge', 'fl_problems']
 */
export function addedColumns(existing: readonly string[], stations: readonly Station[], options: NormalisedOptions): AddedColumn[] {
  const keys = ['fl_kind'];
  if (options.planeFormat === 'dipdir') keys.push('fl_dip_direction', 'fl_dip');
  else if (options.planeFormat === 'rhr') keys.push('fl_strike', 'fl_dip');
  else keys.push('fl_plane');
  const numericPlane = options.planeFormat === 'dipdir' || options.planeFormat === 'rhr';
  if (numericPlane && stations.some((s) => s.plane?.overturned === true)) keys.push('fl_overturned');
  if ((options.lineFormat ?? 'azimuth') === 'azimuth') keys.push('fl_trend', 'fl_plunge');
  else keys.push('fl_line');
  if (options.location) keys.push('fl_lon', 'fl_lat');
  if (stations.some((s) => (s.corrections?.length ?? 0) > 0)) keys.push('fl_corrections');
  keys.push('fl_problems');
  const taken = new Set(existing);
  return keys.map((key) => {
    let name = key;
    for (let i = 2; taken.has(name); i++) name = `${key}_${i}`;
    taken.add(name);
    return { key, name };
  });
}

/**
 * The added values of one station, by column key.
 * @example normalisedValues(station, { planeFormat: 'rhr' }).fl_strike // 30 for plane 120/45
 */
export function normalisedValues(station: Station, options: NormalisedOptions): Record<string, NormalisedValue> {
  const d = options.decimals ?? 2;
  if (!Number.isInteger(d) || d < 0 || d > 6) throw new RangeError(`decimals must be a whole number from 0 to 6, got ${d}`);
  const round = (x: number): number => Number(x.toFixed(d));
  const azimuth = (x: number): number => {
    const r = round(normalizeAzimuth(x));
    return r >= 360 ? 0 : r;
  };
  const p = station.plane;
  const l = station.line;
  const out: Record<string, NormalisedValue> = {
    fl_kind: station.kind ?? null,
    fl_dip_direction: p ? azimuth(p.dipDirection) : null,
    fl_strike: p ? azimuth(p.dipDirection - 90) : null,
    fl_dip: p ? round(p.dip) : null,
    fl_plane: p && options.planeFormat !== 'dipdir' && options.planeFormat !== 'rhr' ? formatPlane(p, options.planeFormat, { decimals: d }) : null,
    fl_overturned: p?.overturned === true ? 'yes' : null,
    fl_trend: l ? azimuth(l.trend) : null,
    fl_plunge: l ? round(l.plunge) : null,
    fl_line: l && options.lineFormat === 'quadrant' ? formatLine(l, 'quadrant', { decimals: d }) : null,
    // Eight decimals of a degree are about a millimetre.
    fl_lon: station.lon !== undefined ? Number(station.lon.toFixed(8)) : null,
    fl_lat: station.lat !== undefined ? Number(station.lat.toFixed(8)) : null,
    fl_corrections: station.corrections && station.corrections.length > 0 ? station.corrections.map(describeCorrection).join('; ') : null,
    fl_problems: station.problems.length > 0 ? station.problems.map(describeProblem).join('; ') : null,
  };
  return out;
}

/**
 * A correction in words: "magnetic-declination +2.31 (WMM2025 at 2025-06-01)".
 * @example describeCorrection({ type: 'user-declination', degrees: -3, source: 'declination given by the user' })
 * // 'user-declination -3.00 (declination given by the user)'
 */
export function describeCorrection(c: AzimuthCorrection): string {
  return `${c.type} ${c.degrees >= 0 ? '+' : ''}${c.degrees.toFixed(2)} (${c.source})`;
}
