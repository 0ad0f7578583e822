import type { Station } from '../../core/station';
import type { CsvRow } from '../../io/csvTable';
import { readStation, type StationReadOptions } from '../../io/readStations';
import type { CellEdit, ImportOptions, ProjectDataset } from '../../io/projectFile';
import { toReadOptions } from '../import/importOptions';

/**
 * Fixing a value in place: the row is read again, whole, by the same reader with the same
 * mapping and options as at import (readStation in io/readStations.ts), with the one cell
 * changed. Nothing else about the row is touched; the value first read is kept in the edit.
 */

const cache = new WeakMap<ImportOptions, StationReadOptions>();

/** The reader options of a dataset, resolved once per options object. */
function readOptionsOf(options: ImportOptions): StationReadOptions {
  let r = cache.get(options);
  if (!r) {
    r = toReadOptions(options);
    cache.set(options, r);
  }
  return r;
}

/**
 * The station at `index` read again with `column` set to `value`, and the edit that records it.
 * Throws a RangeError for an index or column the dataset does not have, and ImportOptionsError
 * if the dataset's options can no longer be resolved (a CRS this build does not know).
 * @example
 * const { station } = rereadRow(dataset, 31, 'Dip', '59');
 * station.problems // [] once the dip is a dip
 */
export function rereadRow(dataset: ProjectDataset, index: number, column: string, value: string, at = new Date()): { station: Station; edit: CellEdit } {
  const old = dataset.stations[index];
  if (!old) throw new RangeError(`no station ${index} in dataset "${dataset.name}" (0 to ${dataset.stations.length - 1})`);
  if (!dataset.table.headers.includes(column)) throw new RangeError(`"${column}" is not a column of dataset "${dataset.name}"`);
  const values: Record<string, string> = Object.fromEntries(Object.entries(old.source));
  values[column] = value;
  const extra = dataset.table.extras.find((x) => x.row === old.row)?.fields;
  const row: CsvRow = extra ? { row: old.row, values, extra } : { row: old.row, values };
  let mapping = dataset.mapping;
  let given;
  if (dataset.table.format === 'geojson') {
    // As at import (io/readGeoJson.ts): the geometry gives the location, coordinate properties are not read.
    const { lon: _lon, lat: _lat, x: _x, y: _y, ...rest } = mapping;
    mapping = rest;
    given = dataset.table.locations?.[index] ?? {};
  }
  const station = readStation(row, mapping, readOptionsOf(dataset.options), given);
  return { station, edit: { row: old.row, column, from: old.source[column] ?? '', to: value, at: at.toISOString() } };
}
