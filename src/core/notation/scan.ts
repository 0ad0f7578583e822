/**
 * The scanner under every notation parser: one left-to-right pass over the characters with
 * no regular expressions (so no backtracking on hostile input), a hard cap on the number of
 * tokens, and an error that names the offending text as soon as something cannot be read.
 * Meaning (which number is a strike, whether letters fit) is decided by the callers.
 */
import { NotationProblem, quoteValue } from './error';
import { bearingToAzimuth, isCompassPoint, type CompassPoint } from './compass';

/** Kinds of token; whitespace is not a token but sets `spaceBefore` on the next one. */
export type TokenKind = 'number' | 'word' | 'slash' | 'degree';

export interface Token {
  readonly kind: TokenKind;
  /** The characters as written. */
  readonly text: string;
  /** For words, the ASCII letters upper-cased; else ''. */
  readonly upper: string;
  /** For numbers, the value; else NaN. */
  readonly value: number;
  /** Whether whitespace came right before this token. */
  readonly spaceBefore: boolean;
  /** Index of the first character in the source text. */
  readonly start: number;
}

/** No notation needs more tokens than N 30 ° E / 45 ° SE OT (9); stop junk early. */
const MAX_TOKENS = 12;

const GRAD_WORDS = new Set(['G', 'GR', 'GON', 'GONS', 'GRAD', 'GRADS']);
const RADIAN_WORDS = new Set(['RAD', 'RADS', 'RADIAN', 'RADIANS']);
export const OVERTURNED_WORDS = new Set(['OT', 'OVERTURNED']);

export const GRADS_EXPECTED = 'angles in degrees (0 to 360 for azimuths, 0 to 90 for dips); grads (g, gon) are not accepted';

// Space, tab, no-break space, figure space, thin space, narrow no-break space: spreadsheets
// paste all of these between fields.
const isSpace = (c: number): boolean => c === 32 || c === 9 || c === 0xa0 || c === 0x2007 || c === 0x2009 || c === 0x202f;
const isDigit = (c: number): boolean => c >= 48 && c <= 57;
const isLetter = (c: number): boolean => (c >= 65 && c <= 90) || (c >= 97 && c <= 122);

/** A character for a message: itself when printable, else its code point. */
function describeChar(text: string, i: number): string {
  const cp = text.codePointAt(i) ?? 0;
  return cp < 0x20 || (cp >= 0x7f && cp < 0xa0) || (cp >= 0xd800 && cp <= 0xdfff)
    ? `U+${cp.toString(16).toUpperCase().padStart(4, '0')}`
    : `"${String.fromCodePoint(cp)}"`;
}

/**
 * Splits text into tokens. `expected` describes the whole notation, for messages.
 * @example tokenize('120/45', 'a plane').map((t) => t.kind) // ['number', 'slash', 'number']
 */
export function tokenize(text: string, expected: string): Token[] {
  const toks: Token[] = [];
  const n = text.length;
  let i = 0;
  let space = false;
  while (i < n) {
    const c = text.charCodeAt(i);
    if (isSpace(c)) {
      space = true;
      i++;
      continue;
    }
    if (toks.length >= MAX_TOKENS) {
      throw new NotationProblem(text, `unexpected extra text ${quoteValue(text.slice(i))}`, expected, 'text');
    }
    const start = i;
    const prev = toks.length > 0 ? toks[toks.length - 1] : undefined;
    if (isDigit(c)) {
      while (i < n && isDigit(text.charCodeAt(i))) i++;
      if (i < n && text.charCodeAt(i) === 46) {
        i++;
        if (!(i < n && isDigit(text.charCodeAt(i)))) {
          throw new NotationProblem(text, `"${text.slice(start, i)}" is an unfinished decimal number`, expected, 'number');
        }
        while (i < n && isDigit(text.charCodeAt(i))) i++;
        if (i < n && text.charCodeAt(i) === 46) {
          while (i < n && (isDigit(text.charCodeAt(i)) || text.charCodeAt(i) === 46)) i++;
          throw new NotationProblem(text, `"${text.slice(start, i)}" is not a number`, expected, 'number');
        }
      }
      const t = text.slice(start, i);
      toks.push({ kind: 'number', text: t, upper: '', value: Number(t), spaceBefore: space, start });
    } else if (isLetter(c)) {
      while (i < n && isLetter(text.charCodeAt(i))) i++;
      const t = text.slice(start, i);
      const upper = t.toUpperCase();
      const afterNumber = prev !== undefined && (prev.kind === 'number' || prev.kind === 'degree');
      if (afterNumber && GRAD_WORDS.has(upper)) {
        throw new NotationProblem(text, `"${t}" marks grads, which are not accepted`, GRADS_EXPECTED, 'unit');
      }
      if (afterNumber && RADIAN_WORDS.has(upper)) {
        throw new NotationProblem(text, `"${t}" marks radians, which are not accepted`, 'angles in degrees', 'unit');
      }
      toks.push({ kind: 'word', text: t, upper, value: NaN, spaceBefore: space, start });
    } else if (c === 47) {
      i++;
      toks.push({ kind: 'slash', text: '/', upper: '', value: NaN, spaceBefore: space, start });
    } else if (c === 0xb0 || c === 0xba) {
      // ° and the look-alike º (masculine ordinal), which many keyboards type for it.
      i++;
      toks.push({ kind: 'degree', text: text[start], upper: '', value: NaN, spaceBefore: space, start });
    } else if (c === 45 || c === 0x2212) {
      const next = i + 1 < n ? text.charCodeAt(i + 1) : -1;
      if (prev !== undefined && prev.kind !== 'slash' && !space) {
        throw new NotationProblem(text, `"-" is not a separator between fields`, `${expected}, with "/" or a space between fields`, 'separator');
      }
      if (isDigit(next)) {
        let j = i + 1;
        while (j < n && (isDigit(text.charCodeAt(j)) || text.charCodeAt(j) === 46)) j++;
        throw new NotationProblem(text, `negative angle "${text.slice(start, j)}"`, 'angles of 0 or more (azimuths 0 to 360, dips 0 to 90)', 'number');
      }
      throw new NotationProblem(text, `unexpected character "-"`, expected, 'text');
    } else if (c === 44) {
      throw new NotationProblem(text, 'a comma, which is neither a decimal point nor a separator here', `${expected}, with "." for decimals and "/" or a space between fields`, 'separator');
    } else if (c === 39 || c === 34 || c === 0x2032 || c === 0x2033 || c === 0x2019 || c === 0x201d) {
      throw new NotationProblem(text, `${describeChar(text, i)} marks minutes or seconds, which are not accepted`, 'decimal degrees such as 45.5', 'unit');
    } else if (c === 0x1d4d) {
      throw new NotationProblem(text, `"ᵍ" marks grads, which are not accepted`, GRADS_EXPECTED, 'unit');
    } else {
      throw new NotationProblem(text, `unexpected character ${describeChar(text, i)}`, expected, 'text');
    }
    space = false;
  }
  if (toks.length === 0) throw new NotationProblem(text, 'empty', expected, 'text');
  return toks;
}

/** A direction field as read: an azimuth number or a quadrant bearing, converted to an azimuth. */
export interface DirectionField {
  /** Azimuth in degrees (bearings converted); range not yet checked for plain numbers. */
  readonly value: number;
  /** As written, e.g. "030", "N30E". */
  readonly text: string;
  readonly bearing: boolean;
  /** Index of the token after the field. */
  readonly next: number;
}

/** Index after an optional degree sign written straight after token i - 1. */
function skipDegree(toks: readonly Token[], i: number): number {
  const t = toks[i];
  return t !== undefined && t.kind === 'degree' && !t.spaceBefore ? i + 1 : i;
}

/**
 * Text of the tokens from i to the end, quoted, for "unexpected ..." messages.
 * @example rest('120/45 x', tokenize('120/45 x', 'a plane'), 3) // '"x"'
 */
export function rest(text: string, toks: readonly Token[], i: number): string {
  return quoteValue(text.slice(toks[i].start).trim());
}

/**
 * Reads an azimuth written as a number (`030`, `30.5°`) or a quadrant bearing (`N30E`, `S55°W`).
 * Bearing angles over 90 are rejected here; azimuth ranges are checked by the caller.
 * @example readDirection('S55E 20', tokenize('S55E 20', 'a line'), 0, 'a line', 'trend').value // 125
 */
export function readDirection(text: string, toks: readonly Token[], i: number, expected: string, what: string): DirectionField {
  const t = toks[i];
  if (t.kind === 'number') return { value: t.value, text: t.text, bearing: false, next: skipDegree(toks, i + 1) };
  if (t.kind === 'word' && (t.upper === 'N' || t.upper === 'S')) {
    const num = toks[i + 1];
    const j = num !== undefined && num.kind === 'number' && !num.spaceBefore ? skipDegree(toks, i + 2) : -1;
    const ew = j >= 0 ? toks[j] : undefined;
    if (ew === undefined || ew.kind !== 'word' || ew.spaceBefore || (ew.upper !== 'E' && ew.upper !== 'W')) {
      throw new NotationProblem(text, `incomplete quadrant bearing starting ${quoteValue(t.text)}`, `${what} as a quadrant bearing with no spaces inside, such as N30E or S55W`, what);
    }
    const written = text.slice(t.start, ew.start + ew.text.length);
    if (!(num.value <= 90)) {
      throw new NotationProblem(text, `bearing angle ${num.text} in ${written} is more than 90`, `a quadrant bearing angle from 0 to 90, such as N30E`, what);
    }
    return { value: bearingToAzimuth(t.upper, num.value, ew.upper), text: written, bearing: true, next: j + 1 };
  }
  throw new NotationProblem(text, `${quoteValue(t.text)} where the ${what} was expected`, expected, what);
}

/**
 * Reads a plain number with an optional degree sign (dip, plunge, rake).
 * @example readAngle('45°', tokenize('45°', 'a dip'), 0, 'a dip', 'dip') // {value: 45, text: '45', next: 2}
 */
export function readAngle(text: string, toks: readonly Token[], i: number, expected: string, what: string): { value: number; text: string; next: number } {
  const t = toks[i];
  if (t === undefined) throw new NotationProblem(text, `the ${what} is missing`, expected, what);
  if (t.kind !== 'number') throw new NotationProblem(text, `${quoteValue(t.text)} where the ${what} was expected`, expected, what);
  return { value: t.value, text: t.text, next: skipDegree(toks, i + 1) };
}

/**
 * Steps over the separator between two fields: one "/" (spaces around it allowed) or
 * whitespace. Returns the index of the next field's first token.
 * @example readSeparator('120/45', tokenize('120/45', 'a plane'), 1, 'a plane', '120', 'dip') // 2
 */
export function readSeparator(text: string, toks: readonly Token[], i: number, expected: string, prevText: string, nextWhat: string): number {
  const t = toks[i];
  if (t === undefined) throw new NotationProblem(text, `the ${nextWhat} is missing`, expected, nextWhat);
  if (t.kind === 'slash') {
    if (toks[i + 1] === undefined) throw new NotationProblem(text, `the ${nextWhat} is missing after "/"`, expected, nextWhat);
    return i + 1;
  }
  if (!t.spaceBefore) {
    throw new NotationProblem(text, `${quoteValue(t.text)} follows ${quoteValue(prevText)} with no "/" or space between them`, expected, 'separator');
  }
  return i;
}

/**
 * Reads optional compass letters at token i. A word of compass-like letters that is not one of
 * the eight (NNE, ESE) is an error; any other word is left for the caller.
 * @example readCompass('45SE', tokenize('45SE', 'a dip'), 1, 'dip quadrant') // {point: 'SE', next: 2}
 */
export function readCompass(text: string, toks: readonly Token[], i: number, what: string): { point?: CompassPoint; next: number } {
  const t = toks[i];
  if (t === undefined || t.kind !== 'word') return { next: i };
  if (isCompassPoint(t.upper)) return { point: t.upper, next: i + 1 };
  if (isCompassLike(t.upper)) {
    throw new NotationProblem(text, `${quoteValue(t.text)} is not a ${what}`, `a ${what} of one or two compass letters: N, NE, E, SE, S, SW, W or NW`, what);
  }
  return { next: i };
}

/** Whether a word is made only of N, E, S, W (so it was meant as compass letters). */
function isCompassLike(upper: string): boolean {
  for (let k = 0; k < upper.length; k++) {
    const c = upper[k];
    if (c !== 'N' && c !== 'E' && c !== 'S' && c !== 'W') return false;
  }
  return true;
}
