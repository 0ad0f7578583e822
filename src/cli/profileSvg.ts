import { extentOfTriples, layoutProfile, toDrawing, type Extent } from '../core/profileLayout';

/**
 * A standalone SVG of a down-plunge profile at true scale: linework as polylines, planes as
 * apparent-dip ticks, lines as dots, everything coloured by its distance along the axis, with a
 * scale bar and a title block (title, axis, view, method, date, caution). Every piece of data
 * text is escaped; the file holds no script and loads nothing.
 */

/** A station as drawn. */
export interface DrawnStation {
  readonly id: string;
  readonly kind: string;
  readonly x: number;
  readonly y: number;
  readonly depth: number;
  /** Unit direction of a plane's trace (profile right, up); absent for lines. */
  readonly trace?: { readonly dx: number; readonly dy: number };
}

/** A run of linework as drawn: (x', y', depth) triples. */
export interface DrawnLine {
  readonly label: string;
  readonly points: Float64Array;
}

/** Everything the drawing shows. */
export interface ProfileDrawing {
  readonly title: string;
  /** Lines of the title block, in order (axis, view, method, frame, date...). */
  readonly notes: readonly string[];
  readonly caution: string;
  readonly stations: readonly DrawnStation[];
  readonly lines: readonly DrawnLine[];
}

/** Our own two-colour ramp for distance along the axis: near (up-plunge) to far (down-plunge). */
const NEAR: readonly [number, number, number] = [0x1b, 0x6f, 0x8a];
const FAR: readonly [number, number, number] = [0xc2, 0x57, 0x1a];

/**
 * Escapes text for SVG/XML content and attribute values. Characters XML 1.0 does not allow
 * (control characters, U+FFFE, U+FFFF) become the replacement sign, so the file stays readable.
 * @example escapeXml('<b> & "x"') // '&lt;b&gt; &amp; &quot;x&quot;'
 */
export function escapeXml(text: string): string {
  return text
    .replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!)
    .replace(/[\u0000-\u0008\u000B\u000C\u000E-\u001F\uFFFE\uFFFF]/g, '\uFFFD');
}

/**
 * The SVG text of a profile drawing.
 * @example writeFileSync('profile.svg', profileSvg(drawing))
 */
export function profileSvg(d: ProfileDrawing): string {
  let extent: Extent | null = null;
  for (const l of d.lines) extent = extentOfTriples(l.points, extent);
  const stationTriples = new Float64Array(d.stations.flatMap((s) => [s.x, s.y, s.depth]));
  extent = extentOfTriples(stationTriples, extent) ?? { minX: 0, minY: 0, maxX: 1, maxY: 1 };
  const layout = layoutProfile(extent);
  const [dMin, dMax] = depthRange(d);
  const colour = (depth: number): string => rampColour(dMax > dMin ? (depth - dMin) / (dMax - dMin) : 0.5);
  const f = (v: number): string => (Math.round(v * 100) / 100).toString();
  const { left, top, width, height } = layout.plot;
  const svgWidth = Math.max(left * 2 + width, 720);
  const blockTop = top + height + 56;
  const lineHeight = 16;
  // About 6.2 px per character of 12 px sans-serif: wrap the title block to the drawing's width.
  const maxChars = Math.max(40, Math.floor((svgWidth - 2 * left) / 6.2));
  const noteLines = d.notes.flatMap((n) => wrapText(n, maxChars));
  const cautionLines = wrapText(d.caution, maxChars);
  const svgHeight = blockTop + (noteLines.length + cautionLines.length + 1) * lineHeight + 28;

  const out: string[] = [];
  out.push(
    `<svg xmlns="http://www.w3.org/2000/svg" width="${f(svgWidth)}" height="${f(svgHeight)}" viewBox="0 0 ${f(svgWidth)} ${f(svgHeight)}" role="img" aria-labelledby="fl-title fl-desc" font-family="sans-serif" font-size="12">`,
  );
  out.push(`<title id="fl-title">${escapeXml(d.title)}</title>`);
  out.push(`<desc id="fl-desc">${escapeXml([...d.notes, d.caution].join(' '))}</desc>`);
  out.push(
    `<defs><linearGradient id="fl-depth" x1="0" x2="1" y1="0" y2="0"><stop offset="0" stop-color="${rampColour(0)}"/><stop offset="1" stop-color="${rampColour(1)}"/></linearGradient></defs>`,
  );
  out.push(`<rect x="0" y="0" width="${f(svgWidth)}" height="${f(svgHeight)}" fill="#ffffff"/>`);
  out.push(`<rect x="${f(left)}" y="${f(top)}" width="${f(width)}" height="${f(height)}" fill="#fbfaf7" stroke="#8a8a8a" stroke-width="1"/>`);

  out.push('<g fill="none" stroke-width="1.6" stroke-linejoin="round" stroke-linecap="round">');
  for (const l of d.lines) {
    const pts: string[] = [];
    let depthSum = 0;
    let count = 0;
    for (let i = 0; i + 2 < l.points.length; i += 3) {
      if (!Number.isFinite(l.points[i]) || !Number.isFinite(l.points[i + 1])) continue;
      const [px, py] = toDrawing(layout, l.points[i], l.points[i + 1]);
      pts.push(`${f(px)},${f(py)}`);
      depthSum += l.points[i + 2];
      count++;
    }
    if (count === 0) continue;
    const stroke = colour(depthSum / count);
    if (count === 1) {
      const [px, py] = pts[0].split(',');
      out.push(`<circle cx="${px}" cy="${py}" r="1.5" fill="${stroke}" stroke="none"><title>${escapeXml(l.label)}</title></circle>`);
    } else out.push(`<polyline points="${pts.join(' ')}" stroke="${stroke}"><title>${escapeXml(l.label)}</title></polyline>`);
  }
  out.push('</g>');

  const tick = 9;
  out.push('<g stroke-width="2" stroke-linecap="round">');
  for (const s of d.stations) {
    const [px, py] = toDrawing(layout, s.x, s.y);
    const c = colour(s.depth);
    const label = `<title>${escapeXml(`${s.id} (${s.kind})`)}</title>`;
    if (s.trace) {
      // Drawing y grows downward, so the trace's up component changes sign.
      const ex = s.trace.dx * tick;
      const ey = -s.trace.dy * tick;
      out.push(`<line x1="${f(px - ex)}" y1="${f(py - ey)}" x2="${f(px + ex)}" y2="${f(py + ey)}" stroke="${c}">${label}</line>`);
    } else out.push(`<circle cx="${f(px)}" cy="${f(py)}" r="3.2" fill="${c}" stroke="#1d1d1d" stroke-width="0.6">${label}</circle>`);
  }
  out.push('</g>');

  // Scale bar, lower left inside the frame.
  const sbX = left + 12;
  const sbY = top + height - 14;
  const sbL = layout.scaleBar.length;
  out.push('<g stroke="#1d1d1d" stroke-width="1.5" fill="#1d1d1d">');
  out.push(`<line x1="${f(sbX)}" y1="${f(sbY)}" x2="${f(sbX + sbL)}" y2="${f(sbY)}"/>`);
  out.push(`<line x1="${f(sbX)}" y1="${f(sbY - 4)}" x2="${f(sbX)}" y2="${f(sbY + 4)}"/>`);
  out.push(`<line x1="${f(sbX + sbL)}" y1="${f(sbY - 4)}" x2="${f(sbX + sbL)}" y2="${f(sbY + 4)}"/>`);
  out.push(`<text x="${f(sbX + sbL / 2)}" y="${f(sbY - 7)}" text-anchor="middle" stroke="none">${escapeXml(formatMetres(layout.scaleBar.metres))}</text>`);
  out.push('</g>');

  // Depth legend under the frame.
  const lgY = top + height + 14;
  out.push(`<rect x="${f(left)}" y="${f(lgY)}" width="160" height="10" fill="url(#fl-depth)" stroke="#8a8a8a" stroke-width="0.5"/>`);
  out.push(
    `<text x="${f(left + 170)}" y="${f(lgY + 9)}">${escapeXml(`Colour: distance along the axis, ${formatMetres(dMin)} (near, up-plunge) to ${formatMetres(dMax)} (far, down-plunge)`)}</text>`,
  );

  // Title block.
  out.push(`<g transform="translate(${f(left)} ${f(blockTop)})">`);
  out.push(`<text x="0" y="0" font-size="15" font-weight="bold">${escapeXml(d.title)}</text>`);
  noteLines.forEach((n, i) => out.push(`<text x="0" y="${f((i + 1) * lineHeight + 4)}">${escapeXml(n)}</text>`));
  cautionLines.forEach((c, i) => out.push(`<text x="0" y="${f((noteLines.length + 1 + i) * lineHeight + 8)}" font-style="italic">${escapeXml(c)}</text>`));
  out.push('</g>');
  out.push('</svg>');
  return `${out.join('\n')}\n`;
}

/** Splits text at spaces into lines of at most `max` characters (a longer word gets a line of its own). */
function wrapText(text: string, max: number): string[] {
  const lines: string[] = [];
  let line = '';
  for (const word of text.split(/\s+/).filter(Boolean)) {
    if (line !== '' && line.length + 1 + word.length > max) {
      lines.push(line);
      line = word;
    } else line = line === '' ? word : `${line} ${word}`;
  }
  if (line !== '') lines.push(line);
  return lines;
}

function depthRange(d: ProfileDrawing): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  const take = (v: number): void => {
    if (!Number.isFinite(v)) return;
    lo = Math.min(lo, v);
    hi = Math.max(hi, v);
  };
  for (const s of d.stations) take(s.depth);
  for (const l of d.lines) for (let i = 2; i < l.points.length; i += 3) take(l.points[i]);
  return lo <= hi ? [lo, hi] : [0, 0];
}

function rampColour(t: number): string {
  const k = Math.min(1, Math.max(0, t));
  return `#${NEAR.map((c, i) => Math.round(c + (FAR[i] - c) * k).toString(16).padStart(2, '0')).join('')}`;
}

function formatMetres(m: number): string {
  if (Math.abs(m) >= 1000 && Math.abs(m) % 1000 === 0) return `${m / 1000} km`;
  return `${Math.round(m)} m`;
}
