import { describe, expect, it } from 'vitest';
import { resolveAxisChoice, type AxisChoiceInput } from '../../src/components/profile/axisChoice';

const base: AxisChoiceInput = {
  source: 'selection',
  selection: { axis: { trend: 75, plunge: 12 }, n: 80, cone95: 2.14 },
  domains: [
    { id: 'd1', name: 'West', axis: { trend: 76, plunge: 13 }, cone95: 3 },
    { id: 'd2', name: 'Flat', axis: null, cone95: null },
  ],
  domainId: 'd1',
  hinges: { axis: { trend: 77, plunge: 11 }, n: 14, alpha95: 4.25, kappa: 90, reason: null },
  trendText: '100',
  plungeText: '18',
};

describe('resolveAxisChoice(input)', () => {
  it("resolveAxisChoice with source 'selection' gives the selection's π axis and says where it comes from", () => {
    const c = resolveAxisChoice(base);
    expect(c.axis).toEqual({ trend: 75, plunge: 12 });
    expect(c.from).toBe('π axis of the selection (n 80, cone ±2.1°)');
    expect(c.problem).toBeNull();
  });

  it("resolveAxisChoice with source 'domain' gives the chosen domain's axis, and names a domain without one", () => {
    expect(resolveAxisChoice({ ...base, source: 'domain' })).toMatchObject({ axis: { trend: 76, plunge: 13 }, from: 'π axis of domain “West” (cone ±3.0°)' });
    expect(resolveAxisChoice({ ...base, source: 'domain', domainId: 'd2' })).toMatchObject({ axis: null, problem: 'Domain “Flat” has no defined fold axis.' });
    expect(resolveAxisChoice({ ...base, source: 'domain', domainId: '' }).problem).toBe('Choose a domain.');
    expect(resolveAxisChoice({ ...base, source: 'domain', domains: [] }).problem).toBe('No domain is saved yet: save a selection as a domain first.');
  });

  it("resolveAxisChoice with source 'hinges' gives the hinge mean with n and α95, or the reason there is none", () => {
    expect(resolveAxisChoice({ ...base, source: 'hinges' })).toMatchObject({ axis: { trend: 77, plunge: 11 }, from: 'Fisher mean of 14 measured hinges in the selection, α95 4.3°' });
    const none = resolveAxisChoice({ ...base, source: 'hinges', hinges: { axis: null, n: 0, alpha95: null, kappa: null, reason: 'no measured hinge in the selection' } });
    expect(none.axis).toBeNull();
    expect(none.problem).toBe('No hinge mean: no measured hinge in the selection.');
    expect(resolveAxisChoice({ ...base, source: 'hinges', hinges: null }).problem).toContain('Nothing is selected');
  });

  it("resolveAxisChoice with source 'typed' reads the two fields, and gives each wrong field's message", () => {
    expect(resolveAxisChoice({ ...base, source: 'typed' })).toMatchObject({ axis: { trend: 100, plunge: 18 }, from: 'typed by the user', fieldProblems: [] });
    const bad = resolveAxisChoice({ ...base, source: 'typed', trendText: '361', plungeText: 'x' });
    expect(bad.axis).toBeNull();
    expect(bad.fieldProblems.map((p) => p.field)).toEqual(['Trend', 'Plunge']);
    expect(bad.problem).toBe('Trend: "361" is out of range; expected an azimuth from 0 to 360°, clockwise from north. Plunge: "x" is not a number; expected a plunge from 0 (horizontal) to 90° (vertical).');
  });

  it('resolveAxisChoice says why the selection gives no axis: nothing selected, analysis running, axis undefined', () => {
    expect(resolveAxisChoice({ ...base, selection: null }).problem).toContain('Nothing is selected');
    expect(resolveAxisChoice({ ...base, selection: { axis: { trend: 1, plunge: 1 }, n: 3, cone95: null, pending: true } })).toMatchObject({ axis: null, problem: 'The analysis of the selection is still running.' });
    expect(resolveAxisChoice({ ...base, selection: { axis: null, n: 2, cone95: null } }).problem).toContain('no defined fold axis');
  });
});
