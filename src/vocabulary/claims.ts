/**
 * Claims: what a statement asserts about the data, in machine-readable form. Every statement carries the
 * claims its words make, beside its text and figures; src/verify/ recomputes each claim from the components
 * and the data (sharing no code with src/narrate/) and reports any that is false.
 *
 * A claim is a plain JSON object tagged by `kind`. The union is open: to add a kind, add its interface
 * here and one line to `ClaimKinds`; the verifier's table of checks (src/verify/checks.ts) is typed
 * `{ [K in ClaimKind]: Check<K> }`, so the type-check fails until the new kind has its check.
 *
 * Conventions shared by every kind:
 * - periods are ISO dates as in `components.dates` (the start of the period);
 * - an index is a position in `components.dates`;
 * - a number is the value the words state, unrounded, in the unit named beside it;
 * - `expression` says how a change is put in words: 'relative' (percent of the earlier value, only ever
 *   of a positive one) or 'absolute' (in the series' units; for a series in %, percentage points).
 */

/** How a change is put in words. */
export type ChangeExpression = 'relative' | 'absolute';

/** A direction word as the brief uses it: one materiality rule decides all of them (analyse/materiality.ts). */
export type DirectionWord = 'rising' | 'falling' | 'broadly-unchanged';

/** A span of consecutive periods, inclusive, by ISO start dates, with how many periods it holds. */
export interface ClaimSpan {
  from: string;
  to: string;
  periods: number;
}

/**
 * The rule that decided a direction word. 'revision-range': the change is broadly unchanged when zero lies
 * inside `value + [low, high]`, the first estimate moved by the range of past revisions (later minus
 * earlier). 'noise': no revision study could be made; broadly unchanged when |value| ≤ `high` (the robust
 * spread of the remainder, in the same terms as the value).
 */
export interface Materiality {
  rule: 'revision-range' | 'noise';
  low: number;
  high: number;
}

/** The trend's change over a year at the reporting period, and the direction word it earns. */
export interface TrendYearlyChangeClaim {
  kind: 'trend-yearly-change';
  at: string;
  base: string;
  expression: ChangeExpression;
  /** The change as stated: percent when relative, units when absolute. NaN when it cannot be given. */
  value: number;
  /** The change in the series' units (trend now minus trend a year before). */
  change: number;
  direction: DirectionWord | 'unknown';
  materiality: Materiality | null;
  /**
   * Present when the data hold less than two years before the reporting period: the change is then over
   * this many periods (base is that many periods before at), not over a year.
   */
  over?: number;
}

/** The tile's direction word and how many periods in a row the trend has stepped that way. */
export interface TrendDirectionClaim {
  kind: 'trend-direction';
  at: string;
  direction: DirectionWord | 'unknown';
  /** Consecutive periods up to `at` in which the trend rose (or fell), when the direction is rising (falling). */
  run: number;
}

/** The latest period's raw change, split into what the season usually does and the rest. */
export interface LatestChangeClaim {
  kind: 'latest-change';
  at: string;
  previous: string;
  /** observed[at] − observed[previous], in units. */
  raw: number;
  /** The part the seasonal component accounts for, in units. */
  seasonal: number;
  /** The rest: the change of the seasonally adjusted series, in units. */
  beyondSeason: number;
}

/** How seasons are named and grouped (see SeasonalPeakLowClaim). */
export type SeasonNaming = 'month' | 'quarter' | 'iso-week' | 'weekday' | 'hour' | 'cycle-position';

/** One seasonal pattern's peak and low season, from the seasonal component over whole cycles. */
export interface SeasonalPeakLowClaim {
  kind: 'seasonal-peak-low';
  /** Observations per cycle of the pattern described (7 for a week of days, 12 for a year of months). */
  period: number;
  /**
   * How the seasons are named, which is also how they are grouped: each period of the cycles falls in the
   * season its date names (a yearly pattern of days is described by calendar month, a weekly one by
   * weekday); 'cycle-position' numbers the periods of a cycle 1…period.
   */
  seasonsBy: SeasonNaming;
  /** The whole cycles the profile was averaged over, as an inclusive index range (a multiple of `period` long). */
  cycles: { from: number; to: number };
  /** Peak and low season with their typical effect: percent of the level when relative, units when absolute. */
  peak: { label: string; size: number };
  low: { label: string; size: number };
  expression: ChangeExpression;
}

/** A comparison of two spans, combined by sum or mean. */
export interface ComparisonClaim {
  kind: 'comparison';
  comparison: string;
  aggregation: 'sum' | 'mean';
  current: ClaimSpan;
  baseline: ClaimSpan;
  /**
   * 'year-before': the words say the baseline is the same span a year earlier; 'stated': the words name the
   * baseline span; 'same-weekday': the words name one day (or hour) as "the same weekday a year earlier"
   * (52 weeks back); 'iso-week': the words name one ISO week as last year's twin of the current one — the
   * same week number, or week 52 for a week 53 whose year before has none (the words then say so).
   */
  baselineWords: 'year-before' | 'stated' | 'same-weekday' | 'iso-week';
  /** The words say the two spans differ in length (they must whenever the spans do). */
  lengthsDifferSaid: boolean;
  currentValue: number;
  baselineValue: number;
  expression: ChangeExpression;
  /** The raw change as stated (percent or units); NaN when not stated. */
  change: number;
  /** The seasonally adjusted change as stated, or NaN when not stated. */
  adjustedChange: number;
}

/** How many unusual periods fall in a calendar span, and which are named. */
export interface UnusualCountClaim {
  kind: 'unusual-count';
  /** The calendar span the words name ("the last two years"), by ISO dates, inclusive. */
  span: ClaimSpan;
  /** The span's length in years as the words give it: the span must be exactly that many calendar years. */
  years: number;
  count: number;
  /** The rule that marks a period unusual. */
  limit: { centre: 'median'; spread: 'mad'; multiple: number };
  named: { date: string; size: number }[];
}

/** The firmness statement: provisional values and the revision study's summary. */
export interface FirmnessClaim {
  kind: 'firmness';
  provisionalCount: number;
  periodsChecked: number;
  meanAbsoluteRevision: number;
  range: { low: number; high: number; share: number };
  /** How many revisions the words say lie inside the range ("18 of the 24"). */
  withinRange: number;
  /**
   * First index of the provisional zone: every first estimate was compared with a settled one, so every
   * revision's index lies before it. Revisions are later minus earlier (settled − first).
   */
  settledBefore: number;
}

/** The value next period would need for the trend's last step to reverse. */
export interface SensitivityClaim {
  kind: 'sensitivity';
  at: string;
  next: string;
  stepDirection: 'rising' | 'falling';
  side: 'below' | 'above';
  value: number;
}

/**
 * What the last brief (from the record) said of the trend's change over a year at its own reporting period,
 * and what today's components give for the same period. `published` comes from the record; `now` is
 * checked against the trend.
 */
export interface SinceLastBriefClaim {
  kind: 'since-last-brief';
  /** The last brief's reporting period. */
  period: string;
  expression: ChangeExpression;
  /** As published: percent when relative, units when absolute; NaN when it gave none. */
  published: number;
  /** The same change from today's trend; NaN when it cannot be given. */
  now: number;
}

/** Past values the source data changed since the last brief: each `after` is the value read today. */
export interface SourceRevisionsClaim {
  kind: 'source-revisions';
  /** The last brief's reporting period. */
  since: string;
  count: number;
  /** The revisions named in the words, latest first. */
  named: { date: string; before: number; after: number }[];
}

/** Published first estimates of the trend's yearly change (percent) against today's, summarised. */
export interface PublishedFirmnessClaim {
  kind: 'published-firmness';
  briefs: number;
  revisions: { date: string; first: number; latest: number }[];
  meanAbsoluteRevision: number;
  range: { low: number; high: number; share: number };
}

/** The value observed in the reporting period, as the overview states it. */
export interface LatestValueClaim {
  kind: 'latest-value';
  /** The reporting period the words name. */
  at: string;
  /** The value as stated, unrounded, in the series' units. */
  value: number;
}

/** One F test as stated: the statistic, its degrees of freedom and p-value. */
export interface ClaimFTest {
  statistic: number;
  df1: number;
  df2: number;
  pValue: number;
}

/**
 * Whether a seasonal pattern of `period` is identifiable, by the combined test of Lothian & Morry (1978)
 * on the seasonal-irregular values against a centred moving average of order `period`
 * (diagnose/identifiable-seasonality.ts). `verdict` is what the words say; when it is not 'present' the
 * statement names no peak, and when `adjusted` is false the brief's components carry no season (the trend
 * is that of the data as they are).
 */
export interface IdentifiableSeasonalityClaim {
  kind: 'identifiable-seasonality';
  period: number;
  multiplicative: boolean;
  verdict: 'present' | 'probably-none' | 'none';
  stable: ClaimFTest;
  moving: ClaimFTest;
  kruskalWallis: { statistic: number; df: number; pValue: number };
  /** The levels the words state: stable F, moving F, Kruskal–Wallis. */
  levels: { stable: number; moving: number; kruskalWallis: number };
  /** Whether the T1/T2 thresholds took part (monthly and quarterly cycles only). */
  thresholds: boolean;
  /** Whether the season was removed from the brief's components. */
  adjusted: boolean;
}

/**
 * Whether seasonality is left in the seasonally adjusted series: a one-way F test of its period-on-period
 * changes by season over the last `cycles` whole cycles at most (diagnose/residual-seasonality.ts), at
 * `level`.
 */
export interface ResidualSeasonalityClaim {
  kind: 'residual-seasonality';
  period: number;
  cycles: number;
  test: ClaimFTest;
  level: number;
  present: boolean;
}

/**
 * The seasonally adjusted series adds up to the data's total over each whole year listed (calendar years,
 * or financial years starting in `yearStartMonth`): the job's match_yearly_totals (src/adjust/denton.ts).
 * `years` are the first and last periods of each year forced, in time order; every whole year of the data
 * from the first listed to the last with all its values present is listed.
 */
export interface YearlyTotalsClaim {
  kind: 'yearly-totals';
  yearStartMonth: number;
  years: { from: string; to: string }[];
}

/**
 * What the brief cannot compare and why: with `periods` periods to the reporting period, fewer than the
 * `needed` two years and one period of a yearly comparison (`yearly` false: the words say so); and the
 * comparisons left out because their spans reach outside the data, by id with their spans.
 */
export interface HistoryLimitClaim {
  kind: 'history-limit';
  periods: number;
  needed: number;
  yearly: boolean;
  leftOut: { id: string; current: ClaimSpan; baseline: ClaimSpan }[];
}

/** A statement that asserts nothing about the data (a caution). */
export interface NoClaim {
  kind: 'none';
}

/** Every claim kind by its tag. Add a line here for a new kind (see DEVELOPERS.md, "Adding a statement"). */
/**
 * A period's working days (Monday to Friday) against the same period a year before, and, when the
 * working-day effect earned its place in the model, the change on a year earlier of the series with the
 * calendar effects taken out (observed − calendar, or observed ÷ calendar).
 */
export interface WorkingDaysClaim {
  kind: 'working-days';
  at: string;
  base: string;
  daysAt: number;
  daysBase: number;
  /** Holidays on Monday to Friday the words count out of each period, as ISO dates. */
  holidaysAt: string[];
  holidaysBase: string[];
  /** Whether the words allow for the working days (the effect was kept by the AICc rule). */
  allowed: boolean;
  expression: ChangeExpression;
  /** The calendar-adjusted change as stated (percent or units); NaN when not allowed for. */
  value: number;
}

/**
 * A step in the level, named in the job or found in the data (a ramp: a rise or fall spread from `from` to
 * `to`): its size is the jump of the trend's step part (components.steps) across it, as a percent of the
 * step part before it when relative, in units when absolute. 'unclear': the estimate is within twice its
 * standard error, and the words say no clear step.
 */
export interface LevelStepClaim {
  kind: 'level-step';
  from: string;
  /** The last period of a ramp; the same as `from` for a step. */
  to: string;
  label: string | null;
  direction: 'up' | 'down' | 'unclear';
  expression: ChangeExpression;
  /** The size as stated, unsigned, unrounded. */
  size: number;
}

/** A one-off or fading event the job named: how far its period sits above or below the rest of the pattern. */
export interface NamedEventClaim {
  kind: 'named-event';
  at: string;
  label: string;
  direction: 'above' | 'below';
  expression: ChangeExpression;
  /** The one-off part of the remainder at `at`, as stated: percent (of 1, multiplicative) or units; unsigned. */
  size: number;
}

/** The month (1–12) Easter Sunday fell in, in the reporting period's year and the year before. */
export interface EasterMonthsClaim {
  kind: 'easter-months';
  year: number;
  month: number;
  lastMonth: number;
}

export interface ClaimKinds {
  'working-days': WorkingDaysClaim;
  'level-step': LevelStepClaim;
  'named-event': NamedEventClaim;
  'easter-months': EasterMonthsClaim;
  'trend-yearly-change': TrendYearlyChangeClaim;
  'trend-direction': TrendDirectionClaim;
  'latest-change': LatestChangeClaim;
  'seasonal-peak-low': SeasonalPeakLowClaim;
  comparison: ComparisonClaim;
  'unusual-count': UnusualCountClaim;
  firmness: FirmnessClaim;
  sensitivity: SensitivityClaim;
  'since-last-brief': SinceLastBriefClaim;
  'source-revisions': SourceRevisionsClaim;
  'published-firmness': PublishedFirmnessClaim;
  'latest-value': LatestValueClaim;
  'identifiable-seasonality': IdentifiableSeasonalityClaim;
  'residual-seasonality': ResidualSeasonalityClaim;
  'yearly-totals': YearlyTotalsClaim;
  'history-limit': HistoryLimitClaim;
  none: NoClaim;
}

export type ClaimKind = keyof ClaimKinds;
export type Claim = ClaimKinds[ClaimKind];
