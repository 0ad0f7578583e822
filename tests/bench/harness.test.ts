import { describe, it, expect } from 'vitest';
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import {
  budgetProblems,
  exitCode,
  formatTable,
  median,
  parseBenchArgs,
  reportedTime,
  resultsJson,
  runCase,
  runCases,
  writeResults,
  type BenchCase,
} from '../../bench/harness';

/**
 * A fake nanosecond clock: each run() of a fake case advances it by the next of its given
 * durations, so the harness's arithmetic can be checked without timing anything.
 */
function fakeClock(): { clock: () => bigint; advance: (ns: number) => void } {
  let now = 0n;
  return { clock: () => now, advance: (ns) => (now += BigInt(ns)) };
}

function durations(advance: (ns: number) => void, ns: number[]): () => number {
  let i = 0;
  return () => {
    advance(ns[i % ns.length]);
    return i++;
  };
}

describe('median', () => {
  // Definition of the median (common practice): middle value, or mean of the two middle values.
  const rows = [
    { values: [5, 1, 3], expected: 3 },
    { values: [4, 1, 3, 2], expected: 2.5 },
    { values: [7], expected: 7 },
    // A missing measurement (NaN) makes the median unknown, not whatever sorting leaves in the middle.
    { values: [1, NaN, 3], expected: NaN },
  ];
  for (const { values, expected } of rows) {
    it(`median([${values}]) is ${expected}`, () => expect(median(values)).toBe(expected));
  }
  it('median([]) throws', () => expect(() => median([])).toThrow(/no values/));
});

describe('runCase', () => {
  it('runCase(case with fake timings) reports medians in the case unit and ratio = baseline median / median', () => {
    const { clock, advance } = fakeClock();
    const c: BenchCase = {
      name: 'fake fast',
      unit: 'ms',
      // Warm-up durations (first two) are ignored; timed 1, 3, 2 ms -> median 2 ms.
      run: durations(advance, [50e6, 50e6, 1e6, 3e6, 2e6]),
      warmups: 2,
      repetitions: 3,
      baseline: { name: 'fake slow', run: durations(advance, [10e6, 30e6, 20e6, 40e6]), warmups: 0, repetitions: 4 },
      budget: { maxMedianMs: 5, minRatio: 10 },
    };
    const r = runCase(c, { clock });
    expect(r.median).toBe(2);
    expect(r.baselineMedian).toBe(25);
    expect(r.ratio).toBe(12.5);
    expect(r.pass).toBe(true);
    expect([r.name, r.baseline, r.unit]).toEqual(['fake fast', 'fake slow', 'ms']);
  });

  it('runCase fails a case over its time budget or under its speed-up budget, and says why', () => {
    const { clock, advance } = fakeClock();
    const r = runCase(
      {
        name: 'slow',
        unit: 'us',
        run: durations(advance, [200e6]),
        baseline: { name: 'b', run: durations(advance, [300e6]) },
        budget: { maxMedianMs: 100, minRatio: 2 },
      },
      { clock, warmups: 0, repetitions: 3 },
    );
    expect(r.median).toBe(200_000); // 200 ms in microseconds
    expect(r.ratio).toBe(1.5);
    expect(r.pass).toBe(false);
    expect(r.problems).toEqual(['median 200 ms is over the budget of 100 ms', 'speed-up 1.50x is under the budget of 2x']);
  });

  it('runCase fails a case whose result check reports a disagreement with the baseline', () => {
    const { clock, advance } = fakeClock();
    const r = runCase(
      {
        name: 'wrong',
        unit: 'ms',
        run: () => (advance(1e6), 41),
        baseline: { name: 'right', run: () => (advance(2e6), 42) },
        check: (a, b) => (a === b ? undefined : `${String(a)} against ${String(b)}`),
      },
      { clock, warmups: 1, repetitions: 1 },
    );
    expect(r.pass).toBe(false);
    expect(r.problems).toEqual(['result check: 41 against 42']);
    expect(exitCode([r])).toBe(1);
  });

  it('runCase passes a case without budget, and rejects a speed-up budget without a baseline or an unknown unit', () => {
    const { clock, advance } = fakeClock();
    const r = runCase({ name: 'free', unit: 'ms', run: () => advance(1e6) }, { clock, repetitions: 2 });
    expect([r.pass, r.baseline, r.baselineMedian, r.ratio, r.budget]).toEqual([true, null, null, null, null]);
    expect(() => runCase({ name: 'x', unit: 'ms', run: () => 0, budget: { minRatio: 2 } })).toThrow(/minRatio budget but no baseline/);
    expect(() => runCase({ name: 'x', unit: 'hours' as 'ms', run: () => 0 })).toThrow(/unit "hours"/);
  });

  it('runCase calls setup once before timing', () => {
    const calls: string[] = [];
    const { clock, advance } = fakeClock();
    runCase({ name: 's', unit: 'ms', setup: () => calls.push('setup'), run: () => (advance(1), calls.push('run')) }, { clock, warmups: 1, repetitions: 2 });
    expect(calls).toEqual(['setup', 'run', 'run', 'run']);
  });
});

describe('reportedTime and the maxSlowdown budget', () => {
  it('runCase takes the times its runs report with reportedTime(ns, result) instead of its clock, and checks the unwrapped results', () => {
    const { clock, advance } = fakeClock();
    const reported = [9e6, 1e6, 3e6, 2e6]; // first one is the warm-up
    let i = 0;
    const seen: unknown[] = [];
    const r = runCase(
      {
        name: 'timed in a page',
        unit: 'ms',
        // The clock sees 100 ms per run (the hand-over); the runs report 1, 3 and 2 ms.
        run: () => (advance(100e6), reportedTime(reported[i], `result ${i++}`)),
        warmups: 1,
        repetitions: 3,
        baseline: { name: 'also in a page', run: () => (advance(100e6), reportedTime(8e6, 'b')), warmups: 0, repetitions: 2 },
        check: (a, b) => (seen.push(a, b), undefined),
      },
      { clock },
    );
    expect([r.median, r.baselineMedian, r.ratio]).toEqual([2, 8, 4]);
    expect(seen).toEqual(['result 3', 'b']);
  });

  it('runCase judges maxSlowdown as case median / baseline median, the inverse of the ratio', () => {
    const { clock, advance } = fakeClock();
    // Case 5 ms, baseline 2 ms: 2.5 times slower.
    const make = (maxSlowdown: number): BenchCase => ({
      name: 'symbols',
      unit: 'ms',
      run: () => advance(5e6),
      baseline: { name: 'circles', run: () => advance(2e6) },
      budget: { maxSlowdown },
    });
    const ok = runCase(make(3), { clock, warmups: 0, repetitions: 1 });
    expect([ok.ratio, ok.pass]).toEqual([0.4, true]);
    const over = runCase(make(2), { clock, warmups: 0, repetitions: 1 });
    expect(over.pass).toBe(false);
    expect(over.problems).toEqual(['slowdown 2.50x (case / baseline) is over the budget of 2x']);
    expect(() => runCase({ name: 'x', unit: 'ms', run: () => 0, budget: { maxSlowdown: 3 } })).toThrow(/maxSlowdown budget but no baseline/);
  });

  it('runCase fails the ratio budgets of a case whose runs report no time (NaN), rather than calling it infinitely fast', () => {
    const { clock } = fakeClock();
    const r = runCase(
      { name: 'lost', unit: 'ms', run: () => reportedTime(NaN), baseline: { name: 'b', run: () => reportedTime(2e6) }, budget: { maxSlowdown: 3, minRatio: 0.1 } },
      { clock, warmups: 0, repetitions: 2 },
    );
    expect(r.ratio).toBeNaN();
    expect(r.pass).toBe(false);
    expect(r.problems).toEqual(['speed-up NaNx is under the budget of 0.1x', 'slowdown NaNx (case / baseline) is over the budget of 3x']);
  });

  it('budgetProblems({maxSlowdown}, medianMs, ratio) fails an unknown ratio and passes a case timed at zero', () => {
    expect(budgetProblems({ maxSlowdown: 3 }, 1, null)).toEqual(['slowdown unknown (case / baseline) is over the budget of 3x']);
    expect(budgetProblems({ maxSlowdown: 3 }, 0, Infinity)).toEqual([]);
    expect(budgetProblems({ maxSlowdown: 3 }, 1, 1 / 3)).toEqual([]);
  });

  it('formatTable shows a slower case as "0.400x (2.50x slower)" and its budget as "<= 3x slower"', () => {
    const { clock, advance } = fakeClock();
    const [r] = runCases(
      [{ name: 'symbols', unit: 'ms', run: () => advance(5e6), baseline: { name: 'circles', run: () => advance(2e6) }, budget: { maxSlowdown: 3 } }],
      { clock, warmups: 0, repetitions: 1 },
    );
    const row = formatTable([r]).split('\n')[2];
    expect(row).toMatch(/0\.400x \(2\.50x slower\)\s+<= 3x slower\s+yes$/);
  });
});

describe('runCases, output and arguments', () => {
  it('runCases(cases, {filter}) runs only the cases whose name contains the filter, ignoring case', () => {
    const { clock, advance } = fakeClock();
    const cases: BenchCase[] = ['Kamb grid', 'exponential density', 'girdle fit'].map((name) => ({ name, unit: 'ms', run: () => advance(1e6) }));
    expect(runCases(cases, { clock, filter: 'KAMB', warmups: 0, repetitions: 1 }).map((r) => r.name)).toEqual(['Kamb grid']);
    expect(runCases(cases, { clock, warmups: 0, repetitions: 1 })).toHaveLength(3);
  });

  it('writeResults(path, results) writes the JSON array of {name, median, unit, baseline, baselineMedian, ratio, budget, pass}', () => {
    const { clock, advance } = fakeClock();
    const results = runCases(
      [
        {
          name: 'a',
          unit: 'ms',
          run: () => advance(4e6),
          baseline: { name: 'naive a', run: () => advance(40e6) },
          budget: { maxMedianMs: 5 },
        },
        { name: 'b', unit: 's', run: () => advance(3e9) },
      ],
      { clock, warmups: 0, repetitions: 3 },
    );
    const path = join(mkdtempSync(join(tmpdir(), 'bench-')), 'nested', 'latest.json');
    writeResults(path, results);
    const json = JSON.parse(readFileSync(path, 'utf8'));
    expect(json).toEqual([
      { name: 'a', median: 4, unit: 'ms', baseline: 'naive a', baselineMedian: 40, ratio: 10, budget: { maxMedianMs: 5 }, pass: true, problems: [] },
      { name: 'b', median: 3, unit: 's', baseline: null, baselineMedian: null, ratio: null, budget: null, pass: true, problems: [] },
    ]);
    expect(exitCode(results)).toBe(0);
  });

  it('resultsJson writes an infinite ratio (a case timed at zero) as null, and formatTable lists every case', () => {
    const { clock, advance } = fakeClock();
    const [r] = runCases([{ name: 'instant', unit: 'ms', run: () => 0, baseline: { name: 'slow', run: () => advance(5) } }], { clock, warmups: 0, repetitions: 1 });
    expect(r.ratio).toBe(Infinity);
    expect(JSON.parse(resultsJson([r]))[0].ratio).toBeNull();
    const table = formatTable([r]).split('\n');
    expect(table[0]).toMatch(/^case\s+median\s+baseline/);
    expect(table[2]).toMatch(/^instant\s+0\.00\d* ms\s+slow/);
  });

  it('budgetProblems(budget, medianMs, ratio) reports an unknown ratio as failing a speed-up budget', () => {
    expect(budgetProblems({ minRatio: 3 }, 1, null)).toEqual(['speed-up unknown is under the budget of 3x']);
    expect(budgetProblems(undefined, 1e9, null)).toEqual([]);
  });

  it('parseBenchArgs(argv) reads --json and --filter, with or without "=", and rejects anything else', () => {
    expect(parseBenchArgs([])).toEqual({ json: 'bench/results/latest.json' });
    expect(parseBenchArgs(['--json', 'out/x.json', '--filter', 'kamb'])).toEqual({ json: 'out/x.json', filter: 'kamb' });
    expect(parseBenchArgs(['--filter=girdle fit'])).toEqual({ json: 'bench/results/latest.json', filter: 'girdle fit' });
    expect(() => parseBenchArgs(['--fast'])).toThrow(/unknown argument "--fast"/);
    expect(() => parseBenchArgs(['--json'])).toThrow(/--json needs a value/);
  });
});
