/**
 * The render, check and init commands end to end in a child process: outputs, atomic writes, batches with
 * groups, shards, exit codes and one-line errors.
 */
import { cpSync, existsSync, mkdtempSync, readdirSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { EXAMPLE_COPY, ROOT, runCli } from './run.js';

const WATER = 'examples/water-deliveries/job.yaml';
const tmp = (): string => mkdtempSync(join(tmpdir(), 'tb-render-'));

describe('trendbrief render', () => {
  it('writes json to a new --out folder and nothing else', () => {
    const out = join(tmp(), 'nested', 'out');
    const r = runCli(['render', WATER, '--out', out, '--format', 'json']);
    expect(r.code).toBe(0);
    expect(readdirSync(out)).toEqual(['water-delivered-north-zone.json']);
    expect(r.stderr).toContain(`wrote ${join(out, 'water-delivered-north-zone.json')}`);
    const brief = JSON.parse(readFileSync(join(out, 'water-delivered-north-zone.json'), 'utf8'));
    expect(brief.series[0].id).toBe('north-deliveries');
  });

  it('gives the same bytes on two runs with SOURCE_DATE_EPOCH set', () => {
    const a = tmp();
    const b = tmp();
    const env = { SOURCE_DATE_EPOCH: '1767225600' };
    expect(runCli(['render', WATER, '--out', a, '--format', 'json,html'], env).code).toBe(0);
    expect(runCli(['render', WATER, '--out', b, '--format', 'json,html'], env).code).toBe(0);
    for (const f of ['water-delivered-north-zone.json', 'water-delivered-north-zone.html']) {
      expect(readFileSync(join(a, f)).equals(readFileSync(join(b, f)))).toBe(true);
    }
    expect(JSON.parse(readFileSync(join(a, 'water-delivered-north-zone.json'), 'utf8')).provenance.generatedAt).toBe(
      '2026-01-01T00:00:00.000Z',
    );
    // Beside HTML the brief has its charts; the JSON keeps their words and leaves out the drawings.
    const charts = JSON.parse(readFileSync(join(a, 'water-delivered-north-zone.json'), 'utf8')).series[0].charts;
    expect(charts.length).toBeGreaterThan(0);
    for (const c of charts) expect(Object.keys(c)).toEqual(['id', 'title', 'alt', 'caption', 'width', 'height']);
  });

  it('a failed run leaves earlier outputs untouched and writes no partial file', () => {
    const dir = tmp();
    cpSync(join(ROOT, 'examples/water-deliveries'), join(dir, 'job'), EXAMPLE_COPY);
    const job = join(dir, 'job', 'job.yaml');
    const out = join(dir, 'out');
    expect(runCli(['render', job, '--out', out, '--format', 'json']).code).toBe(0);
    const file = join(out, 'water-delivered-north-zone.json');
    const before = readFileSync(file);
    const mtime = statSync(file).mtimeMs;
    // Break the data: a value that is not a number.
    const csv = join(dir, 'job', 'data', 'deliveries.csv');
    writeFileSync(csv, readFileSync(csv, 'utf8').replace(/North,(\d+)/, 'North,12a'));
    const r = runCli(['render', job, '--out', out, '--format', 'json']);
    expect(r.code).toBe(2);
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).toMatch(/deliveries\.csv: row \d+, column "delivered_ml": "12a[\d.]*" is not a number — /);
    expect(readFileSync(file).equals(before)).toBe(true);
    expect(statSync(file).mtimeMs).toBe(mtime);
    expect(readdirSync(out)).toEqual(['water-delivered-north-zone.json']);
  });

  it('renders one brief per group and a summary; --shard splits the briefs without overlap', () => {
    const job = 'examples/clinic-visits/job.yaml';
    const all = new Set<string>();
    for (const k of [1, 2]) {
      const out = tmp();
      const r = runCli(['render', job, '--out', out, '--format', 'json', '--shard', `${k}/2`]);
      expect(r.code).toBe(0);
      expect(r.stderr).toMatch(new RegExp(`\\d briefs? written, 0 failed, in [\\d.]+ s \\(shard ${k}/2\\)`));
      for (const f of readdirSync(out)) {
        expect(all.has(f)).toBe(false);
        all.add(f);
      }
    }
    expect([...all].sort()).toEqual([
      'clinic-visits-harbour-street.json',
      'clinic-visits-hillcrest.json',
      'clinic-visits-old-mill.json',
    ]);
  });

  it('a folder of jobs renders each into its own subfolder; a failing job is listed and the rest go on (exit 1)', () => {
    const dir = tmp();
    cpSync(join(ROOT, 'examples/water-deliveries'), join(dir, 'jobs', 'water'), EXAMPLE_COPY);
    cpSync(join(ROOT, 'examples/online-orders'), join(dir, 'jobs', 'orders'), EXAMPLE_COPY);
    writeFileSync(join(dir, 'jobs', 'broken.yaml'), 'brief:\n  title: Broken\nseries: []\n');
    const out = join(dir, 'out');
    const r = runCli(['render', join(dir, 'jobs'), '--out', out, '--format', 'json']);
    expect(r.code).toBe(1);
    expect(readdirSync(out).sort()).toEqual(['orders', 'water']);
    expect(r.stderr).toMatch(/2 briefs written, 1 failed/);
    expect(r.stderr).toMatch(/failed: .*broken\.yaml/);
  });

  it('usage mistakes are one line with exit 2', () => {
    for (const args of [
      ['render'],
      ['render', WATER, '--format', 'docx'],
      ['render', WATER, '--shard', '3/2'],
      ['render', WATER, '--pdf-engine', 'laser'],
      ['render', 'no-such-job.yaml'],
    ]) {
      const r = runCli(args);
      expect(r.code, args.join(' ')).toBe(2);
      expect(r.stderr.trim().split('\n'), args.join(' ')).toHaveLength(1);
      expect(r.stderr).toMatch(/ — /);
    }
  });

  it('an output folder that cannot be written is a one-line error', () => {
    const dir = tmp();
    const file = join(dir, 'not-a-folder');
    writeFileSync(file, 'x');
    const r = runCli(['render', WATER, '--out', file, '--format', 'json']);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/is a file, not a folder|cannot create the output folder/);
  });
});

describe('trendbrief init and check', () => {
  it('init writes a starter job that check accepts and render turns into a brief', () => {
    const dir = join(tmp(), 'starter');
    expect(runCli(['init', dir]).code).toBe(0);
    expect(existsSync(join(dir, 'job.yaml'))).toBe(true);
    const c = runCli(['check', join(dir, 'job.yaml')]);
    expect(c.code).toBe(0);
    expect(c.stdout).toMatch(/valid job, 1 series, 1 brief/);
    expect(c.stdout).toMatch(/strength of trend/);
    expect(existsSync(join(dir, 'out'))).toBe(false);
    const r = runCli(['render', join(dir, 'job.yaml'), '--format', 'json']);
    expect(r.code).toBe(0);
    expect(existsSync(join(dir, 'out', 'bus-boardings.json'))).toBe(true);
    // A second init refuses to overwrite.
    const again = runCli(['init', dir]);
    expect(again.code).toBe(2);
    expect(again.stderr).toMatch(/already exists — choose another folder/);
  });

  it('every command has --help with an example', () => {
    for (const cmd of ['render', 'check', 'init', 'decompose']) {
      const r = runCli([cmd, '--help']);
      expect(r.code).toBe(0);
      expect(r.stdout).toMatch(/Usage: trendbrief/);
      expect(r.stdout).toMatch(/Example/);
    }
    expect(runCli(['--help']).code).toBe(0);
    expect(runCli(['frobnicate']).code).toBe(2);
  });
});
