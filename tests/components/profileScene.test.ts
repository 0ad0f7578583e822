import { readFileSync } from 'node:fs';
import { beforeAll, describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { lab, rgb } from 'd3';
import proj4 from 'proj4';
import type { FeatureCollection } from 'geojson';
import { buildProfileData, type ProfileData } from '../../src/map/profileData';
import type { Station } from '../../src/core/station';
import { readDem } from '../../src/io/dem';
import type { Dem } from '../../src/io/demSampler';
import {
  DEFAULT_PROFILE_SHOW,
  annotationLayer,
  distanceBins,
  faceLayer,
  frameLayer,
  headingLines,
  highlightLayer,
  legendLayer,
  linesLayer,
  stationsLayer,
  topographyLayer,
  type ColourBy,
  type SceneItem,
  type SceneLayer,
  type ScenePath,
} from '../../src/components/profile/profileScene';
import { CONTACT_COLOURS, CONTACT_DASHES, DISTANCE_RAMP_STOPS, PROFILE_PALETTE, distanceColour } from '../../src/components/profile/profileStyle';
import { PROFILE_CAUTION, annotationText, metresText, profileAriaLabel, profileRows, profileTitleBlock } from '../../src/components/profile/profileText';
import { profileSceneToSvg } from '../../src/components/profile/profileExportSvg';
import { applyZoom, fitAffine, profileLayout, scaleBar, toScreen } from '../../src/components/profile/profileView';
import { escapeXml } from '../../src/components/net/exportSvg';
import truth from '../../sample-maps/korvane/truth.json';
import { expectClose } from '../helpers/tolerance';

const XSS = '<img src=x onerror=alert(1)>';
const UTM33 = '+proj=utm +zone=33 +datum=WGS84 +units=m +no_defs';
const toLonLat = (e: number, n: number): [number, number] => proj4(UTM33, 'WGS84', [e, n]) as [number, number];
const west = truth.domains.find((d) => d.id === 'west')!;

let dem: Dem;
let contacts: FeatureCollection;
let faults: FeatureCollection;
beforeAll(async () => {
  dem = await readDem(readFileSync('sample-maps/korvane/dem.tif'), { source: 'dem.tif' });
  contacts = JSON.parse(readFileSync('sample-maps/korvane/contacts.geo.json', 'utf8')) as FeatureCollection;
  faults = JSON.parse(readFileSync('sample-maps/korvane/faults.geo.json', 'utf8')) as FeatureCollection;
});

const byName = (items: readonly SceneItem[], name: string): SceneItem | undefined => items.find((i) => i.name === name);

/** Every layer of a full drawing at a view, as the export writes it. */
function scene(data: ProfileData | null, ve: number, colourBy: ColourBy, zoom = { k: 1, x: 0, y: 0 }): { layers: SceneLayer[]; layout: ReturnType<typeof profileLayout> } {
  const probe = legendLayer(data, { colourBy, show: DEFAULT_PROFILE_SHOW, x: 0, y: 0, width: 206 });
  const layout = profileLayout(data?.extent ?? null, ve, false, probe.bottom, headingLines(data, ve, false).length);
  const a = applyZoom(fitAffine(data?.extent ?? null, layout.plot, ve), zoom);
  return {
    layout,
    layers: [
      faceLayer(layout),
      topographyLayer(data, a, DEFAULT_PROFILE_SHOW, layout.plot),
      linesLayer(data, a, colourBy, DEFAULT_PROFILE_SHOW, layout.plot),
      stationsLayer(data, a, colourBy, DEFAULT_PROFILE_SHOW, layout.plot),
      highlightLayer(data, a, data?.stations.index[0] ?? -1),
      frameLayer(layout),
      annotationLayer(data, layout, a, ve),
      legendLayer(data, { colourBy, show: DEFAULT_PROFILE_SHOW, ...layout.legend }).layer,
    ],
  };
}

function korvane(section = false): ProfileData {
  const [e0, n0] = west.profile.originUtm;
  const az = (150 * Math.PI) / 180;
  return buildProfileData({
    stations: [],
    contacts,
    faults,
    dem,
    axis: west.axis,
    ring: west.polygon as [number, number][],
    ...(section && { section: { line: [toLonLat(e0 - 1500 * Math.sin(az), n0 - 1500 * Math.cos(az)), toLonLat(e0 + 1500 * Math.sin(az), n0 + 1500 * Math.cos(az))], swath: 400 } }),
    label: west.name,
  });
}

describe('colours (profileStyle.ts)', () => {
  it('distanceColour(t) rises in CIELAB lightness from near to far (d3-color lab): by at least 2.5 between the 8 drawn steps, and nowhere falls by more than 8-bit rounding', () => {
    const bins = distanceBins([0, 1]);
    const steps = Array.from({ length: bins.bins }, (_, b) => lab(bins.colour(b)).l);
    for (let b = 1; b < steps.length; b++) expect(steps[b] - steps[b - 1], `step ${b}`).toBeGreaterThan(2.5);
    let last = -Infinity;
    for (let i = 0; i <= 400; i++) {
      const l = lab(distanceColour(i / 400)).l;
      // One unit of an 8-bit channel moves L* by well under 0.5.
      expect(l).toBeGreaterThan(last - 0.5);
      last = Math.max(last, l);
    }
    expect(lab(distanceColour(1)).l - lab(distanceColour(0)).l).toBeGreaterThan(35);
  });

  /** WCAG 2.1 relative luminance and contrast ratio (W3C, "contrast ratio" definition). */
  const luminance = (c: string): number => {
    const { r, g, b } = rgb(c);
    const f = (v: number): number => (v / 255 <= 0.03928 ? v / 255 / 12.92 : ((v / 255 + 0.055) / 1.055) ** 2.4);
    return 0.2126 * f(r) + 0.7152 * f(g) + 0.0722 * f(b);
  };
  const contrast = (a: string, b: string): number => (Math.max(luminance(a), luminance(b)) + 0.05) / (Math.min(luminance(a), luminance(b)) + 0.05);

  it('every ramp and contact colour keeps 3:1 contrast against the white face (WCAG 2.1, 1.4.11 non-text contrast)', () => {
    for (const c of [...DISTANCE_RAMP_STOPS, ...CONTACT_COLOURS, distanceColour(0.93), PROFILE_PALETTE.fault, PROFILE_PALETTE.topography, PROFILE_PALETTE.station]) {
      expect(contrast(c, PROFILE_PALETTE.face), c).toBeGreaterThanOrEqual(3);
    }
  });

  it('contact layers from the third on differ by dash as well as colour; no two layers look the same', () => {
    const looks = CONTACT_COLOURS.map((c, i) => `${c}|${CONTACT_DASHES[i]}`);
    expect(new Set(looks).size).toBe(CONTACT_COLOURS.length);
    expect(CONTACT_DASHES.slice(2).every((d) => d !== '')).toBe(true);
  });

  it('distanceBins(range).binOf puts the ends of the range in the first and last of 8 bins', () => {
    const b = distanceBins([-1950, 1478]);
    expect(b.binOf(-1950)).toBe(0);
    expect(b.binOf(1478)).toBe(7);
    expect(distanceBins(null).binOf(5)).toBe(4);
  });
});

describe('the drawing (profileScene.ts)', () => {
  it('linesLayer(data, a, "layer") draws one path per contact name in the key\'s order and one for the faults', () => {
    const data = korvane();
    const { layers } = scene(data, 1, 'layer');
    const lines = layers.find((l) => l.id === 'lines')!.items as ScenePath[];
    const contacts = data.lines.filter((l) => l.kind === 'contact');
    expect(lines.filter((i) => i.role === 'contact').map((i) => i.title)).toEqual(contacts.map((l) => l.name));
    expect(lines.filter((i) => i.role === 'contact').map((i) => i.stroke)).toEqual(contacts.map((l) => CONTACT_COLOURS[l.order]));
    const legend = layers.find((l) => l.id === 'legend')!.items;
    contacts.forEach((l, k) => expect(byName(legend, `key-contact-${k}`)).toBeDefined());
    // Every run of a layer is a subpath of its one path.
    const runs = contacts[0].runStarts.length - 1;
    expect((lines[0] as ScenePath).d.match(/M/g)!.length).toBeGreaterThanOrEqual(runs);
  });

  it('linesLayer(data, a, "distance") splits lines into at most 8 ramp paths per kind, each coloured from the ramp', () => {
    const { layers } = scene(korvane(), 1, 'distance');
    const items = layers.find((l) => l.id === 'lines')!.items as ScenePath[];
    const contactPaths = items.filter((i) => i.role === 'contact');
    expect(contactPaths.length).toBeGreaterThan(1);
    expect(contactPaths.length).toBeLessThanOrEqual(8);
    for (const p of contactPaths) expect(p.stroke).toMatch(/^#[0-9a-f]{6}$/);
    const legend = layers.find((l) => l.id === 'legend')!.items;
    expect(byName(legend, 'key-ramp-near')).toMatchObject({ text: 'near (up-plunge)' });
    expect(byName(legend, 'key-ramp-min')).toMatchObject({ text: metresText(korvane().alongRange![0]) });
  });

  it('annotationLayer(data, layout, a, 1) names the view, the compass sides and a scale bar whose drawn length is its metres times the scale', () => {
    const data = korvane();
    const { layers, layout } = scene(data, 1, 'layer');
    const items = layers.find((l) => l.id === 'annotations')!.items;
    expect(byName(items, 'annotation')).toMatchObject({ text: 'Looking down-plunge toward 075°, plunge 12° · true scale' });
    expect(byName(items, 'edge-left')).toMatchObject({ text: '← 345° NNW' });
    expect(byName(items, 'edge-right')).toMatchObject({ text: '165° SSE →' });
    expect(byName(items, 'edge-up')).toMatchObject({ text: '↑ up: normal to the axis, leaning 12° from vertical toward 075°' });
    const a = fitAffine(data.extent, layout.plot, 1);
    const bar = scaleBar(a, Math.min(layout.plot.width / 4, 200));
    const d = (byName(items, 'scale-bar') as ScenePath).d;
    const [, x0, , x1] = d.match(/^M([-\d.]+) ([-\d.]+)H([-\d.]+)/)!.map(Number);
    expectClose(x1 - x0, bar.length, 0.11, 'drawn bar length');
    expect(byName(items, 'scale-text')).toMatchObject({ text: metresText(bar.metres) });
    expect(byName(items, 'axis-text')).toMatchObject({ text: 'axis 075/12, into the page' });
  });

  it('annotationLayer(section data, layout, a, 2) labels the vertical exaggeration "V.E. ×2" at the scale bar and in the heading', () => {
    const data = korvane(true);
    const { layers } = scene(data, 2, 'layer');
    const items = layers.find((l) => l.id === 'annotations')!.items;
    expect((byName(items, 'scale-text') as { text: string }).text).toMatch(/ · V\.E\. ×2$/);
    // The heading may wrap over several lines: read them together.
    const heading = items.filter((i) => i.type === 'text' && i.role === 'annotation').map((i) => (i as { text: string }).text).join(' ');
    expect(heading).toContain('V.E. ×2 (vertical exaggeration)');
    expect(byName(items, 'edge-up')).toMatchObject({ text: '↑ up (vertical)' });
    expect((byName(items, 'axis-text') as { text: string }).text).toMatch(/^axis apparent plunge \d+\.\d° toward the (end|start) \(drawn \d+\.\d° at V\.E\. ×2\)$/);
    expect(layers.find((l) => l.id === 'topography')!.items).toHaveLength(1);
  });

  it('headingLines(data, ve, narrow) wraps the view annotation without losing a word, and profileLayout moves the plot down for each extra line', () => {
    const data = korvane(true);
    const long: ProfileData = { ...data, view: `${data.view} and a much longer note about segments that does not fit` };
    for (const narrow of [false, true]) {
      const lines = headingLines(long, 10, narrow);
      expect(lines.join(' ')).toBe(annotationText(long, 10));
      const one = profileLayout(long.extent, 10, narrow, 100, 1);
      const more = profileLayout(long.extent, 10, narrow, 100, lines.length);
      expect(more.plot.top - one.plot.top).toBe(16 * (lines.length - 1));
    }
  });

  it('highlightLayer(data, a, index) rings the station at toScreen(a, its x, y)', () => {
    const [lon, lat] = toLonLat(500_000, 2_723_000);
    const s: Station[] = [0, 1, 2].map((i) => ({ id: `S${i}`, row: i + 1, kind: 'bedding', lon: lon + 0.001 * i, lat, elevation: 700 + 10 * i, plane: { dipDirection: 90, dip: 30 }, source: {}, problems: [] }));
    const data = buildProfileData({ stations: s, axis: { trend: 0, plunge: 20 } });
    const a = { sx: 2, tx: 100, sy: -2, ty: 300 };
    const ring = highlightLayer(data, a, 2).items[0] as ScenePath;
    const [X, Y] = toScreen(a, data.stations.xy[4], data.stations.xy[5]);
    const [, mx, my] = ring.d.match(/^M([-\d.]+) ([-\d.]+)A/)!.map(Number);
    expectClose(mx - 9, X, 0.06, 'ring centre x');
    expectClose(my, Y, 0.06, 'ring centre y');
    expect(highlightLayer(data, a, 7).items).toHaveLength(0);
  });

  it('stationsLayer draws every station\'s tick centred on toScreen(a, x, y) (one path for all)', () => {
    const [lon, lat] = toLonLat(500_000, 2_723_000);
    const s: Station[] = Array.from({ length: 5 }, (_, i) => ({ id: `S${i}`, row: i + 1, kind: 'bedding', lon: lon + 0.002 * i, lat: lat + 0.001 * i, elevation: 700, plane: { dipDirection: 40 * i, dip: 10 + 15 * i }, source: {}, problems: [] }));
    const data = buildProfileData({ stations: s, axis: { trend: 75, plunge: 12 } });
    const a = fitAffine(data.extent, { left: 0, top: 0, width: 600, height: 300 });
    const ticks = stationsLayer(data, a, 'layer', DEFAULT_PROFILE_SHOW).items.filter((i) => i.name === 'ticks') as ScenePath[];
    expect(ticks).toHaveLength(1);
    const segments = [...ticks[0].d.matchAll(/M([-\d.]+) ([-\d.]+)L([-\d.]+) ([-\d.]+)/g)].map((m) => m.slice(1).map(Number));
    expect(segments).toHaveLength(5);
    segments.forEach(([x0, y0, x1, y1], k) => {
      const [X, Y] = toScreen(a, data.stations.xy[2 * k], data.stations.xy[2 * k + 1]);
      expectClose((x0 + x1) / 2, X, 0.1, `tick ${k} centre x`);
      expectClose((y0 + y1) / 2, Y, 0.1, `tick ${k} centre y`);
    });
  });
});

describe('text and export never show NaN', () => {
  const bad = /NaN|Infinity|undefined/;

  it('every text, path and export of random profiles holds no NaN, Infinity or undefined (property)', () => {
    const [lon0, lat0] = toLonLat(500_000, 2_723_000);
    const stationArb = fc.record({
      dx: fc.double({ min: -0.02, max: 0.02, noNaN: true }),
      dy: fc.double({ min: -0.02, max: 0.02, noNaN: true }),
      elevation: fc.option(fc.double({ min: -100, max: 3000, noNaN: true }), { nil: undefined }),
      dd: fc.double({ min: 0, max: 359.99, noNaN: true }),
      dip: fc.double({ min: 0, max: 90, noNaN: true }),
      isLine: fc.boolean(),
    });
    fc.assert(
      fc.property(
        fc.array(stationArb, { maxLength: 12 }),
        fc.double({ min: 0, max: 359.99, noNaN: true }),
        fc.double({ min: 0, max: 90, noNaN: true }),
        fc.constantFrom('down-plunge', 'section', 'ring'),
        fc.constantFrom<ColourBy>('layer', 'distance'),
        fc.constantFrom(1, 2, 5),
        fc.double({ min: 0.5, max: 50, noNaN: true }),
        (raw, trend, plunge, mode, colourBy, ve, k) => {
          const stations: Station[] = raw.map((r, i) => ({
            id: `R-${i}`,
            row: i + 1,
            kind: r.isLine ? 'hinge' : 'bedding',
            lon: lon0 + r.dx,
            lat: lat0 + r.dy,
            ...(r.elevation !== undefined && { elevation: r.elevation }),
            ...(r.isLine ? { line: { trend: r.dd, plunge: r.dip } } : { plane: { dipDirection: r.dd, dip: r.dip } }),
            source: {},
            problems: [],
          }));
          // A section needs an axis that crosses it: trend within 45° of the section's normal, plunge under 80.
          const section = mode === 'section' ? { line: [toLonLat(499_000, 2_723_000), toLonLat(501_000, 2_723_000)] as [number, number][], swath: 3000 } : undefined;
          const axis = section ? { trend: (trend % 90) - 45 + 360, plunge: Math.min(plunge, 80) } : { trend, plunge };
          const ring = mode === 'ring' ? ([[lon0 - 0.01, lat0 - 0.01], [lon0 + 0.01, lat0 - 0.01], [lon0, lat0 + 0.01]] as [number, number][]) : undefined;
          const data = buildProfileData({ stations, axis, ...(section && { section }), ...(ring && { ring }), label: 'Random' });
          const { layers, layout } = scene(data, section ? ve : 1, colourBy, { k, x: 10, y: -5 });
          const texts: string[] = [];
          for (const l of layers) for (const item of l.items) texts.push(item.type === 'text' ? item.text : `${item.d} ${item.title ?? ''} ${item.stroke ?? ''}`);
          for (const r of profileRows(data, ve)) texts.push(r.text, r.reason ?? '');
          texts.push(profileAriaLabel(data, ve), ...profileTitleBlock(data, '', '2025-06-01', ve).map((l) => l.text));
          texts.push(profileSceneToSvg(layers, { layout, label: profileAriaLabel(data, ve), titleBlock: profileTitleBlock(data, '', '2025-06-01', ve) }));
          for (const t of texts) if (bad.test(t)) throw new Error(`"${t.slice(0, 200)}" holds ${t.match(bad)![0]}`);
          return true;
        },
      ),
      { numRuns: 60 },
    );
  });

  it('scene(null) (no data yet) says so and holds no NaN', () => {
    const { layers, layout } = scene(null, 1, 'layer');
    const svg = profileSceneToSvg(layers, { layout, label: profileAriaLabel(null, 1) });
    expect(svg).toContain('Profile: no data yet');
    expect(svg).not.toMatch(bad);
  });

  it('profileSceneToSvg writes a standalone SVG with the caution, the date, escaped data text, and no script, handler, style sheet or link', () => {
    const base = korvane();
    const data: ProfileData = { ...base, label: `West ${XSS}`, lines: [...base.lines, { ...base.lines[0], name: `Contact ${XSS}` }] };
    const { layers, layout } = scene(data, 1, 'layer');
    const svg = profileSceneToSvg(layers, { layout, label: profileAriaLabel(data, 1), titleBlock: profileTitleBlock(data, '', '2025-06-01', 1) });
    expect(svg.startsWith('<svg xmlns="http://www.w3.org/2000/svg"')).toBe(true);
    expect(svg.trimEnd().endsWith('</svg>')).toBe(true);
    expect(svg).not.toMatch(/<script|<style|<foreignObject|<img|<iframe|<a[\s>]|javascript:/i);
    // Attribute names of every tag (values are double-quoted and hold no raw quote): none is an event handler.
    const attributes = [...svg.matchAll(/<[A-Za-z][\w:-]*((?:\s+[^\s=/>]+="[^"]*")*)\s*\/?>/g)].flatMap((m) => [...m[1].matchAll(/\s([^\s=]+)="/g)].map((a) => a[1]));
    expect((svg.match(/<[A-Za-z]/g) ?? []).length).toBe([...svg.matchAll(/<[A-Za-z][\w:-]*((?:\s+[^\s=/>]+="[^"]*")*)\s*\/?>/g)].length);
    expect(attributes.filter((n) => /^on/i.test(n))).toEqual([]);
    expect(svg).not.toMatch(/href=/i);
    expect(svg).toContain(escapeXml(`Contact ${XSS}`));
    expect(svg).toContain(escapeXml(`West ${XSS}`));
    expect(svg.split('<g ').length).toBe(svg.split('</g>').length);
    const text = svg.replace(/<[^>]+>/g, ' ').replace(/\s+/g, ' ');
    expect(text).toContain(PROFILE_CAUTION);
    expect(text).toContain('exported 2025-06-01');
    expect(text).toContain('Method: Down-plunge projection');
    expect(text).toContain('fold axis 075/12 (true north)');
  });

  it('profileTitleBlock names stations left out for want of a height', () => {
    const [lon, lat] = toLonLat(500_000, 2_723_000);
    const data = buildProfileData({ stations: [{ id: 'KR-77', row: 78, kind: 'bedding', lon, lat, plane: { dipDirection: 1, dip: 2 }, source: {}, problems: [] }], axis: { trend: 75, plunge: 12 } });
    const block = profileTitleBlock(data, 'Here', '2025-06-01', 1).map((l) => l.text).join(' ');
    expect(block).toContain('Left out for want of a height (1): station KR-77 (row 78)');
  });
});
