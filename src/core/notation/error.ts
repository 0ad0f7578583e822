/**
 * The one error type every notation parser throws for unreadable text.
 *
 * Importers turn it into a row problem: `value` is the text exactly as given (never trimmed
 * or altered), `expected` says in words what would have been read, and `problem` names what
 * is wrong with this value, so that a message built from any pair of them is useful.
 * @example
 * try { parsePlane('095/45', 'dipdir'); } catch (e) {
 *   if (e instanceof NotationError) console.log(e.field, e.value, e.expected);
 * }
 */
export class NotationError extends Error {
  /** The text (or number, as text) that could not be read, exactly as given. */
  readonly value: string;
  /** What was expected, in words: "a dip from 0 to 90". */
  readonly expected: string;
  /** What is wrong with `value`, in words: "dip 95 is more than 90". */
  readonly problem: string;
  /** Which part of the value is wrong: "dip", "strike", "dip quadrant", "notation", ... */
  readonly field: string;

  /**
   * @example
   * new NotationError('120/95', 'dip 95 is more than 90', 'a dip from 0 to 90', 'dip').message
   * // '"120/95": dip 95 is more than 90; expected a dip from 0 to 90'
   */
  constructor(value: string, problem: string, expected: string, field = 'value') {
    super(`${quoteValue(value)}: ${problem}; expected ${expected}`);
    this.name = 'NotationError';
    this.value = value;
    this.expected = expected;
    this.problem = problem;
    this.field = field;
  }
}

/**
 * The same facts as a NotationError, as a plain object with no stack trace. Capturing a stack
 * costs far more than parsing a field, so the parsers use this inside and for the `tryParse*`
 * functions that bulk imports call; the throwing parsers turn it into a NotationError.
 * @example
 * const r = tryParsePlane('N30E 95SE', 'strike-quadrant');
 * if (r instanceof NotationProblem) report(r.problem);
 */
export class NotationProblem {
  readonly value: string;
  readonly problem: string;
  readonly expected: string;
  readonly field: string;

  /** @example new NotationProblem('120/95', 'dip 95 is more than 90', 'a dip from 0 to 90', 'dip').field // 'dip' */
  constructor(value: string, problem: string, expected: string, field = 'value') {
    this.value = value;
    this.problem = problem;
    this.expected = expected;
    this.field = field;
  }

  /** The sentence a NotationError would carry. @example problem.message // '"120/95": dip 95 is more than 90; expected a dip from 0 to 90' */
  get message(): string {
    return `${quoteValue(this.value)}: ${this.problem}; expected ${this.expected}`;
  }

  /** @example new NotationProblem('x', 'p', 'e').toError() instanceof NotationError // true */
  toError(): NotationError {
    return new NotationError(this.value, this.problem, this.expected, this.field);
  }
}

/**
 * A NotationProblem caught inside a parser, as the NotationError the public API throws;
 * anything else (a bug) passes through unchanged.
 * @example throw asNotationError(e)
 */
export function asNotationError(e: unknown): unknown {
  return e instanceof NotationProblem ? e.toError() : e;
}

/**
 * A NotationProblem caught inside a parser, returned as a value; anything else is rethrown.
 * @example const r = problemOrRethrow(e) // NotationProblem
 */
export function problemOrRethrow(e: unknown): NotationProblem {
  if (e instanceof NotationProblem) return e;
  throw e;
}

/** Longest value quoted in full inside a message; longer ones are cut (the `value` field keeps all of it). */
const MAX_QUOTED = 60;

/**
 * A value quoted for a message: JSON escaping makes control characters visible, and very long
 * junk is shortened so a message stays readable.
 * @example quoteValue('120/45') // '"120/45"'
 */
export function quoteValue(value: string): string {
  const shown = value.length > MAX_QUOTED ? `${value.slice(0, MAX_QUOTED - 1)}…` : value;
  return JSON.stringify(shown);
}

/**
 * An azimuth for a message: rounded to 6 decimals, integer part padded to three digits.
 * @example messageAzimuth(30) // '030'
 */
export function messageAzimuth(a: number): string {
  const s = String(Math.round(a * 1e6) / 1e6);
  const dot = s.indexOf('.');
  return s.padStart(dot < 0 ? 3 : s.length - dot + 3, '0');
}
