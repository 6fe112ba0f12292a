/**
 * Smaller defects found by trying the tool as a new user would, each kept fixed here (run on the built
 * command line, dist/).
 */
import { existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, test } from 'vitest';
import { ROOT, runCli } from './run.js';

const dir = mkdtempSync(join(tmpdir(), 'trendbrief-small-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
const ORDERS = join(ROOT, 'examples', 'online-orders', 'job.yaml'); // monthly data

describe('the reporting period', () => {
  test('a quarter on monthly data is an error naming the accepted forms, not silently its first month', () => {
    // Found: --period 1960-Q2 on monthly data silently meant April 1960.
    const out = join(dir, 'coarse');
    const r = runCli(['render', ORDERS, '--period', '2024-Q2', '--out', out, '--format', 'json']);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/the reporting period "2024-Q2" names a quarter, but series "orders" is monthly/);
    expect(r.stderr).toMatch(/accepted: YYYY-MM, or a date within the month/);
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(existsSync(join(out, 'online-orders.json'))).toBe(false);
  });

  test('a month, or a date within it, is accepted on monthly data', () => {
    for (const period of ['2024-06', '2024-06-15']) {
      const r = runCli(['render', ORDERS, '--period', period, '--out', join(dir, period), '--format', 'json']);
      expect(r.code, r.stderr).toBe(0);
    }
  });
});

describe('options', () => {
  test('-q is --quiet', () => {
    // Found: "-q" was refused with node's message about positionals.
    const r = runCli(['render', '-q', ORDERS, '--out', join(dir, 'quiet'), '--format', 'json']);
    expect(r.code, r.stderr).toBe(0);
    expect(r.stderr).toBe('');
    expect(existsSync(join(dir, 'quiet', 'online-orders.json'))).toBe(true);
  });

  test('an unknown option is named in one plain line', () => {
    const r = runCli(['render', '-x', ORDERS]);
    expect(r.code).toBe(2);
    expect(r.stderr.trim()).toBe('unknown option "-x" — run "trendbrief render --help" for the options');
  });
});

describe('too little data, and what a failed run leaves', () => {
  // AirPassengers (R datasets), its first 20 months: less than the 25 months a monthly brief needs.
  const short = join(dir, 'short');
  mkdirSync(short, { recursive: true });
  const csv = readFileSync(join(ROOT, 'test', 'verify', 'corpus', 'air-passengers.csv'), 'utf8').split('\n');
  writeFileSync(join(short, 'pax.csv'), `${csv.slice(0, 21).join('\n')}\n`);
  writeFileSync(
    join(short, 'job.yaml'),
    'brief:\n  title: Short\nseries:\n  - id: pax\n    label: Passengers\n    unit: thousand\n    combine: sum\n    frequency: monthly\n    data: { file: pax.csv, date: date, value: value }\n',
  );
  test('check says so in one line with the minimum, and never "valid job" first', () => {
    // Found: "valid job" was printed, then exit 2 with an unexplained "(25)".
    const r = runCli(['check', join(short, 'job.yaml')]);
    expect(r.code).toBe(2);
    expect(r.stdout).toBe('');
    const lines = r.stderr.trim().split('\n');
    expect(lines).toHaveLength(1);
    expect(lines[0]).toMatch(
      /has 20 months of data up to the reporting period; a brief of monthly data needs at least 25/,
    );
  });
  test('render that fails creates no --out folder', () => {
    // Found: the folder was created before the brief failed, and left empty.
    const out = join(dir, 'never-made');
    const r = runCli(['render', join(short, 'job.yaml'), '--out', out, '--format', 'json']);
    expect(r.code).toBe(2);
    expect(existsSync(out)).toBe(false);
  });
});

describe('help examples', () => {
  test('the example in decompose --help works on its own file', () => {
    // Found: it named the water example's file, which holds two zones in one column.
    const help = runCli(['decompose', '--help']).stdout;
    const line = help.split('\n').find((l) => l.trim().startsWith('trendbrief decompose examples/'));
    expect(line).toBeDefined();
    const args = (line as string).trim().split(/\s+/).slice(1);
    const r = runCli(args.map((a) => (a.startsWith('examples/') ? join(ROOT, a) : a)));
    expect(r.code, r.stderr).toBe(0);
    expect(r.stdout.split('\n')[0]).toMatch(/trend/);
  });
});

describe('the accent colour', () => {
  test('colours the trend line, as the job reference says', () => {
    const job = join(dir, 'accent.yaml');
    writeFileSync(
      job,
      `brief:\n  title: Accent\n  accent: "#AA3377"\nseries:\n  - id: orders\n    label: Orders\n    unit: orders\n    combine: sum\n    frequency: monthly\n    data: { file: ${JSON.stringify(join(ROOT, 'examples', 'online-orders', 'data', 'orders.csv'))}, date: month, value: orders }\n`,
    );
    const r = runCli(['render', job, '--out', join(dir, 'accent'), '--format', 'html']);
    expect(r.code, r.stderr).toBe(0);
    const html = readFileSync(join(dir, 'accent', 'accent.html'), 'utf8');
    expect(html).toMatch(/<path[^>]*stroke="#AA3377"/i);
  });
});
