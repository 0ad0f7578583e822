import KDBush from 'kdbush';
import type { Map as MapLibreMap } from 'maplibre-gl';
import { lonLatToMercator } from '../core/webMercator';

/**
 * Which station is under the pointer: the nearest one within a radius of screen pixels, found
 * in a kd-tree of the stations' Web Mercator positions (kdbush), then measured on screen with
 * the map's `project`, so the answer holds at any bearing and pitch.
 *
 * Why not an invisible circle layer and MapLibre's feature queries: such a layer makes the
 * map's worker build a bucket of every station on every tile, which with 10^5 stations costs as
 * much as drawing them all as circles; the tree is built once, in milliseconds.
 * @example
 * const picker = new StationPicker([{ index: 0, lon: 15, lat: 46 }]);
 * picker.nearest(map, e.point, 10) // 0 when the pointer is within 10 px of the station
 */
export class StationPicker {
  private readonly index: KDBush | null;
  private readonly ids: Int32Array;
  private readonly lon: Float64Array;
  private readonly lat: Float64Array;

  /** `stations`: index (returned by `nearest`) and position of each station that can be picked. */
  constructor(stations: ReadonlyArray<{ readonly index: number; readonly lon: number; readonly lat: number }>) {
    const n = stations.length;
    this.ids = new Int32Array(n);
    this.lon = new Float64Array(n);
    this.lat = new Float64Array(n);
    if (n === 0) {
      this.index = null;
      return;
    }
    const tree = new KDBush(n);
    stations.forEach((s, k) => {
      const [x, y] = lonLatToMercator(s.lon, s.lat);
      tree.add(x, y);
      this.ids[k] = s.index;
      this.lon[k] = s.lon;
      this.lat[k] = s.lat;
    });
    tree.finish();
    this.index = tree;
  }

  /** The index of the station nearest to a screen point within `radiusPx` CSS px, or -1. */
  nearest(map: MapLibreMap, point: { readonly x: number; readonly y: number }, radiusPx: number): number {
    if (!this.index) return -1;
    const ground = map.unproject([point.x, point.y]);
    // The tree holds the stations in the world from -180° to 180°; a map panned across the
    // antimeridian shows another copy of it, so look up the pointer in that world and measure
    // each candidate in the copy of the world the pointer is in.
    const shift = 360 * Math.floor((ground.lng + 180) / 360);
    const [mx, my] = lonLatToMercator(ground.lng - shift, ground.lat);
    // radiusPx on screen is radiusPx / (512 * 2^zoom) of the world at the map's centre; a
    // pitched view shows more ground per pixel away from it, so ask the tree generously and
    // measure the candidates on screen.
    const slack = 1.5 / Math.max(0.2, Math.cos((map.getPitch() * Math.PI) / 180) ** 2);
    const r = (radiusPx * slack) / (512 * 2 ** map.getZoom());
    let best = -1;
    let bestD2 = radiusPx * radiusPx;
    // Near the antimeridian the circle reaches into the neighbouring copy: look there too (x ± 1).
    const candidates: Array<[number, number]> = this.index.within(mx, my, r).map((k) => [k, shift]);
    if (mx - r < 0) for (const k of this.index.within(mx + 1, my, r)) candidates.push([k, shift - 360]);
    if (mx + r > 1) for (const k of this.index.within(mx - 1, my, r)) candidates.push([k, shift + 360]);
    for (const [k, lonShift] of candidates) {
      const p = map.project([this.lon[k] + lonShift, this.lat[k]]);
      const d2 = (p.x - point.x) ** 2 + (p.y - point.y) ** 2;
      if (d2 <= bestD2) {
        bestD2 = d2;
        best = this.ids[k];
      }
    }
    return best;
  }
}
