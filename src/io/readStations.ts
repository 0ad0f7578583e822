import { isLineKind, isPlaneKind, type FoldSense, type Line, type MeasurementKind, type PlaneMeasurement } from '../core/types';
import type { AzimuthCorrection, RowProblem, Station } from '../core/station';
import {
  NotationError,
  inSector,
  isCompassPoint,
  parseAzimuth,
  parseDip,
  parseLine,
  parseOverturnedFlag,
  parsePlane,
  parsePlunge,
  parseRake,
  planeFromStrikeDip,
  type LineNotation,
  type PlaneNotation,
} from '../core/notation';
import { lineFromRake } from '../core/rake';
import { azimuthDifference } from '../core/math';
import type { ColumnMapping, Field } from './columns';
import type { CsvRow, CsvTable } from './csvTable';
import { normalizeKind } from './kinds';
import { flagSwappedCoordinates } from './swappedCoordinates';
import { CrsError, describeArea, inArea, lonLatProblem, toLonLat, type Crs } from './crs';
import { DeclinationError, WMM_SPAN, convergenceCorrection, correctAzimuth, magneticCorrection, parseIsoDate, userDeclination } from './declination';

/**
 * Turning table rows into Stations. Every row becomes a Station; a row that cannot be used
 * keeps every original field in `source` and says why in `problems` (row, column, value as
 * written, and what was expected). Nothing is guessed: an unknown kind word, a strike with a
 * dip quadrant that lies along it, a dip of 95 or a point outside the CRS are problems.
 *
 * What the reader takes from each row (columns as in columns.ts):
 * - kind: from the kind column (words normalised by kinds.ts); without one, `defaultKind`,
 *   else `plane` when only plane columns are filled and `line` when only line columns are;
 * - a plane: dip direction + dip, or strike + dip (+ dip quadrant; without one the strike
 *   follows the right-hand rule, common practice), or the attitude column read in
 *   `planeNotation`; an overturned column sets the flag;
 * - a line: trend + plunge, or the attitude column read in `lineNotation`; or a rake in a plane;
 * - a location: lon/lat columns (WGS84 degrees), else x/y columns in `crs`;
 * - corrections to true north, by `north`: none, magnetic declination (WMM at the row's date,
 *   or a declination typed by the user), or grid convergence of `crs`.
 */

/** Options for reading stations. */
export interface StationReadOptions {
  /** Notation of plane values in the attitude column; default `auto` (only forms that name their dip side). */
  readonly planeNotation?: PlaneNotation;
  /** Notation of line values in the attitude column; default `auto`. */
  readonly lineNotation?: LineNotation;
  /** CRS of x/y columns. */
  readonly crs?: Crs;
  /** Widening of the CRS area of use, degrees (default 1; see crs.ts `inArea`). */
  readonly areaMarginDegrees?: number;
  /** North the azimuths were read against; default `true` (no correction). */
  readonly north?: 'true' | 'magnetic' | 'grid';
  /** For magnetic north: `wmm` (default) for the World Magnetic Model, or degrees east typed by the user. */
  readonly declination?: 'wmm' | number;
  /** Date for the magnetic model when a row has no date of its own. */
  readonly date?: Date;
  /** Kind of every row when there is no kind column. */
  readonly defaultKind?: MeasurementKind;
}

/** A location found outside the row (a GeoJSON geometry), with the name to use in messages. */
export interface GivenLocation {
  readonly lon?: number;
  readonly lat?: number;
  readonly elevation?: number;
  readonly problems?: readonly RowProblem[];
}

/**
 * Reads every data row of a table into a Station (blank rows are not stations; they keep their
 * numbers, see csvTable.ts).
 * @example
 * const table = readCsv('id,kind,dipdir,dip\nA1,bedding,120,40');
 * readStations(table, detectColumns(table.headers).mapping)[0].plane // {dipDirection: 120, dip: 40}
 */
export function readStations(table: CsvTable, mapping: ColumnMapping, options: StationReadOptions = {}): Station[] {
  return flagSwappedCoordinates(table.rows.map((row) => readStation(row, mapping, options)));
}

/**
 * Reads one row into a Station; `given` supplies a location found elsewhere (GeoJSON geometry),
 * which then takes the place of coordinate columns.
 * @example readStation({ row: 1, values: { dip: '40', dipdir: '120' } }, { dip: 'dip', dipDirection: 'dipdir' }).plane
 */
export function readStation(row: CsvRow, mapping: ColumnMapping, options: StationReadOptions = {}, given?: GivenLocation): Station {
  const r = new RowReader(row, mapping);
  if (row.extra && row.extra.length > 0) {
    r.problem('(beyond the last column)', row.extra.join(' | '), 'no more fields than the header has columns (quote fields that contain the delimiter)');
  }
  const idText = r.text('id').trim();
  const id = idText !== '' ? idText : `row-${row.row}`;
  const kind = readKind(r, options);
  const found = given ?? readLocation(r, options);
  for (const p of found.problems ?? []) r.problems.push(p);
  // An elevation column wins over a height that came with the location (a GeoJSON third coordinate).
  const elevation = readElevation(r) ?? found.elevation;
  const location: GivenLocation = { lon: found.lon, lat: found.lat, elevation };

  let plane: PlaneMeasurement | undefined;
  let line: (Line & { sense?: FoldSense }) | undefined;
  if (kind !== undefined) {
    const needsPlane = isPlaneKind(kind) || (isLineKind(kind) && r.has('rake'));
    plane = needsPlane ? readPlane(r, options, isLineKind(kind)) : undefined;
    // A row with problems is not used, so no correction is worked out (or complained about) for it.
    const corrections = r.problems.length === 0 ? readCorrections(r, options, location) : [];
    if (plane && corrections.length > 0) plane = { ...plane, dipDirection: correctAzimuth(plane.dipDirection, corrections) };
    // A rake is measured within the plane, so a line from a rake needs no correction of its own.
    if (isLineKind(kind)) line = r.has('rake') ? lineFromRakeOf(r, plane) : readLine(r, options, corrections);
    else if (r.has('rake') && plane) line = lineFromRakeOf(r, plane);
    if (line && isLineKind(kind) && r.has('sense')) line = withSense(r, line);
    return finish(row, id, kind, location, elevation, plane, line, corrections, r);
  }
  return finish(row, id, undefined, location, elevation, undefined, undefined, [], r);
}

function finish(
  row: CsvRow,
  id: string,
  kind: MeasurementKind | undefined,
  location: GivenLocation,
  elevation: number | undefined,
  plane: PlaneMeasurement | undefined,
  line: (Line & { sense?: FoldSense }) | undefined,
  corrections: readonly AzimuthCorrection[],
  r: RowReader,
): Station {
  const ok = r.problems.length === 0;
  return {
    id,
    row: row.row,
    ...(kind !== undefined && { kind }),
    ...(location.lon !== undefined && location.lat !== undefined && { lon: location.lon, lat: location.lat }),
    ...(elevation !== undefined && { elevation }),
    // A station with problems carries no attitude: half-read numbers must not reach an analysis.
    ...(ok && plane && { plane }),
    ...(ok && line && { line }),
    ...(ok && corrections.length > 0 && { corrections }),
    source: row.values,
    problems: r.problems,
  };
}

/** Access to the mapped fields of one row, collecting problems. */
class RowReader {
  readonly problems: RowProblem[] = [];
  constructor(
    readonly row: CsvRow,
    readonly mapping: ColumnMapping,
  ) {}
  column(field: Field): string {
    return this.mapping[field] ?? field;
  }
  mapped(field: Field): boolean {
    return this.mapping[field] !== undefined;
  }
  text(field: Field): string {
    const c = this.mapping[field];
    return c === undefined ? '' : (this.row.values[c] ?? '');
  }
  has(field: Field): boolean {
    return this.text(field).trim() !== '';
  }
  problem(column: string, value: string, expected: string): void {
    this.problems.push({ row: this.row.row, column, value, expected });
  }
  /** Runs a notation parser; a NotationError becomes a problem on `field`'s column. */
  read<T>(field: Field, f: () => T, composite = false): T | undefined {
    try {
      return f();
    } catch (e) {
      if (e instanceof NotationError || e instanceof RangeError) {
        const expected = e instanceof NotationError ? (composite ? `${e.expected} (${e.problem})` : e.expected) : e.message;
        this.problem(this.column(field), this.text(field), expected);
        return undefined;
      }
      throw e;
    }
  }
  missing(field: Field, expected: string): void {
    this.problem(this.column(field), this.text(field), expected);
  }
}

const KIND_EXPECTED = 'a kind such as bedding, foliation, cleavage, joint, fault, vein, axial plane, contact, lineation, hinge, intersection, slickenline';

function readKind(r: RowReader, options: StationReadOptions): MeasurementKind | undefined {
  if (r.mapped('kind')) {
    const text = r.text('kind');
    if (text.trim() === '') {
      r.missing('kind', `${KIND_EXPECTED} (the kind is missing)`);
      return undefined;
    }
    const kind = normalizeKind(text);
    if (kind === undefined) r.missing('kind', KIND_EXPECTED);
    return kind;
  }
  if (options.defaultKind !== undefined) return options.defaultKind;
  const planeFilled = r.has('dipDirection') || r.has('strike') || r.has('dip') || r.has('dipQuadrant');
  const lineFilled = r.has('trend') || r.has('plunge');
  if (planeFilled && !lineFilled) return 'plane';
  if (lineFilled && !planeFilled) return 'line';
  const expected = planeFilled
    ? 'a kind column saying whether the row is a plane or a line (it has both plane and line values)'
    : r.has('attitude')
      ? 'a kind column or a default kind saying whether the attitude is a plane or a line'
      : 'a measurement: dip direction and dip, strike and dip, trend and plunge, or an attitude';
  r.problem('kind', '', expected);
  return undefined;
}

function readPlane(r: RowReader, options: StationReadOptions, forRake: boolean): PlaneMeasurement | undefined {
  let plane: PlaneMeasurement | undefined;
  if (r.has('dipDirection')) {
    const dd = r.read('dipDirection', () => parseAzimuth(r.text('dipDirection'), 'dip direction'));
    const dip = readDip(r);
    if (dd === undefined || dip === undefined) return undefined;
    plane = { dipDirection: dd, dip };
    if (r.has('strike')) checkStrikeAgainst(r, dd);
    if (r.has('dipQuadrant')) checkQuadrantAgainst(r, dd);
  } else if (r.has('strike')) {
    const strike = r.read('strike', () => parseAzimuth(r.text('strike'), 'strike'));
    const dip = readDip(r);
    if (strike === undefined || dip === undefined) return undefined;
    const field: Field = r.has('dipQuadrant') ? 'dipQuadrant' : 'strike';
    plane = r.read(field, () => planeFromStrikeDip(strike, dip, r.has('dipQuadrant') ? r.text('dipQuadrant') : undefined));
  } else if (r.has('attitude')) {
    plane = r.read('attitude', () => parsePlane(r.text('attitude'), options.planeNotation ?? 'auto'), true);
  } else {
    const expected = forRake
      ? 'the plane the rake is measured in: dip direction and dip, or strike and dip'
      : 'a plane: dip direction and dip, strike and dip, or an attitude such as 030/45SE';
    r.problem(r.mapped('dip') ? r.column('dip') : r.mapped('attitude') ? r.column('attitude') : 'dip', '', expected);
    return undefined;
  }
  if (plane && r.has('overturned')) {
    const flag = r.read('overturned', () => parseOverturnedFlag(r.text('overturned')));
    if (flag === undefined) return undefined;
    if (flag && !plane.overturned) plane = { ...plane, overturned: true };
  }
  return plane;
}

function readDip(r: RowReader): number | undefined {
  if (!r.has('dip')) {
    r.missing('dip', 'a dip from 0 to 90 (the dip is missing)');
    return undefined;
  }
  return r.read('dip', () => parseDip(r.text('dip')));
}

/** A strike written beside a dip direction must lie across it (either hand: common practice). */
function checkStrikeAgainst(r: RowReader, dipDirection: number): void {
  const strike = r.read('strike', () => parseAzimuth(r.text('strike'), 'strike'));
  if (strike === undefined) return;
  if (Math.abs(azimuthDifference(strike, dipDirection) - 90) > 1) {
    r.missing('strike', `a strike at right angles to dip direction ${r.text('dipDirection').trim()} (within 1°), or an empty strike`);
  }
}

function checkQuadrantAgainst(r: RowReader, dipDirection: number): void {
  const letters = r.text('dipQuadrant').trim().toUpperCase();
  if (!isCompassPoint(letters)) {
    r.missing('dipQuadrant', 'a dip quadrant of one or two compass letters: N, NE, E, SE, S, SW, W or NW');
  } else if (!inSector(dipDirection, letters)) {
    r.missing('dipQuadrant', `a dip quadrant that holds dip direction ${r.text('dipDirection').trim()}`);
  }
}

function readLine(r: RowReader, options: StationReadOptions, corrections: readonly AzimuthCorrection[]): Line | undefined {
  let line: Line | undefined;
  if (r.has('trend') || r.has('plunge')) {
    if (!r.has('trend')) {
      r.missing('trend', 'a trend from 0 to less than 360 (the trend is missing)');
      return undefined;
    }
    if (!r.has('plunge')) {
      r.missing('plunge', 'a plunge from 0 to 90 (the plunge is missing)');
      return undefined;
    }
    const trend = r.read('trend', () => parseAzimuth(r.text('trend'), 'trend'));
    const plunge = r.read('plunge', () => parsePlunge(r.text('plunge')));
    if (trend === undefined || plunge === undefined) return undefined;
    line = { trend, plunge };
  } else if (r.has('attitude')) {
    line = r.read('attitude', () => parseLine(r.text('attitude'), options.lineNotation ?? 'auto'), true);
  } else {
    r.problem(r.mapped('trend') ? r.column('trend') : r.mapped('attitude') ? r.column('attitude') : 'trend', '', 'a line: trend and plunge, or an attitude such as 125/20');
    return undefined;
  }
  return line && corrections.length > 0 ? { ...line, trend: correctAzimuth(line.trend, corrections) } : line;
}

function lineFromRakeOf(r: RowReader, plane: PlaneMeasurement | undefined): Line | undefined {
  const rake = r.read('rake', () => parseRake(r.text('rake')), true);
  if (rake === undefined || plane === undefined) return undefined;
  return r.read('rake', () => lineFromRake(plane, rake.angle, rake.from), true);
}

const SENSES: Readonly<Record<string, FoldSense>> = { antiform: 'antiform', synform: 'synform', unknown: 'unknown', '': 'unknown' };

function withSense(r: RowReader, line: Line): Line & { sense?: FoldSense } {
  const sense = SENSES[r.text('sense').trim().toLowerCase()];
  if (sense === undefined) {
    r.missing('sense', 'a fold sense: antiform, synform or unknown');
    return line;
  }
  return { ...line, sense };
}

const NUMBER = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/;

/**
 * A number as written in a cell (decimal point, optional exponent), or undefined.
 * Decimal commas are not read: "45,3" could be one number or two. A number too large for a
 * double ("1e400") is not read either: it would be Infinity.
 * @example parseNumberCell(' 512034.5 ') // 512034.5
 */
export function parseNumberCell(text: string): number | undefined {
  const t = text.trim();
  const n = NUMBER.test(t) ? Number(t) : Number.NaN;
  return Number.isFinite(n) ? n : undefined;
}

function readElevation(r: RowReader): number | undefined {
  if (!r.has('elevation')) return undefined;
  const elevation = parseNumberCell(r.text('elevation'));
  if (elevation === undefined) r.missing('elevation', 'an elevation in metres, a number with a decimal point');
  return elevation;
}

function readLocation(r: RowReader, options: StationReadOptions): GivenLocation {
  const problems: RowProblem[] = [];
  const at = (field: Field, expected: string): void => {
    problems.push({ row: r.row.row, column: r.column(field), value: r.text(field), expected });
  };
  const pair = (a: Field, b: Field): { a?: number; b?: number; filled: boolean } | undefined => {
    if (!r.mapped(a) && !r.mapped(b)) return undefined;
    const filled = r.has(a) || r.has(b);
    if (!filled) return { filled };
    let ok = true;
    const read = (f: Field): number | undefined => {
      const v = parseNumberCell(r.text(f));
      if (v === undefined) {
        ok = false;
        at(f, r.has(f) ? 'a number with a decimal point' : 'a number (the other coordinate is given)');
      }
      return v;
    };
    const va = read(a);
    const vb = read(b);
    return ok ? { a: va, b: vb, filled } : { filled };
  };

  const ll = pair('lon', 'lat');
  if (ll) {
    if (!ll.filled || ll.a === undefined || ll.b === undefined) return { problems };
    const why = lonLatProblem(ll.a, ll.b);
    if (why) {
      at(why.startsWith('a longitude') ? 'lon' : 'lat', why);
      return { problems };
    }
    return { lon: ll.a, lat: ll.b, problems };
  }
  const xy = pair('x', 'y');
  if (!xy || !xy.filled || xy.a === undefined || xy.b === undefined) return { problems };
  const crs = options.crs;
  if (!crs) {
    at('x', 'a coordinate reference system for the x/y columns (give the CRS, e.g. EPSG:32633)');
    return { problems };
  }
  const x = xy.a;
  const y = xy.b;
  if (crs.geographic) {
    const why = lonLatProblem(x, y);
    if (why) {
      at(why.startsWith('a longitude') ? 'x' : 'y', `${why} (x is longitude, y latitude in ${crs.code})`);
      return { problems };
    }
  }
  const margin = options.areaMarginDegrees ?? 1;
  const convert = (px: number, py: number): { lon: number; lat: number } | undefined => {
    try {
      const p = toLonLat(px, py, crs);
      return Math.abs(p.lat) <= 90 && Math.abs(p.lon) <= 540 ? p : undefined;
    } catch (e) {
      if (e instanceof CrsError) return undefined;
      throw e;
    }
  };
  const p = convert(x, y);
  if (p && inArea(p.lon, p.lat, crs, margin)) return { lon: p.lon, lat: p.lat, problems };
  const swapped = convert(y, x);
  const area = crs.area ? ` (${describeArea(crs.area)})` : '';
  if (swapped && inArea(swapped.lon, swapped.lat, crs, margin) && crs.area) {
    at('x', `an easting here: x and y look swapped (taken the other way round, the point lies inside ${crs.code}${area})`);
  } else {
    at('x', `a point inside the area of use of ${crs.code}${area}`);
  }
  return { problems };
}

function readCorrections(r: RowReader, options: StationReadOptions, location: GivenLocation): AzimuthCorrection[] {
  const north = options.north ?? 'true';
  if (north === 'true') return [];
  if (north === 'grid') {
    const crs = options.crs;
    if (!crs || crs.geographic) {
      r.problem('north', 'grid', 'a projected CRS for azimuths read against grid north');
      return [];
    }
    if (location.lon === undefined || location.lat === undefined) {
      r.problem(r.mapped('x') ? r.column('x') : 'x', r.text('x'), 'a location, needed for the grid convergence');
      return [];
    }
    return [convergenceCorrection(location.lon, location.lat, crs)];
  }
  const declination = options.declination ?? 'wmm';
  if (typeof declination === 'number') {
    try {
      return [userDeclination(declination)];
    } catch (e) {
      if (e instanceof DeclinationError) {
        r.problem('declination', String(declination), e.message);
        return [];
      }
      throw e;
    }
  }
  if (location.lon === undefined || location.lat === undefined) {
    const field: Field = r.mapped('lat') ? 'lat' : r.mapped('y') ? 'y' : 'lat';
    r.problem(r.column(field), r.text(field), 'a location, needed for the magnetic declination');
    return [];
  }
  let date = options.date;
  if (r.has('date')) {
    date = parseIsoDate(r.text('date'));
    if (date === undefined) {
      r.missing('date', 'a date written as YYYY-MM-DD (ISO 8601), needed for the magnetic declination');
      return [];
    }
  }
  const dateColumn = r.mapped('date') ? r.column('date') : 'date';
  if (date === undefined) {
    r.problem(dateColumn, '', 'a date for the magnetic declination (a date column or a default date)');
    return [];
  }
  if (date < WMM_SPAN.start || date > WMM_SPAN.end) {
    r.problem(
      dateColumn,
      r.has('date') ? r.text('date') : date.toISOString().slice(0, 10),
      `a date from ${WMM_SPAN.start.toISOString().slice(0, 10)} to ${WMM_SPAN.end.toISOString().slice(0, 10)}, the span of the World Magnetic Models here (or give the declination yourself)`,
    );
    return [];
  }
  try {
    return [magneticCorrection(location.lat, location.lon, (location.elevation ?? 0) / 1000, date)];
  } catch (e) {
    if (e instanceof DeclinationError) {
      r.problem(dateColumn, r.text('date'), `a place and date the World Magnetic Model covers (${e.message})`);
      return [];
    }
    throw e;
  }
}
