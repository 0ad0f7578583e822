/**
 * A small command-line option parser: `--name value`, `--name=value` and `--flag`; `--` ends
 * the options. Anything not declared is an error, never ignored.
 */

/** One option a command accepts. */
export interface OptionSpec {
  readonly name: string;
  /** Placeholder of the value (e.g. "N", "file"); absent for a flag. */
  readonly value?: string;
  readonly help: string;
}

/** Parsed arguments: positionals in order, option values by name (flags are "true"). */
export interface ParsedArgs {
  readonly positionals: readonly string[];
  readonly options: Readonly<Record<string, string>>;
}

/**
 * A mistake on the command line (exit code 2).
 * @example new UsageError('unknown option --bogus')
 */
export class UsageError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'UsageError';
  }
}

/**
 * Parses `argv` against the options of one command. Throws {@link UsageError} for an unknown
 * option, a missing value, a value given to a flag, or an option given twice.
 * @example
 * parseArgs(['a.csv', '--to', 'rhr'], [{ name: 'to', value: 'notation', help: '' }])
 * // { positionals: ['a.csv'], options: { to: 'rhr' } }
 */
export function parseArgs(argv: readonly string[], specs: readonly OptionSpec[]): ParsedArgs {
  const byName = new Map(specs.map((s) => [s.name, s]));
  const positionals: string[] = [];
  const options: Record<string, string> = {};
  for (let i = 0; i < argv.length; i++) {
    const arg = argv[i];
    if (arg === '--') {
      positionals.push(...argv.slice(i + 1));
      break;
    }
    if (arg === '-h') {
      options.help = 'true';
      continue;
    }
    if (!arg.startsWith('--') || arg === '-') {
      if (arg.startsWith('-') && arg !== '-') throw new UsageError(`unknown option ${arg} (options are written --name)`);
      positionals.push(arg);
      continue;
    }
    const eq = arg.indexOf('=');
    const name = arg.slice(2, eq < 0 ? undefined : eq);
    const spec = byName.get(name);
    if (!spec) throw new UsageError(`unknown option --${name}${suggest(name, specs)}`);
    if (Object.prototype.hasOwnProperty.call(options, name)) throw new UsageError(`--${name} is given twice`);
    if (spec.value === undefined) {
      if (eq >= 0) throw new UsageError(`--${name} takes no value`);
      options[name] = 'true';
      continue;
    }
    let value: string | undefined;
    if (eq >= 0) value = arg.slice(eq + 1);
    else {
      value = argv[i + 1];
      if (value === undefined || (value.startsWith('--') && value.length > 2)) throw new UsageError(`--${name} needs a value (${spec.value})`);
      i++;
    }
    options[name] = value;
  }
  return { positionals, options };
}

/**
 * The option list of a command as help text, one option a line.
 * @example formatOptions([{ name: 'json', help: 'print JSON' }]) // '  --json  print JSON'
 */
export function formatOptions(specs: readonly OptionSpec[]): string {
  const left = specs.map((s) => `  --${s.name}${s.value ? ` <${s.value}>` : ''}`);
  const width = Math.max(...left.map((l) => l.length)) + 2;
  return specs.map((s, i) => `${left[i].padEnd(width)}${s.help}`).join('\n');
}

function suggest(name: string, specs: readonly OptionSpec[]): string {
  const close = specs.filter((s) => distance(s.name, name) <= 2).map((s) => `--${s.name}`);
  return close.length > 0 ? ` (did you mean ${close.slice(0, 3).join(' or ')}?)` : ' (see --help)';
}

/** Levenshtein distance, for "did you mean". */
function distance(a: string, b: string): number {
  const row = Array.from({ length: b.length + 1 }, (_, j) => j);
  for (let i = 1; i <= a.length; i++) {
    let prev = row[0];
    row[0] = i;
    for (let j = 1; j <= b.length; j++) {
      const tmp = row[j];
      row[j] = Math.min(row[j] + 1, row[j - 1] + 1, prev + (a[i - 1] === b[j - 1] ? 0 : 1));
      prev = tmp;
    }
  }
  return row[b.length];
}
