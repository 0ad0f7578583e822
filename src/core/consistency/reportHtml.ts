import { greatCirclePath } from '../geometry';
import { projectLine, projectVector } from '../netProjection';
import type { Line, Plane } from '../types';
import type { ClosureCheck } from './closures';
import type { DomainCheck } from './domainCheck';
import type { ConsistencyReport, FieldReport } from './report';

/**
 * The consistency report as one printable HTML page: no script, no event handlers, no external
 * resources; a small inline style sheet for print. Every piece of text that comes from data
 * (names, ids, messages, file names) goes through {@link escapeHtml}, so it can never become
 * markup. Small equal-area nets (lower hemisphere, netProjection.ts) show each domain's poles,
 * girdle, axis and lines, and a small map shows the local axis field and its suggested domains.
 */

/**
 * Escapes text for HTML character data and quoted attribute values (the five characters of the
 * HTML and XML specifications), and shows control characters as the replacement sign.
 * @example escapeHtml('<b onclick="x">') // '&lt;b onclick=&quot;x&quot;&gt;'
 */
export function escapeHtml(text: string): string {
  return String(text)
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/"/g, '&quot;')
    .replace(/'/g, '&#39;')
    .replace(/[\u0000-\u0008\u000B\u000C\u000E-\u001F\u007F]/g, '\uFFFD');
}

const esc = escapeHtml;

/** Colours chosen for contrast in print and on screen (Foldlens's own). */
const INK = '#1d2430';
const MUTED = '#6b7480';
const FLAG = '#c0392b';
const AXIS = '#1f5fa8';
const LINE = '#2e7d32';
const REGION_COLOURS = ['#1f5fa8', '#c77c02', '#2e7d32', '#8e3b8e', '#0f7c84', '#a63d2a', '#5b6b1f', '#47508f'];

/**
 * The whole report as an HTML document.
 * @example writeFileSync('check.html', consistencyReportHtml(report))
 */
export function consistencyReportHtml(report: ConsistencyReport): string {
  const parts: string[] = [];
  parts.push(
    '<!DOCTYPE html>',
    '<html lang="en">',
    '<head>',
    '<meta charset="utf-8">',
    `<title>${esc(report.title)}</title>`,
    `<style>${STYLE}</style>`,
    '</head>',
    '<body>',
    `<h1>${esc(report.title)}</h1>`,
    `<p class="meta">Made ${esc(report.generated)} by foldlens.</p>`,
    `<p class="caution"><strong>Caution.</strong> ${esc(report.caution)}</p>`,
  );
  const inputs = Object.entries(report.input);
  if (inputs.length > 0) {
    parts.push('<table class="input"><tbody>', ...inputs.map(([k, v]) => `<tr><th scope="row">${esc(k)}</th><td>${esc(v === null ? '—' : String(v))}</td></tr>`), '</tbody></table>');
  }
  parts.push(summaryTable(report));
  if (report.flags.length > 0) {
    parts.push('<h2>Flags</h2>', '<ul class="flags">', ...report.flags.map((f) => `<li class="${f.severity}"><strong>${esc(domainName(report, f.domain))}</strong> (${esc(f.code)}): ${esc(f.message)}</li>`), '</ul>');
  } else {
    parts.push('<h2>Flags</h2>', '<p>No check raised a flag.</p>');
  }
  if (report.pairs.length > 0) {
    parts.push(
      '<h2>Domains compared</h2>',
      '<table><thead><tr><th>Domains</th><th>Angle between axes</th><th>95% cones overlap</th></tr></thead><tbody>',
      ...report.pairs.map((p) => `<tr><td>${esc(domainName(report, p.a))} / ${esc(domainName(report, p.b))}</td><td>${deg(p.angle)}</td><td>${yesNo(p.conesOverlap)}</td></tr>`),
      '</tbody></table>',
    );
  }
  for (const d of report.domains) parts.push(domainSection(d));
  if (report.field) parts.push(fieldSection(report.field));
  parts.push('<h2>Methods</h2>', '<dl class="methods">', ...report.methods.map((m) => `<dt>${esc(m.topic)}</dt><dd>${esc(m.text)}</dd>`), '</dl>');
  if (report.notes.length > 0) parts.push('<h2>Notes</h2>', '<ul>', ...report.notes.map((n) => `<li>${esc(n)}</li>`), '</ul>');
  parts.push(`<p class="caution">${esc(report.caution)}</p>`, '</body>', '</html>', '');
  return parts.join('\n');
}

const STYLE = [
  `body{font:13px/1.45 system-ui,sans-serif;color:${INK};margin:24px;max-width:1000px}`,
  'h1{font-size:20px;margin:0 0 4px}h2{font-size:16px;margin:22px 0 6px;border-bottom:1px solid #ccd}h3{font-size:14px;margin:14px 0 4px}h4{font-size:13px;margin:10px 0 4px}',
  `.meta{color:${MUTED};margin:0 0 8px}.caution{background:#fff6e0;border-left:4px solid #c77c02;padding:6px 10px}`,
  'table{border-collapse:collapse;margin:6px 0}th,td{border:1px solid #ccd;padding:2px 6px;text-align:left;vertical-align:top}td.num{text-align:right;font-variant-numeric:tabular-nums}',
  `.flags li.warning{color:${FLAG}}.flags li.note{color:${MUTED}}tr.flagged td{color:${FLAG}}`,
  '.domain{break-inside:avoid}.figs{display:flex;gap:16px;flex-wrap:wrap;align-items:flex-start}svg{background:#fff}',
  '@media print{body{margin:0}h2{break-after:avoid}}',
].join('');

function domainName(report: ConsistencyReport, id: string): string {
  return report.domains.find((d) => d.id === id)?.name ?? id;
}

const deg = (v: number | null | undefined, digits = 1): string => (v === null || v === undefined || !Number.isFinite(v) ? '—' : `${v.toFixed(digits)}°`);
const num = (v: number | null | undefined, digits = 2): string => (v === null || v === undefined || !Number.isFinite(v) ? '—' : v.toFixed(digits));
const yesNo = (v: boolean | null): string => (v === null ? '—' : v ? 'yes' : 'no');
const line = (l: Line | null | undefined): string => (l ? `${String(Math.round(l.trend) % 360).padStart(3, '0')}/${String(Math.round(l.plunge)).padStart(2, '0')}` : '—');
const plane = (p: Plane | null | undefined): string => (p ? `${String(Math.round(p.dipDirection) % 360).padStart(3, '0')}/${String(Math.round(p.dip)).padStart(2, '0')}` : '—');

function summaryTable(report: ConsistencyReport): string {
  const rows = report.domains.map((d) => {
    const cyl = d.girdle.cylindricity;
    const mp = d.mapPattern;
    return [
      `<tr><td>${esc(d.name)}</td>`,
      `<td class="num">${d.counts.planes}</td><td class="num">${d.counts.lines}</td>`,
      `<td>${line(d.axis)}</td><td class="num">${deg(d.cone95)}</td>`,
      `<td class="num">${num(cyl?.cylindricity, 3)}</td><td class="num">${deg(cyl?.misfit)}</td>`,
      `<td class="num">${d.girdle.outliers}</td><td class="num">${d.lines?.flagged ?? '—'}</td>`,
      `<td class="num">${deg(d.lines?.all.angle)}</td>`,
      `<td>${mp?.coherence ? (mp.coherence.constrained === false ? 'not constrained' : mp.coherence.atBest ? 'agrees' : mp.coherence.nearBest ? 'near' : 'prefers another axis') : '—'}</td>`,
      `<td>${mp?.search?.axis ? `${line(mp.search.axis)} (${deg(mp.search.angleToStart)}, ${esc(mp.search.constraint ?? '—')})` : '—'}</td>`,
      `<td class="num">${d.flags.length}</td></tr>`,
    ].join('');
  });
  return [
    '<h2>Summary</h2>',
    '<table><thead><tr><th>Domain</th><th>Planes</th><th>Lines</th><th>Pi axis</th><th>95% cone</th><th>Cylindricity</th><th>RMS off girdle</th><th>Planes flagged</th><th>Lines flagged</th><th>Line mean to axis</th><th>Map pattern</th><th>Map-only axis</th><th>Flags</th></tr></thead><tbody>',
    ...rows,
    '</tbody></table>',
  ].join('\n');
}

function domainSection(d: DomainCheck): string {
  const out: string[] = [`<section class="domain"><h2>${esc(d.name)}</h2>`, `<p>${esc(d.reading)}</p>`];
  out.push('<div class="figs">', netSvg(d), '<div>');
  const cyl = d.girdle.cylindricity;
  if (cyl) {
    out.push(
      '<h3>Poles against the girdle</h3>',
      `<p>${esc(d.girdle.reading)}</p>`,
      '<table><tbody>',
      `<tr><th>Eigenvalues S1, S2, S3</th><td>${cyl.eigenvalues.map((v) => v.toFixed(4)).join(', ')}</td></tr>`,
      `<tr><th>Cylindricity S2/(S2+S3)</th><td>${num(cyl.cylindricity, 3)}</td></tr>`,
      `<tr><th>RMS distance from girdle</th><td>${deg(cyl.misfit)}</td></tr>`,
      `<tr><th>Woodcock K, C</th><td>${num(cyl.woodcock.K)}, ${num(cyl.woodcock.C)}</td></tr>`,
      `<tr><th>Vollmer P, G, R</th><td>${num(cyl.vollmer.P)}, ${num(cyl.vollmer.G)}, ${num(cyl.vollmer.R)}</td></tr>`,
      `<tr><th>Flagging threshold</th><td>${deg(d.girdle.threshold)} (${esc(d.girdle.rule)})</td></tr>`,
      '</tbody></table>',
    );
  }
  out.push('</div></div>');
  const flaggedPlanes = d.girdle.residuals.filter((r) => r.flagged);
  if (flaggedPlanes.length > 0) {
    out.push(
      '<h3>Planes off the girdle</h3>',
      '<table><thead><tr><th>Reading</th><th>Dip direction/dip</th><th>Distance from girdle</th></tr></thead><tbody>',
      ...flaggedPlanes.map((r) => `<tr class="flagged"><td>${esc(r.id ?? `plane ${r.index + 1}`)}</td><td>${plane(r.plane)}</td><td class="num">${deg(r.distance)}</td></tr>`),
      '</tbody></table>',
    );
  }
  if (d.lines) {
    const l = d.lines;
    out.push(
      '<h3>Measured lines against the axis</h3>',
      `<p>${esc(l.reading)}</p>`,
      `<p>Fisher mean ${line(l.all.mean)}, alpha95 ${deg(l.all.alpha95)}, kappa ${num(l.all.kappa, 1)}; without flagged lines: mean ${line(l.unflagged.mean)}, ${deg(l.unflagged.angle)} from the axis.</p>`,
      '<table><thead><tr><th>Reading</th><th>Trend/plunge</th><th>Angle to axis</th></tr></thead><tbody>',
      ...l.lines.map((a) => `<tr${a.flagged ? ' class="flagged"' : ''}><td>${esc(a.id ?? `line ${a.index + 1}`)}</td><td>${line(a.line)}</td><td class="num">${deg(a.angle)}</td></tr>`),
      '</tbody></table>',
    );
  }
  const mp = d.mapPattern;
  if (mp) {
    out.push('<h3>Map pattern against the axis</h3>', `<p>${mp.surfaces} surface${mp.surfaces === 1 ? '' : 's'}, ${mp.vertices} trace vertices with heights.</p>`);
    if (mp.coherence) out.push(`<p>${esc(mp.coherence.reading)} (radius ${mp.coherence.radius.toFixed(0)} m, contrast ${num(mp.coherence.contrast)}).</p>`);
    if (mp.search) out.push(`<p>${esc(mp.search.reading)}</p>`);
    if (mp.predictions) out.push(`<p>${esc(mp.predictions.reading)}</p>`);
    if (mp.closures) out.push(closuresTable(mp.closures));
    for (const n of mp.notes) out.push(`<p>${esc(n)}</p>`);
  }
  if (d.warnings.length > 0) out.push('<ul>', ...d.warnings.map((w) => `<li>${esc(w.message)}</li>`), '</ul>');
  out.push('</section>');
  return out.join('\n');
}

/** Fold closures on the map: the reading, and each closure with a known sense (disagreeing ones first). */
function closuresTable(c: ClosureCheck): string {
  const judged = c.closures.filter((k) => k.agrees !== null).sort((p, q) => Number(p.agrees) - Number(q.agrees));
  const out = ['<h4>Fold closures on the map</h4>', `<p>${esc(c.reading)}</p>`];
  if (judged.length > 0) {
    out.push(
      '<table><thead><tr><th>Surface</th><th>Apex (frame m E, N)</th><th>Points</th><th>Read down the axis</th><th>Sense from</th><th>Agrees</th></tr></thead><tbody>',
      ...judged.map(
        (k) =>
          `<tr${k.agrees ? '' : ' class="flagged"'}><td>${esc(k.surface ?? '—')}</td><td class="num">${k.position[0].toFixed(0)}, ${k.position[1].toFixed(0)}</td><td>${esc(k.points)}${k.ruleHolds === false ? ' (ground reverses the rule)' : ''}</td><td>${esc(k.traceSense ?? '—')}</td><td>${esc(k.senseFrom === 'hinges' ? `hinges ${k.hinges.ids.join(', ')}` : `limb dips (${k.limbs.antiform} antiform, ${k.limbs.synform} synform)`)}: ${esc(k.sense ?? '—')}</td><td>${yesNo(k.agrees)}</td></tr>`,
      ),
      '</tbody></table>',
    );
  }
  return out.join('\n');
}

/** A lower-hemisphere equal-area net of the domain: poles (flagged ones red), girdle, axis, lines. */
function netSvg(d: DomainCheck): string {
  const size = 240;
  const r = 100;
  const c = size / 2;
  const at = (p: { x: number; y: number }): string => `${(c + r * p.x).toFixed(1)},${(c - r * p.y).toFixed(1)}`;
  const out: string[] = [
    `<svg xmlns="http://www.w3.org/2000/svg" width="${size}" height="${size}" viewBox="0 0 ${size} ${size}" role="img" aria-label="Equal-area net, lower hemisphere: ${esc(d.name)}">`,
    `<circle cx="${c}" cy="${c}" r="${r}" fill="none" stroke="${INK}" stroke-width="1"/>`,
    `<line x1="${c}" y1="${c - r}" x2="${c}" y2="${c - r - 6}" stroke="${INK}"/><text x="${c}" y="${c - r - 8}" font-size="10" text-anchor="middle" fill="${INK}">N</text>`,
  ];
  if (d.girdlePlane) {
    const pts = greatCirclePath(d.girdlePlane, 60).map((v) => at(projectVector(v, 'equal-area')));
    out.push(`<polyline points="${pts.join(' ')}" fill="none" stroke="${AXIS}" stroke-width="1"/>`);
  }
  for (const res of d.girdle.residuals) {
    const p = projectLine({ trend: (res.plane.dipDirection + 180) % 360, plunge: 90 - res.plane.dip }, 'equal-area');
    out.push(`<circle cx="${(c + r * p.x).toFixed(1)}" cy="${(c - r * p.y).toFixed(1)}" r="${res.flagged ? 2.6 : 1.6}" fill="${res.flagged ? FLAG : MUTED}"/>`);
  }
  for (const l of d.lines?.lines ?? []) {
    const p = projectLine(l.line, 'equal-area');
    const x = c + r * p.x;
    const y = c - r * p.y;
    out.push(`<path d="M${x.toFixed(1)},${(y - 3.5).toFixed(1)}L${(x + 3).toFixed(1)},${(y + 2).toFixed(1)}L${(x - 3).toFixed(1)},${(y + 2).toFixed(1)}Z" fill="${l.flagged ? FLAG : LINE}"/>`);
  }
  if (d.axis) {
    const p = projectLine(d.axis, 'equal-area');
    out.push(`<rect x="${(c + r * p.x - 4).toFixed(1)}" y="${(c - r * p.y - 4).toFixed(1)}" width="8" height="8" fill="none" stroke="${AXIS}" stroke-width="2"/>`);
  }
  out.push('</svg>');
  return out.join('');
}

function fieldSection(f: FieldReport): string {
  const out: string[] = ['<section class="field"><h2>Local fold axis field</h2>'];
  const window = f.window.mode === 'nearest' ? `the ${f.window.k} nearest planes` : `planes within ${f.window.radius.toFixed(0)}`;
  out.push(
    `<p>Pi axis of ${esc(window)} at each of ${f.grid.nx} × ${f.grid.ny} nodes (${f.nodesWithAxis} with an axis, at least ${f.minCount} planes). Coordinates: ${esc(f.coordinates)}. Reference axis ${line(f.reference)}; local axes differ from it by up to ${deg(f.maxAngleToReference)}.</p>`,
    `<p>${f.partition.regions.length} suggested domain${f.partition.regions.length === 1 ? '' : 's'} (region growing, ${deg(f.partition.angle, 0)} to the region's mean axis; regions under ${f.partition.minNodes} nodes merged):</p>`,
    '<table><thead><tr><th>Region</th><th>Nodes</th><th>Mean axis</th><th>Spread</th></tr></thead><tbody>',
    ...f.partition.regions.map((r) => `<tr><td><span style="color:${REGION_COLOURS[r.label % REGION_COLOURS.length]}">■</span> ${r.label + 1}</td><td class="num">${r.nodes}</td><td>${line(r.axis)}</td><td class="num">${deg(r.spread)}</td></tr>`),
    '</tbody></table>',
    fieldSvg(f),
    '</section>',
  );
  return out.join('\n');
}

/** Map of the field: each node's axis trend as a tick coloured by region, boundaries in black. North up. */
function fieldSvg(f: FieldReport): string {
  const { grid } = f;
  const w = grid.nx * grid.dx;
  const h = grid.ny * grid.dy;
  const width = 520;
  const scale = width / w;
  const height = Math.max(40, Math.round(h * scale));
  const sx = (x: number): string => ((x - grid.minX) * scale).toFixed(1);
  const sy = (y: number): string => (height - (y - grid.minY) * scale).toFixed(1);
  const tick = (Math.min(grid.dx, grid.dy) * scale) / 2.4;
  const out: string[] = [
    `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}" role="img" aria-label="Local fold axis trends and suggested domain boundaries">`,
    `<rect x="0" y="0" width="${width}" height="${height}" fill="none" stroke="${MUTED}"/>`,
  ];
  for (const n of f.nodes) {
    if (!n.axis) continue;
    const t = (n.axis.trend * Math.PI) / 180;
    const len = tick * (0.4 + 0.6 * Math.cos((n.axis.plunge * Math.PI) / 180));
    const dx = Math.sin(t) * len;
    const dy = Math.cos(t) * len;
    const x = (n.x - grid.minX) * scale;
    const y = height - (n.y - grid.minY) * scale;
    const colour = n.region === null ? MUTED : REGION_COLOURS[n.region % REGION_COLOURS.length];
    out.push(`<line x1="${(x - dx).toFixed(1)}" y1="${(y + dy).toFixed(1)}" x2="${(x + dx).toFixed(1)}" y2="${(y - dy).toFixed(1)}" stroke="${colour}" stroke-width="1.3"/>`);
  }
  for (const b of f.partition.boundaries) {
    const pts: string[] = [];
    for (let i = 0; i < b.points.length; i += 2) pts.push(`${sx(b.points[i])},${sy(b.points[i + 1])}`);
    out.push(`<polyline points="${pts.join(' ')}" fill="none" stroke="${INK}" stroke-width="2"/>`);
  }
  out.push('</svg>');
  return out.join('');
}
