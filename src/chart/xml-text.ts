/**
 * Text for SVG markup: XML escaping, and ids made safe. XML 1.0 (W3C, 5th ed., §2.2) allows neither the C0
 * controls other than tab, newline and carriage return, nor lone surrogates, nor U+FFFE and U+FFFF, even
 * escaped; a label holding one would make the whole chart unreadable, so each becomes U+FFFD.
 */

/** Whether a UTF-16 code unit at i of text is allowed in XML, a surrogate only as half of a pair. */
function allowed(text: string, i: number): boolean {
  const c = text.charCodeAt(i);
  if (c < 0x20) return c === 0x09 || c === 0x0a || c === 0x0d;
  if (c < 0xd800) return true;
  if (c <= 0xdbff) {
    const next = text.charCodeAt(i + 1);
    return next >= 0xdc00 && next <= 0xdfff;
  }
  if (c <= 0xdfff) {
    const prev = text.charCodeAt(i - 1);
    return prev >= 0xd800 && prev <= 0xdbff;
  }
  return c !== 0xfffe && c !== 0xffff;
}

/** The text with every character XML forbids replaced by U+FFFD. */
export function xmlChars(text: string): string {
  let out = '';
  let from = 0;
  for (let i = 0; i < text.length; i++) {
    if (allowed(text, i)) continue;
    out += `${text.slice(from, i)}\uFFFD`;
    from = i + 1;
  }
  return from === 0 ? text : out + text.slice(from);
}

/** Text for XML content and attribute values. */
export function escapeXml(text: string): string {
  return xmlChars(text)
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/"/g, '&quot;')
    .replace(/'/g, '&apos;');
}

/** An id-safe form of any text: lower case letters, digits and hyphens. */
export function idSafe(text: string): string {
  const slug = text
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '');
  return /^[a-z]/.test(slug) ? slug : `c-${slug}`;
}
