/**
 * The demo's central claim: the bedding poles of each structural domain of the SYNTHETIC Korvane
 * map give back the planted fold axis. The orientation tensor's eigenvectors come from ml-matrix
 * (EigenvalueDecomposition), a general-purpose reference outside Foldlens; the least eigenvector of
 * the tensor of poles to a folded surface is its fold (pi) axis (common practice; orientation
 * tensor as in REFERENCES.md, Woodcock 1977 from memory).
 */
import { describe, expect, it } from 'vitest';
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import truth from '../../sample-maps/korvane/truth.json';
import { stations } from '../../sample-maps/korvane/index';

const D2R = Math.PI / 180;
type V3 = [number, number, number];

/** North-east-down direction cosines of a line (common practice, as src/core/types.ts states). */
const lineVector = (trend: number, plunge: number): V3 => [Math.cos(plunge * D2R) * Math.cos(trend * D2R), Math.cos(plunge * D2R) * Math.sin(trend * D2R), Math.sin(plunge * D2R)];
/** Pole of a plane: trend = dip direction + 180, plunge = 90 - dip (common practice). */
const poleVector = (dd: number, dip: number): V3 => lineVector(dd + 180, 90 - dip);
const axialAngle = (p: V3, q: V3): number => Math.acos(Math.min(1, Math.abs(p[0] * q[0] + p[1] * q[1] + p[2] * q[2]) / (Math.hypot(...p) * Math.hypot(...q)))) / D2R;

const bad = new Set(truth.plantedBadRows.map((r) => r.id));
const good = stations.filter((s) => !bad.has(s.station_id));

/** Domain of a station from the fault trace in truth.json (west = left of the trace going north). */
function domainOf(row: Readonly<Record<string, string>>): string {
  const [[ax, ay], [bx, by]] = truth.fault.traceUtm;
  const e = Number(row.easting);
  const n = Number(row.northing);
  return (bx - ax) * (n - ay) - (by - ay) * (e - ax) >= 0 ? 'west' : 'east';
}

/** Eigenvalues (descending) and eigenvectors of T = (1/N) sum x x^T, through ml-matrix. */
function orientationTensor(vectors: readonly V3[]): { values: number[]; vectors: V3[] } {
  const t = Matrix.zeros(3, 3);
  for (const v of vectors) for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) t.set(i, j, t.get(i, j) + (v[i] * v[j]) / vectors.length);
  const evd = new EigenvalueDecomposition(t, { assumeSymmetric: true });
  const order = evd.realEigenvalues.map((value, k) => ({ value, k })).sort((a, b) => b.value - a.value);
  const vec = evd.eigenvectorMatrix;
  return { values: order.map((o) => o.value), vectors: order.map((o) => [vec.get(0, o.k), vec.get(1, o.k), vec.get(2, o.k)] as V3) };
}

const polesIn = (domain: string): V3[] =>
  good.filter((s) => s.kind === 'bedding' && domainOf(s) === domain).map((s) => poleVector(Number(s.dip_direction), Number(s.dip)));

describe('fold axes recovered from the Korvane stations', () => {
  for (const d of truth.domains) {
    const axis = lineVector(d.axis.trend, d.axis.plunge);

    it(`the least eigenvector of orientationTensor(bedding poles) in the ${d.id} domain lies within 2° of the planted axis ${d.axis.trend}/${d.axis.plunge}`, () => {
      const poles = polesIn(d.id);
      expect(poles.length).toBeGreaterThan(150);
      const { values, vectors } = orientationTensor(poles);
      // A girdle: S3 small, S2 well above it (Woodcock 1977, from memory).
      expect(values[2]).toBeLessThan(0.01);
      expect(values[1]).toBeGreaterThan(0.05);
      expect(axialAngle(vectors[2], axis)).toBeLessThan(2);
    });

    it(`the summed hinges and intersection lineations of the ${d.id} domain point within 2° of its axis`, () => {
      const lines = good.filter((s) => (s.kind === 'hinge' || s.kind === 'intersection') && domainOf(s) === d.id);
      expect(lines.length).toBeGreaterThan(20);
      const sum = lines.map((s) => lineVector(Number(s.trend), Number(s.plunge))).reduce<V3>((a, v) => [a[0] + v[0], a[1] + v[1], a[2] + v[2]], [0, 0, 0]);
      expect(axialAngle(sum, axis)).toBeLessThan(2);
      for (const s of lines) expect(axialAngle(lineVector(Number(s.trend), Number(s.plunge)), axis), s.station_id).toBeLessThan(15);
    });

    it(`the cleavage poles of the ${d.id} domain average within 3° of the axial-surface pole in truth.json`, () => {
      const poles = good.filter((s) => s.kind === 'cleavage' && domainOf(s) === d.id).map((s) => poleVector(Number(s.dip_direction), Number(s.dip)));
      expect(poles.length).toBeGreaterThan(3);
      const { vectors } = orientationTensor(poles);
      expect(axialAngle(vectors[0], poleVector(d.axialSurface.dipDirection, d.axialSurface.dip))).toBeLessThan(3);
      // The axial surface contains the axis.
      expect(90 - axialAngle(poleVector(d.axialSurface.dipDirection, d.axialSurface.dip), axis)).toBeLessThan(0.01);
    });
  }

  it('orientationTensor of the pooled bedding poles is a poorer girdle than either domain alone (larger S3)', () => {
    const pooled = orientationTensor([...polesIn('west'), ...polesIn('east')]).values[2];
    for (const d of truth.domains) expect(pooled).toBeGreaterThan(5 * orientationTensor(polesIn(d.id)).values[2]);
  });

  it('the axes recovered in the two domains differ by truth.angleBetweenAxes within 3°', () => {
    const [w, e] = truth.domains.map((d) => orientationTensor(polesIn(d.id)).vectors[2]);
    expect(Math.abs(axialAngle(w, e) - truth.angleBetweenAxes)).toBeLessThan(3);
    // and truth.angleBetweenAxes itself is the angle between the stated axes
    const [tw, te] = truth.domains.map((d) => lineVector(d.axis.trend, d.axis.plunge));
    expect(Math.abs(axialAngle(tw, te) - truth.angleBetweenAxes)).toBeLessThan(0.001);
  });
});
