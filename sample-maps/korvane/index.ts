/**
 * The SYNTHETIC Korvane sample map as one module, for the demo viewer (vite) and for Node (tsx,
 * vitest) alike. Every name, rock and reading in it is invented; see README.md beside this file.
 *
 * The data files are written by `npm run sample-map`; this module is hand-written and only wires
 * them together: it imports the JSON files and builds the MapLibre style with the GeoJSON inlined.
 */
import type { Map as MapLibreMap, StyleSpecification } from 'maplibre-gl';
import type { FeatureCollection } from 'geojson';
import styleTemplate from './style.json';
import geologyJson from './geology.geo.json';
import contactsJson from './contacts.geo.json';
import topoJson from './topo.geo.json';
import faultsJson from './faults.geo.json';
import placesJson from './places.geo.json';
import stationsJson from './stations.json';
import truthJson from './truth.json';

/** Unit polygons (`unit`, `name`, `lithology`, `order`, `domain`). */
export const geology = geologyJson as unknown as FeatureCollection;
/** Contact lines (`name`, `unitBelow`, `unitAbove`, `level`, `domain`). */
export const contacts = contactsJson as unknown as FeatureCollection;
/** Topographic contours (`elevation`, `index`). */
export const topo = topoJson as unknown as FeatureCollection;
/** The fault between the two structural domains. */
export const faults = faultsJson as unknown as FeatureCollection;
/** Named hills and wadis. */
export const places = placesJson as unknown as FeatureCollection;

/** One row of stations.csv: column name -> the text of the cell, exactly as in the CSV. */
export type SampleStationRow = Readonly<Record<string, string>>;

/**
 * The station rows, identical to stations.csv (including the planted bad rows listed in
 * truth.plantedBadRows).
 * @example stations[0].station_id // 'KR-0001'
 */
export const stations: readonly SampleStationRow[] = stationsJson;

/**
 * The documented right answer: fold axes of both domains, domain polygons, geometry, noise.
 * @example truth.domains[0].axis // {trend: 74.994, plunge: 12}
 */
export const truth = truthJson;

/**
 * Longitude/latitude bounds of the map frame, [west, south, east, north].
 * @example map.fitBounds(bounds)
 */
export const bounds = truthJson.frame.bounds as [number, number, number, number];

/**
 * URL of the DEM GeoTIFF (vite turns this into an asset URL; in Node it is a file: URL).
 * @example const bytes = await (await fetch(demUrl)).arrayBuffer();
 */
export const demUrl: string = new URL('./dem.tif', import.meta.url).href;

/** Parsed GeoJSON for each file name used as a placeholder in style.json. */
const layerFiles: Readonly<Record<string, FeatureCollection>> = {
  'geology.geo.json': geology,
  'contacts.geo.json': contacts,
  'topo.geo.json': topo,
  'faults.geo.json': faults,
  'places.geo.json': places,
};

/** The two looks of the sample map: light paper, or dark for a dark page and dim light. */
export type SampleMapTheme = 'light' | 'dark';

/**
 * Paint of the dark look, by layer id: the same layers and the same unit colours, on a dark
 * ground (units let more of it through), with lines lightened so they keep their contrast.
 * Station symbols carry their own white halo, so they read on both.
 */
const DARK_PAINT: Readonly<Record<string, Readonly<Record<string, unknown>>>> = {
  'korvane-background': { 'background-color': '#1c2124' },
  'korvane-geology-fill': { 'fill-opacity': 0.5 },
  'korvane-topo-minor': { 'line-color': '#cfc3ad', 'line-opacity': 0.3 },
  'korvane-topo-index': { 'line-color': '#ddd1bb', 'line-opacity': 0.55 },
  'korvane-wadis': { 'line-color': '#78acd6' },
  'korvane-contacts': { 'line-color': '#e4e0d8' },
  'korvane-faults': { 'line-color': '#ff8a7a' },
  'korvane-hills': { 'circle-color': '#e0cfb0', 'circle-stroke-color': '#1c2124' },
};

/**
 * The MapLibre style of the sample map with every GeoJSON source inlined; needs no network
 * (no glyphs, sprites or tiles). Returns a new object on every call. `theme: 'dark'` gives the
 * dark look (see {@link samplePaint} to switch a map that is already showing).
 * @example new maplibregl.Map({ container: 'map', style: buildStyle({ theme: 'dark' }) })
 */
export function buildStyle(options: { readonly theme?: SampleMapTheme } = {}): StyleSpecification {
  const template = structuredClone(styleTemplate) as unknown as StyleSpecification;
  const sources: StyleSpecification['sources'] = {};
  for (const [id, source] of Object.entries(template.sources)) {
    if (source.type === 'geojson' && typeof source.data === 'string') {
      const data = layerFiles[source.data];
      if (!data) throw new Error(`style.json source "${id}": no file "${source.data}" in the sample map; expected one of ${Object.keys(layerFiles).join(', ')}`);
      sources[id] = { ...source, data: structuredClone(data) };
    } else sources[id] = source;
  }
  if (options.theme !== 'dark') return { ...template, sources };
  const layers = template.layers.map((layer) => {
    const dark = DARK_PAINT[layer.id];
    return dark && 'paint' in layer ? ({ ...layer, paint: { ...layer.paint, ...dark } } as typeof layer) : layer;
  });
  return { ...template, sources, layers };
}

/**
 * Every paint property of the sample map's layers in a theme, to switch a map showing the
 * sample style with setPaintProperty, which leaves the layers others added (Foldlens's) alone,
 * where setStyle would drop them.
 * @example for (const p of samplePaint('dark')) map.setPaintProperty(p.layer, p.property, p.value);
 */
export function samplePaint(theme: SampleMapTheme): Array<{ layer: string; property: PaintName; value: PaintValue }> {
  return buildStyle({ theme }).layers.flatMap((layer) =>
    Object.entries(('paint' in layer ? layer.paint : undefined) ?? {}).map(([property, value]) => ({ layer: layer.id, property: property as PaintName, value: value as PaintValue })),
  );
}

/** A paint property name, as setPaintProperty takes it. */
type PaintName = Parameters<MapLibreMap['setPaintProperty']>[1];
/** A paint property value, as setPaintProperty takes it. */
type PaintValue = Parameters<MapLibreMap['setPaintProperty']>[2];

/** The style with inlined sources (built once). */
export const style: StyleSpecification = buildStyle();
