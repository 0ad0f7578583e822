/**
 * Field readings of the district: bedding at random outcrop points with the attitude of the
 * true bedding surface there plus reading scatter; hinges on the crest and trough lines; bedding/
 * cleavage intersection lineations; axial-planar cleavage. Ordered along daily traverses.
 */
import { normalizeAzimuth } from '../../src/core/math';
import { normalToPlane } from '../../src/core/vectors';
import type { FoldSense } from '../../src/core/types';
import { COUNTS, FIELD_SEASON_START, FRAME_HEIGHT, FRAME_WIDTH, NOISE, UNITS } from './district';
import { axialSurfaceNormal, profileCoordinates, profileCurve, profileFrame, stratGradient, stratHeight, toNed, type FoldDomain } from './fold';
import { domainAt, faultSide, unitIndexAt } from './domains';
import { gridAzimuthOfTrueNorth, localToUtm } from './crs';
import { demAt, type DemGrid } from './terrain';
import type { Random } from './prng';

export type ReadingKind = 'bedding' | 'hinge' | 'intersection' | 'cleavage';

/** One clean reading, azimuths referred to true north, whole degrees. */
export interface FieldReading {
  readonly id: string;
  readonly kind: ReadingKind;
  readonly easting: number;
  readonly northing: number;
  readonly elevation: number;
  readonly domain: 'west' | 'east';
  readonly unit: string;
  readonly plane?: { readonly dipDirection: number; readonly dip: number };
  readonly line?: { readonly trend: number; readonly plunge: number };
  readonly sense?: FoldSense;
  readonly date: string;
  readonly notes: string;
}

interface Draft extends Omit<FieldReading, 'id' | 'date'> {
  readonly x: number;
  readonly y: number;
}

const MARGIN = 80;
const FAULT_GAP = 50;

/**
 * Dip-direction scatter (sigma, degrees) for a given dip (see NOISE).
 * @example dipDirectionSigma(12) // 5 (capped); dipDirectionSigma(60) // 2
 */
export function dipDirectionSigma(dip: number): number {
  const s = NOISE.dipDirectionSigmaAtVertical / Math.max(Math.sin((dip * Math.PI) / 180), 1e-6);
  return Math.min(NOISE.dipDirectionSigmaMax, Math.max(NOISE.dipDirectionSigmaMin, s));
}

function noisyPlane(rnd: Random, dipDirection: number, dip: number, dipSigma: number, ddSigma: number) {
  let d = dip + rnd.gaussian(dipSigma);
  let dd = dipDirection + rnd.gaussian(ddSigma);
  // A reading past the vertical or above the horizontal is the same plane read the other way.
  if (d < 0) [d, dd] = [-d, dd + 180];
  if (d > 90) [d, dd] = [180 - d, dd + 180];
  return { dipDirection: normalizeAzimuth(Math.round(dd)), dip: Math.round(d) };
}

function noisyLine(rnd: Random, trend: number, plunge: number) {
  let p = plunge + rnd.gaussian(NOISE.linePlungeSigma);
  let t = trend + rnd.gaussian(NOISE.lineTrendSigma);
  if (p < 0) [p, t] = [-p, t + 180];
  return { trend: normalizeAzimuth(Math.round(t)), plunge: Math.round(p) };
}

/** A random outcrop point (whole-metre UTM position) away from the frame edge and the fault. */
function outcropPoint(rnd: Random): [number, number] {
  for (;;) {
    const x = Math.round(rnd.uniform(MARGIN, FRAME_WIDTH - MARGIN));
    const y = Math.round(rnd.uniform(MARGIN, FRAME_HEIGHT - MARGIN));
    if (Math.abs(faultSide(x, y)) >= FAULT_GAP) return [x, y];
  }
}

/** Grid azimuth -> true azimuth at local (x, y). */
function toTrue(x: number, y: number, gridAzimuth: number): number {
  const [e, n] = localToUtm(x, y);
  return normalizeAzimuth(gridAzimuth - gridAzimuthOfTrueNorth(e, n));
}

function base(domains: readonly FoldDomain[], dem: DemGrid, x: number, y: number) {
  const d = domainAt(domains, x, y);
  const z = demAt(dem, x, y);
  const [easting, northing] = localToUtm(x, y);
  const unit = UNITS[unitIndexAt(stratHeight(d, x, y, z))].code;
  return { d, z, fields: { x, y, easting, northing, elevation: Math.round(z), domain: d.id, unit } };
}

const BEDDING_NOTES = ['', '', '', '', '', 'tops up from cross-bedding', 'ledge on dip slope', 'weathered surface, fair reading', 'ripple marks on bedding surface', 'small outcrop in wadi bank'];

function bedding(rnd: Random, domains: readonly FoldDomain[], dem: DemGrid): Draft {
  const { d, z, fields } = base(domains, dem, ...outcropPoint(rnd));
  const plane = normalToPlane(toNed(stratGradient(d, fields.x, fields.y, z)));
  const trueDd = toTrue(fields.x, fields.y, plane.dipDirection);
  return {
    ...fields,
    kind: 'bedding',
    plane: noisyPlane(rnd, trueDd, plane.dip, NOISE.dipSigma, dipDirectionSigma(plane.dip)),
    notes: BEDDING_NOTES[rnd.int(BEDDING_NOTES.length)],
  };
}

/**
 * A point on a hinge line: start anywhere, then walk along the profile-right direction u until
 * the profile phase theta reaches the nearest crest (pi/2) or trough (-pi/2), re-reading the
 * ground elevation each step because xi = u - shear v depends on height.
 */
function hinge(rnd: Random, domains: readonly FoldDomain[], dem: DemGrid): Draft {
  for (;;) {
    let [x, y] = outcropPoint(rnd);
    const d = domainAt(domains, x, y);
    const f = profileFrame(d.axisGrid);
    const k = (2 * Math.PI) / d.wavelength;
    const phase = (d.phaseDeg * Math.PI) / 180;
    const xiAt = (px: number, py: number) => {
      const { u, v } = profileCoordinates(d, px, py, demAt(dem, px, py));
      return u - d.shear * v;
    };
    const theta0 = profileCurve(d, xiAt(x, y)).theta;
    const n = Math.round((theta0 - Math.PI / 2) / Math.PI);
    const target = (Math.PI / 2 + n * Math.PI - phase) / k;
    for (let i = 0; i < 30; i++) {
      const step = target - xiAt(x, y);
      x += step * f.u[0];
      y += step * f.u[1];
    }
    [x, y] = [Math.round(x), Math.round(y)];
    if (x < MARGIN || x > FRAME_WIDTH - MARGIN || y < MARGIN || y > FRAME_HEIGHT - MARGIN) continue;
    if (Math.abs(faultSide(x, y)) < FAULT_GAP || domainAt(domains, x, y) !== d) continue;
    const { fields } = base(domains, dem, x, y);
    const antiform = Math.sin(Math.PI / 2 + n * Math.PI) > 0;
    const recorded = rnd.next() < 0.75;
    const sense: FoldSense = recorded ? (antiform ? 'antiform' : 'synform') : 'unknown';
    const line = noisyLine(rnd, toTrue(x, y, d.axisGrid.trend), d.axisGrid.plunge);
    const notes = recorded ? `${sense} closure exposed` : 'closure partly under sand';
    return { ...fields, kind: 'hinge', line, sense, notes };
  }
}

/** Cleavage is read in the fine-grained units only. */
const CLEAVED_UNITS = new Set(['TAM', 'BRE']);

function inCleavedUnit(rnd: Random, domains: readonly FoldDomain[], dem: DemGrid) {
  for (;;) {
    const b = base(domains, dem, ...outcropPoint(rnd));
    if (CLEAVED_UNITS.has(b.fields.unit)) return b;
  }
}

function intersection(rnd: Random, domains: readonly FoldDomain[], dem: DemGrid): Draft {
  const { d, fields } = inCleavedUnit(rnd, domains, dem);
  // Bedding and axial-planar cleavage both contain the axis, so their intersection is the axis.
  const line = noisyLine(rnd, toTrue(fields.x, fields.y, d.axisGrid.trend), d.axisGrid.plunge);
  return { ...fields, kind: 'intersection', line, notes: 'bedding-cleavage intersection' };
}

function cleavage(rnd: Random, domains: readonly FoldDomain[], dem: DemGrid): Draft {
  const { d, fields } = inCleavedUnit(rnd, domains, dem);
  const plane = normalToPlane(toNed(axialSurfaceNormal(d)));
  const trueDd = toTrue(fields.x, fields.y, plane.dipDirection);
  return { ...fields, kind: 'cleavage', plane: noisyPlane(rnd, trueDd, plane.dip, NOISE.cleavageSigma, NOISE.cleavageSigma), notes: 'slaty cleavage, axial planar' };
}

const TRAVERSE_WIDTH = 500;

/** ISO date `days` after the start of the field season. */
function seasonDate(days: number): string {
  const t = Date.parse(`${FIELD_SEASON_START}T00:00:00Z`) + days * 86400000;
  return new Date(t).toISOString().slice(0, 10);
}

/**
 * All readings, in traverse order: one north-south traverse 500 m wide per field day, walked
 * alternately north and south, with a rest day after every sixth day.
 * @example makeReadings(createRandom(1), buildDomains(), dem, 'KR').length // 494
 */
export function makeReadings(rnd: Random, domains: readonly FoldDomain[], dem: DemGrid, prefix: string): FieldReading[] {
  const drafts: Draft[] = [];
  for (let i = 0; i < COUNTS.bedding; i++) drafts.push(bedding(rnd, domains, dem));
  for (let i = 0; i < COUNTS.hinge; i++) drafts.push(hinge(rnd, domains, dem));
  for (let i = 0; i < COUNTS.intersection; i++) drafts.push(intersection(rnd, domains, dem));
  for (let i = 0; i < COUNTS.cleavage; i++) drafts.push(cleavage(rnd, domains, dem));
  const day = (r: Draft): number => Math.floor(r.x / TRAVERSE_WIDTH);
  const ordered = [...drafts].sort((a, b) => day(a) - day(b) || (day(a) % 2 === 0 ? a.y - b.y : b.y - a.y) || a.x - b.x);
  return ordered.map((draft, i) => {
    const dayIndex = day(draft);
    const { x: _x, y: _y, ...reading } = draft;
    return { ...reading, id: `${prefix}-${String(i + 1).padStart(4, '0')}`, date: seasonDate(dayIndex + Math.floor(dayIndex / 6)) };
  });
}
