/**
 * One series of a brief: its data cut at the reporting period, its settings resolved once, then decomposed,
 * diagnosed, analysed (with the firmness and sensitivity re-runs), narrated and, when asked, charted. What
 * the second thread of a many-series brief runs (series-service.ts), so it loads none of the job reader or
 * the data readers: the job and the data arrive read.
 */
import { matchYearlyTotals } from '../adjust/yearly-totals.js';
import { seriesHistory } from '../analyse/history.js';
import { analyse } from '../analyse/index.js';
import { type SpanPair, spansFor } from '../analyse/spans.js';
import { parsePeriod } from '../data/dates.js';
import type { LoadedData, LoadedGroup } from '../data/load.js';
import { identifiableSeasonality } from '../diagnose/identifiable-seasonality.js';
import { diagnose } from '../diagnose/index.js';
import { BriefError } from '../errors.js';
import { resolveChangeExpression } from '../job/change-expression.js';
import { placeInJob } from '../job/place.js';
import { defaultPeriods, resolveDecomposition } from '../job/resolve.js';
import { resolveEffects } from '../job/resolve-effects.js';
import { formatNumber } from '../narrate/format.js';
import { narrateOverview } from '../narrate/overview.js';
import { narrateSeries } from '../narrate/statements.js';
import { comparisonLabel } from '../narrate/wording.js';
import type { DecompositionSettings, PastIssue, SeriesBrief } from '../vocabulary/brief.js';
import {
  defaultPeriod,
  type Frequency,
  isoOf,
  isoWeekOf,
  ordinalOf,
  startOf,
  yearLag,
} from '../vocabulary/period-index.js';
import type { IdentifiableSeasonality } from '../vocabulary/seasonality.js';
import type { ComparisonSpec, Job, SeriesSpec } from '../vocabulary/settings.js';
import { putBack, removeEffects, trendWithEffects } from './effects.js';
import { decomposeExtended, effectsModel } from './extended.js';
import { refitWindow, windowedTrendOf } from './refit-window.js';

/** One series of a brief with its data: what buildSeries needs. */
export interface SeriesWork {
  spec: SeriesSpec;
  data: LoadedData;
  g: LoadedGroup;
  /** What earlier briefs published about this series (from the record); empty when none. */
  past?: PastIssue[];
}

/** One series' figures and, when asked, its charts. */
export async function buildSeriesWithCharts(
  job: Job,
  w: SeriesWork,
  period: string | null,
  locale: string,
  charts: boolean,
): Promise<SeriesBrief> {
  const s = buildSeries(job, w.spec, w.data, w.g, period, w.past ?? []);
  if (charts) {
    const { buildCharts } = await import('../chart/index.js');
    s.charts = await buildCharts(s, locale, job.brief.accentColour);
  }
  return s;
}

/**
 * Where a series stops for this brief: the reporting period (the job's or --period, else the last
 * observation) as an ordinal, and the number of periods up to it. Throws when the period is not a date, lies
 * outside the data, or leaves fewer periods than the decomposition needs (two whole seasonal cycles).
 */
export function reportingCut(job: Job, spec: SeriesSpec, data: LoadedData, g: LoadedGroup, period: string | null) {
  // A period from the job points at brief.period; one from the command line can only name the job file.
  // Looked up only for an error: a worker thread would parse the job file again to find it.
  const i = job.series.indexOf(spec);
  const place = () =>
    period !== null && period === job.brief.period ? placeInJob(job, 'brief.period') : { file: job.file };
  const frequency = data.frequency;
  const index = g.series.index;
  const last = index.start + index.length - 1;
  let reporting = last;
  if (period) {
    const p = parsePeriod(period);
    if (p === null) {
      throw new BriefError(
        'bad-period',
        `the reporting period "${period}" is not a date`,
        'write it like the data, e.g. 2026-09 for a month or 2026-Q3 for a quarter',
        place(),
      );
    }
    // A period coarser than the data names several of its periods ("1960-Q2" on monthly data is three
    // months, not April): refused, with the form that fits. A finer one names the period that holds it.
    if (COARSENESS[p.frequency] > COARSENESS[frequency]) {
      throw new BriefError(
        'period-too-coarse',
        `the reporting period "${period}" names a ${UNIT[p.frequency]}, but series "${spec.id}" is ${frequency}`,
        `write one ${UNIT[frequency]}, e.g. ${isoForm(frequency, last)} (accepted: ${ACCEPTED[frequency]})`,
        place(),
      );
    }
    reporting = ordinalOf(frequency, p.utcMs);
    if (reporting > last || reporting < index.start) {
      throw new BriefError(
        'period-outside-data',
        `the reporting period ${period} is outside the data of series "${spec.id}" (${isoOf(frequency, index.start)} to ${isoOf(frequency, last)})`,
        'choose a period within the data, or leave brief.period out to report the last observation',
        place(),
      );
    }
  }
  const n = reporting - index.start + 1;
  // What the decomposition and its seasonal test need: two whole cycles of the seasonal period and one
  // period more (MSTL: of its shortest period, since longer ones the data cannot hold are dropped; of the
  // longest when the job names them). With less than two years the brief says what it cannot compare
  // (README, "How much data a brief needs").
  const { least, why } = leastHistory(spec, frequency);
  // A period the job names that the data cannot hold twice is reported at that setting (job/resolve.ts).
  const named = spec.decomposition.period !== null || spec.decomposition.periods !== null;
  if (n < least && !(named && n < least - 1)) {
    throw new BriefError(
      'too-short',
      `series "${spec.id}" has ${n} ${UNIT[frequency]}s of data up to the reporting period; a brief of ${frequency} data needs at least ${least}: ${why}`,
      'add older data or choose a later reporting period (README, "How much data a brief needs")',
      period ? place() : placeInJob(job, `series.${i}.data.file`),
    );
  }
  return { i, n, reporting, frequency, index };
}

/** The fewest periods a series' decomposition accepts, and why in words. */
function leastHistory(spec: SeriesSpec, frequency: Frequency): { least: number; why: string } {
  const d = spec.decomposition;
  const p =
    d.method === 'mstl'
      ? d.periods
        ? Math.max(...d.periods)
        : Math.min(...defaultPeriods(frequency))
      : (d.period ?? defaultPeriod(frequency));
  // One period more than the two cycles the decomposition takes: the test for a real seasonal pattern
  // compares seasons over the cycles a centred moving average leaves, and needs two values of one season.
  return {
    least: 2 * p + 1,
    why: `two whole cycles of the seasonal period of ${p} ${UNIT[frequency]}s, and one ${UNIT[frequency]} more for the test of a real seasonal pattern`,
  };
}

/** The frequencies from finest to coarsest. */
const COARSENESS: Record<Frequency, number> = { hourly: 0, daily: 1, weekly: 2, monthly: 3, quarterly: 4 };
const UNIT: Record<Frequency, string> = {
  hourly: 'hour',
  daily: 'day',
  weekly: 'week',
  monthly: 'month',
  quarterly: 'quarter',
};
/** The written forms a reporting period of each frequency may take (finer ones name the period holding them). */
const ACCEPTED: Record<Frequency, string> = {
  hourly: 'YYYY-MM-DDTHH:MM',
  daily: 'YYYY-MM-DD, or a date-time within the day',
  weekly: 'YYYY-Www, or a date within the week',
  monthly: 'YYYY-MM, or a date within the month',
  quarterly: 'YYYY-Qn, YYYY-MM or a date within the quarter',
};

/** The data's own written form of a period: "2026-09", "2026-Q3", "2026-W39", "2026-09-15", "2026-09-15T14:00". */
function isoForm(frequency: Frequency, ordinal: number): string {
  const iso = isoOf(frequency, ordinal);
  switch (frequency) {
    case 'monthly':
      return iso.slice(0, 7);
    case 'quarterly':
      return `${iso.slice(0, 4)}-Q${Math.floor(Number(iso.slice(5, 7)) / 3) + 1}`;
    case 'weekly': {
      const w = isoWeekOf(startOf(frequency, ordinal));
      return `${w.year}-W${String(w.week).padStart(2, '0')}`;
    }
    case 'hourly':
      return iso.replace(/Z$/, '');
    default:
      return iso;
  }
}

export function buildSeries(
  job: Job,
  spec: SeriesSpec,
  data: LoadedData,
  g: LoadedGroup,
  period: string | null,
  past: PastIssue[] = [],
): SeriesBrief {
  const { i, n, reporting, frequency, index } = reportingCut(job, spec, data, g, period);
  const values = g.series.values.slice(0, n);
  const dates = g.dates.slice(0, n);
  const locale = job.brief.locale;
  const settingAt = (key: string) =>
    placeInJob(job, `series.${i}.decomposition.${key}`, `defaults.decomposition.${key}`, `series.${i}`);
  const resolved = resolveDecomposition(
    spec.decomposition,
    values,
    frequency,
    settingAt,
    (v) => formatNumber(v, locale),
    job.brief.fiscalYearStartMonth,
  );
  const mult = resolved.model === 'multiplicative';
  const identifiable = resolved.periods.map((p) => identifiableSeasonality(values, p, mult));
  const effectAt = (key: string) =>
    placeInJob(job, `series.${i}.effects.${key}`, `defaults.effects.${key}`, `series.${i}.effects`, `series.${i}`);
  const { settings: effectSettings, holidays } = resolveEffects(
    spec.effects,
    { frequency, start: index.start, length: index.length, used: n, values: g.series.values },
    effectAt,
  );
  const settings: DecompositionSettings = {
    ...resolved,
    seasonalAdjustment: seasonalAdjustmentFor(identifiable),
    effects: effectSettings,
  };
  // Effects first, then the extension and decomposition of what is left (the linearised series).
  const removed = effectSettings.on
    ? removeEffects(values, { frequency, start: index.start, length: n }, effectSettings, mult, holidays)
    : null;
  const fx = removed?.effects ?? null;
  const linearised = removed?.linearised ?? values;
  // A seasonal ARIMA extension of what the effects leave takes the effects model's orders (extended.ts);
  // TRENDBRIEF_EXHAUSTIVE_REFITS=1 searches again, for test/brief/extension.test.ts to compare.
  const known = fx && !exhaustiveRefits() ? effectsModel(fx.fit, fx.log, settings) : null;
  const { d: dLinear, extension: ext } = decomposeExtended(linearised, settings, known, false, true);
  const extension =
    known && ext?.description ? { ...ext, description: `${ext.description} (the orders of the effects model)` } : ext;
  const withFx = fx ? putBack(dLinear, fx, mult, values) : null;
  const d = withFx ?? dLinear;
  const chosen = extension?.model ?? null;
  // Matched yearly totals replace the adjusted series everywhere it is read (comparisons, charts, tables);
  // the decomposition's own stays in the components beside it.
  const totals = !settings.yearlyTotals.match
    ? null
    : settings.seasonalAdjustment.applied
      ? matchYearlyTotals(values, d.adjusted, frequency, index.start, settings.yearlyTotals.yearStartMonth)
      : {
          adjusted: d.adjusted,
          years: [],
          skipped: 'the data are not seasonally adjusted, so there is nothing to match',
        };
  const adjusted = totals ? totals.adjusted : d.adjusted;
  const diagnostics = diagnose({
    ...d,
    // Residual seasonality is tested on the adjusted series the brief publishes (matched, when asked).
    adjusted,
    observed: values,
    period: settings.period,
    multiplicative: mult,
    dates,
    identifiable,
    seasonAdjusted: settings.seasonalAdjustment.applied,
  });
  const comparisons = job.comparisons.map((c) => ({
    spec: c,
    label: c.label ?? comparisonLabel(c, frequency),
    spans: comparisonSpans(c, frequency, reporting, job, spec),
  }));
  const minLength = 2 * Math.max(...settings.periods);
  const withEffects = (f: (v: Float64Array) => Float64Array) => (fx ? trendWithEffects(f, fx, mult) : f);
  const window = refitWindow(n, yearLag(frequency), Math.max(...settings.periods));
  const change = resolveChangeExpression(spec.changeAs ?? 'auto', spec.unit, values);
  const analysis = analyse({
    frequency,
    start: index.start,
    dates,
    observed: values,
    ...d,
    adjusted,
    period: settings.period,
    multiplicative: mult,
    aggregation: spec.aggregation,
    provisionalReason: provisionalReason(settings, d.provisionalCount),
    diagnostics,
    comparisons,
    firmnessPeriods: spec.firmnessPeriods,
    minLength,
    // The revision study (shorter series) runs the brief's own pipeline: extended with the chosen orders,
    // coefficients re-estimated. The sensitivity check (one value more, tried many times) keeps the
    // coefficients, so the trend stays linear in the data unless the model is on logarithms.
    // A long series' re-fits see only its latest years (refit-window.ts); the method appendix says so.
    trendOf: withEffects(windowedTrendOf((v) => decomposeExtended(v, settings, chosen, v.length > n).d.trend, window)),
    refitWindow: window,
    // The sensitivity search's short cuts (analyse/sensitivity.ts); TRENDBRIEF_EXHAUSTIVE_REFITS=1 walks every
    // step with a fit each, for test/brief/refits.test.ts to compare.
    singleCrossing: !exhaustiveRefits() && singleCrossing(settings) && !chosen?.log,
    gallop: !exhaustiveRefits(),
    affine: !exhaustiveRefits() && !settings.robust && !mult && !chosen?.log,
    changeExpression: change.expression,
  });
  const components = {
    dates,
    observed: Array.from(values),
    trend: Array.from(d.trend),
    seasonal: Array.from(d.seasonal),
    remainder: Array.from(d.remainder),
    adjusted: Array.from(adjusted),
    ...(totals?.years.length ? { adjustedAsDecomposed: Array.from(d.adjusted) } : {}),
    ...(d.seasonals
      ? { seasonals: Object.fromEntries([...d.seasonals].map(([p, v]) => [String(p), Array.from(v)])) }
      : {}),
    ...(d.weights ? { weights: Array.from(d.weights) } : {}),
    // The calendar component is there when a calendar group earned its place; otherwise it is nil.
    ...(withFx && removed?.report.groups.some((x) => x.kept) ? { calendar: Array.from(withFx.calendar) } : {}),
    ...(fx && fx.events.length > 0 ? { steps: Array.from(fx.level), oneOff: Array.from(fx.oneOff) } : {}),
  };
  const series: SeriesBrief = {
    id: spec.id,
    label: spec.label,
    unit: spec.unit,
    group: g.key,
    aggregation: spec.aggregation,
    goodDirection: spec.goodDirection,
    frequency,
    settings,
    changeExpression: change.expression,
    changeExpressionReason: change.reason,
    extension: {
      used: chosen !== null,
      added: extension?.added ?? 0,
      model: extension?.description ?? null,
      skipped: extension?.skipped ?? null,
    },
    yearlyTotals: totals
      ? {
          years: totals.years.map((y) => ({
            from: dates[y.from],
            to: dates[y.to],
            ordinals: { first: index.start + y.from, last: index.start + y.to },
          })),
          skipped: totals.skipped,
        }
      : null,
    effects: removed
      ? { ...removed.report, events: removed.report.events.map((x) => ({ ...x, date: dates[x.at] })) }
      : null,
    periodIndex: { frequency, start: index.start, length: n },
    reportingIndex: n - 1,
    reportingDate: dates[n - 1],
    components,
    diagnostics,
    analysis,
    statements: [],
    charts: [],
    data: {
      file: spec.data.fileAsWritten,
      sha256: data.sha256,
      ...(data.source ? { source: data.source } : {}),
      ...(spec.data.query ? { query: spec.data.query } : {}),
      rows: data.rows,
      dateColumn: spec.data.dateColumn,
      valueColumn: spec.data.valueColumn,
      gaps: g.gaps.filter((x) => x <= dates[n - 1]),
      notes: g.notes,
    },
    history: past.length ? seriesHistory(past, dates, values, d.trend, yearLag(frequency)) : null,
  };
  series.statements = narrateSeries(series, job.brief.locale);
  series.statements.push(narrateOverview(series, series.statements, job.brief.locale));
  return series;
}

/**
 * The season is removed unless no period's seasonality is identifiable by the combined test: then the
 * brief describes the trend of the data as they are (decompose/without-season.ts).
 */
function seasonalAdjustmentFor(tests: IdentifiableSeasonality[]): DecompositionSettings['seasonalAdjustment'] {
  if (tests.some((t) => t.verdict === 'present')) {
    return { applied: true, reason: 'the combined test finds identifiable seasonality' };
  }
  return {
    applied: false,
    reason: 'the combined test finds no identifiable seasonality, so the data are not seasonally adjusted',
  };
}

/**
 * Whether the trend's last step can change sign only once as an appended value moves (see
 * analyse/sensitivity.ts). Without robustness weights every method here is linear in the data (loess with
 * fixed weights, moving averages, Henderson), so the step is an affine function of the value; a
 * multiplicative STL or MSTL is linear in the logarithms, so both trend values are powers of the value
 * and their difference changes sign once. A Henderson trend on multiplicative data sums such powers, and
 * robust weights depend on the value itself: neither is promised.
 */
function exhaustiveRefits(): boolean {
  return process.env.TRENDBRIEF_EXHAUSTIVE_REFITS === '1';
}

function singleCrossing(s: SeriesBrief['settings']): boolean {
  if (s.robust) return false;
  if (s.model !== 'multiplicative') return true;
  return s.method !== 'classical' && !s.hendersonLength;
}

function provisionalReason(s: SeriesBrief['settings'], count: number): string {
  if (count === 0)
    return 'the centred moving-average trend stops half a cycle before the end, so no end estimate is shown';
  if (s.hendersonLength)
    return `the last ${count} trend values use Henderson end weights (Musgrave), which later data will revise`;
  return `the last ${count} trend values rest on one-sided loess windows, which later data will revise`;
}

function comparisonSpans(
  c: ComparisonSpec,
  frequency: Frequency,
  reporting: number,
  job: Job,
  spec: SeriesSpec,
): SpanPair {
  if (c.kind !== 'custom') return spansFor(c.kind, frequency, reporting, job.brief.fiscalYearStartMonth);
  const ord = (text: string): number => {
    const p = parsePeriod(text);
    if (p === null) {
      throw new BriefError(
        'bad-span',
        `comparison "${c.label}": "${text}" is not a date`,
        'write spans like the data, e.g. [2025-12, 2026-02]',
        { file: job.file },
      );
    }
    return ordinalOf(frequency, p.utcMs);
  };
  const current = { from: ord(c.current[0]), to: ord(c.current[1]) };
  const baseline = { from: ord(c.baseline[0]), to: ord(c.baseline[1]) };
  for (const s of [current, baseline]) {
    if (s.to > reporting) {
      throw new BriefError(
        'span-after-period',
        `comparison "${c.label}" reaches past the reporting period of series "${spec.id}"`,
        'end custom spans at or before the reporting period',
        { file: job.file },
      );
    }
  }
  return { current, baseline, partial: false, alignment: 'custom' };
}
