/**
 * The job as the rest of the pipeline sees it: parsed, validated and with every default filled in that
 * does not depend on the data. Settings that do depend on the data (the seasonal period when the frequency is
 * inferred, windows that depend on the length, the automatic model) are resolved once, in job/resolve.ts,
 * right after loading, and travel down as DecompositionSettings (vocabulary/brief.ts).
 */

import type { Frequency } from './period-index.js';

/** The decomposition method, the model, how periods combine, and which way is good for the reader. */
export type Method = 'classical' | 'stl' | 'mstl';
export type Model = 'additive' | 'multiplicative';
export type Aggregation = 'sum' | 'mean';
export type GoodDirection = 'up' | 'down' | 'neither';

export type OutputFormat = 'html' | 'pdf' | 'eml' | 'json';
/** A chart written as a file of its own: SVG, or PNG at twice its size. */
export type ChartFileFormat = 'svg' | 'png';

/** What a data source is: a file (CSV, JSON, Excel workbook), a SQLite database file, or a PostgreSQL query. */
export type DataFormat = 'csv' | 'json' | 'xlsx' | 'sqlite' | 'postgres';

/** A value the query's parameters may take, drawn from the reporting period. */
export type QueryParameter = 'period' | 'period_start' | 'period_end';

export interface DataSpec {
  /** Absolute path of the file ("" for PostgreSQL). */
  file: string;
  /** The path as written in the job, for messages; for PostgreSQL, "PostgreSQL ($ENV)". */
  fileAsWritten: string;
  format: DataFormat;
  /** Workbooks: the sheet by name or 1-based position; null for the first. */
  sheet?: string | number | null;
  /** Workbooks: the cell range holding the table (header included), e.g. "B3:E200"; null for the used cells. */
  range?: string | null;
  /** Workbooks: the header's row number as the sheet shows it; null for the first row not empty. */
  headerRow?: number | null;
  /** Databases: the query, as written. */
  query?: string | null;
  /** PostgreSQL: the name of the environment variable holding the connection string (never its value). */
  connectionEnv?: string | null;
  /** Databases: the query's parameters, in order. */
  parameters?: QueryParameter[];
  /** Databases: seconds (PostgreSQL: statement timeout; SQLite: wait for a writer's lock). */
  timeoutSeconds?: number;
  dateColumn: string;
  valueColumn: string;
  /** Keep only rows whose column equals one of the values. */
  filter: { column: string; values: string[] } | null;
  /** One brief per distinct value of this column. */
  groupBy: string | null;
  /** Decimal mark of numbers in the file; from the locale unless set. */
  decimal: '.' | ',';
  /** CSV delimiter. */
  delimiter: string;
}

/** Decomposition settings as written in the job; anything absent is resolved from the data. */
export interface DecompositionSpec {
  method: Method;
  model: 'auto' | 'additive' | 'multiplicative';
  period: number | null;
  periods: number[] | null;
  seasonalWindow: number | 'periodic' | (number | 'periodic')[] | null;
  seasonalDegree: 0 | 1 | null;
  trendWindow: number | null;
  trendDegree: 0 | 1 | null;
  lowpassWindow: number | null;
  lowpassDegree: 0 | 1 | null;
  robust: boolean;
  inner: number | null;
  outer: number | null;
  iterations: number | null;
  /** Henderson filter length for the final trend; null for none (classical default: none). */
  henderson: number | null;
  /** Forecast extension before decomposition: auto, on, off, or a number of periods. */
  extend: 'auto' | 'on' | 'off' | number;
  /** Force the adjusted series' yearly totals to the raw ones (Denton); job key match_yearly_totals. */
  matchYearlyTotals: boolean;
}

/** An event the job names (effects.events): its kind, where it starts (as written) and its label. */
export interface EventSpec {
  kind: 'step' | 'fading' | 'one-off' | 'ramp';
  at: string;
  /** A ramp's last period, as written; null for other kinds. */
  until: string | null;
  label: string;
  /** Fading events: the share of the effect left after each period. */
  fadingRate: number;
}

/** Effects taken out before the decomposition (job key effects:, merged with defaults.effects key by key). */
export interface EffectsSpec {
  days: 'working' | 'each-weekday' | 'none';
  leapYear: boolean;
  /** Days before Easter Sunday of the Easter window; null for no Easter effect. */
  easterDays: number | null;
  /** A region code of the holiday library; null for none. */
  holidays: string | null;
  /** Absolute path of a file of holiday dates; null for none. */
  holidayFile: string | null;
  /** The holiday file's path as the job writes it, for messages; null for none. */
  holidayFileAsWritten: string | null;
  events: EventSpec[];
  /** The search for events nobody named; auto: on for monthly and quarterly data. */
  find: 'auto' | 'on' | 'off';
  findKinds: ('one-off' | 'step' | 'fading')[];
}

export interface SeriesSpec {
  id: string;
  label: string;
  unit: string;
  aggregation: Aggregation;
  goodDirection: GoodDirection;
  data: DataSpec;
  frequency: Frequency | null;
  decomposition: DecompositionSpec;
  effects: EffectsSpec;
  /** How many cut-off periods the firmness check re-runs (default 24). */
  firmnessPeriods: number;
  /** How changes are put in words: percent, units, or auto (from the unit and the data's sign); absent: auto. */
  changeAs: 'auto' | 'percent' | 'units';
}

export type ComparisonSpec =
  | { kind: 'year-on-year'; label: string | null }
  | { kind: 'year-to-date'; label: string | null }
  | { kind: 'fiscal-year-to-date'; label: string | null }
  | { kind: 'latest-year'; label: string | null }
  | { kind: 'custom'; label: string; current: [string, string]; baseline: [string, string] };

export interface EmailSpec {
  subject: string | null;
  from: string | null;
  to: string[];
  cc: string[];
}

/** A top-level part of the brief (job key brief.sections). */
export type SectionName = 'overview' | 'series' | 'cautions' | 'method' | 'data';
/** A part of each series' section (job key brief.series_sections). */
export type SeriesSectionName =
  | 'headline'
  | 'key_figures'
  | 'notes'
  | 'charts'
  | 'comparisons'
  | 'unusual'
  | 'firmness';

/** Which parts the brief holds, in which order, in every format; and how long the data appendix is. */
export interface LayoutSpec {
  sections: SectionName[];
  seriesSections: SeriesSectionName[];
  /** The latest periods of each series the data appendix lists; null for every period. */
  dataPeriods: number | null;
}

export interface BriefSpec {
  title: string;
  organisation: string;
  author: string;
  contact: string;
  /** Reporting period as written (e.g. "2026-09"), or null for the last observation. */
  period: string | null;
  locale: string;
  fiscalYearStartMonth: number;
  outputs: OutputFormat[];
  /** Charts also written as files of their own (svg, png); empty for none. */
  chartFiles: ChartFileFormat[];
  pageSize: 'A4' | 'Letter';
  pdfEngine: 'builtin' | 'browser';
  pdfArchival: boolean;
  accentColour: string;
  layout: LayoutSpec;
  /** Absolute path of the logo file, or null. */
  logo: string | null;
  /** Absolute path of a folder of template overrides, or null. */
  templates: string | null;
  email: EmailSpec;
}

/** Where the briefs of a job are recorded (src/record/). */
export interface RecordSpec {
  store: 'sqlite' | 'postgres' | 'none';
  /** Absolute path of the SQLite file. */
  file: string;
  /** Name of the environment variable holding the PostgreSQL connection string. */
  connectionEnv: string;
  /** Name of the brief in the record, or null for its title. */
  name: string | null;
  /** Fail the brief when it cannot be recorded. */
  required: boolean;
}

export interface Job {
  /** Absolute path of the job file. */
  file: string;
  /** Folder of the job file; data paths are relative to it. */
  dir: string;
  sha256: string;
  brief: BriefSpec;
  series: SeriesSpec[];
  comparisons: ComparisonSpec[];
  record: RecordSpec;
}
