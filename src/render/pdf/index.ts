/**
 * The PDF brief drawn without a browser, by pdfkit: the display view (render/view.ts) laid out in the HTML
 * brief's order, Source Sans 3 embedded, charts as vectors, a tagged structure always, and with
 * `archival` a PDF/A-2b file (ISO 19005-2, level B: XMP metadata and an sRGB output intent). The same
 * Brief gives the same bytes: every date comes from the brief's generation time.
 */
import type { Brief } from '../../brief/model.js';
import { BriefError, withCause } from '../../errors.js';
import { type BriefView, briefView, type HeadView, type SeriesView } from '../view.js';
import { drawCautions, drawDataAppendix, drawMethodAppendix } from './back-matter.js';
import { BriefDocument } from './document.js';
import { defaultFont, registerFonts } from './fonts.js';
import { drawFurniture } from './furniture.js';
import { type Flow, newPage } from './layout.js';
import { drawMasthead } from './masthead.js';
import { completeXmp, documentInfo } from './metadata.js';
import { drawSeries } from './series.js';
import { documentRoot } from './tags.js';
import { geometry, theme } from './theme.js';

export interface PdfOptions {
  /** PDF/A-2b: XMP identification and an sRGB output intent (the file is tagged either way). */
  archival?: boolean;
  /** The view, when the caller has it already (the HTML brief is made from the same one). */
  view?: BriefView;
}

export async function renderPdf(brief: Brief, options: PdfOptions = {}): Promise<Buffer> {
  const view = options.view ?? briefView(brief);
  const drawing = startPdf(view, options);
  for (const s of view.series) drawing.series(s);
  return drawing.finish(view);
}

/**
 * A PDF brief drawn as its parts become known: the head (masthead, contents, metadata) first, then each
 * series in the brief's order, then the back matter and page furniture. renderPdf draws a finished brief
 * this way in one go; the command line starts drawing while later series are still being built. The same
 * views give the same bytes either way. A failure is kept and reported by finish, as `pdf-failed`.
 */
export interface PdfDrawing {
  series(view: SeriesView): void;
  finish(view: BriefView): Promise<Buffer>;
}

export function startPdf(head: HeadView, options: Pick<PdfOptions, 'archival'> = {}): PdfDrawing {
  let failure: unknown = null;
  let pdf: PdfDrawing | null = null;
  try {
    pdf = begin(head, options.archival === true);
  } catch (e) {
    failure = e;
  }
  return {
    series: (s) => {
      if (failure !== null || !pdf) return;
      try {
        pdf.series(s);
      } catch (e) {
        failure = e;
      }
    },
    finish: async (view) => {
      if (failure === null && pdf) {
        try {
          return await pdf.finish(view);
        } catch (e) {
          failure = e;
        }
      }
      throw pdfFailed(failure);
    },
  };
}

function pdfFailed(e: unknown): BriefError {
  if (e instanceof BriefError) return e;
  const message = e instanceof Error ? e.message.split('\n')[0] : String(e);
  return withCause(
    new BriefError(
      'pdf-failed',
      `the PDF brief could not be drawn: ${message}`,
      'run again with --debug and report it, or use --format html',
      {},
      1,
    ),
    e,
  );
}

function begin(head: HeadView, archival: boolean): PdfDrawing {
  const geo = geometry(head.pageSize);
  const doc = new BriefDocument({
    size: [geo.width, geo.height],
    margins: { top: geo.bodyTop, bottom: geo.height - geo.bodyBottom, left: geo.left, right: geo.width - geo.right },
    autoFirstPage: false,
    bufferPages: true,
    pdfVersion: '1.7',
    tagged: true,
    displayTitle: true,
    lang: head.lang,
    info: documentInfo(head),
    // pdfkit starts every document with Helvetica (parsing its metrics each time); start with ours instead.
    font: defaultFont(),
    ...(archival ? { subset: 'PDF/A-2b' as const } : {}),
    deflateLevel: 2,
  });
  const chunks: Buffer[] = [];
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('data', (c: Buffer) => chunks.push(c));
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });
  registerFonts(doc);
  completeXmp(doc, head);
  doc.addPage();
  const flow: Flow = { doc, geo, theme: theme(head.accent), y: geo.bodyTop };
  const root = documentRoot(doc);
  drawMasthead(flow, root, head);
  let drawn = 0;
  return {
    series: (s) => {
      if (drawn++ > 0) newPage(flow);
      drawSeries(flow, root, s);
    },
    finish: (view) => {
      drawCautions(flow, root, view.cautions);
      drawMethodAppendix(flow, root, view);
      drawDataAppendix(flow, root, view);
      root.end();
      drawFurniture(flow, view);
      doc.end();
      return done;
    },
  };
}
