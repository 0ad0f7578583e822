import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { EXPORT_CAUTION, escapeXml, sceneToSvg, titleBlockLines, wrapText } from '../../src/components/net/exportSvg';
import { CSV_FORMULA_NOTE, csvCell, numbersToCsv, numbersToJson, numbersToJsonObject, type NumbersExportMeta } from '../../src/components/net/exportNumbers';
import { netFields, type NetField } from '../../src/components/net/netNumbers';
import { DEFAULT_SHOW, analysisLayer, contourLayer, frameLayers, legendLayer, lineLayer, poleLayer } from '../../src/components/net/netScene';
import { NET_PALETTE, resolvePalette, roleCss } from '../../src/components/net/netStyle';
import { analyzeFold } from '../../src/core/foldAnalysis';
import { kambGrid } from '../../src/core/kamb';
import { projectVectors } from '../../src/core/netProjection';
import { lineToVector, poleOf } from '../../src/core/vectors';
import type { PlaneMeasurement } from '../../src/core/types';

const XSS = '<img src=x onerror=alert(1)>';
const SELECTION = `North ridge, "Tarn" Hollow & station ${XSS}`;
const PLANES: PlaneMeasurement[] = [
  { dipDirection: 110, dip: 50 }, { dipDirection: 115, dip: 55 }, { dipDirection: 330, dip: 52 },
  { dipDirection: 325, dip: 48 }, { dipDirection: 220, dip: 64 }, { dipDirection: 112, dip: 45 },
];
const ANALYSIS = analyzeFold({ planes: PLANES }, { bootstrap: 100 });
const POLES = new Float64Array(PLANES.flatMap((p) => {
  const v = lineToVector(poleOf(p));
  return [v.x, v.y, v.z];
}));
const META: NumbersExportMeta = { selection: SELECTION, net: 'equal-area', date: '2025-06-01', method: ANALYSIS.method };

function fullScene() {
  const xy = projectVectors(POLES, 'equal-area');
  const density = kambGrid(POLES, { resolution: 41 });
  return [
    ...frameLayers('equal-area', true),
    contourLayer(density, 'equal-area'),
    poleLayer(xy),
    lineLayer(projectVectors(new Float64Array([0, 0, 1]), 'equal-area')),
    analysisLayer(ANALYSIS, null, 'equal-area', DEFAULT_SHOW),
    legendLayer({ poles: PLANES.length, lines: 1, greatCircles: null, analysis: ANALYSIS, description: null, density, show: DEFAULT_SHOW }),
  ];
}

/** Names of all attributes in all tags of XML text whose attribute values are double-quoted. */
function attributeNames(xml: string): Set<string> {
  const names = new Set<string>();
  for (const [, body] of xml.matchAll(/<[A-Za-z][\w:-]*((?:\s+[^\s=/>]+="[^"]*")*)\s*\/?>/g)) {
    for (const [, name] of body.matchAll(/\s([^\s=]+)="[^"]*"/g)) names.add(name);
  }
  // Every opening tag must have been read whole: as many matches as tags.
  const tags = xml.match(/<[A-Za-z]/g)?.length ?? 0;
  const read = [...xml.matchAll(/<[A-Za-z][\w:-]*((?:\s+[^\s=/>]+="[^"]*")*)\s*\/?>/g)].length;
  if (tags !== read) throw new Error(`attributeNames: read ${read} of ${tags} tags`);
  return names;
}

/** Cells of RFC 4180 CSV text (quoted fields, doubled quotes, CRLF records). */
function parseCsv(text: string): string[][] {
  const rows: string[][] = [];
  let row: string[] = [];
  let cell = '';
  let quoted = false;
  for (let i = 0; i < text.length; i++) {
    const c = text[i];
    if (quoted) {
      if (c === '"' && text[i + 1] === '"') (cell += '"'), i++;
      else if (c === '"') quoted = false;
      else cell += c;
    } else if (c === '"') quoted = true;
    else if (c === ',') row.push(cell), (cell = '');
    else if (c === '\r' && text[i + 1] === '\n') row.push(cell), rows.push(row), (row = []), (cell = ''), i++;
    else cell += c;
  }
  return rows;
}

describe('SVG export', () => {
  // XML 1.0 (W3C), section 2.4: <, & must be escaped in character data; quotes in attribute values.
  const escapes = [
    { input: XSS, expected: '&lt;img src=x onerror=alert(1)&gt;' },
    { input: 'a & b', expected: 'a &amp; b' },
    { input: `"it's"`, expected: '&quot;it&apos;s&quot;' },
    { input: 'bell\u0007', expected: 'bell\uFFFD' }, // XML 1.0 section 2.2: control characters are not allowed
  ];
  for (const row of escapes) {
    it(`escapeXml(${JSON.stringify(row.input)}) is ${JSON.stringify(row.expected)}`, () => {
      expect(escapeXml(row.input)).toBe(row.expected);
    });
  }

  it('sceneToSvg(layers, {titleBlock}) writes a standalone SVG with no script, handler, style sheet or raw label', () => {
    const svg = sceneToSvg(fullScene(), {
      label: `Net of ${SELECTION}`,
      titleBlock: { selection: SELECTION, method: 'Pi axis from the orientation tensor.', planes: PLANES.length, lines: 1, date: '2025-06-01', result: 'Fold axis 040/25' },
    });
    expect(svg.startsWith('<svg xmlns="http://www.w3.org/2000/svg"')).toBe(true);
    expect(svg.trimEnd().endsWith('</svg>')).toBe(true);
    expect(svg).not.toMatch(/<script|<style|<foreignObject|<img|<iframe|javascript:/i);
    // Every tag's attributes are name="value" pairs (values hold no raw quote), none an event handler.
    const names = attributeNames(svg);
    expect(names.size).toBeGreaterThan(5);
    expect([...names].filter((n) => /^on/i.test(n))).toEqual([]);
    expect(svg).not.toMatch(/href=/i);
    expect(svg).toContain(escapeXml(SELECTION));
    expect(svg.split('<g ').length).toBe(svg.split('</g>').length);
    expect(svg).toContain('<clipPath id="fl-net-clip">');
    expect(svg).toContain('clip-path="url(#fl-net-clip)"');
    expect(svg).toMatch(/<path d="M\d+ \d+h0[^"]*" style="[^"]*stroke-width: 32px[^"]*" transform="scale\(0\.1\)"/);
    const text = svg.replace(/<[^>]+>/g, ' ').replace(/\s+/g, ' ');
    expect(text).toContain(EXPORT_CAUTION);
    expect(text).toContain('2025-06-01');
    expect(text).not.toMatch(/NaN|Infinity|undefined/);
  });

  it('sceneToSvg(layers, {palette}) writes the given colours inline', () => {
    const svg = sceneToSvg(fullScene(), { palette: { ...NET_PALETTE, pole: '#000000', axis: 'rgb(1, 2, 3)' } });
    expect(svg).toContain('stroke: #000000');
    expect(svg).toContain('fill: rgb(1, 2, 3)');
  });

  it('titleBlockLines(t) keeps every word of the selection, the date and the caution', () => {
    const long = `${SELECTION} ${'x'.repeat(150)}`;
    const lines = titleBlockLines({ selection: long, method: 'm', planes: 1, lines: 0, date: '2025-06-01' });
    const text = lines.map((l) => l.text).join(' ');
    expect(text).toContain('1 plane, 0 lines · exported 2025-06-01');
    expect(text.replace(/\s+/g, '')).toContain(long.replace(/\s+/g, ''));
    expect(text).toContain(EXPORT_CAUTION.split(' ').slice(-4).join(' '));
  });

  it('wrapText(text, width) loses no character and keeps every line within width', () => {
    fc.assert(
      fc.property(fc.string({ maxLength: 300 }), fc.integer({ min: 1, max: 40 }), (text, width) => {
        const lines = wrapText(text, width);
        for (const l of lines) expect(l.length).toBeLessThanOrEqual(width);
        expect(lines.join('').replace(/\s+/g, '')).toBe(text.replace(/\s+/g, ''));
        // Lines break only at white space, except inside a word longer than a line.
        if (text.split(/\s+/).every((w) => w.length <= width)) expect(lines.join(' ')).toBe(text.split(/\s+/).filter((w) => w !== '').join(' '));
      }),
    );
    expect(() => wrapText('a', 0)).toThrow(/width 0/);
  });

  it('resolvePalette(read) takes plain colours and keeps the default for anything else', () => {
    const given: Record<string, string> = {
      '--fl-net-pole': ' #112233 ',
      '--fl-net-axis': 'rgb(10, 20, 30)',
      '--fl-net-girdle': 'red;} svg { display: none',
      '--fl-net-beta': 'url(javascript:alert(1))',
      '--fl-net-line': 'darkorange',
    };
    const p = resolvePalette((name) => given[name] ?? '');
    expect(p.pole).toBe('#112233');
    expect(p.axis).toBe('rgb(10, 20, 30)');
    expect(p.girdle).toBe(NET_PALETTE.girdle);
    expect(p.beta).toBe(NET_PALETTE.beta);
    expect(p.line).toBe('darkorange');
    expect(p.face).toBe(NET_PALETTE.face);
  });

  it('roleCss() styles every role through --fl-net custom properties with fallbacks', () => {
    const cssText = roleCss();
    expect(cssText).toContain(`.r-pole { fill: none; stroke: var(--fl-net-pole, ${NET_PALETTE.pole});`);
    expect(cssText).toContain('.r-axis {');
    expect(cssText).not.toMatch(/undefined/);
  });
});

describe('CSV and JSON export', () => {
  // RFC 4180, section 2: fields with commas, quotes or line breaks are quoted; quotes are doubled.
  // OWASP "CSV Injection": cells starting with =, +, -, @, tab or CR are prefixed with a quote.
  const cells = [
    { input: 'plain', expected: 'plain' },
    { input: 'a,b', expected: '"a,b"' },
    { input: 'say "hi"', expected: '"say ""hi"""' },
    { input: 'two\r\nlines', expected: '"two\r\nlines"' },
    { input: ' edge', expected: '" edge"' },
    { input: '=HYPERLINK("x")', expected: '"\'=HYPERLINK(""x"")"' },
    { input: '@SUM(A1)', expected: "'@SUM(A1)" },
    { input: -12.5, expected: '-12.5' },
    { input: null, expected: '' },
    { input: Number.NaN, expected: '' },
  ];
  for (const row of cells) {
    it(`csvCell(${JSON.stringify(row.input)}) is ${JSON.stringify(row.expected)}`, () => {
      expect(csvCell(row.input as string | number | null)).toBe(row.expected);
    });
  }

  it('numbersToCsv(fields, warnings, meta) writes the selection, method, caution, every field and every warning', () => {
    const fields = netFields({ analysis: ANALYSIS });
    const csv = numbersToCsv(fields, [...ANALYSIS.warnings, { code: 'few-planes', message: 'Only 2 planes, "test", here' }], META);
    expect(csv.endsWith('\r\n')).toBe(true);
    const rows = parseCsv(csv);
    expect(rows[0]).toEqual(['key', 'label', 'value', 'unit', 'note']);
    for (const r of rows) expect(r.length).toBe(5);
    const byKey = new Map(rows.map((r) => [r[0], r]));
    expect(byKey.get('selection')?.[2]).toBe(SELECTION); // round trip through quoting
    expect(byKey.get('caution')?.[2]).toBe(EXPORT_CAUTION);
    expect(byKey.get('csv_note')?.[2]).toBe(CSV_FORMULA_NOTE);
    expect(byKey.get('method')?.[2]).toBe(ANALYSIS.method);
    for (const f of fields) {
      const r = byKey.get(f.key);
      expect(r, f.key).toBeDefined();
      expect(r![2]).toBe(f.value === null ? '' : String(f.value));
      expect(r![4]).toBe(f.note ?? '');
    }
    expect(Number(byKey.get('axis_trend')![2])).toBeCloseTo(ANALYSIS.axis!.trend, 9);
    expect(rows.filter((r) => r[0].startsWith('warning_')).length).toBe(ANALYSIS.warnings.length + 1);
    expect(csv).not.toMatch(/NaN|Infinity|undefined/);
  });

  it('numbersToJson(fields, warnings, meta) is inert JSON holding the selection, caution and every field', () => {
    const fields = netFields({ analysis: ANALYSIS });
    const text = numbersToJson(fields, ANALYSIS.warnings, META);
    expect(text).not.toMatch(/[<>]/);
    expect(text).not.toMatch(/NaN|Infinity|undefined/);
    const json = JSON.parse(text);
    expect(json).toMatchObject({ format: 'foldlens-net-numbers', version: 1, selection: SELECTION, net: 'equal-area', hemisphere: 'lower', date: '2025-06-01', caution: EXPORT_CAUTION });
    expect(Object.keys(json.fields)).toEqual(fields.map((f) => f.key));
    expect(json.fields.axis_trend.value).toBeCloseTo(ANALYSIS.axis!.trend, 9);
    expect(json.fields.lines_mean_trend).toEqual({ label: 'Lines Fisher mean trend', value: null, unit: 'deg', note: 'no lines' });
  });

  it('numbersToJsonObject(fields) turns a non-finite number into null with a note', () => {
    const fields: NetField[] = [{ key: 'k', label: 'K', value: Number.POSITIVE_INFINITY, unit: '', note: null }];
    expect(numbersToJsonObject(fields, [], META).fields.k).toEqual({ label: 'K', value: null, unit: '', note: 'not a finite number' });
  });
});
