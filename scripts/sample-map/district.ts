/**
 * The design of the Korvane district: a SYNTHETIC demo area. Every name here (district, hills,
 * wadis, fault, rock units, stations) is invented; the coordinates fall in a sparsely inhabited
 * stretch of the central Sahara in UTM zone 33N, and nothing about the real ground there is
 * represented.
 *
 * Local coordinates used by the generator: x metres east and y metres north of the south-west
 * corner of the DEM frame, z metres above sea level.
 */

/**
 * The notice carried by every file of the sample map.
 * @example geojson.description === SYNTHETIC_NOTICE
 */
export const SYNTHETIC_NOTICE =
  'SYNTHETIC demo data: the Korvane district, its terrain, rocks, names and field stations are invented. Not a real survey.';

/**
 * Identity of the district: folder name, display name, station id prefix, default seed.
 * @example `${DISTRICT.stationPrefix}-0001` // 'KR-0001'
 */
export const DISTRICT = {
  id: 'korvane',
  name: 'Korvane district',
  stationPrefix: 'KR',
  defaultSeed: 20241104,
} as const;

/**
 * WGS 84 / UTM zone 33N. The proj4 definition is the standard one for EPSG:32633.
 * @example proj4(CRS.proj4, 'WGS84').forward([500000, 2723000]) // [15, 24.62...]
 */
export const CRS = {
  epsg: 32633,
  name: 'WGS 84 / UTM zone 33N',
  proj4: '+proj=utm +zone=33 +datum=WGS84 +units=m +no_defs +type=crs',
} as const;

/**
 * DEM frame: 150 x 100 cells of 40 m, pixel-is-area, centred on the zone's central meridian.
 * @example FRAME.easting0 + FRAME_WIDTH // 503000, the east edge
 */
export const FRAME = {
  easting0: 497000,
  northing0: 2721000,
  cols: 150,
  rows: 100,
  cell: 40,
} as const;
/** Frame width in metres. @example FRAME_WIDTH // 6000 */
export const FRAME_WIDTH = FRAME.cols * FRAME.cell;
/** Frame height in metres. @example FRAME_HEIGHT // 4000 */
export const FRAME_HEIGHT = FRAME.rows * FRAME.cell;

/** A straight line in local coordinates. */
export interface Segment {
  readonly from: readonly [number, number];
  readonly to: readonly [number, number];
}

/**
 * The Kell Fault: a steep fault that separates the two structural domains. West of it lies the
 * west domain. Its trace runs through the whole frame; the Quennet Wadi follows it.
 * @example FAULT.trace.from // [3150, 0]
 */
export const FAULT: { readonly name: string; readonly trace: Segment } = {
  name: 'Kell Fault',
  trace: { from: [3150, 0], to: [2750, FRAME_HEIGHT] },
};

/**
 * One structural domain: a cylindrical fold train. In the profile plane (u to the right looking
 * down the plunge, v "up" normal to the axis) every bedding surface is
 *   v = c - offset + h(xi),  xi = u - shear * v,
 *   h(xi) = amplitude * asin(r sin(2 pi xi / wavelength + phase)) / asin(r),
 * i.e. the stratigraphic height F = v - h(u - shear * v) + offset is constant (= c) on a surface.
 * r -> 0 gives a sine, r -> 1 a chevron (triangle) wave; shear tilts the axial surfaces, making
 * the folds inclined. u, v are measured from `origin`.
 */
export interface FoldDomainDesign {
  readonly id: 'west' | 'east';
  readonly name: string;
  /** Fold axis referred to UTM grid north (the frame the geometry is built in). */
  readonly axisGrid: { readonly trend: number; readonly plunge: number };
  readonly amplitude: number;
  readonly wavelength: number;
  readonly r: number;
  readonly phaseDeg: number;
  readonly shear: number;
  /** Local x, y and elevation of the point where u = v = 0. */
  readonly origin: readonly [number, number, number];
}

/**
 * The two domains. Axes differ by about 25 degrees (075/12 and 100/18 on the grid).
 * @example DOMAINS[1].axisGrid // {trend: 100, plunge: 18}
 */
export const DOMAINS: readonly FoldDomainDesign[] = [
  {
    id: 'west',
    name: 'West domain (Oskaran fold train)',
    axisGrid: { trend: 75, plunge: 12 },
    amplitude: 200,
    wavelength: 1300,
    r: 0.75,
    phaseDeg: 20,
    shear: 0.2,
    origin: [1500, 2000, 800],
  },
  {
    id: 'east',
    name: 'East domain (Tamsel fold train)',
    axisGrid: { trend: 100, plunge: 18 },
    amplitude: 190,
    wavelength: 1100,
    r: 0.85,
    phaseDeg: -40,
    shear: 0.35,
    origin: [4500, 2000, 800],
  },
];

/**
 * Rock units, oldest first. Colours are ours: calm, alternating light and mid tones so that
 * neighbouring units differ in lightness, on a blue-yellow rather than red-green contrast so
 * they stay apart under red-green colour blindness. Checked by simulating protan, deutan and
 * tritan vision (Machado, Oliveira & Fernandes 2009 matrices, from memory): every pair of
 * units stays at least 14 CIELAB units apart.
 */
export interface UnitDesign {
  readonly code: string;
  readonly name: string;
  readonly lithology: string;
  readonly colour: string;
}

/**
 * The succession, oldest first.
 * @example UNITS[0].code // 'OSK'
 */
export const UNITS: readonly UnitDesign[] = [
  { code: 'OSK', name: 'Oskaran Quartzite', lithology: 'pale, thick-bedded quartzite', colour: '#f3e8cc' },
  { code: 'TAM', name: 'Tamsel Siltstone', lithology: 'green-grey laminated siltstone', colour: '#93b89a' },
  { code: 'VAR', name: 'Vardel Limestone', lithology: 'blue-grey bedded limestone', colour: '#bcd6ee' },
  { code: 'QUE', name: 'Quennet Sandstone', lithology: 'buff cross-bedded sandstone', colour: '#dfa36f' },
  { code: 'BRE', name: 'Brellow Slate', lithology: 'dark grey slate with cleavage', colour: '#7b70a6' },
];

/**
 * Stratigraphic heights of the contacts between consecutive units (metres along v, see
 * FoldDomainDesign). The base of the oldest unit and the top of the youngest are not exposed.
 * @example CONTACT_LEVELS.length === UNITS.length - 1 // true
 */
export const CONTACT_LEVELS: readonly number[] = [-450, -150, 150, 450];

/**
 * Counts of each kind of reading.
 * @example COUNTS.bedding // 400
 */
export const COUNTS = {
  bedding: 400,
  hinge: 40,
  intersection: 30,
  cleavage: 24,
} as const;

/**
 * Reading scatter. Compass-clinometer readings: about 2 degrees on dip and 2-5 degrees on
 * strike (common practice); strike scatter grows as 1/sin(dip) (Cruden & Charlesworth 1976,
 * GSA Bulletin 87), so the dip-direction sigma is 1.5/sin(dip), kept within 2..5 degrees.
 * @example NOISE.dipSigma // 2
 */
export const NOISE = {
  dipSigma: 2,
  dipDirectionSigmaAtVertical: 1.5,
  dipDirectionSigmaMin: 2,
  dipDirectionSigmaMax: 5,
  lineTrendSigma: 3,
  linePlungeSigma: 2,
  cleavageSigma: 3,
  /** Readings are written as whole degrees, as read off a compass. */
  roundingDeg: 1,
} as const;

/**
 * Named hills, for README and the places layer (local metres).
 * @example HILLS[1].name // 'Tamsel Hill'
 */
export const HILLS = [
  { name: 'Vardel Ridge', at: [1700, 3000] as const },
  { name: 'Tamsel Hill', at: [4400, 2500] as const },
  { name: 'Oskaran Knoll', at: [1400, 900] as const },
  { name: 'Brellow Rise', at: [5000, 950] as const },
];

/**
 * Wadis (dry stream beds), each listed from upstream to downstream with the elevation of its
 * floor at both ends: the terrain is carved down to a floor that falls steadily along the path,
 * so every wadi runs downhill. All drain to the junction and leave the frame to the south.
 */
export interface WadiDesign {
  readonly name: string;
  readonly path: readonly (readonly [number, number])[];
  readonly floor: readonly [number, number];
}

/**
 * The wadis, upstream first.
 * @example WADIS[2].name // 'Quennet Wadi', the outlet
 */
export const WADIS: readonly WadiDesign[] = [
  {
    name: 'Sennet Wadi',
    path: [[5980, 3900], [5300, 3700], [4600, 3750], [3900, 3450], [3350, 2900], [3050, 2400], [2950, 2050]],
    floor: [770, 715],
  },
  {
    name: 'Tellan Wadi',
    path: [[20, 1950], [800, 1800], [1500, 2050], [2300, 1900], [2950, 2050]],
    floor: [760, 715],
  },
  {
    name: 'Quennet Wadi',
    path: [[2950, 2050], [3020, 1300], [3080, 600], [3140, 20]],
    floor: [715, 670],
  },
];

/**
 * First day of the field season used for station dates (Saharan winter).
 * @example FIELD_SEASON_START // '2024-11-04'
 */
export const FIELD_SEASON_START = '2024-11-04';
