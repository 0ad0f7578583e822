/**
 * Words and numbers of the profile panel: the view annotation, edge labels, the numbers block
 * (the drawing's text alternative), the accessible summary and the export title block. Every
 * number goes through net/format.ts, so NaN, Infinity or "undefined" never reach the screen or
 * a file: a value that cannot be given is a dash with its reason.
 */
import type { ProfileData } from '../../map/profileData';
import { DASH, azimuthText, formatCount, formatNumber, isFiniteNumber, type Formatted } from '../net/format';
import { compassPoint, edgeAzimuths } from './profileView';

/** The caution printed with every profile export. */
export const PROFILE_CAUTION = 'Results are aids to interpretation; check in the field and defer to local codes and licensed professional practice.';

/** The minus sign used for negative values (U+2212), as typeset numbers use it. */
const MINUS = '\u2212';

/**
 * A length in metres for labels: whole metres with thin-space grouping, or kilometres for
 * whole kilometres; a dash for a value that is not finite.
 * @example metresText(2000) // '2 km'
 * @example metresText(-1520.4) // '−1 520 m'
 */
export function metresText(m: number): string {
  if (!isFiniteNumber(m)) return DASH;
  if (Math.abs(m) >= 1000 && Math.abs(m) % 1000 === 0) return `${m < 0 ? MINUS : ''}${Math.abs(m) / 1000} km`;
  const r = Math.round(m);
  const body = formatCount(Math.abs(r)).text;
  return `${r < 0 ? MINUS : ''}${body} m`;
}

/**
 * An angle in degrees with one decimal (dash when not finite).
 * @example angleText(11.84) // '11.8°'
 */
export function angleText(a: number): string {
  return isFiniteNumber(a) ? `${(Math.round(a * 10) / 10).toFixed(1)}°` : DASH;
}

/**
 * The vertical exaggeration as labelled on the drawing: "V.E. ×2", "V.E. ×2.5".
 * @example veText(2) // 'V.E. ×2'
 */
export function veText(ve: number): string {
  const v = isFiniteNumber(ve) && ve > 0 ? Math.round(ve * 100) / 100 : 1;
  return `V.E. ×${v}`;
}

/**
 * The axis as trend/plunge, "075/12" (true north).
 * @example axisText({ trend: 74.994, plunge: 12 }) // '075/12'
 */
export function axisText(axis: { readonly trend: number; readonly plunge: number }): string {
  if (!isFiniteNumber(axis.trend) || !isFiniteNumber(axis.plunge)) return DASH;
  return `${azimuthText(axis.trend)}/${String(Math.round(axis.plunge)).padStart(2, '0')}`;
}

/**
 * The line over the drawing: the view, and whether it is at true scale.
 * @example annotationText(data, 1) // 'Looking down-plunge toward 075°, plunge 12° · true scale'
 */
export function annotationText(data: ProfileData, ve: number): string {
  if (data.mode === 'down-plunge') return `${data.view} · true scale`;
  return `${data.view} · ${ve === 1 ? 'true scale' : `${veText(ve)} (vertical exaggeration)`}`;
}

/**
 * The short count line under the annotation.
 * @example subtitleText(data) // '412 stations · 1 730 linework vertices'
 */
export function subtitleText(data: ProfileData): string {
  const parts = [`${formatCount(data.counts.drawn).text} station${data.counts.drawn === 1 ? '' : 's'}`, `${formatCount(data.counts.verticesDrawn).text} linework vert${data.counts.verticesDrawn === 1 ? 'ex' : 'ices'}`];
  if (data.section) parts.push(`section ${metresText(data.section.length)}, swath ±${metresText(data.section.swath)}`);
  return parts.join(' · ');
}

/**
 * Labels of the drawing's edges: which compass side is left and right, and what up is.
 * @example edgeLabels(data).right // '165° SSE →'
 */
export function edgeLabels(data: ProfileData): { left: string; right: string; up: string } {
  const e = edgeAzimuths(data.axis, data.section?.azimuths ?? null);
  const side = (a: number): string => `${azimuthText(a)}° ${compassPoint(a)}`;
  if (data.mode === 'section') return { left: `← start, toward ${side(e.left)}`, right: `end, toward ${side(e.right)} →`, up: '↑ up (vertical)' };
  return {
    left: `← ${side(e.left)}`,
    right: `${side(e.right)} →`,
    up: `↑ up: normal to the axis, leaning ${Math.round(e.upLean)}° from vertical toward ${azimuthText(e.upToward)}°`,
  };
}

/**
 * Text beside the axis mark. Down-plunge: the axis points into the page. Section: its apparent
 * plunge in the (first) segment, and the angle drawn when exaggerated.
 * @example axisMarkText(data, 1) // 'axis 075/12, into the page'
 */
export function axisMarkText(data: ProfileData, ve: number, drawnAngle?: number): string {
  if (data.mode === 'down-plunge' || !data.section) return `axis ${axisText(data.axis)}, into the page`;
  const a = data.section.axisApparentPlunge[0];
  const toward = isFiniteNumber(a) ? (a >= 0 ? 'toward the end' : 'toward the start') : '';
  const drawn = ve !== 1 && drawnAngle !== undefined && isFiniteNumber(drawnAngle) ? ` (drawn ${angleText(Math.abs(drawnAngle))} at ${veText(ve)})` : '';
  const segment = data.section.axisApparentPlunge.length > 1 ? ' in segment 1' : '';
  return `axis apparent plunge ${angleText(Math.abs(a))} ${toward}${segment}${drawn}`.replace(/\s+/g, ' ').trim();
}

/** One row of the numbers block. */
export interface ProfileRow {
  readonly key: string;
  readonly label: string;
  readonly text: string;
  /** Why the value is a dash; null when it is a value. */
  readonly reason: string | null;
}

/**
 * The numbers block: mode, axis, view, counts, distances, section details, frame, method.
 * @example profileRows(data, 1).find((r) => r.key === 'stations')!.text // '412 drawn of 450 in the area'
 */
export function profileRows(data: ProfileData, ve: number): ProfileRow[] {
  const c = data.counts;
  const rows: ProfileRow[] = [];
  const add = (key: string, label: string, f: Formatted | string): void => {
    if (typeof f === 'string') rows.push({ key, label, text: f, reason: null });
    else rows.push({ key, label, text: f.text, reason: f.reason });
  };
  add('mode', 'Drawing', data.mode === 'down-plunge' ? 'Down-plunge profile' : `Vertical section, ${ve === 1 ? 'true scale' : veText(ve)}`);
  add('axis', 'Fold axis', `${axisText(data.axis)} (trend/plunge, true north)`);
  add('view', 'View', data.view);
  const inArea = data.hasArea ? 'in the area' : 'with a location';
  add('stations', 'Stations', c.inArea > 0 || c.drawn > 0 ? `${formatCount(c.drawn).text} drawn of ${formatCount(c.inArea).text} ${inArea}` : { text: DASH, reason: 'no usable station in the area' });
  if (c.noHeight > 0) add('no-height', 'Without height', `${formatCount(c.noHeight).text} (named below; not drawn)`);
  if (c.outsideSwath + c.missedSection > 0) add('off-section', 'Off the section', `${formatCount(c.outsideSwath + c.missedSection).text} (beyond the swath or past the ends)`);
  add(
    'vertices',
    'Linework vertices',
    c.verticesDrawn > 0
      ? `${formatCount(c.verticesDrawn).text} drawn of ${formatCount(c.vertices).text}${c.edgePoints > 0 ? `, plus ${formatCount(c.edgePoints).text} where lines cross the area's edge` : ''}`
      : { text: DASH, reason: c.vertices > 0 ? 'no linework vertex in the area has a height' : 'no linework given' },
  );
  const range = data.alongRange;
  add(
    'along',
    data.mode === 'down-plunge' ? 'Distance along the axis' : 'Distance from the section along the axis',
    range ? `${metresText(range[0])} to ${metresText(range[1])}` : { text: DASH, reason: 'nothing drawn' },
  );
  if (data.section) {
    const s = data.section;
    add('section', 'Section', `${metresText(s.length)}, ${s.azimuths.map((a) => `${azimuthText(a)}°`).join(' then ')}; swath ±${metresText(s.swath)}`);
    add('apparent-plunge', 'Axis apparent plunge', s.axisApparentPlunge.map((a, i) => `${s.axisApparentPlunge.length > 1 ? `segment ${i + 1}: ` : ''}${angleText(Math.abs(a))} ${a >= 0 ? 'toward the end' : 'toward the start'}`).join('; '));
  }
  const f = data.frame;
  add('frame', 'Frame', `${f.crs}, origin E ${f.originEasting} N ${f.originNorthing}; convergence ${formatNumber(f.convergence, 3, '°').text}`);
  add('method', 'Method', data.method);
  return rows;
}

/**
 * A one-sentence summary for the drawing's accessible name.
 * @example profileAriaLabel(data, 1) // 'Down-plunge profile of West domain: looking down-plunge toward 075°, ...'
 */
export function profileAriaLabel(data: ProfileData | null, ve: number): string {
  if (!data) return 'Profile: no data';
  const what = data.mode === 'down-plunge' ? 'Down-plunge profile' : 'Vertical section';
  return `${what} of ${data.label}: ${data.view.charAt(0).toLowerCase()}${data.view.slice(1)}; ${subtitleText(data)}${data.mode === 'section' && ve !== 1 ? `; ${veText(ve)}` : ''}.`;
}

/**
 * Lines of the export's title block, in order: heading, drawing and date, view, counts, method,
 * stations left out for want of a height (up to `maxNamed`), caution.
 * @example profileTitleBlock(data, 'West domain', '2025-06-01', 1)[0] // 'Foldlens profile: West domain'
 */
export function profileTitleBlock(data: ProfileData, label: string, date: string, ve: number, maxNamed = 12): { text: string; strong: boolean }[] {
  const out: { text: string; strong: boolean }[] = [];
  const add = (text: string, strong = false): void => {
    out.push({ text, strong });
  };
  add(`Foldlens profile: ${label === '' ? data.label : label}`, true);
  add(`${data.mode === 'down-plunge' ? 'Down-plunge profile' : `Vertical section, ${ve === 1 ? 'true scale' : veText(ve)}`} · fold axis ${axisText(data.axis)} (true north) · exported ${date}`);
  add(`${annotationText(data, ve)}. ${subtitleText(data)}.`);
  add(`Method: ${data.method}`);
  if (data.noHeight.length > 0) {
    const shown = data.noHeight.slice(0, maxNamed);
    add(`Left out for want of a height (${data.noHeight.length}): ${shown.join(' ')}${data.noHeight.length > shown.length ? ` … and ${data.noHeight.length - shown.length} more.` : ''}`);
  }
  add(PROFILE_CAUTION, true);
  return out;
}
