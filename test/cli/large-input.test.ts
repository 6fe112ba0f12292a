/**
 * A long hourly series (100,000 hours, about eleven years; bench/make-hourly.mjs, seeded) renders to HTML,
 * PDF and JSON as a brief that summarises: the PDF a few pages long (it was 1,895 pages, its data appendix
 * one row an hour), the HTML a fraction of a megabyte (its charts one vertex an hour), the JSON holding every
 * component of every period. The million-hour case, with its time and memory, is bench/large.js's; tests
 * never assert times.
 */
import { mkdtempSync, readFileSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { writeHourlyJob } from '../../bench/make-hourly.mjs';
import { runCli } from './run.js';

const POINTS = 100_000;
let dir: string;
let job: string;

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'trendbrief-large-'));
  job = writeHourlyJob(POINTS, join(dir, 'job'));
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** Pages of a PDF: pdfkit writes each page object plainly, "/Type /Page". */
function pageCount(pdf: Buffer): number {
  return (pdf.toString('latin1').match(/\/Type \/Page\b(?!s)/g) ?? []).length;
}

describe('a 100,000-hour series', () => {
  it('renders to HTML, PDF and JSON as a brief of a few pages', { timeout: 600_000 }, () => {
    const out = join(dir, 'out');
    const r = runCli(['render', job, '--out', out, '--format', 'html,pdf,json', '--quiet'], {
      TRENDBRIEF_RECORD: 'never',
    });
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    const pdf = readFileSync(join(out, 'hourly-demand.pdf'));
    const pages = pageCount(pdf);
    expect(pages).toBeGreaterThan(5);
    expect(pages).toBeLessThanOrEqual(30);
    // Charts of summaries and a data table of the latest 400 hours: well under a megabyte.
    expect(statSync(join(out, 'hourly-demand.html')).size).toBeLessThan(1_000_000);
    const html = readFileSync(join(out, 'hourly-demand.html'), 'utf8');
    expect(html).toContain('The latest 400 of 100,000 periods are listed');
    expect(html).toContain('Electricity demand: the last 14 days, hour by hour');
    expect(html).toContain('Re-fits for firmness and sensitivity');
    const brief = JSON.parse(readFileSync(join(out, 'hourly-demand.json'), 'utf8'));
    const c = brief.series[0].components;
    expect(c.dates.length).toBe(POINTS);
    expect(c.observed.length).toBe(POINTS);
    expect(brief.series[0].analysis.firmness.refitWindow).toBe(3 * 8736);
  });
});
