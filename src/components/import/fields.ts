import type { Field } from '../../io/columns';
import type { PlaneNotation, LineNotation } from '../../core/notation';

/**
 * Words for the import form: what each logical field (io/columns.ts) is called, how the fields
 * are grouped, and what each notation looks like. Kept apart from the component so the checks
 * (mappingCheck.ts) can name fields the way the form does.
 */

/** The name of each field in the form and in messages. */
export const FIELD_LABELS: Readonly<Record<Field, string>> = {
  id: 'Station id',
  kind: 'Kind',
  dipDirection: 'Dip direction',
  dip: 'Dip',
  strike: 'Strike',
  dipQuadrant: 'Dip quadrant',
  trend: 'Trend',
  plunge: 'Plunge',
  rake: 'Rake',
  attitude: 'Attitude',
  x: 'x (easting)',
  y: 'y (northing)',
  lon: 'Longitude',
  lat: 'Latitude',
  elevation: 'Elevation (m)',
  date: 'Date',
  notes: 'Notes',
  overturned: 'Overturned',
  sense: 'Fold sense',
};

/** Fields in the groups the form shows them in. */
export const FIELD_GROUPS: readonly { readonly label: string; readonly fields: readonly Field[] }[] = [
  { label: 'Station', fields: ['id', 'kind', 'date', 'notes'] },
  { label: 'Plane', fields: ['dipDirection', 'dip', 'strike', 'dipQuadrant', 'overturned'] },
  { label: 'Line', fields: ['trend', 'plunge', 'rake', 'sense'] },
  { label: 'Attitude in one column', fields: ['attitude'] },
];

/** Location fields, shown with the coordinate system. */
export const LOCATION_FIELDS: readonly Field[] = ['lon', 'lat', 'x', 'y', 'elevation'];

/** Plane notations with an example, for the notation select (see core/notation.ts). */
export const PLANE_NOTATION_LABELS: Readonly<Record<PlaneNotation, string>> = {
  auto: 'Auto: only values naming their dip side (030/45SE, N30E 45SE)',
  dipdir: 'Dip direction / dip (120/45)',
  rhr: 'Strike / dip, right-hand rule (030/45)',
  'strike-quadrant': 'Strike / dip with dip quadrant (030/45SE)',
  quadrant: 'Quadrant bearing with dip quadrant (N30E 45SE)',
};

/** Line notations with an example. */
export const LINE_NOTATION_LABELS: Readonly<Record<LineNotation, string>> = {
  auto: 'Auto (125/20 or S55E 20)',
  azimuth: 'Trend / plunge (125/20)',
  quadrant: 'Quadrant bearing and plunge (S55E 20)',
};
