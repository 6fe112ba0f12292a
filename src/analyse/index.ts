/**
 * Every analysis figure of one series at its reporting period (the last index of the decomposed data):
 * changes, direction, turning points, the seasonal profile, comparisons, recent unusual periods, the
 * firmness study and the sensitivity of the trend's direction.
 */
import type { Aggregation, Analysis, Comparison, Diagnostics } from '../brief/model.js';
import { type Frequency, isoOf, periodsPerYear, yearLag } from '../data/calendar.js';
import { robustScale } from '../diagnose/robust-scale.js';
import type { ComparisonSpec } from '../job/types.js';
import { annualisedGrowth, changeAt } from './change.js';
import { compareSpans } from './comparisons.js';
import { trendDirection } from './direction.js';
import { revisionStudy } from './revisions.js';
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
  /** Re-runs the same decomposition on other data; returns the trend. */
  trendOf: (values: Float64Array) => Float64Array;
  /**
   * The trend's last step changes sign at most once as one appended value moves (true for decompositions
   * linear in the data or in their logarithms, never for robust fits); lets the sensitivity search
   * binary-search its grid instead of walking it.
   */
  singleCrossing?: boolean;
  seasonOf: (index: number) => { position: number; label: string };
}

export const RECENT_OUTLIER_WINDOW = 24;

export function analyse(a: AnalyseInput): Analysis {
  const r = a.dates.length - 1;
  const lag = yearLag(a.frequency);
  const { direction, run } = trendDirection(a.trend, r);
  const comparisons: Comparison[] = a.comparisons.map(({ spec, label, spans }) => ({
    id: spec.kind === 'custom' ? `custom-${slug(label)}` : spec.kind,
    kind: spec.kind,
    label,
    aggregation: a.aggregation,
    current: spanInfo(a.frequency, spans.current),
    baseline: spanInfo(a.frequency, spans.baseline),
    partial: spans.partial,
    raw: compareSpans(a.observed, spans.current, spans.baseline, a.start, a.aggregation),
    adjusted: compareSpans(a.adjusted, spans.current, spans.baseline, a.start, a.aggregation),
    trend: compareSpans(a.trend, spans.current, spans.baseline, a.start, a.aggregation),
  }));
  const study = revisionStudy(a.observed, a.trend, r, lag, a.firmnessPeriods, a.minLength, a.dates, a.trendOf);
  const sensitivity = sensitivityOf(a, direction);
  return {
    trendYoY: changeAt(a.trend, r, lag, a.dates),
    adjustedYoY: changeAt(a.adjusted, r, lag, a.dates),
    rawYoY: changeAt(a.observed, r, lag, a.dates),
    trendPoP: changeAt(a.trend, r, 1, a.dates),
    adjustedPoP: changeAt(a.adjusted, r, 1, a.dates),
    trendAnnualised6: annualisedGrowth(a.trend, r, 6, periodsPerYear(a.frequency)),
    direction,
    directionRun: run,
    turningPointRule: TURNING_POINT_RULE,
    turningPoints: turningPoints(a.trend, a.dates),
    // The profile is that of the main period alone ("each week" must not carry the yearly swing too); the
    // seasonal share of the latest change keeps every seasonal component, through observed − adjusted.
    seasonalProfile: seasonalProfile({ ...a, seasonal: a.seasonals?.get(a.period) ?? a.seasonal, index: r }),
    comparisons,
    outliers: a.diagnostics.outliers.filter((o) => o.index > r - RECENT_OUTLIER_WINDOW),
    firmness: {
      periodsChecked: study.revisions.length,
      revisions: study.revisions,
      meanAbsoluteRevision: study.meanAbsoluteRevision,
      range80: study.range80,
      provisionalFrom: a.dates.length - a.provisionalCount,
      provisionalCount: a.provisionalCount,
      provisionalReason: a.provisionalReason,
    },
    sensitivity: { direction, ...sensitivity, nextDate: isoOf(a.frequency, a.start + r + 1) },
  };
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
  });
}

function spanInfo(frequency: Frequency, s: { from: number; to: number }) {
  return { from: isoOf(frequency, s.from), to: isoOf(frequency, s.to), periods: s.to - s.from + 1 };
}

function slug(text: string): string {
  return (
    text
      .toLowerCase()
      .replace(/[^a-z0-9]+/g, '-')
      .replace(/^-|-$/g, '') || 'span'
  );
}
