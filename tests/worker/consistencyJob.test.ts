import { describe, expect, it } from 'vitest';
import { checkDomain } from '../../src/core/consistency/domainCheck';
import { localAxisField } from '../../src/core/consistency/localAxisField';
import { angleBetweenLines } from '../../src/core/geometry';
import { runConsistencyJob } from '../../src/worker/consistencyJob';
import { foldStations, positionsAndPoles } from '../core/consistency/synthetic';

/**
 * The worker's job runner gives the numbers of core/consistency itself. Synthetic data with a known
 * answer (tests/core/consistency/synthetic.ts): two cylindrical domains with axes 070/15 and
 * 095/20 (23.9° apart, derived) meeting at x = 0.
 */
const WEST = { trend: 70, plunge: 15 };
const EAST = { trend: 95, plunge: 20 };
const stations = foldStations({
  seed: 77,
  n: 700,
  hinges: 30,
  badLines: 2,
  box: [-3000, -2000, 3000, 2000],
  fold: (x) => (x < 0 ? { axis: WEST, swing: 50, wavelength: 1000, domain: 'west' } : { axis: EAST, swing: 50, wavelength: 1000, domain: 'east' }),
});
const { xy, poles } = positionsAndPoles(stations);

describe('runConsistencyJob', () => {
  it('runConsistencyJob(field job) gives localAxisField\u2019s own axes, and merges speckle below minShare so the two planted domains remain', () => {
    const job = { kind: 'field' as const, id: 7, xy, poles, nx: 30, ny: 20, k: 25, bounds: [-3000, -2000, 3000, 2000] as const, angle: 10, minShare: 0.05 };
    const r = runConsistencyJob(job);
    expect(r.id).toBe(7);
    const direct = localAxisField(xy, poles, { nx: 30, ny: 20, k: 25, bounds: [-3000, -2000, 3000, 2000] });
    expect(Array.from(r.field.trend)).toEqual(Array.from(direct.trend));
    expect(r.partition.regions.length).toBe(2);
    const axes = r.partition.regions.map((g) => g.axis);
    expect(axes.some((a) => angleBetweenLines(a, WEST) < 2)).toBe(true);
    expect(axes.some((a) => angleBetweenLines(a, EAST) < 2)).toBe(true);
    // Without merging, windows that straddle x = 0 leave small regions of mixed axes.
    const speckled = runConsistencyJob({ ...job, minShare: 0 });
    expect(speckled.partition.regions.length).toBeGreaterThan(2);
    expect(() => runConsistencyJob({ ...job, minShare: 1.5 })).toThrow(/smallest domain 1.5/);
  });

  it('runConsistencyJob(checks job) gives checkDomain\u2019s result for each domain', () => {
    const west = stations.filter((s) => s.domain === 'west');
    const input = {
      id: 'west',
      name: 'West',
      planes: west.filter((s) => s.plane).map((s) => ({ ...s.plane!, id: s.id, x: s.x, y: s.y })),
      lines: west.filter((s) => s.line).map((s) => ({ ...s.line!, id: s.id })),
    };
    const options = { bootstrap: 50, seed: 3, lineThreshold: 12 };
    const r = runConsistencyJob({ kind: 'checks', id: 2, domains: [input], options });
    expect(r.checks).toEqual([checkDomain(input, options)]);
    const planted = west.filter((s) => s.bad && s.line).map((s) => s.id);
    expect(r.checks[0].lines!.lines.filter((l) => l.flagged).map((l) => l.id)).toEqual(planted);
  });
});
