import { readNumberField, type FieldProblem } from './numberField';
import type { Line } from './types';

/** A fold axis typed as trend and plunge in two fields, or the problems with them. */
export interface TypedAxis {
  /** The axis (trend in [0, 360), plunge in [0, 90], degrees, as referred by the user), or null when a field is wrong. */
  readonly axis: Line | null;
  /** One problem per wrong field, trend first; empty when `axis` is set. */
  readonly problems: readonly FieldProblem[];
}

/**
 * What the trend field takes, as the messages say it.
 * @example input.title = `Trend: ${TREND_EXPECTED}`;
 */
export const TREND_EXPECTED = 'an azimuth from 0 to 360°, clockwise from north';
/**
 * What the plunge field takes, as the messages say it.
 * @example input.title = `Plunge: ${PLUNGE_EXPECTED}`;
 */
export const PLUNGE_EXPECTED = 'a plunge from 0 (horizontal) to 90° (vertical)';

/**
 * Reads a fold axis typed in two fields. A trend of 360 is north (0); the plunge is degrees
 * below the horizontal (types.ts). Both fields are checked, so the user sees every problem at once.
 * @example readTypedAxis('075', '12').axis // {trend: 75, plunge: 12}
 * @example readTypedAxis('400', '-5').problems.map((p) => p.field) // ['Trend', 'Plunge']
 */
export function readTypedAxis(trendText: string, plungeText: string): TypedAxis {
  const trend = readNumberField(trendText, { field: 'Trend', min: 0, max: 360, expected: TREND_EXPECTED });
  const plunge = readNumberField(plungeText, { field: 'Plunge', min: 0, max: 90, expected: PLUNGE_EXPECTED });
  const problems: FieldProblem[] = [];
  if (!trend.ok) problems.push(trend.problem);
  if (!plunge.ok) problems.push(plunge.problem);
  if (!trend.ok || !plunge.ok) return { axis: null, problems };
  return { axis: { trend: trend.value === 360 ? 0 : trend.value, plunge: plunge.value }, problems };
}
