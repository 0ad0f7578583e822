import { LitElement, css, html, nothing } from 'lit';
import type { HingeMean } from '../core/hingeMean';
import { PLUNGE_EXPECTED, TREND_EXPECTED } from '../core/typedAxis';
import { defineOnce } from './define';
import { resolveAxisChoice, type AxisChoice, type AxisSource, type DomainAxis, type SelectionAxis } from './profile/axisChoice';
import { axisText } from './profile/profileText';

/**
 * `<foldlens-axis-picker>`: chooses the fold axis a down-plunge profile or a section is drawn
 * with: the selection's pi axis, a saved domain's pi axis, the Fisher mean of the measured
 * hinges in the selection, or an axis typed as trend and plunge (each field checked, with a
 * message naming the field and the range it takes). Below the choices, the axis in use and
 * where it comes from, or why there is none. The rules are in profile/axisChoice.ts.
 *
 * Properties (set from code):
 * - `selection` (SelectionAxis | null): the selection's analysis; null when nothing is selected;
 * - `domains` (DomainAxis[]): saved domains and their axes;
 * - `hinges` (HingeMean | null): hinge mean of the selection (core/hingeMean.ts); null without a selection;
 * - `source` ('selection' | 'domain' | 'hinges' | 'typed', default 'selection'), `domainId`,
 *   `trendText`, `plungeText`: the user's choice (the host may preset them);
 * - `choice` (read only, AxisChoice): the axis in force, its origin in words, or the problem.
 *
 * Events (bubble, composed): `foldlens-axis-change` {detail: AxisChoice} whenever the user
 * changes the source, the domain or a typed field.
 *
 * Parts: `sources`, `option`, `typed`, `field-problem`, `in-use`.
 *
 * CSS custom properties: `--fl-bg`, `--fl-fg`, `--fl-muted`, `--fl-border`, `--fl-accent`,
 * `--fl-danger`, `--fl-font`.
 * @example
 * const picker = document.createElement('foldlens-axis-picker');
 * picker.selection = { axis: { trend: 75, plunge: 12 }, n: 80, cone95: 2.1 };
 * picker.addEventListener('foldlens-axis-change', (e) => redraw(e.detail.axis));
 */
export class FoldlensAxisPicker extends LitElement {
  static override properties = {
    selection: { attribute: false },
    domains: { attribute: false },
    hinges: { attribute: false },
    source: {},
    domainId: { attribute: false },
    trendText: { attribute: false },
    plungeText: { attribute: false },
    touched: { state: true },
  };

  selection: SelectionAxis | null = null;
  domains: readonly DomainAxis[] = [];
  hinges: HingeMean | null = null;
  source: AxisSource = 'selection';
  domainId = '';
  trendText = '';
  plungeText = '';
  /** Typed fields the user has left or typed in: their problems are shown beside them. */
  touched: ReadonlySet<'trend' | 'plunge'> = new Set();

  static override styles = css`
    :host { display: block; font: 13px/1.35 var(--fl-font, system-ui, sans-serif); color: var(--fl-fg, #1d2326); }
    fieldset { border: 0; margin: 0; padding: 0; min-width: 0; }
    legend { font-size: 12px; text-transform: uppercase; letter-spacing: 0.06em; color: var(--fl-muted, #5b6469); padding: 0; margin: 0 0 4px; }
    .option { display: flex; flex-wrap: wrap; align-items: center; gap: 4px 8px; padding: 3px 0; }
    .option > label:first-child { display: inline-flex; align-items: center; gap: 6px; cursor: pointer; }
    .value { color: var(--fl-muted, #5b6469); font-variant-numeric: tabular-nums; font-size: 12px; }
    .typed { display: inline-flex; flex-wrap: wrap; gap: 4px 10px; align-items: center; }
    .typed label { display: inline-flex; gap: 4px; align-items: center; }
    input[type='text'] { width: 4.2em; font: inherit; font-variant-numeric: tabular-nums; padding: 3px 5px; border: 1px solid var(--fl-border, #c9cdc8); border-radius: 4px; background: var(--fl-bg, #fff); color: inherit; }
    input[aria-invalid='true'] { border-color: var(--fl-danger, #b3261e); box-shadow: inset 0 0 0 1px var(--fl-danger, #b3261e); }
    select { font: inherit; color: inherit; background: var(--fl-bg, #fbfaf7); border: 1px solid var(--fl-border, #c9cdc8); border-radius: 4px; padding: 2px 6px; max-width: 14em; }
    :is(input, select):focus-visible { outline: 2px solid var(--fl-accent, #0b6e8a); outline-offset: 1px; }
    input[type='radio'] { width: 18px; height: 18px; margin: 0; accent-color: var(--fl-accent, #0b6e8a); }
    .field-problem { color: var(--fl-danger, #b3261e); font-size: 12px; margin: 2px 0 0 24px; }
    .in-use { margin: 6px 0 0; padding: 5px 8px; border-radius: 4px; background: var(--fl-accent-soft, #e3f0f3); overflow-wrap: anywhere; }
    .in-use.none { background: transparent; border: 1px dashed var(--fl-border, #c9cdc8); color: var(--fl-muted, #5b6469); }
    .in-use strong { font-variant-numeric: tabular-nums; }
  `;

  /**
   * The axis in force, where it comes from, or why there is none.
   * @example picker.choice.axis // {trend: 75, plunge: 12} or null
   */
  get choice(): AxisChoice {
    return resolveAxisChoice({
      source: this.source,
      selection: this.selection,
      domains: this.domains,
      domainId: this.domainId,
      hinges: this.hinges,
      trendText: this.trendText,
      plungeText: this.plungeText,
    });
  }

  private changed(): void {
    this.dispatchEvent(new CustomEvent<AxisChoice>('foldlens-axis-change', { detail: this.choice, bubbles: true, composed: true }));
  }

  private pick(source: AxisSource): void {
    if (this.source === source) return;
    this.source = source;
    if (source === 'domain' && !this.domains.some((d) => d.id === this.domainId) && this.domains.length > 0) this.domainId = this.domains[0].id;
    this.changed();
  }

  private typed(field: 'trend' | 'plunge', value: string): void {
    if (field === 'trend') this.trendText = value;
    else this.plungeText = value;
    this.touched = new Set([...this.touched, field]);
    this.source = 'typed';
    this.changed();
  }

  private radio(source: AxisSource, label: string, value: string | null) {
    return html`<label>
        <input type="radio" name="source" value=${source} .checked=${this.source === source} @change=${() => this.pick(source)} />
        ${label}
      </label>
      ${value !== null ? html`<span class="value">${value}</span>` : nothing}`;
  }

  override render() {
    const choice = this.choice;
    const typedProblems = this.source === 'typed' ? choice.fieldProblems : [];
    const problemOf = (field: 'Trend' | 'Plunge') => typedProblems.find((p) => p.field === field);
    const trendProblem = this.touched.has('trend') ? problemOf('Trend') : undefined;
    const plungeProblem = this.touched.has('plunge') ? problemOf('Plunge') : undefined;
    const selectionValue = this.selection === null ? 'no selection' : this.selection.pending ? 'analysing…' : this.selection.axis ? axisText(this.selection.axis) : 'undefined';
    const domain = this.domains.find((d) => d.id === this.domainId);
    const hingeValue = this.hinges === null ? 'no selection' : this.hinges.axis ? `${axisText(this.hinges.axis)} (n ${this.hinges.n})` : `none (${this.hinges.n} hinges)`;
    return html`<fieldset part="sources">
        <legend>Fold axis for profiles and sections</legend>
        <div class="option" part="option">${this.radio('selection', 'π axis of the selection', selectionValue)}</div>
        <div class="option" part="option">
          ${this.radio('domain', 'π axis of domain', null)}
          <select
            aria-label="Domain whose axis to use"
            ?disabled=${this.domains.length === 0}
            @change=${(e: Event) => {
              this.domainId = (e.target as HTMLSelectElement).value;
              this.source = 'domain';
              this.changed();
            }}
          >
            ${this.domains.length === 0 ? html`<option value="">no domain saved</option>` : nothing}
            ${this.domains.map((d) => html`<option value=${d.id} ?selected=${d.id === this.domainId}>${d.name}</option>`)}
          </select>
          ${domain ? html`<span class="value">${domain.axis ? axisText(domain.axis) : 'undefined'}</span>` : nothing}
        </div>
        <div class="option" part="option">${this.radio('hinges', 'Mean of measured hinges in the selection', hingeValue)}</div>
        <div class="option" part="option">
          ${this.radio('typed', 'Typed', null)}
          <span class="typed" part="typed">
            <label for="trend">Trend (°)</label>
            <input
              id="trend"
              type="text"
              inputmode="decimal"
              autocomplete="off"
              placeholder="0–360"
              title=${`Trend: ${TREND_EXPECTED}`}
              .value=${this.trendText}
              aria-invalid=${trendProblem ? 'true' : 'false'}
              aria-describedby=${trendProblem ? 'trend-problem' : nothing}
              @input=${(e: Event) => this.typed('trend', (e.target as HTMLInputElement).value)}
            />
            <label for="plunge">Plunge (°)</label>
            <input
              id="plunge"
              type="text"
              inputmode="decimal"
              autocomplete="off"
              placeholder="0–90"
              title=${`Plunge: ${PLUNGE_EXPECTED}`}
              .value=${this.plungeText}
              aria-invalid=${plungeProblem ? 'true' : 'false'}
              aria-describedby=${plungeProblem ? 'plunge-problem' : nothing}
              @input=${(e: Event) => this.typed('plunge', (e.target as HTMLInputElement).value)}
            />
          </span>
        </div>
        ${trendProblem ? html`<p class="field-problem" part="field-problem" id="trend-problem">${trendProblem.message}</p>` : nothing}
        ${plungeProblem ? html`<p class="field-problem" part="field-problem" id="plunge-problem">${plungeProblem.message}</p>` : nothing}
      </fieldset>
      <p class="in-use ${choice.axis ? '' : 'none'}" part="in-use" role="status" aria-live="polite">
        ${choice.axis
          ? html`Axis in use: <strong>${axisText(choice.axis)}</strong> (trend/plunge, true north), ${choice.from}.`
          : html`No axis yet: ${choice.problem}`}
      </p>`;
  }
}

defineOnce('foldlens-axis-picker', FoldlensAxisPicker);

declare global {
  interface HTMLElementTagNameMap {
    'foldlens-axis-picker': FoldlensAxisPicker;
  }
}
