/**
 * A batch reads each job's data once, on the main thread, and hands every task only its own group's
 * series (src/cli/batch.ts planTasks, src/brief/build.ts dataOfGroup), so pool workers neither read the
 * data file nor hold the other groups. Checked here: each planned task carries exactly its group; after a
 * structured clone (what the pool sends a worker) and with the data file emptied of its rows, every brief is still
 * written, byte for byte as a run that reads the file itself writes it.
 */
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { type BatchTask, clearCaches, planTasks, runTask } from '../../src/cli/batch.js';
import type { RenderOptions } from '../../src/cli/render-files.js';

const GROUPS = ['North', 'South', 'Zürich'];

/** Three invented monthly series of four years, one per group; the job briefs each group. */
function writeJob(dir: string): string {
  const rows = ['month,branch,value'];
  GROUPS.forEach((g, j) => {
    for (let i = 0; i < 48; i++) {
      const month = `${2021 + Math.floor(i / 12)}-${String((i % 12) + 1).padStart(2, '0')}`;
      const value = 100 * (j + 1) + i + 10 * Math.sin((2 * Math.PI * i) / 12) + ((i * 7 + j) % 5);
      rows.push(`${month},${g},${value.toFixed(1)}`);
    }
  });
  mkdirSync(join(dir, 'data'), { recursive: true });
  writeFileSync(join(dir, 'data/groups.csv'), `${rows.join('\n')}\n`);
  const job = `brief:
  title: Branch throughput
  outputs: [html]
series:
  - id: throughput
    label: Throughput
    unit: units
    combine: sum
    good: up
    data:
      file: data/groups.csv
      date: month
      value: value
      group_by: branch
    decomposition:
      method: stl
      seasonal_window: 13
comparisons:
  - year_on_year
`;
  writeFileSync(join(dir, 'job.yaml'), job);
  return join(dir, 'job.yaml');
}

const options: RenderOptions = { formats: ['html'], period: null, pdfEngine: null, overrides: {} };

describe('a batch hands each brief its own group', () => {
  const dir = mkdtempSync(join(tmpdir(), 'tb-batch-data-'));
  const epoch = process.env.SOURCE_DATE_EPOCH;
  process.env.SOURCE_DATE_EPOCH = '1767225600';
  afterAll(() => {
    rmSync(dir, { recursive: true, force: true });
    if (epoch === undefined) delete process.env.SOURCE_DATE_EPOCH;
    else process.env.SOURCE_DATE_EPOCH = epoch;
  });
  const jobFile = writeJob(dir);

  it('plans one task per group, each carrying only that group’s series', () => {
    const { tasks, failures } = planTasks([jobFile], join(dir, 'out'), options, null);
    expect(failures).toEqual([]);
    expect(tasks.map((t) => t.group).sort()).toEqual([...GROUPS].sort());
    for (const t of tasks) {
      expect(t.data).toHaveLength(1);
      const [, data] = t.data?.[0] ?? [];
      expect(data?.groups.map((g) => g.key)).toEqual([t.group]);
      // The file's row count stays the whole file's (3 groups × 48 months), as a brief's provenance says.
      expect(data?.rows).toBe(144);
    }
  });

  it('writes the same briefs from the handed data, with the data file emptied, as from the file', async () => {
    clearCaches();
    const fromFile = join(dir, 'from-file');
    mkdirSync(fromFile, { recursive: true });
    for (const group of GROUPS) {
      const task: BatchTask = { jobFile, group, outDir: fromFile, options, smtp: null };
      expect((await runTask(task)).error).toBeNull();
    }
    clearCaches();
    const handed = join(dir, 'handed');
    mkdirSync(handed, { recursive: true });
    const { tasks } = planTasks([jobFile], handed, options, null);
    // The job still names the file (loading the job checks it is there), but reading it now would fail.
    writeFileSync(join(dir, 'data/groups.csv'), 'month,branch,value\n');
    for (const t of tasks) {
      const result = await runTask(structuredClone(t));
      expect(result.error).toBeNull();
      expect(result.files).toHaveLength(1);
      const same = join(fromFile, result.files[0].slice(handed.length + 1));
      expect(readFileSync(result.files[0]).equals(readFileSync(same))).toBe(true);
    }
  }, 60_000);
});
