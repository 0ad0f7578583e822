import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import type { Browser, Page } from 'playwright-core';
import { launchBrowser, openDemo } from './browser';
import truth from '../../sample-maps/korvane/truth.json';
import { angleBetweenLines } from '../../src/core/geometry';
import { expectClose } from '../helpers/tolerance';
import { fromWestOrigin, onScreen } from './westSection';

/**
 * The demo's "Profiles and sections" block used as a geologist would, on the SYNTHETIC Korvane
 * sample map: type an axis, draw a section line across the west domain with the mouse (then
 * with touch and pen pointer events), read the section panel, and pick the axis of a
 * down-plunge profile from a typed value and from the mean of the measured hinges.
 *
 * Outside answers: the apparent plunge of a line seen in a vertical section,
 * tan(apparent plunge) = tan(plunge) / cos(section azimuth − trend) (orthographic projection of
 * the line onto the section's plane: its vertical part sin p stays, its horizontal part shrinks
 * to cos p·cos(θ − t); common practice, e.g. Ragan, Structural Geology: An Introduction to
 * Geometrical Techniques — from memory), and the planted axis of the west domain in truth.json (075/12), which
 * the generator scattered hinges about by 3° in trend and 2° in plunge.
 */

type Demo = { foldlensDemo: { map: import('maplibre-gl').Map } };
const west = truth.domains.find((d) => d.id === 'west')!;

/** Text of one element in the profile panel's shadow DOM ('' when absent). */
async function panelText(page: Page, selector: string): Promise<string> {
  return page.evaluate((sel) => document.querySelector('foldlens-profile')!.shadowRoot!.querySelector(sel)?.textContent ?? '', selector);
}

/** Waits until the profile panel is open on data of this mode (and a label matching `label`); fails with the block's status line. */
async function waitForPanel(page: Page, mode: 'section' | 'down-plunge', label?: RegExp): Promise<void> {
  try {
    await page.waitForFunction(
      ([m, l]) => {
        const el = document.querySelector('foldlens-profile')!;
        const box = document.querySelector('#profile-box') as HTMLDialogElement;
        return box.open && el.data?.mode === m && (l === null || new RegExp(l).test(el.label));
      },
      [mode, label ? label.source : null] as const,
      { timeout: 120_000 },
    );
  } catch (e) {
    const seen = await page.evaluate(() => ({ status: document.querySelector('#profile-status')?.textContent, label: document.querySelector('foldlens-profile')!.label }));
    throw new Error(`no ${mode} panel${label ? ` labelled ${label}` : ''}: status "${seen.status}", panel label "${seen.label}" (${(e as Error).message})`);
  }
  await page.evaluate(() => document.querySelector('foldlens-profile')!.updateComplete);
}

const stationsDrawn = (text: string): number => Number((/^([\d\s\u2009\u202f]+) drawn of/.exec(text)?.[1] ?? '0').replace(/\D/g, ''));

describe('profile tools in the demo: section line, swath, line layers and axis picker', () => {
  let browser: Browser;
  let page: Page;
  let errors: string[];
  beforeAll(async () => {
    browser = await launchBrowser();
    // One page, step by step: the dev server's reloads are held (see openDemo).
    ({ page, errors } = await openDemo(browser, '', { width: 1280, height: 900 }, { holdReloads: true }));
  });
  afterAll(async () => {
    await browser?.close();
  });

  it('a typed axis out of range is refused with a message naming the field and its range; a good one is put in use', async () => {
    const picker = page.locator('#axis-picker');
    await picker.getByLabel('Trend (°)').fill('400');
    await picker.getByLabel('Plunge (°)').fill('12');
    await expect.poll(() => picker.locator('[part="field-problem"]').allTextContents()).toEqual(['Trend: "400" is out of range; expected an azimuth from 0 to 360°, clockwise from north.']);
    expect(await picker.getByLabel('Trend (°)').getAttribute('aria-invalid')).toBe('true');
    expect(await picker.locator('[part="in-use"]').textContent()).toContain('No axis yet: Trend: "400" is out of range');
    await picker.getByLabel('Trend (°)').fill('075');
    await expect.poll(() => picker.locator('[part="in-use"]').textContent()).toMatch(/Axis in use: 075\/12 \(trend\/plunge, true north\), typed by the user\./);
    expect(await picker.locator('[part="field-problem"]').count()).toBe(0);
    expect(await picker.getByRole('radio', { name: 'Typed' }).isChecked()).toBe(true);
  });

  it('axe-core finds no accessibility violations in the block, with a field in error and while a line is drawn (external reference: axe-core)', async () => {
    // Loaded by evaluation, as the demo's Content-Security-Policy forbids inline script tags.
    const axeSource = readFileSync(createRequire(import.meta.url).resolve('axe-core/axe.min.js'), 'utf8');
    const check = () =>
      page.evaluate(async (src) => {
        if (!(window as unknown as { axe?: unknown }).axe) (0, eval)(src);
        const axe = (window as unknown as { axe: { run(el: Element): Promise<{ violations: { id: string; help: string; nodes: { target: unknown[] }[] }[] }> } }).axe;
        const res = await axe.run(document.querySelector('#profile-tools')!);
        return res.violations.map((v) => `${v.id}: ${v.help} (${v.nodes.map((n) => JSON.stringify(n.target)).join(', ')})`);
      }, axeSource);
    const picker = page.locator('#axis-picker');
    await picker.getByLabel('Plunge (°)').fill('95');
    expect(await check(), 'plunge in error').toEqual([]);
    await picker.getByLabel('Plunge (°)').fill('12');
    await page.getByRole('button', { name: 'Draw section line' }).click();
    expect(await check(), 'drawing').toEqual([]);
    await page.getByRole('button', { name: 'Cancel', exact: true }).click();
    expect(await page.locator('#profile-status').textContent()).toBe('Drawing cancelled.');
  });

  it('drawing a section line at 135° with the mouse (click, then double-click) opens a vertical section with stations projected along the plunge and the axis\' apparent plunge', async () => {
    await page.locator('#section-swath').fill('600');
    await page.locator('#section-swath').press('Tab');
    await page.getByRole('button', { name: 'Draw section line' }).click();
    expect(await page.getByRole('button', { name: /Drawing section line/ }).getAttribute('aria-pressed')).toBe('true');
    const [a, b] = await onScreen(page, [fromWestOrigin(-1700, 135), fromWestOrigin(1700, 135)]);
    const zoom = () => page.evaluate(() => (window as unknown as Demo).foldlensDemo.map.getZoom());
    const zoomBefore = await zoom();
    await page.mouse.click(a.x, a.y);
    await page.mouse.move((a.x + b.x) / 2, (a.y + b.y) / 2, { steps: 5 });
    await page.mouse.dblclick(b.x, b.y);
    await waitForPanel(page, 'section', /^Section /);
    expect(await zoom()).toBe(zoomBefore); // the double click that ends the line does not zoom the map

    // The line stays on the map, labelled at both ends; the clicks on the map opened no station.
    const onMap = await page.evaluate(async () => {
      const map = (window as unknown as Demo).foldlensDemo.map;
      await new Promise((r) => (map.loaded() ? r(null) : map.once('idle', r)));
      return map.queryRenderedFeatures({ layers: ['foldlens-section-line'] }).length;
    });
    expect(onMap).toBeGreaterThan(0);
    expect(await page.locator('.foldlens-section-label').allTextContents()).toEqual(['start', 'end']);
    expect(await page.locator('#card').evaluate((el) => (el as HTMLElement & { station: unknown }).station ?? null)).toBeNull();

    const stations = await panelText(page, 'dd[data-key="stations"]');
    expect(stationsDrawn(stations), stations).toBeGreaterThan(20);
    const section = await panelText(page, 'dd[data-key="section"]');
    expect(section).toMatch(/swath ±600 m$/);
    const azimuth = Number(/(\d{3})°/.exec(section)![1]);
    expect(Math.abs(azimuth - 135)).toBeLessThanOrEqual(2); // drawn at grid 135°; true north differs by the grid convergence (under 1° here)
    const label = await panelText(page, '[data-name="axis-text"]');
    const m = /^axis apparent plunge (\d+\.\d)° toward the (start|end)$/.exec(label);
    expect(m, label).not.toBeNull();
    // tan(apparent plunge) = tan(12°) / cos(azimuth − 075°): about 23° toward the end (the axis's trend is 60° from the
    // section's, on the side it runs to). The azimuth is shown to the whole degree: ±0.5° moves the answer ±0.31° here.
    const expected = (Math.atan(Math.tan((12 * Math.PI) / 180) / Math.cos(((azimuth - 75) * Math.PI) / 180)) * 180) / Math.PI;
    expect(m![2]).toBe('end');
    expectClose(Number(m![1]), expected, 0.4, 'apparent plunge of the axis in the section');
    expect(await panelText(page, '[data-name="annotation"]')).toContain('axis 075/12 projected along the plunge');
    expect(await page.locator('#profile-status').textContent()).toContain('Section drawn with axis 075/12; contacts and faults projected.');
  }, 180_000); // the first section also reads the DEM

  it('the section panel labels its vertical exaggeration; ×2 is written on the drawing', async () => {
    const panel = page.locator('foldlens-profile');
    await panel.getByLabel('Vertical exaggeration').selectOption('2');
    await expect.poll(() => panelText(page, '[data-name="scale-text"]')).toMatch(/V\.E\. ×2$/);
    // The heading may wrap over several lines (annotation, annotation-1, ...): read them together.
    const heading = await page.evaluate(() => [...document.querySelector('foldlens-profile')!.shadowRoot!.querySelectorAll('[data-name^="annotation"]')].map((e) => e.textContent).join(' '));
    expect(heading).toContain('V.E. ×2 (vertical exaggeration)');
    await panel.getByLabel('Vertical exaggeration').selectOption('1');
  });

  it('a narrower swath redraws the section with fewer stations; a bad width is refused with its field named', async () => {
    const before = stationsDrawn(await panelText(page, 'dd[data-key="stations"]'));
    await page.locator('#section-swath').fill('wide');
    await page.locator('#section-swath').press('Tab');
    expect(await page.locator('#section-swath-problem').textContent()).toBe('Swath half-width: "wide" is not a number; expected metres, more than 0 and at most 20000.');
    expect(await page.locator('#section-swath').getAttribute('aria-invalid')).toBe('true');
    await page.locator('#section-swath').fill('150');
    await page.locator('#section-swath').press('Tab');
    await expect.poll(() => panelText(page, 'dd[data-key="section"]')).toMatch(/swath ±150 m$/);
    const after = stationsDrawn(await panelText(page, 'dd[data-key="stations"]'));
    expect(after).toBeGreaterThan(0);
    expect(after).toBeLessThan(before);
    expect(await page.locator('#section-swath-problem').isHidden()).toBe(true);
    await page.locator('#section-swath').fill('600');
    await page.locator('#section-swath').press('Tab');
    await expect.poll(() => panelText(page, 'dd[data-key="section"]')).toMatch(/swath ±600 m$/);
  });

  it('unticking Contacts leaves them out of the section (fewer linework vertices, no contact in the key); ticking brings them back', async () => {
    const key = () => page.evaluate(() => [...document.querySelector('foldlens-profile')!.shadowRoot!.querySelectorAll('[data-layer="legend"] text')].map((t) => t.textContent).join(' | '));
    const vertices = async () => Number((await panelText(page, 'dd[data-key="vertices"]')).replace(/[\s\u2009\u202f]/g, '').match(/^(\d+)drawn/)?.[1] ?? '0');
    const withContacts = { key: await key(), vertices: await vertices() };
    expect(withContacts.key).toMatch(/contact/);
    expect(withContacts.vertices).toBeGreaterThan(0);
    await page.locator('#profile-contacts').uncheck();
    await expect.poll(key).not.toMatch(/contact/);
    expect(await vertices()).toBeLessThan(withContacts.vertices);
    expect(await page.locator('#profile-status').textContent()).toContain('; faults projected.');
    await page.locator('#profile-contacts').check();
    await expect.poll(key).toBe(withContacts.key);
    expect(await vertices()).toBe(withContacts.vertices);
  });

  it('a line traced on the map is projected with the section as its own layer; Clear traces takes it out again', async () => {
    const key = () => page.evaluate(() => [...document.querySelector('foldlens-profile')!.shadowRoot!.querySelectorAll('[data-layer="legend"] text')].map((t) => t.textContent).join(' | '));
    await page.getByRole('button', { name: 'Trace a line on the map' }).click();
    expect(await page.locator('#trace-draw').getAttribute('aria-pressed')).toBe('true');
    // A trace across the section near its middle, 800 m long: all of it inside the 600 m swath.
    const [a, b] = await onScreen(page, [fromWestOrigin(-400, 45), fromWestOrigin(400, 45)]);
    await page.mouse.click(a.x, a.y);
    await page.mouse.move((a.x + b.x) / 2, (a.y + b.y) / 2, { steps: 5 });
    await page.mouse.dblclick(b.x, b.y);
    await expect.poll(() => page.locator('#trace-count').textContent()).toBe('1');
    const traced = () => page.evaluate(() => (window as unknown as Demo).foldlensDemo.map.queryRenderedFeatures({ layers: ['foldlens-trace-1-line'] }).length);
    await expect.poll(traced, { timeout: 10_000 }).toBeGreaterThan(0); // the trace stays on the map
    await page.getByRole('button', { name: 'Open section' }).click();
    await waitForPanel(page, 'section', /^Section /);
    await expect.poll(key).toMatch(/Drawn trace 1/);
    expect(await page.locator('#profile-status').textContent()).toContain('contacts and faults and 1 drawn trace projected.');
    await page.getByRole('button', { name: 'Clear traces' }).click();
    await page.getByRole('button', { name: 'Open section' }).click();
    await expect.poll(key).not.toMatch(/Drawn trace/);
    expect(await page.locator('#trace-count').textContent()).toBe('0');
  });

  it('Escape while drawing a new line cancels it and keeps the last section line', async () => {
    await page.getByRole('button', { name: 'Draw a new section line' }).click();
    const [p] = await onScreen(page, [fromWestOrigin(0, 0)]);
    await page.mouse.click(p.x, p.y);
    expect(await page.locator('#profile-status').textContent()).toContain('1 point.');
    await page.keyboard.press('Escape');
    expect(await page.locator('#profile-status').textContent()).toBe('Drawing cancelled; the previous section line is kept.');
    expect(await page.locator('.foldlens-section-label').allTextContents()).toEqual(['start', 'end']);
    await page.getByRole('button', { name: 'Open section' }).click();
    await waitForPanel(page, 'section');
    expect(await panelText(page, 'dd[data-key="section"]')).toMatch(/swath ±600 m$/);
  });

  for (const pointerType of ['touch', 'pen'] as const) {
    it(`a section line tapped with ${pointerType} pointer events (three points, the last tapped twice) opens a section of two segments`, async () => {
      await page.getByRole('button', { name: 'Draw a new section line' }).click();
      const pts = await onScreen(page, [fromWestOrigin(-1500, 150), fromWestOrigin(0, 0), fromWestOrigin(1500, 170)]);
      await page.evaluate(
        ([type, taps]) => {
          const map = (window as unknown as Demo).foldlensDemo.map;
          const el = map.getCanvasContainer();
          const fire = (kind: string, x: number, y: number) =>
            el.dispatchEvent(new PointerEvent(kind, { pointerType: type, pointerId: 11, isPrimary: true, clientX: x, clientY: y, button: 0, buttons: kind === 'pointerup' ? 0 : 1, bubbles: true, cancelable: true }));
          for (const t of taps) {
            fire('pointerdown', t.x, t.y);
            fire('pointermove', t.x + 1, t.y);
            fire('pointerup', t.x + 1, t.y);
          }
        },
        [pointerType, [...pts, pts[2]]] as const,
      );
      await waitForPanel(page, 'section', /, 3 points —/);
      const section = await panelText(page, 'dd[data-key="section"]');
      expect(section).toMatch(/\d{3}° then \d{3}°/);
      expect(await panelText(page, 'dd[data-key="apparent-plunge"]')).toMatch(/^segment 1: \d+\.\d° toward the (start|end); segment 2: \d+\.\d° toward the (start|end)$/);
      expect(stationsDrawn(await panelText(page, 'dd[data-key="stations"]'))).toBeGreaterThan(0);
    });
  }

  it('a down-plunge profile of a lassoed area takes a typed axis, then the mean of the measured hinges, and its axis annotation follows', async () => {
    if (await page.locator('#profile-close').isVisible()) await page.locator('#profile-close').click();
    await page.locator('foldlens-toolbar').getByRole('button', { name: /Lasso/ }).click();
    const ring = west.polygon.slice(0, -1) as [number, number][];
    const corners = await onScreen(page, ring);
    const cx = corners.reduce((s, p) => s + p.x, 0) / corners.length;
    const cy = corners.reduce((s, p) => s + p.y, 0) / corners.length;
    const inner = corners.map((p) => ({ x: cx + (p.x - cx) * 0.85, y: cy + (p.y - cy) * 0.85 }));
    const before = await page.evaluate(() => document.body.dataset.analysisReady);
    await page.mouse.move(inner[0].x, inner[0].y);
    await page.mouse.down();
    for (const c of [...inner.slice(1), inner[0]]) await page.mouse.move(c.x, c.y, { steps: 12 });
    await page.mouse.up();
    await page.waitForFunction((prev) => document.body.dataset.analysisReady && document.body.dataset.analysisReady !== prev, before, { timeout: 150_000 });

    const picker = page.locator('#axis-picker');
    await picker.getByLabel('Trend (°)').fill('090');
    await picker.getByLabel('Plunge (°)').fill('20');
    await page.getByRole('button', { name: 'Down-plunge profile of the selection' }).click();
    await waitForPanel(page, 'down-plunge', /axis 090\/20: typed by the user$/);
    expect(await panelText(page, '[data-name="annotation"]')).toContain('Looking down-plunge toward 090°, plunge 20°');
    expect(await panelText(page, '[data-name="axis-text"]')).toBe('axis 090/20, into the page');

    await picker.getByRole('radio', { name: 'Mean of measured hinges in the selection' }).check();
    const inUse = await picker.locator('[part="in-use"]').textContent();
    const m = /Axis in use: (\d{3})\/(\d{2}) \(trend\/plunge, true north\), Fisher mean of (\d+) measured hinges in the selection/.exec(inUse ?? '');
    expect(m, inUse ?? '').not.toBeNull();
    const hinge = { trend: Number(m![1]), plunge: Number(m![2]) };
    expect(Number(m![3])).toBeGreaterThanOrEqual(10);
    expect(angleBetweenLines(hinge, west.axis)).toBeLessThan(3);
    // The open profile is redrawn down the new axis.
    await waitForPanel(page, 'down-plunge', /Fisher mean of \d+ measured hinges/);
    expect(await panelText(page, '[data-name="annotation"]')).toContain(`Looking down-plunge toward ${m![1]}°, plunge ${hinge.plunge}°`);
    expect(await panelText(page, '[data-name="axis-text"]')).toBe(`axis ${m![1]}/${m![2]}, into the page`);
    expect(stationsDrawn(await panelText(page, 'dd[data-key="stations"]'))).toBeGreaterThan(100);
  }, 300_000); // the full analysis (500 bootstrap resamples in a worker) is slow on a busy machine

  it('a saved domain gives its own axis and its own outline: "Down-plunge profile of domain …" draws it', async () => {
    const domains = page.locator('foldlens-domains');
    await domains.getByRole('textbox', { name: 'Name of the new domain' }).fill('West <i>test</i>');
    await domains.getByRole('button', { name: 'Save selection as domain' }).click();
    await page.waitForFunction(() => document.body.dataset.domainsSaved === '1', null, { timeout: 150_000 });
    const picker = page.locator('#axis-picker');
    await picker.getByRole('radio', { name: 'π axis of domain' }).check();
    const inUse = (await picker.locator('[part="in-use"]').textContent()) ?? '';
    const m = /Axis in use: (\d{3})\/(\d{2}) \(trend\/plunge, true north\), π axis of domain “West <i>test<\/i>”/.exec(inUse);
    expect(m, inUse).not.toBeNull();
    expect(angleBetweenLines({ trend: Number(m![1]), plunge: Number(m![2]) }, west.axis)).toBeLessThan(3);
    await page.getByRole('button', { name: 'Down-plunge profile of domain “West <i>test</i>”' }).click();
    await waitForPanel(page, 'down-plunge', /^Domain “West <i>test<\/i>” — axis \d{3}\/\d{2}: π axis of domain/);
    expect(await panelText(page, '[data-name="annotation"]')).toContain(`Looking down-plunge toward ${m![1]}°, plunge ${Number(m![2])}°`);
    // The name is data: shown as text, never made into an element.
    expect(await page.locator('#profile-tools i, #axis-picker i').count()).toBe(0);
    expect(await page.evaluate(() => document.querySelector('#axis-picker')!.shadowRoot!.querySelectorAll('i').length)).toBe(0);
    expect(errors).toEqual([]);
  }, 300_000);
});
