/**
 * Smaller defects found by trying the tool as a new user would, each kept fixed here (run on the built
 * command line, dist/).
 */
import { existsSync, mkdtempSync, rmSync } from 'node:fs';
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
