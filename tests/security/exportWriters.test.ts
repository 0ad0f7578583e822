import { readFileSync } from 'node:fs';
import { beforeAll, describe, expect, it } from 'vitest';
import Papa from 'papaparse';
import type { FeatureCollection } from 'geojson';
import { sceneToSvg, type SvgTitleBlock } from '../../src/components/net/exportSvg';
import { CSV_FORMULA_NOTE, numbersToCsv, numbersToJson } from '../../src/components/net/exportNumbers';
import { netFields } from '../../src/components/net/netNumbers';
import { DEFAULT_SHOW, analysisLayer, frameLayers, legendLayer, poleLayer, type SceneLayer } from '../../src/components/net/netScene';
import { profileSceneToSvg } from '../../src/components/profile/profileExportSvg';
import { DEFAULT_PROFILE_SHOW, annotationLayer, faceLayer, frameLayer, headingLines, legendLayer as profileLegendLayer, linesLayer, stationsLayer } from '../../src/components/profile/profileScene';
import { profileAriaLabel, profileTitleBlock } from '../../src/components/profile/profileText';
import { fitAffine, profileLayout } from '../../src/components/profile/profileView';
import { profileSvg } from '../../src/cli/profileSvg';
import { checkDomain, type DomainPlane } from '../../src/core/consistency/domainCheck';
import { partitionAxisField } from '../../src/core/consistency/domainBoundaries';
import { localAxisField } from '../../src/core/consistency/localAxisField';
import { buildConsistencyReport, type ConsistencyReport } from '../../src/core/consistency/report';
import { consistencyReportHtml } from '../../src/core/consistency/reportHtml';
import { analyzeFold } from '../../src/core/foldAnalysis';
import { projectVectors } from '../../src/core/netProjection';
import { lineToVector, poleOf } from '../../src/core/vectors';
import { readCsv } from '../../src/io/csvTable';
import { detectColumns } from '../../src/io/columns';
import { readStations } from '../../src/io/readStations';
import { stationsToCsv, stationsToGeoJson } from '../../src/io/writeStations';
import { readDem } from '../../src/io/dem';
import { buildProfileData, type ProfileData } from '../../src/map/profileData';
import truth from '../../sample-maps/korvane/truth.json';
import { foldStations, positionsAndPoles } from '../core/consistency/synthetic';
import { findActiveContent, markupText, readMarkup } from '../helpers/activeContent';
import { HOSTILE_HEADERS, HOSTILE_PAYLOADS } from '../helpers/hostilePayloads';

/**
 * Every writer of SVG, HTML, CSV and JSON, fed the hostile payloads (tests/helpers/hostilePayloads.ts)
 * in every piece of data text it takes, in Node: the SVG and HTML hold no active content (the
 * checker in tests/helpers/activeContent.ts), no element that came from a payload, and the
 * payload comes back as text; the data files give the payload back exactly when parsed with a
 * reference parser (papaparse for CSV, JSON.parse).
 */

/** Elements the SVG writers use; anything else came from data. */
const SVG_ELEMENTS = new Set(['svg', 'title', 'desc', 'defs', 'clippath', 'lineargradient', 'stop', 'g', 'path', 'circle', 'rect', 'line', 'polyline', 'text']);
/** Elements of the consistency report page, its small nets and map included. */
const HTML_ELEMENTS = new Set([
  'html', 'head', 'meta', 'title', 'style', 'body', 'h1', 'h2', 'h3', 'p', 'strong', 'span', 'div', 'section', 'table', 'thead', 'tbody', 'tr', 'th', 'td', 'ul', 'li', 'dl', 'dt', 'dd',
  ...SVG_ELEMENTS,
]);
/**
 * Characters XML 1.0 does not allow (W3C XML 1.0, §2.2 production [2] Char): a file holding one
 * is not well-formed, and Chromium's DOMParser refuses it (checked by hand when this was written).
 */
const NOT_XML_CHARS = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\uFFFE\uFFFF]/;
const squash = (s: string): string => s.replace(/\s+/g, '');

/** Asserts the markup is inert, uses only the writer's own elements, and shows `payload` as text. */
function expectInert(markup: string, payload: string, allowed: ReadonlySet<string>): void {
  expect(findActiveContent(markup)).toEqual([]);
  const foreign = readMarkup(markup).elements.map((e) => e.name).filter((n) => !allowed.has(n));
  expect(foreign, 'elements that only a payload could have made').toEqual([]);
  expect(markup).not.toMatch(NOT_XML_CHARS);
  // Long words are wrapped onto lines of their own; without white space the text is whole.
  expect(squash(markupText(markup))).toContain(squash(payload));
}

const PLANES = [
  { dipDirection: 110, dip: 50 }, { dipDirection: 115, dip: 55 }, { dipDirection: 330, dip: 52 },
  { dipDirection: 325, dip: 48 }, { dipDirection: 220, dip: 64 }, { dipDirection: 112, dip: 45 },
];
const ANALYSIS = analyzeFold({ planes: PLANES }, { bootstrap: 50, seed: 1 });
const POLES = new Float64Array(PLANES.flatMap((p) => {
  const v = lineToVector(poleOf(p));
  return [v.x, v.y, v.z];
}));

describe('net SVG export (components/net/exportSvg.ts sceneToSvg)', () => {
  for (const p of HOSTILE_PAYLOADS) {
    it(`sceneToSvg with the payload "${p.name}" as selection, label, method, result, layer id, item text, title and name writes it as text only`, () => {
      const own: SceneLayer = {
        id: p.text,
        clip: true,
        items: [
          { type: 'text', role: 'caption', x: 10, y: 20, text: p.text, anchor: 'start', name: p.text },
          { type: 'path', role: 'pole', d: 'M0 0L1 1', title: p.text, name: p.text },
        ],
      };
      const layers = [...frameLayers('equal-area', true), poleLayer(projectVectors(POLES, 'equal-area')), analysisLayer(ANALYSIS, null, 'equal-area', DEFAULT_SHOW), own,
        legendLayer({ poles: PLANES.length, lines: 0, greatCircles: null, analysis: ANALYSIS, description: null, density: null, show: DEFAULT_SHOW })];
      const titleBlock: SvgTitleBlock = { selection: p.text, method: p.text, planes: 6, lines: 0, date: '2025-06-01', result: p.text };
      expectInert(sceneToSvg(layers, { label: p.text, titleBlock }), p.text, SVG_ELEMENTS);
    });
  }
});

describe('net numbers export (components/net/exportNumbers.ts)', () => {
  const fields = netFields({ analysis: ANALYSIS, description: null, density: null, linesCount: 0 });
  for (const p of HOSTILE_PAYLOADS) {
    it(`numbersToCsv and numbersToJson with the payload "${p.name}" as the selection give it back exactly (a formula with its apostrophe)`, () => {
      const meta = { selection: p.text, net: 'equal-area' as const, date: '2025-06-01', method: p.text };
      // Reference parser: papaparse reads the CSV back (RFC 4180).
      const rows = Papa.parse<string[]>(numbersToCsv(fields, ANALYSIS.warnings, meta), { skipEmptyLines: true }).data;
      const selection = rows.find((r) => r[0] === 'selection')!;
      // OWASP CSV injection advice: text a spreadsheet reads as a formula gets a leading apostrophe.
      const formula = /^[=+\-@\t\r]/.test(p.text);
      expect(selection[2]).toBe(formula ? `'${p.text}` : p.text);
      expect(rows.find((r) => r[0] === 'csv_note')?.[2]).toBe(CSV_FORMULA_NOTE);
      expect(rows.every((r) => r.length === 5)).toBe(true);
      const json = numbersToJson(fields, ANALYSIS.warnings, meta);
      expect(json).not.toMatch(/[<>&]/);
      expect(JSON.parse(json).selection).toBe(p.text);
    });
  }
});

describe('profile SVG export (components/profile/profileExportSvg.ts profileSceneToSvg)', () => {
  let base: ProfileData;
  beforeAll(async () => {
    const dem = await readDem(readFileSync('sample-maps/korvane/dem.tif'), { source: 'dem.tif' });
    const contacts = JSON.parse(readFileSync('sample-maps/korvane/contacts.geo.json', 'utf8')) as FeatureCollection;
    const west = truth.domains.find((d) => d.id === 'west')!;
    base = buildProfileData({ stations: [], contacts, dem, axis: west.axis, ring: west.polygon as [number, number][], label: 'West' });
  });

  for (const p of HOSTILE_PAYLOADS) {
    it(`profileSceneToSvg with the payload "${p.name}" as the label, a contact's name and a station left out writes it as text only`, () => {
      const data: ProfileData = { ...base, label: p.text, lines: [...base.lines, { ...base.lines[0], name: p.text }], noHeight: [`${p.text}: no height; not drawn.`] };
      const probe = profileLegendLayer(data, { colourBy: 'layer', show: DEFAULT_PROFILE_SHOW, x: 0, y: 0, width: 206 });
      const layout = profileLayout(data.extent, 1, false, probe.bottom, headingLines(data, 1, false).length);
      const a = fitAffine(data.extent, layout.plot, 1);
      const layers = [
        faceLayer(layout),
        linesLayer(data, a, 'layer', DEFAULT_PROFILE_SHOW, layout.plot),
        stationsLayer(data, a, 'layer', DEFAULT_PROFILE_SHOW, layout.plot),
        frameLayer(layout),
        annotationLayer(data, layout, a, 1),
        profileLegendLayer(data, { colourBy: 'layer', show: DEFAULT_PROFILE_SHOW, ...layout.legend }).layer,
      ];
      const svg = profileSceneToSvg(layers, { layout, label: profileAriaLabel(data, 1), titleBlock: profileTitleBlock(data, p.text, '2025-06-01', 1) });
      expectInert(svg, p.text, SVG_ELEMENTS);
    });
  }
});

describe('command-line profile SVG (cli/profileSvg.ts profileSvg)', () => {
  for (const p of HOSTILE_PAYLOADS) {
    it(`profileSvg with the payload "${p.name}" as title, note, station id, kind and line label writes it as text only`, () => {
      const svg = profileSvg({
        title: p.text,
        notes: [p.text],
        caution: 'Results are aids to interpretation.',
        stations: [
          { id: p.text, kind: p.text, x: 0, y: 0, depth: 0, trace: { dx: 1, dy: 0 } },
          { id: p.text, kind: 'hinge', x: 100, y: -50, depth: 40 },
        ],
        lines: [{ label: p.text, points: new Float64Array([0, 0, 0, 50, -20, 10, 100, -40, 20]) }],
      });
      expectInert(svg, p.text, SVG_ELEMENTS);
    });
  }
});

describe('consistency report page (core/consistency/reportHtml.ts consistencyReportHtml)', () => {
  const MARK = 'QQMARKQQ';
  let template: ConsistencyReport;
  beforeAll(() => {
    const WEST = { trend: 70, plunge: 15 };
    const stations = foldStations({ seed: 1, n: 120, hinges: 8, badPlanes: 3, badLines: 1, box: [-3000, -2000, 0, 2000], fold: () => ({ axis: WEST, swing: 50, wavelength: 1000, domain: 'west' }) });
    const domain = checkDomain(
      {
        id: `west-${MARK}`,
        name: `West ${MARK}`,
        planes: stations.filter((s) => s.plane).map((s): DomainPlane => ({ ...s.plane!, id: `${s.id} ${MARK}` })),
        lines: stations.filter((s) => s.line).map((s) => ({ ...s.line!, id: `${s.id} ${MARK}` })),
      },
      { bootstrap: 50 },
    );
    const { xy, poles } = positionsAndPoles(stations);
    const field = localAxisField(xy, poles, { nx: 8, ny: 6, k: 20 });
    template = buildConsistencyReport({
      title: `Check of ${MARK}`,
      generated: '2025-06-01',
      input: { stations: `field ${MARK}.csv`, [`column ${MARK}`]: 1 },
      domains: [domain],
      field: { field, partition: partitionAxisField(field), coordinates: `metres of ${MARK}` },
      notes: [`note ${MARK}`],
    });
  });

  for (const p of HOSTILE_PAYLOADS) {
    it(`consistencyReportHtml with the payload "${p.name}" in the title, file name, input names, domain name, reading ids and notes writes it as text only`, () => {
      // Every piece of text the report carries, with the marker replaced by the payload.
      const swap = (v: unknown): unknown => (typeof v === 'string' ? v.split(MARK).join(p.text) : v);
      const report = JSON.parse(JSON.stringify(template), (k, v) => swap(v)) as ConsistencyReport;
      const input = Object.fromEntries(Object.entries(report.input).map(([k, v]) => [swap(k) as string, v]));
      const html = consistencyReportHtml({ ...report, input });
      expectInert(html, p.text, HTML_ELEMENTS);
      expect(squash(markupText(html))).toContain(squash(`Check of ${p.text}`));
      expect(html).toMatch(/defer to local codes and licensed professional practice/);
    });
  }
});

describe('station CSV and GeoJSON export (io/writeStations.ts)', () => {
  // Stance on spreadsheet formulas (writeStations.ts): the station CSV gives back the user's own
  // fields exactly as read, so a cell such as =cmd|' /C calc'!A0 is written as it was (an
  // apostrophe would change values such as negative coordinates and break the round trip);
  // Foldlens never evaluates cell text. The numbers CSV, which Foldlens composes, does prefix.
  const headers = ['id', 'kind', 'dipdir', 'dip', 'lon', 'lat', 'notes', ...HOSTILE_HEADERS];
  const rows = HOSTILE_PAYLOADS.map((p, i) => [p.text, 'bedding', String((i * 37) % 360), String(10 + i), (15.1 + i / 1000).toFixed(4), '24.6', p.text, ...HOSTILE_HEADERS.map(() => p.text)]);
  // Reference writer: papaparse quotes fields as RFC 4180 requires.
  const text = Papa.unparse({ fields: headers, data: rows }, { newline: '\n' });
  const table = readCsv(text);
  const stations = readStations(table, detectColumns(table.headers).mapping);

  it('readCsv and readStations keep every hostile header and cell as data (ids, notes, a column named __proto__)', () => {
    expect(table.headers).toEqual(headers);
    expect(stations.map((s) => s.id)).toEqual(HOSTILE_PAYLOADS.map((p) => p.text));
    expect(stations.every((s) => s.problems.length === 0)).toBe(true);
    expect(Object.getPrototypeOf(stations[0].source)).toBe(Object.prototype);
    expect(Object.keys(stations[0].source)).toEqual(headers);
  });

  it('stationsToCsv writes every hostile header and cell back exactly as read, formulas included (read back with papaparse)', () => {
    const back = Papa.parse<string[]>(stationsToCsv(table, stations, { planeFormat: 'dipdir' }), { skipEmptyLines: true }).data;
    expect(back[0].slice(0, headers.length)).toEqual(headers);
    back.slice(1).forEach((r, i) => expect(r.slice(0, headers.length)).toEqual(rows[i]));
    expect(back.slice(1).map((r) => r[headers.indexOf('notes')])).toContain("=cmd|' /C calc'!A0");
  });

  it('stationsToGeoJson keeps every hostile property name and value exactly (read back with JSON.parse)', () => {
    const fc = JSON.parse(JSON.stringify(stationsToGeoJson(stations, { planeFormat: 'dipdir' }))) as FeatureCollection;
    fc.features.forEach((f, i) => {
      expect(Object.prototype.hasOwnProperty.call(f.properties, '__proto__')).toBe(true);
      for (const [c, h] of headers.entries()) expect(f.properties![h]).toBe(rows[i][c]);
      expect(f.properties!.fl_id).toBe(HOSTILE_PAYLOADS[i].text);
    });
  });
});

describe('characters XML 1.0 does not allow', () => {
  const BAD = 'row\u0001\u0008\u000b\u001b[31m red\uFFFE\uFFFF end';

  it('every SVG writer replaces control characters and U+FFFE/U+FFFF, so the file stays well-formed XML', () => {
    const net = sceneToSvg(frameLayers('equal-area', false), { label: BAD, titleBlock: { selection: BAD, method: 'm', planes: 0, lines: 0, date: '2025-06-01' } });
    const cli = profileSvg({ title: BAD, notes: [BAD], caution: 'c', stations: [{ id: BAD, kind: BAD, x: 0, y: 0, depth: 0 }], lines: [] });
    for (const svg of [net, cli]) {
      expect(svg).not.toMatch(NOT_XML_CHARS);
      expect(markupText(svg)).toContain('red');
    }
  });
});
