import Papa from 'papaparse';
import { describeProblem, isUsable, type RowProblem } from '../../core/station';
import type { ProjectDataset } from '../../io/projectFile';

/**
 * The validation report of an import: how many rows were read, how many can be used, and every
 * problem of every row that cannot (row number, column, value as written, what was expected).
 * Rows with problems are kept in the dataset, flagged; this report only lists them.
 */

/** What an import found. */
export interface ImportReport {
  readonly fileName: string;
  readonly format: 'csv' | 'geojson';
  /** Data rows read (one station each). */
  readonly rows: number;
  readonly usable: number;
  readonly withProblems: number;
  /** Blank rows skipped (they keep their numbers). */
  readonly blankRows: readonly number[];
  /** What the reader noted (e.g. a name given to a blank header). */
  readonly notes: readonly string[];
  /** Every problem, in row order. */
  readonly problems: readonly RowProblem[];
  /** Problems counted by column, most first. */
  readonly byColumn: readonly { readonly column: string; readonly count: number }[];
}

/**
 * The report of a dataset (also after edits or a restore).
 * @example reportOf(dataset).withProblems // 5 for the Korvane sample
 */
export function reportOf(dataset: ProjectDataset): ImportReport {
  let usable = 0;
  let withProblems = 0;
  const problems: RowProblem[] = [];
  const counts = new Map<string, number>();
  for (const s of dataset.stations) {
    if (isUsable(s)) usable++;
    if (s.problems.length > 0) withProblems++;
    for (const p of s.problems) {
      problems.push(p);
      counts.set(p.column, (counts.get(p.column) ?? 0) + 1);
    }
  }
  return {
    fileName: dataset.name,
    format: dataset.table.format,
    rows: dataset.stations.length,
    usable,
    withProblems,
    blankRows: dataset.table.blankRows,
    notes: dataset.table.notes,
    problems,
    byColumn: [...counts].map(([column, count]) => ({ column, count })).sort((a, b) => b.count - a.count || a.column.localeCompare(b.column)),
  };
}

/**
 * The problems as CSV (row, column, value, expected, message), one line each, for a spreadsheet.
 * @example problemsToCsv([{ row: 3, column: 'dip', value: '95', expected: 'a dip from 0 to 90' }])
 * // 'row,column,value,expected,message\n3,dip,95,a dip from 0 to 90,"row 3, column dip: ""95""; expected a dip from 0 to 90"'
 */
export function problemsToCsv(problems: readonly RowProblem[]): string {
  return Papa.unparse(
    { fields: ['row', 'column', 'value', 'expected', 'message'], data: problems.map((p) => [String(p.row), p.column, p.value, p.expected, describeProblem(p)]) },
    { newline: '\n', escapeFormulae: true },
  );
}
