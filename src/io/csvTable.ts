import Papa from 'papaparse';

/**
 * Reading delimited text (CSV, TSV, semicolon- or pipe-separated) into a table of strings.
 *
 * Row numbering, used in every message Foldlens writes about a table: the header is row 0
 * and data rows count 1, 2, 3... from there, blank rows included (they are skipped, but they
 * still take a number). With the header on the first line of the file this is the spreadsheet
 * row number minus one, and the file line number minus one as long as no quoted field spans
 * several lines (a quoted field with line breaks is one row, as in a spreadsheet). This is the
 * convention of `Station.row` in `src/core/station.ts`.
 *
 * Pure functions on strings and bytes; no DOM.
 */

/** Why a text could not be read as a table at all. */
export type CsvErrorCode =
  | 'binary'
  | 'encoding'
  | 'empty'
  | 'no-header'
  | 'duplicate-column'
  | 'no-data-rows'
  | 'unclosed-quote'
  | 'bad-delimiter';

/**
 * The only error the table reader throws. `row` is set when one row is to blame.
 * @example
 * try { readCsv(''); } catch (e) { if (e instanceof CsvError) console.log(e.code); } // 'empty'
 */
export class CsvError extends Error {
  readonly code: CsvErrorCode;
  readonly row?: number;
  constructor(code: CsvErrorCode, message: string, row?: number) {
    super(message);
    this.name = 'CsvError';
    this.code = code;
    if (row !== undefined) this.row = row;
  }
}

/** One data row: its number (header = 0) and every field by header name, exactly as read. */
export interface CsvRow {
  readonly row: number;
  readonly values: Readonly<Record<string, string>>;
  /**
   * Non-empty fields beyond the last header column. They have no name, so they cannot go
   * into `values`; they are kept here so nothing is lost, and readers report them.
   */
  readonly extra?: readonly string[];
}

/** A table read from delimited text. */
export interface CsvTable {
  /** Column names in file order, exactly as written (a UTF-8 byte-order mark is removed). */
  readonly headers: readonly string[];
  /** Data rows that hold at least one non-blank field. */
  readonly rows: readonly CsvRow[];
  /** Numbers of the blank rows that were skipped (they keep their numbers). */
  readonly blankRows: readonly number[];
  /** The field delimiter used. */
  readonly delimiter: string;
  /** Things the reader did that the user should hear about (e.g. a name given to a blank header). */
  readonly notes: readonly string[];
}

/** Options for {@link readCsv}. */
export interface CsvOptions {
  /** Field delimiter: one character, or the words "comma", "tab", "semicolon", "pipe"; default: detect. */
  readonly delimiter?: string;
}

/** Delimiters tried when none is given, in order of preference on a tie. */
export const DELIMITERS_TO_GUESS = [',', '\t', ';', '|'] as const;

const DELIMITER_WORDS: Readonly<Record<string, string>> = {
  comma: ',',
  tab: '\t',
  '\\t': '\t',
  semicolon: ';',
  pipe: '|',
  space: ' ',
};

/**
 * Decodes file bytes as UTF-8, refusing anything that is not text.
 * Throws {@link CsvError} `binary` for NUL bytes (spreadsheet workbooks, images...) and
 * `encoding` for invalid UTF-8, naming the byte offset.
 * @example
 * decodeText(new TextEncoder().encode('id,dip\n1,30')) // 'id,dip\n1,30'
 */
export function decodeText(bytes: Uint8Array): string {
  rejectBinaryBytes(bytes);
  try {
    return new TextDecoder('utf-8', { fatal: true, ignoreBOM: false }).decode(bytes);
  } catch {
    const at = firstInvalidUtf8(bytes);
    throw new CsvError(
      'encoding',
      `the file is not valid UTF-8 (first bad byte at offset ${at}); save it as "CSV UTF-8" and try again`,
    );
  }
}

/**
 * Reads delimited text into a {@link CsvTable}. Throws only {@link CsvError}.
 * @example
 * const t = readCsv('id;dip\nA;30\n\nB;40');
 * t.delimiter // ';'
 * t.rows.map((r) => r.row) // [1, 3]  (row 2 is blank)
 */
export function readCsv(text: string, options: CsvOptions = {}): CsvTable {
  const clean = stripBom(text);
  rejectBinaryText(clean);
  if (clean.trim() === '') throw new CsvError('empty', 'the file is empty: expected a header row and at least one data row');

  const notes: string[] = [];
  const { text: body, mixed } = normaliseNewlines(clean);
  const newline = '\n';
  if (mixed) notes.push('the file mixes Windows and Unix line endings; read both as line breaks');

  const delimiter = options.delimiter !== undefined ? resolveDelimiter(options.delimiter) : guessDelimiter(body, newline);
  const parsed = Papa.parse<string[]>(body, { delimiter, newline, header: false, skipEmptyLines: false, quoteChar: '"' });
  const quoteError = parsed.errors.find((e) => e.code === 'MissingQuotes');
  if (quoteError) {
    const row = recordIndexToRow(parsed.data, quoteError.row ?? 0);
    throw new CsvError('unclosed-quote', `row ${row}: a quoted field is opened but never closed (a lone " character)`, row);
  }

  const records = parsed.data;
  // Leading blank records are not the header; the header is the first record with content.
  let start = 0;
  while (start < records.length && isBlank(records[start])) start++;
  const headerRecord = records[start] ?? [];
  const headers = nameHeaders(headerRecord, notes);
  checkDuplicates(headers);
  if (looksLikeData(headerRecord)) {
    throw new CsvError(
      'no-header',
      `the first row (${headerRecord.slice(0, 4).join(delimiter)}${headerRecord.length > 4 ? delimiter + '...' : ''}) looks like data, not column names; add a header row naming the columns`,
    );
  }

  const rows: CsvRow[] = [];
  const blankRows: number[] = [];
  for (let i = start + 1; i < records.length; i++) {
    const record = records[i];
    const row = i - start;
    if (isBlank(record)) {
      // The record after the final line break is not a row anyone typed.
      if (!(i === records.length - 1 && record.length === 1 && record[0] === '')) blankRows.push(row);
      continue;
    }
    // fromEntries defines own properties, so even a column named "__proto__" is kept as data.
    const values: Record<string, string> = Object.fromEntries(headers.map((h, c) => [h, record[c] ?? '']));
    const extra = record.slice(headers.length);
    rows.push(extra.some((v) => v.trim() !== '') ? { row, values, extra } : { row, values });
  }
  if (rows.length === 0) {
    throw new CsvError('no-data-rows', `the file has a header (${headers.join(', ')}) but no data rows`);
  }
  return { headers, rows, blankRows, delimiter, notes };
}

/**
 * Turns a delimiter option ("tab", ";", "\\t"...) into the character, or throws {@link CsvError}.
 * @example resolveDelimiter('tab') // '\t'
 */
export function resolveDelimiter(given: string): string {
  const word = DELIMITER_WORDS[given.toLowerCase()];
  if (word !== undefined) return word;
  if (given.length === 1 && given !== '"' && given !== '\n' && given !== '\r') return given;
  throw new CsvError('bad-delimiter', `"${given}" is not a delimiter: expected one character or comma, tab, semicolon, pipe, space`);
}

function stripBom(text: string): string {
  return text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
}

function rejectBinaryBytes(bytes: Uint8Array): void {
  // Spreadsheet workbooks (.xlsx, .ods) are zip archives: say so plainly.
  if (bytes.length >= 4 && bytes[0] === 0x50 && bytes[1] === 0x4b && bytes[2] === 0x03 && bytes[3] === 0x04) {
    throw new CsvError('binary', 'this is a zip archive (perhaps a spreadsheet workbook), not text: export the sheet as CSV');
  }
  const at = bytes.indexOf(0);
  if (at >= 0) throw new CsvError('binary', `the file holds binary data (a NUL byte at offset ${at}), not delimited text`);
}

function rejectBinaryText(text: string): void {
  if (text.startsWith('PK\u0003\u0004')) {
    throw new CsvError('binary', 'this is a zip archive (perhaps a spreadsheet workbook), not text: export the sheet as CSV');
  }
  const nul = text.indexOf('\u0000');
  if (nul >= 0) throw new CsvError('binary', `the file holds binary data (a NUL character at position ${nul}), not delimited text`);
  // U+FFFD is what a decoder leaves where bytes were not valid in its encoding.
  const bad = text.indexOf('\ufffd');
  if (bad >= 0) {
    throw new CsvError(
      'encoding',
      `the text holds a replacement character (U+FFFD) at position ${bad}, so it was not decoded correctly; save the file as "CSV UTF-8"`,
    );
  }
}

/**
 * Offset of the first byte that makes `bytes` invalid UTF-8. With `final` false (a chunk of a
 * longer stream), a character cut short at the end is not an error and the length is returned.
 * @example firstInvalidUtf8(new Uint8Array([0x41, 0xff])) // 1
 */
export function firstInvalidUtf8(bytes: Uint8Array, final = true): number {
  // Bisection on "this prefix holds no invalid sequence" (decoding in stream mode leaves an
  // unfinished character at the end pending instead of failing, so the test is monotone).
  const validPrefix = (n: number): boolean => {
    try {
      new TextDecoder('utf-8', { fatal: true }).decode(bytes.subarray(0, n), { stream: true });
      return true;
    } catch {
      return false;
    }
  };
  if (validPrefix(bytes.length)) {
    if (!final) return bytes.length;
    // Only the end is wrong: a character cut short. Point at its first byte.
    let at = bytes.length - 1;
    while (at > 0 && (bytes[at] & 0xc0) === 0x80) at--;
    return at;
  }
  let lo = 0;
  let hi = bytes.length;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (validPrefix(mid)) lo = mid;
    else hi = mid;
  }
  // Byte `lo` made the text invalid; if a character was pending before it, point at that
  // character's lead byte, which is where the bad sequence starts.
  for (let j = lo - 1; j >= Math.max(0, lo - 3); j--) {
    if ((bytes[j] & 0xc0) === 0xc0) {
      const length = bytes[j] >= 0xf0 ? 4 : bytes[j] >= 0xe0 ? 3 : 2;
      return j + length > lo ? j : lo;
    }
    if ((bytes[j] & 0xc0) !== 0x80) break;
  }
  return lo;
}

/**
 * Turns every line break outside quoted fields into "\n" (Windows "\r\n", old Mac "\r"), so
 * that files mixing them read as the user sees them, while line breaks inside quoted fields
 * stay exactly as typed.
 */
function normaliseNewlines(text: string): { text: string; mixed: boolean } {
  const kinds = new Set<string>();
  let out = '';
  let inQuotes = false;
  let from = 0;
  for (let i = 0; i < text.length; i++) {
    const ch = text[i];
    if (ch === '"') inQuotes = !inQuotes;
    else if (!inQuotes && ch === '\r') {
      const crlf = text[i + 1] === '\n';
      kinds.add(crlf ? 'crlf' : 'cr');
      out += text.slice(from, i) + '\n';
      if (crlf) i++;
      from = i + 1;
    } else if (!inQuotes && ch === '\n') kinds.add('lf');
  }
  return { text: from === 0 ? text : out + text.slice(from), mixed: kinds.size > 1 };
}

/**
 * Picks the delimiter that splits the first non-blank lines into the same number (> 1) of
 * fields most consistently. Papaparse's own guess is thrown off by blank lines, hence our own.
 */
function guessDelimiter(text: string, newline: '\n'): string {
  let best: { delimiter: string; score: number } = { delimiter: ',', score: -1 };
  for (const delimiter of DELIMITERS_TO_GUESS) {
    const sample = Papa.parse<string[]>(text, { delimiter, newline, preview: 60, skipEmptyLines: 'greedy' }).data.slice(0, 30);
    if (sample.length === 0) continue;
    const counts = sample.map((r) => r.length);
    const first = counts[0];
    if (first < 2) continue;
    const agreeing = counts.filter((c) => c === first).length / counts.length;
    const score = agreeing * 1000 + first;
    if (score > best.score) best = { delimiter, score };
  }
  return best.delimiter;
}

function isBlank(record: readonly string[]): boolean {
  return record.every((v) => v.trim() === '');
}

function recordIndexToRow(records: readonly (readonly string[])[], index: number): number {
  let start = 0;
  while (start < records.length && isBlank(records[start])) start++;
  return Math.max(0, index - start);
}

function nameHeaders(record: readonly string[], notes: string[]): string[] {
  // Trailing blank header cells beyond the last named column are common in spreadsheet exports.
  let end = record.length;
  while (end > 0 && record[end - 1].trim() === '') end--;
  return record.slice(0, Math.max(end, 1)).map((h, i) => {
    if (h.trim() !== '') return h;
    const name = `column ${i + 1}`;
    notes.push(`column ${i + 1} has no name in the header; called it "${name}"`);
    return name;
  });
}

function checkDuplicates(headers: readonly string[]): void {
  const seen = new Map<string, number>();
  headers.forEach((h, i) => {
    const before = seen.get(h);
    if (before !== undefined) {
      throw new CsvError(
        'duplicate-column',
        `columns ${before + 1} and ${i + 1} are both named "${h}"; rename one so every column has its own name`,
        0,
      );
    }
    seen.set(h, i);
  });
}

/** A plain number, or an attitude: digits, signs, separators and compass letters, with at least two digits. */
const NUMBER_LIKE = /^[+-]?\d+(?:[.,]\d+)?$/;
const ATTITUDE_LIKE = /^(?=(?:.*\d){2})[\d\s.,+\-/°'"NESWnesw]*$/;

function looksLikeData(record: readonly string[]): boolean {
  const cells = record.map((c) => c.trim()).filter((c) => c !== '');
  return cells.length > 0 && cells.every((c) => NUMBER_LIKE.test(c) || ATTITUDE_LIKE.test(c));
}
