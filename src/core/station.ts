import type { FoldSense, Line, MeasurementKind, PlaneMeasurement } from './types';

/**
 * One measurement at one place, as Foldlens carries it after import. A station that could
 * not be read is still a Station: `problems` says why, `plane`/`line` stay undefined, and
 * `source` keeps every original field so nothing the user gave is lost.
 */
export interface Station {
  /** Stable id: the data's own station id when given, else `row-<n>`. */
  readonly id: string;
  /** 1-based data row number in the source file (header is row 0), for messages. */
  readonly row: number;
  /** Measurement kind, lower-case trade word (bedding, hinge, ...); undefined if unreadable. */
  readonly kind?: MeasurementKind;
  /** WGS84 longitude and latitude in degrees. */
  readonly lon?: number;
  readonly lat?: number;
  /** Height above sea level in metres, when known. */
  readonly elevation?: number;
  /** Planar attitude referred to true north, after corrections. */
  readonly plane?: PlaneMeasurement;
  /** Linear attitude referred to true north, after corrections. */
  readonly line?: Line & { readonly sense?: FoldSense };
  /** Corrections applied to the azimuths, in the order applied. */
  readonly corrections?: readonly AzimuthCorrection[];
  /** Every original column, by header name, exactly as read. */
  readonly source: Readonly<Record<string, string>>;
  /** Why this row cannot be used; empty when it can. */
  readonly problems: readonly RowProblem[];
}

/** A problem with one field of one row. */
export interface RowProblem {
  readonly row: number;
  /** Column name as it appears in the file (or a logical field name when no column applies). */
  readonly column: string;
  readonly value: string;
  /** What was expected, in words: "a dip from 0 to 90". */
  readonly expected: string;
}

/** One azimuth correction, stored with the measurement. */
export interface AzimuthCorrection {
  readonly type: 'magnetic-declination' | 'grid-convergence' | 'user-declination';
  /** Degrees added to the recorded azimuth. */
  readonly degrees: number;
  /** Where the value came from, e.g. "WMM2025 at 2025-06-01". */
  readonly source: string;
}

/**
 * Whether a station can take part in analysis.
 * @example
 * const usable = stations.filter(isUsable);
 */
export function isUsable(station: Station): boolean {
  return station.problems.length === 0 && (station.plane !== undefined || station.line !== undefined);
}

/**
 * Formats a row problem as a sentence: "row 14, column dip: 95 is not a dip (0 to 90)".
 * @example
 * describeProblem({ row: 14, column: 'dip', value: '95', expected: 'a dip from 0 to 90' })
 * // 'row 14, column dip: "95"; expected a dip from 0 to 90'
 */
export function describeProblem(p: RowProblem): string {
  const value = p.value === '' ? 'empty' : `"${p.value}"`;
  return `row ${p.row}, column ${p.column}: ${value}; expected ${p.expected}`;
}
