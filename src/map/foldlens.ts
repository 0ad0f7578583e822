import type { Map as MapLibreMap } from 'maplibre-gl';
import type { Station } from '../core/station';
import { isUsable } from '../core/station';
import { LiveSelection, type SelectionCombine } from '../core/liveSelection';
import { lonLatToMercator } from '../core/webMercator';
import { fitGirdleFromSums, type GirdleFit } from '../core/girdle';
import { lineToVector, poleOf } from '../core/vectors';
import { FoldlensOverlay, type FoldlensOverlayOptions } from './foldlensOverlay';
import { SelectionDrawer, type SelectionToolName, type ShapeEventDetail } from './selectionDrawer';

/** Detail of the `selectionchange` event. */
export interface SelectionChangeDetail {
  /** Selected station indices (into the array given to setStations), ascending. */
  readonly indices: Int32Array;
  /** Selected planar stations with a pole (the n of the fold analysis). */
  readonly planeCount: number;
  /** Girdle fit of the selected poles, from running tensor sums; null with fewer than 1 pole. */
  readonly quickFit: GirdleFit | null;
  /** False while a shape is being drawn, true when the gesture (or a code change) is complete. */
  readonly final: boolean;
  /** The last finished shape as a lon/lat ring, when the selection came from one. */
  readonly shape: ReadonlyArray<readonly [number, number]> | null;
}

/**
 * Foldlens attached to a MapLibre map: orientation symbols ({@link FoldlensOverlay}), selection
 * tools ({@link SelectionDrawer}) and a live selection whose girdle fit updates on every move.
 *
 * Events (CustomEvent on this object): `selectionchange` ({@link SelectionChangeDetail}),
 * `stationclick` and `stationhover` (forwarded from the overlay).
 * @example
 * const foldlens = new Foldlens(map); // or attachFoldlens(map)
 * foldlens.setStations(stations);
 * foldlens.addEventListener('selectionchange', (e) => console.log(e.detail.indices.length));
 * foldlens.setTool('lasso');
 */
export class Foldlens extends EventTarget {
  readonly map: MapLibreMap;
  readonly overlay: FoldlensOverlay;
  readonly drawer: SelectionDrawer;
  private stations: readonly Station[] = [];
  private selection: LiveSelection = new LiveSelection(new Float64Array(0));
  private frame = 0;
  private lastShape: Array<readonly [number, number]> | null = null;
  private drawing: Array<readonly [number, number]> = [];

  constructor(map: MapLibreMap, options: Partial<FoldlensOverlayOptions> = {}) {
    super();
    this.map = map;
    this.overlay = new FoldlensOverlay(map, options);
    this.drawer = new SelectionDrawer(map, this.overlay.options.idPrefix);
    this.drawer.addEventListener('shapestart', this.onShape as EventListener);
    this.drawer.addEventListener('shapechange', this.onShape as EventListener);
    this.drawer.addEventListener('shapeend', this.onShape as EventListener);
    this.drawer.addEventListener('shapecancel', this.onShape as EventListener);
    for (const type of ['stationclick', 'stationhover']) {
      this.overlay.addEventListener(type, (e) => {
        // The click that ends a lasso or box is part of the drawing, not a request to inspect a station.
        if (type === 'stationclick' && this.drawer.currentTool) return;
        this.dispatchEvent(new CustomEvent(type, { detail: (e as CustomEvent).detail }));
      });
    }
  }

  /** Replaces the stations; clears the selection. */
  setStations(stations: readonly Station[]): void {
    this.stations = stations;
    this.overlay.setStations(stations);
    const n = stations.length;
    const xy = new Float64Array(2 * n);
    const poles = new Float64Array(3 * n);
    stations.forEach((s, i) => {
      const drawable = isUsable(s) && s.lon !== undefined && s.lat !== undefined;
      // Stations that cannot be drawn cannot be lassoed either: park them far outside the square.
      const [x, y] = drawable ? lonLatToMercator(s.lon!, s.lat!) : [-1e6, -1e6];
      xy[2 * i] = x;
      xy[2 * i + 1] = y;
      if (drawable && s.plane) {
        const v = lineToVector(poleOf(s.plane));
        poles.set([v.x, v.y, v.z], 3 * i);
      } else poles.set([NaN, NaN, NaN], 3 * i);
    });
    this.selection = new LiveSelection(xy, poles);
    this.lastShape = null;
    this.publish(true);
  }

  getStations(): readonly Station[] {
    return this.stations;
  }

  /** Activates a drawing tool, or null to pan. */
  setTool(tool: SelectionToolName | null): void {
    this.drawer.setTool(tool);
  }

  /** Combine mode used without modifier keys (touch, toolbar). */
  setCombine(combine: SelectionCombine): void {
    this.drawer.combine = combine;
  }

  /** Selects the stations inside a lon/lat ring, combined with the current selection. */
  selectWithin(ring: ReadonlyArray<readonly [number, number]>, combine: SelectionCombine = 'replace'): void {
    this.selection.begin(combine);
    this.selection.setShape(ring.flatMap(([lon, lat]) => lonLatToMercator(lon, lat)));
    this.lastShape = ring.map((p) => [p[0], p[1]] as const);
    this.drawer.showOutline(this.lastShape);
    this.selection.resync();
    this.publish(true);
  }

  /** Selects every drawable station of the given kinds (combined with the current selection). */
  selectKinds(kinds: Iterable<string>, combine: SelectionCombine = 'replace'): void {
    const wanted = new Set(kinds);
    const flags = combine === 'replace' ? new Uint8Array(this.stations.length) : this.selection.flags.slice();
    this.stations.forEach((s, i) => {
      if (!s.kind || !wanted.has(s.kind) || !isUsable(s) || s.lon === undefined) return;
      flags[i] = combine === 'subtract' ? 0 : 1;
    });
    this.selection.setSelected(flags);
    this.lastShape = null;
    this.drawer.showOutline(null);
    this.publish(true);
  }

  /**
   * Selects stations by index (e.g. to restore a saved selection), replacing the selection;
   * `outline` (a lon/lat ring) is drawn and reported as its shape, or none is.
   */
  selectIndices(indices: Iterable<number>, outline: ReadonlyArray<readonly [number, number]> | null = null): void {
    const flags = new Uint8Array(this.stations.length);
    for (const i of indices) if (i >= 0 && i < flags.length) flags[i] = 1;
    this.selection.setSelected(flags);
    this.lastShape = outline ? outline.map((p) => [p[0], p[1]] as const) : null;
    this.drawer.showOutline(this.lastShape);
    this.publish(true);
  }

  clearSelection(): void {
    this.selection.clear();
    this.lastShape = null;
    this.drawer.showOutline(null);
    this.publish(true);
  }

  /** Current selection as station indices. */
  selectedIndices(): Int32Array {
    return this.selection.selectedIndices();
  }

  /** The last finished selection shape (lon/lat ring), or null. */
  get shape(): ReadonlyArray<readonly [number, number]> | null {
    return this.lastShape;
  }

  /** Removes everything Foldlens added to the map. */
  remove(): void {
    cancelAnimationFrame(this.frame);
    this.drawer.remove();
    this.overlay.remove();
  }

  private readonly onShape = (e: CustomEvent<ShapeEventDetail>): void => {
    const d = e.detail;
    switch (e.type) {
      case 'shapestart':
        this.selection.begin(d.combine);
        this.drawing = [];
        return;
      case 'shapechange':
        if (d.tool === 'lasso') {
          for (let k = d.ring.length - d.added; k < d.ring.length; k++) {
            const [x, y] = lonLatToMercator(d.ring[k][0], d.ring[k][1]);
            this.selection.addLassoVertex(x, y);
          }
        } else this.selection.setShape(d.ring.flatMap(([lon, lat]) => lonLatToMercator(lon, lat)));
        this.drawing = d.ring.slice();
        this.schedule();
        return;
      case 'shapeend':
        this.selection.resync();
        // Only a shape that replaced the selection outlines it; after Add or Remove no single ring does.
        this.lastShape = d.combine === 'replace' ? this.drawing.slice() : null;
        if (!this.lastShape) this.drawer.showOutline(null);
        this.publish(true);
        return;
      case 'shapecancel':
        // Back to the selection before the gesture.
        this.selection.cancel();
        this.publish(true);
        return;
    }
  };

  private schedule(): void {
    if (this.frame) return;
    this.frame = requestAnimationFrame(() => {
      this.frame = 0;
      this.publish(false);
    });
  }

  private publish(final: boolean): void {
    if (final && this.frame) {
      cancelAnimationFrame(this.frame);
      this.frame = 0;
    }
    this.overlay.setSelection(this.selection.flags, final);
    const sums = this.selection.tensorSums();
    const detail: SelectionChangeDetail = {
      indices: this.selection.selectedIndices(),
      planeCount: sums.n,
      quickFit: sums.n > 0 ? fitGirdleFromSums(sums) : null,
      final,
      shape: this.lastShape,
    };
    this.dispatchEvent(new CustomEvent<SelectionChangeDetail>('selectionchange', { detail }));
  }
}

/**
 * Attaches Foldlens to an existing MapLibre map (created by the host with its own style).
 * @example
 * const foldlens = attachFoldlens(map);
 * foldlens.setStations(stations);
 * foldlens.setTool('lasso');
 * foldlens.addEventListener('selectionchange', (e) => console.log(e.detail.quickFit?.axis));
 * // later: foldlens.remove();
 */
export function attachFoldlens(map: MapLibreMap, options: Partial<FoldlensOverlayOptions> = {}): Foldlens {
  return new Foldlens(map, options);
}
