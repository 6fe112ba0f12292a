/**
 * The document builder: the Brief's display view (view.ts) turned into blocks (blocks.ts), once, for
 * every format. What the brief holds and in which order is decided here — by the job's brief.sections,
 * brief.series_sections and brief.data_periods — and every fixed word comes from words.ts.
 *
 *   buildDocument(brief, view) = masthead, contents, then the job's sections in the job's order
 *
 * The parts that need only the head of the brief (headSections) and one series (seriesSection) can be
 * built on their own, so the PDF can be drawn while later series are still being figured.
 */
import type { Brief, Statement } from '../vocabulary/brief.js';
import type { LayoutSpec, SectionName, SeriesSectionName } from '../vocabulary/settings.js';
import type { Block, BriefDocument, Fact, SectionBlock, Table } from './blocks.js';
import { overviewSection } from './overview.js';
import { type BriefView, dataTable, type HeadView, type SeriesView } from './view.js';
import { safeAccent, WORDS } from './words.js';

/** The part names of a brief in reading order: the masthead, the contents (two or more series; after an overview the job puts first), the job's sections. */
export type PartName = 'masthead' | 'contents' | SectionName;

export function documentPlan(layout: LayoutSpec, seriesCount: number): PartName[] {
  const many = seriesCount > 1;
  // An overview of one series would repeat its key figures.
  const sections = layout.sections.filter((s) => many || s !== 'overview');
  if (!many) return ['masthead', ...sections];
  // An overview the job puts first is read first, on the first page; the contents follow it.
  const lead = sections[0] === 'overview' ? 1 : 0;
  return ['masthead', ...sections.slice(0, lead), 'contents', ...sections.slice(lead)];
}

/** The whole document of a finished brief; `view` is its display view (briefView). */
export function buildDocument(brief: Brief, view: BriefView): BriefDocument {
  const layout = brief.meta.layout;
  const sections: SectionBlock[] = [];
  for (const part of documentPlan(layout, view.series.length)) {
    if (part === 'masthead' || part === 'contents') sections.push(...headSections(view, [part]));
    else if (part === 'series') for (const s of view.series) sections.push(seriesSection(s, layout));
    else if (part === 'overview') sections.push(overviewSection(brief, view));
    else if (part === 'cautions') sections.push(...cautionsSection(view.cautions));
    else if (part === 'method') sections.push(methodSection(view));
    else sections.push(dataSection(brief, view));
  }
  return { ...frame(view), sections };
}

export function frame(head: HeadView): Omit<BriefDocument, 'sections'> {
  return {
    lang: head.lang,
    title: head.title,
    fullTitle: head.organisation ? `${head.title} — ${head.organisation}` : head.title,
    accent: safeAccent(head.accent),
    pageSize: head.pageSize,
    toolVersion: head.toolVersion,
  };
}

/** The masthead and, for two or more series, the contents: all the head of the brief needs. */
export function headSections(head: HeadView, parts: PartName[] = ['masthead', 'contents']): SectionBlock[] {
  const out: SectionBlock[] = [];
  const many = head.series.length > 1;
  // One reporting period when every series has the same, else each series' own.
  const periods = new Set(head.series.map((s) => s.reportingPeriod));
  if (parts.includes('masthead')) {
    const byline: Fact[] =
      periods.size === 1
        ? [{ label: WORDS.reportingPeriod, value: [...periods][0] }]
        : head.series.map((s) => ({ label: WORDS.reportingPeriodOf(s.label), value: s.reportingPeriod }));
    if (head.author) byline.push({ label: WORDS.preparedBy, value: head.author });
    if (head.contact) byline.push({ label: WORDS.contact, value: head.contact });
    byline.push({ label: WORDS.generated, value: head.generatedAt, time: head.generatedIso });
    out.push(
      section('masthead', null, null, [
        {
          kind: 'masthead',
          organisation: head.organisation,
          title: head.title,
          logo: head.logo ? { ...head.logo, alt: WORDS.logoOf(head.organisation) } : null,
          byline,
        },
      ]),
    );
  }
  if (parts.includes('contents') && many) {
    const plan = documentPlan(head.layout, head.series.length);
    const entries: { text: string; note: string; target: string }[] = [];
    for (const part of plan) {
      if (part === 'overview') entries.push({ text: WORDS.overview, note: '', target: 'overview' });
      else if (part === 'series')
        for (const s of head.series)
          entries.push({ text: s.label, note: periods.size > 1 ? s.reportingPeriod : '', target: s.anchor });
      else if (part === 'cautions') entries.push({ text: WORDS.cautions, note: '', target: 'cautions' });
      else if (part === 'method') entries.push({ text: WORDS.methodAppendix, note: '', target: 'appendix-method' });
      else if (part === 'data') entries.push({ text: WORDS.dataAppendix, note: '', target: 'appendix-data' });
    }
    out.push(
      section('contents', null, null, [
        { kind: 'contents', title: WORDS.contents, label: WORDS.contentsLabel, entries },
      ]),
    );
  }
  return out;
}

/** One series' part: its heading, then the job's series_sections in order. */
export function seriesSection(s: SeriesView, layout: LayoutSpec): SectionBlock {
  const blocks: Block[] = [{ kind: 'heading', level: 2, text: s.label, id: `${s.anchor}-title`, unit: s.unit }];
  for (const part of layout.seriesSections) blocks.push(...seriesPart(s, part));
  return { ...section('series', s.anchor, `${s.anchor}-title`, blocks), outline: s.label };
}

function seriesPart(s: SeriesView, part: SeriesSectionName): Block[] {
  switch (part) {
    case 'headline':
      return s.headline ? [{ kind: 'headline', text: s.headline.text }] : [];
    case 'key_figures':
      return s.keyFigures.length > 0 ? [{ kind: 'key-figures', items: s.keyFigures }] : [];
    case 'notes':
      return statements(ofKind(s.statements, 'context', 'effects', 'seasonal', 'history'));
    case 'charts':
      return s.charts.length > 0 ? [{ kind: 'figures', anchor: s.anchor, charts: s.charts }] : [];
    case 'comparisons':
      return [
        subsection('comparisons', `${s.anchor}-comparisons`, WORDS.comparisons, [
          ...statements(ofKind(s.statements, 'comparison')),
          table('comparisons', s.comparisons, true),
        ]),
      ];
    case 'unusual':
      return [
        subsection('unusual', `${s.anchor}-unusual`, WORDS.unusual, [
          ...(s.unusualSummary ? statements([{ kind: 'unusual', text: s.unusualSummary }]) : []),
          ...(s.unusual ? [table('unusual', s.unusual, true)] : []),
        ]),
      ];
    case 'firmness':
      return [
        subsection('firmness', `${s.anchor}-firmness`, WORDS.firmness, [
          ...statements([s.firmness, s.sensitivity].filter((x): x is Statement => !!x)),
          ...(s.revisions ? [table('revisions', s.revisions, false)] : []),
          ...statements(s.firmnessPublished ? [s.firmnessPublished] : []),
          ...(s.publishedRevisions ? [table('revisions', s.publishedRevisions, false)] : []),
        ]),
      ];
  }
}

export function cautionsSection(cautions: Statement[]): SectionBlock[] {
  if (cautions.length === 0) return [];
  return [
    {
      ...section('cautions', 'cautions', 'cautions-title', [
        { kind: 'cautions', title: WORDS.cautions, items: cautions.map((c) => c.text) },
      ]),
      outline: WORDS.cautions,
    },
  ];
}

export function methodSection(view: BriefView): SectionBlock {
  const blocks: Block[] = [
    { kind: 'heading', level: 2, text: WORDS.methodAppendix, id: 'appendix-method-title', unit: '' },
  ];
  for (const s of view.series) {
    blocks.push(
      section('appendix-series', null, null, [
        { kind: 'heading', level: 3, text: s.label, id: `${s.anchor}-method`, unit: '' },
        table('method', s.method, false),
        {
          kind: 'facts',
          title: WORDS.sources,
          role: 'sources',
          items: s.sources.map((x) => ({ label: x.method, value: x.source })),
        },
        { kind: 'facts', title: WORDS.dataRead, role: 'facts', items: s.dataInfo },
      ]),
    );
  }
  blocks.push(
    section('appendix-run', null, null, [
      { kind: 'heading', level: 3, text: WORDS.thisRun, id: 'appendix-run-title', unit: '' },
      {
        kind: 'facts',
        title: '',
        role: 'facts',
        items: [
          { label: WORDS.jobFile, value: view.jobFile },
          { label: WORDS.jobSha256, value: view.jobSha256 },
          { label: WORDS.fingerprint, value: view.fingerprint },
          { label: WORDS.tool, value: `trendbrief ${view.toolVersion}` },
          { label: WORDS.generated, value: view.generatedAt, time: view.generatedIso },
        ],
      },
    ]),
  );
  return {
    ...section('appendix appendix-method', 'appendix-method', 'appendix-method-title', blocks),
    outline: WORDS.methodAppendix,
    detail: true,
  };
}

/** Appendix B: each series' periods with their components, the latest `data_periods` of them. */
export function dataSection(brief: Brief, view: BriefView): SectionBlock {
  const locale = brief.meta.locale;
  const limit = brief.meta.layout.dataPeriods;
  const blocks: Block[] = [
    { kind: 'heading', level: 2, text: WORDS.dataAppendix, id: 'appendix-data-title', unit: '' },
  ];
  brief.series.forEach((s, i) => {
    const n = s.components.dates.length;
    const first = limit === null ? 0 : Math.max(0, n - limit);
    const count = (v: number) => new Intl.NumberFormat(locale, { maximumFractionDigits: 0 }).format(v);
    blocks.push(
      section('appendix-series', null, null, [
        { kind: 'heading', level: 3, text: s.label, id: `${view.series[i].anchor}-data`, unit: '' },
        { kind: 'note', text: WORDS.dataNote },
        ...(first > 0 ? [{ kind: 'note' as const, text: WORDS.dataLimit(count(n - first), count(n)) }] : []),
        table('data', dataTable(s, locale, first), false),
      ]),
    );
  });
  return {
    ...section('appendix appendix-data', 'appendix-data', 'appendix-data-title', blocks),
    // Not on a page of its own: the method appendix's last table ("This run") once stood alone on one.
    outline: WORDS.dataAppendix,
    detail: true,
  };
}

function section(name: string, id: string | null, labelledBy: string | null, blocks: Block[]): SectionBlock {
  const titled = blocks[0]?.kind === 'heading';
  return { kind: 'section', name, id, labelledBy, titled, outline: null, newPage: false, detail: false, blocks };
}

function subsection(name: string, id: string, title: string, blocks: Block[]): SectionBlock {
  // Not a landmark: every series has one of the same name.
  return section(name, null, null, [{ kind: 'heading', level: 3, text: title, id, unit: '' }, ...blocks]);
}

function statements(list: { kind: string; text: string }[]): Block[] {
  return list.length > 0 ? [{ kind: 'statements', items: list.map((x) => ({ kind: x.kind, text: x.text })) }] : [];
}

function table(role: string, t: Table, keepTogether: boolean): Block {
  return { kind: 'table', role, keepTogether, ...t };
}

function ofKind(list: Statement[], ...kinds: Statement['kind'][]): Statement[] {
  return list.filter((x) => kinds.includes(x.kind));
}
