import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readFile } from 'node:fs/promises';
import type { Browser } from 'playwright-core';
import { launchBrowser, openDemo } from './browser';
import { runCli } from '../../src/cli/main';
import truth from '../../sample-maps/korvane/truth.json';
import { expectDeepClose } from '../helpers/tolerance';

/**
 * The net panel and `foldlens analyze --within` must give identical numbers for the same
 * stations: both read the same CSV through src/io, pick planes with core/foldInput.ts and run
 * core/foldAnalysis.ts with the same bootstrap seed.
 */
describe('net panel and command line agree', () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });

  for (const domain of truth.domains) {
    it(`the ${domain.id} domain: the panel's analysis equals analyze --within --json`, async () => {
      const { page, errors } = await openDemo(browser);
      const panel = await page.evaluate(async (ring) => {
        const before = document.body.dataset.analysisReady;
        const d = (window as unknown as { foldlensDemo: { foldlens: { selectWithin(r: number[][]): void } } }).foldlensDemo;
        d.foldlens.selectWithin(ring.slice(0, -1));
        const deadline = Date.now() + 60_000;
        while (document.body.dataset.analysisReady === before && Date.now() < deadline) await new Promise((r) => setTimeout(r, 100));
        const net = document.querySelector('foldlens-net') as unknown as { analysis: unknown; description: unknown };
        return JSON.parse(JSON.stringify({ ...(net.analysis as object), description: net.description }));
      }, domain.polygon);

      const area = JSON.stringify({ type: 'Feature', properties: {}, geometry: { type: 'Polygon', coordinates: [domain.polygon] } });
      let stdout = '';
      const code = await runCli(['analyze', 'sample-maps/korvane/stations.csv', '--within', 'area.geojson', '--json'], {
        stdout: { write: (t: string) => (stdout += t) },
        stderr: { write: () => true },
        readFile: async (p: string) => (p === 'area.geojson' ? area : readFile(p)),
        writeFile: async () => undefined,
      });
      expect(code).toBe(1); // the sample's planted bad rows are reported, as documented
      const cli = JSON.parse(stdout);
      // Same stations, same order, same seed: the results agree to the last bit or two. Chromium's
      // and Node's V8 may round Math.sin/cos differently in the last place, so compare to 1e-9
      // (degrees or fractions), far below anything shown or exported with meaning.
      expect(cli.n).toBe(panel.n);
      expect(cli.lines.n).toBe(panel.lines.n);
      for (const key of ['axis', 'girdle', 'eigenvalues', 'eigenvectors', 'woodcock', 'vollmer', 'cylindricity', 'cone95', 'lines']) {
        expectDeepClose(cli[key], panel[key], 1e-9, key);
      }
      // The fold description (limb maxima from modes, interlimb angle, limb bisector) is the same too.
      expect(cli.description.ok).toBe(true);
      expect(panel.description.ok).toBe(true);
      for (const key of ['interlimbAngle', 'interlimbAngleOfMeans', 'limbs', 'axialPlane', 'classes']) {
        expectDeepClose(cli.description[key], panel.description[key], 1e-9, `description.${key}`);
      }
      expect(cli.warnings.map((w: { code: string }) => w.code)).toEqual(panel.warnings.map((w: { code: string }) => w.code));
      // The beta axis leaves out pairs of planes closer than a fixed angle; a last-place difference
      // can move one pair of thousands across that line, which moves beta by about 0.001°.
      expectDeepClose(cli.beta, panel.beta, 0.01, 'beta');
      expect(panel.n).toBeGreaterThan(100);
      expect(errors).toEqual([]);
      await page.close();
    });
  }
});
