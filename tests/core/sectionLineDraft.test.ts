import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { EMPTY_DRAFT, FINISH_RADIUS_PX, finishDraft, sectionLineFeatures, tapOnDraft, withVertex, withoutLastVertex, type LonLatPair, type SectionLineDraft } from '../../src/core/sectionLineDraft';

/** A stand-in map view: 10 000 px per degree about (15, 24.6), y down as on screen. */
const project = (p: LonLatPair): LonLatPair => [(p[0] - 15) * 10_000, (24.6 - p[1]) * 10_000];
const unproject = (s: LonLatPair): LonLatPair => [15 + s[0] / 10_000, 24.6 - s[1] / 10_000];
const tapAt = (draft: SectionLineDraft, x: number, y: number) => tapOnDraft(draft, unproject([x, y]), [x, y], project);

describe('section line drafting (core/sectionLineDraft.ts)', () => {
  it('tapOnDraft adds a vertex per tap, and a tap on the last vertex (a double click) finishes a line of two or more', () => {
    let d = EMPTY_DRAFT;
    let r = tapAt(d, 0, 0);
    expect(r.action).toBe('added');
    d = r.draft;
    r = tapAt(d, 300, 40);
    expect(r.action).toBe('added');
    d = r.draft;
    r = tapAt(d, 302, 41); // the second click of a double click, 2 px away
    expect(r.action).toBe('finish');
    expect(r.draft).toBe(d); // no third vertex
    expect(finishDraft(d).line).toEqual([unproject([0, 0]), unproject([300, 40])]);
  });

  it('tapOnDraft ignores a repeated tap on the only vertex (no zero-length segment, no finish)', () => {
    const d = tapAt(EMPTY_DRAFT, 100, 100).draft;
    const r = tapAt(d, 104, 103);
    expect(r.action).toBe('ignored');
    expect(r.draft.vertices).toHaveLength(1);
  });

  it(`tapOnDraft measures the finishing distance on screen as the map shows it now: just under ${FINISH_RADIUS_PX} px in, ${FINISH_RADIUS_PX + 1} px out`, () => {
    const d = [tapAt(EMPTY_DRAFT, 0, 0).draft].map((x) => tapAt(x, 200, 0).draft)[0];
    expect(tapAt(d, 200 + FINISH_RADIUS_PX - 0.01, 0).action).toBe('finish');
    expect(tapAt(d, 200 + FINISH_RADIUS_PX + 1, 0).action).toBe('added');
    // After the map has moved (zoomed out 10x), the same screen tap is far from the last vertex in lon/lat but near it on screen.
    const zoomedOut = (p: LonLatPair): LonLatPair => [project(p)[0] / 10, project(p)[1] / 10];
    expect(tapOnDraft(d, unproject([200, 0]), [20, 0], zoomedOut).action).toBe('finish');
  });

  it('tapOnDraft refuses a position that is not longitude/latitude, naming it', () => {
    expect(() => tapOnDraft(EMPTY_DRAFT, [200, 24], [0, 0], project)).toThrow('section line tap: [200,24] is not [longitude, latitude] in degrees');
    expect(() => withVertex(EMPTY_DRAFT, [Number.NaN, 0])).toThrow('is not [longitude, latitude]');
  });

  it('withoutLastVertex takes back one vertex; finishDraft then needs two distinct points and says so', () => {
    let d = withVertex(withVertex(EMPTY_DRAFT, [15, 24.6]), [15.01, 24.61]);
    d = withoutLastVertex(d);
    const f = finishDraft(d);
    expect(f.line).toBeNull();
    expect(f.problem).toBe('A section line needs a start and an end point; it has only one point. Click where the section starts, then where it ends.');
    expect(finishDraft(EMPTY_DRAFT).problem).toContain('it has no point yet');
    expect(finishDraft({ vertices: [[15, 24.6], [15, 24.6]] }).line).toBeNull();
  });

  it('finishDraft drops repeated consecutive positions and keeps the order of the rest (property)', () => {
    fc.assert(
      fc.property(fc.array(fc.tuple(fc.integer({ min: 0, max: 3 }), fc.integer({ min: 0, max: 3 })), { maxLength: 12 }), (cells) => {
        const vertices = cells.map(([a, b]) => [15 + a / 100, 24.6 + b / 100] as LonLatPair);
        const f = finishDraft({ vertices });
        const distinct = vertices.filter((v, i) => i === 0 || v[0] !== vertices[i - 1][0] || v[1] !== vertices[i - 1][1]);
        if (distinct.length < 2) expect(f.line).toBeNull();
        else expect(f.line).toEqual(distinct);
      }),
    );
  });

  it('sectionLineFeatures draws the line, the rubber band to the pointer while drawing, start and end', () => {
    const v: LonLatPair[] = [[15, 24.6], [15.01, 24.61], [15.02, 24.6]];
    const drawing = sectionLineFeatures(v.slice(0, 2), [15.03, 24.62], false).features;
    expect(drawing.map((f) => f.properties.role)).toEqual(['line', 'pending', 'start', 'vertex']);
    expect(drawing[1].geometry).toEqual({ type: 'LineString', coordinates: [[15.01, 24.61], [15.03, 24.62]] });
    const done = sectionLineFeatures(v, [15.03, 24.62], true).features;
    expect(done.map((f) => f.properties.role)).toEqual(['line', 'start', 'vertex', 'end']);
    expect(done[0].geometry).toEqual({ type: 'LineString', coordinates: v.map((p) => [p[0], p[1]]) });
    expect(sectionLineFeatures([], null, false).features).toEqual([]);
  });
});
