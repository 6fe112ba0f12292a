/**
 * The display view of a Brief: the same figures, formatted once for the job's locale, in the order and
 * grouping the HTML and PDF briefs share. No figure is computed here — only chosen and formatted — so both
 * renderers print exactly the same words and numbers.
 */

import { dataFingerprint } from '../brief/build.js';
import {
  countNoun,
  formatExact,
  formatNumber,
  formatPercent,
  formatPeriod,
  formatPeriodShort,
  formatSigned,
  formatSpan,
  unitAround,
  withUnit,
} from '../narrate/format.js';
import { spanBack } from '../narrate/wording.js';
import type {
  Brief,
  BriefMeta,
  Chart,
  Comparison,
  DecompositionSettings,
  ExtensionReport,
  PeriodSpan,
  Provenance,
  SeriesBrief,
  SeriesHead,
  Statement,
  YearlyTotalsReport,
} from '../vocabulary/brief.js';
import { type Frequency, ordinalAt, ordinalOfIso } from '../vocabulary/period-index.js';
import type { LayoutSpec } from '../vocabulary/settings.js';
import type { KeyFigure, Table } from './blocks.js';
import { METHOD_WORDS, SERIES_WORDS, WORDS } from './words.js';

export type { KeyFigure, Table } from './blocks.js';

export interface SeriesView {
  id: string;
  anchor: string;
  label: string;
  unit: string;
  group: string | null;
  reportingPeriod: string;
  headline: Statement;
  statements: Statement[];
  keyFigures: KeyFigure[];
  charts: Chart[];
  comparisons: Table;
  unusual: Table | null;
  /** The statement on unusual periods (how many, or that there were none); empty when there is none. */
  unusualSummary: string;
  firmness: Statement;
  /** Published first estimates against today's (from the record), once there are enough. */
  firmnessPublished: Statement | null;
  publishedRevisions: Table | null;
  sensitivity: Statement | null;
  revisions: Table | null;
  method: Table;
  sources: { method: string; source: string }[];
  dataInfo: { label: string; value: string }[];
}

export interface BriefView {
  title: string;
  organisation: string;
  author: string;
  contact: string;
  locale: string;
  lang: string;
  accent: string;
  logo: { mime: string; dataUri: string } | null;
  pageSize: 'A4' | 'Letter';
  layout: LayoutSpec;
  generatedAt: string;
  generatedIso: string;
  toolVersion: string;
  jobFile: string;
  jobSha256: string;
  fingerprint: string;
  cautions: Statement[];
  series: SeriesView[];
}

/**
 * What the start of the brief shows — masthead, byline, contents and the file's metadata — which needs of
 * each series only its label and reporting period, known before any series is figured. The PDF brief is
 * begun from it while the series are still being built (cli/render-files.ts).
 */
export type HeadView = Omit<BriefView, 'series' | 'cautions' | 'fingerprint'> & {
  series: Pick<SeriesView, 'label' | 'reportingPeriod' | 'anchor'>[];
};

export function headView(meta: BriefMeta, provenance: Provenance, series: SeriesHead[]): HeadView {
  const locale = meta.locale;
  return {
    title: meta.title,
    organisation: meta.organisation,
    author: meta.author,
    contact: meta.contact,
    locale,
    lang: locale,
    accent: meta.accentColour,
    logo: meta.logo,
    pageSize: meta.pageSize,
    generatedAt:
      new Intl.DateTimeFormat(locale, { dateStyle: 'long', timeStyle: 'short', timeZone: 'UTC' }).format(
        new Date(provenance.generatedAt),
      ) + ' UTC',
    generatedIso: provenance.generatedAt,
    toolVersion: provenance.toolVersion,
    jobFile: provenance.jobFile.split(/[\\/]/).pop() ?? provenance.jobFile,
    jobSha256: provenance.jobSha256,
    layout: meta.layout,
    series: series.map((s) => ({
      label: s.label,
      reportingPeriod: reportingPeriod(s, locale),
      anchor: anchorOf(s.id),
    })),
  };
}

/** The whole view; `seriesViews` are the series' views when the caller made them already, in order. */
export function briefView(brief: Brief, seriesViews?: SeriesView[]): BriefView {
  const locale = brief.meta.locale;
  const series =
    seriesViews?.length === brief.series.length ? seriesViews : brief.series.map((s) => seriesView(s, locale));
  return {
    ...headView(brief.meta, brief.provenance, brief.series),
    fingerprint: dataFingerprint(brief),
    cautions: brief.cautions,
    series,
  };
}

function anchorOf(id: string): string {
  return `series-${id}`;
}

function reportingPeriod(s: SeriesHead, locale: string): string {
  return periodText(s.frequency, ordinalAt(s.periodIndex, s.reportingIndex), locale, false);
}

export function seriesView(s: SeriesBrief, locale: string): SeriesView {
  const a = s.analysis;
  const u = s.unit ? ` ${s.unit}` : '';
  const unit = (formatted: string) => withUnit(formatted, s.unit, locale);
  const num = (v: number) => formatNumber(v, locale);
  const pct = (v: number) => formatPercent(v, locale, true);
  // Periods of the series by position; labels from outside the period index (the data's gaps, the record's
  // earlier briefs) are the only ones read back.
  const at = (i: number, short = false) => periodText(s.frequency, ordinalAt(s.periodIndex, i), locale, short);
  const period = (iso: string, short = false) => periodLabel(s.frequency, iso, locale, short);
  const byKind = (kind: Statement['kind']) => s.statements.filter((x) => x.kind === kind);
  const headline = byKind('headline')[0];
  // The same direction word as the headline: one materiality rule (analyse/materiality.ts) decides both.
  const y = a.trendYearly;
  const dirWord = SERIES_WORDS.direction[y.direction];
  const relative = s.changeExpression === 'relative';
  const adjusted = s.settings.seasonalAdjustment?.applied ?? true;
  // Revisions are of the trend's yearly change as the brief states it: points of a percent, or units.
  const revisionRelative = y.expression === 'relative';
  const revision = (v: number) => (revisionRelative ? `${formatNumber(v, locale, 1)} ${WORDS.points}` : unit(num(v)));
  const signedRevision = (v: number) =>
    revisionRelative ? `${formatSigned(v, locale, 1)} ${WORDS.points}` : unit(formatSigned(v, locale));
  // With less than two years of data the headline's change is over a shorter span (a week, three months).
  const span = a.headlineSpan;
  const back = span.yearly ? 'a year ago' : `${spanBack(s.frequency, span.periods, false)} earlier`;
  const keyFigures: KeyFigure[] = [
    {
      label: span.yearly ? SERIES_WORDS.trendYoY : SERIES_WORDS.trendOn(back),
      value: relative ? pct(a.trendYoY.percent) : unit(formatSigned(a.trendYoY.change, locale)),
      note: relative
        ? `${unit(formatSigned(a.trendYoY.change, locale))} ${SERIES_WORDS.onPeriod(at(s.reportingIndex - a.headlineSpan.periods))}`
        : SERIES_WORDS.onPeriod(at(s.reportingIndex - a.headlineSpan.periods)),
    },
    {
      label: SERIES_WORDS.trendDirection,
      value: dirWord,
      note: y.run > 0 ? SERIES_WORDS.inARow(countOf(y.run, s.frequency, locale)) : '',
    },
    {
      label: SERIES_WORDS.latestValue(at(s.reportingIndex)),
      value: unit(num(s.components.observed[s.reportingIndex])),
      note: relative
        ? SERIES_WORDS.rawOnYearAgo(pct(a.rawYoY.percent), back)
        : SERIES_WORDS.rawOnYearAgo(unit(formatSigned(a.rawYoY.change, locale)), back),
    },
    {
      // Unadjusted (no identifiable seasonality), the adjusted series is the data: say so.
      label: adjusted ? SERIES_WORDS.adjustedOnPrevious : SERIES_WORDS.unadjustedOnPrevious,
      value: relative ? pct(a.adjustedPoP.percent) : unit(formatSigned(a.adjustedPoP.change, locale)),
      note: relative ? unit(formatSigned(a.adjustedPoP.change, locale)) : '',
    },
    // An annualised growth rate is a percent, and over six months or quarters a measure of the trade's
    // monthly and quarterly reports (common practice); over six hours, days or weeks it would mislead.
    ...(relative && (s.frequency === 'monthly' || s.frequency === 'quarterly')
      ? [
          {
            label: SERIES_WORDS.annualised(s.frequency === 'monthly' ? 'months' : 'quarters'),
            value: pct(a.trendAnnualised6),
            note: '',
          },
        ]
      : []),
    {
      label: SERIES_WORDS.typicalRevision,
      value: Number.isFinite(a.firmness.meanAbsoluteRevision)
        ? revision(a.firmness.meanAbsoluteRevision)
        : WORDS.notAvailable,
      note: Number.isFinite(a.firmness.range80[0])
        ? SERIES_WORDS.withinRange(
            a.firmness.withinRange80,
            a.firmness.periodsChecked,
            signedRevision(a.firmness.range80[0]),
            signedRevision(a.firmness.range80[1]),
          )
        : '',
    },
  ];
  // In the series' own terms, as the statements put them: a percent only of a positive baseline.
  const change = (v: Comparison['raw']) =>
    relative && v.baseline > 0 ? pct(v.percent) : unit(formatSigned(v.change, locale));
  const comparisons: Table = {
    caption: SERIES_WORDS.comparisonsCaption(s.label, s.aggregation),
    headers: SERIES_WORDS.comparisonHeaders(u),
    numeric: [false, false, false, true, true, true, true, true],
    rows: a.comparisons.map((c: Comparison) => [
      c.label + (c.partial ? SERIES_WORDS.partYear : ''),
      spanText(s, c.current, locale),
      spanText(s, c.baseline, locale),
      num(c.raw.current),
      num(c.raw.baseline),
      change(c.raw),
      adjusted ? change(c.adjusted) : SERIES_WORDS.notAdjusted,
      change(c.trend),
    ]),
  };
  const mult = s.settings.model === 'multiplicative';
  const unusual: Table | null =
    a.outliers.length === 0
      ? null
      : {
          caption:
            a.recentSpan.years > 0
              ? SERIES_WORDS.unusualInLast(a.recentSpan.years)
              : SERIES_WORDS.unusualSince(at(a.recentSpan.from)),
          headers: SERIES_WORDS.unusualHeaders(u, mult),
          numeric: [false, true, true, true],
          rows: a.outliers.map((o) => [
            at(o.index),
            num(o.observed),
            mult ? pct(100 * (o.remainder - 1)) : formatSigned(o.remainder, locale),
            formatNumber(o.score, locale, 1),
          ]),
        };
  const revisions: Table | null =
    a.firmness.revisions.length === 0
      ? null
      : {
          caption: SERIES_WORDS.revisionsCaption(revisionRelative ? 'percent' : s.unit || 'units'),
          headers: SERIES_WORDS.revisionHeaders(revisionRelative ? WORDS.points : s.unit || 'units'),
          numeric: [false, true, true, true],
          rows: a.firmness.revisions.map((r) => [
            at(r.index, true),
            revisionRelative ? pct(r.first) : formatSigned(r.first, locale),
            revisionRelative ? pct(r.latest) : formatSigned(r.latest, locale),
            revisionRelative ? formatSigned(r.revision, locale, 1) : formatSigned(r.revision, locale),
          ]),
        };
  const published = s.history?.published;
  const publishedRevisions: Table | null = !published
    ? null
    : {
        caption: SERIES_WORDS.publishedCaption,
        headers: [...SERIES_WORDS.publishedHeaders],
        numeric: [false, true, true, true],
        rows: published.revisions.map((r) => [
          period(r.date, true),
          pct(r.first),
          pct(r.latest),
          formatSigned(r.revision, locale, 1),
        ]),
      };
  return {
    id: s.id,
    anchor: anchorOf(s.id),
    label: s.label,
    unit: s.unit,
    group: s.group,
    reportingPeriod: reportingPeriod(s, locale),
    headline,
    statements: s.statements.filter((x) => x !== headline),
    keyFigures,
    charts: s.charts,
    comparisons,
    unusual,
    unusualSummary: byKind('unusual')[0]?.text ?? '',
    firmness: byKind('firmness').find((x) => x.id === 'firmness') ?? byKind('firmness')[0],
    firmnessPublished: s.statements.find((x) => x.id === 'firmness-published') ?? null,
    publishedRevisions,
    sensitivity: byKind('sensitivity')[0] ?? null,
    revisions,
    method: withEffectRows(
      withWordMeanings(
        methodTable(s.settings, locale, s.extension, s.frequency, a.firmness.refitWindow ?? null, s.yearlyTotals),
        s,
        locale,
      ),
      s,
      locale,
    ),
    sources: [...methodSources(s.settings, s.extension, (s.yearlyTotals?.years.length ?? 0) > 0), ...effectSources(s)],
    dataInfo: [
      { label: s.data.query ? SERIES_WORDS.database : SERIES_WORDS.dataFile, value: s.data.file },
      ...(s.data.source?.startsWith('sheet') ? [{ label: SERIES_WORDS.sheet, value: s.data.source.slice(6) }] : []),
      // The query on one line: a table cell of the PDF sets one paragraph.
      ...(s.data.query ? [{ label: SERIES_WORDS.query, value: s.data.query.replace(/\s+/g, ' ').trim() }] : []),
      { label: s.data.query ? SERIES_WORDS.queryHash : SERIES_WORDS.fileHash, value: s.data.sha256 },
      { label: SERIES_WORDS.rowsRead, value: formatNumber(s.data.rows, locale, 0) },
      { label: SERIES_WORDS.dateColumn, value: s.data.dateColumn },
      { label: SERIES_WORDS.valueColumn, value: s.data.valueColumn },
      {
        label: SERIES_WORDS.missingPeriods,
        value: s.data.gaps.length === 0 ? SERIES_WORDS.none : s.data.gaps.map((g) => period(g, true)).join(', '),
      },
      ...s.data.notes.map((n) => ({ label: SERIES_WORDS.note, value: n })),
      { label: SERIES_WORDS.provisional, value: SERIES_WORDS.provisionalMarked(a.firmness.provisionalReason) },
    ],
  };
}

/**
 * The data appendix's table of a series: every period from `first` on, with its components. Periods marked *
 * are provisional. Formatted only for the rows shown (a long series' appendix is cut by the document).
 */
export function dataTable(s: SeriesBrief, locale: string, first = 0): Table {
  const a = s.analysis;
  const c = s.components;
  const u = s.unit ? ` (${s.unit})` : '';
  const mult = s.settings.model === 'multiplicative';
  const num = (v: number) => formatNumber(v, locale);
  const rows: string[][] = [];
  const cal = c.calendar;
  for (let i = Math.max(0, first); i < c.dates.length; i++) {
    rows.push([
      periodText(s.frequency, ordinalAt(s.periodIndex, i), locale, true) +
        (i >= a.firmness.provisionalFrom ? ' *' : ''),
      formatExact(c.observed[i], locale),
      num(c.trend[i]),
      mult ? formatNumber(c.seasonal[i], locale, 3) : num(c.seasonal[i]),
      ...(cal ? [mult ? formatNumber(cal[i], locale, 3) : num(cal[i])] : []),
      num(c.adjusted[i]),
      mult ? formatNumber(c.remainder[i], locale, 3) : num(c.remainder[i]),
    ]);
  }
  return {
    caption: SERIES_WORDS.dataCaption(s.label, u),
    headers: ['Period', 'Observed', 'Trend', 'Seasonal', ...(cal ? ['Calendar'] : []), 'Adjusted', 'Remainder'],
    numeric: [false, true, true, true, ...(cal ? [true] : []), true, true],
    rows,
  };
}

function periodText(f: Frequency, ordinal: number, locale: string, short: boolean): string {
  return short ? formatPeriodShort(f, ordinal, locale) : formatPeriod(f, ordinal, locale);
}

/** A period named by a label from outside the series' period index: a gap the data stage listed, an earlier brief's. */
function periodLabel(f: Frequency, iso: string, locale: string, short: boolean): string {
  return periodText(f, ordinalOfIso(f, iso), locale, short);
}

function spanText(s: SeriesBrief, span: PeriodSpan, locale: string): string {
  return formatSpan(s.frequency, span.ordinals.first, span.ordinals.last, locale);
}

function countOf(n: number, f: Frequency, locale: string): string {
  const noun = { monthly: 'month', quarterly: 'quarter', weekly: 'week', daily: 'day', hourly: 'hour' }[f];
  return countNoun(n, noun, locale);
}

/**
 * The model in words. A multiplicative STL or MSTL is fitted to the logarithms of the data and transformed
 * back (decompose/index.ts), so the seasonally adjusted values (data ÷ seasonal) need not add up to the raw
 * totals over a year: a reviewer comparing the two must be told.
 */
function modelText(s: DecompositionSettings, matched: boolean): string {
  if (s.model === 'additive') return METHOD_WORDS.additive;
  return METHOD_WORDS.multiplicative(
    s.method === 'classical' ? METHOD_WORDS.ratios : METHOD_WORDS.onLogarithms(s.method.toUpperCase()),
    matched,
  );
}

/**
 * The method appendix's line on matched yearly totals: which years were forced and how, what happens to
 * part years, and that the seasonal component shown is the decomposition's; or why nothing was forced.
 */
function yearlyTotalsText(s: DecompositionSettings, t: YearlyTotalsReport, f: Frequency, locale: string): string {
  const kind = s.yearlyTotals.yearStartMonth === 1 ? 'calendar' : 'financial';
  if (t.years.length === 0) return `asked for, but not done: ${t.skipped ?? 'no whole year could be matched'}`;
  const first = periodText(f, t.years[0].ordinals.first, locale, false);
  const last = periodText(f, t.years[t.years.length - 1].ordinals.last, locale, false);
  return `the seasonally adjusted series is matched to the data's totals over each whole ${kind} year from ${first} to ${last} (${formatNumber(t.years.length, locale, 0)} ${t.years.length === 1 ? 'year' : 'years'}) by Denton's proportional first-difference method, without a fixed first value; a year the data hold only in part, or with a missing value, is not matched: its ratio of matched to unmatched values is carried on from the nearest whole year. The comparisons without the season use the matched series; the seasonal component shown is the decomposition's, so there the adjusted value is no longer exactly the data ${s.model === 'multiplicative' ? 'over' : 'minus'} the seasonal`;
}

function methodTable(
  s: DecompositionSettings,
  locale: string,
  e: ExtensionReport,
  f: Frequency,
  refit: number | null = null,
  totals: YearlyTotalsReport | null = null,
): Table {
  const n = (v: number) => formatNumber(v, locale, 0);
  const rows: string[][] = [
    [METHOD_WORDS.method, METHOD_WORDS.methods[s.method]],
    [METHOD_WORDS.model, modelText(s, (totals?.years.length ?? 0) > 0)],
    [METHOD_WORDS.modelChosen, s.modelReason],
    [s.method === 'mstl' ? METHOD_WORDS.seasonalPeriods : METHOD_WORDS.seasonalPeriod, s.periods.map(n).join(', ')],
  ];
  if (s.method === 'classical') {
    rows.push([
      METHOD_WORDS.trendFilter,
      s.trendFilter === 'henderson' ? METHOD_WORDS.henderson(s.hendersonLength) : METHOD_WORDS.centredAverage(s.period),
    ]);
  } else {
    rows.push(
      [
        METHOD_WORDS.seasonalWindow,
        s.seasonalWindows.map((w) => (w === 'periodic' ? METHOD_WORDS.periodic : n(w))).join(', '),
      ],
      [METHOD_WORDS.trendWindow, s.trendWindows.map(n).join(', ')],
      [METHOD_WORDS.lowpassWindow, s.lowpassWindows.map(n).join(', ')],
      [METHOD_WORDS.degrees, `${s.seasonalDegree}, ${s.trendDegree}, ${s.lowpassDegree}`],
      [METHOD_WORDS.passes, `${s.inner}, ${s.outer}`],
      [METHOD_WORDS.robust, s.robust ? METHOD_WORDS.robustYes : METHOD_WORDS.robustNo],
    );
    if (s.method === 'mstl') rows.push([METHOD_WORDS.iterations, n(s.iterations)]);
    if (s.hendersonLength) rows.push([METHOD_WORDS.finalTrend, METHOD_WORDS.finalHenderson(s.hendersonLength)]);
  }
  rows.push([METHOD_WORDS.seasonalAdjustment, s.seasonalAdjustment?.reason ?? METHOD_WORDS.seasonRemoved]);
  rows.push([METHOD_WORDS.extension, extensionText(s, e, f, locale)]);
  if (totals) rows.push([METHOD_WORDS.yearlyTotals, yearlyTotalsText(s, totals, f, locale)]);
  if (refit) rows.push([METHOD_WORDS.refits, METHOD_WORDS.refitsOn(countOf(refit, f, locale))]);
  return { caption: METHOD_WORDS.caption, headers: [...METHOD_WORDS.headers], numeric: [false, false], rows };
}

/** The method appendix's line on forecast extension: what extended the series and by how much, or why not. */
function extensionText(s: DecompositionSettings, e: ExtensionReport, f: Frequency, locale: string): string {
  if (e.used) {
    return METHOD_WORDS.extended(countOf(e.added, f, locale), e.model, s.extension.reason);
  }
  if (e.skipped) return METHOD_WORDS.extensionSkipped(e.skipped);
  return s.extension.reason;
}

/** What the brief's words mean for this series: how change is expressed, the materiality rule, the spans. */
/**
 * The method appendix's rows on calendar effects and events: the rule that keeps a calendar regressor
 * (AICc), the search's critical value (Ljung 1993), the model of the errors, and each effect with its
 * estimate and t-value.
 */
function withEffectRows(t: Table, s: SeriesBrief, locale: string): Table {
  const e = s.effects;
  const fx = s.settings.effects;
  if (!e || !fx) return t;
  const rows: string[][] = [];
  if (e.skipped) {
    rows.push(['Calendar effects and events', e.skipped]);
    return { ...t, rows: [...t.rows, ...rows] };
  }
  // With a calendar component the model's identity has four parts.
  const base = s.components.calendar
    ? t.rows.map((r) =>
        r[0] === 'Model'
          ? [
              r[0],
              r[1]
                .replace('trend + seasonal + remainder', 'trend + seasonal + calendar + remainder')
                .replace('trend × seasonal × remainder', 'trend × seasonal × calendar × remainder'),
            ]
          : r,
      )
    : t.rows;
  const num = (v: number, d?: number) => formatNumber(v, locale, d);
  rows.push([
    'Calendar effects and events',
    `estimated together before decomposing, by a regression with ${e.model} errors (exact maximum likelihood); taken out of the series the decomposition sees; steps and ramps put back into the trend, one-off and fading events into the remainder, calendar effects kept as a component of their own${e.scale === 'factor' ? ' (on logarithms: effects are factors)' : ''}`,
  ]);
  if (e.groups.length > 0) {
    rows.push([
      'Calendar regressors kept',
      `each kept only when the model with it has the lower AICc (Hurvich & Tsai 1989): ${e.groups
        .map(
          (g) =>
            `${g.name} ${g.kept ? 'kept' : 'dropped'} (AICc ${num(g.aiccWith, 1)} with, ${num(g.aiccWithout, 1)} without)`,
        )
        .join('; ')}`,
    ]);
  }
  rows.push([
    'Search for unnamed events',
    fx.find.length > 0
      ? `${fx.findReason}: ${fx.find.join(', ')} events by the iterative method of Chen & Liu (1993), kept when |t| is above ${num(e.criticalValue ?? Number.NaN, 2)}, the critical value of Ljung (1993) for this length at the 5% level`
      : fx.findReason,
  ]);
  for (const x of e.events) {
    const size =
      e.scale === 'factor'
        ? `${formatNumber(100 * (Math.exp(x.estimate) - 1), locale, 1)}%`
        : withUnit(num(x.estimate), s.unit, locale);
    const when = periodText(s.frequency, ordinalAt(s.periodIndex, x.at), locale, false);
    rows.push([
      `${x.label ? 'Named' : 'Found'} ${x.kind}, ${when}`,
      `${x.label ? `${x.label}: ` : ''}${size} (t = ${num(x.t, 1)})`,
    ]);
  }
  return { ...t, rows: [...base, ...rows] };
}

function effectSources(s: SeriesBrief): { method: string; source: string }[] {
  const e = s.effects;
  if (!e || e.skipped) return [];
  const out = [
    {
      method: 'Calendar effects and events',
      source:
        'regression with ARIMA errors before decomposition: Findley, Monsell, Bell, Otto & Chen (1998), JBES 16(2); regressors kept by AICc (Hurvich & Tsai 1989)',
    },
  ];
  if (s.settings.effects?.easterDays != null) {
    out.push({ method: 'Easter effect', source: 'Bell & Hillmer (1983), JASA 78(383): w days before Easter Sunday' });
  }
  if ((s.settings.effects?.find.length ?? 0) > 0) {
    out.push({
      method: 'Search for unnamed events',
      source: 'Chen & Liu (1993), JASA 88(421); critical value by Ljung (1993), JRSS B 55(2)',
    });
  }
  return out;
}

function withWordMeanings(t: Table, s: SeriesBrief, locale: string): Table {
  const y = s.analysis.trendYearly;
  const m = y.materiality;
  const pts = (v: number) => formatNumber(v, locale, y.expression === 'relative' ? 1 : undefined);
  const unit = y.expression === 'relative' ? 'points' : s.unit;
  // "−3 to 4 points", "£−3 thousand to £4 thousand": a unit after a number once, a currency sign before each.
  const range =
    unitAround(unit, locale).before === ''
      ? `${pts(m.low)} to ${withUnit(pts(m.high), unit, locale)}`
      : `${withUnit(pts(m.low), unit, locale)} to ${withUnit(pts(m.high), unit, locale)}`;
  const rule =
    m.rule === 'revision-range'
      ? METHOD_WORDS.revisionRangeRule(range)
      : METHOD_WORDS.noiseRule(
          y.expression === 'relative' ? `${pts(m.high)} %` : withUnit(pts(m.high), s.unit, locale),
          s.analysis.headlineSpan.yearly
            ? 'yearly change'
            : `change over ${spanBack(s.frequency, s.analysis.headlineSpan.periods, false)}`,
        );
  const recent = s.analysis.recentSpan;
  return {
    ...t,
    rows: [
      ...t.rows,
      [
        METHOD_WORDS.changeExpressed,
        METHOD_WORDS.changeExpressedAs(
          s.changeExpression === 'relative' ? METHOD_WORDS.asPercent : METHOD_WORDS.inUnits(s.unit),
          s.changeExpressionReason,
        ),
      ],
      [METHOD_WORDS.directionWords, rule],
      [METHOD_WORDS.peakAndLow, METHOD_WORDS.peakAndLowMeaning],
      [METHOD_WORDS.unusualListed, recent.years > 0 ? METHOD_WORDS.lastYears(recent.years) : METHOD_WORDS.wholeSeries],
    ],
  };
}

export function methodSources(
  s: DecompositionSettings,
  e?: ExtensionReport,
  matched = false,
): { method: string; source: string }[] {
  const out: { method: string; source: string }[] = [];
  if (s.method === 'classical') {
    out.push({
      method: 'Classical decomposition',
      source: 'Hyndman & Athanasopoulos, Forecasting: Principles and Practice, 3rd ed., §3.4',
    });
    out.push({
      method: 'Centred moving average',
      source: 'Hyndman & Athanasopoulos, Forecasting: Principles and Practice, 3rd ed., §3.3',
    });
  } else {
    out.push({
      method: 'STL',
      source: 'Cleveland, Cleveland, McRae & Terpenning (1990), Journal of Official Statistics 6(1), 3–73',
    });
    if (s.method === 'mstl')
      out.push({ method: 'MSTL', source: 'Bandara, Hyndman & Bergmeir (2021), arXiv:2107.13462' });
  }
  if (s.hendersonLength) {
    out.push({
      method: 'Henderson filter',
      source: 'Henderson (1916), Transactions of the Actuarial Society of America 17, 43–48',
    });
    out.push({
      method: 'Musgrave end weights',
      source: 'Doherty (2001), Australian & New Zealand Journal of Statistics 43(4), 385–392',
    });
  }
  out.push(
    {
      method: 'Strength of trend and seasonality',
      source: 'Wang, Smith & Hyndman (2006), Data Mining and Knowledge Discovery 13(3)',
    },
    { method: 'Unusual periods', source: 'median ± 3 × 1.4826 × MAD of the remainder (common practice; Hampel 1974)' },
    {
      method: 'Identifiable seasonality',
      source:
        'combined test of Lothian & Morry (1978), Statistics Canada: stable-seasonality F at 0.1%, moving-seasonality F at 5% (Higginson 1975), Kruskal–Wallis at 0.1% (Kruskal & Wallis 1952), T1 = 7/F_S and T2 = 3·F_M/F_S for monthly and quarterly cycles; on ratios (differences) to a centred moving average',
    },
    {
      method: 'Residual seasonality',
      source: 'F-test of the adjusted series’ period-on-period changes by season, last 8 cycles, at the 1% level',
    },
    ...(e?.used
      ? [
          {
            method: 'Forecast extension',
            source:
              'Dagum (1988), The X-11-ARIMA/88 Seasonal Adjustment Method, Statistics Canada; ARIMA by exact maximum likelihood (Gardner, Harvey & Phillips 1980), orders chosen as Hyndman & Khandakar (2008), Journal of Statistical Software 27(3)',
          },
        ]
      : []),
    ...(matched
      ? [
          {
            method: 'Yearly totals matched',
            source:
              'Denton (1971), Journal of the American Statistical Association 66(333), 99–102, proportional first differences; modified without the first-period constraint, part years extrapolated, as in the IMF Quarterly National Accounts Manual (2017), chapter 6',
          },
        ]
      : []),
    {
      method: 'Firmness',
      source:
        'real-time revision study of the trend’s year-on-year change: first estimates against settled ones, revision = settled − first (McKenzie 2006, OECD STD/DOC(2006)2); 10th–90th percentiles by quantile type 7 (Hyndman & Fan 1996)',
    },
  );
  return out;
}
