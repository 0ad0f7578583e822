import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { readTypedAxis } from '../../src/core/typedAxis';
import { formatLine, parseLine } from '../../src/core/notation';

describe('readTypedAxis(trendText, plungeText)', () => {
  it("readTypedAxis('075', '12') is the axis 075/12", () => {
    expect(readTypedAxis('075', '12')).toEqual({ axis: { trend: 75, plunge: 12 }, problems: [] });
  });

  it("readTypedAxis('360', '0') is north, horizontal: a trend of 360 is 0 (azimuths run 0 to 360, common practice)", () => {
    expect(readTypedAxis('360', '0').axis).toEqual({ trend: 0, plunge: 0 });
  });

  it("readTypedAxis('0', '90') is the vertical axis", () => {
    expect(readTypedAxis('0', '90').axis).toEqual({ trend: 0, plunge: 90 });
  });

  const bad: { trend: string; plunge: string; fields: string[]; says: string[] }[] = [
    { trend: '', plunge: '12', fields: ['Trend'], says: ['Trend: empty; expected an azimuth from 0 to 360°, clockwise from north.'] },
    { trend: '75', plunge: '', fields: ['Plunge'], says: ['Plunge: empty; expected a plunge from 0 (horizontal) to 90° (vertical).'] },
    { trend: '400', plunge: '12', fields: ['Trend'], says: ['Trend: "400" is out of range; expected an azimuth from 0 to 360°'] },
    { trend: '-10', plunge: '12', fields: ['Trend'], says: ['Trend: "-10" is out of range'] },
    { trend: '75', plunge: '95', fields: ['Plunge'], says: ['Plunge: "95" is out of range; expected a plunge from 0 (horizontal) to 90° (vertical).'] },
    { trend: '75', plunge: '-12', fields: ['Plunge'], says: ['Plunge: "-12" is out of range'] },
    { trend: 'NE', plunge: 'steep', fields: ['Trend', 'Plunge'], says: ['Trend: "NE" is not a number', 'Plunge: "steep" is not a number'] },
    { trend: '075/12', plunge: '', fields: ['Trend', 'Plunge'], says: ['Trend: "075/12" is not a number', 'Plunge: empty'] },
  ];
  for (const row of bad) {
    it(`readTypedAxis(${JSON.stringify(row.trend)}, ${JSON.stringify(row.plunge)}) gives no axis and names ${row.fields.join(' and ')}`, () => {
      const r = readTypedAxis(row.trend, row.plunge);
      expect(r.axis).toBeNull();
      expect(r.problems.map((p) => p.field)).toEqual(row.fields);
      row.says.forEach((text, i) => expect(r.problems[i].message).toContain(text));
    });
  }

  it('readTypedAxis agrees with the notation parser parseLine on "trend/plunge" text for every whole-degree axis (property)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 359 }), fc.integer({ min: 0, max: 90 }), (trend, plunge) => {
        const text = formatLine({ trend, plunge }, 'azimuth');
        const [t, p] = text.split('/');
        expect(readTypedAxis(t, p).axis).toEqual(parseLine(text));
      }),
    );
  });
});
