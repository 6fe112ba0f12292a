/**
 * Calendar effects, named interventions and automatically found outliers, estimated together by a
 * regression with ARIMA errors (model/fit-arima.ts, orders chosen automatically with the regressors,
 * model/auto-arima.ts) and split into components that a decomposition can take back:
 * - calendar: working days (one regressor) or trading days (six contrasts), leap year, Easter; for daily
 *   data the day of, before and after each holiday;
 * - level shifts (named or found, and ramps): they belong to the trend;
 * - one-off effects (additive outliers and temporary changes): they belong to the remainder.
 * The series given to the decomposition is the observed one less all three; observed = linearised +
 * calendar + level + one-off (sums, or products on logarithms for a multiplicative model).
 * A calendar group is kept only when it earns its place: when the model with it has the lower AICc
 * (Hurvich & Tsai 1989), the rule of X-13ARIMA-SEATS's "aictest" (US Census Bureau, Reference Manual
 * v1.1 (2017), §7.13). Named interventions are always kept: the job asked for them.
 * Source: Findley, Monsell, Bell, Otto & Chen (1998), "New capabilities and methods of the X-12-ARIMA
 * seasonal adjustment program", JBES 16(2), 127–152, §2 (regARIMA before adjustment); Chen & Liu (1993).
 *
 *   estimateEffects(monthly, index, { calendar: { workingDays: true }, outliers: true }) →
 *     { linearised, calendar, level, oneOff, events: [{ type: 'LS', at: 169, effect: −0.23 }], … }
 */
import { easterEffect } from '../calendar/easter-effect.js';
import { HOLIDAY_EFFECT_NAMES, holidayEffects } from '../calendar/holiday-effects.js';
import { leapYear } from '../calendar/leap-year.js';
import { periodDays } from '../calendar/period-days.js';
import { TRADING_DAY_NAMES, tradingDay } from '../calendar/trading-day.js';
import { workingDayRegressor, workingDays } from '../calendar/working-days.js';
import { autoArima, differencingOrders } from '../model/auto-arima.js';
import { type DetectedType, detectOutliers, regressionSe } from '../model/detect-outliers.js';
import { type ArimaFit, type ArimaSpec, fitArima } from '../model/fit-arima.js';
import { type OutlierType, outlierColumn } from '../model/outlier-effects.js';
import { defaultPeriod, type TimeIndex } from '../vocabulary/period-index.js';

export interface NamedIntervention {
  type: OutlierType;
  /** Index of the period it starts at. */
  at: number;
  label: string;
  /** Temporary change: decay rate (default 0.7). */
  rate?: number;
  /** Ramp: index of the period it ends at. */
  until?: number;
}

export interface EffectOptions {
  multiplicative: boolean;
  calendar?: {
    workingDays?: boolean;
    tradingDay?: boolean;
    leapYear?: boolean;
    /** Easter window: days before Easter Sunday (Bell & Hillmer's w); null for none. */
    easter?: number | null;
    /** Holidays as days since 1970-01-01. */
    holidays?: ReadonlySet<number>;
  };
  interventions?: NamedIntervention[];
  /** Outlier types to search for; none when empty. */
  outliers?: readonly DetectedType[];
}

export interface Event {
  type: OutlierType;
  at: number;
  /** Effect on the model's scale (units, or logarithms when multiplicative). */
  effect: number;
  t: number;
  /** The job's label, or null for one found automatically. */
  label: string | null;
}

export interface Effects {
  /** Observed less every effect: what the decomposition gets. */
  linearised: Float64Array;
  /** Effects on the series' scale: differences, or factors when multiplicative. */
  calendar: Float64Array;
  level: Float64Array;
  oneOff: Float64Array;
  events: Event[];
  /** Working days of each period (NaN where not counted), for the words. */
  workingDays: Float64Array | null;
  /** Regressor groups kept and dropped, with the AICc of each choice. */
  groups: { name: string; kept: boolean; aiccWith: number; aiccWithout: number }[];
  fit: ArimaFit;
  log: boolean;
}

export class EffectsError extends Error {}

export function estimateEffects(values: Float64Array, index: TimeIndex, o: EffectOptions): Effects {
  const n = values.length;
  const period = defaultPeriod(index.frequency);
  let positive = true;
  for (const v of values) if (!Number.isNaN(v) && !(v > 0)) positive = false;
  const log = o.multiplicative && positive;
  const y = log ? values.map(Math.log) : Float64Array.from(values);

  // 1. Regressors: calendar groups and named interventions.
  const groups: { name: string; cols: Float64Array[]; names: string[] }[] = [];
  const days = index.frequency === 'hourly' ? null : periodDays(index);
  const holidays = o.calendar?.holidays ?? new Set<number>();
  if (days && (index.frequency === 'monthly' || index.frequency === 'quarterly')) {
    if (o.calendar?.tradingDay) {
      groups.push({ name: 'trading days', cols: tradingDay(days, holidays), names: [...TRADING_DAY_NAMES] });
    } else if (o.calendar?.workingDays) {
      groups.push({ name: 'working days', cols: [workingDayRegressor(days, holidays)], names: ['working days'] });
    }
    if (o.calendar?.leapYear) groups.push({ name: 'leap year', cols: [leapYear(days)], names: ['leap year'] });
    if (o.calendar?.easter != null) {
      const col = easterEffect(days, { before: o.calendar.easter, after: -1 });
      if (col.some((v) => v !== 0)) groups.push({ name: 'Easter', cols: [col], names: ['Easter'] });
    }
  } else if (days && index.frequency === 'daily' && holidays.size > 0) {
    // Each column goes with its name: a regressor that is zero throughout (no holiday near the data) is
    // dropped together with its name, so names and columns stay in line.
    const h = holidayEffects(days, holidays);
    const kept = (['dayOf', 'before', 'after'] as const).filter((k) => h[k].some((v) => v !== 0));
    if (kept.length > 0) {
      groups.push({ name: 'holidays', cols: kept.map((k) => h[k]), names: kept.map((k) => HOLIDAY_EFFECT_NAMES[k]) });
    }
  }
  const named = o.interventions ?? [];
  for (const iv of named) {
    if (!(iv.at >= 0 && iv.at < n)) throw new EffectsError(`intervention "${iv.label}" is outside the data`);
    if (Number.isNaN(values[iv.at])) throw new EffectsError(`intervention "${iv.label}" falls on a missing period`);
  }
  const namedCols = named.map((iv) => outlierColumn(iv.type, iv.at, n, { rate: iv.rate, until: iv.until }));
  const namedNames = named.map((iv) => iv.label);

  // 2. Orders with every candidate regressor; then each calendar group must lower the AICc to stay.
  const xregOf = (gs: typeof groups) => [...gs.flatMap((g) => g.cols), ...namedCols];
  const namesOf = (gs: typeof groups) => [...gs.flatMap((g) => g.names), ...namedNames];
  checkCollinear(xregOf(groups), namesOf(groups));
  // The search's own final fit is the model with every candidate: the first AICc of the group test.
  const selected = autoArima(y, period, { xreg: nonEmpty(xregOf(groups)), xregNames: namesOf(groups) }).fit;
  const orders: ArimaSpec = { ...selected.spec, xreg: undefined, xregNames: undefined };
  const narma = orders.p + orders.q + orders.P + orders.Q;
  const fits = new Map<string, ArimaFit | null>([[keyOf(groups), selected]]);
  // Each further fit drops one group from a model already fitted: it starts from that model's ARMA
  // coefficients (the regression coefficients start from least squares, as always).
  const fitOf = (gs: typeof groups, from: ArimaFit | null): ArimaFit | null => {
    const key = keyOf(gs);
    if (!fits.has(key)) {
      let fit: ArimaFit | null = null;
      try {
        // Only the AICc is needed unless this model is kept: no final filter (detectOutliers completes the
        // fit it keeps), at the tolerance of a full fit.
        fit = fitArima(
          y,
          { ...orders, xreg: nonEmpty(xregOf(gs)), xregNames: namesOf(gs) },
          { start: from ? from.coef.slice(0, narma) : undefined, quick: true, relTol: 1e-10 },
        );
      } catch {
        fit = null;
      }
      fits.set(key, fit);
    }
    return fits.get(key) ?? null;
  };
  const aiccOf = (fit: ArimaFit | null) => (fit && Number.isFinite(fit.aicc) ? fit.aicc : Number.POSITIVE_INFINITY);
  const verdicts: Effects['groups'] = [];
  let kept = groups;
  for (const g of groups) {
    const withFit = fitOf(kept, null);
    const withIt = aiccOf(withFit);
    const without = aiccOf(
      fitOf(
        kept.filter((k) => k !== g),
        withFit,
      ),
    );
    const keep = withIt < without;
    verdicts.push({ name: g.name, kept: keep, aiccWith: withIt, aiccWithout: without });
    if (!keep) kept = kept.filter((k) => k !== g);
  }

  // 3. Outliers, searched with the kept regressors in the model, whose fit is known already; the orders
  // stay unless the first candidates change the differencing (as reselectOrders in model/auto-arima.ts).
  const given = xregOf(kept);
  const spec: ArimaSpec = { ...orders, xreg: nonEmpty(given), xregNames: namesOf(kept) };
  const types = o.outliers ?? [];
  const found = detectOutliers(y, spec, {
    types,
    initial: fitOf(kept, null) ?? undefined,
    // The search's own final fit has exactly these regressors: taken as it is.
    reselect: (xreg, names) => {
      const { d, D } = differencingOrders(y, period, { xreg });
      return d === orders.d && D === orders.D ? null : autoArima(y, period, { xreg, xregNames: names, d, D }).fit;
    },
  });
  const fit = found.fit;
  const se = regressionSe(y, fit);
  const seOf = (j: number) => se[j - (fit.coef.length - fit.regressors.length)];

  // 4. Effects from the coefficients.
  const first =
    fit.coef.length - fit.regressors.length + (fit.regressors.length - given.length - found.outliers.length);
  const calendarLog = new Float64Array(n);
  const levelLog = new Float64Array(n);
  const oneOffLog = new Float64Array(n);
  const add = (target: Float64Array, col: Float64Array, b: number) => {
    for (let t = 0; t < n; t++) target[t] += b * col[t];
  };
  let j = first;
  const calendarCount = kept.reduce((s, g) => s + g.cols.length, 0);
  for (let c = 0; c < calendarCount; c++, j++) add(calendarLog, given[c], fit.coef[j]);
  const events: Event[] = [];
  named.forEach((iv, i) => {
    const b = fit.coef[j];
    add(iv.type === 'LS' || iv.type === 'RAMP' ? levelLog : oneOffLog, namedCols[i], b);
    events.push({ type: iv.type, at: iv.at, effect: b, t: b / seOf(j), label: iv.label });
    j++;
  });
  for (const out of found.outliers) {
    add(out.type === 'LS' ? levelLog : oneOffLog, outlierColumn(out.type, out.at, n), out.effect);
    events.push({ type: out.type, at: out.at, effect: out.effect, t: out.t, label: null });
    j++;
  }
  events.sort((a, b) => a.at - b.at);

  const linearised = new Float64Array(n);
  for (let t = 0; t < n; t++) linearised[t] = y[t] - calendarLog[t] - levelLog[t] - oneOffLog[t];
  const back = (a: Float64Array) => (log ? a.map(Math.exp) : a);
  return {
    linearised: log ? linearised.map(Math.exp) : linearised,
    calendar: back(calendarLog),
    level: back(levelLog),
    oneOff: back(oneOffLog),
    events,
    workingDays: days && groups.some((g) => g.name === 'working days') ? workingDays(days, holidays) : null,
    groups: verdicts,
    fit,
    log,
  };
}

function keyOf(gs: { name: string }[]): string {
  return gs.map((g) => g.name).join('|');
}

function nonEmpty(cols: Float64Array[]): Float64Array[] | undefined {
  return cols.length > 0 ? cols : undefined;
}

/** Regressors that are constant or a combination of the others cannot be told apart: a plain error. */
function checkCollinear(cols: Float64Array[], names: string[]): void {
  const basis: Float64Array[] = [];
  const n = cols[0]?.length ?? 0;
  const one = new Float64Array(n).fill(1 / Math.sqrt(Math.max(1, n)));
  basis.push(one);
  cols.forEach((col, i) => {
    const v = Float64Array.from(col);
    for (let pass = 0; pass < 2; pass++) {
      for (const b of basis) {
        let c = 0;
        for (let t = 0; t < n; t++) c += v[t] * b[t];
        for (let t = 0; t < n; t++) v[t] -= c * b[t];
      }
    }
    let norm = 0;
    let size = 0;
    for (let t = 0; t < n; t++) {
      norm += v[t] * v[t];
      size += col[t] * col[t];
    }
    if (!(norm > 1e-10 * Math.max(size, 1e-300))) {
      throw new EffectsError(
        `the regressor "${names[i]}" is constant or a combination of the others (${names.slice(0, i).join(', ') || 'the level'}), so its effect cannot be estimated`,
      );
    }
    const s = Math.sqrt(norm);
    basis.push(v.map((x) => x / s));
  });
}
