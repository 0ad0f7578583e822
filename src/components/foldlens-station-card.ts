import { LitElement, css, html, nothing } from 'lit';
import type { Station } from '../core/station';
import { describeProblem } from '../core/station';
import { KIND_LABELS } from '../map/symbolCatalog';
import { defineOnce } from './define';

const pad = (n: number, width: number) => String(Math.round(n) % (width === 3 ? 360 : 1000)).padStart(width, '0');

/**
 * `<foldlens-station-card>`: everything known about one station — its attitude after
 * corrections, the corrections applied, every original field as read, and any problems.
 * All data text is rendered as text (lit escapes it); nothing from a file becomes HTML.
 *
 * Properties: `station` (Station | null), `netPosition` ({x, y} on the unit net, optional).
 * Events: `foldlens-close` when the close button is pressed (bubbles, composed).
 * Parts: `card`, `title`, `fields`, `close`.
 * CSS custom properties: `--fl-bg`, `--fl-fg`, `--fl-muted`, `--fl-border`, `--fl-accent`, `--fl-danger`.
 * @example
 * const card = document.createElement('foldlens-station-card');
 * foldlens.addEventListener('stationclick', (e) => (card.station = foldlens.getStations()[e.detail.index]));
 */
export class FoldlensStationCard extends LitElement {
  static override properties = {
    station: { attribute: false },
    netPosition: { attribute: false },
  };

  station: Station | null = null;
  netPosition: { x: number; y: number } | null = null;

  static override styles = css`
    :host { display: block; font: 13px/1.4 var(--fl-font, system-ui, sans-serif); color: var(--fl-fg, #1d2326); }
    .card { background: var(--fl-bg, #fbfaf7); border: 1px solid var(--fl-border, #c9cdc8); border-radius: 6px; padding: 8px 10px; }
    header { display: flex; align-items: baseline; gap: 8px; }
    h3 { margin: 0; font-size: 14px; flex: 1; overflow-wrap: anywhere; }
    .attitude { font-size: 18px; font-variant-numeric: tabular-nums; margin: 4px 0; }
    dl { display: grid; grid-template-columns: max-content 1fr; gap: 1px 10px; margin: 6px 0 0; }
    dt { color: var(--fl-muted, #5b6469); }
    dd { margin: 0; overflow-wrap: anywhere; }
    .problem { color: var(--fl-danger, #b3261e); }
    button { font: inherit; border: 1px solid var(--fl-border, #c9cdc8); background: transparent; border-radius: 4px; cursor: pointer; }
    button:focus-visible { outline: 2px solid var(--fl-accent, #0b6e8a); outline-offset: 1px; }
    h4 { margin: 8px 0 2px; font-size: 12px; color: var(--fl-muted, #5b6469); text-transform: uppercase; letter-spacing: 0.05em; }
  `;

  private attitudeText(s: Station): string {
    if (s.plane) return `${pad(s.plane.dipDirection, 3)}/${pad(s.plane.dip, 2)}${s.plane.overturned ? ' overturned' : ''} (dip direction/dip)`;
    if (s.line) return `${pad(s.line.trend, 3)}/${pad(s.line.plunge, 2)}${s.line.sense && s.line.sense !== 'unknown' ? ` ${s.line.sense}` : ''} (trend/plunge)`;
    return 'no usable attitude';
  }

  override render() {
    const s = this.station;
    if (!s) return nothing;
    const kind = s.kind ? (KIND_LABELS[s.kind] ?? s.kind) : 'Unknown kind';
    return html`<section class="card" part="card" role="region" aria-label=${`Station ${s.id}`}>
      <header>
        <h3 part="title">${kind} · ${s.id}</h3>
        <button part="close" aria-label="Close station details" @click=${() => this.dispatchEvent(new CustomEvent('foldlens-close', { bubbles: true, composed: true }))}>×</button>
      </header>
      <div class="attitude">${this.attitudeText(s)}</div>
      ${s.problems.length ? html`<h4>Problems</h4>${s.problems.map((p) => html`<div class="problem">${describeProblem(p)}</div>`)}` : nothing}
      <h4>Corrections</h4>
      <div>${s.corrections?.length ? s.corrections.map((c) => html`<div>${c.type}: ${c.degrees >= 0 ? '+' : ''}${c.degrees.toFixed(2)}° (${c.source})</div>`) : 'none applied'}</div>
      <h4>Position</h4>
      <div>${s.lon !== undefined && s.lat !== undefined ? `${Math.abs(s.lat).toFixed(6)}° ${s.lat >= 0 ? 'N' : 'S'}, ${Math.abs(s.lon).toFixed(6)}° ${s.lon >= 0 ? 'E' : 'W'}` : 'no position'}${s.elevation !== undefined ? ` · ${s.elevation.toFixed(1)} m` : ''}</div>
      ${this.netPosition ? html`<div>On the net: x ${this.netPosition.x.toFixed(3)}, y ${this.netPosition.y.toFixed(3)}</div>` : nothing}
      <h4>As read (row ${s.row})</h4>
      <dl part="fields">
        ${Object.entries(s.source).map(([k, v]) => html`<dt>${k}</dt><dd>${v}</dd>`)}
      </dl>
    </section>`;
  }
}

defineOnce('foldlens-station-card', FoldlensStationCard);

declare global {
  interface HTMLElementTagNameMap {
    'foldlens-station-card': FoldlensStationCard;
  }
}
