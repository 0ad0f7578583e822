/**
 * Drives bench/browser/symbols.html in headless Chromium on the software rasteriser: starts a
 * vite dev server on the project (as tests/browser/global-setup.ts does), then for each
 * repetition opens a fresh page per kind (symbols, then circles) and renders n stations; the
 * first repetition also counts the drawn features and pans (slow frames: once is enough).
 * Prints a {@link DriverReport} as JSON on the last line of standard output.
 *
 * Run by bench/cases/symbols.ts in a child process, because the harness is synchronous.
 * Usage: node --import tsx bench/browser/symbolsDriver.ts <n> <repetitions> <panSteps> <panMaxSeconds> <deadlineSeconds>
 * Starts no repetition that would end after the deadline (the report then holds fewer renders).
 * BENCH_VITE_LOG=info shows the dev server's log; CHROMIUM_PATH overrides /usr/bin/chromium.
 */
import { createServer, type ViteDevServer } from 'vite';
import { chromium, type Browser, type BrowserContext } from 'playwright-core';
import type { DriverReport, PageRender, RenderKind } from './protocol';

/** The flags of tests/browser/browser.ts (that module needs vitest, so it is not imported here). */
const CHROMIUM_ARGS = [
  '--no-sandbox',
  '--disable-gpu',
  '--use-angle=swiftshader',
  '--enable-unsafe-swiftshader',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
  '--no-first-run',
  '--disable-quic',
];
const VIEWPORT = { width: 1280, height: 800 };

function positiveInteger(text: string | undefined, name: string): number {
  const value = Number(text);
  if (!(Number.isInteger(value) && value >= 1)) throw new RangeError(`${name} "${text}": expected a whole number from 1`);
  return value;
}

/** Opens a fresh page, renders one kind, pans; fails on a page that never gets ready. */
async function renderOnce(
  context: BrowserContext,
  url: string,
  kind: RenderKind,
  n: number,
  panSteps: number,
  panMaxMs: number,
  countDrawn: boolean,
): Promise<{ render: PageRender; errors: string[] }> {
  const page = await context.newPage();
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(`pageerror: ${e.message}`));
  page.on('console', (m) => {
    if (m.type() === 'error') errors.push(`console: ${m.text()}`);
  });
  try {
    const loading = Date.now();
    await page.goto(url);
    await page.waitForSelector('body[data-bench-ready="true"]', { timeout: 60_000 }).catch((error: Error) => {
      throw new Error(`${error.message.split('\n')[0]} ${errors.join('; ')}`);
    });
    process.stderr.write(`symbols bench: ${kind} page loaded and map ready in ${((Date.now() - loading) / 1000).toFixed(1)} s\n`);
    // Same seed for both kinds and every repetition: the same points each time.
    const render = await page.evaluate(
      ([k, count, steps, maxMs, count1]) =>
        (window as unknown as { benchRender: (...a: unknown[]) => Promise<PageRender> }).benchRender(k, count, 31, steps, maxMs, count1),
      [kind, n, panSteps, panMaxMs, countDrawn] as const,
    );
    return { render, errors };
  } finally {
    await page.close();
  }
}

async function main(): Promise<DriverReport> {
  const [nText, repsText, stepsText, panMaxText, deadlineText] = process.argv.slice(2);
  const n = positiveInteger(nText, 'n');
  const reps = positiveInteger(repsText, 'repetitions');
  const panSteps = positiveInteger(stepsText, 'panSteps');
  const panMaxMs = 1000 * positiveInteger(panMaxText, 'panMaxSeconds');
  const started = Date.now();
  const deadline = started + 1000 * positiveInteger(deadlineText, 'deadlineSeconds');
  const elapsed = () => ((Date.now() - started) / 1000).toFixed(0);
  const renders: PageRender[] = [];
  const problems: string[] = [];
  let server: ViteDevServer | undefined;
  let browser: Browser | undefined;
  const close = async () => {
    await browser?.close().catch(() => undefined);
    await server?.close().catch(() => undefined);
  };
  process.once('SIGTERM', () => void close().then(() => process.exit(143)));
  try {
    // The project's vite config, plus this page in the dependency scan, so no late discovery reloads
    // it, and a cache of its own: a test run's dev server re-optimizing the shared cache at the same
    // time would answer this page's imports with "504 Outdated Optimize Dep".
    server = await createServer({
      configFile: 'vite.config.ts',
      cacheDir: 'node_modules/.vite-bench',
      // No hot reload: an edit to the sources while the bench runs must not reload a page mid-measurement.
      server: { port: 0, host: '127.0.0.1', hmr: false },
      optimizeDeps: { entries: ['bench/browser/*.html'] },
      logLevel: (process.env.BENCH_VITE_LOG as 'info' | undefined) ?? 'error',
    });
    await server.listen();
    const address = server.httpServer?.address();
    if (!address || typeof address === 'string') throw new Error('vite server did not report a port');
    const url = `http://127.0.0.1:${address.port}/bench/browser/symbols.html`;
    process.stderr.write(`symbols bench: dev server ready (${elapsed()} s since start)\n`);
    browser = await chromium.launch({ executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium', args: CHROMIUM_ARGS });
    // One context for every page: they share the HTTP cache (modules load faster), nothing else.
    const context = await browser.newContext({ viewport: VIEWPORT });
    let slowestRep = 0;
    for (let rep = 0; rep < reps; rep++) {
      if (rep > 0 && Date.now() + 1.2 * slowestRep > deadline) {
        process.stderr.write(`symbols bench: stopped after ${rep} of ${reps} repetitions: the next would pass the deadline\n`);
        break;
      }
      const repStart = Date.now();
      let extraMs = 0;
      for (const kind of ['symbols', 'circles'] as RenderKind[]) {
        const steps = rep === 0 ? panSteps : 0;
        const result = await renderOnce(context, url, kind, n, steps, panMaxMs, rep === 0).catch((error: Error) => {
          // A dev server that finds a dependency late reloads the page once; try again on a fresh page.
          if (!/context was destroyed|navigat/i.test(error.message)) throw error;
          process.stderr.write(`symbols bench: page reloaded by the dev server, ${kind} rendered again\n`);
          return renderOnce(context, url, kind, n, steps, panMaxMs, rep === 0);
        });
        if (result.errors.length > 0) problems.push(`${kind}, repetition ${rep + 1}: ${result.errors.join('; ')}`);
        renders.push(result.render);
        extraMs += result.render.frameMs.reduce((a, b) => a + b, 0) + result.render.countMs;
        process.stderr.write(
          `symbols bench: ${kind} n=${n} rep ${rep + 1}: first render ${result.render.firstRenderMs.toFixed(0)} ms (${elapsed()} s since start)\n`,
        );
      }
      // Later repetitions neither count nor pan: leave both out of the estimate of the next one.
      slowestRep = Math.max(slowestRep, Date.now() - repStart - extraMs);
    }
  } catch (error) {
    problems.push(`driver failed: ${(error as Error).message.split('\n')[0]}`);
  } finally {
    await close();
  }
  return { n, viewport: VIEWPORT, renders, repetitions: reps, problems };
}

main()
  .then((report) => {
    process.stdout.write(`${JSON.stringify(report)}\n`);
    process.exit(0);
  })
  .catch((error) => {
    process.stderr.write(`symbols bench: ${(error as Error).message}\n`);
    process.exit(1);
  });
