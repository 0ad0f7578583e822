import { readFileSync } from 'node:fs';
import { beforeAll, describe, expect, it } from 'vitest';
import { partitionAxisField } from '../../../src/core/consistency/domainBoundaries';
import { localAxisField } from '../../../src/core/consistency/localAxisField';
import { profileCoherence, searchMapAxis, traceScatter } from '../../../src/core/consistency/mapPatternAxis';
import { compareWithMeasured, predictAttitudes } from '../../../src/core/consistency/predictedAttitudes';
import { checkClosures } from '../../../src/core/consistency/closures';
import { foldInputFromStations } from '../../../src/core/foldInput';
import { angleBetweenLines } from '../../../src/core/geometry';
import { fitGirdleToPlanes } from '../../../src/core/girdle';
import { pointInRing } from '../../../src/core/polygon';
import { isUsable, type Station } from '../../../src/core/station';
import { planeNormal } from '../../../src/core/vectors';
import { detectColumns } from '../../../src/io/columns';
import { builtInCrs } from '../../../src/io/crs';
import { readCsv } from '../../../src/io/csvTable';
import { readDem } from '../../../src/io/dem';
import { lineworkHeights } from '../../../src/io/elevations';
import { chooseLocalFrame, gridAxis, lonLatToLocal, type LocalFrame } from '../../../src/io/localFrame';
import { readLinework, type LineworkFeature } from '../../../src/io/readLinework';
import { readStations } from '../../../src/io/readStations';
import truth from '../../../sample-maps/korvane/truth.json';

/**
 * The SYNTHETIC Korvane sample map (sample-maps/korvane): two exactly cylindrical domains with axes
 * 075/12 (west) and 100/18 (east), 24.87° apart, meeting at the Kell Fault (truth.json). The
 * planted geometry is the outside answer.
 */
const CRS = builtInCrs(truth.crs.epsg)!;
type Domain = (typeof truth.domains)[number];

let frame: LocalFrame;
let stations: Station[];
let contacts: LineworkFeature[];
let contactHeights: ReturnType<typeof lineworkHeights>;

beforeAll(async () => {
  const dem = await readDem(readFileSync('sample-maps/korvane/dem.tif'), { source: 'dem.tif' });
  contacts = readLinework(readFileSync('sample-maps/korvane/contacts.geo.json', 'utf8'));
  contactHeights = lineworkHeights(contacts, { dem, crs: CRS });
  const table = readCsv(readFileSync('sample-maps/korvane/stations.csv', 'utf8'));
  stations = readStations(table, detectColumns(table.headers).mapping).filter(isUsable);
  frame = chooseLocalFrame(truth.domains.flatMap((d) => d.polygon.flat()), CRS);
});

const local = (lon: number, lat: number): [number, number] => {
  const p = lonLatToLocal(frame, [lon, lat], [0]);
  return [p[0], p[1]];
};
const inDomain = (d: Domain, s: Station): boolean => pointInRing(s.lon!, s.lat!, d.polygon.flat());

/** The fault trace in frame metres, and the distance of a point from it. */
function faultDistance(x: number, y: number): number {
  const [[e0, n0], [e1, n1]] = truth.fault.traceUtm;
  const [ax, ay] = [e0 - frame.originEasting, n0 - frame.originNorthing];
  const [bx, by] = [e1 - frame.originEasting, n1 - frame.originNorthing];
  return Math.abs((x - ax) * (by - ay) - (y - ay) * (bx - ax)) / Math.hypot(bx - ax, by - ay);
}

/** Trace points of one domain, one array per contact, in frame metres. */
function domainSurfaces(d: Domain): Float64Array[] {
  return truth.stratigraphy.contacts.map((c) => {
    const out: number[] = [];
    contacts.forEach((f, i) => {
      if (f.properties.domain !== d.id || f.properties.level !== c.level) return;
      f.parts.forEach((part, k) => out.push(...lonLatToLocal(frame, part.lonLat, contactHeights.heights[i][k])));
    });
    return Float64Array.from(out);
  });
}

describe('consistency checks on the Korvane sample map', () => {
  it('partitionAxisField(localAxisField(all Korvane bedding, k 20)) separates the two domains with axes within 1.5° of 075/12 and 100/18, the boundary within 650 m of the Kell Fault (median within 200 m)', () => {
    // Stated tolerance: 400 bedding readings over 24 km² put the 20th nearest reading about 640 m
    // from a node (median), so a window straddles the fault for up to about that far.
    expect(contactHeights.missing).toEqual([]);
    const input = foldInputFromStations(stations);
    const xy = new Float64Array(2 * input.planes.length);
    const poles = new Float64Array(3 * input.planes.length);
    Array.from(input.planeIds).forEach((i, k) => {
      xy.set(local(stations[i].lon!, stations[i].lat!), 2 * k);
      const v = planeNormal(input.planes[k]);
      poles.set([v.x, v.y, v.z], 3 * k);
    });
    const [minX, minY] = [truth.frame.eastingMin - frame.originEasting, truth.frame.northingMin - frame.originNorthing];
    const [maxX, maxY] = [truth.frame.eastingMax - frame.originEasting, truth.frame.northingMax - frame.originNorthing];
    const field = localAxisField(xy, poles, { nx: 60, ny: 40, k: 20, bounds: [minX, minY, maxX, maxY] });
    const partition = partitionAxisField(field, { angle: 10 });
    const big = [...partition.regions].sort((a, b) => b.nodes - a.nodes).slice(0, 2);
    expect(big[0].nodes + big[1].nodes).toBeGreaterThan(0.9 * 2400);
    const [west, east] = truth.domains;
    const westRegion = big.find((r) => angleBetweenLines(r.axis, west.axis) < 1.5);
    const eastRegion = big.find((r) => angleBetweenLines(r.axis, east.axis) < 1.5);
    expect(westRegion).toBeDefined();
    expect(eastRegion).toBeDefined();
    const distances: number[] = [];
    for (const b of partition.boundaries) {
      for (let i = 0; i < b.points.length; i += 2) {
        const [x, y] = [b.points[i], b.points[i + 1]];
        // Leave out vertices on the frame of the grid itself.
        if (x <= minX + 1 || x >= maxX - 1 || y <= minY + 1 || y >= maxY - 1) continue;
        distances.push(faultDistance(x, y));
      }
    }
    distances.sort((p, q) => p - q);
    expect(distances.length).toBeGreaterThan(20);
    expect(distances[distances.length >> 1]).toBeLessThan(200);
    expect(distances[distances.length - 1]).toBeLessThan(650);
  });

  for (const d of truth.domains) {
    it(`profileCoherence(${d.id} contacts, planted grid axis ${d.axisGrid.trend}/${d.axisGrid.plunge}) finds no tilted axis that does better`, () => {
      const c = profileCoherence(domainSurfaces(d), d.axisGrid, { radius: 100 });
      expect(c.atBest).toBe(true);
      expect(c.constrained).toBe(true);
      expect(c.contrast!).toBeGreaterThan(2);
    });
  }

  it('searchMapAxis(Korvane contacts, bedding pi axis) finds the east axis within 1° of 100/18 but the west one only within 5° of 075/12, along a line the west traces cannot resolve', () => {
    // What the traces can tell (profileScatter.ts): only pieces of one contact that overlap in the
    // profile at different depths constrain the axis. In the east they pin it; in the west they pin
    // it across one line of axes only, and along that line the scatter at the planted axis is
    // within 15% of the least found (seen: 0.182 against 0.165-0.172 m).
    for (const d of truth.domains) {
      const planes = foldInputFromStations(stations.filter((s) => inDomain(d, s))).planes;
      const pi = gridAxis(frame, fitGirdleToPlanes(planes).axis);
      const surfaces = domainSurfaces(d);
      const s = searchMapAxis(surfaces, pi, { radius: 100 });
      const off = angleBetweenLines(s.axis!, d.axisGrid);
      if (d.id === 'east') {
        expect(off).toBeLessThan(1);
      } else {
        expect(off).toBeLessThan(5);
        const atTruth = traceScatter(surfaces, d.axisGrid, { radius: 100 }).scatter!;
        expect(atTruth / s.scatter!).toBeLessThan(1.15);
        expect(s.weakestContrast!).toBeLessThan(2);
      }
      expect(s.constraint).not.toBe('none');
    }
  });

  it('checkClosures(Korvane contacts, planted axis, hinge senses and bedding of the domain) finds every judged closure pointing the right way, and every one wrong for the axis reversed', () => {
    // The planted folds are upright and the ground gentle (truth.json), so antiform closures point
    // down the plunge (common practice); the hinge readings carry the planted sense.
    for (const d of truth.domains) {
      const pieces = contacts.flatMap((f, i) => (f.properties.domain === d.id ? f.parts.map((part, k) => ({ surface: String(f.properties.name), xyz: lonLatToLocal(frame, part.lonLat, contactHeights.heights[i][k]) })) : []));
      const inside = stations.filter((s) => inDomain(d, s));
      const place = (s: Station) => {
        const [x, y] = local(s.lon!, s.lat!);
        return { x, y, id: s.id };
      };
      // Readings are referred to true north; the frame to grid north (true = grid + convergence).
      const planes = inside.filter((s) => s.kind === 'bedding').map((s) => ({ ...place(s), dipDirection: s.plane!.dipDirection - frame.convergence, dip: s.plane!.dip }));
      const lines = inside.filter((s) => s.line).map((s) => ({ ...place(s), trend: s.line!.trend - frame.convergence, plunge: s.line!.plunge, ...(s.line!.sense && { sense: s.line!.sense }) }));
      const right = checkClosures(pieces, d.axisGrid, { planes, lines });
      expect(right.judged).toBeGreaterThan(6);
      expect(right.disagreeing).toBe(0);
      expect(right.closures.some((c) => c.senseFrom === 'hinges')).toBe(true);
      const reversed = checkClosures(pieces, { trend: (d.axisGrid.trend + 180) % 360, plunge: d.axisGrid.plunge }, { planes, lines });
      expect(reversed.judged).toBeGreaterThan(6);
      expect(reversed.disagreeing).toBe(reversed.judged);
    }
  });

  it('compareWithMeasured(predictAttitudes(contacts, planted axis), bedding of the domain) agrees to a median under 8° in both domains', () => {
    // Stated tolerance: bedding within 150 m of a contact need not parallel it exactly (the folds
    // are similar, not parallel, folds: truth.json), and readings carry 2-5° of noise.
    for (const d of truth.domains) {
      const pieces: Float64Array[] = [];
      contacts.forEach((f, i) => {
        if (f.properties.domain !== d.id) return;
        f.parts.forEach((part, k) => pieces.push(lonLatToLocal(frame, part.lonLat, contactHeights.heights[i][k])));
      });
      const bedding = stations.filter((s) => s.kind === 'bedding' && inDomain(d, s));
      const measured = bedding.map((s) => {
        const [x, y] = local(s.lon!, s.lat!);
        // Readings are referred to true north; the frame to grid north (true = grid + convergence).
        return { x, y, dipDirection: s.plane!.dipDirection - frame.convergence, dip: s.plane!.dip, id: s.id };
      });
      const check = compareWithMeasured(predictAttitudes(pieces, d.axisGrid), measured);
      expect(check.comparisons.length).toBeGreaterThan(40);
      expect(check.medianAngle!).toBeLessThan(8);
    }
  });
});
