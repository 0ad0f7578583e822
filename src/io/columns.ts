/**
 * Recognising which column holds what, from the field names the trade commonly writes.
 *
 * A header is compared after lower-casing, dropping a unit in brackets ("Dip (°)",
 * "Elevation [m]") and dropping every character that is not a letter or digit, so
 * "Dip Dir", "dip_dir", "DIP-DIR" and "DipDir" all read as `dipdir`.
 *
 * | field | header names recognised (common practice) |
 * |---|---|
 * | id | id, station, station id, station no, station number, station name, stn, stn id, site, site id, locality, locality id, loc, point, point id, pt, pt id, obs, observation, observation id, name |
 * | kind | kind, type, feature, feature type, structure, structure type, structural feature, measurement, measurement type, measurement kind, element |
 * | dipDirection | dipdir, dip dir, dip direction, dip dirn, dip azimuth, dip az, dd, ddir, dip dir deg |
 * | dip | dip, dip angle, dip amount, dip deg, dip value |
 * | strike | strike, strk, str, strike azimuth, strike rhr, rhr strike, strike dir |
 * | dipQuadrant | dip quadrant, dip quad, quadrant, quad, dip sense, dip direction quadrant, dip dir quadrant, dip dir letter |
 * | trend | trend, trd, line trend, lineation trend, plunge direction, plunge dir, plunge azimuth, trend azimuth, bearing |
 * | plunge | plunge, plg, plunge angle, plunge amount, lineation plunge, line plunge |
 * | rake | rake, pitch, rake angle |
 * | attitude | attitude, orientation, reading, strike dip, strike and dip, dip dipdir, dip dip direction, dipdir dip, trend plunge |
 * | x | x, easting, east, e, x coord, x coordinate, utm e, utm easting, map x, proj x |
 * | y | y, northing, north, n, y coord, y coordinate, utm n, utm northing, map y, proj y |
 * | lon | lon, lng, long, longitude, lon dd, long dd, longitude dd, decimal longitude, wgs84 lon |
 * | lat | lat, latitude, lat dd, latitude dd, decimal latitude, wgs84 lat |
 * | elevation | z, elev, elevation, height, alt, altitude, z coord, rl, m asl, masl |
 * | date | date, datetime, date time, measured, date measured, survey date, observed, observation date, field date, timestamp |
 * | notes | notes, note, comment, comments, remarks, remark, description, desc, memo |
 * | overturned | overturned, ot, inverted, is overturned, overturned flag |
 * | sense | fold sense, hinge sense, closure, sense |
 *
 * Context words: "azimuth", "az", "azi", "direction", "dir" are read as dipDirection when the
 * file has a dip column and no plunge column, as trend when it has plunge and no dip; "angle",
 * "inclination", "incl" as dip when the file has a dip direction or strike and no trend, as
 * plunge when it has a trend and neither of those. Otherwise they are reported as ambiguous.
 * Two columns that both name one field are reported, never resolved by a guess; explicit
 * overrides always win.
 */

/** The logical fields a column can hold. */
export const FIELDS = [
  'id',
  'kind',
  'dipDirection',
  'dip',
  'strike',
  'dipQuadrant',
  'trend',
  'plunge',
  'rake',
  'attitude',
  'x',
  'y',
  'lon',
  'lat',
  'elevation',
  'date',
  'notes',
  'overturned',
  'sense',
] as const;

export type Field = (typeof FIELDS)[number];

/**
 * Which column (by its exact header text) holds each field. A plain JSON object, so it can be
 * saved and given back later: `{"dipDirection": "Dip Dir", "dip": "Dip"}`.
 */
export type ColumnMapping = { readonly [F in Field]?: string };

/** Something column detection could not settle on its own. */
export interface ColumnIssue {
  readonly kind: 'ambiguous' | 'missing-column' | 'unknown-field' | 'column-used-twice';
  readonly field: string;
  readonly columns: readonly string[];
  readonly message: string;
}

/** Result of {@link detectColumns}. */
export interface ColumnDetection {
  readonly mapping: ColumnMapping;
  /** Headers not mapped to any field (they are still kept with every station). */
  readonly unused: readonly string[];
  readonly issues: readonly ColumnIssue[];
}

const SYNONYMS: Readonly<Record<Field, readonly string[]>> = {
  id: ['id', 'station', 'stationid', 'stationno', 'stationnumber', 'stationname', 'stn', 'stnid', 'site', 'siteid', 'locality', 'localityid', 'loc', 'point', 'pointid', 'pt', 'ptid', 'obs', 'observation', 'observationid', 'name'],
  kind: ['kind', 'type', 'feature', 'featuretype', 'structure', 'structuretype', 'structuralfeature', 'measurement', 'measurementtype', 'measurementkind', 'element'],
  dipDirection: ['dipdir', 'dipdirection', 'dipdirn', 'dipazimuth', 'dipaz', 'dd', 'ddir', 'dipdirdeg'],
  dip: ['dip', 'dipangle', 'dipamount', 'dipdeg', 'dipvalue'],
  strike: ['strike', 'strk', 'str', 'strikeazimuth', 'strikerhr', 'rhrstrike', 'strikedir'],
  dipQuadrant: ['dipquadrant', 'dipquad', 'quadrant', 'quad', 'dipsense', 'dipdirectionquadrant', 'dipdirquadrant', 'dipdirletter'],
  trend: ['trend', 'trd', 'linetrend', 'lineationtrend', 'plungedirection', 'plungedir', 'plungeazimuth', 'trendazimuth', 'bearing'],
  plunge: ['plunge', 'plg', 'plungeangle', 'plungeamount', 'lineationplunge', 'lineplunge'],
  rake: ['rake', 'pitch', 'rakeangle'],
  attitude: ['attitude', 'orientation', 'reading', 'strikedip', 'strikeanddip', 'dipdipdir', 'dipdipdirection', 'dipdirdip', 'trendplunge'],
  x: ['x', 'easting', 'east', 'e', 'xcoord', 'xcoordinate', 'utme', 'utmeasting', 'mapx', 'projx'],
  y: ['y', 'northing', 'north', 'n', 'ycoord', 'ycoordinate', 'utmn', 'utmnorthing', 'mapy', 'projy'],
  lon: ['lon', 'lng', 'long', 'longitude', 'londd', 'longdd', 'longitudedd', 'decimallongitude', 'wgs84lon'],
  lat: ['lat', 'latitude', 'latdd', 'latitudedd', 'decimallatitude', 'wgs84lat'],
  elevation: ['z', 'elev', 'elevation', 'height', 'alt', 'altitude', 'zcoord', 'rl', 'masl', 'elevationm', 'elevm', 'heightm', 'zm', 'altm'],
  date: ['date', 'datetime', 'measured', 'datemeasured', 'surveydate', 'observed', 'observationdate', 'fielddate', 'timestamp'],
  notes: ['notes', 'note', 'comment', 'comments', 'remarks', 'remark', 'description', 'desc', 'memo'],
  overturned: ['overturned', 'ot', 'inverted', 'isoverturned', 'overturnedflag'],
  sense: ['foldsense', 'hingesense', 'closure', 'sense'],
};

/** Header words that need the rest of the file to say what they are. */
const AZIMUTH_WORDS = ['azimuth', 'az', 'azi', 'direction', 'dir'];
const ANGLE_WORDS = ['angle', 'inclination', 'incl'];

/** The synonym table, for documentation and tests. */
export const COLUMN_SYNONYMS: Readonly<Record<Field, readonly string[]>> = SYNONYMS;

/**
 * The comparison key of a header: lower case, unit in brackets dropped, letters and digits only.
 * @example headerKey('Dip Dir (°)') // 'dipdir'
 */
export function headerKey(header: string): string {
  return header
    .toLowerCase()
    .replace(/[([{][^)\]}]*[)\]}]/g, '')
    .replace(/[^\p{L}\p{N}]+/gu, '');
}

const FIELD_BY_KEY: ReadonlyMap<string, Field> = new Map(
  (Object.entries(SYNONYMS) as [Field, readonly string[]][]).flatMap(([field, keys]) => keys.map((k) => [k, field] as const)),
);

/**
 * Works out a {@link ColumnMapping} from the headers. Explicit `overrides` (field -> header)
 * always win and take their column out of detection. Never throws; anything unsettled is in
 * `issues`, and a field with an issue stays unmapped.
 * @example
 * detectColumns(['Station', 'Type', 'Dip Dir', 'Dip']).mapping
 * // { id: 'Station', kind: 'Type', dipDirection: 'Dip Dir', dip: 'Dip' }
 * detectColumns(['azimuth', 'angle'], { dipDirection: 'azimuth', dip: 'angle' }).issues // []
 */
export function detectColumns(headers: readonly string[], overrides: Readonly<Record<string, string | undefined>> = {}): ColumnDetection {
  const mapping: Partial<Record<Field, string>> = {};
  const issues: ColumnIssue[] = [];
  const taken = new Set<string>();

  for (const [field, wanted] of Object.entries(overrides)) {
    if (wanted === undefined) continue;
    if (!(FIELDS as readonly string[]).includes(field)) {
      issues.push({ kind: 'unknown-field', field, columns: [wanted], message: `"${field}" is not a field; expected one of ${FIELDS.join(', ')}` });
      continue;
    }
    const column = findHeader(headers, wanted);
    if (column === undefined) {
      issues.push({
        kind: 'missing-column',
        field,
        columns: [wanted],
        message: `no column is named "${wanted}" (given for ${field}); the columns are: ${headers.map((h) => `"${h}"`).join(', ')}`,
      });
      continue;
    }
    if (taken.has(column)) {
      issues.push({ kind: 'column-used-twice', field, columns: [column], message: `column "${column}" is given for two fields` });
      continue;
    }
    mapping[field as Field] = column;
    taken.add(column);
  }

  // Named columns first.
  const byField = new Map<Field, string[]>();
  const azimuthLike: string[] = [];
  const angleLike: string[] = [];
  for (const h of headers) {
    if (taken.has(h)) continue;
    const key = headerKey(h);
    const field = FIELD_BY_KEY.get(key);
    if (field !== undefined) {
      if (mapping[field] !== undefined) continue; // an override already holds this field
      byField.set(field, [...(byField.get(field) ?? []), h]);
    } else if (AZIMUTH_WORDS.includes(key)) azimuthLike.push(h);
    else if (ANGLE_WORDS.includes(key)) angleLike.push(h);
  }
  for (const [field, columns] of byField) {
    if (columns.length === 1) {
      mapping[field] = columns[0];
      taken.add(columns[0]);
    } else {
      issues.push(ambiguous(field, columns));
    }
  }

  // Context words, read against the named columns.
  const hasIssue = (f: Field): boolean => issues.some((i) => i.field === f);
  const has = (f: Field): boolean => mapping[f] !== undefined || hasIssue(f);
  const azimuthField: Field | undefined = has('dip') && !has('plunge') ? 'dipDirection' : has('plunge') && !has('dip') ? 'trend' : undefined;
  const angleField: Field | undefined =
    (has('dipDirection') || has('strike') || azimuthField === 'dipDirection') && !has('trend') && azimuthField !== 'trend'
      ? 'dip'
      : (has('trend') || azimuthField === 'trend') && !has('dipDirection') && !has('strike')
        ? 'plunge'
        : undefined;
  assignContext(azimuthLike, azimuthField, ['dipDirection', 'trend'], mapping, taken, issues);
  assignContext(angleLike, angleField, ['dip', 'plunge'], mapping, taken, issues);

  return { mapping: orderMapping(mapping), unused: headers.filter((h) => !taken.has(h)), issues };
}

/**
 * Reads a saved mapping back (the parsed JSON), checking every key is a field and every value a
 * string. Throws a TypeError naming the bad entry.
 * @example parseColumnMapping(JSON.parse('{"dip": "Dip"}')) // { dip: 'Dip' }
 */
export function parseColumnMapping(json: unknown): ColumnMapping {
  if (json === null || typeof json !== 'object' || Array.isArray(json)) {
    throw new TypeError('a column mapping is a JSON object such as {"dip": "Dip"}');
  }
  const out: Partial<Record<Field, string>> = {};
  for (const [field, column] of Object.entries(json)) {
    if (!(FIELDS as readonly string[]).includes(field)) throw new TypeError(`column mapping: "${field}" is not a field; expected one of ${FIELDS.join(', ')}`);
    if (typeof column !== 'string') throw new TypeError(`column mapping: the column for ${field} must be a header name in quotes, got ${JSON.stringify(column)}`);
    out[field as Field] = column;
  }
  return out;
}

function findHeader(headers: readonly string[], wanted: string): string | undefined {
  if (headers.includes(wanted)) return wanted;
  const loose = headers.filter((h) => h.trim().toLowerCase() === wanted.trim().toLowerCase());
  return loose.length === 1 ? loose[0] : undefined;
}

function ambiguous(field: string, columns: readonly string[]): ColumnIssue {
  return {
    kind: 'ambiguous',
    field,
    columns,
    message: `columns ${columns.map((c) => `"${c}"`).join(' and ')} could each be ${field}; say which one to use`,
  };
}

function assignContext(
  columns: readonly string[],
  field: Field | undefined,
  possible: readonly Field[],
  mapping: Partial<Record<Field, string>>,
  taken: Set<string>,
  issues: ColumnIssue[],
): void {
  if (columns.length === 0) return;
  if (field !== undefined && mapping[field] === undefined && columns.length === 1 && !issues.some((i) => i.field === field)) {
    mapping[field] = columns[0];
    taken.add(columns[0]);
    return;
  }
  if (field !== undefined && mapping[field] !== undefined) return; // the named column already holds it
  issues.push({
    kind: 'ambiguous',
    field: possible.join(' or '),
    columns,
    message: `column${columns.length > 1 ? 's' : ''} ${columns.map((c) => `"${c}"`).join(' and ')} could be ${possible.join(' or ')}; say which`,
  });
}

function orderMapping(mapping: Partial<Record<Field, string>>): ColumnMapping {
  const out: Partial<Record<Field, string>> = {};
  for (const f of FIELDS) if (mapping[f] !== undefined) out[f] = mapping[f];
  return out;
}
