import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import Papa from 'papaparse';
import { CsvError, decodeText, readCsv, type CsvRow } from '../../src/io/csvTable';
import { CsvStreamReader, NewlineNormaliser, Utf8ChunkDecoder } from '../../src/components/import/csvStream';
import { fuzzRuns, fuzzTimeout } from '../helpers/fuzzRuns';

/**
 * The streaming reader must give exactly what readCsv (io/csvTable.ts) gives for the whole text:
 * readCsv is the reference, and papaparse (an outside library) writes the test tables.
 */

type Outcome = { ok: true; headers: readonly string[]; rows: readonly CsvRow[]; blankRows: readonly number[]; delimiter: string; notes: readonly string[] } | { ok: false; code: string; message: string };

function whole(text: string, delimiter?: string): Outcome {
  try {
    const t = readCsv(text, delimiter ? { delimiter } : {});
    return { ok: true, headers: t.headers, rows: t.rows, blankRows: t.blankRows, delimiter: t.delimiter, notes: t.notes };
  } catch (e) {
    if (e instanceof CsvError) return { ok: false, code: e.code, message: e.message };
    throw e;
  }
}

/** Streams `text` cut at `cuts` (character offsets) with a small head, as a worker would. */
function streamed(text: string, cuts: readonly number[], headChars: number, delimiter?: string): Outcome {
  const rows: CsvRow[] = [];
  try {
    const reader = new CsvStreamReader({ headChars, ...(delimiter && { delimiter }) }, (batch) => rows.push(...batch));
    let from = 0;
    for (const c of [...cuts].sort((a, b) => a - b)) {
      reader.push(text.slice(from, c));
      from = Math.max(from, c);
    }
    reader.push(text.slice(from));
    const s = reader.end();
    return { ok: true, headers: s.headers, rows, blankRows: s.blankRows, delimiter: s.delimiter, notes: s.notes };
  } catch (e) {
    if (e instanceof CsvError) return { ok: false, code: e.code, message: e.message };
    throw e;
  }
}

const cell = fc.string({ unit: fc.constantFrom('a', '7', ' ', ',', ';', '\t', '"', '\n', '\r', 'ü'), maxLength: 10 });
const header = fc.stringMatching(/^[A-DF-MO-RT-VX-Za-df-mo-rt-vx-z][A-Za-z0-9_]{0,6}$/);

describe('CsvStreamReader', () => {
  it('CsvStreamReader gives readCsv(text)\'s headers, rows, blank rows and notes for papaparse-written tables cut anywhere (property)', () => {
    fc.assert(
      fc.property(
        fc.uniqueArray(header, { minLength: 1, maxLength: 4 }),
        fc.array(fc.array(cell, { minLength: 1, maxLength: 5 }), { minLength: 1, maxLength: 12 }),
        fc.constantFrom(',', '\t', ';'),
        fc.constantFrom('\n', '\r\n'),
        fc.array(fc.nat(), { maxLength: 6 }),
        fc.integer({ min: 1, max: 60 }),
        fc.boolean(),
        (headers, cells, delimiter, newline, cutSeeds, headChars, blankLines) => {
          // Ragged rows (fewer or more cells than headers) and blank lines are part of the test.
          let text = Papa.unparse([headers, ...cells], { delimiter, newline, quotes: false });
          if (blankLines) text = text.replace(new RegExp(`${newline}(?=[a7])`, 'g'), `${newline}${newline}`);
          const cuts = cutSeeds.map((s) => s % (text.length + 1));
          expect(streamed(text, cuts, headChars, delimiter)).toEqual(whole(text, delimiter));
          expect(streamed(text, cuts, headChars)).toEqual(whole(text));
        },
      ),
      { numRuns: 600 },
    );
  });

  it('CsvStreamReader refuses exactly the texts readCsv(text) refuses and reads the rest alike (fuzz)', () => {
    const alphabet = fc.constantFrom('a', 'B', '1', ',', ';', '\t', '"', '\n', '\r', ' ', '/', 'N', '\u0000', '\ufeff', '\ufffd');
    fc.assert(
      fc.property(fc.array(alphabet, { maxLength: 60 }), fc.array(fc.nat(), { maxLength: 4 }), fc.integer({ min: 1, max: 30 }), (chars, cutSeeds, headChars) => {
        const text = chars.join('');
        const expected = whole(text);
        const got = streamed(text, cutSeeds.map((s) => s % (text.length + 1)), headChars);
        // Both must refuse the same texts. Which reason is named first may differ: readCsv looks at the
        // whole text (not text at all? a quote never closed?) before the header, a stream meets the
        // header first and a bad character only when it gets there.
        if (!expected.ok || !got.ok) {
          expect(got.ok).toBe(expected.ok);
        } else expect(got).toEqual(expected);
      }),
      { numRuns: fuzzRuns(3000) },
    );
  }, fuzzTimeout());

  it('CsvStreamReader streams a 20,000-row text in 4 kB pieces to the same rows as readCsv(text)', () => {
    const lines = ['Stn,Type,Strike,Dip,DipQuad,Remarks'];
    for (let i = 1; i <= 20_000; i++) lines.push(`S${i},Bedding,N${i % 90}E,${i % 90},SE,${i % 7 === 0 ? '"note, with comma\nand a line break"' : ''}`);
    const text = lines.join('\r\n') + '\r\n';
    const cuts = Array.from({ length: Math.floor(text.length / 4096) }, (_, k) => (k + 1) * 4096);
    const got = streamed(text, cuts, 64 * 1024);
    expect(got).toEqual(whole(text));
    expect(got.ok && got.rows.length).toBe(20_000);
  });

  it('CsvStreamReader keeps a column named "__proto__" as data in the streamed part, as readCsv(text) does', () => {
    const text = `id,__proto__\n${Array.from({ length: 40 }, (_, i) => `A${i},v${i}`).join('\n')}\n`;
    const got = streamed(text, [50, 120], 20, ',');
    expect(got).toEqual(whole(text, ','));
    if (got.ok) {
      expect(Object.keys(got.rows[39].values)).toEqual(['id', '__proto__']);
      expect(got.rows[39].values.__proto__).toBe('v39');
      expect(Object.getPrototypeOf(got.rows[39].values)).toBe(Object.prototype);
    }
  });

  it('CsvStreamReader reports a quote never closed in the streamed part with the row readCsv(text) names', () => {
    const text = `id,dip\n${Array.from({ length: 50 }, (_, i) => `A${i},30`).join('\n')}\nB,"40\nC,50\n`;
    const got = streamed(text, [100, 200, 300], 40);
    expect(got).toEqual(whole(text));
    expect(got.ok).toBe(false);
    if (!got.ok) expect(got.message).toMatch(/^row 51: a quoted field is opened but never closed/);
  });

  it('CsvStreamReader stops at a record longer than maxRecordChars instead of scanning to the end', () => {
    const text = `id,notes\nA,ok\nB,"${'x'.repeat(5000)}`;
    const reader = new CsvStreamReader({ headChars: 10, maxRecordChars: 1000, delimiter: ',' }, () => {});
    expect(() => {
      for (let i = 0; i < text.length; i += 500) reader.push(text.slice(i, i + 500));
    }).toThrow(/row 2: a quoted field is opened but never closed.*longer than 1000 characters/);
  });

  it('CsvStreamReader refuses a NUL character or a replacement character in the streamed part, naming the position', () => {
    const body = `id,dip\n${'A,30\n'.repeat(20)}`;
    for (const [bad, code, what] of [['\u0000', 'binary', /NUL character at position/], ['\ufffd', 'encoding', /replacement character \(U\+FFFD\) at position/]] as const) {
      const text = `${body}B,4${bad}\n`;
      const got = streamed(text, [30, 60], 20);
      expect(got).toMatchObject({ ok: false, code });
      if (!got.ok) expect(got.message).toMatch(what);
      expect(whole(text)).toMatchObject({ ok: false, code });
    }
  });
});

describe('NewlineNormaliser', () => {
  it('NewlineNormaliser.push(text) makes \\r\\n, \\r and \\n outside quotes "\\n" even when \\r\\n is split between chunks', () => {
    const n = new NewlineNormaliser();
    const out = n.push('a\r') + n.push('\nb\rc"x\r\ny"\n') + n.push('d\r') + n.end();
    expect(out).toBe('a\nb\nc"x\r\ny"\nd\n');
    expect(n.mixed).toBe(true);
  });
});

describe('Utf8ChunkDecoder', () => {
  it('Utf8ChunkDecoder.push(bytes) decodes in pieces what decodeText(bytes) decodes whole, and refuses what it refuses with the same message (property)', () => {
    const bytes = fc.oneof(
      fc.uint8Array({ maxLength: 40 }),
      fc.string({ maxLength: 20 }).map((s) => new TextEncoder().encode(`\ufeff${s}é€😀`)),
    );
    fc.assert(
      fc.property(bytes, fc.array(fc.nat(), { maxLength: 4 }), (b, cutSeeds) => {
        let expected: string;
        try {
          expected = decodeText(b);
        } catch (e) {
          expected = `error: ${(e as Error).message}`;
        }
        const cuts = [...new Set(cutSeeds.map((s) => s % (b.length + 1)))].sort((x, y) => x - y);
        const d = new Utf8ChunkDecoder();
        let got = '';
        try {
          let from = 0;
          for (const c of cuts) {
            got += d.push(b.subarray(from, c));
            from = c;
          }
          got += d.push(b.subarray(from), true);
        } catch (e) {
          got = `error: ${(e as Error).message}`;
        }
        // A NUL byte is found chunk by chunk, so a bad sequence in an earlier chunk is named first: both are refusals.
        if (expected.startsWith('error') && b.includes(0)) expect(got).toMatch(/^error: /);
        else expect(got).toBe(expected);
      }),
      { numRuns: fuzzRuns(2000) },
    );
  }, fuzzTimeout());
});
