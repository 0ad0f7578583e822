/**
 * The numbers of the net panel as CSV and JSON files: the same fields as the numbers block
 * (netFields), with the selection, net, date, method, warnings and the caution. Values that
 * cannot be given are empty (CSV) or null (JSON), each with its reason; no file ever holds
 * NaN or Infinity.
 */
import type { FoldWarning } from '../../core/foldAnalysis';
import type { NetKind } from '../../core/netProjection';
import { EXPORT_CAUTION } from './exportSvg';
import type { NetField } from './netNumbers';

/** What the numbers are about. */
export interface NumbersExportMeta {
  /** The selection as the user named it (data text, written verbatim). */
  readonly selection: string;
  readonly net: NetKind;
  /** Date of the export, e.g. an ISO date. */
  readonly date: string;
  /** How the numbers were obtained. */
  readonly method: string;
}

/** Said in every CSV, since it changes how some text cells are written. */
export const CSV_FORMULA_NOTE = "Text cells that begin with =, +, -, @ or a tab are written with a leading ' so spreadsheets do not run them as formulas.";

/**
 * One CSV cell (RFC 4180): quoted when it holds a comma, quote, line break or edge spaces.
 * Text that a spreadsheet would take as a formula gets a leading apostrophe (OWASP advice on
 * CSV injection); the file says so in a `note` row. Numbers are written as they are.
 * @example csvCell('a,b') // '"a,b"'
 * @example csvCell('=1+1') // "'=1+1"
 */
export function csvCell(value: string | number | null): string {
  if (value === null) return '';
  if (typeof value === 'number') return Number.isFinite(value) ? String(value) : '';
  let s = String(value);
  if (/^[=+\-@\t\r]/.test(s)) s = `'${s}`;
  return /[",\r\n]|^\s|\s$/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

/**
 * The numbers as CSV with columns key, label, value, unit, note: first the selection, net,
 * date, method and caution, then every field, then one row per warning.
 * @example numbersToCsv(netFields({analysis}), analysis.warnings, {selection: 'Ridge', net: 'equal-area', date: '2025-06-01', method: analysis.method})
 */
export function numbersToCsv(fields: readonly NetField[], warnings: readonly FoldWarning[], meta: NumbersExportMeta): string {
  const rows: (string | number | null)[][] = [['key', 'label', 'value', 'unit', 'note']];
  rows.push(['selection', 'Selection', meta.selection, '', null]);
  rows.push(['net', 'Net', `${meta.net}, lower hemisphere`, '', null]);
  rows.push(['date', 'Exported', meta.date, '', null]);
  rows.push(['method', 'Method', meta.method, '', null]);
  rows.push(['caution', 'Caution', EXPORT_CAUTION, '', null]);
  rows.push(['csv_note', 'Note', CSV_FORMULA_NOTE, '', null]);
  for (const f of fields) rows.push([f.key, f.label, f.value, f.unit, f.note]);
  warnings.forEach((w, i) => rows.push([`warning_${i + 1}`, `Warning (${w.code})`, w.message, '', null]));
  return `${rows.map((r) => r.map(csvCell).join(',')).join('\r\n')}\r\n`;
}

/** Shape of the JSON export. */
export interface NumbersJson {
  readonly format: 'foldlens-net-numbers';
  readonly version: 1;
  readonly selection: string;
  readonly net: NetKind;
  readonly hemisphere: 'lower';
  readonly date: string;
  readonly method: string;
  readonly caution: string;
  readonly fields: Readonly<Record<string, { label: string; value: number | string | null; unit: string; note: string | null }>>;
  readonly warnings: readonly FoldWarning[];
}

/**
 * The numbers as a JSON object (see NumbersJson). Non-finite numbers become null with a note.
 * @example JSON.parse(numbersToJson(fields, [], meta)).fields.axis_trend.value // 40.2
 */
export function numbersToJsonObject(fields: readonly NetField[], warnings: readonly FoldWarning[], meta: NumbersExportMeta): NumbersJson {
  const out: Record<string, { label: string; value: number | string | null; unit: string; note: string | null }> = {};
  for (const f of fields) {
    const bad = typeof f.value === 'number' && !Number.isFinite(f.value);
    out[f.key] = { label: f.label, value: bad ? null : f.value, unit: f.unit, note: bad ? 'not a finite number' : f.note };
  }
  return {
    format: 'foldlens-net-numbers',
    version: 1,
    selection: meta.selection,
    net: meta.net,
    hemisphere: 'lower',
    date: meta.date,
    method: meta.method,
    caution: EXPORT_CAUTION,
    fields: out,
    warnings: warnings.map((w) => ({ code: w.code, message: w.message })),
  };
}

/**
 * The JSON export as text (2-space indent). "<", ">" and "&" are written as \u escapes, so
 * the text stays inert even if someone pastes it into an HTML page.
 * @example numbersToJson(fields, [], meta).includes('<') // false
 */
export function numbersToJson(fields: readonly NetField[], warnings: readonly FoldWarning[], meta: NumbersExportMeta): string {
  return JSON.stringify(numbersToJsonObject(fields, warnings, meta), null, 2)
    .replace(/</g, '\\u003c')
    .replace(/>/g, '\\u003e')
    .replace(/&/g, '\\u0026');
}
