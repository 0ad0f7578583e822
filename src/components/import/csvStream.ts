import Papa from 'papaparse';
import { CsvError, firstInvalidUtf8, readCsv, type CsvOptions, type CsvRow } from '../../io/csvTable';

/**
 * Reading delimited text that arrives in pieces (a large file read in chunks in a worker) into
 * the same rows `readCsv` (io/csvTable.ts) gives for the whole text: same headers, same row
 * numbers (header = row 0, blank rows counted), same values, same errors.
 *
 * How: the head of the text (the first `headChars` characters, cut after the last complete
 * record) goes through `readCsv` itself, which settles the delimiter, the header and every
 * header error; the rest is cut into records by papaparse's own `Parser` with that delimiter,
 * chunk by chunk, the incomplete last record carried over (as papaparse's streamers do). A text
 * no longer than the head is simply given to `readCsv` whole. Line breaks are made "\n" on the
 * way in by the rule readCsv uses (outside quoted fields only), so a record may span chunks.
 *
 * A record longer than `maxRecordChars` (default 1 MiB) stops the reading with the message
 * readCsv gives for a quote that is never closed: that is nearly always what it is, and it
 * keeps a broken file from being re-scanned to the end on every chunk.
 */

/** Options for {@link CsvStreamReader}. */
export interface CsvStreamOptions extends CsvOptions {
  /** Characters read whole before streaming starts (default 1 MiB). */
  readonly headChars?: number;
  /** Longest record accepted, in characters (default 1 MiB). */
  readonly maxRecordChars?: number;
}

/** What is known once the header has been read. */
export interface CsvStreamHead {
  readonly headers: readonly string[];
  readonly delimiter: string;
}

/** Everything but the rows, once the text has ended: as a CsvTable without `rows`. */
export interface CsvStreamSummary extends CsvStreamHead {
  readonly blankRows: readonly number[];
  readonly notes: readonly string[];
  readonly rowCount: number;
}

/** readCsv's note for a file that mixes line endings (csvTable.ts); the streamed tail adds it itself. */
const MIXED_NOTE = 'the file mixes Windows and Unix line endings; read both as line breaks';

/**
 * Turns every line break outside quoted fields into "\n", chunk by chunk: the same rule as
 * readCsv's own (a quote character flips "inside a quoted field"), with a "\r" at the end of one
 * chunk waiting for the next to see whether "\n" follows.
 * @example const n = new NewlineNormaliser(); n.push('a\r') + n.push('\nb') + n.end() // 'a\nb'
 */
export class NewlineNormaliser {
  private inQuotes = false;
  private pendingCr = false;
  private readonly kinds = new Set<string>();

  /** Whether the text so far used more than one kind of line ending. */
  get mixed(): boolean {
    return this.kinds.size > 1;
  }

  push(text: string): string {
    let out = '';
    let from = 0;
    let i = 0;
    if (this.pendingCr) {
      this.pendingCr = false;
      const crlf = text[0] === '\n';
      this.kinds.add(crlf ? 'crlf' : 'cr');
      out = '\n';
      if (crlf) i = from = 1;
    }
    for (; i < text.length; i++) {
      const ch = text.charCodeAt(i);
      if (ch === 34 /* " */) this.inQuotes = !this.inQuotes;
      else if (!this.inQuotes && ch === 13 /* \r */) {
        out += text.slice(from, i);
        if (i === text.length - 1) {
          this.pendingCr = true;
          return out;
        }
        const crlf = text.charCodeAt(i + 1) === 10;
        this.kinds.add(crlf ? 'crlf' : 'cr');
        out += '\n';
        if (crlf) i++;
        from = i + 1;
      } else if (!this.inQuotes && ch === 10) this.kinds.add('lf');
    }
    return from === 0 && out === '' ? text : out + text.slice(from);
  }

  end(): string {
    if (!this.pendingCr) return '';
    this.pendingCr = false;
    this.kinds.add('cr');
    return '\n';
  }
}

/**
 * Reads delimited text pushed in pieces; calls `onRows` with each batch of complete data rows.
 * Throws only CsvError, from `push` or `end`.
 * @example
 * const rows: CsvRow[] = [];
 * const r = new CsvStreamReader({}, (batch) => rows.push(...batch));
 * r.push('id,dip\nA,3'); r.push('0\n\nB,40\n');
 * r.end().blankRows // [2]; rows.map((x) => x.values.dip) // ['30', '40']
 */
export class CsvStreamReader {
  private readonly options: CsvOptions;
  private headChars: number;
  private readonly maxHeadChars: number;
  private readonly maxRecordChars: number;
  private readonly normaliser = new NewlineNormaliser();
  private rawHead = '';
  private normHead = '';
  private head: (CsvStreamHead & { notes: readonly string[] }) | undefined;
  private parser: Papa.Parser | undefined;
  private partial = '';
  private nextRow = 0;
  private rowCount = 0;
  private readonly blankRows: number[] = [];
  private ended = false;
  private charsSeen = 0;
  private bom = false;

  constructor(
    options: CsvStreamOptions,
    private readonly onRows: (rows: CsvRow[], head: CsvStreamHead) => void,
  ) {
    this.options = options.delimiter !== undefined ? { delimiter: options.delimiter } : {};
    this.headChars = Math.max(1, options.headChars ?? 1 << 20);
    this.maxRecordChars = Math.max(1, options.maxRecordChars ?? 1 << 20);
    this.maxHeadChars = Math.max(this.headChars * 16, 16 << 20);
  }

  /** The header and delimiter, once the head has been read. */
  get header(): CsvStreamHead | undefined {
    return this.head;
  }

  push(text: string): void {
    if (this.ended) throw new Error('CsvStreamReader: push after end');
    if (text === '') return;
    const seen = this.charsSeen;
    if (seen === 0) this.bom = text.charCodeAt(0) === 0xfeff;
    this.charsSeen += text.length;
    const norm = this.normaliser.push(text);
    if (this.head === undefined) {
      this.rawHead += text;
      this.normHead += norm;
      if (this.normHead.length >= this.headChars) this.settleHead();
      return;
    }
    this.checkText(text, seen);
    this.feed(norm);
  }

  /** Refuses text that is not text, as readCsv does (position counted without a byte-order mark). */
  private checkText(text: string, seen: number): void {
    const bom = seen === 0 && text.charCodeAt(0) === 0xfeff ? 1 : 0;
    const at = seen - (seen > 0 && this.bom ? 1 : 0) - bom;
    const nul = text.indexOf('\u0000');
    if (nul >= 0) throw new CsvError('binary', `the file holds binary data (a NUL character at position ${at + nul}), not delimited text`);
    const bad = text.indexOf('\ufffd');
    if (bad >= 0) {
      throw new CsvError(
        'encoding',
        `the text holds a replacement character (U+FFFD) at position ${at + bad}, so it was not decoded correctly; save the file as "CSV UTF-8"`,
      );
    }
  }

  end(): CsvStreamSummary {
    if (this.ended) throw new Error('CsvStreamReader: end called twice');
    this.ended = true;
    const norm = this.normaliser.end();
    if (this.head === undefined) {
      // The whole text fitted in the head: readCsv reads it exactly as it would any text.
      const table = readCsv(this.rawHead, this.options);
      this.rawHead = this.normHead = '';
      this.rowCount = table.rows.length;
      if (table.rows.length > 0) this.onRows(table.rows.slice(), table);
      return { headers: table.headers, delimiter: table.delimiter, blankRows: table.blankRows, notes: table.notes, rowCount: table.rows.length };
    }
    this.feed(norm);
    const result = this.parser!.parse(this.partial, 0, false) as Papa.ParseResult<string[]>;
    const missing = result.errors.find((e) => e.code === 'MissingQuotes');
    if (missing) {
      const row = this.nextRow + (missing.row ?? 0);
      throw new CsvError('unclosed-quote', `row ${row}: a quoted field is opened but never closed (a lone " character)`, row);
    }
    this.partial = '';
    this.records(result.data);
    const notes = this.normaliser.mixed ? [MIXED_NOTE, ...this.head.notes] : this.head.notes;
    return { headers: this.head.headers, delimiter: this.head.delimiter, blankRows: this.blankRows, notes, rowCount: this.rowCount };
  }

  private settleHead(): void {
    // readCsv looks at the whole text for these before anything else; so does the head.
    this.checkText(this.rawHead, 0);
    const cut = lastRecordEnd(this.normHead);
    const last = this.normHead.length > this.maxHeadChars;
    // readCsv guesses the delimiter from the first 30 non-blank records: the head must hold them all.
    const enough = this.options.delimiter !== undefined || contentRecords(this.normHead, cut) >= GUESS_RECORDS || last;
    if (cut > 0 && enough) {
      try {
        const table = readCsv(this.normHead.slice(0, cut), this.options);
        const lastRow = Math.max(table.rows.at(-1)?.row ?? 0, table.blankRows.at(-1) ?? 0);
        this.head = { headers: table.headers, delimiter: table.delimiter, notes: table.notes };
        this.parser = new Papa.Parser({ delimiter: table.delimiter, newline: '\n', quoteChar: '"' });
        this.nextRow = lastRow + 1;
        this.rowCount = table.rows.length;
        this.blankRows.push(...table.blankRows);
        const rest = this.normHead.slice(cut);
        this.rawHead = this.normHead = '';
        this.onRows(table.rows.slice(), this.head);
        this.feed(rest);
        return;
      } catch (e) {
        // Only the end of the text can settle these: read on, with a longer head.
        const later = e instanceof CsvError && (e.code === 'no-data-rows' || e.code === 'empty' || e.code === 'unclosed-quote');
        if (!later || last) throw e;
      }
    }
    if (last) {
      throw new CsvError(
        'unclosed-quote',
        `the first ${this.maxHeadChars} characters hold no complete data row: a quoted field is probably opened but never closed (a lone " character)`,
      );
    }
    this.headChars = this.normHead.length * 2;
  }

  private feed(text: string): void {
    if (text === '') return;
    const aggregate = this.partial + text;
    const result = this.parser!.parse(aggregate, 0, true) as Papa.ParseResult<string[]>;
    this.partial = aggregate.slice(result.meta.cursor);
    this.records(result.data);
    if (this.partial.length > this.maxRecordChars) {
      throw new CsvError(
        'unclosed-quote',
        `row ${this.nextRow}: a quoted field is opened but never closed (a lone " character), or the row is longer than ${this.maxRecordChars} characters`,
        this.nextRow,
      );
    }
  }

  private records(records: readonly string[][]): void {
    if (records.length === 0) return;
    const headers = this.head!.headers;
    const rows: CsvRow[] = [];
    for (const record of records) {
      const row = this.nextRow++;
      if (record.every((v) => v.trim() === '')) {
        this.blankRows.push(row);
        continue;
      }
      // As readCsv: own properties (a column named "__proto__" stays data), extra fields kept aside.
      // A plain loop: Object.fromEntries would make a small array per field, and GC time dominates here.
      const values: Record<string, string> = {};
      for (let c = 0; c < headers.length; c++) {
        const h = headers[c];
        if (h === '__proto__') Object.defineProperty(values, h, { value: record[c] ?? '', enumerable: true, writable: true, configurable: true });
        else values[h] = record[c] ?? '';
      }
      const extra = record.slice(headers.length);
      rows.push(extra.some((v) => v.trim() !== '') ? { row, values, extra } : { row, values });
    }
    this.rowCount += rows.length;
    if (rows.length > 0) this.onRows(rows, this.head!);
  }
}

/** Records readCsv's delimiter guess looks at (csvTable.ts: the first 30 non-blank records). */
const GUESS_RECORDS = 30;

/**
 * Records in text[0, end) that hold something besides blanks, quotes and the delimiters readCsv
 * guesses among, so that they count as non-blank whichever delimiter is guessed; stops at the need.
 */
function contentRecords(text: string, end: number): number {
  let count = 0;
  let content = false;
  let inQuotes = false;
  for (let i = 0; i < end && count < GUESS_RECORDS; i++) {
    const ch = text[i];
    if (ch === '"') inQuotes = !inQuotes;
    else if (ch === '\n' && !inQuotes) {
      if (content) count++;
      content = false;
    } else if (!content && ch.trim() !== '' && !',;|\t'.includes(ch)) content = true;
  }
  return count;
}

/** Index just after the last "\n" that lies outside quoted fields (by the quote-flip rule), or 0. */
function lastRecordEnd(text: string): number {
  let inQuotes = false;
  let end = 0;
  for (let i = 0; i < text.length; i++) {
    const ch = text.charCodeAt(i);
    if (ch === 34) inQuotes = !inQuotes;
    else if (ch === 10 && !inQuotes) end = i + 1;
  }
  return end;
}

/**
 * Decodes UTF-8 bytes that arrive in pieces, refusing what is not text the way `decodeText`
 * (csvTable.ts) does for a whole file: a zip archive (a spreadsheet workbook), a NUL byte, or
 * invalid UTF-8, each named with its byte offset in the file. A byte-order mark is dropped.
 * @example new Utf8ChunkDecoder().push(new TextEncoder().encode('id,dip'), true) // 'id,dip'
 */
export class Utf8ChunkDecoder {
  private readonly decoder = new TextDecoder('utf-8', { fatal: true, ignoreBOM: false });
  private offset = 0;
  private tail: Uint8Array = new Uint8Array(0);

  push(bytes: Uint8Array, final = false): string {
    if (this.offset === 0 && bytes.length >= 4 && bytes[0] === 0x50 && bytes[1] === 0x4b && bytes[2] === 0x03 && bytes[3] === 0x04) {
      throw new CsvError('binary', 'this is a zip archive (perhaps a spreadsheet workbook), not text: export the sheet as CSV');
    }
    const nul = bytes.indexOf(0);
    if (nul >= 0) throw new CsvError('binary', `the file holds binary data (a NUL byte at offset ${this.offset + nul}), not delimited text`);
    let text: string;
    try {
      text = this.decoder.decode(bytes, { stream: !final });
    } catch {
      const joined = new Uint8Array(this.tail.length + bytes.length);
      joined.set(this.tail);
      joined.set(bytes, this.tail.length);
      const at = this.offset - this.tail.length + firstInvalidUtf8(joined, final);
      throw new CsvError('encoding', `the file is not valid UTF-8 (first bad byte at offset ${at}); save it as "CSV UTF-8" and try again`);
    }
    this.offset += bytes.length;
    this.tail = unfinishedTail(this.tail, bytes);
    return text;
  }
}

/** The bytes of a character still unfinished at the end of `before` + `bytes` (at most three). */
function unfinishedTail(before: Uint8Array, bytes: Uint8Array): Uint8Array {
  const kept = Math.min(3, before.length + bytes.length);
  const last = new Uint8Array(kept);
  const fromBytes = Math.min(kept, bytes.length);
  last.set(before.subarray(before.length - (kept - fromBytes)));
  last.set(bytes.subarray(bytes.length - fromBytes), kept - fromBytes);
  for (let j = last.length - 1; j >= 0; j--) {
    const b = last[j];
    if ((b & 0xc0) === 0x80) continue; // a continuation byte: look further back for its lead
    const length = b >= 0xf0 ? 4 : b >= 0xe0 ? 3 : b >= 0xc0 ? 2 : 1;
    return length > last.length - j ? last.slice(j) : new Uint8Array(0);
  }
  return new Uint8Array(0);
}

