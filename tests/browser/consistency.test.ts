import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { launchBrowser, openDemo } from './browser';
import truth from '../../sample-maps/korvane/truth.json';
import { angleBetweenLines } from '../../src/core/geometry';
import { builtInCrs, fromLonLat } from '../../src/io/crs';
import type { ConsistencyReport } from '../../src/core/consistency/report';
import { pointInRing } from '../../src/core/polygon';
import { stations as sampleRows } from '../../sample-maps/korvane/index';
import { pngPixels } from './pngPixels';

/**
 * The consistency panel of the demo, used as a geologist would on the SYNTHETIC Korvane sample
 * map: show the local fold axis field, read the domains it suggests, accept them, check them
 * with a threshold of one's own, and open the report. The planted answer is truth.json: two
 * domains with axes 075/12 and 100/18 meeting at the Kell Fault, and five planted unreadable rows.
 *
 * Stated tolerances. Axes of the accepted domains: 3°, as for a lasso over one domain
 * (demo-lasso.test.ts): the sampling error of a few hundred readings with 2-5° of scatter, plus
 * 0.5° for whole-degree display. Suggested boundary: median distance from the fault under 200 m
 * and every vertex within 650 m, as in tests/core/consistency/korvane.test.ts: with about 400
 * bedding readings over 24 km², the 25th nearest reading lies some 700 m from a cell, so windows
 * straddle the fault for up to about that far and the boundary falls where the two sides balance.
 */
const AXIS_TOLERANCE = 3;
const BOUNDARY_MEDIAN = 200;
const BOUNDARY_MAX = 650;

const require = createRequire(import.meta.url);
const axeSource = readFileSync(require.resolve('axe-core/axe.min.js'), 'utf8');
interface AxeResult { violations: Array<{ id: string; impact: string | null; help: string; nodes: Array<{ target: string[] }> }> }

type DemoWindow = { foldlensDemo: { map: import('maplibre-gl').Map } };

/** Distance (m) of a lon/lat point from the Kell Fault, in UTM 33N. */
const UTM = builtInCrs(truth.crs.epsg)!;
function faultDistance(lon: number, lat: number): number {
  const { x, y } = fromLonLat(lon, lat, UTM);
  const [[ax, ay], [bx, by]] = truth.fault.traceUtm;
  return Math.abs((x - ax) * (by - ay) - (y - ay) * (bx - ax)) / Math.hypot(bx - ax, by - ay);
}

async function renderedCount(page: Page, layer: string): Promise<number> {
  return page.evaluate((id) => {
    const map = (window as unknown as DemoWindow).foldlensDemo.map;
    return map.getLayer(id) ? map.queryRenderedFeatures({ layers: [id] }).length : 0;
  }, layer);
}

/** Waits until the map has drawn everything it was asked to. */
async function idle(page: Page): Promise<void> {
  await page.evaluate(
    () =>
      new Promise<void>((resolve) => {
        const map = (window as unknown as DemoWindow).foldlensDemo.map;
        map.once('idle', () => resolve());
        map.triggerRepaint();
      }),
  );
}

/** Pixels that differ visibly between two PNG screenshots of the same size. */
async function differingPixels(page: Page, a: Buffer, b: Buffer): Promise<number> {
  const [p, q] = [(await pngPixels(page, a)).data, (await pngPixels(page, b)).data];
  let n = 0;
  for (let i = 0; i < p.length; i += 4) if (Math.abs(p[i] - q[i]) + Math.abs(p[i + 1] - q[i + 1]) + Math.abs(p[i + 2] - q[i + 2]) > 30) n++;
  return n;
}

/** The planted domain a sample station lies in. */
function truthDomainOf(id: string): string | undefined {
  const row = sampleRows.find((r) => r.station_id === id);
  if (!row) return undefined;
  return truth.domains.find((d) => pointInRing(Number(row.lon), Number(row.lat), d.polygon.flat()))?.id;
}

async function panelText(page: Page, selector = 'foldlens-consistency'): Promise<string> {
  return page.evaluate((sel) => (document.querySelector(sel)!.shadowRoot?.textContent ?? '').replace(/\s+/g, ' '), selector);
}

describe('consistency panel on the sample map', () => {
  let browser: Browser;
  let page: Page;
  let errors: string[];
  const panel = () => page.locator('foldlens-consistency');
  beforeAll(async () => {
    browser = await launchBrowser();
    ({ page, errors } = await openDemo(browser, '', { width: 1400, height: 900 }));
  });
  afterAll(async () => {
    await browser?.close();
  });

  it('Show axis field (pressed with the keyboard) draws plunge arrows and angle cells, and suggests two domains with a boundary along the Kell Fault', async () => {
    const button = panel().getByRole('button', { name: 'Show axis field' });
    await button.focus();
    await page.keyboard.press('Enter');
    await page.waitForSelector('body[data-consistency-field]', { timeout: 60_000 });
    await idle(page);
    expect(await renderedCount(page, 'foldlens-axis-field-cells')).toBeGreaterThan(500);
    // The arrows, as the user sees them: the map with and without them (the "Plunge arrows" box).
    const map = page.locator('#map canvas');
    const withArrows = await map.screenshot();
    const arrows = panel().getByLabel('Plunge arrows');
    await arrows.uncheck();
    await idle(page);
    const without = await map.screenshot();
    await arrows.check();
    await idle(page);
    // An arrow covers some tens of pixels; over a thousand of them are drawn.
    expect(await differingPixels(page, withArrows, without)).toBeGreaterThan(10_000);
    const text = await panelText(page);
    expect(text).toMatch(/2 suggested domains\./);
    // The regions' mean axes, as the panel lists them, against the planted ones.
    const listed = [...text.matchAll(/Suggested domain \d: mean cell axis (\d{3})\/(\d{2})/g)].map((m) => ({ trend: Number(m[1]), plunge: Number(m[2]) }));
    expect(listed.length).toBe(2);
    for (const d of truth.domains) expect(Math.min(...listed.map((l) => angleBetweenLines(l, d.axis)))).toBeLessThan(AXIS_TOLERANCE);
    // The dashed boundary drawn on the map, against the fault.
    const lines = await page.evaluate(() => {
      const map = (window as unknown as DemoWindow).foldlensDemo.map;
      const data = (map.getSource('foldlens-consistency-boundaries') as import('maplibre-gl').GeoJSONSource).serialize().data as GeoJSON.FeatureCollection<GeoJSON.LineString>;
      return data.features.map((f) => f.geometry.coordinates);
    });
    expect(await renderedCount(page, 'foldlens-consistency-boundaries')).toBeGreaterThan(0);
    const [west, south, east, north] = truth.frame.bounds;
    const distances = lines
      .flat()
      // Leave out vertices on the outer frame of the grid (about a cell from the data's edge).
      .filter(([lon, lat]) => lon > west + 0.002 && lon < east - 0.002 && lat > south + 0.002 && lat < north - 0.002)
      .map(([lon, lat]) => faultDistance(lon, lat))
      .sort((a, b) => a - b);
    expect(distances.length).toBeGreaterThan(20);
    expect(distances[distances.length >> 1]).toBeLessThan(BOUNDARY_MEDIAN);
    expect(distances[distances.length - 1]).toBeLessThan(BOUNDARY_MAX);
  });

  it('the consistency panel has no serious or critical accessibility violations (external reference: axe-core)', async () => {
    const result = await page.evaluate(async (src) => {
      if (!(window as unknown as { axe?: unknown }).axe) (0, eval)(src);
      const axe = (window as unknown as { axe: { run(ctx: unknown, opts: unknown): Promise<AxeResult> } }).axe;
      return axe.run({ include: [['foldlens-consistency']] }, { resultTypes: ['violations'] });
    }, axeSource);
    const serious = result.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical').map((v) => `${v.id}: ${v.help} (${v.nodes.map((n) => n.target.join(' ')).join('; ')})`);
    expect(serious).toEqual([]);
  });

  /** Suggested domain name to the planted domain whose axis it has. */
  const planted = new Map<string, string>();

  it('Accept suggested domains saves two domains whose axes agree with the planted ones', async () => {
    await panel().getByRole('button', { name: 'Accept suggested domains' }).click();
    await page.waitForSelector('body[data-domains-saved="2"]', { timeout: 60_000 });
    const rows = await page.evaluate(() => [...document.querySelector('foldlens-domains')!.shadowRoot!.querySelectorAll('tbody tr')].map((r) => (r.textContent ?? '').replace(/\s+/g, ' ')));
    expect(rows.length).toBe(2);
    const axes = rows.map((r) => {
      const m = /(\d{3})\/(\d{2})/.exec(r);
      expect(m, `no axis in the row "${r}"`).not.toBeNull();
      return { trend: Number(m![1]), plunge: Number(m![2]) };
    });
    for (const d of truth.domains) expect(Math.min(...axes.map((a) => angleBetweenLines(a, d.axis)))).toBeLessThan(AXIS_TOLERANCE);
    expect(rows.every((r) => /Suggested domain \d/.test(r))).toBe(true);
    rows.forEach((r, i) => planted.set(/Suggested domain \d/.exec(r)![0], truth.domains.find((d) => angleBetweenLines(axes[i], d.axis) < AXIS_TOLERANCE)!.id));
  });

  it('Check domains flags no line at the default 15° and no plane of its own domain, and rings the lines beyond a threshold of 2° set by the user', async () => {
    const threshold = panel().getByLabel('Lines off the axis by more than');
    const check = async (value: string): Promise<number> => {
      await threshold.fill(value);
      const before = await page.evaluate(() => document.body.dataset.consistencyFlags);
      await panel().getByRole('button', { name: 'Check domains' }).click();
      await page.waitForFunction((prev) => document.body.dataset.consistencyFlags !== undefined && document.body.dataset.consistencyFlags !== prev, before, { timeout: 60_000 }).catch(() => undefined);
      await page.waitForFunction(() => !document.querySelector('foldlens-consistency')!.shadowRoot!.textContent!.includes('Checking…'), undefined, { timeout: 60_000 });
      return Number(await page.evaluate(() => document.body.dataset.consistencyFlags));
    };
    const atDefault = await check('15');
    let text = await panelText(page);
    expect(text).toMatch(/Checked the 2 saved domains\./);
    expect([...text.matchAll(/(\d+) lines? off the axis/g)].map((m) => m[1])).toEqual(['0', '0']);
    // A pole off the girdle at the robust default must be a reading of the other planted domain that
    // the suggested boundary left on this side (within the boundary tolerance of the fault).
    const items = await page.evaluate(() => [...document.querySelector('foldlens-consistency')!.shadowRoot!.querySelectorAll('ul.flags li')].map((li) => li.textContent ?? ''));
    const offGirdle = items.filter((t) => /from the girdle/.test(t)).flatMap((t) => [...t.matchAll(/KR-\d{4}/g)].map((m) => ({ domain: /Suggested domain \d/.exec(t)![0], id: m[0] })));
    expect(offGirdle.length).toBe(atDefault);
    for (const f of offGirdle) {
      expect(truthDomainOf(f.id), `${f.id} flagged in ${f.domain}`).not.toBe(planted.get(f.domain));
      const row = sampleRows.find((r) => r.station_id === f.id)!;
      expect(faultDistance(Number(row.lon), Number(row.lat))).toBeLessThan(BOUNDARY_MAX);
    }
    const flagged = await check('2');
    text = await panelText(page);
    const perDomain = [...text.matchAll(/(\d+) lines? off the axis/g)].reduce((n, m) => n + Number(m[1]), 0);
    expect(flagged).toBeGreaterThan(0);
    expect(flagged).toBe(perDomain + [...text.matchAll(/(\d+) poles? off the girdle/g)].reduce((n, m) => n + Number(m[1]), 0));
    await page.waitForFunction((n) => {
      const map = (window as unknown as DemoWindow).foldlensDemo.map;
      return map.queryRenderedFeatures({ layers: ['foldlens-consistency-flags'] }).length >= n;
    }, Math.min(flagged, 5), { timeout: 30_000 });
    expect(text).toMatch(/lies? more than 2° from the axis/);
    await threshold.fill('15');
  });

  it('Make report opens a printable page showing both domains, their checks, the planted bad rows and the caution, and Download JSON gives the same report', async () => {
    await panel().getByRole('button', { name: 'Make report' }).click();
    const link = panel().getByRole('link', { name: 'Open the printable report' });
    await link.waitFor({ timeout: 60_000 });
    const [report] = await Promise.all([page.context().waitForEvent('page'), link.click()]);
    await report.waitForLoadState('load');
    const body = (await report.locator('body').textContent())!.replace(/\s+/g, ' ');
    expect(await report.title()).toBe('Fold consistency report');
    expect(body).toContain('Suggested domain 1');
    expect(body).toContain('Suggested domain 2');
    expect(body).toMatch(/Domains compared/);
    expect(body).toMatch(/Fold closures on the map/);
    for (const bad of truth.plantedBadRows) expect(body, `planted bad row ${bad.id}`).toContain(`Left out: ${bad.id}`);
    expect(body).toMatch(/defer to local codes and licensed professional practice/);
    expect(await report.locator('script').count()).toBe(0);
    await report.close();

    const [download] = await Promise.all([page.waitForEvent('download'), panel().getByRole('button', { name: 'Download JSON' }).click()]);
    const json = JSON.parse(readFileSync((await download.path())!, 'utf8')) as ConsistencyReport;
    expect(json.domains.map((d) => d.name).sort()).toEqual(['Suggested domain 1', 'Suggested domain 2']);
    for (const d of truth.domains) expect(Math.min(...json.domains.map((c) => angleBetweenLines(c.axis!, d.axis)))).toBeLessThan(AXIS_TOLERANCE);
    expect(json.pairs[0].angle!).toBeGreaterThan(20);
    expect(json.field!.partition.regions.length).toBe(2);
    expect(json.notes.filter((n) => n.startsWith('Left out: ')).length).toBe(truth.plantedBadRows.length);
    expect(json.domains.every((d) => d.mapPattern?.closures && d.mapPattern.closures.disagreeing === 0)).toBe(true);
    expect(errors).toEqual([]);
  });
});
