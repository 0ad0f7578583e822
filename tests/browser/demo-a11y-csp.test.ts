import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import type { Browser } from 'playwright-core';
import { launchBrowser, openDemo } from './browser';

const require = createRequire(import.meta.url);
const axeSource = readFileSync(require.resolve('axe-core/axe.min.js'), 'utf8');

interface AxeResult { violations: Array<{ id: string; impact: string | null; help: string; nodes: Array<{ target: string[] }> }> }

describe('demo accessibility and content security', () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it('the demo declares a Content-Security-Policy that allows no inline script, and an inline script does not run', async () => {
    const { page, errors } = await openDemo(browser);
    const csp = await page.locator('meta[http-equiv="Content-Security-Policy"]').getAttribute('content');
    expect(csp).toMatch(/script-src 'self'(;|$)/);
    expect(csp).not.toMatch(/script-src[^;]*'unsafe-(inline|eval)'/);
    // Try to run an inline script the way injected HTML would: it must be blocked.
    const ran = await page.evaluate(async () => {
      (window as unknown as { injected?: boolean }).injected = false;
      const s = document.createElement('script');
      s.textContent = 'window.injected = true';
      document.body.append(s);
      await new Promise((r) => setTimeout(r, 50));
      return (window as unknown as { injected?: boolean }).injected;
    });
    expect(ran).toBe(false);
    // The blocked attempt is the only console error allowed.
    expect(errors.filter((e) => !/Content Security Policy/.test(e))).toEqual([]);
    await page.close();
  });

  it('axe-core finds no serious or critical accessibility violations in the demo, before and after a selection (external reference: axe-core)', async () => {
    const { page } = await openDemo(browser);
    const run = () =>
      page.evaluate(async (src) => {
        // evaluate() runs outside the page's CSP, as a test harness should.
        if (!(window as unknown as { axe?: unknown }).axe) (0, eval)(src);
        const axe = (window as unknown as { axe: { run(ctx: unknown, opts: unknown): Promise<AxeResult> } }).axe;
        return axe.run(document, { resultTypes: ['violations'] });
      }, axeSource);
    const serious = (r: AxeResult) => r.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical').map((v) => `${v.id}: ${v.help} (${v.nodes.map((n) => n.target.join(' ')).slice(0, 3).join('; ')})`);
    expect(serious(await run())).toEqual([]);
    await page.evaluate(async () => {
      const before = document.body.dataset.analysisReady;
      const d = (window as unknown as { foldlensDemo: { foldlens: { selectKinds(k: string[]): void } } }).foldlensDemo;
      d.foldlens.selectKinds(['bedding']);
      while (document.body.dataset.analysisReady === before) await new Promise((r) => setTimeout(r, 100));
    });
    expect(serious(await run())).toEqual([]);
    await page.close();
  });
});
