import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { levelsText, netDisplayRows, netFields, NO_ANALYSIS, type NetDisplayRow, type NetField } from '../../src/components/net/netNumbers';
import { numbersToCsv, numbersToJson } from '../../src/components/net/exportNumbers';
import { analyzeFold, analyzeFoldPoles } from '../../src/core/foldAnalysis';
import { describeFold } from '../../src/core/foldDescription';
import { kambGrid } from '../../src/core/kamb';
import type { Line, PlaneMeasurement } from '../../src/core/types';
import { expectAzimuth, expectClose } from '../helpers/tolerance';

const BAD = /NaN|Infinity|undefined/;
const row = (rows: NetDisplayRow[], key: string) => rows.find((r) => r.key === key) as NetDisplayRow;
const field = (fields: NetField[], key: string) => fields.find((f) => f.key === key) as NetField;

function expectClean(rows: NetDisplayRow[], fields: NetField[]): void {
  for (const r of rows) {
    expect(`${r.label} ${r.text} ${r.reason ?? ''}`).not.toMatch(BAD);
    if (r.text === '—') expect(r.reason, `row ${r.key} is a dash without a reason`).toBeTruthy();
  }
  for (const f of fields) {
    if (typeof f.value === 'number') expect(Number.isFinite(f.value), `field ${f.key}`).toBe(true);
    if (typeof f.value === 'string') expect(f.value).not.toMatch(BAD);
    if (f.value === null) expect(f.note, `field ${f.key} is null without a note`).toBeTruthy();
  }
}

describe('netDisplayRows and netFields', () => {
  it('netDisplayRows({analysis}) for limbs 120/40 and 240/40 shows the axis 180/23 and why there is no cone', () => {
    // REFERENCES.md (derived): limbs 120/40 and 240/40 intersect in 180/22.760.
    const analysis = analyzeFold({ planes: [{ dipDirection: 120, dip: 40 }, { dipDirection: 240, dip: 40 }] });
    const rows = netDisplayRows({ analysis });
    expect(row(rows, 'axis').text).toBe('180/23');
    expect(row(rows, 'beta').text).toBe('180/23');
    expect(row(rows, 'cone95')).toMatchObject({ text: '—', reason: 'needs 3 or more planes' });
    const fields = netFields({ analysis });
    expectAzimuth(field(fields, 'axis_trend').value as number, 180, 1e-6, 'axis trend');
    expectClose(field(fields, 'axis_plunge').value as number, 22.76, 1e-3, 'axis plunge');
    expect(field(fields, 'cone95')).toMatchObject({ value: null, note: 'needs 3 or more planes' });
    // Two poles span one great circle: S3 = 0, so C is unbounded (and K its limit 0).
    expect(field(fields, 'woodcock_c').note).toMatch(/unbounded/);
    expectClean(rows, fields);
  });

  it('netDisplayRows({analysis}) prints eigenvalues to 3 decimals and the shape indices of eigenvalues 0.6, 0.3, 0.1', () => {
    // 6 poles north, 3 east, 1 down: T = diag(0.6, 0.3, 0.1).
    const poles = new Float64Array([...Array(6).fill([1, 0, 0]), ...Array(3).fill([0, 1, 0]), [0, 0, 1]].flat());
    const analysis = analyzeFoldPoles(poles, { bootstrap: 0 });
    const rows = netDisplayRows({ analysis });
    expect(row(rows, 'eigenvalues').text).toBe('0.600 · 0.300 · 0.100');
    // REFERENCES.md (derived from Woodcock 1977 and Vollmer 1990): K = 0.630930, C = 1.791759, P = 0.3, G = 0.4, R = 0.3.
    expect(row(rows, 'woodcock').text).toBe('0.63, 1.79');
    expect(row(rows, 'vollmer').text).toBe('0.30, 0.40, 0.30');
    const fields = netFields({ analysis });
    expectClose(field(fields, 'woodcock_k').value as number, 0.63093, 1e-6, 'K');
    expectClose(field(fields, 'woodcock_c').value as number, 1.791759, 1e-6, 'C');
    expect(row(rows, 'cone95').reason).toBe('not computed yet');
  });

  it('netDisplayRows({analysis}) gives the Fisher mean and alpha95 of measured lines', () => {
    // REFERENCES.md (derived from Fisher 1953): lines 010/40, 020/45, 015/50, 005/42, 025/48 ->
    // mean 014.71/45.22, alpha95 6.585°.
    const lines: Line[] = [[10, 40], [20, 45], [15, 50], [5, 42], [25, 48]].map(([trend, plunge]) => ({ trend, plunge }));
    const planes: PlaneMeasurement[] = [{ dipDirection: 90, dip: 30 }, { dipDirection: 270, dip: 30 }, { dipDirection: 180, dip: 10 }];
    const analysis = analyzeFold({ planes, lines }, { bootstrap: 50 });
    const rows = netDisplayRows({ analysis });
    expect(row(rows, 'lines').text).toBe('5');
    expect(row(rows, 'linesMean').text).toBe('015/45, α95 6.6°');
    const fields = netFields({ analysis });
    expectClose(field(fields, 'lines_mean_trend').value as number, 14.71, 0.01, 'mean trend');
    expectClose(field(fields, 'lines_mean_plunge').value as number, 45.22, 0.01, 'mean plunge');
    expectClose(field(fields, 'lines_alpha95').value as number, 6.585, 0.001, 'alpha95');
    expect(typeof field(fields, 'lines_angle_to_axis').value).toBe('number');
  });

  it('netDisplayRows({analysis, description}) shows the interlimb angle and Fleuty classes of a fold with limbs dipping 40° each way', () => {
    // Limbs dipping 40° either way: the facing normals are 80° apart, so the interlimb angle is
    // 180 - 80 = 100° (derived), "open" in Fleuty (1964) classes as pinned in foldDescription.ts.
    const planes: PlaneMeasurement[] = [{ dipDirection: 90, dip: 40 }, { dipDirection: 270, dip: 40 }, { dipDirection: 90, dip: 40 }, { dipDirection: 270, dip: 40 }];
    const analysis = analyzeFold({ planes }, { bootstrap: 0 });
    const description = describeFold(planes);
    const rows = netDisplayRows({ analysis, description });
    expect(row(rows, 'interlimb').text).toBe('100° (open)');
    expect(row(rows, 'fleuty').text).toBe('horizontal, upright, open');
    expect(row(rows, 'axialPlane').text).toMatch(/^(090|270)\/90$/);
    expect(row(rows, 'limbs').text).toMatch(/^(090\/40 · 270\/40|270\/40 · 090\/40)$/);
  });

  it('netDisplayRows({analysis, description}) of parallel planes gives dashes with reasons and no NaN', () => {
    const planes = Array.from({ length: 5 }, () => ({ dipDirection: 75, dip: 35 }));
    const analysis = analyzeFold({ planes });
    const description = describeFold(planes);
    const rows = netDisplayRows({ analysis, description });
    const fields = netFields({ analysis, description });
    expect(row(rows, 'axis')).toMatchObject({ text: '—', reason: 'all planes parallel' });
    expect(row(rows, 'girdle').reason).toBe('all planes parallel');
    expect(row(rows, 'woodcock')).toMatchObject({ text: '—', reason: 'not defined: all poles parallel' });
    expect(row(rows, 'interlimb').reason).toBe('fold not described, see messages');
    expectClean(rows, fields);
  });

  it('netDisplayRows({analysis: null}) shows every value as a dash saying no planes are selected', () => {
    const rows = netDisplayRows({ analysis: null });
    for (const r of rows.filter((r) => !['lines', 'linesMean', 'linesToAxis', 'density'].includes(r.key))) {
      expect(r, r.key).toMatchObject({ text: '—', reason: NO_ANALYSIS });
    }
    expect(row(rows, 'lines').text).toBe('0');
    expectClean(rows, netFields({ analysis: null }));
  });

  it('netDisplayRows({analysis, density}) names the density method and its levels', () => {
    const poles = new Float64Array([0.6, 0.8, 0, 0.6, 0.8, 0, 0, 0.6, 0.8, 0, 0.8, 0.6]);
    const density = kambGrid(poles, { resolution: 21 });
    const rows = netDisplayRows({ analysis: analyzeFoldPoles(poles, { bootstrap: 0 }), density });
    expect(row(rows, 'density').text).toMatch(/^Kamb counting, [\d.]+(, [\d.]+)*σ; counting cone [\d.]+°$/);
    expect(field(netFields({ analysis: null, density }), 'density_method').value).toBe('kamb');
  });

  it('netDisplayRows and netFields never print NaN, Infinity or undefined for any set of planes and lines', () => {
    const plane = fc.record({ dipDirection: fc.constantFrom(0, 45, 90, 180, 359.9, 120), dip: fc.constantFrom(0, 1, 30, 45, 89.9, 90) });
    const line = fc.record({ trend: fc.constantFrom(0, 90, 200), plunge: fc.constantFrom(0, 45, 90) });
    fc.assert(
      fc.property(fc.array(plane, { maxLength: 7 }), fc.option(fc.array(line, { maxLength: 4 }), { nil: undefined }), (planes, lines) => {
        const analysis = analyzeFold({ planes, lines }, { bootstrap: 20 });
        const description = planes.length >= 2 ? describeFold(planes) : null;
        expectClean(netDisplayRows({ analysis, description }), netFields({ analysis, description }));
      }),
      { numRuns: 150 },
    );
  });

  it('netDisplayRows and netFields show the girdle fit, and numbersToCsv / numbersToJson carry it with the poor-girdle-fit warning for two pooled folds', () => {
    // Two girdles whose axes (000/00 and 030/00) are 30° apart, poles every 10° around each:
    // T = I/2 - (aaᵀ + bbᵀ)/4 has least eigenvalue sin²(15°)/2 (derived), so the misfit is
    // asin(sin 15°/√2) = 10.54°, above the 6° limit.
    const girdle = (trend: number): PlaneMeasurement[] => Array.from({ length: 18 }, (_, k) => ({ dipDirection: trend + 90 + (k < 9 ? 0 : 180), dip: (k % 9) * 10 + 5 }));
    const planes = [...girdle(0), ...girdle(30)];
    const analysis = analyzeFold({ planes }, { bootstrap: 0 });
    const misfit = Math.asin(Math.sin((15 * Math.PI) / 180) / Math.SQRT2) * (180 / Math.PI);
    expectClose(analysis.cylindricity!.misfit, misfit, 1e-6, 'misfit');
    const rows = netDisplayRows({ analysis });
    expect(row(rows, 'girdleFit').text).toBe(`${misfit.toFixed(1)}° RMS, cylindricity ${analysis.cylindricity!.cylindricity.toFixed(3)}`);
    const fields = netFields({ analysis });
    expectClose(field(fields, 'girdle_misfit').value as number, misfit, 1e-6, 'girdle_misfit');
    expect(field(fields, 'cylindricity').value).toBeCloseTo(analysis.cylindricity!.cylindricity, 12);
    const meta = { selection: 'Two pooled folds', net: 'equal-area' as const, date: '2025-01-01', method: analysis.method };
    const csv = numbersToCsv(fields, analysis.warnings, meta);
    expect(csv).toMatch(/\r\ngirdle_misfit,RMS distance of the poles from the girdle,10\.5\d*,deg,\r\n/);
    expect(csv).toMatch(/warning_\d+,Warning \(poor-girdle-fit\),"?The poles scatter 10\.5° \(root mean square\)/);
    const json = JSON.parse(numbersToJson(fields, analysis.warnings, meta));
    expectClose(json.fields.girdle_misfit.value, misfit, 1e-6, 'JSON girdle_misfit');
    expect(json.warnings.map((w: { code: string }) => w.code)).toContain('poor-girdle-fit');
  });

  it('netFields({analysis, description}) exports the interlimb angle from limb maxima and, for comparison, from limb means', () => {
    // Limbs of 6 planes each at exactly 40° either way plus one 30° reading each (a rounded hinge):
    // the modes stay at 40° (interlimb 100°, derived), the means move inward.
    const planes: PlaneMeasurement[] = [...Array(6).fill({ dipDirection: 90, dip: 40 }), ...Array(6).fill({ dipDirection: 270, dip: 40 }), { dipDirection: 90, dip: 30 }, { dipDirection: 270, dip: 30 }];
    const description = describeFold(planes);
    const fields = netFields({ analysis: analyzeFold({ planes }, { bootstrap: 0 }), description });
    expectClose(field(fields, 'interlimb_angle').value as number, 100, 0.5, 'interlimb angle from modes');
    expect(field(fields, 'interlimb_angle_limb_means').value as number).toBeGreaterThan(101);
    expect(field(fields, 'limb1_estimate').value).toBe('mode');
    expect(field(fields, 'limb_mode_bandwidth').value).toBe(4);
    expect(field(fields, 'axial_plane_dip').label).toBe('Axial plane (limb bisector) dip');
  });

  const levelRows = [
    { input: [2, 4, 6], expected: '2, 4, 6σ' },
    { input: [2, 4, 6, 8, 10, 12, 14], expected: '2, 4 … 14σ' },
    { input: [], expected: 'none' },
    { input: [0.5, 1.25], expected: '0.5, 1.25σ' },
  ];
  for (const r of levelRows) {
    it(`levelsText(${JSON.stringify(r.input)}) is '${r.expected}'`, () => {
      expect(levelsText(r.input)).toBe(r.expected);
    });
  }
});
