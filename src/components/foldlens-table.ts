import { LitElement, css, html, nothing, type PropertyValues, type TemplateResult } from 'lit';
import { describeProblem, isUsable, type Station } from '../core/station';
import type { PlaneFormat } from '../core/notation';
import { withStationEdit, type CellEdit, type ProjectDataset } from '../io/projectFile';
import { KIND_LABELS } from '../map/symbolCatalog';
import { ImportOptionsError, prepareCrs } from './import/importOptions';
import { pendingEpsgCode } from '../io/crs';
import { problemsToCsv } from './import/importReport';
import { rereadRow } from './table/fixRow';
import { datasetToCsv, datasetToGeoJson } from './table/exportTable';
import {
  cellText,
  scrollToShow,
  tableColumns,
  tableCounts,
  viewIndices,
  visibleWindow,
  type KindFilter,
  type RowsFilter,
  type SortSpec,
  type TableColumn,
  type TableCounts,
} from './table/tableModel';
import { defineOnce } from './define';

/** Detail of `foldlens-row-select`. */
export interface RowSelectDetail {
  readonly index: number;
}

/** Detail of `foldlens-row-edit` (every edit) and `foldlens-row-fixed` (an edit that made the row usable). */
export interface RowEditDetail {
  readonly index: number;
  readonly station: Station;
  readonly edit: CellEdit;
  /** The dataset with the edit made, to store. */
  readonly dataset: ProjectDataset;
}

const ROW_HEIGHT = 26;
const HEADER_HEIGHT = 28;
const OVERSCAN = 6;
const PLANE_FORMATS: readonly { value: PlaneFormat; label: string }[] = [
  { value: 'dipdir', label: 'dip direction/dip' },
  { value: 'rhr', label: 'strike/dip (RHR)' },
  { value: 'strike-quadrant', label: 'strike/dip quadrant' },
  { value: 'quadrant', label: 'quadrant bearings' },
];

/**
 * `<foldlens-table>`: the stations of a dataset as rows, every original column kept. Sortable
 * (click a column heading), filterable by kind and by state (rows with problems, usable rows),
 * virtualised (only the rows in view are in the DOM, so 10^4 to 10^6 rows scroll smoothly).
 * A row with problems can be fixed in place: edit one of its original cells (double-click,
 * F2, or Enter on a flagged cell) and the row is read again by the same reader with the same
 * mapping and options. Export as CSV or GeoJSON keeps every original column.
 *
 * Properties: `data` (the ProjectDataset shown, or null; `dataset` is taken by HTMLElement), `selectedIndex` (station index, -1 for none:
 * setting it scrolls to the row and marks it), `highlight` (station index to mark without
 * scrolling, e.g. while the map is hovered; -1 for none).
 * Methods: `toCsv(planeFormat?)`, `toGeoJson(planeFormat?)`, `scrollToIndex(index)`.
 * Events (bubble, composed): `foldlens-row-select` {index} on a click or Enter/Space;
 * `foldlens-row-edit` {index, station, edit, dataset} after every edit;
 * `foldlens-row-fixed` {index, station, edit, dataset} when an edit makes a row usable.
 * Keyboard (grid focused): arrows move the active cell, Page Up/Down, Home/End (with Ctrl: first
 * and last row), Enter or Space selects the row, F2 (or Enter on a flagged cell) edits, Escape cancels.
 * Parts: `toolbar`, `grid`, `header`, `row`, `cell`, `export`.
 * CSS custom properties: `--fl-table-height` (default 320px), `--fl-bg`, `--fl-fg`, `--fl-muted`,
 * `--fl-border`, `--fl-accent`, `--fl-accent-soft`, `--fl-danger`, `--fl-font`.
 * @example
 * <foldlens-table></foldlens-table>
 * table.data = dataset; table.addEventListener('foldlens-row-select', (e) => flyTo(e.detail.index));
 */
export class FoldlensTable extends LitElement {
  static override properties = {
    data: { attribute: false },
    selectedIndex: { type: Number },
    highlight: { type: Number },
    kindFilter: { state: true },
    rowsFilter: { state: true },
    sort: { state: true },
    first: { state: true },
    viewportHeight: { state: true },
    active: { state: true },
    editing: { state: true },
    message: { state: true },
    planeFormat: { state: true },
  };

  data: ProjectDataset | null = null;
  selectedIndex = -1;
  highlight = -1;

  kindFilter: KindFilter = 'all';
  rowsFilter: RowsFilter = 'all';
  sort: SortSpec | null = null;
  first = 0;
  viewportHeight = 320;
  /** Active cell: position in the view and column number. */
  active = { position: 0, column: 2 };
  editing: { index: number; column: string } | null = null;
  message: string | null = null;
  planeFormat: PlaneFormat = 'dipdir';

  private view: Int32Array = new Int32Array(0);
  private positions: Int32Array = new Int32Array(0);
  private columns: TableColumn[] = [];
  private counts: TableCounts = { kinds: new Map(), problems: 0, usable: 0 };
  private viewOf: ProjectDataset | null = null;
  private resize: ResizeObserver | null = null;
  private frame = 0;
  private scrollWanted: number | null = null;
  private scrollToSelected = false;

  static override styles = css`
    :host { display: block; font: 13px/1.3 var(--fl-font, system-ui, sans-serif); color: var(--fl-fg, #1d2326); }
    * { box-sizing: border-box; }
    button, select, input { font: inherit; color: inherit; }
    button, select { background: var(--fl-bg, #fbfaf7); border: 1px solid var(--fl-border, #c9cdc8); border-radius: 4px; min-height: 26px; padding: 2px 8px; cursor: pointer; }
    select { padding: 2px 4px; }
    :is(button, select, input):focus-visible { outline: 2px solid var(--fl-accent, #0b6e8a); outline-offset: 1px; }
    .toolbar { display: flex; flex-wrap: wrap; gap: 6px 10px; align-items: center; margin-bottom: 6px; }
    .toolbar label { display: inline-flex; gap: 4px; align-items: center; color: var(--fl-muted, #5b6469); }
    .toolbar .count { color: var(--fl-muted, #5b6469); font-variant-numeric: tabular-nums; }
    .toolbar .export { margin-left: auto; display: inline-flex; gap: 4px; align-items: center; }
    .viewport { position: relative; height: var(--fl-table-height, 320px); overflow: auto; border: 1px solid var(--fl-border, #c9cdc8); border-radius: 4px; background: var(--fl-bg, #fbfaf7); outline: none; }
    .viewport:focus-visible { box-shadow: 0 0 0 2px var(--fl-accent, #0b6e8a); }
    /* Fixed column widths and layout containment: a scroll re-lays out only the rows in view, cheaply. */
    .header, .row { display: grid; min-width: 100%; }
    .row { contain: layout paint style; }
    .cell { contain: layout paint style; }
    .header { position: sticky; top: 0; z-index: 2; height: ${HEADER_HEIGHT}px; background: var(--fl-bg, #fbfaf7); border-bottom: 1px solid var(--fl-border, #c9cdc8); }
    .header [role='columnheader'] { display: flex; align-items: stretch; min-width: 0; }
    .header button { flex: 1; min-width: 0; border: 0; border-radius: 0; background: transparent; text-align: left; font-weight: 600; color: var(--fl-muted, #5b6469); padding: 0 6px; white-space: nowrap; overflow: hidden; text-overflow: ellipsis; min-height: 0; }
    .header button:hover { color: var(--fl-fg, #1d2326); }
    .header .original button { font-weight: 500; font-style: italic; }
    .arrow { font-style: normal; color: var(--fl-accent, #0b6e8a); }
    .body { position: relative; }
    .rows { position: absolute; left: 0; top: 0; min-width: 100%; will-change: transform; }
    .row { height: ${ROW_HEIGHT}px; border-bottom: 1px solid color-mix(in srgb, var(--fl-border, #c9cdc8) 45%, transparent); cursor: default; }
    .row:nth-child(even) { background: color-mix(in srgb, var(--fl-border, #c9cdc8) 12%, transparent); }
    .row.problem { background: color-mix(in srgb, var(--fl-danger, #b3261e) 5%, transparent); }
    .row.highlight { background: var(--fl-accent-soft, #e3f0f3); }
    .row[aria-selected='true'] { background: var(--fl-accent-soft, #e3f0f3); box-shadow: inset 3px 0 0 var(--fl-accent, #0b6e8a); }
    .cell { padding: 0 6px; line-height: ${ROW_HEIGHT - 1}px; white-space: nowrap; overflow: hidden; text-overflow: ellipsis; font-variant-numeric: tabular-nums; min-width: 0; }
    .cell.num { text-align: right; color: var(--fl-muted, #5b6469); }
    .cell.flagged { color: var(--fl-danger, #b3261e); text-decoration: underline wavy color-mix(in srgb, var(--fl-danger, #b3261e) 60%, transparent); text-underline-offset: 3px; }
    .cell.editable { cursor: text; }
    .cell.problems { color: var(--fl-danger, #b3261e); }
    .viewport:focus-within .cell.active { outline: 2px solid var(--fl-accent, #0b6e8a); outline-offset: -2px; }
    .flag { display: inline-block; min-width: 16px; height: 16px; line-height: 16px; border-radius: 8px; background: var(--fl-danger, #b3261e); color: #fff; text-align: center; font-size: 11px; font-weight: 700; }
    .cell input { width: 100%; height: ${ROW_HEIGHT - 4}px; border: 1px solid var(--fl-accent, #0b6e8a); border-radius: 3px; padding: 0 4px; background: var(--fl-bg, #fff); }
    .empty { padding: 16px; color: var(--fl-muted, #5b6469); }
    .message { margin: 6px 0 0; color: var(--fl-muted, #5b6469); overflow-wrap: anywhere; }
    .message.bad { color: var(--fl-danger, #b3261e); }
    .hint { color: var(--fl-muted, #5b6469); font-size: 12px; margin: 4px 0 0; }
    .visually-hidden { position: absolute; width: 1px; height: 1px; overflow: hidden; clip: rect(0 0 0 0); white-space: nowrap; }
  `;

  /** The stations shown, in file order. */
  get stations(): readonly Station[] {
    return this.data?.stations ?? [];
  }

  /** The dataset as CSV with every original column (io/writeStations.ts stationsToCsv). */
  toCsv(planeFormat: PlaneFormat = this.planeFormat): string {
    if (!this.data) return '';
    return datasetToCsv(this.data, { planeFormat });
  }

  /** The dataset as GeoJSON text (io/writeStations.ts stationsToGeoJson). */
  toGeoJson(planeFormat: PlaneFormat = this.planeFormat): string {
    if (!this.data) return '';
    return datasetToGeoJson(this.data, { planeFormat });
  }

  /** Scrolls so the row of station `index` is in view (no selection change). */
  scrollToIndex(index: number): void {
    const position = this.positions[index] ?? -1;
    if (position < 0) return;
    const viewport = this.viewport;
    if (!viewport) {
      this.scrollWanted = position;
      return;
    }
    const top = scrollToShow(position, viewport.scrollTop, viewport.clientHeight, ROW_HEIGHT, HEADER_HEIGHT);
    if (top !== viewport.scrollTop) viewport.scrollTop = top;
    this.first = visibleWindow(viewport.scrollTop, viewport.clientHeight - HEADER_HEIGHT, ROW_HEIGHT, this.view.length).first;
  }

  override connectedCallback(): void {
    super.connectedCallback();
    this.resize = new ResizeObserver(() => {
      const h = this.viewport?.clientHeight;
      if (h && h !== this.viewportHeight) this.viewportHeight = h;
    });
  }

  override disconnectedCallback(): void {
    super.disconnectedCallback();
    this.resize?.disconnect();
    cancelAnimationFrame(this.frame);
  }

  protected override firstUpdated(): void {
    if (this.viewport) {
      this.resize?.observe(this.viewport);
      this.viewportHeight = this.viewport.clientHeight || this.viewportHeight;
    }
  }

  protected override willUpdate(changed: PropertyValues<this>): void {
    if (changed.has('data') && this.data !== this.viewOf) {
      // A new dataset from the host: new columns, counts and view. (Our own edits keep the view as it is.)
      const newData = this.viewOf === null || this.data?.id !== this.viewOf.id;
      this.viewOf = this.data;
      this.columns = tableColumns(this.data?.table.headers ?? []);
      this.counts = tableCounts(this.stations);
      if (newData) {
        this.kindFilter = 'all';
        this.rowsFilter = 'all';
        this.sort = null;
        this.editing = null;
        this.message = null;
        this.active = { position: 0, column: 2 };
      }
      this.rebuildView();
    } else if (changed.has('kindFilter') || changed.has('rowsFilter') || changed.has('sort')) {
      this.rebuildView();
    }
    if (changed.has('selectedIndex') && this.selectedIndex >= 0) {
      const position = this.positions[this.selectedIndex] ?? -1;
      if (position < 0) {
        this.message = this.selectedIndex < this.stations.length ? `The selected station (row ${this.stations[this.selectedIndex].row}) is hidden by the filters.` : null;
      } else {
        this.active = { ...this.active, position };
        this.scrollToSelected = true;
      }
    }
  }

  protected override updated(changed: PropertyValues<this>): void {
    if (this.scrollToSelected) {
      this.scrollToSelected = false;
      this.scrollToIndex(this.selectedIndex);
    }
    if (this.scrollWanted !== null && this.viewport) {
      const position = this.scrollWanted;
      this.scrollWanted = null;
      this.viewport.scrollTop = scrollToShow(position, this.viewport.scrollTop, this.viewport.clientHeight, ROW_HEIGHT, HEADER_HEIGHT);
    }
    if (this.editing) {
      const input = this.renderRoot.querySelector<HTMLInputElement>('.cell input');
      if (input && this.renderRoot instanceof ShadowRoot && this.renderRoot.activeElement !== input) {
        input.focus();
        input.select();
      }
    }
  }

  private get viewport(): HTMLElement | null {
    return this.renderRoot.querySelector<HTMLElement>('.viewport');
  }

  private rebuildView(): void {
    this.view = viewIndices(this.stations, { kind: this.kindFilter, rows: this.rowsFilter, sort: this.sort, columns: this.columns });
    this.positions = new Int32Array(this.stations.length).fill(-1);
    this.view.forEach((index, position) => (this.positions[index] = position));
    this.active = { ...this.active, position: Math.min(this.active.position, Math.max(0, this.view.length - 1)) };
    const viewport = this.viewport;
    if (viewport) viewport.scrollTop = Math.min(viewport.scrollTop, Math.max(0, this.view.length * ROW_HEIGHT - viewport.clientHeight + HEADER_HEIGHT));
    this.first = viewport ? visibleWindow(viewport.scrollTop, this.viewportHeight - HEADER_HEIGHT, ROW_HEIGHT, this.view.length).first : 0;
  }

  private onScroll = (): void => {
    cancelAnimationFrame(this.frame);
    this.frame = requestAnimationFrame(() => {
      const v = this.viewport;
      if (v) this.first = visibleWindow(v.scrollTop, this.viewportHeight - HEADER_HEIGHT, ROW_HEIGHT, this.view.length).first;
    });
  };

  private fire(type: string, detail: unknown): void {
    this.dispatchEvent(new CustomEvent(type, { detail, bubbles: true, composed: true }));
  }

  private select(position: number): void {
    const index = this.view[position];
    if (index === undefined) return;
    this.selectedIndex = index;
    this.message = null;
    this.fire('foldlens-row-select', { index } satisfies RowSelectDetail);
  }

  private editable(station: Station, column: TableColumn): boolean {
    return column.source !== undefined && station.problems.length > 0;
  }

  private startEdit(position: number, columnNumber: number): void {
    const index = this.view[position];
    const column = this.columns[columnNumber];
    if (index === undefined || !column) return;
    const station = this.stations[index];
    if (!this.editable(station, column)) {
      this.message = station.problems.length === 0 ? 'Only rows with problems can be edited here; this row is usable as it is.' : 'Edit one of the original columns (to the right of Problems).';
      return;
    }
    this.active = { position, column: columnNumber };
    this.editing = { index, column: column.source! };
  }

  private commitEdit(value: string): void {
    const editing = this.editing;
    const dataset = this.data;
    this.editing = null;
    if (!editing || !dataset) return;
    const old = dataset.stations[editing.index];
    if ((old.source[editing.column] ?? '') === value) {
      this.focusGrid();
      return;
    }
    const crs = dataset.options.crs;
    if (crs !== undefined && pendingEpsgCode(crs) !== undefined) {
      // A CRS from the EPSG table not looked up yet on this page (after a reload): look it up, then read the row.
      this.message = `Looking up ${crs} in the EPSG index…`;
      prepareCrs(crs).then(
        () => {
          if (pendingEpsgCode(crs) !== undefined || this.data !== dataset) return;
          this.editing = editing;
          this.commitEdit(value);
        },
        (e: unknown) => (this.message = `The row could not be read again: ${e instanceof Error ? e.message : String(e)}`),
      );
      return;
    }
    let result;
    try {
      result = rereadRow(dataset, editing.index, editing.column, value);
    } catch (e) {
      if (e instanceof ImportOptionsError || e instanceof RangeError) {
        this.message = `The row could not be read again: ${e.message}`;
        return;
      }
      throw e;
    }
    const next = withStationEdit(dataset, editing.index, result.station, result.edit);
    this.viewOf = next; // our own edit: keep the view (the row stays where it is, even under a filter)
    this.data = next;
    this.counts = tableCounts(next.stations);
    const detail: RowEditDetail = { index: editing.index, station: result.station, edit: result.edit, dataset: next };
    const fixed = !isUsable(old) && isUsable(result.station);
    this.message = fixed
      ? `Row ${old.row} is usable now.`
      : result.station.problems.length > 0
        ? `Row ${old.row} still cannot be used: ${describeProblem(result.station.problems[0])}`
        : `Row ${old.row} was read again.`;
    this.fire('foldlens-row-edit', detail);
    if (fixed) this.fire('foldlens-row-fixed', detail);
    this.focusGrid();
  }

  private focusGrid(): void {
    void this.updateComplete.then(() => this.viewport?.focus({ preventScroll: true }));
  }

  private moveTo(position: number, column = this.active.column): void {
    const p = Math.max(0, Math.min(this.view.length - 1, position));
    const c = Math.max(0, Math.min(this.columns.length - 1, column));
    this.active = { position: p, column: c };
    const v = this.viewport;
    if (v) {
      const top = scrollToShow(p, v.scrollTop, v.clientHeight, ROW_HEIGHT, HEADER_HEIGHT);
      if (top !== v.scrollTop) v.scrollTop = top;
      // Keep the active cell's column in view too.
      const left = this.columns.slice(0, c).reduce((x, col) => x + col.width, 0);
      const right = left + this.columns[c].width;
      if (left < v.scrollLeft) v.scrollLeft = left;
      else if (right > v.scrollLeft + v.clientWidth) v.scrollLeft = right - v.clientWidth;
      this.first = visibleWindow(v.scrollTop, this.viewportHeight - HEADER_HEIGHT, ROW_HEIGHT, this.view.length).first;
    }
  }

  private onKey = (e: KeyboardEvent): void => {
    if (this.editing || e.target instanceof HTMLInputElement || e.target instanceof HTMLButtonElement) return;
    const { position, column } = this.active;
    const page = Math.max(1, Math.floor((this.viewportHeight - HEADER_HEIGHT) / ROW_HEIGHT) - 1);
    const keys: Record<string, () => void> = {
      ArrowDown: () => this.moveTo(position + 1),
      ArrowUp: () => this.moveTo(position - 1),
      ArrowRight: () => this.moveTo(position, column + 1),
      ArrowLeft: () => this.moveTo(position, column - 1),
      PageDown: () => this.moveTo(position + page),
      PageUp: () => this.moveTo(position - page),
      Home: () => (e.ctrlKey ? this.moveTo(0) : this.moveTo(position, 0)),
      End: () => (e.ctrlKey ? this.moveTo(this.view.length - 1) : this.moveTo(position, this.columns.length - 1)),
      ' ': () => this.select(position),
      Enter: () => {
        const index = this.view[position];
        const col = this.columns[column];
        if (index !== undefined && col && this.isFlagged(this.stations[index], col)) this.startEdit(position, column);
        else this.select(position);
      },
      F2: () => this.startEdit(position, column),
    };
    const action = keys[e.key];
    if (action && this.view.length > 0) {
      e.preventDefault();
      action();
    }
  };

  private isFlagged(s: Station, column: TableColumn): boolean {
    return column.source !== undefined && s.problems.some((p) => p.column === column.source);
  }

  private sortBy(key: string): void {
    this.sort = this.sort?.key === key ? { key, direction: this.sort.direction === 1 ? -1 : 1 } : { key, direction: 1 };
  }

  private download(text: string, type: string, ending: string): void {
    const name = (this.data?.name ?? 'stations').replace(/\.[^.]+$/, '');
    const a = document.createElement('a');
    a.href = URL.createObjectURL(new Blob([text], { type }));
    a.download = `${name}.foldlens.${ending}`;
    a.click();
    setTimeout(() => URL.revokeObjectURL(a.href), 10_000);
  }

  override render() {
    if (!this.data) return html`<div class="empty" part="grid">No file imported yet. The sample map's stations are not listed here; import a file to list, check and fix your own rows.</div>`;
    const template = this.columns.map((c) => `${c.width}px`).join(' ');
    const width = this.columns.reduce((w, c) => w + c.width, 0);
    const n = this.view.length;
    // `first` already holds the overscan above the view; render as many below.
    const from = Math.max(0, Math.min(this.first, n - 1));
    const to = Math.min(n, from + Math.ceil((this.viewportHeight - HEADER_HEIGHT) / ROW_HEIGHT) + 2 * OVERSCAN);
    const activeId = n > 0 ? `cell-${this.active.position}-${this.active.column}` : undefined;
    return html`
      ${this.renderToolbar(n)}
      <div
        class="viewport"
        part="grid"
        role="grid"
        aria-label=${`Stations of ${this.data.name}`}
        aria-rowcount=${n + 1}
        aria-colcount=${this.columns.length}
        aria-activedescendant=${activeId ?? nothing}
        tabindex="0"
        @scroll=${this.onScroll}
        @keydown=${this.onKey}
      >
        <div class="header" part="header" role="row" aria-rowindex="1" style=${`grid-template-columns:${template};width:${width}px`}>
          ${this.columns.map((c, i) => this.renderHeading(c, i))}
        </div>
        <div class="body" role="rowgroup" style=${`height:${n * ROW_HEIGHT}px`}>
          <div class="rows" style=${`transform:translateY(${from * ROW_HEIGHT}px)`}>
            ${Array.from({ length: Math.max(0, to - from) }, (_, k) => this.renderRow(from + k, `grid-template-columns:${template};width:${width}px`))}
          </div>
        </div>
        ${n === 0 ? html`<div class="empty">No rows match these filters.</div>` : nothing}
      </div>
      ${this.message ? html`<p class="message" role="status">${this.message}</p>` : html`<p class="hint">Rows with problems are kept and flagged; double-click a flagged value (or press F2) to fix it.</p>`}
    `;
  }

  private renderToolbar(shown: number): TemplateResult {
    const kinds = [...this.counts.kinds].sort((a, b) => b[1] - a[1]);
    const total = this.stations.length;
    return html`<div class="toolbar" part="toolbar">
      <label>Kind
        <select aria-label="Show rows of kind" @change=${(e: Event) => (this.kindFilter = (e.target as HTMLSelectElement).value as KindFilter)}>
          <option value="all" ?selected=${this.kindFilter === 'all'}>All kinds</option>
          ${kinds.map(([k, count]) => html`<option value=${k} ?selected=${this.kindFilter === k}>${k === 'none' ? 'No kind' : (KIND_LABELS[k as keyof typeof KIND_LABELS] ?? k)} (${count.toLocaleString('en')})</option>`)}
        </select>
      </label>
      <label>Rows
        <select aria-label="Show rows" @change=${(e: Event) => (this.rowsFilter = (e.target as HTMLSelectElement).value as RowsFilter)}>
          <option value="all" ?selected=${this.rowsFilter === 'all'}>All</option>
          <option value="problems" ?selected=${this.rowsFilter === 'problems'}>With problems (${this.counts.problems.toLocaleString('en')})</option>
          <option value="usable" ?selected=${this.rowsFilter === 'usable'}>Usable (${this.counts.usable.toLocaleString('en')})</option>
        </select>
      </label>
      <span class="count" aria-live="polite">${shown === total ? `${total.toLocaleString('en')} rows` : `${shown.toLocaleString('en')} of ${total.toLocaleString('en')} rows`}</span>
      <span class="export" part="export">
        <label for="plane-format">Planes as</label>
        <select id="plane-format" @change=${(e: Event) => (this.planeFormat = (e.target as HTMLSelectElement).value as PlaneFormat)}>
          ${PLANE_FORMATS.map((f) => html`<option value=${f.value} ?selected=${this.planeFormat === f.value}>${f.label}</option>`)}
        </select>
        <button type="button" @click=${() => this.download(this.toCsv(), 'text/csv', 'csv')}>Export CSV</button>
        <button type="button" @click=${() => this.download(this.toGeoJson(), 'application/geo+json', 'geojson')}>GeoJSON</button>
        ${this.counts.problems > 0
          ? html`<button type="button" @click=${() => this.download(problemsToCsv(this.stations.flatMap((s) => s.problems)), 'text/csv', 'problems.csv')}>Problems</button>`
          : nothing}
      </span>
    </div>`;
  }

  private renderHeading(c: TableColumn, i: number): TemplateResult {
    const sorted = this.sort?.key === c.key ? this.sort.direction : 0;
    const label = c.key === 'status' ? 'Problems count' : c.label;
    return html`<div role="columnheader" aria-colindex=${i + 1} aria-sort=${sorted === 1 ? 'ascending' : sorted === -1 ? 'descending' : 'none'} class=${c.source !== undefined ? 'original' : ''}>
      <button type="button" title=${c.source !== undefined ? `Original column "${c.source}" (sort)` : `Sort by ${label}`} aria-label=${`Sort by ${label}`} @click=${() => this.sortBy(c.key)}>
        ${c.key === 'status' ? '!' : c.label}${sorted ? html`<span class="arrow" aria-hidden="true"> ${sorted === 1 ? '▲' : '▼'}</span>` : nothing}
      </button>
    </div>`;
  }

  private renderRow(position: number, layout: string): TemplateResult {
    const index = this.view[position];
    const s = this.stations[index];
    const classes = ['row', s.problems.length > 0 ? 'problem' : '', index === this.highlight ? 'highlight' : ''].join(' ');
    return html`<div
      class=${classes}
      part="row"
      role="row"
      aria-rowindex=${position + 2}
      aria-selected=${String(index === this.selectedIndex)}
      data-index=${index}
      style=${layout}
      @click=${(e: MouseEvent) => {
        const cell = (e.target as HTMLElement).closest('[data-col]') as HTMLElement | null;
        this.active = { position, column: cell ? Number(cell.dataset.col) : this.active.column };
        this.select(position);
        this.viewport?.focus({ preventScroll: true });
      }}
      @dblclick=${(e: MouseEvent) => {
        const cell = (e.target as HTMLElement).closest('[data-col]') as HTMLElement | null;
        if (cell) this.startEdit(position, Number(cell.dataset.col));
      }}
    >
      ${this.columns.map((c, ci) => this.renderCell(s, index, position, c, ci))}
    </div>`;
  }

  private renderCell(s: Station, index: number, position: number, c: TableColumn, ci: number): TemplateResult {
    const active = position === this.active.position && ci === this.active.column;
    const id = `cell-${position}-${ci}`;
    if (this.editing && this.editing.index === index && c.source === this.editing.column) {
      return html`<div class="cell active" id=${id} role="gridcell" aria-colindex=${ci + 1} data-col=${ci}>
        <input
          aria-label=${`New value for ${c.source}, row ${s.row}`}
          .value=${s.source[c.source] ?? ''}
          @keydown=${(e: KeyboardEvent) => {
            e.stopPropagation();
            if (e.key === 'Enter') this.commitEdit((e.target as HTMLInputElement).value);
            else if (e.key === 'Escape') {
              this.editing = null;
              this.focusGrid();
            }
          }}
          @blur=${(e: FocusEvent) => {
            if (this.editing) this.commitEdit((e.target as HTMLInputElement).value);
          }}
          @click=${(e: Event) => e.stopPropagation()}
          @dblclick=${(e: Event) => e.stopPropagation()}
        />
      </div>`;
    }
    const flagged = this.isFlagged(s, c);
    const problem = flagged ? s.problems.find((p) => p.column === c.source) : undefined;
    const classes = ['cell', c.key === 'row' ? 'num' : '', c.key === 'problems' ? 'problems' : '', flagged ? 'flagged' : '', this.editable(s, c) ? 'editable' : '', active ? 'active' : ''].join(' ');
    const text = c.key === 'kind' && s.kind ? (KIND_LABELS[s.kind] ?? s.kind) : cellText(s, c);
    const title = problem ? describeProblem(problem) : c.key === 'problems' ? s.problems.map(describeProblem).join('\n') : text;
    return html`<div class=${classes} part="cell" id=${id} role="gridcell" aria-colindex=${ci + 1} data-col=${ci} title=${title} aria-invalid=${flagged ? 'true' : nothing}>
      ${c.key === 'status' ? (s.problems.length > 0 ? html`<span class="flag" aria-label=${`${s.problems.length} problem${s.problems.length === 1 ? '' : 's'}`}>${s.problems.length}</span>` : nothing) : text}
    </div>`;
  }
}

defineOnce('foldlens-table', FoldlensTable);

declare global {
  interface HTMLElementTagNameMap {
    'foldlens-table': FoldlensTable;
  }
}
