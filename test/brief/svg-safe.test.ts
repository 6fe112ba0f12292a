/**
 * safeSvg keeps what draws and drops what reaches out (src/brief/svg-safe.ts). The cases are small enough
 * to read: each states what goes in and what must come out. The list of what reaches out follows the SVG 1.1
 * and SVG 2 specifications' elements and attributes that load or link (a, image, use, script, style,
 * foreignObject, feImage, href, url(), event attributes); which of them svg-to-pdfkit acts on was read in
 * its source (links become PDF link annotations, an image's href is opened as a file).
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { safeSvg } from '../../src/brief/svg-safe.js';

describe('safeSvg', () => {
  it('keeps a plain logo as drawn: the same elements and attributes', () => {
    const svg = readFileSync(new URL('../render/files-pdf/logo.svg', import.meta.url), 'utf8');
    const tags = (s: string) => [...s.matchAll(/<([a-zA-Z]+)\b/g)].map((m) => m[1]);
    expect(tags(safeSvg(svg))).toEqual(tags(svg.replace(/<\?xml[^>]*>/, '').replace(/<!--[\s\S]*?-->/g, '')));
  });

  it('unwraps links, keeping their shapes', () => {
    expect(safeSvg('<svg><a href="javascript:x()"><rect width="4" height="2"/></a></svg>')).toBe(
      '<svg xmlns="http://www.w3.org/2000/svg"><rect width="4" height="2"/></svg>',
    );
  });

  it('drops scripts, styles, foreign content, filters, animation and editor metadata with their content', () => {
    const out = safeSvg(
      '<svg xmlns:inkscape="x"><script>x()</script><style>@import url(http://a/b)</style>' +
        '<foreignObject><div>hi</div></foreignObject><filter><feImage href="http://a/i.png"/></filter>' +
        '<set attributeName="href" to="javascript:x()"/><inkscape:grid/><metadata>m</metadata><circle r="1"/></svg>',
    );
    expect(out).toBe('<svg xmlns="http://www.w3.org/2000/svg" xmlns:inkscape="x"><circle r="1"/></svg>');
  });

  it('keeps references inside the document and embedded PNG or JPEG images only', () => {
    const png = 'data:image/png;base64,iVBORw0KGgo=';
    const out = safeSvg(
      `<svg><defs><linearGradient id="g" xlink:href="#h"/></defs><use href="#g"/><use href="a.svg#g"/>` +
        `<image href="${png}"/><image href="/etc/passwd"/><image href="data:image/svg+xml;base64,PHN2Zz4="/>` +
        `<rect fill="url(#g)"/><rect fill="url(http://a/p)" style="fill:url( 'file:///x')"/></svg>`,
    );
    expect(out).toBe(
      `<svg xmlns="http://www.w3.org/2000/svg"><defs><linearGradient id="g" xlink:href="#h"/></defs><use href="#g"/>` +
        `<image href="${png}"/><rect fill="url(#g)"/><rect/></svg>`,
    );
  });

  it('drops event attributes and escaped style tricks, and escapes text and attributes afresh', () => {
    expect(
      safeSvg('<svg onload="x()"><text onclick="y()" style="fill:u\\72l(x)">a &lt; b &amp; "c"</text></svg>'),
    ).toBe('<svg xmlns="http://www.w3.org/2000/svg"><text>a &lt; b &amp; "c"</text></svg>');
  });

  it('expands no entity a document defines for itself, and keeps nothing outside the root', () => {
    const out = safeSvg(
      '<?xml version="1.0"?><!DOCTYPE svg [<!ENTITY a "aaaaaaaaaa"><!ENTITY b "&a;&a;&a;&a;">]>' +
        '<!-- c --><svg><title>&b;</title></svg><script>x()</script>',
    );
    expect(out).toBe('<svg xmlns="http://www.w3.org/2000/svg"><title>&amp;b;</title></svg>');
  });
});
