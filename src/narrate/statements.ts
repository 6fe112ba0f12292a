/**
 * Plain-language statements built only from figures of the Brief model. Each statement is assembled
 * from text and figure parts, so every number printed in its text is one of its figures' formatted
 * strings and a reviewer can trace it; and each carries the claims its words make (vocabulary/claims.ts), which
 * src/verify/ checks against the data. Sentences are short and causal words are avoided: the brief says
 * what moved, never why. Numbers in prose carry no sign: direction is said in words ("355 ML less").
 * A series' label opens the sentence it is in, so it keeps the capitals its owner gave it.
 */

import type {
  BriefMeta,
  Comparison,
  Figure,
  PeriodSpan,
  SeasonalProfile,
  SeriesBrief,
  Statement,
} from '../vocabulary/brief.js';
import type {
  Claim,
  ComparisonClaim,
  DirectionWord,
  FirmnessClaim,
  HistoryLimitClaim,
  IdentifiableSeasonalityClaim,
  ResidualSeasonalityClaim,
  SeasonalPeakLowClaim,
  SensitivityClaim,
  TrendDirectionClaim,
  TrendYearlyChangeClaim,
  UnusualCountClaim,
  YearlyTotalsClaim,
} from '../vocabulary/claims.js';

import { type Frequency, isoOf, isoWeekOf, ordinalAt, startOf } from '../vocabulary/period-index.js';
import { narrateEffects } from './effects.js';

import { countNoun, countOf, formatNumber, formatPercent, formatPeriod, unitAround } from './format.js';
import { narrateHistory } from './history.js';
import { type Part, statement } from './statement.js';
import { article, judgement, periodNoun, spanBack, unitWords } from './wording.js';

function fig(name: string, value: number | string, unit: string, formatted: string): Figure {
  return { name, value, unit, formatted };
}

/** Everything a series' statements need to format numbers alike. */
export class Words {
  constructor(
    readonly s: SeriesBrief,
    readonly locale: string,
  ) {}
  get freq(): Frequency {
    return this.s.frequency;
  }
  get relative(): boolean {
    return this.s.changeExpression === 'relative';
  }
  /** A figure with its unit around it: "£1,522 thousand", "355 ML", "0.4 points" (format.ts unitAround). */
  withUnit(f: Figure, unit: string): Part[] {
    const { before, after } = unitAround(unit, this.locale);
    return [before, f, after];
  }
  /** A level in the series' unit. */
  money(name: string, v: number): Part[] {
    return this.withUnit(this.amount(name, v), this.s.unit);
  }
  amount(name: string, v: number): Figure {
    return fig(name, v, this.s.unit, formatNumber(v, this.locale));
  }
  percent(name: string, v: number): Figure {
    return fig(name, v, '%', formatPercent(v, this.locale, false));
  }
  /**
   * The size of a change, unsigned, in the series' terms: "4.2%" when relative; "355 ML", or "0.4 points"
   * for a series in %, when absolute. The figure's value keeps the sign; the words give the direction.
   */
  size(name: string, v: number, relative = this.relative): Part[] {
    if (relative) return [fig(name, v, '%', formatPercent(Math.abs(v), this.locale, false))];
    return this.withUnit(
      fig(name, v, this.s.unit, formatNumber(Math.abs(v), this.locale)),
      unitWords(this.s.unit, Math.abs(v)),
    );
  }
  points(name: string, v: number): Figure {
    return fig(name, v, 'percentage points', formatNumber(v, this.locale, 1));
  }
  /** "in" for months, quarters and weeks; "on" for days and hours (an hour prints as "5 March 2026 at 13:00"). */
  when(): string {
    return this.freq === 'daily' || this.freq === 'hourly' ? 'on' : 'in';
  }
  /** A period by its ordinal; the figure's value is its ISO label, as the Brief carries it. */
  period(name: string, ordinal: number): Figure {
    return fig(name, isoOf(this.freq, ordinal), 'period', formatPeriod(this.freq, ordinal, this.locale));
  }
  /** The period at a position of the series' components. */
  at(name: string, i: number): Figure {
    return this.period(name, ordinalAt(this.s.periodIndex, i));
  }
  count(name: string, n: number, noun = periodNoun(this.freq)): Figure {
    return fig(name, n, noun, countNoun(n, noun, this.locale));
  }
  /** "18 of the 24" (`part` as the figure's value, the whole in its unit). */
  fraction(name: string, part: number, whole: number): Figure {
    const text = `${formatNumber(part, this.locale, 0)} of the ${formatNumber(whole, this.locale, 0)}`;
    return fig(name, part, `of ${whole}`, text);
  }
}

export function narrateSeries(s: SeriesBrief, locale: string): Statement[] {
  const w = new Words(s, locale);
  const out: Statement[] = [headline(w), context(w), ...narrateEffects(w)];
  s.analysis.seasonalProfiles.forEach((p, i) => {
    out.push(seasonal(w, p, i === 0 ? 'seasonal' : `seasonal-${p.period}`, i === 0));
  });
  out.push(...narrateHistory(s, locale));
  const limit = historyLimit(w);
  if (limit) out.push(limit);
  for (const c of s.analysis.comparisons) out.push(comparison(w, c));
  const totals = yearlyTotals(w);
  if (totals) out.push(totals);
  out.push(unusual(w), firmness(w));
  const sens = sensitivity(w);
  if (sens) out.push(sens);
  return out;
}

const DIRECTION_WORDS: Record<DirectionWord, string> = {
  rising: 'up',
  falling: 'down',
  'broadly-unchanged': 'broadly unchanged',
};

function headline(w: Words): Statement {
  const { s } = w;
  const y = s.analysis.trendYearly;
  const yoy = s.analysis.trendYoY;
  const span = s.analysis.headlineSpan;
  // "on a year ago", or with less than two years of data "on a week earlier" (analyse/headline-span.ts).
  const back = span.yearly ? 'a year ago' : `${spanBack(w.freq, span.periods, false)} earlier`;
  const claim: TrendYearlyChangeClaim = {
    kind: 'trend-yearly-change',
    at: yoy.currentDate,
    base: yoy.baseDate,
    expression: y.expression,
    value: y.value,
    change: yoy.change,
    direction: y.direction,
    materiality: Number.isFinite(y.value) ? y.materiality : null,
    ...(span.yearly ? {} : { over: span.periods }),
  };
  const tile: TrendDirectionClaim = {
    kind: 'trend-direction',
    at: yoy.currentDate,
    direction: y.direction,
    run: y.run,
  };
  if (y.direction === 'unknown') {
    const why = `the trend has no value ${back} or now, so its change cannot be given`;
    return statement('headline', 'headline', [`${s.label}: ${why}.`], [claim, tile]);
  }
  const relative = y.expression === 'relative';
  const moreLess = y.value > 0 ? 'higher' : 'lower';
  const parts: Part[] = [`${s.label}: the trend is ${DIRECTION_WORDS[y.direction]} `];
  if (y.direction === 'broadly-unchanged') {
    parts.push(`on ${back} (`, ...w.size('trendYoY', y.value, relative), ` ${moreLess}). `);
    parts.push(
      y.materiality.rule === 'revision-range'
        ? 'That is inside the range by which first estimates usually move.'
        : `That is within the usual noise of one ${periodNoun(w.freq)}.`,
    );
    return statement('headline', 'headline', parts, [claim, tile]);
  }
  parts.push(...w.size('trendYoY', y.value, relative), ` on ${back}`);
  if (relative) parts.push(' (', ...w.size('trendYoYChange', yoy.change, false), ` ${moreLess})`);
  parts.push('.');
  const j = judgement(y.direction, s.goodDirection);
  if (j === 'better') parts.push(' That is the direction you want.');
  if (j === 'worse') parts.push(' That is not the direction you want.');
  const f = s.analysis.firmness;
  if (Number.isFinite(f.meanAbsoluteRevision)) {
    parts.push(' First estimates like this one have moved by ');
    if (relative) {
      const p = w.points('meanAbsoluteRevision', f.meanAbsoluteRevision);
      parts.push(p, ` ${pointWord(p.formatted)}`);
    } else parts.push(...w.size('meanAbsoluteRevision', f.meanAbsoluteRevision, false));
    parts.push(' on average.');
  }
  return statement('headline', 'headline', parts, [claim, tile]);
}

/** "point" after a number that reads as one ("1", "1.0"), "points" otherwise. */
export function pointWord(formatted: string): string {
  return Number(formatted.replace(',', '.')) === 1 ? 'point' : 'points';
}

/** "a rise of 120 ML", "a fall of 3.5 points", "no change". */
function riseOrFall(w: Words, name: string, v: number): Part[] {
  if (v === 0) return ['no change'];
  return [v > 0 ? 'a rise of ' : 'a fall of ', ...w.size(name, v, false)];
}

function context(w: Words): Statement {
  const { s } = w;
  const r = s.reportingIndex;
  const obs = s.components.observed;
  const p = s.analysis.seasonalProfile;
  const parts: Part[] = [
    `${s.label} ${w.when()} `,
    w.at('reportingPeriod', s.reportingIndex),
    ': ',
    ...w.money('reportingValue', obs[r]),
    '. ',
  ];
  if (!Number.isFinite(p.latestRawChange)) {
    parts.push(`There is no value for the ${periodNoun(w.freq)} before, so the change cannot be given.`);
    return statement('context', 'context', parts, [{ kind: 'none' }]);
  }
  const raw = p.latestRawChange;
  const beyond = raw - p.latestSeasonalChange;
  if (raw === 0) parts.push('That is the same as ', w.when() === 'on' ? 'on ' : 'in ');
  else
    parts.push('That is ', ...w.size('rawChange', raw, false), raw > 0 ? ' more than ' : ' less than ', `${w.when()} `);
  parts.push(w.at('previousPeriod', r - 1), '.');
  const claim: Claim = {
    kind: 'latest-change',
    at: s.components.dates[r],
    previous: s.components.dates[r - 1],
    raw,
    seasonal: p.latestSeasonalChange,
    beyondSeason: beyond,
  };
  if (!s.settings.seasonalAdjustment.applied) return statement('context', 'context', parts, [claim]);
  // "Time of year" is true only of monthly and quarterly seasons; hours and days have daily or weekly ones.
  const yearly = w.s.frequency === 'monthly' || w.s.frequency === 'quarterly';
  parts.push(
    yearly ? ' The usual pattern for this time of year accounts for ' : ' The usual seasonal pattern accounts for ',
  );
  parts.push(...riseOrFall(w, 'seasonalChange', p.latestSeasonalChange), '. ');
  parts.push('Beyond the season, the change is ', ...riseOrFall(w, 'adjustedChange', beyond), '.');
  return statement('context', 'context', parts, [claim]);
}

/** The span one cycle of a pattern covers, and the preposition its seasons take. */
function cycleWords(w: Words, p: SeasonalProfile): { cycle: string; at: string } {
  switch (p.naming) {
    case 'month':
    case 'quarter':
    case 'iso-week':
      return { cycle: 'Each year', at: 'in ' };
    case 'weekday':
      return { cycle: 'Each week', at: 'on ' };
    case 'hour':
      return { cycle: 'Each day', at: 'at ' };
    case 'cycle-position':
      return { cycle: `In each cycle of ${p.period} ${periodNoun(w.freq)}s`, at: `at ${periodNoun(w.freq)} ` };
  }
}

function seasonal(w: Words, p: SeasonalProfile, id: string, main: boolean): Statement {
  const test = w.s.diagnostics.identifiableSeasonality?.find((t) => t.period === p.period);
  const idClaim = test ? identifiableClaim(w, test) : null;
  const residual = main && w.s.settings.seasonalAdjustment.applied ? residualWords(w) : null;
  const tail: Part[] = residual ? [' ', ...residual.parts] : [];
  const extra: Claim[] = residual ? [residual.claim] : [];
  if (test && idClaim && test.verdict !== 'present') {
    return statement(id, 'seasonal', [...notIdentifiable(w, p, test, main), ...tail], [idClaim, ...extra]);
  }
  const relative = w.relative && Number.isFinite(p.peak.effectPercent) && Number.isFinite(p.trough.effectPercent);
  const size = (x: SeasonalProfile['peak']) => (relative ? x.effectPercent : x.effect);
  const claim: SeasonalPeakLowClaim = {
    kind: 'seasonal-peak-low',
    period: p.period,
    seasonsBy: p.naming,
    cycles: p.cycles,
    peak: { label: p.peak.label, size: size(p.peak) },
    low: { label: p.trough.label, size: size(p.trough) },
    expression: relative ? 'relative' : 'absolute',
  };
  if (p.cycles.from < 0 || !Number.isFinite(p.peak.effect)) {
    return statement(id, 'seasonal', ['There is no whole seasonal cycle to describe.'], [{ kind: 'none' }]);
  }
  const { cycle, at } = cycleWords(w, p);
  const k = p.period === w.s.settings.period ? '' : `${p.period}.`;
  const identified: Part[] = test
    ? [
        ' A test for a real seasonal pattern finds one (F = ',
        fig(`${k}stableF`, test.stable.statistic, 'F', formatNumber(test.stable.statistic, w.locale, 1)),
        ', ',
        ...pWords(w, `${k}stableP`, test.stable.pValue),
        ', at the ',
        levelFigure(w, `${k}stableLevel`, test.levels.stable),
        ' level).',
      ]
    : [];
  // Season names are figures too: "Q3", "week 9" and "13:00" hold numbers a reader may check.
  return statement(
    id,
    'seasonal',
    [
      `${cycle}, the seasonal peak is ${at}`,
      fig(`${k}peakSeason`, p.peak.label, 'season', p.peak.label),
      ', about ',
      ...w.size(`${k}peakSize`, size(p.peak), relative),
      ` above the trend. The low point is ${at}`,
      fig(`${k}troughSeason`, p.trough.label, 'season', p.trough.label),
      ', about ',
      ...w.size(`${k}troughSize`, size(p.trough), relative),
      ' below it.',
      ...identified,
      ...tail,
    ],
    idClaim ? [claim, idClaim, ...extra] : [claim, ...extra],
  );
}

/** What a cycle of a pattern is called: "weekly", "yearly", "daily", or "12-period". */
function patternWord(w: Words, p: SeasonalProfile): string {
  switch (p.naming) {
    case 'month':
    case 'quarter':
    case 'iso-week':
      return 'yearly';
    case 'weekday':
      return 'weekly';
    case 'hour':
      return 'daily';
    case 'cycle-position':
      return `${p.period}-${periodNoun(w.freq)}`;
  }
}

/** "p = 0.005", or "p < 0.001" below that. */
function pWords(w: Words, name: string, pValue: number): Part[] {
  if (pValue < 0.001) return ['p < ', fig(name, pValue, 'p', formatNumber(0.001, w.locale, 3))];
  return ['p = ', fig(name, pValue, 'p', formatNumber(pValue, w.locale, pValue < 0.01 ? 3 : 2))];
}

/** A test level as a percent: "0.1%", "1%". */
function levelFigure(w: Words, name: string, level: number): Figure {
  return fig(name, level, 'level', formatPercent(100 * level, w.locale, false, level < 0.01 ? 1 : 0));
}

function notIdentifiable(
  w: Words,
  p: SeasonalProfile,
  t: NonNullable<SeriesBrief['diagnostics']['identifiableSeasonality']>[number],
  main: boolean,
): Part[] {
  const k = p.period === w.s.settings.period ? '' : `${p.period}.`;
  const what = patternWord(w, p);
  const parts: Part[] = [
    t.verdict === 'none'
      ? `No clear ${what} pattern shows in the data. `
      : `There is probably no clear ${what} pattern in the data. `,
    'A test for a real seasonal pattern finds none (F = ',
    fig(`${k}stableF`, t.stable.statistic, 'F', formatNumber(t.stable.statistic, w.locale, 2)),
    ', ',
    ...pWords(w, `${k}stableP`, t.stable.pValue),
    ', at the ',
    levelFigure(w, `${k}stableLevel`, t.levels.stable),
    ' level).',
  ];
  if (t.decidedBy === 'moving') {
    parts.push(
      ' The pattern shifts too much from year to year to measure (F = ',
      fig(`${k}movingF`, t.moving.statistic, 'F', formatNumber(t.moving.statistic, w.locale, 2)),
      ', at the ',
      levelFigure(w, `${k}movingLevel`, t.levels.moving),
      ' level).',
    );
  } else if (t.decidedBy === 'kruskal-wallis') {
    parts.push(
      ' A rank test finds the seasons alike at the ',
      levelFigure(w, `${k}kwLevel`, t.levels.kruskalWallis),
      ' level.',
    );
  } else if (t.decidedBy === 't1' || t.decidedBy === 't2') {
    parts.push(' The pattern is weak next to the noise.');
  }
  // Unadjusted, the main statement says so once; adjusted (another period is identifiable), say why no peak.
  if (!w.s.settings.seasonalAdjustment.applied) {
    if (main) parts.push(' So the data are not adjusted for season. The trend is that of the data as they are.');
  } else parts.push(' So no peak or low is given for it.');
  return parts;
}

function identifiableClaim(
  w: Words,
  t: NonNullable<SeriesBrief['diagnostics']['identifiableSeasonality']>[number],
): IdentifiableSeasonalityClaim {
  const f = (x: { statistic: number; df1: number; df2: number; pValue: number }) => ({
    statistic: x.statistic,
    df1: x.df1,
    df2: x.df2,
    pValue: x.pValue,
  });
  return {
    kind: 'identifiable-seasonality',
    period: t.period,
    multiplicative: w.s.settings.model === 'multiplicative',
    verdict: t.verdict,
    stable: f(t.stable),
    moving: f(t.moving),
    kruskalWallis: { statistic: t.kruskalWallis.statistic, df: t.kruskalWallis.df, pValue: t.kruskalWallis.pValue },
    levels: { ...t.levels },
    thresholds: t.period === 12 || t.period === 4,
    adjusted: w.s.settings.seasonalAdjustment.applied,
  };
}

/** The residual-seasonality sentence and its claim; null when the test could not be run. */
function residualWords(w: Words): { parts: Part[]; claim: ResidualSeasonalityClaim } | null {
  const r = w.s.diagnostics.residualSeasonality;
  if (!Number.isFinite(r.statistic) || !Number.isFinite(r.pValue)) return null;
  const stats: Part[] = [
    'F = ',
    fig('residualF', r.statistic, 'F', formatNumber(r.statistic, w.locale, 2)),
    ', ',
    ...pWords(w, 'residualP', r.pValue),
  ];
  const level = levelFigure(w, 'residualLevel', r.level);
  const parts: Part[] = r.present
    ? ['Some of the season is still left once it is taken out (', ...stats, ', at the ', level, ' level).']
    : ['No season is left once it is taken out, at the ', level, ' level (', ...stats, ').'];
  return {
    parts,
    claim: {
      kind: 'residual-seasonality',
      period: w.s.settings.period,
      cycles: r.cycles,
      test: { statistic: r.statistic, df1: r.df1, df2: r.df2, pValue: r.pValue },
      level: r.level,
      present: r.present,
    },
  };
}

/** A span as a claim states it: its labels and length (the checker reads labels, not our ordinals). */
function labels(span: PeriodSpan): { from: string; to: string; periods: number } {
  return { from: span.from, to: span.to, periods: span.periods };
}

/** "March 2026" for one period, "January 2026 to March 2026" for more. */
function spanWords(w: Words, name: string, span: Comparison['current']): Part[] {
  if (span.from === span.to) return [w.period(`${name}`, span.ordinals.first)];
  return [w.period(`${name}.from`, span.ordinals.first), ' to ', w.period(`${name}.to`, span.ordinals.last)];
}

function comparison(w: Words, c: Comparison): Statement {
  const what = c.aggregation === 'sum' ? 'total' : 'average';
  const relative = w.relative && c.raw.baseline > 0 && c.adjusted.baseline > 0;
  const change = relative ? c.raw.percent : c.raw.change;
  // Without seasonal adjustment the adjusted series is the data: "without the season" would repeat the change.
  const adjusted = !w.s.settings.seasonalAdjustment.applied
    ? Number.NaN
    : relative
      ? c.adjusted.percent
      : c.adjusted.change;
  const yearBefore = c.kind !== 'custom';
  // The label is a figure too: "Last 12 months" or a custom label holds numbers a reader may check.
  const parts: Part[] = [
    fig(`${c.id}.label`, c.label, 'label', c.label),
    // One period is a value, not a total or an average of one.
    c.current.from === c.current.to ? ': ' : `: ${article(what)} ${what} of `,
    ...w.money(`${c.id}.current`, c.raw.current),
  ];
  const named = yearBefore ? namedBaseline(w, c) : null;
  const baselineWords: Part[] = named
    ? named.words
    : yearBefore
      ? ['the same span a year before']
      : spanWords(w, `${c.id}.baselineSpan`, c.baseline);
  if (!Number.isFinite(change)) {
    parts.push(', against ', ...w.money(`${c.id}.baseline`, c.raw.baseline), ' in ', ...baselineWords, '.');
  } else if (change === 0) {
    parts.push(
      '. That is the same as in ',
      ...baselineWords,
      ' (',
      ...w.money(`${c.id}.baseline`, c.raw.baseline),
      ').',
    );
  } else {
    parts.push('. That is ', ...w.size(`${c.id}.change`, change, relative), change > 0 ? ' more than ' : ' less than ');
    // A custom single period is a date for days and hours ("on 20 August 2000 at 23:00").
    const single = !yearBefore && c.baseline.periods === 1 ? `${w.when()} ` : 'in ';
    parts.push(
      yearBefore && !named ? '' : (named?.preposition ?? single),
      ...baselineWords,
      ' (',
      ...w.money(`${c.id}.baseline`, c.raw.baseline),
      ').',
    );
  }
  if (named?.note) parts.push(...named.note);
  if (c.partial) parts.push(' It covers ', w.count(`${c.id}.periods`, c.current.periods), ' so far.');
  const differ = c.current.periods !== c.baseline.periods;
  if (differ) {
    parts.push(
      ' The spans differ in length: ',
      w.count(`${c.id}.currentPeriods`, c.current.periods),
      ' against ',
      w.count(`${c.id}.baselinePeriods`, c.baseline.periods),
      '.',
    );
  }
  if (Number.isFinite(adjusted)) {
    if (adjusted === 0) parts.push(' Without the season, there is no change.');
    else {
      parts.push(' Without the season, it is ', ...w.size(`${c.id}.adjusted`, adjusted, relative));
      parts.push(adjusted > 0 ? ' more.' : ' less.');
    }
  }
  const claim: ComparisonClaim = {
    kind: 'comparison',
    comparison: c.id,
    aggregation: c.aggregation,
    current: labels(c.current),
    baseline: labels(c.baseline),
    baselineWords: named ? named.claim : yearBefore ? 'year-before' : 'stated',
    lengthsDifferSaid: differ,
    currentValue: c.raw.current,
    baselineValue: c.raw.baseline,
    expression: relative ? 'relative' : 'absolute',
    change,
    adjustedChange: adjusted,
  };
  return statement(`comparison-${c.id}`, 'comparison', parts, [claim]);
}

/**
 * What the brief cannot compare, and why: "A yearly comparison needs at least two years of data. This
 * series has 2,016 hours (12 weeks). So these are left out: Same hour last year, Year to date." Null when
 * the data hold two years and every comparison the job asks for fits in them.
 */
function historyLimit(w: Words): Statement | null {
  const { s } = w;
  const span = s.analysis.headlineSpan;
  const left = s.analysis.comparisonsLeftOut;
  if (span.yearly && left.length === 0) return null;
  const parts: Part[] = [];
  if (!span.yearly) {
    const weeks = w.freq === 'hourly' || w.freq === 'daily' ? (w.freq === 'hourly' ? 168 : 7) : 0;
    parts.push(
      'A yearly comparison needs at least two years of data. This series has ',
      w.count('historyPeriods', span.available),
      weeks > 0 && span.available % weeks === 0 && span.available > weeks
        ? ` (${spanBack(w.freq, span.available, false)})`
        : '',
      '.',
    );
    parts.push(` So the trend's change is given over ${spanBack(w.freq, span.periods, false)} instead.`);
  }
  if (left.length > 0) {
    parts.push(span.yearly ? 'Left out, as the data do not reach ' : ' Left out, as the data do not reach ');
    parts.push('back to their spans: ');
    left.forEach((c, i) => {
      if (i > 0) parts.push(i === left.length - 1 ? ' and ' : ', ');
      parts.push(fig(`${c.id}.leftOut`, c.label, 'label', c.label));
    });
    parts.push('.');
  }
  const claim: HistoryLimitClaim = {
    kind: 'history-limit',
    periods: span.available,
    needed: span.needed,
    yearly: span.yearly,
    leftOut: left.map((c) => ({ id: c.id, current: labels(c.current), baseline: labels(c.baseline) })),
  };
  return statement('history-limit', 'comparison', parts, [claim]);
}

/**
 * "Each whole calendar year from January 1949 to December 1959 has the same total without the season as
 * in the data." Said only when the job matched the adjusted series to yearly totals and some year was.
 */
function yearlyTotals(w: Words): Statement | null {
  const t = w.s.yearlyTotals;
  if (!t || t.years.length === 0) return null;
  const start = w.s.settings.yearlyTotals.yearStartMonth;
  const first = t.years[0].ordinals.first;
  const last = t.years[t.years.length - 1].ordinals.last;
  const what = w.s.aggregation === 'sum' ? 'total' : 'average';
  const one = t.years.length === 1;
  const claim: YearlyTotalsClaim = {
    kind: 'yearly-totals',
    yearStartMonth: start,
    years: t.years.map((y) => ({ from: y.from, to: y.to })),
  };
  return statement(
    'yearly-totals',
    'comparison',
    [
      one ? 'The whole ' : 'Each whole ',
      start === 1 ? 'calendar year' : 'financial year',
      ' from ',
      w.period('yearlyTotals.from', first),
      ' to ',
      w.period('yearlyTotals.to', last),
      ` has the same ${what} without the season as in the data.`,
      ` The seasonally adjusted figures are matched to ${one ? 'that' : 'those'} ${what}s by Denton's method.`,
    ],
    [claim],
  );
}

const NUMBER_WORDS = ['', 'one', 'two', 'three', 'four', 'five'];

/**
 * A one-period baseline named in words rather than called "the same span a year before": for a day or
 * hour, "the same weekday a year earlier, 1 October 2025" (52 weeks back, not the same date); for a week,
 * the ISO week, with a note when its number differs ("2019 had no week 53."). Null for other comparisons.
 */
function namedBaseline(
  w: Words,
  c: Comparison,
): { words: Part[]; preposition: string; note: Part[] | null; claim: 'same-weekday' | 'iso-week' } | null {
  if (c.current.periods !== 1 || c.baseline.periods !== 1) return null;
  if (c.alignment === 'weekday') {
    const what =
      w.freq === 'hourly' ? 'the same hour of the same weekday a year earlier, ' : 'the same weekday a year earlier, ';
    return {
      words: [what, w.period(`${c.id}.baselinePeriod`, c.baseline.ordinals.first)],
      preposition: 'on ',
      note: null,
      claim: 'same-weekday',
    };
  }
  if (c.alignment === 'iso-week') {
    const now = isoWeekOf(startOf(w.freq, c.current.ordinals.first));
    const then = isoWeekOf(startOf(w.freq, c.baseline.ordinals.first));
    const note: Part[] | null =
      now.week === then.week
        ? null
        : [
            ' ',
            fig(`${c.id}.baselineYear`, then.year, 'year', String(then.year)),
            ' had no week ',
            fig(`${c.id}.currentWeek`, now.week, 'week', String(now.week)),
            '.',
          ];
    return {
      words: [w.period(`${c.id}.baselinePeriod`, c.baseline.ordinals.first)],
      preposition: 'in ',
      note,
      claim: 'iso-week',
    };
  }
  return null;
}

function unusual(w: Words): Statement {
  const { s } = w;
  const o = s.analysis.outliers;
  const noun = periodNoun(w.freq);
  const r = s.reportingIndex;
  const dates = s.components.dates;
  const { from, years } = s.analysis.recentSpan;
  const mult = s.settings.model === 'multiplicative';
  const claim: UnusualCountClaim = {
    kind: 'unusual-count',
    span: { from: dates[from], to: dates[r], periods: r - from + 1 },
    years,
    count: o.length,
    limit: { centre: 'median', spread: 'mad', multiple: 3 },
    named: o.slice(-3).map((x) => ({ date: x.date, size: mult ? 100 * (x.remainder - 1) : x.remainder })),
  };
  const within: Part[] =
    years > 0 ? [`in the last ${NUMBER_WORDS[years] ?? years} years`] : ['since ', w.at('recentFrom', from)];
  if (o.length === 0) {
    return statement('unusual', 'unusual', [`No ${noun} `, ...within, ' stands out from the usual pattern.'], [claim]);
  }
  const parts: Part[] = [w.count('unusualCount', o.length), ' ', ...within, ' stood out from the usual pattern: '];
  const shown = o.slice(-3);
  shown.forEach((x, i) => {
    if (i > 0) parts.push(i === shown.length - 1 ? ' and ' : ', ');
    const size = mult ? 100 * (x.remainder - 1) : x.remainder;
    parts.push(w.at(`unusual${i}.period`, x.index), ' (');
    parts.push(...w.size(`unusual${i}.size`, size, mult), size > 0 ? ' above' : ' below', ' the expected value)');
  });
  parts.push('. These may be real events. The brief does not say why they happened.');
  return statement('unusual', 'unusual', parts, [claim]);
}

function firmness(w: Words): Statement {
  const f = w.s.analysis.firmness;
  const parts: Part[] = [];
  if (f.provisionalCount > 0) {
    parts.push(
      'The last ',
      w.count('provisionalCount', f.provisionalCount, 'value'),
      ' of the trend are provisional. They will change as new data come in. ',
    );
  }
  const pts = (name: string, v: number): Part[] =>
    w.s.analysis.trendYearly.expression === 'relative'
      ? [w.points(name, v), ` ${pointWord(w.points(name, v).formatted)}`]
      : w.withUnit(fig(name, v, w.s.unit, formatNumber(v, w.locale)), unitWords(w.s.unit, Math.abs(v)));
  if (f.periodsChecked > 0 && Number.isFinite(f.meanAbsoluteRevision)) {
    const first = f.revisions[0];
    const last = f.revisions[f.revisions.length - 1];
    // Unsigned in prose: the direction is said in words ("a fall of 0.3 points").
    const bound = (name: string, v: number): Part[] => {
      if (v === 0) return ['no change'];
      const f = fig(name, v, 'percentage points', formatNumber(Math.abs(v), w.locale, 1));
      const size: Part[] =
        w.s.analysis.trendYearly.expression === 'relative'
          ? [f, ` ${pointWord(f.formatted)}`]
          : w.withUnit(fig(name, v, w.s.unit, formatNumber(Math.abs(v), w.locale)), unitWords(w.s.unit, Math.abs(v)));
      return [v > 0 ? 'a rise of ' : 'a fall of ', ...size];
    };
    parts.push(
      'For ',
      w.count('periodsChecked', f.periodsChecked),
      ', from ',
      w.at('firstCut', first.index),
      ' to ',
      w.at('lastCut', last.index),
      ', we compared the first estimate of the yearly trend change with its settled estimate from all the data. ',
    );
    parts.push('The two differed by ', ...pts('firmnessMean', f.meanAbsoluteRevision), ' on average. ');
    parts.push(
      'Taking each revision as the settled estimate minus the first, ',
      w.fraction('range80Count', f.withinRange80, f.periodsChecked),
      ' revisions were between ',
      ...bound('range80Low', f.range80[0]),
      ' and ',
      ...bound('range80High', f.range80[1]),
      '.',
    );
  } else if (f.limit === 'no-end-estimate') {
    parts.push(
      'The trend has no estimate at the end of the data, so how much first estimates move cannot be measured.',
    );
  } else {
    parts.push(
      'How much first estimates move cannot be measured yet: that needs ',
      w.count('neededLength', f.neededLength),
      ' of data, so that first estimates can be compared with settled ones.',
    );
  }
  const claim: FirmnessClaim = {
    kind: 'firmness',
    provisionalCount: f.provisionalCount,
    periodsChecked: f.periodsChecked,
    meanAbsoluteRevision: f.meanAbsoluteRevision,
    range: { low: f.range80[0], high: f.range80[1], share: 0.8 },
    withinRange: f.withinRange80,
    settledBefore: f.provisionalFrom,
  };
  return statement('firmness', 'firmness', parts, [claim]);
}

function sensitivity(w: Words): Statement | null {
  const x = w.s.analysis.sensitivity;
  if (x.side === 'none' || !Number.isFinite(x.reversalValue)) return null;
  const turn = x.direction === 'rising' ? 'turn down' : 'turn up';
  const claim: SensitivityClaim = {
    kind: 'sensitivity',
    at: w.s.reportingDate,
    next: x.nextDate,
    stepDirection: x.direction === 'rising' ? 'rising' : 'falling',
    side: x.side,
    value: x.reversalValue,
  };
  return statement(
    'sensitivity',
    'sensitivity',
    [
      `For the trend to ${turn}, `,
      w.at('nextPeriod', w.s.reportingIndex + 1),
      ` would need to come in ${x.side} about `,
      ...w.money('reversalValue', x.reversalValue),
      '.',
    ],
    [claim],
  );
}

/** The cautions every brief carries once. */
export function briefCautions(_meta: BriefMeta): Statement[] {
  return [
    statement('caution-provisional', 'caution', [
      'Figures near the end are provisional. They will be revised as new data come in.',
    ]),
    statement('caution-no-forecast', 'caution', ['This brief describes the past. It is not a forecast.']),
    statement('caution-unusual', 'caution', ['Unusual values may be real events, not errors in the data.']),
    statement('caution-regulator', 'caution', ['If a regulator sets a method for your filing, use that method.']),
  ];
}

export { countOf };
