/**
 * Lines (trend and plunge) written as text; see ../notation.ts for the grammar.
 */
import type { Line } from '../types';
import { NotationProblem, asNotationError, problemOrRethrow } from './error';
import { checkAzimuth, checkInclination } from './fields';
import { OVERTURNED_WORDS, readAngle, readCompass, readDirection, readSeparator, rest, tokenize } from './scan';

/**
 * How a line is written: `azimuth` trend/plunge (`125/20`), `quadrant` bearing and plunge
 * (`S55E 20`), or `auto`, which reads either (the two cannot be confused). The trend always
 * comes first.
 */
export type LineNotation = 'azimuth' | 'quadrant' | 'auto';

/**
 * Every line notation, for pickers and argument checks.
 * @example
 * LINE_NOTATIONS.includes('quadrant') // true
 */
export const LINE_NOTATIONS: readonly LineNotation[] = ['azimuth', 'quadrant', 'auto'];

const LINE_EXPECTED: Readonly<Record<LineNotation, string>> = {
  azimuth: 'trend/plunge such as 125/20',
  quadrant: 'a quadrant-bearing trend and plunge such as S55E 20',
  auto: 'trend/plunge such as 125/20 or S55E 20',
};

/**
 * Reads a line written in the given notation (default `auto`). A horizontal or vertical line
 * keeps the trend written. Throws NotationError naming the problem.
 * @example parseLine('125/20') // {trend: 125, plunge: 20}
 * @example parseLine('S55E 20') // {trend: 125, plunge: 20}
 * @example parseLine('N10W/35', 'quadrant') // {trend: 350, plunge: 35}
 */
export function parseLine(text: string, notation: LineNotation = 'auto'): Line {
  try {
    return readLine(text, notation);
  } catch (e) {
    throw asNotationError(e);
  }
}

/**
 * parseLine that returns the NotationProblem instead of throwing (no stack trace: cheap
 * enough for every row of a large import).
 * @example tryParseLine('125/95') instanceof NotationProblem // true
 */
export function tryParseLine(text: string, notation: LineNotation = 'auto'): Line | NotationProblem {
  try {
    return readLine(text, notation);
  } catch (e) {
    return problemOrRethrow(e);
  }
}

function readLine(text: string, notation: LineNotation): Line {
  const expected = LINE_EXPECTED[notation];
  if (expected === undefined) {
    throw new NotationProblem(String(notation), 'unknown line notation', `one of ${LINE_NOTATIONS.join(', ')}`, 'notation');
  }
  const toks = tokenize(text, expected);
  const first = readDirection(text, toks, 0, expected, 'trend');
  const at = readSeparator(text, toks, first.next, expected, first.text, 'plunge');
  const plunge = readAngle(text, toks, at, expected, 'plunge');
  const i = plunge.next;
  if (i < toks.length) {
    const t = toks[i];
    if (t.kind === 'word' && OVERTURNED_WORDS.has(t.upper)) {
      throw new NotationProblem(text, `overturned flag "${t.text}" on a line`, `${expected}; only planes can be overturned`, 'overturned');
    }
    const q = readCompass(text, toks, i, 'dip quadrant');
    if (q.point !== undefined) {
      throw new NotationProblem(text, `compass letters "${t.text}" after the plunge, but a line has no dip quadrant`, `${expected}; the trend alone gives the direction of plunge`, 'text');
    }
    throw new NotationProblem(text, `unexpected ${rest(text, toks, i)} after the plunge`, expected, 'text');
  }
  const trend = checkAzimuth(first.value, first.text, text, 'trend');
  checkInclination(plunge.value, plunge.text, text, 'plunge');
  if (notation === 'azimuth' && first.bearing) {
    throw new NotationProblem(text, `trend written as a quadrant bearing (${first.text})`, `${expected}; name the notation quadrant (or auto) for S55E 20`, 'notation');
  }
  if (notation === 'quadrant' && !first.bearing) {
    throw new NotationProblem(text, `trend written as an azimuth (${first.text}), not a quadrant bearing`, `${expected}; name the notation azimuth (or auto) for 125/20`, 'notation');
  }
  return { trend, plunge: plunge.value };
}
