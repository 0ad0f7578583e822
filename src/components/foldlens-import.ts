import { LitElement, css, html, nothing, type TemplateResult } from 'lit';
import { LINE_KINDS, PLANE_KINDS, type MeasurementKind } from '../core/types';
import type { Station } from '../core/station';
import { describeProblem } from '../core/station';
import { LINE_NOTATIONS, PLANE_NOTATIONS, type LineNotation, type PlaneNotation } from '../core/notation';
import { detectColumns, type ColumnIssue, type ColumnMapping, type Field } from '../io/columns';
import { DEFAULT_IMPORT_OPTIONS, type FoldlensProject, type ImportOptions, type ProjectDataset } from '../io/projectFile';
import { KIND_LABELS } from '../map/symbolCatalog';
import { ParseClient } from '../worker/parseClient';
import { ImportFileError, type ReadProgress, type ScanResult } from './import/parseJob';
import { FIELD_GROUPS, FIELD_LABELS, LINE_NOTATION_LABELS, LOCATION_FIELDS, PLANE_NOTATION_LABELS } from './import/fields';
import { checkMapping, type MappingMessage } from './import/mappingCheck';
import { crsChoiceGroups, crsLookupRunning, describeCrsText, prepareCrs } from './import/importOptions';
import { crsFromText, pendingEpsgCode, type Crs } from '../io/crs';
import { problemsToCsv, reportOf, type ImportReport } from './import/importReport';
import { mappingMemory, type MappingMemory, type SavedMapping } from './import/savedMappings';
import { defineOnce } from './define';

/** Detail of `foldlens-import`. */
export interface ImportEventDetail {
  readonly stations: readonly Station[];
  readonly mapping: ColumnMapping;
  readonly options: ImportOptions;
  readonly fileName: string;
  readonly report: ImportReport;
  /** Everything above as one project dataset (io/projectFile.ts), ready to store. */
  readonly dataset: ProjectDataset;
}

/** Detail of `foldlens-project-open`. */
export interface ProjectOpenDetail {
  readonly project: FoldlensProject;
  readonly fileName: string;
}

type Phase = 'idle' | 'scanning' | 'mapping' | 'reading';
type CsvOrGeoJsonScan = Exclude<ScanResult, { format: 'project' }>;

const DELIMITERS: readonly { value: string; label: string }[] = [
  { value: '', label: 'Detect' },
  { value: ',', label: 'Comma' },
  { value: ';', label: 'Semicolon' },
  { value: '\t', label: 'Tab' },
  { value: '|', label: 'Pipe' },
  { value: ' ', label: 'Space' },
  { value: ':', label: 'Colon' },
];
const KINDS: readonly MeasurementKind[] = [...PLANE_KINDS, ...LINE_KINDS];
const CRS_GROUPS = crsChoiceGroups();
const CRS_VALUES = new Set(CRS_GROUPS.flatMap((g) => g.choices.map((c) => c.value)));
const OTHER_CRS = '__other';
const LISTED_PROBLEMS = 200;
const PREVIEW_SHOWN = 5;

const plural = (n: number, word: string): string => `${n.toLocaleString('en')} ${word}${n === 1 ? '' : 's'}`;
const delimiterName = (d: string): string => DELIMITERS.find((x) => x.value === d)?.label.toLowerCase() ?? `"${d}"`;

/**
 * `<foldlens-import>`: bringing field data in. A file is dropped or chosen (CSV, TSV, TXT or
 * GeoJSON, or a Foldlens project file); its columns are matched to what Foldlens reads (each
 * field has its own select, with the first rows shown), the notation, coordinates and their
 * CRS, north reference, elevation, id and notes are confirmed, and the whole file is read in a
 * web worker with a progress bar and a Cancel button. Rows that cannot be used are kept and
 * listed (row, column, value, what was expected). A mapping can be remembered and is offered
 * again for the next file with the same headers. All file text is rendered as text.
 *
 * Properties: `current` (ImportReport | null: what is loaded now, shown when idle; set it after
 * restoring a project), `memory` (MappingMemory; default localStorage), `client` (ParseClient).
 * Methods: `openFile(file)`, `cancel()`.
 * Events (bubble, composed): `foldlens-import` {stations, mapping, options, fileName, report,
 * dataset}; `foldlens-project-open` {project, fileName} for a project file;
 * `foldlens-import-error` {fileName, message}.
 * Parts: `panel`, `drop`, `error`, `summary`, `problems`, `mapping`, `preview`, `messages`,
 * `progress`, `confirm`, `cancel`.
 * CSS custom properties: `--fl-bg`, `--fl-fg`, `--fl-muted`, `--fl-border`, `--fl-accent`,
 * `--fl-accent-soft`, `--fl-danger`, `--fl-warning`, `--fl-font`.
 * @example
 * <foldlens-import></foldlens-import>
 * importEl.addEventListener('foldlens-import', (e) => (table.data = e.detail.dataset));
 */
export class FoldlensImport extends LitElement {
  static override properties = {
    current: { attribute: false },
    memory: { attribute: false },
    client: { attribute: false },
    phase: { state: true },
    error: { state: true },
    notice: { state: true },
    scan: { state: true },
    mapping: { state: true },
    options: { state: true },
    issues: { state: true },
    offer: { state: true },
    progress: { state: true },
    dragging: { state: true },
    remember: { state: true },
    crsOther: { state: true },
  };

  current: ImportReport | null = null;
  memory: MappingMemory = mappingMemory();
  client: ParseClient | null = null;

  phase: Phase = 'idle';
  error: string | null = null;
  notice: string | null = null;
  scan: CsvOrGeoJsonScan | null = null;
  mapping: ColumnMapping = {};
  options: ImportOptions = DEFAULT_IMPORT_OPTIONS;
  issues: readonly ColumnIssue[] = [];
  offer: SavedMapping | null = null;
  progress: ReadProgress | null = null;
  dragging = false;
  remember = true;
  crsOther = false;

  private file: Blob | null = null;
  private fileName = '';
  private run = 0;

  static override styles = css`
    :host { display: block; min-width: 0; font: 13px/1.4 var(--fl-font, system-ui, sans-serif); color: var(--fl-fg, #1d2326); }
    * { box-sizing: border-box; }
    .panel { display: grid; gap: 8px; min-width: 0; }
    .panel > * { min-width: 0; }
    form { min-width: 0; }
    h2 { font-size: 12px; text-transform: uppercase; letter-spacing: 0.06em; color: var(--fl-muted, #5b6469); margin: 0; }
    h3 { font-size: 12px; font-weight: 600; color: var(--fl-muted, #5b6469); margin: 0 0 4px; }
    button, select, input { font: inherit; color: inherit; }
    button, select, input[type='text'], input[type='number'], input[type='date'] {
      background: var(--fl-bg, #fbfaf7); border: 1px solid var(--fl-border, #c9cdc8); border-radius: 4px; min-height: 28px;
    }
    button { padding: 3px 10px; cursor: pointer; }
    button.primary { background: var(--fl-accent, #0b6e8a); border-color: var(--fl-accent, #0b6e8a); color: #fff; font-weight: 600; }
    button:disabled { opacity: 0.5; cursor: default; }
    select { padding: 2px 4px; min-width: 0; max-width: 100%; }
    input[type='text'], input[type='number'], input[type='date'] { padding: 2px 6px; min-width: 0; }
    :is(button, select, input, [tabindex]):focus-visible { outline: 2px solid var(--fl-accent, #0b6e8a); outline-offset: 1px; }
    .drop { border: 1.5px dashed var(--fl-border, #c9cdc8); border-radius: 6px; padding: 14px 12px; text-align: center; color: var(--fl-muted, #5b6469); }
    .panel.dragging form { outline: 2px dashed var(--fl-accent, #0b6e8a); outline-offset: 4px; }
    .drop.dragging { border-color: var(--fl-accent, #0b6e8a); background: var(--fl-accent-soft, #e3f0f3); color: var(--fl-fg, #1d2326); }
    .drop p { margin: 0 0 6px; }
    .drop small { display: block; margin-top: 6px; }
    .error { border-left: 3px solid var(--fl-danger, #b3261e); background: color-mix(in srgb, var(--fl-danger, #b3261e) 7%, transparent); padding: 6px 8px; border-radius: 0 4px 4px 0; overflow-wrap: anywhere; }
    .error strong { color: var(--fl-danger, #b3261e); }
    .notice { color: var(--fl-muted, #5b6469); }
    .summary { display: grid; gap: 4px; }
    .summary .line { overflow-wrap: anywhere; }
    .ok { color: var(--fl-accent, #0b6e8a); }
    .bad { color: var(--fl-danger, #b3261e); }
    details > summary { cursor: pointer; color: var(--fl-muted, #5b6469); }
    ol.problems { margin: 4px 0 0; padding-left: 0; list-style: none; max-height: 220px; overflow: auto; border-top: 1px solid var(--fl-border, #c9cdc8); }
    ol.problems li { padding: 2px 0; border-bottom: 1px solid color-mix(in srgb, var(--fl-border, #c9cdc8) 50%, transparent); overflow-wrap: anywhere; font-variant-numeric: tabular-nums; }
    .row-actions { display: flex; flex-wrap: wrap; gap: 6px; align-items: center; }
    .file { display: flex; flex-wrap: wrap; gap: 4px 10px; align-items: baseline; }
    .file .name { font-weight: 600; overflow-wrap: anywhere; }
    .file .meta { color: var(--fl-muted, #5b6469); }
    .file .actions { margin-left: auto; display: inline-flex; gap: 6px; align-items: center; }
    .file label { display: inline-flex; gap: 4px; align-items: center; color: var(--fl-muted, #5b6469); }
    .offer { background: var(--fl-accent-soft, #e3f0f3); border-radius: 4px; padding: 6px 8px; display: flex; flex-wrap: wrap; gap: 6px; align-items: center; }
    .offer span { flex: 1 1 200px; }
    fieldset { border: 0; border-top: 1px solid var(--fl-border, #c9cdc8); margin: 0; padding: 6px 0 0; min-width: 0; }
    legend { font-size: 12px; font-weight: 600; color: var(--fl-muted, #5b6469); padding: 0 6px 0 0; }
    .grid { display: grid; grid-template-columns: repeat(auto-fill, minmax(140px, 1fr)); gap: 4px 10px; }
    .pick { display: grid; grid-template-rows: auto auto auto; gap: 1px; min-width: 0; }
    .pick > span:first-child { font-size: 12px; color: var(--fl-muted, #5b6469); }
    .pick select, .pick input { width: 100%; }
    .pick .sample { color: var(--fl-muted, #5b6469); font-size: 11.5px; white-space: nowrap; overflow: hidden; text-overflow: ellipsis; min-height: 1.2em; }
    .pick.wide2 { grid-column: span 2; }
    .pick.mapped select { border-color: var(--fl-accent, #0b6e8a); }
    [aria-invalid='true'] { border-color: var(--fl-danger, #b3261e) !important; }
    .wide { grid-column: 1 / -1; }
    .radios { display: flex; flex-wrap: wrap; gap: 2px 14px; align-items: center; }
    .radios label { display: inline-flex; gap: 4px; align-items: center; }
    .hint { color: var(--fl-muted, #5b6469); font-size: 12px; }
    .crs-note { font-size: 12px; overflow-wrap: anywhere; }
    .preview { overflow: auto; max-height: 170px; border: 1px solid var(--fl-border, #c9cdc8); border-radius: 4px; }
    .preview table { border-collapse: collapse; font-size: 12px; font-variant-numeric: tabular-nums; }
    .preview th, .preview td { padding: 2px 6px; text-align: left; white-space: nowrap; max-width: 180px; overflow: hidden; text-overflow: ellipsis; border-bottom: 1px solid var(--fl-border, #c9cdc8); }
    .preview th { position: sticky; top: 0; background: var(--fl-bg, #fbfaf7); font-weight: 600; vertical-align: bottom; }
    .preview th .chip { display: block; font-weight: 500; font-size: 10.5px; color: var(--fl-accent, #0b6e8a); }
    .preview th .chip.none { color: var(--fl-muted, #5b6469); }
    .preview td.rownum, .preview th.rownum { color: var(--fl-muted, #5b6469); text-align: right; }
    ul.messages { list-style: none; margin: 0; padding: 0; display: grid; gap: 3px; }
    ul.messages li { padding: 3px 8px; border-left: 3px solid var(--fl-border, #c9cdc8); overflow-wrap: anywhere; }
    ul.messages li.error { border-left-color: var(--fl-danger, #b3261e); background: color-mix(in srgb, var(--fl-danger, #b3261e) 7%, transparent); }
    ul.messages li.warning { border-left-color: var(--fl-warning, #a86a00); background: color-mix(in srgb, var(--fl-warning, #a86a00) 8%, transparent); }
    ul.messages li.info { color: var(--fl-muted, #5b6469); }
    .level { font-weight: 600; margin-right: 4px; }
    li.error .level { color: var(--fl-danger, #b3261e); }
    li.warning .level { color: var(--fl-warning, #a86a00); }
    .footer { display: flex; flex-wrap: wrap; gap: 8px; align-items: center; justify-content: flex-end; position: sticky; bottom: 0; background: var(--fl-bg, #fbfaf7); padding: 6px 0 2px; border-top: 1px solid var(--fl-border, #c9cdc8); }
    .footer label { margin-right: auto; display: inline-flex; gap: 4px; align-items: center; }
    progress { width: 100%; height: 10px; accent-color: var(--fl-accent, #0b6e8a); }
    .reading { display: grid; gap: 6px; }
    .status { font-variant-numeric: tabular-nums; }
    .visually-hidden { position: absolute; width: 1px; height: 1px; overflow: hidden; clip: rect(0 0 0 0); white-space: nowrap; }
  `;

  /** Reads a file as if it had been dropped: scans it and shows the mapping step (or opens a project). */
  async openFile(file: File | Blob, name = (file as File).name ?? 'file'): Promise<void> {
    this.cancelRunning();
    const run = ++this.run;
    this.file = file;
    this.fileName = name;
    this.error = null;
    this.notice = null;
    this.offer = null;
    this.phase = 'scanning';
    await this.rescan(run, undefined);
  }

  /** Stops a scan or a reading in progress; nothing loaded before is touched. */
  cancel(): void {
    const wasReading = this.phase === 'reading';
    this.cancelRunning();
    if (wasReading) {
      this.phase = 'mapping';
      this.notice = 'The import was cancelled; nothing was changed.';
    } else if (this.phase === 'scanning') {
      this.phase = 'idle';
      this.notice = 'Cancelled; nothing was changed.';
    }
  }

  override disconnectedCallback(): void {
    super.disconnectedCallback();
    this.cancelRunning();
  }

  protected override willUpdate(changed: Map<PropertyKey, unknown>): void {
    // An EPSG code outside the built-in list is looked up in the EPSG table (loaded on first use);
    // the form shows "Looking up…" meanwhile, then the name, or why it failed.
    const crs = this.options.crs;
    if (changed.has('options') && crs !== undefined && pendingEpsgCode(crs) !== undefined && !crsLookupRunning(crs)) {
      prepareCrs(crs).then(
        () => this.requestUpdate(),
        () => this.requestUpdate(),
      );
    }
  }

  private get parser(): ParseClient {
    this.client ??= new ParseClient();
    return this.client;
  }

  private cancelRunning(): void {
    this.run++;
    if (this.phase === 'scanning' || this.phase === 'reading') this.client?.cancel();
  }

  private fire(type: string, detail: unknown): void {
    this.dispatchEvent(new CustomEvent(type, { detail, bubbles: true, composed: true }));
  }

  private fail(message: string): void {
    this.phase = 'idle';
    this.scan = null;
    this.error = message;
    this.fire('foldlens-import-error', { fileName: this.fileName, message });
  }

  private async rescan(run: number, delimiter: string | undefined): Promise<void> {
    let scan: ScanResult;
    try {
      scan = await this.parser.scan(this.file!, this.fileName, delimiter !== undefined ? { delimiter } : {});
    } catch (e) {
      if (run !== this.run) return;
      if (e instanceof ImportFileError && e.code === 'cancelled') return;
      this.fail(e instanceof Error ? e.message : String(e));
      return;
    }
    if (run !== this.run) return;
    if (scan.format === 'project') {
      this.phase = 'idle';
      this.scan = null;
      this.notice = `Opened the project "${scan.project.name}" from ${this.fileName}.`;
      this.fire('foldlens-project-open', { project: scan.project, fileName: this.fileName } satisfies ProjectOpenDetail);
      return;
    }
    const detection = detectColumns(scan.headers);
    // A new file starts from the defaults; a new delimiter for the same file keeps the choices made.
    const base = this.phase === 'mapping' ? this.options : DEFAULT_IMPORT_OPTIONS;
    this.scan = scan;
    this.mapping = detection.mapping;
    this.issues = detection.issues;
    this.options = delimiter !== undefined ? { ...base, delimiter } : withoutKey(base, 'delimiter');
    this.crsOther = this.options.crs !== undefined && !CRS_VALUES.has(this.options.crs);
    const saved = this.memory.find(scan.headers);
    this.offer = saved && !(sameMapping(saved.mapping, this.mapping) && sameOptions(saved.options, this.options)) ? saved : null;
    this.phase = 'mapping';
  }

  private applyOptions(options: ImportOptions, scan: CsvOrGeoJsonScan): void {
    this.options = { ...options, ...(scan.format === 'csv' && this.options.delimiter !== undefined ? { delimiter: this.options.delimiter } : {}) };
    this.crsOther = this.options.crs !== undefined && !CRS_VALUES.has(this.options.crs);
  }

  private useSaved(): void {
    const saved = this.offer;
    if (!saved || !this.scan) return;
    this.mapping = { ...saved.mapping };
    this.issues = [];
    this.applyOptions(saved.options, this.scan);
    this.offer = null;
    this.notice = `Using the mapping saved with ${saved.fileName}.`;
  }

  private setField(field: Field, column: string): void {
    const next: Partial<Record<Field, string>> = { ...this.mapping };
    if (column === '') delete next[field];
    else next[field] = column;
    this.mapping = next;
    this.issues = this.issues.filter((i) => !i.field.split(' or ').includes(field));
  }

  private setOption<K extends keyof ImportOptions>(key: K, value: ImportOptions[K] | undefined): void {
    this.options = value === undefined || value === '' ? withoutKey(this.options, key) : { ...this.options, [key]: value };
  }

  private setNorth(north: ImportOptions['north']): void {
    let o: ImportOptions = { ...this.options, north };
    if (north !== 'magnetic') o = withoutKey(o, 'declination');
    else if (o.declination === undefined) o = { ...o, declination: 'wmm' };
    this.options = o;
  }

  private async confirm(): Promise<void> {
    const scan = this.scan;
    if (!scan || !this.file) return;
    const run = ++this.run;
    this.phase = 'reading';
    this.notice = null;
    this.error = null;
    this.progress = { bytes: 0, totalBytes: this.file.size, rows: 0 };
    const mapping = this.mapping;
    const options = this.options;
    let parsed;
    try {
      parsed = await this.parser.read(this.file, { format: scan.format, mapping, options, ...lookedUp(options.crs) }, (p) => {
        if (run === this.run) this.progress = p;
      });
    } catch (e) {
      if (run !== this.run) return;
      this.phase = 'mapping';
      if (e instanceof ImportFileError && e.code === 'cancelled') {
        this.notice = 'The import was cancelled; nothing was changed.';
        return;
      }
      this.error = e instanceof Error ? e.message : String(e);
      this.fire('foldlens-import-error', { fileName: this.fileName, message: this.error });
      return;
    }
    if (run !== this.run) return;
    const dataset: ProjectDataset = { id: newDatasetId(), name: this.fileName, table: parsed.table, mapping, options, stations: parsed.stations, edits: [] };
    if (this.remember) this.memory.save({ headers: scan.headers, mapping, options, fileName: this.fileName, savedAt: new Date().toISOString() });
    const report = reportOf(dataset);
    this.current = report;
    this.phase = 'idle';
    this.scan = null;
    this.progress = null;
    this.fire('foldlens-import', { stations: dataset.stations, mapping, options, fileName: this.fileName, report, dataset } satisfies ImportEventDetail);
  }

  private onDrop = (e: DragEvent): void => {
    e.preventDefault();
    this.dragging = false;
    const files = e.dataTransfer?.files;
    if (!files || files.length === 0) {
      this.error = 'Nothing to read was dropped: drop a file (CSV, TSV, TXT or GeoJSON).';
      return;
    }
    void this.openFile(files[0]).then(() => {
      if (files.length > 1 && this.phase === 'mapping') this.notice = `${files.length} files were dropped; only ${files[0].name} is read.`;
    });
  };

  private onDragOver = (e: DragEvent): void => {
    e.preventDefault();
    if (e.dataTransfer) e.dataTransfer.dropEffect = 'copy';
    this.dragging = true;
  };

  private pickFile(): void {
    this.renderRoot.querySelector<HTMLInputElement>('input[type="file"]')?.click();
  }

  private onFileInput(e: Event): void {
    const input = e.target as HTMLInputElement;
    const file = input.files?.[0];
    input.value = '';
    if (file) void this.openFile(file);
  }

  private downloadProblems(): void {
    if (!this.current) return;
    const blob = new Blob([problemsToCsv(this.current.problems)], { type: 'text/csv' });
    const a = document.createElement('a');
    a.href = URL.createObjectURL(blob);
    a.download = `${this.current.fileName.replace(/\.[^.]+$/, '')}.problems.csv`;
    a.click();
    setTimeout(() => URL.revokeObjectURL(a.href), 10_000);
  }

  override render() {
    // The whole panel takes a dropped file, whatever step it is at.
    return html`<section
      class="panel ${this.dragging ? 'dragging' : ''}"
      part="panel"
      aria-label="Import data"
      @dragover=${this.onDragOver}
      @dragenter=${this.onDragOver}
      @dragleave=${(e: DragEvent) => {
        if (!(e.currentTarget as HTMLElement).contains(e.relatedTarget as Node | null)) this.dragging = false;
      }}
      @drop=${this.onDrop}
    >
      ${this.phase === 'mapping' && this.scan ? this.renderMapping(this.scan) : this.phase === 'reading' ? this.renderReading() : this.renderIdle()}
    </section>`;
  }

  private renderIdle(): TemplateResult {
    const scanning = this.phase === 'scanning';
    return html`
      <div
        class="drop ${this.dragging ? 'dragging' : ''}"
        part="drop"
        role="group"
        aria-label="Drop a file here to import it"
      >
        ${scanning
          ? html`<p role="status">Reading the columns of <strong>${this.fileName}</strong>…</p>
              <button type="button" part="cancel" @click=${() => this.cancel()}>Cancel</button>`
          : html`<p>Drop a CSV, TSV, TXT or GeoJSON file here</p>
              <button type="button" @click=${() => this.pickFile()}>Choose a file…</button>
              <small>or a Foldlens project file (.json)</small>`}
        <input
          type="file"
          hidden
          accept=".csv,.tsv,.txt,.json,.geojson,text/csv,text/tab-separated-values,text/plain,application/json,application/geo+json"
          aria-label="File to import"
          @change=${(e: Event) => this.onFileInput(e)}
        />
      </div>
      ${this.renderError()} ${this.notice ? html`<p class="notice" role="status">${this.notice}</p>` : nothing} ${this.current ? this.renderSummary(this.current) : nothing}
    `;
  }

  private renderError(): TemplateResult | typeof nothing {
    if (!this.error) return nothing;
    return html`<div class="error" part="error" role="alert"><strong>Could not import ${this.fileName}:</strong> ${this.error}</div>`;
  }

  private renderSummary(r: ImportReport): TemplateResult {
    const listed = r.problems.slice(0, LISTED_PROBLEMS);
    return html`<div class="summary" part="summary" aria-label="Import report">
      <div class="line">
        <strong>${r.fileName}</strong>: ${plural(r.rows, 'row')} read,
        <span class="ok">${r.usable.toLocaleString('en')} usable</span>${r.withProblems > 0
          ? html`, <span class="bad">${r.withProblems.toLocaleString('en')} with problems</span> (kept and flagged)`
          : nothing}.
        ${r.blankRows.length > 0 ? html`<span class="hint">${plural(r.blankRows.length, 'blank row')} skipped.</span>` : nothing}
      </div>
      ${r.notes.map((n) => html`<div class="hint">Note: ${n}</div>`)}
      ${r.problems.length > 0
        ? html`<details ?open=${r.withProblems <= 20}>
            <summary>Rows that cannot be used (${plural(r.problems.length, 'problem')}${r.byColumn.length ? `; most in ${r.byColumn[0].column}` : ''})</summary>
            <ol class="problems" part="problems">
              ${listed.map((p) => html`<li>${describeProblem(p)}</li>`)}
            </ol>
            ${r.problems.length > LISTED_PROBLEMS
              ? html`<p class="hint">…and ${(r.problems.length - LISTED_PROBLEMS).toLocaleString('en')} more: show the rows with problems in the table, or download them.</p>`
              : nothing}
            <div class="row-actions"><button type="button" @click=${() => this.downloadProblems()}>Download problems (CSV)</button></div>
          </details>`
        : nothing}
    </div>`;
  }

  private renderReading(): TemplateResult {
    const p = this.progress;
    const fraction = p && p.totalBytes > 0 ? p.bytes / p.totalBytes : 0;
    return html`<div class="reading">
      <div class="file"><span class="name">${this.fileName}</span><span class="meta">reading every row…</span></div>
      <progress part="progress" max="1" .value=${fraction} aria-label=${`Reading ${this.fileName}`}></progress>
      <div class="row-actions">
        <span class="status" role="status" aria-live="polite">${Math.round(fraction * 100)}% · ${plural(p?.rows ?? 0, 'row')}</span>
        <button type="button" part="cancel" style="margin-left:auto" @click=${() => this.cancel()}>Cancel</button>
      </div>
    </div>`;
  }

  private renderMapping(scan: CsvOrGeoJsonScan): TemplateResult {
    const messages = checkMapping({ format: scan.format, headers: scan.headers, preview: scan.preview, mapping: this.mapping, options: this.options, issues: this.issues });
    const errors = messages.filter((m) => m.level === 'error');
    const invalid = new Set(errors.map((m) => m.target).filter((t) => t !== undefined));
    const rows = scan.rowCount !== undefined ? plural(scan.rowCount, 'row') : `about ${Math.max(1, Math.round((scan.bytes / Math.max(1, approxRowBytes(scan))) / 1000) * 1000).toLocaleString('en')} rows`;
    const format = scan.format === 'geojson' ? 'GeoJSON features' : `${delimiterName(scan.delimiter)}-separated`;
    return html`<form part="mapping" aria-label="Match the columns" @submit=${(e: Event) => {
      e.preventDefault();
      if (errors.length === 0) void this.confirm();
    }}>
      <div class="panel">
        <div class="file">
          <span class="name">${this.fileName}</span>
          <span class="meta">${format} · ${plural(scan.headers.length, 'column')} · ${rows}</span>
          <span class="actions">
            ${scan.format === 'csv' ? this.renderDelimiter(scan, invalid) : nothing}
            <button type="button" @click=${() => this.pickFile()}>Another file…</button>
          </span>
          <input type="file" hidden accept=".csv,.tsv,.txt,.json,.geojson" aria-label="File to import" @change=${(e: Event) => this.onFileInput(e)} />
        </div>
        ${this.renderError()} ${this.notice ? html`<p class="notice" role="status">${this.notice}</p>` : nothing}
        ${this.offer
          ? html`<div class="offer" role="status">
              <span>A mapping was saved for these columns with <strong>${this.offer.fileName}</strong> (${this.offer.savedAt.slice(0, 10)}).</span>
              <button type="button" @click=${() => this.useSaved()}>Use saved mapping</button>
              <button type="button" @click=${() => (this.offer = null)}>Keep detected</button>
            </div>`
          : nothing}
        ${messages.length
          ? html`<ul class="messages" part="messages" aria-label="Checks of these choices" id="messages">
              ${messages.map((m) => html`<li class=${m.level}><span class="level">${m.level === 'error' ? 'Fix:' : m.level === 'warning' ? 'Check:' : 'Note:'}</span>${m.text}</li>`)}
            </ul>`
          : nothing}
        ${FIELD_GROUPS.map((g) => this.renderGroup(g.label, g.fields, scan, invalid))}
        ${this.renderLocation(scan, invalid)}
        ${this.renderNorth(invalid)}
        <div>
          <h3 id="preview-title">First rows as read</h3>
          ${this.renderPreview(scan)}
        </div>
        <div class="footer">
          <label title="Offer this mapping again for the next file with the same columns"><input type="checkbox" .checked=${this.remember} @change=${(e: Event) => (this.remember = (e.target as HTMLInputElement).checked)} />Remember this mapping</label>
          <button type="button" part="cancel" @click=${() => {
            this.phase = 'idle';
            this.scan = null;
            this.notice = 'Nothing was imported.';
          }}>Cancel</button>
          <button type="submit" class="primary" part="confirm" ?disabled=${errors.length > 0} aria-describedby=${errors.length ? 'messages' : nothing}>
            Import ${scan.rowCount !== undefined ? plural(scan.rowCount, 'row') : 'all rows'}
          </button>
        </div>
      </div>
    </form>`;
  }

  private renderDelimiter(scan: CsvOrGeoJsonScan, invalid: ReadonlySet<string>): TemplateResult {
    const chosen = this.options.delimiter ?? '';
    return html`<label>
      Delimiter
      <select aria-label="Delimiter" aria-invalid=${String(invalid.has('delimiter'))} @change=${(e: Event) => {
        const v = (e.target as HTMLSelectElement).value;
        const run = ++this.run;
        void this.rescan(run, v === '' ? undefined : v);
      }}>
        ${DELIMITERS.map((d) => html`<option value=${d.value} ?selected=${d.value === chosen}>${d.value === '' ? `Detect (${delimiterName(scan.delimiter)})` : d.label}</option>`)}
      </select>
    </label>`;
  }

  private renderGroup(label: string, fields: readonly Field[], scan: CsvOrGeoJsonScan, invalid: ReadonlySet<string>): TemplateResult {
    return html`<fieldset>
      <legend>${label}</legend>
      <div class="grid">
        ${fields.map((f) => this.renderPick(f, scan, invalid))}
        ${fields.includes('kind') && !this.mapping.kind ? this.renderDefaultKind(invalid) : nothing}
        ${fields.includes('attitude') && this.mapping.attitude !== undefined ? this.renderNotations(invalid) : nothing}
      </div>
    </fieldset>`;
  }

  private renderPick(field: Field, scan: CsvOrGeoJsonScan, invalid: ReadonlySet<string>): TemplateResult {
    const column = this.mapping[field] ?? '';
    const sample = column ? scan.preview.map((r) => r.values[column] ?? '').find((v) => v.trim() !== '') : undefined;
    const id = `pick-${field}`;
    return html`<div class="pick ${column ? 'mapped' : ''}">
      <span id=${`${id}-label`}>${FIELD_LABELS[field]}</span>
      <select
        id=${id}
        data-field=${field}
        aria-labelledby=${`${id}-label`}
        aria-describedby=${`${id}-sample`}
        aria-invalid=${String(invalid.has(field))}
        @change=${(e: Event) => this.setField(field, (e.target as HTMLSelectElement).value)}
      >
        <option value="" ?selected=${column === ''}>— none —</option>
        ${scan.headers.map((h) => html`<option value=${h} ?selected=${h === column}>${h}</option>`)}
      </select>
      <span class="sample" id=${`${id}-sample`}>${sample !== undefined ? `e.g. ${sample}` : column ? 'empty in the first rows' : ''}</span>
    </div>`;
  }

  private renderDefaultKind(invalid: ReadonlySet<string>): TemplateResult {
    return html`<label class="pick wide2">
      <span>Every row is</span>
      <select data-option="defaultKind" aria-label="Kind of every row" aria-invalid=${String(invalid.has('defaultKind'))} @change=${(e: Event) => this.setOption('defaultKind', ((e.target as HTMLSelectElement).value || undefined) as MeasurementKind | undefined)}>
        <option value="" ?selected=${!this.options.defaultKind}>a plane or a line, by the columns filled</option>
        ${KINDS.map((k) => html`<option value=${k} ?selected=${this.options.defaultKind === k}>${KIND_LABELS[k]}</option>`)}
      </select>
    </label>`;
  }

  private renderNotations(invalid: ReadonlySet<string>): TemplateResult {
    return html`<label class="pick wide2">
        <span>Planes as</span>
        <select data-option="planeNotation" aria-label="Plane notation" aria-invalid=${String(invalid.has('planeNotation'))} @change=${(e: Event) => this.setOption('planeNotation', (e.target as HTMLSelectElement).value as PlaneNotation)}>
          ${PLANE_NOTATIONS.map((n) => html`<option value=${n} ?selected=${this.options.planeNotation === n}>${PLANE_NOTATION_LABELS[n]}</option>`)}
        </select>
      </label>
      <label class="pick wide2">
        <span>Lines as</span>
        <select data-option="lineNotation" aria-label="Line notation" @change=${(e: Event) => this.setOption('lineNotation', (e.target as HTMLSelectElement).value as LineNotation)}>
          ${LINE_NOTATIONS.map((n) => html`<option value=${n} ?selected=${this.options.lineNotation === n}>${LINE_NOTATION_LABELS[n]}</option>`)}
        </select>
      </label>`;
  }

  private renderLocation(scan: CsvOrGeoJsonScan, invalid: ReadonlySet<string>): TemplateResult {
    const geo = scan.format === 'geojson';
    const needsCrs = (!geo && (this.mapping.x !== undefined || this.mapping.y !== undefined)) || this.options.north === 'grid';
    const crs = this.options.crs ?? '';
    const selectValue = this.crsOther ? OTHER_CRS : crs;
    const described = crs ? describeCrsText(crs) : null;
    return html`<fieldset>
      <legend>Location</legend>
      ${geo ? html`<p class="hint">From each feature's Point geometry (WGS 84 longitude, latitude and height).</p>` : nothing}
      <div class="grid">${(geo ? (['elevation'] as Field[]) : LOCATION_FIELDS).map((f) => this.renderPick(f, scan, invalid))}</div>
      ${needsCrs
        ? html`<div class="grid" style="margin-top:4px">
            <label class="pick wide2">
              <span>Coordinate system</span>
              <select data-option="crs" aria-label="Coordinate system of x and y" aria-invalid=${String(invalid.has('crs'))} @change=${(e: Event) => {
                const v = (e.target as HTMLSelectElement).value;
                this.crsOther = v === OTHER_CRS;
                this.setOption('crs', v === OTHER_CRS ? (CRS_VALUES.has(crs) ? undefined : crs) : v || undefined);
              }}>
                <option value="" ?selected=${selectValue === ''}>Choose…</option>
                ${CRS_GROUPS.map((g) => html`<optgroup label=${g.label}>${g.choices.map((c) => html`<option value=${c.value} ?selected=${selectValue === c.value}>${c.label}</option>`)}</optgroup>`)}
                <option value=${OTHER_CRS} ?selected=${selectValue === OTHER_CRS}>Other: EPSG code or proj4 definition…</option>
              </select>
            </label>
            ${this.crsOther
              ? html`<label class="pick wide2">
                  <span>EPSG code or proj4 definition</span>
                  <input type="text" data-option="crs-text" aria-label="EPSG code or proj4 definition" placeholder="EPSG:32633 or +proj=utm +zone=33 +datum=WGS84" .value=${crs} aria-invalid=${String(invalid.has('crs'))} @change=${(e: Event) => this.setOption('crs', (e.target as HTMLInputElement).value.trim() || undefined)} />
                </label>`
              : nothing}
            ${described ? html`<div class="crs-note wide ${described.ok || described.pending ? 'hint' : 'bad'}" role="status">${described.ok ? `Using ${described.text}` : described.text}</div>` : nothing}
          </div>`
        : nothing}
    </fieldset>`;
  }

  private renderNorth(invalid: ReadonlySet<string>): TemplateResult {
    const o = this.options;
    const typed = typeof o.declination === 'number';
    return html`<fieldset>
      <legend>North the azimuths were read against</legend>
      <div class="radios" role="radiogroup" aria-label="North reference">
        ${(['true', 'magnetic', 'grid'] as const).map(
          (n) => html`<label><input type="radio" name="north" value=${n} .checked=${o.north === n} aria-invalid=${String(invalid.has('north') && o.north === n)} @change=${() => this.setNorth(n)} />${n === 'true' ? 'True north' : n === 'magnetic' ? 'Magnetic north' : 'Grid north'}</label>`,
        )}
      </div>
      ${o.north === 'magnetic'
        ? html`<div class="radios" role="radiogroup" aria-label="Magnetic declination" style="margin-top:4px">
              <label><input type="radio" name="declination" .checked=${!typed} @change=${() => this.setOption('declination', 'wmm')} />World Magnetic Model, by each row's date and place</label>
              <label><input type="radio" name="declination" .checked=${typed} @change=${() => this.setOption('declination', 0)} />Declination</label>
              <input type="number" step="0.01" min="-180" max="180" style="width:7em" aria-label="Declination in degrees east (west negative)" ?disabled=${!typed} .value=${typed ? String(o.declination) : ''} aria-invalid=${String(invalid.has('declination'))} @change=${(e: Event) => {
                const v = (e.target as HTMLInputElement).valueAsNumber;
                this.setOption('declination', Number.isFinite(v) ? v : Number.NaN);
              }} /><span class="hint">° east (west negative)</span>
            </div>
            ${!typed
              ? html`<label class="pick" style="margin-top:4px;max-width:220px">
                  <span>Date for rows without one</span>
                  <input type="date" aria-label="Date for rows without one" .value=${o.date ?? ''} aria-invalid=${String(invalid.has('date'))} @change=${(e: Event) => this.setOption('date', (e.target as HTMLInputElement).value || undefined)} />
                </label>`
              : nothing}`
        : nothing}
      ${o.north === 'grid' ? html`<p class="hint">Azimuths are turned to true north by the grid convergence of the coordinate system at each station.</p>` : nothing}
    </fieldset>`;
  }

  private renderPreview(scan: CsvOrGeoJsonScan): TemplateResult {
    const fieldOf = new Map<string, Field>(Object.entries(this.mapping).map(([f, c]) => [c as string, f as Field]));
    const rows = scan.preview.slice(0, PREVIEW_SHOWN);
    return html`<div class="preview" part="preview" tabindex="0" role="region" aria-labelledby="preview-title">
      <table>
        <thead>
          <tr>
            <th class="rownum" scope="col">row</th>
            ${scan.headers.map((h) => {
              const f = fieldOf.get(h);
              return html`<th scope="col">${h}<span class="chip ${f ? '' : 'none'}">${f ? FIELD_LABELS[f] : 'not read'}</span></th>`;
            })}
          </tr>
        </thead>
        <tbody>
          ${rows.map((r) => html`<tr><td class="rownum">${r.row}</td>${scan.headers.map((h) => html`<td title=${r.values[h] ?? ''}>${r.values[h] ?? ''}</td>`)}</tr>`)}
        </tbody>
      </table>
    </div>`;
  }
}

/** The CRS of an EPSG code known on this page, for the worker (so it need not load the EPSG table again). */
function lookedUp(text: string | undefined): { crs?: Crs } {
  if (text === undefined || pendingEpsgCode(text) !== undefined) return {};
  try {
    const crs = crsFromText(text);
    return crs.code.startsWith('EPSG:') ? { crs } : {};
  } catch {
    return {}; // the reader will say what is wrong with it
  }
}

function withoutKey<K extends keyof ImportOptions>(o: ImportOptions, key: K): ImportOptions {
  const { [key]: _dropped, ...rest } = o;
  return rest as ImportOptions;
}

function sameMapping(a: ColumnMapping, b: ColumnMapping): boolean {
  const ka = Object.keys(a).sort();
  const kb = Object.keys(b).sort();
  return ka.length === kb.length && ka.every((k, i) => k === kb[i] && a[k as Field] === b[k as Field]);
}

function sameOptions(a: ImportOptions, b: ImportOptions): boolean {
  const keys = new Set([...Object.keys(a), ...Object.keys(b)].filter((k) => k !== 'delimiter'));
  return [...keys].every((k) => a[k as keyof ImportOptions] === b[k as keyof ImportOptions]);
}

function approxRowBytes(scan: CsvOrGeoJsonScan): number {
  if (scan.preview.length === 0) return 100;
  const chars = scan.preview.reduce((n, r) => n + Object.values(r.values).reduce((m, v) => m + v.length + 1, 0), 0);
  return Math.max(1, chars / scan.preview.length);
}

function newDatasetId(): string {
  const random = typeof crypto !== 'undefined' && 'randomUUID' in crypto ? crypto.randomUUID().slice(0, 8) : Math.random().toString(36).slice(2, 10);
  return `ds-${Date.now().toString(36)}-${random}`;
}

export type { MappingMessage };

defineOnce('foldlens-import', FoldlensImport);

declare global {
  interface HTMLElementTagNameMap {
    'foldlens-import': FoldlensImport;
  }
}
