import { describe, expect, it } from 'vitest';
import { area as turfArea, booleanPointInPolygon, destination, point } from '@turf/turf';
import { swathOutline } from '../../src/map/sectionSwath';

/**
 * The swath is every place within r of the section line (core/verticalSection.ts). Its area has
 * a closed form (derived: rectangles along the segments, half discs at the ends, a sector of
 * the turning angle φ on the outer side of a bend, less the overlap r²·tan(φ/2) on the inner
 * side): A = 2rL + πr² + r²(φ/2 − tan(φ/2)) per bend. The outline is a polygon of 16 steps per
 * half circle, whose round parts fall short of the circle by 1 − sin(π/16)·16/π ≈ 0.64%.
 * Areas are measured with turf's geodesic area (an outside library).
 */
const R = 500;
const START = point([14.985, 24.62]);

describe('swathOutline(line, halfWidth)', () => {
  it('swathOutline of a straight 2 km line, r = 500 m, has the area 2rL + πr² within 1% (turf area)', () => {
    const end = destination(START, 2, 120, { units: 'kilometers' });
    const outline = swathOutline([START.geometry.coordinates as [number, number], end.geometry.coordinates as [number, number]], R)!;
    expect(outline.geometry.type).toBe('Polygon');
    const expected = 2 * R * 2000 + Math.PI * R * R;
    expect(Math.abs(turfArea(outline) - expected) / expected).toBeLessThan(0.01);
  });

  it('swathOutline of a line bent through 90° is one polygon with the area 2rL + πr² + r²(π/4 − 1) within 1%', () => {
    const b = destination(START, 1.5, 90, { units: 'kilometers' });
    const c = destination(b, 1.5, 180, { units: 'kilometers' });
    const line = [START, b, c].map((p) => p.geometry.coordinates as [number, number]);
    const outline = swathOutline(line, R)!;
    expect(outline.geometry.type).toBe('Polygon');
    const expected = 2 * R * 3000 + Math.PI * R * R + R * R * (Math.PI / 4 - 1);
    expect(Math.abs(turfArea(outline) - expected) / expected).toBeLessThan(0.01);
  });

  it('swathOutline holds points 480 m off the line and not 520 m off it, beside the middle and past the end', () => {
    const end = destination(START, 2, 45, { units: 'kilometers' });
    const outline = swathOutline([START.geometry.coordinates as [number, number], end.geometry.coordinates as [number, number]], R)!;
    const middle = destination(START, 1, 45, { units: 'kilometers' });
    for (const bearing of [135, 315]) {
      expect(booleanPointInPolygon(destination(middle, 0.48, bearing, { units: 'kilometers' }), outline)).toBe(true);
      expect(booleanPointInPolygon(destination(middle, 0.52, bearing, { units: 'kilometers' }), outline)).toBe(false);
    }
    expect(booleanPointInPolygon(destination(end, 0.48, 45, { units: 'kilometers' }), outline)).toBe(true);
    expect(booleanPointInPolygon(destination(end, 0.52, 45, { units: 'kilometers' }), outline)).toBe(false);
  });

  it('swathOutline is null for one point, repeated points or a width that is not positive', () => {
    const p = START.geometry.coordinates as [number, number];
    expect(swathOutline([p], R)).toBeNull();
    expect(swathOutline([p, p], R)).toBeNull();
    expect(swathOutline([p, [p[0] + 0.01, p[1]]], 0)).toBeNull();
    expect(swathOutline([p, [p[0] + 0.01, p[1]]], Number.NaN)).toBeNull();
  });
});
