/**
 * `trendbrief decompose FILE --date COL --value COL [...]`: the engine on its own, for checking our
 * components against another implementation. Loads only the data and decomposition stages.
 */
import { extname } from 'node:path';
import { loadData, periodTexts } from '../data/load.js';
import { runDecomposition, sharedLoess, stlLoess } from '../decompose/index.js';
import { BriefError } from '../errors.js';
import { emptyDecompositionSpec, resolveDecomposition } from '../job/resolve.js';
import type { DecompositionSettings } from '../vocabulary/brief.js';
import { FREQUENCIES, type Frequency } from '../vocabulary/period-index.js';
import type { DataSpec, DecompositionSpec } from '../vocabulary/settings.js';
import { intOption, parseCommand, usage } from './args.js';
import { type Console, writeStdout } from './output.js';

export const help = `trendbrief decompose — split a series into trend, seasonal and remainder

Usage: trendbrief decompose FILE.csv --date COL --value COL [options]
       trendbrief decompose --job JOB.yaml [--series ID] [--group G] [--reporting-period P] [--format json|csv]

With a data file: the decomposition method alone, on the series as it is (for checking our components
against another implementation): no calendar effects, events or forecast extension.
With --job: one series of the job exactly as its brief decomposes it, with the job's settings: calendar
effects, named and found events taken out first, the forecast extension, then the steps put back into the
trend, one-off events into the remainder and the calendar into a component of its own, so that observed =
trend + seasonal + calendar + remainder (or their product). The components are the brief's own.
  --job FILE                 the job file
  --series ID                the series' id (default the job's first series)
  --group G                  the group, for a job whose data are split by a column (default the first)
  --reporting-period P       e.g. 2026-09: cut the series there, as render --period does (default the
                             job's period, else the last observation)

  --date COL                 column holding the dates (2024-03, 2024-Q1, 2024-W09, 2024-03-05, 2024-03-05T13:00)
  --value COL                column holding the values
  --method classical|stl|mstl   default stl
  --period N                 seasonal period (default from the dates: 12, 4, 52, 7 or 24)
  --periods 7,365            several periods (mstl)
  --model additive|multiplicative|auto   default auto
  --seasonal-window N|periodic   odd, at least 7 (default 13; mstl 11, 15, …)
  --trend-window N           odd (default from the period and seasonal window)
  --henderson N              final trend by an N-term Henderson filter
  --robust                   robust STL (15 outer passes with bisquare weights)
  --frequency F              hourly, daily, weekly, monthly or quarterly (default inferred)
  --decimal .|,              decimal mark of the numbers (default .)
  --delimiter C              CSV delimiter (default ,)
  --format json|csv          output on stdout (default json)

Examples:
  trendbrief decompose examples/online-orders/data/orders.csv --date month --value orders --robust --format csv
  trendbrief decompose --job examples/harbour-freight/job.yaml --format csv`;

export async function run(args: string[], con: Console): Promise<number> {
  const { values: o, positionals } = parseCommand('decompose', args, {
    date: { type: 'string' },
    value: { type: 'string' },
    method: { type: 'string' },
    period: { type: 'string' },
    periods: { type: 'string' },
    model: { type: 'string' },
    'seasonal-window': { type: 'string' },
    'trend-window': { type: 'string' },
    henderson: { type: 'string' },
    robust: { type: 'boolean' },
    frequency: { type: 'string' },
    decimal: { type: 'string' },
    delimiter: { type: 'string' },
    format: { type: 'string' },
    job: { type: 'string' },
    series: { type: 'string' },
    group: { type: 'string' },
    'reporting-period': { type: 'string' },
  });
  if (typeof o.job === 'string') return runJob(o, positionals);
  for (const key of ['series', 'group', 'reporting-period'] as const) {
    if (o[key] !== undefined) throw usage('decompose', `--${key} needs --job`, 'name the job file with --job JOB.yaml');
  }
  if (positionals.length !== 1)
    throw usage('decompose', 'name one data file', 'e.g. trendbrief decompose data.csv --date month --value amount');
  if (typeof o.date !== 'string' || typeof o.value !== 'string')
    throw usage(
      'decompose',
      'both --date and --value are needed',
      'name the date column and the value column of the file',
    );
  const file = positionals[0];
  const format = (o.format as string | undefined) ?? 'json';
  if (format !== 'json' && format !== 'csv') throw usage('decompose', `--format must be json or csv, got "${format}"`);
  const frequency = (o.frequency as string | undefined) ?? null;
  if (frequency !== null && !FREQUENCIES.includes(frequency as Frequency)) {
    throw usage('decompose', `--frequency must be one of ${FREQUENCIES.join(', ')}, got "${frequency}"`);
  }
  const spec = decompositionSpec(o);
  const ext = extname(file).toLowerCase();
  const dataSpec: DataSpec = {
    file,
    fileAsWritten: file,
    format: ext === '.json' ? 'json' : 'csv',
    dateColumn: o.date,
    valueColumn: o.value,
    filter: null,
    groupBy: null,
    decimal: o.decimal === ',' ? ',' : '.',
    delimiter: (o.delimiter as string | undefined) ?? ',',
  };
  const data = loadData(dataSpec, frequency as Frequency | null);
  const group = data.groups[0];
  for (const note of group.notes) con.info(`${file}: ${note}`);
  if (group.gaps.length > 0)
    con.info(
      `${file}: ${group.gaps.length} missing period(s) treated as missing: ${group.gaps.slice(0, 5).join(', ')}${group.gaps.length > 5 ? ', …' : ''}`,
    );
  const settings = resolveDecomposition(spec, group.series.values, data.frequency, { file });
  const result = runDecomposition(group.series.values, settings);
  const columns: [string, ArrayLike<number>][] = [
    ['observed', group.series.values],
    ['trend', result.trend],
    ['seasonal', result.seasonal],
    ['remainder', result.remainder],
  ];
  if (result.weights) columns.push(['weights', result.weights]);
  // Dates as text block by block, never all at once: a million hourly dates as strings outweigh the values.
  const dates = (from: number, to: number): string[] =>
    periodTexts(data.frequency, group.series.index.start + from, to - from);
  const n = group.series.index.length;
  if (format === 'json') {
    await writeStdout(toJson(n, dates, columns, result.seasonals, settingsUsed(settings)));
  } else {
    await writeStdout(toCsv(n, dates, columns, result.seasonals));
  }
  return 0;
}

/**
 * One series of a job as its brief decomposes it: the brief's own series build (brief/series.ts, without
 * charts), so the settings, the effects and the components cannot differ from the brief's.
 */
async function runJob(o: Record<string, string | boolean | undefined>, positionals: string[]): Promise<number> {
  if (positionals.length > 0) {
    throw usage('decompose', 'give either a data file or --job, not both', 'e.g. trendbrief decompose --job job.yaml');
  }
  for (const key of Object.keys(o)) {
    if (['job', 'series', 'group', 'reporting-period', 'format'].includes(key) || o[key] === undefined) continue;
    throw usage(
      'decompose',
      `--${key} cannot be used with --job`,
      'the job file holds the settings: change them there',
    );
  }
  const format = (o.format as string | undefined) ?? 'json';
  if (format !== 'json' && format !== 'csv') throw usage('decompose', `--format must be json or csv, got "${format}"`);
  const { loadJob } = await import('../job/load.js');
  const { loadJobData } = await import('../brief/build.js');
  const { buildSeries } = await import('../brief/series.js');
  const { periodOption } = await import('./period-option.js');
  const job = loadJob(o.job as string);
  const asked = o['reporting-period'];
  const period = typeof asked === 'string' ? periodOption('decompose', asked) : null;
  const id = o.series as string | undefined;
  const spec = id === undefined ? job.series[0] : job.series.find((x) => x.id === id);
  if (!spec) {
    throw usage('decompose', `the job has no series "${id}"`, `use one of ${job.series.map((x) => x.id).join(', ')}`);
  }
  const data = loadJobData(job, undefined, period ?? job.brief.period).get(spec)!;
  const wanted = o.group as string | undefined;
  const g = wanted === undefined ? data.groups[0] : data.groups.find((x) => x.key === wanted);
  if (!g) {
    const known = data.groups.map((x) => x.key).filter((k) => k !== null);
    throw usage(
      'decompose',
      wanted === undefined ? 'the series has no data' : `the series' data have no group "${wanted}"`,
      known.length > 0 ? `use one of ${known.slice(0, 8).join(', ')}` : 'this job does not split its data by group',
    );
  }
  const s = buildSeries(job, spec, data, g, period ?? job.brief.period);
  const c = s.components;
  const columns: [string, ArrayLike<number>][] = [
    ['observed', c.observed],
    ['trend', c.trend],
    ['seasonal', c.seasonal],
  ];
  if (c.calendar) columns.push(['calendar', c.calendar]);
  columns.push(['remainder', c.remainder], ['adjusted', c.adjusted]);
  if (c.steps) columns.push(['steps', c.steps]);
  if (c.oneOff) columns.push(['one_off', c.oneOff]);
  if (c.weights) columns.push(['weights', c.weights]);
  const seasonals = c.seasonals
    ? new Map(Object.entries(c.seasonals).map(([p, v]) => [Number(p), Float64Array.from(v)]))
    : null;
  const dates = (from: number, to: number) => c.dates.slice(from, to);
  const n = c.dates.length;
  if (format === 'csv') {
    await writeStdout(toCsv(n, dates, columns, seasonals));
    return 0;
  }
  const e = s.effects ?? null;
  const settings = {
    series: s.id,
    ...(g.key !== null ? { group: g.key } : {}),
    ...settingsUsed(s.settings),
    extension: s.extension.model,
    effects: e && {
      skipped: e.skipped,
      scale: e.scale,
      model: e.model,
      criticalValue: e.criticalValue,
      groups: e.groups,
      events: e.events.map((v) => ({
        kind: v.kind,
        date: c.dates[v.at],
        estimate: v.estimate,
        t: v.t,
        label: v.label,
      })),
    },
  };
  await writeStdout(toJson(n, dates, columns, seasonals, settings));
  return 0;
}

function decompositionSpec(o: Record<string, string | boolean | undefined>): DecompositionSpec {
  const spec = emptyDecompositionSpec();
  const method = (o.method as string | undefined) ?? 'stl';
  if (method !== 'classical' && method !== 'stl' && method !== 'mstl') {
    throw usage('decompose', `unknown method "${method}"`, 'use --method classical, stl or mstl');
  }
  spec.method = method;
  const model = (o.model as string | undefined) ?? 'auto';
  if (model !== 'additive' && model !== 'multiplicative' && model !== 'auto') {
    throw usage('decompose', `unknown model "${model}"`, 'use --model additive, multiplicative or auto');
  }
  spec.model = model;
  spec.period = intOption('decompose', 'period', o.period as string | undefined);
  if (spec.period !== null && spec.period < 2)
    throw usage(
      'decompose',
      `--period must be a whole number of at least 2, got ${spec.period}`,
      'e.g. --period 12 for monthly data',
    );
  if (o.periods !== undefined) {
    const list = String(o.periods)
      .split(',')
      .map((s) => Number(s.trim()));
    if (list.some((p) => !Number.isInteger(p)))
      throw usage('decompose', `--periods must be whole numbers separated by commas, got "${o.periods}"`);
    if (method !== 'mstl')
      throw usage('decompose', '--periods needs --method mstl', 'add --method mstl, or give one --period');
    checkPeriods(list);
    spec.periods = list;
  }
  const sw = o['seasonal-window'] as string | undefined;
  if (sw !== undefined) {
    if (sw === 'periodic') spec.seasonalWindow = 'periodic';
    else {
      const parts = sw.split(',').map((s) => (s.trim() === 'periodic' ? 'periodic' : Number(s.trim())));
      if (parts.some((p) => p !== 'periodic' && !Number.isInteger(p))) {
        throw usage('decompose', `--seasonal-window must be an odd whole number or periodic, got "${sw}"`);
      }
      spec.seasonalWindow = parts.length === 1 ? parts[0] : parts;
    }
  }
  spec.trendWindow = intOption('decompose', 'trend-window', o['trend-window'] as string | undefined);
  spec.henderson = intOption('decompose', 'henderson', o.henderson as string | undefined);
  spec.robust = Boolean(o.robust);
  return spec;
}

/**
 * MSTL's periods as the job file has them: each at least 2, listed once, shortest first — MSTL removes the
 * shorter cycles before the longer ones (Bandara, Hyndman & Bergmeir 2021, §3), so an order other than the
 * written one would be a silent change. A longer period need not be a multiple of a shorter one (7 and 365
 * for daily data is the usual pair).
 */
function checkPeriods(list: number[]): void {
  const sorted = [...new Set(list)].sort((a, b) => a - b);
  const fix = `write --periods ${sorted.filter((p) => p >= 2).join(',')}`;
  const small = list.find((p) => p < 2);
  if (small !== undefined) throw usage('decompose', `--periods has ${small}; each period must be at least 2`, fix);
  const twice = list.find((p, i) => list.indexOf(p) !== i);
  if (twice !== undefined) throw usage('decompose', `--periods lists ${twice} twice`, fix);
  const k = list.findIndex((p, i) => i > 0 && p < list[i - 1]);
  if (k > 0)
    throw usage('decompose', `--periods must be in ascending order, but ${list[k]} follows ${list[k - 1]}`, fix);
}

/** The settings a method actually used, defaults included, without the other methods' fields. */
export function settingsUsed(s: DecompositionSettings): Record<string, unknown> {
  const common = { method: s.method, model: s.model, modelReason: s.modelReason };
  if (s.method === 'classical') {
    return { ...common, period: s.period, trendFilter: s.trendFilter, hendersonLength: s.hendersonLength };
  }
  if (s.method === 'stl') {
    return {
      ...common,
      period: s.period,
      seasonalWindow: s.seasonalWindows[0],
      ...stlLoess(s),
      hendersonLength: s.hendersonLength,
    };
  }
  return {
    ...common,
    periods: s.periods,
    seasonalWindows: s.seasonalWindows,
    trendWindows: s.trendWindows,
    lowpassWindows: s.lowpassWindows,
    iterations: s.iterations,
    ...sharedLoess(s),
    hendersonLength: s.hendersonLength,
  };
}

/**
 * Output text is gathered byte by byte into one reused buffer and yielded in pieces of about 64 KB: a
 * million rows never become one giant string, and (unlike arrays of row strings joined per block) nothing
 * but the piece in hand outlives a garbage collection, which keeps the young heap from growing to its cap.
 * Every character written is ASCII (digits, signs, ISO dates, names already JSON-escaped), so one byte each.
 */
class Pieces {
  private buf = Buffer.allocUnsafe(PIECE + 4096);
  private pos = 0;
  /** Appends ASCII text. */
  put(text: string): void {
    if (this.pos + text.length + 1 > this.buf.length) {
      const bigger = Buffer.allocUnsafe(2 * (this.pos + text.length + 1));
      this.buf.copy(bigger, 0, 0, this.pos);
      this.buf = bigger;
    }
    const buf = this.buf;
    let pos = this.pos;
    for (let c = 0; c < text.length; c++) buf[pos++] = text.charCodeAt(c);
    this.pos = pos;
  }
  /** Appends one character code. */
  char(code: number): void {
    if (this.pos === this.buf.length) this.put('');
    this.buf[this.pos++] = code;
  }
  /** Whether a piece is ready. */
  get full(): boolean {
    return this.pos >= PIECE;
  }
  take(): string {
    const text = this.buf.toString('latin1', 0, this.pos);
    this.pos = 0;
    return text;
  }
}

const PIECE = 60_000;
/** Dates made as text at a time. */
const DATE_BLOCK = 1024;

/** JSON with null for undefined values; numbers in their shortest round-trip form; yielded in pieces. */
function* toJson(
  n: number,
  dates: (from: number, to: number) => string[],
  columns: [string, ArrayLike<number>][],
  seasonals: Map<number, Float64Array> | null,
  settings: Record<string, unknown>,
): Generator<string> {
  const out = new Pieces();
  yield '{"dates":[';
  // A block of dates at a time through JSON.stringify, as the numbers below: the engine's own writer
  // rather than a loop over characters that a fresh process would run interpreted.
  for (let i = 0; i < n; i += DATE_BLOCK) {
    const text = JSON.stringify(dates(i, Math.min(n, i + DATE_BLOCK)));
    yield i === 0 ? text.slice(1, -1) : `,${text.slice(1, -1)}`;
  }
  out.char(93);
  for (const [name, v] of columns) {
    out.put(`,${JSON.stringify(name)}:`);
    yield* numbers(v, out);
  }
  if (seasonals) {
    out.put(',"seasonals":{');
    let first = true;
    for (const [p, v] of seasonals) {
      out.put(`${first ? '' : ','}${JSON.stringify(String(p))}:`);
      yield* numbers(v, out);
      first = false;
    }
    out.char(125);
  }
  yield out.take();
  // The settings may hold text beyond ASCII (the model's reason): a string of its own.
  yield `,"settings":${JSON.stringify(settings)}}\n`;
}

/** Values per piece of a component. */
const NUMBER_BLOCK = 4096;

/**
 * A component as a JSON list, a block of values at a time: JSON.stringify of a plain copy of the block
 * writes each number straight into its output (the shortest round-trip form, null for NaN and ±∞, as
 * String() and our rule give), where String() per value made a string each for the collector.
 */
function* numbers(v: ArrayLike<number>, out: Pieces): Generator<string> {
  out.char(91);
  yield out.take();
  for (let i = 0; i < v.length; i += NUMBER_BLOCK) {
    const block: number[] = [];
    for (let k = i, end = Math.min(v.length, i + NUMBER_BLOCK); k < end; k++) block.push(v[k]);
    const text = JSON.stringify(block);
    yield i === 0 ? text.slice(1, -1) : `,${text.slice(1, -1)}`;
  }
  out.char(93);
}

function* toCsv(
  n: number,
  dates: (from: number, to: number) => string[],
  columns: [string, ArrayLike<number>][],
  seasonals: Map<number, Float64Array> | null,
): Generator<string> {
  const all: ArrayLike<number>[] = columns.map(([, v]) => v);
  const names = columns.map(([name]) => name);
  if (seasonals)
    for (const [p, v] of seasonals) {
      all.push(v);
      names.push(`seasonal_${p}`);
    }
  const out = new Pieces();
  out.put(`${['date', ...names].join(',')}\n`);
  for (let i = 0; i < n; i += DATE_BLOCK) {
    const end = Math.min(n, i + DATE_BLOCK);
    const block = dates(i, end);
    for (let k = i; k < end; k++) {
      out.put(block[k - i]);
      for (let c = 0; c < all.length; c++) {
        out.char(44);
        const x = all[c][k];
        if (Number.isFinite(x)) out.put(String(x));
      }
      out.char(10);
      if (out.full) yield out.take();
    }
  }
  yield out.take();
}

export { BriefError };
