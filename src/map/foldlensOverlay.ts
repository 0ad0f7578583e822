import type { Map as MapLibreMap, MapMouseEvent, GeoJSONSource, FilterSpecification, ExpressionSpecification } from 'maplibre-gl';
import type { Station } from '../core/station';
import { mapImageBox, mapImageFor } from './symbolImages';
import {
  ALL_SYMBOLS_ZOOM,
  KIND_CODES,
  SIZE_STOPS,
  SYMBOL_IMAGE_CODES,
  imageNamesOf,
  kindFilter,
  labelImageExpression,
  overlayFeatures,
  symbolImageExpression,
  symbolOffsetExpression,
  symbolSizeAt,
  type OverlayFeatureProperties,
} from './overlayFeatures';
import { StationTooltip } from './stationTooltip';
import { StationPicker } from './stationPicker';
import { SymbolGlLayer, isSymbolGlLayerSupported, type SymbolImage } from './symbolGlLayer';
import type { Feature, FeatureCollection, Point } from 'geojson';

/** Options of {@link attachFoldlens}; every field has a default in {@link defaultOverlayOptions}. */
export interface FoldlensOverlayOptions {
  /** Prefix of every source and layer id Foldlens adds, so they never clash with the host's. */
  readonly idPrefix: string;
  /** Id of a host layer to insert Foldlens layers below; undefined puts them on top. */
  readonly beforeId?: string;
  /** Which layers to show. */
  readonly show: { readonly symbols: boolean; readonly labels: boolean; readonly dots: boolean };
  /** Symbol size factor (1: symbols at their drawn size from zoom 15 on, a strike line 26 CSS px long). */
  readonly symbolScale: number;
  /** Labels appear from this zoom on. */
  readonly labelMinZoom: number;
  /** A small text tooltip (id, kind, attitude) beside the station under the pointer. */
  readonly tooltip: boolean;
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
  tooltip: false,
  dotColor: '#1d2326',
  selectionColor: '#e8590c',
};

/** Selected stations whose symbols are drawn above the thinning; larger selections show rings only. */
const MAX_LIFTED_SYMBOLS = 5000;
/** A station is under the pointer within this many CSS px (generous, for fingers). */
const PICK_RADIUS_PX = 10;

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
 * Drawing 10^5 stations: below zoom 15 symbols and labels are thinned on a grid per zoom
 * (`zoomThinning.ts`) and then by MapLibre's collision test, with a dot for every station; from
 * zoom 15 every symbol is drawn by one custom layer (`symbolGlLayer.ts`), which needs neither
 * layout in the map's worker nor placement on each frame. The station under the pointer is
 * found in a kd-tree (`stationPicker.ts`), and the selection rings' layer is laid out only once
 * something is selected or highlighted. The option `tooltip` adds a hover tooltip (`stationTooltip.ts`).
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
  private features: FeatureCollection<Point, OverlayFeatureProperties> = { type: 'FeatureCollection', features: [] };
  private readonly tooltip: StationTooltip | null;
  private readonly glSymbols: SymbolGlLayer;
  private selectedFlags = new Uint8Array(0);
  private hovered = -1;
  private picker = new StationPicker([]);
  private selectedCount = 0;
  /** Whether the ring layer is shown: only once something was selected or highlighted (see install). */
  private ringsShown = false;
  private visibleKinds: ReadonlySet<string> | null = null;
  private readonly addedImages = new Set<string>();
  private removed = false;

  constructor(map: MapLibreMap, options: Partial<FoldlensOverlayOptions> = {}) {
    super();
    this.map = map;
    this.options = { ...defaultOverlayOptions, ...options, show: { ...defaultOverlayOptions.show, ...options.show } };
    map.on('style.load', this.onStyleLoad);
    map.on('click', this.onClick);
    map.on('mousemove', this.onHover);
    map.on('mouseout', this.onLeave);
    map.on('terrain', this.onRenderingChange);
    map.on('projectiontransition', this.onRenderingChange);
    this.tooltip = this.options.tooltip ? new StationTooltip(map, this) : null;
    const scale = this.options.symbolScale;
    this.glSymbols = new SymbolGlLayer(this.layerId('symbols-gl'), { minZoom: ALL_SYMBOLS_ZOOM, sizeAt: (z) => symbolSizeAt(z, scale) });
    if (map.isStyleLoaded()) this.install();
  }

  /** Source id of the stations. */
  get sourceId(): string {
    return `${this.options.idPrefix}-stations`;
  }

  /**
   * Layer id for a role. Symbols: 'symbols' is a symbol layer that draws them where they thin
   * out (below zoom 15), 'symbols-gl' a custom layer that draws all of them from zoom 15 (on
   * globe or terrain, where it cannot draw, 'symbols' draws at every zoom).
   */
  layerId(role: 'dots' | 'symbols' | 'symbols-gl' | 'labels' | 'selection' | 'selected-symbols'): string {
    return `${this.options.idPrefix}-${role}`;
  }

  /** Every layer id Foldlens owns, bottom to top. */
  get layerIds(): string[] {
    return (['dots', 'labels', 'symbols', 'symbols-gl', 'selection', 'selected-symbols'] as const).map((r) => this.layerId(r));
  }

  /** Replaces the stations on the map. Unusable stations are not drawn (they remain in the caller's data). */
  setStations(stations: readonly Station[]): void {
    this.stations = stations;
    this.selectedFlags = new Uint8Array(stations.length);
    this.selectedCount = 0;
    this.hovered = -1;
    // The new data reloads every tile anyway: the rings wait again until something is marked.
    this.showRings(false);
    this.refreshFeatures();
    this.updateSelectedSource();
  }

  /**
   * How many symbols the map showed in its last frame from the custom layer that draws every
   * symbol from zoom 15 (0 below that zoom, or where that layer cannot draw). For checks such
   * as the benchmark's, which cannot count those symbols with the map's feature queries.
   */
  get symbolsDrawnAtFullZoom(): number {
    return this.glSymbols.drawnSymbols;
  }

  /** The stations last given to setStations. */
  getStations(): readonly Station[] {
    return this.stations;
  }

  /** Shows only these kinds (null shows all). */
  setVisibleKinds(kinds: Iterable<string> | null): void {
    this.visibleKinds = kinds === null ? null : new Set(kinds);
    // Thinning is among the stations shown, so a hidden kind leaves no gaps in the others.
    this.refreshFeatures();
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
      if (on !== (prev[i] ?? 0)) {
        this.setState(i, { selected: on === 1 });
        this.selectedCount += on === 1 ? 1 : -1;
      }
    }
    this.selectedFlags = next.slice();
    if (this.selectedCount > 0) this.showRings(true);
    if (final) this.updateSelectedSource();
  }

  /** Highlights one station (by index, -1 for none), e.g. when hovering its point in a net. */
  setHighlight(index: number): void {
    if (this.hovered === index) return;
    if (this.hovered >= 0) this.setState(this.hovered, { hover: false });
    this.hovered = index;
    if (index >= 0) {
      this.setState(index, { hover: true });
      this.showRings(true);
    }
  }

  /** Removes every source, layer, image and handler Foldlens added. */
  remove(): void {
    if (this.removed) return;
    this.removed = true;
    const map = this.map;
    map.off('style.load', this.onStyleLoad);
    map.off('click', this.onClick);
    map.off('mousemove', this.onHover);
    map.off('mouseout', this.onLeave);
    map.off('terrain', this.onRenderingChange);
    map.off('projectiontransition', this.onRenderingChange);
    this.tooltip?.remove();
    if (!map.style) return;
    for (const id of [...this.layerIds].reverse()) if (map.getLayer(id)) map.removeLayer(id);
    for (const id of [this.sourceId, `${this.sourceId}-selected`]) if (map.getSource(id)) map.removeSource(id);
    for (const id of this.addedImages) if (map.hasImage(id)) map.removeImage(id);
    this.addedImages.clear();
  }

  /**
   * Rebuilds what is drawn from the stations and the kinds shown: the features (thinned among
   * the kinds shown) for the map's source, and from the features of the kinds shown, found once,
   * the picker's tree and the custom layer's symbols.
   */
  private refreshFeatures(): void {
    const o = this.options;
    this.features = overlayFeatures(this.stations, { visibleKinds: this.visibleKinds, symbolScale: o.symbolScale, labelMinZoom: o.labelMinZoom, thin: true });
    const kinds = this.visibleKinds;
    const shown = kinds ? this.features.features.filter((f) => kinds.has(KIND_CODES[f.properties.k])) : this.features.features;
    this.picker = new StationPicker(shown.map((f) => ({ index: f.id as number, lon: f.geometry.coordinates[0], lat: f.geometry.coordinates[1] })));
    this.ensureImages();
    (this.map.getSource(this.sourceId) as GeoJSONSource | undefined)?.setData(this.features);
    this.updateGlSymbols(shown);
  }

  /**
   * Shows or hides the ring layer. It stays hidden until a station is selected or highlighted:
   * a hidden layer costs the map's worker nothing, a shown one a bucket of every station on
   * every tile, which with 10^5 stations is as much as drawing them all as circles. Once shown
   * it stays, until new stations reload every tile anyway.
   */
  private showRings(on: boolean): void {
    if (on === this.ringsShown) return;
    this.ringsShown = on;
    const id = this.layerId('selection');
    if (this.map.getLayer(id)) this.map.setLayoutProperty(id, 'visibility', on ? 'visible' : 'none');
  }

  /** Hands the symbols of the kinds shown to the custom layer, with their images at the map's pixel ratio. */
  private updateGlSymbols(shown: ReadonlyArray<Feature<Point, OverlayFeatureProperties>>): void {
    if (!this.options.show.symbols) return;
    const n = shown.length;
    const lon = new Float64Array(n);
    const lat = new Float64Array(n);
    const image = new Uint16Array(n);
    const rotation = new Float32Array(n);
    const images = new Map<number, SymbolImage>();
    const ratio = Math.max(1, Math.ceil(this.map.getPixelRatio()));
    shown.forEach((f, k) => {
      [lon[k], lat[k]] = f.geometry.coordinates;
      image[k] = f.properties.i;
      rotation[k] = f.properties.r;
      if (!images.has(f.properties.i)) {
        const id = SYMBOL_IMAGE_CODES[f.properties.i];
        images.set(f.properties.i, { image: mapImageFor(id, ratio)!, box: mapImageBox(id)! });
      }
    });
    this.glSymbols.setSymbols({ lon, lat, image, rotation }, images);
  }

  /**
   * Where the custom layer can draw (flat Web Mercator, no terrain), the symbol layers stop at
   * ALL_SYMBOLS_ZOOM and the custom layer takes over; elsewhere they draw at every zoom.
   */
  private applySymbolZoomRange(): void {
    const top = isSymbolGlLayerSupported(this.map) ? ALL_SYMBOLS_ZOOM : 24;
    for (const id of [this.layerId('symbols'), this.layerId('selected-symbols')]) if (this.map.getLayer(id)) this.map.setLayerZoomRange(id, 0, top);
  }

  private readonly onRenderingChange = (): void => {
    if (!this.removed && this.map.style) this.applySymbolZoomRange();
  };

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
    const all = overlayFeatures(
      picked.map((i) => this.stations[i]),
      { visibleKinds: null, symbolScale: this.options.symbolScale, labelMinZoom: this.options.labelMinZoom, thin: false },
    );
    // overlayFeatures numbers features by position in its input; give them the real indices back.
    const features = all.features.map((f) => ({ ...f, id: picked[f.id as number] }));
    source.setData({ type: 'FeatureCollection', features });
  }

  private kindFilter(): FilterSpecification | undefined {
    return this.visibleKinds ? kindFilter(this.visibleKinds) : undefined;
  }

  private applyFilters(): void {
    const kind = this.kindFilter();
    const withKind = (f: FilterSpecification): FilterSpecification => (kind ? (['all', kind, f] as FilterSpecification) : f);
    // Filters may read the zoom: a tile keeps only the marks drawn at its zoom, so no tile
    // lays out (or overflows with) marks that thinning would hide.
    const symbolShown: FilterSpecification = ['>=', ['zoom'], ['get', 'sz']];
    const labelShown: FilterSpecification = ['all', ['>=', ['get', 'd'], 0], ['>=', ['zoom'], ['get', 'lz']]];
    const set = (id: string, filter: FilterSpecification | undefined) => {
      if (this.map.getLayer(id)) this.map.setFilter(id, filter ?? null);
    };
    set(this.layerId('dots'), kind);
    set(this.layerId('symbols'), withKind(symbolShown));
    set(this.layerId('selection'), kind);
    set(this.layerId('selected-symbols'), kind);
    set(this.layerId('labels'), withKind(labelShown));
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
    for (const id of imageNamesOf(this.features.features)) {
      if (this.map.hasImage(id)) continue;
      const image = mapImageFor(id, ratio);
      if (!image) continue;
      this.map.addImage(id, { width: image.width, height: image.height, data: image.data }, { pixelRatio: image.pixelRatio });
      this.addedImages.add(id);
    }
  }

  private readonly onClick = (e: MapMouseEvent): void => {
    const index = this.picker.nearest(this.map, e.point, PICK_RADIUS_PX);
    if (index >= 0) this.dispatchEvent(new CustomEvent<StationEventDetail>('stationclick', { detail: { index, station: this.stations[index] ?? null } }));
  };

  private readonly onHover = (e: MapMouseEvent): void => {
    const index = this.picker.nearest(this.map, e.point, PICK_RADIUS_PX);
    if (index < 0 && this.hovered < 0) return; // nothing under the pointer, nothing was
    this.map.getCanvas().style.cursor = index >= 0 ? 'pointer' : '';
    if (index === this.hovered) return;
    this.setHighlight(index);
    this.dispatchEvent(new CustomEvent<StationEventDetail>('stationhover', { detail: { index, station: this.stations[index] ?? null } }));
  };

  private readonly onLeave = (): void => {
    if (this.hovered < 0) return;
    this.map.getCanvas().style.cursor = '';
    this.setHighlight(-1);
    this.dispatchEvent(new CustomEvent<StationEventDetail>('stationhover', { detail: { index: -1, station: null } }));
  };

  private install(): void {
    const map = this.map;
    const o = this.options;
    this.ensureImages();
    if (!map.getSource(this.sourceId)) map.addSource(this.sourceId, { type: 'geojson', data: this.features });
    if (!map.getSource(`${this.sourceId}-selected`)) map.addSource(`${this.sourceId}-selected`, { type: 'geojson', data: { type: 'FeatureCollection', features: [] } });
    const size = ['interpolate', ['linear'], ['zoom'], ...SIZE_STOPS.flatMap(([z, f]) => [z, f * o.symbolScale])] as ExpressionSpecification;
    const image = symbolImageExpression();
    const offset = symbolOffsetExpression();
    const add = (layer: Parameters<MapLibreMap['addLayer']>[0]) => {
      if (!map.getLayer(layer.id)) map.addLayer(layer, o.beforeId && map.getLayer(o.beforeId) ? o.beforeId : undefined);
    };
    const visible = (on: boolean) => (on ? 'visible' : 'none') as 'visible' | 'none';
    add({
      id: this.layerId('dots'),
      type: 'circle',
      source: this.sourceId,
      // With symbols shown, dots are for the stations whose symbols thin out, below ALL_SYMBOLS_ZOOM.
      ...(o.show.symbols ? { maxzoom: ALL_SYMBOLS_ZOOM } : {}),
      layout: { visibility: visible(o.show.dots) },
      paint: {
        'circle-radius': ['interpolate', ['linear'], ['zoom'], 8, 1.2, 14, 2.2],
        'circle-color': o.dotColor,
        'circle-opacity': 0.8,
        // A thin light halo, like the symbols', so dots read on dark basemaps too.
        'circle-stroke-width': 0.8,
        'circle-stroke-color': '#ffffff',
        'circle-stroke-opacity': 0.8,
      },
    });
    add({
      id: this.layerId('labels'),
      type: 'symbol',
      source: this.sourceId,
      minzoom: o.labelMinZoom,
      filter: ['>=', ['get', 'd'], 0],
      layout: {
        visibility: visible(o.show.labels),
        'icon-image': labelImageExpression(),
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
        'icon-image': image,
        'icon-rotate': ['get', 'r'],
        'icon-rotation-alignment': 'map',
        'icon-pitch-alignment': 'map',
        'icon-size': size,
        'icon-offset': offset,
        'icon-padding': 0,
        // Below zoom 14 symbols thin out by grid and collision (the dots below keep every station
        // visible); from 14 they stop blocking labels (a symbol's box would cover its own label),
        // and from 15 every symbol is drawn.
        'icon-allow-overlap': ['step', ['zoom'], false, ALL_SYMBOLS_ZOOM, true],
        'icon-ignore-placement': ['step', ['zoom'], false, 14, true],
        // Flat marks need no back-to-front order; sorting 10^5 of them by screen y on every turn of the map costs.
        'symbol-z-order': 'source',
      },
    });
    // Rings exist only for selected or hovered stations: a radius of 0 for the others gives the
    // GPU nothing to fill, where a transparent ring would cost every station a 22 px square.
    const marked: ExpressionSpecification = ['any', ['boolean', ['feature-state', 'selected'], false], ['boolean', ['feature-state', 'hover'], false]];
    if (o.show.symbols && !map.getLayer(this.glSymbols.id)) map.addLayer(this.glSymbols, o.beforeId && map.getLayer(o.beforeId) ? o.beforeId : undefined);
    add({
      id: this.layerId('selection'),
      type: 'circle',
      source: this.sourceId,
      layout: { visibility: this.ringsShown ? 'visible' : 'none' },
      paint: {
        'circle-radius': ['interpolate', ['linear'], ['zoom'], 8, ['case', marked, 4, 0], 15, ['case', marked, 9, 0]],
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
        'icon-image': image,
        'icon-rotate': ['get', 'r'],
        'icon-rotation-alignment': 'map',
        'icon-pitch-alignment': 'map',
        'icon-size': size,
        'icon-offset': offset,
        'icon-allow-overlap': true,
        'icon-ignore-placement': true,
        'symbol-z-order': 'source',
      },
    });
    this.applyFilters();
    this.applySymbolZoomRange();
    for (let i = 0; i < this.selectedFlags.length; i++) if (this.selectedFlags[i]) this.setState(i, { selected: true });
    this.updateSelectedSource();
  }
}
