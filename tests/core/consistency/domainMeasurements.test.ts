import { describe, expect, it } from 'vitest';
import { axisFieldInputs, domainMeasurements } from '../../../src/core/consistency/domainMeasurements';
import type { Station } from '../../../src/core/station';

const station = (over: Partial<Station> & Pick<Station, 'id'>): Station => ({ row: 1, source: {}, problems: [], lon: 15, lat: 46, ...over });

const stations: Station[] = [
  station({ id: 'B1', kind: 'bedding', plane: { dipDirection: 90, dip: 30 } }),
  station({ id: 'C1', kind: 'cleavage', plane: { dipDirection: 180, dip: 80 } }),
  station({ id: 'H1', kind: 'hinge', line: { trend: 45, plunge: 10, sense: 'antiform' } }),
  station({ id: 'S1', kind: 'slickenline', line: { trend: 300, plunge: 5 } }),
  station({ id: 'B2', kind: 'bedding', plane: { dipDirection: 270, dip: 60 }, lon: undefined, lat: undefined }),
];
const place = (s: Station) => (s.lon !== undefined ? { x: s.lon * 1000, y: s.lat! * 1000 } : undefined);

describe('domainMeasurements', () => {
  it('domainMeasurements(stations, place) keeps bedding and hinges with their ids, places and fold sense, and leaves out cleavage and slickenlines', () => {
    const { planes, lines } = domainMeasurements(stations, place);
    expect(planes.map((p) => p.id)).toEqual(['B1', 'B2']);
    expect(planes[0]).toMatchObject({ dipDirection: 90, dip: 30, x: 15000, y: 46000 });
    // A station without a place keeps its reading but has none.
    expect(planes[1]).not.toHaveProperty('x');
    expect(lines).toEqual([{ trend: 45, plunge: 10, id: 'H1', sense: 'antiform', x: 15000, y: 46000 }]);
  });

  it('domainMeasurements(stations, place, kinds) takes the kinds asked for', () => {
    const { planes, lines } = domainMeasurements(stations, place, { planeKinds: ['cleavage'], lineKinds: ['slickenline'] });
    expect(planes.map((p) => p.id)).toEqual(['C1']);
    expect(lines.map((l) => l.id)).toEqual(['S1']);
  });
});

describe('axisFieldInputs', () => {
  it('axisFieldInputs(stations, place) gives each bedding plane its place and its lower-hemisphere pole as a north-east-down unit vector', () => {
    const located = stations.filter((s) => s.lon !== undefined);
    const { xy, poles, count } = axisFieldInputs(located, (s) => ({ x: s.lon! * 1000, y: s.lat! * 1000 }));
    expect(count).toBe(1);
    expect(Array.from(xy)).toEqual([15000, 46000]);
    // The pole of a plane dipping 30° toward 090 trends 270 and plunges 60° (common practice:
    // the pole lies opposite the dip direction, at 90° minus the dip), so north 0, east -cos 60°, down sin 60°.
    expect(poles[0]).toBeCloseTo(0, 12);
    expect(poles[1]).toBeCloseTo(-Math.cos(Math.PI / 3), 12);
    expect(poles[2]).toBeCloseTo(Math.sin(Math.PI / 3), 12);
  });
});
