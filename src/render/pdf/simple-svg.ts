/**
 * A direct drawer for plain SVG: groups with transforms, paths, lines, rects, circles and one-line texts,
 * presentation attributes only — what the chart stage writes (scene-svg.ts) and vega's SVG renderer
 * writes. The brief's charts reach the PDF as scenes (charts.ts draws those without any SVG); this drawer
 * is for SVG that comes without one, such as a logo, and draws in a millisecond or two what svg-to-pdfkit
 * draws in tens. Anything outside that subset (a clip path, a gradient, a style sheet, a tspan…) throws
 * Unsupported, and the caller hands the whole SVG to svg-to-pdfkit instead, so an unusual picture is
 * slower but never drawn wrong. test/render/pdf-svg.test.ts compares both drawers' rasters on every chart
 * of the examples.
 */
import { fontName } from './fonts.js';

export class Unsupported extends Error {}

type Matrix = [number, number, number, number, number, number];

interface Style {
  fill: string | null;
  stroke: string | null;
  strokeWidth: number;
  opacity: number;
  fillOpacity: number;
  strokeOpacity: number;
  dash: number[] | null;
  lineCap: 'butt' | 'round' | 'square';
  lineJoin: 'miter' | 'round' | 'bevel';
  miterLimit: number;
  fontSize: number;
  bold: boolean;
  italic: boolean;
  anchor: 'start' | 'middle' | 'end';
}

interface Frame {
  tag: string;
  m: Matrix;
  style: Style;
  hidden: boolean;
}

const ROOT_STYLE: Style = {
  fill: '#000000',
  stroke: null,
  strokeWidth: 1,
  opacity: 1,
  fillOpacity: 1,
  strokeOpacity: 1,
  dash: null,
  lineCap: 'butt',
  lineJoin: 'miter',
  miterLimit: 4,
  fontSize: 16,
  bold: false,
  italic: false,
  anchor: 'start',
};

/** Attributes that carry no marks (identification, accessibility, interaction, font names). */
const IGNORED = new Set([
  'class',
  'role',
  'id',
  'version',
  'xmlns',
  'xmlns:xlink',
  'pointer-events',
  'aria-hidden',
  'aria-label',
  'aria-labelledby',
  'aria-roledescription',
  'aria-describedby',
  'font-family',
]);

const TOKEN =
  /<!--[\s\S]*?-->|<\?[\s\S]*?\?>|<(\/?)([a-zA-Z][\w:-]*)((?:\s+[^\s=/>]+\s*=\s*"[^"]*")*)\s*(\/?)>|([^<]+)/g;
const ATTR = /([^\s=/>]+)\s*=\s*"([^"]*)"/g;

/** Draws svg into the box (x, y, width, height) of the current page, scaled from its viewBox. */
export function drawSimpleSvg(
  doc: PDFKit.PDFDocument,
  svg: string,
  x: number,
  y: number,
  width: number,
  height: number,
): void {
  const ops: (() => void)[] = [];
  const stack: Frame[] = [];
  let text: { frame: Frame; content: string } | null = null;
  let skipDepth = 0;
  let seenRoot = false;
  TOKEN.lastIndex = 0;
  for (let t = TOKEN.exec(svg); t !== null; t = TOKEN.exec(svg)) {
    const [whole, closing, rawTag, attrText, selfClosing, chars] = t;
    if (chars !== undefined) {
      if (text) text.content += chars;
      else if (chars.trim() !== '' && skipDepth === 0) throw new Unsupported('text outside a text element');
      continue;
    }
    if (rawTag === undefined) continue; // comment or declaration
    const tag = rawTag.toLowerCase();
    if (closing) {
      if (skipDepth > 0) {
        skipDepth--;
        continue;
      }
      const frame = stack.pop();
      if (!frame || frame.tag !== tag) throw new Unsupported(`unbalanced </${tag}>`);
      if (tag === 'text' && text) {
        const done = text;
        // SVG's default white-space handling: runs collapse to one space, ends are trimmed.
        const content = decode(done.content.replace(/\s+/g, ' ').trim());
        if (!done.frame.hidden) ops.push(() => drawText(doc, done.frame, content));
        text = null;
      }
      continue;
    }
    if (skipDepth > 0 || tag === 'title' || tag === 'desc') {
      if (!selfClosing) skipDepth++;
      continue;
    }
    if (text) throw new Unsupported('markup inside a text element');
    if (whole.includes('style=')) throw new Unsupported('style attribute');
    const attrs = readAttrs(attrText);
    const parent = stack[stack.length - 1];
    let frame: Frame;
    if (tag === 'svg') {
      if (seenRoot) throw new Unsupported('nested svg');
      seenRoot = true;
      frame = { tag, m: rootMatrix(attrs, x, y, width, height), style: { ...ROOT_STYLE }, hidden: false };
    } else {
      if (!parent) throw new Unsupported(`<${tag}> outside the svg root`);
      frame = childFrame(tag, attrs, parent);
    }
    if (!selfClosing) stack.push(frame);
    if (tag === 'svg' || tag === 'g' || frame.hidden) continue;
    if (tag === 'text') {
      if (selfClosing) continue;
      text = { frame, content: '' };
    } else if (tag === 'path') {
      const d = attrs.get('d') ?? '';
      if (d.trim() !== '') ops.push(() => drawShape(doc, frame, () => doc.path(d)));
    } else if (tag === 'line') {
      const [x1, y1, x2, y2] = ['x1', 'y1', 'x2', 'y2'].map((k) => num(attrs.get(k) ?? '0'));
      ops.push(() =>
        drawShape(doc, { ...frame, style: { ...frame.style, fill: null } }, () => doc.moveTo(x1, y1).lineTo(x2, y2)),
      );
    } else if (tag === 'rect') {
      const [rx, ry, w, h] = ['x', 'y', 'width', 'height'].map((k) => num(attrs.get(k) ?? '0'));
      if (attrs.has('rx') || attrs.has('ry')) throw new Unsupported('rounded rect');
      if (w > 0 && h > 0) ops.push(() => drawShape(doc, frame, () => doc.rect(rx, ry, w, h)));
    } else if (tag === 'circle') {
      const [cx, cy, r] = ['cx', 'cy', 'r'].map((k) => num(attrs.get(k) ?? '0'));
      if (r > 0) ops.push(() => drawShape(doc, frame, () => doc.circle(cx, cy, r)));
    } else {
      throw new Unsupported(`<${tag}>`);
    }
  }
  if (!seenRoot || stack.length > 0 || text) throw new Unsupported('incomplete svg');
  // Parsed whole before drawing, so a late Unsupported leaves no half-drawn chart behind.
  for (const op of ops) op();
}

function readAttrs(text: string): Map<string, string> {
  const out = new Map<string, string>();
  ATTR.lastIndex = 0;
  for (let a = ATTR.exec(text); a !== null; a = ATTR.exec(text)) out.set(a[1], a[2]);
  return out;
}

function rootMatrix(attrs: Map<string, string>, x: number, y: number, width: number, height: number): Matrix {
  const box = (attrs.get('viewBox') ?? '')
    .split(/[\s,]+/)
    .filter((v) => v !== '')
    .map(Number);
  const w = box.length === 4 ? box[2] : num(attrs.get('width') ?? '0');
  const h = box.length === 4 ? box[3] : num(attrs.get('height') ?? '0');
  if (!(w > 0 && h > 0)) throw new Unsupported('svg without a size');
  const k = Math.min(width / w, height / h);
  const bx = box.length === 4 ? box[0] : 0;
  const by = box.length === 4 ? box[1] : 0;
  return [k, 0, 0, k, x - bx * k, y - by * k];
}

function childFrame(tag: string, attrs: Map<string, string>, parent: Frame): Frame {
  const style: Style = { ...parent.style, opacity: 1 };
  let m = parent.m;
  let hidden = parent.hidden;
  const textAt: [number, number] = [0, 0];
  for (const [name, value] of attrs) {
    if (IGNORED.has(name)) continue;
    switch (name) {
      case 'transform':
        m = multiply(m, parseTransform(value));
        break;
      case 'fill':
        style.fill = colour(value);
        break;
      case 'stroke':
        style.stroke = colour(value);
        break;
      case 'stroke-width':
        style.strokeWidth = num(value);
        break;
      case 'opacity':
        style.opacity = unit(value);
        if (tag === 'g' && style.opacity !== 1) throw new Unsupported('group opacity');
        break;
      case 'fill-opacity':
        style.fillOpacity = unit(value);
        break;
      case 'stroke-opacity':
        style.strokeOpacity = unit(value);
        break;
      case 'stroke-dasharray':
        style.dash = dashes(value);
        break;
      case 'stroke-dashoffset':
        if (num(value) !== 0) throw new Unsupported('dash offset');
        break;
      case 'stroke-linecap':
        style.lineCap = oneOf(value, ['butt', 'round', 'square']);
        break;
      case 'stroke-linejoin':
        style.lineJoin = oneOf(value, ['miter', 'round', 'bevel']);
        break;
      case 'stroke-miterlimit':
        style.miterLimit = num(value);
        break;
      case 'font-size':
        style.fontSize = num(value.replace(/px$/, ''));
        break;
      case 'font-weight':
        style.bold = value === 'bold' || value === 'bolder' || Number(value) >= 600;
        break;
      case 'font-style':
        style.italic = value === 'italic' || value === 'oblique';
        break;
      case 'text-anchor':
        style.anchor = oneOf(value, ['start', 'middle', 'end']);
        break;
      case 'display':
        if (value === 'none') hidden = true;
        break;
      case 'visibility':
        if (value === 'hidden') hidden = true;
        break;
      case 'x':
      case 'y':
        // A text's x and y place its start in its own (transformed) user space: a translation after the
        // transform. One number each; lists (per-character positions) are left to svg-to-pdfkit.
        if (tag === 'text') {
          if (/[\s,]/.test(value.trim())) throw new Unsupported('text position list');
          const v = num(value);
          textAt[name === 'x' ? 0 : 1] = v;
        }
        break;
      case 'd':
      case 'x1':
      case 'y1':
      case 'x2':
      case 'y2':
      case 'cx':
      case 'cy':
      case 'r':
      case 'width':
      case 'height':
        break;
      default:
        throw new Unsupported(`attribute ${name}`);
    }
  }
  if (textAt[0] !== 0 || textAt[1] !== 0) m = multiply(m, [1, 0, 0, 1, textAt[0], textAt[1]]);
  return { tag, m, style, hidden };
}

function drawShape(doc: PDFKit.PDFDocument, frame: Frame, trace: () => void): void {
  const s = frame.style;
  const fill = s.fill !== null;
  const stroke = s.stroke !== null && s.strokeWidth > 0;
  if (!fill && !stroke) return;
  doc.save();
  doc.transform(...frame.m);
  trace();
  if (fill) {
    doc.fillColor(s.fill as string);
    if (s.opacity * s.fillOpacity < 1) doc.fillOpacity(s.opacity * s.fillOpacity);
  }
  if (stroke) {
    doc.strokeColor(s.stroke as string);
    if (s.opacity * s.strokeOpacity < 1) doc.strokeOpacity(s.opacity * s.strokeOpacity);
    doc.lineWidth(s.strokeWidth).lineCap(s.lineCap).lineJoin(s.lineJoin).miterLimit(s.miterLimit);
    if (s.dash) doc.dash(s.dash[0], { space: s.dash[1] });
  }
  if (fill && stroke) doc.fillAndStroke();
  else if (fill) doc.fill();
  else doc.stroke();
  doc.restore();
}

function drawText(doc: PDFKit.PDFDocument, frame: Frame, content: string): void {
  const s = frame.style;
  if (s.fill === null || content === '') return;
  doc.save();
  doc.transform(...frame.m);
  doc.font(fontName(s.italic ? 'It' : s.bold ? 'Semibold' : 'Regular')).fontSize(s.fontSize);
  doc.fillColor(s.fill);
  if (s.opacity * s.fillOpacity < 1) doc.fillOpacity(s.opacity * s.fillOpacity);
  const w = doc.widthOfString(content);
  const dx = s.anchor === 'middle' ? -w / 2 : s.anchor === 'end' ? -w : 0;
  doc.text(content, dx, 0, { lineBreak: false, baseline: 'alphabetic' });
  doc.restore();
}

/** translate, scale, rotate (about the origin or a point) and matrix, in order. */
export function parseTransform(text: string): Matrix {
  let m: Matrix = [1, 0, 0, 1, 0, 0];
  const re = /(\w+)\s*\(([^)]*)\)/g;
  let rest = text;
  for (let t = re.exec(text); t !== null; t = re.exec(text)) {
    rest = rest.replace(t[0], '');
    const v = t[2]
      .split(/[\s,]+/)
      .filter((x) => x !== '')
      .map(num);
    let step: Matrix;
    if (t[1] === 'translate') step = [1, 0, 0, 1, v[0] ?? 0, v[1] ?? 0];
    else if (t[1] === 'scale') step = [v[0], 0, 0, v[1] ?? v[0], 0, 0];
    else if (t[1] === 'matrix' && v.length === 6) step = v as Matrix;
    else if (t[1] === 'rotate') {
      const a = ((v[0] ?? 0) * Math.PI) / 180;
      const [cx, cy] = [v[1] ?? 0, v[2] ?? 0];
      step = multiply(multiply([1, 0, 0, 1, cx, cy], [Math.cos(a), Math.sin(a), -Math.sin(a), Math.cos(a), 0, 0]), [
        1,
        0,
        0,
        1,
        -cx,
        -cy,
      ]);
    } else throw new Unsupported(`transform ${t[1]}`);
    m = multiply(m, step);
  }
  if (rest.trim() !== '') throw new Unsupported(`transform "${text}"`);
  return m;
}

/** a·b: b applied first, as SVG composes a parent's transform with a child's. */
function multiply(a: Matrix, b: Matrix): Matrix {
  return [
    a[0] * b[0] + a[2] * b[1],
    a[1] * b[0] + a[3] * b[1],
    a[0] * b[2] + a[2] * b[3],
    a[1] * b[2] + a[3] * b[3],
    a[0] * b[4] + a[2] * b[5] + a[4],
    a[1] * b[4] + a[3] * b[5] + a[5],
  ];
}

function num(text: string): number {
  const v = Number(text);
  if (!Number.isFinite(v)) throw new Unsupported(`number "${text}"`);
  return v;
}

function unit(text: string): number {
  return Math.min(1, Math.max(0, num(text)));
}

function oneOf<T extends string>(value: string, allowed: T[]): T {
  if (!allowed.includes(value as T)) throw new Unsupported(`value "${value}"`);
  return value as T;
}

/** #rgb, #rrggbb and a few names; "none" is no paint. Anything else goes to svg-to-pdfkit. */
function colour(value: string): string | null {
  const v = value.trim().toLowerCase();
  if (v === 'none' || v === 'transparent') return null;
  if (/^#[0-9a-f]{6}$/.test(v)) return v;
  if (/^#[0-9a-f]{3}$/.test(v)) return `#${v[1]}${v[1]}${v[2]}${v[2]}${v[3]}${v[3]}`;
  const named: Record<string, string> = { black: '#000000', white: '#ffffff' };
  if (named[v]) return named[v];
  throw new Unsupported(`colour "${value}"`);
}

/** A dash pattern of one dash and one gap; no gap means a solid line (vega writes "1,0" for solid). */
function dashes(value: string): number[] | null {
  if (value === 'none') return null;
  const v = value
    .split(/[\s,]+/)
    .filter((x) => x !== '')
    .map(num);
  if (v.length !== 2 || v[0] < 0 || v[1] < 0) throw new Unsupported(`dash pattern "${value}"`);
  if (v[1] === 0) return null;
  if (v[0] === 0) throw new Unsupported('zero-length dashes');
  return v;
}

const ENTITIES: Record<string, string> = { amp: '&', lt: '<', gt: '>', quot: '"', apos: "'" };

function decode(text: string): string {
  return text.replace(/&(#x[0-9a-fA-F]+|#\d+|\w+);/g, (whole, e: string) => {
    if (e[0] === '#') return String.fromCodePoint(e[1] === 'x' ? Number.parseInt(e.slice(2), 16) : Number(e.slice(1)));
    return ENTITIES[e] ?? whole;
  });
}
