import type { Map as MapLibreMap, GeoJSONSource } from 'maplibre-gl';
import type { Feature, Polygon, LineString } from 'geojson';
import type { SelectionCombine } from '../core/liveSelection';

/** The drawing tools. */
export type SelectionToolName = 'lasso' | 'polygon' | 'rectangle';

/** Detail of the drawer's events: the shape so far as a lon/lat ring (not closed). */
export interface ShapeEventDetail {
  readonly tool: SelectionToolName;
  readonly combine: SelectionCombine;
  /** Lon/lat vertices; for the lasso, `added` is the number of vertices appended since the last event. */
  readonly ring: ReadonlyArray<readonly [number, number]>;
  readonly added: number;
}

/** Minimum screen distance in CSS px between freehand lasso vertices. */
const LASSO_STEP_PX = 3;

/**
 * Captures selection gestures on a MapLibre map with pointer events (mouse, pen and touch):
 * freehand lasso (press and drag), rectangle (press and drag), polygon (click vertices; click
 * the first vertex, double-click or press Enter to finish). Shift adds to the selection, Alt
 * subtracts; on touch the combine mode comes from {@link SelectionDrawer.combine}. Escape
 * cancels. While a tool is active the map does not pan with the pointer.
 *
 * Keyboard (polygon tool, map focused): the map's own arrow keys and +/- move and zoom it under
 * a crosshair at the centre; Space drops a corner at the crosshair, Backspace takes back the
 * last one, Enter finishes and Escape cancels. A polite live region says what happened, so the
 * polygon can be drawn without a pointer or a screen.
 *
 * Events on the drawer: `shapestart`, `shapechange`, `shapeend`, `shapecancel`, each with
 * {@link ShapeEventDetail}.
 * @example
 * const drawer = new SelectionDrawer(map);
 * drawer.addEventListener('shapeend', (e) => console.log(e.detail));
 * drawer.setTool('polygon');
 */
export class SelectionDrawer extends EventTarget {
  /** Combine mode used when no modifier key is held (toolbar toggle, touch). */
  combine: SelectionCombine = 'replace';
  private readonly map: MapLibreMap;
  private readonly prefix: string;
  private tool: SelectionToolName | null = null;
  private ring: Array<[number, number]> = [];
  private screen: Array<[number, number]> = [];
  private active = false;
  private gestureCombine: SelectionCombine = 'replace';
  private pointerId = -1;
  private dragPanWasOn = true;
  private hover: [number, number] | null = null;
  /** The last finished shape, drawn until replaced or cleared. */
  private finished: Array<[number, number]> = [];
  /** Centre mark for keyboard drawing, and the live region that reads out each step. */
  private readonly crosshair: HTMLElement;
  private readonly announcer: HTMLElement;

  constructor(map: MapLibreMap, idPrefix = 'foldlens') {
    super();
    this.map = map;
    this.prefix = idPrefix;
    const el = map.getCanvasContainer();
    el.addEventListener('pointerdown', this.onDown);
    el.addEventListener('pointermove', this.onMove);
    el.addEventListener('pointerup', this.onUp);
    el.addEventListener('pointercancel', this.onCancelPointer);
    el.addEventListener('dblclick', this.onDoubleClick);
    el.addEventListener('keydown', this.onCanvasKey);
    window.addEventListener('keydown', this.onKey);
    this.crosshair = document.createElement('div');
    this.crosshair.className = 'foldlens-crosshair';
    this.crosshair.hidden = true;
    this.crosshair.setAttribute('aria-hidden', 'true');
    // Layout set through the CSSOM so it works without the stylesheet and under a strict CSP;
    // the look (colour, size) can be themed with the class in styles/foldlens.css.
    Object.assign(this.crosshair.style, { position: 'absolute', left: '50%', top: '50%', width: '24px', height: '24px', margin: '-12px 0 0 -12px', pointerEvents: 'none', zIndex: '2' });
    this.announcer = document.createElement('div');
    this.announcer.className = 'foldlens-announcer';
    Object.assign(this.announcer.style, { position: 'absolute', width: '1px', height: '1px', overflow: 'hidden', clip: 'rect(0 0 0 0)', whiteSpace: 'nowrap' });
    this.announcer.setAttribute('role', 'status');
    this.announcer.setAttribute('aria-live', 'polite');
    map.getContainer().append(this.crosshair, this.announcer);
    map.getCanvas().addEventListener('focus', this.updateCrosshair);
    map.getCanvas().addEventListener('blur', this.updateCrosshair);
    map.on('style.load', this.install);
    if (map.isStyleLoaded()) this.install();
  }

  get sourceId(): string {
    return `${this.prefix}-shape`;
  }

  /** The tool in use, or null when the map pans normally. */
  get currentTool(): SelectionToolName | null {
    return this.tool;
  }

  /** Activates a tool (null returns the pointer to panning). */
  setTool(tool: SelectionToolName | null): void {
    if (this.active) this.cancel();
    const wasPanning = this.tool === null;
    this.tool = tool;
    this.map.getCanvas().style.cursor = tool ? 'crosshair' : '';
    this.updateCrosshair();
    if (tool === 'polygon') this.announce('Polygon tool. On the focused map: arrow keys move the map under the centre cross, Space adds a corner there, Backspace removes the last corner, Enter finishes, Escape cancels.');
    if (tool) {
      // Remember the host's pan setting only when leaving pan mode, not when switching tools.
      if (wasPanning) this.dragPanWasOn = this.map.dragPan.isEnabled();
      this.map.dragPan.disable();
      this.map.doubleClickZoom.disable();
    } else {
      if (this.dragPanWasOn) this.map.dragPan.enable();
      this.map.doubleClickZoom.enable();
    }
  }

  /**
   * Starts a polygon from code (keyboard operation): adds a vertex at a lon/lat, finishing with
   * {@link finishPolygon}. Used by the keyboard selection in the toolbar.
   */
  addPolygonVertex(lngLat: readonly [number, number], combine: SelectionCombine = this.combine): void {
    if (!this.active) this.start('polygon', combine);
    this.ring.push([lngLat[0], lngLat[1]]);
    const p = this.map.project(lngLat as [number, number]);
    this.screen.push([p.x, p.y]);
    this.emit('shapechange', 1);
    this.draw();
  }

  /** Adds a polygon vertex at the centre of the map view (the keyboard's crosshair). */
  addVertexAtCentre(combine: SelectionCombine = this.combine): void {
    const c = this.map.getCenter();
    this.addPolygonVertex([c.lng, c.lat], this.active ? this.gestureCombine : combine);
    const n = this.ring.length;
    this.announce(`Corner ${n} at ${c.lat.toFixed(5)}, ${c.lng.toFixed(5)}.${n >= 3 ? ' Enter finishes the polygon.' : ` ${3 - n} more needed.`}`);
  }

  /** Takes back the last polygon vertex; cancels when none is left. */
  removeLastVertex(): void {
    if (!this.active || this.tool !== 'polygon') return;
    this.ring.pop();
    this.screen.pop();
    if (this.ring.length === 0) return this.cancel();
    this.emit('shapechange', 0);
    this.draw();
    this.announce(`Corner removed; ${this.ring.length} left.`);
  }

  /** Finishes the polygon being drawn (needs three vertices). */
  finishPolygon(): void {
    if (!this.active || this.ring.length < 3) return this.cancel();
    this.finish();
  }

  /** Cancels the shape being drawn. */
  cancel(): void {
    if (!this.active) return;
    this.active = false;
    this.emit('shapecancel', 0);
    this.ring = [];
    this.screen = [];
    this.draw();
  }

  /** Shows a finished outline (lon/lat ring), or none; e.g. a restored selection, or clear. */
  showOutline(ring: ReadonlyArray<readonly [number, number]> | null): void {
    this.finished = ring ? ring.map((p) => [p[0], p[1]] as [number, number]) : [];
    if (!this.active) this.draw();
  }

  /** Removes handlers, layers and the source. */
  remove(): void {
    const el = this.map.getCanvasContainer();
    el.removeEventListener('pointerdown', this.onDown);
    el.removeEventListener('pointermove', this.onMove);
    el.removeEventListener('pointerup', this.onUp);
    el.removeEventListener('pointercancel', this.onCancelPointer);
    el.removeEventListener('dblclick', this.onDoubleClick);
    el.removeEventListener('keydown', this.onCanvasKey);
    this.map.getCanvas().removeEventListener('focus', this.updateCrosshair);
    this.map.getCanvas().removeEventListener('blur', this.updateCrosshair);
    window.removeEventListener('keydown', this.onKey);
    this.map.off('style.load', this.install);
    if (this.tool) this.setTool(null);
    this.crosshair.remove();
    this.announcer.remove();
    if (!this.map.style) return;
    for (const id of [`${this.prefix}-shape-fill`, `${this.prefix}-shape-line`]) if (this.map.getLayer(id)) this.map.removeLayer(id);
    if (this.map.getSource(this.sourceId)) this.map.removeSource(this.sourceId);
  }

  private readonly install = (): void => {
    const map = this.map;
    if (!map.getSource(this.sourceId)) map.addSource(this.sourceId, { type: 'geojson', data: { type: 'FeatureCollection', features: [] } });
    if (!map.getLayer(`${this.prefix}-shape-fill`)) {
      map.addLayer({ id: `${this.prefix}-shape-fill`, type: 'fill', source: this.sourceId, filter: ['==', ['geometry-type'], 'Polygon'], paint: { 'fill-color': '#e8590c', 'fill-opacity': 0.08 } });
    }
    if (!map.getLayer(`${this.prefix}-shape-line`)) {
      map.addLayer({ id: `${this.prefix}-shape-line`, type: 'line', source: this.sourceId, paint: { 'line-color': '#e8590c', 'line-width': 2, 'line-dasharray': [2, 1] } });
    }
  };

  private combineFor(e: PointerEvent | MouseEvent): SelectionCombine {
    if (e.shiftKey) return 'add';
    if (e.altKey) return 'subtract';
    return this.combine;
  }

  private point(e: PointerEvent | MouseEvent): [number, number] {
    const rect = this.map.getCanvasContainer().getBoundingClientRect();
    return [e.clientX - rect.left, e.clientY - rect.top];
  }

  private lngLat(p: [number, number]): [number, number] {
    const ll = this.map.unproject(p);
    return [ll.lng, ll.lat];
  }

  private start(tool: SelectionToolName, combine: SelectionCombine): void {
    this.active = true;
    this.gestureCombine = combine;
    this.ring = [];
    this.screen = [];
    this.dispatchEvent(new CustomEvent<ShapeEventDetail>('shapestart', { detail: { tool, combine, ring: [], added: 0 } }));
  }

  private readonly onDown = (e: PointerEvent): void => {
    if (!this.tool || e.button > 0) return;
    const p = this.point(e);
    if (this.tool === 'polygon') {
      if (this.active && this.screen.length >= 3) {
        const [fx, fy] = this.screen[0];
        if (Math.hypot(p[0] - fx, p[1] - fy) < 10) return this.finish();
      }
      this.addPolygonVertex(this.lngLat(p), this.active ? this.gestureCombine : this.combineFor(e));
      return;
    }
    e.preventDefault();
    this.pointerId = e.pointerId;
    try {
      // Keeps the gesture when a finger or pen strays off the map; not every pointer can be captured.
      this.map.getCanvasContainer().setPointerCapture(e.pointerId);
    } catch {
      /* drawing continues without capture */
    }
    this.start(this.tool, this.combineFor(e));
    this.screen = [p];
    this.ring = [this.lngLat(p)];
    if (this.tool === 'rectangle') this.setRectangle(p, p);
    this.emit('shapechange', 1);
    this.draw();
  };

  private readonly onMove = (e: PointerEvent): void => {
    if (!this.tool) return;
    const p = this.point(e);
    if (this.tool === 'polygon') {
      this.hover = this.active ? p : null;
      if (this.active) this.draw();
      return;
    }
    if (!this.active || e.pointerId !== this.pointerId) return;
    if (this.tool === 'rectangle') {
      this.setRectangle(this.screen[0], p);
      this.emit('shapechange', 0);
      this.draw();
      return;
    }
    const last = this.screen[this.screen.length - 1];
    if (Math.hypot(p[0] - last[0], p[1] - last[1]) < LASSO_STEP_PX) return;
    this.screen.push(p);
    this.ring.push(this.lngLat(p));
    this.emit('shapechange', 1);
    this.draw();
  };

  private readonly onUp = (e: PointerEvent): void => {
    if (!this.tool || this.tool === 'polygon' || !this.active || e.pointerId !== this.pointerId) return;
    this.pointerId = -1;
    if (this.ring.length < 3) return this.cancel();
    this.finish();
  };

  private readonly onCancelPointer = (e: PointerEvent): void => {
    if (e.pointerId === this.pointerId) this.cancel();
  };

  private readonly onDoubleClick = (e: MouseEvent): void => {
    if (this.tool !== 'polygon' || !this.active) return;
    e.preventDefault();
    // The double click's two clicks each added a vertex at the same spot; keep one.
    if (this.ring.length > 3) {
      this.ring.pop();
      this.screen.pop();
    }
    this.finishPolygon();
  };

  private readonly onKey = (e: KeyboardEvent): void => {
    if (!this.active) return;
    if (e.key === 'Escape') {
      this.cancel();
      if (this.tool === 'polygon') this.announce('Polygon cancelled.');
    } else if (e.key === 'Enter' && this.tool === 'polygon') {
      const n = this.ring.length;
      this.finishPolygon();
      this.announce(n >= 3 ? `Polygon of ${n} corners finished.` : 'A polygon needs three corners; cancelled.');
    }
  };

  /** Space and Backspace on the focused map; the map keeps its own arrow and zoom keys. */
  private readonly onCanvasKey = (e: KeyboardEvent): void => {
    if (this.tool !== 'polygon' || e.ctrlKey || e.metaKey || e.altKey) return;
    if (e.key === ' ') {
      e.preventDefault();
      this.addVertexAtCentre(e.shiftKey ? 'add' : this.combine);
    } else if (e.key === 'Backspace') {
      e.preventDefault();
      this.removeLastVertex();
    }
  };

  /** The centre cross shows only while the polygon tool is on and the map has keyboard focus. */
  private readonly updateCrosshair = (): void => {
    this.crosshair.hidden = !(this.tool === 'polygon' && document.activeElement === this.map.getCanvas());
  };

  private announce(text: string): void {
    this.announcer.textContent = text;
  }

  private setRectangle(a: [number, number], b: [number, number]): void {
    // Four screen corners; unprojected they form the ground polygon seen on screen at any bearing/pitch.
    this.screen = [a, [b[0], a[1]], b, [a[0], b[1]]];
    this.ring = this.screen.map((p) => this.lngLat(p));
  }

  private finish(): void {
    this.active = false;
    this.hover = null;
    this.finished = this.ring.slice();
    this.emit('shapeend', 0);
    this.ring = [];
    this.screen = [];
    this.draw();
  }

  private emit(type: string, added: number): void {
    const tool = this.tool ?? 'polygon';
    this.dispatchEvent(new CustomEvent<ShapeEventDetail>(type, { detail: { tool, combine: this.gestureCombine, ring: this.ring.slice(), added } }));
  }

  private draw(): void {
    const source = this.map.getSource(this.sourceId) as GeoJSONSource | undefined;
    if (!source) return;
    const ring = !this.active ? this.finished : this.hover && this.tool === 'polygon' ? [...this.ring, this.lngLat(this.hover)] : this.ring;
    const features: Array<Feature<Polygon | LineString>> = [];
    if (ring.length >= 3) features.push({ type: 'Feature', properties: {}, geometry: { type: 'Polygon', coordinates: [[...ring, ring[0]]] } });
    else if (ring.length === 2) features.push({ type: 'Feature', properties: {}, geometry: { type: 'LineString', coordinates: ring } });
    source.setData({ type: 'FeatureCollection', features });
  }
}
