/**
 * The SYNTHETIC Korvane sample map as one module, for the demo viewer (vite) and for Node (tsx,
 * vitest) alike. Every name, rock and reading in it is invented; see README.md beside this file.
 *
 * The data files are written by `npm run sample-map`; this module is hand-written and only wires
 * them together: it imports the JSON files and builds the MapLibre style with the GeoJSON inlined.
 */
import type { StyleSpecification } from 'maplibre-gl';
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

/**
 * The MapLibre style of the sample map with every GeoJSON source inlined; needs no network
 * (no glyphs, sprites or tiles). Returns a new object on every call.
 * @example new maplibregl.Map({ container: 'map', style: buildStyle() })
 */
export function buildStyle(): StyleSpecification {
  const template = structuredClone(styleTemplate) as unknown as StyleSpecification;
  const sources: StyleSpecification['sources'] = {};
  for (const [id, source] of Object.entries(template.sources)) {
    if (source.type === 'geojson' && typeof source.data === 'string') {
      const data = layerFiles[source.data];
      if (!data) throw new Error(`style.json source "${id}": no file "${source.data}" in the sample map; expected one of ${Object.keys(layerFiles).join(', ')}`);
      sources[id] = { ...source, data: structuredClone(data) };
    } else sources[id] = source;
  }
  return { ...template, sources };
}

/** The style with inlined sources (built once). */
export const style: StyleSpecification = buildStyle();
