import { readFileSync } from 'node:fs';
import { beforeAll, describe, expect, it } from 'vitest';
import proj4 from 'proj4';
import type { FeatureCollection } from 'geojson';
import { buildProfileData, viewText } from '../../src/map/profileData';
import { profileScatter } from '../../src/core/profileScatter';
import type { Station } from '../../src/core/station';
import { lineToVector, poleOf } from '../../src/core/vectors';
import { readDem } from '../../src/io/dem';
import type { Dem } from '../../src/io/demSampler';
import { readCsv } from '../../src/io/csvTable';
import { detectColumns } from '../../src/io/columns';
import { readStations } from '../../src/io/readStations';
import truth from '../../sample-maps/korvane/truth.json';
import { expectClose } from '../helpers/tolerance';

/**
 * buildProfileData against outside answers: the SYNTHETIC Korvane sample map (its generator's
 * UTM coordinates in stations.csv and its planted axes in truth.json), proj4 for positions
 * (a general-purpose reference library), and analytic geometry for sections.
 */

const UTM33 = '+proj=utm +zone=33 +datum=WGS84 +units=m +no_defs';
const toLonLat = (e: number, n: number): [number, number] => proj4(UTM33, 'WGS84', [e, n]) as [number, number];
const toUtm = (lon: number, lat: number): [number, number] => proj4('WGS84', UTM33, [lon, lat]) as [number, number];
const rad = (d: number): number => (d * Math.PI) / 180;

const west = truth.domains.find((d) => d.id === 'west')!;
const ring = west.polygon as [number, number][];
let dem: Dem;
let stations: Station[];
let contacts: FeatureCollection;
let faults: FeatureCollection;

beforeAll(async () => {
  dem = await readDem(readFileSync('sample-maps/korvane/dem.tif'), { source: 'dem.tif' });
  const table = readCsv(readFileSync('sample-maps/korvane/stations.csv', 'utf8'));
  stations = readStations(table, detectColumns(table.headers).mapping);
  contacts = JSON.parse(readFileSync('sample-maps/korvane/contacts.geo.json', 'utf8')) as FeatureCollection;
  faults = JSON.parse(readFileSync('sample-maps/korvane/faults.geo.json', 'utf8')) as FeatureCollection;
});

function station(id: string, row: number, lon: number, lat: number, extra: Partial<Station>): Station {
  return { id, row, kind: 'bedding', lon, lat, source: {}, problems: [], ...extra };
}

describe('buildProfileData({ring}) down the plunge on the Korvane sample map', () => {
  it('buildProfileData places every west-domain station at x\' = E cos t - N sin t, y\' = (E sin t + N cos t) sin p + h cos p of its generator UTM position (REFERENCES.md "Profiles")', () => {
    const data = buildProfileData({ stations, dem, axis: west.axis, ring });
    expect(data.stations.index.length).toBeGreaterThan(100);
    // The planted grid axis (truth.json axisGrid); the frame's convergence differs from truth's by under 0.002°.
    const t = rad(west.axisGrid.trend);
    const p = rad(west.axisGrid.plunge);
    let checked = 0;
    data.stations.index.forEach((i, k) => {
      const row = stations[i].source; // the CSV's own columns, as read
      const e = Number(row.easting) - data.frame.originEasting;
      const n = Number(row.northing) - data.frame.originNorthing;
      const h = Number(row.elevation_m);
      if (!Number.isFinite(e) || !Number.isFinite(n) || !Number.isFinite(h)) return;
      // Tolerance: eastings are whole metres in the CSV, lon/lat 6 decimals (0.1 m), 0.002° of trend over 3 km (0.1 m).
      expectClose(data.stations.xy[2 * k], e * Math.cos(t) - n * Math.sin(t), 0.8, `${stations[i].id} x'`);
      expectClose(data.stations.xy[2 * k + 1], (e * Math.sin(t) + n * Math.cos(t)) * Math.sin(p) + h * Math.cos(p), 0.8, `${stations[i].id} y'`);
      expectClose(data.stations.along[k], (e * Math.sin(t) + n * Math.cos(t)) * Math.cos(p) - h * Math.sin(p), 0.8, `${stations[i].id} along`);
      checked++;
    });
    expect(checked).toBe(data.stations.index.length);
  });

  it('buildProfileData gives each plane a tick at right angles to its pole as projected onto the profile (derived: the trace lies in the plane)', () => {
    const data = buildProfileData({ stations, dem, axis: west.axis, ring });
    const t = rad(west.axis.trend);
    const p = rad(west.axis.plunge);
    const u = [Math.cos(t), -Math.sin(t), 0];
    const v = [Math.sin(p) * Math.sin(t), Math.sin(p) * Math.cos(t), Math.cos(p)];
    let planes = 0;
    data.stations.index.forEach((i, k) => {
      const plane = stations[i].plane;
      if (!plane) {
        expect(Number.isNaN(data.stations.tick[2 * k])).toBe(true);
        return;
      }
      const nd = lineToVector(poleOf(plane)); // north-east-down
      const n = [nd.y, nd.x, -nd.z];
      const nu = n[0] * u[0] + n[1] * u[1];
      const nv = n[0] * v[0] + n[1] * v[1] + n[2] * v[2];
      expectClose(data.stations.tick[2 * k] * nu + data.stations.tick[2 * k + 1] * nv, 0, 1e-9, `${stations[i].id} tick · pole`);
      planes++;
    });
    expect(planes).toBeGreaterThan(50);
  });

  it('buildProfileData lines up the west Vardel/Quennet contact on one curve down the planted axis (profileScatter under 0.5 m) and not 5° off it (3 times larger)', () => {
    // truth.json: the planted west axis; profileScatter.ts: radius 100 m as in tests/core/downPlungeSampleMap.test.ts.
    const scatter = (trend: number): number => {
      const data = buildProfileData({ stations: [], contacts, dem, axis: { trend, plunge: west.axis.plunge }, ring });
      const layer = data.lines.find((l) => l.name === 'Vardel Limestone / Quennet Sandstone contact')!;
      const xy = new Float64Array((layer.xyd.length / 3) * 2);
      for (let k = 0; k < xy.length / 2; k++) [xy[2 * k], xy[2 * k + 1]] = [layer.xyd[3 * k], layer.xyd[3 * k + 1]];
      return profileScatter(xy, { radius: 100 });
    };
    const right = scatter(west.axis.trend);
    expect(right).toBeLessThan(0.5);
    expect(scatter(west.axis.trend + 5)).toBeGreaterThan(3 * right);
    expect(scatter(west.axis.trend - 5)).toBeGreaterThan(3 * right);
  });

  it('buildProfileData groups contacts by name in order of first appearance and the fault as one layer, keeping only what is inside the ring', () => {
    const data = buildProfileData({ stations, contacts, faults, dem, axis: west.axis, ring });
    const names = data.lines.map((l) => l.name);
    // First appearance in contacts.geo.json among the west domain's features (the ring is the west domain).
    const fileOrder = [...new Set(contacts.features.filter((f) => f.properties?.domain === 'west').map((f) => String(f.properties?.name)))];
    expect(data.lines.filter((l) => l.kind === 'contact').map((l) => l.name)).toEqual(fileOrder);
    expect(new Set(names).size).toBe(names.length);
    // The Kell Fault is the west domain's east edge (truth.json), so it is not inside the ring; over the whole map it is one layer.
    const all = buildProfileData({ stations: [], contacts, faults, dem, axis: west.axis });
    expect(all.lines.filter((l) => l.kind === 'fault').map((l) => l.name)).toEqual(['Faults']);
    expect(all.lines.filter((l) => l.kind === 'contact').map((l) => l.order)).toEqual([0, 1, 2, 3]);
    expect(data.counts.verticesDrawn).toBeLessThan(data.counts.vertices);
    expect(data.mode).toBe('down-plunge');
    expect(data.view).toBe('Looking down-plunge toward 075°, plunge 12°');
  });
});

describe('buildProfileData({section}) along the plunge', () => {
  // At easting 500 000 m (zone 33's central meridian, lon 15°) grid and true north agree, so the
  // axis 000/30 is 000/30 on the grid too; an east-west section through northing 2 723 000.
  const line = [toLonLat(499_500, 2_723_000), toLonLat(500_500, 2_723_000)];

  it('buildProfileData places a station 200 m north of the section at its along-plunge meeting point: same easting, 200·tan 30° higher (derived: a line meets a plane)', () => {
    const [lon, lat] = toLonLat(500_000, 2_723_200);
    const s = [station('P-1', 1, lon, lat, { elevation: 800, plane: { dipDirection: 90, dip: 30 } })];
    const data = buildProfileData({ stations: s, axis: { trend: 0, plunge: 30 }, section: { line, swath: 500 } });
    expect(data.mode).toBe('section');
    expectClose(data.stations.xy[0], 500, 0.01, 'distance along the section');
    expectClose(data.stations.xy[1], 800 + 200 * Math.tan(rad(30)), 0.01, 'elevation at the section');
    // It lies 200 / cos 30° down the plunge from the section (it was moved that far up the plunge to meet it).
    expectClose(data.stations.along[0], 200 / Math.cos(rad(30)), 0.01, 'distance down-plunge of the section');
    // A plane dipping 30° east in an east-west section: apparent dip = true dip, down toward the end.
    expectClose(data.stations.tickAngle[0], 30, 1e-6, 'apparent dip');
    expectClose(data.stations.tick[0], Math.cos(rad(30)), 1e-9, 'tick dx');
    expectClose(data.stations.tick[1], -Math.sin(rad(30)), 1e-9, 'tick dy');
    expectClose(data.section!.length, 1000, 0.01, 'section length');
    expectClose(data.section!.azimuths[0], 90, 1e-3, 'section azimuth');
    // Apparent plunge of an axis at right angles to the section: vertical (apparentDip.ts).
    expectClose(Math.abs(data.section!.axisApparentPlunge[0]), 90, 1e-3, 'axis apparent plunge');
  });

  it('buildProfileData leaves stations beyond the swath out and says so', () => {
    const far = toLonLat(500_000, 2_724_000);
    const near = toLonLat(500_100, 2_723_100);
    const s = [station('FAR', 1, far[0], far[1], { elevation: 800, plane: { dipDirection: 0, dip: 10 } }), station('NEAR', 2, near[0], near[1], { elevation: 800, kind: 'hinge', line: { trend: 0, plunge: 30 } })];
    const data = buildProfileData({ stations: s, axis: { trend: 0, plunge: 30 }, section: { line, swath: 300 } });
    expect(Array.from(data.stations.index)).toEqual([1]);
    expect(Number.isNaN(data.stations.tick[0])).toBe(true);
    expect(data.counts.outsideSwath).toBe(1);
    expect(data.notes.join(' ')).toContain('farther than 300 m from the section line');
    expect(data.notes.join(' ')).toContain('no ground line');
  });

  it('buildProfileData samples the ground line along a Korvane section from the DEM, as many points as sectionSamples gives', () => {
    const [e0, n0] = west.profile.originUtm;
    const section = [toLonLat(e0 - 800, n0 + 1500), toLonLat(e0 + 300, n0 - 1500)];
    const data = buildProfileData({ stations, contacts, dem, axis: west.axis, ring, section: { line: section, swath: 400 } });
    const g = data.topography!;
    expect(g.length / 2).toBeGreaterThan(100);
    // truth.json: the DEM spans 670 to 972 m.
    for (let k = 1; k < g.length; k += 2) {
      expect(g[k]).toBeGreaterThanOrEqual(670 - 1e-6);
      expect(g[k]).toBeLessThanOrEqual(972 + 1e-6);
    }
    expect(data.stations.index.length).toBeGreaterThan(0);
  });
});

describe('buildProfileData: what is left out is named', () => {
  const lon = 15;
  const lat = 24.62;

  it('buildProfileData names a station with no elevation and no DEM, and does not draw it', () => {
    const s = [station('KR-9', 9, lon, lat, { plane: { dipDirection: 10, dip: 20 } }), station('KR-10', 10, lon + 0.001, lat, { elevation: 700, plane: { dipDirection: 10, dip: 20 } })];
    const data = buildProfileData({ stations: s, axis: { trend: 75, plunge: 12 } });
    expect(Array.from(data.stations.index)).toEqual([1]);
    expect(data.counts.noHeight).toBe(1);
    expect(data.noHeight).toHaveLength(1);
    expect(data.noHeight[0]).toContain('station KR-9 (row 9)');
    expect(data.noHeight[0]).toContain('no DEM');
  });

  it('buildProfileData names usable stations without a location', () => {
    const s = [station('NOWHERE', 3, Number.NaN, Number.NaN, { lon: undefined, lat: undefined, elevation: 700, plane: { dipDirection: 10, dip: 20 } })];
    const data = buildProfileData({ stations: s, axis: { trend: 75, plunge: 12 }, ring: [[14.99, 24.61], [15.01, 24.61], [15.01, 24.63], [14.99, 24.63]] });
    expect(data.counts.noLocation).toBe(1);
    expect(data.notes[0]).toContain('NOWHERE');
  });

  it('buildProfileData cuts a line where it leaves the ring and inserts the crossing points on the ring\'s edge (axis 000/90: the profile is the map, x\' = E, y\' = N)', () => {
    const square: [number, number][] = [[14.99, 24.61], [15.01, 24.61], [15.01, 24.63], [14.99, 24.63], [14.99, 24.61]];
    const fc: FeatureCollection = {
      type: 'FeatureCollection',
      features: [{ type: 'Feature', properties: { name: 'Test contact' }, geometry: { type: 'LineString', coordinates: [[15.0, 24.615, 700], [15.005, 24.616, 700], [15.02, 24.618, 700], [15.005, 24.622, 700], [15.0, 24.623, 700]] } }],
    };
    const data = buildProfileData({ stations: [], contacts: fc, axis: { trend: 0, plunge: 90 }, ring: square });
    const l = data.lines[0];
    expect(Array.from(l.runStarts)).toEqual([0, 3, 6]);
    expect(l.vertices).toBe(4);
    expect(l.edgePoints).toBe(2);
    // The leaving point: on lon 15.01 between (15.005, 24.616) and (15.02, 24.618), interpolated in lon/lat.
    const [e, n] = toUtm(15.01, 24.616 + (0.002 * 0.005) / 0.015);
    expectClose(l.xyd[6] + data.frame.originEasting, e, 0.01, 'edge point easting');
    expectClose(l.xyd[7] + data.frame.originNorthing, n, 0.01, 'edge point northing');
    expect(data.counts.verticesInArea).toBe(4);
  });

  const bad: { name: string; input: () => Parameters<typeof buildProfileData>[0]; message: RegExp }[] = [
    { name: 'a ring of two positions', input: () => ({ stations: [], axis: { trend: 0, plunge: 10 }, ring: [[15, 24], [15.1, 24]] }), message: /the area ring has 2 distinct positions; an area needs at least 3/ },
    { name: 'a ring position that is not lon/lat', input: () => ({ stations: [], axis: { trend: 0, plunge: 10 }, ring: [[15, 24], [500000, 2723000], [15.1, 24.1]] }), message: /area ring, position 2: \[500000,2723000\] is not \[longitude, latitude\]/ },
    { name: 'a section vertex that is not a number', input: () => ({ stations: [], axis: { trend: 0, plunge: 10 }, section: { line: [[15, 24], [Number.NaN, 24]] } }), message: /section line, position 2/ },
    { name: 'a plunge of 95', input: () => ({ stations: [], axis: { trend: 0, plunge: 95 } }), message: /plunge 95 is not a plunge/ },
    { name: 'a swath of 0', input: () => ({ stations: [], axis: { trend: 0, plunge: 10 }, section: { line: [[15, 24], [15.01, 24]], swath: 0 } }), message: /section swath 0 is not a half-width/ },
    { name: 'an axis in the plane of the section', input: () => ({ stations: [], axis: { trend: 90, plunge: 10 }, section: { line: [[15, 24], [15.01, 24]] } }), message: /draw the section across the trend of the axis/ },
    {
      name: 'a DEM that names no CRS',
      input: () => ({ stations: [], axis: { trend: 0, plunge: 10 }, dem: { width: 1, height: 1, values: new Float32Array([1]), x0: 0, y0: 0, dx: 1, dy: 1, noData: null, source: 'x.tif' } }),
      message: /x\.tif names no CRS; pass it as demCrs/,
    },
  ];
  for (const row of bad) {
    it(`buildProfileData refuses ${row.name} with a message naming it`, () => {
      expect(() => buildProfileData(row.input())).toThrow(row.message);
    });
  }

  it('viewText(axis, section) says which way the view looks', () => {
    expect(viewText({ trend: 74.994, plunge: 12 }, null)).toBe('Looking down-plunge toward 075°, plunge 12°');
    // Derived: a line drawn start-left to end-right runs along the viewer's right hand, so the
    // viewer faces 90° anticlockwise of it (a section toward 150° is seen looking toward 060°).
    expect(viewText({ trend: 75, plunge: 12 }, { azimuths: [150] })).toBe('Vertical section along 150°, looking toward 060°; axis 075/12 projected along the plunge');
    expect(viewText({ trend: 75, plunge: 12 }, { azimuths: [30] })).toMatch(/^Vertical section along 030°, looking toward 300°;/);
  });
});
