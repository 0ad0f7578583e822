/**
 * The sample map against its documented answer: an independent re-implementation of the
 * geometry written in truth.json (bisection instead of the generator's Newton steps; the DEM read
 * back from the GeoTIFF with geotiff.js; coordinates through proj4) checks the contacts, the
 * geology polygons and every station reading.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { fromArrayBuffer } from 'geotiff';
import proj4 from 'proj4';
import * as turf from '@turf/turf';
import type { FeatureCollection, LineString, MultiPolygon } from 'geojson';
import truth from '../../sample-maps/korvane/truth.json';
import { stations } from '../../sample-maps/korvane/index';

const dir = new URL('../../sample-maps/korvane/', import.meta.url);
const readJson = <T>(name: string): T => JSON.parse(readFileSync(new URL(name, dir), 'utf8')) as T;
const utm = proj4(truth.crs.proj4, 'WGS84');
const D2R = Math.PI / 180;

type Domain = (typeof truth.domains)[number];
type V3 = [number, number, number];

/** The geometry exactly as truth.json states it in words (geometry.* fields). */
function frameOf(d: Domain): { u: V3; v: V3; a: V3 } {
  const t = d.axisGrid.trend * D2R;
  const p = d.axisGrid.plunge * D2R;
  return {
    u: [Math.cos(t), -Math.sin(t), 0],
    v: [Math.sin(p) * Math.sin(t), Math.sin(p) * Math.cos(t), Math.cos(p)],
    a: [Math.cos(p) * Math.sin(t), Math.cos(p) * Math.cos(t), -Math.sin(p)],
  };
}
const dot = (p: V3, q: V3): number => p[0] * q[0] + p[1] * q[1] + p[2] * q[2];
const h = (d: Domain, xi: number): number => {
  const { amplitude, wavelength, r, phaseDeg } = d.profile;
  return (amplitude * Math.asin(r * Math.sin((2 * Math.PI * xi) / wavelength + phaseDeg * D2R))) / Math.asin(r);
};
function F(d: Domain, e: number, n: number, z: number): number {
  const f = frameOf(d);
  const [e0, n0, z0] = d.profile.originUtm;
  const P: V3 = [e - e0, n - n0, z - z0];
  const u = dot(P, f.u);
  const v = dot(P, f.v);
  return v - h(d, u - d.profile.shear * v) + d.profile.offset;
}
/** Elevation of the surface F = level over (e, n), by bisection (F rises with z). */
function surfaceZ(d: Domain, level: number, e: number, n: number): number {
  let lo = -5000;
  let hi = 5000;
  for (let i = 0; i < 80; i++) {
    const mid = (lo + hi) / 2;
    if (F(d, e, n, mid) < level) lo = mid;
    else hi = mid;
  }
  return (lo + hi) / 2;
}
/** Bedding normal by central differences of F (east-north-up). */
function normalAt(d: Domain, e: number, n: number, z: number): V3 {
  const s = 0.01;
  const g: V3 = [
    (F(d, e + s, n, z) - F(d, e - s, n, z)) / (2 * s),
    (F(d, e, n + s, z) - F(d, e, n - s, z)) / (2 * s),
    (F(d, e, n, z + s) - F(d, e, n, z - s)) / (2 * s),
  ];
  const len = Math.hypot(...g);
  return [g[0] / len, g[1] / len, g[2] / len];
}
/** Which domain holds a UTM point: the west domain lies left of the fault trace (south to north). */
function domainAt(e: number, n: number): Domain {
  const [[ax, ay], [bx, by]] = truth.fault.traceUtm;
  const left = (bx - ax) * (n - ay) - (by - ay) * (e - ax) >= 0;
  return truth.domains[left ? 0 : 1];
}
const unitAt = (F0: number): string => {
  const levels = truth.stratigraphy.contacts.map((c) => c.level);
  return truth.stratigraphy.units[levels.filter((l) => l <= F0).length].code;
};
/** Upward unit normal (east-north-up) of a plane: it leans toward the dip direction (common practice). */
const planeNormal = (dd: number, dip: number): V3 => [Math.sin(dip * D2R) * Math.sin(dd * D2R), Math.sin(dip * D2R) * Math.cos(dd * D2R), Math.cos(dip * D2R)];
/** Angle between two unit vectors, with sense: both normals here point up. */
const angle = (p: V3, q: V3): number => Math.acos(Math.max(-1, Math.min(1, dot(p, q)))) / D2R;

async function readDem() {
  const bytes = readFileSync(new URL('dem.tif', dir));
  const tiff = await fromArrayBuffer(bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength));
  const image = await tiff.getImage();
  const [values] = (await image.readRasters()) as unknown as [Float32Array];
  const [e0, nTop] = image.getOrigin();
  const [sx, sy] = image.getResolution();
  const cols = image.getWidth();
  const rows = image.getHeight();
  // Bilinear between cell centres (pixel-is-area: centre of cell (i, j) at origin + (i + 0.5, j + 0.5) * resolution).
  return (e: number, n: number): number => {
    const fi = (e - e0) / sx - 0.5;
    const fj = (n - nTop) / sy - 0.5;
    const i = Math.max(0, Math.min(cols - 2, Math.floor(fi)));
    const j = Math.max(0, Math.min(rows - 2, Math.floor(fj)));
    const tx = fi - i;
    const ty = fj - j;
    const at = (ii: number, jj: number): number => values[jj * cols + ii];
    return (1 - tx) * (1 - ty) * at(i, j) + tx * (1 - ty) * at(i + 1, j) + (1 - tx) * ty * at(i, j + 1) + tx * ty * at(i + 1, j + 1);
  };
}

describe('contacts.geo.json against the surfaces documented in truth.json', () => {
  it('every contact vertex lies on the DEM within one cell of linear-interpolation error of its contact surface', async () => {
    const demAt = await readDem();
    const contacts = readJson<FeatureCollection<LineString>>('contacts.geo.json');
    const cell = truth.dem.cellSize;
    let checked = 0;
    for (const f of contacts.features) {
      const props = f.properties as { level: number; domain: string };
      const d = truth.domains.find((x) => x.id === props.domain) as Domain;
      for (const [lon, lat] of f.geometry.coordinates) {
        const [e, n] = utm.inverse([lon, lat]);
        const s = surfaceZ(d, props.level, e, n);
        // Linear interpolation over a chord of length L errs by at most L^2/8 * max|S''| (Taylor);
        // chords here are cell edges, or cell diagonals where a line is cut at the fault.
        const chord = cell * Math.SQRT2;
        let curvature = 0;
        for (const [de, dn] of [[1, 0], [0, 1], [Math.SQRT1_2, Math.SQRT1_2], [Math.SQRT1_2, -Math.SQRT1_2]]) {
          for (const k of [-0.5, 0, 0.5]) {
            const ce = e + k * chord * de;
            const cn = n + k * chord * dn;
            const step = chord / 2;
            const second = (surfaceZ(d, props.level, ce + step * de, cn + step * dn) - 2 * surfaceZ(d, props.level, ce, cn) + surfaceZ(d, props.level, ce - step * de, cn - step * dn)) / (step * step);
            curvature = Math.max(curvature, Math.abs(second));
          }
        }
        const slope = Math.hypot(surfaceZ(d, props.level, e + 1, n) - s, surfaceZ(d, props.level, e, n + 1) - s);
        // 6-decimal lon/lat moves a point by up to about 0.1 m; the DEM is stored to 0.01 m.
        const tol = ((chord * chord) / 8) * curvature + 0.15 * (slope + 1) + 0.01;
        const miss = Math.abs(demAt(e, n) - s);
        checked++;
        if (miss > tol) expect.fail(`contact ${JSON.stringify(f.properties)} vertex ${lon},${lat}: DEM - surface = ${miss.toFixed(2)} m > ${tol.toFixed(2)} m`);
      }
    }
    expect(checked).toBeGreaterThan(500);
  });
});

const bad = new Set(truth.plantedBadRows.map((r) => r.id));
const good = stations.filter((s) => !bad.has(s.station_id));

describe('stations against the geometry documented in truth.json', () => {
  it('every good bedding reading lies within 12° of the normal of F at its station (RMS under 4°), as the noise in truth.noise allows', () => {
    const misfits: number[] = [];
    for (const s of good.filter((r) => r.kind === 'bedding')) {
      const e = Number(s.easting);
      const n = Number(s.northing);
      const z = Number(s.elevation_m);
      const miss = angle(planeNormal(Number(s.dip_direction), Number(s.dip)), normalAt(domainAt(e, n), e, n, z));
      if (miss > 12) expect.fail(`${s.station_id}: reading ${s.dip_direction}/${s.dip} is ${miss.toFixed(1)}° from the surface`);
      misfits.push(miss);
    }
    const rms = Math.sqrt(misfits.reduce((a, m) => a + m * m, 0) / misfits.length);
    expect(misfits.length).toBeGreaterThan(390);
    expect(rms).toBeLessThan(4);
    // Noise really was added: readings are not all exact (sigma 2° on dip, truth.noise).
    expect(rms).toBeGreaterThan(1);
  });

  it('the unit column of every good row is the unit of F(easting, northing, DEM elevation) in truth.stratigraphy', async () => {
    const demAt = await readDem();
    for (const s of good) {
      const e = Number(s.easting);
      const n = Number(s.northing);
      expect(s.unit, s.station_id).toBe(unitAt(F(domainAt(e, n), e, n, demAt(e, n))));
    }
  });

  it('every hinge lies on a crest or trough line of truth.geometry.hinges, with its recorded sense', async () => {
    const demAt = await readDem();
    const hinges = good.filter((s) => s.kind === 'hinge');
    expect(hinges.length).toBe(truth.counts.hinge);
    for (const s of hinges) {
      const e = Number(s.easting);
      const n = Number(s.northing);
      const d = domainAt(e, n);
      const f = frameOf(d);
      const [e0, n0, z0] = d.profile.originUtm;
      const P: V3 = [e - e0, n - n0, demAt(e, n) - z0];
      const v = dot(P, f.v);
      const theta = (2 * Math.PI * (dot(P, f.u) - d.profile.shear * v)) / d.profile.wavelength + d.profile.phaseDeg * D2R;
      // Whole-metre coordinates move a hinge by under a metre: |cos theta| < 2 pi / wavelength * 1 m, with margin.
      expect(Math.abs(Math.cos(theta)), s.station_id).toBeLessThan(0.02);
      if (s.sense) expect(s.sense, s.station_id).toBe(Math.sin(theta) > 0 ? 'antiform' : 'synform');
    }
  });
});

describe('geology.geo.json against the stratigraphy in truth.json', () => {
  const geology = readJson<FeatureCollection<MultiPolygon>>('geology.geo.json');

  it('the unit polygons of each domain tile the domain polygon of truth.json (areas within 0.2%, turf.area)', () => {
    for (const d of truth.domains) {
      const tiles = geology.features.filter((f) => f.properties?.domain === d.id).reduce((a, f) => a + turf.area(f), 0);
      const whole = turf.area(turf.polygon([d.polygon]));
      expect(Math.abs(tiles - whole) / whole).toBeLessThan(0.002);
    }
  });

  it('the polygon under each good station has the unit of F there, except within one DEM cell of a contact', async () => {
    const demAt = await readDem();
    const cell = truth.dem.cellSize;
    let nearContact = 0;
    for (const s of good) {
      const e = Number(s.easting);
      const n = Number(s.northing);
      const d = domainAt(e, n);
      const expected = unitAt(F(d, e, n, demAt(e, n)));
      const point = turf.point([Number(s.lon), Number(s.lat)]);
      const found = geology.features.filter((f) => turf.booleanPointInPolygon(point, f)).map((f) => f.properties?.unit);
      if (found.length === 1 && found[0] === expected) continue;
      // Allowed only where the unit changes within one cell: the polygons are linear on the grid.
      const ring = Array.from({ length: 8 }, (_, k) => [e + cell * Math.cos((k * Math.PI) / 4), n + cell * Math.sin((k * Math.PI) / 4)]);
      const changes = ring.some(([pe, pn]) => unitAt(F(d, pe, pn, demAt(pe, pn))) !== expected);
      if (!changes) expect.fail(`${s.station_id}: polygons say ${found.join('+') || 'nothing'}, truth says ${expected}`);
      nearContact++;
    }
    expect(nearContact).toBeLessThan(good.length * 0.03);
  });
});
