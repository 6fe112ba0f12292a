/**
 * Comparison sentences say which baseline they use, like with like (analyse/spans.ts): the same weekday
 * a year earlier for a day, the same ISO week number for a week (and why a week 53 meets a week 52), and
 * a plain note when the two spans differ in length (a leap year, a 53-week year). Built from small invented
 * series (test/narrate/synthetic.ts) whose last period is chosen for each case; dates checked by hand.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, test } from 'vitest';
import { buildBriefs } from '../../src/brief/build.js';
import { loadJob } from '../../src/job/load.js';
import { verifySeries } from '../../src/verify/index.js';
import type { SeriesBrief } from '../../src/vocabulary/brief.js';
import { type Frequency, isoWeekStart, ordinalOf } from '../../src/vocabulary/period-index.js';
import { writeSyntheticJob } from './synthetic.js';

const dir = mkdtempSync(join(tmpdir(), 'trendbrief-comparison-words-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** A synthetic series of `length` periods ending at the period holding `lastMs`. */
async function seriesEnding(name: string, frequency: Frequency, lastMs: number, length: number): Promise<SeriesBrief> {
  const last = ordinalOf(frequency, lastMs);
  const file = writeSyntheticJob(dir, {
    name,
    frequency,
    length,
    start: last - length + 1,
    locale: 'en-GB',
    good: 'neither',
    growth: 0.001,
  });
  const units = await buildBriefs(loadJob(file), { toolVersion: 'test', charts: false, epoch: 0 });
  const s = units[0].brief?.series[0];
  if (!s) throw units[0].error ?? new Error('no brief');
  // Every claim of these briefs holds (src/verify shares no code with the narrator).
  expect(verifySeries(s)).toEqual([]);
  return s;
}

const text = (s: SeriesBrief, id: string) => s.statements.find((x) => x.id === `comparison-${id}`)?.text ?? '';

describe('days', async () => {
  // Wednesday 30 September 2026; 364 days earlier is Wednesday 1 October 2025.
  const s = await seriesEnding('daily-sept', 'daily', Date.UTC(2026, 8, 30), 800);

  test('the same day last year is named as the same weekday a year earlier, with its date', () => {
    // Found: "the same span a year before" for a baseline 364 days back, which readers take for 30 September.
    expect(text(s, 'year-on-year')).toMatch(/than on the same weekday a year earlier, 1 October 2025 \(/);
  });

  test('spans of equal length carry no note', () => {
    expect(text(s, 'year-to-date')).not.toContain('differ in length');
  });
});

test('a leap year to date says its span is a day longer', async () => {
  // 1 January to 1 March 2024 is 31 + 29 + 1 = 61 days; 1 January to 1 March 2023 is 60.
  const s = await seriesEnding('daily-leap', 'daily', Date.UTC(2024, 2, 1), 800);
  expect(text(s, 'year-to-date')).toContain('The spans differ in length: 61 days against 60 days.');
});

describe('weeks', async () => {
  test('week 53 meets week 52 of a year without a week 53, and says why', async () => {
    // ISO 2020 has 53 weeks and ISO 2019 has 52. Found: 2020-W53 was compared with 2020-W01.
    const s = await seriesEnding('weekly-53', 'weekly', isoWeekStart(2020, 53), 220);
    expect(text(s, 'year-on-year')).toMatch(/than in week 52 of 2019 \([^)]*\)\. 2019 had no week 53\./);
    // The year to date then holds 53 weeks against 52 weeks.
    expect(text(s, 'year-to-date')).toContain('The spans differ in length: 53 weeks against 52 weeks.');
  });

  test('week 1 meets week 1', async () => {
    // Found: 2021-W01 − 52 weeks is 2020-W02 (ISO 2020 has 53 weeks).
    const s = await seriesEnding('weekly-1', 'weekly', isoWeekStart(2021, 1), 220);
    expect(text(s, 'year-on-year')).toMatch(/than in week 1 of 2020 \(/);
    const c = s.analysis.comparisons.find((x) => x.kind === 'fiscal-year-to-date');
    expect(c?.current.periods).toBe(c?.baseline.periods);
  });
});
