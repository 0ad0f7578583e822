import { Marker, type Map as MapLibreMap, type GeoJSONSource, type MapLayerMouseEvent } from 'maplibre-gl';
import type { Feature, FeatureCollection, Point, Polygon } from 'geojson';
import type { Domain } from '../core/domain';
import { ringCentroid } from '../core/domain';
import { rasterize } from './raster';

const AXIS_IMAGE = 'fl-domain-axis';
const OUTLINE = '#5a3d8a';

/** Detail of `domainringchange` / `domainringend`: the edited outline. */
export interface DomainRingDetail {
  readonly id: string;
  readonly ring: Array<[number, number]>;
}

const pad = (n: number, w: number) => String(Math.round(n) % 360).padStart(w, '0');

/**
 * Draws saved structural domains on the map: outline, an arrow at the centre pointing down the
 * domain's fold axis, and a label with name and axis (a DOM marker: a handful of labels need no
 * glyph server). One domain at a time can be edited by dragging its vertices.
 *
 * Events: `domainringchange` while a vertex is dragged and `domainringend` when it is dropped,
 * both with {@link DomainRingDetail}; `domainclick` {id} when an outline is clicked.
 * @example
 * const layer = new DomainLayer(map);
 * layer.setDomains(project.domains);
 * layer.addEventListener('domainringend', (e) => updateDomain(e.detail));
 */
export class DomainLayer extends EventTarget {
  private readonly map: MapLibreMap;
  private readonly prefix: string;
  private domains: readonly Domain[] = [];
  private markers: Marker[] = [];
  private editing: { id: string; ring: Array<[number, number]> } | null = null;
  private dragging = -1;

  constructor(map: MapLibreMap, idPrefix = 'foldlens') {
    super();
    this.map = map;
    this.prefix = `${idPrefix}-domains`;
    map.on('style.load', this.install);
    map.on('mousedown', `${this.prefix}-vertices`, this.onVertexDown);
    map.on('touchstart', `${this.prefix}-vertices`, this.onVertexDown);
    map.on('click', `${this.prefix}-fill`, this.onClick);
    if (map.isStyleLoaded()) this.install();
  }

  /** Replaces the domains drawn. */
  setDomains(domains: readonly Domain[]): void {
    this.domains = domains;
    if (this.editing && !domains.some((d) => d.id === this.editing!.id)) this.editing = null;
    this.render();
  }

  /** Starts editing a domain's outline (null stops). */
  edit(id: string | null): void {
    const d = id ? this.domains.find((x) => x.id === id) : undefined;
    this.editing = d ? { id: d.id, ring: d.ring.map((p) => [p[0], p[1]] as [number, number]) } : null;
    this.render();
  }

  get editingId(): string | null {
    return this.editing?.id ?? null;
  }

  remove(): void {
    this.map.off('style.load', this.install);
    this.map.off('mousedown', `${this.prefix}-vertices`, this.onVertexDown);
    this.map.off('touchstart', `${this.prefix}-vertices`, this.onVertexDown);
    this.map.off('click', `${this.prefix}-fill`, this.onClick);
    for (const m of this.markers) m.remove();
    this.markers = [];
    if (!this.map.style) return;
    for (const id of ['vertices', 'arrows', 'line', 'fill'].map((r) => `${this.prefix}-${r}`)) if (this.map.getLayer(id)) this.map.removeLayer(id);
    for (const id of [this.prefix, `${this.prefix}-points`, `${this.prefix}-edit`]) if (this.map.getSource(id)) this.map.removeSource(id);
    if (this.map.hasImage(AXIS_IMAGE)) this.map.removeImage(AXIS_IMAGE);
  }

  private readonly install = (): void => {
    const map = this.map;
    const empty: FeatureCollection = { type: 'FeatureCollection', features: [] };
    if (!map.hasImage(AXIS_IMAGE)) {
      const ratio = Math.max(1, Math.ceil(map.getPixelRatio()));
      const c = [90, 61, 138] as const;
      const img = rasterize(
        [
          { type: 'segment', a: [0, -16], b: [0, 16], width: 4, color: c },
          { type: 'polygon', points: [[-8, 12], [8, 12], [0, 26]], color: c },
        ],
        56,
        ratio,
        2,
      );
      map.addImage(AXIS_IMAGE, { width: img.width, height: img.height, data: img.data }, { pixelRatio: ratio });
    }
    for (const id of [this.prefix, `${this.prefix}-points`, `${this.prefix}-edit`]) if (!map.getSource(id)) map.addSource(id, { type: 'geojson', data: empty });
    const add = (layer: Parameters<MapLibreMap['addLayer']>[0]) => {
      if (!map.getLayer(layer.id)) map.addLayer(layer);
    };
    add({ id: `${this.prefix}-fill`, type: 'fill', source: this.prefix, paint: { 'fill-color': OUTLINE, 'fill-opacity': 0.04 } });
    add({ id: `${this.prefix}-line`, type: 'line', source: this.prefix, paint: { 'line-color': OUTLINE, 'line-width': ['case', ['get', 'editing'], 3, 2], 'line-opacity': 0.9 } });
    add({
      id: `${this.prefix}-arrows`,
      type: 'symbol',
      source: `${this.prefix}-points`,
      layout: { 'icon-image': AXIS_IMAGE, 'icon-rotate': ['get', 'trend'], 'icon-rotation-alignment': 'map', 'icon-allow-overlap': true, 'icon-ignore-placement': true },
    });
    add({
      id: `${this.prefix}-vertices`,
      type: 'circle',
      source: `${this.prefix}-edit`,
      paint: { 'circle-radius': 6, 'circle-color': '#ffffff', 'circle-stroke-color': OUTLINE, 'circle-stroke-width': 2 },
    });
    this.render();
  };

  private render(): void {
    const map = this.map;
    const outlines = map.getSource(this.prefix) as GeoJSONSource | undefined;
    if (!outlines) return;
    const ringOf = (d: Domain) => (this.editing?.id === d.id ? this.editing.ring : d.ring);
    const polys: Array<Feature<Polygon>> = this.domains.map((d) => {
      const r = ringOf(d).map((p) => [p[0], p[1]]);
      return { type: 'Feature', properties: { id: d.id, editing: this.editing?.id === d.id }, geometry: { type: 'Polygon', coordinates: [[...r, r[0]]] } };
    });
    outlines.setData({ type: 'FeatureCollection', features: polys });
    const points: Array<Feature<Point>> = this.domains
      .filter((d) => d.analysis?.axis)
      .map((d) => ({ type: 'Feature', properties: { id: d.id, trend: d.analysis!.axis!.trend }, geometry: { type: 'Point', coordinates: ringCentroid(ringOf(d)) } }));
    (map.getSource(`${this.prefix}-points`) as GeoJSONSource).setData({ type: 'FeatureCollection', features: points });
    const handles: Array<Feature<Point>> = (this.editing?.ring ?? []).map((p, i) => ({ type: 'Feature', properties: { i }, geometry: { type: 'Point', coordinates: [p[0], p[1]] } }));
    (map.getSource(`${this.prefix}-edit`) as GeoJSONSource).setData({ type: 'FeatureCollection', features: handles });
    this.renderLabels(ringOf);
  }

  private renderLabels(ringOf: (d: Domain) => ReadonlyArray<readonly [number, number]>): void {
    for (const m of this.markers) m.remove();
    this.markers = this.domains.map((d) => {
      const el = document.createElement('div');
      el.className = 'foldlens-domain-label';
      const axis = d.analysis?.axis;
      // Text only: a domain name typed by the user never becomes HTML.
      el.textContent = axis ? `${d.name} · axis ${pad(axis.trend, 3)}/${pad(axis.plunge, 2)}` : `${d.name} · no axis`;
      return new Marker({ element: el, anchor: 'top', offset: [0, 18] }).setLngLat(ringCentroid(ringOf(d))).addTo(this.map);
    });
  }

  private readonly onClick = (e: MapLayerMouseEvent): void => {
    const id = e.features?.[0]?.properties?.id;
    if (typeof id === 'string') this.dispatchEvent(new CustomEvent('domainclick', { detail: { id } }));
  };

  private readonly onVertexDown = (e: MapLayerMouseEvent | import('maplibre-gl').MapLayerTouchEvent): void => {
    const i = e.features?.[0]?.properties?.i;
    if (!this.editing || typeof i !== 'number') return;
    e.preventDefault();
    this.dragging = i;
    this.map.on('mousemove', this.onDrag);
    this.map.on('touchmove', this.onDrag);
    this.map.once('mouseup', this.onDrop);
    this.map.once('touchend', this.onDrop);
  };

  private readonly onDrag = (e: { lngLat: { lng: number; lat: number } }): void => {
    if (!this.editing || this.dragging < 0) return;
    this.editing.ring[this.dragging] = [e.lngLat.lng, e.lngLat.lat];
    this.render();
    this.dispatchEvent(new CustomEvent<DomainRingDetail>('domainringchange', { detail: { id: this.editing.id, ring: this.editing.ring.slice() } }));
  };

  private readonly onDrop = (): void => {
    this.map.off('mousemove', this.onDrag);
    this.map.off('touchmove', this.onDrag);
    this.dragging = -1;
    if (this.editing) this.dispatchEvent(new CustomEvent<DomainRingDetail>('domainringend', { detail: { id: this.editing.id, ring: this.editing.ring.slice() } }));
  };
}
