/**
 * Less than two years of data: the brief gives the statements the history supports and says what it
 * cannot compare. Open data from test/verify/corpus/ (sources in corpus.json): electricity-hourly, R package
 * forecast's taylor (half-hourly electricity demand in England and Wales, 5 June to 27 August 2000; Taylor
 * 2003), averaged to hours: twelve weeks; chicago-daily, R package modeldata's Chicago (daily L-train
 * ridership at Clark/Lake), its first 300 days. Before, both were refused: a brief needed two years.
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, test } from 'vitest';
import { buildBriefs } from '../../src/brief/build.js';
import { seriesView } from '../../src/document/view.js';
import { loadJob } from '../../src/job/load.js';
import { describeFindings, verifySeries } from '../../src/verify/index.js';
import type { SeriesBrief } from '../../src/vocabulary/brief.js';
import { CORPUS_DIR } from '../verify/corpus.js';

function job(file: string, frequency: string, lines: string[] = [], brief: string[] = []): string {
  const dir = mkdtempSync(join(tmpdir(), 'tb-short-'));
  const f = join(dir, 'job.yaml');
  writeFileSync(
    f,
    [
      'brief:',
      '  title: Short',
      ...brief,
      'series:',
      '  - id: s',
      '    label: Demand',
      '    unit: MW',
      '    combine: mean',
      `    frequency: ${frequency}`,
      `    data: { file: ${JSON.stringify(join(CORPUS_DIR, file))}, date: date, value: value }`,
      ...lines.map((l) => `    ${l}`),
      '',
    ].join('\n'),
  );
  return f;
}

async function build(f: string) {
  const [unit] = await buildBriefs(loadJob(f), { toolVersion: 'test', charts: true, epoch: 0 });
  return unit;
}

const text = (s: SeriesBrief, id: string) => s.statements.find((x) => x.id === id)?.text ?? '';

describe('twelve weeks of hours (electricity-hourly), MSTL with periods 24 and 168', async () => {
  const unit = await build(
    job('electricity-hourly.csv', 'hourly', ['decomposition: { method: mstl, periods: [24, 168] }']),
  );
  const s = unit.brief?.series[0] as SeriesBrief;

  test('is made, and every claim verifies', () => {
    expect(unit.error).toBeNull();
    expect(s.components.observed).toHaveLength(2016);
    expect(describeFindings(verifySeries(s, s.components.observed))).toBe('');
  });

  test('the headline gives the trend over a week, the same hour of the same weekday', () => {
    expect(s.analysis.headlineSpan).toEqual({ periods: 168, yearly: false, needed: 17473, available: 2016 });
    expect(s.analysis.trendYoY.baseDate).toBe('2000-08-20T23:00Z');
    expect(text(s, 'headline')).toMatch(/^Demand: the trend is (up|down|broadly unchanged) .*on a week earlier/);
    expect(text(s, 'overview')).toMatch(/The trend is .* on a week\./);
  });

  test('it says plainly which comparisons it cannot make and why', () => {
    expect(text(s, 'history-limit')).toBe(
      "A yearly comparison needs at least two years of data. This series has 2,016 hours (12 weeks). So the trend's change is given over a week instead. Left out, as the data do not reach back to their spans: Same hour last year, Year to date and Last 52 weeks.",
    );
    expect(s.analysis.comparisons.map((c) => c.id)).toEqual(['week-earlier']);
    expect(text(s, 'comparison-week-earlier')).toMatch(
      /^Same hour a week earlier: 23,871 MW\. That is 2\.8% less than on 20 August 2000 at 23:00 \(24,550 MW\)\./,
    );
    // Each pattern is described in its own terms; no "n/a" anywhere in the words.
    expect(text(s, 'seasonal')).toMatch(/^Each day, the seasonal peak is at/);
    expect(text(s, 'seasonal-168')).toMatch(/^Each week, the seasonal peak is on/);
    expect(s.statements.filter((x) => /n\/a/.test(x.text)).map((x) => x.id)).toEqual([]);
  });

  test('one period is a value, not "an average of"; hours have no "time of year" and no annualised growth', () => {
    expect(text(s, 'comparison-week-earlier')).not.toMatch(/average of|total of/);
    expect(s.statements.filter((x) => /time of year/.test(x.text)).map((x) => x.id)).toEqual([]);
    expect(seriesView(s, 'en-GB').keyFigures.filter((k) => /annualised/.test(k.label))).toEqual([]);
  });

  test('no chart of the yearly change; the key figure names its span', () => {
    expect(s.charts.map((c) => c.id)).not.toContain('yoy');
    const v = seriesView(s, 'en-GB');
    expect(v.keyFigures[0].label).toBe('Trend, on a week earlier');
    expect(v.keyFigures[2].note).toMatch(/on a week earlier$/);
  });

  test('the verifier catches a short span used where two years exist, and a wrong count', () => {
    const t = structuredClone(s);
    const c = t.statements.find((x) => x.id === 'history-limit')?.claims[0];
    if (c?.kind !== 'history-limit') throw new Error('no claim');
    c.periods = 2000;
    expect(
      verifySeries(t)
        .map((f) => f.problem)
        .join('\n'),
    ).toMatch(/says the series has 2000 periods, it has 2016/);
    c.periods = 2016;
    c.leftOut = [];
    expect(verifySeries(t).map((f) => f.problem)).toEqual([]);
    c.leftOut = [
      { id: 'week-earlier', current: { from: '', to: '', periods: 1 }, baseline: { from: '', to: '', periods: 1 } },
    ];
    expect(
      verifySeries(t)
        .map((f) => f.problem)
        .join('\n'),
    ).toMatch(/leaves out week-earlier but also compares it/);
  });
});

describe('daily data, 300 days (chicago-daily)', async () => {
  const dates = (await import('node:fs')).readFileSync(join(CORPUS_DIR, 'chicago-daily.csv'), 'utf8').split('\n');
  const day300 = dates[300].split(',')[0];
  const unit = await build(job('chicago-daily.csv', 'daily', [], [`  period: "${day300}"`]));
  const s = unit.brief?.series[0] as SeriesBrief;

  test('made, the trend over four weeks, the same weekday a week earlier, every claim true', () => {
    expect(unit.error).toBeNull();
    expect(s.analysis.headlineSpan).toEqual({ periods: 28, yearly: false, needed: 729, available: 300 });
    expect(text(s, 'headline')).toMatch(/on four weeks earlier/);
    expect(text(s, 'history-limit')).toMatch(
      /^A yearly comparison needs at least two years of data\. This series has 300 days\./,
    );
    expect(text(s, 'comparison-week-earlier')).toMatch(/^Same day a week earlier: /);
    expect(describeFindings(verifySeries(s, s.components.observed))).toBe('');
  });
});

describe('the least history per method, and what a long series still says', () => {
  test('hourly STL (period 24): 48 hours refused naming 49, 49 hours made with the trend over a day', async () => {
    const lines = ['decomposition: { method: stl }'];
    const short = await build(job('electricity-hourly.csv', 'hourly', lines, ['  period: "2000-06-06T23:00"']));
    expect(short.error?.code).toBe('too-short');
    expect(short.error?.message).toBe(
      'series "s" has 48 hours of data up to the reporting period; a brief of hourly data needs at least 49: two whole cycles of the seasonal period of 24 hours, and one hour more for the test of a real seasonal pattern',
    );
    const least = await build(job('electricity-hourly.csv', 'hourly', lines, ['  period: "2000-06-07T00:00"']));
    expect(least.error).toBeNull();
    const s = least.brief?.series[0] as SeriesBrief;
    expect(s.analysis.headlineSpan.periods).toBe(24);
    expect(text(s, 'headline')).toMatch(/on a day earlier/);
    expect(describeFindings(verifySeries(s, s.components.observed))).toBe('');
  });

  test('two years and more: no limit statement, the yearly headline, and the verifier refuses a short span', async () => {
    const unit = await build(job('air-passengers.csv', 'monthly', []));
    const s = unit.brief?.series[0] as SeriesBrief;
    expect(s.analysis.headlineSpan.yearly).toBe(true);
    expect(s.statements.some((x) => x.id === 'history-limit')).toBe(false);
    const t = structuredClone(s);
    const c = t.statements.find((x) => x.id === 'headline')?.claims[0];
    if (c?.kind !== 'trend-yearly-change') throw new Error('no claim');
    c.over = 12;
    expect(
      verifySeries(t)
        .map((f) => f.problem)
        .join('\n'),
    ).toMatch(/gives the change over 12 periods though the data hold two years/);
  });
});
