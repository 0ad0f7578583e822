// Benchmark-only page: a MapLibre map with a blank style, on which the driver
// (symbolsDriver.ts) draws n seeded bedding stations either as Foldlens symbols (the overlay
// with its default layers: dots, labels, symbols) or as one plain circle layer, times the first
// full render and then the frames of a pan. One page load per render, so nothing is cached.
//
// First full render: from handing the stations over (overlay.setStations; for circles, building
// the GeoJSON and setData) to the map's 'idle' event, and then until the GPU has finished that
// frame (a one-pixel readPixels on the map's WebGL context waits for it), so work the GPU does
// after 'idle' is counted too.
import 'maplibre-gl/dist/maplibre-gl.css';
import { Map as MapLibreMap, type GeoJSONSource } from 'maplibre-gl';
import type { FeatureCollection, Point } from 'geojson';
import { configureMapLibre } from '../../src/map/maplibreSetup';
import { FoldlensOverlay } from '../../src/map/foldlensOverlay';
import type { Station } from '../../src/core/station';
import { seededUniform } from '../cases/data';
import { ZOOM, type PageRender, type RenderKind } from './protocol';

configureMapLibre();
const map = new MapLibreMap({
  container: 'map',
  style: { version: 8, sources: {}, layers: [{ id: 'bg', type: 'background', paint: { 'background-color': '#ffffff' } }] },
  center: [15, 46],
  zoom: ZOOM,
  attributionControl: false,
  fadeDuration: 0,
});

/** n bedding stations, uniform over the central 90 % of the view, random attitudes; seeded. */
function makeStations(n: number, seed: number): Station[] {
  const rnd = seededUniform(seed);
  const b = map.getBounds();
  const w = b.getEast() - b.getWest();
  const h = b.getNorth() - b.getSouth();
  const out: Station[] = [];
  for (let i = 0; i < n; i++) {
    out.push({
      id: `B${i}`,
      row: i + 1,
      kind: 'bedding',
      lon: b.getWest() + w * (0.05 + 0.9 * rnd()),
      lat: b.getSouth() + h * (0.05 + 0.9 * rnd()),
      plane: { dipDirection: Math.floor(360 * rnd()), dip: Math.floor(91 * rnd()) },
      source: {},
      problems: [],
    });
  }
  return out;
}

/** Waits until the GPU has executed every command given so far (readPixels must return the pixel). */
function gpuFinished(): void {
  const gl = map.getCanvas().getContext('webgl2');
  gl?.readPixels(0, 0, 1, 1, gl.RGBA, gl.UNSIGNED_BYTE, new Uint8Array(4));
}

function once(event: 'idle'): Promise<void> {
  return new Promise((resolve) => map.once(event, () => resolve()));
}

/** Distinct feature ids drawn by a layer anywhere in the view (for symbols: the placed ones). */
function drawnCount(layer: string): number {
  const ids = new Set<unknown>();
  for (const f of map.queryRenderedFeatures({ layers: [layer] })) ids.add(f.id);
  return ids.size;
}

/**
 * Pans by `dx` CSS px per frame, half the steps to the right then back, each step issued when the
 * previous frame has rendered, for `steps` frames or until `maxMs` have passed (at least two
 * frames); returns the times between successive frames in ms.
 */
function pan(steps: number, dx: number, maxMs: number): Promise<number[]> {
  return new Promise((resolve) => {
    const stamps: number[] = [];
    let k = 0;
    const step = () => map.panBy([k < steps / 2 ? dx : -dx, 0], { animate: false });
    const onRender = () => {
      const now = performance.now();
      stamps.push(now);
      if (k++ >= steps || (stamps.length > 2 && now - stamps[0] > maxMs)) {
        map.off('render', onRender);
        resolve(stamps.slice(1).map((t, i) => t - stamps[i]));
        return;
      }
      step();
    };
    map.on('render', onRender);
    step();
  });
}

async function render(kind: RenderKind, n: number, seed: number, panSteps: number, panMaxMs: number, count: boolean): Promise<PageRender> {
  const stations = makeStations(n, seed);
  let countDrawn: () => number;
  let start: number;
  if (kind === 'symbols') {
    // The product's defaults: dots, labels and symbols shown. At this zoom every symbol is drawn,
    // by the overlay's custom layer, which the map's feature queries cannot see: it reports its
    // own count. Labels still give way to each other.
    const overlay = new FoldlensOverlay(map);
    countDrawn = () => overlay.symbolsDrawnAtFullZoom;
    start = performance.now();
    overlay.setStations(stations);
  } else {
    map.addSource('plain', { type: 'geojson', data: { type: 'FeatureCollection', features: [] } });
    map.addLayer({ id: 'plain-circles', type: 'circle', source: 'plain', paint: { 'circle-radius': 2.2, 'circle-color': '#1d2326' } });
    countDrawn = () => drawnCount('plain-circles');
    start = performance.now();
    // The same points as plain GeoJSON, built inside the timed span as the overlay builds its features.
    const data: FeatureCollection<Point> = {
      type: 'FeatureCollection',
      features: stations.map((s, i) => ({ type: 'Feature', id: i, geometry: { type: 'Point', coordinates: [s.lon!, s.lat!] }, properties: {} })),
    };
    (map.getSource('plain') as GeoJSONSource).setData(data);
  }
  const handOverMs = performance.now() - start;
  await once('idle');
  const idleMs = performance.now() - start;
  gpuFinished();
  const firstRenderMs = performance.now() - start;
  const counting = performance.now();
  const drawn = count ? countDrawn() : -1;
  const countMs = performance.now() - counting;
  const frameMs = panSteps > 0 ? await pan(panSteps, 12, panMaxMs) : [];
  return { kind, n, firstRenderMs, idleMs, handOverMs, frameMs, drawn, countMs };
}

// The first 'idle' comes once the style has loaded (awaiting 'load' first could miss it: both fire in one frame).
await once('idle');
Object.assign(window, { benchRender: render });
document.body.setAttribute('data-bench-ready', 'true');
