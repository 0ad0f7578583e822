import { LitElement, css, html, nothing } from 'lit';
import { styleMap } from 'lit/directives/style-map.js';
import { parseLine } from '../core/notation';
import type { Line } from '../core/types';
import { defineOnce } from './define';

/** A suggested domain of the local axis field, as the panel lists it. */
export interface ConsistencyRegion {
  readonly label: number;
  readonly axis: Line;
  /** Grid cells in the region. */
  readonly nodes: number;
  /** Largest angle between a cell's axis and the region's mean, degrees. */
  readonly spread: number;
}

/** One flag of the checks, as the panel lists it. */
export interface ConsistencyFlagItem {
  /** Name of the domain it belongs to. */
  readonly domain: string;
  readonly code: string;
  readonly severity: 'note' | 'warning';
  readonly message: string;
}

/** Detail of `foldlens-consistency-field`. */
export interface ConsistencyFieldRequest {
  /** Planes per window (k nearest). */
  readonly k: number;
  /** Grid cells along the longer side of the data. */
  readonly grid: number;
  /** Largest axis turn within one suggested domain, degrees. */
  readonly angle: number;
  /** Smallest suggested domain as a share of the field (0 to 1). */
  readonly minShare: number;
  /** Reference axis (true north); null: the pi axis of all the planes. */
  readonly reference: Line | null;
}

/** Detail of `foldlens-consistency-check` and `foldlens-consistency-report`. */
export interface ConsistencyCheckRequest {
  /** Flag lines farther than this from the axis, degrees. */
  readonly lineThreshold: number;
  /** Flag planes farther than this from the girdle, degrees; null: the robust rule. */
  readonly outlierAngle: number | null;
  /** Also search for the axis from the map pattern alone (slow). */
  readonly searchAxis: boolean;
}

/** Detail of `foldlens-consistency-layers`. */
export interface ConsistencyLayers {
  readonly arrows: boolean;
  readonly angles: boolean;
  readonly boundaries: boolean;
  readonly flags: boolean;
}

const pad = (n: number, w: number): string => String(Math.round(n) % 360).padStart(w, '0');
const lineText = (l: Line): string => `${pad(l.trend, 3)}/${pad(l.plunge, 2)}`;

/**
 * `<foldlens-consistency>`: asks for the local fold axis field (window, grid, how far the axis may
 * turn within a domain, a reference axis), lists the domains it suggests with a button to accept
 * them, sets the thresholds of the flags and runs the checks, and makes the consistency report
 * (a printable page to open and a JSON file to download). It computes nothing itself: the host
 * listens to its events and fills in the results.
 *
 * Properties: `fieldSummary` (string, the field in words), `regions` (ConsistencyRegion[]),
 * `canAccept` (boolean), `angleLegend` ({colour, label}[]: the colours of the angle to the
 * reference), `checkSummary` (string), `flags` (ConsistencyFlagItem[]), `busy` ('' | 'field' |
 * 'checks' | 'report'), `reportUrl` (string | null: where the printable report is), `problem`
 * (string: what went wrong, shown as an alert).
 * Events (bubble, composed): `foldlens-consistency-field` {@link ConsistencyFieldRequest},
 * `foldlens-consistency-layers` {@link ConsistencyLayers}, `foldlens-consistency-accept`,
 * `foldlens-consistency-check` and `foldlens-consistency-report` {@link ConsistencyCheckRequest},
 * `foldlens-consistency-export`.
 * Parts: `field-form`, `field-summary`, `regions`, `legend`, `check-form`, `check-summary`,
 * `flags`, `report`.
 * CSS custom properties: `--fl-bg`, `--fl-fg`, `--fl-muted`, `--fl-border`, `--fl-accent`,
 * `--fl-danger`, `--fl-font`.
 * @example
 * const panel = document.createElement('foldlens-consistency');
 * panel.addEventListener('foldlens-consistency-field', (e) => runField(e.detail)); // then set panel.fieldSummary, panel.regions
 */
export class FoldlensConsistency extends LitElement {
  static override properties = {
    fieldSummary: { attribute: false },
    regions: { attribute: false },
    canAccept: { type: Boolean },
    angleLegend: { attribute: false },
    checkSummary: { attribute: false },
    flags: { attribute: false },
    busy: { type: String },
    reportUrl: { attribute: false },
    problem: { attribute: false },
    referenceProblem: { state: true },
  };

  fieldSummary = '';
  regions: readonly ConsistencyRegion[] = [];
  canAccept = false;
  angleLegend: readonly { readonly colour: string; readonly label: string }[] = [];
  checkSummary = '';
  flags: readonly ConsistencyFlagItem[] = [];
  busy: '' | 'field' | 'checks' | 'report' = '';
  reportUrl: string | null = null;
  problem = '';
  referenceProblem = '';
  private layers: ConsistencyLayers = { arrows: true, angles: true, boundaries: true, flags: true };

  static override styles = css`
    :host { display: block; font: 13px/1.4 var(--fl-font, system-ui, sans-serif); color: var(--fl-fg, #1d2326); }
    h2 { font-size: 12px; text-transform: uppercase; letter-spacing: 0.06em; color: var(--fl-muted, #5b6469); margin: 0 0 6px; }
    fieldset { border: 1px solid var(--fl-border, #c9cdc8); border-radius: 6px; margin: 0 0 8px; padding: 6px 8px 8px; }
    legend { padding: 0 4px; font-weight: 600; }
    .grid { display: grid; grid-template-columns: auto 5.5em auto; gap: 4px 6px; align-items: center; }
    .grid label { grid-column: 1; }
    .grid input { grid-column: 2; }
    .grid .unit { grid-column: 3; color: var(--fl-muted, #5b6469); font-size: 12px; }
    input[type='number'], input[type='text'] { width: 100%; box-sizing: border-box; font: inherit; padding: 3px 5px; border: 1px solid var(--fl-border, #c9cdc8); border-radius: 4px; background: var(--fl-bg, #fff); color: inherit; font-variant-numeric: tabular-nums; }
    input[aria-invalid='true'] { border-color: var(--fl-danger, #b3261e); }
    input[type='checkbox'] { width: 18px; height: 18px; margin: 0; accent-color: var(--fl-accent, #0b6e8a); }
    .checks { display: flex; flex-wrap: wrap; gap: 4px 14px; }
    .checks label, .option { display: inline-flex; gap: 6px; align-items: center; }
    .option { margin-top: 6px; }
    button, a.button { font: inherit; color: inherit; background: var(--fl-bg, #fbfaf7); border: 1px solid var(--fl-border, #c9cdc8); border-radius: 4px; padding: 4px 10px; cursor: pointer; text-decoration: none; display: inline-block; }
    button.primary { background: var(--fl-accent, #0b6e8a); border-color: var(--fl-accent, #0b6e8a); color: #fff; }
    button:disabled { opacity: 0.5; cursor: default; }
    :is(button, input, a):focus-visible { outline: 2px solid var(--fl-accent, #0b6e8a); outline-offset: 1px; }
    .actions { display: flex; flex-wrap: wrap; gap: 6px; align-items: center; margin-top: 6px; }
    .status { margin: 6px 0 0; min-height: 1.2em; }
    .problem { color: var(--fl-danger, #b3261e); margin: 4px 0 0; }
    .hint { color: var(--fl-muted, #5b6469); font-size: 12px; margin: 4px 0 0; }
    ol, ul { margin: 4px 0 0; padding-left: 20px; }
    li { margin: 2px 0; overflow-wrap: anywhere; }
    ul.flags li.warning { color: var(--fl-danger, #b3261e); }
    .legend { display: flex; flex-wrap: wrap; gap: 2px 8px; margin: 6px 0 0; padding: 0; list-style: none; font-size: 12px; }
    .legend li { display: inline-flex; gap: 4px; align-items: center; margin: 0; }
    .swatch { width: 14px; height: 10px; border: 1px solid var(--fl-border, #c9cdc8); display: inline-block; }
  `;

  private fire(type: string, detail: unknown = {}): void {
    this.dispatchEvent(new CustomEvent(type, { detail, bubbles: true, composed: true }));
  }

  private value(form: HTMLFormElement, name: string): string {
    return (form.elements.namedItem(name) as HTMLInputElement).value.trim();
  }

  private requestField(e: Event): void {
    e.preventDefault();
    const form = e.target as HTMLFormElement;
    if (!form.reportValidity()) return;
    const text = this.value(form, 'reference');
    let reference: Line | null = null;
    if (text !== '') {
      try {
        reference = parseLine(text);
      } catch (error) {
        this.referenceProblem = `Reference axis "${text}": ${error instanceof Error ? error.message : String(error)}. Write trend/plunge, such as 075/12, or leave it blank.`;
        return;
      }
    }
    this.referenceProblem = '';
    this.fire('foldlens-consistency-field', {
      k: Number(this.value(form, 'k')),
      grid: Number(this.value(form, 'grid')),
      angle: Number(this.value(form, 'angle')),
      minShare: Number(this.value(form, 'share')) / 100,
      reference,
    } satisfies ConsistencyFieldRequest);
  }

  private checkRequest(): ConsistencyCheckRequest | null {
    const form = this.renderRoot.querySelector<HTMLFormElement>('form.check');
    if (!form || !form.reportValidity()) return null;
    const outlier = this.value(form, 'outlier');
    return {
      lineThreshold: Number(this.value(form, 'threshold')),
      outlierAngle: outlier === '' ? null : Number(outlier),
      searchAxis: (form.elements.namedItem('search') as HTMLInputElement).checked,
    };
  }

  private requestChecks(e: Event): void {
    e.preventDefault();
    const request = this.checkRequest();
    if (request) this.fire('foldlens-consistency-check', request);
  }

  private requestReport(): void {
    const request = this.checkRequest();
    if (request) this.fire('foldlens-consistency-report', request);
  }

  private toggle(name: keyof ConsistencyLayers, on: boolean): void {
    this.layers = { ...this.layers, [name]: on };
    this.fire('foldlens-consistency-layers', this.layers);
  }

  override updated(changed: Map<string, unknown>): void {
    // A freshly made report: move the keyboard to the link that opens it.
    if (changed.has('reportUrl') && this.reportUrl && changed.get('reportUrl') !== this.reportUrl) this.renderRoot.querySelector<HTMLAnchorElement>('a.open-report')?.focus();
  }

  private renderLayers() {
    const box = (name: keyof ConsistencyLayers, label: string) =>
      html`<label><input type="checkbox" .checked=${this.layers[name]} @change=${(e: Event) => this.toggle(name, (e.target as HTMLInputElement).checked)} />${label}</label>`;
    return html`<fieldset>
      <legend>Show on the map</legend>
      <div class="checks">${box('arrows', 'Plunge arrows')}${box('angles', 'Angle to the reference')}${box('boundaries', 'Suggested boundaries')}${box('flags', 'Flags')}</div>
    </fieldset>`;
  }

  override render() {
    const busy = this.busy !== '';
    return html`<h2 id="consistency-title">Consistency</h2>
      <form part="field-form" aria-labelledby="field-legend" @submit=${this.requestField}>
        <fieldset>
          <legend id="field-legend">Local fold axis field</legend>
          <div class="grid">
            <label for="k">Window</label><input id="k" name="k" type="number" min="8" max="500" step="1" value="25" required /><span class="unit">nearest planes</span>
            <label for="grid">Grid</label><input id="grid" name="grid" type="number" min="5" max="200" step="1" value="50" required /><span class="unit">cells along the longer side</span>
            <label for="angle">A cell joins a domain within</label><input id="angle" name="angle" type="number" min="1" max="45" step="0.5" value="10" required /><span class="unit">degrees of the domain's axis as it grows</span>
            <label for="share">Smallest domain</label><input id="share" name="share" type="number" min="0" max="50" step="0.5" value="5" required /><span class="unit">% of the field</span>
            <label for="reference">Reference axis</label><input id="reference" name="reference" type="text" placeholder="all planes" aria-invalid=${this.referenceProblem ? 'true' : 'false'} aria-describedby="reference-help" /><span class="unit" id="reference-help">trend/plunge; blank: π axis of all planes</span>
          </div>
          ${this.referenceProblem ? html`<p class="problem" role="alert">${this.referenceProblem}</p>` : nothing}
          <div class="actions"><button type="submit" class="primary" ?disabled=${busy}>${this.busy === 'field' ? 'Computing the field…' : 'Show axis field'}</button></div>
        </fieldset>
      </form>
      ${this.renderLayers()}
      <p class="status" part="field-summary" role="status">${this.fieldSummary}</p>
      ${this.angleLegend.length > 0 && this.fieldSummary
        ? html`<ul class="legend" part="legend" aria-label="Angle between the local axis and the reference">
            ${this.angleLegend.map((c) => html`<li><span class="swatch" style=${styleMap({ background: c.colour })}></span>${c.label}</li>`)}
          </ul>`
        : nothing}
      ${this.regions.length > 0
        ? html`<ol part="regions" aria-label="Suggested domains">
            ${this.regions.map((r) => html`<li>Suggested domain ${r.label + 1}: mean cell axis ${lineText(r.axis)}, ${r.nodes} cells, cell axes up to ${r.spread.toFixed(0)}° from the domain's axis</li>`)}
          </ol>`
        : nothing}
      <div class="actions">
        <button type="button" ?disabled=${!this.canAccept || busy} @click=${() => this.fire('foldlens-consistency-accept')}>Accept suggested domains</button>
      </div>
      <form class="check" part="check-form" @submit=${this.requestChecks}>
        <fieldset>
          <legend>Flags and checks</legend>
          <div class="grid">
            <label for="threshold">Lines off the axis by more than</label><input id="threshold" name="threshold" type="number" min="0.5" max="90" step="0.5" value="15" required /><span class="unit">degrees</span>
            <label for="outlier">Poles off the girdle by more than</label><input id="outlier" name="outlier" type="number" min="0.5" max="90" step="0.5" placeholder="auto" aria-describedby="outlier-help" /><span class="unit" id="outlier-help">degrees; blank: 3.5 robust σ, at least 5°</span>
          </div>
          <label class="option"><input type="checkbox" name="search" />Also search for the axis from the map pattern alone (slow)</label>
          <p class="hint">Checks run on the saved domains; without any, on the suggested domains, or on all stations.</p>
          <div class="actions"><button type="submit" class="primary" ?disabled=${busy}>${this.busy === 'checks' ? 'Checking…' : 'Check domains'}</button></div>
        </fieldset>
      </form>
      <p class="status" part="check-summary" role="status">${this.checkSummary}</p>
      ${this.flags.length > 0
        ? html`<ul class="flags" part="flags" aria-label="Flags">
            ${this.flags.map((f) => html`<li class=${f.severity}><strong>${f.domain}</strong>: ${f.message}</li>`)}
          </ul>`
        : nothing}
      <div class="actions" part="report">
        <button type="button" ?disabled=${busy} @click=${this.requestReport}>${this.busy === 'report' ? 'Making the report…' : 'Make report'}</button>
        ${this.reportUrl
          ? html`<a class="button open-report" href=${this.reportUrl} target="_blank" rel="noopener">Open the printable report</a>
              <button type="button" @click=${() => this.fire('foldlens-consistency-export')}>Download JSON</button>`
          : nothing}
      </div>
      ${this.problem ? html`<p class="problem" role="alert">${this.problem}</p>` : nothing}`;
  }
}

defineOnce('foldlens-consistency', FoldlensConsistency);

declare global {
  interface HTMLElementTagNameMap {
    'foldlens-consistency': FoldlensConsistency;
  }
}
