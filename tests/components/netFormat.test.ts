import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  DASH,
  azimuthText,
  displayText,
  formatAngle,
  formatCount,
  formatLine,
  formatNumber,
  formatPlane,
  inclinationText,
  joinFormatted,
} from '../../src/components/net/format';

const BAD = /NaN|Infinity|undefined|null/;

/** Any number including the awkward ones, or a missing value. */
const anyValue = fc.oneof(
  fc.double(),
  fc.constantFrom(Number.NaN, Infinity, -Infinity, -0, 0, 1e-300, -1e-300, 1e21, Number.MAX_VALUE),
  fc.constant(null),
  fc.constant(undefined),
);

describe('format helpers', () => {
  it('formatNumber(v, digits, unit, reason) never prints NaN, Infinity, undefined or null, and gives a reason exactly when it prints a dash', () => {
    fc.assert(
      fc.property(anyValue, fc.integer({ min: 0, max: 6 }), (v, digits) => {
        const f = formatNumber(v as number | null | undefined, digits, '°', 'no planes');
        expect(f.text).not.toMatch(BAD);
        const finite = typeof v === 'number' && Number.isFinite(v);
        expect(f.reason === null).toBe(finite);
        if (!finite) {
          expect(f.text).toBe(DASH);
          expect(displayText(f)).toBe('— (no planes)');
        }
      }),
      { numRuns: 500 },
    );
  });

  it('formatLine(line) and formatPlane(plane) never print NaN, Infinity or undefined for any input', () => {
    fc.assert(
      fc.property(anyValue, anyValue, (a, b) => {
        const line = formatLine({ trend: a as number, plunge: b as number }, 'no axis');
        const plane = formatPlane({ dipDirection: a as number, dip: b as number }, 'no girdle');
        for (const f of [line, plane]) expect(displayText(f)).not.toMatch(BAD);
      }),
      { numRuns: 500 },
    );
    expect(formatLine(null, 'all planes parallel')).toEqual({ text: DASH, reason: 'all planes parallel' });
    expect(formatPlane(undefined)).toEqual({ text: DASH, reason: 'not available' });
  });

  // Three-digit azimuths and two-digit plunges, rounded to whole degrees (common practice for
  // trend/plunge notation, e.g. 040/25).
  const azimuths = [
    { input: 0, expected: '000' },
    { input: 7.4, expected: '007' },
    { input: 40.5, expected: '041' }, // Math.round rounds half up
    { input: 359.4, expected: '359' },
    { input: 359.6, expected: '000' }, // rounds to 360, which is north
    { input: -0.4, expected: '000' },
    { input: -90, expected: '270' },
    { input: 725, expected: '005' },
  ];
  for (const row of azimuths) {
    it(`azimuthText(${row.input}) is '${row.expected}'`, () => {
      expect(azimuthText(row.input)).toBe(row.expected);
    });
  }

  it('inclinationText(angle) pads to two digits and stays within 0..90', () => {
    expect(inclinationText(5.2)).toBe('05');
    expect(inclinationText(89.7)).toBe('90');
    expect(inclinationText(90.4)).toBe('90');
    expect(inclinationText(Number.NaN)).toBe(DASH);
  });

  it('formatLine({trend: 40.2, plunge: 24.8}) is 040/25 and formatPlane({dipDirection: 130, dip: 65}) is 130/65', () => {
    expect(formatLine({ trend: 40.2, plunge: 24.8 }).text).toBe('040/25');
    expect(formatPlane({ dipDirection: 130, dip: 65 }).text).toBe('130/65');
  });

  it('formatNumber(-0.0001, 3) prints 0.000, not -0.000', () => {
    expect(formatNumber(-0.0001, 3).text).toBe('0.000');
    expect(formatAngle(-0.01).text).toBe('0.0°');
  });

  it('formatCount(n) groups thousands with a narrow space', () => {
    expect(formatCount(100000).text).toBe('100\u202f000');
    expect(formatCount(999).text).toBe('999');
    expect(formatCount(Infinity).text).toBe(DASH);
  });

  it('joinFormatted(parts, sep) gives a dash with the first reason when any part is missing', () => {
    expect(joinFormatted([formatNumber(0.6, 3), formatNumber(0.3, 3)], ' · ').text).toBe('0.600 · 0.300');
    expect(joinFormatted([formatNumber(0.6, 3), formatNumber(null, 3, '', 'no planes')], ' · ')).toEqual({ text: DASH, reason: 'no planes' });
  });
});
