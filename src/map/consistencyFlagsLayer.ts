import type { GeoJSONSource, LayerSpecification, Map as MapLibreMap } from 'maplibre-gl';
import type { Feature, FeatureCollection, LineString, Point } from 'geojson';
import type { DomainCheck } from '../core/consistency/domainCheck';

/**
 * Consistency flags on the map: a ring round each planar reading whose pole lies off its
 * domain's girdle, a larger ring of another colour round each measured line that disagrees with
 * the axis, a square mark at each fold closure that points the wrong way for the axis
 * (core/consistency: girdleResiduals.ts, axisVsLines.ts, closures.ts), and the suggested domain
 * boundaries of the local axis field (domainBoundaries.ts) as a dashed line. Talks to MapLibre
 * through its public API only, re-adds itself when the host swaps style and removes every trace
 * on `remove()`.
 */

/** Options of {@link ConsistencyFlagsLayer}; every field has a default in {@link defaultFlagsLayerOptions}. */
export interface ConsistencyFlagsLayerOptions {
  readonly idPrefix: string;
  /** Ring round a pole off the girdle. */
  readonly planeColor: string;
  /** Ring round a line off the axis. */
  readonly lineColor: string;
  /** Mark at a closure that points the wrong way. */
  readonly closureColor: string;
  /** Suggested boundaries. */
  readonly boundaryColor: string;
}

/**
 * Defaults of {@link ConsistencyFlagsLayerOptions}.
 * @example new ConsistencyFlagsLayer(map, { ...defaultFlagsLayerOptions, planeColor: '#b00020' })
 */
export const defaultFlagsLayerOptions: ConsistencyFlagsLayerOptions = {
  idPrefix: 'foldlens-consistency',
  planeColor: '#d7191c',
  lineColor: '#6a1b9a',
  closureColor: '#0d47a1',
  boundaryColor: '#111111',
};

/** What a flag marks. */
export type FlagKind = 'plane-off-girdle' | 'line-off-axis' | 'closure-disagrees';

/** Properties of a flag feature. */
export interface FlagProperties {
  readonly kind: FlagKind;
  /** Station id (or the closure's surface), for the user. */
  readonly id: string;
  readonly domain: string;
  /** Why it is flagged, in words. */
  readonly message: string;
}

/**
 * The flags of a set of domain checks as GeoJSON points: the flagged planes and lines at their
 * stations (`placeOf` gives a station's [longitude, latitude] by id), and disagreeing closures at
 * their apex (`closureToLonLat` turns the apex from the frame the checks used, east-north metres
 * turned to true north by domainCheck.ts, to longitude, latitude). A flagged reading whose id has
 * no position is left out and counted in `unplaced`.
 * @example
 * const { points } = flagFeatures(checks, (id) => lonLatById.get(id), apexToLonLat);
 */
export function flagFeatures(
  checks: readonly DomainCheck[],
  placeOf: (id: string) => readonly [number, number] | undefined,
  closureToLonLat: (x: number, y: number) => readonly [number, number],
): { points: FeatureCollection<Point, FlagProperties>; unplaced: number } {
  const features: Feature<Point, FlagProperties>[] = [];
  let unplaced = 0;
  const add = (kind: FlagKind, id: string, domain: string, message: string, at: readonly [number, number] | undefined): void => {
    if (!at) {
      unplaced++;
      return;
    }
    features.push({ type: 'Feature', properties: { kind, id, domain, message }, geometry: { type: 'Point', coordinates: [at[0], at[1]] } });
  };
  for (const d of checks) {
    for (const r of d.girdle.residuals) {
      if (!r.flagged) continue;
      const id = r.id ?? `plane ${r.index + 1}`;
      add('plane-off-girdle', id, d.id, `${id}: pole ${r.distance?.toFixed(1) ?? '?'}° off the girdle of ${d.name} (threshold ${d.girdle.threshold.toFixed(1)}°)`, r.id === undefined ? undefined : placeOf(r.id));
    }
    for (const l of d.lines?.lines ?? []) {
      if (!l.flagged) continue;
      const id = l.id ?? `line ${l.index + 1}`;
      add('line-off-axis', id, d.id, `${id}: ${l.angle.toFixed(1)}° from the axis of ${d.name} (threshold ${d.lines!.threshold}°)`, l.id === undefined ? undefined : placeOf(l.id));
    }
    for (const c of d.mapPattern?.closures?.closures ?? []) {
      if (c.agrees !== false) continue;
      add('closure-disagrees', c.surface ?? 'closure', d.id, c.reading, closureToLonLat(c.position[0], c.position[1]));
    }
  }
  return { points: { type: 'FeatureCollection', features }, unplaced };
}

/** Which parts are shown. */
export interface FlagsVisibility {
  readonly flags: boolean;
  readonly boundaries: boolean;
}

const EMPTY: FeatureCollection = { type: 'FeatureCollection', features: [] };

/**
 * Draws consistency flags and suggested domain boundaries on a MapLibre map.
 * @example
 * const flags = new ConsistencyFlagsLayer(map);
 * flags.setFlags(flagFeatures(checks, placeOf, toLonLat).points);
 * flags.setBoundaries([[[15.0, 24.61], [14.99, 24.63]]]);
 */
export class ConsistencyFlagsLayer {
  readonly options: ConsistencyFlagsLayerOptions;
  private readonly map: MapLibreMap;
  private flags: FeatureCollection<Point, FlagProperties> | null = null;
  private boundaries: FeatureCollection<LineString> | null = null;
  private visibility: FlagsVisibility = { flags: true, boundaries: true };

  constructor(map: MapLibreMap, options: Partial<ConsistencyFlagsLayerOptions> = {}) {
    this.map = map;
    this.options = { ...defaultFlagsLayerOptions, ...options };
    map.on('style.load', this.install);
    // isStyleLoaded() is false while any source is loading; getStyle() is defined as soon as the
    // style itself is, which is all that adding sources and layers needs.
    if (map.isStyleLoaded() || map.getStyle() !== undefined) this.install();
  }

  /** Id of the layer of flag rings and marks. */
  get flagLayerId(): string {
    return `${this.options.idPrefix}-flags`;
  }

  /** Id of the (dashed) boundary layer. */
  get boundaryLayerId(): string {
    return `${this.options.idPrefix}-boundaries`;
  }

  /** Replaces the flags drawn (null clears them). */
  setFlags(points: FeatureCollection<Point, FlagProperties> | null): void {
    this.flags = points;
    this.render();
  }

  /** Replaces the suggested boundaries: polylines of [lon, lat] (an empty list clears them). */
  setBoundaries(lines: ReadonlyArray<ReadonlyArray<readonly [number, number]>>): void {
    this.boundaries = {
      type: 'FeatureCollection',
      features: lines.filter((l) => l.length >= 2).map((l) => ({ type: 'Feature', properties: {}, geometry: { type: 'LineString', coordinates: l.map((p) => [p[0], p[1]]) } })),
    };
    this.render();
  }

  /** Shows or hides the flags and the boundaries. */
  setVisibility(visibility: Partial<FlagsVisibility>): void {
    this.visibility = { ...this.visibility, ...visibility };
    this.applyVisibility();
  }

  /** Removes the layers, sources and handlers. */
  remove(): void {
    this.map.off('style.load', this.install);
    if (!this.map.style) return;
    for (const id of this.layerIds()) if (this.map.getLayer(id)) this.map.removeLayer(id);
    for (const id of [this.flagLayerId, this.boundaryLayerId]) if (this.map.getSource(id)) this.map.removeSource(id);
  }

  private layerIds(): string[] {
    return [`${this.flagLayerId}-closures`, this.flagLayerId, this.boundaryLayerId, `${this.boundaryLayerId}-casing`];
  }

  private readonly install = (): void => {
    const map = this.map;
    const o = this.options;
    for (const id of [this.flagLayerId, this.boundaryLayerId]) if (!map.getSource(id)) map.addSource(id, { type: 'geojson', data: EMPTY });
    const layers: LayerSpecification[] = [
      { id: `${this.boundaryLayerId}-casing`, type: 'line', source: this.boundaryLayerId, layout: { 'line-cap': 'round', 'line-join': 'round' }, paint: { 'line-color': '#ffffff', 'line-width': 6, 'line-opacity': 0.85 } },
      { id: this.boundaryLayerId, type: 'line', source: this.boundaryLayerId, layout: { 'line-join': 'round' }, paint: { 'line-color': o.boundaryColor, 'line-width': 3, 'line-dasharray': [2, 1.5] } },
      {
        id: this.flagLayerId,
        type: 'circle',
        source: this.flagLayerId,
        filter: ['!=', ['get', 'kind'], 'closure-disagrees'],
        paint: {
          'circle-radius': ['match', ['get', 'kind'], 'line-off-axis', 13, 9],
          'circle-color': 'rgba(0,0,0,0)',
          'circle-stroke-width': 3,
          'circle-stroke-color': ['match', ['get', 'kind'], 'line-off-axis', o.lineColor, o.planeColor],
        },
      },
      {
        id: `${this.flagLayerId}-closures`,
        type: 'circle',
        source: this.flagLayerId,
        filter: ['==', ['get', 'kind'], 'closure-disagrees'],
        paint: { 'circle-radius': 11, 'circle-color': 'rgba(255,255,255,0.35)', 'circle-stroke-width': 4, 'circle-stroke-color': o.closureColor },
      },
    ];
    for (const layer of layers) if (!map.getLayer(layer.id)) map.addLayer(layer);
    this.render();
  };

  private render(): void {
    const flags = this.map.getSource(this.flagLayerId) as GeoJSONSource | undefined;
    const boundaries = this.map.getSource(this.boundaryLayerId) as GeoJSONSource | undefined;
    if (!flags || !boundaries) return;
    flags.setData(this.flags ?? EMPTY);
    boundaries.setData(this.boundaries ?? EMPTY);
    this.applyVisibility();
  }

  private applyVisibility(): void {
    const set = (id: string, on: boolean): void => {
      if (this.map.getLayer(id)) this.map.setLayoutProperty(id, 'visibility', on ? 'visible' : 'none');
    };
    set(this.flagLayerId, this.visibility.flags);
    set(`${this.flagLayerId}-closures`, this.visibility.flags);
    set(this.boundaryLayerId, this.visibility.boundaries);
    set(`${this.boundaryLayerId}-casing`, this.visibility.boundaries);
  }
}
