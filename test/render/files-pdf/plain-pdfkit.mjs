/**
 * One small pdfkit document, drawn only through pdfkit's public calls: text in an embedded TrueType font
 * with characters beyond Latin-1, vector paths, a binary image in the content, a standard font, two pages
 * and a structure tree. test/render/pdf-document.test.ts draws it in its own process (after briefs) and in
 * a fresh one (`node plain-pdfkit.mjs FONT`, which writes the file to standard output) and compares them.
 */
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import PDFDocument from 'pdfkit';

// A 1×1 PNG (red), for a binary image stream written between text operators.
const PNG = Buffer.from(
  'iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mP8z8DwHwAFBQIAX8jx0gAAAABJRU5ErkJggg==',
  'base64',
);

/**
 * Draws the document on `make(options)` (pdfkit's PDFDocument unless given) with the font file at `font`;
 * `title` goes into the Info dictionary and the XMP packet.
 */
export function drawPlain(font, make = (options) => new PDFDocument(options), title = 'Rivers and lakes') {
  const doc = make({
    autoFirstPage: false,
    info: { CreationDate: new Date(0), ModDate: new Date(0), Title: title },
    tagged: true,
    pdfVersion: '1.7',
    bufferPages: true,
  });
  const chunks = [];
  const done = new Promise((resolve, reject) => {
    doc.on('data', (c) => chunks.push(c));
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });
  doc.registerFont('body', readFileSync(font));
  doc.addPage();
  doc.font('body').fontSize(11).text('Water delivered: 5,946 ML (−3.2% on a year before) — Łódź, ½, “quoted”', 50, 50);
  doc.moveTo(50, 100).lineTo(300, 120).bezierCurveTo(320, 130, 340, 90, 360, 100).stroke('#0072B2');
  doc.image(PNG, 50, 140, { width: 20 });
  doc.font('Helvetica').text('Standard font after an image (ASCII only)', 50, 180);
  doc.addPage();
  doc.font('body').text('A second page', 50, 50);
  const root = doc.struct('Document');
  doc.addStructure(root);
  root.add(doc.struct('P', () => doc.text('A tagged paragraph', 50, 80)));
  const table = doc.struct('Table');
  root.add(table);
  const row = doc.struct('TR');
  table.add(row);
  row.add(doc.struct('TH', { scope: 'Row' }, () => doc.text('Jan 2024', 50, 110)));
  row.add(doc.struct('TD', () => doc.text('1,234', 150, 110)));
  row.add(doc.struct('Figure', { alt: 'A figure', bbox: [50, 130, 90, 150] }, () => doc.rect(50, 130, 40, 20).fill()));
  row.end();
  table.end();
  doc.switchToPage(0);
  doc.markContent('Artifact', { type: 'Pagination' });
  doc.text('Page 1', 50, 700);
  doc.endMarkedContent();
  root.end();
  doc.end();
  return done;
}

if (process.argv[1] === fileURLToPath(import.meta.url)) {
  process.stdout.write(await drawPlain(process.argv[2]));
}
