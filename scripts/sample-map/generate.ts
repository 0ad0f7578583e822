/**
 * makeSampleMap(seed): the whole SYNTHETIC Korvane sample map as file contents, computed in
 * memory with no side effects, so tests can regenerate it and compare with the committed files.
 */
import { DISTRICT } from './district';
import { buildDomains } from './domains';
import { geologyAndContacts, faultLayer, placesLayer, topoContours, type SyntheticCollection } from './layers';
import { writeDemGeoTiff } from './geotiff';
import { createRandom } from './prng';
import { makeReadings, type FieldReading } from './stations';
import { makeStyle } from './style';
import { makeTables, QUADRANT_COLUMNS, STATION_COLUMNS, toCsv } from './tables';
import { frameBounds, makeTruth, type Truth } from './truth';
import { sampleDem, terrainFunction, type DemGrid } from './terrain';
import { makeReadme } from './readme';

/** Everything the generator makes. `files` maps a file name (inside sample-maps/korvane/) to its contents. */
export interface SampleMap {
  readonly files: Readonly<Record<string, string | Uint8Array>>;
  readonly truth: Truth;
  readonly dem: DemGrid;
  readonly readings: readonly FieldReading[];
}

/**
 * Directory of the sample map, relative to the repository root.
 * @example writeFileSync(join(SAMPLE_MAP_DIR, 'truth.json'), text)
 */
export const SAMPLE_MAP_DIR = `sample-maps/${DISTRICT.id}`;

/** Indented JSON with every array of plain values on one line (JSON strings hold no raw line breaks). */
const json = (value: unknown): string =>
  `${JSON.stringify(value, null, 2).replace(/\[\s*([^[\]{}]*?)\s*\]/g, (_m, inner: string) => `[${inner.replace(/\n\s*/g, ' ')}]`)}\n`;
/** Compact JSON for the bulky layers: one feature per line keeps diffs readable and files small. */
const layerJson = (fc: SyntheticCollection): string => {
  const { features, ...head } = fc;
  const top = JSON.stringify(head).slice(0, -1);
  return `${top},"features":[\n${features.map((f) => JSON.stringify(f)).join(',\n')}\n]}\n`;
};

/**
 * Generates the SYNTHETIC Korvane district for a seed. The same seed always gives the same bytes.
 * @example
 * const map = makeSampleMap(20241104);
 * map.truth.domains[0].axis; // {trend: 75.0.., plunge: 12}
 */
export function makeSampleMap(seed: number = DISTRICT.defaultSeed): SampleMap {
  // Separate streams, so that changing one part (say the station count) leaves the terrain alone.
  const terrainRandom = createRandom(seed);
  const stationRandom = createRandom(seed + 1);
  const defectRandom = createRandom(seed + 2);

  const dem = sampleDem(terrainFunction(terrainRandom));
  const domains = buildDomains();
  const readings = makeReadings(stationRandom, domains, dem, DISTRICT.stationPrefix);
  const tables = makeTables(defectRandom, readings);
  const { geology, contacts } = geologyAndContacts(dem, domains);
  const bounds = frameBounds();
  const truth = makeTruth(seed, domains, dem, tables.planted, bounds);
  const center: [number, number] = [(bounds[0] + bounds[2]) / 2, (bounds[1] + bounds[3]) / 2].map((v) => Math.round(v * 1e6) / 1e6) as [number, number];

  const files: Record<string, string | Uint8Array> = {
    'dem.tif': writeDemGeoTiff(dem),
    'topo.geo.json': layerJson(topoContours(dem, 20)),
    'geology.geo.json': layerJson(geology),
    'contacts.geo.json': layerJson(contacts),
    'faults.geo.json': layerJson(faultLayer()),
    'places.geo.json': layerJson(placesLayer(dem)),
    'stations.csv': toCsv(STATION_COLUMNS, tables.rows),
    'stations.json': `[\n${tables.rows.map((r) => JSON.stringify(r)).join(',\n')}\n]\n`,
    'stations-quadrant.csv': toCsv(QUADRANT_COLUMNS, tables.quadrant),
    'style.json': json(makeStyle(center)),
    'truth.json': json(truth),
  };
  files['README.md'] = makeReadme(truth, readings, files);
  return { files, truth, dem, readings };
}
