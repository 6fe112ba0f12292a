/**
 * Calendar effects and events around the decomposition of one series: estimated and taken out first
 * (adjust/regression-effects.ts), the decomposition runs on what is left (the linearised series), then
 * steps and ramps go back into the trend, one-off and fading events into the remainder, and the calendar
 * effects become a component of their own, so that observed = trend + seasonal + calendar + remainder
 * (or the product, for a multiplicative model). A model that cannot be estimated (collinear regressors,
 * too short a series, an optimiser that fails) leaves the series as it is, with a sentence saying why.
 */
import { type Effects, EffectsError, estimateEffects, type NamedIntervention } from '../adjust/regression-effects.js';
import type { DecomposeOutput } from '../decompose/output.js';
import type { DetectedType } from '../model/detect-outliers.js';
import { outlierCriticalValue } from '../model/outlier-critical-value.js';
import type { EffectSettings, EffectsReport, EventKind } from '../vocabulary/brief.js';
import { type Frequency, isoOf } from '../vocabulary/period-index.js';

const TYPE_OF: Record<EventKind, NamedIntervention['type']> = {
  step: 'LS',
  fading: 'TC',
  'one-off': 'AO',
  ramp: 'RAMP',
};
/** Periods in a year: three years is the least a regression is estimated on. */
const yearOf: Record<Frequency, number> = { monthly: 12, quarterly: 4, weekly: 52, daily: 365, hourly: 8760 };
const KIND_OF: Record<string, EventKind> = { LS: 'step', TC: 'fading', AO: 'one-off', RAMP: 'ramp' };

export interface RemovedEffects {
  /** What the decomposition gets: the observed series less every effect (the observed series when skipped). */
  linearised: Float64Array;
  effects: Effects | null;
  report: EffectsReport;
}

export function removeEffects(
  values: Float64Array,
  index: { frequency: Frequency; start: number; length: number },
  s: EffectSettings,
  multiplicative: boolean,
  holidays: ReadonlySet<number> = new Set(),
): RemovedEffects {
  const scale = multiplicative ? 'factor' : 'units';
  const empty = (skipped: string | null): RemovedEffects => ({
    linearised: values,
    effects: null,
    report: {
      skipped,
      scale,
      events: [],
      groups: [],
      workingDays: null,
      holidays: [],
      model: null,
      criticalValue: null,
    },
  });
  let observed = 0;
  for (const v of values) if (!Number.isNaN(v)) observed++;
  // Three years of data at least, the least X-13ARIMA-SEATS estimates a regression with (common practice).
  const least = 3 * yearOf[index.frequency];
  if (observed < least) {
    return empty(
      `Calendar effects and events were not estimated for this series: ${observed} values are fewer than three years of data (${least}).`,
    );
  }
  let e: Effects;
  try {
    e = estimateEffects(values, index, {
      multiplicative,
      calendar: {
        workingDays: s.days === 'working',
        tradingDay: s.days === 'each-weekday',
        leapYear: s.leapYear,
        easter: s.easterDays,
        holidays,
      },
      interventions: s.events.map((v) => ({
        type: TYPE_OF[v.kind],
        at: v.at,
        label: v.label,
        rate: v.kind === 'fading' ? v.fadingRate : undefined,
        until: v.until ?? undefined,
      })),
      outliers: s.find.map((k) => (k === 'step' ? 'LS' : k === 'fading' ? 'TC' : 'AO')) as DetectedType[],
    });
  } catch (err) {
    const why = err instanceof EffectsError ? err.message : 'the regression model could not be estimated';
    return empty(`Calendar effects and events were not estimated for this series: ${why}.`);
  }
  if (multiplicative && !e.log) {
    return empty(
      'Calendar effects and events were not estimated for this series: a multiplicative model needs every value above zero.',
    );
  }
  for (const a of [e.linearised, e.calendar, e.level, e.oneOff]) {
    if (a.some((v, t) => !Number.isFinite(v) && Number.isFinite(values[t]))) {
      return empty('Calendar effects and events were not estimated for this series: the estimates were not finite.');
    }
  }
  const spec = e.fit.spec;
  const seasonal =
    spec.period > 1 && spec.P + spec.D + spec.Q > 0 ? `(${spec.P},${spec.D},${spec.Q})[${spec.period}]` : '';
  return {
    linearised: e.linearised,
    effects: e,
    report: {
      skipped: null,
      scale,
      events: e.events.map((v) => ({
        kind: KIND_OF[v.type],
        at: v.at,
        date: '',
        estimate: v.effect,
        t: v.t,
        label: v.label,
      })),
      groups: e.groups.map((g) => ({ ...g })),
      workingDays: e.workingDays ? Array.from(e.workingDays) : null,
      holidays: weekdayHolidays(holidays, index),
      model: `ARIMA(${spec.p},${spec.d},${spec.q})${seasonal}`,
      criticalValue: s.find.length > 0 ? outlierCriticalValue(observed) : null,
    },
  };
}

export interface WithEffects extends DecomposeOutput {
  calendar: Float64Array;
}

/**
 * The decomposition of the linearised series with the effects put back: steps into the trend, one-offs
 * into the remainder, the calendar as its own component; adjusted = observed less (over) seasonal and
 * calendar.
 */
export function putBack(d: DecomposeOutput, e: Effects, multiplicative: boolean, observed: Float64Array): WithEffects {
  const n = d.trend.length;
  const op = multiplicative ? (a: number, b: number) => a * b : (a: number, b: number) => a + b;
  const trend = new Float64Array(n);
  const remainder = new Float64Array(n);
  const adjusted = new Float64Array(n);
  for (let t = 0; t < n; t++) {
    trend[t] = op(d.trend[t], e.level[t]);
    remainder[t] = op(d.remainder[t], e.oneOff[t]);
    // From the data themselves, so that with no season and no calendar effect it is the data exactly.
    adjusted[t] = multiplicative
      ? observed[t] / (d.seasonal[t] * e.calendar[t])
      : observed[t] - d.seasonal[t] - e.calendar[t];
  }
  return { ...d, trend, remainder, adjusted, calendar: Float64Array.from(e.calendar) };
}

/**
 * A trend function of the series (the firmness and sensitivity re-runs) that keeps the estimated effects:
 * the effects up to each cut are taken out and the steps put back. A value appended past the end gets the
 * last period's step and no calendar or one-off effect (they are not known there).
 */
export function trendWithEffects(
  trendOf: (values: Float64Array) => Float64Array,
  e: Effects,
  multiplicative: boolean,
): (values: Float64Array) => Float64Array {
  const n = e.level.length;
  const neutral = multiplicative ? 1 : 0;
  return (values) => {
    const m = values.length;
    const lin = new Float64Array(m);
    const level = (t: number) => (t < n ? e.level[t] : e.level[n - 1]);
    for (let t = 0; t < m; t++) {
      const other = t < n ? (multiplicative ? e.calendar[t] * e.oneOff[t] : e.calendar[t] + e.oneOff[t]) : neutral;
      lin[t] = multiplicative ? values[t] / (other * level(t)) : values[t] - other - level(t);
    }
    const trend = trendOf(lin);
    const out = new Float64Array(m);
    for (let t = 0; t < m; t++) out[t] = multiplicative ? trend[t] * level(t) : trend[t] + level(t);
    return out;
  };
}

/** Holidays on Monday to Friday from the first period's first day to the last period's start, as ISO dates. */
function weekdayHolidays(
  holidays: ReadonlySet<number>,
  index: { frequency: Frequency; start: number; length: number },
) {
  if (holidays.size === 0) return [];
  const first = Date.parse(`${isoOf(index.frequency, index.start)}T00:00:00Z`) / 86_400_000;
  const last = Date.parse(`${isoOf(index.frequency, index.start + index.length)}T00:00:00Z`) / 86_400_000;
  return [...holidays]
    .filter((d) => d >= first && d < last && ((d % 7) + 7 + 3) % 7 < 5)
    .sort((a, b) => a - b)
    .map((d) => new Date(d * 86_400_000).toISOString().slice(0, 10));
}
