/**
 * Charts in the PDF brief: the chart stage's SVG drawn as vectors by svg-to-pdfkit, under its title and
 * caption (as in the HTML brief, the caption sits above the chart), the three kept on one page and the
 * figure tagged with the chart's alt text.
 */
import { createRequire } from 'node:module';
import type { Chart } from '../../brief/model.js';
import { svgFont } from './fonts.js';
import { ensure, type Flow, setStyle, space, textHeight } from './layout.js';
import { drawSimpleSvg, Unsupported } from './simple-svg.js';
import { leaf, type Struct } from './tags.js';

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
  },
) => void;

const SVGtoPDF = createRequire(import.meta.url)('svg-to-pdfkit') as SvgToPdf;

/** CSS px to pt. */
const PX = 0.75;

export function drawChart(flow: Flow, parent: Struct, chart: Chart): void {
  const { doc, geo, theme } = flow;
  const scale = Math.min(1, geo.column / (chart.width * PX));
  const width = chart.width * PX * scale;
  const height = chart.height * PX * scale;
  const titleHeight = textHeight(doc, theme.chartTitle, chart.title, geo.column);
  const captionHeight = textHeight(doc, theme.chartCaption, chart.caption, geo.column);
  ensure(flow, titleHeight + captionHeight + 4 + height);
  leaf(doc, parent, 'P', () => {
    setStyle(doc, theme.chartTitle);
    doc.text(chart.title, geo.left, flow.y, { width: geo.column, lineGap: theme.chartTitle.lineGap });
  });
  flow.y = doc.y;
  leaf(doc, parent, 'P', () => {
    setStyle(doc, theme.chartCaption);
    doc.text(chart.caption, geo.left, flow.y, { width: geo.column, lineGap: theme.chartCaption.lineGap });
  });
  flow.y = doc.y + 4;
  const x = geo.left;
  const y = flow.y;
  leaf(doc, parent, 'Figure', () => drawSvg(doc, chart.svg, x, y, width, height), {
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
