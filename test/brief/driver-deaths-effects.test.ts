/**
 * A brief of UK car drivers killed or seriously injured (datasets::UKDriverDeaths, January 1969 to December
 * 1984, from the committed R fixture test/model/fixtures/arima.json) with the job's defaults: the search
 * for unnamed events is on for monthly data and finds the seat-belt law of 31 January 1983 as a step
 * down from February 1983 (Harvey & Durbin 1986, JRSS A 149(3): a fall of about a fifth). The brief says so
 * in words, the trend holds the step, and every claim verifies.
 */
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { buildBriefs } from '../../src/brief/build.js';
import { loadJob } from '../../src/job/load.js';
import { describeFindings, verifyBrief } from '../../src/verify/index.js';

const fx = JSON.parse(readFileSync(new URL('../model/fixtures/arima.json', import.meta.url), 'utf8'));
const values: number[] = fx.cases.find((c: { id: string }) => c.id === 'driver-drift').values;

describe('UK driver deaths with the default search for events', () => {
  it('finds the February 1983 step down, says it in words, and every claim is true', { timeout: 120_000 }, async () => {
    const dir = mkdtempSync(join(tmpdir(), 'drivers-'));
    const rows = values.map((v, t) => `${1969 + Math.floor(t / 12)}-${String((t % 12) + 1).padStart(2, '0')},${v}`);
    writeFileSync(join(dir, 'drivers.csv'), `month,killed\n${rows.join('\n')}\n`);
    writeFileSync(
      join(dir, 'job.yaml'),
      [
        'brief: { title: Drivers killed or seriously injured }',
        'series:',
        '  - id: drivers',
        '    label: Drivers killed or seriously injured',
        '    unit: people',
        '    combine: sum',
        '    data: { file: drivers.csv, date: month, value: killed }',
        // Harvey & Durbin model the logarithms: a multiplicative model here.
        '    decomposition: { model: multiplicative }',
        '',
      ].join('\n'),
    );
    expect(values.length).toBe(192);
    const [unit] = await buildBriefs(loadJob(join(dir, 'job.yaml')), { toolVersion: 'test', charts: false, epoch: 0 });
    if (unit.error) throw unit.error;
    const s = unit.brief!.series[0];
    const step = s.effects?.events.find((e) => e.kind === 'step' && e.date === '1983-02-01');
    expect(step).toBeDefined();
    // Harvey & Durbin's estimate of the law's effect on the logarithms is about −0.24 (from memory).
    expect(Math.abs(step!.estimate + 0.24)).toBeLessThan(0.05);
    const words = s.statements.find((x) => x.claims.some((c) => c.kind === 'level-step' && c.from === '1983-02-01'));
    expect(words?.text).toMatch(
      /^From February 1983 the level stepped down by about \d+(\.\d)?%? ?(people)? \(found in the data\)\. The trend includes that step\.$/,
    );
    // The trend holds the step: its fall across January to February 1983 is most of the step's size.
    const t = s.components.trend;
    const i = s.components.dates.indexOf('1983-02-01');
    expect(t[i] / t[i - 1]).toBeLessThan(0.9);
    expect(describeFindings(verifyBrief(unit.brief!))).toBe('');
  });
});
