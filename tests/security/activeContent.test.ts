import { describe, expect, it } from 'vitest';
import { decodeReferences, findActiveContent, markupText, readMarkup } from '../helpers/activeContent';

/**
 * The checker the payload suite relies on must itself catch what it claims to: each row is a
 * known way to run script or load something from an SVG or HTML file, and each must be
 * reported. Vectors: the OWASP XSS filter evasion cheat sheet and the SVG/HTML element indexes
 * (written from memory; common practice).
 */

const ACTIVE: readonly { name: string; markup: string }[] = [
  { name: 'script element', markup: '<svg xmlns="http://www.w3.org/2000/svg"><script>alert(1)</script></svg>' },
  { name: 'namespaced script element', markup: '<svg:svg xmlns:svg="http://www.w3.org/2000/svg"><svg:script>alert(1)</svg:script></svg:svg>' },
  { name: 'onload handler', markup: '<svg onload="alert(1)"></svg>' },
  { name: 'unquoted handler', markup: '<img src=x onerror=alert(1)>' },
  { name: 'upper-case handler', markup: '<BODY ONLOAD=alert(1)>' },
  { name: 'foreignObject', markup: '<svg><foreignObject><div>x</div></foreignObject></svg>' },
  { name: 'javascript: link', markup: '<svg><a href="javascript:alert(1)"><text>x</text></a></svg>' },
  { name: 'xlink javascript: link', markup: '<svg><a xlink:href="javascript:alert(1)">x</a></svg>' },
  { name: 'entity-encoded javascript:', markup: '<a href="&#106;avascript&#58;alert(1)">x</a>' },
  { name: 'hex-encoded and tab-split javascript:', markup: '<a href="jav&#x09;ascript:alert(1)">x</a>' },
  { name: 'external image', markup: '<svg><image href="https://example.invalid/x.png"/></svg>' },
  { name: 'protocol-relative reference', markup: '<svg><use href="//example.invalid/s.svg#a"/></svg>' },
  { name: 'relative reference', markup: '<img src="x">' },
  { name: 'data: URL', markup: '<iframe src="data:text/html,<script>alert(1)</script>"></iframe>' },
  { name: 'set element rewriting a link', markup: '<svg><a><set attributeName="href" to="javascript:alert(1)"/><text>x</text></a></svg>' },
  { name: 'animate element', markup: '<svg><animate attributeName="href" values="javascript:alert(1)"/></svg>' },
  { name: 'CSS url() to a server', markup: '<svg><rect style="fill: url(http://example.invalid/a.svg#g)"/></svg>' },
  { name: 'CSS @import in a style element', markup: '<html><head><style>@import "http://example.invalid/a.css";</style></head></html>' },
  { name: 'CSS expression()', markup: '<div style="width: expression(alert(1))"></div>' },
  { name: 'meta refresh', markup: '<meta http-equiv="refresh" content="0;url=javascript:alert(1)">' },
  { name: 'external stylesheet link', markup: '<link rel="stylesheet" href="https://example.invalid/a.css">' },
  { name: 'object element', markup: '<object data="x.swf"></object>' },
  { name: 'raw "<" in text (unescaped data)', markup: '<svg><text>a < b</text></svg>' },
  { name: 'unterminated attribute', markup: '<svg><text x="1>hi</text></svg>' },
  { name: 'processing instruction', markup: '<?xml-stylesheet href="http://example.invalid/a.xsl"?><svg/>' },
];

const INERT: readonly { name: string; markup: string }[] = [
  { name: 'plain SVG with a fragment clip', markup: '<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 10 10"><defs><clipPath id="c"><circle r="1"/></clipPath></defs><g clip-path="url(#c)"><path d="M0 0L1 1" style="stroke: #123456"/></g></svg>' },
  { name: 'escaped markup in text and attributes', markup: '<svg xmlns="http://www.w3.org/2000/svg" aria-label="&lt;img src=x onerror=alert(1)&gt;"><title>&lt;script&gt;</title><text>&quot;&gt;&lt;svg onload=x&gt;</text></svg>' },
  { name: 'HTML page with an inline style sheet', markup: '<!DOCTYPE html><html lang="en"><head><meta charset="utf-8"><title>a &amp; b</title><style>body{font:13px system-ui}a>b{color:#111}</style></head><body><p>javascript:alert(1) as text</p></body></html>' },
  { name: 'XML declaration and comment', markup: '<?xml version="1.0" encoding="UTF-8"?><!-- made by a test --><svg xmlns="http://www.w3.org/2000/svg"/>' },
];

describe('findActiveContent(markup)', () => {
  for (const row of ACTIVE) {
    it(`findActiveContent reports ${row.name}`, () => {
      expect(findActiveContent(row.markup).length).toBeGreaterThan(0);
    });
  }
  for (const row of INERT) {
    it(`findActiveContent finds nothing in ${row.name}`, () => {
      expect(findActiveContent(row.markup)).toEqual([]);
    });
  }
});

describe('readMarkup(markup) and decodeReferences(text)', () => {
  it('decodeReferences decodes decimal, hex and named references, and leaves unknown names', () => {
    // HTML 5 named character references: amp, lt, gt, quot, apos, colon (WHATWG, from memory).
    expect(decodeReferences('&#106;&#x61;&lt;&gt;&amp;&quot;&apos;&colon;&bogus;')).toBe('ja<>&"\':&bogus;');
  });

  it('readMarkup reads elements, attributes and decoded text, and the text of a style element apart', () => {
    const r = readMarkup('<svg a="1" b=\'2\' c=3 d><text x="&lt;">x &amp; y</text><style>p{}</style></svg>');
    expect(r.elements.map((e) => e.name)).toEqual(['svg', 'text', 'style']);
    expect(r.elements[0].attributes).toEqual([{ name: 'a', value: '1' }, { name: 'b', value: '2' }, { name: 'c', value: '3' }, { name: 'd', value: '' }]);
    expect(r.elements[1].attributes[0].value).toBe('<');
    expect(r.text).toEqual(['x & y']);
    expect(r.styles).toEqual(['p{}']);
    expect(r.problems).toEqual([]);
  });

  it('markupText(markup) gives the character data only', () => {
    expect(markupText('<p>a &lt;b&gt; <b>c</b></p>')).toBe('a <b> c');
  });
});
