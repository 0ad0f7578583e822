import type { Page } from 'playwright-core';
import truth from '../../sample-maps/korvane/truth.json';
import { builtInCrs, toLonLat } from '../../src/io/crs';
import type { DemoWindow, ScreenPoint } from './demoActions';

/**
 * Places along the west domain of the sample map, for the browser tests of profiles and
 * sections: positions measured in metres from the domain's profile origin (truth.json) in the
 * sample's UTM grid, and where the map shows them now.
 */

const west = truth.domains.find((d) => d.id === 'west')!;
const utm = builtInCrs(truth.crs.epsg)!;

/** A point `s` metres from the west domain's profile origin along grid azimuth `az`, then `side` metres to its right, as lon/lat. */
export function fromWestOrigin(s: number, az: number, side = 0): [number, number] {
  const [e0, n0] = west.profile.originUtm;
  const a = (az * Math.PI) / 180;
  const ll = toLonLat(e0 + s * Math.sin(a) + side * Math.cos(a), n0 + s * Math.cos(a) - side * Math.sin(a), utm);
  return [ll.lon, ll.lat];
}

/** Page coordinates of lon/lat positions on the demo's map as it is shown now. */
export async function onScreen(page: Page, lonLat: [number, number][]): Promise<ScreenPoint[]> {
  return page.evaluate((pts) => {
    const map = (window as unknown as DemoWindow).foldlensDemo.map;
    const rect = map.getCanvasContainer().getBoundingClientRect();
    return pts.map((p) => {
      const q = map.project(p);
      return { x: rect.left + q.x, y: rect.top + q.y };
    });
  }, lonLat);
}
