import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { lineToVector, vectorToLine, poleOf, planeOf, angleBetweenVectors, axialAngle, normalize, vec3, toLowerHemisphere } from '../../src/core/vectors';
import { expectAzimuth, expectClose, expectDeepClose } from '../helpers/tolerance';

describe('lineToVector / vectorToLine', () => {
  // Direction cosines in north-east-down; values are the definitions of the convention (common practice).
  const rows = [
    { line: { trend: 0, plunge: 0 }, v: [1, 0, 0] },
    { line: { trend: 90, plunge: 0 }, v: [0, 1, 0] },
    { line: { trend: 0, plunge: 90 }, v: [0, 0, 1] },
    { line: { trend: 180, plunge: 30 }, v: [-Math.sqrt(3) / 2, 0, 0.5] },
    { line: { trend: 225, plunge: 45 }, v: [-0.5, -0.5, Math.SQRT1_2] },
  ];
  for (const { line, v } of rows) {
    it(`lineToVector(${line.trend}/${line.plunge}) gives (${v.map((c) => c.toFixed(3)).join(', ')})`, () => {
      const got = lineToVector(line);
      expectDeepClose([got.x, got.y, got.z], v, 1e-12);
      expectDeepClose(vectorToLine(got), line, 1e-9);
    });
  }

  it('vectorToLine flips upward vectors into the lower hemisphere', () => {
    expectDeepClose(vectorToLine(vec3(0, -1, -1)), { trend: 90, plunge: 45 }, 1e-9);
  });

  it('toLowerHemisphere picks trend in [0,180) for horizontal vectors', () => {
    expectDeepClose(vectorToLine(toLowerHemisphere(vec3(-1, 0, 0))), { trend: 0, plunge: 0 }, 1e-9);
  });

  it('normalize throws on a zero vector', () => {
    expect(() => normalize(vec3(0, 0, 0))).toThrow(/zero-length/);
  });

  it('round-trips any line (property)', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 359.999, noNaN: true }), fc.double({ min: 0.001, max: 89.999, noNaN: true }), (trend, plunge) => {
        const back = vectorToLine(lineToVector({ trend, plunge }));
        expectAzimuth(back.trend, trend, 1e-7);
        expectClose(back.plunge, plunge, 1e-7);
      }),
    );
  });
});

describe('poleOf / planeOf', () => {
  it('poleOf({dipDirection: 120, dip: 45}) is 300/45 (pole opposite the dip direction, common practice)', () => {
    expectDeepClose(poleOf({ dipDirection: 120, dip: 45 }), { trend: 300, plunge: 45 }, 1e-12);
  });
  it('planeOf(poleOf(p)) returns p', () => {
    expectDeepClose(planeOf(poleOf({ dipDirection: 10, dip: 80 })), { dipDirection: 10, dip: 80 }, 1e-12);
  });
});

describe('angles', () => {
  it('angleBetweenVectors of opposite vectors is 180, axialAngle is 0', () => {
    const a = lineToVector({ trend: 30, plunge: 20 });
    const b = vec3(-a.x, -a.y, -a.z);
    expectClose(angleBetweenVectors(a, b), 180, 1e-9);
    expectClose(axialAngle(a, b), 0, 1e-6);
  });
});

describe('vectorToLine precision', () => {
  it('vectorToLine keeps a nearly horizontal line horizontal to 1e-12° (atan2, not asin)', () => {
    // A vector 1e-10 rad below the horizontal: plunge must be 1e-10 rad in degrees, not asin noise.
    const back = vectorToLine(vec3(Math.cos(1e-10), 0, Math.sin(1e-10)));
    expectClose(back.plunge, 1e-10 * (180 / Math.PI), 1e-15);
  });
  it('vectorToLine of a vector tilted 1e-9 rad from vertical has plunge 90 - 5.7e-8°', () => {
    const e = 1e-9;
    const back = vectorToLine(vec3(Math.sin(e), 0, Math.cos(e)));
    expectClose(back.plunge, 90 - e * (180 / Math.PI), 1e-12);
  });
});
