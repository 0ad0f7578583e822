import { describe, it, expect } from 'vitest';
import {
  wmmDeclination,
  magneticCorrection,
  userDeclination,
  convergenceCorrection,
  correctAzimuth,
  parseIsoDate,
  DeclinationError,
  WMM_SPAN,
} from '../../src/io/declination';
import { builtInCrs } from '../../src/io/crs';
import { expectAzimuth, expectClose } from '../helpers/tolerance';

/** A decimal year as a Date, the way the model's own code turns dates into years (365-day years). */
function decimalYear(y: number): Date {
  const whole = Math.floor(y);
  return new Date(Date.UTC(whole, 0, 1) + (y - whole) * 365 * 86_400_000);
}

describe('wmmDeclination(lat, lon, heightKm, date)', () => {
  // NOAA World Magnetic Model 2025 test values (published; see REFERENCES.md): (year, height km, lat, lon) -> D, east positive.
  const rows = [
    { year: 2025.0, h: 0, lat: 80, lon: 0, d: 1.28 },
    { year: 2025.0, h: 0, lat: 0, lon: 120, d: -0.16 },
    { year: 2025.0, h: 0, lat: -80, lon: 240, d: 68.78 },
    { year: 2027.5, h: 0, lat: 80, lon: 0, d: 2.59 },
    { year: 2025.0, h: 28, lat: 89, lon: -121, d: -99.77 },
    { year: 2025.0, h: 48, lat: 80, lon: -96, d: -29.91 },
    { year: 2025.0, h: 18, lat: 0, lon: 21, d: 1.29 },
    { year: 2025.5, h: 6, lat: -36, lon: -137, d: 20.28 },
  ];
  for (const r of rows) {
    it(`wmmDeclination(${r.lat}, ${r.lon}, ${r.h}, ${r.year}) is ${r.d}° (NOAA WMM2025 test value)`, () => {
      const got = wmmDeclination(r.lat, r.lon, r.h, decimalYear(r.year));
      expectClose(got.degrees, r.d, 0.01, 'declination'); // tolerance as in REFERENCES.md
      expect(got.model).toBe('WMM2025');
    });
  }

  it('wmmDeclination(...) names the older model for a date it covers', () => {
    expect(wmmDeclination(45, 15, 0, new Date('2022-01-01')).model).toBe('WMM2020');
  });

  for (const date of ['2010-06-01', '2031-01-01']) {
    it(`wmmDeclination(45, 15, 0, ${date}) refuses a date outside the models, with no fallback`, () => {
      expect(() => wmmDeclination(45, 15, 0, new Date(date))).toThrow(DeclinationError);
      expect(() => wmmDeclination(45, 15, 0, new Date(date))).toThrow(/outside the World Magnetic Models available here \(2014-12-15 to 2029-11-13\)/);
    });
  }

  it('WMM_SPAN runs from the first WMM2015 day to the last WMM2025 day', () => {
    expect(WMM_SPAN.start.toISOString().slice(0, 10)).toBe('2014-12-15');
    expect(WMM_SPAN.end.toISOString().slice(0, 10)).toBe('2029-11-13');
  });

  it('wmmDeclination(...) refuses a latitude beyond 90 and an invalid date', () => {
    expect(() => wmmDeclination(95, 15, 0, new Date('2025-06-01'))).toThrow(/not a latitude and longitude/);
    expect(() => wmmDeclination(45, 15, 0, new Date('not a date'))).toThrow(/not a valid date/);
  });
});

describe('corrections', () => {
  it('magneticCorrection(lat, lon, km, date) stores the model and date as its source', () => {
    const c = magneticCorrection(80, 0, 0, decimalYear(2025.0));
    expect(c.type).toBe('magnetic-declination');
    expect(c.source).toBe('WMM2025 at 2025-01-01');
    expectClose(c.degrees, 1.28, 0.01, 'degrees'); // NOAA WMM2025 test value
  });

  it('userDeclination(degrees) keeps the value typed and refuses one beyond ±180', () => {
    expect(userDeclination(-2.5)).toEqual({ type: 'user-declination', degrees: -2.5, source: 'declination given by the user' });
    expect(() => userDeclination(200)).toThrow(/-180 to 180/);
    expect(() => userDeclination(Number.NaN)).toThrow(DeclinationError);
  });

  it('correctAzimuth(azimuth, corrections) adds them: true = magnetic + declination (east positive), wrapped to [0, 360)', () => {
    // Sign convention: NOAA (east declination positive, true bearing = magnetic bearing + D), common practice.
    expectAzimuth(correctAzimuth(358, [userDeclination(3)]), 1, 1e-12);
    expectAzimuth(correctAzimuth(10, [userDeclination(-12)]), 358, 1e-12);
    expect(correctAzimuth(90, [])).toBe(90);
  });

  it('convergenceCorrection(lon, lat, crs) is +Δλ·sin φ east of the central meridian (grid north east of true north)', () => {
    // Derived: γ ≈ Δλ sin φ for small Δλ (see crs.test.ts); true = grid + γ.
    const c = convergenceCorrection(15.5, 45, builtInCrs(32633)!);
    expect(c.type).toBe('grid-convergence');
    expect(c.source).toBe('grid convergence of EPSG:32633');
    expectClose(c.degrees, 0.5 * Math.sin(Math.PI / 4), 1e-5, 'γ');
  });
});

describe('parseIsoDate(text)', () => {
  // ISO 8601 calendar dates (common practice for data exchange); anything else is refused.
  const good = [
    { text: '2025-06-01', iso: '2025-06-01T00:00:00.000Z' },
    { text: ' 2025-06-01 ', iso: '2025-06-01T00:00:00.000Z' },
    { text: '2025-06-01T10:30', iso: '2025-06-01T10:30:00.000Z' },
    { text: '2025-06-01 10:30:15', iso: '2025-06-01T10:30:15.000Z' },
    { text: '2025-06-01T10:30:00+02:00', iso: '2025-06-01T08:30:00.000Z' },
  ];
  for (const { text, iso } of good) {
    it(`parseIsoDate(${JSON.stringify(text)}) is ${iso}`, () => {
      expect(parseIsoDate(text)?.toISOString()).toBe(iso);
    });
  }
  for (const text of ['03/04/2025', '2025-02-30', '2025-13-01', '2025', '1 June 2025', '']) {
    it(`parseIsoDate(${JSON.stringify(text)}) is undefined: not an ISO date`, () => {
      expect(parseIsoDate(text)).toBeUndefined();
    });
  }
});
