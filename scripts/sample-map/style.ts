/**
 * A MapLibre style (version 8) for the sample map that needs no network: no glyphs, no sprite,
 * no text or symbol layers, only fills, lines and circles. Each GeoJSON source's `data` is the
 * name of a file beside style.json; sample-maps/korvane/index.ts swaps in the parsed data.
 */
import type { StyleSpecification } from 'maplibre-gl';
import { SYNTHETIC_NOTICE, UNITS } from './district';

/**
 * Source id -> GeoJSON file name beside style.json.
 * @example STYLE_SOURCES['korvane-geology'] // 'geology.geo.json'
 */
export const STYLE_SOURCES = {
  'korvane-geology': 'geology.geo.json',
  'korvane-contacts': 'contacts.geo.json',
  'korvane-topo': 'topo.geo.json',
  'korvane-faults': 'faults.geo.json',
  'korvane-places': 'places.geo.json',
} as const;

/**
 * The style with file-name placeholders as source data.
 * @example makeStyle([15, 24.62]).layers.length // 8
 */
export function makeStyle(center: [number, number]): StyleSpecification {
  const unitColours = UNITS.flatMap((u) => [u.code, u.colour]);
  return {
    version: 8,
    name: 'Korvane district (SYNTHETIC demo)',
    metadata: {
      'foldlens:synthetic': true,
      'foldlens:description': SYNTHETIC_NOTICE,
      'foldlens:sources': 'Each source "data" is the name of a GeoJSON file beside this style; load it and put the parsed object in its place (sample-maps/korvane/index.ts does so).',
    },
    center,
    zoom: 13.2,
    sources: Object.fromEntries(Object.entries(STYLE_SOURCES).map(([id, file]) => [id, { type: 'geojson', data: file }])),
    layers: [
      { id: 'korvane-background', type: 'background', paint: { 'background-color': '#f6f3ec' } },
      {
        id: 'korvane-geology-fill',
        type: 'fill',
        source: 'korvane-geology',
        paint: { 'fill-color': ['match', ['get', 'unit'], ...unitColours, '#d9d9d9'] as never, 'fill-opacity': 0.85 },
      },
      {
        id: 'korvane-topo-minor',
        type: 'line',
        source: 'korvane-topo',
        filter: ['==', ['get', 'index'], false],
        paint: { 'line-color': '#7d6f5a', 'line-opacity': 0.45, 'line-width': 0.6 },
      },
      {
        id: 'korvane-topo-index',
        type: 'line',
        source: 'korvane-topo',
        filter: ['==', ['get', 'index'], true],
        paint: { 'line-color': '#6b5d48', 'line-opacity': 0.75, 'line-width': 1.2 },
      },
      {
        id: 'korvane-wadis',
        type: 'line',
        source: 'korvane-places',
        filter: ['==', ['get', 'kind'], 'wadi'],
        layout: { 'line-cap': 'round', 'line-join': 'round' },
        paint: { 'line-color': '#4f7fa6', 'line-width': 1.4, 'line-dasharray': [3, 2] },
      },
      {
        id: 'korvane-contacts',
        type: 'line',
        source: 'korvane-contacts',
        layout: { 'line-join': 'round' },
        paint: { 'line-color': '#2b2b2b', 'line-width': 1.3 },
      },
      {
        id: 'korvane-faults',
        type: 'line',
        source: 'korvane-faults',
        paint: { 'line-color': '#8c2d2d', 'line-width': 2.4 },
      },
      {
        id: 'korvane-hills',
        type: 'circle',
        source: 'korvane-places',
        filter: ['==', ['get', 'kind'], 'hill'],
        paint: { 'circle-radius': 3.5, 'circle-color': '#5a4a3a', 'circle-stroke-color': '#ffffff', 'circle-stroke-width': 1 },
      },
    ],
  };
}
