import { LitElement, css, html, nothing } from 'lit';
import type { Domain } from '../core/domain';
import { compareDomains } from '../core/domain';
import { defineOnce } from './define';

const pad = (n: number, w: number) => String(Math.round(n) % 360).padStart(w, '0');
const axisText = (d: Domain) => (d.analysis?.axis ? `${pad(d.analysis.axis.trend, 3)}/${pad(d.analysis.axis.plunge, 2)}` : '—');
const coneText = (d: Domain) => (d.analysis?.cone95 != null ? `±${d.analysis.cone95.toFixed(1)}°` : '—');

/**
 * `<foldlens-domains>`: saved structural domains side by side, with saving, renaming, showing,
 * outline editing, deleting (with undo) and a comparison of any two.
 *
 * Properties: `domains` (Domain[]), `canSave` (a selection with a shape exists), `editingId`,
 * `deleted` (the last deleted domain, offered for undo, or null).
 * Events (bubble, composed): `foldlens-domain-save` {name}, `foldlens-domain-show` {id},
 * `foldlens-domain-edit` {id | null}, `foldlens-domain-rename` {id, name}, `foldlens-domain-delete` {id},
 * `foldlens-domain-undo`.
 * Parts: `list`, `row`, `compare`, `undo`.
 * CSS custom properties: `--fl-bg`, `--fl-fg`, `--fl-muted`, `--fl-border`, `--fl-accent`.
 * @example
 * const list = document.createElement('foldlens-domains');
 * list.domains = project.domains;
 * list.addEventListener('foldlens-domain-save', (e) => saveDomain(e.detail.name));
 */
export class FoldlensDomains extends LitElement {
  static override properties = {
    domains: { attribute: false },
    canSave: { type: Boolean },
    editingId: { attribute: false },
    deleted: { attribute: false },
    compareA: { state: true },
    compareB: { state: true },
    renamingId: { state: true },
  };

  domains: readonly Domain[] = [];
  canSave = false;
  editingId: string | null = null;
  deleted: Domain | null = null;
  compareA = '';
  compareB = '';
  renamingId: string | null = null;

  static override styles = css`
    :host { display: block; font: 13px/1.35 var(--fl-font, system-ui, sans-serif); color: var(--fl-fg, #1d2326); }
    h2 { font-size: 12px; text-transform: uppercase; letter-spacing: 0.06em; color: var(--fl-muted, #5b6469); margin: 0 0 6px; }
    form { display: flex; gap: 6px; margin-bottom: 8px; }
    input[type='text'] { flex: 1; min-width: 0; font: inherit; padding: 4px 6px; border: 1px solid var(--fl-border, #c9cdc8); border-radius: 4px; background: var(--fl-bg, #fff); color: inherit; }
    button, select { font: inherit; color: inherit; background: var(--fl-bg, #fbfaf7); border: 1px solid var(--fl-border, #c9cdc8); border-radius: 4px; padding: 3px 8px; cursor: pointer; }
    button[aria-pressed='true'] { background: var(--fl-accent, #0b6e8a); color: #fff; }
    button:disabled { opacity: 0.5; cursor: default; }
    :is(button, select, input):focus-visible { outline: 2px solid var(--fl-accent, #0b6e8a); outline-offset: 1px; }
    table { width: 100%; border-collapse: collapse; font-variant-numeric: tabular-nums; }
    th { text-align: left; font-weight: 600; color: var(--fl-muted, #5b6469); font-size: 12px; padding: 2px 4px; }
    td { padding: 3px 4px; border-top: 1px solid var(--fl-border, #c9cdc8); vertical-align: middle; }
    td.name { overflow-wrap: anywhere; }
    td.actions { text-align: right; }
    td.actions button { padding: 2px 6px; margin: 1px 0; font-size: 12px; }
    .empty, .result { color: var(--fl-muted, #5b6469); }
    .compare { display: flex; flex-wrap: wrap; gap: 6px; align-items: center; margin-top: 8px; }
    .undo { margin-top: 6px; display: flex; gap: 8px; align-items: center; }
    .visually-hidden { position: absolute; width: 1px; height: 1px; overflow: hidden; clip: rect(0 0 0 0); white-space: nowrap; }
  `;

  private fire(type: string, detail: unknown = {}): void {
    this.dispatchEvent(new CustomEvent(type, { detail, bubbles: true, composed: true }));
  }

  private save(e: Event): void {
    e.preventDefault();
    const input = this.renderRoot.querySelector<HTMLInputElement>('input[name=name]')!;
    this.fire('foldlens-domain-save', { name: input.value.trim() });
    input.value = '';
  }

  private commitRename(d: Domain, input: HTMLInputElement): void {
    const name = input.value.trim();
    this.renamingId = null;
    if (name && name !== d.name) this.fire('foldlens-domain-rename', { id: d.id, name });
  }

  private renderName(d: Domain) {
    if (this.renamingId !== d.id) return d.name;
    return html`<input type="text" .value=${d.name} aria-label=${`New name for ${d.name}`}
      @keydown=${(e: KeyboardEvent) => {
        if (e.key === 'Enter') this.commitRename(d, e.target as HTMLInputElement);
        if (e.key === 'Escape') this.renamingId = null;
      }}
      @blur=${(e: FocusEvent) => this.commitRename(d, e.target as HTMLInputElement)} />`;
  }

  override updated(): void {
    if (this.renamingId) this.renderRoot.querySelector<HTMLInputElement>('td.name input')?.focus();
  }

  private renderCompare() {
    if (this.domains.length < 2) return nothing;
    const a = this.domains.find((d) => d.id === this.compareA);
    const b = this.domains.find((d) => d.id === this.compareB);
    const options = (selected: string) => this.domains.map((d) => html`<option value=${d.id} ?selected=${d.id === selected}>${d.name}</option>`);
    return html`<div class="compare" part="compare">
      <span>Compare</span>
      <select aria-label="First domain to compare" @change=${(e: Event) => (this.compareA = (e.target as HTMLSelectElement).value)}>
        <option value="">—</option>${options(this.compareA)}
      </select>
      <span>with</span>
      <select aria-label="Second domain to compare" @change=${(e: Event) => (this.compareB = (e.target as HTMLSelectElement).value)}>
        <option value="">—</option>${options(this.compareB)}
      </select>
      ${a && b && a !== b ? html`<p class="result" role="status">${compareDomains(a, b).text}</p>` : nothing}
    </div>`;
  }

  override render() {
    return html`<h2 id="domains-title">Structural domains</h2>
      <form @submit=${this.save}>
        <input type="text" name="name" placeholder="Name (optional)" aria-label="Name of the new domain" />
        <button type="submit" ?disabled=${!this.canSave} title=${this.canSave ? 'Save the selected area and its analysis' : 'Draw a selection first'}>Save selection as domain</button>
      </form>
      ${this.domains.length === 0
        ? html`<p class="empty">No domains yet. Select an area, then save it here.</p>`
        : html`<table part="list" aria-labelledby="domains-title">
            <thead><tr><th scope="col">Domain</th><th scope="col">n</th><th scope="col">Axis</th><th scope="col">Cone</th><th scope="col"><span class="visually-hidden">Actions</span></th></tr></thead>
            <tbody>
              ${this.domains.map(
                (d) => html`<tr part="row">
                  <td class="name">${this.renderName(d)}</td>
                  <td>${d.analysis?.n ?? 0}</td>
                  <td>${axisText(d)}</td>
                  <td>${coneText(d)}</td>
                  <td class="actions">
                    <button type="button" @click=${() => this.fire('foldlens-domain-show', { id: d.id })} aria-label=${`Show ${d.name}`}>Show</button>
                    <button type="button" aria-pressed=${String(this.editingId === d.id)} @click=${() => this.fire('foldlens-domain-edit', { id: this.editingId === d.id ? null : d.id })} aria-label=${`Edit the outline of ${d.name}`}>Edit</button>
                    <button type="button" @click=${() => (this.renamingId = d.id)} aria-label=${`Rename ${d.name}`}>Rename</button>
                    <button type="button" @click=${() => this.fire('foldlens-domain-delete', { id: d.id })} aria-label=${`Delete ${d.name}`}>Delete</button>
                  </td>
                </tr>`,
              )}
            </tbody>
          </table>`}
      ${this.renderCompare()}
      ${this.deleted
        ? html`<div class="undo" part="undo" role="status">Deleted “${this.deleted.name}”. <button type="button" @click=${() => this.fire('foldlens-domain-undo')}>Undo</button></div>`
        : nothing}`;
  }
}

defineOnce('foldlens-domains', FoldlensDomains);

declare global {
  interface HTMLElementTagNameMap {
    'foldlens-domains': FoldlensDomains;
  }
}
