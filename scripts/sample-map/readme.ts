/**
 * README.md of the sample map, written from the truth so that the two never disagree.
 */
import { COUNTS, FAULT, HILLS, WADIS } from './district';
import { localToUtm } from './crs';
import type { FieldReading } from './stations';
import type { Truth } from './truth';

const table = (head: readonly string[], rows: readonly (readonly (string | number)[])[]): string =>
  [`| ${head.join(' | ')} |`, `|${head.map(() => '---').join('|')}|`, ...rows.map((r) => `| ${r.join(' | ')} |`)].join('\n');

const f3 = (v: number): string => v.toFixed(3).padStart(7, '0');
const kb = (c: string | Uint8Array): string => {
  const k = (typeof c === 'string' ? Buffer.byteLength(c) : c.byteLength) / 1024;
  return `${k.toFixed(k < 10 ? 1 : 0)} kB`;
};

/**
 * The README text.
 * @example makeReadme(truth, readings, files).startsWith('# Korvane district') // true
 */
export function makeReadme(truth: Truth, readings: readonly FieldReading[], files: Record<string, string | Uint8Array>): string {
  const count = (kind: string, domain?: string) => readings.filter((r) => r.kind === kind && (!domain || r.domain === domain)).length;
  const [west, east] = truth.domains;
  const describe: Record<string, string> = {
    'dem.tif': `terrain model: Float32 GeoTIFF, ${truth.dem.cols} x ${truth.dem.rows} cells of ${truth.dem.cellSize} m, EPSG:${truth.crs.epsg}, pixel-is-area`,
    'topo.geo.json': 'topographic contours every 20 m (`elevation`, `index` = every 100 m), MultiLineStrings',
    'geology.geo.json': 'which unit crops out where: one MultiPolygon per unit and domain (`unit`, `name`, `lithology`, `order`, `domain`)',
    'contacts.geo.json': 'where each contact surface meets the ground: LineStrings (`name`, `unitBelow`, `unitAbove`, `level`, `domain`)',
    'faults.geo.json': `the ${FAULT.name}, the boundary between the two structural domains`,
    'places.geo.json': 'named hills (Points, with `elevation`) and wadis (LineStrings)',
    'stations.csv': 'field readings, both coordinate systems, dip direction/dip and trend/plunge columns plus a combined `reading`',
    'stations.json': 'the same rows as stations.csv, as an array of objects with the same keys and the same text values',
    'stations-quadrant.csv': 'the same readings as a spreadsheet export in quadrant notation, UTM only',
    'style.json': 'MapLibre style v8 that needs no network; each source `data` names a file beside it',
    'truth.json': 'the right answer: axes, domains, the analytic geometry, noise, planted bad rows, seed',
  };
  return `# ${truth.district}: a SYNTHETIC sample map

> **${truth.notice}** The coordinates lie in a sparsely inhabited part of the central
> Sahara (WGS 84 / UTM zone 33N, around 15.00° E, 24.62° N) only so that the map has a real
> projection; the terrain, rocks and names have nothing to do with the real ground there.

This folder is written by \`npm run sample-map\` (scripts/make-sample-map.ts, seed ${truth.seed}); do not edit
it by hand. tests/sample-map/ checks that the files are exactly what the generator makes now, and that the
data give back the answer below.

## Files

${table(['file', 'size', 'contents'], Object.keys(files).filter((f) => f !== 'README.md').map((f) => [`\`${f}\``, kb(files[f]), describe[f] ?? '']))}
| \`index.ts\` | | imports the JSON files and exports \`style\` (sources inlined), \`stations\`, \`truth\`, \`bounds\`, the layers and \`demUrl\` |

GeoJSON files use the \`.geo.json\` ending so that vite, vitest and tsx all import them as JSON; they are plain
RFC 7946 GeoJSON (WGS 84 longitude/latitude, 6 decimals) that any GIS opens. Every FeatureCollection carries
\`"synthetic": true\` and a \`description\`; the GeoTIFF says SYNTHETIC in its ImageDescription and
GTCitationGeoKey; each station row says so in its \`dataset\` column.

## Frame

- CRS: ${truth.crs.name} (EPSG:${truth.crs.epsg}).
- Easting ${truth.frame.eastingMin} to ${truth.frame.eastingMax} m, northing ${truth.frame.northingMin} to ${truth.frame.northingMax} m (6 km x 4 km).
- Longitude/latitude bounds [west, south, east, north]: [${truth.frame.bounds.join(', ')}].
- Elevations ${truth.dem.minElevation} to ${truth.dem.maxElevation} m.

## The right answer

Two structural domains, each an exactly cylindrical fold train, separated by the ${FAULT.name}
(a steep fault, east side up, running NNW across the middle of the map). Azimuths are referred to true
north (grid convergence, under 0.02°, applied); grid values in truth.json.

${table(
    ['domain', 'fold axis (trend/plunge)', 'axial surface (dip direction/dip)', 'wavelength', 'amplitude', 'bedding readings'],
    [west, east].map((d) => [
      d.name,
      `${f3(d.axis.trend)} / ${d.axis.plunge}`,
      `${f3(d.axialSurface.dipDirection)} / ${d.axialSurface.dip}`,
      `${d.profile.wavelength} m`,
      `${d.profile.amplitude} m`,
      count('bedding', d.id),
    ]),
  )}

The two axes are ${truth.angleBetweenAxes}° apart. A girdle fit to the bedding poles of either domain
(the least eigenvector of the orientation tensor) should find its axis within about 1-2°; hinges and
intersection lineations scatter about the same axis. Pooling the two domains gives a poorer fit: that is the
point of the demo (lasso one domain at a time). The domain polygons are in truth.json.

### How the geometry is built

In each domain, with the grid axis trend t and plunge p and the domain's origin O:

- profile frame: u = (cos t, -sin t, 0) (right, looking down the plunge), v = (sin p sin t, sin p cos t, cos p)
  (up, normal to the axis), east-north-up; u = (P - O)·u, v = (P - O)·v;
- profile curve: ${truth.geometry.profileCurve} (a rounded chevron; r near 0 gives a sine, r near 1 a sharp chevron);
- stratigraphic height: F = v - h(u - shear v) + offset. Every bedding surface is a level set of F. F does not
  depend on the position along the axis, so the bedding normal (the gradient of F) is always perpendicular to the
  axis: the folds are exactly cylindrical. The shear tilts the axial surfaces (inclined folds); layers are
  similar folds, never overturned.

${table(
    ['domain', 'amplitude', 'wavelength', 'r', 'phase', 'shear', 'origin (E, N, z)', 'offset'],
    [west, east].map((d) => [d.id, d.profile.amplitude, d.profile.wavelength, d.profile.r, `${d.profile.phaseDeg}°`, d.profile.shear, d.profile.originUtm.join(', '), d.profile.offset.toFixed(3)]),
  )}

Contacts are the zero lines of (DEM - elevation of the contact surface) on the DEM grid (d3-contour,
linear interpolation along cell edges), so they lie on the DEM to within the interpolation error of one cell.

## Stratigraphy (oldest first)

${table(
    ['unit', 'name', 'lithology', 'F from', 'F to', 'map colour'],
    truth.stratigraphy.units.map((u) => [u.code, u.name, u.lithology, u.baseLevel ?? '(not exposed)', u.topLevel ?? '(not exposed)', `\`${u.colour}\``]),
  )}

${truth.stratigraphy.thicknessNote} Cleavage and intersection lineations were read in the Tamsel Siltstone and
Brellow Slate only.

## Stations

${readings.length} rows: ${COUNTS.bedding} bedding, ${COUNTS.hinge} hinges (${count('hinge', 'west')} west, ${count('hinge', 'east')} east; sense recorded on most), ${COUNTS.intersection} bedding-cleavage
intersection lineations and ${COUNTS.cleavage} cleavage readings, ordered along daily north-south traverses in
November 2024. Bedding stations sit at random outcrop points; each reading is the true tangent plane of the
bedding surface through that point, plus scatter: dip ${truth.noise.dipSigma}° (sigma), dip direction
${truth.noise.dipDirectionSigmaAtVertical}°/sin(dip) kept within ${truth.noise.dipDirectionSigmaMin}-${truth.noise.dipDirectionSigmaMax}° (strike is poorly defined on gentle dips; Cruden &
Charlesworth 1976), lines ${truth.noise.lineTrendSigma}° in trend and ${truth.noise.linePlungeSigma}° in plunge, cleavage ${truth.noise.cleavageSigma}°; all rounded to whole degrees.

stations.csv columns:

${table(
    ['column', 'meaning'],
    [
      ['`station_id`', 'KR-0001 ... (unique per row)'],
      ['`kind`', 'bedding, hinge, intersection (lineation) or cleavage'],
      ['`easting`, `northing`', 'EPSG:32633, whole metres'],
      ['`lon`, `lat`', 'WGS 84 degrees, 6 decimals (the same point)'],
      ['`elevation_m`', 'from the DEM, whole metres'],
      ['`dip_direction`, `dip`', 'planes, degrees, true north'],
      ['`trend`, `plunge`', 'lines, degrees, true north'],
      ['`sense`', 'hinges: antiform or synform; empty if not recorded'],
      ['`reading`', 'the attitude as one field: planes as strike/dip with dip quadrant (`305/42SW`, right-hand-rule strike), lines as trend/plunge (`075/12`)'],
      ['`unit`', 'rock unit code at the station'],
      ['`date`', 'ISO date'],
      ['`notes`', 'free text (may contain commas; such fields are quoted, RFC 4180)'],
      ['`dataset`', 'always "SYNTHETIC demo (Korvane district)"'],
    ],
  )}

stations-quadrant.csv has the columns Stn, Type, E, N, Elev_m, Strike (quadrant bearing of the strike from its
northern end, e.g. \`N55W\`), Dip, DipQuad (\`SW\`), Trend (quadrant bearing, e.g. \`S80E\`), Plunge, Sense,
Date, Remarks, Dataset.

### Planted bad rows

These rows are wrong on purpose, in all three station files, so that importers can show how they report
bad input. A correct importer names the row, the field, the value and what was expected, and keeps the row.

${table(['station', 'mistake', 'columns', 'details'], truth.plantedBadRows.map((p) => [p.id, p.defect, p.columns.map((c) => `\`${c}\``).join(', '), p.description]))}

## Places

${table(['name', 'kind', 'where (E, N)'], [
    ...HILLS.map((h) => [h.name, 'hill', localToUtm(h.at[0], h.at[1]).join(', ')]),
    ...WADIS.map((w) => [w.name, 'wadi (dry stream bed)', `${localToUtm(...w.path[0]).join(', ')} to ${localToUtm(...w.path[w.path.length - 1]).join(', ')}`]),
    [FAULT.name, 'fault', `${truth.fault.traceUtm[0].join(', ')} to ${truth.fault.traceUtm[1].join(', ')}`],
  ])}

The rock units are named after these invented localities. The Quennet Wadi follows the fault.

## Regenerating

\`npm run sample-map\` rewrites this folder (\`-- --seed <n>\` for another district with the same design);
\`npx vitest run --project unit tests/sample-map\` checks it.

Fold axes and profiles found from any data are aids to interpretation. In real work, check them in the field and
defer to local codes and licensed professional practice.
`;
}
