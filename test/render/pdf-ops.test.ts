/**
 * The chart drawer's operator writer (src/render/pdf/ops.ts) against pdfkit itself: random paths, circles,
 * rectangles, colours (long and short hex, CSS names, one pdfkit does not know) and line styles, drawn once
 * through pdfkit's own calls (moveTo, lineTo, rect, circle, fillColor, strokeColor, lineWidth, lineCap,
 * lineJoin, fill, stroke, fillAndStroke, save, restore) and once through Ops, give the same PDF bytes.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { BriefDocument } from '../../src/render/pdf/document.js';
import { Ops, pdfNumber } from '../../src/render/pdf/ops.js';

type Shape =
  | { kind: 'path'; points: number[] }
  | { kind: 'circle'; x: number; y: number; r: number }
  | { kind: 'rect'; x: number; y: number; w: number; h: number };

interface Mark {
  shape: Shape;
  fill: string | null;
  stroke: { colour: string; width: number; cap: 'butt' | 'round' | 'square'; join: 'miter' | 'round' | 'bevel' } | null;
  saved: boolean;
}

const coord = fc.double({ min: -50, max: 700, noNaN: true });
const colour = fc.oneof(
  fc.integer({ min: 0, max: 0xffffff }).map((v) => `#${v.toString(16).padStart(6, '0')}`),
  fc.integer({ min: 0, max: 0xfff }).map((v) => `#${v.toString(16).padStart(3, '0')}`),
  fc.constantFrom('white', 'black', 'steelblue', 'none'),
);
const shape: fc.Arbitrary<Shape> = fc.oneof(
  fc
    .array(coord, { minLength: 4, maxLength: 40 })
    .map((p) => ({ kind: 'path' as const, points: p.length % 2 ? p.slice(1) : p })),
  fc.record({
    kind: fc.constant('circle' as const),
    x: coord,
    y: coord,
    r: fc.double({ min: 0.1, max: 20, noNaN: true }),
  }),
  fc.record({ kind: fc.constant('rect' as const), x: coord, y: coord, w: coord, h: coord }),
);
const mark: fc.Arbitrary<Mark> = fc.record({
  shape,
  fill: fc.option(colour),
  stroke: fc.option(
    fc.record({
      colour,
      width: fc.double({ min: 0.1, max: 4, noNaN: true }),
      cap: fc.constantFrom('butt' as const, 'round' as const, 'square' as const),
      join: fc.constantFrom('miter' as const, 'round' as const, 'bevel' as const),
    }),
  ),
  saved: fc.boolean(),
});

function page(draw: (doc: PDFKit.PDFDocument) => void): Promise<Buffer> {
  const doc = new BriefDocument({
    autoFirstPage: false,
    info: { CreationDate: new Date(0), ModDate: new Date(0) },
    deflateLevel: 1,
  });
  const chunks: Buffer[] = [];
  const done = new Promise<Buffer>((resolve) => {
    doc.on('data', (c: Buffer) => chunks.push(c));
    doc.on('end', () => resolve(Buffer.concat(chunks)));
  });
  doc.addPage();
  draw(doc);
  doc.end();
  return done;
}

/** The drawing calls a mark needs, made through pdfkit or through Ops. */
interface Pen {
  save(): void;
  restore(): void;
  moveTo(x: number, y: number): void;
  lineTo(x: number, y: number): void;
  closePath(): void;
  rect(x: number, y: number, w: number, h: number): void;
  circle(x: number, y: number, r: number): void;
  fillColour(colour: string): void;
  strokeStyle(s: NonNullable<Mark['stroke']>): void;
  paint(op: 'B' | 'f' | 'S'): void;
  done(): void;
}

function pdfkitPen(doc: PDFKit.PDFDocument): Pen {
  return {
    save: () => doc.save(),
    restore: () => doc.restore(),
    moveTo: (x, y) => doc.moveTo(x, y),
    lineTo: (x, y) => doc.lineTo(x, y),
    closePath: () => doc.closePath(),
    rect: (x, y, w, h) => doc.rect(x, y, w, h),
    circle: (x, y, r) => doc.circle(x, y, r),
    fillColour: (c) => doc.fillColor(c),
    strokeStyle: (st) => doc.strokeColor(st.colour).lineWidth(st.width).lineCap(st.cap).lineJoin(st.join),
    paint: (op) => (op === 'B' ? doc.fillAndStroke() : op === 'f' ? doc.fill() : doc.stroke()),
    done: () => {},
  };
}

function opsPen(doc: PDFKit.PDFDocument): Pen {
  const ops = new Ops(doc);
  return {
    save: () => ops.raw('q'),
    restore: () => ops.raw('Q'),
    moveTo: (x, y) => ops.moveTo(x, y),
    lineTo: (x, y) => ops.lineTo(x, y),
    closePath: () => ops.closePath(),
    rect: (x, y, w, h) => ops.rect(x, y, w, h),
    circle: (x, y, r) => ops.circle(x, y, r),
    fillColour: (c) => ops.colour(c, false),
    strokeStyle: (st) => {
      ops.colour(st.colour, true);
      ops.lineWidth(st.width).lineCap(st.cap).lineJoin(st.join);
    },
    paint: (op) => ops.raw(op),
    done: () => ops.flush(),
  };
}

function draw(pen: Pen, marks: Mark[]): void {
  for (const m of marks) {
    if (m.saved) pen.save();
    const s = m.shape;
    if (s.kind === 'circle') pen.circle(s.x, s.y, s.r);
    else if (s.kind === 'rect') pen.rect(s.x, s.y, s.w, s.h);
    else {
      pen.moveTo(s.points[0], s.points[1]);
      for (let i = 2; i < s.points.length; i += 2) pen.lineTo(s.points[i], s.points[i + 1]);
      pen.closePath();
    }
    if (m.fill !== null) pen.fillColour(m.fill);
    if (m.stroke) pen.strokeStyle(m.stroke);
    pen.paint(m.fill !== null && m.stroke ? 'B' : m.fill !== null ? 'f' : 'S');
    if (m.saved) pen.restore();
  }
  pen.done();
}

describe('Ops, the chart drawer’s operator writer', () => {
  it('writes the bytes pdfkit’s own drawing calls write (fast-check, 150 random pages)', async () => {
    await fc.assert(
      fc.asyncProperty(fc.array(mark, { minLength: 1, maxLength: 25 }), async (marks) => {
        const [a, b] = await Promise.all([page((d) => draw(pdfkitPen(d), marks)), page((d) => draw(opsPen(d), marks))]);
        expect(b.equals(a)).toBe(true);
      }),
      { numRuns: 150 },
    );
  });

  it('leaves pdfkit’s remembered fill colour as fillColor does', async () => {
    const seen: unknown[] = [];
    await page((d) => {
      d.fillColor('#123456');
      seen.push((d as unknown as { _fillColor: unknown })._fillColor);
      const ops = new Ops(d);
      ops.colour('#654321', false);
      ops.flush();
      seen.push((d as unknown as { _fillColor: unknown })._fillColor);
    });
    expect(seen).toEqual([
      ['#123456', undefined],
      ['#654321', undefined],
    ]);
  });

  it('formats numbers as pdfkit does: six decimals, no minus zero, out-of-range refused', () => {
    expect(pdfNumber(1 / 3)).toBe('0.333333');
    expect(pdfNumber(-0.0000001)).toBe('0');
    expect(pdfNumber(12.5)).toBe('12.5');
    expect(() => pdfNumber(Number.NaN)).toThrow(/unsupported number/);
  });
});
