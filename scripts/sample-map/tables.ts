/**
 * The station tables: stations.csv (both coordinate systems, dip direction/dip and trend/plunge
 * columns plus a combined reading), the same rows as stations.json, and a quadrant-notation,
 * UTM-only spreadsheet export (stations-quadrant.csv). A few rows carry planted mistakes.
 */
import { compassPoint, csvLine, lineBearing, rhrStrike, strikeBearing, strikeDipQuadrant, trendPlunge } from './notation';
import { round6, utmToLonLat } from './crs';
import type { FieldReading } from './stations';
import type { Random } from './prng';

/**
 * Value of the dataset column of every row.
 * @example row.dataset === DATASET_LABEL
 */
export const DATASET_LABEL = 'SYNTHETIC demo (Korvane district)';

/**
 * Columns of stations.csv (and keys of stations.json), in order.
 * @example STATION_COLUMNS[0] // 'station_id'
 */
export const STATION_COLUMNS = [
  'station_id', 'kind', 'easting', 'northing', 'lon', 'lat', 'elevation_m', 'dip_direction', 'dip', 'trend', 'plunge',
  'sense', 'reading', 'unit', 'date', 'notes', 'dataset',
] as const;
export type StationRow = Record<(typeof STATION_COLUMNS)[number], string>;

/**
 * Columns of stations-quadrant.csv, in order.
 * @example QUADRANT_COLUMNS[5] // 'Strike'
 */
export const QUADRANT_COLUMNS = [
  'Stn', 'Type', 'E', 'N', 'Elev_m', 'Strike', 'Dip', 'DipQuad', 'Trend', 'Plunge', 'Sense', 'Date', 'Remarks', 'Dataset',
] as const;
export type QuadrantRow = Record<(typeof QUADRANT_COLUMNS)[number], string>;

/** The mistakes planted in the tables, one row each. */
export type DefectType = 'dip-out-of-range' | 'quadrant-contradicts-strike' | 'missing-kind' | 'non-numeric-dip' | 'coordinates-swapped';
/**
 * The planted mistakes, one row each, in the order they are assigned.
 * @example DEFECTS.length // 5
 */
export const DEFECTS: readonly DefectType[] = ['dip-out-of-range', 'quadrant-contradicts-strike', 'missing-kind', 'non-numeric-dip', 'coordinates-swapped'];

export interface PlantedDefect {
  readonly id: string;
  readonly defect: DefectType;
  readonly columns: readonly string[];
  readonly description: string;
}

const pad2 = (v: number): string => String(v).padStart(2, '0');
const pad3 = (v: number): string => String(v).padStart(3, '0');
const capitalise = (s: string): string => s.charAt(0).toUpperCase() + s.slice(1);

function cleanRow(r: FieldReading): StationRow {
  const [lon, lat] = utmToLonLat(r.easting, r.northing);
  return {
    station_id: r.id,
    kind: r.kind,
    easting: String(r.easting),
    northing: String(r.northing),
    lon: round6(lon).toFixed(6),
    lat: round6(lat).toFixed(6),
    elevation_m: String(r.elevation),
    dip_direction: r.plane ? pad3(r.plane.dipDirection) : '',
    dip: r.plane ? pad2(r.plane.dip) : '',
    trend: r.line ? pad3(r.line.trend) : '',
    plunge: r.line ? pad2(r.line.plunge) : '',
    sense: r.sense && r.sense !== 'unknown' ? r.sense : '',
    reading: r.plane ? strikeDipQuadrant(r.plane.dipDirection, r.plane.dip) : r.line ? trendPlunge(r.line.trend, r.line.plunge) : '',
    unit: r.unit,
    date: r.date,
    notes: r.notes,
    dataset: DATASET_LABEL,
  };
}

function cleanQuadrantRow(r: FieldReading): QuadrantRow {
  return {
    Stn: r.id,
    Type: capitalise(r.kind),
    E: String(r.easting),
    N: String(r.northing),
    Elev_m: String(r.elevation),
    Strike: r.plane ? strikeBearing(rhrStrike(r.plane.dipDirection)) : '',
    Dip: r.plane ? String(r.plane.dip) : '',
    DipQuad: r.plane ? compassPoint(r.plane.dipDirection) : '',
    Trend: r.line ? lineBearing(r.line.trend) : '',
    Plunge: r.line ? String(r.line.plunge) : '',
    Sense: r.sense && r.sense !== 'unknown' ? capitalise(r.sense) : '',
    Date: r.date,
    Remarks: r.notes,
    Dataset: DATASET_LABEL,
  };
}

/** Applies one planted mistake to both forms of a row; returns its description. */
function plant(defect: DefectType, r: FieldReading, row: StationRow, q: QuadrantRow): PlantedDefect {
  const plane = r.plane as { dipDirection: number; dip: number };
  const strike = rhrStrike(plane.dipDirection);
  switch (defect) {
    case 'dip-out-of-range':
      row.dip = '95';
      row.reading = `${pad3(strike)}/95${compassPoint(plane.dipDirection)}`;
      q.Dip = '95';
      return { id: r.id, defect, columns: ['dip', 'reading', 'Dip'], description: 'dip 95 is outside 0 to 90' };
    case 'quadrant-contradicts-strike': {
      // A strike on a compass point, with that same compass point given as the dip quadrant:
      // the dip quadrant lies along the strike, so it names neither side.
      const s45 = (Math.round(strike / 45) * 45) % 360;
      row.dip_direction = '';
      row.dip = '';
      row.reading = `${pad3(s45)}/${pad2(plane.dip)}${compassPoint(s45)}`;
      q.Strike = strikeBearing(s45);
      q.DipQuad = compassPoint(s45);
      return {
        id: r.id,
        defect,
        columns: ['reading', 'Strike', 'DipQuad'],
        description: `dip quadrant ${compassPoint(s45)} lies along strike ${pad3(s45)}; dip_direction and dip are empty in stations.csv`,
      };
    }
    case 'missing-kind':
      row.kind = '';
      q.Type = '';
      return { id: r.id, defect, columns: ['kind', 'Type'], description: 'measurement kind is empty' };
    case 'non-numeric-dip': {
      const typo = `${Math.floor(plane.dip / 10)}O`; // letter O typed for a zero
      row.dip = typo;
      row.reading = `${pad3(strike)}/${typo}${compassPoint(plane.dipDirection)}`;
      q.Dip = typo;
      return { id: r.id, defect, columns: ['dip', 'reading', 'Dip'], description: `dip "${typo}" is not a number (letter O for zero)` };
    }
    case 'coordinates-swapped':
      [row.easting, row.northing] = [row.northing, row.easting];
      [row.lon, row.lat] = [row.lat, row.lon];
      [q.E, q.N] = [q.N, q.E];
      return {
        id: r.id,
        defect,
        columns: ['easting', 'northing', 'lon', 'lat', 'E', 'N'],
        description: 'easting/northing and lon/lat swapped: the point falls far outside the district',
      };
  }
}

/**
 * Builds the table rows and plants one of each DEFECTS in distinct bedding rows picked at random.
 * @example makeTables(rnd, readings).planted.length // 5
 */
export function makeTables(rnd: Random, readings: readonly FieldReading[]): { rows: StationRow[]; quadrant: QuadrantRow[]; planted: PlantedDefect[] } {
  const rows = readings.map(cleanRow);
  const quadrant = readings.map(cleanQuadrantRow);
  const beddingIndices = readings.flatMap((r, i) => (r.kind === 'bedding' ? [i] : []));
  const chosen: number[] = [];
  while (chosen.length < DEFECTS.length) {
    const i = beddingIndices[rnd.int(beddingIndices.length)];
    if (!chosen.includes(i)) chosen.push(i);
  }
  const planted = DEFECTS.map((defect, k) => plant(defect, readings[chosen[k]], rows[chosen[k]], quadrant[chosen[k]]));
  planted.sort((a, b) => a.id.localeCompare(b.id));
  return { rows, quadrant, planted };
}

/**
 * CSV text with a header line, LF line ends, final newline.
 * @example toCsv(['a', 'b'], [{a: '1', b: 'x,y'}]) // 'a,b\n1,"x,y"\n'
 */
export function toCsv<K extends string>(columns: readonly K[], rows: readonly Record<K, string>[]): string {
  return [csvLine(columns), ...rows.map((r) => csvLine(columns.map((c) => r[c])))].join('\n') + '\n';
}
