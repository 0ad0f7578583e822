/**
 * The net as a standalone SVG file: the same scene the panel draws, written with inline
 * styles (no stylesheet, no script, no event-handler attributes), plus a title block with the
 * selection, method, counts, date and the caution. Every piece of text is escaped for XML,
 * so data text (station labels, selection names) can never become markup.
 */
import { NET_LAYOUT, type NetLayout, type SceneItem, type SceneLayer } from './netScene';
import { NET_PALETTE, NET_STYLES, styleDeclarations, type NetPalette } from './netStyle';
import { coord } from './netPaths';

/** The caution printed on every export. */
export const EXPORT_CAUTION = 'Results are aids to interpretation; check in the field and defer to local codes and licensed professional practice.';

/** Text of the title block under the net. */
export interface SvgTitleBlock {
  /** What was selected, as the user named it (data text: escaped). */
  readonly selection: string;
  /** How the numbers were obtained, in a sentence or two. */
  readonly method: string;
  readonly planes: number;
  readonly lines: number;
  /** Date of the export, e.g. an ISO date. */
  readonly date: string;
  /** Short result line, e.g. "Fold axis (π) 040/25 · 95% cone 3.1°". */
  readonly result?: string;
}

/** Options of `sceneToSvg`. */
export interface SceneToSvgOptions {
  readonly layout?: NetLayout;
  readonly palette?: NetPalette;
  readonly titleBlock?: SvgTitleBlock;
  /** Text for the SVG's <title> and aria-label. */
  readonly label?: string;
  /** Font stack written on the root element. */
  readonly font?: string;
}

/** Title-block text: 11 px, about 6.6 px per character at most (bold system sans; measured here), 15 px lines. */
const CHAR_WIDTH = 6.6;
const LINE_HEIGHT = 15;

/**
 * Escapes text for XML character data and attribute values.
 * @example escapeXml('<img src=x onerror=alert(1)>') // '&lt;img src=x onerror=alert(1)&gt;'
 */
export function escapeXml(text: string): string {
  return String(text)
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/"/g, '&quot;')
    .replace(/'/g, '&apos;')
    // Control characters and U+FFFE/U+FFFF are not allowed in XML 1.0 (its Char production):
    // one would leave the file unreadable, so show them as the replacement sign.
    .replace(/[\u0000-\u0008\u000B\u000C\u000E-\u001F\uFFFE\uFFFF]/g, '\uFFFD');
}

/**
 * Breaks text into lines of at most `width` characters at spaces (a word longer than the
 * line is split). Nothing but white space is dropped: for words that fit a line, joining the
 * lines with single spaces gives the text back with each run of white space made one space.
 * @example wrapText('a bb ccc', 4) // ['a bb', 'ccc']
 */
export function wrapText(text: string, width: number): string[] {
  if (!(Number.isInteger(width) && width > 0)) throw new RangeError(`wrapText: width ${String(width)} is not usable; expected a whole number of characters from 1`);
  const lines: string[] = [];
  let current = '';
  for (const word of String(text).split(/\s+/).filter((w) => w !== '')) {
    let w = word;
    while (w.length > width) {
      if (current !== '') {
        lines.push(current);
        current = '';
      }
      lines.push(w.slice(0, width));
      w = w.slice(width);
    }
    if (current === '') current = w;
    else if (current.length + 1 + w.length <= width) current += ` ${w}`;
    else {
      lines.push(current);
      current = w;
    }
  }
  if (current !== '') lines.push(current);
  return lines;
}

/**
 * Title-block lines of at most `width` characters: heading, counts and date, result, method, caution.
 * @example titleBlockLines({selection: 'Ridge', method: 'Pi axis', planes: 3, lines: 0, date: '2025-06-01'})[0] // 'Foldlens net: Ridge'
 */
export function titleBlockLines(t: SvgTitleBlock, width = 80): { text: string; strong: boolean }[] {
  const out: { text: string; strong: boolean }[] = [];
  const add = (text: string, strong = false): void => wrapText(text, width).forEach((line) => out.push({ text: line, strong }));
  add(`Foldlens net: ${t.selection === '' ? 'unnamed selection' : t.selection}`, true);
  add(`${count(t.planes, 'plane')}, ${count(t.lines, 'line')} · exported ${t.date}`);
  if (t.result) add(t.result);
  add(`Method: ${t.method}`);
  add(EXPORT_CAUTION, true);
  return out;
}

/**
 * Writes scene layers as a standalone SVG document (a string).
 * @example sceneToSvg(frameLayers('equal-area', true)).startsWith('<svg xmlns="http://www.w3.org/2000/svg"') // true
 */
export function sceneToSvg(layers: readonly SceneLayer[], options: SceneToSvgOptions = {}): string {
  const layout = options.layout ?? NET_LAYOUT;
  const palette = options.palette ?? NET_PALETTE;
  const font = options.font ?? 'system-ui, -apple-system, Segoe UI, Roboto, sans-serif';
  const title = options.titleBlock ? titleBlockLines(options.titleBlock, Math.max(20, Math.floor((layout.width - 24) / CHAR_WIDTH))) : [];
  const height = layout.height + (title.length ? 14 + title.length * LINE_HEIGHT : 0);
  const f = layout.frame;
  const out: string[] = [];
  const label = escapeXml(options.label ?? 'Foldlens net');
  out.push(
    `<svg xmlns="http://www.w3.org/2000/svg" width="${layout.width}" height="${height}" viewBox="0 0 ${layout.width} ${height}" role="img" aria-label="${label}" font-family="${escapeXml(font)}">`,
    `<title>${label}</title>`,
    `<defs><clipPath id="fl-net-clip"><circle cx="${coord(f.cx)}" cy="${coord(f.cy)}" r="${coord(f.r)}"/></clipPath></defs>`,
    `<rect x="0" y="0" width="${layout.width}" height="${height}" style="fill: ${escapeXml(palette.face)}; stroke: none"/>`,
  );
  for (const layer of layers) {
    out.push(`<g data-layer="${escapeXml(layer.id)}"${layer.clip ? ' clip-path="url(#fl-net-clip)"' : ''}>`);
    for (const item of layer.items) out.push(itemToSvg(item, palette));
    out.push('</g>');
  }
  if (title.length) {
    const x = 12;
    let y = layout.height + 14;
    out.push(`<g data-layer="title-block"><path d="M${x} ${layout.height + 2}H${layout.width - 12}" style="stroke: ${escapeXml(palette.grid)}; stroke-width: 1"/>`);
    for (const line of title) {
      out.push(`<text x="${x}" y="${y}" style="fill: ${escapeXml(palette.ink)}; font-size: 11px${line.strong ? '; font-weight: 600' : ''}">${escapeXml(line.text)}</text>`);
      y += LINE_HEIGHT;
    }
    out.push('</g>');
  }
  out.push('</svg>');
  return out.join('\n');
}

function itemToSvg(item: SceneItem, palette: NetPalette): string {
  const style = styleDeclarations(NET_STYLES[item.role], palette);
  if (item.type === 'text') {
    const css = style.map(([k, v]) => `${k}: ${v}`).join('; ');
    return `<text x="${coord(item.x)}" y="${coord(item.y)}" text-anchor="${item.anchor}" style="${escapeXml(css)}"${nameAttr(item.name)}>${escapeXml(item.text)}</text>`;
  }
  const override = (key: string, v: string | undefined): void => {
    if (v === undefined) return;
    const i = style.findIndex(([k]) => k === key);
    if (i >= 0) style.splice(i, 1);
    style.push([key, v]);
  };
  override('fill-opacity', item.fillOpacity === undefined ? undefined : String(item.fillOpacity));
  override('stroke-width', item.strokeWidth === undefined ? undefined : `${item.strokeWidth}px`);
  override('stroke-opacity', item.strokeOpacity === undefined ? undefined : String(item.strokeOpacity));
  const css = style.map(([k, v]) => `${k}: ${v}`).join('; ');
  const transform = item.at
    ? ` transform="translate(${coord(item.at.x)} ${coord(item.at.y)})"`
    : item.scale !== undefined
      ? ` transform="scale(${item.scale})"`
      : '';
  const rule = item.fillRule ? ` fill-rule="${item.fillRule}"` : '';
  const open = `<path d="${escapeXml(item.d)}" style="${escapeXml(css)}"${transform}${rule}${nameAttr(item.name)}`;
  return item.title ? `${open}><title>${escapeXml(item.title)}</title></path>` : `${open}/>`;
}

function nameAttr(name: string | undefined): string {
  return name ? ` data-name="${escapeXml(name)}"` : '';
}

function count(n: number, word: string): string {
  const v = Number.isFinite(n) ? Math.round(n) : 0;
  return `${v} ${word}${v === 1 ? '' : 's'}`;
}
