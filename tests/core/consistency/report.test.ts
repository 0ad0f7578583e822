import { describe, expect, it } from 'vitest';
import { checkDomain, type DomainPlane } from '../../../src/core/consistency/domainCheck';
import { partitionAxisField } from '../../../src/core/consistency/domainBoundaries';
import { localAxisField } from '../../../src/core/consistency/localAxisField';
import { buildConsistencyReport, CONSISTENCY_CAUTION } from '../../../src/core/consistency/report';
import { consistencyReportHtml, escapeHtml } from '../../../src/core/consistency/reportHtml';
import { angleBetweenLines } from '../../../src/core/geometry';
import { contactTraces, foldStations, levelGroundClosures, positionsAndPoles, surfaceBedding, type SynthStation } from './synthetic';

const WEST = { trend: 70, plunge: 15 };
const EAST = { trend: 90, plunge: 18 };
const HOSTILE = '<img src=x onerror="alert(1)">&\'';

function stationsOf(domain: string): SynthStation[] {
  const axis = domain === 'west' ? WEST : EAST;
  return foldStations({ seed: domain === 'west' ? 1 : 2, n: 150, hinges: 10, badPlanes: 3, badLines: 1, box: domain === 'west' ? [-3000, -2000, 0, 2000] : [0, -2000, 3000, 2000], fold: () => ({ axis, swing: 50, wavelength: 1000, domain }) });
}

function report() {
  const domains = ['west', 'east'].map((id) => {
    const stations = stationsOf(id);
    return checkDomain(
      {
        id,
        name: id === 'west' ? `West ${HOSTILE}` : 'East',
        planes: stations.filter((s) => s.plane).map((s): DomainPlane => ({ ...s.plane!, id: `${s.id}${HOSTILE}` })),
        lines: stations.filter((s) => s.line).map((s) => ({ ...s.line!, id: s.id })),
      },
      { bootstrap: 100 },
    );
  });
  const { xy, poles } = positionsAndPoles([...stationsOf('west'), ...stationsOf('east')]);
  const field = localAxisField(xy, poles, { nx: 12, ny: 8, k: 25 });
  return buildConsistencyReport({
    title: `Check of ${HOSTILE}`,
    generated: '2025-06-01',
    input: { stations: `field${HOSTILE}.csv`, rows: 320 },
    domains,
    field: { field, partition: partitionAxisField(field), coordinates: 'metres east and north of a local origin', toLonLat: (x, y) => [x / 1e5, y / 1e5] },
    notes: [`note ${HOSTILE}`],
  });
}

describe('buildConsistencyReport', () => {
  it('buildConsistencyReport(two domains 19.4° apart, field) compares the axes, gathers every flag with its domain, and survives a JSON round trip unchanged', () => {
    const r = report();
    expect(r.pairs.length).toBe(1);
    // Planted axes 19.399° apart (derived); each pi axis is within a degree of its planted one.
    expect(Math.abs(r.pairs[0].angle! - angleBetweenLines(WEST, EAST))).toBeLessThan(2);
    expect(r.pairs[0].conesOverlap).toBe(false);
    expect(r.flags.length).toBe(r.domains.reduce((n, d) => n + d.flags.length, 0));
    expect(r.flags.filter((f) => f.code === 'planes-off-girdle').map((f) => f.domain)).toEqual(['west', 'east']);
    expect(r.caution).toBe(CONSISTENCY_CAUTION);
    expect(r.caution).toMatch(/defer to local codes and licensed professional practice/);
    expect(r.field!.nodes.length).toBe(96);
    expect(r.field!.nodes.every((n) => n.lon === n.x / 1e5 && n.lat === n.y / 1e5)).toBe(true);
    expect(r.field!.partition.boundaries.every((b) => b.lonLat!.length === b.points.length)).toBe(true);
    expect(JSON.parse(JSON.stringify(r))).toEqual(r);
    expect(JSON.stringify(r)).not.toMatch(/NaN|Infinity/);
  });
});

describe('consistencyReportHtml', () => {
  it('consistencyReportHtml(report) escapes every piece of data text and holds no script, no event handler and no external resource', () => {
    const html = consistencyReportHtml(report());
    expect(html.startsWith('<!DOCTYPE html>')).toBe(true);
    // Escaped text holds no '<' and no '"', so every '<...>' is real markup and every "..." in it a
    // whole attribute value: look at the tags with their values blanked.
    const tags = html.match(/<[^>]*>/g)!.map((t) => t.replace(/"[^"]*"/g, '""'));
    expect(tags.filter((t) => /^<\/?(script|img|iframe|object|embed|link)\b/i.test(t))).toEqual([]);
    expect(tags.filter((t) => /\son[a-z]+\s*=/i.test(t))).toEqual([]);
    expect(tags.filter((t) => /\s(src|href)\s*=/i.test(t))).toEqual([]);
    expect(html).toContain(escapeHtml(`Check of ${HOSTILE}`));
    expect(html).toContain(escapeHtml(`West ${HOSTILE}`));
    expect(html).toContain(escapeHtml(`field${HOSTILE}.csv`));
    expect(html).toContain(escapeHtml(`note ${HOSTILE}`));
    expect(html).toContain(CONSISTENCY_CAUTION);
    // One net per domain and one map of the field.
    expect(html.match(/<svg /g)!.length).toBe(3);
  });

  it('consistencyReportHtml(report with fold closures) lists the closure that disagrees, with the surface name escaped', () => {
    // Level-ground contact and hinges of synthetic.ts; the first hinge is planted with the wrong sense.
    const spec = { axis: WEST, amplitude: 150, wavelength: 1000 };
    const box = [-2000, -1500, 2000, 1500] as const;
    const closures = levelGroundClosures({ ...spec, level: 650, z0: 800, box });
    const lines = closures.map((c, i) => ({ ...WEST, x: c.x, y: c.y, id: `H${i + 1}`, sense: i === 0 ? (c.sense === 'antiform' ? ('synform' as const) : ('antiform' as const)) : c.sense }));
    const check = checkDomain(
      {
        id: 'c',
        name: 'Closures',
        planes: surfaceBedding({ ...spec, box, count: 200, seed: 4 }),
        lines,
        surfaces: [{ name: `contact ${HOSTILE}`, pieces: contactTraces({ ...spec, level: 650, box, cell: 20, terrain: () => 800 }) }],
      },
      { bootstrap: 0, searchAxis: false },
    );
    const html = consistencyReportHtml(buildConsistencyReport({ generated: '2025-06-01', domains: [check] }));
    expect(check.mapPattern!.closures!.disagreeing).toBe(1);
    expect(html).toContain('Fold closures on the map');
    expect(html).toContain(escapeHtml(`contact ${HOSTILE}`));
    expect(html).not.toContain(HOSTILE);
    expect(html.match(/<tr class="flagged"><td>contact /g)!.length).toBe(1);
  });

  // Reference rows: the characters HTML requires escaped in text and quoted attributes (HTML
  // Living Standard, "Escaping a string"; XML 1.0 section 2.4 predefined entities).
  const rows = [
    { input: 'a & b', expected: 'a &amp; b' }, // HTML standard: & -> &amp;
    { input: '<b>', expected: '&lt;b&gt;' }, // HTML standard: < and > in text
    { input: 'say "hi"', expected: 'say &quot;hi&quot;' }, // HTML standard: " in attribute values
    { input: "it's", expected: 'it&#39;s' }, // numeric reference for ' (valid in HTML and XML)
    { input: '&amp;', expected: '&amp;amp;' }, // already-escaped text is escaped again, never trusted
    { input: 'bell\u0007', expected: 'bell\uFFFD' }, // control characters are not allowed in HTML text (Foldlens shows U+FFFD)
  ];
  for (const row of rows) {
    it(`escapeHtml(${JSON.stringify(row.input)}) gives ${JSON.stringify(row.expected)}`, () => {
      expect(escapeHtml(row.input)).toBe(row.expected);
    });
  }
});
