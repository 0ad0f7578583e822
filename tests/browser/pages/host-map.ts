// Test-only page: somebody else's map (own style, own layers, own id prefix choices) that
// attaches Foldlens the way the README says, so a test can check it coexists and leaves cleanly.
import 'maplibre-gl/dist/maplibre-gl.css';
import { Map as MapLibreMap, type StyleSpecification } from 'maplibre-gl';
import { attachFoldlens, readCsv, detectColumns, readStations } from '../../../src/index';
import { configureMapLibre } from '../../../src/map/maplibreSetup'; // what a host does with setWorkerUrl (README)

configureMapLibre();
const hostStyle = (colour: string): StyleSpecification => ({
  version: 8,
  sources: {
    parcels: {
      type: 'geojson',
      data: { type: 'FeatureCollection', features: [{ type: 'Feature', properties: {}, geometry: { type: 'Polygon', coordinates: [[[-71.02, 42.99], [-70.98, 42.99], [-70.98, 43.01], [-71.02, 43.01], [-71.02, 42.99]]] } }] },
    },
  },
  layers: [
    { id: 'background', type: 'background', paint: { 'background-color': colour } },
    { id: 'parcels', type: 'fill', source: 'parcels', paint: { 'fill-color': '#88aa66', 'fill-opacity': 0.4 } },
  ],
});
const map = new MapLibreMap({ container: 'host', style: hostStyle('#f0eee8'), center: [-71, 43], zoom: 14, attributionControl: false });
const csv = ['site,type,dip_dir,dip,trend,plunge,longitude,latitude', 'H1,bedding,045,30,,,-71.005,43.002', 'H2,bedding,135,60,,,-70.995,42.998', 'H3,hinge,,,090,15,-71.000,43.000', 'H4,bedding,95,30,,,-71.01,43.005'].join('\n');
const table = readCsv(csv);
const stations = readStations(table, detectColumns(table.headers).mapping);
const foldlens = attachFoldlens(map);
map.on('load', () => {
  foldlens.setStations(stations);
  map.once('idle', () => document.body.setAttribute('data-map-ready', 'true'));
});
// What the host hears: the analysis of each finished selection, and saved domains.
const heard: Array<{ type: string; detail: unknown }> = [];
for (const type of ['axiscomputed', 'domainsaved']) foldlens.addEventListener(type, (e) => heard.push({ type, detail: (e as CustomEvent).detail }));
Object.assign(window, { map, foldlens, stations, hostStyle, heard });
