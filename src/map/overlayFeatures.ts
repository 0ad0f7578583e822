import type { ExpressionSpecification, FilterSpecification } from 'maplibre-gl';
import type { Feature, FeatureCollection, Point } from 'geojson';
import type { Station } from '../core/station';
import { isUsable } from '../core/station';
import { LINE_KINDS, PLANE_KINDS, type MeasurementKind } from '../core/types';
import { lonLatToMercator } from '../core/webMercator';
import { allSymbolImageIds, symbolFor } from './symbolCatalog';
import { mapImageBox, mapImageOffset } from './symbolImages';
import { thinningZooms } from './zoomThinning';

/**
 * The compact features the overlay hands to MapLibre, and the style expressions that read them.
 *
 * Every property but the station id is a number. A GeoJSON source copies its data to the map's
 * worker, and with 10^5 stations strings cost: the readable properties of `stationFeatures`
 * (station id, kind, family, image and label names) took about twice as long to copy as bare
 * points, numbers hardly more (measured in Node with structuredClone, which is what
 * postMessage does). The expressions below turn the codes back into image names. The id stays
 * text (`sid`), so a host reading rendered features learns which station it is.
 */

/** Kinds by code: property `k` is an index into this list. */
export const KIND_CODES: readonly MeasurementKind[] = [...PLANE_KINDS, ...LINE_KINDS];
/** Symbol images by code: property `i` is an index into this list. */
export const SYMBOL_IMAGE_CODES: readonly string[] = allSymbolImageIds();
const IMAGE_CODE = new Map(SYMBOL_IMAGE_CODES.map((id, i) => [id, i]));
const KIND_CODE = new Map(KIND_CODES.map((kind, i) => [kind as string, i]));

/** Properties of one overlay feature; the feature id is the station's index in the input array. */
export interface OverlayFeatureProperties {
  /** The station id as given by the data. */
  readonly sid: string;
  /** Kind code (index into {@link KIND_CODES}). */
  readonly k: number;
  /** Symbol image code (index into {@link SYMBOL_IMAGE_CODES}). */
  readonly i: number;
  /** Clockwise rotation of the symbol from north, degrees. */
  readonly r: number;
  /** The label's whole degrees (dip or plunge), or -1 for no label. */
  readonly d: number;
  /** Lowest whole zoom from which the symbol is drawn (thinning). */
  readonly sz: number;
  /** Lowest whole zoom from which the label is drawn (thinning). */
  readonly lz: number;
}

/**
 * From this zoom on every symbol is drawn, overlapping or not; below it symbols thin out.
 * @example map.getZoom() >= ALL_SYMBOLS_ZOOM // every station has its symbol
 */
export const ALL_SYMBOLS_ZOOM = 15;
/** Labels are thinned by grid up to this zoom, and only by MapLibre's collision test above it. */
const LABEL_GRID_ZOOM = 20;

/**
 * Symbol size by zoom as [zoom, factor] stops of a linear interpolation (factor 1: images at
 * their drawn size); multiplied by the overlay's `symbolScale`.
 * @example ['interpolate', ['linear'], ['zoom'], ...SIZE_STOPS.flat()]
 */
export const SIZE_STOPS: ReadonlyArray<readonly [number, number]> = [
  [8, 0.35],
  [12, 0.6],
  [15, 1],
];

/**
 * The size factor of symbols at a zoom, as the interpolation of {@link SIZE_STOPS} gives it.
 * @example symbolSizeAt(15, 1) // 1
 */
export function symbolSizeAt(zoom: number, scale: number): number {
  const stops = SIZE_STOPS;
  if (zoom <= stops[0][0]) return stops[0][1] * scale;
  for (let k = 1; k < stops.length; k++) {
    const [z1, f1] = stops[k];
    const [z0, f0] = stops[k - 1];
    if (zoom <= z1) return (f0 + ((f1 - f0) * (zoom - z0)) / (z1 - z0)) * scale;
  }
  return stops[stops.length - 1][1] * scale;
}

/** Side of the smallest label's collision box, CSS px: a one-digit label image plus its padding of 1 px each side. */
const LABEL_CELL: readonly [number, number] = (() => {
  const box = mapImageBox('fl-num/1')!;
  return [box.right - box.left + 2, box.top - box.bottom + 2];
})();
/** Shortest side of any symbol image, CSS px at size factor 1. */
const SYMBOL_CELL = Math.min(
  ...SYMBOL_IMAGE_CODES.map((id) => {
    const box = mapImageBox(id)!;
    return Math.min(box.right - box.left, box.top - box.bottom);
  }),
);

/** How to build overlay features. */
export interface OverlayFeatureOptions {
  /** Kinds shown (null: all). Thinning is among these, so a hidden kind leaves no gaps in the others. */
  readonly visibleKinds: ReadonlySet<string> | null;
  /** The overlay's symbol size factor. */
  readonly symbolScale: number;
  /** Zoom from which labels are shown. */
  readonly labelMinZoom: number;
  /** False: no thinning (every symbol and label from zoom 0), e.g. for selected stations. */
  readonly thin: boolean;
}

/**
 * The overlay's features for the drawable stations, each with the zooms from which its symbol
 * and label are drawn (see {@link thinningZooms}): symbols thin on a grid of cells the size of
 * the smallest symbol at each zoom, up to {@link ALL_SYMBOLS_ZOOM}; labels on a grid of the
 * smallest label's collision box. The feature id is the station's index in `stations`.
 * @example
 * overlayFeatures(stations, { visibleKinds: null, symbolScale: 1, labelMinZoom: 14, thin: true }).features[0].properties
 * // {sid: 'KR-1', k: 0, i: 0, r: 120, d: 45, sz: 0, lz: 14}
 */
export function overlayFeatures(stations: readonly Station[], options: OverlayFeatureOptions): FeatureCollection<Point, OverlayFeatureProperties> {
  const kept: Array<{ index: number; sid: string; lon: number; lat: number; k: number; i: number; r: number; d: number }> = [];
  stations.forEach((s, index) => {
    if (!isUsable(s) || s.lon === undefined || s.lat === undefined || !s.kind) return;
    const symbol = symbolFor(s);
    const i = symbol ? IMAGE_CODE.get(symbol.image) : undefined;
    const k = KIND_CODE.get(s.kind);
    if (!symbol || i === undefined || k === undefined) return;
    kept.push({ index, sid: s.id, lon: s.lon, lat: s.lat, k, i, r: symbol.rotation, d: symbol.label === '' ? -1 : Number(symbol.label) });
  });
  let symbolFrom: Float64Array | null = null;
  let labelFrom: Float64Array | null = null;
  if (options.thin) {
    const shown = (f: (typeof kept)[number]) => !options.visibleKinds || options.visibleKinds.has(KIND_CODES[f.k]);
    const symbolXy = new Float64Array(2 * kept.length).fill(NaN);
    const labelXy = new Float64Array(2 * kept.length).fill(NaN);
    kept.forEach((f, n) => {
      if (!shown(f)) return;
      const [x, y] = lonLatToMercator(f.lon, f.lat);
      symbolXy[2 * n] = x;
      symbolXy[2 * n + 1] = y;
      // Only stations with a label compete for label cells.
      if (f.d >= 0) labelXy.set([x, y], 2 * n);
    });
    const scale = options.symbolScale;
    symbolFrom = thinningZooms(symbolXy, {
      minZoom: 0,
      fullZoom: ALL_SYMBOLS_ZOOM,
      cellPx: (z) => [SYMBOL_CELL * symbolSizeAt(z, scale), SYMBOL_CELL * symbolSizeAt(z, scale)],
    });
    const labelMin = Math.min(LABEL_GRID_ZOOM, Math.max(0, Math.floor(options.labelMinZoom)));
    labelFrom = thinningZooms(labelXy, { minZoom: labelMin, fullZoom: LABEL_GRID_ZOOM, cellPx: () => LABEL_CELL });
  }
  // Infinity (hidden kinds, no label) is not JSON; such marks are filtered out by kind or label anyway.
  const zoomOf = (from: Float64Array | null, n: number) => (from === null ? 0 : Number.isFinite(from[n]) ? from[n] : 99);
  const features = kept.map(
    (f, n): Feature<Point, OverlayFeatureProperties> => ({
      type: 'Feature',
      id: f.index,
      geometry: { type: 'Point', coordinates: [f.lon, f.lat] },
      properties: { sid: f.sid, k: f.k, i: f.i, r: f.r, d: f.d, sz: zoomOf(symbolFrom, n), lz: zoomOf(labelFrom, n) },
    }),
  );
  return { type: 'FeatureCollection', features };
}

/**
 * `icon-image` of the symbols: the image name of the feature's code.
 * @example layout: { 'icon-image': symbolImageExpression() }
 */
export function symbolImageExpression(): ExpressionSpecification {
  return ['match', ['get', 'i'], ...SYMBOL_IMAGE_CODES.flatMap((id, i) => [i, id]), ''] as unknown as ExpressionSpecification;
}

/**
 * `icon-offset` of the symbols: each image is cropped to what it paints, so its centre lies off
 * the station by its own offset (icon-offset turns with icon-rotate, so the station stays the pivot).
 * @example layout: { 'icon-offset': symbolOffsetExpression() }
 */
export function symbolOffsetExpression(): ExpressionSpecification {
  return ['match', ['get', 'i'], ...SYMBOL_IMAGE_CODES.flatMap((id, i) => [i, ['literal', mapImageOffset(id)]]), ['literal', [0, 0]]] as unknown as ExpressionSpecification;
}

/**
 * `icon-image` of the labels: `fl-num/<degrees>`.
 * @example layout: { 'icon-image': labelImageExpression() }
 */
export function labelImageExpression(): ExpressionSpecification {
  return ['concat', 'fl-num/', ['to-string', ['get', 'd']]];
}

/**
 * Filter keeping features of the given kinds (kind names; unknown names match nothing).
 * @example map.setFilter('foldlens-dots', kindFilter(['bedding', 'hinge']))
 */
export function kindFilter(kinds: Iterable<string>): FilterSpecification {
  const codes = [...kinds].map((k) => KIND_CODE.get(k)).filter((c): c is number => c !== undefined);
  return ['in', ['get', 'k'], ['literal', codes]] as FilterSpecification;
}

/**
 * The image names a set of overlay features draws (symbols and labels), to add before they are needed.
 * @example for (const id of imageNamesOf(fc.features)) map.addImage(id, ...)
 */
export function imageNamesOf(features: ReadonlyArray<Feature<Point, OverlayFeatureProperties>>): Set<string> {
  const names = new Set<string>();
  for (const f of features) {
    names.add(SYMBOL_IMAGE_CODES[f.properties.i]);
    if (f.properties.d >= 0) names.add(`fl-num/${f.properties.d}`);
  }
  return names;
}
