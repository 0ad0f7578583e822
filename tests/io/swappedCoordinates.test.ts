import { describe, expect, it } from 'vitest';
import { flagSwappedCoordinates } from '../../src/io/swappedCoordinates';
import type { Station } from '../../src/core/station';

const at = (id: string, lon: number, lat: number): Station => ({ id, row: Number(id.slice(1)), kind: 'bedding', lon, lat, plane: { dipDirection: 90, dip: 30 }, source: { longitude: String(lon), latitude: String(lat) }, problems: [] });

describe('flagSwappedCoordinates', () => {
  const cluster = Array.from({ length: 20 }, (_, i) => at(`s${i + 1}`, 14.97 + (i % 5) * 0.01, 24.60 + Math.floor(i / 5) * 0.01));

  it('flagSwappedCoordinates flags a station whose lon/lat trade places, naming the row, column and the swapped position', () => {
    const out = flagSwappedCoordinates([...cluster, at('s21', 24.615, 14.99)]);
    const flagged = out.filter((s) => s.problems.length > 0);
    expect(flagged.map((s) => s.id)).toEqual(['s21']);
    expect(flagged[0].problems[0]).toMatchObject({ row: 21, column: 'longitude' });
    expect(flagged[0].problems[0].expected).toMatch(/swapped/);
    expect(flagged[0].plane).toBeUndefined();
    expect(flagged[0].source).toEqual({ longitude: '24.615', latitude: '14.99' });
  });

  it('flagSwappedCoordinates leaves a far station alone when swapping does not bring it near the others', () => {
    const out = flagSwappedCoordinates([...cluster, at('s21', 30, 40)]);
    expect(out.every((s) => s.problems.length === 0)).toBe(true);
  });

  it('flagSwappedCoordinates changes nothing in a clean data set', () => {
    expect(flagSwappedCoordinates(cluster)).toEqual(cluster);
  });
});
