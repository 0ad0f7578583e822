import { describe, expect, it } from 'vitest';
import { profileFrame, projectDownPlunge } from '../../src/core/downPlunge';
import { profileScatter, profileScatterDetail } from '../../src/core/profileScatter';
import { createDem, sampleDem, type Dem } from '../../src/io/demSampler';
import { mulberry32 } from '../helpers/prng';
import { expectClose } from '../helpers/tolerance';

/**
 * Round trip through the ground: a synthetic cylindrical surface built from a known profile
 * curve, cut by a synthetic terrain model; the trace (surface ∩ terrain) projected down the
 * surface's axis must give back the curve, and projected along a wrong axis must not.
 *
 * Synthetic data with an analytic answer: the surface is {P : P·v - h(P·u) = 0} for the profile
 * frame (u, v) of the axis (REFERENCES.md "Profiles"), h(x) = A sin(2πx/λ). It contains every
 * line parallel to the axis, so it is exactly cylindrical.
 */

const AXIS = { trend: 40, plunge: 10 };
const AMPLITUDE = 150;
const WAVELENGTH = 1000;
const h = (x: number): number => AMPLITUDE * Math.sin((2 * Math.PI * x) / WAVELENGTH);

/** 6 km x 6 km of 25 m cells with ridges and valleys (relief about 600 m), heights in metres. */
function syntheticTerrain(): Dem {
  const width = 240;
  const height = 240;
  const cell = 25;
  const values = new Float32Array(width * height);
  for (let r = 0; r < height; r++) {
    for (let c = 0; c < width; c++) {
      const x = c * cell;
      const y = 6000 - r * cell;
      values[r * width + c] = 600 + 180 * Math.sin(x / 430) * Math.cos(y / 370) + 120 * Math.sin((x + y) / 900);
    }
  }
  return createDem({ width, height, values, x0: 0, y0: 6000, dx: cell, dy: cell, noData: null, source: 'synthetic terrain' });
}

const ORIGIN = [3000, 3000, 600] as const;

/**
 * Points where the surface meets the ground: on every edge between neighbouring cell centres
 * where (height of the surface - height of the ground) changes sign, the crossing found by
 * bisection to 1e-9 of the edge (the ground along such an edge is linear in the bilinear model,
 * so the point lies on the terrain model exactly). Returns east-north-up metres from ORIGIN.
 */
function traceOfSurface(dem: Dem): Float64Array {
  const f = profileFrame(AXIS);
  const g = (x: number, y: number): number => {
    const z = sampleDem(dem, x, y)!;
    const p = [x - ORIGIN[0], y - ORIGIN[1], z - ORIGIN[2]];
    const u = p[0] * f.right[0] + p[1] * f.right[1];
    const v = p[0] * f.up[0] + p[1] * f.up[1] + p[2] * f.up[2];
    return v - h(u);
  };
  const out: number[] = [];
  const cross = (xa: number, ya: number, xb: number, yb: number): void => {
    const ga = g(xa, ya);
    if (ga > 0 === g(xb, yb) > 0) return;
    let lo = 0;
    let hi = 1;
    for (let k = 0; k < 40; k++) {
      const m = (lo + hi) / 2;
      if (g(xa + m * (xb - xa), ya + m * (yb - ya)) > 0 === ga > 0) lo = m;
      else hi = m;
    }
    const m = (lo + hi) / 2;
    const x = xa + m * (xb - xa);
    const y = ya + m * (yb - ya);
    out.push(x - ORIGIN[0], y - ORIGIN[1], sampleDem(dem, x, y)! - ORIGIN[2]);
  };
  for (let r = 0; r < dem.height; r++) {
    for (let c = 0; c < dem.width; c++) {
      const x = dem.x0 + c * dem.dx;
      const y = dem.y0 - r * dem.dy;
      if (c + 1 < dem.width) cross(x, y, x + dem.dx, y);
      if (r + 1 < dem.height) cross(x, y, x, y - dem.dy);
    }
  }
  return new Float64Array(out);
}

/** (x', y') pairs of a projection, and the RMS and largest |y' - h(x')|. */
function projectTrace(trace: Float64Array, axis: { trend: number; plunge: number }) {
  const p = projectDownPlunge(trace, axis);
  const n = trace.length / 3;
  const xy = new Float64Array(2 * n);
  let sum = 0;
  let max = 0;
  for (let i = 0; i < n; i++) {
    xy[2 * i] = p[3 * i];
    xy[2 * i + 1] = p[3 * i + 1];
    const e = p[3 * i + 1] - h(p[3 * i]);
    sum += e * e;
    max = Math.max(max, Math.abs(e));
  }
  return { xy, rms: Math.sqrt(sum / n), max };
}

describe('down-plunge round trip: trace of a cylindrical surface on a synthetic DEM', () => {
  const dem = syntheticTerrain();
  const trace = traceOfSurface(dem);

  it('traceOfSurface finds a trace that crosses the ground many times at different depths along the axis', () => {
    const n = trace.length / 3;
    expect(n).toBeGreaterThan(800);
    const depths = projectDownPlunge(trace, AXIS).filter((_, i) => i % 3 === 2);
    // More than 2 km of spread along the axis: the pieces overlap in the profile only if the axis is right.
    expect(Math.max(...depths) - Math.min(...depths)).toBeGreaterThan(2000);
  });

  it('projectDownPlunge(trace, true axis) gives back the profile curve y = h(x) within 1e-6 m (stated tolerance: bisection to 1e-9 of a 25 m edge)', () => {
    const { rms, max } = projectTrace(trace, AXIS);
    expect(max).toBeLessThan(1e-6);
    expect(rms).toBeLessThan(1e-6);
  });

  it('projectDownPlunge(trace, axis 5° off in trend or plunge) misses the curve by tens of metres', () => {
    for (const wrong of [
      { trend: AXIS.trend + 5, plunge: AXIS.plunge },
      { trend: AXIS.trend - 5, plunge: AXIS.plunge },
      { trend: AXIS.trend, plunge: AXIS.plunge + 5 },
    ]) {
      const { rms } = projectTrace(trace, wrong);
      expect(rms, `axis ${wrong.trend}/${wrong.plunge}`).toBeGreaterThan(20);
    }
  });

  it('profileScatter of the projected trace, with no knowledge of the curve, grows more than tenfold when the axis is 5° wrong', () => {
    const radius = 100;
    const right = profileScatter(projectTrace(trace, AXIS).xy, { radius });
    // Floor of the measure on a sine of 150 m amplitude: the quadratic cannot follow it exactly over ±100 m.
    expect(right).toBeLessThan(0.2);
    for (const wrong of [
      { trend: AXIS.trend + 5, plunge: AXIS.plunge },
      { trend: AXIS.trend - 5, plunge: AXIS.plunge },
      { trend: AXIS.trend, plunge: AXIS.plunge + 5 },
    ]) {
      const s = profileScatter(projectTrace(trace, wrong).xy, { radius });
      expect(s, `axis ${wrong.trend}/${wrong.plunge}`).toBeGreaterThan(10 * right);
      expect(s).toBeGreaterThan(2);
    }
  });
});

describe('profileScatter(points)', () => {
  it('profileScatter of points on a straight line is 0 and of points on a circle of radius 1000 m is under 1 mm', () => {
    const line = new Float64Array(Array.from({ length: 200 }, (_, i) => [i * 5, 3 + i * 2.5]).flat());
    expectClose(profileScatter(line, { radius: 30 }), 0, 1e-9, 'line');
    const circle = new Float64Array(Array.from({ length: 400 }, (_, i) => [1000 * Math.cos((i / 400) * 2 * Math.PI), 1000 * Math.sin((i / 400) * 2 * Math.PI)]).flat());
    // A quadratic follows a circle to about s^3/R^2-order terms: tiny over ±50 m on R = 1000 m.
    expect(profileScatter(circle, { radius: 50 })).toBeLessThan(1e-3);
  });

  it('profileScatter of a uniform band of width w approaches its standard deviation across, w/sqrt(12)', () => {
    // Standard deviation of a uniform distribution of width w is w/sqrt(12) (common practice).
    const rnd = mulberry32(7);
    const w = 20;
    const pts = new Float64Array(Array.from({ length: 8000 }, () => [2000 * rnd(), w * (rnd() - 0.5)]).flat());
    const s = profileScatter(pts, { radius: 60 });
    expectClose(s, w / Math.sqrt(12), 0.1 * (w / Math.sqrt(12)), 'band scatter');
  });

  it('profileScatterDetail leaves points with too few neighbours without a residual and reports the default radius (1/40 of the diagonal)', () => {
    const pts = new Float64Array([0, 0, 1, 0, 2, 0, 3, 0, 4, 0, 5, 0, 400, 300]);
    const d = profileScatterDetail(pts);
    expectClose(d.radius, 500 / 40, 1e-12, 'default radius');
    expect(Number.isNaN(d.residuals[6])).toBe(true);
    expect(d.used).toBe(6);
    expectClose(d.rms, 0, 1e-9, 'rms of the collinear six');
  });

  it('profileScatter rejects odd lengths, non-finite coordinates and a bad radius, naming the point', () => {
    expect(() => profileScatter(new Float64Array(3))).toThrow(/3 numbers is not a list of x, y pairs/);
    expect(() => profileScatter(new Float64Array([0, 0, Number.NaN, 1]))).toThrow(/point 2 has a non-finite x/);
    expect(() => profileScatter(new Float64Array([0, 0, 1, 1]), { radius: -1 })).toThrow(/radius -1/);
    expect(() => profileScatter(new Float64Array([0, 0, 1, 1]), { minNeighbours: 2 })).toThrow(/at least 4/);
  });
});
