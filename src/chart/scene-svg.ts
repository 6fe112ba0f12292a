/**
 * A scene as a static, labelled SVG string, the brief's charts as HTML inlines them and resvg draws them.
 * The guarantees of the vega path (svg.ts) hold: the root is role="img", labelled by its <title> and
 * <desc>, which come first; ids (title, desc, clip paths) start with the chart's own prefix, so several
 * charts inlined in one page cannot clash; no script, no event handler, no link — the writer has no way to
 * write one; every text and attribute value is XML-escaped (xml-text.ts), so a label such as
 * `<script>` or `" onload="` is shown, never run; and the same scene gives the same bytes, since numbers
 * are written rounded to 0.01 px by one rule and nothing depends on time, machine or order of calls.
 */
import {
  baselineShift,
  type GroupMark,
  type Mark,
  type Scene,
  type Stroke,
  type SymbolMark,
  symbolRadius,
  type TextMark,
} from '../vocabulary/scene.js';
import { FONT_FAMILY } from './theme.js';
import { escapeXml, idSafe } from './xml-text.js';

export interface SvgLabel {
  /** Prefix for every id inside the SVG; unique within a page (letters, digits, hyphens). */
  idPrefix: string;
  title: string;
  desc: string;
}

/** A coordinate or length rounded to 0.01 px, without trailing zeros ("12.5", "0", "-3.25"). */
export function num(v: number): string {
  const r = Math.round(v * 100) / 100;
  return Object.is(r, -0) ? '0' : String(r);
}

function strokeAttrs(s: Stroke): string {
  let out = ` stroke="${escapeXml(s.colour)}" stroke-width="${num(s.width)}"`;
  if (s.dash) out += ` stroke-dasharray="${num(s.dash[0])},${num(s.dash[1])}"`;
  if (s.cap && s.cap !== 'butt') out += ` stroke-linecap="${s.cap}"`;
  if (s.join && s.join !== 'miter') out += ` stroke-linejoin="${s.join}"`;
  if (s.opacity !== undefined && s.opacity < 1) out += ` stroke-opacity="${num(s.opacity)}"`;
  return out;
}

function fillAttr(fill: string | null, opacity?: number): string {
  if (fill === null) return ' fill="none"';
  const o = opacity !== undefined && opacity < 1 ? ` fill-opacity="${num(opacity)}"` : '';
  return ` fill="${escapeXml(fill)}"${o}`;
}

function symbol(m: SymbolMark): string {
  const r = symbolRadius(m.size);
  const paint = fillAttr(m.fill) + (m.stroke ? strokeAttrs(m.stroke) : '');
  const [x, y] = [m.x, m.y];
  switch (m.shape) {
    case 'circle':
      return `<circle cx="${num(x)}" cy="${num(y)}" r="${num(r)}"${paint}/>`;
    case 'square':
      return `<rect x="${num(x - r)}" y="${num(y - r)}" width="${num(2 * r)}" height="${num(2 * r)}"${paint}/>`;
    case 'diamond':
      return `<path d="M${num(x - r)},${num(y)}L${num(x)},${num(y - r)}L${num(x + r)},${num(y)}L${num(x)},${num(y + r)}Z"${paint}/>`;
    case 'stroke':
      return `<line x1="${num(x - r)}" y1="${num(y)}" x2="${num(x + r)}" y2="${num(y)}"${m.stroke ? strokeAttrs(m.stroke) : ''}/>`;
  }
}

function text(m: TextMark): string {
  const y = m.y + baselineShift(m.baseline, m.size);
  let attrs = `x="${num(m.x)}" y="${num(y)}"`;
  if (m.anchor !== 'start') attrs += ` text-anchor="${m.anchor}"`;
  attrs += ` font-size="${num(m.size)}"`;
  if (m.weight === 'bold') attrs += ' font-weight="bold"';
  attrs += ` fill="${escapeXml(m.fill)}"`;
  if (m.angle) attrs += ` transform="rotate(${num(m.angle)} ${num(m.x)} ${num(m.y)})"`;
  return `<text ${attrs}>${escapeXml(m.text)}</text>`;
}

interface Ids {
  prefix: string;
  clips: number;
}

function group(m: GroupMark, ids: Ids, out: string[]): void {
  let attrs = ` class="${idSafe(m.name)}"`;
  if (m.x !== 0 || m.y !== 0) attrs += ` transform="translate(${num(m.x)},${num(m.y)})"`;
  if (m.clip) {
    const id = `${ids.prefix}-clip${++ids.clips}`;
    out.push(`<clipPath id="${id}"><rect width="${num(m.clip.width)}" height="${num(m.clip.height)}"/></clipPath>`);
    attrs += ` clip-path="url(#${id})"`;
  }
  out.push(`<g${attrs}>`);
  for (const c of m.marks) mark(c, ids, out);
  out.push('</g>');
}

function mark(m: Mark, ids: Ids, out: string[]): void {
  switch (m.type) {
    case 'group':
      group(m, ids, out);
      return;
    case 'rect':
      if (!(m.width > 0 && m.height > 0)) return;
      out.push(
        `<rect x="${num(m.x)}" y="${num(m.y)}" width="${num(m.width)}" height="${num(m.height)}"${fillAttr(m.fill, m.fillOpacity)}${m.stroke ? strokeAttrs(m.stroke) : ''}/>`,
      );
      return;
    case 'line':
      out.push(
        `<line x1="${num(m.x1)}" y1="${num(m.y1)}" x2="${num(m.x2)}" y2="${num(m.y2)}"${strokeAttrs(m.stroke)}/>`,
      );
      return;
    case 'path': {
      let d = '';
      for (const seg of m.segments) {
        for (let i = 0; i + 1 < seg.length; i += 2) d += `${i === 0 ? 'M' : 'L'}${num(seg[i])},${num(seg[i + 1])}`;
      }
      if (d !== '') out.push(`<path d="${d}" fill="none"${strokeAttrs(m.stroke)}/>`);
      return;
    }
    case 'area': {
      let d = '';
      for (const seg of m.segments) {
        if (seg.length < 6) continue;
        for (let i = 0; i + 1 < seg.length; i += 2) d += `${i === 0 ? 'M' : 'L'}${num(seg[i])},${num(seg[i + 1])}`;
        d += 'Z';
      }
      if (d !== '') out.push(`<path d="${d}"${fillAttr(m.fill, m.fillOpacity)}/>`);
      return;
    }
    case 'symbol':
      out.push(symbol(m));
      return;
    case 'text':
      if (m.text !== '') out.push(text(m));
      return;
  }
}

/** The scene as an SVG document string (no XML declaration, ready to inline). */
export function sceneToSvg(scene: Scene, label: SvgLabel): string {
  const prefix = idSafe(label.idPrefix);
  const titleId = `${prefix}-title`;
  const descId = `${prefix}-desc`;
  const w = num(scene.width);
  const h = num(scene.height);
  const out: string[] = [
    `<svg xmlns="http://www.w3.org/2000/svg" role="img" aria-labelledby="${titleId} ${descId}" width="${w}" height="${h}" viewBox="0 0 ${w} ${h}">`,
    `<title id="${titleId}">${escapeXml(label.title)}</title>`,
    `<desc id="${descId}">${escapeXml(label.desc)}</desc>`,
    `<rect width="${w}" height="${h}"${fillAttr(scene.background)}/>`,
    `<g font-family="${escapeXml(FONT_FAMILY)}">`,
  ];
  const ids: Ids = { prefix, clips: 0 };
  for (const m of scene.marks) mark(m, ids, out);
  out.push('</g></svg>');
  return out.join('');
}
