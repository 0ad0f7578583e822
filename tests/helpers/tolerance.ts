import { expect } from 'vitest';
import { azimuthDifference } from '../../src/core/math';

/** Asserts |actual - expected| <= tol with a message that names what was compared. */
export function expectClose(actual: number, expected: number, tol: number, what = 'value'): void {
  if (!Number.isFinite(actual) || Math.abs(actual - expected) > tol) {
    expect.fail(`${what}: expected ${expected} ± ${tol}, got ${actual}`);
  }
}

/** Asserts two azimuths agree modulo 360 within tol degrees. */
export function expectAzimuth(actual: number, expected: number, tol: number, what = 'azimuth'): void {
  if (!Number.isFinite(actual) || azimuthDifference(actual, expected) > tol) {
    expect.fail(`${what}: expected ${expected}° ± ${tol}° (mod 360), got ${actual}°`);
  }
}

/**
 * Compares nested numbers (objects and arrays) within tol; keys named like azimuths
 * (trend, dipDirection, strike, azimuth) compare modulo 360.
 */
export function expectDeepClose(actual: unknown, expected: unknown, tol: number, path = 'value'): void {
  if (typeof expected === 'number') {
    if (typeof actual !== 'number') expect.fail(`${path}: expected a number, got ${String(actual)}`);
    const key = path.split('.').pop() ?? '';
    if (/^(trend|dipDirection|strike|azimuth)$/.test(key)) expectAzimuth(actual as number, expected, tol, path);
    else expectClose(actual as number, expected, tol, path);
    return;
  }
  if (Array.isArray(expected)) {
    if (!Array.isArray(actual) || actual.length !== expected.length) expect.fail(`${path}: expected array of ${expected.length}`);
    expected.forEach((e, i) => expectDeepClose((actual as unknown[])[i], e, tol, `${path}[${i}]`));
    return;
  }
  if (expected && typeof expected === 'object') {
    for (const [k, e] of Object.entries(expected)) expectDeepClose((actual as Record<string, unknown>)?.[k], e, tol, `${path}.${k}`);
    return;
  }
  expect(actual).toEqual(expected);
}
