// Test-only page: a few stations on a blank map with the overlay's hover tooltip on, one of
// them with markup in its id, so a test can hover them with the mouse and read the tooltip.
import 'maplibre-gl/dist/maplibre-gl.css';
import { Map as MapLibreMap } from 'maplibre-gl';
import { configureMapLibre } from '../../../src/map/maplibreSetup';
import { FoldlensOverlay, type StationEventDetail } from '../../../src/map/foldlensOverlay';
import type { Station } from '../../../src/core/station';

configureMapLibre();
const center: [number, number] = [15, 46];
const map = new MapLibreMap({
  container: 'map',
  style: { version: 8, sources: {}, layers: [{ id: 'bg', type: 'background', paint: { 'background-color': '#ffffff' } }] },
  center,
  zoom: 15,
  attributionControl: false,
  fadeDuration: 0,
});
const stations: Station[] = [
  { id: '<img src=x onerror="window.__injected=1"><b>T-1</b>', row: 1, kind: 'bedding', lon: 14.998, lat: 46, plane: { dipDirection: 120, dip: 35 }, source: {}, problems: [] },
  { id: 'T-2', row: 2, kind: 'hinge', lon: 15.002, lat: 46, line: { trend: 74, plunge: 12, sense: 'antiform' }, source: {}, problems: [] },
];
const overlay = new FoldlensOverlay(map, { tooltip: true });
const clicks: number[] = [];
overlay.addEventListener('stationclick', (e) => clicks.push((e as CustomEvent<StationEventDetail>).detail.index));
map.on('load', () => {
  overlay.setStations(stations);
  map.once('idle', () => document.body.setAttribute('data-map-ready', 'true'));
});
Object.assign(window, { map, stations, overlay, clicks });
