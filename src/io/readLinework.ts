/**
 * Reading map linework (contact traces, form lines, fault traces) from GeoJSON (RFC 7946):
 * LineString and MultiLineString features, positions in WGS 84 longitude and latitude with an
 * optional third number, the height in metres (RFC 7946 §3.1.1). Anything else is an error that
 * names the feature: nothing is skipped silently.
 *
 * Each feature keeps its 1-based number in the file, an id (the feature's `id`, else its
 * `id` property, else its number) and its properties as given.
 */

/** One continuous line of a feature. */
export interface LineworkPart {
  /** Flat [lon0, lat0, lon1, lat1, ...]. */
  readonly lonLat: Float64Array;
  /** Height of each vertex from the file, NaN where it gave none. */
  readonly heights: Float64Array;
}

/** One linework feature. */
export interface LineworkFeature {
  /** 1-based position in the file. */
  readonly feature: number;
  readonly id: string;
  readonly name?: string;
  readonly properties: Readonly<Record<string, unknown>>;
  readonly parts: readonly LineworkPart[];
}

/**
 * The only error readLinework throws.
 * @example try { readLinework('{}'); } catch (e) { (e as LineworkError).message }
 */
export class LineworkError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'LineworkError';
  }
}

/**
 * Reads linework from GeoJSON text (a FeatureCollection, a Feature, or a bare LineString or
 * MultiLineString geometry).
 * @example readLinework('{"type":"LineString","coordinates":[[15,24.6],[15.01,24.61,700]]}')[0].parts[0].heights // [NaN, 700]
 */
export function readLinework(text: string): LineworkFeature[] {
  let json: unknown;
  try {
    json = JSON.parse(text.charCodeAt(0) === 0xfeff ? text.slice(1) : text);
  } catch (e) {
    throw new LineworkError(`the linework file is not valid JSON: ${(e as Error).message}`);
  }
  const type = (json as { type?: unknown } | null)?.type;
  const items: unknown[] =
    type === 'FeatureCollection' && Array.isArray((json as { features?: unknown }).features)
      ? (json as { features: unknown[] }).features
      : type === 'Feature'
        ? [json]
        : type === 'LineString' || type === 'MultiLineString'
          ? [{ type: 'Feature', geometry: json, properties: {} }]
          : [];
  if (items.length === 0) throw new LineworkError('the linework file holds no lines: expected LineString or MultiLineString features');
  return items.map((item, i) => readFeature(item, i + 1));
}

function readFeature(item: unknown, feature: number): LineworkFeature {
  const f = item as { type?: unknown; id?: unknown; geometry?: { type?: unknown; coordinates?: unknown } | null; properties?: unknown } | null;
  const where = `feature ${feature}`;
  if (!f || f.type !== 'Feature') throw new LineworkError(`${where} is not a GeoJSON Feature`);
  const properties = f.properties && typeof f.properties === 'object' && !Array.isArray(f.properties) ? (f.properties as Record<string, unknown>) : {};
  const g = f.geometry;
  if (!g || (g.type !== 'LineString' && g.type !== 'MultiLineString')) {
    throw new LineworkError(`${where} is a ${g ? String(g.type) : 'feature without geometry'}; expected a LineString or MultiLineString`);
  }
  const lines = (g.type === 'LineString' ? [g.coordinates] : g.coordinates) as unknown;
  if (!Array.isArray(lines) || lines.length === 0) throw new LineworkError(`${where}: the ${g.type} has no coordinates`);
  const parts = lines.map((line, k) => readPart(line, g.type === 'MultiLineString' ? `${where}, line ${k + 1}` : where));
  const id = typeof f.id === 'string' || typeof f.id === 'number' ? String(f.id) : typeof properties.id === 'string' || typeof properties.id === 'number' ? String(properties.id) : String(feature);
  const name = typeof properties.name === 'string' ? properties.name : undefined;
  return { feature, id, ...(name !== undefined && { name }), properties, parts };
}

function readPart(line: unknown, where: string): LineworkPart {
  if (!Array.isArray(line) || line.length < 2) throw new LineworkError(`${where}: a line needs at least 2 positions`);
  const lonLat = new Float64Array(2 * line.length);
  const heights = new Float64Array(line.length).fill(Number.NaN);
  line.forEach((p, v) => {
    const at = `${where}, position ${v + 1}`;
    if (!Array.isArray(p) || p.length < 2 || !p.every((c) => typeof c === 'number' && Number.isFinite(c))) {
      throw new LineworkError(`${at}: ${JSON.stringify(p)} is not [longitude, latitude] or [longitude, latitude, height] in numbers`);
    }
    const [lon, lat] = p as number[];
    if (Math.abs(lon) > 180 || Math.abs(lat) > 90) {
      throw new LineworkError(`${at}: (${lon}, ${lat}) is not a longitude from -180 to 180 and a latitude from -90 to 90 (GeoJSON positions are WGS 84 degrees; projected metres are not allowed)`);
    }
    lonLat[2 * v] = lon;
    lonLat[2 * v + 1] = lat;
    if (p.length >= 3) heights[v] = p[2] as number;
  });
  return { lonLat, heights };
}
