import { readFileSync } from 'node:fs';
import { beforeAll, describe, expect, it } from 'vitest';
import { projectDownPlunge } from '../../src/core/downPlunge';
import { profileScatter } from '../../src/core/profileScatter';
import { builtInCrs } from '../../src/io/crs';
import { readDem } from '../../src/io/dem';
import type { Dem } from '../../src/io/demSampler';
import { lineworkHeights } from '../../src/io/elevations';
import { chooseLocalFrame, gridAxis, lonLatToLocal } from '../../src/io/localFrame';
import { readLinework, type LineworkFeature } from '../../src/io/readLinework';
import truth from '../../sample-maps/korvane/truth.json';

/**
 * The SYNTHETIC Korvane sample map (sample-maps/korvane): contact traces of one domain projected
 * down the planted axis. truth.json documents the geometry: in each domain's profile frame
 * (origin O), contact k is the curve F = v - h(u - shear·v) + offset = level_k with
 * h(xi) = A asin(r sin(2π xi/λ + phase)) / asin(r). That curve is the outside answer here; the
 * contacts were traced on the DEM grid by the generator (d3-contour), so they lie on the DEM
 * to within the interpolation error of a cell.
 */

type Domain = (typeof truth.domains)[number];
const domain = (id: string): Domain => truth.domains.find((d) => d.id === id)!;
const CRS = builtInCrs(truth.crs.epsg)!;

let dem: Dem;
let contacts: LineworkFeature[];
beforeAll(async () => {
  dem = await readDem(readFileSync('sample-maps/korvane/dem.tif'), { source: 'dem.tif' });
  contacts = readLinework(readFileSync('sample-maps/korvane/contacts.geo.json', 'utf8'));
});

/** All vertices of one contact in one domain, as east-north-up metres from the domain's origin O. */
function contactPoints(domainId: string, level: number): Float64Array {
  const heights = lineworkHeights(contacts, { dem, crs: CRS });
  expect(heights.missing).toEqual([]);
  const lonLat: number[] = [];
  const z: number[] = [];
  contacts.forEach((f, i) => {
    if (f.properties.domain !== domainId || f.properties.level !== level) return;
    f.parts.forEach((p, k) => {
      lonLat.push(...p.lonLat);
      z.push(...heights.heights[i][k]);
    });
  });
  const frame = chooseLocalFrame(lonLat, CRS);
  const xyz = lonLatToLocal(frame, lonLat, z);
  const o = domain(domainId).profile.originUtm;
  for (let i = 0; i < z.length; i++) {
    xyz[3 * i] -= o[0] - frame.originEasting;
    xyz[3 * i + 1] -= o[1] - frame.originNorthing;
    xyz[3 * i + 2] -= o[2];
  }
  return xyz;
}

/** Residuals F - level of projected points against truth.json's curve. */
function curveResiduals(d: Domain, level: number, profile: Float64Array): { rms: number; max: number } {
  const p = d.profile;
  const h = (xi: number): number => (p.amplitude * Math.asin(p.r * Math.sin((2 * Math.PI * xi) / p.wavelength + (p.phaseDeg * Math.PI) / 180))) / Math.asin(p.r);
  let sum = 0;
  let max = 0;
  const n = profile.length / 3;
  for (let i = 0; i < n; i++) {
    const u = profile[3 * i];
    const v = profile[3 * i + 1];
    const e = v - h(u - p.shear * v) + p.offset - level;
    sum += e * e;
    max = Math.max(max, Math.abs(e));
  }
  return { rms: Math.sqrt(sum / n), max };
}

const xyOf = (profile: Float64Array): Float64Array => profile.filter((_, i) => i % 3 !== 2);
const off = (axis: { trend: number; plunge: number }, dTrend: number) => ({ trend: axis.trend + dTrend, plunge: axis.plunge });

describe('Korvane sample map: contacts projected down the planted axis', () => {
  // Frame and axis: the planted grid axes are 075/12 and 100/18 (truth.json axisGrid).
  it('gridAxis(chooseLocalFrame(Korvane contacts), true axis) gives the planted grid axis of truth.json within 0.002°', () => {
    for (const d of truth.domains) {
      const lonLat = d.polygon.flat();
      const frame = chooseLocalFrame(lonLat, CRS);
      const g = gridAxis(frame, d.axis);
      expect(Math.abs(g.trend - d.axisGrid.trend)).toBeLessThan(0.002);
      expect(g.plunge).toBe(d.axisGrid.plunge);
    }
  });

  for (const d of truth.domains) {
    for (const c of truth.stratigraphy.contacts) {
      it(`projectDownPlunge(${d.id} ${c.unitBelow}/${c.unitAbove} contact, axis ${d.axisGrid.trend}/${d.axisGrid.plunge}) lies on the documented profile curve (RMS under 0.8 m, worst under 3 m), and 5° off it does not (RMS over 30 m)`, () => {
        const xyz = contactPoints(d.id, c.level);
        expect(xyz.length).toBeGreaterThan(3 * 50);
        const right = curveResiduals(d, c.level, projectDownPlunge(xyz, d.axisGrid));
        // Stated tolerance: contacts are interpolated linearly on the 40 m DEM grid and rounded to 1e-6° (about 0.1 m).
        expect(right.rms).toBeLessThan(0.8);
        expect(right.max).toBeLessThan(3);
        for (const wrong of [off(d.axisGrid, 5), off(d.axisGrid, -5)]) {
          expect(curveResiduals(d, c.level, projectDownPlunge(xyz, wrong)).rms).toBeGreaterThan(30);
        }
      });
    }
  }

  // The scatter measure needs no truth, but sees a wrong axis only where pieces of one trace that
  // lie at different depths cover the same stretch of the profile (see profileScatter.ts). In these
  // two contacts the trace crosses valleys and outcrops in separate pieces; the others cross the
  // fold train about once and so look smooth down any axis.
  const cases = [
    { domain: 'west', level: 150, name: 'Vardel Limestone / Quennet Sandstone' },
    { domain: 'east', level: -450, name: 'Oskaran Quartzite / Tamsel Siltstone' },
  ];
  for (const k of cases) {
    it(`profileScatter of the ${k.domain} ${k.name} contact is under 0.5 m down the planted axis and at least 3 times larger 5° off it`, () => {
      const d = domain(k.domain);
      const xyz = contactPoints(k.domain, k.level);
      const radius = 100;
      const right = profileScatter(xyOf(projectDownPlunge(xyz, d.axisGrid)), { radius });
      expect(right).toBeLessThan(0.5);
      for (const wrong of [off(d.axisGrid, 5), off(d.axisGrid, -5)]) {
        expect(profileScatter(xyOf(projectDownPlunge(xyz, wrong)), { radius })).toBeGreaterThan(3 * right);
      }
    });
  }
});
