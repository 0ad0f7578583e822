import { LitElement, css, html, nothing } from 'lit';
import type { Station } from '../core/station';
import { legendEntries, type LegendEntry } from '../map/legendEntries';
import { imageFor } from '../map/symbolImages';
import { rasterImageUrl } from './rasterImageUrl';
import { defineOnce } from './define';

/**
 * `<foldlens-legend>`: the symbols the stations actually use, with a per-kind filter.
 *
 * Properties: `stations` (Station[]), `hiddenKinds` (string[]).
 * Events: `foldlens-kind-filter` {detail: {visibleKinds: string[] | null}} (bubbles, composed).
 * Parts: `list`, `entry`, `symbol`, `toggle`.
 * CSS custom properties: `--fl-bg`, `--fl-fg`, `--fl-muted`, `--fl-border`, `--fl-font`.
 * @example
 * const legend = document.createElement('foldlens-legend');
 * legend.stations = stations;
 * legend.addEventListener('foldlens-kind-filter', (e) => foldlens.overlay.setVisibleKinds(e.detail.visibleKinds));
 */
export class FoldlensLegend extends LitElement {
  static override properties = {
    stations: { attribute: false },
    hiddenKinds: { attribute: false },
  };

  stations: readonly Station[] = [];
  hiddenKinds: readonly string[] = [];

  static override styles = css`
    :host { display: block; font: 13px/1.35 var(--fl-font, system-ui, sans-serif); color: var(--fl-fg, #1d2326); }
    h2 { font-size: 12px; text-transform: uppercase; letter-spacing: 0.06em; color: var(--fl-muted, #5b6469); margin: 0 0 6px; }
    ul { list-style: none; margin: 0; padding: 0; }
    li { display: grid; grid-template-columns: auto 30px 1fr auto; align-items: center; gap: 6px; padding: 2px 0; }
    img { width: 30px; height: 30px; }
    .detail { color: var(--fl-muted, #5b6469); font-size: 12px; }
    .count { color: var(--fl-muted, #5b6469); font-variant-numeric: tabular-nums; font-size: 12px; }
    input:focus-visible { outline: 2px solid var(--fl-accent, #0b6e8a); outline-offset: 2px; }
    .empty { color: var(--fl-muted, #5b6469); font-style: italic; }
  `;

  private toggle(kind: string, on: boolean): void {
    const hidden = new Set(this.hiddenKinds);
    if (on) hidden.delete(kind);
    else hidden.add(kind);
    this.hiddenKinds = [...hidden];
    const allKinds = [...new Set(legendEntries(this.stations).map((e) => e.kind))];
    const visibleKinds = hidden.size === 0 ? null : allKinds.filter((k) => !hidden.has(k));
    this.dispatchEvent(new CustomEvent('foldlens-kind-filter', { detail: { visibleKinds }, bubbles: true, composed: true }));
  }

  private renderEntry(e: LegendEntry, firstOfKind: boolean) {
    const img = imageFor(e.image, 2);
    const url = img ? rasterImageUrl(e.image, img) : '';
    const shown = !this.hiddenKinds.includes(e.kind);
    return html`<li part="entry">
      ${firstOfKind
        ? html`<input part="toggle" type="checkbox" .checked=${shown} aria-label=${`Show ${e.title}`} @change=${(ev: Event) => this.toggle(e.kind, (ev.target as HTMLInputElement).checked)} />`
        : html`<span></span>`}
      <img part="symbol" src=${url} alt="" />
      <span><span>${e.title}</span> <span class="detail">${e.detail}</span></span>
      <span class="count" title="stations">${e.count}</span>
    </li>`;
  }

  override render() {
    const entries = legendEntries(this.stations);
    const seen = new Set<string>();
    return html`<h2 id="legend-title">Symbols</h2>
      ${entries.length === 0
        ? html`<p class="empty">No stations to show.</p>`
        : html`<ul part="list" aria-labelledby="legend-title">
            ${entries.map((e) => {
              const first = !seen.has(e.kind);
              seen.add(e.kind);
              return this.renderEntry(e, first);
            })}
          </ul>`}
      ${nothing}`;
  }
}

defineOnce('foldlens-legend', FoldlensLegend);

declare global {
  interface HTMLElementTagNameMap {
    'foldlens-legend': FoldlensLegend;
  }
}
