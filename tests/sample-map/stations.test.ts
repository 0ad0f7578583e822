/**
 * The three station files agree with each other and hold exactly the planted mistakes that
 * truth.json lists. CSV text is parsed with papaparse (an outside parser); coordinates are
 * checked with proj4.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import Papa from 'papaparse';
import proj4 from 'proj4';
import truth from '../../sample-maps/korvane/truth.json';
import { stations } from '../../sample-maps/korvane/index';

const dir = new URL('../../sample-maps/korvane/', import.meta.url);
const read = (name: string): string => readFileSync(new URL(name, dir), 'utf8');
const parseCsv = (text: string): Record<string, string>[] => Papa.parse<Record<string, string>>(text, { header: true, skipEmptyLines: true }).data;
const utm = proj4(truth.crs.proj4, 'WGS84');

const csvRows = parseCsv(read('stations.csv'));
const quadrantRows = parseCsv(read('stations-quadrant.csv'));
const planted = new Map(truth.plantedBadRows.map((r) => [r.id, r.defect]));

/** Smallest angle between two azimuths, degrees. */
const azDiff = (a: number, b: number): number => {
  const d = Math.abs((((a - b) % 360) + 360) % 360);
  return d > 180 ? 360 - d : d;
};
const COMPASS: Record<string, number> = { N: 0, NE: 45, E: 90, SE: 135, S: 180, SW: 225, W: 270, NW: 315 };
/** Quadrant bearing (N55W, S80E) to azimuth (common practice). */
function bearing(text: string): number {
  const m = /^([NS])(\d{2})([EW])$/.exec(text);
  if (!m) throw new Error(`"${text}" is not a quadrant bearing`);
  const a = Number(m[2]);
  if (m[1] === 'N') return m[3] === 'E' ? a : (360 - a) % 360;
  return m[3] === 'E' ? 180 - a : 180 + a;
}
/** Dip direction from a strike azimuth and a dip quadrant: the side of the strike the quadrant names. */
function dipDirectionFrom(strike: number, quadrant: string): number | 'contradiction' {
  const q = COMPASS[quadrant];
  const sides = [(strike + 90) % 360, (strike + 270) % 360];
  const [d1, d2] = sides.map((s) => azDiff(q, s));
  if (Math.min(d1, d2) > 45) return 'contradiction';
  return d1 < d2 ? sides[0] : sides[1];
}

/** A small, independent check of one stations.csv row: the defect types it shows. */
function problemsOf(r: Record<string, string>): string[] {
  const out: string[] = [];
  if (!['bedding', 'hinge', 'intersection', 'cleavage'].includes(r.kind)) out.push('missing-kind');
  const e = Number(r.easting);
  const n = Number(r.northing);
  if (!(e >= truth.frame.eastingMin && e <= truth.frame.eastingMax && n >= truth.frame.northingMin && n <= truth.frame.northingMax)) out.push('coordinates-swapped');
  const plane = /^(\d{3})\/(\w{2})([NESW]{1,2})$/.exec(r.reading);
  if (plane) {
    if (r.dip !== '' && !/^\d+$/.test(r.dip)) out.push('non-numeric-dip');
    else if (Number(r.dip) > 90 || Number(plane[2]) > 90) out.push('dip-out-of-range');
    if (dipDirectionFrom(Number(plane[1]), plane[3]) === 'contradiction') out.push('quadrant-contradicts-strike');
  }
  return out;
}

describe('stations.csv, stations.json and stations-quadrant.csv', () => {
  it('Papa.parse(stations.csv) gives the same rows, keys and text as stations.json and the stations export of index.ts', () => {
    const json = JSON.parse(read('stations.json')) as Record<string, string>[];
    expect(csvRows).toEqual(json);
    expect(stations).toEqual(json);
    expect(csvRows.length).toBe(truth.counts.bedding + truth.counts.hinge + truth.counts.intersection + truth.counts.cleavage);
    expect(new Set(csvRows.map((r) => r.station_id)).size).toBe(csvRows.length);
    for (const r of csvRows) expect(r.dataset).toMatch(/^SYNTHETIC/);
  });

  it('problemsOf(row) finds exactly the planted mistakes of truth.plantedBadRows, one per listed row, and none elsewhere', () => {
    const found = new Map<string, string[]>();
    for (const r of csvRows) {
      const p = problemsOf(r);
      if (p.length) found.set(r.station_id, p);
    }
    expect([...found.keys()].sort()).toEqual([...planted.keys()].sort());
    for (const [id, defect] of planted) expect(found.get(id)).toEqual([defect]);
    expect(new Set(planted.values()).size).toBe(5);
  });

  it('every good row has lon/lat equal to proj4(easting, northing) within 0.2 m, and the swapped row becomes valid when swapped back', () => {
    for (const r of csvRows) {
      const swapped = planted.get(r.station_id) === 'coordinates-swapped';
      const [e, n] = swapped ? [Number(r.northing), Number(r.easting)] : [Number(r.easting), Number(r.northing)];
      const [lon, lat] = swapped ? [Number(r.lat), Number(r.lon)] : [Number(r.lon), Number(r.lat)];
      const [pe, pn] = utm.inverse([lon, lat]);
      expect(Math.hypot(pe - e, pn - n), r.station_id).toBeLessThan(0.2);
    }
  });

  it('the reading column of every good row says the same attitude as its numeric columns', () => {
    for (const r of csvRows.filter((x) => !planted.has(x.station_id))) {
      if (r.dip_direction !== '') {
        const m = /^(\d{3})\/(\d{2})([NESW]{1,2})$/.exec(r.reading);
        expect(m, r.station_id).not.toBeNull();
        const [, strike, dip, quadrant] = m as RegExpExecArray;
        expect(Number(strike)).toBe((Number(r.dip_direction) + 270) % 360); // right-hand rule: strike = dip direction - 90
        expect(dipDirectionFrom(Number(strike), quadrant)).toBe(Number(r.dip_direction));
        expect(Number(dip)).toBe(Number(r.dip));
        expect(r.trend + r.plunge).toBe('');
      } else {
        expect(r.reading, r.station_id).toBe(`${r.trend}/${r.plunge}`);
        expect(Number(r.plunge)).toBeLessThanOrEqual(90);
        expect(Number(r.trend)).toBeLessThan(360);
      }
    }
  });

  it('bearing() and dipDirectionFrom() of stations-quadrant.csv give back the azimuths of stations.csv, row for row', () => {
    expect(quadrantRows.map((q) => q.Stn)).toEqual(csvRows.map((r) => r.station_id));
    quadrantRows.forEach((q, i) => {
      const r = csvRows[i];
      expect([q.E, q.N, q.Elev_m, q.Date]).toEqual([r.easting, r.northing, r.elevation_m, r.date]);
      expect(q.Dataset).toMatch(/^SYNTHETIC/);
      const defect = planted.get(r.station_id);
      if (defect === 'missing-kind') expect(q.Type).toBe('');
      else expect(q.Type.toLowerCase()).toBe(r.kind);
      if (defect === 'dip-out-of-range') expect(q.Dip).toBe('95');
      if (defect === 'non-numeric-dip') expect(q.Dip).toBe(r.dip);
      if (defect === 'quadrant-contradicts-strike') expect(dipDirectionFrom(bearing(q.Strike), q.DipQuad)).toBe('contradiction');
      if (defect) return;
      if (r.dip_direction !== '') {
        expect(dipDirectionFrom(bearing(q.Strike), q.DipQuad), r.station_id).toBe(Number(r.dip_direction));
        expect(Number(q.Dip)).toBe(Number(r.dip));
      } else {
        expect(bearing(q.Trend), r.station_id).toBe(Number(r.trend));
        expect(Number(q.Plunge)).toBe(Number(r.plunge));
        expect(q.Sense.toLowerCase()).toBe(r.sense);
      }
    });
  });

  it('the counts of each kind match truth.counts (the missing-kind row is a bedding row)', () => {
    const count = (k: string) => csvRows.filter((r) => r.kind === k).length;
    expect(count('bedding')).toBe(truth.counts.bedding - 1);
    expect(count('hinge')).toBe(truth.counts.hinge);
    expect(count('intersection')).toBe(truth.counts.intersection);
    expect(count('cleavage')).toBe(truth.counts.cleavage);
  });
});
