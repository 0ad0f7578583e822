import type { Map as MapLibreMap } from 'maplibre-gl';
import type { Station } from '../core/station';
import { KIND_LABELS } from './symbolCatalog';

/** Detail of the `stationhover` events the tooltip follows (as {@link FoldlensOverlay} fires them). */
interface HoverDetail {
  readonly index: number;
  readonly station: Station | null;
}

const pad = (n: number, width: number): string => String(Math.round(n) % (width === 3 ? 360 : 1000)).padStart(width, '0');

/**
 * The lines a hover tooltip shows for a station: its id, then its kind and attitude, as plain
 * text (the caller puts them in the page with textContent, so an id like `<b>` stays literal).
 * @example
 * stationTooltipLines({ id: 'KR-7', row: 1, kind: 'bedding', plane: { dipDirection: 120, dip: 45 }, source: {}, problems: [] })
 * // ['KR-7', 'Bedding · 120/45 (dip direction/dip)']
 */
export function stationTooltipLines(station: Station): [string, string] {
  const kind = station.kind ? (KIND_LABELS[station.kind] ?? station.kind) : 'Unknown kind';
  let attitude = 'no usable attitude';
  if (station.plane) attitude = `${pad(station.plane.dipDirection, 3)}/${pad(station.plane.dip, 2)}${station.plane.overturned ? ' overturned' : ''} (dip direction/dip)`;
  else if (station.line) {
    const sense = station.line.sense && station.line.sense !== 'unknown' ? ` ${station.line.sense}` : '';
    attitude = `${pad(station.line.trend, 3)}/${pad(station.line.plunge, 2)}${sense} (trend/plunge)`;
  }
  return [station.id, `${kind} · ${attitude}`];
}

/** Gap between the station and the tooltip's nearest corner, CSS px. */
const GAP = 12;

/**
 * A small text tooltip over the map for the station under the pointer: id, kind, attitude.
 * It follows `stationhover` events of an overlay (index -1 hides it), sits beside the station
 * and moves with the map. Pointer users get it on hover; it repeats what the station card
 * shows on click or keyboard pick, so it is hidden from assistive technology (aria-hidden)
 * rather than announced on every mouse move. Text only: set with textContent, never as HTML.
 *
 * Styling: class `foldlens-tooltip` (see styles/foldlens.css) with the custom properties
 * `--fl-tooltip-bg`, `--fl-tooltip-fg`, `--fl-tooltip-border`; the id line has class
 * `foldlens-tooltip__id`.
 * @example
 * const tooltip = new StationTooltip(map, overlay); // overlay fires 'stationhover'
 * // later: tooltip.remove();
 */
export class StationTooltip {
  /** The tooltip element (in the map's container while attached). */
  readonly element: HTMLDivElement;
  private readonly map: MapLibreMap;
  private readonly events: EventTarget;
  private readonly idLine: HTMLElement;
  private readonly detailLine: HTMLElement;
  private station: Station | null = null;

  constructor(map: MapLibreMap, events: EventTarget) {
    this.map = map;
    this.events = events;
    const el = document.createElement('div');
    el.className = 'foldlens-tooltip';
    el.setAttribute('aria-hidden', 'true');
    // Placement essentials inline, so the tooltip works without the stylesheet; looks are in CSS.
    Object.assign(el.style, { position: 'absolute', left: '0', top: '0', pointerEvents: 'none', zIndex: '3', whiteSpace: 'nowrap' });
    el.hidden = true;
    this.idLine = el.appendChild(document.createElement('div'));
    this.idLine.className = 'foldlens-tooltip__id';
    this.detailLine = el.appendChild(document.createElement('div'));
    this.element = el;
    map.getContainer().appendChild(el);
    events.addEventListener('stationhover', this.onHover);
    map.on('move', this.place);
  }

  /** The station shown, or null when hidden. */
  get shown(): Station | null {
    return this.station;
  }

  /** Takes the tooltip off the map and stops listening. */
  remove(): void {
    this.events.removeEventListener('stationhover', this.onHover);
    this.map.off('move', this.place);
    this.element.remove();
    this.station = null;
  }

  private readonly onHover = (e: Event): void => {
    const { station } = (e as CustomEvent<HoverDetail>).detail;
    this.station = station && station.lon !== undefined && station.lat !== undefined ? station : null;
    if (!this.station) {
      this.element.hidden = true;
      return;
    }
    const [id, detail] = stationTooltipLines(this.station);
    this.idLine.textContent = id;
    this.detailLine.textContent = detail;
    this.element.hidden = false;
    this.place();
  };

  /** Beside the station, up and to the right, flipped to stay inside the map. */
  private readonly place = (): void => {
    const s = this.station;
    if (!s) return;
    // The copy of the station nearest the view's centre (a map panned across the antimeridian).
    const lon = s.lon! + 360 * Math.round((this.map.getCenter().lng - s.lon!) / 360);
    const p = this.map.project([lon, s.lat!]);
    const container = this.map.getContainer();
    const w = this.element.offsetWidth;
    const h = this.element.offsetHeight;
    let x = p.x + GAP;
    let y = p.y - GAP - h;
    if (x + w > container.clientWidth) x = p.x - GAP - w;
    if (y < 0) y = p.y + GAP;
    this.element.style.transform = `translate(${Math.round(Math.max(0, x))}px, ${Math.round(Math.max(0, y))}px)`;
  };
}
