import { realpathSync } from 'node:fs';
import { readFile, writeFile } from 'node:fs/promises';
import { fileURLToPath } from 'node:url';
import { loadEpsgFromIndex } from '../io/epsgNode';
import { UsageError } from './args';
import { ANALYZE_HELP, runAnalyze } from './analyze';
import { CHECK_HELP, runCheck } from './check';
import { CONVERT_HELP, runConvert } from './convert';
import { PROFILE_HELP, runProfile } from './profile';
import type { CliIo } from './input';

/**
 * The `foldlens` command line. `runCli` does the work and returns the exit code, so tests can
 * run it with their own streams and files; the lines at the end run it for real when this
 * file is the program started.
 *
 * Exit codes, for every command: 0 all went well; 1 some input could not be used (rows that
 * could not be read are listed on stderr, the rest is processed); 2 a usage or file error.
 */

export type { CliIo } from './input';

export const MAIN_HELP = `Usage: foldlens <command> [options]

Commands:
  convert <file.csv> --to <notation>   write the table back with normalised attitudes added
  analyze <file.csv|file.geojson>      fold axis, girdle and fabric of the planes (and lines)
  profile <file.csv> --axis <t/p>      down-plunge profile of stations and linework (CSV, JSON, SVG)
  check <file.csv>                     consistency report: lines vs axis, poles vs girdle, map pattern, axis field

Run foldlens <command> --help for the options of a command.
Exit codes: 0 all went well; 1 some rows could not be read; 2 usage or file error.
`;

/**
 * Runs the command line with `argv` (the arguments after the program name).
 * @example
 * const code = await runCli(['convert', 'field.csv', '--to', 'rhr'], io);
 */
export async function runCli(argv: readonly string[], io: CliIo): Promise<number> {
  const [command, ...rest] = argv;
  try {
    switch (command) {
      case 'convert':
        return await runConvert(rest, io);
      case 'analyze':
        return await runAnalyze(rest, io);
      case 'profile':
        return await runProfile(rest, io);
      case 'check':
        return await runCheck(rest, io);
      case undefined:
      case '--help':
      case '-h':
      case 'help':
        if (command === 'help' && rest[0] === 'convert') io.stdout.write(CONVERT_HELP);
        else if (command === 'help' && rest[0] === 'analyze') io.stdout.write(ANALYZE_HELP);
        else if (command === 'help' && rest[0] === 'profile') io.stdout.write(PROFILE_HELP);
        else if (command === 'help' && rest[0] === 'check') io.stdout.write(CHECK_HELP);
        else (command === undefined ? io.stderr : io.stdout).write(MAIN_HELP);
        return command === undefined ? 2 : 0;
      default:
        throw new UsageError(`unknown command "${command}": expected convert or analyze or profile`);
    }
  } catch (e) {
    if (e instanceof UsageError) {
      io.stderr.write(`foldlens: ${e.message}\n`);
      return 2;
    }
    throw e;
  }
}

/** The real surroundings: process streams and the file system. */
export const nodeIo: CliIo = {
  stdout: process.stdout,
  stderr: process.stderr,
  readFile: (path) => readFile(path),
  writeFile: (path, text) => writeFile(path, text, 'utf8'),
  epsg: loadEpsgFromIndex,
};

/** Whether this module is the program that was started (not imported by a test). */
function isEntry(): boolean {
  const started = process.argv[1];
  if (!started) return false;
  try {
    return realpathSync(started) === realpathSync(fileURLToPath(import.meta.url));
  } catch {
    return false;
  }
}

if (isEntry()) {
  runCli(process.argv.slice(2), nodeIo).then(
    (code) => {
      process.exitCode = code;
    },
    (e: unknown) => {
      process.stderr.write(`foldlens: internal error: ${e instanceof Error ? (e.stack ?? e.message) : String(e)}\n`);
      process.exitCode = 3;
    },
  );
}
