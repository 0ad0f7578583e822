import { describe, expect, it } from 'vitest';
import { centroid, polygon } from '@turf/turf';
import { compareDomains, newDomainId, nextDomainName, ringCentroid } from '../../src/core/domain';
import type { FoldAnalysis } from '../../src/core/foldAnalysis';
import { expectClose } from '../helpers/tolerance';

const withAxis = (trend: number, plunge: number, cone95: number | null) => ({ axis: { trend, plunge }, cone95 }) as unknown as FoldAnalysis;

describe('compareDomains', () => {
  it('compareDomains gives the angle between axes 075/12 and 100/18 and says the cones do not overlap', () => {
    // Angle derived from direction cosines: cos θ = cos12 cos18 cos25 + sin12 sin18 = 0.9071 -> 24.9° (derived).
    const c = compareDomains({ name: 'West', analysis: withAxis(75, 12, 1) }, { name: 'East', analysis: withAxis(100, 18, 1.5) });
    expectClose(c.angle!, 24.9, 0.05);
    expect(c.conesOverlap).toBe(false);
    expect(c.text).toMatch(/differ/);
  });

  it('compareDomains reports overlapping cones when the angle is within the sum of half-angles', () => {
    const c = compareDomains({ name: 'A', analysis: withAxis(75, 12, 3) }, { name: 'B', analysis: withAxis(79, 12, 2) });
    expect(c.angle!).toBeLessThan(5);
    expect(c.conesOverlap).toBe(true);
  });

  it('compareDomains says which domain has no axis and never returns NaN', () => {
    const c = compareDomains({ name: 'A', analysis: null }, { name: 'B', analysis: withAxis(1, 2, 3) });
    expect(c.angle).toBeNull();
    expect(c.text).toContain('A has no defined fold axis');
  });
});

describe('domain names and ids', () => {
  it('nextDomainName skips names in use', () => {
    expect(nextDomainName([{ name: 'Domain 1' }, { name: 'Domain 3' }])).toBe('Domain 2');
  });
  it('newDomainId is stable for a given time and random source', () => {
    expect(newDomainId(1_700_000_000_000, () => 0.5)).toBe(newDomainId(1_700_000_000_000, () => 0.5));
  });
});

describe('ringCentroid', () => {
  it('ringCentroid agrees with turf centroid of a convex quadrilateral (external reference: @turf/turf, planar for small areas)', () => {
    const ring: Array<[number, number]> = [[14.97, 24.603], [15.0015, 24.603], [14.9975, 24.639], [14.97, 24.639]];
    // turf.centroid is the vertex mean, which for this near-rectangle lies within 0.002° of the area centroid.
    const c = ringCentroid(ring);
    const t = centroid(polygon([[...ring, ring[0]]])).geometry.coordinates;
    expect(Math.abs(c[0] - t[0])).toBeLessThan(0.002);
    expect(Math.abs(c[1] - t[1])).toBeLessThan(0.002);
  });
  it('ringCentroid of a unit square is its centre (analytic)', () => {
    expect(ringCentroid([[0, 0], [1, 0], [1, 1], [0, 1]])).toEqual([0.5, 0.5]);
  });
});
