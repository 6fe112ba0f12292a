/**
 * From a job file that passed validation to the resolved Job: every default filled in, `defaults:` merged
 * into each series key by key (the series' own setting wins), paths made absolute from the job's folder
 * and the names turned into the pipeline's (camelCase fields, kebab-case comparison kinds).
 * Settings that depend on the data (period from frequency, windows from length) stay null here.
 */
import { resolve } from 'node:path';
import type {
  BriefSpec,
  ComparisonSpec,
  DataSpec,
  DecompositionSpec,
  EffectsSpec,
  Job,
  OutputFormat,
  SectionName,
  SeriesSectionName,
  SeriesSpec,
} from '../vocabulary/settings.js';
import type { RawBuiltinKind, RawComparison, RawDecomposition, RawEffects, RawJob, RawSeries } from './schema.js';

/** The defaults the schema's `default` annotations also state (a test keeps the two in step). */
export const JOB_DEFAULTS = {
  organisation: '',
  author: '',
  contact: '',
  locale: 'en-GB',
  fiscalYearStart: 1,
  outputs: ['html', 'pdf'] as OutputFormat[],
  pageSize: 'A4' as const,
  pdfEngine: 'builtin' as const,
  pdfArchival: false,
  accent: '#1F5C99',
  sections: ['overview', 'series', 'cautions', 'method', 'data'] as SectionName[],
  seriesSections: [
    'headline',
    'key_figures',
    'notes',
    'charts',
    'comparisons',
    'unusual',
    'firmness',
  ] as SeriesSectionName[],
  dataPeriods: 400,
  unit: '',
  good: 'neither' as const,
  delimiter: ',',
  queryTimeout: 60,
  method: 'stl' as const,
  model: 'auto' as const,
  robust: false,
  firmnessPeriods: 24,
  days: 'none' as const,
  leapYear: false,
  fadingRate: 0.7,
  find: 'auto' as const,
  findKinds: ['one_off', 'step', 'fading'] as ('one_off' | 'step' | 'fading')[],
  recordStore: 'sqlite' as const,
  recordFile: 'trendbrief-record.sqlite',
  recordConnectionEnv: 'TRENDBRIEF_RECORD_URL',
  recordRequired: false,
  comparisons: ['year_on_year', 'year_to_date', 'latest_year'] as RawBuiltinKind[],
};

const KINDS: Record<RawBuiltinKind, Exclude<ComparisonSpec['kind'], 'custom'>> = {
  year_on_year: 'year-on-year',
  year_to_date: 'year-to-date',
  fiscal_year_to_date: 'fiscal-year-to-date',
  latest_year: 'latest-year',
};

/** The resolved job. `file` is the absolute path of the job file, `sha256` the hash of its bytes. */
export function resolveJob(raw: RawJob, file: string, sha256: string): Job {
  const dir = resolve(file, '..');
  const brief = resolveBrief(raw.brief, dir);
  return {
    file,
    dir,
    sha256,
    brief,
    series: raw.series.map((s) => resolveSeries(s, raw.defaults ?? {}, brief.locale, dir)),
    comparisons: (raw.comparisons ?? JOB_DEFAULTS.comparisons).map(resolveComparison),
    record: {
      store: raw.record?.store ?? JOB_DEFAULTS.recordStore,
      file: resolve(dir, raw.record?.file ?? JOB_DEFAULTS.recordFile),
      connectionEnv: raw.record?.connection_env ?? JOB_DEFAULTS.recordConnectionEnv,
      name: raw.record?.name ?? null,
      required: raw.record?.required ?? JOB_DEFAULTS.recordRequired,
    },
  };
}

function resolveBrief(b: RawJob['brief'], dir: string): BriefSpec {
  const locale = Intl.getCanonicalLocales(b.locale ?? JOB_DEFAULTS.locale)[0];
  return {
    title: b.title,
    organisation: b.organisation ?? JOB_DEFAULTS.organisation,
    author: b.author ?? JOB_DEFAULTS.author,
    contact: b.contact ?? JOB_DEFAULTS.contact,
    period: b.period ?? null,
    locale,
    fiscalYearStartMonth: b.fiscal_year_start ?? JOB_DEFAULTS.fiscalYearStart,
    outputs: [...(b.outputs ?? JOB_DEFAULTS.outputs)],
    chartFiles: [...(b.chart_files ?? [])],
    pageSize: b.page_size ?? JOB_DEFAULTS.pageSize,
    pdfEngine: b.pdf_engine ?? JOB_DEFAULTS.pdfEngine,
    pdfArchival: b.pdf_archival ?? JOB_DEFAULTS.pdfArchival,
    accentColour: b.accent ?? JOB_DEFAULTS.accent,
    layout: {
      sections: [...(b.sections ?? JOB_DEFAULTS.sections)],
      seriesSections: [...(b.series_sections ?? JOB_DEFAULTS.seriesSections)],
      dataPeriods: b.data_periods === 'all' ? null : (b.data_periods ?? JOB_DEFAULTS.dataPeriods),
    },
    logo: b.logo === undefined ? null : resolve(dir, b.logo),
    templates: b.templates === undefined ? null : resolve(dir, b.templates),
    email: {
      subject: b.email?.subject ?? null,
      from: b.email?.from ?? null,
      to: [...(b.email?.to ?? [])],
      cc: [...(b.email?.cc ?? [])],
    },
  };
}

function resolveSeries(s: RawSeries, shared: NonNullable<RawJob['defaults']>, locale: string, dir: string): SeriesSpec {
  const combine = s.combine ?? shared.combine;
  // The schema requires combine in every series unless defaults sets it.
  if (combine === undefined) throw new Error(`series ${s.id} has no combine; validation should have caught this`);
  return {
    id: s.id,
    label: s.label,
    unit: s.unit ?? shared.unit ?? JOB_DEFAULTS.unit,
    aggregation: combine,
    goodDirection: s.good ?? shared.good ?? JOB_DEFAULTS.good,
    data: resolveData(s.data, locale, dir),
    frequency: s.frequency ?? shared.frequency ?? null,
    decomposition: resolveDecomposition({ ...shared.decomposition, ...s.decomposition }),
    effects: resolveEffects({ ...shared.effects, ...s.effects }, dir),
    firmnessPeriods: s.firmness?.periods ?? JOB_DEFAULTS.firmnessPeriods,
    changeAs: s.change_as ?? shared.change_as ?? 'auto',
  };
}

function resolveData(d: RawSeries['data'], locale: string, dir: string): DataSpec {
  const equals = d.filter?.equals;
  const postgres = d.connection_env !== undefined;
  const file = d.file ?? '';
  return {
    file: postgres ? '' : resolve(dir, file),
    fileAsWritten: postgres ? `PostgreSQL ($${d.connection_env})` : file,
    format: postgres ? 'postgres' : (d.format ?? formatOfFile(file)),
    sheet: d.sheet ?? null,
    range: d.range ?? null,
    headerRow: d.header_row ?? null,
    query: d.query ?? null,
    connectionEnv: d.connection_env ?? null,
    parameters: d.parameters ? [...d.parameters] : [],
    timeoutSeconds: d.timeout ?? JOB_DEFAULTS.queryTimeout,
    dateColumn: d.date,
    valueColumn: d.value,
    filter: d.filter
      ? { column: d.filter.column, values: Array.isArray(equals) ? [...equals] : [equals as string] }
      : null,
    groupBy: d.group_by ?? null,
    decimal: d.decimal ?? localeDecimal(locale),
    delimiter: d.delimiter ?? JOB_DEFAULTS.delimiter,
  };
}

/** A data file's format from its name: .json, .xlsx, .sqlite/.sqlite3/.db, or CSV for anything else. */
export function formatOfFile(file: string): 'csv' | 'json' | 'xlsx' | 'sqlite' {
  const lower = file.toLowerCase();
  if (lower.endsWith('.json')) return 'json';
  if (lower.endsWith('.xlsx')) return 'xlsx';
  if (/\.(sqlite3?|db)$/.test(lower)) return 'sqlite';
  return 'csv';
}

/** The locale's decimal mark, e.g. "," for de-DE; "." for locales whose mark is neither. */
export function localeDecimal(locale: string): '.' | ',' {
  const mark = new Intl.NumberFormat(locale).formatToParts(1.5).find((p) => p.type === 'decimal')?.value;
  return mark === ',' ? ',' : '.';
}

function resolveDecomposition(d: RawDecomposition): DecompositionSpec {
  return {
    method: d.method ?? JOB_DEFAULTS.method,
    model: d.model ?? JOB_DEFAULTS.model,
    period: d.period ?? null,
    periods: d.periods ? [...d.periods] : null,
    seasonalWindow: Array.isArray(d.seasonal_window) ? [...d.seasonal_window] : (d.seasonal_window ?? null),
    seasonalDegree: d.seasonal_degree ?? null,
    trendWindow: d.trend_window ?? null,
    trendDegree: d.trend_degree ?? null,
    lowpassWindow: d.lowpass_window ?? null,
    lowpassDegree: d.lowpass_degree ?? null,
    robust: d.robust ?? JOB_DEFAULTS.robust,
    inner: d.inner ?? null,
    outer: d.outer ?? null,
    iterations: d.iterations ?? null,
    henderson: typeof d.henderson === 'number' ? d.henderson : null,
    extend: d.extend ?? 'auto',
    matchYearlyTotals: d.match_yearly_totals ?? false,
  };
}

const KIND_NAMES = { step: 'step', fading: 'fading', one_off: 'one-off', ramp: 'ramp' } as const;

function resolveEffects(e: RawEffects, dir: string): EffectsSpec {
  return {
    days: e.days === 'each_weekday' ? 'each-weekday' : (e.days ?? JOB_DEFAULTS.days),
    leapYear: e.leap_year ?? JOB_DEFAULTS.leapYear,
    easterDays: typeof e.easter_days === 'number' ? e.easter_days : null,
    holidays: e.holidays ?? null,
    holidayFile: e.holiday_file === undefined ? null : resolve(dir, e.holiday_file),
    holidayFileAsWritten: e.holiday_file ?? null,
    events: (e.events ?? []).map((v) => ({
      kind: KIND_NAMES[v.kind],
      at: v.at,
      until: v.until ?? null,
      label: v.label,
      fadingRate: v.fading_rate ?? JOB_DEFAULTS.fadingRate,
    })),
    find: e.find ?? JOB_DEFAULTS.find,
    findKinds: (e.find_kinds ?? JOB_DEFAULTS.findKinds).map((k) => KIND_NAMES[k] as 'one-off' | 'step' | 'fading'),
  };
}

function resolveComparison(c: RawComparison): ComparisonSpec {
  if (typeof c === 'string') return { kind: KINDS[c], label: null };
  if ('custom' in c && c.custom) {
    const { label, current, baseline } = c.custom;
    return { kind: 'custom', label, current: [current[0], current[1]], baseline: [baseline[0], baseline[1]] };
  }
  const [name, value] = Object.entries(c)[0] as [RawBuiltinKind, { label: string }];
  return { kind: KINDS[name], label: value.label };
}
