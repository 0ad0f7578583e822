/**
 * `npm run bench`: times every registered case against its baseline, prints a table, writes
 * the figures as JSON (default bench/results/latest.json) and exits non-zero when a case misses
 * its budget or its result disagrees with the baseline.
 *
 * Options: --json <path> (where to write the JSON), --filter <substring> (cases whose name
 * contains it, case-insensitive).
 */
import { exitCode, formatTable, parseBenchArgs, runCases, writeResults } from './harness';
import { benchCases } from './cases/index';

function main(): number {
  let args;
  try {
    args = parseBenchArgs(process.argv.slice(2));
  } catch (error) {
    console.error(`bench: ${(error as Error).message}`);
    return 2;
  }
  const started = Date.now();
  const results = runCases(benchCases, {
    ...(args.filter === undefined ? {} : { filter: args.filter }),
    onResult: (r) => console.error(`bench: ${r.name} done (${r.median.toFixed(2)} ${r.unit})`),
  });
  if (results.length === 0) {
    console.error(`bench: no case matches "${args.filter ?? ''}"; cases: ${benchCases.map((c) => c.name).join(' | ')}`);
    return 2;
  }
  console.log(formatTable(results));
  writeResults(args.json, results);
  console.log(`\n${results.length} case(s) in ${((Date.now() - started) / 1000).toFixed(1)} s on Node ${process.version}; JSON: ${args.json}`);
  return exitCode(results);
}

process.exitCode = main();
