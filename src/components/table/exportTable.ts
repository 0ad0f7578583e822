import type { CsvTable } from '../../io/csvTable';
import type { NormalisedOptions } from '../../io/normalisedColumns';
import type { ProjectDataset } from '../../io/projectFile';
import { stationsToCsv, stationsToGeoJson } from '../../io/writeStations';

/**
 * Writing a dataset out as CSV or GeoJSON through the io writers (io/writeStations.ts): every
 * original column and row as it stands now (edited cells hold their new value), blank rows in
 * their places, and the columns Foldlens adds (attitude after corrections, problems).
 */

/**
 * The dataset as the CsvTable it was read from (rows rebuilt from the stations' original fields).
 * @example datasetTable(dataset).rows.length === dataset.stations.length // true
 */
export function datasetTable(dataset: ProjectDataset): CsvTable {
  const extras = new Map(dataset.table.extras.map((x) => [x.row, x.fields]));
  return {
    headers: dataset.table.headers,
    delimiter: dataset.table.delimiter,
    blankRows: dataset.table.blankRows,
    notes: dataset.table.notes,
    rows: dataset.stations.map((s) => {
      const extra = extras.get(s.row);
      return extra ? { row: s.row, values: s.source, extra } : { row: s.row, values: s.source };
    }),
  };
}

/** Whether positions must be written in added columns: the file did not give them as longitude and latitude. */
function needsLocation(dataset: ProjectDataset): boolean {
  return dataset.table.format === 'geojson' || dataset.mapping.lon === undefined;
}

/**
 * The dataset as CSV (stationsToCsv), positions added as fl_lon/fl_lat when the file had none in degrees.
 * @example datasetToCsv(dataset, { planeFormat: 'dipdir' }).split('\n')[0] // 'Stn,Type,...,fl_kind,fl_dip_direction,...'
 */
export function datasetToCsv(dataset: ProjectDataset, options: NormalisedOptions): string {
  return stationsToCsv(datasetTable(dataset), dataset.stations, { location: needsLocation(dataset), ...options });
}

/**
 * The dataset as GeoJSON text (stationsToGeoJson), one Point feature per station.
 * @example JSON.parse(datasetToGeoJson(dataset, { planeFormat: 'dipdir' })).features.length
 */
export function datasetToGeoJson(dataset: ProjectDataset, options: NormalisedOptions): string {
  return JSON.stringify(stationsToGeoJson(dataset.stations, options));
}
