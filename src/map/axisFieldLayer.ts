import type { ExpressionSpecification, GeoJSONSource, LayerSpecification, Map as MapLibreMap } from 'maplibre-gl';
import type { Feature, FeatureCollection, Point, Polygon } from 'geojson';
import type { LocalAxisField } from '../core/consistency/localAxisField';
import { nodePosition } from '../core/consistency/localAxisField';
import { rasterize, type Rgb } from './raster';

/**
 * The local fold axis field on the map (core/consistency/localAxisField.ts): at each node an
 * arrow pointing down the plunge, its length the horizontal share of the axis (cos plunge: a
 * steep axis draws short) and its opacity the confidence (a wide 95% cone fades it); under the
 * arrows each grid cell coloured by the angle between its axis and a reference axis, so the
 * places where the axis swings stand out. Talks to MapLibre through its public API only, re-adds
 * itself when the host swaps style and removes every trace on `remove()`.
 */

/** Options of {@link AxisFieldLayer}; every field has a default in {@link defaultAxisFieldLayerOptions}. */
export interface AxisFieldLayerOptions {
  /** Prefix of the source and layer ids. */
  readonly idPrefix: string;
  /** Id of a layer to draw the cells below (e.g. the station symbols); undefined puts them on top. */
  readonly beforeId?: string;
  /** Colour of the arrows. */
  readonly arrowColor: Rgb;
  /** Opacity of the angle cells (0 to 1). */
  readonly cellOpacity: number;
}

/**
 * Defaults of {@link AxisFieldLayerOptions}.
 * @example new AxisFieldLayer(map, { ...defaultAxisFieldLayerOptions, cellOpacity: 0.3 })
 */
export const defaultAxisFieldLayerOptions: AxisFieldLayerOptions = {
  idPrefix: 'foldlens-axis-field',
  arrowColor: [27, 58, 87],
  cellOpacity: 0.45,
};

/**
 * Classes of the angle to the reference axis (degrees; each class holds the angles from the
 * previous bound up to, not including, `upTo`) and their colours:
 * a sequential ramp from pale (the axis agrees) to dark red-brown (it has turned), chosen for
 * order and contrast on the pale geological map, and readable by colour-blind users (it varies
 * in lightness, not only in hue).
 * @example ANGLE_CLASSES.find((c) => angle <= c.upTo)!.colour
 */
export const ANGLE_CLASSES: readonly { readonly upTo: number; readonly colour: string; readonly label: string }[] = [
  { upTo: 5, colour: '#fff3bf', label: 'under 5°' },
  { upTo: 10, colour: '#fdcf7e', label: '5–10°' },
  { upTo: 15, colour: '#f59a4c', label: '10–15°' },
  { upTo: 20, colour: '#d9602a', label: '15–20°' },
  { upTo: 30, colour: '#a33214', label: '20–30°' },
  { upTo: 90.001, colour: '#5e160b', label: '30° or more' },
];

/** Cone (degrees) up to which an arrow is drawn opaque, and from which it is faintest. */
const SURE_CONE = 5;
const UNSURE_CONE = 30;
const FAINTEST = 0.2;

/**
 * Arrow opacity for a 95% cone in degrees: 1 up to 5°, falling linearly to 0.2 at 30° and beyond
 * (Foldlens convention: a 30° cone says little about the local axis).
 * @example arrowOpacity(3) // 1
 */
export function arrowOpacity(cone: number | null): number {
  if (cone === null || !Number.isFinite(cone)) return FAINTEST;
  if (cone <= SURE_CONE) return 1;
  if (cone >= UNSURE_CONE) return FAINTEST;
  return 1 - ((1 - FAINTEST) * (cone - SURE_CONE)) / (UNSURE_CONE - SURE_CONE);
}

/** Properties of an arrow feature. */
export interface AxisArrowProperties {
  readonly node: number;
  readonly trend: number;
  readonly plunge: number;
  /** 95% cone in degrees, or -1 where unknown. */
  readonly cone: number;
  readonly opacity: number;
  /** Horizontal share of the axis, cos(plunge), at least 0.25 so steep axes still show. */
  readonly length: number;
}

/** Properties of a cell feature. */
export interface AxisCellProperties {
  readonly node: number;
  /** Angle to the reference axis in degrees; -1 where the node has no axis. */
  readonly angle: number;
}

/** The field ready for the map. */
export interface AxisFieldFeatures {
  readonly arrows: FeatureCollection<Point, AxisArrowProperties>;
  readonly cells: FeatureCollection<Polygon, AxisCellProperties>;
  /** Size of a grid cell on the screen at zoom 0, CSS px (the smaller side; web mercator, 512 px world). */
  readonly cellPixelsAtZoom0: number;
}

/**
 * The field as GeoJSON: one arrow point per node with an axis, one cell polygon per node with an
 * angle to the reference. `toLonLat` turns the field's frame x, y into longitude, latitude.
 * @example
 * const { arrows, cells } = axisFieldFeatures(field, (x, y) => [lon, lat]);
 */
export function axisFieldFeatures(field: LocalAxisField, toLonLat: (x: number, y: number) => readonly [number, number]): AxisFieldFeatures {
  const { grid } = field;
  const arrows: Feature<Point, AxisArrowProperties>[] = [];
  const cells: Feature<Polygon, AxisCellProperties>[] = [];
  const corner = (x: number, y: number): [number, number] => {
    const [lon, lat] = toLonLat(x, y);
    return [lon, lat];
  };
  for (let node = 0; node < grid.nx * grid.ny; node++) {
    if (!Number.isFinite(field.trend[node])) continue;
    const [x, y] = nodePosition(grid, node);
    const cone = Number.isFinite(field.cone[node]) ? field.cone[node] : null;
    const plunge = field.plunge[node];
    arrows.push({
      type: 'Feature',
      properties: { node, trend: field.trend[node], plunge, cone: cone ?? -1, opacity: arrowOpacity(cone), length: Math.max(0.25, Math.cos((plunge * Math.PI) / 180)) },
      geometry: { type: 'Point', coordinates: corner(x, y) },
    });
    const angle = field.angleToReference[node];
    if (!Number.isFinite(angle)) continue;
    const [x0, y0, x1, y1] = [x - grid.dx / 2, y - grid.dy / 2, x + grid.dx / 2, y + grid.dy / 2];
    cells.push({
      type: 'Feature',
      properties: { node, angle },
      geometry: { type: 'Polygon', coordinates: [[corner(x0, y0), corner(x1, y0), corner(x1, y1), corner(x0, y1), corner(x0, y0)]] },
    });
  }
  // The middle cell's size on a web mercator map at zoom 0: x = 512 (lon + 180)/360,
  // y = 512 (1 - ln(tan(π/4 + φ/2))/π)/2 (the spherical mercator of web maps; common practice).
  const [cx, cy] = [grid.minX + grid.dx * Math.floor(grid.nx / 2), grid.minY + grid.dy * Math.floor(grid.ny / 2)];
  const [lon0, lat0] = toLonLat(cx, cy);
  const [lon1, lat1] = toLonLat(cx + grid.dx, cy + grid.dy);
  const mercY = (lat: number): number => (512 * (1 - Math.log(Math.tan(Math.PI / 4 + (lat * Math.PI) / 360)) / Math.PI)) / 2;
  const cellPixelsAtZoom0 = Math.min((512 * Math.abs(lon1 - lon0)) / 360, Math.abs(mercY(lat1) - mercY(lat0)));
  return { arrows: { type: 'FeatureCollection', features: arrows }, cells: { type: 'FeatureCollection', features: cells }, cellPixelsAtZoom0 };
}

/** Which parts of the field are shown. */
export interface AxisFieldVisibility {
  readonly arrows: boolean;
  readonly angles: boolean;
}

const ARROW_IMAGE = 'fl-axis-field-arrow';
/** The arrow image's length, CSS px, at icon-size 1. */
const ARROW_PIXELS = 32;
/** Share of a cell a horizontal arrow spans, and the largest icon size (arrows stop growing there). */
const ARROW_SHARE = 0.9;
const LARGEST_ARROW = 1.25;

/**
 * icon-size of the arrows: ARROW_SHARE of a cell at every zoom (a cell doubles with each zoom
 * level, so the size grows as 2^zoom) until the arrow reaches LARGEST_ARROW, times the arrow's
 * horizontal share. Zoom may only drive a top-level interpolation (MapLibre style specification).
 */
function arrowSize(cellPixelsAtZoom0: number): ExpressionSpecification {
  const atZoom0 = (ARROW_SHARE * cellPixelsAtZoom0) / ARROW_PIXELS;
  const full = Math.max(0, Math.log2(LARGEST_ARROW / atZoom0));
  return ['interpolate', ['exponential', 2], ['zoom'], 0, ['*', atZoom0, ['get', 'length']], full, ['*', LARGEST_ARROW, ['get', 'length']]];
}
const EMPTY: FeatureCollection = { type: 'FeatureCollection', features: [] };

/**
 * Draws a local axis field on a MapLibre map.
 * @example
 * const layer = new AxisFieldLayer(map, { beforeId: 'foldlens-symbols' });
 * layer.setFeatures(axisFieldFeatures(field, toLonLat));
 */
export class AxisFieldLayer {
  readonly options: AxisFieldLayerOptions;
  private readonly map: MapLibreMap;
  private data: AxisFieldFeatures | null = null;
  private visibility: AxisFieldVisibility = { arrows: true, angles: true };

  constructor(map: MapLibreMap, options: Partial<AxisFieldLayerOptions> = {}) {
    this.map = map;
    this.options = { ...defaultAxisFieldLayerOptions, ...options };
    map.on('style.load', this.install);
    // isStyleLoaded() is false while any source is loading; getStyle() is defined as soon as the
    // style itself is, which is all that adding sources and layers needs.
    if (map.isStyleLoaded() || map.getStyle() !== undefined) this.install();
  }

  /** Id of the arrow layer (for queries such as queryRenderedFeatures). */
  get arrowLayerId(): string {
    return `${this.options.idPrefix}-arrows`;
  }

  /** Id of the cell layer. */
  get cellLayerId(): string {
    return `${this.options.idPrefix}-cells`;
  }

  /** Replaces the field drawn (null clears it). */
  setFeatures(data: AxisFieldFeatures | null): void {
    this.data = data;
    this.render();
  }

  /** Shows or hides the arrows and the angle cells. */
  setVisibility(visibility: Partial<AxisFieldVisibility>): void {
    this.visibility = { ...this.visibility, ...visibility };
    this.applyVisibility();
  }

  /** Removes the layers, sources, image and handlers. */
  remove(): void {
    this.map.off('style.load', this.install);
    if (!this.map.style) return;
    for (const id of [this.arrowLayerId, this.cellLayerId]) if (this.map.getLayer(id)) this.map.removeLayer(id);
    for (const id of [this.arrowLayerId, this.cellLayerId]) if (this.map.getSource(id)) this.map.removeSource(id);
    if (this.map.hasImage(ARROW_IMAGE)) this.map.removeImage(ARROW_IMAGE);
  }

  private readonly install = (): void => {
    const map = this.map;
    if (!map.hasImage(ARROW_IMAGE)) {
      const ratio = Math.max(1, Math.ceil(map.getPixelRatio()));
      const c = this.options.arrowColor;
      // North-pointing arrow centred on its node; the layer turns it to the trend.
      const img = rasterize(
        [
          { type: 'segment', a: [0, -14], b: [0, 5], width: 3, color: c },
          { type: 'polygon', points: [[-6.5, 3], [6.5, 3], [0, 15]], color: c },
        ],
        ARROW_PIXELS,
        ratio,
        1.2,
      );
      map.addImage(ARROW_IMAGE, { width: img.width, height: img.height, data: img.data }, { pixelRatio: ratio });
    }
    for (const id of [this.arrowLayerId, this.cellLayerId]) if (!map.getSource(id)) map.addSource(id, { type: 'geojson', data: EMPTY });
    const before = this.options.beforeId && map.getLayer(this.options.beforeId) ? this.options.beforeId : undefined;
    const colour: ExpressionSpecification = ['step', ['get', 'angle'], ANGLE_CLASSES[0].colour, ...ANGLE_CLASSES.slice(0, -1).flatMap((c, i) => [c.upTo, ANGLE_CLASSES[i + 1].colour])] as unknown as ExpressionSpecification;
    // No antialiasing: it leaves hairline seams between cells that share an edge.
    const cells: LayerSpecification = { id: this.cellLayerId, type: 'fill', source: this.cellLayerId, paint: { 'fill-color': colour, 'fill-opacity': this.options.cellOpacity, 'fill-antialias': false } };
    const arrows: LayerSpecification = {
      id: this.arrowLayerId,
      type: 'symbol',
      source: this.arrowLayerId,
      layout: {
        'icon-image': ARROW_IMAGE,
        'icon-rotate': ['get', 'trend'],
        'icon-rotation-alignment': 'map',
        'icon-allow-overlap': true,
        'icon-ignore-placement': true,
      },
      paint: { 'icon-opacity': ['get', 'opacity'] },
    };
    if (!map.getLayer(this.cellLayerId)) map.addLayer(cells, before);
    if (!map.getLayer(this.arrowLayerId)) map.addLayer(arrows, before);
    this.render();
  };

  private render(): void {
    const arrows = this.map.getSource(this.arrowLayerId) as GeoJSONSource | undefined;
    const cells = this.map.getSource(this.cellLayerId) as GeoJSONSource | undefined;
    if (!arrows || !cells) return;
    arrows.setData(this.data?.arrows ?? EMPTY);
    cells.setData(this.data?.cells ?? EMPTY);
    if (this.data && this.data.cellPixelsAtZoom0 > 0) this.map.setLayoutProperty(this.arrowLayerId, 'icon-size', arrowSize(this.data.cellPixelsAtZoom0));
    this.applyVisibility();
  }

  private applyVisibility(): void {
    if (this.map.getLayer(this.arrowLayerId)) this.map.setLayoutProperty(this.arrowLayerId, 'visibility', this.visibility.arrows ? 'visible' : 'none');
    if (this.map.getLayer(this.cellLayerId)) this.map.setLayoutProperty(this.cellLayerId, 'visibility', this.visibility.angles ? 'visible' : 'none');
  }
}
