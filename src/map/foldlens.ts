import type { Map as MapLibreMap } from 'maplibre-gl';
import type { Station } from '../core/station';
import { isUsable } from '../core/station';
import { LiveSelection, type SelectionCombine } from '../core/liveSelection';
import { lonLatToMercator } from '../core/webMercator';
import { fitGirdleFromSums, type GirdleFit } from '../core/girdle';
import { lineToVector, poleOf } from '../core/vectors';
import { foldInputFromStations } from '../core/foldInput';
import type { FoldAnalysis } from '../core/foldAnalysis';
import { newDomainId, nextDomainName, type Domain } from '../core/domain';
import { AnalysisClient } from '../worker/analysisClient';
import { FoldlensOverlay, type FoldlensOverlayOptions } from './foldlensOverlay';
import { SelectionDrawer, type SelectionToolName, type ShapeEventDetail } from './selectionDrawer';
import { DomainLayer } from './domainLayer';

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

/** Detail of the `axiscomputed` event: the full fold analysis of a finished selection. */
export interface AxisComputedDetail {
  /** The selected station indices the analysis is of. */
  readonly indices: Int32Array;
  /** Fold axis, girdle, 95% cone, beta axis, fabric and warnings (null fields where undefined). */
  readonly analysis: FoldAnalysis;
}

/** Detail of the `domainsaved` event. */
export interface DomainSavedDetail {
  readonly domain: Domain;
}

/** Options of {@link Foldlens}: the overlay's, plus the analysis run after each finished selection. */
export interface FoldlensOptions extends FoldlensOverlayOptions {
  /**
   * The fold analysis run in a web worker when a selection is finished, announced by
   * `axiscomputed`; `false` turns it off (a host that runs its own). Default: 500 bootstrap
   * resamples for the cone, seed 1, so the same selection always gives the same numbers.
   */
  readonly analysis: { readonly bootstrap: number; readonly seed: number } | false;
}

const defaultAnalysis = { bootstrap: 500, seed: 1 } as const;

/**
 * Foldlens attached to a MapLibre map: orientation symbols ({@link FoldlensOverlay}), selection
 * tools ({@link SelectionDrawer}), a live selection whose girdle fit updates on every move, the
 * full fold analysis of each finished selection, and structural domains saved from selections.
 *
 * Events (CustomEvent on this object): `selectionchange` ({@link SelectionChangeDetail}),
 * `axiscomputed` ({@link AxisComputedDetail}), `domainsaved` ({@link DomainSavedDetail}),
 * `stationclick` and `stationhover` (forwarded from the overlay).
 * @example
 * const foldlens = new Foldlens(map); // or attachFoldlens(map)
 * foldlens.setStations(stations);
 * foldlens.addEventListener('selectionchange', (e) => console.log(e.detail.indices.length));
 * foldlens.addEventListener('axiscomputed', (e) => console.log(e.detail.analysis.axis));
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
  private readonly analysisOptions: FoldlensOptions['analysis'];
  private analysisClient: AnalysisClient | null = null;
  private latestAnalysis: AxisComputedDetail | null = null;
  private savedDomains: Domain[] = [];
  private domainLayer: DomainLayer | null = null;

  constructor(map: MapLibreMap, options: Partial<FoldlensOptions> = {}) {
    super();
    this.map = map;
    const { analysis = defaultAnalysis, ...overlayOptions } = options;
    this.analysisOptions = analysis;
    this.overlay = new FoldlensOverlay(map, overlayOptions);
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

  /** The analysis of the current selection once `axiscomputed` has announced it; null before, or with analysis off. */
  get analysis(): AxisComputedDetail | null {
    return this.latestAnalysis;
  }

  /** Domains saved with {@link saveDomain}, oldest first. */
  get domains(): readonly Domain[] {
    return this.savedDomains;
  }

  /**
   * Saves the current selection as a structural domain: its outline, its fold analysis (the
   * worker's, as `axiscomputed` gave it, or computed now) and the ids of its stations. The domain
   * is drawn on the map with an arrow down its axis and announced by `domainsaved`.
   * @throws Error when the selection has no single outline (nothing selected, or made with Add/Remove).
   */
  async saveDomain(name?: string): Promise<Domain> {
    const ring = this.lastShape;
    const indices = this.selection.selectedIndices();
    if (!ring || indices.length === 0) throw new Error('a domain needs a selection drawn as one shape (not made with Add or Remove)');
    const analysis = this.latestAnalysis && sameIndices(this.latestAnalysis.indices, indices) ? this.latestAnalysis.analysis : await this.analyse(indices);
    const domain: Domain = {
      id: newDomainId(),
      name: name?.trim() || nextDomainName(this.savedDomains),
      ring: ring.map((p) => [p[0], p[1]] as const),
      analysis,
      stationIds: Array.from(indices, (i) => this.stations[i].id),
      updated: new Date().toISOString(),
    };
    this.savedDomains = [...this.savedDomains, domain];
    this.domainLayer ??= new DomainLayer(this.map, this.overlay.options.idPrefix);
    this.domainLayer.setDomains(this.savedDomains);
    this.dispatchEvent(new CustomEvent<DomainSavedDetail>('domainsaved', { detail: { domain } }));
    return domain;
  }

  /** Removes everything Foldlens added to the map. */
  remove(): void {
    cancelAnimationFrame(this.frame);
    this.analysisClient?.terminate();
    this.domainLayer?.remove();
    this.drawer.remove();
    this.overlay.remove();
  }

  /** The fold analysis of some stations, in the worker (null only when a newer run superseded it). */
  private async analyse(indices: Int32Array): Promise<FoldAnalysis | null> {
    const settings = this.analysisOptions || defaultAnalysis;
    this.analysisClient ??= new AnalysisClient();
    const { planes, lines } = foldInputFromStations(this.stations, indices);
    const result = await this.analysisClient.run({ planes, lines, bootstrap: settings.bootstrap, seed: settings.seed, density: 'off', net: 'equal-area' });
    return result?.analysis ?? null;
  }

  /** Runs the analysis of a finished selection and announces it, unless a newer selection took over. */
  private announceAnalysis(indices: Int32Array): void {
    this.latestAnalysis = null;
    if (!this.analysisOptions || indices.length === 0) return;
    this.analyse(indices).then(
      (analysis) => {
        if (!analysis || !sameIndices(indices, this.selection.selectedIndices())) return;
        this.latestAnalysis = { indices, analysis };
        this.dispatchEvent(new CustomEvent<AxisComputedDetail>('axiscomputed', { detail: this.latestAnalysis }));
      },
      (e: unknown) => console.error('Foldlens: the fold analysis failed', e),
    );
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
    if (final) this.announceAnalysis(detail.indices);
  }
}

function sameIndices(a: Int32Array, b: Int32Array): boolean {
  if (a.length !== b.length) return false;
  for (let k = 0; k < a.length; k++) if (a[k] !== b[k]) return false;
  return true;
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
export function attachFoldlens(map: MapLibreMap, options: Partial<FoldlensOptions> = {}): Foldlens {
  return new Foldlens(map, options);
}
