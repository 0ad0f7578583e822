/**
 * How many generated inputs a fuzz property runs: the CI count on every run, and
 * {@link NIGHTLY_FUZZ_RUNS} with FOLDLENS_NIGHTLY=1 (`npm run test:nightly`), the flag the other
 * nightly-size tests read (tests/components/parseJobLarge.test.ts).
 */

/** Whether this is the nightly-size run. */
export const NIGHTLY = process.env.FOLDLENS_NIGHTLY === '1';

/** Generated inputs per parser in the nightly-size run (issue #8: at least 10^5). */
export const NIGHTLY_FUZZ_RUNS = 100_000;

/**
 * `numRuns` for fast-check: `ciCount` normally, 100 000 in the nightly run. `nightlyCount`
 * lowers the nightly count for a property too expensive for 10^5 runs (say why beside it).
 * @example fc.assert(fc.property(fc.string(), (s) => { parse(s); }), { numRuns: fuzzRuns(2000) });
 */
export function fuzzRuns(ciCount: number, nightlyCount = NIGHTLY_FUZZ_RUNS): number {
  return NIGHTLY ? Math.max(ciCount, nightlyCount) : ciCount;
}

/**
 * A per-test timeout (ms) for a fuzz property: `ciMs` normally, an hour in the nightly run.
 * @example it('parse never throws (fuzz)', () => { ... }, fuzzTimeout());
 */
export function fuzzTimeout(ciMs = 60_000): number {
  return NIGHTLY ? 3_600_000 : ciMs;
}
