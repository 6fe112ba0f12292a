/**
 * The wording defects found by briefing open datasets (issue "Every sentence true"), each held by a test
 * on the dataset that showed it. Datasets and their sources: test/verify/corpus/corpus.json.
 */
import { describe, expect, test } from 'vitest';
import { buildCharts } from '../../src/chart/index.js';
import { seriesView } from '../../src/document/view.js';
import type { SeriesBrief } from '../../src/vocabulary/brief.js';
import { buildCase, DATASETS, type Setting } from './corpus.js';

async function brief(id: string, lines: string[], comparisons?: string[], period?: string): Promise<SeriesBrief> {
  const d = DATASETS.find((x) => x.id === id);
  if (!d) throw new Error(`no dataset ${id}`);
  const setting: Setting = {
    name: 'test',
    series: () => lines,
    ...(comparisons ? { comparisons: () => comparisons } : {}),
    ...(period ? { period: () => period } : {}),
  };
  const r = await buildCase(d, setting);
  if (!r?.brief) throw r?.error ?? new Error('no brief');
  return r.brief.series[0];
}

const text = (s: SeriesBrief, id: string) => s.statements.find((x) => x.id === id)?.text ?? '';

describe('1. a window named in words is a calendar span', () => {
  test('daily data: "the last two years" holds two years of days, not 24 days', async () => {
    const s = await brief('chicago-daily', []);
    const u = s.statements.find((x) => x.id === 'unusual');
    const claim = u?.claims[0];
    expect(claim?.kind).toBe('unusual-count');
    if (claim?.kind !== 'unusual-count') return;
    // 29 August 2014 to 28 August 2016: 731 days (2016 is a leap year)
    expect([claim.span.from, claim.span.to, claim.span.periods]).toEqual(['2014-08-29', '2016-08-28', 731]);
    const inSpan = s.diagnostics.outliers.filter((o) => o.date >= '2014-08-29').length;
    expect(inSpan).toBeGreaterThan(0);
    expect(s.analysis.outliers).toHaveLength(inSpan);
    expect(u?.text).toMatch(new RegExp(`^${inSpan} days in the last two years stood out`));
    // The table says the same span.
    expect(seriesView(s, 'en-GB').unusual?.caption).toBe('Unusual periods in the last two years');
  });
});

describe('2. each seasonal pattern in its own terms', () => {
  test('a yearly pattern of days is described by month, not by weekday', async () => {
    const s = await brief('river-flow', ['decomposition: { method: stl, period: 365 }']);
    expect(text(s, 'seasonal')).toMatch(/^Each year, the seasonal peak is in (June|July|August)\b/);
    expect(text(s, 'seasonal')).not.toMatch(/day\b/);
    expect(s.analysis.seasonalProfile.seasons.map((x) => x.label)).toHaveLength(12);
  });
  test('periods 7 and 365: both patterns are described, by weekday and by month', async () => {
    const s = await brief('chicago-daily', ['decomposition: { method: mstl, periods: [7, 365] }']);
    expect(text(s, 'seasonal')).toMatch(/^Each week, the seasonal peak is on \w+day\b.*low point is on Sunday/);
    expect(text(s, 'seasonal-365')).toMatch(/^Each year, the seasonal peak is in [A-Z][a-z]+\b/);
    expect(s.analysis.seasonalProfiles.map((p) => p.naming)).toEqual(['weekday', 'month']);
    // Each pattern is drawn too, in its own terms.
    const charts = await buildCharts(s, 'en-GB');
    const week = charts.find((c) => c.id === 'seasonal-profile');
    const year = charts.find((c) => c.id === 'seasonal-profile-365');
    expect(week?.title).toMatch(/within the week$/);
    expect(year?.title).toMatch(/within the year$/);
    expect(week?.svg).toContain('>Sunday<');
    expect(year?.svg).toContain('>January<');
    expect(year?.svg).not.toContain('>Sunday<');
  });
});

describe('3. percent only where it means something', () => {
  const PERCENT_CHANGE = /\d(\.\d+)?\s?%/;
  test('a temperature in °F: changes in degrees, never percent', async () => {
    const s = await brief('nottingham-f', []);
    expect(s.changeExpression).toBe('absolute');
    // A test's level ("tested at the 0.1% level") is a percent of its own, not a change.
    for (const id of ['headline', 'seasonal', 'comparison-year-to-date'])
      expect(text(s, id).replace(/at the [\d.]+% level/g, '')).not.toMatch(PERCENT_CHANGE);
    expect(text(s, 'seasonal')).toMatch(/about [\d.]+ °F above the trend/);
  });
  test('a series in %: changes in points, not percent of a percent', async () => {
    const s = await brief('treasury-1y', []);
    expect(text(s, 'headline')).toMatch(/points (higher|lower)|up [\d.]+ points|down [\d.]+ points/);
    expect(text(s, 'comparison-latest-year')).toMatch(/That is [\d.]+ points (more|less) than/);
    expect(text(s, 'firmness')).not.toMatch(/\d %/);
  });
  test('a level crossing zero: the change is given, and peak and low are not swapped', async () => {
    const s = await brief('nottingham-c', []);
    expect(text(s, 'headline')).not.toMatch(/no value a year ago/);
    expect(text(s, 'headline')).toMatch(/°C (higher|lower)|(up|down) [\d.]+ °C/);
    // R: stl(nottem, s.window = 13) over 1939 peaks in July and is lowest in December (the same months in °C)
    expect(text(s, 'seasonal')).toMatch(/peak is in July.*low point is in December/);
  });
  test('a level around zero: summer is the peak, winter the low', async () => {
    // Hveravellir's mean temperature is below zero: 100·s/level would flip every season's sign.
    const s = await brief('river-temperature', ['decomposition: { method: stl, period: 365 }']);
    expect(text(s, 'seasonal')).toMatch(
      /peak is in (June|July|August).*low point is in (November|December|January|February|March)/,
    );
  });
  test('a percent asked of a level that is not above zero falls back to units', async () => {
    const s = await brief('river-temperature', ['change_as: percent'], undefined, '1974-12-30');
    expect(s.analysis.trendYearly.expression).toBe('absolute');
    expect(text(s, 'headline')).toMatch(/°C/);
  });
});

describe('4. peak and low from the seasonal component over whole cycles', () => {
  test('classical multiplicative AirPassengers: peak July (+22.66%), low November, as R', async () => {
    // extend: off — R's decompose sees the data alone; forecast extension (on by default for monthly data)
    // would add a year of forecasts to the moving averages and move the seasonal figure.
    const s = await brief('air-passengers', [
      'decomposition: { method: classical, model: multiplicative, extend: off }',
    ]);
    const p = s.analysis.seasonalProfile;
    // R 4.2: decompose(AirPassengers, "multiplicative")$figure: July 1.2266, November 0.8012 (printed to 4 digits)
    expect([p.peak.label, p.trough.label]).toEqual(['July', 'November']);
    expect(p.peak.effectPercent).toBeCloseTo(22.66, 1);
    expect(p.trough.effectPercent).toBeCloseTo(-19.88, 1);
    expect(text(s, 'seasonal')).toContain('peak is in July, about 22.7% above the trend');
  });
});

describe('5. a custom comparison names its own baseline', () => {
  test('a baseline three years earlier is not "the same span a year before"', async () => {
    const s = await brief(
      'uk-gas',
      [],
      ['  - { custom: { label: Winter quarters, current: [1986-Q1, 1986-Q4], baseline: [1983-Q1, 1983-Q4] } }'],
    );
    const t = text(s, 'comparison-custom-winter-quarters');
    expect(t).not.toContain('a year before');
    expect(t).toMatch(/than in Q1 1983 to Q4 1983 \(/);
  });
});

describe('8. one materiality rule for every direction word', () => {
  test('the direction tile says what the headline says', async () => {
    for (const d of ['uk-driver-deaths', 'treasury-1y', 'australian-residents', 'wine-sales']) {
      const s = await brief(d, []);
      const tile = seriesView(s, 'en-GB').keyFigures.find((k) => k.label === 'Trend direction');
      const h = text(s, 'headline');
      if (/broadly unchanged/.test(h)) expect(tile?.value).toBe('Broadly unchanged');
      else if (/ is up /.test(h)) expect(tile?.value).toBe('Rising');
      else expect(tile?.value).toBe('Falling');
    }
  });
});

describe('10. diagnostics are said: identifiable and residual seasonality, with their test levels', () => {
  test('no identifiable seasonality (sunspots): said with the level, no peak, the data left unadjusted', async () => {
    const s = await brief('sunspots', []);
    const t = s.diagnostics.identifiableSeasonality[0];
    expect(t.verdict).toBe('none');
    expect(text(s, 'seasonal')).toMatch(
      /^No clear yearly pattern shows in the data\. A test for a real seasonal pattern finds none \(F = [\d.]+, p = [\d.]+, at the 0\.1% level\)\. So the data are not adjusted for season\./,
    );
    expect(text(s, 'seasonal')).not.toMatch(/peak (is|was)/);
    expect(text(s, 'context')).not.toMatch(/season/);
    for (const c of s.analysis.comparisons) expect(text(s, `comparison-${c.id}`)).not.toMatch(/Without the season/);
    // The components: no season, the adjusted series is the data, the trend is the unadjusted data's.
    expect(s.settings.seasonalAdjustment.applied).toBe(false);
    expect(s.components.seasonal.every((v) => v === 0)).toBe(true);
    expect(s.components.adjusted).toEqual(s.components.observed);
    // The charts agree: no adjusted chart, no seasonal profile, and the remainder is what the trend leaves.
    const charts = await buildCharts(s, 'en-GB');
    expect(charts.map((c) => c.id)).not.toContain('adjusted-trend');
    expect(charts.some((c) => c.id.startsWith('seasonal-profile'))).toBe(false);
    expect(charts.find((c) => c.id === 'remainder')?.caption).toMatch(/what the trend leaves unexplained/);
    // And the key figures do not call the data seasonally adjusted.
    expect(seriesView(s, 'en-GB').keyFigures.map((k) => k.label)).toContain(
      'On previous period (not seasonally adjusted)',
    );
  });
  test('the unadjusted trend is the loess smooth of the data with the STL trend window (not of data less a season)', async () => {
    const s = await brief('sunspots', []);
    const k = s.components;
    // Remainder = data − trend exactly, and the trend is smooth: its second differences are far smaller
    // than the data's.
    for (let i = 0; i < k.observed.length; i++) expect(k.remainder[i]).toBeCloseTo(k.observed[i] - k.trend[i], 9);
    const rough = (v: number[]) => v.slice(2).reduce((a, x, i) => a + Math.abs(x - 2 * v[i + 1] + v[i]), 0);
    expect(rough(k.trend)).toBeLessThan(rough(k.observed) / 20);
  });
  test('residual seasonality found is said, with F, p and the level (UK driver deaths, robust STL: F ≈ 2.7–2.9, p < 0.01)', async () => {
    const s = await brief('uk-driver-deaths', ['change_as: units', 'decomposition: { method: stl, robust: true }']);
    expect(text(s, 'seasonal')).toMatch(
      /Some of the season is still left once it is taken out \(F = [\d.]+, p = 0\.00\d, at the 1% level\)\./,
    );
  });
  test('"none found" states the level, and an identifiable pattern says so', async () => {
    const s = await brief('nottingham-f', []);
    expect(text(s, 'seasonal')).toMatch(/No season is left once it is taken out, at the 1% level \(F = /);
    expect(text(s, 'seasonal')).toMatch(
      /A test for a real seasonal pattern finds one \(F = [\d.]+, p < 0\.001, at the 0\.1% level\)/,
    );
  });
  test('a daily series with a weekly pattern that is not identifiable but a yearly one that is (river temperature, MSTL)', async () => {
    const s = await brief('river-temperature', ['decomposition: { method: mstl, periods: [7, 365] }']);
    expect(s.settings.seasonalAdjustment.applied).toBe(true);
    expect(text(s, 'seasonal')).toMatch(
      /^No clear weekly pattern shows in the data\..*So no peak or low is given for it\./,
    );
    expect(text(s, 'seasonal-365')).toMatch(/^Each year, the seasonal peak is in (June|July|August)/);
  });
});

describe('12. wording', () => {
  test('"an average", never "a average"', async () => {
    const s = await brief('nottingham-f', []);
    expect(text(s, 'comparison-year-to-date')).toMatch(/: an average of /);
    expect(s.statements.map((x) => x.text).join(' ')).not.toMatch(/\ba average\b/);
  });
  test('no signed numbers in prose: direction is said in words', async () => {
    for (const d of ['uk-driver-deaths', 'nottingham-c', 'treasury-1y', 'chicago-weekly']) {
      const s = await brief(d, []);
      for (const st of s.statements.filter((x) => ['headline', 'context', 'seasonal', 'comparison'].includes(x.kind))) {
        // A level may be negative (−5.4 °C); a change never carries a sign.
        expect(st.text, st.id).not.toMatch(/(That is|change of|change is|moved by|about|it is) [+−-]\d/);
        expect(st.text, st.id).not.toMatch(/\+\d/);
      }
    }
  });
  test('a label keeps its capitals only where it opens a sentence', async () => {
    const s = await brief('uk-gas', []);
    for (const st of s.statements) {
      for (const m of st.text.matchAll(/uk-gas/g)) {
        const before = st.text.slice(0, m.index).trimEnd();
        expect(before === '' || before.endsWith('.'), st.text).toBe(true);
      }
    }
  });
});

describe('13. smaller wording defects', () => {
  test('key figures and tables of a series whose change is in units show no % or pts (Nottingham, °F)', async () => {
    // Found: the tiles gave "raw +2.1% on a year ago", an annualised percent and revisions in "pts".
    const s = await brief('nottingham-f', []);
    const v = seriesView(s, 'en-GB');
    for (const k of v.keyFigures) expect(`${k.label} ${k.value} ${k.note}`).not.toMatch(/%|\bpts\b/);
    for (const row of v.comparisons.rows) for (const cell of row.slice(5)) expect(cell).not.toMatch(/%/);
  });
  test('firmness bounds in prose carry no sign: "between a fall of … and a rise of …"', async () => {
    const s = await brief('uk-driver-deaths', []);
    const t = text(s, 'firmness');
    expect(t).toMatch(/revisions were between (a fall of|a rise of|no change)/);
    expect(t).not.toMatch(/[−+]\d/);
  });
  test('"1.0 point", not "1.0 points"', async () => {
    const { pointWord } = await import('../../src/narrate/statements.js');
    expect([pointWord('1.0'), pointWord('1'), pointWord('1,0'), pointWord('0.9'), pointWord('2.0')]).toEqual([
      'point',
      'point',
      'point',
      'points',
      'points',
    ]);
  });
});
