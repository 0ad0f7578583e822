/**
 * Looks of the profile panel in one table, shared by the live component (CSS classes with
 * custom properties) and the exported SVG (inline styles), so the two cannot drift apart.
 *
 * Colours are Foldlens's own. Distance along the axis uses a sequential ramp whose lightness
 * rises steadily from near (dark indigo) to far (ochre): order is read from lightness alone,
 * which survives every common colour-vision deficiency and greyscale print, and the blue to
 * yellow hue run is the one axis that protan and deutan vision keep (common practice for
 * colour-blind-aware sequential ramps). Every colour keeps at least 3:1 contrast against the
 * white face (WCAG 2.1, success criterion 1.4.11, non-text contrast). Contact layers differ in
 * colour AND, from the third on, in dash pattern, so they stay apart without colour.
 */

/** What a drawn item is; each role has one style. */
export type ProfileRole =
  | 'face'
  | 'frame'
  | 'topography'
  | 'contact'
  | 'fault'
  | 'tick'
  | 'dot'
  | 'dot-halo'
  | 'untraced'
  | 'highlight'
  | 'hover'
  | 'axis-mark'
  | 'scale-bar'
  | 'scale-halo'
  | 'scale-text'
  | 'annotation'
  | 'edge-label'
  | 'legend-title'
  | 'legend-text'
  | 'legend-swatch'
  | 'note';

/** Colour slots a host can restyle through `--fl-profile-<slot>` custom properties. */
export const PROFILE_PALETTE = {
  face: '#ffffff',
  ink: '#1d2326',
  muted: '#5b6469',
  frame: '#8a9296',
  topography: '#7a6a55',
  contact: '#3a3f44',
  fault: '#8f2323',
  station: '#1d2326',
  highlight: '#e8a200',
  halo: '#ffffff',
} as const;

export type ProfilePaletteSlot = keyof typeof PROFILE_PALETTE;
export type ProfilePalette = Readonly<Record<ProfilePaletteSlot, string>>;

/** A style in palette terms: colours name slots, lengths are viewBox units. */
export interface ProfileStyleSpec {
  readonly fill?: ProfilePaletteSlot | 'none';
  readonly fillOpacity?: number;
  readonly stroke?: ProfilePaletteSlot | 'none';
  readonly strokeWidth?: number;
  readonly strokeOpacity?: number;
  readonly linecap?: 'round' | 'butt';
  readonly linejoin?: 'round' | 'miter';
  readonly fontSize?: number;
  readonly fontWeight?: number;
  readonly fontStyle?: 'italic';
  /** Paint the stroke under the fill (a halo behind text). */
  readonly paintOrderStroke?: boolean;
}

/** Diameter (viewBox units) of a line-station dot: the stroke width of a zero-length round-capped segment. */
export const DOT_DIAMETER = 5;

/** Half-length (viewBox units) of a plane's apparent-dip tick. */
export const TICK_HALF_LENGTH = 6;

export const PROFILE_STYLES: Readonly<Record<ProfileRole, ProfileStyleSpec>> = {
  face: { fill: 'face', stroke: 'none' },
  frame: { fill: 'none', stroke: 'frame', strokeWidth: 1 },
  topography: { fill: 'none', stroke: 'topography', strokeWidth: 1.3, linejoin: 'round' },
  contact: { fill: 'none', stroke: 'contact', strokeWidth: 1.8, linejoin: 'round', linecap: 'round' },
  fault: { fill: 'none', stroke: 'fault', strokeWidth: 2.4, linejoin: 'round', linecap: 'round' },
  tick: { fill: 'none', stroke: 'station', strokeWidth: 1.3, linecap: 'round' },
  dot: { fill: 'none', stroke: 'station', strokeWidth: DOT_DIAMETER, linecap: 'round' },
  'dot-halo': { fill: 'none', stroke: 'halo', strokeWidth: DOT_DIAMETER + 2.4, linecap: 'round' },
  untraced: { fill: 'none', stroke: 'station', strokeWidth: 1.2 },
  highlight: { fill: 'none', stroke: 'highlight', strokeWidth: 3 },
  hover: { fill: 'none', stroke: 'ink', strokeWidth: 1.5 },
  'axis-mark': { fill: 'none', stroke: 'ink', strokeWidth: 1.4, linecap: 'round', linejoin: 'round' },
  'scale-bar': { fill: 'none', stroke: 'ink', strokeWidth: 1.6, linecap: 'butt' },
  'scale-halo': { fill: 'halo', fillOpacity: 0.85, stroke: 'none' },
  'scale-text': { fill: 'ink', fontSize: 11.5 },
  annotation: { fill: 'ink', fontSize: 13, fontWeight: 600 },
  'edge-label': { fill: 'muted', fontSize: 11.5 },
  'legend-title': { fill: 'muted', fontSize: 10.5, fontWeight: 600 },
  'legend-text': { fill: 'ink', fontSize: 11.5 },
  'legend-swatch': { fill: 'none', stroke: 'ink', strokeWidth: 1.6, linecap: 'round' },
  note: { fill: 'muted', fontSize: 11, fontStyle: 'italic' },
};

/** Every role, in a stable order. */
export const PROFILE_ROLES = Object.keys(PROFILE_STYLES) as ProfileRole[];

/** Stops of the distance ramp, near (up-plunge) to far (down-plunge); lightness rises along it. */
export const DISTANCE_RAMP_STOPS: readonly string[] = Object.freeze(['#25275c', '#22598d', '#17818a', '#5f9146', '#b98a2c']);

/** Colours of contact layers, in order of first appearance; with CONTACT_DASHES they repeat after six. */
export const CONTACT_COLOURS: readonly string[] = Object.freeze(['#1d5f8f', '#b5541c', '#2e7d4a', '#6e4a9e', '#8a6d12', '#3a3f44']);

/** Dash patterns of contact layers (viewBox units); the first two are solid. */
export const CONTACT_DASHES: readonly string[] = Object.freeze(['', '', '6 3', '2 2.5', '9 3 2 3', '4 2 1 2']);

/**
 * Colour of the distance ramp at t in [0, 1] (clamped; NaN gives the middle), interpolated in
 * sRGB between DISTANCE_RAMP_STOPS.
 * @example distanceColour(0) // '#25275c' (near)
 */
export function distanceColour(t: number): string {
  const k = Number.isFinite(t) ? Math.min(1, Math.max(0, t)) : 0.5;
  const n = DISTANCE_RAMP_STOPS.length - 1;
  const i = Math.min(n - 1, Math.floor(k * n));
  const u = k * n - i;
  const a = hexToRgb(DISTANCE_RAMP_STOPS[i]);
  const b = hexToRgb(DISTANCE_RAMP_STOPS[i + 1]);
  return `#${a.map((c, j) => Math.round(c + (b[j] - c) * u).toString(16).padStart(2, '0')).join('')}`;
}

/**
 * Colour and dash of the k-th contact layer (0-based).
 * @example contactStyle(2) // { colour: '#2e7d4a', dash: '6 3' }
 */
export function contactStyle(k: number): { colour: string; dash: string } {
  const i = Number.isInteger(k) && k >= 0 ? k % CONTACT_COLOURS.length : 0;
  return { colour: CONTACT_COLOURS[i], dash: CONTACT_DASHES[i] };
}

/**
 * The style as SVG presentation properties (name, value), colours taken from `palette`.
 * @example styleDeclarations(PROFILE_STYLES.fault, PROFILE_PALETTE) // [['fill', 'none'], ['stroke', '#8f2323'], ...]
 */
export function styleDeclarations(spec: ProfileStyleSpec, palette: ProfilePalette): [string, string][] {
  return declarations(spec, (c) => (c === 'none' ? 'none' : palette[c]));
}

/**
 * CSS rules for every role, `.p-<role> {...}`, colours as `var(--fl-profile-<slot>, <default>)`.
 * @example profileRoleCss().includes('.p-tick') // true
 */
export function profileRoleCss(): string {
  const colour = (c: ProfilePaletteSlot | 'none'): string => (c === 'none' ? 'none' : `var(--fl-profile-${c}, ${PROFILE_PALETTE[c]})`);
  return PROFILE_ROLES.map((role) => `.p-${role} { ${declarations(PROFILE_STYLES[role], colour).map(([k, v]) => `${k}: ${v};`).join(' ')} }`).join('\n');
}

/**
 * Reads a palette from CSS custom properties, keeping the defaults for slots that are unset or
 * not a plain colour (values end up inside exported files, so they are checked strictly).
 * @example resolveProfilePalette((name) => (name === '--fl-profile-fault' ? '#000' : '')).fault // '#000'
 */
export function resolveProfilePalette(read: (property: string) => string): ProfilePalette {
  const out: Record<string, string> = { ...PROFILE_PALETTE };
  for (const slot of Object.keys(PROFILE_PALETTE) as ProfilePaletteSlot[]) {
    const value = read(`--fl-profile-${slot}`).trim();
    if (SAFE_COLOUR.test(value)) out[slot] = value;
  }
  return out as ProfilePalette;
}

/**
 * Whether a string is a plain colour safe to write into a style attribute.
 * @example isSafeColour('#1d5f8f') // true
 */
export function isSafeColour(value: string): boolean {
  return SAFE_COLOUR.test(value);
}

/** Hex colours, rgb()/rgba()/hsl()/hsla() with plain numbers, or a bare colour keyword. */
const SAFE_COLOUR = /^(#[0-9a-fA-F]{3,8}|(rgb|rgba|hsl|hsla)\(\s*[0-9.,%\s/-]+\)|[a-zA-Z]{3,20})$/;

// Lengths carry "px" (user units inside an SVG) so the same text is valid CSS and a valid style attribute.
function declarations(spec: ProfileStyleSpec, colour: (c: ProfilePaletteSlot | 'none') => string): [string, string][] {
  const out: [string, string][] = [];
  if (spec.fill !== undefined) out.push(['fill', colour(spec.fill)]);
  if (spec.fillOpacity !== undefined) out.push(['fill-opacity', String(spec.fillOpacity)]);
  if (spec.stroke !== undefined) out.push(['stroke', colour(spec.stroke)]);
  if (spec.strokeWidth !== undefined) out.push(['stroke-width', `${spec.strokeWidth}px`]);
  if (spec.strokeOpacity !== undefined) out.push(['stroke-opacity', String(spec.strokeOpacity)]);
  if (spec.linecap !== undefined) out.push(['stroke-linecap', spec.linecap]);
  if (spec.linejoin !== undefined) out.push(['stroke-linejoin', spec.linejoin]);
  if (spec.fontSize !== undefined) out.push(['font-size', `${spec.fontSize}px`]);
  if (spec.fontWeight !== undefined) out.push(['font-weight', String(spec.fontWeight)]);
  if (spec.fontStyle !== undefined) out.push(['font-style', spec.fontStyle]);
  if (spec.paintOrderStroke) out.push(['paint-order', 'stroke']);
  return out;
}

function hexToRgb(hex: string): [number, number, number] {
  const v = Number.parseInt(hex.slice(1), 16);
  return [(v >> 16) & 255, (v >> 8) & 255, v & 255];
}
