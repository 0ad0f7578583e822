import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { spawn, type ChildProcess } from 'node:child_process';
import { createReadStream, mkdirSync, mkdtempSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import { extname, join, normalize, sep } from 'node:path';
import { launchBrowser } from './browser';
import { REPO, buildAndPack, cleanNpmEnv, readPackageJson, run } from '../package/buildPackage';
import { embeddingGuide } from '../package/embeddingGuide';
import { analyzeFold } from '../../src/core/foldAnalysis';
import { foldInputFromStations } from '../../src/core/foldInput';
import type { Station } from '../../src/core/station';

// A host that has never seen this repository: a blank Vite app in the temp folder installs the
// packed tarball, copies the README's embedding guide verbatim as its index.html and main.js,
// builds, and is driven in headless Chromium like a user would.

/** Appended after the guide's code (same module, so it sees the guide's constants): test hooks only. */
const HARNESS = `
// ---- test harness, not part of the guide ----
window.__host = { map, foldlens, stations, selections: [] };
foldlens.addEventListener('selectionchange', (e) => {
  window.__host.selections.push({ final: e.detail.final, indices: Array.from(e.detail.indices), quickAxis: e.detail.quickFit ? e.detail.quickFit.axis : null });
});
`;

/** A second, separately bundled copy of Foldlens, as a page that loads two bundles would have. */
const SECOND_COPY = `export { FoldlensDomains, FoldlensNet } from 'foldlens';\n`;
const SECOND_CONFIG = `export default {
  publicDir: false,
  build: { outDir: 'dist/second', emptyOutDir: true, lib: { entry: 'second.js', formats: ['es'], fileName: 'second' } },
};\n`;

const MIME: Record<string, string> = { '.html': 'text/html', '.js': 'text/javascript', '.mjs': 'text/javascript', '.css': 'text/css', '.json': 'application/json', '.svg': 'image/svg+xml', '.png': 'image/png' };

/** Serves a built site the way any static host would (no SPA fallback, no bundler). */
function serveStatic(root: string): Promise<{ server: Server; url: string }> {
  const server = createServer((req, res) => {
    const path = normalize(join(root, decodeURIComponent(new URL(req.url ?? '/', 'http://x').pathname)));
    const file = path.endsWith(sep) ? join(path, 'index.html') : path;
    let ok = file.startsWith(root);
    try {
      ok &&= statSync(file).isFile();
    } catch {
      ok = false;
    }
    if (!ok) {
      res.writeHead(404).end('not found');
      return;
    }
    res.writeHead(200, { 'content-type': MIME[extname(file)] ?? 'application/octet-stream' });
    createReadStream(file).pipe(res);
  });
  return new Promise((resolve) => server.listen(0, '127.0.0.1', () => resolve({ server, url: `http://127.0.0.1:${(server.address() as AddressInfo).port}/` })));
}

/** A free port on the loopback interface, for the dev server. */
function freePort(): Promise<number> {
  return new Promise((resolve) => {
    const s = createServer().listen(0, '127.0.0.1', () => {
      const port = (s.address() as AddressInfo).port;
      s.close(() => resolve(port));
    });
  });
}

/**
 * Problems of a stylesheet that could reach the host page: a rule must style only `foldlens-`
 * elements or classes (its subject names one), or declare nothing but `--fl-*` custom properties.
 * Runs in the page so that Chromium's own CSS parser reads the file.
 */
function cssLeaks(cssText: string): string[] {
  const sheet = new CSSStyleSheet();
  sheet.replaceSync(cssText);
  const problems: string[] = [];
  const subjectIsOurs = (selector: string): boolean => {
    // The compound after the last combinator outside brackets and parentheses is what gets styled.
    let depth = 0;
    let start = 0;
    for (let i = 0; i < selector.length; i++) {
      const c = selector[i];
      if (c === '(' || c === '[') depth++;
      else if (c === ')' || c === ']') depth--;
      else if (depth === 0 && (c === ' ' || c === '>' || c === '+' || c === '~')) start = i + 1;
    }
    return /(^|[^\w-])(\.)?foldlens-[\w-]+/.test(selector.slice(start).replace(/:not\([^)]*\)/g, ''));
  };
  const splitList = (list: string): string[] => {
    const out: string[] = [];
    let depth = 0;
    let from = 0;
    for (let i = 0; i < list.length; i++) {
      if (list[i] === '(' || list[i] === '[') depth++;
      else if (list[i] === ')' || list[i] === ']') depth--;
      else if (list[i] === ',' && depth === 0) {
        out.push(list.slice(from, i).trim());
        from = i + 1;
      }
    }
    out.push(list.slice(from).trim());
    return out;
  };
  const walk = (rules: CSSRuleList): void => {
    for (const rule of Array.from(rules)) {
      if (rule instanceof CSSStyleRule) {
        const foreign = splitList(rule.selectorText).filter((s) => !subjectIsOurs(s));
        const properties = Array.from({ length: rule.style.length }, (_, i) => rule.style[i]);
        const notCustom = properties.filter((p) => !p.startsWith('--fl-'));
        if (foreign.length && notCustom.length) problems.push(`${foreign.join(', ')} sets ${notCustom.join(', ')}`);
        if (rule.cssRules?.length) walk(rule.cssRules);
      } else if (rule instanceof CSSMediaRule || rule instanceof CSSSupportsRule) walk(rule.cssRules);
      else if (rule instanceof CSSKeyframesRule) {
        if (!/^(foldlens|fl)-/.test(rule.name)) problems.push(`@keyframes ${rule.name} is not prefixed`);
      } else problems.push(`${rule.cssText.slice(0, 40)}: a rule of this kind reaches the whole page`);
    }
  };
  walk(sheet.cssRules);
  return problems;
}

type HostWindow = {
  __host: {
    map: import('maplibre-gl').Map;
    foldlens: { selectedIndices(): Int32Array };
    stations: Station[];
    selections: Array<{ final: boolean; indices: number[]; quickAxis: { trend: number; plunge: number } | null }>;
  };
};

/** Opens a page, collecting console errors and uncaught exceptions (a host's own missing favicon aside). */
async function openPage(browser: Browser, url: string): Promise<{ page: Page; errors: string[] }> {
  const page = await browser.newPage({ viewport: { width: 900, height: 900 } });
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(`pageerror: ${e.message}`));
  page.on('console', (m) => {
    if (m.type() === 'error' && !m.location().url.endsWith('/favicon.ico')) errors.push(`console: ${m.text()} (${m.location().url})`);
  });
  await page.goto(url);
  return { page, errors };
}

/** Waits until the map has drawn a symbol for every station the guide fed in; returns the count. */
async function waitForSymbols(page: Page): Promise<number> {
  await page.waitForFunction(
    () => {
      const host = (window as unknown as Partial<HostWindow>).__host;
      if (!host || !host.map.getLayer('foldlens-symbols') || !host.map.loaded()) return false;
      return host.map.queryRenderedFeatures({ layers: ['foldlens-symbols'] }).length >= host.stations.length;
    },
    null,
    { timeout: 60_000, polling: 250 },
  );
  return page.evaluate(() => (window as unknown as HostWindow).__host.map.queryRenderedFeatures({ layers: ['foldlens-symbols'] }).length);
}

describe('the packed tarball in a blank Vite app, set up as the README says', () => {
  const work = mkdtempSync(join(tmpdir(), 'foldlens-consumer-'));
  const app = join(work, 'app');
  const guide = embeddingGuide(readFileSync(join(REPO, 'README.md'), 'utf8'));
  const devDependencies = readPackageJson().devDependencies ?? {};
  let site: { server: Server; url: string } | undefined;
  let dev: ChildProcess | undefined;
  let browser: Browser;
  let page: Page;
  let errors: string[] = [];
  let elementNames: string[] = [];
  let lassoAxis = '';

  beforeAll(async () => {
    const packed = await buildAndPack(work);
    mkdirSync(app);
    writeFileSync(join(app, 'package.json'), JSON.stringify({ name: 'blank-host', private: true, type: 'module' }, null, 2));
    // The README's install line with the packed tarball for "foldlens" and the repository's pinned
    // versions (already in the npm cache), plus Vite, which a blank Vite project has anyway.
    const words = guide.install.split(/\s+/);
    const packages = words.slice(2).map((w) => (w === 'foldlens' ? packed.tarball : w.startsWith('maplibre-gl') ? `maplibre-gl@${devDependencies['maplibre-gl']}` : w));
    await run('npm', ['install', '--prefer-offline', '--no-audit', '--no-fund', ...packages, `vite@${devDependencies.vite}`], { cwd: app, timeoutMs: 480_000 });
    writeFileSync(join(app, 'index.html'), guide.html);
    writeFileSync(join(app, 'main.js'), guide.js + HARNESS);
    writeFileSync(join(app, 'second.js'), SECOND_COPY);
    writeFileSync(join(app, 'vite.second.config.js'), SECOND_CONFIG);
    const vite = join(app, 'node_modules', '.bin', 'vite');
    await run(vite, ['build'], { cwd: app });
    await run(vite, ['build', '--config', 'vite.second.config.js'], { cwd: app });
    // Every custom element the packaged library registers, read from the shipped code itself.
    const lib = readFileSync(join(app, 'node_modules', 'foldlens', 'dist', 'lib', 'foldlens.js'), 'utf8');
    elementNames = [...lib.matchAll(/defineOnce\(\s*["'](foldlens-[\w-]+)["']/g)].map((m) => m[1]);
    site = await serveStatic(join(app, 'dist'));
    browser = await launchBrowser();
    ({ page, errors } = await openPage(browser, site.url));
  }, 900_000);

  afterAll(async () => {
    await browser?.close();
    await new Promise((r) => (site ? site.server.close(r) : r(undefined)));
    if (dev && dev.exitCode === null) dev.kill('SIGTERM');
    rmSync(work, { recursive: true, force: true });
  });

  it('the built page draws an orientation symbol for every station fed from code, on the host\'s own style', async () => {
    const drawn = await waitForSymbols(page);
    const state = await page.evaluate(() => {
      const { map, stations } = (window as unknown as HostWindow).__host;
      return { stations: stations.length, layers: map.getStyle().layers.map((l) => l.id) };
    });
    expect(state.stations).toBe(5);
    expect(drawn).toBe(state.stations);
    expect(state.layers[0]).toBe('paper');
    expect(state.layers.slice(1).every((id) => id.startsWith('foldlens-'))).toBe(true);
    expect(errors).toEqual([]);
  }, 120_000);

  it('a lasso drawn with the mouse selects the stations, and the selection and the fold axis arrive', async () => {
    const box = (await page.locator('#map').boundingBox())!;
    const cx = box.x + box.width / 2;
    const cy = box.y + box.height / 2;
    await page.mouse.move(cx - 200, cy - 200);
    await page.mouse.down();
    for (const [x, y] of [[cx + 200, cy - 200], [cx + 200, cy + 200], [cx - 200, cy + 200], [cx - 200, cy - 200]]) await page.mouse.move(x, y, { steps: 10 });
    await page.mouse.up();

    const axisText = page.locator('#fold-axis');
    await expect.poll(() => axisText.textContent(), { timeout: 30_000 }).toMatch(/^\d+\/\d+, 95% cone [\d.]+°, n = \d+$/);
    const host = await page.evaluate(() => {
      const h = (window as unknown as HostWindow).__host;
      return { selected: Array.from(h.foldlens.selectedIndices()), selections: h.selections, stations: h.stations };
    });
    expect(host.selected).toEqual([0, 1, 2, 3, 4]);
    expect(host.selections.some((s) => !s.final)).toBe(true); // live updates while drawing
    const last = host.selections.at(-1)!;
    expect(last.final).toBe(true);
    expect(last.indices).toEqual([0, 1, 2, 3, 4]);
    expect(last.quickAxis).not.toBeNull();

    // The worker in the host's bundle gives what the core gives in Node for the same stations.
    const expected = analyzeFold(foldInputFromStations(host.stations, last.indices), { bootstrap: 500, seed: 1 });
    const [, trend, plunge, cone, n] = /^(\d+)\/(\d+), 95% cone ([\d.]+)°, n = (\d+)$/.exec((await axisText.textContent())!)!.map(Number);
    expect(n).toBe(expected.n);
    expect(trend).toBe(Math.round(expected.axis!.trend));
    expect(plunge).toBe(Math.round(expected.axis!.plunge));
    expect(cone).toBeCloseTo(expected.cone95!, 1);
    // The guide's beds all contain the line 095/05 (dip directions rounded to whole degrees), so
    // that is the axis: synthetic data with an analytic answer (apparent-dip relation, common practice).
    expect(Math.abs(trend - 95)).toBeLessThanOrEqual(2);
    expect(Math.abs(plunge - 5)).toBeLessThanOrEqual(2);
    lassoAxis = `${String(trend).padStart(3, '0')}/${String(plunge).padStart(2, '0')}`;
    expect(errors).toEqual([]);
  }, 120_000);

  it('saving the selection in <foldlens-domains> lists the domain with its axis and labels it on the map', async () => {
    await page.locator('foldlens-domains input[name=name]').fill('Hinge zone');
    await page.locator('foldlens-domains button[type=submit]').click();
    const row = page.locator('foldlens-domains tbody tr');
    await expect.poll(() => row.count(), { timeout: 10_000 }).toBe(1);
    const cells = await row.locator('td').allTextContents();
    // Same stations, same analysis: the axis the lasso gave, over the 4 beds (the hinge is compared, not fitted).
    expect(lassoAxis).not.toBe('');
    expect(cells.slice(0, 3).map((c) => c.trim())).toEqual(['Hinge zone', '4', lassoAxis]);
    // The label is a DOM marker styled by foldlens/styles/foldlens.css, imported by the guide.
    const label = page.locator('.foldlens-domain-label');
    await expect.poll(() => label.count()).toBe(1);
    expect(await label.textContent()).toContain('Hinge zone');
    expect(await label.evaluate((el) => getComputedStyle(el).whiteSpace)).toBe('nowrap');
    expect(errors).toEqual([]);
  }, 60_000);

  it('custom elements are registered once: a second bundle of Foldlens on the same page loads without an error', async () => {
    expect(elementNames.length).toBeGreaterThanOrEqual(8);
    const result = await page.evaluate(async (names) => {
      const before = names.map((n) => customElements.get(n));
      // The page's own import(), out of reach of the test runner's transform of this file.
      const load = new Function('url', 'return import(url)') as (url: string) => Promise<{ FoldlensDomains: CustomElementConstructor; FoldlensNet: CustomElementConstructor }>;
      const second = await load(`${location.origin}/second/second.js`);
      const after = names.map((n) => customElements.get(n));
      return {
        allDefined: before.every(Boolean),
        unchanged: before.every((c, i) => c === after[i]),
        // Proof that the second bundle really is another copy, whose define would have clashed.
        secondIsAnotherCopy: second.FoldlensDomains !== customElements.get('foldlens-domains') && second.FoldlensNet !== customElements.get('foldlens-net'),
      };
    }, elementNames);
    expect(result).toEqual({ allDefined: true, unchanged: true, secondIsAnotherCopy: true });
    expect(errors).toEqual([]);
  }, 60_000);

  it('foldlens.css cannot restyle the host page: outside foldlens- elements and classes it only sets --fl-* properties', async () => {
    // The check itself must catch a leak, or its silence would mean nothing.
    const leaky = 'button { color: red } :root { --fl-bg: #fff; font-size: 20px } .foldlens-x, p { margin: 0 } @font-face { font-family: Host; src: local(Arial) }';
    expect((await page.evaluate(cssLeaks, leaky)).length).toBe(4);
    expect(await page.evaluate(cssLeaks, '.foldlens-x::before, foldlens-net > .foldlens-y { color: red } [data-theme=dark] { --fl-bg: #000 }')).toEqual([]);
    const shipped = readFileSync(join(app, 'node_modules', 'foldlens', 'styles', 'foldlens.css'), 'utf8');
    expect(await page.evaluate(cssLeaks, shipped)).toEqual([]);
  }, 30_000);

  it('the same guide runs under the Vite dev server (dependency pre-bundling), with no console error', async () => {
    const port = await freePort();
    dev = spawn(join(app, 'node_modules', '.bin', 'vite'), ['--port', String(port), '--strictPort', '--host', '127.0.0.1'], { cwd: app, env: cleanNpmEnv(), stdio: ['ignore', 'pipe', 'pipe'] });
    let output = '';
    dev.stdout!.on('data', (d) => (output += d));
    dev.stderr!.on('data', (d) => (output += d));
    await expect.poll(() => output, { timeout: 60_000 }).toContain(`${port}`);
    const opened = await openPage(browser, `http://127.0.0.1:${port}/`);
    try {
      expect(await waitForSymbols(opened.page)).toBe(5);
      expect(opened.errors).toEqual([]);
      expect(output).not.toMatch(/error/i);
    } finally {
      await opened.page.close();
      dev.kill('SIGTERM');
    }
  }, 150_000);
});
