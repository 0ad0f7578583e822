import { builtInCrs, crsFromText, CrsError, pendingEpsgCode, resolveCrs, type Crs, type EpsgLoader } from '../../io/crs';
import { loadEpsgFromTable } from '../../io/epsgTable';
import { parseIsoDate } from '../../io/declination';
import type { StationReadOptions } from '../../io/readStations';
import type { ImportOptions } from '../../io/projectFile';

/**
 * Import options as the user chose them (plain JSON, see ImportOptions in io/projectFile.ts)
 * turned into the StationReadOptions the readers take, and the coordinate systems offered by
 * name in the import form. No DOM: the worker and the table use this too.
 */

/**
 * Why options cannot be used; `field` names the option at fault for the form.
 * @example try { toReadOptions(options); } catch (e) { if (e instanceof ImportOptionsError) mark(e.field); }
 */
export class ImportOptionsError extends Error {
  readonly field: keyof ImportOptions;
  constructor(field: keyof ImportOptions, message: string) {
    super(message);
    this.name = 'ImportOptionsError';
    this.field = field;
  }
}

/** EPSG codes being looked up by {@link prepareCrs}, or whose lookup failed (with why). */
const lookups = new Map<number, { readonly failed?: string }>();

/**
 * Looks up an EPSG code that is not built in (crs.ts) in the EPSG table, which is loaded on first
 * use (io/epsgTable.ts), so that {@link toReadOptions} can use it from then on in this context
 * (the page, or the parse worker). Any other CRS text needs nothing and resolves at once.
 * Throws {@link ImportOptionsError} for `crs` when the code cannot be resolved, saying why.
 * @example await prepareCrs('EPSG:2263'); toReadOptions({ ...options, crs: 'EPSG:2263' }).crs?.name // 'NAD83 / New York Long Island (ftUS)'
 */
export async function prepareCrs(text: string | undefined, loader: EpsgLoader = loadEpsgFromTable): Promise<void> {
  const code = text === undefined ? undefined : pendingEpsgCode(text);
  if (code === undefined) return;
  lookups.set(code, {});
  try {
    await resolveCrs(text!, loader);
    lookups.delete(code);
  } catch (e) {
    if (!(e instanceof CrsError)) throw e;
    const message = /is not a coordinate reference system the EPSG index knows/.test(e.message)
      ? `EPSG:${code} is not in the built-in table or the EPSG index: check the code, or give its proj4 definition (+proj=...)`
      : e.message;
    lookups.set(code, { failed: message });
    throw new ImportOptionsError('crs', message);
  }
}

/**
 * Whether {@link prepareCrs} is still looking up the EPSG code of `text`.
 * @example crsLookupRunning('EPSG:2263') // true between prepareCrs('EPSG:2263') and its end
 */
export function crsLookupRunning(text: string): boolean {
  const code = pendingEpsgCode(text);
  return code !== undefined && lookups.has(code) && lookups.get(code)!.failed === undefined;
}

/**
 * The reader options for stored import options: the CRS text resolved with the built-in table
 * (crs.ts) or as looked up by {@link prepareCrs}, the default date parsed. Throws
 * {@link ImportOptionsError} naming the option.
 * @example toReadOptions({ planeNotation: 'auto', lineNotation: 'auto', north: 'grid', crs: 'EPSG:32633' }).crs?.name
 * // 'WGS 84 / UTM zone 33N'
 */
export function toReadOptions(options: ImportOptions): StationReadOptions {
  let crs: Crs | undefined;
  if (options.crs !== undefined && options.crs.trim() !== '') {
    try {
      crs = crsFromText(options.crs);
    } catch (e) {
      if (e instanceof CrsError) {
        const code = pendingEpsgCode(options.crs);
        const lookup = code === undefined ? undefined : lookups.get(code);
        throw new ImportOptionsError(
          'crs',
          code === undefined
            ? e.message
            : (lookup?.failed ?? (lookup ? `EPSG:${code} is being looked up in the EPSG index` : `EPSG:${code} is not in the built-in table and has not been looked up in the EPSG index yet (prepareCrs)`)),
        );
      }
      throw e;
    }
  }
  if (options.north === 'grid' && (!crs || crs.geographic)) {
    throw new ImportOptionsError('north', 'grid north needs the projected coordinate system the azimuths were read against: choose it under Coordinates');
  }
  let date: Date | undefined;
  if (options.date !== undefined && options.date !== '') {
    date = parseIsoDate(options.date);
    if (!date) throw new ImportOptionsError('date', `"${options.date}" is not a date: expected YYYY-MM-DD`);
  }
  const declination = options.north === 'magnetic' ? (options.declination ?? 'wmm') : undefined;
  if (typeof declination === 'number' && !(Number.isFinite(declination) && Math.abs(declination) <= 180)) {
    throw new ImportOptionsError('declination', `${declination} is not a declination: expected degrees east from -180 to 180 (west negative)`);
  }
  return {
    planeNotation: options.planeNotation,
    lineNotation: options.lineNotation,
    north: options.north,
    ...(crs && { crs }),
    ...(declination !== undefined && { declination }),
    ...(date && { date }),
    ...(options.defaultKind && { defaultKind: options.defaultKind }),
  };
}

/** One coordinate system offered by name. */
export interface CrsChoice {
  /** What is stored in ImportOptions.crs: "EPSG:32633". */
  readonly value: string;
  /** "WGS 84 / UTM zone 33N". */
  readonly label: string;
}

/** A named group of choices, for an optgroup. */
export interface CrsChoiceGroup {
  readonly label: string;
  readonly choices: readonly CrsChoice[];
}

/** EPSG codes of the national and regional grids built into crs.ts, in the order offered. */
const NATIONAL_GRIDS = [27700, 29903, 2157, 2154, 2056, 28992, 31370, 3006, 2193, 3035, 5070, 3857] as const;

const choice = (code: number): CrsChoice => ({ value: `EPSG:${code}`, label: builtInCrs(code)!.name });
const range = (first: number, count: number): number[] => Array.from({ length: count }, (_, i) => first + i);

/**
 * The coordinate systems the import form offers by name: WGS 84 longitude/latitude, UTM zones
 * (WGS 84 north and south, ETRS89, NAD83) and the built-in national grids; names come from
 * `builtInCrs`. Anything else is typed as an EPSG code or a proj4 definition.
 * @example crsChoiceGroups()[1].choices[32].label // 'WGS 84 / UTM zone 33N'
 */
export function crsChoiceGroups(): CrsChoiceGroup[] {
  return [
    { label: 'Longitude and latitude', choices: [choice(4326)] },
    { label: 'UTM, WGS 84, north', choices: range(32601, 60).map(choice) },
    { label: 'UTM, WGS 84, south', choices: range(32701, 60).map(choice) },
    { label: 'UTM, ETRS89', choices: range(25828, 10).map(choice) },
    { label: 'UTM, NAD83', choices: range(26901, 23).map(choice) },
    { label: 'National and regional grids', choices: NATIONAL_GRIDS.map(choice) },
  ];
}

/**
 * A one-line description of a CRS text for the form: its name and area, or why it cannot be used
 * (`pending` while its EPSG code is being looked up).
 * @example describeCrsText('UTM 33N') // { ok: true, text: 'WGS 84 / UTM zone 33N (EPSG:32633)' }
 */
export function describeCrsText(text: string): { ok: boolean; text: string; pending?: true } {
  if (text.trim() === '') return { ok: false, text: 'no coordinate system chosen' };
  if (crsLookupRunning(text)) return { ok: false, pending: true, text: `Looking up EPSG:${pendingEpsgCode(text)} in the EPSG index…` };
  try {
    const crs = crsFromText(text);
    const notes = crs.notes.length ? `; ${crs.notes.join('; ')}` : '';
    return { ok: true, text: crs.code === 'PROJ4' ? `proj4 definition (${crs.geographic ? 'longitude/latitude' : 'projected'})${notes}` : `${crs.name} (${crs.code})${notes}` };
  } catch (e) {
    if (e instanceof CrsError) return { ok: false, text: toReadOptionsMessage(text) ?? e.message };
    throw e;
  }
}

function toReadOptionsMessage(text: string): string | undefined {
  try {
    toReadOptions({ planeNotation: 'auto', lineNotation: 'auto', north: 'true', crs: text });
    return undefined;
  } catch (e) {
    return e instanceof ImportOptionsError ? e.message : undefined;
  }
}
