/**
 * Charts in the PDF brief, under their title and caption (as in the HTML brief, the caption sits above the
 * chart), the three kept on one page and the figure tagged with the chart's alt text. A chart is drawn from
 * its scene (src/vocabulary/scene.ts) straight into pdfkit's vector operators — the same marks its SVG was
 * written from, with no SVG parsed — and its text in our embedded Source Sans 3 faces. A chart without a
 * scene, and any other SVG (the masthead's logo), goes through the SVG drawers: the direct one for the
 * plain subset (simple-svg.ts), else svg-to-pdfkit, loaded only then.
 */
import { createRequire } from 'node:module';
import type { Chart } from '../../vocabulary/brief.js';
import {
  baselineShift,
  type GroupMark,
  type Mark,
  type Scene,
  type Stroke,
  type SymbolMark,
  symbolRadius,
  type TextMark,
} from '../../vocabulary/scene.js';
import { svgFont } from './fonts.js';
import { ensure, type Flow, setBlock, space } from './layout.js';
import { Ops } from './ops.js';
import { drawSimpleSvg, Unsupported } from './simple-svg.js';
import { leaf, type Struct } from './tags.js';
import { drawText, lineBlock, measureText } from './text.js';

type SvgToPdf = (
  doc: PDFKit.PDFDocument,
  svg: string,
  x: number,
  y: number,
  options: {
    width: number;
    height: number;
    fontCallback: (family: string, bold: boolean, italic: boolean) => string;
    warningCallback: (message: string) => void;
    /** What pdfkit opens for an <image>'s href. */
    imageCallback: (link: string) => string;
  },
) => void;

let svgToPdf: SvgToPdf | undefined;

/** svg-to-pdfkit, required on first use: most briefs never need it. */
function SVGtoPDF(...args: Parameters<SvgToPdf>): void {
  svgToPdf ??= createRequire(import.meta.url)('svg-to-pdfkit') as SvgToPdf;
  svgToPdf(...args);
}

/** CSS px to pt. */
const PX = 0.75;

export function drawChart(flow: Flow, parent: Struct, chart: Chart): void {
  const { doc, geo, theme } = flow;
  const scale = Math.min(1, geo.column / (chart.width * PX));
  const width = chart.width * PX * scale;
  const height = chart.height * PX * scale;
  // Title and caption go through the brief's own text setter (fallback fonts, right-to-left runs), measured once.
  const title = measureText(doc, chart.title, theme.chartTitle, geo.column);
  const caption = measureText(doc, chart.caption, theme.chartCaption, geo.column);
  ensure(flow, title.height + caption.height + 4 + height);
  leaf(doc, parent, 'P', () => setBlock(flow, title, geo.left));
  leaf(doc, parent, 'P', () => setBlock(flow, caption, geo.left));
  flow.y += 4;
  const x = geo.left;
  const y = flow.y;
  const { scene } = chart;
  const draw = scene
    ? () => drawScene(doc, scene, x, y, width / scene.width)
    : () => drawSvg(doc, chart.svg, x, y, width, height);
  leaf(doc, parent, 'Figure', draw, {
    alt: chart.alt,
    bbox: [x, y, x + width, y + height],
  });
  flow.y = y + height;
  space(flow, 14);
}

/**
 * An SVG as vectors in the box (x, y, width, height), its text in our fonts: by the direct drawer when the
 * SVG keeps to the chart stage's plain subset, else by svg-to-pdfkit.
 */
export function drawSvg(
  doc: PDFKit.PDFDocument,
  svg: string,
  x: number,
  y: number,
  width: number,
  height: number,
): void {
  try {
    drawSimpleSvg(doc, svg, x, y, width, height);
    return;
  } catch (e) {
    if (!(e instanceof Unsupported)) throw e;
  }
  SVGtoPDF(doc, printableSvg(svg), x, y, {
    width,
    height,
    fontCallback: svgFont,
    // An <image> is opened by pdfkit, which reads a path as a file: only an embedded PNG or JPEG is drawn
    // (the logo is cleaned before it gets here, brief/svg-safe.ts; this is the second lock).
    imageCallback: (link: string) => (/^data:image\/(?:png|jpeg);base64,/.test(link) ? link.replace(/\s+/g, '') : ''),
    // svg-to-pdfkit warns about SVG features it skips (ARIA attributes and the like); none carry marks.
    warningCallback: () => {},
  });
}

/**
 * The SVG with what pdfkit refuses made equivalent: a dash pattern holding a zero length ("1,0" is vega's
 * solid line) throws in pdfkit's dash(), so a pattern without gaps becomes a plain line and any other zero
 * becomes a hair's breadth.
 */
export function printableSvg(svg: string): string {
  return svg.replace(/\sstroke-dasharray="([^"]*)"/g, (whole, list: string) => {
    const values = list
      .split(/[\s,]+/)
      .filter((v) => v !== '')
      .map(Number);
    if (values.length === 0 || values.some((v) => !Number.isFinite(v) || v < 0)) return '';
    const doubled = values.length % 2 === 1 ? [...values, ...values] : values;
    const gaps = doubled.filter((_, i) => i % 2 === 1);
    if (gaps.every((g) => g === 0)) return '';
    if (!values.includes(0)) return whole;
    return ` stroke-dasharray="${values.map((v) => (v === 0 ? 0.001 : v)).join(',')}"`;
  });
}

/**
 * A coordinate rounded to 0.01 px, as the chart's SVG writes it (scene-svg.ts): the same drawing, and
 * shorter numbers in the content stream than pdfkit's six decimals.
 */
function r(v: number): number {
  return Math.round(v * 100) / 100;
}

/** A scene with its top left corner at (x, y), `k` points to the px. */
export function drawScene(doc: PDFKit.PDFDocument, scene: Scene, x: number, y: number, k: number): void {
  doc.save();
  doc.transform(k, 0, 0, k, x, y);
  const ops = new Ops(doc);
  if (scene.background) {
    ops.rect(0, 0, scene.width, scene.height);
    ops.colour(scene.background, false);
    ops.raw('f');
  }
  for (const m of scene.marks) drawMark(doc, ops, m);
  ops.flush();
  doc.restore();
}

function drawMark(doc: PDFKit.PDFDocument, ops: Ops, m: Mark): void {
  /** Each segment (x0, y0, x1, y1, …) as a subpath, closed for an area. */
  const trace = (segments: number[][], close: boolean): void => {
    for (const seg of segments) {
      ops.moveTo(r(seg[0]), r(seg[1]));
      for (let i = 2; i + 1 < seg.length; i += 2) ops.lineTo(r(seg[i]), r(seg[i + 1]));
      if (close) ops.closePath();
    }
  };
  switch (m.type) {
    case 'group':
      drawGroup(doc, ops, m);
      return;
    case 'rect':
      if (!(m.width > 0 && m.height > 0)) return;
      paint(doc, ops, () => ops.rect(r(m.x), r(m.y), r(m.width), r(m.height)), m.fill, m.fillOpacity, m.stroke);
      return;
    case 'line':
      paint(doc, ops, () => ops.moveTo(r(m.x1), r(m.y1)).lineTo(r(m.x2), r(m.y2)), null, undefined, m.stroke);
      return;
    case 'path': {
      const drawn = m.segments.filter((seg) => seg.length >= 4);
      if (drawn.length === 0) return;
      paint(doc, ops, () => trace(drawn, false), null, undefined, m.stroke);
      return;
    }
    case 'area': {
      const drawn = m.segments.filter((seg) => seg.length >= 6);
      if (drawn.length === 0) return;
      paint(doc, ops, () => trace(drawn, true), m.fill, m.fillOpacity, undefined);
      return;
    }
    case 'symbol':
      drawSymbol(doc, ops, m);
      return;
    case 'text':
      ops.flush();
      drawSceneText(doc, m);
      return;
  }
}

function drawGroup(doc: PDFKit.PDFDocument, ops: Ops, g: GroupMark): void {
  const moved = g.x !== 0 || g.y !== 0;
  const state = moved || g.clip !== undefined;
  if (state) {
    ops.flush();
    doc.save();
  }
  if (moved) doc.translate(g.x, g.y);
  if (g.clip) doc.rect(0, 0, g.clip.width, g.clip.height).clip();
  for (const m of g.marks) drawMark(doc, ops, m);
  if (state) {
    ops.flush();
    doc.restore();
  }
}

/**
 * Traces a shape and fills and/or strokes it. Opacity and dashes live in the graphics state, so a mark
 * that sets either is wrapped in save/restore and leaves nothing behind for the next one.
 */
function paint(
  doc: PDFKit.PDFDocument,
  ops: Ops,
  trace: () => void,
  fill: string | null,
  fillOpacity: number | undefined,
  stroke: Stroke | undefined,
): void {
  const stroked = stroke !== undefined && stroke.width > 0;
  if (fill === null && !stroked) return;
  const fillFaded = fill !== null && fillOpacity !== undefined && fillOpacity < 1;
  const strokeFaded = stroked && stroke.opacity !== undefined && stroke.opacity < 1;
  const dashed = stroked && stroke.dash !== undefined;
  const state = fillFaded || strokeFaded || dashed;
  // No transform inside the pair, so pdfkit's own save/restore would only write these two operators.
  if (state) ops.raw('q');
  trace();
  if (fill !== null) {
    ops.colour(fill, false);
    if (fillFaded) {
      ops.flush();
      doc.fillOpacity(fillOpacity);
    }
  }
  if (stroked) {
    ops.colour(stroke.colour, true);
    if (strokeFaded) {
      ops.flush();
      doc.strokeOpacity(stroke.opacity as number);
    }
    ops
      .lineWidth(stroke.width)
      .lineCap(stroke.cap ?? 'butt')
      .lineJoin(stroke.join ?? 'miter');
    if (stroke.dash) {
      ops.flush();
      doc.dash(stroke.dash[0], { space: stroke.dash[1] });
    }
  }
  if (fill !== null && stroked) ops.raw('B');
  else if (fill !== null) ops.raw('f');
  else ops.raw('S');
  if (state) ops.raw('Q');
}

function drawSymbol(doc: PDFKit.PDFDocument, ops: Ops, m: SymbolMark): void {
  const h = symbolRadius(m.size);
  const [x, y] = [r(m.x), r(m.y)];
  switch (m.shape) {
    case 'circle':
      paint(doc, ops, () => ops.circle(x, y, r(h)), m.fill, undefined, m.stroke);
      return;
    case 'square':
      paint(doc, ops, () => ops.rect(r(x - h), r(y - h), r(2 * h), r(2 * h)), m.fill, undefined, m.stroke);
      return;
    case 'diamond':
      paint(
        doc,
        ops,
        () =>
          ops
            .moveTo(r(x - h), y)
            .lineTo(x, r(y - h))
            .lineTo(r(x + h), y)
            .lineTo(x, r(y + h))
            .closePath(),
        m.fill,
        undefined,
        m.stroke,
      );
      return;
    case 'stroke':
      paint(doc, ops, () => ops.moveTo(r(x - h), y).lineTo(r(x + h), y), null, undefined, m.stroke);
      return;
  }
}

/** One line of chart text on its alphabetic baseline, anchored by its width as pdfkit sets it. */
function drawSceneText(doc: PDFKit.PDFDocument, m: TextMark): void {
  if (m.text === '') return;
  // The brief's own one-line setter: labels holding Hebrew, Arabic or emoji get their fallback fonts here too.
  const b = lineBlock(doc, m.text, {
    face: m.weight === 'bold' ? 'Semibold' : 'Regular',
    size: m.size,
    colour: m.fill,
    lineGap: 0,
  });
  const dx = m.anchor === 'middle' ? -b.width / 2 : m.anchor === 'end' ? -b.width : 0;
  const baseline = m.y + baselineShift(m.baseline, m.size);
  if (m.angle) {
    doc.save();
    doc.rotate(m.angle, { origin: [m.x, m.y] });
  }
  drawText(doc, b, r(m.x + dx), r(baseline) - b.ascent);
  if (m.angle) doc.restore();
}
