import { describe, expect, it } from 'vitest';
import { extentOfTriples, keptRuns, layoutProfile, niceLength, toDrawing } from '../../src/core/profileLayout';
import { expectClose } from '../helpers/tolerance';

describe('niceLength(max)', () => {
  // Round scale-bar lengths 1, 2, 5 × 10^k (common practice on map scale bars).
  const rows = [
    { max: 730, expected: 500 },
    { max: 1000, expected: 1000 },
    { max: 199.9, expected: 100 },
    { max: 2.5, expected: 2 },
    { max: 0.07, expected: 0.05 },
  ];
  for (const { max, expected } of rows) {
    it(`niceLength(${max}) is ${expected}`, () => {
      expectClose(niceLength(max), expected, 1e-12 * expected, 'length');
    });
  }
  it('niceLength rejects a length that is not positive', () => {
    expect(() => niceLength(0)).toThrow(/0 is not a positive length/);
  });
});

describe('layoutProfile(extent) and toDrawing', () => {
  it('layoutProfile uses one scale across and up (true scale) and fits the larger of width and height', () => {
    const l = layoutProfile({ minX: 0, minY: 0, maxX: 3000, maxY: 1000 }, { maxWidth: 900, maxHeight: 600, padding: 0 });
    expectClose(l.scale, 900 / 3000, 1e-12, 'px per metre');
    expectClose(l.plot.height / l.plot.width, 1000 / 3000, 1e-12, 'aspect ratio kept');
    expect(l.scaleBar.metres).toBe(500);
    expectClose(l.scaleBar.length, 500 * l.scale, 1e-12, 'drawn scale bar');
  });

  it('toDrawing puts the lower-left of the extent at the bottom-left of the plot and up in the profile up on the page', () => {
    const l = layoutProfile({ minX: 100, minY: 200, maxX: 1100, maxY: 700 }, { padding: 0, margin: 40 });
    expect(toDrawing(l, 100, 200)).toEqual([40, 40 + l.plot.height]);
    const [, yHigh] = toDrawing(l, 100, 700);
    expectClose(yHigh, 40, 1e-9, 'top of the plot');
  });

  it('layoutProfile gives a single point a drawable area and rejects non-finite extents', () => {
    const l = layoutProfile({ minX: 5, minY: 5, maxX: 5, maxY: 5 });
    expect(l.plot.width).toBeGreaterThan(0);
    expect(l.plot.height).toBeGreaterThan(0);
    expect(() => layoutProfile({ minX: 0, minY: Number.NaN, maxX: 1, maxY: 1 })).toThrow(/extent minY is NaN/);
  });

  it('extentOfTriples ignores the depth and non-finite points and can grow an extent', () => {
    const e = extentOfTriples(new Float64Array([0, 0, 99, 10, 20, -99, Number.NaN, 500, 0]));
    expect(e).toEqual({ minX: 0, minY: 0, maxX: 10, maxY: 20 });
    expect(extentOfTriples(new Float64Array([-5, 1, 0]), e)).toEqual({ minX: -5, minY: 0, maxX: 10, maxY: 20 });
    expect(extentOfTriples(new Float64Array(0))).toBeNull();
  });
});

describe('keptRuns(keep)', () => {
  it('keptRuns breaks a line where vertices are left out and keeps runs of one', () => {
    expect(keptRuns([1, 1, 0, 1])).toEqual([
      [0, 2],
      [3, 4],
    ]);
    expect(keptRuns([false, false])).toEqual([]);
    expect(keptRuns([true, false, true, true, true, false])).toEqual([
      [0, 1],
      [2, 5],
    ]);
  });
});
