import { detectPlaneNotation, tryParsePlane, NotationProblem } from '../../core/notation';
import { describeProblem, type RowProblem } from '../../core/station';
import { isPlaneKind } from '../../core/types';
import type { ColumnIssue, ColumnMapping, Field } from '../../io/columns';
import type { CsvRow } from '../../io/csvTable';
import { normalizeKind } from '../../io/kinds';
import { readStation, type StationReadOptions } from '../../io/readStations';
import type { ImportOptions } from '../../io/projectFile';
import { FIELD_LABELS, PLANE_NOTATION_LABELS } from './fields';
import { ImportOptionsError, toReadOptions } from './importOptions';

/**
 * Checks the mapping step before the file is read: what would stop the import making sense
 * (`error`: the Import button waits until it is settled), what the user should know (`warning`),
 * and what was simply noted (`info`). The first rows are read with the current choices, so row
 * problems (a dip of "50g", swapped coordinates) show up before the whole file is read.
 */

/** One message for the mapping step; `target` is the field or option it is about, for the form. */
export interface MappingMessage {
  readonly level: 'error' | 'warning' | 'info';
  readonly target?: Field | keyof ImportOptions | 'delimiter';
  readonly text: string;
}

/** What the check looks at. */
export interface MappingContext {
  readonly format: 'csv' | 'geojson';
  readonly headers: readonly string[];
  readonly preview: readonly CsvRow[];
  readonly mapping: ColumnMapping;
  readonly options: ImportOptions;
  /** Issues column detection could not settle (io/columns.ts). */
  readonly issues?: readonly ColumnIssue[];
}

const label = (f: Field): string => FIELD_LABELS[f];
/** A number, an attitude or a bearing (digits, signs, separators, compass letters, with at least one digit). */
const VALUE_LIKE = /^(?=.*\d)[\d\s.,+\-/°NESWnesw]+$/;
const quoted = (columns: readonly string[]): string => columns.map((c) => `"${c}"`).join(', ');

/**
 * All messages for the current choices, errors first.
 * @example checkMapping({ format: 'csv', headers: ['a'], preview: [], mapping: {}, options: DEFAULT_IMPORT_OPTIONS })[0].text
 * // 'No column holds an attitude: ...'
 */
export function checkMapping(ctx: MappingContext): MappingMessage[] {
  const out: MappingMessage[] = [];
  const m = ctx.mapping;
  const o = ctx.options;
  const error = (text: string, target?: MappingMessage['target']): void => void out.push({ level: 'error', text, ...(target && { target }) });
  const warning = (text: string, target?: MappingMessage['target']): void => void out.push({ level: 'warning', text, ...(target && { target }) });
  const info = (text: string): void => void out.push({ level: 'info', text });

  // One column where several were meant: the delimiter is wrong.
  if (ctx.format === 'csv' && ctx.headers.length === 1) {
    const h = ctx.headers[0];
    const seen = [';', ',', '\t', '|', ':', ' '].filter((d) => h.includes(d));
    const name = (d: string): string => (d === '\t' ? 'tab' : d === ' ' ? 'space' : `"${d}"`);
    error(
      `Only one column was found, named "${h.length > 60 ? `${h.slice(0, 57)}...` : h}". ` +
        (seen.length > 0 ? `The fields look separated by ${name(seen[0])}: choose it under Delimiter.` : 'If the fields are separated by some character, choose it under Delimiter.'),
      'delimiter',
    );
  }

  // A first row of values where the names belong: the file has no header row.
  const valueLike = ctx.headers.filter((h) => VALUE_LIKE.test(h.trim()));
  if (ctx.format === 'csv' && valueLike.length >= 2 && valueLike.length * 2 >= ctx.headers.length) {
    error(
      `The first row holds values such as ${quoted(valueLike.slice(0, 3))} where the column names belong: the file seems to have no header row. Add a first row naming the columns (for example station, kind, dip_direction, dip).`,
      'id',
    );
  }

  for (const issue of ctx.issues ?? []) warning(`${issue.message}.`);

  // A column chosen for two fields.
  const byColumn = new Map<string, Field[]>();
  for (const [f, c] of Object.entries(m) as [Field, string][]) byColumn.set(c, [...(byColumn.get(c) ?? []), f]);
  for (const [c, fields] of byColumn) {
    if (fields.length > 1) error(`Column "${c}" is chosen for ${fields.map(label).join(' and ')}: a column can hold one field only.`, fields[1]);
  }

  // Something to read an attitude from, and each attitude complete.
  const plane = m.dipDirection || m.strike;
  if (!plane && !m.attitude && !m.trend && !m.dip && !m.plunge) {
    error('No column holds an attitude: choose the columns for dip direction and dip, strike and dip, trend and plunge, or a single attitude column.', 'dip');
  }
  if (plane && !m.dip) error(`${m.dipDirection ? 'Dip direction' : 'Strike'} is chosen but Dip is not: choose the dip column.`, 'dip');
  if (m.dip && !plane && !m.attitude) error('Dip is chosen but neither Dip direction nor Strike is: choose one of them.', 'dipDirection');
  if ((m.trend && !m.plunge) || (m.plunge && !m.trend)) error(`${m.trend ? 'Trend' : 'Plunge'} is chosen without ${m.trend ? 'Plunge' : 'Trend'}: choose both.`, m.trend ? 'plunge' : 'trend');
  if (m.dipQuadrant && !m.strike && !m.dipDirection) warning('Dip quadrant is chosen without a strike column; it is only read beside a strike or dip direction.', 'dipQuadrant');

  // Kind.
  const lineFields = m.trend || m.plunge;
  if (!m.kind && !o.defaultKind) {
    if (m.attitude && !plane && !lineFields) {
      error('An attitude column needs a kind column, or a kind for every row, to say whether each value is a plane or a line.', 'defaultKind');
    } else if ((plane || m.dip) && lineFields) {
      warning('Without a kind column, each row is read as a plane or a line from the columns it fills; rows filling both are flagged. Choose a kind column or a kind for every row.', 'kind');
    }
  }

  // Options that cannot be used (CRS text, grid north without a grid, the default date, a typed declination).
  let readOptions: StationReadOptions | undefined;
  try {
    readOptions = toReadOptions(o);
  } catch (e) {
    if (!(e instanceof ImportOptionsError)) throw e;
    error(`${e.message.charAt(0).toUpperCase()}${e.message.slice(1)}.`, e.field);
  }

  // Location.
  if (ctx.format === 'geojson') {
    info('Locations come from the Point geometries (WGS 84 longitude and latitude).');
  } else {
    if ((m.x && !m.y) || (m.y && !m.x)) error(`Choose both x and y columns (only ${m.x ? 'x' : 'y'} is chosen).`, m.x ? 'y' : 'x');
    if ((m.lon && !m.lat) || (m.lat && !m.lon)) error(`Choose both longitude and latitude columns (only ${m.lon ? 'longitude' : 'latitude'} is chosen).`, m.lon ? 'lat' : 'lon');
    if (m.x && m.y && !m.lon && !o.crs) {
      error(`Columns ${quoted([m.x, m.y])} hold map coordinates: choose their coordinate system.`, 'crs');
    }
    if (m.lon && m.x) info('Longitude and latitude give the location; the x and y columns are kept as they are.');
    if (!m.lon && !m.x) warning('No location columns are chosen: the stations will have no place on the map.', 'lon');
  }

  // Azimuth corrections that need more than the rows give.
  if (o.north === 'magnetic' && (o.declination ?? 'wmm') === 'wmm') {
    if (!m.date && !o.date) error('The World Magnetic Model needs a date: choose a date column or give a date for rows without one.', 'date');
    if (ctx.format === 'csv' && !m.lon && !m.x) error('The World Magnetic Model needs each station\'s location: choose the location columns.', 'lon');
  }

  // The notation of an attitude column, judged from the first rows' plane values.
  if (m.attitude) out.push(...notationMessages(ctx, m.attitude));

  // The first rows read with these choices.
  if (readOptions && !out.some((x) => x.level === 'error')) out.push(...previewMessages(ctx, readOptions));

  const unused = ctx.headers.filter((h) => !Object.values(m).includes(h));
  if (unused.length > 0) info(`Kept with every station but not read: ${quoted(unused)}.`);

  const rank = { error: 0, warning: 1, info: 2 } as const;
  return out.map((x, i) => [x, i] as const).sort((a, b) => rank[a[0].level] - rank[b[0].level] || a[1] - b[1]).map(([x]) => x);
}

function notationMessages(ctx: MappingContext, column: string): MappingMessage[] {
  const m = ctx.mapping;
  const o = ctx.options;
  const planar = (values: Readonly<Record<string, string>>): boolean => {
    if (!m.kind) return o.defaultKind !== undefined && isPlaneKind(o.defaultKind);
    const k = normalizeKind(values[m.kind] ?? '');
    return k !== undefined && isPlaneKind(k);
  };
  const rows = ctx.preview.filter((r) => planar(r.values) && (r.values[column] ?? '').trim() !== '');
  if (rows.length === 0) return [];
  if (o.planeNotation === 'auto') {
    const report = detectPlaneNotation(rows.map((r) => r.values[column] ?? ''));
    if (report.status === 'needs-naming' || report.status === 'mixed') {
      return [{ level: 'error', target: 'planeNotation', text: `Column "${column}": ${report.message}. Choose the notation.` }];
    }
    return [];
  }
  const bad = rows.filter((r) => tryParsePlane(r.values[column] ?? '', o.planeNotation) instanceof NotationProblem);
  if (bad.length === 0) return [];
  return [
    {
      level: 'warning',
      target: 'planeNotation',
      text: `${bad.length} of the first ${rows.length} plane values in column "${column}" cannot be read as ${PLANE_NOTATION_LABELS[o.planeNotation].toLowerCase()} (e.g. row ${bad[0].row}: "${bad[0].values[column]}"); those rows will be flagged.`,
    },
  ];
}

function previewMessages(ctx: MappingContext, readOptions: StationReadOptions): MappingMessage[] {
  let mapping = ctx.mapping;
  if (ctx.format === 'geojson') {
    const { lon: _lon, lat: _lat, x: _x, y: _y, ...rest } = mapping;
    mapping = rest;
  }
  const problems: RowProblem[] = [];
  let rowsWithProblems = 0;
  for (const row of ctx.preview) {
    // GeoJSON previews carry no geometry; their locations are checked when the file is read.
    const s = readStation(row, mapping, readOptions, ctx.format === 'geojson' ? {} : undefined);
    if (s.problems.length > 0) rowsWithProblems++;
    problems.push(...s.problems);
  }
  if (rowsWithProblems === 0) return [];
  const examples = problems.slice(0, 3).map(describeProblem).join('; ');
  return [
    {
      level: 'warning',
      text: `${rowsWithProblems} of the first ${ctx.preview.length} rows cannot be used as they are (${examples}${problems.length > 3 ? '; ...' : ''}). They will be kept and flagged; if this looks wrong, check the choices.`,
    },
  ];
}
