/**
 * Looks of the net panel in one table, so the live component (CSS classes with custom
 * properties) and the exported SVG (inline styles, no stylesheet) cannot drift apart.
 *
 * Palette: Foldlens's own. Meaning is carried by shape first (dot, open triangle, square,
 * diamond, ring) and by colour second, so the net still reads for colour-blind users and in
 * greyscale print; hues differ in lightness as well as hue (common practice for
 * colour-blind-aware charts).
 */

/** What a drawn item is; each role has one style. */
export type NetRole =
  | 'face'
  | 'grid'
  | 'primitive'
  | 'tick'
  | 'north'
  | 'centre'
  | 'contour'
  | 'great-circle'
  | 'pole'
  | 'line'
  | 'girdle'
  | 'cone'
  | 'axial-plane'
  | 'axis'
  | 'beta'
  | 'limb'
  | 'highlight'
  | 'caption'
  | 'legend-text'
  | 'legend-title'
  | 'note';

/** Colour slots a host can restyle through `--fl-net-<slot>` custom properties. */
export const NET_PALETTE = {
  face: '#ffffff',
  ink: '#1d2326',
  muted: '#5b6469',
  grid: '#c9d0d3',
  pole: '#243b53',
  'great-circle': '#4d6a85',
  line: '#b35900',
  contour: '#0b6e8a',
  girdle: '#c22f26',
  axis: '#c22f26',
  beta: '#5b2a86',
  limb: '#1f7a45',
  highlight: '#e8a200',
  halo: '#ffffff',
} as const;

export type NetPaletteSlot = keyof typeof NET_PALETTE;
export type NetPalette = Readonly<Record<NetPaletteSlot, string>>;

/** A style in palette terms: colours name slots, numbers are in viewBox units. */
export interface NetStyleSpec {
  readonly fill?: NetPaletteSlot | 'none';
  readonly fillOpacity?: number;
  readonly stroke?: NetPaletteSlot | 'none';
  readonly strokeWidth?: number;
  readonly strokeOpacity?: number;
  readonly dash?: string;
  readonly linecap?: 'round' | 'butt';
  readonly linejoin?: 'round' | 'miter';
  readonly fontSize?: number;
  readonly fontWeight?: number;
  /** Paint the stroke under the fill (a halo behind text and markers). */
  readonly paintOrderStroke?: boolean;
}

/** Diameter (viewBox units) of a pole dot: the stroke width of a zero-length round-capped segment. */
export const POLE_DOT = 3.2;

export const NET_STYLES: Readonly<Record<NetRole, NetStyleSpec>> = {
  face: { fill: 'face', stroke: 'none' },
  grid: { fill: 'none', stroke: 'grid', strokeWidth: 0.6 },
  primitive: { fill: 'none', stroke: 'ink', strokeWidth: 1.4 },
  tick: { fill: 'none', stroke: 'ink', strokeWidth: 1.4 },
  north: { fill: 'ink', fontSize: 15, fontWeight: 600 },
  centre: { fill: 'none', stroke: 'ink', strokeWidth: 0.9 },
  // Each level is drawn over the last with a light fill (contourOpacities), so bands darken with density.
  contour: { fill: 'contour', fillOpacity: 0.12, stroke: 'contour', strokeWidth: 0.6, strokeOpacity: 0.75 },
  'great-circle': { fill: 'none', stroke: 'great-circle', strokeWidth: 0.7, strokeOpacity: 0.45 },
  pole: { fill: 'none', stroke: 'pole', strokeWidth: POLE_DOT, linecap: 'round' },
  line: { fill: 'face', stroke: 'line', strokeWidth: 1.5, linejoin: 'round' },
  girdle: { fill: 'none', stroke: 'girdle', strokeWidth: 1.6 },
  cone: { fill: 'none', stroke: 'axis', strokeWidth: 1.3, dash: '4 3' },
  'axial-plane': { fill: 'none', stroke: 'limb', strokeWidth: 1.4, dash: '7 4' },
  axis: { fill: 'axis', stroke: 'halo', strokeWidth: 1.5, paintOrderStroke: true },
  beta: { fill: 'halo', stroke: 'beta', strokeWidth: 2, linejoin: 'miter' },
  limb: { fill: 'limb', stroke: 'halo', strokeWidth: 1.5, paintOrderStroke: true },
  highlight: { fill: 'none', stroke: 'highlight', strokeWidth: 3 },
  caption: { fill: 'muted', fontSize: 11 },
  'legend-text': { fill: 'ink', fontSize: 11.5 },
  'legend-title': { fill: 'muted', fontSize: 10.5, fontWeight: 600 },
  note: { fill: 'ink', fontSize: 11, fontWeight: 600 },
};

/** Every role, in a stable order. */
export const NET_ROLES = Object.keys(NET_STYLES) as NetRole[];

/**
 * The style as SVG presentation properties (name, value), colours taken from `palette`.
 * @example styleDeclarations(NET_STYLES.girdle, NET_PALETTE) // [['fill', 'none'], ['stroke', '#c22f26'], ['stroke-width', '1.6px']]
 */
export function styleDeclarations(spec: NetStyleSpec, palette: NetPalette): [string, string][] {
  const colour = (c: NetPaletteSlot | 'none'): string => (c === 'none' ? 'none' : palette[c]);
  return declarations(spec, colour);
}

/**
 * CSS rules for every role, as `.r-<role> {...}`, colours as `var(--fl-net-<slot>, <default>)`
 * so a host page can restyle them.
 * @example roleCss().includes('.r-pole') // true
 */
export function roleCss(): string {
  const colour = (c: NetPaletteSlot | 'none'): string => (c === 'none' ? 'none' : `var(--fl-net-${c}, ${NET_PALETTE[c]})`);
  return NET_ROLES.map((role) => `.r-${role} { ${declarations(NET_STYLES[role], colour).map(([k, v]) => `${k}: ${v};`).join(' ')} }`).join('\n');
}

// Lengths carry "px" (user units inside an SVG) so the same text is valid CSS and a valid style attribute.
function declarations(spec: NetStyleSpec, colour: (c: NetPaletteSlot | 'none') => string): [string, string][] {
  const out: [string, string][] = [];
  if (spec.fill !== undefined) out.push(['fill', colour(spec.fill)]);
  if (spec.fillOpacity !== undefined) out.push(['fill-opacity', String(spec.fillOpacity)]);
  if (spec.stroke !== undefined) out.push(['stroke', colour(spec.stroke)]);
  if (spec.strokeWidth !== undefined) out.push(['stroke-width', `${spec.strokeWidth}px`]);
  if (spec.strokeOpacity !== undefined) out.push(['stroke-opacity', String(spec.strokeOpacity)]);
  if (spec.dash !== undefined) out.push(['stroke-dasharray', spec.dash]);
  if (spec.linecap !== undefined) out.push(['stroke-linecap', spec.linecap]);
  if (spec.linejoin !== undefined) out.push(['stroke-linejoin', spec.linejoin]);
  if (spec.fontSize !== undefined) out.push(['font-size', `${spec.fontSize}px`]);
  if (spec.fontWeight !== undefined) out.push(['font-weight', String(spec.fontWeight)]);
  if (spec.paintOrderStroke) out.push(['paint-order', 'stroke']);
  return out;
}

/**
 * Reads a palette from CSS custom properties (e.g. a computed style), keeping the defaults
 * for slots that are unset or not a plain colour. Values are checked against a strict colour
 * pattern because they end up inside exported files.
 * @example resolvePalette((name) => (name === '--fl-net-pole' ? '#000' : '')).pole // '#000'
 */
export function resolvePalette(read: (property: string) => string): NetPalette {
  const out: Record<string, string> = { ...NET_PALETTE };
  for (const slot of Object.keys(NET_PALETTE) as NetPaletteSlot[]) {
    const value = read(`--fl-net-${slot}`).trim();
    if (SAFE_COLOUR.test(value)) out[slot] = value;
  }
  return out as NetPalette;
}

/** Hex colours, rgb()/rgba()/hsl()/hsla() with plain numbers, or a bare colour keyword. */
const SAFE_COLOUR = /^(#[0-9a-fA-F]{3,8}|(rgb|rgba|hsl|hsla)\(\s*[0-9.,%\s/-]+\)|[a-zA-Z]{3,20})$/;

/** Fill opacity of the lowest and the highest contour band. */
export const CONTOUR_OPACITY = Object.freeze({ lowest: 0.12, highest: 0.6 });

/**
 * Fill opacities for `levels` contour regions drawn one over the other. `cumulative[i]` is how
 * opaque the band above level i looks (rising evenly from CONTOUR_OPACITY.lowest to .highest,
 * so poles stay visible in the densest band); `layer[i]` is the opacity to give region i so
 * that, composited over the regions below it, it reaches cumulative[i]:
 * 1 − (1 − c[i−1])(1 − a[i]) = c[i] (source-over compositing of one colour).
 * @example contourOpacities(2) // {layer: [0.12, 0.545...], cumulative: [0.12, 0.6]}
 */
export function contourOpacities(levels: number): { layer: number[]; cumulative: number[] } {
  if (!(Number.isInteger(levels) && levels >= 0)) throw new RangeError(`contourOpacities: ${String(levels)} levels; expected a whole number from 0`);
  const { lowest, highest } = CONTOUR_OPACITY;
  const cumulative = Array.from({ length: levels }, (_, i) => (levels === 1 ? lowest * 2 : lowest + ((highest - lowest) * i) / (levels - 1)));
  const layer = cumulative.map((c, i) => (i === 0 ? c : 1 - (1 - c) / (1 - cumulative[i - 1])));
  return { layer, cumulative };
}
