/**
 * Charts as files of their own, for slides (`--chart-files`, job key brief.chart_files): each chart of each
 * series as SVG and PNG beside the brief, named BRIEF--SERIES--CHART, written with the brief's other files.
 */
import { cpSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { EXAMPLE_COPY, ROOT, runCli } from './run.js';

let dir: string;
beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'trendbrief-chart-files-'));
  cpSync(join(ROOT, 'examples', 'water-deliveries'), join(dir, 'water'), EXAMPLE_COPY);
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const PNG_SIGNATURE = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);

describe('--chart-files', () => {
  it('writes every chart as SVG and PNG beside the brief, with distinct, stable names', () => {
    const out = join(dir, 'out');
    const r = runCli([
      'render',
      join(dir, 'water', 'job.yaml'),
      '--out',
      out,
      '--format',
      'html',
      '--chart-files',
      'svg,png',
      '--record',
      'never',
      '--quiet',
    ]);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    const files = readdirSync(out).sort();
    const html = files.filter((f) => f.endsWith('.html'));
    expect(html.length).toBe(1);
    const stem = html[0].replace(/\.html$/, '');
    const svgs = files.filter((f) => f.endsWith('.svg'));
    const pngs = files.filter((f) => f.endsWith('.png'));
    expect(svgs.length).toBeGreaterThanOrEqual(5);
    expect(pngs.map((f) => f.replace(/\.png$/, ''))).toEqual(svgs.map((f) => f.replace(/\.svg$/, '')));
    expect(svgs).toContain(`${stem}--north-deliveries--observed-trend.svg`);
    for (const f of svgs) {
      expect(f.startsWith(`${stem}--`)).toBe(true);
      const text = readFileSync(join(out, f), 'utf8');
      expect(text.startsWith('<?xml version="1.0" encoding="UTF-8"?>\n<svg')).toBe(true);
      expect(text).toContain('xmlns="http://www.w3.org/2000/svg"');
    }
    for (const f of pngs) expect(readFileSync(join(out, f)).subarray(0, 8).equals(PNG_SIGNATURE)).toBe(true);
    // The same names and bytes on a second run.
    const again = join(dir, 'again');
    runCli(
      [
        'render',
        join(dir, 'water', 'job.yaml'),
        '--out',
        again,
        '--format',
        'html',
        '--chart-files',
        'svg',
        '--record',
        'never',
        '--quiet',
      ],
      { SOURCE_DATE_EPOCH: '1790000000' },
    );
    for (const f of readdirSync(again).filter((x) => x.endsWith('.svg')))
      expect(readFileSync(join(again, f)).equals(readFileSync(join(out, f))), f).toBe(true);
  });

  it('takes the job key brief.chart_files, and none turns it off', () => {
    const job = join(dir, 'water', 'job.yaml');
    const text = readFileSync(job, 'utf8').replace(/^brief:\n/m, 'brief:\n  chart_files: [png]\n');
    const keyed = join(dir, 'water', 'keyed.yaml');
    writeFileSync(keyed, text);
    const out = join(dir, 'keyed');
    expect(runCli(['render', keyed, '--out', out, '--format', 'html', '--record', 'never', '--quiet']).code).toBe(0);
    expect(readdirSync(out).filter((f) => f.endsWith('.png')).length).toBeGreaterThanOrEqual(5);
    expect(readdirSync(out).some((f) => f.endsWith('.svg'))).toBe(false);
    const off = join(dir, 'off');
    runCli([
      'render',
      keyed,
      '--out',
      off,
      '--format',
      'html',
      '--chart-files',
      'none',
      '--record',
      'never',
      '--quiet',
    ]);
    expect(readdirSync(off).filter((f) => !f.endsWith('.html'))).toEqual([]);
  });

  it('refuses an unknown picture format in one line, exit 2, writing nothing', () => {
    const out = join(dir, 'bad');
    const r = runCli(['render', join(dir, 'water', 'job.yaml'), '--out', out, '--chart-files', 'gif']);
    expect(r.code).toBe(2);
    expect(r.stderr.trim().split('\n').length).toBe(1);
    expect(r.stderr).toContain('unknown chart file format "gif"');
  });
});
