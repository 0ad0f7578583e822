import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { hingeMeanAxis } from '../../src/core/hingeMean';
import type { Station } from '../../src/core/station';
import type { Line } from '../../src/core/types';
import { angleBetweenLines } from '../../src/core/geometry';
import { pointInRing } from '../../src/core/polygon';
import { loadSampleStations } from '../../src/app/sampleStations';
import truth from '../../sample-maps/korvane/truth.json';
import { expectAzimuth, expectClose } from '../helpers/tolerance';

const hinge = (id: string, line: Line, kind: Station['kind'] = 'hinge'): Station => ({ id, row: 1, kind, lon: 15, lat: 24.6, line, source: {}, problems: [] });

/** Lines on a cone of half-angle `cone` about the axis trend/plunge, evenly spaced round it (vector arithmetic, north-east-down). */
function coneAbout(axis: Line, cone: number, count: number): Line[] {
  const r = Math.PI / 180;
  const a = [Math.cos(axis.plunge * r) * Math.cos(axis.trend * r), Math.cos(axis.plunge * r) * Math.sin(axis.trend * r), Math.sin(axis.plunge * r)];
  // Two unit vectors normal to the axis.
  const u = [-Math.sin(axis.trend * r), Math.cos(axis.trend * r), 0];
  const w = [a[1] * u[2] - a[2] * u[1], a[2] * u[0] - a[0] * u[2], a[0] * u[1] - a[1] * u[0]];
  return Array.from({ length: count }, (_, k) => {
    const phi = (2 * Math.PI * k) / count;
    let v = [0, 1, 2].map((i) => Math.cos(cone * r) * a[i] + Math.sin(cone * r) * (Math.cos(phi) * u[i] + Math.sin(phi) * w[i]));
    if (v[2] < 0) v = v.map((x) => -x); // lower hemisphere
    const trend = ((Math.atan2(v[1], v[0]) / r) % 360 + 360) % 360;
    return { trend, plunge: Math.asin(Math.min(1, v[2])) / r };
  });
}

describe('hingeMeanAxis(stations, indices)', () => {
  it('hingeMeanAxis of hinges evenly spread on a 10° cone about 075/12 is 075/12 (synthetic: by symmetry the resultant lies on the axis)', () => {
    const stations = coneAbout({ trend: 75, plunge: 12 }, 10, 8).map((l, i) => hinge(`H${i}`, l));
    const m = hingeMeanAxis(stations);
    expect(m.n).toBe(8);
    expectAzimuth(m.axis!.trend, 75, 1e-9, 'trend');
    expectClose(m.axis!.plunge, 12, 1e-9, 'plunge');
    expect(m.reason).toBeNull();
  });

  it('hingeMeanAxis treats hinges as lines without sense: 090/00 and 270/00 are one hinge (Fisher 1953 statistics of axes, fisher.ts)', () => {
    const m = hingeMeanAxis([hinge('a', { trend: 88, plunge: 0 }), hinge('b', { trend: 272, plunge: 0 }), hinge('c', { trend: 90, plunge: 2 })]);
    expect(angleBetweenLines(m.axis!, { trend: 90, plunge: 0.67 })).toBeLessThan(0.05);
  });

  it('hingeMeanAxis takes only usable hinges at the given indices: lineations, intersections, bad rows and unselected hinges are left out', () => {
    const stations: Station[] = [
      hinge('in', { trend: 80, plunge: 10 }),
      hinge('lin', { trend: 200, plunge: 60 }, 'lineation'),
      hinge('int', { trend: 10, plunge: 40 }, 'intersection'),
      { ...hinge('bad', { trend: 300, plunge: 70 }), problems: [{ row: 4, column: 'plunge', value: '95', expected: 'a plunge from 0 to 90' }] },
      hinge('out', { trend: 170, plunge: 50 }),
    ];
    const m = hingeMeanAxis(stations, [0, 1, 2, 3]);
    expect(m.n).toBe(1);
    expect(m.axis).toEqual({ trend: 80, plunge: expect.closeTo(10, 9) as unknown as number });
    expect(m.alpha95).toBeNull(); // one line has no cone
  });

  it('hingeMeanAxis with no hinge gives no axis and says why', () => {
    const m = hingeMeanAxis([hinge('lin', { trend: 200, plunge: 60 }, 'lineation')], [0]);
    expect(m.axis).toBeNull();
    expect(m.n).toBe(0);
    expect(m.reason).toBe('no measured hinge in the selection');
  });

  it('hingeMeanAxis is the direction of the summed unit vectors once each is turned to the same side (Fisher 1953 mean, checked by plain arithmetic; property)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.record({ trend: fc.double({ min: 60, max: 100, noNaN: true }), plunge: fc.double({ min: 5, max: 40, noNaN: true }) }), { minLength: 2, maxLength: 30 }),
        (lines) => {
          const r = Math.PI / 180;
          let s = [0, 0, 0];
          for (const l of lines) {
            s = [s[0] + Math.cos(l.plunge * r) * Math.cos(l.trend * r), s[1] + Math.cos(l.plunge * r) * Math.sin(l.trend * r), s[2] + Math.sin(l.plunge * r)];
          }
          const expected = { trend: ((Math.atan2(s[1], s[0]) / r) + 360) % 360, plunge: Math.asin(s[2] / Math.hypot(...s)) / r };
          const m = hingeMeanAxis(lines.map((l, i) => hinge(`H${i}`, l)));
          expect(angleBetweenLines(m.axis!, expected)).toBeLessThan(1e-6);
        },
      ),
    );
  });

  it('hingeMeanAxis of the west domain\'s hinges on the SYNTHETIC sample map lies within 3° of the planted axis 075/12 (truth.json; hinges scattered 3° in trend, 2° in plunge)', () => {
    const stations = loadSampleStations();
    const west = truth.domains.find((d) => d.id === 'west')!;
    const ring = west.polygon.flat();
    const inside = stations.flatMap((s, i) => (s.lon !== undefined && s.lat !== undefined && pointInRing(s.lon, s.lat, ring) ? [i] : []));
    const m = hingeMeanAxis(stations, inside);
    expect(m.n).toBeGreaterThanOrEqual(10);
    expect(angleBetweenLines(m.axis!, west.axis)).toBeLessThan(3);
  });
});
