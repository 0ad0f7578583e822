/**
 * Writes the synthetic two-domain fold fixture into tests/fixtures/fold-two-domains/
 * (tsx scripts/make-fold-fixture.ts). Invented data: the "Brennock Hills" and every station
 * name are made up.
 *
 * The truth, known analytically:
 * - domain A (stations BH-A.., inside area.geojson): a cylindrical fold with axis 120/25
 *   (trend/plunge). Every plane is built so that its pole is exactly perpendicular to that axis:
 *   pole(θ) = cos θ·v + sin θ·u, with u the horizontal line across the axis (trend 210, plunge 0)
 *   and v the line at right angles to the axis in its vertical plane (trend 300... flipped to
 *   the lower hemisphere: 120 + 180 with plunge 90 - 25), θ = -60° to 60° in 10° steps. The
 *   poles lie on the great circle whose pole is the axis, so the best-fit girdle axis (the
 *   eigenvector of the least eigenvalue of the pole tensor) is the axis itself. Hinges measured
 *   in the domain are 120/25 and that line turned ±2° about the horizontal across it (their
 *   mean is 120/25). Each pole is written twice, tilted 3° toward each end of the axis: a pair
 *   adds cos²3°·p pᵀ + sin²3°·a aᵀ to the pole tensor (the cross terms cancel), so the axis is
 *   still exactly the eigenvector of the least eigenvalue, while the data scatter as real data do.
 * - domain B (BH-B.., outside the area): axis 030/10 the same way, θ = -50° to 50°.
 * Angles are written with two decimals, so each plane is off by at most 0.005° from the exact
 * one and the axis of domain A is recovered far inside 0.5°.
 *
 * Locations: UTM zone 33N (EPSG:32633) eastings and northings; domain A lies in the square
 * 500000-501000 E, 5000000-5001000 N, which area.geojson outlines in WGS84 (corners converted
 * with proj4); domain B lies 2 km east of it. Only trigonometry and proj4 are used here, not the
 * Foldlens code under test.
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import proj4 from 'proj4';

export const FOLD_FIXTURE_DIR = join('tests', 'fixtures', 'fold-two-domains');
export const TRUTH = { inside: { axis: { trend: 120, plunge: 25 } }, outside: { axis: { trend: 30, plunge: 10 } } } as const;

const D = Math.PI / 180;
const UTM33 = '+proj=utm +zone=33 +datum=WGS84 +units=m +no_defs';
const WGS84 = '+proj=longlat +datum=WGS84 +no_defs';

type V = [number, number, number]; // north, east, down

/** Unit vectors of the frame of an axis: a along it, u horizontal across it, v across it in its vertical plane. */
function frame(trend: number, plunge: number): { a: V; u: V; v: V } {
  const t = trend * D;
  const p = plunge * D;
  return {
    a: [Math.cos(p) * Math.cos(t), Math.cos(p) * Math.sin(t), Math.sin(p)],
    u: [-Math.sin(t), Math.cos(t), 0],
    v: [-Math.sin(p) * Math.cos(t), -Math.sin(p) * Math.sin(t), Math.cos(p)],
  };
}

const comb = (k1: number, x: V, k2: number, y: V): V => [k1 * x[0] + k2 * y[0], k1 * x[1] + k2 * y[1], k1 * x[2] + k2 * y[2]];

/** Trend and plunge of a unit vector, flipped into the lower hemisphere. */
function trendPlunge(n: V): [number, number] {
  const m: V = n[2] < 0 ? [-n[0], -n[1], -n[2]] : n;
  return [(Math.atan2(m[1], m[0]) / D + 360) % 360, Math.asin(Math.min(1, m[2])) / D];
}

/**
 * Planes (dip direction, dip) of a cylindrical fold: for each θ (degrees) the pole
 * cos θ·v + sin θ·u, tilted by +TILT and by -TILT toward the axis. The two tilts of a pair add
 * cos²·p pᵀ + sin²·a aᵀ to the tensor (their cross terms cancel), so the axis stays exactly an
 * eigenvector, of the least eigenvalue sin² TILT, while the poles scatter off the girdle.
 */
function foldPlanes(trend: number, plunge: number, thetas: readonly number[]): { theta: number; tilt: number; plane: [number, number] }[] {
  const { a, u, v } = frame(trend, plunge);
  return thetas.flatMap((deg) =>
    [TILT, -TILT].map((tilt) => {
      const pole = comb(Math.cos(tilt * D), comb(Math.cos(deg * D), v, Math.sin(deg * D), u), Math.sin(tilt * D), a);
      const [poleTrend, polePlunge] = trendPlunge(pole);
      return { theta: deg, tilt, plane: [(poleTrend + 180) % 360, 90 - polePlunge] as [number, number] };
    }),
  );
}

/** Hinges: the axis, and the axis turned by ±HINGE_SPREAD about u (their mean is the axis). */
function hinges(trend: number, plunge: number): [number, number][] {
  const { a, v } = frame(trend, plunge);
  return [0, HINGE_SPREAD, -HINGE_SPREAD].map((deg) => trendPlunge(comb(Math.cos(deg * D), a, Math.sin(deg * D), v)));
}

/** Tilt of the poles off the girdle, degrees. */
const TILT = 3;
/** Spread of the hinges about the axis, degrees. */
const HINGE_SPREAD = 2;

const range = (from: number, to: number, step: number): number[] => Array.from({ length: Math.round((to - from) / step) + 1 }, (_, i) => from + i * step);
const f2 = (x: number): string => x.toFixed(2);

/** Rows and GeoJSON features of the fixture. */
export function makeFoldFixture(): Record<string, string> {
  const header = ['Station', 'Structure', 'DipDir', 'Dip', 'Trend', 'Plunge', 'Easting', 'Northing', 'Date', 'Notes'];
  const rows: string[][] = [];
  const planeWords = ['Bedding', 'S0', 'bed'];
  const addDomain = (tag: string, axis: { trend: number; plunge: number }, thetas: number[], x0: number): void => {
    foldPlanes(axis.trend, axis.plunge, thetas).forEach(({ theta, tilt, plane: [dd, dip] }, i) => {
      const x = x0 + 100 + (i % 5) * 200;
      const y = 5000100 + Math.floor(i / 5) * 150;
      rows.push([`BH-${tag}${String(i + 1).padStart(2, '0')}`, planeWords[i % 3], f2(dd), f2(dip), '', '', String(x), String(y), '2025-06-01', `synthetic limb θ ${theta}°, tilt ${tilt}°`]);
    });
    hinges(axis.trend, axis.plunge).forEach(([trend, plunge], i) => {
      rows.push([`BH-${tag}H${i + 1}`, i % 2 ? 'fold axis' : 'F1 hinge', '', '', f2(trend), f2(plunge), String(x0 + 250 + i * 250), '5000950', '2025-06-01', 'synthetic hinge']);
    });
  };
  addDomain('A', TRUTH.inside.axis, range(-60, 60, 10), 500000);
  addDomain('B', TRUTH.outside.axis, range(-50, 50, 10), 502000);

  const csv = [header, ...rows].map((r) => r.map((v) => (/[",\n]/.test(v) ? `"${v.replace(/"/g, '""')}"` : v)).join(',')).join('\n') + '\n';

  const toLonLat = (x: number, y: number): [number, number] => {
    const [lon, lat] = proj4(UTM33, WGS84, [x, y]);
    return [Number(lon.toFixed(8)), Number(lat.toFixed(8))];
  };
  const corners = [
    [500000, 5000000],
    [501000, 5000000],
    [501000, 5001000],
    [500000, 5001000],
    [500000, 5000000],
  ].map(([x, y]) => toLonLat(x, y));
  const area = { type: 'FeatureCollection', features: [{ type: 'Feature', properties: { name: 'Brennock Hills, domain A' }, geometry: { type: 'Polygon', coordinates: [corners] } }] };

  const features = rows.map((r) => {
    const properties: Record<string, string | number> = {};
    header.forEach((h, i) => {
      if (h !== 'Easting' && h !== 'Northing' && r[i] !== '') properties[h] = /^(DipDir|Dip|Trend|Plunge)$/.test(h) ? Number(r[i]) : r[i];
    });
    return { type: 'Feature', properties, geometry: { type: 'Point', coordinates: toLonLat(Number(r[6]), Number(r[7])) } };
  });
  const geojson = { type: 'FeatureCollection', features };

  return {
    'in.csv': csv,
    'in.geojson': `${JSON.stringify(geojson, null, 1)}\n`,
    'area.geojson': `${JSON.stringify(area, null, 1)}\n`,
    'truth.json': `${JSON.stringify(TRUTH, null, 2)}\n`,
  };
}

if (process.argv[1] && /make-fold-fixture\.ts$/.test(process.argv[1])) {
  mkdirSync(FOLD_FIXTURE_DIR, { recursive: true });
  for (const [name, text] of Object.entries(makeFoldFixture())) {
    writeFileSync(join(FOLD_FIXTURE_DIR, name), text);
    console.log(`wrote ${join(FOLD_FIXTURE_DIR, name)}`);
  }
}
