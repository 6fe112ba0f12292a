/**
 * One brief's output files, produced in memory (nothing is written here): build the brief of one group
 * and render each asked format. The caller writes them atomically, all or none.
 */
import { resolve } from 'node:path';
import { type BriefProgress, buildBriefs } from '../brief/build.js';
import type { Brief, PastIssue, SeriesBrief } from '../brief/model.js';
import type { LoadedData } from '../data/load.js';
import type { Job, OutputFormat } from '../job/types.js';
import type { EmailOverrides } from '../render/email.js';
import type { PdfDrawing } from '../render/pdf/index.js';
import type { BriefView, SeriesView } from '../render/view.js';
import type { OutputFile } from '../render/write.js';

export type PdfEngine = Job['brief']['pdfEngine'];

export interface RenderOptions {
  /** Formats to write; null for the job's brief.outputs. */
  formats: OutputFormat[] | null;
  period: string | null;
  /** null for the job's brief.pdf_engine. */
  pdfEngine: PdfEngine | null;
  overrides: EmailOverrides;
}

/** File stem of a brief: its title (and group) in lower case with dashes. */
export function fileStem(brief: Brief): string {
  return (
    brief.meta.title
      .normalize('NFKD')
      .replace(/[\u0300-\u036f]/g, '')
      .toLowerCase()
      .replace(/[^a-z0-9]+/g, '-')
      .replace(/^-+|-+$/g, '') || 'brief'
  );
}

export async function renderBriefFiles(
  job: Job,
  group: string | null,
  outDir: string,
  options: RenderOptions,
  toolVersion: string,
  cache?: Map<string, LoadedData>,
  past?: Map<string, PastIssue[]>,
): Promise<{ name: string; brief: Brief; files: OutputFile[] }> {
  const formats = options.formats ?? job.brief.outputs;
  const engine = options.pdfEngine ?? job.brief.pdfEngine;
  const wantsPdf = formats.includes('pdf') || formats.includes('eml');
  // The built-in PDF is drawn while the brief is built: its head as soon as the series' reporting periods
  // are known, each series once it is ready (build.ts BriefProgress). The browser engine prints the page.
  const streamed = wantsPdf && (!formats.includes('pdf') || engine === 'builtin') ? pdfAsBuilt(job) : null;
  const [unit] = await buildBriefs(job, {
    period: options.period,
    toolVersion,
    charts: formats.some((f) => f !== 'json'),
    groups: [group],
    cache,
    progress: streamed?.progress,
    past,
  });
  if (unit.error || !unit.brief) throw unit.error;
  const brief = unit.brief;
  const stem = resolve(outDir, fileStem(brief));
  // Formatted once for the HTML and the PDF brief (the series' parts already, when the PDF was drawn as built).
  const view = formats.some((f) => f !== 'json')
    ? (await import('../render/view.js')).briefView(brief, streamed?.seriesViews)
    : undefined;
  // The PDF is made once, before the email that attaches it.
  const pdf = !wantsPdf
    ? null
    : streamed && view && streamed.complete(view)
      ? await streamed.finish(view)
      : await renderPdfBytes(job, brief, formats.includes('pdf') ? engine : 'builtin', view);
  const files: OutputFile[] = [];
  for (const format of formats) {
    if (format === 'json') {
      const { renderJson } = await import('../render/json.js');
      files.push({ path: `${stem}.json`, bytes: renderJson(brief) });
    } else if (format === 'html') {
      const { renderHtml } = await import('../render/html.js');
      files.push({ path: `${stem}.html`, bytes: renderHtml(brief, { templatesDir: job.brief.templates, view }) });
    } else if (format === 'pdf') {
      files.push({ path: `${stem}.pdf`, bytes: pdf as Buffer });
    } else {
      const { emailImages, renderEmail } = await import('../render/email.js');
      const { chartPng } = await import('../chart/png.js');
      const bytes = await renderEmail(brief, {
        pdf: pdf as Buffer,
        pdfName: `${fileStem(brief)}.pdf`,
        pngs: emailImages(brief, chartPng),
        email: job.brief.email,
        overrides: options.overrides,
        templates: job.brief.templates,
      });
      files.push({ path: `${stem}.eml`, bytes });
    }
  }
  return { name: brief.meta.title, brief, files };
}

/**
 * The built-in PDF brief drawn as the brief is built. `complete` says whether every series was drawn (a
 * drawing begun is finished only then; otherwise the PDF is drawn afresh from the finished brief).
 */
function pdfAsBuilt(job: Job) {
  let drawing: PdfDrawing | null = null;
  let seriesView: ((s: SeriesBrief, locale: string) => SeriesView) | null = null;
  let locale = '';
  const seriesViews: SeriesView[] = [];
  const progress: BriefProgress = {
    start: async (meta, provenance, heads) => {
      const [{ startPdf }, views] = await Promise.all([import('../render/pdf/index.js'), import('../render/view.js')]);
      seriesView = views.seriesView;
      locale = meta.locale;
      drawing = startPdf(views.headView(meta, provenance, heads), { archival: job.brief.pdfArchival });
    },
    series: (s) => {
      if (!drawing || !seriesView) return;
      const v = seriesView(s, locale);
      seriesViews.push(v);
      drawing.series(v);
    },
  };
  return {
    progress,
    seriesViews,
    complete: (view: BriefView) => drawing !== null && seriesViews.length === view.series.length,
    finish: (view: BriefView) => (drawing as PdfDrawing).finish(view),
  };
}

/** The PDF brief from the chosen engine: drawn by pdfkit, or the HTML brief printed by Chromium. */
async function renderPdfBytes(job: Job, brief: Brief, engine: PdfEngine, view?: BriefView): Promise<Buffer> {
  if (engine === 'browser') {
    const { renderHtml } = await import('../render/html.js');
    const { renderBrowserPdf } = await import('../render/browser-pdf.js');
    return renderBrowserPdf(renderHtml(brief, { templatesDir: job.brief.templates, view }), brief);
  }
  const { renderPdf } = await import('../render/pdf/index.js');
  return renderPdf(brief, { archival: job.brief.pdfArchival, view });
}
