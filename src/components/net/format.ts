/**
 * Number formatting for the net panel's numbers block and its exports. Every helper returns
 * a dash ("—") with a reason for a value that is missing or not finite, so NaN, Infinity and
 * "undefined" can never reach the screen or a file.
 */
import type { Line, Plane } from '../../core/types';

/** The sign shown for a value that cannot be given. */
export const DASH = '—';

/** A formatted value: its text, and why it is a dash when it is one. */
export interface Formatted {
  readonly text: string;
  /** Why the value is missing; null when `text` is a value. */
  readonly reason: string | null;
}

/**
 * Whether v is a finite number (narrowing).
 * @example isFiniteNumber(Number.NaN) // false
 */
export function isFiniteNumber(v: unknown): v is number {
  return typeof v === 'number' && Number.isFinite(v);
}

/**
 * A number with fixed decimals and an optional unit, or a dash with the reason.
 * @example formatNumber(0.61234, 3) // {text: '0.612', reason: null}
 * @example formatNumber(NaN, 3, '', 'no planes') // {text: '—', reason: 'no planes'}
 */
export function formatNumber(v: number | null | undefined, digits: number, unit = '', reason = 'not available'): Formatted {
  if (!isFiniteNumber(v)) return missing(reason);
  return { text: `${fixed(v, digits)}${unit}`, reason: null };
}

/**
 * An angle in degrees with one decimal and the degree sign.
 * @example formatAngle(3.14159) // {text: '3.1°', reason: null}
 */
export function formatAngle(v: number | null | undefined, reason = 'not available', digits = 1): Formatted {
  return formatNumber(v, digits, '°', reason);
}

/**
 * An azimuth as three whole-degree digits in [000, 359]; 359.6 rounds to 000 (common practice).
 * @example azimuthText(7.4) // '007'
 */
export function azimuthText(azimuth: number): string {
  if (!isFiniteNumber(azimuth)) return DASH;
  const whole = ((Math.round(azimuth) % 360) + 360) % 360;
  return String(whole).padStart(3, '0');
}

/**
 * A plunge or dip as two whole-degree digits.
 * @example inclinationText(5.2) // '05'
 */
export function inclinationText(angle: number): string {
  if (!isFiniteNumber(angle)) return DASH;
  return String(Math.min(90, Math.max(0, Math.round(angle)))).padStart(2, '0');
}

/**
 * A line as trend/plunge, e.g. "040/25", or a dash with the reason.
 * @example formatLine({trend: 40.2, plunge: 24.8}) // {text: '040/25', reason: null}
 */
export function formatLine(line: Line | null | undefined, reason = 'not available'): Formatted {
  if (!line || !isFiniteNumber(line.trend) || !isFiniteNumber(line.plunge)) return missing(reason);
  return { text: `${azimuthText(line.trend)}/${inclinationText(line.plunge)}`, reason: null };
}

/**
 * A plane as dip direction/dip, e.g. "130/65", or a dash with the reason.
 * @example formatPlane({dipDirection: 130, dip: 65}) // {text: '130/65', reason: null}
 */
export function formatPlane(plane: Plane | null | undefined, reason = 'not available'): Formatted {
  if (!plane || !isFiniteNumber(plane.dipDirection) || !isFiniteNumber(plane.dip)) return missing(reason);
  return { text: `${azimuthText(plane.dipDirection)}/${inclinationText(plane.dip)}`, reason: null };
}

/**
 * A whole count with thin grouping ("12 345"), or a dash.
 * @example formatCount(12345) // {text: '12 345', reason: null}
 */
export function formatCount(v: number | null | undefined, reason = 'not available'): Formatted {
  if (!isFiniteNumber(v)) return missing(reason);
  return { text: String(Math.round(v)).replace(/\B(?=(\d{3})+(?!\d))/g, '\u202f'), reason: null };
}

/**
 * Joins formatted parts; a dash with the first reason if any part is a dash.
 * @example joinFormatted([formatNumber(1, 0), formatNumber(2, 0)], ' · ') // {text: '1 · 2', reason: null}
 */
export function joinFormatted(parts: readonly Formatted[], separator: string): Formatted {
  const bad = parts.find((p) => p.reason !== null);
  if (bad) return missing(bad.reason as string);
  return { text: parts.map((p) => p.text).join(separator), reason: null };
}

/**
 * Text for display: the value, or "— (reason)".
 * @example displayText({text: '—', reason: 'no planes'}) // '— (no planes)'
 */
export function displayText(f: Formatted): string {
  return f.reason === null ? f.text : `${DASH} (${f.reason})`;
}

function missing(reason: string): Formatted {
  return { text: DASH, reason: reason === '' ? 'not available' : reason };
}

/** toFixed without "-0.000" for tiny negatives. */
function fixed(v: number, digits: number): string {
  const s = v.toFixed(Math.max(0, Math.min(20, Math.round(digits))));
  return /^-0(\.0+)?$/.test(s) ? s.slice(1) : s;
}
