// Test helpers that build and pack the npm package the way a release does (`npm run build:lib`,
// `npm run build:cli`, `npm pack`), for the pack-contents check and the packed-consumer test.
import { execFile } from 'node:child_process';
import { createHash } from 'node:crypto';
import { mkdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';

/** The repository root (where package.json is). */
export const REPO = fileURLToPath(new URL('../..', import.meta.url));

/** package.json of the repository, as written. */
export interface PackageJson {
  name: string;
  version: string;
  main?: string;
  module?: string;
  types?: string;
  bin?: Record<string, string>;
  exports?: Record<string, string | Record<string, string>>;
  files?: string[];
  dependencies?: Record<string, string>;
  peerDependencies?: Record<string, string>;
  devDependencies?: Record<string, string>;
}

export function readPackageJson(dir = REPO): PackageJson {
  return JSON.parse(readFileSync(join(dir, 'package.json'), 'utf8')) as PackageJson;
}

/** One file of `npm pack --json` output. */
export interface PackedFile {
  readonly path: string;
  readonly size: number;
}

/** The `npm pack --json` record of one package. */
export interface PackResult {
  readonly filename: string;
  readonly files: readonly PackedFile[];
  readonly entryCount: number;
  readonly unpackedSize: number;
}

/**
 * The environment for a child npm: without the npm_* variables that `npm test` passes down
 * (npm_config_local_prefix and friends would point a nested `npm install` back at this repo).
 */
export function cleanNpmEnv(): NodeJS.ProcessEnv {
  const env: NodeJS.ProcessEnv = {};
  for (const [key, value] of Object.entries(process.env)) {
    if (/^npm_/i.test(key) || key === 'INIT_CWD') continue;
    env[key] = value;
  }
  return env;
}

/** Runs a command; on failure the error names the command, its exit code and the end of its output. */
export function run(command: string, args: readonly string[], options: { cwd: string; timeoutMs?: number; env?: NodeJS.ProcessEnv }): Promise<{ stdout: string; stderr: string }> {
  return new Promise((resolve, reject) => {
    execFile(
      command,
      args,
      { cwd: options.cwd, env: options.env ?? cleanNpmEnv(), timeout: options.timeoutMs ?? 300_000, maxBuffer: 64 * 1024 * 1024 },
      (error, stdout, stderr) => {
        if (!error) return resolve({ stdout, stderr });
        const tail = `${stdout}\n${stderr}`.trim().split('\n').slice(-30).join('\n');
        reject(new Error(`${command} ${args.join(' ')} (in ${options.cwd}) failed with ${error.code ?? error.signal}:\n${tail}`));
      },
    );
  });
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

function alive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch {
    return false;
  }
}

let inProcess: Promise<unknown> = Promise.resolve();

/**
 * Runs `work` while holding this checkout's build lock, so two test files (or two vitest
 * projects running side by side) never write dist/ at the same time. The lock is a directory
 * in the temp folder named after the checkout; one left by a dead process is taken over.
 */
export function withBuildLock<T>(work: () => Promise<T>): Promise<T> {
  const lockDir = join(tmpdir(), `foldlens-build-${createHash('sha256').update(REPO).digest('hex').slice(0, 12)}.lock`);
  const acquire = async () => {
    const deadline = Date.now() + 10 * 60_000;
    for (;;) {
      try {
        mkdirSync(lockDir);
        writeFileSync(join(lockDir, 'pid'), String(process.pid));
        return;
      } catch (e) {
        if ((e as NodeJS.ErrnoException).code !== 'EEXIST') throw e;
      }
      let holder = NaN;
      try {
        holder = Number(readFileSync(join(lockDir, 'pid'), 'utf8'));
      } catch {
        // The holder has made the directory but not yet written its pid.
      }
      if (Number.isInteger(holder) && holder !== process.pid && !alive(holder)) rmSync(lockDir, { recursive: true, force: true });
      else if (Date.now() > deadline) throw new Error(`build lock ${lockDir} still held by process ${holder} after 10 minutes`);
      else await sleep(500);
    }
  };
  const next = inProcess.then(async () => {
    await acquire();
    try {
      return await work();
    } finally {
      rmSync(lockDir, { recursive: true, force: true });
    }
  });
  inProcess = next.catch(() => undefined);
  return next;
}

/** `npm run build:lib` and `npm run build:cli`, the builds that put the package's files in dist/. */
async function buildPackageFiles(): Promise<void> {
  await run('npm', ['run', 'build:lib'], { cwd: REPO });
  await run('npm', ['run', 'build:cli'], { cwd: REPO });
}

function parsePack(stdout: string): PackResult {
  const parsed = JSON.parse(stdout) as PackResult[];
  if (parsed.length !== 1) throw new Error(`npm pack --json listed ${parsed.length} packages, expected 1`);
  return parsed[0];
}

/**
 * Builds the package and lists what `npm pack` would put in the tarball (`--dry-run`). Scripts
 * are skipped because the build has just run (prepack would run it again and print into the JSON).
 */
export function buildAndListPack(): Promise<PackResult> {
  return withBuildLock(async () => {
    await buildPackageFiles();
    const { stdout } = await run('npm', ['pack', '--dry-run', '--json', '--ignore-scripts'], { cwd: REPO });
    return parsePack(stdout);
  });
}

/** Builds the package and packs it into `destination`; returns the tarball's path and its listing. */
export function buildAndPack(destination: string): Promise<PackResult & { tarball: string }> {
  return withBuildLock(async () => {
    await buildPackageFiles();
    const { stdout } = await run('npm', ['pack', '--json', '--ignore-scripts', '--pack-destination', destination], { cwd: REPO });
    const result = parsePack(stdout);
    return { ...result, tarball: join(destination, result.filename) };
  });
}
