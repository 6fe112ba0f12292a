/**
 * Checks the schema cannot make: duplicate ids, files and folders that must exist, settings that depend on
 * each other (after `defaults:` is merged in), periods that must be real calendar dates. Each finding is a
 * Problem tied to a path in the file, so load.ts can point at its line and column.
 */
import { statSync } from 'node:fs';
import { extname, resolve } from 'node:path';
import { isoWeekStart, isoWeeksInYear } from '../vocabulary/period-index.js';
import { formatOfFile } from './defaults.js';
import { type JobPath, type Problem, pathText } from './schema.js';

// Each check reads only the parts that have the right type, so all run even when the schema found mistakes
// elsewhere, and one run reports every mistake.

type Rec = Record<string, unknown>;

function rec(value: unknown): Rec | undefined {
  return value !== null && typeof value === 'object' && !Array.isArray(value) ? (value as Rec) : undefined;
}

function str(value: unknown): string | undefined {
  return typeof value === 'string' ? value : undefined;
}

/** Checks that need the file system, the calendar or several keys at once. `dir` is the job's folder. */
export function contentProblems(data: unknown, dir: string): Problem[] {
  const job = rec(data);
  if (!job) return [];
  const problems: Problem[] = [];
  const brief = rec(job.brief);
  if (brief) problems.push(...briefProblems(brief, dir));
  const series = Array.isArray(job.series) ? job.series : [];
  const firstWithId = new Map<string, number>();
  const perSeries: (Problem & { series: number })[] = [];
  series.forEach((raw, i) => {
    const s = rec(raw);
    if (!s) return;
    const id = str(s.id);
    if (id !== undefined) {
      const first = firstWithId.get(id);
      if (first === undefined) firstWithId.set(id, i);
      else
        problems.push({
          code: 'job-duplicate-id',
          path: ['series', i, 'id'],
          at: 'value',
          message: `series id "${id}" is used twice, by series[${first}] and series[${i}]`,
          hint: 'give each series an id of its own',
        });
    }
    const dataSpec = rec(s.data);
    if (dataSpec) problems.push(...dataProblems(dataSpec, ['series', i, 'data'], dir));
    perSeries.push(...decompositionProblems(s, i, rec(rec(job.defaults)?.decomposition)));
    problems.push(...eventProblems(rec(s.effects), ['series', i, 'effects']));
  });
  problems.push(...eventProblems(rec(rec(job.defaults)?.effects), ['defaults', 'effects']));
  problems.push(...mergeSeries(perSeries));
  const comparisons = Array.isArray(job.comparisons) ? job.comparisons : [];
  comparisons.forEach((c, i) => {
    const custom = rec(rec(c)?.custom);
    if (custom) problems.push(...spanProblems(custom, ['comparisons', i, 'custom']));
  });
  return dedupe(problems);
}

function briefProblems(brief: Rec, dir: string): Problem[] {
  const problems: Problem[] = [];
  const locale = str(brief.locale);
  if (locale !== undefined && localeProblem(locale)) {
    problems.push({
      code: 'job-locale',
      path: ['brief', 'locale'],
      at: 'value',
      message: localeProblem(locale)!,
      hint: 'write a language tag such as en-GB, en-AU, de-DE or fr-CA',
    });
  }
  const period = str(brief.period);
  if (period !== undefined && periodPattern.test(period) && Number.isNaN(periodStart(period))) {
    problems.push(noSuchPeriod(['brief', 'period'], period));
  }
  const sections = brief.sections;
  if (Array.isArray(sections) && sections.length > 0 && !sections.includes('cautions')) {
    problems.push({
      code: 'job-sections',
      path: ['brief', 'sections'],
      at: 'value',
      message:
        'brief.sections leaves out cautions, which every brief shows (provisional ends, no forecast, a prescribed method comes first)',
      hint: 'add cautions to the list, where in the brief it should come',
    });
  }
  const logo = str(brief.logo);
  if (logo !== undefined) {
    const p = fileProblem(dir, logo, ['brief', 'logo'], 'logo', 'file');
    if (p) problems.push(p);
    else if (!['.png', '.jpg', '.jpeg', '.svg'].includes(extname(logo).toLowerCase())) {
      problems.push({
        code: 'job-logo',
        path: ['brief', 'logo'],
        at: 'value',
        message: `logo "${logo}" is not a .png, .jpg, .jpeg or .svg file`,
        hint: 'save the logo as PNG, JPEG or SVG',
      });
    }
  }
  const templates = str(brief.templates);
  if (templates !== undefined) {
    const p = fileProblem(dir, templates, ['brief', 'templates'], 'templates folder', 'folder');
    if (p) problems.push(p);
  }
  return problems;
}

/** Why a locale cannot be used, or null. */
function localeProblem(locale: string): string | null {
  let canonical: string;
  try {
    [canonical] = Intl.getCanonicalLocales(locale);
  } catch {
    return `locale "${locale}" is not a valid language tag`;
  }
  // English is in every ICU Node is built with (small-icu too), and any English tag is supported through
  // it; the list of available locales costs about 4 ms to build on first use, so English skips it.
  if (canonical === 'en' || canonical.startsWith('en-')) return null;
  if (Intl.NumberFormat.supportedLocalesOf([locale]).length === 0) {
    return `locale "${locale}" is not known to this Node.js`;
  }
  return null;
}

const WORKBOOK_KEYS = ['sheet', 'range', 'header_row'] as const;
const QUERY_KEYS = ['query', 'parameters', 'timeout'] as const;
const FILE_ENDINGS = new Set(['.csv', '.json', '.xlsx', '.sqlite', '.sqlite3', '.db']);

function dataProblems(data: Rec, path: JobPath, dir: string): Problem[] {
  const file = str(data.file);
  const at = (key: string, message: string, hint: string): Problem => ({
    code: 'job-data-source',
    path: [...path, key],
    at: 'key',
    message,
    hint,
  });
  if (data.connection_env !== undefined) {
    // PostgreSQL: a query and nothing that belongs to a file.
    const wrong = ['file', 'format', ...WORKBOOK_KEYS, 'delimiter', 'decimal'].filter((k) => data[k] !== undefined);
    if (wrong.length > 0) {
      return [
        at(
          wrong[0],
          `${wrong[0]} does not go with connection_env`,
          'a PostgreSQL source is a connection_env and a query; remove this key',
        ),
      ];
    }
    if (data.query === undefined) {
      return [
        {
          ...at(
            'connection_env',
            'a PostgreSQL source needs a query',
            'add query: select … returning the date and value columns',
          ),
          at: 'value',
        },
      ];
    }
    return [];
  }
  if (file === undefined) {
    return [
      {
        code: 'job-data-source',
        path,
        at: 'value',
        message: 'data names no source: neither file nor connection_env',
        hint: 'write file: data/deliveries.csv (CSV, JSON, .xlsx or SQLite), or connection_env: VAR with a query for PostgreSQL',
      },
    ];
  }
  const missing = fileProblem(dir, file, [...path, 'file'], 'data file', 'file');
  if (missing) return [missing];
  const ext = extname(file).toLowerCase();
  if (data.format === undefined && !FILE_ENDINGS.has(ext)) {
    return [
      {
        code: 'job-data-file',
        path: [...path, 'file'],
        at: 'value',
        message: `data file "${file}" ends in none of .csv, .json, .xlsx, .sqlite, .sqlite3, .db`,
        hint: 'say which it is with format: csv, json, xlsx or sqlite',
      },
    ];
  }
  const format = (data.format as string | undefined) ?? formatOfFile(file);
  if (format === 'sqlite' && data.query === undefined) {
    return [
      {
        ...at('file', 'a SQLite source needs a query', 'add query: select … returning the date and value columns'),
        at: 'value',
      },
    ];
  }
  if (format !== 'sqlite') {
    const wrong = QUERY_KEYS.find((k) => data[k] !== undefined);
    if (wrong)
      return [
        at(
          wrong,
          `${wrong} is for databases, and this source is a ${format} file`,
          'remove it, or point file at a SQLite database',
        ),
      ];
  }
  if (format !== 'xlsx') {
    const wrong = WORKBOOK_KEYS.find((k) => data[k] !== undefined);
    if (wrong)
      return [
        at(
          wrong,
          `${wrong} is for Excel workbooks, and this source is a ${format} ${format === 'sqlite' ? 'database' : 'file'}`,
          'remove it, or point file at an .xlsx workbook',
        ),
      ];
  }
  return [];
}

/** A path that must name an existing file or folder, relative to the job's folder. */
function fileProblem(
  dir: string,
  written: string,
  path: JobPath,
  what: string,
  kind: 'file' | 'folder',
): Problem | null {
  const full = resolve(dir, written);
  const code = what === 'data file' ? 'job-data-file' : what === 'logo' ? 'job-logo' : 'job-templates';
  let isDir: boolean;
  let isFile: boolean;
  try {
    const st = statSync(full);
    isDir = st.isDirectory();
    isFile = st.isFile();
  } catch {
    return {
      code,
      path,
      at: 'value',
      message: `${what} "${written}" not found (looked for ${full})`,
      hint: "check the name; relative paths start from the job file's folder",
    };
  }
  if (kind === 'file' && isDir) {
    return { code, path, at: 'value', message: `${what} "${written}" is a folder`, hint: 'name the file inside it' };
  }
  // A named pipe or a device would be read until someone writes to it, perhaps forever.
  if (kind === 'file' && !isFile) {
    return {
      code,
      path,
      at: 'value',
      message: `${what} "${written}" is not a regular file (a pipe, socket or device)`,
      hint: 'name an ordinary file; save the data to one first',
    };
  }
  if (kind === 'folder' && !isDir) {
    return {
      code,
      path,
      at: 'value',
      message: `${what} "${written}" is a file, not a folder`,
      hint: 'name the folder that holds the template files',
    };
  }
  return null;
}

/**
 * Events whose keys depend on their kind: a ramp needs its last period after its first; until and
 * fading_rate belong to ramps and fading events alone.
 */
function eventProblems(effects: Rec | undefined, at: JobPath): Problem[] {
  const events = effects && Array.isArray(effects.events) ? effects.events : [];
  const problems: Problem[] = [];
  events.forEach((raw, k) => {
    const e = rec(raw);
    if (!e) return;
    const path: JobPath = [...at, 'events', k];
    if (e.kind === 'ramp' && !('until' in e)) {
      problems.push({
        code: 'job-event',
        path: [...path, 'kind'],
        at: 'value',
        message: 'a ramp needs the period it ends at',
        hint: 'add until: with its last period, e.g. until: 2024-06',
      });
    }
    if (e.kind !== undefined && e.kind !== 'ramp' && 'until' in e) {
      problems.push({
        code: 'job-event',
        path: [...path, 'until'],
        at: 'key',
        message: `until is only used by a ramp, not by a ${String(e.kind)} event`,
        hint: 'remove until:, or write kind: ramp',
      });
    }
    if (e.kind !== undefined && e.kind !== 'fading' && 'fading_rate' in e) {
      problems.push({
        code: 'job-event',
        path: [...path, 'fading_rate'],
        at: 'key',
        message: `fading_rate is only used by a fading event, not by a ${String(e.kind)} event`,
        hint: 'remove fading_rate:, or write kind: fading',
      });
    }
    if (typeof e.at === 'string' && typeof e.until === 'string' && e.until.localeCompare(e.at) <= 0) {
      problems.push({
        code: 'job-event',
        path: [...path, 'until'],
        at: 'value',
        message: `the ramp ends (${e.until}) no later than it starts (${e.at})`,
        hint: 'give until: a period after at:',
      });
    }
  });
  return problems;
}

/**
 * Decomposition settings that depend on each other, checked after `defaults:` is merged in. A message holds
 * `{series}` for the series it concerns: one setting in `defaults:` can trouble several, told once.
 */
function decompositionProblems(series: Rec, i: number, shared: Rec | undefined): (Problem & { series: number })[] {
  const own = rec(series.decomposition);
  const where = (key: string): JobPath | null =>
    own && key in own
      ? ['series', i, 'decomposition', key]
      : shared && key in shared
        ? ['defaults', 'decomposition', key]
        : null;
  const get = (key: string): unknown => (own && key in own ? own[key] : shared?.[key]);
  const problems: (Problem & { series: number })[] = [];
  const method = get('method') ?? 'stl';
  const mstl = method === 'mstl';
  const periods = get('periods');
  const periodsAt = where('periods');
  if (!mstl && periodsAt) {
    problems.push({
      code: 'job-decomposition',
      series: i,
      path: periodsAt,
      at: 'key',
      message: 'periods is only used with method: mstl (not by {series})',
      hint: 'add method: mstl for several seasonal cycles, or give one cycle as period:',
    });
  }
  const periodAt = where('period');
  if (mstl && periodAt) {
    problems.push({
      code: 'job-decomposition',
      series: i,
      path: periodAt,
      at: 'key',
      message: 'period is not used with method: mstl ({series})',
      hint: 'list every seasonal cycle under periods: instead',
    });
  }
  if (Array.isArray(periods) && periods.every((p) => typeof p === 'number')) {
    const k = periods.findIndex((p, j) => j > 0 && p < periods[j - 1]);
    if (k > 0) {
      problems.push({
        code: 'job-decomposition',
        series: i,
        path: [...periodsAt!, k],
        at: 'value',
        message: `periods must be in ascending order, but ${periods[k]} follows ${periods[k - 1]}`,
        hint: `write periods: [${[...periods].sort((a, b) => a - b).join(', ')}]`,
      });
    }
  }
  const windows = get('seasonal_window');
  const windowsAt = where('seasonal_window');
  if (Array.isArray(windows) && windowsAt) {
    if (!mstl) {
      problems.push({
        code: 'job-decomposition',
        series: i,
        path: windowsAt,
        at: 'value',
        message: 'a list of seasonal windows is only used with method: mstl (not by {series})',
        hint: 'give one window such as seasonal_window: 13, or use method: mstl',
      });
    } else if (Array.isArray(periods) && periods.length !== windows.length) {
      problems.push({
        code: 'job-decomposition',
        series: i,
        path: windowsAt,
        at: 'value',
        message: `${windows.length} seasonal windows are listed for ${periods.length} periods ({series})`,
        hint: 'give one window per period, in the same order, or a single window for all',
      });
    }
  }
  return problems;
}

function spanProblems(custom: Rec, path: JobPath): Problem[] {
  const problems: Problem[] = [];
  for (const side of ['current', 'baseline'] as const) {
    const span = custom[side];
    if (!Array.isArray(span) || span.length !== 2 || !span.every((p) => typeof p === 'string')) continue;
    const [a, b] = span as string[];
    if (!periodPattern.test(a) || !periodPattern.test(b)) continue;
    const bad = [a, b].findIndex((p) => Number.isNaN(periodStart(p)));
    if (bad >= 0) {
      problems.push(noSuchPeriod([...path, side, bad], span[bad]));
    } else if (periodStart(a) > periodStart(b)) {
      problems.push({
        code: 'job-comparison',
        path: [...path, side],
        at: 'value',
        message: `${pathText([...path, side])} runs backwards: ${a} comes after ${b}`,
        hint: `write the earlier period first: [${b}, ${a}]`,
      });
    }
  }
  return problems;
}

function noSuchPeriod(path: JobPath, text: string): Problem {
  return {
    code: 'job-bad-value',
    path,
    at: 'value',
    message: `${pathText(path)} is ${JSON.stringify(text)}, which is not a date in the calendar`,
    hint: 'check the day of the month, or the week number of that year',
  };
}

// The forms the schema's period pattern admits.
const periodPattern = /^(\d{4})-(\d{2})(?:-(\d{2})(?:T(\d{2})(?::00)?Z?)?)?$|^(\d{4})-Q([1-4])$|^(\d{4})-W(\d{2})$/;

/** Whether text is a reporting period in one of the forms a job may write, and a real one. */
export function isPeriodText(text: string): boolean {
  return periodPattern.test(text) && !Number.isNaN(periodStart(text));
}

/** UTC start of a period written 2026-09, 2026-09-15, 2026-09-15T14:00, 2026-Q3 or 2026-W39; NaN if no such date. */
export function periodStart(text: string): number {
  const m = periodPattern.exec(text);
  if (!m) return Number.NaN;
  if (m[5]) return Date.UTC(Number(m[5]), (Number(m[6]) - 1) * 3, 1);
  if (m[7]) {
    const year = Number(m[7]);
    const week = Number(m[8]);
    return week >= 1 && week <= isoWeeksInYear(year) ? isoWeekStart(year, week) : Number.NaN;
  }
  const year = Number(m[1]);
  const month = Number(m[2]) - 1;
  const day = m[3] ? Number(m[3]) : 1;
  const t = Date.UTC(year, month, day, m[4] ? Number(m[4]) : 0);
  const d = new Date(t);
  return d.getUTCMonth() === month && d.getUTCDate() === day ? t : Number.NaN;
}

/** One problem per place and wording, naming every series it concerns. */
function mergeSeries(problems: (Problem & { series: number })[]): Problem[] {
  const merged = new Map<string, { problem: Problem; series: number[] }>();
  for (const { series, ...problem } of problems) {
    const key = `${problem.at}|${problem.path.join('/')}|${problem.message}`;
    const entry = merged.get(key);
    if (entry) entry.series.push(series);
    else merged.set(key, { problem, series: [series] });
  }
  return [...merged.values()].map(({ problem, series }) => ({
    ...problem,
    message: problem.message.replace('{series}', series.map((i) => `series[${i}]`).join(', ')),
  }));
}

function dedupe(problems: Problem[]): Problem[] {
  const seen = new Set<string>();
  return problems.filter((p) => {
    const key = `${p.at}|${p.path.join('/')}|${p.message}`;
    if (seen.has(key)) return false;
    seen.add(key);
    return true;
  });
}
