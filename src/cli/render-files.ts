/**
 * One brief's output files, produced in memory (nothing is written here): build the brief of one group
 * and render each asked format. The caller writes them atomically, all or none.
 */
import { type Dirent, readdirSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { type BriefProgress, buildBriefs } from '../brief/build.js';
import type { LoadedData } from '../data/load.js';
import type { BriefDocument } from '../document/blocks.js';
import type { BriefView, SeriesView } from '../document/view.js';
import type { EmailOverrides } from '../render/email.js';
import { fileStem } from '../render/names.js';
import type { InputFile, OutputFile } from '../render/write.js';
import type { Brief, PastIssue, SeriesBrief } from '../vocabulary/brief.js';
import type { ChartFileFormat, Job, OutputFormat } from '../vocabulary/settings.js';

export type PdfEngine = Job['brief']['pdfEngine'];

export interface RenderOptions {
  /** Formats to write; null for the job's brief.outputs. */
  formats: OutputFormat[] | null;
  period: string | null;
  /** null for the job's brief.pdf_engine. */
  pdfEngine: PdfEngine | null;
  overrides: EmailOverrides;
  /** Charts also written as files of their own; null for the job's brief.chart_files. */
  chartFiles?: ChartFileFormat[] | null;
}

/**
 * The files a job reads, which no output may replace: the job file, its data files, the logo and every file
 * in the templates folder.
 */
export function inputsOf(job: Job): InputFile[] {
  const inputs: InputFile[] = [{ path: job.file, role: 'job file' }];
  for (const s of job.series) inputs.push({ path: s.data.file, role: 'data file' });
  for (const s of job.series)
    if (s.effects?.holidayFile) inputs.push({ path: s.effects.holidayFile, role: 'holiday file' });
  if (job.brief.logo) inputs.push({ path: job.brief.logo, role: 'logo' });
  if (job.brief.templates) for (const path of filesUnder(job.brief.templates)) inputs.push({ path, role: 'template' });
  return inputs;
}

function filesUnder(dir: string, depth = 0): string[] {
  if (depth > 8) return [];
  let entries: Dirent[];
  try {
    entries = readdirSync(dir, { withFileTypes: true });
  } catch {
    return [];
  }
  return entries.flatMap((e) =>
    e.isDirectory() ? filesUnder(join(dir, e.name), depth + 1) : e.isFile() ? [join(dir, e.name)] : [],
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
  /** The file name without extension, when the caller has worked it out (batch.ts, to check for collisions). */
  stemName?: string,
): Promise<{ name: string; brief: Brief; files: OutputFile[] }> {
  const formats = options.formats ?? job.brief.outputs;
  const chartFiles = options.chartFiles ?? job.brief.chartFiles;
  const engine = options.pdfEngine ?? job.brief.pdfEngine;
  const wantsPdf = formats.includes('pdf') || formats.includes('eml');
  // The built-in PDF is drawn while the brief is built: its head as soon as the series' reporting periods
  // are known, each series once it is ready (build.ts BriefProgress). The browser engine prints the page.
  const streamed = wantsPdf && (!formats.includes('pdf') || engine === 'builtin') ? pdfAsBuilt(job) : null;
  const [unit] = await buildBriefs(job, {
    period: options.period,
    toolVersion,
    charts: chartFiles.length > 0 || formats.some((f) => f !== 'json'),
    groups: [group],
    cache,
    progress: streamed?.progress,
    past,
  }).catch((e) => {
    streamed?.abandon();
    throw e;
  });
  if (unit.error || !unit.brief) {
    streamed?.abandon();
    throw unit.error;
  }
  const brief = unit.brief;
  const name = stemName ?? fileStem(brief.meta.title);
  const stem = resolve(outDir, name);
  // Formatted once, and made into one document, for every format (the series' parts already formatted when
  // the PDF was drawn as built).
  const view = formats.some((f) => f !== 'json')
    ? (await import('../document/view.js')).briefView(brief, streamed?.seriesViews)
    : undefined;
  const document = view ? (await import('../document/build.js')).buildDocument(brief, view) : undefined;
  // The PDF is made once, before the email that attaches it; on its own thread it is finished while the
  // HTML is written here.
  const drawPdf = async (): Promise<Buffer> => {
    const drawn =
      streamed && view && document && streamed.complete(view) ? await streamed.finish(view, document) : null;
    return drawn ?? (await renderPdfBytes(job, brief, formats.includes('pdf') ? engine : 'builtin', view, document));
  };
  const pdfMade = wantsPdf ? drawPdf() : null;
  // Awaited where it is used; a failure of another format first leaves it handled, not unhandled.
  pdfMade?.catch(() => {});
  const files: OutputFile[] = [];
  for (const format of formats) {
    if (format === 'json') {
      const { renderJsonPieces } = await import('../render/json.js');
      // Made while written (write.ts), so the text of a long series is never all in memory.
      files.push({ path: `${stem}.json`, bytes: () => renderJsonPieces(brief) });
    } else if (format === 'html') {
      const { renderHtmlPieces } = await import('../render/html.js');
      files.push({
        path: `${stem}.html`,
        bytes: renderHtmlPieces(brief, { templatesDir: job.brief.templates, document }),
      });
    } else if (format === 'pdf') {
      files.push({ path: `${stem}.pdf`, bytes: (await pdfMade) as Buffer });
    } else {
      const { emailImages, renderEmail } = await import('../render/email.js');
      const { chartPng } = await import('../chart/png.js');
      const bytes = await renderEmail(brief, {
        pdf: (await pdfMade) as Buffer,
        pdfName: `${name}.pdf`,
        pngs: emailImages(brief, chartPng, document),
        document,
        email: job.brief.email,
        overrides: options.overrides,
        templates: job.brief.templates,
      });
      files.push({ path: `${stem}.eml`, bytes });
    }
  }
  if (chartFiles.length > 0) files.push(...(await chartFileList(brief, stem, chartFiles)));
  return { name: brief.meta.title, brief, files };
}

/**
 * Each chart as a file of its own, for slides: `STEM--SERIES--CHART.svg` and `.png` beside the brief. The
 * stem never holds "--" (fileStem makes every run of other characters one dash) and no chart id does, so
 * the names are distinct from every brief's and from each other, and the same on every run.
 */
async function chartFileList(brief: Brief, stem: string, kinds: ChartFileFormat[]): Promise<OutputFile[]> {
  const png = kinds.includes('png') ? (await import('../chart/png.js')).chartPng : null;
  const out: OutputFile[] = [];
  for (const s of brief.series)
    for (const chart of s.charts) {
      const name = `${stem}--${s.id}--${chart.id}`;
      if (kinds.includes('svg')) out.push({ path: `${name}.svg`, bytes: chartFileSvg(chart.svg) });
      if (png) out.push({ path: `${name}.png`, bytes: png(chart) });
    }
  return out;
}

/** A chart's inline SVG as a file: with the XML declaration and the namespace a standalone file needs. */
function chartFileSvg(svg: string): string {
  const named = /^<svg[^>]*\sxmlns=/.test(svg) ? svg : svg.replace(/^<svg/, '<svg xmlns="http://www.w3.org/2000/svg"');
  return `<?xml version="1.0" encoding="UTF-8"?>\n${named}\n`;
}

/**
 * The built-in PDF brief drawn as the brief is built: on a thread of its own where there is a spare core
 * (render/pdf/thread.ts), else here. `complete` says whether every series was drawn (a drawing begun is
 * finished only then; otherwise the PDF is drawn afresh from the finished brief, as it is when `finish`
 * gives null: the thread was lost).
 */
function pdfAsBuilt(job: Job) {
  let drawing: {
    series(v: SeriesView): void;
    finish(v: BriefView, d: BriefDocument): Promise<Buffer | null>;
    abandon?(): void;
  } | null = null;
  let seriesView: ((s: SeriesBrief, locale: string) => SeriesView) | null = null;
  let locale = '';
  const seriesViews: SeriesView[] = [];
  const progress: BriefProgress = {
    start: async (meta, provenance, heads) => {
      const [thread, views] = await Promise.all([import('../render/pdf/thread.js'), import('../document/view.js')]);
      seriesView = views.seriesView;
      locale = meta.locale;
      const head = views.headView(meta, provenance, heads);
      const archival = job.brief.pdfArchival;
      drawing = thread.canDrawOnThread() ? thread.startPdfThread(head, archival) : null;
      drawing ??= (await import('../render/pdf/index.js')).startPdf(head, { archival });
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
    finish: (view: BriefView, document: BriefDocument) =>
      (drawing as NonNullable<typeof drawing>).finish(view, document),
    abandon: () => drawing?.abandon?.(),
  };
}

/** The PDF brief from the chosen engine: drawn by pdfkit, or the HTML brief printed by Chromium. */
async function renderPdfBytes(
  job: Job,
  brief: Brief,
  engine: PdfEngine,
  view?: BriefView,
  document?: BriefDocument,
): Promise<Buffer> {
  if (engine === 'browser') {
    const { renderHtml } = await import('../render/html.js');
    const { renderBrowserPdf } = await import('../render/browser-pdf.js');
    return renderBrowserPdf(renderHtml(brief, { templatesDir: job.brief.templates, document }), brief);
  }
  const { renderPdf } = await import('../render/pdf/index.js');
  return renderPdf(brief, { archival: job.brief.pdfArchival, view, document });
}
