/**
 * The profile as a standalone SVG file: the scene the panel draws, with inline styles (no
 * stylesheet, no script, no event-handler attributes, no links), the plot clipped to its frame,
 * and a title block under it (domain, axis, date, view, method, stations left out, caution).
 * Every piece of text goes through escapeXml (net/exportSvg.ts), so data text such as contact
 * names or station ids can never become markup.
 */
import { escapeXml, wrapText } from '../net/exportSvg';
import type { SceneItem, SceneLayer } from './profileScene';
import { PROFILE_PALETTE, PROFILE_STYLES, isSafeColour, styleDeclarations, type ProfilePalette } from './profileStyle';
import type { ProfileLayout } from './profileView';
import { c1 } from './profilePaths';

/** Options of {@link profileSceneToSvg}. */
export interface ProfileSvgOptions {
  readonly layout: ProfileLayout;
  readonly palette?: ProfilePalette;
  /** Text for the SVG's <title> and aria-label. */
  readonly label: string;
  /** Lines of the title block (profileText.ts, profileTitleBlock). */
  readonly titleBlock?: readonly { readonly text: string; readonly strong: boolean }[];
  readonly font?: string;
}

/** Title-block text: 11 px, at most about 6.6 px per character; 15 px lines (as the net's export). */
const CHAR_WIDTH = 6.6;
const LINE_HEIGHT = 15;

/**
 * Writes scene layers (built with the zoomed map: see profileScene.ts) as an SVG document.
 * @example profileSceneToSvg([faceLayer(layout)], { layout, label: 'Profile' }).startsWith('<svg xmlns="http://www.w3.org/2000/svg"') // true
 */
export function profileSceneToSvg(layers: readonly SceneLayer[], o: ProfileSvgOptions): string {
  const { layout } = o;
  const palette = o.palette ?? PROFILE_PALETTE;
  const font = o.font ?? 'system-ui, -apple-system, Segoe UI, Roboto, sans-serif';
  const width = Math.max(20, Math.floor((layout.width - 24) / CHAR_WIDTH));
  const block = (o.titleBlock ?? []).flatMap((line) => wrapText(line.text, width).map((text) => ({ text, strong: line.strong })));
  const height = layout.height + (block.length ? 16 + block.length * LINE_HEIGHT : 0);
  const label = escapeXml(o.label);
  const p = layout.plot;
  const out: string[] = [
    `<svg xmlns="http://www.w3.org/2000/svg" width="${layout.width}" height="${c1(height)}" viewBox="0 0 ${layout.width} ${c1(height)}" role="img" aria-label="${label}" font-family="${escapeXml(font)}">`,
    `<title>${label}</title>`,
    `<defs><clipPath id="fl-profile-clip"><rect x="${c1(p.left)}" y="${c1(p.top)}" width="${c1(p.width)}" height="${c1(p.height)}"/></clipPath></defs>`,
    `<rect x="0" y="0" width="${layout.width}" height="${c1(height)}" style="fill: ${escapeXml(palette.halo)}; stroke: none"/>`,
  ];
  for (const layer of layers) {
    out.push(`<g data-layer="${escapeXml(layer.id)}"${layer.clip ? ' clip-path="url(#fl-profile-clip)"' : ''}>`);
    for (const item of layer.items) out.push(itemToSvg(item, palette));
    out.push('</g>');
  }
  if (block.length) {
    const x = 12;
    let y = layout.height + 16;
    out.push(`<g data-layer="title-block"><path d="M${x} ${c1(layout.height + 2)}H${layout.width - 12}" style="stroke: ${escapeXml(palette.frame)}; stroke-width: 1px"/>`);
    for (const line of block) {
      out.push(`<text x="${x}" y="${c1(y)}" style="fill: ${escapeXml(palette.ink)}; font-size: 11px${line.strong ? '; font-weight: 600' : ''}">${escapeXml(line.text)}</text>`);
      y += LINE_HEIGHT;
    }
    out.push('</g>');
  }
  out.push('</svg>');
  return out.join('\n');
}

/**
 * The inline style of an item: its role's declarations with the item's own colour and dash
 * (checked: only plain colours and numeric dash lists reach the file).
 * @example itemStyle({ type: 'path', role: 'contact', d: '', stroke: '#1d5f8f' }, PROFILE_PALETTE).includes('stroke: #1d5f8f') // true
 */
export function itemStyle(item: SceneItem, palette: ProfilePalette): string {
  const style = styleDeclarations(PROFILE_STYLES[item.role], palette);
  const set = (key: string, value: string | undefined, ok: (v: string) => boolean): void => {
    if (value === undefined || !ok(value)) return;
    const i = style.findIndex(([k]) => k === key);
    if (i >= 0) style.splice(i, 1);
    style.push([key, value]);
  };
  if (item.type === 'path') {
    set('stroke', item.stroke, (v) => v === 'none' || isSafeColour(v));
    set('fill', item.fill, (v) => v === 'none' || isSafeColour(v));
    set('stroke-dasharray', item.dash, (v) => /^[0-9.\s]+$/.test(v));
  }
  return style.map(([k, v]) => `${k}: ${v}`).join('; ');
}

function itemToSvg(item: SceneItem, palette: ProfilePalette): string {
  const style = escapeXml(itemStyle(item, palette));
  const name = item.name ? ` data-name="${escapeXml(item.name)}"` : '';
  if (item.type === 'text') {
    return `<text x="${c1(item.x)}" y="${c1(item.y)}" text-anchor="${item.anchor}" style="${style}"${name}>${escapeXml(item.text)}</text>`;
  }
  const open = `<path d="${escapeXml(item.d)}" style="${style}"${name}`;
  return item.title ? `${open}><title>${escapeXml(item.title)}</title></path>` : `${open}/>`;
}
