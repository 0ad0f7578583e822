// Test-only page: one lineation arrow or one bedding mark per cell of a grid, each at a known
// azimuth, on a plain background, so a test can measure the drawn direction from pixels.
import 'maplibre-gl/dist/maplibre-gl.css';
import { Map as MapLibreMap } from 'maplibre-gl';
import { configureMapLibre } from '../../../src/map/maplibreSetup';
import { FoldlensOverlay } from '../../../src/map/foldlensOverlay';
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
const azimuths = [10, 60, 100, 150, 200, 250, 290, 340];
const stations: Station[] = [];
azimuths.forEach((az, i) => {
  const lon = center[0] + (i % 4 - 1.5) * 0.0025;
  const lat = center[1] + (Math.floor(i / 4) - 0.5) * 0.0036;
  stations.push({ id: `L${az}`, row: i + 1, kind: 'lineation', lon, lat, line: { trend: az, plunge: 30 }, source: {}, problems: [] });
  stations.push({ id: `P${az}`, row: i + 9, kind: 'bedding', lon, lat: lat - 0.0015, plane: { dipDirection: az, dip: 40 }, source: {}, problems: [] });
});
const overlay = new FoldlensOverlay(map, { show: { dots: false, labels: false, symbols: true } });
map.on('load', () => {
  overlay.setStations(stations);
  map.once('idle', () => document.body.setAttribute('data-map-ready', 'true'));
});
Object.assign(window, { map, stations, overlay });
