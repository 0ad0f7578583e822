import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { launchBrowser, openDemo } from './browser';

describe('demo viewer', () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it('opens with a WebGL map and no console errors', async () => {
    const { page, errors } = await openDemo(browser);
    const hasCanvas = await page.locator('#map canvas').count();
    expect(hasCanvas).toBeGreaterThan(0);
    expect(errors).toEqual([]);
    await page.close();
  });
});
