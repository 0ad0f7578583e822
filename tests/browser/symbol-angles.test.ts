import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { inject } from 'vitest';
import { launchBrowser } from './browser';
import { azimuthDifference } from '../../src/core/math';

/**
 * Reads symbol directions back from rendered pixels. For each station, the centroid of the
 * symbol's coloured pixels (near the station) lies along the arrow (lines) or on the dip-mark
 * side of the strike line (planes). The expected screen direction of an azimuth comes from
 * MapLibre's public `project()` of a point a few metres along that azimuth, so the check holds
 * for any bearing and pitch (common practice: symbols are map-aligned and true to north).
 */
interface Measured { id: string; azimuth: number; measured: number; expected: number; axial: boolean; sideOk: boolean }

async function measure(page: Page): Promise<Measured[]> {
  const png = await page.screenshot({ type: 'png' });
  return page.evaluate(async (b64) => {
    const img = new Image();
    img.src = `data:image/png;base64,${b64}`;
    await img.decode();
    const canvas = document.createElement('canvas');
    canvas.width = img.width;
    canvas.height = img.height;
    const ctx = canvas.getContext('2d')!;
    ctx.drawImage(img, 0, 0);
    const { data, width } = ctx.getImageData(0, 0, img.width, img.height);
    const w = window as unknown as { map: import('maplibre-gl').Map; stations: import('../../src/core/station').Station[] };
    const ratio = img.width / w.map.getCanvas().clientWidth;
    const out = [];
    for (const s of w.stations) {
      const p = w.map.project([s.lon!, s.lat!]);
      const az = s.line ? s.line.trend : s.plane!.dipDirection;
      // Expected: screen direction of a short step along an azimuth on the ground.
      const screenDir = (a: number) => {
        const d = 20 / 111320;
        const q = w.map.project([s.lon! + (d * Math.sin((a * Math.PI) / 180)) / Math.cos((s.lat! * Math.PI) / 180), s.lat! + d * Math.cos((a * Math.PI) / 180)]);
        return { x: q.x - p.x, y: q.y - p.y, deg: ((Math.atan2(q.x - p.x, -(q.y - p.y)) * 180) / Math.PI + 360) % 360 };
      };
      // Lines: compare the arrow with the trend. Planes: compare the strike line with the strike
      // (axially: a strike line has no sense) and check the dip mark is on the down-dip side.
      const target = s.line ? screenDir(az) : screenDir(az + 90);
      const dipSide = screenDir(az);
      // Principal axis of the symbol's dark pixels within 24 px of the station gives the line
      // of the arrow (lines) or of the strike (planes); the centroid gives the sense.
      let sx = 0, sy = 0, sxx = 0, syy = 0, sxy = 0, n = 0;
      const R = 24 * ratio;
      for (let y = Math.max(0, Math.floor(p.y * ratio - R)); y < Math.min(img.height, p.y * ratio + R); y++) {
        for (let x = Math.max(0, Math.floor(p.x * ratio - R)); x < Math.min(width, p.x * ratio + R); x++) {
          const i = (y * width + x) * 4;
          const lum = 0.3 * data[i] + 0.59 * data[i + 1] + 0.11 * data[i + 2];
          if (lum > 160) continue; // background and white halo
          const dx = x - p.x * ratio, dy = y - p.y * ratio;
          if (dx * dx + dy * dy > R * R) continue;
          sx += dx; sy += dy; sxx += dx * dx; syy += dy * dy; sxy += dx * dy; n++;
        }
      }
      const mx = sx / n, my = sy / n;
      const cxx = sxx / n - mx * mx, cyy = syy / n - my * my, cxy = sxy / n - mx * my;
      const major = 0.5 * Math.atan2(2 * cxy, cxx - cyy); // screen angle of the principal axis (x right, y down)
      let ux = Math.cos(major), uy = Math.sin(major);
      if (s.line && ux * mx + uy * my < 0) [ux, uy] = [-ux, -uy]; // sense: toward the arrow head
      const measured = ((Math.atan2(ux, -uy) * 180) / Math.PI + 360) % 360;
      const sideOk = s.line ? true : mx * dipSide.x + my * dipSide.y > 0;
      out.push({ id: s.id, azimuth: az, measured, expected: target.deg, axial: !s.line, sideOk });
    }
    return out;
  }, png.toString('base64'));
}

describe('orientation symbols on a rotated map', () => {
  let browser: Browser;
  let page: Page;
  beforeAll(async () => {
    browser = await launchBrowser();
    page = await browser.newPage({ viewport: { width: 1000, height: 700 } });
    await page.goto(`${inject('demoUrl')}tests/browser/pages/symbol-angles.html`);
    await page.waitForSelector('body[data-map-ready="true"]', { timeout: 60_000 });
  });
  afterAll(async () => {
    await browser?.close();
  });

  // Bearings in all four quadrants, plus a pitched view.
  for (const view of [{ bearing: 0, pitch: 0 }, { bearing: 37, pitch: 0 }, { bearing: 143, pitch: 0 }, { bearing: -110, pitch: 0 }, { bearing: 200, pitch: 0 }, { bearing: 25, pitch: 40 }]) {
    it(`symbols point along their azimuths at bearing ${view.bearing}°, pitch ${view.pitch}°`, async () => {
      await page.evaluate(async (v) => {
        const w = window as unknown as { map: import('maplibre-gl').Map };
        w.map.jumpTo({ bearing: v.bearing, pitch: v.pitch });
        await new Promise((r) => w.map.once('idle', r));
      }, view);
      const rows = await measure(page);
      if (process.env.FOLDLENS_SHOTS) await page.screenshot({ path: `${process.env.FOLDLENS_SHOTS}/angles-${view.bearing}-${view.pitch}.png` });
      expect(rows.length).toBe(16);
      for (const r of rows) {
        const tol = view.pitch > 0 ? 6 : 3;
        const diff = r.axial ? Math.min(azimuthDifference(r.measured, r.expected), azimuthDifference(r.measured + 180, r.expected)) : azimuthDifference(r.measured, r.expected);
        if (diff > tol) {
          expect.fail(`${r.id}: azimuth ${r.azimuth}° drawn toward ${r.measured.toFixed(1)}° on screen, expected ${r.expected.toFixed(1)}°${r.axial ? ' (strike line)' : ''}`);
        }
        if (!r.sideOk) expect.fail(`${r.id}: the dip mark is on the up-dip side`);
      }
    });
  }
});
