/**
 * Comparison kinds renamed to names of our own: an old name is refused where it is written, with the new
 * name, and the new names load.
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, test } from 'vitest';
import { BriefError } from '../../src/errors.js';
import { loadJob } from '../../src/job/load.js';

function job(comparisons: string): string {
  const dir = mkdtempSync(join(tmpdir(), 'tb-renamed-'));
  writeFileSync(join(dir, 'd.csv'), 'month,v\n2026-01,1\n');
  const file = join(dir, 'job.yaml');
  writeFileSync(
    file,
    `brief:\n  title: T\nseries:\n  - id: a\n    label: A\n    combine: sum\n    data: { file: d.csv, date: month, value: v }\ncomparisons:\n${comparisons}\n`,
  );
  return file;
}

function messages(file: string): string[] {
  try {
    loadJob(file);
  } catch (e) {
    if (e instanceof BriefError) {
      const all = (e as BriefError & { errors?: BriefError[] }).errors ?? [e];
      return all.map((x) => x.message);
    }
    throw e;
  }
  return [];
}

describe('renamed comparison kinds', () => {
  test('old names are refused at their place, naming the new one', () => {
    const file = job('  - same_period_last_year\n  - { rolling_12: { label: Last year } }');
    const text = messages(file).join('\n');
    expect(text).toContain('the comparison "same_period_last_year" is now called "year_on_year"');
    expect(text).toContain('the comparison "rolling_12" is now called "latest_year"');
    expect(text).not.toContain('one of');
  });
  test('the new names load', () => {
    const j = loadJob(job('  - year_on_year\n  - { latest_year: { label: Last year } }\n  - year_to_date'));
    expect(j.comparisons.map((c) => c.kind)).toEqual(['year-on-year', 'latest-year', 'year-to-date']);
  });
});
