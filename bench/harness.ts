/**
 * A small benchmark harness: warm-ups, then timed repetitions of each case and of its
 * baseline in the same process, the median of each, and the ratio baseline / case.
 *
 * Budgets live here, not in unit tests, because timings depend on the machine and its load.
 * The clock is injectable so the arithmetic (median, ratio, pass/fail, JSON) can be tested
 * with fake timings.
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import { dirname } from 'node:path';

/** Unit in which a case's median is reported. */
export type TimeUnit = 'ns' | 'us' | 'ms' | 's';

/** Limits a case must meet; unset limits are not checked. */
export interface BenchBudget {
  /** Largest acceptable median, in milliseconds whatever the case's unit. */
  readonly maxMedianMs?: number;
  /** Smallest acceptable speed-up: baseline median / case median. */
  readonly minRatio?: number;
  /**
   * Largest acceptable slowdown: case median / baseline median (the inverse of the ratio), for a
   * case that does more work than its baseline and may only cost so many times as much.
   */
  readonly maxSlowdown?: number;
}

/** Something timed: a name and a function. Warm-up and repetition counts override the harness defaults. */
export interface BenchRunnable {
  readonly name: string;
  run(): unknown;
  readonly warmups?: number;
  readonly repetitions?: number;
}

/** One benchmark case. */
export interface BenchCase extends BenchRunnable {
  /** Unit of the reported medians. */
  readonly unit: TimeUnit;
  /** The slow reference doing the same work, timed in the same run. */
  readonly baseline?: BenchRunnable;
  readonly budget?: BenchBudget;
  /** Untimed preparation (building input data), run once before anything is timed. */
  setup?(): void;
  /**
   * Compares the case's last result with the baseline's (undefined without a baseline);
   * returns a description of the disagreement, or undefined when they agree.
   */
  check?(result: unknown, baselineResult: unknown): string | undefined;
}

/** The figures reported for one case (also the shape of each entry of the JSON file). */
export interface BenchResult {
  readonly name: string;
  /** Median time of the case, in `unit`. */
  readonly median: number;
  readonly unit: TimeUnit;
  /** Baseline name, or null without one. */
  readonly baseline: string | null;
  /** Median time of the baseline, in `unit`. */
  readonly baselineMedian: number | null;
  /** baselineMedian / median: how many times faster the case is. */
  readonly ratio: number | null;
  readonly budget: BenchBudget | null;
  /** False when a budget limit or the result check failed. */
  readonly pass: boolean;
  /** Why it failed; empty when it passed. */
  readonly problems: string[];
}

const REPORTED_NS = Symbol('reported time');

/** What a run returns when it timed itself: its time and its result. See {@link reportedTime}. */
export interface ReportedRun {
  readonly [REPORTED_NS]: number;
  readonly result: unknown;
}

/**
 * Wraps a run's result with the time the run measured itself, which the harness then takes in
 * place of its own clock. For work timed elsewhere (inside a browser page, in another process),
 * where the harness clock would time only the hand-over.
 * @example run: () => reportedTime(samplesNs.shift()!, 'from the page')
 */
export function reportedTime(ns: number, result?: unknown): ReportedRun {
  return { [REPORTED_NS]: ns, result };
}

function isReported(value: unknown): value is ReportedRun {
  return typeof value === 'object' && value !== null && REPORTED_NS in value;
}

/** Harness settings. */
export interface HarnessOptions {
  /** Default warm-up runs per case (untimed). Default 3. */
  readonly warmups?: number;
  /** Default timed runs per case. Default 10. */
  readonly repetitions?: number;
  /** Nanosecond clock. Default process.hrtime.bigint. */
  readonly clock?: () => bigint;
  /** Only cases whose name contains this (case-insensitive). */
  readonly filter?: string;
  /** Called after each case, e.g. to print progress. */
  readonly onResult?: (result: BenchResult) => void;
}

const NS_PER: Record<TimeUnit, number> = { ns: 1, us: 1e3, ms: 1e6, s: 1e9 };

/**
 * Median of a non-empty list (mean of the middle two for an even count); NaN when any value is
 * NaN (a missing measurement), which sorting would otherwise put anywhere.
 * @example median([5, 1, 3]) // 3
 */
export function median(values: readonly number[]): number {
  if (values.length === 0) throw new RangeError('median of no values');
  if (values.some(Number.isNaN)) return NaN;
  const s = [...values].sort((a, b) => a - b);
  const mid = s.length >> 1;
  return s.length % 2 === 1 ? s[mid] : (s[mid - 1] + s[mid]) / 2;
}

/**
 * Runs `warmups` untimed and `repetitions` timed calls; returns the timings in nanoseconds and
 * the last result. A run that returns {@link reportedTime} is timed by what it reports.
 * @example timeRuns(() => 1 + 1, 1, 5, process.hrtime.bigint).samplesNs.length // 5
 */
export function timeRuns(
  run: () => unknown,
  warmups: number,
  repetitions: number,
  clock: () => bigint,
): { samplesNs: number[]; last: unknown } {
  if (!(Number.isInteger(repetitions) && repetitions >= 1)) throw new RangeError(`repetitions ${repetitions}: expected a whole number from 1`);
  if (!(Number.isInteger(warmups) && warmups >= 0)) throw new RangeError(`warmups ${warmups}: expected a whole number from 0`);
  let last: unknown;
  const unwrap = (value: unknown): unknown => (isReported(value) ? value.result : value);
  for (let i = 0; i < warmups; i++) last = unwrap(run());
  const samplesNs: number[] = [];
  for (let i = 0; i < repetitions; i++) {
    const start = clock();
    const value = run();
    const elapsed = Number(clock() - start);
    samplesNs.push(isReported(value) ? value[REPORTED_NS] : elapsed);
    last = unwrap(value);
  }
  return { samplesNs, last };
}

/**
 * Checks a case's medians against its budget; returns the problems (empty when it passes).
 * @example budgetProblems({maxMedianMs: 100}, 120, null) // ['median 120 ms is over the budget of 100 ms']
 */
export function budgetProblems(budget: BenchBudget | undefined, medianMs: number, ratio: number | null): string[] {
  const problems: string[] = [];
  if (budget?.maxMedianMs !== undefined && !(medianMs <= budget.maxMedianMs)) {
    problems.push(`median ${round(medianMs)} ms is over the budget of ${budget.maxMedianMs} ms`);
  }
  if (budget?.minRatio !== undefined && !(ratio !== null && ratio >= budget.minRatio)) {
    problems.push(`speed-up ${ratio === null ? 'unknown' : `${round(ratio)}x`} is under the budget of ${budget.minRatio}x`);
  }
  if (budget?.maxSlowdown !== undefined) {
    // ratio = baseline / case, so the slowdown case / baseline is its inverse (0 for a case timed at zero).
    const slowdown = ratio === null ? null : 1 / ratio;
    if (!(slowdown !== null && slowdown <= budget.maxSlowdown)) {
      problems.push(`slowdown ${slowdown === null ? 'unknown' : `${round(slowdown)}x`} (case / baseline) is over the budget of ${budget.maxSlowdown}x`);
    }
  }
  return problems;
}

/**
 * Times one case and its baseline and judges the budget.
 * @example runCase({name: 'sum', unit: 'ms', run: () => 1}).median
 */
export function runCase(c: BenchCase, options: HarnessOptions = {}): BenchResult {
  if (!(c.unit in NS_PER)) throw new RangeError(`case "${c.name}" has unit "${String(c.unit)}"; expected one of ${Object.keys(NS_PER).join(', ')}`);
  if (c.budget?.minRatio !== undefined && !c.baseline) throw new RangeError(`case "${c.name}" has a minRatio budget but no baseline`);
  if (c.budget?.maxSlowdown !== undefined && !c.baseline) throw new RangeError(`case "${c.name}" has a maxSlowdown budget but no baseline`);
  const clock = options.clock ?? process.hrtime.bigint;
  const warmups = options.warmups ?? 3;
  const repetitions = options.repetitions ?? 10;
  c.setup?.();
  const timed = timeRuns(() => c.run(), c.warmups ?? warmups, c.repetitions ?? repetitions, clock);
  const medianNs = median(timed.samplesNs);
  let baselineMedianNs: number | null = null;
  let baselineLast: unknown;
  if (c.baseline) {
    const b = c.baseline;
    const bt = timeRuns(() => b.run(), b.warmups ?? warmups, b.repetitions ?? repetitions, clock);
    baselineMedianNs = median(bt.samplesNs);
    baselineLast = bt.last;
  }
  // A case timed at zero is infinitely faster; one with no time (NaN reported) has no ratio and fails any ratio budget.
  const ratio = baselineMedianNs === null ? null : medianNs > 0 ? baselineMedianNs / medianNs : medianNs === 0 ? Infinity : NaN;
  const problems = budgetProblems(c.budget, medianNs / NS_PER.ms, ratio);
  const disagreement = c.check?.(timed.last, baselineLast);
  if (disagreement) problems.push(`result check: ${disagreement}`);
  const unit = c.unit;
  return {
    name: c.name,
    median: medianNs / NS_PER[unit],
    unit,
    baseline: c.baseline?.name ?? null,
    baselineMedian: baselineMedianNs === null ? null : baselineMedianNs / NS_PER[unit],
    ratio,
    budget: c.budget ?? null,
    pass: problems.length === 0,
    problems,
  };
}

/**
 * Runs every case whose name matches the filter, in order.
 * @example runCases(cases, {filter: 'kamb'}).map((r) => r.pass)
 */
export function runCases(cases: readonly BenchCase[], options: HarnessOptions = {}): BenchResult[] {
  const filter = options.filter?.toLowerCase();
  const results: BenchResult[] = [];
  for (const c of cases) {
    if (filter && !c.name.toLowerCase().includes(filter)) continue;
    const result = runCase(c, options);
    options.onResult?.(result);
    results.push(result);
  }
  return results;
}

/**
 * The results as a plain-text table.
 * @example console.log(formatTable(results))
 */
export function formatTable(results: readonly BenchResult[]): string {
  const header = ['case', 'median', 'baseline', 'baseline median', 'ratio', 'budget', 'pass'];
  const rows = results.map((r) => [
    r.name,
    `${round(r.median)} ${r.unit}`,
    r.baseline ?? '-',
    r.baselineMedian === null ? '-' : `${round(r.baselineMedian)} ${r.unit}`,
    formatRatio(r.ratio),
    describeBudget(r.budget),
    r.pass ? 'yes' : `NO: ${r.problems.join('; ')}`,
  ]);
  const widths = header.map((h, i) => Math.max(h.length, ...rows.map((row) => row[i].length)));
  const line = (cells: string[]): string => cells.map((cell, i) => cell.padEnd(widths[i])).join('  ').trimEnd();
  return [line(header), line(widths.map((w) => '-'.repeat(w))), ...rows.map(line)].join('\n');
}

/**
 * The results as JSON: an array of {name, median, unit, baseline, baselineMedian, ratio, budget, pass, problems}.
 * @example JSON.parse(resultsJson(results))[0].ratio
 */
export function resultsJson(results: readonly BenchResult[]): string {
  // Infinity is not JSON: a zero-time case reports ratio null there rather than a silent null from stringify.
  return `${JSON.stringify(
    results.map((r) => ({ ...r, ratio: r.ratio !== null && Number.isFinite(r.ratio) ? r.ratio : null })),
    null,
    2,
  )}\n`;
}

/**
 * Writes the JSON results, creating the directory.
 * @example writeResults('bench/results/latest.json', results)
 */
export function writeResults(path: string, results: readonly BenchResult[]): void {
  mkdirSync(dirname(path), { recursive: true });
  writeFileSync(path, resultsJson(results));
}

/**
 * Process exit code: 1 when any case failed its budget or its result check, else 0.
 * @example exitCode(results) // 0
 */
export function exitCode(results: readonly BenchResult[]): number {
  return results.every((r) => r.pass) ? 0 : 1;
}

/** Command-line options of bench/run.ts. */
export interface BenchArgs {
  readonly json: string;
  readonly filter?: string;
}

/**
 * Parses `--json path` and `--filter substring` (also `--json=path`); throws on anything else.
 * @example parseBenchArgs(['--filter', 'kamb']) // {json: 'bench/results/latest.json', filter: 'kamb'}
 */
export function parseBenchArgs(argv: readonly string[], defaultJson = 'bench/results/latest.json'): BenchArgs {
  let json = defaultJson;
  let filter: string | undefined;
  for (let i = 0; i < argv.length; i++) {
    const [flag, inline] = argv[i].split(/=(.*)/s, 2);
    if (flag !== '--json' && flag !== '--filter') throw new RangeError(`unknown argument "${argv[i]}"; expected --json <path> or --filter <substring>`);
    const value = inline ?? argv[++i];
    if (value === undefined || value === '') throw new RangeError(`${flag} needs a value`);
    if (flag === '--json') json = value;
    else filter = value;
  }
  return filter === undefined ? { json } : { json, filter };
}

function describeBudget(budget: BenchBudget | null): string {
  if (!budget) return '-';
  const parts: string[] = [];
  if (budget.maxMedianMs !== undefined) parts.push(`<= ${budget.maxMedianMs} ms`);
  if (budget.minRatio !== undefined) parts.push(`>= ${budget.minRatio}x`);
  if (budget.maxSlowdown !== undefined) parts.push(`<= ${budget.maxSlowdown}x slower`);
  return parts.join(', ') || '-';
}

/** The speed-up, and for a case slower than its baseline also how many times slower. */
function formatRatio(ratio: number | null): string {
  if (ratio === null) return '-';
  return ratio < 1 && ratio > 0 ? `${round(ratio)}x (${round(1 / ratio)}x slower)` : `${round(ratio)}x`;
}

function round(x: number): string {
  if (!Number.isFinite(x)) return String(x);
  const a = Math.abs(x);
  return a >= 100 ? x.toFixed(0) : a >= 10 ? x.toFixed(1) : a >= 1 ? x.toFixed(2) : x.toPrecision(3);
}
