import type { Station } from '../core/station';
import { isPlaneKind, LINE_KINDS, PLANE_KINDS, type MeasurementKind } from '../core/types';
import { detectPlaneNotation, LINE_NOTATIONS, PLANE_NOTATIONS, type LineNotation, type PlaneNotation } from '../core/notation';
import { CsvError, decodeText, readCsv, type CsvTable } from '../io/csvTable';
import { detectColumns, FIELDS, parseColumnMapping, type ColumnDetection, type ColumnMapping, type Field } from '../io/columns';
import { normalizeKind } from '../io/kinds';
import { CrsError, resolveCrs, type Crs, type EpsgLoader } from '../io/crs';
import { parseIsoDate } from '../io/declination';
import { readStations, type StationReadOptions } from '../io/readStations';
import { GeoJsonError, readGeoJsonStations } from '../io/readGeoJson';
import { UsageError, type OptionSpec, type ParsedArgs } from './args';

/** What the command line needs from its surroundings; tests pass their own. */
export interface CliIo {
  readonly stdout: { write(text: string): unknown };
  readonly stderr: { write(text: string): unknown };
  readFile(path: string): Promise<Uint8Array | string>;
  writeFile(path: string, text: string): Promise<void>;
  /** EPSG definitions for codes not built in (the command line passes the epsg-index reader). */
  readonly epsg?: EpsgLoader;
}

/** `--dip-direction-column` for `dipDirection`, and so on. */
export const columnOption = (field: Field): string => `${field.replace(/[A-Z]/g, (c) => `-${c.toLowerCase()}`)}-column`;

const FIELD_WORDS: Readonly<Record<Field, string>> = {
  id: 'the station id',
  kind: 'the measurement kind',
  dipDirection: 'the dip direction',
  dip: 'the dip',
  strike: 'the strike',
  dipQuadrant: 'the dip quadrant',
  trend: 'the trend',
  plunge: 'the plunge',
  rake: 'the rake',
  attitude: 'a whole attitude (e.g. 030/45SE)',
  x: 'x (easting)',
  y: 'y (northing)',
  lon: 'the longitude',
  lat: 'the latitude',
  elevation: 'the elevation in metres',
  date: 'the date (YYYY-MM-DD)',
  notes: 'notes',
  overturned: 'an overturned flag',
  sense: 'the fold sense',
};

/** Options every command that reads stations accepts. */
export const INPUT_OPTIONS: readonly OptionSpec[] = [
  { name: 'delimiter', value: 'char', help: 'CSV field delimiter: a character, or comma, tab, semicolon, pipe (default: detect)' },
  { name: 'notation', value: 'name', help: `notation of planes in an attitude column: ${PLANE_NOTATIONS.join(', ')} (default auto)` },
  { name: 'line-notation', value: 'name', help: `notation of lines in an attitude column: ${LINE_NOTATIONS.join(', ')} (default auto)` },
  { name: 'kind', value: 'kind', help: 'kind of every row when the file has no kind column (bedding, hinge, ...)' },
  { name: 'crs', value: 'crs', help: 'CRS of x/y columns: EPSG:<code>, "UTM 33N", a built-in name, or a proj4 definition' },
  { name: 'north', value: 'ref', help: 'north the azimuths were read against: true, magnetic or grid (default true)' },
  { name: 'declination', value: 'deg|wmm', help: 'magnetic declination in degrees east, or wmm for the World Magnetic Model (implies --north magnetic)' },
  { name: 'date', value: 'YYYY-MM-DD', help: 'date for the magnetic model where a row has no date' },
  { name: 'columns', value: 'file.json', help: 'a saved column mapping such as {"dip": "Dip"}' },
  { name: 'save-columns', value: 'file.json', help: 'write the column mapping used, to reuse with --columns' },
  ...FIELDS.map((f): OptionSpec => ({ name: columnOption(f), value: 'name', help: `the column holding ${FIELD_WORDS[f]}` })),
];


/** Stations read from one file, with what the user should be told about the reading. */
export interface LoadedInput {
  readonly format: 'csv' | 'geojson';
  readonly table?: CsvTable;
  readonly mapping: ColumnMapping;
  readonly stations: readonly Station[];
  readonly crs?: Crs;
  /** Sentences for stderr: notes from the reader and the CRS. */
  readonly notes: readonly string[];
}

/** Whether a path names a GeoJSON file. */
export const isGeoJsonPath = (path: string): boolean => /\.(geo)?json$/i.test(path);

/**
 * Reads a file as text, turning file-system errors into {@link UsageError}s that name the file.
 * @example await readText('field.csv', io)
 */
export async function readText(path: string, io: CliIo): Promise<string> {
  let content: Uint8Array | string;
  try {
    content = await io.readFile(path);
  } catch (e) {
    const code = (e as { code?: string }).code;
    const why = code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'it is a folder' : code === 'EACCES' ? 'permission denied' : (e as Error).message;
    throw new UsageError(`cannot read ${path}: ${why}`);
  }
  try {
    return typeof content === 'string' ? content : decodeText(content);
  } catch (e) {
    if (e instanceof CsvError) throw new UsageError(`${path}: ${e.message}`);
    throw e;
  }
}

/**
 * Reads stations from a CSV or GeoJSON file with the input options of the command line.
 * Throws {@link UsageError} for anything that stops the whole file being read.
 * @example const input = await loadInput('field.csv', parsed, io);
 */
export async function loadInput(path: string, args: ParsedArgs, io: CliIo): Promise<LoadedInput> {
  const o = args.options;
  const notes: string[] = [];
  const readOptions = await readOptionsFrom(o, io, notes);
  const overrides = await overridesFrom(o, io);
  const text = await readText(path, io);

  if (isGeoJsonPath(path)) {
    if (o.delimiter !== undefined) throw new UsageError('--delimiter applies to CSV files, not GeoJSON');
    let read;
    try {
      read = readGeoJsonStations(text, readOptions, overrides);
    } catch (e) {
      if (e instanceof GeoJsonError) throw new UsageError(`${path}: ${e.message}`);
      throw e;
    }
    checkDetection(read.detection);
    await saveColumns(o, read.detection.mapping, io);
    return { format: 'geojson', mapping: read.detection.mapping, stations: read.stations, crs: readOptions.crs, notes };
  }

  let table: CsvTable;
  try {
    table = readCsv(text, o.delimiter !== undefined ? { delimiter: o.delimiter } : {});
  } catch (e) {
    if (e instanceof CsvError) throw new UsageError(`${path}: ${e.message}`);
    throw e;
  }
  notes.push(...table.notes);
  const detection = detectColumns(table.headers, overrides);
  checkDetection(detection);
  const mapping = detection.mapping;
  checkUsableMapping(mapping, readOptions);
  checkNotation(table, mapping, readOptions);
  await saveColumns(o, mapping, io);
  return { format: 'csv', table, mapping, stations: readStations(table, mapping, readOptions), crs: readOptions.crs, notes };
}

async function readOptionsFrom(o: Readonly<Record<string, string>>, io: CliIo, notes: string[]): Promise<StationReadOptions> {
  const planeNotation = o.notation;
  if (planeNotation !== undefined && !(PLANE_NOTATIONS as readonly string[]).includes(planeNotation)) {
    throw new UsageError(`--notation ${planeNotation}: expected one of ${PLANE_NOTATIONS.join(', ')}`);
  }
  const lineNotation = o['line-notation'];
  if (lineNotation !== undefined && !(LINE_NOTATIONS as readonly string[]).includes(lineNotation)) {
    throw new UsageError(`--line-notation ${lineNotation}: expected one of ${LINE_NOTATIONS.join(', ')}`);
  }
  let defaultKind: MeasurementKind | undefined;
  if (o.kind !== undefined) {
    defaultKind = normalizeKind(o.kind);
    if (defaultKind === undefined) throw new UsageError(`--kind ${o.kind}: expected a kind such as ${[...PLANE_KINDS, ...LINE_KINDS].join(', ')}`);
  }
  let crs: Crs | undefined;
  if (o.crs !== undefined) {
    try {
      crs = await resolveCrs(o.crs, io.epsg);
    } catch (e) {
      if (e instanceof CrsError) throw new UsageError(`--crs: ${e.message}`);
      throw e;
    }
    notes.push(...crs.notes.map((n) => `${crs!.code}: ${n}`));
  }
  let north = o.north;
  if (north !== undefined && !['true', 'magnetic', 'grid'].includes(north)) throw new UsageError(`--north ${north}: expected true, magnetic or grid`);
  let declination: 'wmm' | number | undefined;
  if (o.declination !== undefined) {
    if (north !== undefined && north !== 'magnetic') throw new UsageError(`--declination goes with --north magnetic, not --north ${north}`);
    north = 'magnetic';
    if (o.declination.toLowerCase() === 'wmm') declination = 'wmm';
    else {
      const d = Number(o.declination);
      if (o.declination.trim() === '' || !Number.isFinite(d) || Math.abs(d) > 180) {
        throw new UsageError(`--declination ${o.declination}: expected degrees east from -180 to 180 (west negative), or wmm`);
      }
      declination = d;
    }
  }
  if (north === 'grid' && (!crs || crs.geographic)) throw new UsageError('--north grid needs --crs naming the projected grid the azimuths were read against');
  let date: Date | undefined;
  if (o.date !== undefined) {
    date = parseIsoDate(o.date);
    if (!date) throw new UsageError(`--date ${o.date}: expected a date written YYYY-MM-DD`);
  }
  return {
    ...(planeNotation !== undefined && { planeNotation: planeNotation as PlaneNotation }),
    ...(lineNotation !== undefined && { lineNotation: lineNotation as LineNotation }),
    ...(defaultKind !== undefined && { defaultKind }),
    ...(crs !== undefined && { crs }),
    ...(north !== undefined && { north: north as 'true' | 'magnetic' | 'grid' }),
    ...(declination !== undefined && { declination }),
    ...(date !== undefined && { date }),
  };
}

async function overridesFrom(o: Readonly<Record<string, string>>, io: CliIo): Promise<Record<string, string>> {
  let saved: ColumnMapping = {};
  if (o.columns !== undefined) {
    const text = await readText(o.columns, io);
    try {
      saved = parseColumnMapping(JSON.parse(text));
    } catch (e) {
      throw new UsageError(`--columns ${o.columns}: ${(e as Error).message}`);
    }
  }
  const overrides: Record<string, string> = { ...saved };
  for (const f of FIELDS) {
    const v = o[columnOption(f)];
    if (v !== undefined) overrides[f] = v;
  }
  return overrides;
}

function checkDetection(d: ColumnDetection): void {
  if (d.issues.length === 0) return;
  const lines = d.issues.map((i) => {
    const fields = i.field.split(' or ').filter((f): f is Field => (FIELDS as readonly string[]).includes(f));
    const hint = fields.length > 0 ? ` (${fields.map((f) => `--${columnOption(f)}`).join(' or ')})` : '';
    return `${i.message}${hint}`;
  });
  throw new UsageError(`the columns could not be settled:\n  ${lines.join('\n  ')}`);
}

function checkUsableMapping(m: ColumnMapping, options: StationReadOptions): void {
  const attitude = m.dipDirection || m.strike || m.attitude || m.trend || m.dip || m.plunge;
  if (!attitude) {
    throw new UsageError(
      'no column holds an attitude: expected columns such as dip direction and dip, strike and dip, trend and plunge, or an attitude column (name them with --dip-column etc.)',
    );
  }
  if ((m.x || m.y) && !(m.lon || m.lat) && !options.crs) {
    throw new UsageError(`columns ${[m.x, m.y].filter(Boolean).map((c) => `"${c}"`).join(' and ')} hold map coordinates: give their CRS with --crs (e.g. --crs EPSG:32633)`);
  }
}

/** Bare values such as 120/45 in an attitude column cannot be read without a named notation: say so once. */
function checkNotation(table: CsvTable, m: ColumnMapping, options: StationReadOptions): void {
  if (!m.attitude || (options.planeNotation ?? 'auto') !== 'auto') return;
  const planar = (values: Readonly<Record<string, string>>): boolean => {
    if (!m.kind) return options.defaultKind !== undefined && isPlaneKind(options.defaultKind);
    const k = normalizeKind(values[m.kind] ?? '');
    return k !== undefined && isPlaneKind(k);
  };
  const samples = table.rows.filter((r) => planar(r.values)).map((r) => r.values[m.attitude!] ?? '');
  const report = detectPlaneNotation(samples);
  if (report.status === 'needs-naming') {
    throw new UsageError(`column "${m.attitude}": ${report.message}: give --notation dipdir or --notation rhr`);
  }
}

async function saveColumns(o: Readonly<Record<string, string>>, mapping: ColumnMapping, io: CliIo): Promise<void> {
  if (o['save-columns'] === undefined) return;
  try {
    await io.writeFile(o['save-columns'], `${JSON.stringify(mapping, null, 2)}\n`);
  } catch (e) {
    throw new UsageError(`cannot write ${o['save-columns']}: ${(e as Error).message}`);
  }
}
