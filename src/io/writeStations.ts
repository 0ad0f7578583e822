import Papa from 'papaparse';
import type { Feature, FeatureCollection, Point } from 'geojson';
import type { Station } from '../core/station';
import type { CsvTable } from './csvTable';
import { addedColumns, normalisedValues, type NormalisedOptions, type NormalisedValue } from './normalisedColumns';

/**
 * Writing stations back out: CSV with every original column and row kept and the normalised
 * columns of normalisedColumns.ts added, and GeoJSON (RFC 7946) for any map.
 */

/**
 * The table as CSV again: the original header and every row, each field exactly as read, with
 * the normalised columns after them. Blank rows are written as empty rows, so every row keeps
 * its number and messages about the input point at the same rows of the output. Fields beyond
 * the header (already reported as problems) go, as a JSON list, into `fl_extra_fields`.
 * The delimiter is the table's; lines end in "\n"; fields are quoted only when they must be
 * (RFC 4180 §2), including fields with leading or trailing spaces.
 * Cells a spreadsheet would take as a formula (starting =, +, -, @) are also written as read,
 * with no apostrophe: this file gives the user's own fields back, and a prefix would change
 * values such as negative coordinates and break the round trip. Foldlens never evaluates cell
 * text; open the file in a spreadsheet as text if its origin is not trusted. (The net's numbers
 * CSV, which Foldlens composes itself, does prefix such cells: net/exportNumbers.ts.)
 * @example
 * const table = readCsv('id,dd,dip\nA,120,40');
 * stationsToCsv(table, readStations(table, detectColumns(table.headers).mapping), { planeFormat: 'rhr' })
 * // 'id,dd,dip,fl_kind,fl_strike,fl_dip,fl_trend,fl_plunge,fl_problems\nA,120,40,plane,30,40,,,'
 */
export function stationsToCsv(table: CsvTable, stations: readonly Station[], options: NormalisedOptions): string {
  const added = addedColumns(table.headers, stations, options);
  const extraName = uniqueName('fl_extra_fields', [...table.headers, ...added.map((a) => a.name)]);
  const hasExtra = table.rows.some((r) => r.extra && r.extra.length > 0);
  const fields = [...table.headers, ...added.map((a) => a.name), ...(hasExtra ? [extraName] : [])];
  const byRow = new Map(stations.map((s) => [s.row, s]));
  const rowByNumber = new Map(table.rows.map((r) => [r.row, r]));
  const last = Math.max(0, ...table.rows.map((r) => r.row), ...table.blankRows);
  const data: string[][] = [];
  for (let n = 1; n <= last; n++) {
    const row = rowByNumber.get(n);
    if (!row) {
      data.push(fields.map(() => ''));
      continue;
    }
    const station = byRow.get(n);
    const values = station ? normalisedValues(station, options) : {};
    data.push([
      ...table.headers.map((h) => row.values[h] ?? ''),
      ...added.map((a) => asText(values[a.key])),
      ...(hasExtra ? [row.extra && row.extra.length > 0 ? JSON.stringify(row.extra) : ''] : []),
    ]);
  }
  return Papa.unparse({ fields, data }, { delimiter: table.delimiter, newline: '\n', quotes: false, escapeFormulae: false });
}

/**
 * Stations as a GeoJSON FeatureCollection (RFC 7946): a Point at each station's WGS84 position
 * (null geometry when it has none), properties holding every original field as read plus
 * `fl_id`, `fl_row` and the normalised columns (angles as numbers).
 * @example stationsToGeoJson(stations, { planeFormat: 'dipdir' }).features[0].properties.fl_dip_direction // 120
 */
export function stationsToGeoJson(stations: readonly Station[], options: NormalisedOptions): FeatureCollection<Point | null> {
  const existing = [...new Set(stations.flatMap((s) => Object.keys(s.source)))];
  const idName = uniqueName('fl_id', existing);
  const rowName = uniqueName('fl_row', [...existing, idName]);
  const added = addedColumns([...existing, idName, rowName], stations, { ...options, location: false });
  const features = stations.map((s): Feature<Point | null> => {
    const values = normalisedValues(s, options);
    const properties: Record<string, NormalisedValue> = Object.fromEntries([
      ...Object.entries(s.source),
      [idName, s.id],
      [rowName, s.row],
      ...added.map((a) => [a.name, values[a.key]] as const),
    ]);
    const geometry: Point | null =
      s.lon !== undefined && s.lat !== undefined ? { type: 'Point', coordinates: s.elevation !== undefined ? [s.lon, s.lat, s.elevation] : [s.lon, s.lat] } : null;
    return { type: 'Feature', geometry, properties };
  });
  return { type: 'FeatureCollection', features };
}

function asText(v: NormalisedValue | undefined): string {
  return v === null || v === undefined ? '' : String(v);
}

function uniqueName(base: string, taken: readonly string[]): string {
  let name = base;
  for (let i = 2; taken.includes(name); i++) name = `${base}_${i}`;
  return name;
}
