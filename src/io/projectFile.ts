import { LINE_KINDS, PLANE_KINDS, type MeasurementKind } from '../core/types';
import type { AzimuthCorrection, RowProblem, Station } from '../core/station';
import { LINE_NOTATIONS, PLANE_NOTATIONS, type LineNotation, type PlaneNotation } from '../core/notation';
import { parseColumnMapping, type ColumnMapping } from './columns';
import { parseIsoDate } from './declination';
import type { GivenLocation } from './readStations';

/**
 * The Foldlens project file: one JSON document, `"format": "foldlens-project"`, `"version": 1`,
 * holding everything needed to pick the work up again: the stations of every imported file
 * (each with its original fields, problems and azimuth corrections), how the file was read
 * (column mapping and options), the cell edits made since, named selections, map domains, and
 * the lines drawn on the map (traces to project, the last section line with its swath).
 * docs/project-format.md describes every field; this module is its reference implementation.
 *
 * Reading checks the whole document and throws {@link ProjectFileError} naming the path of the
 * first bad field ("datasets[0].stations[12].plane.dip: expected ..."). A file written by a newer
 * format version is refused with a message saying so, never half-read. Unknown fields are refused
 * too (they are typos or newer features), except inside domains, which are opaque for now.
 * Writing then reading gives back an equal object: nothing is rounded, renamed or dropped.
 */

/** The `format` value of every project file. */
export const PROJECT_FORMAT = 'foldlens-project';
/** The format version this module writes, and the newest it reads. */
export const PROJECT_VERSION = 1;

/** How a file was read, as stored: plain JSON, unlike StationReadOptions (which holds a resolved CRS and a Date). */
export interface ImportOptions {
  /** Notation of planes in an attitude column. */
  readonly planeNotation: PlaneNotation;
  /** Notation of lines in an attitude column. */
  readonly lineNotation: LineNotation;
  /** CRS of x/y columns (and of grid north) as the user gave it: "EPSG:32633", "UTM 33N", "+proj=...". */
  readonly crs?: string;
  /** North the azimuths were read against. */
  readonly north: 'true' | 'magnetic' | 'grid';
  /** Magnetic north only: `wmm` for the World Magnetic Model, or degrees east typed by the user. */
  readonly declination?: 'wmm' | number;
  /** Date (YYYY-MM-DD) for the magnetic model where a row has none. */
  readonly date?: string;
  /** Kind of every row when there is no kind column. */
  readonly defaultKind?: MeasurementKind;
  /** CSV field delimiter asked for; absent when it was detected. */
  readonly delimiter?: string;
}

/** Options used when nothing else is said: notations `auto`, true north. */
export const DEFAULT_IMPORT_OPTIONS: ImportOptions = { planeNotation: 'auto', lineNotation: 'auto', north: 'true' };

/** Non-empty fields found beyond the last header column of one row (kept so nothing is lost). */
export interface ExtraFields {
  readonly row: number;
  readonly fields: readonly string[];
}

/** The shape of the file a dataset came from: enough to write it out again with every original column. */
export interface DatasetTable {
  readonly format: 'csv' | 'geojson';
  /** Column names (CSV header, or GeoJSON property names in order of first appearance). */
  readonly headers: readonly string[];
  /** CSV field delimiter ("," for GeoJSON, used when the dataset is written as CSV). */
  readonly delimiter: string;
  /** Numbers of blank rows that were skipped (they keep their numbers). */
  readonly blankRows: readonly number[];
  /** What the reader told the user (e.g. a name given to a blank header). */
  readonly notes: readonly string[];
  readonly extras: readonly ExtraFields[];
  /** GeoJSON only: the location each feature's geometry gave, by station index; null for a feature without geometry. */
  readonly locations?: readonly (GivenLocation | null)[];
}

/** One cell changed by the user after import; `from` keeps the value as first read. */
export interface CellEdit {
  /** Station row number (Station.row). */
  readonly row: number;
  readonly column: string;
  readonly from: string;
  readonly to: string;
  /** When, ISO 8601. */
  readonly at: string;
}

/** One imported file and its stations. */
export interface ProjectDataset {
  readonly id: string;
  /** The file name it was imported from. */
  readonly name: string;
  readonly table: DatasetTable;
  readonly mapping: ColumnMapping;
  readonly options: ImportOptions;
  /** One station per data row, in file order. */
  readonly stations: readonly Station[];
  /** Cell edits in the order made. */
  readonly edits: readonly CellEdit[];
}

/** The drawing tools a selection outline can come from. */
export const SELECTION_TOOLS = ['lasso', 'polygon', 'rectangle'] as const;

/** The outline a selection was drawn with. */
export interface SelectionShape {
  /** How it was drawn; absent when it came from elsewhere (a domain outline shown as the selection). */
  readonly tool?: (typeof SELECTION_TOOLS)[number];
  /** [longitude, latitude] vertices, at least three, closed or not. */
  readonly ring: readonly (readonly [number, number])[];
}

/**
 * A named selection: the stations it held (by index into a dataset's `stations`, or by station
 * id) and, when it was drawn as one shape, its outline. At least one of `indices`, `stationIds`
 * and `shape` is given. Without `dataset` it belongs to the stations shown when the project has no
 * dataset of its own (the demo's built-in sample), which it names by `stationIds`.
 */
export interface ProjectSelection {
  readonly id: string;
  readonly name: string;
  /** Id of the dataset whose stations are selected; needed with `indices`. */
  readonly dataset?: string;
  /** Positions in that dataset's `stations`, 0-based. */
  readonly indices?: readonly number[];
  /** Station ids (Station.id). */
  readonly stationIds?: readonly string[];
  /** The outline the selection was drawn with. */
  readonly shape?: SelectionShape;
  /** When it was saved, ISO 8601. */
  readonly savedAt?: string;
}

/** A map domain: a closed or open ring of [longitude, latitude] and, for now, any analysis as opaque JSON. */
export interface ProjectDomain {
  readonly id: string;
  readonly name: string;
  readonly ring: readonly (readonly [number, number])[];
  readonly analysis?: unknown;
  readonly [extra: string]: unknown;
}

/** Largest swath half-width of a section line, metres: wider is no longer a section of one fold train. */
export const MAX_SECTION_SWATH = 20_000;

/**
 * A line traced on the map (a contact or form line seen in the field), projected with the
 * stations into profiles and sections as a layer of its own, under its name.
 */
export interface ProjectTrace {
  readonly id: string;
  /** Legend text, e.g. "Drawn trace 1" (data text: shown as text only). */
  readonly name: string;
  /** [longitude, latitude] vertices in order, at least two distinct. */
  readonly line: readonly (readonly [number, number])[];
}

/** The section line drawn on the map and the swath about it. */
export interface ProjectSectionLine {
  /** [longitude, latitude] vertices in order, at least two distinct. */
  readonly line: readonly (readonly [number, number])[];
  /** Swath half-width, metres: more than 0, at most {@link MAX_SECTION_SWATH}. */
  readonly swath: number;
}

/** A whole project. */
export interface FoldlensProject {
  readonly format: typeof PROJECT_FORMAT;
  readonly version: typeof PROJECT_VERSION;
  readonly name: string;
  /** When it was last saved, ISO 8601. */
  readonly savedAt: string;
  readonly datasets: readonly ProjectDataset[];
  readonly selections: readonly ProjectSelection[];
  readonly domains: readonly ProjectDomain[];
  /** Lines traced on the map; absent when there are none (and in files written before they were kept). */
  readonly traces?: readonly ProjectTrace[];
  /** The last section line drawn; absent when there is none. */
  readonly sectionLine?: ProjectSectionLine;
}

/**
 * The only error thrown when a project file cannot be read. `path` names the bad field
 * (`datasets[0].stations[3].plane.dip`), empty for the document itself.
 * @example try { parseProject('{}'); } catch (e) { (e as ProjectFileError).path } // 'format'
 */
export class ProjectFileError extends Error {
  readonly path: string;
  constructor(path: string, message: string) {
    super(path === '' ? message : `${path}: ${message}`);
    this.name = 'ProjectFileError';
    this.path = path;
  }
}

/**
 * A project with nothing in it.
 * @example emptyProject('Korvane 2024').datasets // []
 */
export function emptyProject(name = 'Untitled project', savedAt = new Date().toISOString()): FoldlensProject {
  return { format: PROJECT_FORMAT, version: PROJECT_VERSION, name, savedAt, datasets: [], selections: [], domains: [] };
}

/**
 * The project with `dataset` added, or put in the place of the dataset with the same id.
 * @example withDataset(emptyProject(), dataset).datasets.length // 1
 */
export function withDataset(project: FoldlensProject, dataset: ProjectDataset): FoldlensProject {
  const at = project.datasets.findIndex((d) => d.id === dataset.id);
  const datasets = at < 0 ? [...project.datasets, dataset] : project.datasets.map((d, i) => (i === at ? dataset : d));
  return { ...project, datasets };
}

/**
 * The dataset with one station replaced and the edit that caused it logged.
 * @example withStationEdit(dataset, 4, fixedStation, { row: 5, column: 'Dip', from: '3O', to: '30', at })
 */
export function withStationEdit(dataset: ProjectDataset, index: number, station: Station, edit: CellEdit): ProjectDataset {
  if (!Number.isInteger(index) || index < 0 || index >= dataset.stations.length) {
    throw new RangeError(`station index ${index} is outside dataset "${dataset.name}" (0 to ${dataset.stations.length - 1})`);
  }
  const stations = dataset.stations.slice();
  stations[index] = station;
  return { ...dataset, stations, edits: [...dataset.edits, edit] };
}

/**
 * The project as the text of a project file (checked first, so a file that could not be read
 * back is never written). `space` indents for people; the default writes one line.
 * @example projectToJson(emptyProject('Demo')).startsWith('{"format":"foldlens-project","version":1') // true
 */
export function projectToJson(project: FoldlensProject, space?: number): string {
  checkProject(project);
  return JSON.stringify(project, null, space);
}

/**
 * Reads a project file (its text, or JSON already parsed) and checks every field.
 * Throws {@link ProjectFileError} naming the path of the first bad field.
 * @example parseProject(projectToJson(emptyProject('Demo'))).name // 'Demo'
 */
export function parseProject(input: string | unknown): FoldlensProject {
  let json: unknown = input;
  if (typeof input === 'string') {
    try {
      json = JSON.parse(input.charCodeAt(0) === 0xfeff ? input.slice(1) : input);
    } catch (e) {
      throw new ProjectFileError('', `the project file is not valid JSON: ${(e as Error).message}`);
    }
  }
  return checkProject(json);
}

/**
 * Whether parsed JSON claims to be a project file (whatever its version), so a reader can tell
 * it from GeoJSON before checking it.
 * @example isProjectLike({ format: 'foldlens-project', version: 9 }) // true
 */
export function isProjectLike(json: unknown): boolean {
  return isObject(json) && json.format === PROJECT_FORMAT;
}

/**
 * Checks import options as stored and returns them; throws {@link ProjectFileError} at `path`.
 * @example checkImportOptions({ planeNotation: 'rhr', lineNotation: 'auto', north: 'true' }).planeNotation // 'rhr'
 */
export function checkImportOptions(value: unknown, path = 'options'): ImportOptions {
  const o = object(value, path, 'import options');
  known(o, path, ['planeNotation', 'lineNotation', 'crs', 'north', 'declination', 'date', 'defaultKind', 'delimiter']);
  oneOf(o.planeNotation, `${path}.planeNotation`, PLANE_NOTATIONS);
  oneOf(o.lineNotation, `${path}.lineNotation`, LINE_NOTATIONS);
  oneOf(o.north, `${path}.north`, ['true', 'magnetic', 'grid']);
  if (o.crs !== undefined) text(o.crs, `${path}.crs`, 'a CRS such as "EPSG:32633" or a proj4 definition', true);
  if (o.declination !== undefined) {
    if (o.north !== 'magnetic') fail(`${path}.declination`, `a declination goes with "north": "magnetic", not "${String(o.north)}"`);
    if (o.declination !== 'wmm' && !(typeof o.declination === 'number' && Number.isFinite(o.declination) && Math.abs(o.declination) <= 180)) {
      expected(`${path}.declination`, '"wmm" or degrees east from -180 to 180', o.declination);
    }
  }
  if (o.date !== undefined && (typeof o.date !== 'string' || !/^\d{4}-\d{2}-\d{2}$/.test(o.date) || parseIsoDate(o.date) === undefined)) {
    expected(`${path}.date`, 'a date written YYYY-MM-DD', o.date);
  }
  if (o.defaultKind !== undefined) oneOf(o.defaultKind, `${path}.defaultKind`, KINDS);
  if (o.delimiter !== undefined && (typeof o.delimiter !== 'string' || o.delimiter.length !== 1 || o.delimiter === '"' || o.delimiter === '\n' || o.delimiter === '\r')) {
    expected(`${path}.delimiter`, 'one character other than a quote or a line break', o.delimiter);
  }
  return o as unknown as ImportOptions;
}

/**
 * Checks a parsed project object in place and returns it typed; see {@link parseProject}.
 * @example checkProject(JSON.parse(text))
 */
export function checkProject(json: unknown): FoldlensProject {
  if (!isObject(json)) fail('', `a project file is a JSON object with "format": "${PROJECT_FORMAT}", found ${describe(json)}`);
  const p = json;
  if (p.format !== PROJECT_FORMAT) {
    fail('format', `not a Foldlens project file: expected "${PROJECT_FORMAT}", found ${describe(p.format)}`);
  }
  if (typeof p.version !== 'number' || !Number.isInteger(p.version) || p.version < 1) {
    expected('version', `a whole format version from 1 (this Foldlens writes ${PROJECT_VERSION})`, p.version);
  }
  if ((p.version as number) > PROJECT_VERSION) {
    fail(
      'version',
      `this project was written in format version ${p.version as number}, newer than this Foldlens reads (version ${PROJECT_VERSION} and older); open it with a newer Foldlens`,
    );
  }
  known(p, '', ['format', 'version', 'name', 'savedAt', 'datasets', 'selections', 'domains', 'traces', 'sectionLine']);
  text(p.name, 'name', 'the project name');
  if (typeof p.savedAt !== 'string' || Number.isNaN(Date.parse(p.savedAt))) expected('savedAt', 'a date and time, ISO 8601', p.savedAt);
  const datasets = array(p.datasets, 'datasets', 'a list of datasets');
  const ids = new Set<string>();
  datasets.forEach((d, i) => {
    const id = checkDataset(d, `datasets[${i}]`);
    if (ids.has(id)) fail(`datasets[${i}].id`, `the id "${id}" is used by two datasets`);
    ids.add(id);
  });
  const byId = new Map(datasets.map((d) => [(d as { id: string }).id, (d as { stations: readonly Station[] }).stations]));
  const selectionIds = new Set<string>();
  array(p.selections, 'selections', 'a list of selections').forEach((s, i) => {
    const id = checkSelection(s, `selections[${i}]`, byId);
    if (selectionIds.has(id)) fail(`selections[${i}].id`, `the id "${id}" is used by two selections`);
    selectionIds.add(id);
  });
  const domainIds = new Set<string>();
  array(p.domains, 'domains', 'a list of domains').forEach((d, i) => {
    const id = checkDomain(d, `domains[${i}]`);
    if (domainIds.has(id)) fail(`domains[${i}].id`, `the id "${id}" is used by two domains`);
    domainIds.add(id);
  });
  // Traces and the section line came after the first files of version 1: both optional.
  if (p.traces !== undefined) {
    const traceIds = new Set<string>();
    array(p.traces, 'traces', 'a list of traces').forEach((t, i) => {
      const id = checkTrace(t, `traces[${i}]`);
      if (traceIds.has(id)) fail(`traces[${i}].id`, `the id "${id}" is used by two traces`);
      traceIds.add(id);
    });
  }
  if (p.sectionLine !== undefined) checkSectionLine(p.sectionLine, 'sectionLine');
  return p as unknown as FoldlensProject;
}

const KINDS: readonly string[] = [...PLANE_KINDS, ...LINE_KINDS];
const CORRECTION_TYPES: readonly AzimuthCorrection['type'][] = ['magnetic-declination', 'grid-convergence', 'user-declination'];

function checkDataset(value: unknown, path: string): string {
  const d = object(value, path, 'a dataset');
  known(d, path, ['id', 'name', 'table', 'mapping', 'options', 'stations', 'edits']);
  const id = text(d.id, `${path}.id`, 'an id', true);
  text(d.name, `${path}.name`, 'the file name');
  const table = checkTable(d.table, `${path}.table`);
  try {
    parseColumnMapping(d.mapping);
  } catch (e) {
    fail(`${path}.mapping`, (e as Error).message.replace(/^column mapping: /, ''));
  }
  for (const [field, column] of Object.entries(d.mapping as Record<string, string>)) {
    if (!table.headers.includes(column)) fail(`${path}.mapping.${field}`, `"${column}" is not one of the dataset's columns`);
  }
  checkImportOptions(d.options, `${path}.options`);
  const stations = array(d.stations, `${path}.stations`, 'a list of stations');
  stations.forEach((s, i) => checkStation(s, `${path}.stations[${i}]`));
  if (table.locations !== undefined && table.locations.length !== stations.length) {
    fail(`${path}.table.locations`, `expected one location per station (${stations.length}), found ${table.locations.length}`);
  }
  array(d.edits, `${path}.edits`, 'a list of cell edits').forEach((e, i) => {
    const p = `${path}.edits[${i}]`;
    const o = object(e, p, 'a cell edit');
    known(o, p, ['row', 'column', 'from', 'to', 'at']);
    wholeNumber(o.row, `${p}.row`, 0);
    text(o.column, `${p}.column`, 'a column name');
    text(o.from, `${p}.from`, 'the value before the edit');
    text(o.to, `${p}.to`, 'the value after the edit');
    if (typeof o.at !== 'string' || Number.isNaN(Date.parse(o.at))) expected(`${p}.at`, 'a date and time, ISO 8601', o.at);
  });
  return id;
}

function checkTable(value: unknown, path: string): DatasetTable {
  const t = object(value, path, 'the table');
  known(t, path, ['format', 'headers', 'delimiter', 'blankRows', 'notes', 'extras', 'locations']);
  oneOf(t.format, `${path}.format`, ['csv', 'geojson']);
  const headers = array(t.headers, `${path}.headers`, 'a list of column names');
  const seen = new Set<string>();
  headers.forEach((h, i) => {
    const name = text(h, `${path}.headers[${i}]`, 'a column name');
    if (seen.has(name)) fail(`${path}.headers[${i}]`, `the column name "${name}" appears twice`);
    seen.add(name);
  });
  if (typeof t.delimiter !== 'string' || t.delimiter.length !== 1) expected(`${path}.delimiter`, 'one character', t.delimiter);
  array(t.blankRows, `${path}.blankRows`, 'a list of row numbers').forEach((r, i) => wholeNumber(r, `${path}.blankRows[${i}]`, 1));
  array(t.notes, `${path}.notes`, 'a list of notes').forEach((n, i) => text(n, `${path}.notes[${i}]`, 'a note'));
  array(t.extras, `${path}.extras`, 'a list of extra fields').forEach((x, i) => {
    const p = `${path}.extras[${i}]`;
    const o = object(x, p, 'extra fields of a row');
    known(o, p, ['row', 'fields']);
    wholeNumber(o.row, `${p}.row`, 1);
    array(o.fields, `${p}.fields`, 'a list of fields').forEach((f, j) => text(f, `${p}.fields[${j}]`, 'a field'));
  });
  if (t.locations !== undefined) {
    if (t.format !== 'geojson') fail(`${path}.locations`, 'locations belong to GeoJSON datasets only');
    array(t.locations, `${path}.locations`, 'a list of locations').forEach((l, i) => {
      if (l !== null) checkLocation(l, `${path}.locations[${i}]`);
    });
  }
  return t as unknown as DatasetTable;
}

function checkLocation(value: unknown, path: string): void {
  const o = object(value, path, 'a location or null');
  known(o, path, ['lon', 'lat', 'elevation', 'problems']);
  checkLonLat(o, path);
  if (o.elevation !== undefined) finite(o.elevation, `${path}.elevation`, 'an elevation in metres');
  if (o.problems !== undefined) array(o.problems, `${path}.problems`, 'a list of problems').forEach((q, i) => checkProblem(q, `${path}.problems[${i}]`));
}

function checkStation(value: unknown, path: string): void {
  const s = object(value, path, 'a station');
  known(s, path, ['id', 'row', 'kind', 'lon', 'lat', 'elevation', 'plane', 'line', 'corrections', 'source', 'problems']);
  text(s.id, `${path}.id`, 'a station id', true);
  wholeNumber(s.row, `${path}.row`, 1);
  if (s.kind !== undefined) oneOf(s.kind, `${path}.kind`, KINDS);
  checkLonLat(s, path);
  if (s.elevation !== undefined) finite(s.elevation, `${path}.elevation`, 'an elevation in metres');
  if (s.plane !== undefined) {
    const p = object(s.plane, `${path}.plane`, 'a plane');
    known(p, `${path}.plane`, ['dipDirection', 'dip', 'overturned']);
    angle(p.dipDirection, `${path}.plane.dipDirection`, 0, 360, 'a dip direction from 0 to less than 360');
    angle(p.dip, `${path}.plane.dip`, 0, 90, 'a dip from 0 to 90', true);
    if (p.overturned !== undefined && typeof p.overturned !== 'boolean') expected(`${path}.plane.overturned`, 'true or false', p.overturned);
  }
  if (s.line !== undefined) {
    const l = object(s.line, `${path}.line`, 'a line');
    known(l, `${path}.line`, ['trend', 'plunge', 'sense']);
    angle(l.trend, `${path}.line.trend`, 0, 360, 'a trend from 0 to less than 360');
    angle(l.plunge, `${path}.line.plunge`, 0, 90, 'a plunge from 0 to 90', true);
    if (l.sense !== undefined) oneOf(l.sense, `${path}.line.sense`, ['antiform', 'synform', 'unknown']);
  }
  if (s.corrections !== undefined) {
    array(s.corrections, `${path}.corrections`, 'a list of corrections').forEach((c, i) => {
      const p = `${path}.corrections[${i}]`;
      const o = object(c, p, 'a correction');
      known(o, p, ['type', 'degrees', 'source']);
      oneOf(o.type, `${p}.type`, CORRECTION_TYPES);
      finite(o.degrees, `${p}.degrees`, 'degrees added to the azimuth');
      text(o.source, `${p}.source`, 'where the correction came from');
    });
  }
  const source = object(s.source, `${path}.source`, 'the original fields by column name');
  for (const [k, v] of Object.entries(source)) {
    if (typeof v !== 'string') expected(`${path}.source[${JSON.stringify(k)}]`, 'the field as text', v);
  }
  array(s.problems, `${path}.problems`, 'a list of problems').forEach((q, i) => checkProblem(q, `${path}.problems[${i}]`));
}

function checkProblem(value: unknown, path: string): RowProblem {
  const o = object(value, path, 'a row problem');
  known(o, path, ['row', 'column', 'value', 'expected']);
  wholeNumber(o.row, `${path}.row`, 0);
  text(o.column, `${path}.column`, 'a column name');
  text(o.value, `${path}.value`, 'the value as written');
  text(o.expected, `${path}.expected`, 'what was expected');
  return o as unknown as RowProblem;
}

function checkSelection(value: unknown, path: string, datasets: ReadonlyMap<string, readonly Station[]>): string {
  const s = object(value, path, 'a selection');
  known(s, path, ['id', 'name', 'dataset', 'indices', 'stationIds', 'shape', 'savedAt']);
  const id = text(s.id, `${path}.id`, 'an id', true);
  text(s.name, `${path}.name`, 'a name');
  let stations: readonly Station[] | undefined;
  if (s.dataset !== undefined) {
    const dataset = text(s.dataset, `${path}.dataset`, 'the id of a dataset', true);
    stations = datasets.get(dataset);
    if (stations === undefined) fail(`${path}.dataset`, `no dataset has the id "${dataset}"`);
  }
  if (s.indices !== undefined) {
    if (!stations) fail(`${path}.dataset`, 'expected the id of the dataset the indices point into, found nothing');
    const size = stations.length;
    array(s.indices, `${path}.indices`, 'a list of station indices').forEach((n, i) => {
      if (typeof n !== 'number' || !Number.isInteger(n) || n < 0 || n >= size) {
        expected(`${path}.indices[${i}]`, `a station index from 0 to ${size - 1}`, n);
      }
    });
  }
  if (s.stationIds !== undefined) {
    const ids = stations && new Set(stations.map((x) => x.id));
    array(s.stationIds, `${path}.stationIds`, 'a list of station ids').forEach((v, i) => {
      const stationId = text(v, `${path}.stationIds[${i}]`, 'a station id', true);
      if (ids && !ids.has(stationId)) fail(`${path}.stationIds[${i}]`, `no station of dataset "${s.dataset as string}" has the id "${stationId}"`);
    });
  }
  if (s.shape !== undefined) {
    const shape = object(s.shape, `${path}.shape`, 'a shape {tool, ring}');
    known(shape, `${path}.shape`, ['tool', 'ring']);
    if (shape.tool !== undefined) oneOf(shape.tool, `${path}.shape.tool`, SELECTION_TOOLS);
    checkRing(shape.ring, `${path}.shape.ring`);
  }
  if (s.indices === undefined && s.stationIds === undefined && s.shape === undefined) {
    fail(path, 'expected the stations of the selection (indices or stationIds) or its outline (shape), found none of them');
  }
  if (s.savedAt !== undefined && (typeof s.savedAt !== 'string' || Number.isNaN(Date.parse(s.savedAt)))) expected(`${path}.savedAt`, 'a date and time, ISO 8601', s.savedAt);
  return id;
}

function checkDomain(value: unknown, path: string): string {
  const d = object(value, path, 'a domain');
  const id = text(d.id, `${path}.id`, 'an id', true);
  text(d.name, `${path}.name`, 'a name');
  checkRing(d.ring, `${path}.ring`);
  return id;
}

function checkTrace(value: unknown, path: string): string {
  const t = object(value, path, 'a trace {id, name, line}');
  known(t, path, ['id', 'name', 'line']);
  const id = text(t.id, `${path}.id`, 'an id', true);
  text(t.name, `${path}.name`, 'a name');
  checkLine(t.line, `${path}.line`);
  return id;
}

function checkSectionLine(value: unknown, path: string): void {
  const s = object(value, path, 'a section line {line, swath}');
  known(s, path, ['line', 'swath']);
  checkLine(s.line, `${path}.line`);
  if (typeof s.swath !== 'number' || !Number.isFinite(s.swath) || !(s.swath > 0) || s.swath > MAX_SECTION_SWATH) {
    expected(`${path}.swath`, `a swath half-width in metres, more than 0 and at most ${MAX_SECTION_SWATH}`, s.swath);
  }
}

/** A line drawn on the map: at least two [longitude, latitude] positions, not all at one place. */
function checkLine(value: unknown, path: string): void {
  const line = array(value, path, 'a line of [longitude, latitude] positions');
  if (line.length < 2) fail(path, `expected at least 2 positions, found ${line.length}`);
  line.forEach((pos, i) => {
    const p = `${path}[${i}]`;
    if (!Array.isArray(pos) || pos.length !== 2) expected(p, '[longitude, latitude]', pos);
    if (typeof pos[0] !== 'number' || !(Math.abs(pos[0]) <= 180)) expected(`${p}[0]`, 'a longitude from -180 to 180', pos[0]);
    if (typeof pos[1] !== 'number' || !(Math.abs(pos[1]) <= 90)) expected(`${p}[1]`, 'a latitude from -90 to 90', pos[1]);
  });
  const [lon0, lat0] = line[0] as [number, number];
  if (line.every((pos) => (pos as [number, number])[0] === lon0 && (pos as [number, number])[1] === lat0)) {
    fail(path, `expected at least 2 different positions, found ${line.length} at one place`);
  }
}

function checkRing(value: unknown, path: string): void {
  const ring = array(value, path, 'a ring of [longitude, latitude] positions');
  if (ring.length < 3) fail(path, `expected at least 3 positions, found ${ring.length}`);
  ring.forEach((pos, i) => {
    const p = `${path}[${i}]`;
    if (!Array.isArray(pos) || pos.length !== 2) expected(p, '[longitude, latitude]', pos);
    finite(pos[0], `${p}[0]`, 'a longitude');
    if (typeof pos[1] !== 'number' || !(Math.abs(pos[1]) <= 90)) expected(`${p}[1]`, 'a latitude from -90 to 90', pos[1]);
  });
}

function checkLonLat(o: Record<string, unknown>, path: string): void {
  if ((o.lon === undefined) !== (o.lat === undefined)) fail(path, 'has one of lon and lat without the other');
  if (o.lon !== undefined) finite(o.lon, `${path}.lon`, 'a longitude in degrees');
  if (o.lat !== undefined && (typeof o.lat !== 'number' || !(Math.abs(o.lat) <= 90))) expected(`${path}.lat`, 'a latitude from -90 to 90', o.lat);
}

// --- small checkers: each throws ProjectFileError naming the path ---

function fail(path: string, message: string): never {
  throw new ProjectFileError(path, message);
}

function expected(path: string, what: string, found: unknown): never {
  fail(path, `expected ${what}, found ${describe(found)}`);
}

function describe(v: unknown): string {
  if (v === undefined) return 'nothing';
  if (Array.isArray(v)) return 'a list';
  if (v === null) return 'null';
  if (typeof v === 'object') return 'an object';
  if (typeof v === 'number' && !Number.isFinite(v)) return String(v); // JSON.stringify would say null
  const s = JSON.stringify(v);
  return s.length > 60 ? `${s.slice(0, 57)}...` : s;
}

function isObject(v: unknown): v is Record<string, unknown> {
  return v !== null && typeof v === 'object' && !Array.isArray(v);
}

function object(v: unknown, path: string, what: string): Record<string, unknown> {
  if (!isObject(v)) expected(path, what, v);
  return v;
}

function array(v: unknown, path: string, what: string): unknown[] {
  if (!Array.isArray(v)) expected(path, what, v);
  return v;
}

function text(v: unknown, path: string, what: string, nonEmpty = false): string {
  if (typeof v !== 'string' || (nonEmpty && v === '')) expected(path, nonEmpty ? `${what} (non-empty text)` : `${what} (text)`, v);
  return v;
}

function finite(v: unknown, path: string, what: string): number {
  if (typeof v !== 'number' || !Number.isFinite(v)) expected(path, what, v);
  return v;
}

function wholeNumber(v: unknown, path: string, min: number): number {
  if (typeof v !== 'number' || !Number.isInteger(v) || v < min) expected(path, `a whole number from ${min}`, v);
  return v;
}

function angle(v: unknown, path: string, min: number, max: number, what: string, inclusive = false): void {
  if (typeof v !== 'number' || !(v >= min) || !(inclusive ? v <= max : v < max)) expected(path, what, v);
}

function oneOf(v: unknown, path: string, allowed: readonly string[]): void {
  if (typeof v !== 'string' || !allowed.includes(v)) expected(path, `one of ${allowed.map((a) => `"${a}"`).join(', ')}`, v);
}

function known(o: Record<string, unknown>, path: string, keys: readonly string[]): void {
  for (const k of Object.keys(o)) {
    if (!keys.includes(k)) fail(path === '' ? k : `${path}.${k}`, `unknown field; expected only ${keys.join(', ')}`);
  }
}
