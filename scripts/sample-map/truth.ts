/**
 * truth.json: the documented right answer of the sample map — the planted fold axes, the
 * domains, the analytic geometry (enough to recompute every surface), noise and planted errors.
 */
import { axialAngle, lineToVector, normalToPlane } from '../../src/core/vectors';
import { normalizeAzimuth } from '../../src/core/math';
import { CONTACT_LEVELS, COUNTS, CRS, DISTRICT, FAULT, FRAME, FRAME_HEIGHT, FRAME_WIDTH, NOISE, SYNTHETIC_NOTICE, UNITS } from './district';
import { axialSurfaceNormal, toNed, type FoldDomain } from './fold';
import { DOMAIN_RINGS, LEVEL_AT_ORIGIN } from './domains';
import { gridAzimuthOfTrueNorth, localToUtm, utmToLonLat } from './crs';
import { localToLonLat, contactName } from './layers';
import { DEM_DESCRIPTION } from './geotiff';
import type { PlantedDefect } from './tables';
import type { DemGrid } from './terrain';

const r3 = (v: number): number => Math.round(v * 1000) / 1000;

/** The truth document (plain JSON). */
export type Truth = ReturnType<typeof makeTruth>;

/**
 * Builds truth.json for one generated district.
 * @example makeTruth(seed, domains, dem, planted, bounds).domains[0].axis // {trend: 75.0.., plunge: 12}
 */
export function makeTruth(seed: number, domains: readonly FoldDomain[], dem: DemGrid, planted: readonly PlantedDefect[], bounds: number[]) {
  let lo = Infinity;
  let hi = -Infinity;
  for (const v of dem.values) [lo, hi] = [Math.min(lo, v), Math.max(hi, v)];
  const domainTruth = domains.map((d) => {
    const [e, n] = localToUtm(d.origin[0], d.origin[1]);
    const gamma = gridAzimuthOfTrueNorth(e, n);
    const axial = normalToPlane(toNed(axialSurfaceNormal(d)));
    return {
      id: d.id,
      name: d.name,
      polygon: DOMAIN_RINGS[d.id].map(localToLonLat),
      polygonUtm: DOMAIN_RINGS[d.id].map(([x, y]) => localToUtm(x, y)),
      axis: { trend: r3(normalizeAzimuth(d.axisGrid.trend - gamma)), plunge: d.axisGrid.plunge },
      axisGrid: d.axisGrid,
      axialSurface: { dipDirection: r3(normalizeAzimuth(axial.dipDirection - gamma)), dip: r3(axial.dip) },
      gridAzimuthOfTrueNorthAtOrigin: Number(gamma.toFixed(5)),
      profile: {
        amplitude: d.amplitude,
        wavelength: d.wavelength,
        r: d.r,
        phaseDeg: d.phaseDeg,
        shear: d.shear,
        originUtm: [e, n, d.origin[2]],
        offset: d.offset,
        levelAtOrigin: LEVEL_AT_ORIGIN[d.id],
      },
    };
  });
  const [w, e] = domainTruth;
  return {
    synthetic: true,
    notice: SYNTHETIC_NOTICE,
    district: DISTRICT.name,
    seed,
    generator: 'scripts/make-sample-map.ts (npm run sample-map)',
    crs: { epsg: CRS.epsg, name: CRS.name, proj4: CRS.proj4 },
    azimuthReference:
      'Azimuths in the station files are referred to true north. The geometry is built on the UTM grid; grid convergence (under 0.02 degrees anywhere in the frame) was applied to every reading. axis/axialSurface below are true; axisGrid is the grid value.',
    frame: {
      eastingMin: FRAME.easting0,
      northingMin: FRAME.northing0,
      eastingMax: FRAME.easting0 + FRAME_WIDTH,
      northingMax: FRAME.northing0 + FRAME_HEIGHT,
      bounds,
    },
    dem: {
      file: 'dem.tif',
      description: DEM_DESCRIPTION,
      cols: dem.cols,
      rows: dem.rows,
      cellSize: dem.cell,
      pixelIsArea: true,
      topLeftCorner: [FRAME.easting0, FRAME.northing0 + FRAME_HEIGHT],
      minElevation: Math.round(lo * 100) / 100,
      maxElevation: Math.round(hi * 100) / 100,
    },
    geometry: {
      frame: 'East-north-up metres: P - O = (easting - E0, northing - N0, elevation - z0) with O = profile.originUtm of the domain.',
      profileFrame:
        'With the grid axis trend t and plunge p: u = (cos t, -sin t, 0) (profile right, looking down plunge), v = (sin p sin t, sin p cos t, cos p) (profile up); u = (P-O).u, v = (P-O).v.',
      profileCurve: 'h(xi) = amplitude * asin(r * sin(2 * pi * xi / wavelength + phaseDeg * pi / 180)) / asin(r)',
      stratigraphicHeight:
        'F = v - h(u - shear * v) + offset. Each bedding surface is a level set of F; F grows upward through the succession. The gradient of F is the bedding normal; it has no component along the axis, so each domain is exactly cylindrical.',
      contactSurface: 'Contact k is the surface F = level_k. Its elevation over a map point is the root z of F(x, y, z) = level_k (F increases with z).',
      hinges: 'Crest lines (antiforms) where sin(theta) = 1 and trough lines (synforms) where sin(theta) = -1, theta = 2 pi xi / wavelength + phase.',
    },
    domains: domainTruth,
    angleBetweenAxes: r3(axialAngle(lineToVector(w.axis), lineToVector(e.axis))),
    fault: {
      name: FAULT.name,
      traceUtm: [localToUtm(...FAULT.trace.from), localToUtm(...FAULT.trace.to)],
      traceLonLat: [localToLonLat(FAULT.trace.from), localToLonLat(FAULT.trace.to)],
      description: 'Steep fault; the west domain lies west of it. East side up. The domains meet along it with a sharp change of axis.',
    },
    stratigraphy: {
      units: UNITS.map((u, i) => ({
        code: u.code,
        name: u.name,
        lithology: u.lithology,
        colour: u.colour,
        order: i + 1,
        baseLevel: i === 0 ? null : CONTACT_LEVELS[i - 1],
        topLevel: i === UNITS.length - 1 ? null : CONTACT_LEVELS[i],
      })),
      contacts: CONTACT_LEVELS.map((level, k) => ({ name: contactName(k), unitBelow: UNITS[k].code, unitAbove: UNITS[k + 1].code, level })),
      thicknessNote:
        'Levels are stratigraphic heights measured along v. The true (perpendicular) thickness of a layer is the level difference divided by |grad F|: equal to it at the hinges and varying around the folds, as in similar folds.',
    },
    noise: { ...NOISE, note: 'Gaussian deviates on dip and dip direction (planes) and on trend and plunge (lines), then rounded to whole degrees.' },
    counts: COUNTS,
    plantedBadRows: planted,
  };
}

/**
 * Lon/lat bounds [west, south, east, north] of the DEM frame, rounded outward to 6 decimals.
 * Lines of constant northing are curved in longitude/latitude (they bulge north toward the central
 * meridian), so the frame edges are sampled every 50 m rather than only at the corners.
 * @example frameBounds() // [14.970356, 24.60309, 15.029644, 24.639219]
 */
export function frameBounds(): number[] {
  const edge: [number, number][] = [];
  for (let x = 0; x <= FRAME_WIDTH; x += 50) edge.push([x, 0], [x, FRAME_HEIGHT]);
  for (let y = 0; y <= FRAME_HEIGHT; y += 50) edge.push([0, y], [FRAME_WIDTH, y]);
  const points = edge.map(([x, y]) => utmToLonLat(...localToUtm(x, y)));
  const lons = points.map((c) => c[0]);
  const lats = points.map((c) => c[1]);
  const down = (v: number): number => Math.floor(v * 1e6) / 1e6;
  const up = (v: number): number => Math.ceil(v * 1e6) / 1e6;
  return [down(Math.min(...lons)), down(Math.min(...lats)), up(Math.max(...lons)), up(Math.max(...lats))];
}
