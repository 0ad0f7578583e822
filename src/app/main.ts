import 'maplibre-gl/dist/maplibre-gl.css';
import { Map as MapLibreMap } from 'maplibre-gl';
import { configureMapLibre } from '../map/maplibreSetup';

configureMapLibre();

const map = new MapLibreMap({
  container: 'map',
  style: { version: 8, sources: {}, layers: [{ id: 'paper', type: 'background', paint: { 'background-color': '#f4f1ea' } }] },
  center: [0, 0],
  zoom: 2,
  attributionControl: false,
});
map.once('idle', () => document.body.setAttribute('data-map-ready', 'true'));
(window as unknown as { foldlensMap: MapLibreMap }).foldlensMap = map;
