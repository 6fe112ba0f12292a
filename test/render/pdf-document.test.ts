/**
 * The brief's pdfkit document (src/render/pdf/document.ts) changes pdfkit for its own instances only:
 * - drawn on it, a document is the bytes pdfkit gives (at zlib's default level), or the same stream
 *   contents at another level;
 * - pdfkit's prototypes are the same functions after briefs have been drawn as before, and a plain pdfkit
 *   document drawn in this process after briefs is the same file as one drawn in a fresh process;
 * - Node's latin1 encoding keeps the low byte of each UTF-16 unit, which is what pdfkit's own conversion
 *   does (Node.js documentation, Buffer, "latin1"; checked here on arbitrary strings).
 */
import { execFileSync } from 'node:child_process';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { inflateSync } from 'node:zlib';
import fc from 'fast-check';
import PDFDocument from 'pdfkit';
import { describe, expect, it } from 'vitest';
import { sourceSansFile } from '../../src/chart/fonts.js';
import { exampleBriefs } from './files-pdf/examples.js';

const FIXTURE = fileURLToPath(new URL('./files-pdf/plain-pdfkit.mjs', import.meta.url));
const FONT = sourceSansFile('Regular');

type Make = (options: object) => PDFKit.PDFDocument;
const { drawPlain } = (await import(pathToFileURL(FIXTURE).href)) as {
  drawPlain(font: string, make?: Make, title?: string): Promise<Buffer>;
};

/** Every function on pdfkit's prototypes (document, its mixins' methods, page, reference), by name. */
function pdfkitPrototypes(): Map<string, unknown> {
  const out = new Map<string, unknown>();
  const doc = new PDFDocument({ autoFirstPage: false });
  doc.addPage();
  const protos: [string, object][] = [
    ['document', PDFDocument.prototype],
    ['page', Object.getPrototypeOf(doc.page)],
    ['reference', Object.getPrototypeOf(doc.ref({}))],
    ['structure element', Object.getPrototypeOf(doc.struct('P'))],
  ];
  for (const [name, proto] of protos) {
    for (let p: object | null = proto; p && p !== Object.prototype; p = Object.getPrototypeOf(p)) {
      for (const key of Object.getOwnPropertyNames(p)) {
        const d = Object.getOwnPropertyDescriptor(p, key);
        out.set(`${name}.${key}`, d?.value ?? d?.get);
      }
    }
  }
  return out;
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

// Taken before anything of the PDF engine is loaded (nothing imported above loads it).
const pristine = pdfkitPrototypes();

describe('the brief document leaves pdfkit as it is for everyone else', () => {
  it('keeps every pdfkit prototype, and a plain document drawn after briefs is a fresh process’s file', async () => {
    const before = pristine;
    expect(before.size).toBeGreaterThan(100);
    // The PDF engine loaded and two briefs drawn, one of them PDF/A.
    const { renderPdf } = await import('../../src/render/pdf/index.js');
    const [water] = await exampleBriefs('water-deliveries');
    expect((await renderPdf(water)).length).toBeGreaterThan(10_000);
    expect((await renderPdf(water, { archival: true })).length).toBeGreaterThan(10_000);
    const after = pdfkitPrototypes();
    expect([...after.keys()]).toEqual([...before.keys()]);
    for (const [key, value] of before) expect(after.get(key), key).toBe(value);

    const here = await drawPlain(FONT);
    const fresh = execFileSync(process.execPath, [FIXTURE, FONT], { maxBuffer: 1 << 26 });
    expect(here.length).toBeGreaterThan(5000);
    expect(here.equals(fresh)).toBe(true);
  });
});

describe('BriefDocument', async () => {
  const { BriefDocument } = await import('../../src/render/pdf/document.js');
  const brief =
    (level?: number): Make =>
    (options) =>
      new BriefDocument({ ...options, deflateLevel: level });

  it('gives the bytes pdfkit gives, at zlib’s default level', async () => {
    const plain = await drawPlain(FONT);
    expect((await drawPlain(FONT, brief())).equals(plain)).toBe(true);
    expect((await drawPlain(FONT, brief(6))).equals(plain)).toBe(true);
  });

  it('compresses at the level asked for, with the same stream contents', async () => {
    const plain = await drawPlain(FONT);
    const fast = await drawPlain(FONT, brief(1));
    expect(fast.equals(plain)).toBe(false);
    expect(inflatedStreams(fast)).toEqual(inflatedStreams(plain));
    expect(inflatedStreams(plain).length).toBeGreaterThan(2);
  });

  it('escapes the Info strings it copies into the XMP packet (pdfkit leaves them raw)', async () => {
    const title = 'Rivers & <lakes>';
    const xmp = (pdf: Buffer) => /<x:xmpmeta[\s\S]*<\/x:xmpmeta>/.exec(pdf.toString('latin1'))?.[0] ?? '';
    expect(xmp(await drawPlain(FONT, undefined, title))).toContain('>Rivers & <lakes></rdf:li>');
    const ours = xmp(await drawPlain(FONT, brief(), title));
    expect(ours).toContain('>Rivers &amp; &lt;lakes&gt;</rdf:li>');
    expect(ours).not.toContain('Rivers & ');
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

describe('BriefDocument, the tables’ own paths', async () => {
  const { BriefDocument } = await import('../../src/render/pdf/document.js');
  const { artifact, beginCell, endCell, group, leaf, tableRow } = await import('../../src/render/pdf/tags.js');
  const options = {
    autoFirstPage: false,
    tagged: true,
    pdfVersion: '1.7' as const,
    bufferPages: true,
    info: { CreationDate: new Date(0), ModDate: new Date(0) },
  };
  const bytesOf = (doc: PDFKit.PDFDocument): Promise<Buffer> => {
    const chunks: Buffer[] = [];
    return new Promise((resolve, reject) => {
      doc.on('data', (c: Buffer) => chunks.push(c));
      doc.on('end', () => resolve(Buffer.concat(chunks)));
      doc.on('error', reject);
    });
  };

  /** A table of a header row and five body rows over two pages, its cells made one way or the other. */
  async function table(cells: 'pdfkit' | 'ours'): Promise<Buffer> {
    const doc = new BriefDocument(options);
    const done = bytesOf(doc);
    doc.addPage();
    const root = doc.struct('Document');
    doc.addStructure(root);
    const el = group(doc, root, 'Table');
    const rows: [string, 'Column' | 'Row' | undefined, number][] = [];
    for (let r = 0; r < 6; r++)
      for (let c = 0; c < 3; c++)
        rows.push([c === 0 || r === 0 ? 'TH' : 'TD', r === 0 ? 'Column' : c === 0 ? 'Row' : undefined, r]);
    for (let r = 0; r < 6; r++) {
      if (r === 4) doc.addPage();
      const parent = r === 0 ? group(doc, el, 'THead') : el;
      const row = cells === 'ours' ? tableRow(doc, parent) : group(doc, parent, 'TR');
      for (let c = 0; c < 3; c++) {
        const [type, scope] = rows[r * 3 + c];
        const draw = () => doc.rect(10 + 20 * c, 10 + 20 * r, 15, 15).fill(c === 1 ? '#336699' : '#000000');
        if (cells === 'pdfkit') leaf(doc, row, type, draw, scope ? { scope } : {});
        else {
          const cell = beginCell(doc, row as ReturnType<typeof tableRow>, type as 'TH' | 'TD', scope);
          draw();
          endCell(doc, cell);
        }
      }
      row.end();
      if (r === 0) parent.end();
      // A rule between rows, as the tables draw them.
      artifact(doc, () =>
        doc
          .moveTo(10, 30 + 20 * r)
          .lineTo(80, 30 + 20 * r)
          .stroke(),
      );
    }
    el.end();
    root.end();
    doc.end();
    return done;
  }

  it('writes table cells made by beginCell and endCell as pdfkit writes elements given their content', async () => {
    const pdfkit = await table('pdfkit');
    const ours = await table('ours');
    const text = ours.toString('latin1');
    expect(text).toContain('/S /TH\n/A <<\n/O /Table\n/Scope /Row\n>>\n/P ');
    expect(text).toContain('/S /TH\n/A <<\n/O /Table\n/Scope /Column\n>>\n/P ');
    expect(text.match(/\/S \/TD\n\/P \d+ 0 R\n\/K \[\d+\]\n\/Pg \d+ 0 R\n>>/g)?.length).toBe(10);
    expect(ours.equals(pdfkit)).toBe(true);
  });

  it('writes lines longer than its buffers, and text beyond Latin-1, as pdfkit does', async () => {
    const draw = async (doc: PDFKit.PDFDocument): Promise<Buffer> => {
      const done = bytesOf(doc);
      doc.addPage();
      // An operator line of 70,000 characters (longer than any of the document's buffers) and one with
      // characters outside Latin-1 (both written as the low byte of each UTF-16 unit).
      doc.addContent(`% ${'x'.repeat(70_000)}`);
      doc.addContent('% Łódź −3.2%');
      const root = doc.struct('Document');
      doc.addStructure(root);
      root.add(doc.struct('P', { lang: 'pl', alt: 'Łódź' }, () => doc.rect(1, 1, 2, 2).fill()));
      root.end();
      doc.end();
      return done;
    };
    const plain = await draw(new PDFDocument(options));
    const ours = await draw(new BriefDocument(options));
    expect(plain.length).toBeGreaterThan(1000);
    expect(ours.equals(plain)).toBe(true);
  });
});
