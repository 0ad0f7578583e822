import { LitElement, css, html } from 'lit';
import type { ProjectSelection } from '../io/projectFile';
import { defineOnce } from './define';

const TOOL_WORDS: Record<string, string> = { lasso: 'lasso', polygon: 'polygon', rectangle: 'box' };

/** How many stations a saved selection names, as shown in the list. */
function stationCount(s: ProjectSelection): string {
  const n = s.indices?.length ?? s.stationIds?.length;
  return n === undefined ? 'outline only' : `${n.toLocaleString('en')} station${n === 1 ? '' : 's'}`;
}

/**
 * `<foldlens-selections>`: named selections. The current selection is saved under a name
 * (Enter in the name field, or the button), and any saved one is applied again, or deleted,
 * from its row. Every control is a labelled button or field, so it works from the keyboard.
 *
 * Properties: `selections` (ProjectSelection[] to list, io/projectFile.ts), `canSave` (something
 * is selected), `status` (text announced in the status line, e.g. what Apply did).
 * Events (bubble, composed): `foldlens-selection-save` {name} (name may be empty: the host picks
 * one), `foldlens-selection-apply` {id}, `foldlens-selection-delete` {id}.
 * Parts: `form`, `list`, `row`, `status`.
 * CSS custom properties: `--fl-bg`, `--fl-fg`, `--fl-muted`, `--fl-border`, `--fl-accent`, `--fl-font`.
 * @example
 * <foldlens-selections></foldlens-selections>
 * panel.addEventListener('foldlens-selection-apply', (e) => restore(e.detail.id));
 */
export class FoldlensSelections extends LitElement {
  static override properties = {
    selections: { attribute: false },
    canSave: { type: Boolean },
    status: {},
  };

  selections: readonly ProjectSelection[] = [];
  canSave = false;
  status = '';

  static override styles = css`
    :host { display: block; font: 13px/1.35 var(--fl-font, system-ui, sans-serif); color: var(--fl-fg, #1d2326); }
    h2 { font-size: 12px; text-transform: uppercase; letter-spacing: 0.06em; color: var(--fl-muted, #5b6469); margin: 0 0 6px; }
    form { display: flex; gap: 6px; margin-bottom: 6px; }
    input[type='text'] { flex: 1; min-width: 0; font: inherit; padding: 4px 6px; border: 1px solid var(--fl-border, #c9cdc8); border-radius: 4px; background: var(--fl-bg, #fff); color: inherit; }
    button { font: inherit; color: inherit; background: var(--fl-bg, #fbfaf7); border: 1px solid var(--fl-border, #c9cdc8); border-radius: 4px; padding: 3px 8px; cursor: pointer; }
    button:disabled { opacity: 0.5; cursor: default; }
    :is(button, input):focus-visible { outline: 2px solid var(--fl-accent, #0b6e8a); outline-offset: 1px; }
    ul { list-style: none; margin: 0; padding: 0; }
    li { display: flex; gap: 6px; align-items: center; padding: 3px 0; border-top: 1px solid var(--fl-border, #c9cdc8); }
    .name { flex: 1; min-width: 0; overflow-wrap: anywhere; }
    .meta { color: var(--fl-muted, #5b6469); font-size: 12px; white-space: nowrap; }
    li button { padding: 2px 6px; font-size: 12px; }
    .empty, .status { color: var(--fl-muted, #5b6469); margin: 4px 0 0; }
    .status:empty { margin: 0; }
  `;

  private fire(type: string, detail: unknown): void {
    this.dispatchEvent(new CustomEvent(type, { detail, bubbles: true, composed: true }));
  }

  private save(e: Event): void {
    e.preventDefault();
    if (!this.canSave) return;
    const input = this.renderRoot.querySelector<HTMLInputElement>('input[name=name]')!;
    this.fire('foldlens-selection-save', { name: input.value.trim() });
    input.value = '';
  }

  override render() {
    return html`<h2 id="selections-title">Named selections</h2>
      <form part="form" @submit=${this.save}>
        <input type="text" name="name" placeholder="Name (optional)" aria-label="Name of the selection to save" />
        <button type="submit" ?disabled=${!this.canSave} title=${this.canSave ? 'Keep the stations selected now under this name' : 'Select stations first'}>Save selection</button>
      </form>
      ${this.selections.length === 0
        ? html`<p class="empty">No named selections yet. Select stations, name them and save.</p>`
        : html`<ul part="list" aria-labelledby="selections-title">
            ${this.selections.map(
              (s) => html`<li part="row">
                <span class="name">${s.name}</span>
                <span class="meta">${stationCount(s)}${s.shape ? `, ${TOOL_WORDS[s.shape.tool ?? ''] ?? 'outline'}` : ''}</span>
                <button type="button" aria-label=${`Apply the selection ${s.name}`} @click=${() => this.fire('foldlens-selection-apply', { id: s.id })}>Apply</button>
                <button type="button" aria-label=${`Delete the selection ${s.name}`} @click=${() => this.fire('foldlens-selection-delete', { id: s.id })}>Delete</button>
              </li>`,
            )}
          </ul>`}
      <p class="status" part="status" role="status">${this.status}</p>`;
  }
}

defineOnce('foldlens-selections', FoldlensSelections);

declare global {
  interface HTMLElementTagNameMap {
    'foldlens-selections': FoldlensSelections;
  }
}
