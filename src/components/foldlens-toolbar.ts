import { LitElement, css, html } from 'lit';
import { defineOnce } from './define';

export type ToolbarTool = 'pan' | 'lasso' | 'polygon' | 'rectangle';
export type ToolbarCombine = 'replace' | 'add' | 'subtract';

const TOOLS: ReadonlyArray<{ id: ToolbarTool; label: string; key: string; hint: string }> = [
  { id: 'pan', label: 'Pan', key: 'P', hint: 'Move the map' },
  { id: 'lasso', label: 'Lasso', key: 'L', hint: 'Press and draw around stations' },
  { id: 'polygon', label: 'Polygon', key: 'G', hint: 'Click corners; click the first corner, double-click or press Enter to finish. Keyboard: on the focused map, Space adds a corner at the centre cross' },
  { id: 'rectangle', label: 'Box', key: 'B', hint: 'Press and drag a box' },
];

const COMBINES: ReadonlyArray<{ id: ToolbarCombine; label: string; hint: string }> = [
  { id: 'replace', label: 'New', hint: 'The shape replaces the selection' },
  { id: 'add', label: 'Add', hint: 'Add to the selection (or hold Shift)' },
  { id: 'subtract', label: 'Remove', hint: 'Remove from the selection (or hold Alt)' },
];

/**
 * `<foldlens-toolbar>`: selection tools for the map.
 *
 * Properties: `tool`, `combine`, `kinds` (kinds present, for "select by kind"), `selectedCount`.
 * Events (bubble, composed): `foldlens-tool` {tool}, `foldlens-combine` {combine},
 * `foldlens-clear`, `foldlens-select-kind` {kind}.
 * Keyboard: P, L, G, B pick a tool while focus is in the toolbar; Escape clears a shape in progress (map).
 * Parts: `bar`, `tool`, `combine`, `clear`.
 * CSS custom properties: `--fl-bg`, `--fl-fg`, `--fl-accent`, `--fl-border`, `--fl-font`.
 * @example
 * const toolbar = document.createElement('foldlens-toolbar');
 * toolbar.addEventListener('foldlens-tool', (e) => foldlens.setTool(e.detail.tool === 'pan' ? null : e.detail.tool));
 */
export class FoldlensToolbar extends LitElement {
  static override properties = {
    tool: {},
    combine: {},
    kinds: { attribute: false },
    selectedCount: { type: Number },
  };

  tool: ToolbarTool = 'pan';
  combine: ToolbarCombine = 'replace';
  kinds: readonly { kind: string; label: string }[] = [];
  selectedCount = 0;

  static override styles = css`
    :host { display: block; font: 13px/1.2 var(--fl-font, system-ui, sans-serif); color: var(--fl-fg, #1d2326); }
    .bar { display: flex; flex-wrap: wrap; gap: 6px; align-items: center; }
    [role='group'] { display: inline-flex; border: 1px solid var(--fl-border, #c9cdc8); border-radius: 6px; overflow: hidden; }
    button, select { font: inherit; color: inherit; background: var(--fl-bg, #fbfaf7); border: 0; padding: 6px 10px; min-height: 32px; cursor: pointer; }
    [role='group'] button + button { border-left: 1px solid var(--fl-border, #c9cdc8); }
    button[aria-pressed='true'] { background: var(--fl-accent, #0b6e8a); color: #fff; }
    button:focus-visible, select:focus-visible { outline: 2px solid var(--fl-accent, #0b6e8a); outline-offset: -2px; }
    select { border: 1px solid var(--fl-border, #c9cdc8); border-radius: 6px; }
    .count { color: var(--fl-muted, #5b6469); font-variant-numeric: tabular-nums; }
    kbd { font: 11px var(--fl-font, system-ui, sans-serif); opacity: 0.7; margin-left: 4px; }
  `;

  private fire(type: string, detail: unknown = {}): void {
    this.dispatchEvent(new CustomEvent(type, { detail, bubbles: true, composed: true }));
  }

  private pickTool(tool: ToolbarTool): void {
    this.tool = tool;
    this.fire('foldlens-tool', { tool });
  }

  private onKey = (e: KeyboardEvent): void => {
    if (e.target instanceof HTMLSelectElement || e.ctrlKey || e.metaKey || e.altKey) return;
    const t = TOOLS.find((x) => x.key.toLowerCase() === e.key.toLowerCase());
    if (t) {
      e.preventDefault();
      this.pickTool(t.id);
    }
  };

  override render() {
    return html`<div class="bar" part="bar" role="toolbar" aria-label="Selection tools" @keydown=${this.onKey}>
      <div role="group" aria-label="Tool">
        ${TOOLS.map(
          (t) => html`<button part="tool" type="button" aria-pressed=${String(this.tool === t.id)} title=${`${t.hint} (${t.key})`} @click=${() => this.pickTool(t.id)}>
            ${t.label}<kbd aria-hidden="true">${t.key}</kbd>
          </button>`,
        )}
      </div>
      <div role="group" aria-label="Combine with the selection">
        ${COMBINES.map(
          (c) => html`<button part="combine" type="button" aria-pressed=${String(this.combine === c.id)} title=${c.hint} @click=${() => {
            this.combine = c.id;
            this.fire('foldlens-combine', { combine: c.id });
          }}>${c.label}</button>`,
        )}
      </div>
      <select aria-label="Select all stations of a kind" @change=${(e: Event) => {
        const el = e.target as HTMLSelectElement;
        if (el.value) this.fire('foldlens-select-kind', { kind: el.value });
        el.value = '';
      }}>
        <option value="">Select by kind…</option>
        ${this.kinds.map((k) => html`<option value=${k.kind}>${k.label}</option>`)}
      </select>
      <button part="clear" type="button" @click=${() => this.fire('foldlens-clear')} ?disabled=${this.selectedCount === 0}>Clear</button>
      <span class="count" aria-live="polite">${this.selectedCount} selected</span>
    </div>`;
  }
}

defineOnce('foldlens-toolbar', FoldlensToolbar);

declare global {
  interface HTMLElementTagNameMap {
    'foldlens-toolbar': FoldlensToolbar;
  }
}
