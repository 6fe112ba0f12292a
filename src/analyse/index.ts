/**
 * Every analysis figure of one series at its reporting period (the last index of the decomposed data):
 * changes, direction, turning points, the seasonal profile, comparisons, recent unusual periods, the
 * firmness study and the sensitivity of the trend's direction.
 */

import { robustScale } from '../diagnose/robust-scale.js';
import type { Analysis, Comparison, Diagnostics, TrendYearly } from '../vocabulary/brief.js';
import type { ChangeExpression } from '../vocabulary/claims.js';
import { type Frequency, isoOf, periodsPerYear, startOf, yearLag } from '../vocabulary/period-index.js';
import type { Aggregation, ComparisonSpec } from '../vocabulary/settings.js';
import { annualisedGrowth, changeAt, percentChange } from './change.js';
import { compareSpans } from './comparisons.js';
import { stepDirection, trendDirection } from './direction.js';
import { headlineSpan } from './headline-span.js';
import { directionOf, materialityOf } from './materiality.js';
import { revisionStudy } from './revisions.js';
import { namingFor, seasonAt } from './season-naming.js';
import { seasonalProfile } from './seasonal-profile.js';
import { reversalValue } from './sensitivity.js';
import type { SpanPair } from './spans.js';
import { TURNING_POINT_RULE, turningPoints } from './turning-points.js';

export interface AnalyseInput {
  frequency: Frequency;
  /** Ordinal of the first period. */
  start: number;
  dates: string[];
  observed: Float64Array;
  trend: Float64Array;
  seasonal: Float64Array;
  remainder: Float64Array;
  adjusted: Float64Array;
  /** MSTL: each period's seasonal component, keyed by the period; null or absent for one period. */
  seasonals?: Map<number, Float64Array> | null;
  period: number;
  multiplicative: boolean;
  aggregation: Aggregation;
  provisionalCount: number;
  provisionalReason: string;
  diagnostics: Diagnostics;
  comparisons: { spec: ComparisonSpec; label: string; spans: SpanPair }[];
  firmnessPeriods: number;
  /** Shortest series the decomposition accepts (two full cycles). */
  minLength: number;
  /**
   * Re-runs the same fit on other data (a prefix, or the data with one more value); returns the trend. The
   * firmness study and the sensitivity search see the fit only through this.
   */
  trendOf: (values: Float64Array) => Float64Array;
  /** Periods each re-fit of trendOf sees when the series is long (brief/refit-window.ts); null for all. */
  refitWindow?: number | null;
  /**
   * The trend's last step changes sign at most once as one appended value moves (true for decompositions
   * linear in the data or in their logarithms, never for robust fits); lets the sensitivity search
   * binary-search its grid instead of walking it.
   */
  singleCrossing?: boolean;
  /**
   * The trend is linear in the data (no robustness weights, no logarithms): the sensitivity search fits
   * three trials and runs on the line they give (see ReversalSearch.affine).
   */
  affine?: boolean;
  /** Let the sensitivity search gallop over its grid where it would walk it (see ReversalSearch.gallop). */
  gallop?: boolean;
  /** How changes are put in words: percent of a positive base, or units (brief/series.ts resolves it). */
  changeExpression: ChangeExpression;
}

/** The calendar span of the unusual-periods statement, in years ("the last two years"). */
export const RECENT_OUTLIER_YEARS = 2;

export function analyse(a: AnalyseInput): Analysis {
  const r = a.dates.length - 1;
  const lag = yearLag(a.frequency);
  // The headline's span: a year, or with less than two years of data the shorter span they support.
  const span = headlineSpan(a.frequency, r + 1);
  const { direction, run } = trendDirection(a.trend, r);
  const asked: Comparison[] = a.comparisons.map(({ spec, label, spans }) => ({
    id: spec.kind === 'custom' ? `custom-${slug(label)}` : spec.kind,
    kind: spec.kind,
    label,
    aggregation: a.aggregation,
    current: spanInfo(a.frequency, spans.current),
    baseline: spanInfo(a.frequency, spans.baseline),
    partial: spans.partial,
    alignment: spans.alignment,
    raw: compareSpans(a.observed, spans.current, spans.baseline, a.start, a.aggregation),
    adjusted: compareSpans(a.adjusted, spans.current, spans.baseline, a.start, a.aggregation),
    trend: compareSpans(a.trend, spans.current, spans.baseline, a.start, a.aggregation),
  }));
  // A comparison whose spans reach outside the data cannot be made: it is left out, and the brief says so.
  const first = a.dates[0];
  const last = a.dates[r];
  const inside = (c: Comparison) =>
    [c.current, c.baseline].every((x) => x.from >= first && x.to <= last && x.from <= x.to);
  const comparisons = asked.filter(inside);
  if (!span.yearly) comparisons.push(...weekEarlier(a, r));
  const trendYoY = changeAt(a.trend, r, span.periods, a.dates);
  // A percent only of a positive base: a relative series whose trend a year ago was not above zero has its
  // yearly change (and the revisions of it) given in units.
  const relative = a.changeExpression === 'relative' && trendYoY.yearAgo > 0;
  const measure = relative ? percentChange : (now: number, base: number) => now - base;
  const settledBefore = a.dates.length - a.provisionalCount;
  const study = revisionStudy({
    values: a.observed,
    settledTrend: a.trend,
    settledBefore,
    lag,
    periods: a.firmnessPeriods,
    minLength: a.minLength,
    dates: a.dates,
    trendOf: a.trendOf,
    measure,
  });
  const sensitivity = sensitivityOf(a, direction);
  const trendYearly = trendYearlyOf(a, relative, trendYoY.current, trendYoY.yearAgo, study.revisions);
  const periods = [...new Set([a.period, ...(a.seasonals ? [...a.seasonals.keys()] : [])])].sort((x, y) => x - y);
  const profileOf = (period: number) => {
    const naming = namingFor(a.frequency, period);
    return seasonalProfile({
      ...a,
      seasonal: a.seasonals?.get(period) ?? a.seasonal,
      index: r,
      period,
      naming,
      seasonAt: (i, position) => seasonAt(naming, a.frequency, a.start + i, position),
    });
  };
  const seasonalProfiles = periods.map(profileOf);
  const recentFrom = recentStart(a, r);
  return {
    trendYoY,
    trendYearly,
    headlineSpan: span,
    adjustedYoY: changeAt(a.adjusted, r, span.periods, a.dates),
    rawYoY: changeAt(a.observed, r, span.periods, a.dates),
    trendPoP: changeAt(a.trend, r, 1, a.dates),
    adjustedPoP: changeAt(a.adjusted, r, 1, a.dates),
    trendAnnualised6: annualisedGrowth(a.trend, r, 6, periodsPerYear(a.frequency)),
    direction,
    directionRun: run,
    turningPointRule: TURNING_POINT_RULE,
    turningPoints: turningPoints(a.trend, a.dates),
    // The profile is that of the main period alone ("each week" must not carry the yearly swing too); the
    // seasonal share of the latest change keeps every seasonal component, through observed − adjusted.
    seasonalProfile: seasonalProfiles[periods.indexOf(a.period)],
    seasonalProfiles,
    comparisons,
    comparisonsLeftOut: asked.filter((c) => !inside(c)),
    recentSpan: {
      from: recentFrom,
      years: a.dates.length > 0 && recentFrom === 0 && !reaches(a, r) ? 0 : RECENT_OUTLIER_YEARS,
    },
    outliers: a.diagnostics.outliers.filter((o) => o.index >= recentFrom && o.index <= r),
    firmness: {
      periodsChecked: study.revisions.length,
      revisions: study.revisions,
      meanAbsoluteRevision: study.meanAbsoluteRevision,
      range80: study.range80,
      withinRange80: study.withinRange80,
      limit: study.limit,
      neededLength: study.neededLength,
      provisionalFrom: settledBefore,
      provisionalCount: a.provisionalCount,
      provisionalReason: a.provisionalReason,
      refitWindow: a.refitWindow ?? null,
    },
    sensitivity: { direction, ...sensitivity, nextDate: isoOf(a.frequency, a.start + r + 1) },
  };
}

/** The trend's yearly change in the series' chosen terms, its materiality and the direction word it earns. */
function trendYearlyOf(
  a: AnalyseInput,
  relative: boolean,
  now: number,
  base: number,
  revisions: Analysis['firmness']['revisions'],
): TrendYearly {
  const value = relative ? percentChange(now, base) : now - base;
  const materiality = materialityOf({ ...a, revisions, base, relative });
  const direction = directionOf(value, materiality);
  const r = a.dates.length - 1;
  const step = direction === 'rising' ? 'rising' : direction === 'falling' ? 'falling' : null;
  let run = 0;
  if (step) for (let t = r; t >= 1 && stepDirection(a.trend, t) === step; t--) run++;
  return { expression: relative ? 'relative' : 'absolute', value, materiality, direction, run };
}

/** Same instant RECENT_OUTLIER_YEARS calendar years before the reporting period's start. */
function recentCutoff(a: AnalyseInput, r: number): number {
  const d = new Date(startOf(a.frequency, a.start + r));
  const y = d.getUTCFullYear() - RECENT_OUTLIER_YEARS;
  const last = new Date(Date.UTC(y, d.getUTCMonth() + 1, 0)).getUTCDate();
  return Date.UTC(y, d.getUTCMonth(), Math.min(d.getUTCDate(), last), d.getUTCHours());
}

/** Whether the data reach back the whole recent span. */
function reaches(a: AnalyseInput, r: number): boolean {
  return startOf(a.frequency, a.start) <= recentCutoff(a, r);
}

/** First index of the recent span: the first period starting after the cutoff (or the first period). */
function recentStart(a: AnalyseInput, r: number): number {
  const cutoff = recentCutoff(a, r);
  let i = 0;
  while (i < r && startOf(a.frequency, a.start + i) <= cutoff) i++;
  return i;
}

function sensitivityOf(a: AnalyseInput, direction: Analysis['direction']) {
  const n = a.observed.length;
  // Start from the value the usual pattern expects next period (latest trend with the season of a cycle
  // ago) and search in steps of a quarter of the remainder's robust spread, up to twelve spreads away.
  const misfit = Array.from(a.observed, (y, i) =>
    a.multiplicative ? y - a.trend[i] * a.seasonal[i] : y - a.trend[i] - a.seasonal[i],
  );
  const spread = robustScale(misfit).mad;
  const back = n - a.period;
  const expected = a.multiplicative ? a.trend[n - 1] * a.seasonal[back] : a.trend[n - 1] + a.seasonal[back];
  const extended = new Float64Array(n + 1);
  extended.set(a.observed);
  const lastStep = (x: number): number => {
    extended[n] = x;
    const t = a.trendOf(extended);
    return t[n] - t[n - 1];
  };
  return reversalValue(direction, expected, 12 * spread, a.multiplicative, lastStep, {
    steps: 48,
    singleCrossing: a.singleCrossing === true,
    gallop: a.gallop === true,
    affine: a.affine === true,
  });
}

/**
 * With less than the yearly history, daily and hourly data are set against the same day (hour of the same
 * weekday) a week earlier: the comparison a weekly cycle supports. None when a week is not in the data.
 */
function weekEarlier(a: AnalyseInput, r: number): Comparison[] {
  const back = a.frequency === 'hourly' ? 168 : a.frequency === 'daily' ? 7 : 0;
  if (back === 0 || r - back < 0) return [];
  const current = { from: a.start + r, to: a.start + r };
  const baseline = { from: a.start + r - back, to: a.start + r - back };
  return [
    {
      id: 'week-earlier',
      kind: 'custom',
      label: a.frequency === 'hourly' ? 'Same hour a week earlier' : 'Same day a week earlier',
      aggregation: a.aggregation,
      current: spanInfo(a.frequency, current),
      baseline: spanInfo(a.frequency, baseline),
      partial: false,
      alignment: 'custom',
      raw: compareSpans(a.observed, current, baseline, a.start, a.aggregation),
      adjusted: compareSpans(a.adjusted, current, baseline, a.start, a.aggregation),
      trend: compareSpans(a.trend, current, baseline, a.start, a.aggregation),
    },
  ];
}

function spanInfo(frequency: Frequency, s: { from: number; to: number }) {
  return {
    from: isoOf(frequency, s.from),
    to: isoOf(frequency, s.to),
    periods: s.to - s.from + 1,
    ordinals: { first: s.from, last: s.to },
  };
}

function slug(text: string): string {
  return (
    text
      .toLowerCase()
      .replace(/[^a-z0-9]+/g, '-')
      .replace(/^-|-$/g, '') || 'span'
  );
}
