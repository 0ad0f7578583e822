import type { Station } from '../../core/station';
import { CsvError, decodeText, type CsvRow } from '../../io/csvTable';
import type { ColumnMapping } from '../../io/columns';
import { GeoJsonError, readGeoJsonStations } from '../../io/readGeoJson';
import { readStation, type GivenLocation } from '../../io/readStations';
import { checkProject, isProjectLike, ProjectFileError, type DatasetTable, type ExtraFields, type FoldlensProject, type ImportOptions } from '../../io/projectFile';
import { CsvStreamReader, Utf8ChunkDecoder } from './csvStream';
import { ImportOptionsError, prepareCrs, toReadOptions } from './importOptions';
import { CrsError, rememberCrs, type Crs } from '../../io/crs';

/**
 * The work of reading a file for import, with no DOM: `scanFile` looks at a file (its format,
 * columns, first rows) for the mapping step; `readFileStations` reads every row into a Station
 * with the mapping and options chosen, passing them on in batches so a worker can post them as
 * it goes. Both take a Blob, so they run the same in a worker, on the page, or in Node.
 *
 * A CSV file longer than `headBytes` is streamed (csvStream.ts); a shorter one, and every
 * GeoJSON or project file, is read whole. Every failure is an {@link ImportFileError} carrying
 * the reader's own message (io/csvTable.ts, io/readGeoJson.ts, io/projectFile.ts).
 */

/** Rows of the preview sent to the mapping step (also used to judge the notation of a column). */
export const PREVIEW_ROWS = 200;

/** Bytes read whole; a longer CSV file is streamed. */
export const DEFAULT_HEAD_BYTES = 4 << 20;

/**
 * Why a file cannot be imported at all; `code` is the reader's error code (csvTable.ts codes, `json`,
 * `geojson`, `project`, `options`, `cancelled`, `worker`).
 * @example try { await scanFile(file, 'a.csv'); } catch (e) { if (e instanceof ImportFileError) show(e.message); }
 */
export class ImportFileError extends Error {
  readonly code: string;
  constructor(code: string, message: string) {
    super(message);
    this.name = 'ImportFileError';
    this.code = code;
  }
}

/** What the mapping step needs to know about a delimited-text file. */
export interface CsvScan {
  readonly format: 'csv';
  readonly fileName: string;
  readonly bytes: number;
  readonly headers: readonly string[];
  readonly delimiter: string;
  readonly notes: readonly string[];
  /** The first rows (at most PREVIEW_ROWS). */
  readonly preview: readonly CsvRow[];
  /** Number of data rows, when the whole file was read; otherwise undefined. */
  readonly rowCount?: number;
}

/** What the mapping step needs to know about a GeoJSON file. */
export interface GeoJsonScan {
  readonly format: 'geojson';
  readonly fileName: string;
  readonly bytes: number;
  /** Property names in order of first appearance. */
  readonly headers: readonly string[];
  readonly delimiter: ',';
  readonly notes: readonly string[];
  readonly preview: readonly CsvRow[];
  readonly rowCount: number;
}

/** A Foldlens project file, checked. */
export interface ProjectScan {
  readonly format: 'project';
  readonly fileName: string;
  readonly bytes: number;
  readonly project: FoldlensProject;
}

export type ScanResult = CsvScan | GeoJsonScan | ProjectScan;

/** What to read and how. */
export interface ReadRequest {
  readonly format: 'csv' | 'geojson';
  readonly mapping: ColumnMapping;
  readonly options: ImportOptions;
  /** Bytes read whole before streaming (default DEFAULT_HEAD_BYTES); tests make it small. */
  readonly headBytes?: number;
  /** Stations per batch (default 5000). */
  readonly batchSize?: number;
  /**
   * The CRS of `options.crs` when the caller has looked its EPSG code up already (the page, for its
   * worker), so the EPSG table is not loaded a second time.
   */
  readonly crs?: Crs;
}

/** One batch of stations, in row order, continuing the previous batch. */
export interface StationBatch {
  readonly stations: readonly Station[];
  /** GeoJSON: the location from each feature's geometry, one per station (not repeated in the table returned). */
  readonly locations?: readonly (GivenLocation | null)[];
}

/** How far the reading has got. */
export interface ReadProgress {
  readonly bytes: number;
  readonly totalBytes: number;
  readonly rows: number;
}

/** Where batches and progress go. */
export interface ReadSink {
  batch(batch: StationBatch): void;
  progress(progress: ReadProgress): void;
}

/**
 * Looks at a file for the mapping step: its format (by its first character, then its name),
 * columns, first rows, and for short files the number of rows. Throws {@link ImportFileError}.
 * @example const scan = await scanFile(new Blob(['id,dip\nA,30']), 'a.csv'); scan.format // 'csv'
 */
export async function scanFile(file: Blob, fileName: string, options: { delimiter?: string; headBytes?: number } = {}): Promise<ScanResult> {
  const headBytes = options.headBytes ?? DEFAULT_HEAD_BYTES;
  if (await looksLikeJson(file, fileName)) return scanJson(file, fileName);
  const preview: CsvRow[] = [];
  const reader = new CsvStreamReader({ ...(options.delimiter !== undefined && { delimiter: options.delimiter }), headChars: headBytes }, (rows) => {
    for (const r of rows) if (preview.length < PREVIEW_ROWS) preview.push(r);
  });
  return failingAs(async () => {
    if (file.size <= headBytes) {
      reader.push(decodeText(new Uint8Array(await file.arrayBuffer())));
      const s = reader.end();
      return { format: 'csv', fileName, bytes: file.size, headers: s.headers, delimiter: s.delimiter, notes: s.notes, preview, rowCount: s.rowCount };
    }
    // A long file: read chunks until the header is settled and the preview is full.
    const decoder = new Utf8ChunkDecoder();
    let offset = 0;
    const step = 256 * 1024;
    while (offset < file.size && (reader.header === undefined || preview.length < PREVIEW_ROWS)) {
      const end = Math.min(file.size, offset + step);
      reader.push(decoder.push(new Uint8Array(await file.slice(offset, end).arrayBuffer()), end === file.size));
      offset = end;
    }
    if (offset >= file.size) {
      const s = reader.end();
      return { format: 'csv', fileName, bytes: file.size, headers: s.headers, delimiter: s.delimiter, notes: s.notes, preview, rowCount: s.rowCount };
    }
    const head = reader.header!;
    return { format: 'csv', fileName, bytes: file.size, headers: head.headers, delimiter: head.delimiter, notes: [], preview };
  });
}

/**
 * Reads every row of a file into Stations with the mapping and options given, sending them to
 * `sink` in batches, and returns the table's shape (headers, delimiter, blank rows, notes,
 * extra fields; GeoJSON locations come with the batches). Throws {@link ImportFileError}.
 * @example
 * const stations: Station[] = [];
 * await readFileStations(file, { format: 'csv', mapping, options }, { batch: (b) => stations.push(...b.stations), progress: () => {} });
 */
export async function readFileStations(file: Blob, request: ReadRequest, sink: ReadSink, signal?: AbortSignal): Promise<{ table: DatasetTable; rowCount: number }> {
  let readOptions;
  try {
    // An EPSG code outside the built-in table is known from the caller, or looked up here.
    if (request.crs) rememberCrs(request.crs);
    await prepareCrs(request.options.crs);
    readOptions = toReadOptions(request.options);
  } catch (e) {
    if (e instanceof ImportOptionsError || e instanceof CrsError) throw new ImportFileError('options', e.message);
    throw e;
  }
  if (request.format === 'geojson') return readGeoJsonFile(file, request, readOptions, sink);
  const batchSize = request.batchSize ?? 5000;
  const headBytes = request.headBytes ?? DEFAULT_HEAD_BYTES;
  let batch: Station[] = [];
  const extras: ExtraFields[] = [];
  let rows = 0;
  const flush = (): void => {
    if (batch.length === 0) return;
    sink.batch({ stations: batch });
    batch = [];
  };
  const reader = new CsvStreamReader({ ...(request.options.delimiter !== undefined && { delimiter: request.options.delimiter }), headChars: headBytes }, (csvRows) => {
    for (const row of csvRows) {
      batch.push(readStation(row, request.mapping, readOptions));
      if (row.extra) extras.push({ row: row.row, fields: row.extra });
      if (batch.length >= batchSize) flush();
    }
    rows += csvRows.length;
  });
  return failingAs(async () => {
    if (file.size <= headBytes) {
      reader.push(decodeText(new Uint8Array(await file.arrayBuffer())));
    } else {
      const decoder = new Utf8ChunkDecoder();
      let bytes = 0;
      const stream = file.stream().getReader();
      for (;;) {
        if (signal?.aborted) {
          await stream.cancel();
          throw new ImportFileError('cancelled', 'the import was cancelled');
        }
        const { done, value } = await stream.read();
        if (done) break;
        reader.push(decoder.push(value));
        bytes += value.length;
        sink.progress({ bytes, totalBytes: file.size, rows });
      }
      reader.push(decoder.push(new Uint8Array(0), true));
    }
    const s = reader.end();
    flush();
    sink.progress({ bytes: file.size, totalBytes: file.size, rows });
    return {
      table: { format: 'csv', headers: s.headers, delimiter: s.delimiter, blankRows: s.blankRows, notes: s.notes, extras },
      rowCount: s.rowCount,
    };
  });
}

/** JSON by its first non-blank character, or by its name when it is empty. */
async function looksLikeJson(file: Blob, fileName: string): Promise<boolean> {
  const start = new TextDecoder('utf-8').decode(await file.slice(0, 256).arrayBuffer()).replace(/^\ufeff/, '').trimStart();
  if (start === '') return /\.(geo)?json$/i.test(fileName) && file.size > 0;
  return start.startsWith('{') || start.startsWith('[');
}

async function parseJsonFile(file: Blob): Promise<unknown> {
  let text: string;
  try {
    text = new TextDecoder('utf-8', { fatal: true }).decode(await file.arrayBuffer());
  } catch {
    throw new ImportFileError('encoding', 'the file is not valid UTF-8 text; save it as UTF-8 and try again');
  }
  try {
    return JSON.parse(text.charCodeAt(0) === 0xfeff ? text.slice(1) : text);
  } catch (e) {
    throw new ImportFileError('json', `the file is not valid JSON: ${(e as Error).message}`);
  }
}

async function scanJson(file: Blob, fileName: string): Promise<ScanResult> {
  const json = await parseJsonFile(file);
  if (isProjectLike(json)) {
    try {
      return { format: 'project', fileName, bytes: file.size, project: checkProject(json) };
    } catch (e) {
      if (e instanceof ProjectFileError) throw new ImportFileError('project', `this Foldlens project file cannot be opened: ${e.message}`);
      throw e;
    }
  }
  const read = geoJson(() => readGeoJsonStations(json));
  const preview = read.stations.slice(0, PREVIEW_ROWS).map((s): CsvRow => ({ row: s.row, values: s.source }));
  return { format: 'geojson', fileName, bytes: file.size, headers: read.headers, delimiter: ',', notes: [], preview, rowCount: read.stations.length };
}

async function readGeoJsonFile(
  file: Blob,
  request: ReadRequest,
  readOptions: ReturnType<typeof toReadOptions>,
  sink: ReadSink,
): Promise<{ table: DatasetTable; rowCount: number }> {
  const json = await parseJsonFile(file);
  const base = geoJson(() => readGeoJsonStations(json));
  const features = ((json as { type?: unknown }).type === 'Feature' ? [json] : (json as { features: unknown[] }).features) as { geometry?: unknown }[];
  // As readGeoJsonStations: the geometry gives the location, coordinate properties are not read.
  const { lon: _lon, lat: _lat, x: _x, y: _y, ...mapping } = request.mapping;
  const batchSize = request.batchSize ?? 5000;
  let done = 0;
  for (let from = 0; from < features.length; from += batchSize) {
    const stations: Station[] = [];
    const batchLocations: (GivenLocation | null)[] = [];
    for (let i = from; i < Math.min(features.length, from + batchSize); i++) {
      const row = i + 1;
      const given = locationOf(features[i].geometry, row);
      batchLocations.push(given);
      stations.push(readStation({ row, values: base.stations[i].source }, mapping, readOptions, given ?? {}));
    }
    done += stations.length;
    sink.batch({ stations, locations: batchLocations });
    sink.progress({ bytes: Math.round((file.size * done) / features.length), totalBytes: file.size, rows: done });
  }
  // The locations went with the batches; the caller puts them together (see parseClient.ts).
  return { table: { format: 'geojson', headers: base.headers, delimiter: ',', blankRows: [], notes: [], extras: [] }, rowCount: features.length };
}

/**
 * The location a feature's geometry gives, read by readGeoJsonStations itself (so its rules and
 * messages hold): null for no geometry, else the point or the problem with it.
 */
function locationOf(geometry: unknown, row: number): GivenLocation | null {
  if (geometry === null || geometry === undefined) return null;
  const s = readGeoJsonStations({ type: 'Feature', geometry, properties: {} }).stations[0];
  const problems = s.problems.filter((p) => p.column === 'geometry').map((p) => ({ ...p, row }));
  if (problems.length > 0) return { problems };
  if (s.lon === undefined || s.lat === undefined) return null;
  return s.elevation !== undefined ? { lon: s.lon, lat: s.lat, elevation: s.elevation } : { lon: s.lon, lat: s.lat };
}

function geoJson<T>(f: () => T): T {
  try {
    return f();
  } catch (e) {
    if (e instanceof GeoJsonError) throw new ImportFileError('geojson', e.message);
    throw e;
  }
}

async function failingAs<T>(f: () => Promise<T>): Promise<T> {
  try {
    return await f();
  } catch (e) {
    if (e instanceof CsvError) throw new ImportFileError(e.code, e.message);
    throw e;
  }
}
