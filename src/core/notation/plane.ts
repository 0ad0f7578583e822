/**
 * Planes written as text in any of the notations geologists use; see ../notation.ts for the grammar.
 */
import { normalizeAzimuth } from '../math';
import type { PlaneMeasurement } from '../types';
import { COMPASS_POINTS, isCompassPoint, pickOpposite, type CompassPoint } from './compass';
import { NotationError, NotationProblem, asNotationError, messageAzimuth, problemOrRethrow, quoteValue } from './error';
import { checkAzimuth, checkInclination } from './fields';
import { OVERTURNED_WORDS, readAngle, readCompass, readDirection, readSeparator, rest, tokenize } from './scan';

/**
 * How a plane is written.
 * - `dipdir`: dip direction/dip, `120/45`;
 * - `rhr`: right-hand-rule strike/dip, `030/45` (dip direction = strike + 90, common practice);
 * - `strike-quadrant`: strike azimuth, dip and dip quadrant, `030/45SE` or `210/45SE`;
 * - `quadrant`: quadrant-bearing strike, dip and dip quadrant, `N30E 45SE`;
 * - `auto`: only the self-describing forms (`strike-quadrant`, `quadrant`); bare `030/45` is rejected.
 */
export type PlaneNotation = 'dipdir' | 'rhr' | 'strike-quadrant' | 'quadrant' | 'auto';

/**
 * Every plane notation, for pickers and argument checks.
 * @example
 * for (const n of PLANE_NOTATIONS) select.add(new Option(n));
 */
export const PLANE_NOTATIONS: readonly PlaneNotation[] = ['dipdir', 'rhr', 'strike-quadrant', 'quadrant', 'auto'];

/** What each notation expects, in words, for messages. */
export const PLANE_EXPECTED: Readonly<Record<PlaneNotation, string>> = {
  dipdir: 'dip direction/dip such as 120/45',
  rhr: 'right-hand-rule strike/dip such as 030/45',
  'strike-quadrant': 'strike/dip with a dip quadrant such as 030/45SE',
  quadrant: 'a quadrant-bearing strike, dip and dip quadrant such as N30E 45SE',
  auto: 'a plane that names its dip side, such as 030/45SE or N30E 45SE (or a named notation)',
};

/** The shape of a plane as written, before any notation is applied. */
export interface ScannedPlane {
  /** First field as an azimuth (bearings converted); not yet range-checked. */
  readonly azimuth: number;
  readonly azimuthText: string;
  /** Whether the first field was a quadrant bearing (N30E). */
  readonly bearing: boolean;
  readonly dip: number;
  readonly dipText: string;
  readonly quadrant?: CompassPoint;
  readonly overturned: boolean;
}

/**
 * Reads the fields of a plane without deciding what the first one means (`firstWhat` names it in messages).
 * @example scanPlane('N30E 45SE OT', 'a plane').quadrant // 'SE'
 */
export function scanPlane(text: string, expected: string, firstWhat = 'strike or dip direction'): ScannedPlane {
  const toks = tokenize(text, expected);
  const first = readDirection(text, toks, 0, expected, firstWhat);
  const dipAt = readSeparator(text, toks, first.next, expected, first.text, 'dip');
  const dip = readAngle(text, toks, dipAt, expected, 'dip');
  const q = readCompass(text, toks, dip.next, 'dip quadrant');
  let i = q.next;
  let overturned = false;
  const t = toks[i];
  if (t !== undefined && t.kind === 'word' && OVERTURNED_WORDS.has(t.upper)) {
    overturned = true;
    i++;
  }
  if (i < toks.length) {
    const after = overturned ? `"${toks[i - 1].text}"` : q.point !== undefined ? 'the dip quadrant' : 'the dip';
    throw new NotationProblem(text, `unexpected ${rest(text, toks, i)} after ${after}`, `${expected}, optionally followed by OT for an overturned bed`, 'text');
  }
  return { azimuth: first.value, azimuthText: first.text, bearing: first.bearing, dip: dip.value, dipText: dip.text, quadrant: q.point, overturned };
}

/** Builds the measurement, adding `overturned` only when set so plain planes stay plain. */
const measurement = (dipDirection: number, dip: number, overturned: boolean): PlaneMeasurement =>
  overturned ? { dipDirection, dip, overturned: true } : { dipDirection, dip };

/**
 * The dip direction named by a strike and dip-quadrant letters: of strike + 90 and strike - 90,
 * the one inside the letters' sector (see compass.ts). Letters along the strike are rejected.
 */
function dipDirectionFor(strike: number, point: CompassPoint, value: string, strikeText: string): number {
  const dd = pickOpposite(strike + 90, point);
  if (dd !== undefined) return dd;
  const a = normalizeAzimuth(strike + 90);
  const b = normalizeAzimuth(strike + 270);
  const fits = (d: number): string => COMPASS_POINTS.filter((p) => pickOpposite(strike + 90, p) === d).join(', ');
  throw new NotationProblem(
    value,
    `dip quadrant ${point} lies along strike ${strikeText}, not across it, so it names neither dip direction`,
    `a dip quadrant across strike ${strikeText}: ${fits(a)} for dip direction ${messageAzimuth(a)}; ${fits(b)} for ${messageAzimuth(b)}`,
    'dip quadrant',
  );
}


/**
 * Reads a plane written in the given notation (default `auto`). Input that is ambiguous,
 * contradictory or out of range throws a NotationError naming the problem; nothing is guessed.
 * The numbers are kept as written: a horizontal plane keeps its written dip direction, a
 * vertical one the side written, and an overturned flag is carried, never folded into the numbers.
 * @example parsePlane('030/45SE') // {dipDirection: 120, dip: 45}
 * @example parsePlane('N30E 45SE') // {dipDirection: 120, dip: 45}
 * @example parsePlane('030/45', 'rhr') // {dipDirection: 120, dip: 45}
 * @example parsePlane('120/45 OT', 'dipdir') // {dipDirection: 120, dip: 45, overturned: true}
 * @example parsePlane('030/45') // throws NotationError: could be dip direction/dip or right-hand-rule strike/dip
 */
export function parsePlane(text: string, notation: PlaneNotation = 'auto'): PlaneMeasurement {
  try {
    return readPlane(text, notation);
  } catch (e) {
    throw asNotationError(e);
  }
}

/**
 * parsePlane that returns the NotationProblem instead of throwing (no stack trace: cheap
 * enough for every row of a large import).
 * @example tryParsePlane('030/45') instanceof NotationProblem // true
 */
export function tryParsePlane(text: string, notation: PlaneNotation = 'auto'): PlaneMeasurement | NotationProblem {
  try {
    return readPlane(text, notation);
  } catch (e) {
    return problemOrRethrow(e);
  }
}

function readPlane(text: string, notation: PlaneNotation): PlaneMeasurement {
  const expected = PLANE_EXPECTED[notation];
  if (expected === undefined) {
    throw new NotationProblem(String(notation), 'unknown plane notation', `one of ${PLANE_NOTATIONS.join(', ')}`, 'notation');
  }
  const s = scanPlane(text, expected, notation === 'dipdir' ? 'dip direction' : notation === 'auto' ? 'strike or dip direction' : 'strike');
  const q = s.quadrant;

  // Ranges first: they are about this value, whereas notation mismatches are about the column.
  const firstWhat = notation === 'dipdir' ? 'dip direction' : notation === 'rhr' || q !== undefined ? 'strike' : 'azimuth';
  checkAzimuth(s.azimuth, s.azimuthText, text, firstWhat);
  checkInclination(s.dip, s.dipText, text, 'dip');

  switch (notation) {
    case 'dipdir':
    case 'rhr':
      if (q !== undefined) {
        throw new NotationProblem(
          text,
          `dip quadrant ${q} given, but ${notation === 'dipdir' ? 'dip direction/dip' : 'right-hand-rule strike/dip'} has none`,
          `${expected}; name the notation strike-quadrant (030/45SE) or quadrant (N30E 45SE) if the first value is a strike with its dip quadrant`,
          'notation',
        );
      }
      return measurement(notation === 'dipdir' ? s.azimuth : normalizeAzimuth(s.azimuth + 90), s.dip, s.overturned);
    case 'strike-quadrant':
    case 'quadrant':
      if (q === undefined) {
        throw new NotationProblem(text, `no dip quadrant, so the side the plane dips to is unknown`, expected, 'dip quadrant');
      }
      if (notation === 'strike-quadrant' && s.bearing) {
        throw new NotationProblem(text, `strike written as a quadrant bearing (${s.azimuthText})`, `${expected}; name the notation quadrant (or auto) for N30E 45SE`, 'notation');
      }
      if (notation === 'quadrant' && !s.bearing) {
        throw new NotationProblem(text, `strike written as an azimuth (${s.azimuthText}), not a quadrant bearing`, `${expected}; name the notation strike-quadrant (or auto) for 030/45SE`, 'notation');
      }
      break;
    case 'auto':
      if (q === undefined) {
        throw new NotationProblem(
          text,
          `no dip quadrant, so ${s.azimuthText} could be a dip direction (dip direction/dip) or a strike (right-hand-rule strike/dip)`,
          'the notation named (dipdir for dip direction/dip, rhr for right-hand-rule strike/dip), or a dip quadrant written as in 030/45SE or N30E 45SE',
          'notation',
        );
      }
      break;
  }
  return measurement(dipDirectionFor(s.azimuth, q, text, s.azimuthText), s.dip, s.overturned);
}

/**
 * A plane from a strike and dip held as numbers (separate columns). Without a quadrant the
 * strike follows the right-hand rule (dip direction = strike + 90, common practice); with one
 * (`'SE'`, `'nw'`, `'E'`; surrounding spaces allowed) the quadrant picks the side, and letters
 * along the strike are rejected. An empty quadrant string is an error, not "no quadrant".
 * @example planeFromStrikeDip(30, 45) // {dipDirection: 120, dip: 45}
 * @example planeFromStrikeDip(210, 45, 'SE') // {dipDirection: 120, dip: 45}
 * @example planeFromStrikeDip(8, 12, 'E') // {dipDirection: 98, dip: 12}
 */
export function planeFromStrikeDip(strike: number, dip: number, quadrant?: string): PlaneMeasurement {
  try {
    return strikeDipPlane(strike, dip, quadrant);
  } catch (e) {
    throw asNotationError(e);
  }
}

function strikeDipPlane(strike: number, dip: number, quadrant?: string): PlaneMeasurement {
  checkAzimuth(strike, String(strike), String(strike), 'strike');
  checkInclination(dip, String(dip), String(dip), 'dip');
  if (quadrant === undefined) return measurement(normalizeAzimuth(strike + 90), dip, false);
  const letters = quadrant.trim().toUpperCase();
  if (!isCompassPoint(letters)) {
    throw new NotationProblem(
      quadrant,
      letters === '' ? 'empty dip quadrant' : `${quoteValue(quadrant)} is not a dip quadrant`,
      'a dip quadrant of one or two compass letters: N, NE, E, SE, S, SW, W or NW',
      'dip quadrant',
    );
  }
  return measurement(dipDirectionFor(strike, letters, quadrant, String(strike)), dip, false);
}

const OVERTURNED_TRUE = new Set(['OT', 'OVERTURNED', 'Y', 'YES', 'TRUE', '1']);
const OVERTURNED_FALSE = new Set(['', 'N', 'NO', 'FALSE', '0', 'UPRIGHT']);

/**
 * Reads an overturned flag from its own column. Blank means not flagged; OT, overturned, yes,
 * y, true, 1 mean overturned; no, n, false, 0, upright mean not; anything else is rejected.
 * @example parseOverturnedFlag('OT') // true
 * @example parseOverturnedFlag('') // false
 */
export function parseOverturnedFlag(text: string): boolean {
  const w = text.trim().toUpperCase();
  if (OVERTURNED_TRUE.has(w)) return true;
  if (OVERTURNED_FALSE.has(w)) return false;
  throw new NotationError(text, `${quoteValue(text)} is not an overturned flag`, 'blank, OT, overturned, yes or true for overturned; no, false or upright for not', 'overturned');
}
