import proj4 from 'proj4';
import { normalizeAzimuth, toDegrees } from '../core/math';

/**
 * Coordinate reference systems: turning map coordinates into WGS84 longitude and latitude
 * (and back), and the grid convergence that relates grid north to true north.
 *
 * A small table of definitions is built in (WGS84; UTM on WGS84, ETRS89 and NAD83, generated
 * from the zone number; a few national grids). Any other EPSG code needs a loader: `epsgNode.ts`
 * for Node reads one small file from the `epsg-index` package; `epsgTable.ts`, for the browser,
 * loads a compact table of the whole index as a chunk of its own on first use, so the 8 MB
 * index is never bundled. A code once resolved is remembered in this JavaScript context, so the
 * synchronous {@link crsFromText} knows it from then on.
 *
 * Axis order: x is easting (or longitude), y is northing (or latitude), whatever the EPSG
 * register says about the axis order of the CRS (common practice in GIS files).
 */

/** Area of use in degrees; `west > east` when it crosses the antimeridian. */
export interface LonLatBox {
  readonly west: number;
  readonly south: number;
  readonly east: number;
  readonly north: number;
}

/** A coordinate reference system ready for use. */
export interface Crs {
  /** "EPSG:32633", or "PROJ4" for a definition given as text. */
  readonly code: string;
  readonly name: string;
  /** The proj4 definition used. */
  readonly proj4: string;
  /** Whether coordinates are longitude and latitude in degrees. */
  readonly geographic: boolean;
  readonly area?: LonLatBox;
  /** What the user should know about this definition (e.g. a datum shift left out). */
  readonly notes: readonly string[];
}

/** One record of the `epsg-index` package (`s/<code>.json`). */
export interface EpsgRecord {
  readonly code: string;
  readonly kind: string;
  readonly name: string;
  readonly proj4: string;
  /** [north, west, south, east] in degrees, as the package writes it. */
  readonly bbox?: readonly number[];
}

/** Finds an EPSG record by code, or undefined when there is none. */
export type EpsgLoader = (code: number) => Promise<EpsgRecord | undefined>;

/**
 * The only error the CRS functions throw: an unknown or unusable CRS, or a point that
 * cannot be projected.
 * @example try { crsFromText('EPSG:99999'); } catch (e) { (e as CrsError).message }
 */
export class CrsError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'CrsError';
  }
}

const WGS84 = '+proj=longlat +datum=WGS84 +no_defs';

/** EPSG codes resolved through a loader in this JavaScript context (a page, a worker, a process). */
const resolved = new Map<number, Crs>();

/** Kinds of EPSG record whose coordinates are not map x/y (heights, Earth-centred, local engineering). */
const NOT_FOR_MAPS: Readonly<Record<string, string>> = {
  'CRS-VERTCRS': 'a vertical (height) system',
  'CRS-GCENCRS': 'an Earth-centred (geocentric) system',
  'CRS-ENGCRS': 'a local engineering system',
};

/** Source of the named definitions: the `epsg-index` 2.0.0 package (EPSG register), except where noted. */
const NAMED: readonly { code: number; names: readonly string[]; name: string; proj4: string; bbox: readonly number[]; notes?: string[] }[] = [
  { code: 4326, names: ['wgs84', 'wgs 84', 'lonlat', 'crs84'], name: 'WGS 84', proj4: WGS84, bbox: [90, -180, -90, 180] },
  {
    code: 3857,
    names: ['web mercator', 'pseudo-mercator'],
    name: 'WGS 84 / Pseudo-Mercator',
    proj4: '+proj=merc +a=6378137 +b=6378137 +lat_ts=0 +lon_0=0 +x_0=0 +y_0=0 +k=1 +units=m +nadgrids=@null +no_defs',
    bbox: [85.06, -180, -85.06, 180],
  },
  {
    code: 27700,
    names: ['bng', 'british national grid', 'osgb', 'osgb36'],
    name: 'OSGB36 / British National Grid',
    // The register's definition shifts the datum with the OSTN15 grid file, which is not
    // shipped; the Ordnance Survey's 7-parameter Helmert (from memory, proj4 sign convention)
    // replaces it, good to a few metres.
    proj4:
      '+proj=tmerc +lat_0=49 +lon_0=-2 +k=0.9996012717 +x_0=400000 +y_0=-100000 +ellps=airy +towgs84=446.448,-125.157,542.06,0.15,0.247,0.842,-20.489 +units=m +no_defs',
    bbox: [61.01, -9, 49.75, 2.01],
    notes: ['OSGB36 to WGS84 by the 7-parameter Helmert shift (a few metres), not the OSTN15 grid'],
  },
  {
    code: 29903,
    names: ['irish grid'],
    name: 'TM75 / Irish Grid',
    proj4: '+proj=tmerc +lat_0=53.5 +lon_0=-8 +k=1.000035 +x_0=200000 +y_0=250000 +a=6377340.189 +rf=299.3249646 +towgs84=482.5,-130.6,564.6,-1.042,-0.214,-0.631,8.15 +units=m +no_defs',
    bbox: [55.43, -10.56, 51.39, -5.34],
  },
  {
    code: 2157,
    names: ['itm', 'irish transverse mercator'],
    name: 'IRENET95 / Irish Transverse Mercator',
    proj4: '+proj=tmerc +lat_0=53.5 +lon_0=-8 +k=0.99982 +x_0=600000 +y_0=750000 +ellps=GRS80 +towgs84=0,0,0,0,0,0,0 +units=m +no_defs',
    bbox: [55.43, -10.56, 51.39, -5.34],
  },
  {
    code: 2193,
    names: ['nztm', 'nztm2000'],
    name: 'NZGD2000 / New Zealand Transverse Mercator 2000',
    proj4: '+proj=tmerc +lat_0=0 +lon_0=173 +k=0.9996 +x_0=1600000 +y_0=10000000 +ellps=GRS80 +towgs84=0,0,0,0,0,0,0 +units=m +no_defs',
    bbox: [-34.1, 166.37, -47.33, 178.63],
  },
  {
    code: 2154,
    names: ['lambert-93', 'lambert 93', 'rgf93'],
    name: 'RGF93 v1 / Lambert-93',
    proj4: '+proj=lcc +lat_0=46.5 +lon_0=3 +lat_1=49 +lat_2=44 +x_0=700000 +y_0=6600000 +ellps=GRS80 +towgs84=0,0,0,0,0,0,0 +units=m +no_defs',
    bbox: [51.56, -9.86, 41.15, 10.38],
  },
  {
    code: 2056,
    names: ['lv95', 'ch1903+'],
    name: 'CH1903+ / LV95',
    proj4: '+proj=somerc +lat_0=46.9524055555556 +lon_0=7.43958333333333 +k_0=1 +x_0=2600000 +y_0=1200000 +ellps=bessel +towgs84=674.374,15.056,405.346,0,0,0,0 +units=m +no_defs',
    bbox: [47.81, 5.96, 45.82, 10.49],
  },
  {
    code: 28992,
    names: ['rd new', 'rd'],
    name: 'Amersfoort / RD New',
    proj4: '+proj=sterea +lat_0=52.1561605555556 +lon_0=5.38763888888889 +k=0.9999079 +x_0=155000 +y_0=463000 +ellps=bessel +towgs84=565.4171,50.3319,465.5524,1.9342,-1.6677,9.1019,4.0725 +units=m +no_defs',
    bbox: [53.7, 3.2, 50.75, 7.22],
  },
  {
    code: 3006,
    names: ['sweref99 tm'],
    name: 'SWEREF99 TM',
    proj4: '+proj=utm +zone=33 +ellps=GRS80 +towgs84=0,0,0,0,0,0,0 +units=m +no_defs',
    bbox: [69.07, 10.03, 54.96, 24.17],
  },
  {
    code: 3035,
    names: ['laea europe', 'etrs89 laea'],
    name: 'ETRS89-extended / LAEA Europe',
    proj4: '+proj=laea +lat_0=52 +lon_0=10 +x_0=4321000 +y_0=3210000 +ellps=GRS80 +towgs84=0,0,0,0,0,0,0 +units=m +no_defs',
    bbox: [84.73, -35.58, 24.6, 44.83],
  },
  {
    code: 31370,
    names: ['belgian lambert 72', 'lambert 72'],
    name: 'BD72 / Belgian Lambert 72',
    proj4: '+proj=lcc +lat_0=90 +lon_0=4.36748666666667 +lat_1=51.1666672333333 +lat_2=49.8333339 +x_0=150000.013 +y_0=5400088.438 +ellps=intl +towgs84=-106.8686,52.2978,-103.7239,-0.3366,0.457,-1.8422,-1.2747 +units=m +no_defs',
    bbox: [51.51, 2.5, 49.5, 6.4],
  },
  {
    code: 5070,
    names: ['conus albers'],
    name: 'NAD83 / Conus Albers',
    proj4: '+proj=aea +lat_0=23 +lon_0=-96 +lat_1=29.5 +lat_2=45.5 +x_0=0 +y_0=0 +ellps=GRS80 +towgs84=0,0,0,0,0,0,0 +units=m +no_defs',
    bbox: [49.38, -124.79, 24.41, -66.91],
  },
];

/**
 * UTM families generated from the zone number: [first code, datum text, hemisphere, first zone,
 * last zone, name, south, north]. A zone's area is its 6° of longitude between the latitudes
 * given: the EPSG areas for WGS 84 (equator to 84°N, 80°S to equator), and for ETRS89 and NAD83
 * the span of latitude that covers every zone of the family in the register (so a little
 * wider than any one zone's area of use).
 */
const UTM_FAMILIES: readonly (readonly [number, string, 'N' | 'S', number, number, string, number, number])[] = [
  [32601, '+datum=WGS84', 'N', 1, 60, 'WGS 84', 0, 84],
  [32701, '+datum=WGS84', 'S', 1, 60, 'WGS 84', -80, 0],
  [25828, '+ellps=GRS80 +towgs84=0,0,0,0,0,0,0', 'N', 28, 37, 'ETRS89', 34, 85],
  [26901, '+ellps=GRS80 +towgs84=0,0,0,0,0,0,0', 'N', 1, 23, 'NAD83', 14, 84],
];

/**
 * The built-in CRS for an EPSG code, or undefined when it is not in the table.
 * @example builtInCrs(32633)?.proj4 // '+proj=utm +zone=33 +datum=WGS84 +units=m +no_defs'
 */
export function builtInCrs(code: number): Crs | undefined {
  for (const [first, datum, hemisphere, firstZone, lastZone, datumName, south, north] of UTM_FAMILIES) {
    const zone = code - first + firstZone;
    if (code >= first && zone <= lastZone) {
      const west = -180 + (zone - 1) * 6;
      return {
        code: `EPSG:${code}`,
        name: `${datumName} / UTM zone ${zone}${hemisphere}`,
        proj4: `+proj=utm +zone=${zone}${hemisphere === 'S' ? ' +south' : ''} ${datum} +units=m +no_defs`,
        geographic: false,
        area: { west, south, east: west + 6, north },
        notes: [],
      };
    }
  }
  const named = NAMED.find((n) => n.code === code);
  return named ? fromNamed(named) : undefined;
}

/**
 * Reads a CRS given as text without touching any loader: "EPSG:32633", "32633",
 * "urn:ogc:def:crs:EPSG::27700", "UTM 33N", "UTM33S", a built-in name such as "BNG",
 * or a proj4 definition starting with "+proj=", or an EPSG code already resolved by
 * {@link resolveCrs} here. Throws {@link CrsError} for anything else.
 * @example crsFromText('utm 33n').code // 'EPSG:32633'
 */
export function crsFromText(text: string): Crs {
  const found = lookupText(text);
  if (found.crs) return found.crs;
  if (found.code !== undefined) {
    throw new CrsError(`EPSG:${found.code} is not in the built-in table and has not been looked up in the EPSG index yet (resolveCrs)`);
  }
  throw new CrsError(unknownCrsMessage(text));
}

/**
 * Like {@link crsFromText}, but asks `loader` for EPSG codes that are not built in, and
 * remembers what it found for {@link crsFromText}. Heights, Earth-centred and engineering
 * systems are refused: x and y must be map coordinates.
 * Mandatory datum-shift grid files in a loaded definition cannot be used (none are shipped):
 * they are made optional and the Crs carries a note saying the shift is left out.
 * @example await resolveCrs('EPSG:2056') // built in, the loader is not asked
 */
export async function resolveCrs(text: string, loader?: EpsgLoader): Promise<Crs> {
  const found = lookupText(text);
  if (found.crs) return found.crs;
  if (found.code === undefined) throw new CrsError(unknownCrsMessage(text));
  if (!loader) throw new CrsError(`EPSG:${found.code} is not in the built-in table and no EPSG index is available here`);
  let record: EpsgRecord | undefined;
  try {
    record = await loader(found.code);
  } catch (e) {
    throw new CrsError(`could not read the EPSG index for EPSG:${found.code}: ${(e as Error).message}`);
  }
  if (!record) throw new CrsError(`EPSG:${found.code} is not a coordinate reference system the EPSG index knows`);
  const notForMaps = NOT_FOR_MAPS[record.kind];
  if (notForMaps) throw new CrsError(`EPSG:${found.code} (${record.name}) is ${notForMaps}; x and y need a projected or geographic coordinate reference system`);
  if (typeof record.proj4 !== 'string' || record.proj4 === '') {
    throw new CrsError(`EPSG:${found.code} (${record.name}) has no proj4 definition in the EPSG index; give its proj4 definition (+proj=...) instead`);
  }
  const crs = fromRecord(found.code, record);
  resolved.set(found.code, crs);
  return crs;
}

/**
 * Makes an EPSG CRS resolved elsewhere (on the page, for a worker) known here, as if
 * {@link resolveCrs} had found it, so the same table need not be loaded twice. Throws
 * {@link CrsError} for a CRS whose code is not `EPSG:<n>` or whose definition proj4 cannot use.
 * @example rememberCrs(await resolveCrs('EPSG:2263', loadEpsgFromTable)); // in a worker: crsFromText('EPSG:2263') now works
 */
export function rememberCrs(crs: Crs): void {
  const m = /^EPSG:(\d+)$/.exec(crs.code);
  if (!m) throw new CrsError(`${crs.code} is not an EPSG code; only EPSG codes are remembered`);
  converter(crs);
  resolved.set(Number(m[1]), crs);
}

/**
 * The EPSG code that `text` names when that code is neither built in nor resolved here yet
 * (so {@link resolveCrs} must ask a loader before {@link crsFromText} can use it); otherwise
 * undefined (also for text that is no EPSG code at all).
 * @example pendingEpsgCode('EPSG:2263') // 2263, until resolveCrs('EPSG:2263', loader) has run
 */
export function pendingEpsgCode(text: string): number | undefined {
  const t = text.trim();
  if (t.startsWith('+proj=')) return undefined;
  const found = lookupText(t);
  return found.crs ? undefined : found.code;
}

/**
 * Longitude and latitude (WGS84, degrees) of a point given in `crs`. Throws {@link CrsError}
 * when proj4 cannot project the point.
 * @example toLonLat(500000, 0, builtInCrs(32633)!) // { lon: 15, lat: 0 }
 */
export function toLonLat(x: number, y: number, crs: Crs): { lon: number; lat: number } {
  const [lon, lat] = projected(() => converter(crs).inverse([x, y]));
  if (!Number.isFinite(lon) || !Number.isFinite(lat)) throw new CrsError(`(${x}, ${y}) cannot be converted from ${crs.code} to longitude and latitude`);
  return { lon, lat };
}

/**
 * Coordinates in `crs` of a WGS84 longitude and latitude. Throws {@link CrsError} when proj4
 * cannot project the point.
 * @example fromLonLat(15, 0, builtInCrs(32633)!) // { x: 500000, y: 0 }
 */
export function fromLonLat(lon: number, lat: number, crs: Crs): { x: number; y: number } {
  const [x, y] = projected(() => converter(crs).forward([lon, lat]));
  if (!Number.isFinite(x) || !Number.isFinite(y)) throw new CrsError(`(${lon}, ${lat}) cannot be converted to ${crs.code}`);
  return { x, y };
}

/**
 * The UTM zone of a point, with the Norway and Svalbard exceptions (common practice), and
 * the EPSG code of that zone on WGS84.
 * @example utmZoneFor(15.2, 45.1) // { zone: 33, hemisphere: 'N', epsg: 32633 }
 */
export function utmZoneFor(lon: number, lat: number): { zone: number; hemisphere: 'N' | 'S'; epsg: number } {
  if (!Number.isFinite(lon) || !Number.isFinite(lat) || Math.abs(lat) > 90) {
    throw new CrsError(`(${lon}, ${lat}) is not a longitude and latitude`);
  }
  const l = ((((lon + 180) % 360) + 360) % 360) - 180;
  let zone = Math.min(60, Math.floor((l + 180) / 6) + 1);
  if (lat >= 56 && lat < 64 && l >= 3 && l < 12) zone = 32;
  if (lat >= 72 && lat < 84) {
    if (l >= 0 && l < 9) zone = 31;
    else if (l >= 9 && l < 21) zone = 33;
    else if (l >= 21 && l < 33) zone = 35;
    else if (l >= 33 && l < 42) zone = 37;
  }
  const hemisphere = lat >= 0 ? 'N' : 'S';
  return { zone, hemisphere, epsg: (hemisphere === 'N' ? 32600 : 32700) + zone };
}

/**
 * Grid convergence at a point, in degrees: the angle from true north clockwise to grid north
 * (positive when grid north lies east of true north, as it does east of the central meridian
 * of a transverse Mercator grid in the northern hemisphere). Hence
 * `true azimuth = grid azimuth + gridConvergence(...)`. Zero for a geographic CRS.
 *
 * Computed from the projection itself: the direction of the projected meridian through the
 * point, by a central difference of ±1e-5° of latitude. For transverse Mercator this matches
 * γ ≈ Δλ·sin φ (derived from the projection's meridian slope; see the tests).
 * @example gridConvergence(16, 45, builtInCrs(32633)!) // ≈ 0.7071 (= 1° · sin 45°)
 */
export function gridConvergence(lon: number, lat: number, crs: Crs): number {
  if (crs.geographic) return 0;
  const d = 1e-5;
  const a = fromLonLat(lon, lat - d, crs);
  const b = fromLonLat(lon, lat + d, crs);
  // Grid azimuth of true north; grid north is that angle the other way.
  const trueNorthOnGrid = toDegrees(Math.atan2(b.x - a.x, b.y - a.y));
  const gamma = -trueNorthOnGrid;
  return normalizeAzimuth(gamma + 180) - 180;
}

/**
 * Why a longitude and latitude pair cannot be a WGS84 position (as what was expected instead,
 * to follow "expected" in a message), or undefined when it can.
 * Spots latitude and longitude written in each other's columns when the latitude is beyond
 * ±90 but the longitude is not, and projected metres put in degree columns.
 * @example lonLatProblem(45, 120) // 'a latitude from -90 to 90; latitude and longitude look swapped (latitude 120 ...'
 */
export function lonLatProblem(lon: number, lat: number): string | undefined {
  if (!Number.isFinite(lon) || !Number.isFinite(lat)) return 'numbers for longitude and latitude';
  if (Math.abs(lon) > 360 || Math.abs(lat) > 360) return 'degrees of longitude and latitude; these look like projected coordinates in metres (put them in x/y columns and give their CRS)';
  if (Math.abs(lat) > 90 && Math.abs(lon) <= 90) return `a latitude from -90 to 90; latitude and longitude look swapped (latitude ${lat} is beyond ±90, longitude ${lon} is not)`;
  if (Math.abs(lat) > 90) return 'a latitude from -90 to 90';
  if (Math.abs(lon) > 180) return 'a longitude from -180 to 180';
  return undefined;
}

/**
 * Whether a longitude and latitude lie in the area of use of `crs`, widened by `marginDegrees`
 * on every side (default 1°: work near a zone edge often stays in one zone). True when the CRS
 * has no recorded area.
 * @example inArea(17.5, 45, builtInCrs(32633)!) // true
 */
export function inArea(lon: number, lat: number, crs: Crs, marginDegrees = 1): boolean {
  const a = crs.area;
  if (!a) return true;
  if (lat < a.south - marginDegrees || lat > a.north + marginDegrees) return false;
  const l = ((((lon + 180) % 360) + 360) % 360) - 180;
  if (a.west <= a.east) return l >= a.west - marginDegrees && l <= a.east + marginDegrees;
  return l >= a.west - marginDegrees || l <= a.east + marginDegrees;
}

/**
 * The area of use as words, for messages: "12°E to 18°E, 0°N to 84°N".
 * @example describeArea({ west: 12, south: 0, east: 18, north: 84 }) // '12°E to 18°E, 0°N to 84°N'
 */
export function describeArea(a: LonLatBox): string {
  const ew = (v: number): string => `${Math.abs(v)}°${v < 0 ? 'W' : 'E'}`;
  const ns = (v: number): string => `${Math.abs(v)}°${v < 0 ? 'S' : 'N'}`;
  return `${ew(a.west)} to ${ew(a.east)}, ${ns(a.south)} to ${ns(a.north)}`;
}

const converters = new Map<string, proj4.Converter>();

/**
 * A point through proj4, which throws a TypeError for coordinates that are not finite numbers
 * (and may throw for others it cannot handle): here that is a point that cannot be converted,
 * given back as NaN for the caller's CrsError naming the point.
 */
function projected(convert: () => number[]): number[] {
  try {
    return convert();
  } catch (e) {
    if (e instanceof CrsError) throw e;
    return [Number.NaN, Number.NaN];
  }
}

function converter(crs: Crs): proj4.Converter {
  let c = converters.get(crs.proj4);
  if (!c) {
    try {
      c = proj4(WGS84, crs.proj4);
    } catch (e) {
      throw new CrsError(`proj4 cannot use the definition of ${crs.code}: ${(e as Error).message ?? String(e)}`);
    }
    converters.set(crs.proj4, c);
  }
  return c;
}

function fromNamed(n: (typeof NAMED)[number]): Crs {
  return {
    code: `EPSG:${n.code}`,
    name: n.name,
    proj4: n.proj4,
    geographic: n.proj4.includes('+proj=longlat'),
    area: boxFromBbox(n.bbox),
    notes: n.notes ?? [],
  };
}

function fromRecord(code: number, r: EpsgRecord): Crs {
  const notes: string[] = [];
  // No grid files are shipped, and proj4 gives NaN for every point when a grid is missing
  // unless the list ends in "@null" (no shift). Make every grid optional and add that ending.
  const def = r.proj4
    .replace(/\+nadgrids=(\S+)/g, (m, grids: string) => {
      const names = grids.split(',').map((g) => g.replace(/^@/, ''));
      if (names.every((g) => g === 'null')) return m;
      notes.push(
        `the datum shift grid ${names.filter((g) => g !== 'null').join(', ')} is not available, so the datum shift of EPSG:${code} is left out (errors up to about 100 m)`,
      );
      return `+nadgrids=${[...names.filter((g) => g !== 'null').map((g) => `@${g}`), '@null'].join(',')}`;
    })
    .replace(/\s*\+type=crs/, '');
  notes.push(...methodNotes(def));
  const crs: Crs = {
    code: `EPSG:${code}`,
    name: r.name,
    proj4: def,
    geographic: def.includes('+proj=longlat'),
    area: r.bbox && r.bbox.length === 4 ? boxFromBbox(r.bbox) : undefined,
    notes,
  };
  converter(crs); // fail now, not on the first row
  return crs;
}

/**
 * What proj4 computes differently from the EPSG method of a definition. proj4js works the
 * Equidistant Cylindrical projection on a sphere of the semi-major axis even for an ellipsoid:
 * EPSG Guidance Note 7-2's example for EPSG:4087 (55°N, 10°E) has N 6097230.31 m where proj4js
 * gives 6122571.99 m (its own value, from the tests).
 */
function methodNotes(def: string): string[] {
  if (/\+proj=eqc\b/.test(def) && !/\+R=|\+ellps=sphere\b/.test(def)) {
    return ['the equidistant cylindrical projection is computed on a sphere, so northings differ from the ellipsoidal EPSG method (by 25 km at 55°N)'];
  }
  return [];
}

function boxFromBbox(b: readonly number[]): LonLatBox {
  // epsg-index writes [north, west, south, east].
  return { north: b[0], west: b[1], south: b[2], east: b[3] };
}

function lookupText(text: string): { crs?: Crs; code?: number } {
  const t = text.trim();
  if (t.startsWith('+proj=')) {
    const crs: Crs = { code: 'PROJ4', name: t, proj4: t, geographic: t.includes('+proj=longlat'), notes: methodNotes(t) };
    converter(crs);
    return { crs };
  }
  const lower = t.toLowerCase();
  const epsg = /^(?:epsg\s*:{1,2}\s*|urn:ogc:def:crs:epsg:[\d.]*:)?(\d{4,6})$/.exec(lower);
  if (epsg) {
    const code = Number(epsg[1]);
    return { crs: builtInCrs(code) ?? resolved.get(code), code };
  }
  const utm = /^utm\s*(?:zone\s*)?(\d{1,2})\s*([ns])$/.exec(lower);
  if (utm) {
    const zone = Number(utm[1]);
    if (zone >= 1 && zone <= 60) return { crs: builtInCrs((utm[2] === 'n' ? 32600 : 32700) + zone) };
  }
  const named = NAMED.find((n) => n.names.includes(lower));
  if (named) return { crs: fromNamed(named) };
  return {};
}

function unknownCrsMessage(text: string): string {
  return `"${text}" is not a CRS Foldlens can read: expected EPSG:<code> (e.g. EPSG:32633), "UTM 33N", a proj4 definition (+proj=...), or one of: ${NAMED.flatMap((n) => n.names[0]).join(', ')}`;
}
