/**
 * Single fields in their own columns (strike, dip direction, trend, dip, plunge), and the range
 * checks every notation shares: azimuths in [0, 360), dips and plunges in [0, 90].
 */
import { NotationProblem, asNotationError, problemOrRethrow } from './error';
import { readAngle, readDirection, rest, tokenize } from './scan';

/** "a strike", "an azimuth": the article for a field name in messages. */
const article = (what: string): string => ('aeiouAEIOU'.includes(what[0] ?? '') ? `an ${what}` : `a ${what}`);

// The "expected" text of a field is built once per field name, not on every call of a 10^6-row import.
const expectedCache = new Map<string, string>();
function expectedFor(what: string, build: (what: string) => string): string {
  let e = expectedCache.get(what);
  if (e === undefined) {
    e = build(what);
    if (expectedCache.size < 64) expectedCache.set(what, e);
  }
  return e;
}

/**
 * Throws a NotationProblem unless `value` is an azimuth in [0, 360). `written` is the value as
 * the user wrote it, `text` the whole input.
 * @example checkAzimuth(360, '360', '360/45', 'dip direction') // throws NotationProblem
 */
export function checkAzimuth(value: number, written: string, text: string, what: string): number {
  if (!(value >= 0 && value < 360)) {
    const problem = value >= 360 ? `${what} ${written} is 360 or more` : `${what} ${written} is not a number from 0 to 360`;
    throw new NotationProblem(text, problem, `${article(what)} from 0 to less than 360 (write 360 as 000)`, what);
  }
  return value;
}

/**
 * Throws a NotationProblem unless `value` is a dip or plunge in [0, 90].
 * @example checkInclination(95, '95', '120/95', 'dip') // throws NotationProblem
 */
export function checkInclination(value: number, written: string, text: string, what: string): number {
  if (!(value >= 0 && value <= 90)) {
    const problem = value > 90 ? `${what} ${written} is more than 90` : `${what} ${written} is not a number from 0 to 90`;
    throw new NotationProblem(text, problem, `${article(what)} from 0 to 90`, what);
  }
  return value;
}

function readAzimuth(text: string, what: string): number {
  const expected = expectedFor(`azimuth:${what}`, () => `${article(what)} from 0 to less than 360, such as 030 or N30E`);
  const toks = tokenize(text, expected);
  const f = readDirection(text, toks, 0, expected, what);
  if (f.next < toks.length) throw new NotationProblem(text, `unexpected ${rest(text, toks, f.next)} after the ${what}`, expected, what);
  return checkAzimuth(f.value, f.text, text, what);
}

function readInclination(text: string, what: string): number {
  const expected = expectedFor(`inclination:${what}`, () => `${article(what)} from 0 to 90, such as 45`);
  const toks = tokenize(text, expected);
  const a = readAngle(text, toks, 0, expected, what);
  if (a.next < toks.length) throw new NotationProblem(text, `unexpected ${rest(text, toks, a.next)} after the ${what}`, expected, what);
  return checkInclination(a.value, a.text, text, what);
}

/**
 * Reads one azimuth from its own column: a number with an optional degree sign (`030`, `30.5°`)
 * or a quadrant bearing (`N30E`, `S55W`, read as the direction it names). `what` names the
 * field in messages ("strike", "dip direction", "trend"). Throws NotationError.
 * @example parseAzimuth('S55E', 'trend') // 125
 * @example parseAzimuth('030°', 'strike') // 30
 */
export function parseAzimuth(text: string, what = 'azimuth'): number {
  try {
    return readAzimuth(text, what);
  } catch (e) {
    throw asNotationError(e);
  }
}

/**
 * parseAzimuth that returns the NotationProblem instead of throwing (no stack trace: cheap
 * enough for every row of a large import).
 * @example tryParseAzimuth('400', 'trend') instanceof NotationProblem // true
 */
export function tryParseAzimuth(text: string, what = 'azimuth'): number | NotationProblem {
  try {
    return readAzimuth(text, what);
  } catch (e) {
    return problemOrRethrow(e);
  }
}

/**
 * Reads a dip from its own column: a number from 0 to 90, optional degree sign. A dip
 * quadrant belongs in its own column (see planeFromStrikeDip). Throws NotationError.
 * @example parseDip('45°') // 45
 */
export function parseDip(text: string): number {
  try {
    return readInclination(text, 'dip');
  } catch (e) {
    throw asNotationError(e);
  }
}

/**
 * parseDip that returns the NotationProblem instead of throwing.
 * @example tryParseDip('95') instanceof NotationProblem // true
 */
export function tryParseDip(text: string): number | NotationProblem {
  try {
    return readInclination(text, 'dip');
  } catch (e) {
    return problemOrRethrow(e);
  }
}

/**
 * Reads a plunge from its own column: a number from 0 to 90, optional degree sign. Throws NotationError.
 * @example parsePlunge('20') // 20
 */
export function parsePlunge(text: string): number {
  try {
    return readInclination(text, 'plunge');
  } catch (e) {
    throw asNotationError(e);
  }
}

/**
 * parsePlunge that returns the NotationProblem instead of throwing.
 * @example tryParsePlunge('20') // 20
 */
export function tryParsePlunge(text: string): number | NotationProblem {
  try {
    return readInclination(text, 'plunge');
  } catch (e) {
    return problemOrRethrow(e);
  }
}
