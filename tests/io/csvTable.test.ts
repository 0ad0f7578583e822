import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import Papa from 'papaparse';
import { readCsv, decodeText, resolveDelimiter, CsvError, type CsvErrorCode } from '../../src/io/csvTable';
import { fuzzRuns, fuzzTimeout } from '../helpers/fuzzRuns';

/** Runs `f` and returns the CsvError code it throws (failing if it throws anything else or nothing). */
function csvErrorOf(f: () => unknown): { code: CsvErrorCode; message: string; row?: number } {
  try {
    f();
  } catch (e) {
    if (e instanceof CsvError) return { code: e.code, message: e.message, row: e.row };
    throw e;
  }
  return expect.fail('expected a CsvError');
}

describe('readCsv delimiters', () => {
  // Each row: a small table written with one delimiter; expected cells are what was typed.
  const rows = [
    { name: 'comma', text: 'id,dip\nA,30\nB,40', delimiter: ',' },
    { name: 'tab', text: 'id\tdip\nA\t30\nB\t40', delimiter: '\t' },
    { name: 'semicolon (decimal commas in Europe, common practice)', text: 'id;dip\nA;30,5\nB;40', delimiter: ';' },
    { name: 'pipe', text: 'id|dip\nA|30\nB|40', delimiter: '|' },
  ];
  for (const { name, text, delimiter } of rows) {
    it(`readCsv(text) detects the ${name} delimiter`, () => {
      const t = readCsv(text);
      expect(t.delimiter).toBe(delimiter);
      expect(t.headers).toEqual(['id', 'dip']);
      expect(t.rows.map((r) => r.values.id)).toEqual(['A', 'B']);
    });
  }

  it('readCsv(text) detects the delimiter even with blank lines and a trailing newline', () => {
    expect(readCsv('id\tdip\n\nA\t30\n\nB\t40\n').delimiter).toBe('\t');
  });

  it('readCsv(text, {delimiter}) uses the delimiter given, by character or by name', () => {
    expect(readCsv('a;b\n1;2', { delimiter: ';' }).rows[0].values).toEqual({ a: '1', b: '2' });
    expect(readCsv('a\tb\n1\t2', { delimiter: 'tab' }).rows[0].values).toEqual({ a: '1', b: '2' });
    // A comma-separated reading of semicolon text gives one column: the user's choice is followed.
    expect(readCsv('a;b\n1;2', { delimiter: ',' }).headers).toEqual(['a;b']);
  });

  it('resolveDelimiter(text) refuses a quote or a word it does not know', () => {
    expect(resolveDelimiter('pipe')).toBe('|');
    expect(csvErrorOf(() => resolveDelimiter('"')).code).toBe('bad-delimiter');
    expect(csvErrorOf(() => resolveDelimiter('colon-ish')).message).toMatch(/"colon-ish" is not a delimiter/);
  });
});

describe('readCsv quoting (RFC 4180, section 2)', () => {
  it('readCsv(text) keeps delimiters, line breaks and doubled quotes inside quoted fields', () => {
    // RFC 4180 §2 rules 6 and 7: fields with commas, line breaks or quotes are quoted; a quote is doubled.
    const t = readCsv('id,notes,dip\nA,"steep, near ""Old Quarry""\nsecond line",30\nB,plain,40');
    expect(t.rows[0].values.notes).toBe('steep, near "Old Quarry"\nsecond line');
    expect(t.rows[0].values.dip).toBe('30');
    // A quoted field spanning two lines is one row, as a spreadsheet shows it.
    expect(t.rows.map((r) => r.row)).toEqual([1, 2]);
  });

  it('readCsv(text) names the row of a quote that is never closed', () => {
    const e = csvErrorOf(() => readCsv('id,dip\nA,30\nB,"40\nC,50\n'));
    expect(e.code).toBe('unclosed-quote');
    expect(e.row).toBe(2);
    expect(e.message).toMatch(/^row 2: /);
  });

  it('readCsv(text) parses papaparse-written tables back to the same cells (property)', () => {
    // Papa.unparse is an independent writer of RFC 4180 text; what it writes must read back unchanged.
    // Cells drawn from the characters that make CSV hard: delimiters, quotes, both line breaks.
    const cell = fc.string({ unit: fc.constantFrom('a', '7', ' ', ',', ';', '\t', '"', '\n', '\r', 'ü'), maxLength: 12 });
    // Names start with a letter that is not a compass point, so no header can look like an attitude.
    const header = fc.stringMatching(/^[A-DF-MO-RT-VX-Za-df-mo-rt-vx-z][A-Za-z0-9_ ]{0,8}$/);
    fc.assert(
      fc.property(fc.uniqueArray(header, { minLength: 1, maxLength: 5 }), fc.integer({ min: 1, max: 6 }), fc.constantFrom(',', '\t', ';'), (headers, n, delimiter) => {
        fc.pre(headers.every((h) => h.trim() !== '' && h === h.trimEnd()));
        return fc.assert(
          fc.property(fc.array(fc.array(cell, { minLength: headers.length, maxLength: headers.length }), { minLength: n, maxLength: n }), (cells) => {
            // Rows that are all blank are skipped by design; keep one non-blank cell per row.
            const data = cells.map((r) => [`x${r[0]}`, ...r.slice(1)]);
            const text = Papa.unparse([headers, ...data], { delimiter, newline: '\n', quotes: true });
            const t = readCsv(text, { delimiter });
            expect(t.headers).toEqual(headers);
            expect(t.rows.map((r) => headers.map((h) => r.values[h]))).toEqual(data);
          }),
          { numRuns: 5 },
        );
      }),
      { numRuns: 40 },
    );
  });
});

describe('readCsv rows and headers', () => {
  it('readCsv(text) strips a UTF-8 byte-order mark from the first header', () => {
    expect(readCsv('\ufeffid,dip\nA,30').headers).toEqual(['id', 'dip']);
  });

  it('readCsv(text) skips blank rows but keeps counting them (header = row 0)', () => {
    const t = readCsv('id,dip\nA,30\n\n,\nB,40\n');
    expect(t.rows.map((r) => [r.row, r.values.id])).toEqual([
      [1, 'A'],
      [4, 'B'],
    ]);
    expect(t.blankRows).toEqual([2, 3]);
  });

  it('readCsv(text) counts rows from the header when blank lines come before it', () => {
    expect(readCsv('\n\nid,dip\nA,30').rows[0].row).toBe(1);
  });

  it('readCsv(text) reads Windows, Unix and mixed line endings alike', () => {
    for (const text of ['id,dip\r\nA,30\r\nB,40', 'id,dip\nA,30\nB,40', 'id,dip\r\nA,30\nB,40']) {
      expect(readCsv(text).rows.map((r) => r.values.dip)).toEqual(['30', '40']);
    }
    expect(readCsv('id,dip\r\nA,30\nB,40').notes.join()).toMatch(/line endings/);
  });

  it('readCsv(text) keeps values exactly as typed, spaces included', () => {
    expect(readCsv('id,dip\n A , 30 ').rows[0].values).toEqual({ id: ' A ', dip: ' 30 ' });
  });

  it('readCsv(text) keeps a column named __proto__ as data, not as a prototype', () => {
    const values = readCsv('__proto__,dip\nA,30').rows[0].values;
    expect(Object.getOwnPropertyDescriptor(values, '__proto__')?.value).toBe('A');
    expect(Object.getPrototypeOf(values)).toBe(Object.prototype);
  });

  it('readCsv(text) pads short rows and keeps non-empty extra fields aside', () => {
    const t = readCsv('id,dip,notes\nA,30\nB,40,x,surplus');
    expect(t.rows[0].values).toEqual({ id: 'A', dip: '30', notes: '' });
    expect(t.rows[0].extra).toBeUndefined();
    expect(t.rows[1].extra).toEqual(['surplus']);
  });

  it('readCsv(text) names a blank header cell by its position and says so', () => {
    const t = readCsv('id,,dip\nA,x,30');
    expect(t.headers).toEqual(['id', 'column 2', 'dip']);
    expect(t.notes).toEqual(['column 2 has no name in the header; called it "column 2"']);
  });

  it('readCsv(text) reports duplicate column names instead of renaming them', () => {
    const e = csvErrorOf(() => readCsv('id,dip,Dip,dip\nA,1,2,3'));
    expect(e.code).toBe('duplicate-column');
    expect(e.message).toBe('columns 2 and 4 are both named "dip"; rename one so every column has its own name');
  });

  it('readCsv(text) spots a missing header when the first row looks like data', () => {
    for (const text of ['120,30\n130,35', '045/30E,12.5\n050/31E,13', 'N30E,30\nN35E,31']) {
      const e = csvErrorOf(() => readCsv(text));
      expect(e.code).toBe('no-header');
      expect(e.message).toMatch(/looks like data, not column names/);
    }
  });
});

describe('readCsv refusals', () => {
  const rows: { name: string; text: string; code: CsvErrorCode; message: RegExp }[] = [
    { name: 'an empty file', text: '', code: 'empty', message: /empty/ },
    { name: 'only blank lines', text: '\n \n\t\n', code: 'empty', message: /empty/ },
    { name: 'a header without data', text: 'id,dip\n\n', code: 'no-data-rows', message: /header \(id, dip\) but no data rows/ },
    { name: 'a NUL character', text: 'id,dip\nA,3\u00000', code: 'binary', message: /binary data/ },
    { name: 'a zip archive (spreadsheet workbook)', text: 'PK\u0003\u0004rest', code: 'binary', message: /zip archive/ },
    { name: 'a replacement character from a wrong decoding', text: 'id,dip\nQuarry \ufffd,30', code: 'encoding', message: /U\+FFFD/ },
  ];
  for (const { name, text, code, message } of rows) {
    it(`readCsv(text) refuses ${name} with a CsvError "${code}"`, () => {
      const e = csvErrorOf(() => readCsv(text));
      expect(e.code).toBe(code);
      expect(e.message).toMatch(message);
    });
  }

  it('decodeText(bytes) decodes UTF-8 and names the offset of an invalid byte', () => {
    expect(decodeText(new TextEncoder().encode('id,note\nA,Ölberg'))).toBe('id,note\nA,Ölberg');
    // 0xC3 0x28: a two-byte lead followed by a non-continuation byte (invalid UTF-8, RFC 3629 §3).
    const e = csvErrorOf(() => decodeText(Uint8Array.from([0x61, 0x2c, 0x62, 0x0a, 0xc3, 0x28])));
    expect(e.code).toBe('encoding');
    expect(e.message).toMatch(/offset 4/);
    // Latin-1 "é" (0xE9) where UTF-8 was expected.
    expect(csvErrorOf(() => decodeText(Uint8Array.from([0x69, 0x64, 0x0a, 0xe9, 0x0a]))).message).toMatch(/offset 3/);
  });

  it('decodeText(bytes) refuses a workbook or binary file by its bytes', () => {
    expect(csvErrorOf(() => decodeText(Uint8Array.from([0x50, 0x4b, 0x03, 0x04, 0x14]))).message).toMatch(/zip archive/);
    expect(csvErrorOf(() => decodeText(Uint8Array.from([0x89, 0x50, 0x4e, 0x47, 0x00]))).message).toMatch(/NUL byte at offset 4/);
  });

  it('readCsv(text) throws nothing but CsvError on arbitrary text (fuzz)', () => {
    const alphabet = fc.constantFrom('a', 'B', '1', '9', ',', ';', '\t', '|', '"', '\n', '\r', ' ', '/', 'N', 'E', '\u0000', '\ufeff', '\ufffd', 'é');
    const text = fc.oneof(fc.string({ maxLength: 80 }), fc.array(alphabet, { maxLength: 80 }).map((a) => a.join('')));
    fc.assert(
      fc.property(text, (t) => {
        try {
          const table = readCsv(t);
          // What is returned is consistent: rows numbered upward, every header present in every row.
          const numbers = table.rows.map((r) => r.row);
          expect([...numbers].sort((a, b) => a - b)).toEqual(numbers);
          for (const r of table.rows) expect(Object.keys(r.values).sort()).toEqual([...table.headers].sort());
        } catch (e) {
          if (!(e instanceof CsvError)) throw e;
        }
      }),
      { numRuns: fuzzRuns(2000) },
    );
  }, fuzzTimeout());

  it('decodeText(bytes) throws nothing but CsvError on arbitrary bytes (fuzz)', () => {
    fc.assert(
      fc.property(fc.uint8Array({ maxLength: 64 }), (bytes) => {
        try {
          decodeText(bytes);
        } catch (e) {
          if (!(e instanceof CsvError)) throw e;
        }
      }),
      { numRuns: fuzzRuns(1000) },
    );
  }, fuzzTimeout());
});
