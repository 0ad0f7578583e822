import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { UsageError, formatOptions, parseArgs, type OptionSpec } from '../../src/cli/args';
import { INPUT_OPTIONS } from '../../src/cli/input';
import { textFrom } from '../helpers/fuzzArbitraries';
import { fuzzRuns, fuzzTimeout } from '../helpers/fuzzRuns';

/**
 * Fuzzing the command-line argument parser (issue #8, point 5): any argument list against the
 * real input options and against made-up option sets. Only UsageError escapes, and what is
 * returned accounts for the arguments: every positional is an argument (or follows "--"), every
 * option is declared, a flag is "true", a value is text from the arguments.
 */

const NAMES = ['to', 'json', 'declination', 'crs', 'kind', 'x', 'help', '__proto__', 'constructor', 'toString', ''];
const spec: fc.Arbitrary<OptionSpec> = fc.record({ name: fc.oneof(fc.constantFrom(...NAMES), fc.string({ maxLength: 6 })), value: fc.option(fc.constantFrom('N', 'file'), { nil: undefined }), help: fc.constant('') }).map((s) =>
  s.value === undefined ? { name: s.name, help: s.help } : s,
);
const specs = fc.oneof(fc.constant(INPUT_OPTIONS), fc.uniqueArray(spec, { maxLength: 6, selector: (s) => s.name }));
const arg = fc.oneof(
  textFrom(['--', '-', '=', 'to', 'json', 'crs', 'EPSG:32633', 'kind', 'bedding', 'a.csv', '-3', '__proto__', 'constructor', 'h', ' '], 6),
  fc.constantFrom('--', '-', '-h', '--=', '--help', '--__proto__', '--constructor=1', '--toString'),
  fc.constantFrom(...INPUT_OPTIONS.map((o) => `--${o.name}`)),
);

describe('parseArgs never lets anything but UsageError escape (fuzz)', () => {
  it('parseArgs(argv, specs) on any arguments throws only UsageError and returns only what the arguments hold', () => {
    fc.assert(
      fc.property(fc.array(arg, { maxLength: 8 }), specs, (argv, s) => {
        let parsed;
        try {
          parsed = parseArgs(argv, s);
        } catch (e) {
          if (!(e instanceof UsageError)) throw new Error(`parseArgs(${JSON.stringify(argv)}) threw ${String(e)}`);
          expect(e.message.length).toBeGreaterThan(0);
          return;
        }
        const declared = new Set([...s.map((o) => o.name), 'help']);
        for (const p of parsed.positionals) expect(argv).toContain(p);
        for (const [name, value] of Object.entries(parsed.options)) {
          expect(declared.has(name), `option ${name}`).toBe(true);
          expect(typeof value).toBe('string');
          if (name === 'help' && value === 'true' && argv.includes('-h')) continue; // -h is help, whatever the command declares
          const flag = s.find((o) => o.name === name)?.value === undefined;
          if (flag) expect(value).toBe('true');
          else expect(argv.some((a) => a === value || a.endsWith(`=${value}`))).toBe(true);
        }
        // Nothing lands on Object.prototype, whatever the option names.
        expect(Object.getPrototypeOf(parsed.options)).toBe(Object.prototype);
        expect(({} as Record<string, unknown>).json).toBeUndefined();
      }),
      { numRuns: fuzzRuns(3000) },
    );
  }, fuzzTimeout());

  it('formatOptions(specs) on any option set gives one line per option, never a throw', () => {
    fc.assert(
      fc.property(fc.uniqueArray(spec, { minLength: 1, maxLength: 6, selector: (s) => s.name }), (s) => {
        expect(formatOptions(s).split('\n')).toHaveLength(s.length);
      }),
      { numRuns: fuzzRuns(500) },
    );
  }, fuzzTimeout());
});
