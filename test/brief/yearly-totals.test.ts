/**
 * match_yearly_totals: the seasonally adjusted series forced to the raw data's yearly totals (Denton's
 * proportional first-difference method, src/adjust/denton.ts), end to end through the brief. Open data:
 * R datasets' AirPassengers (a multiplicative, STL-on-logs model, where adjusted yearly totals drift from
 * the raw ones), UKgas (financial years), nottem in °C (an additive series whose adjusted values cross
 * zero), all from test/verify/corpus/ (sources in corpus.json).
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, test } from 'vitest';
import { buildBriefs } from '../../src/brief/build.js';
import { seriesView } from '../../src/document/view.js';
import { BriefError } from '../../src/errors.js';
import { loadJob } from '../../src/job/load.js';
import { describeFindings, verifySeries } from '../../src/verify/index.js';
import type { SeriesBrief } from '../../src/vocabulary/brief.js';
import { CORPUS_DIR } from '../verify/corpus.js';

function jobFile(lines: string[]): string {
  const dir = mkdtempSync(join(tmpdir(), 'tb-totals-'));
  const f = join(dir, 'job.yaml');
  writeFileSync(f, `${lines.join('\n')}\n`);
  return f;
}

function job(file: string, frequency: string, extra: string[], brief: string[] = [], defaults: string[] = []): string {
  return jobFile([
    'brief:',
    '  title: Totals',
    ...brief,
    ...defaults,
    'series:',
    '  - id: s',
    '    label: Series',
    ...(extra.some((l) => l.startsWith('combine:')) ? [] : ['    combine: sum']),
    `    frequency: ${frequency}`,
    `    data: { file: ${JSON.stringify(join(CORPUS_DIR, file))}, date: date, value: value }`,
    ...extra.map((l) => `    ${l}`),
    'comparisons: [year_on_year, year_to_date, fiscal_year_to_date, latest_year]',
  ]);
}

async function series(f: string): Promise<SeriesBrief> {
  const [unit] = await buildBriefs(loadJob(f), { toolVersion: 'test', charts: false, epoch: 0 });
  if (unit.error) throw unit.error;
  return unit.brief?.series[0] as SeriesBrief;
}

/** Sums of a component over the periods whose ISO date starts with each year, for whole years only. */
function yearSums(s: SeriesBrief, values: number[]): Map<string, number> {
  const out = new Map<string, number>();
  const count = new Map<string, number>();
  s.components.dates.forEach((d, i) => {
    const y = d.slice(0, 4);
    out.set(y, (out.get(y) ?? 0) + values[i]);
    count.set(y, (count.get(y) ?? 0) + 1);
  });
  for (const [y, n] of count) if (n !== 12) out.delete(y);
  return out;
}

describe('AirPassengers, multiplicative (STL on logarithms)', async () => {
  const plain = await series(
    job('air-passengers.csv', 'monthly', ['decomposition: { extend: off }'], ['  period: 1960-06']),
  );
  const matched = await series(
    job(
      'air-passengers.csv',
      'monthly',
      ['decomposition: { extend: off, match_yearly_totals: true }'],
      ['  period: 1960-06'],
    ),
  );

  test('without the option the adjusted yearly totals differ from the raw ones (why the option exists)', () => {
    const raw = yearSums(plain, plain.components.observed);
    const adj = yearSums(plain, plain.components.adjusted);
    const worst = Math.max(...[...raw].map(([y, v]) => Math.abs((adj.get(y) as number) / v - 1)));
    expect(worst).toBeGreaterThan(1e-3);
  });

  test('with it, each whole calendar year 1949–1959 adds up to the raw total; 1960 (to June) is carried on', () => {
    const raw = yearSums(matched, matched.components.observed);
    const adj = yearSums(matched, matched.components.adjusted);
    expect([...raw.keys()]).toEqual(Array.from({ length: 11 }, (_, i) => String(1949 + i)));
    for (const [y, v] of raw) expect(Math.abs((adj.get(y) as number) - v)).toBeLessThanOrEqual(1e-9 * v);
    expect(matched.yearlyTotals?.years.at(-1)).toMatchObject({ from: '1959-01-01', to: '1959-12-01' });
    // January–June 1960: the ratio of matched to decomposed values of December 1959, carried on.
    const c = matched.components;
    const dec = c.dates.indexOf('1959-12-01');
    const ratio = c.adjusted[dec] / (c.adjustedAsDecomposed as number[])[dec];
    for (let i = dec + 1; i < c.dates.length; i++) {
      expect(c.adjusted[i] / (c.adjustedAsDecomposed as number[])[i]).toBeCloseTo(ratio, 12);
    }
    // The decomposition itself is untouched: the same trend and seasonal as without the option.
    expect(c.trend).toEqual(plain.components.trend);
    expect(c.adjustedAsDecomposed).toEqual(plain.components.adjusted);
  });

  test('the statement says so, its claim and every other one verifies, and the year-to-date uses the matched series', () => {
    expect(describeFindings(verifySeries(matched, matched.components.observed))).toBe('');
    const st = matched.statements.find((x) => x.id === 'yearly-totals');
    expect(st?.text).toBe(
      "Each whole calendar year from January 1949 to December 1959 has the same total without the season as in the data. The seasonally adjusted figures are matched to those totals by Denton's method.",
    );
    const ytd = matched.analysis.comparisons.find((x) => x.kind === 'year-to-date');
    const c = matched.components;
    const [a, b] = [c.dates.indexOf('1960-01-01'), c.dates.indexOf('1960-06-01')];
    const sum = c.adjusted.slice(a, b + 1).reduce((x, y) => x + y, 0);
    expect(ytd?.adjusted.current).toBeCloseTo(sum, 9);
    expect(ytd?.adjusted.current).not.toBeCloseTo(
      plain.components.adjusted.slice(a, b + 1).reduce((x, y) => x + y, 0),
      3,
    );
  });

  test('the method appendix states it and cites Denton and the IMF manual', () => {
    const v = seriesView(matched, 'en-GB');
    const row = v.method.rows.find((r) => r[0] === 'Yearly totals');
    expect(row?.[1]).toMatch(
      /matched to the data's totals over each whole calendar year from January 1949 to December 1959 \(11 years\) by Denton's proportional first-difference method/,
    );
    expect(row?.[1]).toMatch(/only in part, or with a missing value, is not matched/);
    expect(v.method.rows.find((r) => r[0] === 'Model')?.[1]).toMatch(/so they are matched to them/);
    expect(v.sources.map((x) => x.source).join('\n')).toMatch(
      /Denton \(1971\).*66\(333\).*IMF Quarterly National Accounts Manual \(2017\), chapter 6/,
    );
    const none = seriesView(plain, 'en-GB');
    expect(none.method.rows.some((r) => r[0] === 'Yearly totals')).toBe(false);
  });

  test('the verifier catches adjusted totals that do not match', () => {
    const s = structuredClone(matched);
    s.components.adjusted[s.components.dates.indexOf('1955-03-01')] += 1;
    expect(
      verifySeries(s)
        .map((f) => f.problem)
        .join('\n'),
    ).toMatch(/over 1955-01-01–1955-12-01 adjusted adds to/);
    const t = structuredClone(matched);
    const st = t.statements.find((x) => x.id === 'yearly-totals');
    const claim = st?.claims[0];
    if (claim?.kind !== 'yearly-totals') throw new Error('no claim');
    claim.years = claim.years.filter((y) => y.from !== '1953-01-01');
    expect(
      verifySeries(t)
        .map((f) => f.problem)
        .join('\n'),
    ).toMatch(/the whole year 1953-01-01–1953-12-01 is not listed/);
    claim.years = [{ from: '1953-02-01', to: '1954-01-01' }];
    expect(
      verifySeries(t)
        .map((f) => f.problem)
        .join('\n'),
    ).toMatch(/is not a whole year of the data/);
  });
});

describe('financial years, defaults, and where it cannot be done', () => {
  test('UKgas with fiscal_year_start 4, set under defaults: years April to March', async () => {
    const s = await series(
      job(
        'uk-gas.csv',
        'quarterly',
        [],
        ['  fiscal_year_start: 4'],
        ['defaults:', '  decomposition: { match_yearly_totals: true }'],
      ),
    );
    expect(s.yearlyTotals?.years[0]).toMatchObject({ from: '1960-04-01', to: '1961-01-01' });
    expect(s.yearlyTotals?.years.at(-1)).toMatchObject({ from: '1985-04-01', to: '1986-01-01' });
    expect(s.statements.find((x) => x.id === 'yearly-totals')?.text).toMatch(
      /^Each whole financial year from Q2 1960 to Q1 1986/,
    );
    expect(describeFindings(verifySeries(s, s.components.observed))).toBe('');
  });

  test('an additive temperature in °C (nottem), averages: matched and verified', async () => {
    const s = await series(
      job('nottingham-c.csv', 'monthly', [
        'combine: mean',
        'decomposition: { model: additive, match_yearly_totals: true }',
      ]),
    );
    expect(s.statements.find((x) => x.id === 'yearly-totals')?.text).toMatch(
      /^Each whole calendar year from January 1920 to December 1939 has the same average without the season/,
    );
    expect(describeFindings(verifySeries(s, s.components.observed))).toBe('');
  });

  test('no identifiable seasonality (sunspots): nothing to match, the appendix says why, no statement', async () => {
    const s = await series(
      job('sunspots.csv', 'monthly', ['combine: mean', 'decomposition: { match_yearly_totals: true }']),
    );
    expect(s.settings.seasonalAdjustment.applied).toBe(false);
    expect(s.statements.some((x) => x.id === 'yearly-totals')).toBe(false);
    expect(s.components.adjustedAsDecomposed).toBeUndefined();
    const row = seriesView(s, 'en-GB').method.rows.find((r) => r[0] === 'Yearly totals');
    expect(row?.[1]).toBe(
      'asked for, but not done: the data are not seasonally adjusted, so there is nothing to match',
    );
  });

  test('weekly data: a located error naming the key', async () => {
    const f = job('chicago-weekly.csv', 'weekly', ['decomposition: { match_yearly_totals: true }']);
    const [unit] = await buildBriefs(loadJob(f), { toolVersion: 'test', charts: false, epoch: 0 });
    expect(unit.error).toBeInstanceOf(BriefError);
    // Line 9 of the job (brief:, title, series:, id, label, combine, frequency, data, then this):
    // "    decomposition: { match_yearly_totals: true }".
    expect(unit.error?.oneLine()).toMatch(
      new RegExp(
        `^${f.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}:9:\\d+: match_yearly_totals needs periods that fit into years`,
      ),
    );
  });

  test('a value that is not true or false: a located schema error', () => {
    const f = job('air-passengers.csv', 'monthly', ['decomposition: { match_yearly_totals: yes please }']);
    expect(() => loadJob(f)).toThrow(BriefError);
    try {
      loadJob(f);
    } catch (e) {
      expect((e as BriefError).oneLine()).toMatch(/job\.yaml:9:\d+: .*match_yearly_totals.*true or false/);
    }
  });
});
