import { describe, expect, it } from 'vitest';
import { stationTooltipLines } from '../../src/map/stationTooltip';
import type { Station } from '../../src/core/station';

const base = { row: 3, source: {}, problems: [], lon: 1, lat: 2 };

describe('stationTooltipLines', () => {
  it('stationTooltipLines(station) gives the id as written, then kind and attitude (dip direction/dip, trend/plunge, three and two digits)', () => {
    const plane: Station = { ...base, id: '<b>KR-7</b>', kind: 'bedding', plane: { dipDirection: 5, dip: 7 } };
    const over: Station = { ...base, id: 'F1', kind: 'fault', plane: { dipDirection: 359.6, dip: 82, overturned: true } };
    const hinge: Station = { ...base, id: 'H1', kind: 'hinge', line: { trend: 74, plunge: 12, sense: 'antiform' } };
    const none: Station = { ...base, id: 'X', problems: [{ row: 3, column: 'dip', value: '', expected: 'a dip from 0 to 90' }] };
    expect(stationTooltipLines(plane)).toEqual(['<b>KR-7</b>', 'Bedding · 005/07 (dip direction/dip)']);
    // 359.6 rounds to 360, which is north again: 000 (common practice for azimuths).
    expect(stationTooltipLines(over)).toEqual(['F1', 'Fault plane · 000/82 overturned (dip direction/dip)']);
    expect(stationTooltipLines(hinge)).toEqual(['H1', 'Fold hinge · 074/12 antiform (trend/plunge)']);
    expect(stationTooltipLines(none)).toEqual(['X', 'Unknown kind · no usable attitude']);
  });
});
