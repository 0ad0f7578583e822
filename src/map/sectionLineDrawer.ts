import { Marker, type FilterSpecification, type GeoJSONSource, type Map as MapLibreMap } from 'maplibre-gl';
import type { Feature, FeatureCollection, Geometry } from 'geojson';
import {
  EMPTY_DRAFT,
  finishDraft,
  sectionLineFeatures,
  tapOnDraft,
  withVertex,
  withoutLastVertex,
  type LonLatPair,
  type SectionLineDraft,
} from '../core/sectionLineDraft';
import { swathOutline } from './sectionSwath';

/** Milliseconds after a line ends before the map's double-click zoom is given back (longer than a double click takes to arrive). */
const ZOOM_BACK_DELAY_MS = 600;

/** Options of {@link SectionLineDrawer}; every field has a default in {@link defaultSectionLineDrawerOptions}. */
export interface SectionLineDrawerOptions {
  /** Prefix of the source, layer and marker ids (default 'foldlens-section'). */
  readonly idPrefix: string;
  /** Colour of the line, its vertices and its swath (default a strong blue, apart from the selection's orange, the domains' violet and a map's reds and browns). */
  readonly color: string;
  /** How far in CSS px a press may move and still count as a tap, not a pan (default 6). */
  readonly tapTolerancePx: number;
  /** A tap this close (CSS px) to the last vertex finishes the line (default 10: a double click or double tap). */
  readonly finishRadiusPx: number;
  /** Swath half-width in metres drawn about the line; 0 draws none (default 0). */
  readonly swath: number;
}

/**
 * Defaults of {@link SectionLineDrawerOptions}.
 * @example new SectionLineDrawer(map, { ...defaultSectionLineDrawerOptions, swath: 250 })
 */
export const defaultSectionLineDrawerOptions: SectionLineDrawerOptions = Object.freeze({
  idPrefix: 'foldlens-section',
  color: '#1a47c8',
  tapTolerancePx: 6,
  finishRadiusPx: 10,
  swath: 0,
});

/** Detail of the drawer's events. */
export interface SectionLineEventDetail {
  /** Lon/lat vertices: the draft while drawing, the finished line on `sectionend`. */
  readonly vertices: readonly LonLatPair[];
  /** On `sectionproblem`: why the line cannot be finished yet. */
  readonly message?: string;
}

/**
 * Draws a section line on a MapLibre map: tap (click, pen or finger) each vertex; a double
 * click or double tap, a tap on the last vertex, Enter or {@link finish} ends the line;
 * Escape or {@link cancel} drops it; Backspace takes the last vertex back. The map still pans
 * and zooms while drawing (a press that moves is a pan, not a vertex); only its double-click
 * zoom is off. The line stays on the map after it is finished, with its swath (the area
 * within `swath` metres) shaded and "start" and "end" labels, until it is replaced or cleared.
 * The rules of a tap are in core/sectionLineDraft.ts.
 *
 * Events (CustomEvent on the drawer, detail {@link SectionLineEventDetail}): `sectionstart`,
 * `sectionchange` (a vertex added or taken back), `sectionend` (finished line), `sectioncancel`,
 * `sectionproblem` (finishing was asked with fewer than two points; drawing goes on).
 * @example
 * const drawer = new SectionLineDrawer(map, { swath: 500 });
 * drawer.addEventListener('sectionend', (e) => openSection(e.detail.vertices));
 * drawer.start();
 * // later: drawer.remove();
 */
export class SectionLineDrawer extends EventTarget {
  readonly options: SectionLineDrawerOptions;
  private readonly map: MapLibreMap;
  private swathMetres: number;
  private isDrawing = false;
  private draft: SectionLineDraft = EMPTY_DRAFT;
  private finished: readonly LonLatPair[] | null = null;
  private pointer: LonLatPair | null = null;
  private tap: { id: number; x: number; y: number } | null = null;
  private readonly down = new Set<number>();
  private doubleClickZoomWasOn = true;
  private zoomBackTimer: ReturnType<typeof setTimeout> | undefined;
  private frame = 0;
  private swathCache: { key: string; feature: Feature<Geometry> | null } = { key: '', feature: null };
  private markers: Marker[] = [];

  constructor(map: MapLibreMap, options: Partial<SectionLineDrawerOptions> = {}) {
    super();
    this.map = map;
    this.options = { ...defaultSectionLineDrawerOptions, ...options };
    this.swathMetres = this.options.swath;
    const el = map.getCanvasContainer();
    el.addEventListener('pointerdown', this.onDown);
    el.addEventListener('pointermove', this.onMove);
    el.addEventListener('pointerup', this.onUp);
    el.addEventListener('pointercancel', this.onPointerCancel);
    el.addEventListener('pointerleave', this.onLeave);
    window.addEventListener('keydown', this.onKey);
    map.on('style.load', this.install);
    // isStyleLoaded() is false while any source is loading (a drawer made then, e.g. for a trace
    // restored on load, would never show); getStyle() is defined as soon as the style itself is,
    // which is all that adding sources and layers needs.
    if (map.isStyleLoaded() || map.getStyle() !== undefined) this.install();
  }

  /** Id of the GeoJSON source with the line, its vertices and its swath. */
  get sourceId(): string {
    return this.options.idPrefix;
  }

  /** Ids of the layers drawn, bottom to top. */
  get layerIds(): readonly string[] {
    return ['swath', 'swath-edge', 'casing', 'line', 'pending', 'vertices'].map((r) => `${this.options.idPrefix}-${r}`);
  }

  /** Whether a line is being drawn. */
  get drawing(): boolean {
    return this.isDrawing;
  }

  /** The vertices drawn so far while drawing (lon/lat). */
  get vertices(): readonly LonLatPair[] {
    return this.draft.vertices;
  }

  /** The last finished line (lon/lat), or null. */
  get line(): readonly LonLatPair[] | null {
    return this.finished;
  }

  /** Swath half-width drawn about the line, metres (0: none). */
  get swath(): number {
    return this.swathMetres;
  }

  /** Sets the swath half-width drawn about the line, metres (0 or less: none). */
  setSwath(metres: number): void {
    this.swathMetres = Number.isFinite(metres) && metres > 0 ? metres : 0;
    this.draw();
  }

  /** Starts a new line; the last finished one is hidden until the new one ends (shown again on cancel). */
  start(): void {
    if (this.isDrawing) this.cancel();
    this.isDrawing = true;
    this.draft = EMPTY_DRAFT;
    this.pointer = null;
    this.tap = null;
    if (this.zoomBackTimer !== undefined) clearTimeout(this.zoomBackTimer);
    else this.doubleClickZoomWasOn = this.map.doubleClickZoom.isEnabled();
    this.zoomBackTimer = undefined;
    this.map.doubleClickZoom.disable();
    this.map.getCanvas().style.cursor = 'crosshair';
    this.emit('sectionstart');
    this.draw();
  }

  /** Adds a vertex from code (e.g. the map's centre, for keyboard users). Starts a line when none is being drawn. */
  addVertex(lonLat: LonLatPair): void {
    if (!this.isDrawing) this.start();
    this.draft = withVertex(this.draft, lonLat);
    this.emit('sectionchange');
    this.draw();
  }

  /** Takes the last vertex back. */
  undoVertex(): void {
    if (!this.isDrawing || this.draft.vertices.length === 0) return;
    this.draft = withoutLastVertex(this.draft);
    this.emit('sectionchange');
    this.draw();
  }

  /** Finishes the line; with fewer than two distinct points, fires `sectionproblem` and goes on drawing. Returns whether it finished. */
  finish(): boolean {
    if (!this.isDrawing) return false;
    const done = finishDraft(this.draft);
    if (done.line === null) {
      this.dispatchEvent(new CustomEvent<SectionLineEventDetail>('sectionproblem', { detail: { vertices: this.draft.vertices, message: done.problem } }));
      return false;
    }
    this.finished = done.line;
    this.stopDrawing();
    this.dispatchEvent(new CustomEvent<SectionLineEventDetail>('sectionend', { detail: { vertices: done.line } }));
    this.draw();
    return true;
  }

  /** Drops the line being drawn; the last finished line shows again. */
  cancel(): void {
    if (!this.isDrawing) return;
    this.stopDrawing();
    this.emit('sectioncancel');
    this.draw();
  }

  /** Shows a finished line (e.g. restored), or none. Does not fire `sectionend`. */
  setLine(line: ReadonlyArray<readonly [number, number]> | null): void {
    this.finished = line ? finishDraft({ vertices: line }).line : null;
    this.draw();
  }

  /** Removes handlers, layers, markers and the source, and gives the map its double-click zoom back. */
  remove(): void {
    const el = this.map.getCanvasContainer();
    el.removeEventListener('pointerdown', this.onDown);
    el.removeEventListener('pointermove', this.onMove);
    el.removeEventListener('pointerup', this.onUp);
    el.removeEventListener('pointercancel', this.onPointerCancel);
    el.removeEventListener('pointerleave', this.onLeave);
    window.removeEventListener('keydown', this.onKey);
    this.map.off('style.load', this.install);
    cancelAnimationFrame(this.frame);
    if (this.isDrawing) this.stopDrawing();
    if (this.zoomBackTimer !== undefined) {
      clearTimeout(this.zoomBackTimer);
      this.zoomBackTimer = undefined;
      if (this.doubleClickZoomWasOn) this.map.doubleClickZoom.enable();
    }
    for (const m of this.markers) m.remove();
    this.markers = [];
    if (!this.map.style) return;
    for (const id of [...this.layerIds].reverse()) if (this.map.getLayer(id)) this.map.removeLayer(id);
    if (this.map.getSource(this.sourceId)) this.map.removeSource(this.sourceId);
  }

  private stopDrawing(): void {
    this.isDrawing = false;
    this.draft = EMPTY_DRAFT;
    this.pointer = null;
    this.tap = null;
    this.down.clear();
    // The double click (or double tap) that finished the line is still on its way to the map's
    // zoom handler: give the zoom back only once it has passed.
    this.zoomBackTimer = setTimeout(() => {
      this.zoomBackTimer = undefined;
      if (this.doubleClickZoomWasOn) this.map.doubleClickZoom.enable();
    }, ZOOM_BACK_DELAY_MS);
    this.map.getCanvas().style.cursor = '';
  }

  private emit(type: string): void {
    this.dispatchEvent(new CustomEvent<SectionLineEventDetail>(type, { detail: { vertices: this.draft.vertices } }));
  }

  private readonly install = (): void => {
    const map = this.map;
    const p = this.options.idPrefix;
    const c = this.options.color;
    if (!map.getSource(this.sourceId)) map.addSource(this.sourceId, { type: 'geojson', data: { type: 'FeatureCollection', features: [] } });
    const role = (...roles: string[]): FilterSpecification => ['match', ['get', 'role'], roles, true, false];
    const layers: Parameters<MapLibreMap['addLayer']>[0][] = [
      { id: `${p}-swath`, type: 'fill', source: this.sourceId, filter: role('swath'), paint: { 'fill-color': c, 'fill-opacity': 0.1 } },
      { id: `${p}-swath-edge`, type: 'line', source: this.sourceId, filter: role('swath'), paint: { 'line-color': c, 'line-width': 1, 'line-opacity': 0.6, 'line-dasharray': [3, 2] } },
      { id: `${p}-casing`, type: 'line', source: this.sourceId, filter: role('line'), layout: { 'line-cap': 'round', 'line-join': 'round' }, paint: { 'line-color': '#ffffff', 'line-width': 6, 'line-opacity': 0.85 } },
      { id: `${p}-line`, type: 'line', source: this.sourceId, filter: role('line'), layout: { 'line-cap': 'round', 'line-join': 'round' }, paint: { 'line-color': c, 'line-width': 3 } },
      { id: `${p}-pending`, type: 'line', source: this.sourceId, filter: role('pending'), paint: { 'line-color': c, 'line-width': 2, 'line-dasharray': [2, 1.5] } },
      {
        id: `${p}-vertices`,
        type: 'circle',
        source: this.sourceId,
        filter: role('start', 'vertex', 'end'),
        paint: {
          'circle-radius': ['match', ['get', 'role'], 'vertex', 4, 6],
          'circle-color': ['match', ['get', 'role'], 'start', c, '#ffffff'],
          'circle-stroke-color': c,
          'circle-stroke-width': 2,
        },
      },
    ];
    for (const layer of layers) if (!map.getLayer(layer.id)) map.addLayer(layer);
    this.draw();
  };

  /** Screen position of a pointer event on the map, CSS px from the canvas container's corner. */
  private point(e: PointerEvent): LonLatPair {
    const rect = this.map.getCanvasContainer().getBoundingClientRect();
    return [e.clientX - rect.left, e.clientY - rect.top];
  }

  private lngLat(p: LonLatPair): LonLatPair {
    const ll = this.map.unproject([p[0], p[1]]);
    return [ll.lng, ll.lat];
  }

  private readonly project = (lonLat: LonLatPair): LonLatPair => {
    const p = this.map.project([lonLat[0], lonLat[1]]);
    return [p.x, p.y];
  };

  private readonly onDown = (e: PointerEvent): void => {
    if (!this.isDrawing || (e.pointerType === 'mouse' && e.button !== 0)) return;
    this.down.add(e.pointerId);
    // A second finger makes a pinch or a two-finger pan: no vertex from either.
    if (this.down.size > 1) this.tap = null;
    else {
      const [x, y] = this.point(e);
      this.tap = { id: e.pointerId, x, y };
    }
  };

  private readonly onMove = (e: PointerEvent): void => {
    if (!this.isDrawing) return;
    const p = this.point(e);
    if (this.tap && e.pointerId === this.tap.id && Math.hypot(p[0] - this.tap.x, p[1] - this.tap.y) > this.options.tapTolerancePx) this.tap = null;
    this.pointer = this.lngLat(p);
    this.requestDraw();
  };

  private readonly onUp = (e: PointerEvent): void => {
    this.down.delete(e.pointerId);
    if (!this.isDrawing || !this.tap || e.pointerId !== this.tap.id) return;
    this.tap = null;
    const p = this.point(e);
    const result = tapOnDraft(this.draft, this.lngLat(p), p, this.project, this.options.finishRadiusPx);
    if (result.action === 'finish') {
      this.finish();
      return;
    }
    if (result.action === 'added') {
      this.draft = result.draft;
      this.pointer = null;
      this.emit('sectionchange');
      this.draw();
    }
  };

  private readonly onPointerCancel = (e: PointerEvent): void => {
    this.down.delete(e.pointerId);
    if (this.tap?.id === e.pointerId) this.tap = null;
  };

  private readonly onLeave = (): void => {
    if (!this.isDrawing || this.pointer === null) return;
    this.pointer = null;
    this.requestDraw();
  };

  private readonly onKey = (e: KeyboardEvent): void => {
    if (!this.isDrawing || e.ctrlKey || e.metaKey || e.altKey) return;
    const target = e.composedPath()[0];
    const typing = target instanceof HTMLElement && (target.isContentEditable || ['INPUT', 'TEXTAREA', 'SELECT'].includes(target.tagName));
    if (e.key === 'Escape') this.cancel();
    else if (typing) return;
    else if (e.key === 'Enter') {
      e.preventDefault();
      this.finish();
    } else if (e.key === 'Backspace') {
      e.preventDefault();
      this.undoVertex();
    }
  };

  private requestDraw(): void {
    if (this.frame) return;
    this.frame = requestAnimationFrame(() => {
      this.frame = 0;
      this.draw();
    });
  }

  private swathFeature(vertices: readonly LonLatPair[]): Feature<Geometry> | null {
    const key = `${this.swathMetres}|${vertices.map((v) => v.join(',')).join(';')}`;
    if (this.swathCache.key !== key) {
      const outline = swathOutline(vertices, this.swathMetres);
      this.swathCache = { key, feature: outline ? { ...outline, properties: { role: 'swath' } } : null };
    }
    return this.swathCache.feature;
  }

  private draw(): void {
    const vertices = this.isDrawing ? this.draft.vertices : (this.finished ?? []);
    this.placeMarkers(vertices, !this.isDrawing);
    const source = this.map.getSource(this.sourceId) as GeoJSONSource | undefined;
    if (!source) return;
    const lines = sectionLineFeatures(vertices, this.isDrawing ? this.pointer : null, !this.isDrawing);
    const swath = vertices.length >= 2 ? this.swathFeature(vertices) : null;
    const data: FeatureCollection = { type: 'FeatureCollection', features: [...(swath ? [swath] : []), ...lines.features] };
    source.setData(data);
  }

  /** "start" and "end" labels as DOM markers (a map style need not have glyphs); they let every pointer through. */
  private placeMarkers(vertices: readonly LonLatPair[], finished: boolean): void {
    const wanted: { text: string; at: LonLatPair }[] = [];
    if (vertices.length >= 1) wanted.push({ text: 'start', at: vertices[0] });
    if (finished && vertices.length >= 2) wanted.push({ text: 'end', at: vertices[vertices.length - 1] });
    while (this.markers.length > wanted.length) this.markers.pop()!.remove();
    wanted.forEach((w, i) => {
      let marker = this.markers[i];
      if (!marker) {
        const el = document.createElement('span');
        el.className = `${this.options.idPrefix}-label`;
        Object.assign(el.style, {
          pointerEvents: 'none',
          font: '600 11px/1.2 system-ui, sans-serif',
          color: '#fff',
          background: this.options.color,
          padding: '1px 5px',
          borderRadius: '3px',
          whiteSpace: 'nowrap',
        });
        marker = new Marker({ element: el, anchor: 'bottom', offset: [0, -9] });
        this.markers.push(marker);
        marker.setLngLat([w.at[0], w.at[1]]).addTo(this.map);
      }
      marker.getElement().textContent = w.text;
      marker.setLngLat([w.at[0], w.at[1]]);
    });
  }
}
