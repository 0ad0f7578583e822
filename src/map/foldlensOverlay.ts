import type { Map as MapLibreMap, MapLayerMouseEvent, GeoJSONSource, FilterSpecification, ExpressionSpecification } from 'maplibre-gl';
import type { Station } from '../core/station';
import { imageFor } from './symbolImages';
import { stationFeatures, type StationFeatureProperties } from './stationFeatures';
import type { FeatureCollection, Point } from 'geojson';

/** Options of {@link attachFoldlens}; every field has a default in {@link defaultOverlayOptions}. */
export interface FoldlensOverlayOptions {
  /** Prefix of every source and layer id Foldlens adds, so they never clash with the host's. */
  readonly idPrefix: string;
  /** Id of a host layer to insert Foldlens layers below; undefined puts them on top. */
  readonly beforeId?: string;
  /** Which layers to show. */
  readonly show: { readonly symbols: boolean; readonly labels: boolean; readonly dots: boolean };
  /** Symbol size factor (1 = 44 CSS px images at zoom 15). */
  readonly symbolScale: number;
  /** Labels appear from this zoom on. */
  readonly labelMinZoom: number;
  /** Colour of the station dots and selection rings. */
  readonly dotColor: string;
  readonly selectionColor: string;
}

/**
 * Defaults of {@link FoldlensOverlayOptions}; pass a partial object to override any of them.
 * @example
 * attachFoldlens(map, { ...defaultOverlayOptions, idPrefix: 'geo' });
 */
export const defaultOverlayOptions: FoldlensOverlayOptions = {
  idPrefix: 'foldlens',
  show: { symbols: true, labels: true, dots: true },
  symbolScale: 1,
  labelMinZoom: 14,
  dotColor: '#1d2326',
  selectionColor: '#e8590c',
};

/** Selected stations whose symbols are drawn above the thinning; larger selections show rings only. */
const MAX_LIFTED_SYMBOLS = 5000;

function flagsOf(indices: Iterable<number>, size: number): Uint8Array {
  const flags = new Uint8Array(size);
  for (const i of indices) if (i >= 0 && i < size) flags[i] = 1;
  return flags;
}

/** Detail of `stationclick` and `stationhover` events. */
export interface StationEventDetail {
  /** Index of the station in the array given to setStations, or -1 when the pointer left all stations. */
  readonly index: number;
  readonly station: Station | null;
}

/**
 * Foldlens on someone else's MapLibre map: adds a GeoJSON source and layers for station dots,
 * orientation symbols, labels and selection, draws symbol images on demand at the map's pixel
 * ratio, re-adds itself when the host swaps style, and removes every trace on `remove()`.
 *
 * Events (DOM CustomEvents on the overlay): `stationclick`, `stationhover` with {@link StationEventDetail}.
 * @example
 * const overlay = new FoldlensOverlay(map, { show: { symbols: true, labels: false, dots: true } });
 * overlay.setStations(stations);
 * overlay.setSelection([0, 4, 7]);
 */
export class FoldlensOverlay extends EventTarget {
  readonly options: FoldlensOverlayOptions;
  private readonly map: MapLibreMap;
  private stations: readonly Station[] = [];
  private features: FeatureCollection<Point, StationFeatureProperties> = { type: 'FeatureCollection', features: [] };
  private selectedFlags = new Uint8Array(0);
  private hovered = -1;
  private visibleKinds: ReadonlySet<string> | null = null;
  private readonly addedImages = new Set<string>();
  private removed = false;

  constructor(map: MapLibreMap, options: Partial<FoldlensOverlayOptions> = {}) {
    super();
    this.map = map;
    this.options = { ...defaultOverlayOptions, ...options, show: { ...defaultOverlayOptions.show, ...options.show } };
    map.on('style.load', this.onStyleLoad);
    map.on('click', this.layerId('hit'), this.onClick);
    map.on('mousemove', this.layerId('hit'), this.onHover);
    map.on('mouseleave', this.layerId('hit'), this.onLeave);
    if (map.isStyleLoaded()) this.install();
  }

  /** Source id of the stations. */
  get sourceId(): string {
    return `${this.options.idPrefix}-stations`;
  }

  /** Layer id for a role: 'dots' | 'symbols' | 'labels' | 'selection' | 'hit'. */
  layerId(role: 'dots' | 'symbols' | 'labels' | 'selection' | 'selected-symbols' | 'hit'): string {
    return `${this.options.idPrefix}-${role}`;
  }

  /** Every layer id Foldlens owns, bottom to top. */
  get layerIds(): string[] {
    return (['dots', 'labels', 'symbols', 'selection', 'selected-symbols', 'hit'] as const).map((r) => this.layerId(r));
  }

  /** Replaces the stations on the map. Unusable stations are not drawn (they remain in the caller's data). */
  setStations(stations: readonly Station[]): void {
    this.stations = stations;
    this.selectedFlags = new Uint8Array(stations.length);
    this.hovered = -1;
    this.features = stationFeatures(stations);
    this.ensureImages();
    const source = this.map.getSource(this.sourceId) as GeoJSONSource | undefined;
    source?.setData(this.features);
    this.updateSelectedSource();
  }

  /** The stations last given to setStations. */
  getStations(): readonly Station[] {
    return this.stations;
  }

  /** Shows only these kinds (null shows all). */
  setVisibleKinds(kinds: Iterable<string> | null): void {
    this.visibleKinds = kinds === null ? null : new Set(kinds);
    this.applyFilters();
  }

  /**
   * Marks stations as selected: rings are drawn and, at `final` updates, their symbols are
   * drawn above the thinning so selected stations are never hidden. Accepts membership flags
   * (one per station) or indices; only stations whose state changed are touched, so a lasso
   * move costs little even with 10^5 stations.
   */
  setSelection(selection: Uint8Array | Iterable<number>, final = true): void {
    const next = selection instanceof Uint8Array ? selection : flagsOf(selection, this.stations.length);
    const prev = this.selectedFlags;
    for (let i = 0; i < this.stations.length; i++) {
      const on = next[i] ?? 0;
      if (on !== (prev[i] ?? 0)) this.setState(i, { selected: on === 1 });
    }
    this.selectedFlags = next.slice();
    if (final) this.updateSelectedSource();
  }

  /** Highlights one station (by index, -1 for none), e.g. when hovering its point in a net. */
  setHighlight(index: number): void {
    if (this.hovered === index) return;
    if (this.hovered >= 0) this.setState(this.hovered, { hover: false });
    this.hovered = index;
    if (index >= 0) this.setState(index, { hover: true });
  }

  /** Removes every source, layer, image and handler Foldlens added. */
  remove(): void {
    if (this.removed) return;
    this.removed = true;
    const map = this.map;
    map.off('style.load', this.onStyleLoad);
    map.off('click', this.layerId('hit'), this.onClick);
    map.off('mousemove', this.layerId('hit'), this.onHover);
    map.off('mouseleave', this.layerId('hit'), this.onLeave);
    if (!map.style) return;
    for (const id of [...this.layerIds].reverse()) if (map.getLayer(id)) map.removeLayer(id);
    for (const id of [this.sourceId, `${this.sourceId}-selected`]) if (map.getSource(id)) map.removeSource(id);
    for (const id of this.addedImages) if (map.hasImage(id)) map.removeImage(id);
    this.addedImages.clear();
  }

  private setState(index: number, state: Record<string, boolean>): void {
    if (this.map.getSource(this.sourceId)) this.map.setFeatureState({ source: this.sourceId, id: index }, state);
  }

  private updateSelectedSource(): void {
    const source = this.map.getSource(`${this.sourceId}-selected`) as GeoJSONSource | undefined;
    if (!source) return;
    const picked: number[] = [];
    for (let i = 0; i < this.selectedFlags.length && picked.length <= MAX_LIFTED_SYMBOLS; i++) if (this.selectedFlags[i]) picked.push(i);
    // Past this many, lifting symbols above the thinning would hide nothing less than it costs.
    if (picked.length > MAX_LIFTED_SYMBOLS) picked.length = 0;
    const all = stationFeatures(picked.map((i) => this.stations[i]));
    // stationFeatures numbers features by position in its input; give them the real indices back.
    const features = all.features.map((f) => ({ ...f, id: picked[f.id as number] }));
    source.setData({ type: 'FeatureCollection', features });
  }

  private kindFilter(): FilterSpecification | undefined {
    if (!this.visibleKinds) return undefined;
    return ['in', ['get', 'kind'], ['literal', [...this.visibleKinds]]] as FilterSpecification;
  }

  private applyFilters(): void {
    const kind = this.kindFilter();
    const withLabel: FilterSpecification = ['!=', ['get', 'lbl'], ''];
    const set = (id: string, filter: FilterSpecification | undefined) => {
      if (this.map.getLayer(id)) this.map.setFilter(id, filter ?? null);
    };
    set(this.layerId('dots'), kind);
    set(this.layerId('symbols'), kind);
    set(this.layerId('hit'), kind);
    set(this.layerId('selection'), kind);
    set(this.layerId('selected-symbols'), kind);
    set(this.layerId('labels'), kind ? (['all', kind, withLabel] as FilterSpecification) : withLabel);
  }

  private readonly onStyleLoad = (): void => {
    // A host's setStyle() drops our sources and layers: put them back.
    if (!this.removed) this.install();
  };

  /**
   * Adds the symbol and label images the current stations use and the style lacks. Images are
   * added eagerly rather than through a missing-image resolver, because a map has only one
   * resolver and it belongs to the host.
   */
  private ensureImages(): void {
    if (!this.map.style) return;
    const ratio = Math.max(1, Math.ceil(this.map.getPixelRatio()));
    const needed = new Set<string>();
    for (const f of this.features.features) {
      needed.add(f.properties.img);
      if (f.properties.lbl) needed.add(f.properties.lbl);
    }
    for (const id of needed) {
      if (this.map.hasImage(id)) continue;
      const image = imageFor(id, ratio);
      if (!image) continue;
      this.map.addImage(id, { width: image.width, height: image.height, data: image.data }, { pixelRatio: image.pixelRatio });
      this.addedImages.add(id);
    }
  }

  private readonly onClick = (e: MapLayerMouseEvent): void => {
    const index = this.indexOf(e);
    if (index >= 0) this.dispatchEvent(new CustomEvent<StationEventDetail>('stationclick', { detail: { index, station: this.stations[index] ?? null } }));
  };

  private readonly onHover = (e: MapLayerMouseEvent): void => {
    const index = this.indexOf(e);
    this.map.getCanvas().style.cursor = index >= 0 ? 'pointer' : '';
    if (index === this.hovered) return;
    this.setHighlight(index);
    this.dispatchEvent(new CustomEvent<StationEventDetail>('stationhover', { detail: { index, station: this.stations[index] ?? null } }));
  };

  private readonly onLeave = (): void => {
    this.map.getCanvas().style.cursor = '';
    this.setHighlight(-1);
    this.dispatchEvent(new CustomEvent<StationEventDetail>('stationhover', { detail: { index: -1, station: null } }));
  };

  private indexOf(e: MapLayerMouseEvent): number {
    const id = e.features?.[0]?.id;
    return typeof id === 'number' ? id : -1;
  }

  private install(): void {
    const map = this.map;
    const o = this.options;
    this.ensureImages();
    if (!map.getSource(this.sourceId)) map.addSource(this.sourceId, { type: 'geojson', data: this.features });
    if (!map.getSource(`${this.sourceId}-selected`)) map.addSource(`${this.sourceId}-selected`, { type: 'geojson', data: { type: 'FeatureCollection', features: [] } });
    const size: ExpressionSpecification = ['interpolate', ['linear'], ['zoom'], 8, 0.35 * o.symbolScale, 12, 0.6 * o.symbolScale, 15, 1 * o.symbolScale];
    const add = (layer: Parameters<MapLibreMap['addLayer']>[0]) => {
      if (!map.getLayer(layer.id)) map.addLayer(layer, o.beforeId && map.getLayer(o.beforeId) ? o.beforeId : undefined);
    };
    const visible = (on: boolean) => (on ? 'visible' : 'none') as 'visible' | 'none';
    add({
      id: this.layerId('dots'),
      type: 'circle',
      source: this.sourceId,
      layout: { visibility: visible(o.show.dots) },
      paint: {
        'circle-radius': ['interpolate', ['linear'], ['zoom'], 8, 1.2, 14, 2.2],
        'circle-color': o.dotColor,
        'circle-opacity': 0.8,
      },
    });
    add({
      id: this.layerId('labels'),
      type: 'symbol',
      source: this.sourceId,
      minzoom: o.labelMinZoom,
      filter: ['!=', ['get', 'lbl'], ''],
      layout: {
        visibility: visible(o.show.labels),
        'icon-image': ['get', 'lbl'],
        // Labels stay upright on screen; they sit beside the symbol, off its strike line.
        'icon-rotation-alignment': 'viewport',
        'icon-pitch-alignment': 'viewport',
        'icon-offset': [14, 11],
        'icon-padding': 1,
        'icon-allow-overlap': false,
      },
    });
    add({
      id: this.layerId('symbols'),
      type: 'symbol',
      source: this.sourceId,
      layout: {
        visibility: visible(o.show.symbols),
        'icon-image': ['get', 'img'],
        'icon-rotate': ['get', 'rot'],
        'icon-rotation-alignment': 'map',
        'icon-pitch-alignment': 'map',
        'icon-size': size,
        'icon-padding': 0,
        // Below zoom 14 symbols thin out by collision (the dots below keep every station visible);
        // from 14 they stop blocking labels (a symbol's square box would cover its own label), and
        // from 15 every symbol is drawn.
        'icon-allow-overlap': ['step', ['zoom'], false, 15, true],
        'icon-ignore-placement': ['step', ['zoom'], false, 14, true],
      },
    });
    add({
      id: this.layerId('selection'),
      type: 'circle',
      source: this.sourceId,
      paint: {
        'circle-radius': ['interpolate', ['linear'], ['zoom'], 8, 4, 15, 9],
        'circle-color': 'rgba(0,0,0,0)',
        'circle-stroke-color': ['case', ['boolean', ['feature-state', 'hover'], false], '#0b6e8a', o.selectionColor],
        'circle-stroke-width': ['case', ['boolean', ['feature-state', 'hover'], false], 3, ['boolean', ['feature-state', 'selected'], false], 2, 0],
      },
    });
    add({
      id: this.layerId('selected-symbols'),
      type: 'symbol',
      source: `${this.sourceId}-selected`,
      layout: {
        visibility: visible(o.show.symbols),
        'icon-image': ['get', 'img'],
        'icon-rotate': ['get', 'rot'],
        'icon-rotation-alignment': 'map',
        'icon-pitch-alignment': 'map',
        'icon-size': size,
        'icon-allow-overlap': true,
        'icon-ignore-placement': true,
      },
    });
    // An invisible, generous hit area so stations are easy to click and hover with a finger.
    add({
      id: this.layerId('hit'),
      type: 'circle',
      source: this.sourceId,
      paint: { 'circle-radius': 10, 'circle-color': '#000', 'circle-opacity': 0 },
    });
    this.applyFilters();
    for (let i = 0; i < this.selectedFlags.length; i++) if (this.selectedFlags[i]) this.setState(i, { selected: true });
    this.updateSelectedSource();
  }
}
