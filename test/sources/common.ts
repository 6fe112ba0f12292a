/**
 * Shared by the source tests: the 72 invented months of test/bad-input/good (200 + 1.5·t + 25·sin(2π·month/12)
 * plus a small repeating wobble), a job file around a data block, and a run of the real command line that
 * checks the bad-input rule (exit 2, one line, nothing written in --out).
 */
import { existsSync, mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { expect } from 'vitest';
import { type RunResult, runCli } from '../cli/run.js';

export const MONTHS: { month: string; value: number }[] = readFileSync(
  fileURLToPath(new URL('../bad-input/good/data/values.csv', import.meta.url)),
  'utf8',
)
  .trim()
  .split('\n')
  .slice(1)
  .map((line) => {
    const [month, value] = line.split(',');
    return { month, value: Number(value) };
  });

export function tempDir(prefix: string): string {
  return mkdtempSync(join(tmpdir(), `trendbrief-${prefix}-`));
}

/** Writes dir/job.yaml: a one-series job whose data block is `data` (YAML lines, indented by the caller). */
export function writeJob(dir: string, data: string, extra = ''): string {
  const job = join(dir, 'job.yaml');
  writeFileSync(
    job,
    `brief:
  title: Source sample
  organisation: Test bench
${extra}series:
  - id: sample
    label: Sample measure
    unit: units
    combine: sum
    data:
${data
  .trim()
  .split('\n')
  .map((l) => `      ${l}`)
  .join('\n')}
`,
  );
  return job;
}

/** Renders html and json into a fresh folder; the figures of the json. */
export function render(job: string, env: Record<string, string> = {}): { result: RunResult; json: BriefJson | null } {
  const out = join(job, '..', 'out');
  const result = runCli(['render', job, '--out', out, '--format', 'html,json'], env);
  const file = existsSync(out) ? readdirSync(out).find((f) => f.endsWith('.json')) : undefined;
  return { result, json: file ? (JSON.parse(readFileSync(join(out, file), 'utf8')) as BriefJson) : null };
}

export interface BriefJson {
  series: {
    data: { file: string; sha256: string; rows: number; query?: string };
    components: { dates: string[]; observed: number[] };
  }[];
}

/** The rule for bad input: exit 2, nothing on stdout, one line on stderr matching `line`, no file in --out. */
export function expectBadInput(job: string, line: RegExp, env: Record<string, string> = {}): string {
  const out = join(job, '..', 'out-bad');
  const r = runCli(['render', job, '--out', out, '--format', 'html,json'], env);
  expect(r.stderr.trim().split('\n'), r.stderr).toHaveLength(1);
  expect(r.stderr.trim()).toMatch(line);
  expect(r.stderr).not.toMatch(/\n\s+at /);
  expect(r.code).toBe(2);
  expect(r.stdout).toBe('');
  expect(existsSync(out) ? readdirSync(out) : []).toEqual([]);
  return r.stderr.trim();
}
