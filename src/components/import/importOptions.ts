import { builtInCrs, crsFromText, CrsError, type Crs } from '../../io/crs';
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

/**
 * The reader options for stored import options: the CRS text resolved with the built-in table
 * (crs.ts), the default date parsed. Throws {@link ImportOptionsError} naming the option.
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
        throw new ImportOptionsError(
          'crs',
          /not in the built-in table/.test(e.message)
            ? `${e.message.replace(/; it needs the EPSG index.*$/, '')}; in the browser, give its proj4 definition (+proj=...) instead`
            : e.message,
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
 * A one-line description of a CRS text for the form: its name and area, or why it cannot be used.
 * @example describeCrsText('UTM 33N') // { ok: true, text: 'WGS 84 / UTM zone 33N (EPSG:32633)' }
 */
export function describeCrsText(text: string): { ok: boolean; text: string } {
  if (text.trim() === '') return { ok: false, text: 'no coordinate system chosen' };
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
