/**
 * Resolves a series' decomposition settings once, from what the job (or the decompose command) asked for,
 * the data's frequency and length: every default filled in, every value checked. Nothing downstream
 * re-derives a setting. Our defaults where the methods' authors leave a choice: STL with a seasonal window
 * of 13 (odd, and long enough for a stable monthly pattern); MSTL with R forecast::mstl's windows
 * 7 + 4·i; the other STL settings are the paper's (stl.ts).
 */

import { defaultMstlWindows } from '../decompose/mstl.js';
import { stlSettings } from '../decompose/stl.js';
import { chooseModel } from '../diagnose/model-choice.js';
import { BriefError, type Place } from '../errors.js';
import type { DecompositionSettings } from '../vocabulary/brief.js';
import { defaultPeriod, type Frequency, yearLag } from '../vocabulary/period-index.js';
import type { DecompositionSpec } from '../vocabulary/settings.js';

export const DEFAULT_SEASONAL_WINDOW = 13;

/**
 * Frequencies whose series are extended by forecasts unless the job says otherwise: where
 * bench/EXTENSION-STUDY.md measured, with the brief's model, a median revision at least 25% smaller, smaller
 * on at least two thirds of the series, over at least five series. Monthly: 39% smaller, 12 of 13 series.
 * Quarterly (10%, 7 of 9) and daily (3 series only) stay off; weekly and hourly were not measured.
 */
export const EXTEND_BY_DEFAULT: Frequency[] = ['monthly'];

/** The periods MSTL takes for a frequency when the job names none. */
export function defaultPeriods(frequency: Frequency): number[] {
  switch (frequency) {
    case 'hourly':
      return [24, 168];
    case 'daily':
      return [7, 365];
    default:
      return [defaultPeriod(frequency)];
  }
}

export function emptyDecompositionSpec(): DecompositionSpec {
  return {
    method: 'stl',
    model: 'auto',
    period: null,
    periods: null,
    seasonalWindow: null,
    seasonalDegree: null,
    trendWindow: null,
    trendDegree: null,
    lowpassWindow: null,
    lowpassDegree: null,
    robust: false,
    inner: null,
    outer: null,
    iterations: null,
    henderson: null,
    extend: 'off',
    matchYearlyTotals: false,
  };
}

export function resolveDecomposition(
  spec: DecompositionSpec,
  values: Float64Array,
  frequency: Frequency,
  place: Place | ((setting: string) => Place),
  format: (v: number) => string = (v) => v.toPrecision(3),
  yearStartMonth = 1,
): DecompositionSettings {
  const n = values.length;
  // `place` may point at the job setting each problem concerns (its key as the job writes it).
  const fail = (code: string, message: string, hint: string, setting = ''): never => {
    throw new BriefError(code, message, hint, typeof place === 'function' ? place(setting) : place);
  };
  for (let i = 0; i < n; i++) {
    if (values[i] === Number.POSITIVE_INFINITY || values[i] === Number.NEGATIVE_INFINITY) {
      fail(
        'value-not-finite',
        `value ${i + 1} is infinite`,
        'replace it with a number, or leave the cell empty to mark it missing',
      );
    }
  }
  let periods: number[];
  if (spec.method === 'mstl') {
    periods = spec.periods
      ? [...spec.periods].sort((a, b) => a - b)
      : defaultPeriods(frequency).filter((p) => n >= 2 * p);
    if (periods.length === 0) {
      fail(
        'too-short',
        `${n} values are fewer than two full cycles of any of the periods ${defaultPeriods(frequency).join(', ')}`,
        'give more data, or name shorter periods with periods: [...]',
        'periods',
      );
    }
  } else {
    periods = [spec.period ?? defaultPeriod(frequency)];
  }
  for (const p of periods) {
    if (!Number.isInteger(p) || p < 2)
      fail(
        'bad-period',
        `period ${p} is below 2`,
        'use a whole number of periods per cycle, e.g. 12 for monthly data',
        spec.method === 'mstl' ? 'periods' : 'period',
      );
    if (n < 2 * p) {
      fail(
        'too-short',
        `${n} values are fewer than two full cycles of period ${p} (a seasonal method needs at least ${2 * p})`,
        'give more data or a shorter period',
        spec.method === 'mstl' ? 'periods' : 'period',
      );
    }
  }
  const period = periods[periods.length - 1];

  const windows: (number | 'periodic')[] = [];
  const given = spec.seasonalWindow;
  for (let i = 0; i < periods.length; i++) {
    const w = Array.isArray(given) ? given[i] : given;
    windows.push(w ?? (spec.method === 'mstl' ? defaultMstlWindows(periods.length)[i] : DEFAULT_SEASONAL_WINDOW));
  }
  for (const w of windows) {
    if (w !== 'periodic' && (!Number.isInteger(w) || w < 7 || w % 2 === 0)) {
      fail(
        'bad-seasonal-window',
        `seasonal window ${w} must be an odd whole number of at least 7`,
        'use an odd number such as 7, 13 or 23, or periodic',
        'seasonal_window',
      );
    }
  }
  for (const [name, w, least] of [
    ['trend', spec.trendWindow, 3],
    ['low-pass', spec.lowpassWindow, 3],
  ] as const) {
    if (w !== null && (!Number.isInteger(w) || w < least || w % 2 === 0)) {
      fail(
        'bad-window',
        `${name} window ${w} must be an odd whole number of at least ${least}`,
        'use an odd number such as 13 or 23, or leave it out for the default',
        name === 'trend' ? 'trend_window' : 'lowpass_window',
      );
    }
  }
  if (
    spec.henderson !== null &&
    (!Number.isInteger(spec.henderson) || spec.henderson < 3 || spec.henderson % 2 === 0 || spec.henderson > n)
  ) {
    fail(
      'bad-henderson',
      `Henderson length ${spec.henderson} must be an odd whole number from 3 to the series length ${n}`,
      'use 13 for monthly, 7 for quarterly data (common practice)',
      'henderson',
    );
  }

  let model: 'additive' | 'multiplicative';
  let modelReason: string;
  const hasNonPositive = values.some((v) => v <= 0);
  if (spec.model === 'auto') {
    const choice = chooseModel(values, periods[0], format);
    model = choice.model;
    modelReason = `chosen automatically: ${choice.reason}`;
  } else {
    model = spec.model;
    modelReason = `${model}, as set in the job`;
    if (model === 'multiplicative' && hasNonPositive) {
      fail(
        'multiplicative-non-positive',
        'a multiplicative model needs every value above zero, but the series has zero or negative values',
        'use model: additive, or model: auto',
        'model',
      );
    }
  }

  const robust = spec.robust;
  const trendWindows = periods.map(
    (p, i) =>
      stlSettings(n, { period: p, seasonalWindow: windows[i], trendWindow: spec.trendWindow ?? undefined }).trendWindow,
  );
  const lowpassWindows = periods.map(
    (p, i) =>
      stlSettings(n, { period: p, seasonalWindow: windows[i], lowpassWindow: spec.lowpassWindow ?? undefined })
        .lowpassWindow,
  );
  const stlResolved = stlSettings(n, {
    period,
    seasonalWindow: windows[windows.length - 1],
    seasonalDegree: spec.seasonalDegree ?? undefined,
    trendWindow: trendWindows[trendWindows.length - 1],
    trendDegree: spec.trendDegree ?? undefined,
    lowpassWindow: spec.lowpassWindow ?? undefined,
    lowpassDegree: spec.lowpassDegree ?? undefined,
    robust,
    inner: spec.inner ?? undefined,
    outer: spec.outer ?? undefined,
  });
  return {
    method: spec.method,
    model,
    modelReason,
    modelAuto: spec.model === 'auto',
    period: spec.method === 'mstl' ? periods[0] : period,
    periods,
    seasonalWindows: windows,
    seasonalDegree: stlResolved.seasonalDegree,
    trendWindow: stlResolved.trendWindow,
    trendWindows,
    trendDegree: stlResolved.trendDegree,
    lowpassWindow: stlResolved.lowpassWindow,
    lowpassWindows,
    lowpassDegree: stlResolved.lowpassDegree,
    seasonalJump: stlResolved.seasonalJump,
    trendJump: stlResolved.trendJump,
    lowpassJump: stlResolved.lowpassJump,
    inner: stlResolved.inner,
    outer: stlResolved.outer,
    robust,
    iterations: spec.method === 'mstl' ? Math.max(1, spec.iterations ?? 2) : 1,
    trendFilter: spec.method === 'classical' && spec.henderson ? 'henderson' : 'centred',
    hendersonLength: spec.henderson,
    // The brief decides this once the data are tested (brief/series.ts); the decompose command adjusts.
    seasonalAdjustment: { applied: true, reason: 'the seasonal component is removed' },
    extension: resolveExtension(spec.extend, frequency, periods, n, fail),
    yearlyTotals: resolveYearlyTotals(spec.matchYearlyTotals, frequency, yearStartMonth, fail),
  };
}

/**
 * Matching the adjusted series' yearly totals to the raw ones needs periods that fit into years: months,
 * quarters (when the year starts at a quarter), days and hours. ISO weeks straddle years.
 */
function resolveYearlyTotals(
  match: boolean,
  frequency: Frequency,
  yearStartMonth: number,
  fail: (code: string, message: string, hint: string, setting?: string) => never,
): DecompositionSettings['yearlyTotals'] {
  if (match && frequency === 'weekly') {
    fail(
      'yearly-totals-weekly',
      'match_yearly_totals needs periods that fit into years, but weeks straddle the turn of the year',
      'leave match_yearly_totals out for weekly data, or brief daily or monthly data',
      'match_yearly_totals',
    );
  }
  if (match && frequency === 'quarterly' && (yearStartMonth - 1) % 3 !== 0) {
    fail(
      'yearly-totals-quarters',
      `match_yearly_totals needs quarters that fit into the financial year, which starts in month ${yearStartMonth}`,
      'set brief.fiscal_year_start to 1, 4, 7 or 10, or leave match_yearly_totals out',
      'match_yearly_totals',
    );
  }
  return { match, yearStartMonth };
}

/**
 * Forecast extension: on by default for the frequencies of EXTEND_BY_DEFAULT; the model is a seasonal ARIMA
 * for a weekly cycle of daily data alone (the study's better model there) and an ARIMA on the seasonally
 * adjusted series elsewhere (better for monthly and quarterly data in the study, and the only practical one
 * for long periods such as 52, 168 or 365).
 */
function resolveExtension(
  setting: DecompositionSpec['extend'],
  frequency: Frequency,
  periods: number[],
  n: number,
  fail: (code: string, message: string, hint: string, setting?: string) => never,
): DecompositionSettings['extension'] {
  const measured = EXTEND_BY_DEFAULT.includes(frequency);
  const oneYear = Math.min(yearLag(frequency), 2 * Math.max(...periods));
  const kind =
    frequency === 'daily' && periods.length === 1 && periods[0] <= 7 ? 'seasonal-arima' : 'arima-on-adjusted';
  if (typeof setting === 'number' && setting > n) {
    fail(
      'extend-too-long',
      `extend: ${setting} asks for more forecasts than the series has values (${n})`,
      `use at most ${n}, or extend: on for ${oneYear}`,
      'extend',
    );
  }
  if (setting === 'off') return { on: false, horizon: 0, kind, reason: 'turned off in the job' };
  if (setting === 'auto' && !measured) {
    return { on: false, horizon: 0, kind, reason: `off by default for ${frequency} data` };
  }
  const horizon = typeof setting === 'number' ? setting : oneYear;
  const reason =
    setting === 'auto'
      ? `on by default for ${frequency} data, where it was measured to make first estimates firmer`
      : 'set in the job';
  return { on: true, horizon, kind, reason };
}
