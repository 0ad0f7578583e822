import { chromium, type Browser, type Page } from 'playwright-core';
import { inject } from 'vitest';

/** Flags that give WebGL2 on the software rasteriser in headless Debian Chromium without network noise. */
export const CHROMIUM_ARGS = [
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

export async function launchBrowser(): Promise<Browser> {
  return chromium.launch({ executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium', args: CHROMIUM_ARGS });
}

/** Opens the demo, fails the test on any console error or page error, and waits for the map. */
export async function openDemo(
  browser: Browser,
  query = '',
  viewport = { width: 1280, height: 800 },
  options: {
    /**
     * Leave the dev server's reload channel unanswered, for tests that go step by step on one
     * page: a full reload (the server sees any edit to the sources) would lose what the steps built.
     */
    readonly holdReloads?: boolean;
  } = {},
): Promise<{ page: Page; errors: string[] }> {
  const page = await browser.newPage({ viewport });
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(`pageerror: ${e.message}`));
  page.on('console', (m) => {
    if (m.type() === 'error') errors.push(`console: ${m.text()}`);
  });
  if (options.holdReloads) await page.routeWebSocket(/./, () => {});
  await page.goto(inject('demoUrl') + query);
  await page.waitForSelector('body[data-map-ready="true"]', { timeout: 120_000 });
  return { page, errors };
}
