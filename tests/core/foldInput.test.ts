import { describe, expect, it } from 'vitest';
import { foldInputFromStations } from '../../src/core/foldInput';
import type { Station } from '../../src/core/station';

const st = (id: string, kind: Station['kind'], att: Partial<Station>, problems: Station['problems'] = []): Station => ({ id, row: 1, kind, source: {}, problems, ...att });

describe('foldInputFromStations', () => {
  const stations: Station[] = [
    st('b1', 'bedding', { plane: { dipDirection: 120, dip: 40 } }),
    st('c1', 'cleavage', { plane: { dipDirection: 350, dip: 80 } }),
    st('h1', 'hinge', { line: { trend: 75, plunge: 12, sense: 'antiform' } }),
    st('s1', 'slickenline', { line: { trend: 200, plunge: 30 } }),
    st('bad', 'bedding', {}, [{ row: 5, column: 'dip', value: '95', expected: 'a dip from 0 to 90' }]),
    st('b2', 'bedding', { plane: { dipDirection: 240, dip: 40 } }),
  ];

  it('foldInputFromStations(stations) takes bedding as the folded surface and hinges as axis lines, leaving out cleavage, slickenlines and unusable rows (common practice)', () => {
    const input = foldInputFromStations(stations);
    expect(Array.from(input.planeIds)).toEqual([0, 5]);
    expect(input.planes).toEqual([{ dipDirection: 120, dip: 40 }, { dipDirection: 240, dip: 40 }]);
    expect(Array.from(input.lineIds)).toEqual([2]);
    expect(input.lines).toEqual([{ trend: 75, plunge: 12, id: 2 }]);
  });

  it('foldInputFromStations(stations, indices, kinds) honours the subset and the chosen kinds', () => {
    const input = foldInputFromStations(stations, [1, 3, 5], { planeKinds: ['cleavage', 'bedding'], lineKinds: ['slickenline'] });
    expect(Array.from(input.planeIds)).toEqual([1, 5]);
    expect(Array.from(input.lineIds)).toEqual([3]);
  });
});
