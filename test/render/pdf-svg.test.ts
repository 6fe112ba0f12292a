/**
 * The PDF's chart drawers against svg-to-pdfkit, an independent SVG-to-PDF implementation: every chart of
 * the examples drawn from its scene (charts.ts, what the brief does) and from its SVG by the direct SVG
 * drawer (simple-svg.ts, for SVG without a scene), each rasterised by poppler, must look like
 * svg-to-pdfkit's drawing of the chart's SVG; SVG outside the plain subset must be refused (and then drawn
 * by svg-to-pdfkit); transforms compose as the SVG specification says.
 */

import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { drawScene, drawSvg, printableSvg } from '../../src/render/pdf/charts.js';
import { BriefDocument } from '../../src/render/pdf/document.js';
import { registerFonts, svgFont } from '../../src/render/pdf/fonts.js';
import { drawSimpleSvg, parseTransform, Unsupported } from '../../src/render/pdf/simple-svg.js';
import type { Chart } from '../../src/vocabulary/brief.js';
import { exampleBriefs } from './files-pdf/examples.js';
import { grayPage, normalise, pdfText } from './files-pdf/poppler.js';

const SVGtoPDF = createRequire(import.meta.url)('svg-to-pdfkit') as (
  doc: PDFKit.PDFDocument,
  svg: string,
  x: number,
  y: number,
  o: object,
) => void;

let dir: string;
let charts: Chart[] = [];

beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), 'trendbrief-svg-test-'));
  for (const name of ['water-deliveries', 'online-orders'] as const)
    charts = charts.concat((await exampleBriefs(name))[0].series[0].charts);
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** A one-page PDF of the chart at print size (640 px → 480 pt), drawn by draw. */
async function onePage(chart: Chart, draw: (doc: PDFKit.PDFDocument, w: number, h: number) => void): Promise<string> {
  const w = chart.width * 0.75;
  const h = chart.height * 0.75;
  const doc = new BriefDocument({ size: [w, h], margin: 0, autoFirstPage: false });
  const chunks: Buffer[] = [];
  doc.on('data', (c: Buffer) => chunks.push(c));
  const done = new Promise<Buffer>((resolve) => doc.on('end', () => resolve(Buffer.concat(chunks))));
  registerFonts(doc);
  doc.addPage();
  draw(doc, w, h);
  doc.end();
  const file = join(dir, `${chart.id}-${chunks.length}-${Math.random().toString(36).slice(2)}.pdf`);
  writeFileSync(file, await done);
  return file;
}

/** svg-to-pdfkit's drawing of a chart's SVG at print size: the reference. */
function referencePage(chart: Chart): Promise<string> {
  return onePage(chart, (doc, w, h) =>
    SVGtoPDF(doc, printableSvg(chart.svg), 0, 0, {
      width: w,
      height: h,
      fontCallback: svgFont,
      warningCallback: () => {},
    }),
  );
}

/**
 * The drawing in `file` looks like svg-to-pdfkit's in `reference`, and its words are real text. At 1 px =
 * 1 pt the two differ only in anti-aliasing along edges and sub-point text placement. Seen on these charts:
 * at most 1.2 grey levels in 255 on average, and at most 0.14% of pixels by more than 96 levels; the bounds
 * are about three times that. One missing line (580 px long, 1.5 px wide, about 1.1% of a 480 × 165 px
 * chart) breaks the second bound; missing labels fail the text check.
 */
function expectSameDrawing(chart: Chart, file: string, reference: string): void {
  const a = grayPage(file, 1, 72, dir);
  const b = grayPage(reference, 1, 72, dir);
  expect([a.width, a.height]).toEqual([b.width, b.height]);
  let sum = 0;
  let strong = 0;
  let inkA = 0;
  for (let i = 0; i < a.pixels.length; i++) {
    const d = Math.abs(a.pixels[i] - b.pixels[i]);
    sum += d;
    if (d > 96) strong++;
    if (a.pixels[i] < 200) inkA++;
  }
  expect(sum / a.pixels.length, chart.id).toBeLessThan(3);
  expect(strong / a.pixels.length, chart.id).toBeLessThan(0.004);
  expect(inkA / a.pixels.length, chart.id).toBeGreaterThan(0.02);
  // Its words are real text, in the order the SVG gives them.
  const words = normalise(pdfText(file));
  const labels = [...chart.svg.matchAll(/<text[^>]*>([^<]+)<\/text>/g)].map((m) =>
    normalise(m[1].replace(/&amp;/g, '&')),
  );
  expect(labels.length).toBeGreaterThan(3);
  for (const label of labels) expect(words.includes(label), `${chart.id}: "${label}"`).toBe(true);
}

describe('the scene drawer', () => {
  it('draws every example chart from its scene as svg-to-pdfkit draws its SVG', async () => {
    expect(charts.length).toBe(12);
    for (const chart of charts) {
      const scene = chart.scene;
      if (!scene) throw new Error(`${chart.id} has no scene`);
      const direct = await onePage(chart, (doc, w) => drawScene(doc, scene, 0, 0, w / scene.width));
      expectSameDrawing(chart, direct, await referencePage(chart));
    }
  });
});

describe('the direct SVG drawer', () => {
  it('draws every example chart’s SVG without falling back, as svg-to-pdfkit draws it', async () => {
    expect(charts.length).toBe(12);
    for (const chart of charts) {
      const direct = await onePage(chart, (doc, w, h) => drawSimpleSvg(doc, chart.svg, 0, 0, w, h));
      expectSameDrawing(chart, direct, await referencePage(chart));
    }
  });

  it.each([
    ['an ellipse', '<svg width="10" height="10"><ellipse cx="5" cy="5" rx="4" ry="2"/></svg>'],
    ['a text position list', '<svg width="10" height="10"><text x="1 2 3" y="8">abc</text></svg>'],
    ['a clip path', '<svg width="10" height="10"><g clip-path="url(#c)"><path d="M0,0L5,5"/></g></svg>'],
    ['a gradient fill', '<svg width="10" height="10"><path d="M0,0L5,5" fill="url(#g)"/></svg>'],
    ['a style attribute', '<svg width="10" height="10"><path d="M0,0L5,5" style="fill:red"/></svg>'],
    ['a tspan', '<svg width="10" height="10"><text transform="translate(1,8)">a<tspan>b</tspan></text></svg>'],
    ['group opacity', '<svg width="10" height="10"><g opacity="0.5"><path d="M0,0L5,5"/></g></svg>'],
    ['an rgb() colour', '<svg width="10" height="10"><path d="M0,0L5,5" fill="rgb(1,2,3)"/></svg>'],
    ['a skewX transform', '<svg width="10" height="10"><g transform="skewX(10)"><path d="M0,0L5,5"/></g></svg>'],
  ])('refuses %s, leaving the page untouched', async (_, svg) => {
    const doc = new BriefDocument({ autoFirstPage: false });
    registerFonts(doc);
    doc.addPage();
    expect(() => drawSimpleSvg(doc, svg, 0, 0, 100, 100)).toThrow(Unsupported);
    // Then drawSvg hands it to svg-to-pdfkit, which draws it without complaint.
    expect(() => drawSvg(doc, svg, 0, 0, 100, 100)).not.toThrow();
    doc.end();
  });

  it('composes transforms left to right (SVG 1.1 §7.5)', () => {
    // translate(10,20) rotate(90): the point (1,0) rotates to (0,1), then moves to (10,21);
    // as a matrix [a b c d e f] = [cos sin −sin cos 10 20] = [0 1 −1 0 10 20].
    const m = parseTransform('translate(10,20) rotate(90)');
    expect(m.map((v) => Math.round(v * 1e12) / 1e12)).toEqual([0, 1, -1, 0, 10, 20]);
    // scale(2) translate(3,4): the translation is scaled, e = 2·3 = 6, f = 2·4 = 8.
    expect(parseTransform('scale(2) translate(3,4)')).toEqual([2, 0, 0, 2, 6, 8]);
    // rotate(180, 5, 5) maps (0,0) to (10,10): e = 5 − (−1)·5 = 10.
    const r = parseTransform('rotate(180 5 5)').map((v) => Math.round(v * 1e12) / 1e12);
    expect(r).toEqual([-1, 0, -0, -1, 10, 10]);
  });

  it('turns vega’s solid dash pattern into a plain line for svg-to-pdfkit, which rejects zero lengths', () => {
    expect(printableSvg('<path stroke-dasharray="1,0" d="M0,0"/>')).toBe('<path d="M0,0"/>');
    expect(printableSvg('<path stroke-dasharray="6,4" d="M0,0"/>')).toBe('<path stroke-dasharray="6,4" d="M0,0"/>');
    expect(printableSvg('<path stroke-dasharray="0,4" d="M0,0"/>')).toBe('<path stroke-dasharray="0.001,4" d="M0,0"/>');
  });
});
