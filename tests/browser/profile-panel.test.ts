import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { inject } from 'vitest';
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { launchBrowser } from './browser';
import { profileScatter } from '../../src/core/profileScatter';
import { expectClose } from '../helpers/tolerance';

/**
 * <foldlens-profile> alone on a test page (pages/profile-panel.*) fed with the SYNTHETIC Korvane
 * sample map: stations, contacts and the fault from sample-maps/korvane, the DEM fetched from
 * demUrl and read with src/io/dem.ts, the west domain's planted axis (truth.json, 075/12) and
 * its polygon. The outside answer is the generator's documented geometry: down the planted axis
 * the pieces of one contact fall on one fold profile; 5° off it they do not.
 */

type CaseName = 'west' | 'west-off' | 'section' | 'xss' | 'big' | 'empty';
interface CaseInfo {
  mode: string;
  counts: Record<string, number>;
  stations: number;
  noHeight: number;
  contactXY: number[];
  layers: string[];
  buildMs: number;
  updateMs: number;
  paintMs: number;
}

async function load(page: Page, name: CaseName, options: { colourBy?: 'layer' | 'distance'; verticalExaggeration?: number } = {}): Promise<CaseInfo> {
  return page.evaluate(([n, o]) => (window as unknown as { profilePanel: { load(c: string, o: object): Promise<CaseInfo> } }).profilePanel.load(n, o), [name, options] as const);
}

/** All text and attribute values in the panel's shadow DOM (the style sheet left out). */
async function shadowText(page: Page): Promise<string> {
  return page.evaluate(() => {
    const root = document.querySelector('foldlens-profile')!.shadowRoot!;
    const parts: string[] = [];
    for (const el of root.querySelectorAll('*')) {
      if (el.tagName.toLowerCase() === 'style') continue;
      for (const a of el.attributes) if (a.name !== 'd') parts.push(a.value);
      for (const n of el.childNodes) if (n.nodeType === Node.TEXT_NODE) parts.push(n.textContent ?? '');
    }
    return parts.join('\n');
  });
}

async function events(page: Page): Promise<{ type: string; detail: { index?: number } }[]> {
  return page.evaluate(() => (window as unknown as { profilePanel: { events: { type: string; detail: { index?: number } }[] } }).profilePanel.events.slice());
}

function expectNoBadNumbers(text: string): void {
  for (const bad of ['NaN', 'Infinity', 'undefined']) {
    if (text.includes(bad)) expect.fail(`the panel shows "${bad}": …${text.slice(Math.max(0, text.indexOf(bad) - 80), text.indexOf(bad) + 40)}…`);
  }
}

describe('<foldlens-profile> profile panel in a browser', () => {
  let browser: Browser;
  let page: Page;
  const errors: string[] = [];
  beforeAll(async () => {
    browser = await launchBrowser();
    page = await browser.newPage({ viewport: { width: 1280, height: 820 } });
    page.on('pageerror', (e) => errors.push(`pageerror: ${e.message}`));
    page.on('console', (m) => {
      if (m.type() === 'error') errors.push(`console: ${m.text()}`);
    });
    page.on('dialog', (d) => {
      errors.push(`dialog opened: ${d.message()}`);
      void d.dismiss();
    });
    await page.goto(`${inject('demoUrl')}tests/browser/pages/profile-panel.html`);
    await page.waitForSelector('body[data-ready="true"]', { timeout: 60_000 });
  });
  afterAll(async () => {
    await browser?.close();
  });

  it('load("west") projects the west Vardel/Quennet contact onto one fold profile down the planted axis 075/12, and 5° off it the pieces scatter (profileScatter at least 3 times larger)', async () => {
    const right = await load(page, 'west');
    expect(right.mode).toBe('down-plunge');
    expect(right.noHeight).toBe(0);
    expect(right.contactXY.length).toBeGreaterThan(100);
    // profileScatter.ts: radius 100 m, the same for both axes (tests/core/downPlungeSampleMap.test.ts uses the same contact).
    const onAxis = profileScatter(Float64Array.from(right.contactXY), { radius: 100 });
    const off = await load(page, 'west-off');
    const offAxis = profileScatter(Float64Array.from(off.contactXY), { radius: 100 });
    expect(onAxis).toBeLessThan(0.5);
    expect(offAxis).toBeGreaterThan(3 * onAxis);
    expectNoBadNumbers(await shadowText(page));
  });

  it('load("west") draws each contact as one path at the panel\'s one scale: its first vertex is at el.affine(x\', y\')', async () => {
    const info = await load(page, 'west');
    const check = await page.evaluate(() => {
      const el = document.querySelector('foldlens-profile')!;
      const data = el.data!;
      const k = data.lines.findIndex((l) => l.name === 'Vardel Limestone / Quennet Sandstone contact');
      const path = el.shadowRoot!.querySelector(`[data-layer="lines"] [data-name="contact-${k}"]`)!;
      const m = path.getAttribute('d')!.match(/^M([-\d.]+) ([-\d.]+)/)!;
      // The lines sit in the zoom group at the unzoomed map (el.affine at zoom 1).
      const a = el.affine;
      const l = data.lines[k];
      return { drawn: [Number(m[1]), Number(m[2])], expected: [a.sx * l.xyd[0] + a.tx, a.sy * l.xyd[1] + a.ty], ratio: Math.abs(a.sy) / a.sx, paths: el.shadowRoot!.querySelectorAll('[data-layer="lines"] path').length };
    });
    expectClose(check.drawn[0], check.expected[0], 0.06, 'first vertex x');
    expectClose(check.drawn[1], check.expected[1], 0.06, 'first vertex y');
    expect(check.ratio).toBe(1); // true scale
    expect(check.paths).toBe(info.layers.length); // one path per layer
  });

  it('page.mouse over a station fires foldlens-profile-hover with its station index and -1 on leaving; a click fires foldlens-profile-pick', async () => {
    await load(page, 'west');
    // The station farthest from its neighbours on screen, so only it can be under the pointer.
    const target = await page.evaluate(() => {
      const el = document.querySelector('foldlens-profile')!;
      const s = el.data!.stations;
      const a = el.affine;
      const svg = el.shadowRoot!.querySelector('svg')!;
      const xy = Array.from({ length: s.index.length }, (_, k) => [a.sx * s.xy[2 * k] + a.tx, a.sy * s.xy[2 * k + 1] + a.ty]);
      let best = -1;
      let bestGap = -1;
      xy.forEach(([x, y], i) => {
        let gap = Infinity;
        xy.forEach(([u, v], j) => {
          if (j !== i) gap = Math.min(gap, Math.hypot(u - x, v - y));
        });
        if (gap > bestGap) [best, bestGap] = [i, gap];
      });
      const m = svg.getScreenCTM()!;
      const pt = new DOMPoint(xy[best][0], xy[best][1]).matrixTransform(m);
      return { index: s.index[best], x: pt.x, y: pt.y, gapPx: bestGap * m.a };
    });
    expect(target.gapPx).toBeGreaterThan(12);
    await page.evaluate(() => (window as unknown as { profilePanel: { events: unknown[] } }).profilePanel.events.splice(0));
    await page.mouse.move(target.x + 1.5, target.y - 1);
    await page.mouse.click(target.x + 1.5, target.y - 1);
    const readout = await page.evaluate(() => document.querySelector('foldlens-profile')!.shadowRoot!.querySelector('.readout')!.textContent);
    await page.mouse.move(3, 3);
    const got = await events(page);
    const hover = got.filter((e) => e.type === 'foldlens-profile-hover').map((e) => e.detail.index);
    const pick = got.filter((e) => e.type === 'foldlens-profile-pick').map((e) => e.detail.index);
    expect(hover[0]).toBe(target.index);
    expect(hover.at(-1)).toBe(-1);
    expect(pick).toEqual([target.index]);
    const id = await page.evaluate((i) => document.querySelector('foldlens-profile')!.data!.stations.ids[document.querySelector('foldlens-profile')!.data!.stations.index.indexOf(i)], target.index);
    expect(readout).toContain(id);
  });

  it('el.highlight = station index rings that station where the panel draws it', async () => {
    await load(page, 'west');
    const check = await page.evaluate(async () => {
      const el = document.querySelector('foldlens-profile')!;
      const s = el.data!.stations;
      el.highlight = s.index[5];
      await el.updateComplete;
      const d = el.shadowRoot!.querySelector('[data-name="highlight"]')!.getAttribute('d')!;
      const m = d.match(/^M([-\d.]+) ([-\d.]+)A/)!;
      const a = el.affine;
      return { cx: Number(m[1]) - 9, cy: Number(m[2]), x: a.sx * s.xy[10] + a.tx, y: a.sy * s.xy[11] + a.ty };
    });
    expectClose(check.cx, check.x, 0.06, 'ring x');
    expectClose(check.cy, check.y, 0.06, 'ring y');
  });

  it('the + button (d3-zoom scaleBy) keeps true scale, redraws the scale bar shorter and keeps every station where the zoomed map puts it', async () => {
    await load(page, 'west');
    const before = await page.evaluate(() => document.querySelector('foldlens-profile')!.shadowRoot!.querySelector('[data-name="scale-text"]')!.textContent);
    await page.evaluate(async () => {
      const el = document.querySelector('foldlens-profile')!;
      const zoomIn = el.shadowRoot!.querySelector('button[aria-label="Zoom in"]') as HTMLButtonElement;
      zoomIn.click();
      zoomIn.click();
      await new Promise((r) => setTimeout(r, 400));
      await new Promise((r) => requestAnimationFrame(() => requestAnimationFrame(r)));
    });
    const after = await page.evaluate(() => {
      const el = document.querySelector('foldlens-profile')!;
      const a = el.affine;
      const s = el.data!.stations;
      const hl = el.shadowRoot!;
      // The station nearest the plot's centre (the + button zooms about it), so it stays in view.
      const p = el.drawnLayout.plot;
      let k = 0;
      let best = Infinity;
      for (let i = 0; i < s.index.length; i++) {
        const gap = Math.hypot(a.sx * s.xy[2 * i] + a.tx - (p.left + p.width / 2), a.sy * s.xy[2 * i + 1] + a.ty - (p.top + p.height / 2));
        if (gap < best) [k, best] = [i, gap];
      }
      el.highlight = s.index[k];
      return el.updateComplete.then(() => {
        const d = hl.querySelector('[data-name="highlight"]')?.getAttribute('d') ?? '';
        const m = d.match(/^M([-\d.]+) ([-\d.]+)A/);
        return { scale: hl.querySelector('[data-name="scale-text"]')!.textContent, ratio: Math.abs(a.sy) / a.sx, ring: m ? [Number(m[1]) - 9, Number(m[2])] : null, x: a.sx * s.xy[2 * k] + a.tx, y: a.sy * s.xy[2 * k + 1] + a.ty };
      });
    });
    expect(after.ratio).toBeCloseTo(1, 12);
    expect(after.scale).not.toBe(before);
    expect(after.ring).not.toBeNull();
    expectClose(after.ring![0], after.x, 0.06, 'zoomed ring x');
    expectClose(after.ring![1], after.y, 0.06, 'zoomed ring y');
    await page.evaluate(() => document.querySelector('foldlens-profile')!.resetView());
  });

  it('load("section") draws a vertical section with the ground line from the DEM, labelled "V.E. ×2", with the axis\' apparent plunge', async () => {
    const info = await load(page, 'section', { verticalExaggeration: 2 });
    expect(info.mode).toBe('section');
    expect(info.stations).toBeGreaterThan(0);
    const check = await page.evaluate(() => {
      const root = document.querySelector('foldlens-profile')!.shadowRoot!;
      return {
        ground: root.querySelector('[data-name="topography"]')?.getAttribute('d')?.length ?? 0,
        scale: root.querySelector('[data-name="scale-text"]')!.textContent,
        heading: root.querySelector('[data-name="annotation"]')!.textContent,
        axis: root.querySelector('[data-name="axis-text"]')!.textContent,
        row: root.querySelector('dd[data-key="apparent-plunge"]')!.textContent,
      };
    });
    expect(check.ground).toBeGreaterThan(100);
    expect(check.scale).toMatch(/V\.E\. ×2$/);
    expect(check.heading).toContain('V.E. ×2');
    expect(check.axis).toMatch(/^axis apparent plunge \d+\.\d° toward the/);
    expect(check.row).toMatch(/\d+\.\d° toward the/);
    expectNoBadNumbers(await shadowText(page));
  });

  it('load("xss") shows data text (a label and a contact name with markup) as text: no element is made from it', async () => {
    await load(page, 'xss');
    const found = await page.evaluate(() => {
      const root = document.querySelector('foldlens-profile')!.shadowRoot!;
      return { imgs: root.querySelectorAll('img').length, selection: root.querySelector('.selection')!.textContent, key: [...root.querySelectorAll('[data-layer="legend"] text')].map((t) => t.textContent).join(' ') };
    });
    expect(found.imgs).toBe(0);
    expect(found.selection).toContain('<img src=x onerror=alert(1)>');
    expect(found.key.replace(/\s+/g, '')).toContain('<imgsrc=xonerror=alert(1)>');
    expect(errors.filter((e) => e.startsWith('dialog'))).toEqual([]);
  });

  it('toSvg() is a well-formed standalone SVG with the caution and the date, data text as text, and no script, handler or link', async () => {
    await load(page, 'xss');
    const check = await page.evaluate(() => {
      const svgText = document.querySelector('foldlens-profile')!.toSvg('2025-06-01');
      const doc = new DOMParser().parseFromString(svgText, 'image/svg+xml');
      const all = [...doc.querySelectorAll('*')];
      return {
        parseError: doc.querySelector('parsererror')?.textContent ?? null,
        root: doc.documentElement.tagName,
        scripts: doc.querySelectorAll('script, foreignObject, img, iframe, a').length,
        handlers: all.flatMap((el) => [...el.attributes].filter((a) => /^on/i.test(a.name)).map((a) => `${el.tagName}.${a.name}`)),
        hrefs: all.flatMap((el) => [...el.attributes].filter((a) => /href$/i.test(a.name)).map((a) => a.value)),
        styleTags: doc.querySelectorAll('style').length,
        text: doc.documentElement.textContent ?? '',
      };
    });
    expect(check.parseError).toBeNull();
    expect(check.root).toBe('svg');
    expect(check.scripts).toBe(0);
    expect(check.handlers).toEqual([]);
    expect(check.hrefs).toEqual([]);
    expect(check.styleTags).toBe(0);
    const text = check.text.replace(/\s+/g, ' ');
    expect(text).toContain('Results are aids to interpretation; check in the field and defer to local codes and licensed professional practice.');
    expect(text).toContain('exported 2025-06-01');
    expect(text).toContain('<img src=x onerror=alert(1)>');
    expect(text).toContain('Method: Down-plunge projection');
    expectNoBadNumbers(check.text);
  });

  it('toPng() gives a PNG image of the profile', async () => {
    await load(page, 'west');
    const png = await page.evaluate(async () => {
      const blob = await document.querySelector('foldlens-profile')!.toPng(1);
      const bytes = new Uint8Array(await blob.arrayBuffer());
      return { type: blob.type, size: blob.size, magic: Array.from(bytes.slice(0, 4)) };
    });
    expect(png.type).toBe('image/png');
    expect(png.magic).toEqual([0x89, 0x50, 0x4e, 0x47]); // PNG signature
    expect(png.size).toBeGreaterThan(5000);
  });

  it('load("empty") shows dashes with reasons and no NaN', async () => {
    await load(page, 'empty');
    const text = await shadowText(page);
    expect(text).toContain('no usable station in the area');
    expectNoBadNumbers(text);
  });

  it('axe-core finds no accessibility violations in the panel for a profile and a section', async () => {
    // axe-core (Deque), a general-purpose accessibility checker, run on the element and its shadow DOM.
    const axePath = createRequire(import.meta.url).resolve('axe-core/axe.min.js');
    await page.addScriptTag({ content: readFileSync(axePath, 'utf8') });
    for (const name of ['west', 'section'] as CaseName[]) {
      await load(page, name);
      const violations = await page.evaluate(async () => {
        const axe = (window as unknown as { axe: { run(el: Element): Promise<{ violations: { id: string; help: string; nodes: { target: unknown[] }[] }[] }> } }).axe;
        const res = await axe.run(document.querySelector('foldlens-profile')!);
        return res.violations.map((v) => `${v.id}: ${v.help} (${v.nodes.map((n) => JSON.stringify(n.target)).join(', ')})`);
      });
      expect(violations, `case ${name}`).toEqual([]);
    }
  });

  it('a screenshot of the panel is written for inspection', async () => {
    await load(page, 'west');
    const dir = process.env.FOLDLENS_SHOTS ?? tmpdir();
    await page.locator('foldlens-profile').screenshot({ path: join(dir, 'profile-panel.png') });
    await load(page, 'section', { verticalExaggeration: 2, colourBy: 'distance' });
    await page.locator('foldlens-profile').screenshot({ path: join(dir, 'profile-panel-section.png') });
    expect(errors).toEqual([]);
  });

  it('load("big") draws 10^5 stations and 10^6 linework vertices without 10^5 DOM nodes (times are printed, not asserted)', async () => {
    const info = await load(page, 'big');
    const nodes = await page.evaluate(() => document.querySelector('foldlens-profile')!.shadowRoot!.querySelectorAll('*').length);
    const zoomMs = await page.evaluate(async () => {
      const el = document.querySelector('foldlens-profile')!;
      const t0 = performance.now();
      (el.shadowRoot!.querySelector('button[aria-label="Zoom in"]') as HTMLButtonElement).click();
      await new Promise((r) => setTimeout(r, 300));
      await new Promise((r) => requestAnimationFrame(() => requestAnimationFrame(r)));
      return performance.now() - t0;
    });
    console.log(
      `profile panel: ${info.stations} stations and ${info.counts.verticesDrawn} vertices prepared in ${info.buildMs.toFixed(0)} ms, set and drawn in ${info.updateMs.toFixed(0)} ms ` +
        `(next frame after ${info.paintMs.toFixed(0)} ms); zoom step with redraw ${zoomMs.toFixed(0)} ms; ${nodes} shadow DOM nodes`,
    );
    expect(info.stations).toBe(100_000);
    expect(info.counts.verticesDrawn).toBeGreaterThan(900_000);
    expect(nodes).toBeLessThan(500);
    expectNoBadNumbers(await shadowText(page));
    expect(errors).toEqual([]);
    // Its own time limit: preparing 10^6 vertices and painting them on the software rasteriser is slow on a busy machine.
  }, 300_000);
});
