/**
 * batchStreamWrites (src/render/pdf/streams.ts) leaves pdfkit's output as it was: a document drawn before
 * the change and the same document drawn after it are the same bytes, with text in an embedded TrueType
 * font, characters beyond Latin-1, vector paths, a binary image in the content and a structure tree (whose
 * objects the change writes itself). And Node's latin1
 * encoding keeps the low byte of each UTF-16 unit, which is what pdfkit's own conversion does (Node.js
 * documentation, Buffer, "latin1"; checked here on arbitrary strings).
 */
import { readFileSync } from 'node:fs';
import { inflateSync } from 'node:zlib';
import fc from 'fast-check';
import PDFDocument from 'pdfkit';
import { describe, expect, it } from 'vitest';
import { sourceSansFile } from '../../src/chart/fonts.js';
import { batchStreamWrites } from '../../src/render/pdf/streams.js';

// A 1×1 PNG (red), for a binary image stream written between text operators.
const PNG = Buffer.from(
  'iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mP8z8DwHwAFBQIAX8jx0gAAAABJRU5ErkJggg==',
  'base64',
);

function draw(patch: boolean, deflateLevel?: number): Promise<Buffer> {
  const doc = new PDFDocument({
    autoFirstPage: false,
    info: { CreationDate: new Date(0), ModDate: new Date(0) },
    tagged: true,
  });
  if (patch) batchStreamWrites(doc, { deflateLevel });
  const chunks: Buffer[] = [];
  const done = new Promise<Buffer>((resolve) => {
    doc.on('data', (c: Buffer) => chunks.push(c));
    doc.on('end', () => resolve(Buffer.concat(chunks)));
  });
  doc.registerFont('body', readFileSync(sourceSansFile('Regular')));
  doc.addPage();
  doc.font('body').fontSize(11).text('Water delivered: 5,946 ML (−3.2% on a year before) — Łódź, ½, “quoted”', 50, 50);
  doc.moveTo(50, 100).lineTo(300, 120).bezierCurveTo(320, 130, 340, 90, 360, 100).stroke('#0072B2');
  doc.image(PNG, 50, 140, { width: 20 });
  doc.font('Helvetica').text('Standard font after an image (ASCII only)', 50, 180);
  doc.addPage();
  doc.font('body').text('A second page', 50, 50);
  // Tagged content: the structure tree's objects (names, integers, references, attribute dictionaries).
  const root = doc.struct('Document');
  doc.addStructure(root);
  // (@types/pdfkit lacks the closure form and the scope and bbox options that pdfkit 0.20 has.)
  const struct = doc.struct.bind(doc) as unknown as (
    type: string,
    a?: unknown,
    b?: unknown,
  ) => PDFKit.PDFStructureElement;
  root.add(struct('P', () => doc.text('A tagged paragraph', 50, 80)));
  const table = doc.struct('Table');
  root.add(table);
  const row = doc.struct('TR');
  table.add(row);
  row.add(struct('TH', { scope: 'Row' }, () => doc.text('Jan 2024', 50, 110)));
  row.add(struct('TD', () => doc.text('1,234', 150, 110)));
  row.add(struct('Figure', { alt: 'A figure', bbox: [50, 130, 90, 150] }, () => doc.rect(50, 130, 40, 20).fill()));
  row.end();
  table.end();
  root.end();
  doc.end();
  return done;
}

/** Every Flate stream of a PDF, inflated (zlib, RFC 1950), as latin1 text. */
function inflatedStreams(pdf: Buffer): string[] {
  const text = pdf.toString('latin1');
  const out: string[] = [];
  const re = /(?<!end)stream\n/g;
  for (let m = re.exec(text); m; m = re.exec(text)) {
    const start = m.index + m[0].length;
    const end = text.indexOf('\nendstream', start);
    if (end < 0) break;
    try {
      out.push(inflateSync(pdf.subarray(start, end)).toString('latin1'));
    } catch {
      // Not compressed (the image's raw samples are).
    }
    re.lastIndex = end;
  }
  return out;
}

describe('batchStreamWrites', () => {
  it('gives the bytes pdfkit gives without it', async () => {
    const before = await draw(false);
    const after = await draw(true);
    expect(after.length).toBeGreaterThan(1000);
    expect(after.equals(before)).toBe(true);
    // zlib's default level, asked for explicitly, is the level pdfkit uses.
    expect((await draw(true, 6)).equals(before)).toBe(true);
  });

  it('compresses at the level asked for, with the same stream contents', async () => {
    const before = await draw(false);
    const fast = await draw(true, 1);
    expect(fast.equals(before)).toBe(false);
    expect(inflatedStreams(fast)).toEqual(inflatedStreams(before));
    expect(inflatedStreams(before).length).toBeGreaterThan(2);
  });

  it('relies on latin1 keeping the low byte of every UTF-16 unit (Node.js Buffer documentation)', () => {
    // Any UTF-16 unit, lone surrogates included.
    const unit = fc.integer({ min: 0, max: 0xffff }).map((c) => String.fromCharCode(c));
    fc.assert(
      fc.property(fc.string({ unit, maxLength: 64 }), (s) => {
        const units = Uint8Array.from({ length: s.length }, (_, i) => s.charCodeAt(i) & 0xff);
        return Buffer.from(s, 'latin1').equals(Buffer.from(units));
      }),
    );
  });
});
