import { downloadBlob, svgToPng } from './exportFiles';
import { LitElement, css, html, nothing, unsafeCSS, type PropertyValues } from 'lit';
import { quadtree, select, zoom, zoomIdentity, zoomTransform, type Quadtree, type Selection, type ZoomBehavior, type D3ZoomEvent } from 'd3';
import type { ProfileData } from '../map/profileData';
import { defineOnce } from './define';
import { DASH, formatCount } from './net/format';
import { profileSceneToSvg } from './profile/profileExportSvg';
import {
  DEFAULT_PROFILE_SHOW,
  annotationLayer,
  faceLayer,
  frameLayer,
  headingLines,
  highlightLayer,
  legendLayer,
  linesLayer,
  stationsLayer,
  topographyLayer,
  type ColourBy,
  type ProfileShow,
  type SceneItem,
  type SceneLayer,
} from './profile/profileScene';
import { profileRoleCss, resolveProfilePalette } from './profile/profileStyle';
import { angleText, metresText, profileAriaLabel, profileRows, profileTitleBlock } from './profile/profileText';
import { applyZoom, fitAffine, fromScreen, profileLayout, type ProfileAffine, type ProfileLayout, type ZoomTransform } from './profile/profileView';

/** Detail of `foldlens-profile-options`. */
export interface ProfileOptionsDetail {
  readonly colourBy: ColourBy;
  readonly verticalExaggeration: number;
  readonly show: ProfileShow;
}

/** Vertical exaggerations offered for sections. */
export const PROFILE_EXAGGERATIONS: readonly number[] = Object.freeze([1, 2, 3, 5, 10]);

/** Width (CSS pixels) of the drawing's column below which the key goes under the plot. */
const NARROW_BELOW_PX = 700;

/** Pointer distance (CSS pixels) within which a station counts as hovered. */
const HOVER_RADIUS_PX = 10;

/** Above this many stations, markers are redrawn when a pan or zoom gesture ends, not on every frame. */
const LIVE_REDRAW_LIMIT = 20_000;

/** Most stations named in the "without a height" list on screen (all are in the data and the count). */
const MAX_LISTED = 200;

let instances = 0;

/**
 * `<foldlens-profile>`: a down-plunge profile or a vertical section of stations and map linework
 * at true scale (sections may be drawn with a labelled vertical exaggeration), with a scale bar,
 * the view direction, compass labels on the edges, a key, apparent-dip ticks, colouring by layer
 * or by distance along the axis, pan and zoom, and beside it the numbers as text (the drawing's
 * text alternative). Exports SVG and PNG. The host prepares `data` with
 * `buildProfileData` (src/map/profileData.ts).
 *
 * Properties (set from code):
 * - `data` (ProfileData | null);
 * - `verticalExaggeration` (number, default 1; sections only: a down-plunge profile is always
 *   drawn at true scale);
 * - `colourBy` ('layer' | 'distance', default 'layer');
 * - `show` (Partial<ProfileShow>: stations, contacts, faults, topography);
 * - `highlight` (station index, in the host's station array, to ring; -1 for none);
 * - `label` (title of exports; defaults to `data.label`).
 *
 * Events (all bubble and are composed):
 * - `foldlens-profile-hover` {detail: {index}}: station index under the pointer, -1 when it leaves;
 * - `foldlens-profile-pick` {detail: {index}}: station index clicked, -1 for none;
 * - `foldlens-profile-options` {detail: ProfileOptionsDetail}: a control changed.
 *
 * Methods: `toSvg(date?)`, `toPng(scale?)`, `resetView()`.
 *
 * Keyboard (on the drawing): + and - zoom, arrow keys pan, 0 resets the view. Touch: pinch and drag.
 *
 * Parts: `panel`, `controls`, `drawing`, `readout`, `numbers`, `notes`, `values`, `missing`, `exports`.
 *
 * CSS custom properties: `--fl-bg`, `--fl-fg`, `--fl-muted`, `--fl-border`, `--fl-accent`,
 * `--fl-font`, and for the drawing `--fl-profile-face`, `--fl-profile-ink`, `--fl-profile-muted`,
 * `--fl-profile-frame`, `--fl-profile-topography`, `--fl-profile-contact`, `--fl-profile-fault`,
 * `--fl-profile-station`, `--fl-profile-highlight`, `--fl-profile-halo` (defaults in
 * profile/profileStyle.ts).
 * @example
 * const panel = document.createElement('foldlens-profile');
 * panel.data = buildProfileData({ stations, axis: { trend: 75, plunge: 12 }, ring });
 */
export class FoldlensProfile extends LitElement {
  static override properties = {
    data: { attribute: false },
    verticalExaggeration: { attribute: false },
    colourBy: { attribute: false },
    show: { attribute: false },
    highlight: { attribute: false },
    label: { attribute: false },
  };

  data: ProfileData | null = null;
  verticalExaggeration = 1;
  colourBy: ColourBy = 'layer';
  show: Partial<ProfileShow> = {};
  highlight = -1;
  label = '';

  private readonly clipId = `fl-profile-clip-${++instances}`;
  private inputErrors: string[] = [];
  private narrow = false;
  private layout: ProfileLayout = profileLayout(null, 1, false, 0);
  /** Metres to drawing units before pan and zoom. */
  private base: ProfileAffine = fitAffine(null, this.layout.plot);
  private transform: ZoomTransform = { k: 1, x: 0, y: 0 };
  /** Transform at which the screen layers were last built. */
  private builtAt: ZoomTransform = { k: 1, x: 0, y: 0 };
  private layers = new Map<string, SceneLayer>();
  private layerKeys = new Map<string, readonly unknown[]>();
  private baseXY: Float64Array = new Float64Array(0);
  private index: Quadtree<number> | null = null;
  private hovered = -1;
  private hoveredPoint = -1;
  private frameRequested = false;
  private zoomBehaviour: ZoomBehavior<SVGSVGElement, unknown> | null = null;
  private resizeObserver: ResizeObserver | null = null;

  static override styles = css`
    :host { display: block; font: 13px/1.4 var(--fl-font, system-ui, sans-serif); color: var(--fl-fg, #1d2326); }
    .panel { display: flex; flex-wrap: wrap; gap: 10px 18px; align-items: flex-start; }
    .figure { flex: 3 1 600px; min-width: 260px; max-width: 960px; margin: 0; }
    .numbers { flex: 1 1 260px; min-width: 220px; max-width: 560px; }
    .controls { display: flex; flex-wrap: wrap; gap: 4px 12px; align-items: center; margin-bottom: 4px; font-size: 12px; }
    .controls label { display: inline-flex; gap: 4px; align-items: center; white-space: nowrap; }
    .controls .zoom { display: inline-flex; gap: 3px; margin-left: auto; }
    select, button { font: inherit; color: inherit; background: var(--fl-bg, #fbfaf7); border: 1px solid var(--fl-border, #c9cdc8); border-radius: 4px; padding: 1px 7px; }
    button { cursor: pointer; min-width: 26px; }
    select:disabled { opacity: 0.55; }
    select:focus-visible, button:focus-visible, input:focus-visible, .drawing:focus-visible { outline: 2px solid var(--fl-accent, #0b6e8a); outline-offset: 1px; }
    .drawing { border-radius: 4px; }
    /* The drawing is a sheet of its own colour (white by default) in any page theme: its text and key are drawn for it, as the exports are. */
    svg { display: block; width: 100%; height: auto; user-select: none; -webkit-user-select: none; touch-action: none; cursor: grab; background: var(--fl-profile-halo, #ffffff); border-radius: 4px; }
    svg:active { cursor: grabbing; }
    svg.near { cursor: pointer; }
    .zoomed path { vector-effect: non-scaling-stroke; }
    .readout { min-height: 1.4em; margin: 2px 0 0; color: var(--fl-muted, #5b6469); font-variant-numeric: tabular-nums; font-size: 12px; }
    h2 { font-size: 12px; text-transform: uppercase; letter-spacing: 0.06em; color: var(--fl-muted, #5b6469); margin: 0 0 2px; }
    .selection { margin: 0 0 6px; font-weight: 600; overflow-wrap: anywhere; }
    dl { display: grid; grid-template-columns: max-content 1fr; gap: 2px 10px; margin: 0; font-variant-numeric: tabular-nums; }
    dt { color: var(--fl-muted, #5b6469); }
    dd { margin: 0; overflow-wrap: anywhere; }
    .reason { color: var(--fl-muted, #5b6469); font-size: 12px; }
    .notes { list-style: none; margin: 0 0 8px; padding: 0; }
    .notes li { border-left: 3px solid var(--fl-warn, #b36b00); background: var(--fl-warn-bg, #fff6e5); padding: 3px 8px; margin: 0 0 4px; border-radius: 0 3px 3px 0; }
    .notes li.error { border-left-color: var(--fl-danger, #b3261e); background: var(--fl-danger-bg, #fdeceb); }
    details { margin-top: 8px; }
    details ol { margin: 4px 0 0; padding-left: 20px; font-size: 12px; max-height: 12em; overflow: auto; }
    .exports { display: flex; gap: 6px; flex-wrap: wrap; margin-top: 10px; align-items: center; }
    .exports span { color: var(--fl-muted, #5b6469); font-size: 12px; }
    .caution { color: var(--fl-muted, #5b6469); font-size: 12px; margin: 8px 0 0; }
    ${unsafeCSS(profileRoleCss())}
  `;

  /** The toggles in force: `show` over the defaults. */
  get shown(): ProfileShow {
    return { ...DEFAULT_PROFILE_SHOW, ...this.show };
  }

  /** The exaggeration drawn: as set for a section, 1 for a down-plunge profile. */
  get exaggeration(): number {
    const ve = this.verticalExaggeration;
    return this.data?.mode === 'section' && ve > 0 && Number.isFinite(ve) ? ve : 1;
  }

  /** Metres to drawing units as drawn now (with pan and zoom). */
  get affine(): ProfileAffine {
    return applyZoom(this.base, this.transform);
  }

  /** The layout drawn now (size of the drawing, plot box, key). */
  get drawnLayout(): ProfileLayout {
    return this.layout;
  }

  // ---- Exports -------------------------------------------------------------------------

  /**
   * The profile as drawn now (with pan and zoom) as a standalone SVG document with inline
   * styles and a title block.
   * @example const svgText = panel.toSvg('2025-06-01');
   */
  toSvg(date = new Date().toISOString().slice(0, 10)): string {
    const a = this.affine;
    const cull = this.layout.plot;
    const show = this.shown;
    const ve = this.exaggeration;
    const layers = [
      faceLayer(this.layout),
      topographyLayer(this.data, a, show, cull),
      linesLayer(this.data, a, this.colourBy, show, cull),
      stationsLayer(this.data, a, this.colourBy, show, cull),
      frameLayer(this.layout),
      annotationLayer(this.data, this.layout, a, ve),
      legendLayer(this.data, { colourBy: this.colourBy, show, ...this.layout.legend }).layer,
    ];
    const cs = getComputedStyle(this);
    return profileSceneToSvg(layers, {
      layout: this.layout,
      palette: resolveProfilePalette((name) => cs.getPropertyValue(name)),
      label: profileAriaLabel(this.data, ve),
      ...(this.data && { titleBlock: profileTitleBlock(this.data, this.label, date, ve) }),
    });
  }

  /**
   * The profile as a PNG (the SVG export drawn into a canvas at `scale` times its size).
   * @example const blob = await panel.toPng(2);
   */
  async toPng(scale = 2): Promise<Blob> {
    return svgToPng(this.toSvg(), scale);
  }


  /**
   * Back to the whole profile, unzoomed.
   * @example panel.resetView();
   */
  resetView(): void {
    const svg = this.svgElement();
    if (svg && this.zoomBehaviour) select(svg).call(this.zoomBehaviour.transform, zoomIdentity);
    else this.transform = { k: 1, x: 0, y: 0 };
  }

  // ---- Lifecycle -----------------------------------------------------------------------

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

  private observeSize(): void {
    const figure = this.renderRoot.querySelector('.figure');
    if (!figure || typeof ResizeObserver === 'undefined' || this.resizeObserver) return;
    this.resizeObserver = new ResizeObserver((entries) => {
      const width = entries[entries.length - 1]?.contentRect.width ?? 0;
      // The wide drawing is 900 units across: below about 700 px its 11.5-unit text falls under 9 px.
      const next = width > 0 && width < NARROW_BELOW_PX;
      if (next !== this.narrow) {
        this.narrow = next;
        this.layerKeys.clear();
        this.requestUpdate();
      }
    });
    this.resizeObserver.observe(figure);
  }

  protected override willUpdate(changed: PropertyValues<this>): void {
    this.inputErrors = [];
    const data = this.data;
    const ve = this.exaggeration;
    const show = this.shown;
    try {
      // The key's height fixes the drawing's; the layout fixes the base map.
      const probe = legendLayer(data, { colourBy: this.colourBy, show, x: 0, y: 0, width: this.narrow ? 416 : 206 });
      const heading = headingLines(data, ve, this.narrow).length;
      const layoutKey = [data, ve, this.narrow, probe.bottom, heading];
      if (this.changedKey('layout', layoutKey)) {
        this.layout = profileLayout(data?.extent ?? null, ve, this.narrow, probe.bottom, heading);
        this.base = fitAffine(data?.extent ?? null, this.layout.plot, ve);
        this.baseXY = stationPositions(data, this.base);
        this.index = null;
        this.hovered = -1;
        this.hoveredPoint = -1;
        if (changed.has('data') || this.transform.k !== 1 || this.transform.x !== 0 || this.transform.y !== 0) this.transform = { k: 1, x: 0, y: 0 };
        this.layerKeys.delete('screen');
      }
      const l = this.layout;
      this.layer('face', [l], () => faceLayer(l));
      this.layer('frame', [l], () => frameLayer(l));
      this.layer('topography', [data, this.base, show.topography], () => topographyLayer(data, this.base, show));
      this.layer('lines', [data, this.base, this.colourBy, show.contacts, show.faults], () => linesLayer(data, this.base, this.colourBy, show));
      this.layer('legend', [data, l, this.colourBy, ...Object.values(show)], () => legendLayer(data, { colourBy: this.colourBy, show, ...l.legend }).layer);
      this.buildScreenLayers(true);
    } catch (e) {
      this.inputErrors.push(`The profile could not be drawn: ${(e as Error).message}.`);
      this.layers.clear();
      this.layerKeys.clear();
    }
  }

  /** Layers drawn with the zoomed map: stations and annotations, and the highlight and hover rings. */
  private buildScreenLayers(onlyIfChanged: boolean): void {
    const a = this.affine;
    const data = this.data;
    const show = this.shown;
    const key = [data, this.base, this.transform, this.colourBy, show.stations, this.exaggeration];
    if (!onlyIfChanged || this.changedKey('screen', key)) {
      this.layerKeys.set('screen', key);
      this.layers.set('stations', stationsLayer(data, a, this.colourBy, show, this.layout.plot));
      this.layers.set('annotations', annotationLayer(data, this.layout, a, this.exaggeration));
      this.layers.set('hover', highlightLayer(data, a, this.hoveredIndex(), 'hover'));
      this.builtAt = this.transform;
    }
    // The ring alone follows `highlight` (the host may set it on every map hover).
    if (!onlyIfChanged || this.changedKey('highlight', [data, this.base, this.builtAt, this.highlight])) {
      this.layers.set('highlight', highlightLayer(data, applyZoom(this.base, this.builtAt), this.highlight));
    }
  }

  private changedKey(key: string, deps: readonly unknown[]): boolean {
    const old = this.layerKeys.get(key);
    const same = old !== undefined && old.length === deps.length && old.every((d, i) => d === deps[i]);
    if (!same) this.layerKeys.set(key, deps);
    return !same;
  }

  private layer(key: string, deps: readonly unknown[], build: () => SceneLayer): void {
    if (!this.changedKey(key, deps) && this.layers.has(key)) return;
    this.layers.set(key, build());
  }

  override render() {
    const data = this.data;
    const { width, height } = this.layout;
    const isSection = data?.mode === 'section';
    const show = this.shown;
    const rows = data ? profileRows(data, this.exaggeration) : [];
    const notes = [...this.inputErrors.map((text) => ({ text, error: true })), ...(data?.notes ?? []).map((text) => ({ text, error: false }))];
    const missing = data?.noHeight ?? [];
    return html`<div class="panel" part="panel">
      <figure class="figure">
        <div class="controls" part="controls" role="group" aria-label="Profile options">
          <label>Colour
            <select aria-label="Colour by" @change=${(e: Event) => this.setOption({ colourBy: (e.target as HTMLSelectElement).value as ColourBy })}>
              <option value="layer" ?selected=${this.colourBy === 'layer'}>by layer</option>
              <option value="distance" ?selected=${this.colourBy === 'distance'}>by distance along the axis</option>
            </select>
          </label>
          <label><input type="checkbox" .checked=${show.stations} @change=${(e: Event) => this.setShow('stations', (e.target as HTMLInputElement).checked)} />Stations</label>
          <label><input type="checkbox" .checked=${show.contacts} @change=${(e: Event) => this.setShow('contacts', (e.target as HTMLInputElement).checked)} />Contacts</label>
          <label><input type="checkbox" .checked=${show.faults} @change=${(e: Event) => this.setShow('faults', (e.target as HTMLInputElement).checked)} />Faults</label>
          ${isSection
            ? html`<label><input type="checkbox" .checked=${show.topography} @change=${(e: Event) => this.setShow('topography', (e.target as HTMLInputElement).checked)} />Ground</label>`
            : nothing}
          <label title=${isSection ? 'Vertical exaggeration of the section: heights drawn this many times larger than distances (×1 is true scale)' : 'A down-plunge profile is always drawn at true scale'}>Vertical exaggeration
            <select aria-label="Vertical exaggeration" ?disabled=${!isSection} @change=${(e: Event) => this.setOption({ verticalExaggeration: Number((e.target as HTMLSelectElement).value) })}>
              ${PROFILE_EXAGGERATIONS.map((v) => html`<option value=${v} ?selected=${this.exaggeration === v}>${v === 1 ? '×1 (true scale)' : `×${v}`}</option>`)}
            </select>
          </label>
          <span class="zoom" role="group" aria-label="Zoom">
            <button type="button" aria-label="Zoom in" title="Zoom in (+)" @click=${() => this.zoomBy(1.5)}>+</button>
            <button type="button" aria-label="Zoom out" title="Zoom out (-)" @click=${() => this.zoomBy(1 / 1.5)}>−</button>
            <button type="button" title="Whole profile (0)" @click=${() => this.resetView()}>Reset</button>
          </span>
        </div>
        <div
          class="drawing"
          part="drawing"
          tabindex="0"
          role="group"
          aria-label="Profile drawing: drag or use the arrow keys to pan; wheel, pinch or + and - to zoom; 0 for the whole profile"
          @keydown=${this.onKeyDown}
        >
          <svg
            viewBox="0 0 ${width} ${height}"
            role="img"
            aria-label=${profileAriaLabel(data, this.exaggeration)}
            @pointermove=${this.onPointerMove}
            @pointerleave=${this.onPointerLeave}
            @click=${this.onClick}
          ></svg>
        </div>
        <p class="readout" part="readout" aria-live="polite"></p>
      </figure>
      <section class="numbers" part="numbers" aria-label="Profile numbers">
        <h2>Profile</h2>
        <p class="selection">${this.label !== '' ? this.label : data?.label ?? 'No profile yet'}</p>
        ${notes.length ? html`<ul class="notes" part="notes">${notes.map((n) => html`<li class=${n.error ? 'error' : ''}>${n.text}</li>`)}</ul>` : nothing}
        ${data
          ? html`<dl part="values">
              ${rows.map((r) => html`<dt>${r.label}</dt><dd data-key=${r.key}>${r.reason === null ? r.text : html`${DASH} <span class="reason">(${r.reason})</span>`}</dd>`)}
            </dl>`
          : html`<p class="reason">Give the panel data from buildProfileData to draw a profile.</p>`}
        ${missing.length
          ? html`<details part="missing">
              <summary>Stations without a height (${formatCount(missing.length).text})</summary>
              <ol>
                ${missing.slice(0, MAX_LISTED).map((m) => html`<li>${m}</li>`)}
                ${missing.length > MAX_LISTED ? html`<li>… and ${formatCount(missing.length - MAX_LISTED).text} more</li>` : nothing}
              </ol>
            </details>`
          : nothing}
        <div class="exports" part="exports" role="group" aria-label="Export">
          <span>Export</span>
          <button type="button" @click=${() => this.download('svg')}>SVG</button>
          <button type="button" @click=${() => this.download('png')}>PNG</button>
        </div>
        <p class="caution">Results are aids to interpretation; check in the field and defer to local codes and licensed professional practice.</p>
      </section>
    </div>`;
  }

  protected override updated(): void {
    const svg = this.svgElement();
    if (!svg) return;
    this.attachZoom(svg);
    this.draw(svg);
  }

  private svgElement(): SVGSVGElement | null {
    return this.renderRoot.querySelector('svg');
  }

  // ---- Drawing -------------------------------------------------------------------------

  private static readonly STRUCTURE: readonly { id: string; parent: 'root' | 'clip' | 'zoomed' }[] = [
    { id: 'face', parent: 'root' },
    { id: 'topography', parent: 'zoomed' },
    { id: 'lines', parent: 'zoomed' },
    { id: 'stations', parent: 'clip' },
    { id: 'highlight', parent: 'clip' },
    { id: 'hover', parent: 'clip' },
    { id: 'frame', parent: 'root' },
    { id: 'annotations', parent: 'root' },
    { id: 'legend', parent: 'root' },
  ];

  /** Draws the layers with d3; a group whose layer object did not change is left alone. */
  private draw(svg: SVGSVGElement): void {
    const root = select(svg);
    const p = this.layout.plot;
    if (root.select('defs').empty()) {
      root.append('defs').append('clipPath').attr('id', this.clipId).append('rect');
      for (const s of FoldlensProfile.STRUCTURE) {
        if (s.parent === 'root') root.append('g').attr('data-layer', s.id);
        else if (s.parent === 'zoomed') {
          let clip = root.select<SVGGElement>('g.data-clip');
          if (clip.empty()) clip = root.append('g').attr('class', 'data-clip').attr('clip-path', `url(#${this.clipId})`);
          let zoomed = clip.select<SVGGElement>('g.zoomed');
          if (zoomed.empty()) zoomed = clip.append('g').attr('class', 'zoomed');
          zoomed.append('g').attr('data-layer', s.id);
        } else {
          let clip = root.select<SVGGElement>('g.screen-clip');
          if (clip.empty()) clip = root.append('g').attr('class', 'screen-clip').attr('clip-path', `url(#${this.clipId})`);
          clip.append('g').attr('data-layer', s.id);
        }
      }
    }
    root.select('defs rect').attr('x', p.left).attr('y', p.top).attr('width', p.width).attr('height', p.height);
    this.applyTransforms(root);
    for (const s of FoldlensProfile.STRUCTURE) {
      const layer = this.layers.get(s.id) ?? { id: s.id, clip: false, space: 'screen', items: [] };
      const g = root.select<SVGGElement>(`g[data-layer="${s.id}"]`).node() as (SVGGElement & { flLayer?: SceneLayer }) | null;
      if (!g || g.flLayer === layer) continue;
      g.flLayer = layer;
      const sel = select(g);
      sel.selectChildren().remove();
      for (const item of layer.items) drawItem(sel, item);
    }
  }

  /** The zoom group carries the transform; screen layers built at another transform are moved until rebuilt. */
  private applyTransforms(root: Selection<SVGSVGElement, unknown, null, undefined>): void {
    const t = this.transform;
    root.select('g.zoomed').attr('transform', `translate(${t.x} ${t.y}) scale(${t.k})`);
    const b = this.builtAt;
    const k = t.k / b.k;
    const moved = k !== 1 || t.x !== b.x || t.y !== b.y;
    root.select('g.screen-clip').selectAll<SVGGElement, unknown>('g[data-layer]').attr('transform', moved ? `translate(${t.x - k * b.x} ${t.y - k * b.y}) scale(${k})` : null);
  }

  private attachZoom(svg: SVGSVGElement): void {
    const p = this.layout.plot;
    const extent: [[number, number], [number, number]] = [[p.left, p.top], [p.left + p.width, p.top + p.height]];
    if (!this.zoomBehaviour) {
      this.zoomBehaviour = zoom<SVGSVGElement, unknown>()
        .scaleExtent([0.5, 400])
        .on('zoom', (e: D3ZoomEvent<SVGSVGElement, unknown>) => this.onZoom(e))
        .on('end', () => this.redrawScreen());
      select(svg).call(this.zoomBehaviour).on('dblclick.zoom', null);
    }
    this.zoomBehaviour.extent(extent);
    // Keep d3's own state in step after new data or a new layout reset the view.
    const current = zoomTransform(svg);
    const t = this.transform;
    if (current.k !== t.k || current.x !== t.x || current.y !== t.y) select(svg).call(this.zoomBehaviour.transform, zoomIdentity.translate(t.x, t.y).scale(t.k));
  }

  private onZoom(e: D3ZoomEvent<SVGSVGElement, unknown>): void {
    const { k, x, y } = e.transform;
    this.transform = { k, x, y };
    const svg = this.svgElement();
    if (svg) this.applyTransforms(select(svg));
    // Few stations: redraw markers every frame. Many: move them with the view and redraw at the end.
    if ((this.data?.stations.index.length ?? 0) <= LIVE_REDRAW_LIMIT || e.sourceEvent === null) this.requestRedraw();
  }

  private requestRedraw(): void {
    if (this.frameRequested) return;
    this.frameRequested = true;
    requestAnimationFrame(() => {
      this.frameRequested = false;
      this.redrawScreen();
    });
  }

  private redrawScreen(): void {
    const svg = this.svgElement();
    if (!svg) return;
    try {
      this.buildScreenLayers(true);
    } catch (e) {
      this.inputErrors.push(`The profile could not be drawn: ${(e as Error).message}.`);
      this.requestUpdate();
    }
    this.draw(svg);
  }

  private zoomBy(factor: number): void {
    const svg = this.svgElement();
    if (svg && this.zoomBehaviour) select(svg).call(this.zoomBehaviour.scaleBy, factor);
  }

  private readonly onKeyDown = (e: KeyboardEvent): void => {
    const svg = this.svgElement();
    if (!svg || !this.zoomBehaviour) return;
    const z = this.zoomBehaviour;
    const step = 40 / this.transform.k;
    const moves: Record<string, () => void> = {
      '+': () => select(svg).call(z.scaleBy, 1.5),
      '=': () => select(svg).call(z.scaleBy, 1.5),
      '-': () => select(svg).call(z.scaleBy, 1 / 1.5),
      '0': () => this.resetView(),
      ArrowLeft: () => select(svg).call(z.translateBy, step, 0),
      ArrowRight: () => select(svg).call(z.translateBy, -step, 0),
      ArrowUp: () => select(svg).call(z.translateBy, 0, step),
      ArrowDown: () => select(svg).call(z.translateBy, 0, -step),
    };
    const move = moves[e.key];
    if (!move) return;
    e.preventDefault();
    move();
  };

  // ---- Pointer -------------------------------------------------------------------------

  private readonly onPointerMove = (e: PointerEvent): void => {
    const hit = this.hitTest(e);
    const svg = e.currentTarget as SVGSVGElement;
    svg.classList.toggle('near', hit.point >= 0);
    this.setReadout(hit);
    if (hit.point !== this.hoveredPoint) {
      this.hoveredPoint = hit.point;
      this.layers.set('hover', highlightLayer(this.data, this.builtAffine(), this.hoveredIndex(), 'hover'));
      this.draw(svg);
    }
    if (hit.index !== this.hovered) {
      this.hovered = hit.index;
      this.dispatchEvent(new CustomEvent('foldlens-profile-hover', { detail: { index: hit.index }, bubbles: true, composed: true }));
    }
  };

  private readonly onPointerLeave = (e: PointerEvent): void => {
    this.setReadout(null);
    if (this.hoveredPoint !== -1) {
      this.hoveredPoint = -1;
      this.layers.set('hover', highlightLayer(this.data, this.builtAffine(), -1, 'hover'));
      this.draw(e.currentTarget as SVGSVGElement);
    }
    if (this.hovered !== -1) {
      this.hovered = -1;
      this.dispatchEvent(new CustomEvent('foldlens-profile-hover', { detail: { index: -1 }, bubbles: true, composed: true }));
    }
  };

  private readonly onClick = (e: MouseEvent): void => {
    const hit = this.hitTest(e);
    this.dispatchEvent(new CustomEvent('foldlens-profile-pick', { detail: { index: hit.index }, bubbles: true, composed: true }));
  };

  /** The map at which the screen layers were built (they are moved by a transform until rebuilt). */
  private builtAffine(): ProfileAffine {
    return applyZoom(this.base, this.builtAt);
  }

  private hoveredIndex(): number {
    return this.hoveredPoint >= 0 && this.data ? (this.data.stations.index[this.hoveredPoint] ?? -1) : -1;
  }

  /** Nearest shown station to the pointer within HOVER_RADIUS_PX: its row in the data and its station index. */
  private hitTest(e: MouseEvent): { point: number; index: number; at: [number, number] | null } {
    const svg = e.currentTarget as SVGSVGElement;
    const m = svg.getScreenCTM();
    if (!m || !this.data) return { point: -1, index: -1, at: null };
    const p = new DOMPoint(e.clientX, e.clientY).matrixTransform(m.inverse());
    const plot = this.layout.plot;
    const inside = p.x >= plot.left && p.x <= plot.left + plot.width && p.y >= plot.top && p.y <= plot.top + plot.height;
    if (!inside) return { point: -1, index: -1, at: null };
    const t = this.transform;
    const at = fromScreen(this.affine, p.x, p.y);
    if (!this.shown.stations) return { point: -1, index: -1, at };
    // Base (unzoomed) drawing units: where the quadtree keeps the stations.
    const bx = (p.x - t.x) / t.k;
    const by = (p.y - t.y) / t.k;
    const radius = HOVER_RADIUS_PX / (Math.hypot(m.a, m.b) * t.k);
    const point = this.spatialIndex().find(bx, by, radius);
    return point === undefined ? { point: -1, index: -1, at } : { point, index: this.data.stations.index[point], at };
  }

  private spatialIndex(): Quadtree<number> {
    if (this.index) return this.index;
    const xy = this.baseXY;
    const ids: number[] = [];
    for (let k = 0; k < xy.length / 2; k++) if (Number.isFinite(xy[2 * k]) && Number.isFinite(xy[2 * k + 1])) ids.push(k);
    this.index = quadtree<number>()
      .x((k) => xy[2 * k])
      .y((k) => xy[2 * k + 1])
      .addAll(ids);
    return this.index;
  }

  private setReadout(hit: { point: number; at: [number, number] | null } | null): void {
    const out = this.renderRoot.querySelector('.readout');
    if (!out) return;
    if (!hit || !hit.at || !this.data) {
      out.textContent = '';
      return;
    }
    const [x, y] = hit.at;
    const where = this.data.mode === 'down-plunge' ? `Pointer x′ ${metresText(x)}, y′ ${metresText(y)}` : `Pointer at ${metresText(x)} along the section, height ${metresText(y)}`;
    let station = '';
    if (hit.point >= 0) {
      const s = this.data.stations;
      const k = hit.point;
      const angle = s.tickAngle[k];
      const attitude = s.isPlane[k] === 1 ? (Number.isFinite(angle) ? `, ${this.data.mode === 'down-plunge' ? 'trace' : 'apparent dip'} ${angleText(angle)}` : ', no trace') : '';
      const along = this.data.mode === 'down-plunge' ? `${metresText(s.along[k])} along the axis` : `${metresText(s.along[k])} down-plunge of the section`;
      station = ` · ${s.ids[k] ?? ''} ${s.kinds[k] ?? ''}${attitude}, ${along}`;
    }
    // Text only: station ids are data and never become markup.
    out.textContent = `${where}${station}`;
  }

  // ---- Options -------------------------------------------------------------------------

  private setShow(key: keyof ProfileShow, on: boolean): void {
    this.show = { ...this.show, [key]: on };
    this.index = null;
    this.fireOptions();
  }

  private setOption(o: { colourBy?: ColourBy; verticalExaggeration?: number }): void {
    if (o.colourBy) this.colourBy = o.colourBy;
    if (o.verticalExaggeration !== undefined && o.verticalExaggeration > 0) this.verticalExaggeration = o.verticalExaggeration;
    this.fireOptions();
  }

  private fireOptions(): void {
    const detail: ProfileOptionsDetail = { colourBy: this.colourBy, verticalExaggeration: this.exaggeration, show: this.shown };
    this.dispatchEvent(new CustomEvent('foldlens-profile-options', { detail, bubbles: true, composed: true }));
  }

  private async download(kind: 'svg' | 'png'): Promise<void> {
    const date = new Date().toISOString().slice(0, 10);
    const blob = kind === 'png' ? await this.toPng() : new Blob([this.toSvg(date)], { type: 'image/svg+xml' });
    downloadBlob(blob, `foldlens-profile-${date}.${kind}`);
  }
}

/** Drawing positions of the stations at the unzoomed view, for hit testing. */
function stationPositions(data: ProfileData | null, a: ProfileAffine): Float64Array {
  const xy = data?.stations.xy ?? new Float64Array(0);
  const out = new Float64Array(xy.length);
  for (let k = 0; k < xy.length; k += 2) {
    out[k] = a.sx * xy[k] + a.tx;
    out[k + 1] = a.sy * xy[k + 1] + a.ty;
  }
  return out;
}

/** Appends one scene item to a group; text goes in with .text(), never as markup. */
function drawItem(g: Selection<SVGGElement, unknown, null, undefined>, item: SceneItem): void {
  if (item.type === 'text') {
    g.append('text').attr('class', `p-${item.role}`).attr('x', item.x).attr('y', item.y).attr('text-anchor', item.anchor).attr('data-name', item.name ?? null).text(item.text);
    return;
  }
  const p = g.append('path').attr('class', `p-${item.role}`).attr('d', item.d).attr('data-name', item.name ?? null);
  if (item.stroke !== undefined) p.style('stroke', item.stroke);
  if (item.fill !== undefined) p.style('fill', item.fill);
  if (item.dash !== undefined) p.style('stroke-dasharray', item.dash);
  if (item.title) p.append('title').text(item.title);
}


defineOnce('foldlens-profile', FoldlensProfile);

declare global {
  interface HTMLElementTagNameMap {
    'foldlens-profile': FoldlensProfile;
  }
}
