import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { readNumberField, type NumberFieldSpec } from '../../src/core/numberField';

const PLUNGE: NumberFieldSpec = { field: 'Plunge', min: 0, max: 90, expected: 'a plunge from 0 to 90°' };
const SWATH: NumberFieldSpec = { field: 'Swath half-width', min: 0, minExclusive: true, max: 20000, expected: 'metres, more than 0 and at most 20000' };

/** Typed text and what it reads as: ordinary spellings a person types into a form (common practice). */
const GOOD: { text: string; spec: NumberFieldSpec; value: number }[] = [
  { text: '12', spec: PLUNGE, value: 12 },
  { text: ' 12 ', spec: PLUNGE, value: 12 },
  { text: '012', spec: PLUNGE, value: 12 },
  { text: '+7.5', spec: PLUNGE, value: 7.5 },
  { text: '12,5', spec: PLUNGE, value: 12.5 }, // decimal comma
  { text: '12°', spec: PLUNGE, value: 12 },
  { text: '12 deg', spec: PLUNGE, value: 12 },
  { text: '.5', spec: PLUNGE, value: 0.5 },
  { text: '0', spec: PLUNGE, value: 0 }, // the bounds are inside
  { text: '90', spec: PLUNGE, value: 90 },
  { text: '500 m', spec: SWATH, value: 500 },
  { text: '1e3', spec: SWATH, value: 1000 },
];

/** Bad text and the words its message must contain. */
const BAD: { text: string; spec: NumberFieldSpec; says: string }[] = [
  { text: '', spec: PLUNGE, says: 'Plunge: empty; expected a plunge from 0 to 90°.' },
  { text: '   ', spec: PLUNGE, says: 'Plunge: empty' },
  { text: 'twelve', spec: PLUNGE, says: 'Plunge: "twelve" is not a number; expected a plunge from 0 to 90°.' },
  { text: '12a', spec: PLUNGE, says: '"12a" is not a number' },
  { text: '1.2.3', spec: PLUNGE, says: 'is not a number' },
  { text: '12,5,1', spec: PLUNGE, says: 'is not a number' },
  { text: 'NaN', spec: PLUNGE, says: '"NaN" is not a number' },
  { text: 'Infinity', spec: PLUNGE, says: 'is not a number' },
  { text: '95', spec: PLUNGE, says: 'Plunge: "95" is out of range; expected a plunge from 0 to 90°.' },
  { text: '-5', spec: PLUNGE, says: '"-5" is out of range' },
  { text: '0', spec: SWATH, says: 'Swath half-width: "0" is out of range; expected metres, more than 0' },
  { text: '1e400', spec: SWATH, says: 'is not a finite number' },
  { text: '1,000', spec: SWATH, says: '"1,000" is ambiguous' },
];

describe('readNumberField(text, spec)', () => {
  for (const row of GOOD) {
    it(`readNumberField(${JSON.stringify(row.text)}, ${row.spec.field}) reads ${row.value}`, () => {
      expect(readNumberField(row.text, row.spec)).toEqual({ ok: true, value: row.value });
    });
  }
  for (const row of BAD) {
    it(`readNumberField(${JSON.stringify(row.text)}, ${row.spec.field}) refuses it, naming the field, the value and the range`, () => {
      const r = readNumberField(row.text, row.spec);
      expect(r.ok).toBe(false);
      if (r.ok) return;
      expect(r.problem.message).toContain(row.says);
      expect(r.problem.field).toBe(row.spec.field);
      expect(r.problem.value).toBe(row.text);
      expect(r.problem.message.startsWith(`${row.spec.field}: `)).toBe(true);
      expect(r.problem.message).toContain(`expected ${row.spec.expected}`);
    });
  }

  it('readNumberField(String(x)) gives x back for every number in range, and refuses every number outside it (property)', () => {
    fc.assert(
      fc.property(fc.double({ min: -1000, max: 1000, noNaN: true }), (x) => {
        const r = readNumberField(String(x), PLUNGE);
        if (x >= 0 && x <= 90) expect(r).toEqual({ ok: true, value: x === 0 ? Math.abs(x) + 0 : x });
        else expect(r.ok).toBe(false);
      }),
    );
  });

  it('readNumberField never throws on any text and always either reads a number in range or names the field (property)', () => {
    fc.assert(
      fc.property(fc.string(), (text) => {
        const r = readNumberField(text, PLUNGE);
        if (r.ok) {
          expect(r.value).toBeGreaterThanOrEqual(0);
          expect(r.value).toBeLessThanOrEqual(90);
        } else expect(r.problem.message.startsWith('Plunge: ')).toBe(true);
      }),
    );
  });
});
