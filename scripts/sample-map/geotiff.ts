/**
 * Writes the DEM as a single-band Float32 GeoTIFF with geotiff.js: ModelPixelScale and
 * ModelTiepoint georeference the top-left corner of the top-left cell (GeoTIFF 1.0 spec,
 * section 2.6.1; RasterPixelIsArea), and ProjectedCSTypeGeoKey = 32633 names the CRS.
 */
import { writeArrayBuffer, type GeotiffWriterMetadata } from 'geotiff';
import { CRS, FRAME, FRAME_HEIGHT } from './district';
import type { DemGrid } from './terrain';

/**
 * Text stored in the TIFF ImageDescription and GTCitation fields.
 * @example DEM_DESCRIPTION.startsWith('SYNTHETIC') // true
 */
export const DEM_DESCRIPTION = 'SYNTHETIC demo DEM of the invented Korvane district (not real terrain). Elevation in metres.';

/**
 * The DEM as GeoTIFF bytes.
 * @example writeDemGeoTiff(dem).byteLength // about 61 kB for 150 x 100 cells
 */
export function writeDemGeoTiff(dem: DemGrid): Uint8Array {
  const metadata: GeotiffWriterMetadata & { ImageDescription: string } = {
    width: dem.cols,
    height: dem.rows,
    ImageDescription: DEM_DESCRIPTION,
    ModelPixelScale: [dem.cell, dem.cell, 0],
    ModelTiepoint: [0, 0, 0, FRAME.easting0, FRAME.northing0 + FRAME_HEIGHT, 0],
    GTModelTypeGeoKey: 1, // projected
    GTRasterTypeGeoKey: 1, // pixel is area
    ProjectedCSTypeGeoKey: CRS.epsg,
    GTCitationGeoKey: `${CRS.name}; ${DEM_DESCRIPTION}`,
  };
  return new Uint8Array(writeArrayBuffer(dem.values, metadata));
}
