/**
 * End to end: `trendbrief render` of twelve weeks of hourly data (test/verify/corpus/electricity-hourly.csv:
 * R package forecast's taylor, half-hourly electricity demand in England and Wales, 5 June to 27 August
 * 2000, Taylor 2003, averaged to hours) to HTML, PDF and email. Before, the command refused it (exit 2: a
 * brief needed two years). The PDF is read back by poppler's pdftotext, the email by mailparser.
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { simpleParser } from 'mailparser';
import { describe, expect, test } from 'vitest';
import { ROOT, runCli } from './run.js';

const poppler = spawnSync('pdftotext', ['-v']).error === undefined;
const required = process.env.CI === 'true';

describe('an hourly brief from twelve weeks of data', () => {
  const dir = mkdtempSync(join(tmpdir(), 'tb-short-cli-'));
  const file = join(ROOT, 'test', 'verify', 'corpus', 'electricity-hourly.csv');
  writeFileSync(
    join(dir, 'job.yaml'),
    `brief:\n  title: Electricity demand\n  email: { from: briefs@example.org, to: [ops@example.org] }\nseries:\n  - id: demand\n    label: Electricity demand\n    unit: MW\n    combine: mean\n    frequency: hourly\n    data: { file: ${JSON.stringify(file)}, date: date, value: value }\n    decomposition: { method: mstl, periods: [24, 168] }\n`,
  );
  const out = join(dir, 'out');
  const r = runCli(['render', join(dir, 'job.yaml'), '--out', out, '--format', 'html,pdf,eml'], {
    TRENDBRIEF_RECORD: 'never',
  });
  const limit =
    'A yearly comparison needs at least two years of data. This series has 2,016 hours (12 weeks). So the trend’s change is given over a week instead.';
  const plain = (t: string) => t.replace(/\s+/g, ' ').replace(/&#x27;|&#39;|'/g, '’');

  test('renders HTML, PDF and email, exit 0', () => {
    expect(r.stderr).not.toMatch(/error|failed/i);
    expect(r.code).toBe(0);
    expect(readdirSync(out).sort()).toEqual([
      'electricity-demand.eml',
      'electricity-demand.html',
      'electricity-demand.pdf',
    ]);
  });

  test('the HTML says what it cannot compare, and gives the week-earlier comparison', () => {
    const html = plain(readFileSync(join(out, 'electricity-demand.html'), 'utf8'));
    expect(html).toContain(limit);
    expect(html).toContain('Same hour a week earlier');
    expect(html).toContain('on a week earlier');
  });

  test.runIf(poppler || required)('so does the PDF, read back by pdftotext', () => {
    const text = plain(
      execFileSync('pdftotext', ['-enc', 'UTF-8', join(out, 'electricity-demand.pdf'), '-'], { encoding: 'utf8' }),
    );
    expect(text).toContain(limit);
    expect(text).toContain('Trend, on a week earlier');
  });
  test.skipIf(poppler || required)('PDF text check skipped: pdftotext (poppler-utils) is not installed', () => {});

  test('and the email', async () => {
    const mail = await simpleParser(readFileSync(join(out, 'electricity-demand.eml')));
    expect(plain(mail.text ?? '')).toContain(limit);
    expect(plain(mail.html || '')).toContain(limit);
  });
});
