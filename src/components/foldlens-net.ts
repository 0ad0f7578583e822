import { downloadBlob, svgToPng } from './exportFiles';
import { LitElement, css, html, nothing, unsafeCSS, type PropertyValues } from 'lit';
import { quadtree, select, type Quadtree } from 'd3';
import type { DensityGrid } from '../core/density';
import type { FoldAnalysis } from '../core/foldAnalysis';
import type { FoldDescription, FoldDescriptionFailure } from '../core/foldDescription';
import { projectVectors, unprojectPoint, type NetKind } from '../core/netProjection';
import type { Plane } from '../core/types';
import { lineToVector, normalToPlane, vectorToLine } from '../core/vectors';
import { defineOnce } from './define';
import { sceneToSvg, type SvgTitleBlock } from './net/exportSvg';
import { numbersToCsv, numbersToJson, type NumbersExportMeta } from './net/exportNumbers';
import { formatAngle, formatCount, formatLine, formatPlane, DASH } from './net/format';
import { levelsText, netDisplayRows, netFields } from './net/netNumbers';
import {
  DEFAULT_MAX_GREAT_CIRCLES,
  DEFAULT_SHOW,
  NET_LAYOUT,
  NET_LAYOUT_NARROW,
  analysisLayer,
  contourLayer,
  frameLayers,
  greatCircleLayer,
  highlightLayer,
  fitHeight,
  legendLayer,
  lineLayer,
  netAriaLabel,
  poleLayer,
  type NetLayout,
  type NetLine,
  type NetShow,
  type SceneItem,
  type SceneLayer,
} from './net/netScene';
import { markerPathData } from './net/netPaths';
import { resolvePalette, roleCss } from './net/netStyle';

/** Density estimate the host should compute for the contours. */
export type ContourMethod = 'kamb' | 'exponential' | 'off';

/** Detail of `foldlens-net-options`. */
export interface NetOptionsDetail {
  readonly net: NetKind;
  readonly contours: ContourMethod;
  readonly show: NetShow;
}

/** Width (CSS pixels) of the net's column below which the key goes under the net. */
const NARROW_BELOW_PX = 470;

/** Pointer distance (CSS pixels) within which a point counts as hovered. */
const HOVER_RADIUS_PX = 10;

let instances = 0;

/**
 * `<foldlens-net>`: an equal-area or equal-angle net (lower hemisphere) of a selection of
 * planes and lines, with density contours, the best-fit girdle, the fold (pi) axis and its 95%
 * cone, the beta axis, limb maxima and axial-plane trace, and beside it the numbers as text
 * (which double as the net's text alternative). Exports SVG, PNG, CSV and JSON.
 *
 * Properties (set from code):
 * - `poles` (Float64Array, n·3 north-east-down unit vectors of the planes' poles) and
 *   `poleIds` (Int32Array, station index of each pole; pole i reports i when absent);
 * - `planes` (Plane[] parallel to `poles`, optional: great circles are derived from the poles
 *   when absent); `maxGreatCircles` (default 300; an even sample is drawn above it, and the
 *   panel says so);
 * - `lines` (NetLine[]: {trend, plunge, id} with id the station index);
 * - `analysis` (FoldAnalysis | null), `density` (DensityGrid | null, computed by the host),
 *   `description` (FoldDescription | FoldDescriptionFailure | null);
 * - `net` ('equal-area' | 'equal-angle', default 'equal-area'), `contourMethod`
 *   ('kamb' | 'exponential' | 'off', default 'kamb'), `show` (Partial<NetShow>: grid, poles,
 *   greatCircles, contours, girdle, axis, cone, beta, lines, limbs);
 * - `highlight` (station index to emphasise, -1 for none), `selectionLabel` (string).
 *
 * Events (all bubble and are composed):
 * - `foldlens-net-hover` {detail: {index}}: station index under the pointer, -1 when it leaves;
 * - `foldlens-net-pick` {detail: {index}}: station index clicked, -1 for empty net;
 * - `foldlens-net-options` {detail: NetOptionsDetail}: net kind, contour method or a toggle
 *   changed (the host recomputes the density for the new net or method).
 *
 * Methods: `toSvg()`, `toPng(scale?)`, `toCsv()`, `toJson()` return the exports (the export
 * buttons download them).
 *
 * Parts: `panel`, `controls`, `net` (the SVG), `readout`, `numbers`, `warnings`, `values`, `exports`.
 *
 * CSS custom properties: `--fl-bg`, `--fl-fg`, `--fl-muted`, `--fl-border`, `--fl-accent`,
 * `--fl-font`, and for the net `--fl-net-face`, `--fl-net-ink`, `--fl-net-muted`,
 * `--fl-net-grid`, `--fl-net-pole`, `--fl-net-great-circle`, `--fl-net-line`,
 * `--fl-net-contour`, `--fl-net-girdle`, `--fl-net-axis`, `--fl-net-beta`, `--fl-net-limb`,
 * `--fl-net-highlight`, `--fl-net-halo` (defaults in net/netStyle.ts).
 * @example
 * const net = document.createElement('foldlens-net');
 * net.analysis = analyzeFold({ planes });
 * net.planes = planes;
 * download(net.toSvg());
 */
export class FoldlensNet extends LitElement {
  static override properties = {
    poles: { attribute: false },
    poleIds: { attribute: false },
    planes: { attribute: false },
    lines: { attribute: false },
    analysis: { attribute: false },
    density: { attribute: false },
    description: { attribute: false },
    net: { attribute: false },
    contourMethod: { attribute: false },
    show: { attribute: false },
    highlight: { attribute: false },
    selectionLabel: { attribute: false },
    maxGreatCircles: { attribute: false },
  };

  poles: Float64Array = new Float64Array(0);
  poleIds: Int32Array | null = null;
  planes: readonly Plane[] | null = null;
  lines: readonly NetLine[] = [];
  analysis: FoldAnalysis | null = null;
  density: DensityGrid | null = null;
  description: FoldDescription | FoldDescriptionFailure | null = null;
  net: NetKind = 'equal-area';
  contourMethod: ContourMethod = 'kamb';
  show: Partial<NetShow> = {};
  highlight = -1;
  selectionLabel = '';
  maxGreatCircles = DEFAULT_MAX_GREAT_CIRCLES;

  private readonly clipId = `fl-net-clip-${++instances}`;
  /** Problems with the inputs, shown in the warnings list instead of throwing out of a render. */
  private inputErrors: string[] = [];
  private poleXY: Float64Array = new Float64Array(0);
  private lineXY: Float64Array = new Float64Array(0);
  private layers = new Map<string, SceneLayer>();
  private layerKeys = new Map<string, readonly unknown[]>();
  private greatCircleCount: { drawn: number; total: number } | null = null;
  private index: Quadtree<number> | null = null;
  private hovered = -1;
  private hoveredPoint = -1;
  /** Wide (key beside the net) or narrow (key below), chosen from the element's width. */
  private layout: NetLayout = NET_LAYOUT;
  /** `layout` with its height fitted to the key drawn. */
  private drawnLayout: NetLayout = NET_LAYOUT;
  private resizeObserver: ResizeObserver | null = null;

  static override styles = css`
    :host { display: block; font: 13px/1.4 var(--fl-font, system-ui, sans-serif); color: var(--fl-fg, #1d2326); }
    .panel { display: flex; flex-wrap: wrap; gap: 10px 18px; align-items: flex-start; }
    .figure { flex: 3 1 380px; min-width: 260px; max-width: 720px; margin: 0; }
    .numbers { flex: 2 1 250px; min-width: 220px; }
    .controls { display: flex; flex-wrap: wrap; gap: 4px 10px; align-items: center; margin-bottom: 4px; font-size: 12px; }
    .controls label { display: inline-flex; gap: 4px; align-items: center; white-space: nowrap; }
    select, button { font: inherit; color: inherit; background: var(--fl-bg, #fbfaf7); border: 1px solid var(--fl-border, #c9cdc8); border-radius: 4px; padding: 1px 6px; }
    button { cursor: pointer; }
    select:focus-visible, button:focus-visible, input:focus-visible { outline: 2px solid var(--fl-accent, #0b6e8a); outline-offset: 1px; }
    /* The drawing is a sheet of its own colour (white by default) in any page theme: its text and key are drawn for it, as the exports are. */
    svg { display: block; width: 100%; height: auto; user-select: none; -webkit-user-select: none; background: var(--fl-net-halo, #ffffff); border-radius: 4px; }
    svg.near { cursor: pointer; }
    .readout { min-height: 1.4em; margin: 2px 0 0; color: var(--fl-muted, #5b6469); font-variant-numeric: tabular-nums; font-size: 12px; }
    h2 { font-size: 12px; text-transform: uppercase; letter-spacing: 0.06em; color: var(--fl-muted, #5b6469); margin: 0 0 2px; }
    .selection { margin: 0 0 6px; font-weight: 600; overflow-wrap: anywhere; }
    dl { display: grid; grid-template-columns: max-content 1fr; gap: 2px 10px; margin: 0; font-variant-numeric: tabular-nums; }
    dt { color: var(--fl-muted, #5b6469); }
    dd { margin: 0; overflow-wrap: anywhere; }
    .reason { color: var(--fl-muted, #5b6469); font-size: 12px; }
    .wide { grid-column: 1 / -1; }
    .warnings { list-style: none; margin: 0 0 8px; padding: 0; }
    .warnings li { border-left: 3px solid var(--fl-warn, #b36b00); background: var(--fl-warn-bg, #fff6e5); padding: 3px 8px; margin: 0 0 4px; border-radius: 0 3px 3px 0; }
    .warnings li.error { border-left-color: var(--fl-danger, #b3261e); background: var(--fl-danger-bg, #fdeceb); }
    .exports { display: flex; gap: 6px; flex-wrap: wrap; margin-top: 10px; align-items: center; }
    .exports span { color: var(--fl-muted, #5b6469); font-size: 12px; }
    .hover-ring { fill: none; stroke: var(--fl-net-ink, #1d2326); stroke-width: 1.5px; pointer-events: none; }
    ${unsafeCSS(roleCss())}
  `;

  /** The toggles in force: `show` over the defaults. */
  get shown(): NetShow {
    return { ...DEFAULT_SHOW, ...this.show };
  }

  // ---- Exports -------------------------------------------------------------------------

  /**
   * The net as a standalone SVG document with inline styles and a title block.
   * @example const svgText = panel.toSvg();
   */
  toSvg(date = new Date().toISOString().slice(0, 10)): string {
    const layers = this.orderedLayers().filter((l) => l.id !== 'highlight');
    const cs = getComputedStyle(this);
    return sceneToSvg(layers, {
      layout: this.drawnLayout,
      palette: resolvePalette((name) => cs.getPropertyValue(name)),
      label: this.ariaSummary(),
      titleBlock: this.titleBlock(date),
    });
  }

  /**
   * The net as a PNG (the SVG export drawn into a canvas at `scale` times its size).
   * @example const blob = await panel.toPng(2);
   */
  async toPng(scale = 2): Promise<Blob> {
    return svgToPng(this.toSvg(), scale);
  }


  /**
   * The numbers as CSV (see net/exportNumbers.ts).
   * @example const csvText = panel.toCsv();
   */
  toCsv(date = new Date().toISOString().slice(0, 10)): string {
    return numbersToCsv(netFields(this.numbersInput()), this.analysis?.warnings ?? [], this.exportMeta(date));
  }

  /**
   * The numbers as JSON (see net/exportNumbers.ts).
   * @example JSON.parse(panel.toJson()).fields.axis_trend.value
   */
  toJson(date = new Date().toISOString().slice(0, 10)): string {
    return numbersToJson(netFields(this.numbersInput()), this.analysis?.warnings ?? [], this.exportMeta(date));
  }

  // ---- Rendering -----------------------------------------------------------------------

  override connectedCallback(): void {
    super.connectedCallback();
    if (this.hasUpdated) this.observeSize();
  }

  override disconnectedCallback(): void {
    super.disconnectedCallback();
    this.resizeObserver?.disconnect();
    this.resizeObserver = null;
  }

  protected override firstUpdated(): void {
    this.observeSize();
  }

  /** Chooses the layout from the width of the net's column (the figure), now and on every resize. */
  private observeSize(): void {
    const figure = this.renderRoot.querySelector('.figure');
    if (!figure || typeof ResizeObserver === 'undefined' || this.resizeObserver) return;
    this.resizeObserver = new ResizeObserver((entries) => {
      const width = entries[entries.length - 1]?.contentRect.width ?? 0;
      // Side by side, the key's 11.5-unit text falls under 9 px below about 440 px of width;
      // then the key moves below the net.
      const next = width > 0 && width < NARROW_BELOW_PX ? NET_LAYOUT_NARROW : NET_LAYOUT;
      if (next !== this.layout) {
        this.layout = next;
        this.layerKeys.clear();
        this.requestUpdate();
      }
    });
    this.resizeObserver.observe(figure);
  }

  protected override willUpdate(changed: PropertyValues<this>): void {
    if (changed.has('poles') || changed.has('net') || changed.has('poleIds')) this.projectPoles();
    if (changed.has('lines') || changed.has('net')) this.projectLines();
    this.buildLayers();
  }

  override render() {
    const show = this.shown;
    const rows = netDisplayRows(this.numbersInput());
    const messages = this.messages();
    const { width, height } = this.drawnLayout;
    return html`<div class="panel" part="panel">
      <figure class="figure">
        <div class="controls" part="controls" role="group" aria-label="Net options">
          <label>Net
            <select aria-label="Net kind" @change=${(e: Event) => this.setOption({ net: (e.target as HTMLSelectElement).value as NetKind })}>
              <option value="equal-area" ?selected=${this.net === 'equal-area'}>Equal-area</option>
              <option value="equal-angle" ?selected=${this.net === 'equal-angle'}>Equal-angle</option>
            </select>
          </label>
          <label><input type="checkbox" .checked=${show.poles} @change=${(e: Event) => this.setShow('poles', (e.target as HTMLInputElement).checked)} />Poles</label>
          <label><input type="checkbox" .checked=${show.greatCircles} @change=${(e: Event) => this.setShow('greatCircles', (e.target as HTMLInputElement).checked)} />Great circles</label>
          <label>Contours
            <select aria-label="Contours" @change=${(e: Event) => this.setOption({ contours: (e.target as HTMLSelectElement).value as ContourMethod })}>
              <option value="kamb" ?selected=${this.contourMethod === 'kamb'}>Kamb</option>
              <option value="exponential" ?selected=${this.contourMethod === 'exponential'}>Exponential</option>
              <option value="off" ?selected=${this.contourMethod === 'off'}>Off</option>
            </select>
          </label>
          <label><input type="checkbox" .checked=${show.grid} @change=${(e: Event) => this.setShow('grid', (e.target as HTMLInputElement).checked)} />10° grid</label>
        </div>
        <svg part="net" role="img" aria-label=${this.ariaSummary()} viewBox="0 0 ${width} ${height}"
          @pointermove=${this.onPointerMove} @pointerleave=${this.onPointerLeave} @click=${this.onClick}></svg>
        <p class="readout" part="readout" aria-hidden="true"></p>
      </figure>
      <section class="numbers" part="numbers" role="region" aria-label="Fold analysis results">
        <h2>Fold analysis</h2>
        <p class="selection">${this.selectionLabel === '' ? 'No selection named' : this.selectionLabel}</p>
        ${messages.length
          ? html`<ul class="warnings" part="warnings" aria-live="polite" aria-label="Messages">
              ${messages.map((m) => html`<li class=${m.error ? 'error' : ''}>${m.text}</li>`)}
            </ul>`
          : nothing}
        <dl part="values">
          ${rows.map((r) => (r.key === 'reading' || r.key === 'density'
            ? html`<dt class="wide" title=${r.hint}>${r.label}</dt><dd class="wide" data-key=${r.key}>${this.valueText(r.text, r.reason)}</dd>`
            : html`<dt title=${r.hint}>${r.label}</dt><dd data-key=${r.key}>${this.valueText(r.text, r.reason)}</dd>`))}
        </dl>
        <div class="exports" part="exports" role="group" aria-label="Export">
          <span>Export</span>
          <button @click=${() => this.download('svg')}>SVG</button>
          <button @click=${() => this.download('png')}>PNG</button>
          <button @click=${() => this.download('csv')}>CSV</button>
          <button @click=${() => this.download('json')}>JSON</button>
        </div>
      </section>
    </div>`;
  }

  protected override updated(): void {
    const svg = this.renderRoot.querySelector('svg');
    if (svg) this.draw(svg);
  }

  private valueText(text: string, reason: string | null) {
    return reason === null ? text : html`${DASH} <span class="reason">(${reason})</span>`;
  }

  /** Net coordinates of the poles, or an input error. */
  private projectPoles(): void {
    this.inputErrors = this.inputErrors.filter((e) => !e.startsWith('Poles'));
    this.index = null;
    try {
      const poles = this.poles ?? new Float64Array(0);
      this.poleXY = projectVectors(poles, this.net);
      const ids = this.poleIds;
      if (ids && ids.length !== poles.length / 3) {
        this.inputErrors.push(`Poles: poleIds has ${ids.length} entries; expected one station index per pole (${poles.length / 3}).`);
      }
    } catch (e) {
      this.poleXY = new Float64Array(0);
      this.inputErrors.push(`Poles could not be drawn: ${(e as Error).message}.`);
    }
  }

  private projectLines(): void {
    this.inputErrors = this.inputErrors.filter((e) => !e.startsWith('Lines'));
    this.index = null;
    try {
      const lines = this.lines ?? [];
      const xyz = new Float64Array(lines.length * 3);
      lines.forEach((l, i) => {
        if (!(Number.isFinite(l?.trend) && Number.isFinite(l?.plunge) && l.plunge >= 0 && l.plunge <= 90)) {
          throw new RangeError(`line ${i} (station ${String(l?.id)}) has trend ${String(l?.trend)}, plunge ${String(l?.plunge)}; expected a trend in degrees and a plunge from 0 to 90`);
        }
        const v = lineToVector(l);
        xyz[3 * i] = v.x;
        xyz[3 * i + 1] = v.y;
        xyz[3 * i + 2] = v.z;
      });
      this.lineXY = projectVectors(xyz, this.net);
    } catch (e) {
      this.lineXY = new Float64Array(0);
      this.inputErrors.push(`Lines could not be drawn: ${(e as Error).message}.`);
    }
  }

  /** Rebuilds the layers whose inputs changed (compared by identity). */
  private buildLayers(): void {
    const show = this.shown;
    const net = this.net;
    const density = show.contours ? this.usableDensity() : null;
    const layout = this.layout;
    this.layer('face+frame', [net, show.grid], () => frameLayers(net, show.grid, layout));
    this.layer('contours', [density, net], () => [contourLayer(density, net, layout)]);
    this.layer('great-circles', [this.poles, this.planes, net, show.greatCircles, this.maxGreatCircles], () => {
      if (!show.greatCircles) {
        this.greatCircleCount = null;
        return [{ id: 'great-circles', clip: false, items: [] }];
      }
      const gc = greatCircleLayer(this.planeList(), net, this.maxGreatCircles, layout);
      this.greatCircleCount = { drawn: gc.drawn, total: gc.total };
      return [gc];
    });
    this.layer('poles', [this.poleXY, show.poles], () => [poleLayer(show.poles ? this.poleXY : new Float64Array(0), layout)]);
    this.layer('lines', [this.lineXY, show.lines], () => [lineLayer(show.lines ? this.lineXY : new Float64Array(0), layout)]);
    this.layer('analysis', [this.analysis, this.description, net, ...Object.values(show)], () => [analysisLayer(this.analysis, this.description, net, show, layout)]);
    this.layer('highlight', [this.highlight, this.poleXY, this.lineXY], () => [highlightLayer(this.pointOfStation(this.highlight), layout)]);
    this.layer('legend', [this.poleXY, this.lineXY, this.greatCircleCount?.drawn, this.greatCircleCount?.total, this.analysis, this.description, density, ...Object.values(show)], () => {
      const legend = legendLayer({
        poles: this.poleXY.length / 2,
        lines: this.lineXY.length / 2,
        greatCircles: this.greatCircleCount,
        analysis: this.analysis,
        description: this.description,
        density,
        show,
      }, layout);
      this.drawnLayout = fitHeight(layout, legend.bottom);
      return [legend];
    });
  }

  private layer(key: string, deps: readonly unknown[], build: () => SceneLayer[]): void {
    const old = this.layerKeys.get(key);
    if (old && old.length === deps.length && old.every((d, i) => d === deps[i])) return;
    this.layerKeys.set(key, deps);
    for (const l of build()) this.layers.set(l.id, l);
  }

  /** Draw order of the layers. */
  private static readonly ORDER = ['face', 'contours', 'great-circles', 'poles', 'lines', 'analysis', 'frame', 'highlight', 'legend'];

  private orderedLayers(): SceneLayer[] {
    return FoldlensNet.ORDER.map((id) => this.layers.get(id)).filter((l): l is SceneLayer => l !== undefined);
  }

  /** Draws the layers into the SVG with d3; a layer whose object did not change is left alone. */
  private draw(svg: SVGSVGElement): void {
    const root = select(svg);
    const f = this.layout.frame;
    if (root.select('defs').empty()) root.append('defs').append('clipPath').attr('id', this.clipId).append('circle');
    root.select('defs circle').attr('cx', f.cx).attr('cy', f.cy).attr('r', f.r);
    const layers = this.orderedLayers();
    const groups = root
      .selectAll<SVGGElement, SceneLayer>('g[data-layer]')
      .data(layers, (d) => d.id)
      .join('g')
      .attr('data-layer', (d) => d.id)
      .attr('clip-path', (d) => (d.clip ? `url(#${this.clipId})` : null));
    groups.order();
    groups.each(function (layer) {
      const g = this as SVGGElement & { flLayer?: SceneLayer };
      if (g.flLayer === layer) return;
      g.flLayer = layer;
      const sel = select(g);
      sel.selectChildren().remove();
      for (const item of layer.items) drawItem(sel, item);
    });
    let ring = root.select<SVGPathElement>('path.hover-ring');
    if (ring.empty()) ring = root.append('path').attr('class', 'hover-ring').attr('d', markerPathData('ring', 12));
    const p = this.hoveredPoint >= 0 ? this.pointXY(this.hoveredPoint) : null;
    ring.attr('display', p ? null : 'none').attr('transform', p ? `translate(${f.cx + f.r * p.x} ${f.cy - f.r * p.y})` : null);
  }

  // ---- Pointer -------------------------------------------------------------------------

  private readonly onPointerMove = (e: PointerEvent): void => {
    const hit = this.hitTest(e);
    const svg = e.currentTarget as SVGSVGElement;
    svg.classList.toggle('near', hit.point >= 0);
    this.setReadout(hit.net);
    if (hit.point !== this.hoveredPoint) {
      this.hoveredPoint = hit.point;
      this.draw(svg);
    }
    if (hit.index !== this.hovered) {
      this.hovered = hit.index;
      this.dispatchEvent(new CustomEvent('foldlens-net-hover', { detail: { index: hit.index }, bubbles: true, composed: true }));
    }
  };

  private readonly onPointerLeave = (e: PointerEvent): void => {
    this.setReadout(null);
    if (this.hoveredPoint !== -1) {
      this.hoveredPoint = -1;
      this.draw(e.currentTarget as SVGSVGElement);
    }
    if (this.hovered !== -1) {
      this.hovered = -1;
      this.dispatchEvent(new CustomEvent('foldlens-net-hover', { detail: { index: -1 }, bubbles: true, composed: true }));
    }
  };

  private readonly onClick = (e: MouseEvent): void => {
    const hit = this.hitTest(e);
    this.dispatchEvent(new CustomEvent('foldlens-net-pick', { detail: { index: hit.index }, bubbles: true, composed: true }));
  };

  /** Nearest pole or line to the pointer within HOVER_RADIUS_PX: its point number and station index. */
  private hitTest(e: MouseEvent): { point: number; index: number; net: { x: number; y: number } | null } {
    const svg = e.currentTarget as SVGSVGElement;
    const m = svg.getScreenCTM();
    if (!m) return { point: -1, index: -1, net: null };
    const p = new DOMPoint(e.clientX, e.clientY).matrixTransform(m.inverse());
    const f = this.layout.frame;
    const net = { x: (p.x - f.cx) / f.r, y: (f.cy - p.y) / f.r };
    const radius = HOVER_RADIUS_PX / (Math.hypot(m.a, m.b) * f.r);
    const point = this.spatialIndex().find(net.x, net.y, radius);
    return point === undefined ? { point: -1, index: -1, net } : { point, index: this.stationOfPoint(point), net };
  }

  /** Quadtree over the shown poles and lines in net coordinates, built on first use after a change. */
  private spatialIndex(): Quadtree<number> {
    if (this.index) return this.index;
    const show = this.shown;
    const np = this.poleXY.length / 2;
    const nl = this.lineXY.length / 2;
    const ids: number[] = [];
    if (show.poles) for (let i = 0; i < np; i++) ids.push(i);
    if (show.lines) for (let i = 0; i < nl; i++) ids.push(np + i);
    this.index = quadtree<number>()
      .x((k) => this.pointXY(k)!.x)
      .y((k) => this.pointXY(k)!.y)
      .addAll(ids);
    return this.index;
  }

  /** Net position of point k (poles first, then lines). */
  private pointXY(k: number): { x: number; y: number } | null {
    const np = this.poleXY.length / 2;
    if (k < np) return { x: this.poleXY[2 * k], y: this.poleXY[2 * k + 1] };
    const j = k - np;
    if (j < this.lineXY.length / 2) return { x: this.lineXY[2 * j], y: this.lineXY[2 * j + 1] };
    return null;
  }

  private stationOfPoint(k: number): number {
    const np = this.poleXY.length / 2;
    if (k < np) return this.poleIds && this.poleIds.length === np ? this.poleIds[k] : k;
    return this.lines[k - np]?.id ?? -1;
  }

  /** Net position of a station's pole or line, or null. */
  private pointOfStation(station: number): { x: number; y: number } | null {
    if (!(Number.isInteger(station) && station >= 0)) return null;
    const np = this.poleXY.length / 2;
    const ids = this.poleIds && this.poleIds.length === np ? this.poleIds : null;
    for (let k = 0; k < np; k++) if ((ids ? ids[k] : k) === station) return this.pointXY(k);
    const j = this.lines.findIndex((l) => l.id === station);
    return j >= 0 ? this.pointXY(np + j) : null;
  }

  private setReadout(net: { x: number; y: number } | null): void {
    const out = this.renderRoot.querySelector('.readout');
    if (!out) return;
    const v = net ? unprojectPoint(net, this.net) : null;
    out.textContent = v ? `Pointer ${formatLine(vectorToLine(v)).text} (trend/plunge)` : '';
  }

  // ---- Options -------------------------------------------------------------------------

  private setShow(key: keyof NetShow, on: boolean): void {
    this.show = { ...this.show, [key]: on };
    this.index = null;
    this.fireOptions();
  }

  private setOption(o: { net?: NetKind; contours?: ContourMethod }): void {
    if (o.net) this.net = o.net;
    if (o.contours) this.contourMethod = o.contours;
    this.fireOptions();
  }

  private fireOptions(): void {
    const detail: NetOptionsDetail = { net: this.net, contours: this.contourMethod, show: this.shown };
    this.dispatchEvent(new CustomEvent('foldlens-net-options', { detail, bubbles: true, composed: true }));
  }

  // ---- Text ----------------------------------------------------------------------------

  private planeList(): readonly Plane[] {
    const n = this.poles.length / 3;
    if (this.planes && this.planes.length === n) return this.planes;
    const out: Plane[] = [];
    for (let i = 0; i < n; i++) {
      const x = this.poles[3 * i], y = this.poles[3 * i + 1], z = this.poles[3 * i + 2];
      if (Math.hypot(x, y, z) > 0) out.push(normalToPlane({ x, y, z }));
    }
    return out;
  }

  /** The density, when it was computed for the net and method shown (else the host is still recomputing it). */
  private usableDensity(): DensityGrid | null {
    const g = this.density;
    return this.contourMethod !== 'off' && g && g.net === this.net && g.method === this.contourMethod ? g : null;
  }

  private numbersInput() {
    const density = this.usableDensity();
    return { analysis: this.analysis, description: this.description, density, linesCount: this.lines?.length ?? 0 };
  }

  private messages(): { text: string; error: boolean }[] {
    const out = this.inputErrors.map((text) => ({ text, error: true }));
    for (const w of this.analysis?.warnings ?? []) out.push({ text: w.message, error: false });
    if (this.description && !this.description.ok && (this.analysis?.n ?? 0) >= 2) {
      out.push({ text: `The fold could not be described: ${this.description.reason}.`, error: false });
    }
    const gc = this.greatCircleCount;
    if (gc && gc.drawn < gc.total) {
      out.push({ text: `Great circles: ${formatCount(gc.drawn).text} of ${formatCount(gc.total).text} drawn (an even sample), to keep the net readable and fast.`, error: false });
    }
    if (this.planes && this.planes.length !== this.poles.length / 3) {
      out.push({ text: `Planes: ${this.planes.length} given for ${this.poles.length / 3} poles; great circles were drawn from the poles instead.`, error: true });
    }
    if (this.contourMethod !== 'off' && this.shown.contours && this.density && !this.usableDensity()) {
      const method = this.contourMethod === 'kamb' ? 'Kamb' : 'exponential';
      out.push({ text: `Contours are waiting for a ${method} density on the ${this.net} net.`, error: false });
    }
    return out;
  }

  private ariaSummary(): string {
    return netAriaLabel(this.analysis, this.poleXY.length / 2, this.lineXY.length / 2, this.net);
  }

  private shortMethod(): string {
    const parts = ['Fold (pi) axis: eigenvector of the least eigenvalue of the orientation tensor of the poles; 95% cone from a bootstrap of the poles; beta axis from intersections of pairs of planes.'];
    const g = this.numbersInput().density;
    if (g) {
      const cone = formatAngle(g.countingAngle);
      parts.push(`Contours: ${g.method === 'kamb' ? 'Kamb counting' : 'exponential smoothing'} in multiples of sigma (${levelsText(g.levels)}), counting cone ${cone.reason === null ? cone.text : DASH}.`);
    }
    return parts.join(' ');
  }

  private titleBlock(date: string): SvgTitleBlock {
    const a = this.analysis;
    const result = [
      `Fold axis (π) ${formatLine(a?.axis).text}`,
      `95% cone ${formatAngle(a?.cone95).text}`,
      `β axis ${formatLine(a?.beta).text}`,
      `girdle ${formatPlane(a?.girdle).text}`,
    ].join(' · ');
    return { selection: this.selectionLabel, method: this.shortMethod(), planes: a?.n ?? this.poleXY.length / 2, lines: this.lineXY.length / 2, date, result };
  }

  private exportMeta(date: string): NumbersExportMeta {
    const g = this.numbersInput().density;
    const densityMethod = g ? ` Contours: ${g.method === 'kamb' ? 'Kamb counting' : 'exponential smoothing'}, levels ${levelsText(g.levels)}.` : '';
    const fold = this.description?.ok ? ` ${this.description.method}` : '';
    return { selection: this.selectionLabel, net: this.net, date, method: `${this.analysis?.method ?? 'No analysis.'}${fold}${densityMethod}` };
  }

  private async download(kind: 'svg' | 'png' | 'csv' | 'json'): Promise<void> {
    const date = new Date().toISOString().slice(0, 10);
    const blob =
      kind === 'png'
        ? await this.toPng()
        : new Blob([kind === 'svg' ? this.toSvg(date) : kind === 'csv' ? this.toCsv(date) : this.toJson(date)], {
            type: kind === 'svg' ? 'image/svg+xml' : kind === 'csv' ? 'text/csv' : 'application/json',
          });
    downloadBlob(blob, `foldlens-net-${date}.${kind}`);
  }
}

/** Appends one scene item to a layer group; text goes in with .text(), never as markup. */
function drawItem(g: ReturnType<typeof select<SVGGElement, unknown>>, item: SceneItem): void {
  if (item.type === 'text') {
    g.append('text')
      .attr('class', `r-${item.role}`)
      .attr('x', item.x)
      .attr('y', item.y)
      .attr('text-anchor', item.anchor)
      .attr('data-name', item.name ?? null)
      .text(item.text);
    return;
  }
  const p = g
    .append('path')
    .attr('class', `r-${item.role}`)
    .attr('d', item.d)
    .attr('data-name', item.name ?? null)
    .attr('fill-rule', item.fillRule ?? null)
    .attr('transform', item.at ? `translate(${item.at.x} ${item.at.y})` : item.scale !== undefined ? `scale(${item.scale})` : null);
  if (item.fillOpacity !== undefined) p.style('fill-opacity', String(item.fillOpacity));
  if (item.strokeWidth !== undefined) p.style('stroke-width', `${item.strokeWidth}px`);
  if (item.strokeOpacity !== undefined) p.style('stroke-opacity', String(item.strokeOpacity));
  if (item.title) p.append('title').text(item.title);
}

defineOnce('foldlens-net', FoldlensNet);

declare global {
  interface HTMLElementTagNameMap {
    'foldlens-net': FoldlensNet;
  }
}
