/**
 * The record end to end, through the built command line on a copy of the water example in a temp folder:
 * each month's brief says what the last one said and what the same figure is now, lists past values the
 * source changed, records a rerun as a re-issue, and `history verify` passes until a row is altered. The
 * expected figures are worked out here from the JSON briefs' own components, not by the code under test.
 */
import { spawnSync } from 'node:child_process';
import { cpSync, existsSync, mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Database from 'better-sqlite3';
import { describe, expect, it } from 'vitest';
import { EXAMPLE_COPY, ROOT, runCli } from '../cli/run.js';

const EPOCH = '1790000000';

interface JsonBrief {
  series: {
    reportingDate: string;
    components: { dates: string[]; trend: number[]; observed: number[] };
    analysis: { trendYoY: { percent: number } };
    statements: { id: string; kind: string; text: string }[];
  }[];
}

function copyExample(): string {
  const dir = mkdtempSync(join(tmpdir(), 'tb-history-'));
  cpSync(join(ROOT, 'examples', 'water-deliveries'), dir, EXAMPLE_COPY);
  return dir;
}

function render(dir: string, period: string, extra: string[] = [], env: Record<string, string> = {}) {
  const r = runCli(
    [
      'render',
      join(dir, 'job.yaml'),
      '--out',
      join(dir, 'out'),
      '--format',
      'json',
      '--record',
      'always',
      '--period',
      period,
      ...extra,
    ],
    { SOURCE_DATE_EPOCH: EPOCH, TRENDBRIEF_RECORD: 'auto', ...env },
  );
  const file = join(dir, 'out', 'water-delivered-north-zone.json');
  return { ...r, brief: existsSync(file) ? (JSON.parse(readFileSync(file, 'utf8')) as JsonBrief) : null };
}

describe('a brief with a record of the briefs before it', () => {
  const dir = copyExample();

  it('says nothing of earlier briefs when there are none', () => {
    const r = render(dir, '2026-07');
    expect(r.code, r.stderr).toBe(0);
    expect(r.brief?.series[0].statements.filter((s) => s.kind === 'history')).toEqual([]);
    expect(existsSync(join(dir, 'trendbrief-record.sqlite'))).toBe(true);
  });

  it("gives the last brief's yearly trend change beside the same figure now", () => {
    const july = render(dir, '2026-07').brief?.series[0];
    const r = render(dir, '2026-08');
    expect(r.code, r.stderr).toBe(0);
    const s = r.brief?.series[0];
    if (!july || !s) throw new Error('no brief');
    // Today's trend gives July's yearly change as 100·(trend[July 2026] / trend[July 2025] − 1).
    const i = s.components.dates.indexOf('2026-07-01');
    const now = 100 * (s.components.trend[i] / s.components.trend[i - 12] - 1);
    const since = s.statements.find((x) => x.id === 'since-last');
    // The water series is put in percent (relative): the sizes are unsigned, the direction in words.
    const words = (v: number) => {
      const size = Math.abs(v).toFixed(1);
      return size === '0.0' ? 'the same as a year before' : `${size}% ${v > 0 ? 'higher' : 'lower'} than a year before`;
    };
    expect(since?.text).toBe(
      `In the July 2026 brief, the trend for July 2026 was ${words(july.analysis.trendYoY.percent)}. With data to August 2026, it is ${words(now)}.`,
    );
  });

  it('lists past values the source data changed since the last brief', () => {
    const csv = join(dir, 'data', 'deliveries.csv');
    const text = readFileSync(csv, 'utf8');
    const row = /^2026-05,North,([\d.]+)$/m.exec(text);
    if (!row) throw new Error('no May 2026 row');
    writeFileSync(csv, text.replace(row[0], '2026-05,North,6150'));
    const s = render(dir, '2026-09').brief?.series[0];
    const revised = s?.statements.find((x) => x.id === 'source-revisions');
    // Thousands are printed whole (6,332.8 → "6,333").
    const before = Math.round(Number(row[1])).toLocaleString('en-GB');
    expect(revised?.text).toBe(
      `Since the August 2026 brief, the source data changed for 1 earlier month: May 2026 from ${before} to 6,150 ML.`,
    );
  });

  it('records a rerun as a re-issue with its reason, and the chain verifies', () => {
    const r = render(dir, '2026-09', ['--reason', 'May corrected by the supplier']);
    expect(r.code, r.stderr).toBe(0);
    const db = new Database(join(dir, 'trendbrief-record.sqlite'), { readonly: true });
    const rows = db.prepare('SELECT seq, period, issue, reason FROM trendbrief_record_entries ORDER BY seq').all() as {
      seq: number;
      period: string;
      issue: number;
      reason: string;
    }[];
    db.close();
    expect(rows.map((x) => [x.period, x.issue])).toEqual([
      ['2026-07-01', 1],
      ['2026-07-01', 2],
      ['2026-08-01', 1],
      ['2026-09-01', 1],
      ['2026-09-01', 2],
    ]);
    expect(rows[4].reason).toBe('May corrected by the supplier (same job and data as issue 1)');
    const v = runCli(['history', 'verify', join(dir, 'job.yaml')]);
    expect(v.code, v.stderr).toBe(0);
    expect(v.stdout).toBe(`${join(dir, 'trendbrief-record.sqlite')}: 5 entries, the chain holds\n`);
  });

  it('exports the history as CSV and JSON', () => {
    const csv = runCli(['history', 'export', join(dir, 'job.yaml'), '--as', 'csv']);
    expect(csv.code, csv.stderr).toBe(0);
    const lines = csv.stdout.trimEnd().split('\r\n');
    expect(lines[0]).toMatch(/^seq,kind,recorded_at,brief,group,series,period,issue,reason,/);
    expect(lines.length).toBe(6);
    const json = runCli(['history', 'export', join(dir, 'job.yaml'), '--as', 'json', '--values']);
    const entries = JSON.parse(json.stdout) as { seq: number; body: { values: number[]; files: unknown[] } }[];
    expect(entries.map((e) => e.seq)).toEqual([1, 2, 3, 4, 5]);
    expect(entries[4].body.values.at(-5)).toBe(6150);
    expect(entries[4].body.files).toHaveLength(1);
  });

  it('names the entry a changed row breaks', () => {
    const file = join(dir, 'trendbrief-record.sqlite');
    const db = new Database(file);
    db.exec(
      "DROP TRIGGER trendbrief_record_no_update; UPDATE trendbrief_record_entries SET body = replace(body, 'Water', 'Wine') WHERE seq = 3",
    );
    db.close();
    const v = runCli(['history', 'verify', '--file', file]);
    expect(v.code).toBe(2);
    expect(v.stderr).toBe(
      `${file}: entry 3 breaks the chain: its contents do not match its hash — the record was altered at or after entry 3; keep a copy of it for the audit\n`,
    );
  });
});

describe('a record that cannot be written', () => {
  it('costs one line and the brief is still written', () => {
    const dir = copyExample();
    writeFileSync(join(dir, 'trendbrief-record.sqlite'), 'not a database '.repeat(200));
    const r = render(dir, '2026-09');
    expect(r.code).toBe(0);
    expect(r.brief).not.toBeNull();
    const file = join(dir, 'trendbrief-record.sqlite');
    expect(r.stderr.split('\n')[0]).toBe(
      `not recorded: ${file}: ${file} is not a trendbrief record (not an SQLite database) — point record.file at the record, or move the file away`,
    );
  });

  it('fails the brief, writing nothing, when the job requires recording', () => {
    const dir = copyExample();
    const job = join(dir, 'job.yaml');
    writeFileSync(job, `${readFileSync(job, 'utf8')}\nrecord:\n  required: true\n`);
    writeFileSync(join(dir, 'trendbrief-record.sqlite'), 'not a database '.repeat(200));
    const r = render(dir, '2026-09');
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/is not a trendbrief record/);
    expect(existsSync(join(dir, 'out')) ? readdirSync(join(dir, 'out')) : []).toEqual([]);
  });
});

describe('examples/history.mjs', () => {
  it('renders eight months into one record, so the last brief speaks of the ones before', () => {
    const out = mkdtempSync(join(tmpdir(), 'tb-example-history-'));
    const r = spawnSync(process.execPath, [join(ROOT, 'examples', 'history.mjs'), out], {
      encoding: 'utf8',
      env: { ...process.env, TRENDBRIEF_RECORD: 'auto' },
    });
    expect(r.status, r.stderr).toBe(0);
    expect(r.stdout).toMatch(/^In the August 2026 brief, the trend for August 2026 was /);
    expect(r.stdout).toContain(
      'Since the August 2026 brief, the source data changed for 1 earlier month: July 2026 from 6,691 to 7,240 ML.',
    );
    expect(r.stdout).toMatch(
      /Across 7 briefs already published, the yearly change of the trend as first published has since moved by/,
    );
    const html = readFileSync(join(out, '2026-09', 'water-delivered-north-zone.html'), 'utf8');
    expect(html).toContain('Published first estimates and today’s estimates');
    // Two consecutive months both speak of the month before.
    const august = JSON.parse(
      readFileSync(join(out, '2026-08', 'water-delivered-north-zone.json'), 'utf8'),
    ) as JsonBrief;
    expect(august.series[0].statements.find((s) => s.id === 'since-last')?.text).toMatch(/^In the July 2026 brief/);
    const v = runCli(['history', 'verify', '--file', join(out, 'trendbrief-record.sqlite')]);
    expect(v.stdout).toMatch(/: 8 entries, the chain holds\n$/);
  });
});
