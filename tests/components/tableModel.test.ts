import { describe, expect, it } from 'vitest';
import type { Station } from '../../src/core/station';
import { attitudeText, cellText, problemsText, scrollToShow, sortKey, tableColumns, tableCounts, viewIndices, visibleWindow } from '../../src/components/table/tableModel';

const st = (row: number, extra: Partial<Station> = {}, source: Record<string, string> = {}): Station => ({ id: `S${row}`, row, source, problems: [], ...extra });
const bad = { problems: [{ row: 0, column: 'Dip', value: '95', expected: 'a dip from 0 to 90' }] };

describe('tableModel', () => {
  const stations: Station[] = [
    st(1, { kind: 'bedding', plane: { dipDirection: 120, dip: 40 } }, { Stn: 'S10', Dip: '40' }),
    st(2, { kind: 'hinge', line: { trend: 75, plunge: 12, sense: 'antiform' } }, { Stn: 'S2', Dip: '' }),
    st(3, { kind: 'bedding', ...bad }, { Stn: 'S1', Dip: '95' }),
    st(4, bad, { Stn: 'S3', Dip: '3O' }),
    st(5, { kind: 'bedding', plane: { dipDirection: 5, dip: 7 } }, { Stn: 'S20', Dip: '7' }),
  ];
  const columns = tableColumns(['Stn', 'Dip']);

  it('tableColumns(headers) puts what Foldlens read first and every original column after, by name', () => {
    expect(columns.map((c) => c.key)).toEqual(['row', 'status', 'id', 'kind', 'attitude', 'problems', 'position', 'source:Stn', 'source:Dip']);
  });

  it('attitudeText(station) writes planes as dip direction/dip and lines as trend/plunge, three-digit azimuths (common practice)', () => {
    expect(attitudeText(stations[0])).toBe('120/40');
    expect(attitudeText(stations[1])).toBe('075/12 antiform');
    expect(attitudeText(stations[4])).toBe('005/07');
    expect(attitudeText(stations[2])).toBe('');
  });

  it('problemsText(station) and cellText(station, column) give the first problem and the original value', () => {
    expect(problemsText(stations[2])).toBe('Dip: "95"; expected a dip from 0 to 90');
    expect(problemsText({ ...stations[2], problems: [...bad.problems, ...bad.problems] })).toMatch(/\(\+1 more\)$/);
    expect(cellText(stations[3], columns[8])).toBe('3O');
  });

  it('viewIndices(stations, filter) keeps rows by kind and by state, as indices into the stations', () => {
    expect([...viewIndices(stations, { kind: 'bedding' })]).toEqual([0, 2, 4]);
    expect([...viewIndices(stations, { rows: 'problems' })]).toEqual([2, 3]);
    expect([...viewIndices(stations, { rows: 'usable' })]).toEqual([0, 1, 4]);
    expect([...viewIndices(stations, { kind: 'none' })]).toEqual([3]);
    expect([...viewIndices(stations, { kind: 'bedding', rows: 'problems' })]).toEqual([2]);
  });

  it('viewIndices(stations, {sort}) sorts numbers as numbers, text in natural order, empty cells last both ways', () => {
    const by = (key: string, direction: 1 | -1) => [...viewIndices(stations, { sort: { key, direction }, columns })];
    // Natural order: S1 < S2 < S3 < S10 < S20 (Intl.Collator numeric, the outside reference).
    expect(by('source:Stn', 1)).toEqual([2, 1, 3, 0, 4]);
    expect(by('source:Stn', -1)).toEqual([4, 0, 3, 1, 2]);
    // Numbers first (7, 40, 95), then text ("3O"), empty last either way.
    expect(by('source:Dip', 1)).toEqual([4, 0, 2, 3, 1]);
    expect(by('source:Dip', -1)[4]).toBe(1);
    expect(by('attitude', 1)).toEqual([4, 1, 0, 2, 3]);
    expect(by('row', -1)).toEqual([4, 3, 2, 1, 0]);
  });

  it('viewIndices(stations, {sort}) keeps file order among ties (a stable sort)', () => {
    expect([...viewIndices(stations, { sort: { key: 'kind', direction: 1 }, columns })]).toEqual([0, 2, 4, 1, 3]);
  });

  it('sortKey(station, column) reads a number from a numeric cell', () => {
    expect(sortKey(stations[0], columns[8])).toBe(40);
    expect(sortKey(stations[3], columns[8])).toBe('3O');
  });

  it('tableCounts(stations) counts kinds, rows with problems and usable rows', () => {
    const c = tableCounts(stations);
    expect(c.kinds.get('bedding')).toBe(3);
    expect(c.kinds.get('none')).toBe(1);
    expect(c).toMatchObject({ problems: 2, usable: 3 });
  });

  it('visibleWindow(scrollTop, height, rowHeight, count) covers the rows in view plus the overscan, clamped to the table', () => {
    expect(visibleWindow(2600, 320, 26, 10_000)).toEqual({ first: 94, last: 119 });
    expect(visibleWindow(0, 320, 26, 10_000)).toEqual({ first: 0, last: 19 });
    expect(visibleWindow(259_740, 320, 26, 10_000)).toEqual({ first: 9984, last: 10_000 });
    expect(visibleWindow(0, 320, 26, 3)).toEqual({ first: 0, last: 3 });
  });

  it('scrollToShow(position, ...) moves only as far as needed to show the row', () => {
    expect(scrollToShow(500, 0, 320, 26, 26)).toBe(500 * 26 + 26 - (320 - 26));
    expect(scrollToShow(3, 0, 320, 26, 26)).toBe(0);
    expect(scrollToShow(3, 500, 320, 26, 26)).toBe(78);
  });

  it('viewIndices sorts 10^5 rows by an original column and keeps every index once', () => {
    const many = Array.from({ length: 100_000 }, (_, i) => st(i + 1, {}, { v: String((i * 7919) % 100_003) }));
    const view = viewIndices(many, { sort: { key: 'source:v', direction: 1 }, columns: tableColumns(['v']) });
    expect(view.length).toBe(100_000);
    expect(new Set(view).size).toBe(100_000);
    for (let k = 1; k < view.length; k++) expect(Number(many[view[k - 1]].source.v) <= Number(many[view[k]].source.v)).toBe(true);
  });
});
