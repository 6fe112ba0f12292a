/**
 * The PDF brief drawn without a browser, by pdfkit: the brief's document (src/document/) walked section by
 * section (document.ts), Source Sans 3 embedded, charts as vectors, a tagged structure always, and with
 * `archival` a PDF/A-2b file (ISO 19005-2, level B: XMP metadata and an sRGB output intent). The same
 * Brief gives the same bytes: every date comes from the brief's generation time.
 */

import type { BriefDocument } from '../../document/blocks.js';
import { buildDocument, documentPlan, headSections, seriesSection } from '../../document/build.js';
import { type BriefView, briefView, type HeadView, type SeriesView } from '../../document/view.js';
import { BriefError, withCause } from '../../errors.js';
import type { Brief } from '../../vocabulary/brief.js';
import { BriefDocument as PdfDocument } from './document.js';
import { defaultFont, registerFonts } from './fonts.js';
import { drawFurniture } from './furniture.js';
import type { Flow } from './layout.js';
import { completeXmp, documentInfo } from './metadata.js';
import { documentRoot, type Struct } from './tags.js';
import { geometry, theme } from './theme.js';
import { drawSection, type WalkState } from './walk.js';

export interface PdfOptions {
  /** PDF/A-2b: XMP identification and an sRGB output intent (the file is tagged either way). */
  archival?: boolean;
  /** The view and its document, when the caller has them already (the HTML brief is made from the same). */
  view?: BriefView;
  document?: BriefDocument;
}

export async function renderPdf(brief: Brief, options: PdfOptions = {}): Promise<Buffer> {
  const view = options.view ?? briefView(brief);
  const drawing = startPdf(view, options);
  for (const s of view.series) drawing.series(s);
  return drawing.finish(view, options.document ?? buildDocument(brief, view));
}

/**
 * A PDF brief drawn as its parts become known: the head (masthead, contents, metadata) first, then each
 * series in the brief's order when nothing that needs the whole brief (the overview) comes before the
 * series, then the rest of the document and the page furniture. renderPdf draws a finished brief this way
 * in one go; the command line starts drawing while later series are still being built. The same views give
 * the same bytes either way, since the sections drawn early are the document's first sections, built from
 * the same views. A failure is kept and reported by finish, as `pdf-failed`.
 */
export interface PdfDrawing {
  series(view: SeriesView): void;
  finish(view: BriefView, document: BriefDocument): Promise<Buffer>;
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
    finish: async (view, document) => {
      if (failure === null && pdf) {
        try {
          return await pdf.finish(view, document);
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
  const { flow, root, state, done } = open(head, archival);
  // The document's first sections: the head, then the series as they come if they follow the head directly.
  const plan = documentPlan(head.layout, head.series.length);
  const lead = plan.findIndex((p) => p !== 'masthead' && p !== 'contents');
  const heads = lead === -1 ? plan : plan.slice(0, lead);
  const streamSeries = plan[heads.length] === 'series';
  let drawn = 0;
  for (const section of headSections(head, heads)) {
    drawSection(flow, root, section, state);
    drawn++;
  }
  return {
    series: (s) => {
      if (!streamSeries) return;
      drawSection(flow, root, seriesSection(s, head.layout), state);
      drawn++;
    },
    finish: (view, document) => {
      for (const section of document.sections.slice(drawn)) drawSection(flow, root, section, state);
      root.end();
      drawFurniture(flow, view);
      flow.doc.end();
      return done;
    },
  };
}

interface Opened {
  flow: Flow;
  root: Struct;
  state: WalkState;
  /** The file's bytes, once the document is ended. */
  done: Promise<Buffer>;
}

/** A new document with the brief's fonts and metadata and its first page. */
function open(head: HeadView, archival: boolean): Opened {
  const geo = geometry(head.pageSize);
  const doc = new PdfDocument({
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
  return { flow, root: documentRoot(doc), state: { previous: null }, done };
}
