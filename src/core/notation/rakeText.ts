/**
 * Rake (pitch) written as text: an angle in the plane and the end of the strike line it is
 * measured from. The geometry lives in ../rake.ts.
 */
import type { CompassPoint } from './compass';
import { NotationProblem, asNotationError, problemOrRethrow } from './error';
import { readAngle, readCompass, rest, tokenize } from './scan';

/**
 * Where a rake is measured from, within the plane, toward the dip direction:
 * - `'rhr-strike'`: from the right-hand-rule strike (dip direction - 90);
 * - compass letters: from the end of the strike line lying in that sector (one letter: within
 *   90°, two letters: within 45°; see compass.ts). For strike 030/210, `'N'`, `'E'` and `'NE'`
 *   name the 030 end, `'S'`, `'W'` and `'SW'` the 210 end; `'SE'` and `'NW'` lie across the
 *   strike and name neither, so they are rejected.
 */
export type RakeFrom = 'rhr-strike' | CompassPoint;

/** A rake: angle in degrees from 0 to 180, measured in the plane from `from` toward the dip direction. */
export interface Rake {
  readonly angle: number;
  readonly from: RakeFrom;
}

const RAKE_EXPECTED = 'a rake from 0 to 180, such as 60 (from the right-hand-rule strike), 60NE or 60 from NE';

/**
 * Reads a rake: `60` (from the right-hand-rule strike), `60NE`, `60 NE` or `60 from NE`
 * (from the named end of the strike line), degree sign allowed. Throws NotationError.
 * @example parseRake('60') // {angle: 60, from: 'rhr-strike'}
 * @example parseRake('35 from SW') // {angle: 35, from: 'SW'}
 */
export function parseRake(text: string): Rake {
  try {
    return readRake(text);
  } catch (e) {
    throw asNotationError(e);
  }
}

/**
 * parseRake that returns the NotationProblem instead of throwing.
 * @example tryParseRake('190') instanceof NotationProblem // true
 */
export function tryParseRake(text: string): Rake | NotationProblem {
  try {
    return readRake(text);
  } catch (e) {
    return problemOrRethrow(e);
  }
}

function readRake(text: string): Rake {
  const toks = tokenize(text, RAKE_EXPECTED);
  const a = readAngle(text, toks, 0, RAKE_EXPECTED, 'rake');
  let i = a.next;
  const word = toks[i];
  const hasFrom = word !== undefined && word.kind === 'word' && word.upper === 'FROM';
  if (hasFrom) i++;
  const end = readCompass(text, toks, i, 'strike end');
  if (hasFrom && end.point === undefined) {
    throw new NotationProblem(text, `"from" is not followed by compass letters`, RAKE_EXPECTED, 'strike end');
  }
  if (end.next < toks.length) throw new NotationProblem(text, `unexpected ${rest(text, toks, end.next)} after the rake`, RAKE_EXPECTED, 'text');
  if (!(a.value <= 180)) throw new NotationProblem(text, `rake ${a.text} is more than 180`, RAKE_EXPECTED, 'rake');
  return { angle: a.value, from: end.point ?? 'rhr-strike' };
}

/**
 * Writes a rake: the angle, followed by the compass letters of its end unless it is measured
 * from the right-hand-rule strike.
 * @example formatRake({angle: 60, from: 'NE'}) // '60NE'
 */
export function formatRake(rake: Rake, decimals = 0): string {
  if (!(rake.angle >= 0 && rake.angle <= 180)) throw new RangeError(`cannot write rake ${rake.angle}: expected 0 to 180`);
  if (!Number.isInteger(decimals) || decimals < 0 || decimals > 6) throw new RangeError(`decimals must be a whole number from 0 to 6, got ${decimals}`);
  const angle = rake.angle.toFixed(decimals);
  return rake.from === 'rhr-strike' ? angle : `${angle}${rake.from}`;
}
