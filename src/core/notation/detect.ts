/**
 * Which plane notation a column uses, judged from sample values without guessing.
 */
import { NotationError, NotationProblem } from './error';
import { PLANE_EXPECTED, scanPlane, tryParsePlane } from './plane';

/**
 * - `single`: every readable sample uses one self-describing notation (see `notation`);
 * - `self-describing-mixed`: samples mix `030/45SE` and `N30E 45SE`; each names its side, so `auto` reads them all;
 * - `needs-naming`: every readable sample is two bare values (`120/45`), which could be dip
 *   direction/dip or right-hand-rule strike/dip: the user must name the notation;
 * - `mixed`: bare values alongside self-describing ones: the bare ones cannot be read without a name;
 * - `unreadable`: no sample could be read as a plane; `empty`: every sample was blank.
 */
export type PlaneNotationStatus = 'single' | 'self-describing-mixed' | 'needs-naming' | 'mixed' | 'unreadable' | 'empty';

export interface PlaneNotationReport {
  readonly status: PlaneNotationStatus;
  /** The notation to read the column with, when the samples settle it. */
  readonly notation?: 'strike-quadrant' | 'quadrant' | 'auto';
  /** Counts of samples by shape; `bare` = two values with no dip quadrant. */
  readonly counts: {
    readonly bare: number;
    readonly strikeQuadrant: number;
    readonly quadrant: number;
    readonly unreadable: number;
    readonly blank: number;
  };
  /** The first unreadable samples (at most 20), by index in `samples`, with their errors. */
  readonly unreadable: readonly { readonly index: number; readonly error: NotationError }[];
  /** One sentence for the user. */
  readonly message: string;
}

const MAX_LISTED = 20;

/**
 * Says which notation a column of plane values uses, or that it is mixed or must be named.
 * Blank samples are skipped; values that cannot be read are counted and listed, not guessed at.
 * @example detectPlaneNotation(['030/45SE', '210/30NW']).notation // 'strike-quadrant'
 * @example detectPlaneNotation(['120/45', '130/40']).status // 'needs-naming'
 */
export function detectPlaneNotation(samples: readonly string[]): PlaneNotationReport {
  let bare = 0;
  let strikeQuadrant = 0;
  let quadrant = 0;
  let blank = 0;
  let unreadableCount = 0;
  const unreadable: { index: number; error: NotationError }[] = [];
  samples.forEach((text, index) => {
    if (text.trim() === '') {
      blank++;
      return;
    }
    let result: unknown;
    try {
      const s = scanPlane(text, PLANE_EXPECTED.auto);
      // Full parse with the notation the shape implies, so out-of-range values and letters
      // along the strike count as unreadable; dipdir and rhr accept exactly the same bare values.
      const notation = s.quadrant === undefined ? 'dipdir' : s.bearing ? 'quadrant' : 'strike-quadrant';
      result = tryParsePlane(text, notation);
      if (!(result instanceof NotationProblem)) {
        if (notation === 'dipdir') bare++;
        else if (notation === 'quadrant') quadrant++;
        else strikeQuadrant++;
        return;
      }
    } catch (e) {
      if (!(e instanceof NotationProblem)) throw e;
      result = e;
    }
    unreadableCount++;
    if (unreadable.length < MAX_LISTED) unreadable.push({ index, error: (result as NotationProblem).toError() });
  });
  const counts = { bare, strikeQuadrant, quadrant, unreadable: unreadableCount, blank };
  const readable = bare + strikeQuadrant + quadrant;
  const base = { counts, unreadable };
  if (readable + unreadableCount === 0) return { ...base, status: 'empty', message: 'every sample is blank' };
  if (readable === 0) return { ...base, status: 'unreadable', message: 'no sample could be read as a plane' };
  if (bare > 0 && strikeQuadrant + quadrant > 0) {
    return {
      ...base,
      status: 'mixed',
      message: `${bare} of ${readable} readable samples have no dip quadrant while the rest do; name the notation of the bare ones (dip direction/dip or right-hand-rule strike/dip)`,
    };
  }
  if (bare > 0) {
    return {
      ...base,
      status: 'needs-naming',
      message: 'values such as 120/45 could be dip direction/dip or right-hand-rule strike/dip; name the notation',
    };
  }
  if (strikeQuadrant > 0 && quadrant > 0) {
    return { ...base, status: 'self-describing-mixed', notation: 'auto', message: 'strike azimuths and quadrant bearings, each with a dip quadrant; read with auto' };
  }
  return strikeQuadrant > 0
    ? { ...base, status: 'single', notation: 'strike-quadrant', message: 'strike/dip with dip quadrant, such as 030/45SE' }
    : { ...base, status: 'single', notation: 'quadrant', message: 'quadrant-bearing strike with dip quadrant, such as N30E 45SE' };
}
