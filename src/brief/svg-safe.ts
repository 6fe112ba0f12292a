/**
 * An SVG logo reduced to what draws and nothing that reaches out: shapes, paths, text, groups, gradients,
 * clip paths and masks stay; scripts, event attributes, links, style sheets, foreign content, animation,
 * filters and editor metadata go; a reference is kept only inside the document (`#id`), an embedded image
 * only as a PNG or JPEG data URI. So no viewer of the HTML, no PDF drawer (svg-to-pdfkit turns `<a>` into
 * link annotations and opens an `<image>`'s path as a file) and no mail client follows anything from it.
 * The SVG is read by htmlparser2 in XML mode, which expands no entities a document defines for itself; the
 * result is written afresh, every text and attribute escaped.
 *
 *   safeSvg('<svg><a href="javascript:x()"><rect width="4" height="2"/></a><script>x()</script></svg>')
 *     → '<svg xmlns="http://www.w3.org/2000/svg"><rect width="4" height="2"/></svg>'
 */
import { createRequire } from 'node:module';

// htmlparser2 and the modules it brings are loaded (CommonJS build, synchronously) only for an SVG logo.
type Html = typeof import('htmlparser2');
let html: Html | null = null;
const loadParser = (): Html['Parser'] => {
  html ??= createRequire(import.meta.url)('htmlparser2') as Html;
  return html.Parser;
};

/** Elements kept, with their allowed attributes checked one by one. */
const KEEP = new Set([
  'svg',
  'g',
  'defs',
  'symbol',
  'use',
  'path',
  'rect',
  'circle',
  'ellipse',
  'line',
  'polyline',
  'polygon',
  'text',
  'tspan',
  'title',
  'desc',
  'linearGradient',
  'radialGradient',
  'stop',
  'clipPath',
  'mask',
  'pattern',
  'image',
]);

/** Elements whose children are kept while the element itself goes (a link's shapes stay, not the link). */
const UNWRAP = new Set(['a', 'switch']);

/** Elements that may point at another element of the same document. */
const INTERNAL_REFERENCE = new Set(['use', 'linearGradient', 'radialGradient', 'pattern']);

const DATA_IMAGE = /^data:image\/(?:png|jpeg);base64,[A-Za-z0-9+/=\s]*$/;
const OUTSIDE_URL = /url\s*\(\s*(?!['"]?#)/i;

type Decision = 'keep' | 'unwrap' | 'drop';

export function safeSvg(text: string): string {
  const out: string[] = [];
  const stack: Decision[] = [];
  let dropping = 0;
  let rootSeen = false;
  const Parser = loadParser();
  const parser = new Parser(
    {
      onopentag(name, attribs) {
        const decision: Decision =
          dropping > 0 || (!rootSeen && name !== 'svg')
            ? 'drop'
            : KEEP.has(name) &&
                (name !== 'image' || embeddedImage(attribs)) &&
                (name !== 'use' || internalHref(attribs))
              ? 'keep'
              : UNWRAP.has(name)
                ? 'unwrap'
                : 'drop';
        stack.push(decision);
        if (decision === 'drop') {
          dropping++;
          return;
        }
        if (decision === 'unwrap') return;
        const root = !rootSeen;
        rootSeen = true;
        out.push(`<${name}${attributes(name, attribs, root)}>`);
      },
      ontext(data) {
        if (dropping === 0 && rootSeen && stack.length > 0) out.push(escapeText(data));
      },
      onclosetag(name) {
        const decision = stack.pop();
        if (decision === 'drop') dropping--;
        else if (decision === 'keep') out.push(`</${name}>`);
      },
    },
    { xmlMode: true, decodeEntities: true, recognizeCDATA: true, recognizeSelfClosing: true },
  );
  parser.write(text);
  parser.end();
  // Elements without content written as <x></x> become <x/>, as an SVG writer would.
  return out.join('').replace(/<([a-zA-Z]+)([^<>]*)><\/\1>/g, '<$1$2/>');
}

/** An <image> is kept only when it carries its picture (a PNG or JPEG data URI); without it it draws nothing. */
function embeddedImage(attribs: Record<string, string>): boolean {
  return DATA_IMAGE.test((attribs.href ?? attribs['xlink:href'] ?? '').trim());
}

/** A <use> is kept only when it points inside the document. */
function internalHref(attribs: Record<string, string>): boolean {
  return /^#[\w.:-]+$/.test((attribs.href ?? attribs['xlink:href'] ?? '').trim());
}

function attributes(element: string, attribs: Record<string, string>, root: boolean): string {
  const kept: [string, string][] = [];
  for (const [name, value] of Object.entries(attribs)) {
    const lower = name.toLowerCase();
    if (lower.startsWith('on')) continue;
    if (lower === 'href' || lower === 'xlink:href') {
      const inside = INTERNAL_REFERENCE.has(element) && /^#[\w.:-]+$/.test(value.trim());
      const image = element === 'image' && DATA_IMAGE.test(value.trim());
      if (inside || image) kept.push([name, value.trim()]);
      continue;
    }
    // Namespaced attributes belong to editors (inkscape:…, sodipodi:…) or name links; xml:space and the
    // namespace declarations of the root are the ones that matter for drawing.
    if (name.includes(':') && lower !== 'xml:space' && !(root && lower.startsWith('xmlns:'))) continue;
    if (lower === 'xmlns' && !root) continue;
    if (OUTSIDE_URL.test(value) || (lower === 'style' && /\\|@import|expression\s*\(/i.test(value))) continue;
    kept.push([name, value]);
  }
  if (root && !kept.some(([n]) => n === 'xmlns')) kept.unshift(['xmlns', 'http://www.w3.org/2000/svg']);
  return kept.map(([n, v]) => ` ${n}="${escapeAttribute(v)}"`).join('');
}

function escapeText(text: string): string {
  return text.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');
}

function escapeAttribute(text: string): string {
  return escapeText(text).replace(/"/g, '&quot;');
}
