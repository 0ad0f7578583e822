import { formatLine, formatPlane } from '../../core/notation';
import { isUsable, type Station } from '../../core/station';
import type { MeasurementKind } from '../../core/types';

/**
 * What `<foldlens-table>` shows, without the DOM: its columns, the rows a filter and a sort leave
 * (as indices into the stations, so a row keeps its identity), and the window of rows to render
 * for a scroll position (only those are in the DOM, so 10^6 rows scroll like 10).
 */

/** Which rows by kind: all, one kind, or rows without a kind. */
export type KindFilter = 'all' | 'none' | MeasurementKind;
/** Which rows by state. */
export type RowsFilter = 'all' | 'problems' | 'usable';

/** A column of the table. */
export interface TableColumn {
  /** `row`, `status`, `id`, `kind`, `attitude`, `position`, `problems`, or `source:<header>`. */
  readonly key: string;
  readonly label: string;
  /** Width in CSS pixels. */
  readonly width: number;
  /** The original column shown, for `source:` columns. */
  readonly source?: string;
}

/** A sort: column key and direction (1 ascending, -1 descending). */
export interface SortSpec {
  readonly key: string;
  readonly direction: 1 | -1;
}

/**
 * The columns for a table with these original headers: what Foldlens read first, then every
 * original column as it was written.
 * @example tableColumns(['Stn', 'Dip']).map((c) => c.key).slice(-2) // ['source:Stn', 'source:Dip']
 */
export function tableColumns(headers: readonly string[]): TableColumn[] {
  return [
    { key: 'row', label: 'Row', width: 58 },
    { key: 'status', label: 'Status', width: 28 },
    { key: 'id', label: 'Id', width: 96 },
    { key: 'kind', label: 'Kind', width: 104 },
    { key: 'attitude', label: 'Attitude', width: 88 },
    { key: 'problems', label: 'Problems', width: 230 },
    { key: 'position', label: 'Lat, lon', width: 150 },
    ...headers.map((h) => ({ key: `source:${h}`, label: h, width: Math.min(200, Math.max(70, 12 + 7.5 * h.length)), source: h })),
  ];
}

/**
 * The attitude as Foldlens read it (after corrections): planes as dip direction/dip, lines as
 * trend/plunge, whole degrees (core/notation formatters); empty when there is none.
 * @example attitudeText({ plane: { dipDirection: 120, dip: 45 } } as Station) // '120/45'
 */
export function attitudeText(s: Station): string {
  if (s.plane) return `${formatPlane(s.plane, 'dipdir')}`;
  if (s.line) return `${formatLine(s.line, 'azimuth')}${s.line.sense && s.line.sense !== 'unknown' ? ` ${s.line.sense}` : ''}`;
  return '';
}

/**
 * Latitude and longitude to 5 decimals (about a metre), or empty.
 * @example positionText({ lat: 24.6, lon: 15 } as Station) // '24.60000, 15.00000'
 */
export function positionText(s: Station): string {
  return s.lat !== undefined && s.lon !== undefined ? `${s.lat.toFixed(5)}, ${s.lon.toFixed(5)}` : '';
}

/**
 * The problems of a row in a few words: the first one, and how many more.
 * @example problemsText(station) // 'Dip: "95"; expected a dip from 0 to 90'
 */
export function problemsText(s: Station): string {
  if (s.problems.length === 0) return '';
  const p = s.problems[0];
  const more = s.problems.length > 1 ? ` (+${s.problems.length - 1} more)` : '';
  return `${p.column}: ${p.value === '' ? 'empty' : `"${p.value}"`}; expected ${p.expected}${more}`;
}

/**
 * The text of a cell.
 * @example cellText(station, tableColumns(['Dip'])[7]) // the Dip field as written, e.g. '95'
 */
export function cellText(s: Station, column: TableColumn): string {
  switch (column.key) {
    case 'row':
      return String(s.row);
    case 'status':
      return s.problems.length > 0 ? String(s.problems.length) : '';
    case 'id':
      return s.id;
    case 'kind':
      return s.kind ?? '';
    case 'attitude':
      return attitudeText(s);
    case 'position':
      return positionText(s);
    case 'problems':
      return problemsText(s);
    default:
      return column.source !== undefined ? (s.source[column.source] ?? '') : '';
  }
}

/** Counts per kind and per state, for the filter menus. */
export interface TableCounts {
  readonly kinds: ReadonlyMap<KindFilter, number>;
  readonly problems: number;
  readonly usable: number;
}

/**
 * Counts of the stations by kind (`none` for no kind), with problems, and usable.
 * @example tableCounts(stations).problems // 5
 */
export function tableCounts(stations: readonly Station[]): TableCounts {
  const kinds = new Map<KindFilter, number>();
  let problems = 0;
  let usable = 0;
  for (const s of stations) {
    const k: KindFilter = s.kind ?? 'none';
    kinds.set(k, (kinds.get(k) ?? 0) + 1);
    if (s.problems.length > 0) problems++;
    if (isUsable(s)) usable++;
  }
  return { kinds, problems, usable };
}

const collator = new Intl.Collator('en', { numeric: true, sensitivity: 'base' });

/**
 * Indices of the stations the filters keep, in the order of `sort` (stable: ties keep file
 * order). Numbers sort as numbers, text in natural order ("S2" before "S10"), empty cells last.
 * @example viewIndices(stations, { kind: 'bedding', rows: 'problems' }) // Int32Array of indices
 */
export function viewIndices(stations: readonly Station[], filter: { kind?: KindFilter; rows?: RowsFilter; sort?: SortSpec | null; columns?: readonly TableColumn[] }): Int32Array {
  const kind = filter.kind ?? 'all';
  const rows = filter.rows ?? 'all';
  const kept: number[] = [];
  for (let i = 0; i < stations.length; i++) {
    const s = stations[i];
    if (kind !== 'all' && (s.kind ?? 'none') !== kind) continue;
    if (rows === 'problems' && s.problems.length === 0) continue;
    if (rows === 'usable' && !isUsable(s)) continue;
    kept.push(i);
  }
  const out = Int32Array.from(kept);
  const sort = filter.sort;
  if (!sort || sort.key === 'row') return sort?.direction === -1 ? out.reverse() : out;
  const column = (filter.columns ?? []).find((c) => c.key === sort.key) ?? { key: sort.key, label: '', width: 0, source: sort.key.startsWith('source:') ? sort.key.slice(7) : undefined };
  const keys = Array.from(out, (i) => sortKey(stations[i], column));
  const d = sort.direction;
  const order = Uint32Array.from(keys, (_, k) => k).sort((a, b) => {
    const c = compareKeys(keys[a], keys[b]);
    // Empty cells stay last whichever way; ties keep file order.
    return c !== 0 ? (keys[a] === '' || keys[b] === '' ? c : c * d) : out[a] - out[b];
  });
  return Int32Array.from(order, (k) => out[k]);
}

/**
 * The value a column sorts by: a number where the cell holds one, else its text.
 * @example sortKey(station, { key: 'source:Dip', label: 'Dip', width: 60, source: 'Dip' }) // 40, or '3O'
 */
export function sortKey(s: Station, column: TableColumn): number | string {
  switch (column.key) {
    case 'row':
      return s.row;
    case 'status':
      return s.problems.length;
    case 'attitude':
      return s.plane ? s.plane.dipDirection : s.line ? s.line.trend : '';
    case 'position':
      return s.lat ?? '';
    default: {
      const text = cellText(s, column).trim();
      const n = text === '' ? Number.NaN : Number(text);
      return Number.isFinite(n) ? n : text;
    }
  }
}

function compareKeys(a: number | string, b: number | string): number {
  if (a === '' || b === '') return a === b ? 0 : a === '' ? 1 : -1; // empty last, whichever way
  if (typeof a === 'number' && typeof b === 'number') return a - b;
  if (typeof a === 'number') return -1;
  if (typeof b === 'number') return 1;
  return collator.compare(a, b);
}

/**
 * The rows to render for a scroll position: from `first` to `last` (exclusive), with `overscan`
 * rows beyond each edge so fast scrolling shows no gap.
 * @example visibleWindow(2600, 320, 26, 10_000) // { first: 94, last: 119 }
 */
export function visibleWindow(scrollTop: number, viewportHeight: number, rowHeight: number, count: number, overscan = 6): { first: number; last: number } {
  const top = Math.max(0, Math.floor(scrollTop / rowHeight) - overscan);
  const bottom = Math.min(count, Math.ceil((scrollTop + viewportHeight) / rowHeight) + overscan);
  return { first: Math.min(top, count), last: Math.max(bottom, Math.min(top, count)) };
}

/**
 * The scroll position that brings row `position` into view, or the current one if it is
 * already fully visible (`headerHeight` is covered by the sticky header).
 * @example scrollToShow(500, 0, 320, 26, 26) // 12732: row 500 at the bottom edge
 */
export function scrollToShow(position: number, scrollTop: number, viewportHeight: number, rowHeight: number, headerHeight = 0): number {
  const top = position * rowHeight;
  const bottom = top + rowHeight;
  const visibleTop = scrollTop;
  const visibleBottom = scrollTop + viewportHeight - headerHeight;
  if (top >= visibleTop && bottom <= visibleBottom) return scrollTop;
  if (top < visibleTop) return top;
  return Math.max(0, bottom - (viewportHeight - headerHeight));
}
