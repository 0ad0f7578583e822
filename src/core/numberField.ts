/**
 * One number typed by a person into a form field (a trend, a plunge, a swath width), read with
 * the checks a form needs: empty, not a number, out of range. Each failure is a sentence that
 * names the field, repeats what was typed and says what is expected, so the form can show it
 * beside the field ("Plunge: "95" is out of range; expected 0 to 90°").
 *
 * Accepted spellings: surrounding spaces, a leading "+", a trailing unit ("°", "deg", "m"),
 * and a decimal comma ("12,5") as many keyboards type it. A comma followed by exactly three
 * digits ("1,000") is refused as ambiguous: it may group thousands or mark decimals.
 */

/** What went wrong with one field. */
export interface FieldProblem {
  /** Name of the field as the form labels it: "Trend". */
  readonly field: string;
  /** The text as typed. */
  readonly value: string;
  /** What the field takes, in words: "an azimuth from 0 to 360°". */
  readonly expected: string;
  /** The whole sentence, naming the field, the value and what was expected. */
  readonly message: string;
}

/** How to read one field. */
export interface NumberFieldSpec {
  /** Name of the field as the form labels it. */
  readonly field: string;
  readonly min: number;
  readonly max: number;
  /** Whether `min` itself is refused (a width must be more than 0). Default false. */
  readonly minExclusive?: boolean;
  /** What the field takes, in words, for messages. */
  readonly expected: string;
}

/** A value, or the problem with the text. */
export type FieldReading = { readonly ok: true; readonly value: number } | { readonly ok: false; readonly problem: FieldProblem };

/** Units a person may type after the number; they do not change it. */
const UNIT = /\s*(°|º|deg|degrees?|m|metres?|meters?)$/i;
const NUMBER = /^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/;

/**
 * Reads a typed number and checks it lies in [min, max] (or (min, max] with `minExclusive`).
 * @example readNumberField('12,5°', { field: 'Plunge', min: 0, max: 90, expected: 'a plunge from 0 to 90°' }) // {ok: true, value: 12.5}
 * @example readNumberField('95', { field: 'Plunge', min: 0, max: 90, expected: 'a plunge from 0 to 90°' }).problem.message
 * // 'Plunge: "95" is out of range; expected a plunge from 0 to 90°.'
 */
export function readNumberField(text: string, spec: NumberFieldSpec): FieldReading {
  const typed = String(text ?? '');
  const fail = (what: string): FieldReading => ({
    ok: false,
    problem: { field: spec.field, value: typed, expected: spec.expected, message: `${spec.field}: ${what}; expected ${spec.expected}.` },
  });
  let body = typed.trim().replace(UNIT, '').trim();
  if (body === '') return fail('empty');
  if (body.includes(',')) {
    const parts = body.split(',');
    if (parts.length !== 2 || body.includes('.')) return fail(`"${typed}" is not a number`);
    if (/^\d{3}$/.test(parts[1])) return fail(`"${typed}" is ambiguous (a thousands separator or a decimal comma?); write it without the comma, or with a point for decimals`);
    body = `${parts[0]}.${parts[1]}`;
  }
  if (!NUMBER.test(body)) return fail(`"${typed}" is not a number`);
  const value = Number(body);
  if (!Number.isFinite(value)) return fail(`"${typed}" is not a finite number`);
  const low = spec.minExclusive ? value <= spec.min : value < spec.min;
  if (low || value > spec.max) return fail(`"${typed}" is out of range`);
  return { ok: true, value };
}
