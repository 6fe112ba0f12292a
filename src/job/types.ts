/**
 * The job as the rest of the pipeline sees it: parsed, validated and with every default filled in that
 * does not depend on the data. Settings that do depend on the data (the seasonal period when the frequency is
 * inferred, windows that depend on the length, the automatic model) are resolved once, in job/resolve.ts,
 * right after loading, and travel down as DecompositionSettings (brief/model.ts).
 */

import type { Aggregation, GoodDirection, Method } from '../brief/model.js';
import type { Frequency } from '../data/calendar.js';

export type OutputFormat = 'html' | 'pdf' | 'eml' | 'json';

export interface DataSpec {
  /** Absolute path of the CSV or JSON file. */
  file: string;
  /** The path as written in the job, for messages. */
  fileAsWritten: string;
  format: 'csv' | 'json';
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
  /** How many cut-off periods the firmness check re-runs (default 24). */
  firmnessPeriods: number;
  /** How changes are put in words: percent, units, or auto (from the unit and the data's sign); absent: auto. */
  changeAs?: 'auto' | 'percent' | 'units';
}

export type ComparisonSpec =
  | { kind: 'same-period-last-year'; label: string | null }
  | { kind: 'year-to-date'; label: string | null }
  | { kind: 'fiscal-year-to-date'; label: string | null }
  | { kind: 'rolling-12'; label: string | null }
  | { kind: 'custom'; label: string; current: [string, string]; baseline: [string, string] };

export interface EmailSpec {
  subject: string | null;
  from: string | null;
  to: string[];
  cc: string[];
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
  pageSize: 'A4' | 'Letter';
  pdfEngine: 'builtin' | 'browser';
  pdfArchival: boolean;
  accentColour: string;
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
