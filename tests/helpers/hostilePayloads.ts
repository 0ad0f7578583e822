/**
 * Hostile text for the security tests: markup and script that would run if any piece of data
 * text were ever inserted as HTML or written unescaped into SVG or HTML, plus text that breaks
 * naive writers (delimiters, quotes, line breaks, very long words, direction overrides) and
 * text that spreadsheets read as formulas. Every payload that could run sets `window.__pwned`,
 * so a test can also ask the page whether anything ran.
 *
 * Common practice (OWASP XSS filter evasion and CSV injection cheat sheets; the payload shapes
 * are the usual textbook ones, written here from memory).
 */

/** What a payload does when it runs. */
export const PWNED_FLAG = '__pwned';

/** One payload: a short name for test titles and the text itself. */
export interface HostilePayload {
  readonly name: string;
  readonly text: string;
}

/** Long enough to overflow any fixed-size assumption, ending in markup that must stay text. */
const LONG = `${'Korvane-'.repeat(1250)}<img src=x onerror="window.__pwned=1">`;

/**
 * The payload table. None begins or ends with white space (readers trim cells at the edges),
 * and none holds a control character that XML 1.0 forbids (those are replaced on export and
 * tested on their own).
 */
export const HOSTILE_PAYLOADS: readonly HostilePayload[] = [
  { name: 'img onerror', text: '<img src=x onerror="window.__pwned=1">' },
  { name: 'script element', text: '<script>window.__pwned=1</script>' },
  { name: 'double-quoted attribute break-out', text: '"><svg onload=window.__pwned=1>' },
  { name: 'single-quoted attribute break-out', text: "'><iframe src=javascript:window.__pwned=1></iframe>" },
  { name: 'javascript: URL', text: 'javascript:window.__pwned=1' },
  { name: 'title break-out', text: '</title><script>window.__pwned=1</script>' },
  { name: 'style and textarea break-out', text: '</style></textarea><img src=x onerror=window.__pwned=1>' },
  { name: 'CDATA break-out', text: ']]><script>window.__pwned=1</script><![CDATA[' },
  { name: 'SVG foreignObject', text: '<svg><foreignObject><body onload=window.__pwned=1></body></foreignObject></svg>' },
  { name: 'entities that must not be decoded twice', text: '&lt;script&gt;window.__pwned=1&lt;/script&gt; &amp;amp; &#60;b&#62;' },
  { name: 'CSV formula (DDE)', text: "=cmd|' /C calc'!A0" },
  { name: 'CSV formula with @ and +', text: '@SUM(1+1)*cmd|\' /C calc\'!A0+1' },
  { name: 'template expression', text: '{{constructor.constructor("window.__pwned=1")()}}' },
  { name: 'template literal', text: '${window.__pwned=1}' },
  { name: 'right-to-left override', text: 'KR-\u202Egnp.exe\u202C-0001' },
  { name: 'zero-width and combining marks', text: 'K\u200BR\u200D-Ö\u0301\uFEFF1' },
  { name: 'delimiters, quotes and a line break', text: 'a,"b";c\td|e\nsecond line' },
  { name: 'markdown link', text: '[click](javascript:window.__pwned=1)' },
  { name: 'very long text', text: LONG },
];

/** Column names: each must differ from the others and from every name Foldlens detects as a field. */
export const HOSTILE_HEADERS: readonly string[] = [
  '<img src=x onerror="window.__pwned=1">',
  '"><svg onload=window.__pwned=1>',
  '</title><script>window.__pwned=1</script>',
  "=cmd|' /C calc'!A0",
  '{{constructor}}',
  '__proto__',
];

/**
 * CSS selectors of elements that exist only if a payload was parsed as markup.
 * @example PAYLOAD_ELEMENT_SELECTORS.join(', ')
 */
export const PAYLOAD_ELEMENT_SELECTORS: readonly string[] = [
  'img[src="x"]',
  'svg[onload]',
  'iframe',
  'foreignObject',
  'body[onload]',
  '[onerror]',
  '[onload]',
  'textarea',
];
