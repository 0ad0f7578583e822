import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import type { Browser, Page } from 'playwright-core';
import { launchBrowser, openDemo } from './browser';
import { fromWestOrigin, onScreen } from './westSection';

/**
 * The sample map's contacts, faults and terrain model belong to the SYNTHETIC Korvane district:
 * under the user's own stations they must not be projected. The user's stations here (the invented
 * "Tessary spur" traverse) lie inside the sample's frame, along the section line, which is exactly
 * where the sample's lines would otherwise be drawn under them. The same section on the sample map
 * first shows that the sample's contacts and ground line are there to be left out.
 */


/** Eleven bedding readings every 300 m along the section, 100 m off it, each with its own elevation. */
function traverseCsv(): string {
  const rows = ['Station,Type,Longitude,Latitude,Elevation,Dip Dir,Dip'];
  for (let k = 0; k <= 10; k++) {
    const [lon, lat] = fromWestOrigin(-1500 + 300 * k, 135, 100);
    rows.push(`TS-${String(k + 1).padStart(2, '0')},Bedding,${lon.toFixed(7)},${lat.toFixed(7)},${420 + 7 * k},${k % 2 ? 160 : 340},${20 + 3 * k}`);
  }
  return `${rows.join('\n')}\n`;
}

/** What the open section panel was given: its line layers, whether it has a ground line, and its counts. */
async function sectionShown(page: Page): Promise<{ layers: string[]; topography: boolean; vertices: number; drawn: number; notes: string[] }> {
  return page.evaluate(() => {
    const d = document.querySelector('foldlens-profile')!.data!;
    return { layers: d.lines.map((l) => `${l.kind}: ${l.name}`), topography: d.topography !== null, vertices: d.counts.vertices, drawn: d.counts.drawn, notes: [...d.notes] };
  });
}

/** Waits for a section panel newer than `before` (the panel's data object changes on every drawing). */
async function waitForSection(page: Page, mark: string): Promise<void> {
  try {
    await page.waitForFunction(
      (m) => {
        const el = document.querySelector('foldlens-profile') as HTMLElement & { data: { mode: string } | null };
        const box = document.querySelector('#profile-box') as HTMLDialogElement;
        return box.open && el.data?.mode === 'section' && (el.data as unknown as Record<string, unknown>)[m] === undefined;
      },
      mark,
      { timeout: 150_000 },
    );
  } catch (e) {
    throw new Error(`no new section: status "${await page.locator('#profile-status').textContent()}" (${(e as Error).message})`);
  }
  // Marks the panel's data as seen, so the next wait needs a new drawing.
  await page.evaluate((m) => Object.assign(document.querySelector('foldlens-profile')!.data!, { [m]: true }), mark);
}

async function drawSection(page: Page): Promise<void> {
  await page.getByRole('button', { name: /^Draw (a new )?section line$/ }).click();
  const [a, b] = await onScreen(page, [fromWestOrigin(-1700, 135), fromWestOrigin(1700, 135)]);
  await page.mouse.click(a.x, a.y);
  await page.mouse.move((a.x + b.x) / 2, (a.y + b.y) / 2, { steps: 5 });
  await page.mouse.dblclick(b.x, b.y);
}

describe('the sample map\'s lines and terrain are not projected under the user\'s own data', () => {
  let browser: Browser;
  let page: Page;
  let errors: string[];
  const contacts = () => page.locator('#profile-contacts');
  const faults = () => page.locator('#profile-faults');
  const note = () => page.locator('#profile-lines-note');

  beforeAll(async () => {
    browser = await launchBrowser();
    // One page, step by step: the dev server's reloads are held (see openDemo).
    ({ page, errors } = await openDemo(browser, '', { width: 1280, height: 900 }, { holdReloads: true }));
    const picker = page.locator('#axis-picker');
    await picker.getByLabel('Trend (°)').fill('075');
    await picker.getByLabel('Plunge (°)').fill('12');
  });
  afterAll(async () => {
    await browser?.close();
  });

  it('on the sample map a section across the west domain projects the sample\'s contacts, with a ground line from its terrain model', async () => {
    expect(await contacts().isChecked()).toBe(true);
    expect(await contacts().isEnabled()).toBe(true);
    expect(await note().isHidden()).toBe(true);
    await drawSection(page);
    await waitForSection(page, 'seenSample');
    const shown = await sectionShown(page);
    expect(shown.layers.some((l) => l.startsWith('contact: ')), shown.layers.join(', ')).toBe(true);
    expect(shown.vertices).toBeGreaterThan(0);
    expect(shown.topography).toBe(true);
    expect(await page.locator('#profile-status').textContent()).toContain('contacts and faults projected.');
  }, 200_000); // the first section reads the DEM

  it('with the user\'s own data Contacts and Faults are unticked and disabled with the reason shown, and the section projects none of the sample\'s lines or terrain', async () => {
    await page.locator('#profile-close').click();
    await page.locator('#data-panel > summary').click();
    await page.locator('foldlens-import [part="panel"]').waitFor();
    await page.evaluate((content) => {
      const dt = new DataTransfer();
      dt.items.add(new File([content], 'tessary-spur.csv', { type: 'text/csv' }));
      const zone = document.querySelector('foldlens-import')!.shadowRoot!.querySelector('[part="panel"]')!;
      zone.dispatchEvent(new DragEvent('dragover', { dataTransfer: dt, bubbles: true, composed: true, cancelable: true }));
      zone.dispatchEvent(new DragEvent('drop', { dataTransfer: dt, bubbles: true, composed: true, cancelable: true }));
    }, traverseCsv());
    await page.locator('foldlens-import form[part="mapping"]').waitFor({ timeout: 60_000 });
    expect(await page.locator('foldlens-import select[data-field="elevation"]').inputValue()).toBe('Elevation');
    await page.locator('foldlens-import button[part="confirm"]').click();
    await page.waitForFunction(() => document.querySelector('#dataset-label')?.textContent?.startsWith('tessary-spur.csv'), null, { timeout: 60_000 });

    expect(await contacts().isChecked()).toBe(false);
    expect(await contacts().isDisabled()).toBe(true);
    expect(await faults().isChecked()).toBe(false);
    expect(await faults().isDisabled()).toBe(true);
    expect(await note().isVisible()).toBe(true);
    expect(await note().textContent()).toMatch(/contacts, faults and terrain of the sample map belong to the sample district/);
    expect(await contacts().getAttribute('aria-describedby')).toBe('profile-lines-note');
    // The disabled boxes and their reason pass axe-core (external reference), as the block does on the sample.
    const axeSource = readFileSync(createRequire(import.meta.url).resolve('axe-core/axe.min.js'), 'utf8');
    const violations = await page.evaluate(async (src) => {
      (0, eval)(src); // by evaluation: the demo's Content-Security-Policy forbids inline script tags
      const axe = (window as unknown as { axe: { run(el: Element): Promise<{ violations: { id: string; help: string }[] }> } }).axe;
      return (await axe.run(document.querySelector('#profile-tools')!)).violations.map((v) => `${v.id}: ${v.help}`);
    }, axeSource);
    expect(violations).toEqual([]);
    expect(await page.locator('#profile-status').textContent()).toBe(''); // nothing said of the sample's section stays

    // A trace drawn on the map is still offered, but without a terrain model it has no heights (as the note says).
    await page.getByRole('button', { name: 'Trace a line on the map' }).click();
    const [t0, t1] = await onScreen(page, [fromWestOrigin(-300, 45), fromWestOrigin(300, 45)]);
    await page.mouse.click(t0.x, t0.y);
    await page.mouse.move((t0.x + t1.x) / 2, (t0.y + t1.y) / 2, { steps: 5 });
    await page.mouse.dblclick(t1.x, t1.y);
    await expect.poll(() => page.locator('#trace-count').textContent()).toBe('1');

    // The section line drawn before stays on the map; opened again, it is a section of the user's stations only.
    await page.getByRole('button', { name: 'Open section' }).click();
    await waitForSection(page, 'seenOwn');
    const shown = await sectionShown(page);
    expect(shown.layers).toEqual([]);
    expect(shown.vertices).toBe(2); // the trace's two vertices, none of the sample's
    expect(shown.topography).toBe(false);
    expect(shown.notes).toContain('No terrain model was given: the section has no ground line.');
    expect(shown.notes.some((n) => /Drawn trace 1.*no height in the file, and no DEM was given to take one from; not drawn\./.test(n)), shown.notes.join('\n')).toBe(true);
    expect(shown.drawn).toBe(11); // placed at the elevations of the file
    const status = await page.locator('#profile-status').textContent();
    expect(status).toContain('; 1 drawn trace projected.');
    expect(status).toContain('No terrain model');
  }, 200_000);

  it('with the user\'s own data Check domains leaves the sample\'s contacts out of the map-pattern checks and says why', async () => {
    await page.locator('#profile-close').click();
    const panel = page.locator('foldlens-consistency');
    const before = await page.evaluate(() => document.body.dataset.consistencyFlags);
    await panel.getByRole('button', { name: 'Check domains' }).click();
    await page.waitForFunction((prev) => document.body.dataset.consistencyFlags !== undefined && document.body.dataset.consistencyFlags !== prev, before, { timeout: 60_000 }).catch(() => undefined);
    await page.waitForFunction(() => /Checked /.test(document.querySelector('foldlens-consistency')!.shadowRoot!.textContent ?? ''), undefined, { timeout: 60_000 });
    const text = await panel.evaluate((el) => (el.shadowRoot!.textContent ?? '').replace(/\s+/g, ' '));
    expect(text).toContain("Contact traces not used: the base map's contacts and terrain belong to the sample district, not to the data shown.");
    expect(text).not.toMatch(/closures? pointing the wrong way/);
  }, 200_000);

  it('back on the sample map Contacts and Faults are offered again, ticked, and the section projects the sample\'s contacts again', async () => {
    if (await page.locator('#profile-close').isVisible()) await page.locator('#profile-close').click();
    await page.getByRole('button', { name: 'Back to the sample map' }).click();
    await page.waitForFunction(() => /synthetic demo data/.test(document.querySelector('#dataset-label')?.textContent ?? ''));
    expect(await contacts().isEnabled()).toBe(true);
    expect(await contacts().isChecked()).toBe(true);
    expect(await faults().isEnabled()).toBe(true);
    expect(await faults().isChecked()).toBe(true);
    expect(await note().isHidden()).toBe(true);
    expect(await contacts().getAttribute('aria-describedby')).toBeNull();
    // Back to the sample clears the project, the lines drawn on the map with it (as the domains).
    expect(await page.locator('#trace-count').textContent()).toBe('0');
    expect(await page.locator('#section-open').isDisabled()).toBe(true);
    await drawSection(page);
    await waitForSection(page, 'seenSampleAgain');
    const shown = await sectionShown(page);
    expect(shown.layers.some((l) => l.startsWith('contact: ')), shown.layers.join(', ')).toBe(true);
    expect(shown.topography).toBe(true);
    expect(errors).toEqual([]);
  }, 200_000);
});
