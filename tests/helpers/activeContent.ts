/**
 * A small, strict checker for "no active content" in exported SVG and HTML, usable in Node
 * (unit tests) and on text read back from the browser. It tokenizes the markup itself (tags,
 * attributes, comments, raw-text elements) rather than trusting a regular expression over the
 * whole file, and reports:
 *
 * - elements that run script or pull in other documents: script, foreignObject, iframe,
 *   frame(set), object, embed, applet, base, link, portal, handler, listener, and SVG's
 *   animation elements (set, animate*, which can rewrite a link);
 * - every attribute named on* (event handlers), in any namespace;
 * - URL-bearing attributes (href, xlink:href, src, action, formaction, data, poster,
 *   background, srcset, ping, xml:base) with a javascript:, vbscript: or data: URL, or any
 *   reference outside the file (a scheme such as http:, or a protocol-relative //host);
 * - `<meta http-equiv>` (a refresh can navigate), and in style attributes and style elements:
 *   url() to anything but a fragment (#id), expression(), @import, behavior, -moz-binding,
 *   javascript:;
 * - markup it cannot read: an unterminated tag, comment or quoted value, or a raw "<" that
 *   starts no tag (an escaped writer never emits one).
 *
 * Character references are decoded before URLs are judged (`&#106;avascript:` is javascript:).
 * The element and attribute lists follow the OWASP XSS filter evasion cheat sheet and the
 * SVG 1.1 / HTML element indexes (common practice).
 */

/** Elements that must never appear in an export. */
const ACTIVE_ELEMENTS = new Set([
  'script', 'foreignobject', 'iframe', 'frame', 'frameset', 'object', 'embed', 'applet', 'base', 'link', 'portal',
  'handler', 'listener', 'set', 'animate', 'animatemotion', 'animatetransform', 'animatecolor',
]);

/** Attributes whose value is a URL that a viewer may follow or fetch. */
const URL_ATTRIBUTES = new Set(['href', 'src', 'action', 'formaction', 'data', 'poster', 'background', 'srcset', 'ping', 'base', 'lowsrc', 'dynsrc', 'codebase', 'cite', 'longdesc', 'usemap', 'manifest']);

/** Elements whose content is raw text up to their end tag (HTML). */
const RAW_TEXT = new Set(['script', 'style']);

/** One thing found. */
export interface ActiveContentFinding {
  /** Character offset in the markup. */
  readonly at: number;
  readonly what: string;
}

/** An element as read: lower-case local name, attributes by their written (lower-case) names. */
export interface MarkupElement {
  readonly at: number;
  readonly name: string;
  readonly attributes: readonly { readonly name: string; readonly value: string }[];
}

/** What {@link readMarkup} returns. */
export interface MarkupReading {
  readonly elements: readonly MarkupElement[];
  /** Character data with references decoded, one string per text run (no tags). */
  readonly text: readonly string[];
  /** Content of style elements. */
  readonly styles: readonly string[];
  readonly problems: readonly ActiveContentFinding[];
}

const NAMED_REFERENCES: Readonly<Record<string, string>> = { amp: '&', lt: '<', gt: '>', quot: '"', apos: "'", nbsp: '\u00a0', colon: ':', tab: '\t', newline: '\n' };

/**
 * Decodes character references (&#106; &#x6A; &amp; and a few named ones), as a browser would
 * before using an attribute value.
 * @example decodeReferences('&#106;avascript&colon;') // 'javascript:'
 */
export function decodeReferences(text: string): string {
  return text.replace(/&(#[xX][0-9a-fA-F]+|#[0-9]+|[A-Za-z]+);?/g, (whole, ref: string) => {
    if (ref[0] === '#') {
      const code = ref[1] === 'x' || ref[1] === 'X' ? parseInt(ref.slice(2), 16) : parseInt(ref.slice(1), 10);
      return Number.isFinite(code) && code >= 0 && code <= 0x10ffff ? String.fromCodePoint(code) : whole;
    }
    return NAMED_REFERENCES[ref.toLowerCase()] ?? whole;
  });
}

/**
 * Reads markup into its elements and text, noting anything it cannot read.
 * @example readMarkup('<svg><title>a &lt; b</title></svg>').text // ['a < b']
 */
export function readMarkup(markup: string): MarkupReading {
  const elements: MarkupElement[] = [];
  const text: string[] = [];
  const styles: string[] = [];
  const problems: ActiveContentFinding[] = [];
  let i = 0;
  const n = markup.length;
  const pushText = (from: number, to: number): void => {
    if (to > from) text.push(decodeReferences(markup.slice(from, to)));
  };
  let textStart = 0;
  while (i < n) {
    const lt = markup.indexOf('<', i);
    if (lt < 0) break;
    pushText(textStart, lt);
    if (markup.startsWith('<!--', lt)) {
      const end = markup.indexOf('-->', lt + 4);
      if (end < 0) {
        problems.push({ at: lt, what: 'an unterminated comment' });
        return { elements, text, styles, problems };
      }
      i = textStart = end + 3;
      continue;
    }
    if (markup.startsWith('<![CDATA[', lt)) {
      const end = markup.indexOf(']]>', lt + 9);
      if (end < 0) {
        problems.push({ at: lt, what: 'an unterminated CDATA section' });
        return { elements, text, styles, problems };
      }
      text.push(markup.slice(lt + 9, end));
      i = textStart = end + 3;
      continue;
    }
    if (markup[lt + 1] === '!' || markup[lt + 1] === '?') {
      // Doctype or XML declaration / processing instruction.
      const end = markup.indexOf('>', lt + 2);
      if (end < 0) {
        problems.push({ at: lt, what: 'an unterminated declaration' });
        return { elements, text, styles, problems };
      }
      if (markup[lt + 1] === '?' && !/^<\?xml[\s?]/i.test(markup.slice(lt, lt + 6))) problems.push({ at: lt, what: `a processing instruction ${markup.slice(lt, end + 1)}` });
      i = textStart = end + 1;
      continue;
    }
    const closing = markup[lt + 1] === '/';
    const nameMatch = /^[A-Za-z][^\s/>]*/.exec(markup.slice(lt + (closing ? 2 : 1), lt + (closing ? 2 : 1) + 200));
    if (!nameMatch) {
      problems.push({ at: lt, what: `a raw "<" that starts no tag: ${JSON.stringify(markup.slice(lt, lt + 20))}` });
      i = lt + 1;
      continue;
    }
    const name = nameMatch[0].toLowerCase();
    let j = lt + (closing ? 2 : 1) + nameMatch[0].length;
    const attributes: { name: string; value: string }[] = [];
    let ended = false;
    while (j < n) {
      while (j < n && /\s/.test(markup[j])) j++;
      if (markup[j] === '>') {
        ended = true;
        j++;
        break;
      }
      if (markup.startsWith('/>', j)) {
        ended = true;
        j += 2;
        break;
      }
      const attr = /^[^\s"'>/=]+/.exec(markup.slice(j, j + 500));
      if (!attr) {
        problems.push({ at: j, what: `unreadable text in the tag <${name}>: ${JSON.stringify(markup.slice(j, j + 20))}` });
        j++;
        continue;
      }
      j += attr[0].length;
      while (j < n && /\s/.test(markup[j])) j++;
      let value = '';
      if (markup[j] === '=') {
        j++;
        while (j < n && /\s/.test(markup[j])) j++;
        const q = markup[j];
        if (q === '"' || q === "'") {
          const end = markup.indexOf(q, j + 1);
          if (end < 0) {
            problems.push({ at: j, what: `an unterminated attribute value in <${name}>` });
            return { elements, text, styles, problems };
          }
          value = markup.slice(j + 1, end);
          j = end + 1;
        } else {
          const unquoted = /^[^\s>]*/.exec(markup.slice(j))![0];
          value = unquoted;
          j += unquoted.length;
        }
      }
      attributes.push({ name: attr[0].toLowerCase(), value: decodeReferences(value) });
    }
    if (!ended) {
      problems.push({ at: lt, what: `an unterminated tag <${name}` });
      return { elements, text, styles, problems };
    }
    if (!closing) {
      elements.push({ at: lt, name, attributes });
      const local = name.includes(':') ? name.slice(name.indexOf(':') + 1) : name;
      const selfClosed = markup[j - 2] === '/';
      if (RAW_TEXT.has(local) && !selfClosed) {
        const end = markup.toLowerCase().indexOf(`</${name}`, j);
        const content = markup.slice(j, end < 0 ? n : end);
        if (local === 'style') styles.push(content);
        if (end < 0) {
          problems.push({ at: lt, what: `an unterminated <${name}> element` });
          return { elements, text, styles, problems };
        }
        i = textStart = end;
        continue;
      }
    }
    i = textStart = j;
  }
  pushText(textStart, n);
  return { elements, text, styles, problems };
}

/** Whether a URL (decoded) leaves the file or runs script. Fragment references (#id) are fine. */
function badUrl(value: string): string | null {
  // Browsers ignore white space and control characters inside a scheme ("java\tscript:").
  const v = value.replace(/[\u0000-\u0020\u007f-\u009f]/g, '').toLowerCase();
  if (v === '' || v.startsWith('#')) return null;
  if (/^(javascript|vbscript|data):/.test(v)) return `a ${v.slice(0, v.indexOf(':'))}: URL`;
  if (/^[a-z][a-z0-9+.-]*:/.test(v) || v.startsWith('//')) return 'a reference outside the file';
  // A relative path is a fetch from wherever the file was opened.
  return 'a relative reference outside the file';
}

/** Problems in CSS text (a style attribute or element). */
function badCss(css: string): string[] {
  const out: string[] = [];
  const c = decodeReferences(css).replace(/\\[0-9a-f]{1,6}\s?/gi, (m) => String.fromCodePoint(parseInt(m.slice(1), 16))).toLowerCase();
  for (const m of c.matchAll(/url\(\s*(['"]?)([^'")]*)\1\s*\)/g)) {
    const why = badUrl(m[2]);
    if (why) out.push(`url(${m[2]}) in CSS: ${why}`);
  }
  if (/expression\s*\(/.test(c)) out.push('CSS expression()');
  if (/@import/.test(c)) out.push('CSS @import');
  if (/behavior\s*:|-moz-binding/.test(c)) out.push('a CSS binding');
  if (/javascript:/.test(c.replace(/\s/g, ''))) out.push('javascript: in CSS');
  return out;
}

/**
 * Everything active or external in SVG or HTML text; an empty list means the file is inert.
 * @example findActiveContent('<svg xmlns="http://www.w3.org/2000/svg"><text>&lt;b&gt;</text></svg>') // []
 * @example findActiveContent('<svg onload="x()"/>')[0].what // 'an event-handler attribute onload on <svg>'
 */
export function findActiveContent(markup: string): ActiveContentFinding[] {
  const r = readMarkup(markup);
  const out: ActiveContentFinding[] = [...r.problems];
  for (const e of r.elements) {
    const local = e.name.includes(':') ? e.name.slice(e.name.indexOf(':') + 1) : e.name;
    if (ACTIVE_ELEMENTS.has(local)) out.push({ at: e.at, what: `a <${e.name}> element` });
    if (local === 'meta' && e.attributes.some((a) => a.name === 'http-equiv')) out.push({ at: e.at, what: '<meta http-equiv>' });
    for (const a of e.attributes) {
      const attrLocal = a.name.includes(':') ? a.name.slice(a.name.indexOf(':') + 1) : a.name;
      if (a.name === 'xmlns' || a.name.startsWith('xmlns:')) continue; // namespace names, never fetched
      if (attrLocal.startsWith('on')) out.push({ at: e.at, what: `an event-handler attribute ${a.name} on <${e.name}>` });
      if (URL_ATTRIBUTES.has(attrLocal)) {
        const why = badUrl(a.value);
        if (why) out.push({ at: e.at, what: `${a.name}="${a.value.slice(0, 60)}" on <${e.name}>: ${why}` });
      }
      if (attrLocal === 'style' || /url\(|expression/i.test(a.value)) {
        for (const why of badCss(a.value)) out.push({ at: e.at, what: `${a.name} on <${e.name}>: ${why}` });
      }
    }
  }
  for (const s of r.styles) for (const why of badCss(s)) out.push({ at: -1, what: `style element: ${why}` });
  return out;
}

/**
 * The character data of markup as one string, references decoded, with runs joined by `joiner`.
 * @example markupText('<p>a &amp; <b>b</b></p>') // 'a & b'
 */
export function markupText(markup: string, joiner = ''): string {
  return readMarkup(markup).text.join(joiner);
}
