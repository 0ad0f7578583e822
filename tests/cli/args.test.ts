import { describe, it, expect } from 'vitest';
import { parseArgs, formatOptions, UsageError, type OptionSpec } from '../../src/cli/args';

const SPECS: OptionSpec[] = [
  { name: 'to', value: 'notation', help: 'how to write planes' },
  { name: 'json', help: 'print JSON' },
  { name: 'declination', value: 'deg', help: 'declination' },
];

describe('parseArgs(argv, specs)', () => {
  it('parseArgs reads positionals, --name value, --name=value and flags', () => {
    expect(parseArgs(['a.csv', '--to', 'rhr', '--json', '--declination=-2.5'], SPECS)).toEqual({
      positionals: ['a.csv'],
      options: { to: 'rhr', json: 'true', declination: '-2.5' },
    });
  });

  it('parseArgs takes a negative number as a value', () => {
    expect(parseArgs(['--declination', '-3'], SPECS).options.declination).toBe('-3');
  });

  it('parseArgs treats everything after -- as positionals', () => {
    expect(parseArgs(['--', '--json'], SPECS).positionals).toEqual(['--json']);
  });

  const errors = [
    { argv: ['--bogus'], message: 'unknown option --bogus (see --help)' },
    { argv: ['--jsno'], message: 'unknown option --jsno (did you mean --json?)' },
    { argv: ['--to'], message: '--to needs a value (notation)' },
    { argv: ['--to', '--json'], message: '--to needs a value (notation)' },
    { argv: ['--json=yes'], message: '--json takes no value' },
    { argv: ['--to', 'rhr', '--to', 'dipdir'], message: '--to is given twice' },
    { argv: ['-x'], message: 'unknown option -x (options are written --name)' },
  ];
  for (const { argv, message } of errors) {
    it(`parseArgs(${JSON.stringify(argv)}) throws UsageError "${message}"`, () => {
      expect(() => parseArgs(argv, SPECS)).toThrow(UsageError);
      expect(() => parseArgs(argv, SPECS)).toThrow(message);
    });
  }

  it('formatOptions(specs) lines the help texts up', () => {
    expect(formatOptions(SPECS).split('\n')).toEqual([
      '  --to <notation>      how to write planes',
      '  --json               print JSON',
      '  --declination <deg>  declination',
    ]);
  });
});
