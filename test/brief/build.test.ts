/**
 * buildBriefs on the example jobs: one brief per group of a split job, and explicit, located errors for a
 * reporting period the data cannot support. Expected groups and dates are read off the example data files
 * (examples/clinic-visits/data/visits.csv, examples/water-deliveries/data/deliveries.csv), not the code.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, test } from 'vitest';
import { type BriefUnit, buildBriefs } from '../../src/brief/build.js';
import { BriefError } from '../../src/errors.js';
import { loadJob } from '../../src/job/load.js';

const EXAMPLES = join(import.meta.dirname, '..', '..', 'examples');
const options = { toolVersion: 'test', charts: false, epoch: 0 };

describe('one brief per group', async () => {
  const file = join(EXAMPLES, 'clinic-visits', 'job.yaml');
  const units = await buildBriefs(loadJob(file), options);
  // The distinct values of the group_by column "site", straight from the CSV.
  const lines = readFileSync(join(EXAMPLES, 'clinic-visits', 'data', 'visits.csv'), 'utf8')
    .trim()
    .split('\n');
  const siteColumn = lines[0].split(',').indexOf('site');
  const sites = [...new Set(lines.slice(1).map((l) => l.split(',')[siteColumn]))].sort();

  test('three sites, three briefs, none failed', () => {
    expect(sites).toHaveLength(3);
    expect(units.map((u) => u.group).sort()).toEqual(sites);
    expect(units.every((u) => u.error === null && u.brief !== null)).toBe(true);
  });

  test('each brief is named for its group and carries only its group', () => {
    for (const u of units) {
      const b = u.brief;
      if (!b) throw u.error;
      expect(b.meta.title).toBe(`Clinic visits — ${u.group}`);
      expect(b.series).toHaveLength(1);
      expect(b.series[0].group).toBe(u.group);
    }
    // different sites, different data: the visits on the reporting day differ
    const last = units.map((u) => u.brief?.series[0].components.observed.at(-1));
    expect(new Set(last).size).toBe(3);
  });
});

describe('a reporting period the data cannot support', async () => {
  const file = join(EXAMPLES, 'water-deliveries', 'job.yaml');
  const job = loadJob(file);
  const csv = readFileSync(join(EXAMPLES, 'water-deliveries', 'data', 'deliveries.csv'), 'utf8')
    .trim()
    .split('\n');
  const months = csv.slice(1).map((l) => l.split(',')[0]);
  const first = [...months].sort()[0];
  const build = (period: string): Promise<BriefUnit[]> => buildBriefs(job, { ...options, period });

  /** The unit failed with a BriefError whose single line names the job file and says how to fix it. */
  function expectOneLineError(units: BriefUnit[], code: string): string {
    expect(units).toHaveLength(1);
    const e = units[0].error;
    expect(e).toBeInstanceOf(BriefError);
    if (!e) throw new Error('no error');
    expect(e.code).toBe(code);
    expect(e.hint.length).toBeGreaterThan(10);
    const line = e.oneLine();
    expect(line).not.toContain('\n');
    expect(line.startsWith(`${file}: `)).toBe(true);
    expect(line).toContain(` — ${e.hint}`);
    return line;
  }

  test('the data start in January 2015', () => {
    expect(first).toBe('2015-01');
  });

  test('a period after the data', async () => {
    const line = expectOneLineError(await build('2030-01'), 'period-outside-data');
    expect(line).toContain('2030-01');
    expect(line).toContain('choose a period within the data');
  });

  test('a period before the data', async () => {
    expectOneLineError(await build('2014-06'), 'period-outside-data');
  });

  test('fewer than two full years before the period: December 2016 has 23 months before it', async () => {
    // January 2015 to December 2016 is 24 periods in all; a brief needs 2·12 before the reporting one, 25 in all
    const line = expectOneLineError(await build('2016-12'), 'too-short');
    expect(line).toContain('24 months of data');
    expect(line).toContain('needs at least 25');
    expect(line).toContain('add older data or choose a later reporting period');
  });

  test('January 2017, the first period with two full years before it, builds', async () => {
    const units = await build('2017-01');
    expect(units[0].error).toBeNull();
    expect(units[0].brief?.series[0].reportingDate).toBe('2017-01-01');
    expect(units[0].brief?.series[0].components.dates).toHaveLength(25);
  });

  test('a period that is not a date', async () => {
    expectOneLineError(await build('soon'), 'bad-period');
  });
});

describe('progress while a brief is built (BriefProgress)', async () => {
  // bench/brief-12.yaml: twelve series whose data all end in the same month (bench/data/brief-12.csv).
  const file = join(import.meta.dirname, '..', '..', 'bench', 'brief-12.yaml');
  const job = loadJob(file);
  const csv = readFileSync(join(import.meta.dirname, '..', '..', 'bench', 'data', 'brief-12.csv'), 'utf8')
    .trim()
    .split('\n');
  const lastMonth = `${csv[csv.length - 1].split(',')[0]}-01`;

  async function record(period?: string) {
    const calls: string[] = [];
    const units = await buildBriefs(job, {
      ...options,
      ...(period ? { period } : {}),
      progress: {
        start: async (meta, provenance, heads) => {
          calls.push(`start ${meta.title} ${provenance.generatedAt}`);
          for (const h of heads) calls.push(`head ${h.label} ${h.frequency} ${h.reportingDate}`);
        },
        series: (s) => calls.push(`series ${s.id}`),
      },
    });
    return { calls, units };
  }

  test('the head first, with each series’ label and reporting period, then every series in the job’s order', async () => {
    const { calls, units } = await record();
    const brief = units[0].brief;
    if (!brief) throw units[0].error;
    expect(calls[0]).toBe(`start ${job.brief.title} 1970-01-01T00:00:00.000Z`);
    expect(calls.slice(1, 13)).toEqual(job.series.map((s) => `head ${s.label} monthly ${lastMonth}`));
    expect(calls.slice(13)).toEqual(job.series.map((s) => `series ${s.id}`));
    expect(brief.series.map((s) => s.reportingDate)).toEqual(job.series.map(() => lastMonth));
  });

  test('a reporting period in error: no head, no series, the error as without progress', async () => {
    const { calls, units } = await record('2030-01');
    expect(calls).toEqual([]);
    expect(units[0].error?.code).toBe('period-outside-data');
  });
});
