import { describe, expect, it } from 'vitest';
import { parseXml, textOf } from './xml.js';

// The checker has to fail on broken markup, or the chart tests that lean on it prove nothing.
// Cases from the XML 1.0 well-formedness constraints (W3C Recommendation, 5th ed., §2.1, §3.1, §4.1).
describe('parseXml', () => {
  it('reads a small document and decodes entities', () => {
    const root = parseXml('<svg a="1 &amp; 2"><title>&lt;b&gt; &#x1F600; &#39;</title><g/></svg>');
    expect(root.name).toBe('svg');
    expect(root.attrs.a).toBe('1 & 2');
    expect(textOf(root)).toBe("<b> 😀 '");
  });

  it.each([
    ['mismatched end tag', '<a><b></a></b>'],
    ['unclosed element', '<a><b></b>'],
    ['bare ampersand', '<a>x & y</a>'],
    ['unknown entity', '<a>&nbsp;</a>'],
    ['unquoted attribute', '<a b=1></a>'],
    ['"<" in an attribute', '<a b="<"></a>'],
    ['repeated attribute', '<a b="1" b="2"></a>'],
    ['two roots', '<a></a><b></b>'],
    ['text outside the root', '<a></a>x'],
  ])('rejects %s', (_, xml) => {
    expect(() => parseXml(xml)).toThrow();
  });
});
