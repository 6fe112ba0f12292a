/**
 * `trendbrief decompose FILE --date COL --value COL [...]`: the engine on its own, for checking our
 * components against another implementation. Loads only the data and decomposition stages.
 */
import { extname } from 'node:path';
import type { DecompositionSettings } from '../brief/model.js';
import { FREQUENCIES, type Frequency } from '../data/calendar.js';
import { loadData } from '../data/load.js';
import { runDecomposition } from '../decompose/index.js';
import { BriefError } from '../errors.js';
import { emptyDecompositionSpec, resolveDecomposition } from '../job/resolve.js';
import type { DataSpec, DecompositionSpec } from '../job/types.js';
import { intOption, parseCommand, usage } from './args.js';
import { type Console, writeStdout } from './output.js';

export const help = `trendbrief decompose — split a series into trend, seasonal and remainder

Usage: trendbrief decompose FILE.csv --date COL --value COL [options]

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

Example:
  trendbrief decompose examples/water-deliveries/data/deliveries.csv --date month --value delivered_ml --robust --format csv`;

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
  });
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
  if (format === 'json') {
    await writeStdout(toJson(group.dates, columns, result.seasonals, settingsUsed(settings)));
  } else {
    await writeStdout(toCsv(group.dates, columns, result.seasonals));
  }
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
  if (o.periods !== undefined) {
    const list = String(o.periods)
      .split(',')
      .map((s) => Number(s.trim()));
    if (list.some((p) => !Number.isInteger(p)))
      throw usage('decompose', `--periods must be whole numbers separated by commas, got "${o.periods}"`);
    if (method !== 'mstl')
      throw usage('decompose', '--periods needs --method mstl', 'add --method mstl, or give one --period');
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

/** The settings a method actually used, defaults included, without the other methods' fields. */
export function settingsUsed(s: DecompositionSettings): Record<string, unknown> {
  const common = { method: s.method, model: s.model, modelReason: s.modelReason };
  if (s.method === 'classical') {
    return { ...common, period: s.period, trendFilter: s.trendFilter, hendersonLength: s.hendersonLength };
  }
  const loess = {
    seasonalDegree: s.seasonalDegree,
    trendDegree: s.trendDegree,
    lowpassDegree: s.lowpassDegree,
    robust: s.robust,
    inner: s.inner,
    outer: s.outer,
    hendersonLength: s.hendersonLength,
  };
  if (s.method === 'stl') {
    return {
      ...common,
      period: s.period,
      seasonalWindow: s.seasonalWindows[0],
      trendWindow: s.trendWindow,
      lowpassWindow: s.lowpassWindow,
      seasonalJump: s.seasonalJump,
      trendJump: s.trendJump,
      lowpassJump: s.lowpassJump,
      ...loess,
    };
  }
  return {
    ...common,
    periods: s.periods,
    seasonalWindows: s.seasonalWindows,
    trendWindows: s.trendWindows,
    lowpassWindows: s.lowpassWindows,
    iterations: s.iterations,
    ...loess,
  };
}

/** Values joined in blocks, so a million-point column never becomes one giant string. */
const BLOCK = 8192;

/** JSON with null for undefined values; numbers in their shortest round-trip form; yielded in pieces. */
function* toJson(
  dates: string[],
  columns: [string, ArrayLike<number>][],
  seasonals: Map<number, Float64Array> | null,
  settings: Record<string, unknown>,
): Generator<string> {
  yield '{"dates":[';
  for (let i = 0; i < dates.length; i += BLOCK) {
    yield (i > 0 ? ',' : '') +
      dates
        .slice(i, i + BLOCK)
        .map((d) => JSON.stringify(d))
        .join(',');
  }
  yield ']';
  for (const [name, v] of columns) {
    yield `,${JSON.stringify(name)}:`;
    yield* numbers(v);
  }
  if (seasonals) {
    yield ',"seasonals":{';
    let first = true;
    for (const [p, v] of seasonals) {
      yield `${first ? '' : ','}${JSON.stringify(String(p))}:`;
      yield* numbers(v);
      first = false;
    }
    yield '}';
  }
  yield `,"settings":${JSON.stringify(settings)}}\n`;
}

function* numbers(v: ArrayLike<number>): Generator<string> {
  yield '[';
  for (let i = 0; i < v.length; i += BLOCK) {
    const end = Math.min(v.length, i + BLOCK);
    const out = new Array<string>(end - i);
    for (let j = i; j < end; j++) out[j - i] = Number.isFinite(v[j]) ? String(v[j]) : 'null';
    yield (i > 0 ? ',' : '') + out.join(',');
  }
  yield ']';
}

function* toCsv(
  dates: string[],
  columns: [string, ArrayLike<number>][],
  seasonals: Map<number, Float64Array> | null,
): Generator<string> {
  const all: [string, ArrayLike<number>][] = [...columns];
  if (seasonals) for (const [p, v] of seasonals) all.push([`seasonal_${p}`, v]);
  yield `${['date', ...all.map(([name]) => name)].join(',')}\n`;
  for (let i = 0; i < dates.length; i += BLOCK) {
    const lines: string[] = [];
    for (let k = i; k < Math.min(dates.length, i + BLOCK); k++) {
      const row = [dates[k]];
      for (const [, v] of all) row.push(Number.isFinite(v[k]) ? String(v[k]) : '');
      lines.push(row.join(','));
    }
    yield `${lines.join('\n')}\n`;
  }
}

export { BriefError };
