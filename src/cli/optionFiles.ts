/**
 * Files named by command-line options (`--within`, `--lines`, `--dem`), read with messages that
 * name the option and the file. Shared by analyze, profile and check.
 */
import type { Feature, MultiPolygon, Polygon } from 'geojson';
import { CrsError, resolveCrs, type Crs } from '../io/crs';
import { DemError, readDem } from '../io/dem';
import type { Dem } from '../io/demSampler';
import type { DemInCrs } from '../io/elevations';
import { LineworkError, readLinework, type LineworkFeature } from '../io/readLinework';
import { AreaError, readPolygons } from '../io/within';
import { UsageError } from './args';
import { readText, type CliIo } from './input';

/** Reads the polygons of `--within`. */
export async function readArea(path: string, io: CliIo): Promise<Feature<Polygon | MultiPolygon>[]> {
  const text = await readText(path, io);
  try {
    return readPolygons(text);
  } catch (e) {
    if (e instanceof AreaError) throw new UsageError(`--within ${path}: ${e.message}`);
    throw e;
  }
}

/** Reads the contact and fault traces of `--lines`. */
export async function readLines(path: string, io: CliIo): Promise<LineworkFeature[]> {
  const text = await readText(path, io);
  try {
    return readLinework(text);
  } catch (e) {
    if (e instanceof LineworkError) throw new UsageError(`--lines ${path}: ${e.message}`);
    throw e;
  }
}

/** Reads the GeoTIFF of `--dem` and the CRS it is in (its own EPSG key, or `--dem-crs`). */
export async function loadDem(path: string, crsText: string | undefined, io: CliIo): Promise<DemInCrs> {
  let bytes: Uint8Array | string;
  try {
    bytes = await io.readFile(path);
  } catch (e) {
    const code = (e as { code?: string }).code;
    throw new UsageError(`cannot read ${path}: ${code === 'ENOENT' ? 'no such file' : (e as Error).message}`);
  }
  if (typeof bytes === 'string') throw new UsageError(`--dem ${path}: a GeoTIFF is binary; it was given as text`);
  let dem: Dem;
  try {
    dem = await readDem(bytes, { source: path });
  } catch (e) {
    if (e instanceof DemError) throw new UsageError(`--dem ${e.message}`);
    throw e;
  }
  const text = crsText ?? (dem.epsg !== undefined ? `EPSG:${dem.epsg}` : undefined);
  if (text === undefined) throw new UsageError(`--dem ${path}: the file names no EPSG code for its CRS; give it with --dem-crs (e.g. --dem-crs EPSG:32633)`);
  let crs: Crs;
  try {
    crs = await resolveCrs(text, io.epsg);
  } catch (e) {
    if (e instanceof CrsError) throw new UsageError(`${crsText !== undefined ? '--dem-crs' : `--dem ${path}`}: ${e.message}`);
    throw e;
  }
  return { dem, crs };
}
