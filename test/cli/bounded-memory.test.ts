/**
 * Memory stays bounded on a long series: a 300,000-hour series (about 34 years; bench/make-hourly.mjs,
 * seeded) renders to HTML, PDF and JSON in a process whose V8 old generation is capped at 140 MB. What the
 * brief keeps alive at once (the components, the dates, the charts, the PDF being drawn) peaked between 100
 * and 120 MB when this was written (the run dies of heap exhaustion at 100, passes at 120), so a change that
 * holds a copy of a component more, builds the JSON or a component's text as one string, or an object per
 * period, breaks it. The million-hour case, with its peak resident memory against the 1 GB target, is
 * bench/large.js's; tests never assert times.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { writeHourlyJob } from '../../bench/make-hourly.mjs';
import { BIN, ROOT } from './run.js';

const POINTS = 300_000;
const OLD_SPACE_MB = 140;
let dir: string;
let job: string;

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'trendbrief-bounded-'));
  job = writeHourlyJob(POINTS, join(dir, 'job'));
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe(`a ${POINTS.toLocaleString('en')}-hour series with the heap capped at ${OLD_SPACE_MB} MB`, () => {
  it('renders to HTML, PDF and JSON', { timeout: 600_000 }, () => {
    const out = join(dir, 'out');
    const r = spawnSync(
      process.execPath,
      [
        `--max-old-space-size=${OLD_SPACE_MB}`,
        BIN,
        'render',
        job,
        '--out',
        out,
        '--format',
        'html,pdf,json',
        '--quiet',
      ],
      { cwd: ROOT, env: { ...process.env, NO_COLOR: '1', TRENDBRIEF_RECORD: 'never' }, encoding: 'utf8' },
    );
    expect(r.stderr.split('\n').slice(0, 5).join('\n')).toBe('');
    expect(r.status).toBe(0);
    const brief = JSON.parse(readFileSync(join(out, 'hourly-demand.json'), 'utf8'));
    const c = brief.series[0].components;
    expect(c.dates.length).toBe(POINTS);
    expect(c.trend.length).toBe(POINTS);
    expect(c.dates[POINTS - 1]).toBe('2034-03-22T23:00Z');
  });
});
