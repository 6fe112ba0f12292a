/**
 * A small synthetic SeriesBrief for the chart tests: a monthly series built from a straight trend, a fixed
 * twelve-month pattern and a small repeating remainder with one planted spike, so every expected count (bars,
 * points, unusual values) follows from the construction rather than from the code under test.
 */
import type { Change, Comparison, ComparisonValues, SeasonalProfile, SeriesBrief } from '../../src/vocabulary/brief.js';
import { type Frequency, isoOf, ordinalOf } from '../../src/vocabulary/period-index.js';

export interface SampleOptions {
  length?: number;
  /** First period, ISO. */
  start?: string;
  frequency?: Frequency;
  period?: number;
  label?: string;
  unit?: string;
  model?: 'additive' | 'multiplicative';
  /** Indices given a planted spike and listed as outliers. */
  spikes?: number[];
  provisionalCount?: number;
  comparisonLabels?: string[];
  /** Replaces the straight trend (observed is rebuilt from it). */
  trend?: number[];
}

const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];
/** Seasonal pattern summing to zero over a cycle (additive). */
const PATTERN = [-6, -4, -1, 2, 5, 8, 9, 6, 2, -3, -8, -10];

function change(current: number, yearAgo: number, currentDate: string, baseDate: string): Change {
  return { current, yearAgo, change: current - yearAgo, percent: 100 * (current / yearAgo - 1), currentDate, baseDate };
}

function values(current: number, baseline: number): ComparisonValues {
  return { current, baseline, change: current - baseline, percent: 100 * (current / baseline - 1) };
}

export function sampleSeries(options: SampleOptions = {}): SeriesBrief {
  const n = options.length ?? 48;
  const frequency = options.frequency ?? 'monthly';
  const period = options.period ?? 12;
  const spikes = options.spikes ?? [20];
  const provisionalCount = options.provisionalCount ?? 6;
  const model = options.model ?? 'additive';
  const first = ordinalOf(frequency, Date.parse(options.start ?? '2021-01-01'));
  const dates = Array.from({ length: n }, (_, i) => isoOf(frequency, first + i));
  const trend = options.trend ?? dates.map((_, i) => 100 + 0.5 * i);
  const seasonal = dates.map((_, i) => PATTERN[(i % PATTERN.length) % period] ?? 0);
  const remainder = dates.map((_, i) => (spikes.includes(i) ? 30 : [0.5, -0.5, 0.25, -0.25][i % 4]));
  const observed = dates.map((_, i) => trend[i] + seasonal[i] + remainder[i]);
  const adjusted = dates.map((_, i) => observed[i] - seasonal[i]);
  const seasons = Array.from({ length: period }, (_, s) => ({
    season: s,
    label: period === 12 ? MONTHS[s] : `S${s + 1}`,
    effect: PATTERN[s % PATTERN.length],
    effectPercent: PATTERN[s % PATTERN.length],
  }));
  const outliers = spikes.map((index) => ({
    index,
    date: dates[index],
    observed: observed[index],
    remainder: remainder[index],
    score: 12,
  }));
  const last = n - 1;
  const yoy = change(trend[last], trend[last - 12], dates[last], dates[last - 12]);
  const comparisons: Comparison[] = (options.comparisonLabels ?? ['Same month last year', 'Year to date']).map(
    (label, i) => ({
      id: `c${i}`,
      kind: i === 0 ? 'year-on-year' : 'year-to-date',
      label,
      aggregation: 'sum',
      current: {
        from: i === 0 ? dates[last] : dates[last - 8],
        to: dates[last],
        periods: i === 0 ? 1 : 9,
        ordinals: { first: first + (i === 0 ? last : last - 8), last: first + last },
      },
      baseline: {
        from: i === 0 ? dates[last - 12] : dates[last - 20],
        to: dates[last - 12],
        periods: i === 0 ? 1 : 9,
        ordinals: { first: first + (i === 0 ? last - 12 : last - 20), last: first + last - 12 },
      },
      partial: i !== 0,
      alignment: 'calendar',
      raw: i === 0 ? values(observed[last], observed[last - 12]) : values(1000 + 10 * i, 950),
      adjusted: values(adjusted[last], adjusted[last - 12]),
      trend: values(trend[last], trend[last - 12]),
    }),
  );
  const effects = seasons.map((s) => s.effect);
  const peak = seasons[effects.indexOf(Math.max(...effects))];
  const trough = seasons[effects.indexOf(Math.min(...effects))];
  const profile: SeasonalProfile = {
    period,
    naming: 'month',
    cycles: { from: n - period, to: n - 1 },
    level: 100,
    seasons,
    peak,
    trough,
    latestRawChange: 0,
    latestSeasonalChange: 0,
    seasonalSharePercent: Number.NaN,
  };
  return {
    id: 'water',
    label: options.label ?? 'Water delivered',
    unit: options.unit ?? 'ML',
    group: null,
    aggregation: 'sum',
    goodDirection: 'neither',
    frequency,
    periodIndex: { frequency, start: first, length: n },
    extension: { used: false, added: 0, model: null, skipped: null },
    settings: {
      method: 'stl',
      model,
      modelReason: 'set in the job',
      modelAuto: false,
      seasonalAdjustment: { applied: true, reason: 'the seasonal component is removed' },
      period,
      periods: [period],
      seasonalWindows: ['periodic'],
      seasonalDegree: 0,
      trendWindow: 23,
      trendWindows: [23],
      trendDegree: 1,
      lowpassWindow: 13,
      lowpassWindows: [13],
      lowpassDegree: 1,
      seasonalJump: 1,
      trendJump: 1,
      lowpassJump: 1,
      inner: 2,
      outer: 0,
      robust: false,
      iterations: 1,
      trendFilter: 'centred',
      hendersonLength: null,
      extension: { on: false, horizon: 0, kind: 'arima-on-adjusted', reason: 'turned off in the job' },
      yearlyTotals: { match: false, yearStartMonth: 1 },
    },
    changeExpression: 'relative',
    changeExpressionReason: 'all values are positive',
    reportingIndex: last,
    reportingDate: dates[last],
    components: { dates, observed, trend, seasonal, remainder, adjusted },
    diagnostics: {
      trendStrength: 0.9,
      seasonalStrength: 0.8,
      outliers,
      residualSeasonality: {
        statistic: 0,
        df1: 11,
        df2: 24,
        pValue: 1,
        present: false,
        test: 'F',
        level: 0.01,
        cycles: 8,
      },
      identifiableSeasonality: [],
    },
    analysis: {
      trendYoY: yoy,
      adjustedYoY: yoy,
      rawYoY: yoy,
      trendPoP: change(trend[last], trend[last - 1], dates[last], dates[last - 1]),
      adjustedPoP: change(adjusted[last], adjusted[last - 1], dates[last], dates[last - 1]),
      trendAnnualised6: 6,
      direction: 'rising',
      directionRun: n - 1,
      turningPointRule: 'none',
      turningPoints: [],
      seasonalProfile: profile,
      seasonalProfiles: [profile],
      trendYearly: {
        expression: 'relative',
        value: yoy.percent,
        materiality: { rule: 'noise', low: -1, high: 1 },
        direction: 'rising',
        run: n - 1,
      },
      recentSpan: { from: Math.max(0, n - 24), years: 2 },
      comparisons,
      comparisonsLeftOut: [],
      headlineSpan: { periods: 12, yearly: true, needed: 25, available: n },
      outliers,
      firmness: {
        periodsChecked: 0,
        revisions: [],
        meanAbsoluteRevision: Number.NaN,
        range80: [Number.NaN, Number.NaN],
        withinRange80: 0,
        limit: 'too-short',
        neededLength: Number.NaN,
        provisionalFrom: n - provisionalCount,
        provisionalCount,
        provisionalReason: 'end weights',
      },
      sensitivity: { direction: 'rising', reversalValue: Number.NaN, nextDate: '', side: 'none' },
    },
    statements: [],
    charts: [],
    data: {
      file: 'sample.csv',
      sha256: '',
      rows: n,
      dateColumn: 'date',
      valueColumn: 'value',
      gaps: [],
      notes: [],
    },
  };
}
