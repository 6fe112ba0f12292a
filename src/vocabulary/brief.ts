/**
 * The Brief model: everything a renderer may read. Figures are computed upstream (decompose, diagnose,
 * analyse, narrate, chart); templates and renderers only lay them out. Numbers are plain numbers with NaN
 * for "undefined"; the JSON writer turns NaN into null.
 */

import type { ChangeExpression, Claim, DirectionWord, Materiality, SeasonNaming } from './claims.js';
import type { Frequency, Ordinals, TimeIndex } from './period-index.js';
import type { Scene } from './scene.js';
import type { IdentifiableSeasonality, ResidualSeasonality } from './seasonality.js';
import type { Aggregation, GoodDirection, LayoutSpec, Method, Model } from './settings.js';

export type Direction = 'rising' | 'falling' | 'flat';

/** The effect settings of a series, resolved once the data are known (job/resolve-effects.ts). */
export interface EffectSettings {
  /** Whether anything is estimated at all. */
  on: boolean;
  days: 'working' | 'each-weekday' | 'none';
  leapYear: boolean;
  /** Easter window in days before Easter Sunday; null for none. */
  easterDays: number | null;
  /** Where the holidays come from, in words ("England, United Kingdom (date-holidays 3.37.0)"); null for none. */
  holidays: string | null;
  /** Events the job names, up to the reporting period. */
  events: {
    kind: EventKind;
    /** Index into the series. */
    at: number;
    /** ISO date of that period. */
    date: string;
    /** A ramp's last index; null otherwise. */
    until: number | null;
    label: string;
    fadingRate: number;
  }[];
  /** Kinds of event the search looks for; empty when it is off. */
  find: ('one-off' | 'step' | 'fading')[];
  /** Why the search is on or off, in words. */
  findReason: string;
  /** Whether the job asked for any effect itself (not only the search that is on by default). */
  asked: boolean;
}

export type EventKind = 'step' | 'fading' | 'one-off' | 'ramp';

/** What the estimated effects were, for the words, the method appendix and the chart. */
export interface EffectsReport {
  /** Why effects were not taken out, in one sentence; null when they were. */
  skipped: string | null;
  /** Effects as factors (multiplicative model, estimated on logarithms) or in the series' units. */
  scale: 'units' | 'factor';
  /** Events named or found, in time order. */
  events: {
    kind: EventKind;
    /** Index into components.dates. */
    at: number;
    date: string;
    /** Effect on the model's scale: units, or a logarithm when scale is factor. */
    estimate: number;
    t: number;
    /** The job's label; null for one the search found. */
    label: string | null;
  }[];
  /** Calendar regressor groups tried: kept when the model with them has the lower AICc. */
  groups: { name: string; kept: boolean; aiccWith: number; aiccWithout: number }[];
  /** Working days of each period (null when working days were not asked for). */
  workingDays: number[] | null;
  /** Holidays on Monday to Friday within the series' span, as ISO dates: what working days leave out. */
  holidays: string[];
  /** The ARIMA orders of the regression's errors, e.g. "ARIMA(0,1,1)(0,1,1)[12]". */
  model: string | null;
  /** The critical |t| the search used (Ljung 1993), or null when it did not run. */
  criticalValue: number | null;
}

/** Every decomposition setting actually used, defaults included. */
export interface DecompositionSettings {
  method: Method;
  model: Model;
  /** How the model was chosen, in words ("set in the job", or the automatic rule's finding). */
  modelReason: string;
  modelAuto: boolean;
  /** The main seasonal period: the only one, or for mstl the shortest (whose profile the brief shows). */
  period: number;
  /** Every seasonal period, ascending; one entry unless the method is mstl. */
  periods: number[];
  /** STL seasonal window per period (odd, ≥ 7), or 'periodic'. */
  seasonalWindows: (number | 'periodic')[];
  seasonalDegree: 0 | 1;
  /** Trend window of the fit whose trend is kept (for mstl, the last period's). */
  trendWindow: number;
  /** Trend window of each period's STL fit (one entry unless the method is mstl). */
  trendWindows: number[];
  trendDegree: 0 | 1;
  lowpassWindow: number;
  /** Low-pass window of each period's STL fit. */
  lowpassWindows: number[];
  lowpassDegree: 0 | 1;
  seasonalJump: number;
  trendJump: number;
  lowpassJump: number;
  inner: number;
  outer: number;
  robust: boolean;
  /** MSTL passes over the periods. */
  iterations: number;
  /** Classical: the trend filter. 'henderson' gives a trend up to the last observation. */
  trendFilter: 'centred' | 'henderson';
  /** Length of the Henderson filter used for the final trend, or null when none is applied. */
  hendersonLength: number | null;
  /**
   * Whether the season is removed: not when the combined test finds no identifiable seasonality in any
   * period (diagnose/identifiable-seasonality.ts); the trend is then that of the unadjusted data
   * (decompose/without-season.ts). `reason` in words.
   */
  seasonalAdjustment: { applied: boolean; reason: string };
  /** Effects estimated and taken out before decomposition (src/adjust/regression-effects.ts); absent: none. */
  effects?: EffectSettings;
  /** Forecast extension before decomposition (src/adjust/extend.ts). */
  extension: {
    on: boolean;
    /** Periods of forecasts added. */
    horizon: number;
    kind: 'seasonal-arima' | 'arima-on-adjusted';
    /** Why it is on or off, in words. */
    reason: string;
  };
  /**
   * Whether the seasonally adjusted series is forced to the raw totals of each whole year (job key
   * match_yearly_totals; src/adjust/denton.ts), and the month its years start (1: calendar years; else
   * the job's fiscal_year_start).
   */
  yearlyTotals: { match: boolean; yearStartMonth: number };
}

export interface Components {
  /** ISO dates of each period's start (date-time for hourly data). */
  dates: string[];
  observed: number[];
  trend: number[];
  seasonal: number[];
  remainder: number[];
  /**
   * Seasonally adjusted: observed − seasonal, or observed / seasonal for a multiplicative model; when the
   * job matches yearly totals, that series benchmarked to the raw yearly totals (Denton), and the
   * decomposition's own is in `adjustedAsDecomposed`.
   */
  adjusted: number[];
  /** The adjusted series before benchmarking to yearly totals; present only when the job asks for it. */
  adjustedAsDecomposed?: number[];
  /** MSTL: one seasonal component per period, keyed by the period. */
  seasonals?: Record<string, number[]>;
  /** Robust STL weights (1 = ordinary, 0 = ignored). */
  weights?: number[];
  /**
   * Calendar effects (working days, leap year, Easter) when any were kept: observed = trend + seasonal +
   * calendar + remainder (or the product), and adjusted is observed less (or over) seasonal and calendar.
   */
  calendar?: number[];
  /** The part of the trend that is estimated steps and ramps (0, or 1 as a factor, where there is none). */
  steps?: number[];
  /** The part of the remainder that is estimated one-off and fading events. */
  oneOff?: number[];
}

export interface Change {
  current: number;
  /** The value compared against (a year ago, or the previous period). */
  yearAgo: number;
  change: number;
  /** 100·(current/yearAgo − 1); NaN when the base is zero or undefined. */
  percent: number;
  /** ISO dates of the two periods compared. */
  currentDate: string;
  baseDate: string;
}

export interface TurningPoint {
  index: number;
  date: string;
  kind: 'peak' | 'trough';
  value: number;
}

export interface SeasonEffect {
  /** 0-based order of the season in its cycle (month 0 = January, weekday 0 = Monday). */
  season: number;
  /** "January", "Q1", "Monday", "week 9", "13:00", or "3" for the third position of a cycle. */
  label: string;
  /** Typical effect in the series' units (a multiplicative factor times the mean level of the cycles). */
  effect: number;
  /** Effect as a percent of the mean level of the cycles; NaN when that level or any value is not positive. */
  effectPercent: number;
}

export interface SeasonalProfile {
  /** Observations per cycle of this pattern. */
  period: number;
  /** How its seasons are named and grouped. */
  naming: SeasonNaming;
  /** The whole cycle(s) the profile averages, as an inclusive index range ({-1, -1} when there is none). */
  cycles: { from: number; to: number };
  /** Mean observed value over those cycles. */
  level: number;
  seasons: SeasonEffect[];
  peak: SeasonEffect;
  trough: SeasonEffect;
  /** Raw change from the previous period to the reporting period. */
  latestRawChange: number;
  /** How much of that change the usual season accounts for. */
  latestSeasonalChange: number;
  /** latestSeasonalChange / latestRawChange as a percent (NaN when the raw change is zero). */
  seasonalSharePercent: number;
}

export interface ComparisonValues {
  current: number;
  baseline: number;
  change: number;
  percent: number;
}

/** A run of periods: ISO labels of its first and last, how many, and their ordinals (what later stages read). */
export interface PeriodSpan {
  from: string;
  to: string;
  periods: number;
  ordinals: Ordinals;
}

export interface Comparison {
  id: string;
  kind: 'year-on-year' | 'year-to-date' | 'fiscal-year-to-date' | 'latest-year' | 'custom';
  label: string;
  aggregation: Aggregation;
  current: PeriodSpan;
  baseline: PeriodSpan;
  /** True when the current span is shorter than its calendar unit (a year to date). */
  partial: boolean;
  /**
   * How the baseline was matched (analyse/spans.ts): the same months, quarters or dates a year before
   * ('calendar'), the same ISO week numbers ('iso-week'), the same weekday 52 weeks back ('weekday'), a year
   * of periods back ('periods'), or spans the job names ('custom').
   */
  alignment: 'calendar' | 'iso-week' | 'weekday' | 'periods' | 'custom';
  raw: ComparisonValues;
  adjusted: ComparisonValues;
  trend: ComparisonValues;
}

export interface Outlier {
  index: number;
  date: string;
  observed: number;
  remainder: number;
  /** Remainder in robust standard deviations (1.4826·MAD). */
  score: number;
}

export interface Revision {
  index: number;
  date: string;
  /** The trend's year-over-year percent as first estimated with data up to this period. */
  first: number;
  /** The same figure estimated with all the data: settled, as the period lies before the provisional zone. */
  latest: number;
  /** latest − first (later minus earlier, the convention of official revision analysis). */
  revision: number;
}

export interface Firmness {
  /** How many cut-off periods were re-run and compared; every cut lies before provisionalFrom. */
  periodsChecked: number;
  revisions: Revision[];
  meanAbsoluteRevision: number;
  /** 10th and 90th percentiles of the revisions (type 7), in percentage points. */
  range80: [number, number];
  /** How many of the revisions lie inside range80 (ends included): what the range really holds. */
  withinRange80: number;
  /**
   * Why there are no revisions: 'none' when the study ran; 'too-short' when no cut leaves a settled
   * estimate after it (see neededLength); 'no-end-estimate' when the fit gives no trend at a cut's end.
   */
  limit: 'none' | 'too-short' | 'no-end-estimate';
  /** Fewest periods of data with which the study can make one cut. */
  neededLength: number;
  /** Index of the first trend value computed with end (asymmetric) weights. */
  provisionalFrom: number;
  provisionalCount: number;
  provisionalReason: string;
  /** Periods each re-fit (this study and the sensitivity search) saw, for a long series; null when all. */
  refitWindow?: number | null;
}

export interface Sensitivity {
  direction: Direction;
  /** The raw value next period would need for the trend's direction to reverse; NaN if none found. */
  reversalValue: number;
  nextDate: string;
  /** The lower or upper side: 'below' means a value below reversalValue turns the trend. */
  side: 'below' | 'above' | 'none';
}

export interface TrendYearly {
  expression: ChangeExpression;
  /** Percent of the trend a year before when relative (NaN unless that is positive); units when absolute. */
  value: number;
  materiality: Materiality;
  direction: DirectionWord | 'unknown';
  /** Periods in a row, up to the reporting period, the trend has stepped in `direction` (0 when unchanged). */
  run: number;
}

export interface Analysis {
  trendYoY: Change;
  adjustedYoY: Change;
  rawYoY: Change;
  trendPoP: Change;
  adjustedPoP: Change;
  /** Trend growth over the last 6 periods, annualised, in percent. */
  trendAnnualised6: number;
  direction: Direction;
  /** Periods in a row the trend has moved in `direction`. */
  directionRun: number;
  turningPointRule: string;
  turningPoints: TurningPoint[];
  /** The main pattern's profile (the chart's); the first of seasonalProfiles. */
  seasonalProfile: SeasonalProfile;
  /** One profile per seasonal period, ascending. */
  seasonalProfiles: SeasonalProfile[];
  /** The trend's change over a year as the brief states it, and the direction word of the materiality rule. */
  trendYearly: TrendYearly;
  /**
   * The span the headline's change (trendYoY, rawYoY, adjustedYoY, trendYearly) is over: a year of
   * periods when the data hold two years before the reporting period (`needed` in all); otherwise the
   * shorter span they support (analyse/headline-span.ts), and `yearly` is false. `available`: periods to
   * the reporting period.
   */
  headlineSpan: { periods: number; yearly: boolean; needed: number; available: number };
  comparisons: Comparison[];
  /** Comparisons the job asks for whose spans reach outside the data: left out, and said so. */
  comparisonsLeftOut: Comparison[];
  /**
   * The span the unusual periods are listed for: from index `from` to the reporting period, the last
   * `years` calendar years (0 when the data do not reach that far back and the span is the whole series).
   */
  recentSpan: { from: number; years: number };
  /** Unusual periods within recentSpan. */
  outliers: Outlier[];
  firmness: Firmness;
  sensitivity: Sensitivity;
}

export interface Diagnostics {
  trendStrength: number;
  seasonalStrength: number;
  /** Outliers over the whole series by median ± 3 × 1.4826 × MAD of the remainder. */
  outliers: Outlier[];
  residualSeasonality: ResidualSeasonality;
  /** The combined test for identifiable seasonality, one per seasonal period (ascending), on the data. */
  identifiableSeasonality: IdentifiableSeasonality[];
}

export interface Figure {
  name: string;
  value: number | string;
  unit: string;
  formatted: string;
}

/** What a statement is about; renderers pick statements by kind. Add a kind here with its statement. */
export type StatementKind =
  | 'headline'
  | 'context'
  | 'seasonal'
  | 'history'
  | 'comparison'
  | 'unusual'
  | 'effects'
  | 'firmness'
  | 'sensitivity'
  | 'caution'
  | 'overview';

export interface Statement {
  id: string;
  kind: StatementKind;
  text: string;
  figures: Figure[];
  /** What the words assert, in machine-readable form; src/verify/ checks each against the data. */
  claims: Claim[];
}

export interface Chart {
  id: string;
  title: string;
  /** One-sentence description for screen readers and the email's alt text. */
  alt: string;
  caption: string;
  svg: string;
  width: number;
  height: number;
  /** The marks the SVG was written from, for renderers that draw them directly (the PDF); absent for an
   * SVG from elsewhere, which such renderers then read as SVG. */
  scene?: Scene;
}

export interface DataProvenance {
  /** The file as written in the job; for PostgreSQL, "PostgreSQL ($VARIABLE)". */
  file: string;
  /** SHA-256 of the file's bytes; for a database, of the query and the rows it returned. */
  sha256: string;
  /** What was read: csv, json, xlsx (with the sheet), sqlite or postgres. */
  source?: string;
  /** A database's query, as written in the job. */
  query?: string;
  rows: number;
  dateColumn: string;
  valueColumn: string;
  /** Periods with no value (became NaN). */
  gaps: string[];
  notes: string[];
}

/**
 * What an earlier brief published about a series, as the record keeps it; read before this brief is built
 * (cli/batch.ts) and handed down, so nothing in the build reaches for the record itself.
 */
export interface PastIssue {
  /** ISO date of the earlier brief's reporting period. */
  period: string;
  /** 1 for the first publication of that period, 2 for its re-issue… */
  issue: number;
  recordedAt: string;
  /** The trend's year-over-year percent at its reporting period, as published (NaN for none). */
  trendYoYPercent: number;
  /** The same change in the series' units (NaN for none). */
  trendYoYChange: number;
  /** The data it used: ISO dates and observed values (NaN for a gap). */
  dates: string[];
  values: number[];
}

/** What the record adds to a series: the last brief's figure now, source revisions, published firmness. */
export interface SeriesHistory {
  /** The latest earlier brief: its period, the trend's yearly change it published, and that figure today. */
  sinceLast: { period: string; published: number; now: number; publishedChange: number; nowChange: number } | null;
  /** Values of periods before the last brief's that the source data changed since it (oldest first). */
  sourceRevisions: { date: string; before: number; after: number }[];
  /** Published first estimates against today's, once six or more earlier periods were published. */
  published: { revisions: Revision[]; meanAbsoluteRevision: number; range80: [number, number] } | null;
  /** How many earlier periods the record holds for this series. */
  briefs: number;
}

export interface SeriesBrief {
  id: string;
  label: string;
  unit: string;
  /** The group this brief is for, when the job splits data by a column. */
  group: string | null;
  aggregation: Aggregation;
  goodDirection: GoodDirection;
  frequency: Frequency;
  settings: DecompositionSettings;
  /** How changes are put in words for this series, and why (the job's setting or the default's finding). */
  changeExpression: ChangeExpression;
  changeExpressionReason: string;
  /** What forecast extension did for this series (settings.extension says whether it was asked for). */
  extension: ExtensionReport;
  /** What matching the adjusted series to the raw yearly totals did; null when the job does not ask for it. */
  yearlyTotals?: YearlyTotalsReport | null;
  /** Calendar effects and events taken out before decomposition; null when none were asked for. */
  effects?: EffectsReport | null;
  /**
   * The period index of the components: position i is the period of ordinal periodIndex.start + i, whose
   * ISO label is components.dates[i]. Stages after analyse/ read periods from here (ordinalAt), never by
   * parsing a label; the JSON keeps only the labels.
   */
  periodIndex: TimeIndex;
  /** Index into components.dates of the reporting period. */
  reportingIndex: number;
  reportingDate: string;
  components: Components;
  diagnostics: Diagnostics;
  analysis: Analysis;
  statements: Statement[];
  charts: Chart[];
  data: DataProvenance;
  /** From the record of earlier briefs; null when there is none (or the brief is not recorded). */
  history?: SeriesHistory | null;
}

export interface ExtensionReport {
  /** Whether forecasts were added before decomposing. */
  used: boolean;
  /** Periods of forecasts added (0 when not used). */
  added: number;
  /** The model that made the forecasts, e.g. "ARIMA(0,1,1) on the seasonally adjusted series". */
  model: string | null;
  /** Why an extension that was asked for was skipped, in one sentence; null otherwise. */
  skipped: string | null;
}

export interface YearlyTotalsReport {
  /** The whole years forced to the raw totals, as ISO dates of their first and last periods. */
  years: { from: string; to: string; ordinals: Ordinals }[];
  /** Why no year was forced, in one sentence; null when some were. */
  skipped: string | null;
}

export interface Provenance {
  tool: string;
  toolVersion: string;
  jobFile: string;
  jobSha256: string;
  /** ISO date-time; from SOURCE_DATE_EPOCH when set. */
  generatedAt: string;
}

export interface BriefMeta {
  title: string;
  organisation: string;
  author: string;
  contact: string;
  locale: string;
  /** 1 = January. */
  fiscalYearStartMonth: number;
  accentColour: string;
  logo: { mime: string; dataUri: string } | null;
  pageSize: 'A4' | 'Letter';
  /** Which parts the brief holds and in which order (job keys sections, series_sections, data_periods). */
  layout: LayoutSpec;
}

/** Of a series, what the head of the brief shows: a SeriesBrief has it, and so does a series not yet built. */
export type SeriesHead = Pick<
  SeriesBrief,
  'id' | 'label' | 'frequency' | 'reportingDate' | 'periodIndex' | 'reportingIndex'
>;

export interface Brief {
  meta: BriefMeta;
  provenance: Provenance;
  series: SeriesBrief[];
  /** Cautions shown once per brief (provisional ends, not a forecast, defer to a prescribed method). */
  cautions: Statement[];
}
