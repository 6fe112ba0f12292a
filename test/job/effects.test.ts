/**
 * The effects: keys of a job (calendar effects, named events, the search for others): each mistake is one
 * line naming the job file, the line and column of the setting, and a fix; settings that pass are resolved
 * as written, under defaults: too. Lines and columns are counted from the job texts below (1-based).
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { buildBriefs } from '../../src/brief/build.js';
import { mulberry32, normal } from '../../src/data/synthetic.js';
import { BriefError } from '../../src/errors.js';
import { loadJob } from '../../src/job/load.js';

const dir = mkdtempSync(join(tmpdir(), 'effects-job-'));

/** 96 months from January 2018 (invented: level 500, a yearly swing of 40, noise of 5), one gap in May 2020. */
function monthly(): string {
  const rand = mulberry32(17);
  const rows = ['month,value'];
  for (let t = 0; t < 96; t++) {
    const y = 2018 + Math.floor(t / 12);
    const m = (t % 12) + 1;
    const v = 500 + 40 * Math.sin((2 * Math.PI * t) / 12) + 5 * normal(rand);
    rows.push(`${y}-${String(m).padStart(2, '0')},${y === 2020 && m === 5 ? '' : v.toFixed(2)}`);
  }
  return `${rows.join('\n')}\n`;
}
function weekly(): string {
  const rows = ['week,value'];
  const start = Date.UTC(2021, 0, 4);
  for (let t = 0; t < 160; t++) {
    rows.push(`${new Date(start + t * 7 * 86_400_000).toISOString().slice(0, 10)},${(100 + (t % 52)).toFixed(1)}`);
  }
  return `${rows.join('\n')}\n`;
}
writeFileSync(join(dir, 'monthly.csv'), monthly());
writeFileSync(join(dir, 'weekly.csv'), weekly());

let count = 0;
/** A job file whose line 9 onwards is `effects` (indented under the series). */
function job(effects: string, data = 'monthly.csv', date = 'month'): string {
  const f = join(dir, `job-${++count}.yaml`);
  writeFileSync(
    f,
    [
      'brief:',
      '  title: Effects',
      'series:',
      '  - id: s',
      '    label: S',
      '    combine: sum',
      `    data: { file: ${data}, date: ${date}, value: value }`,
      '    decomposition: { extend: off }',
      ...effects.split('\n').map((l) => `    ${l}`),
      '',
    ].join('\n'),
  );
  return f;
}

function loadError(f: string): string {
  try {
    loadJob(f);
  } catch (e) {
    if (e instanceof BriefError) return e.oneLine();
    throw e;
  }
  throw new Error('loaded without an error');
}

async function buildError(f: string): Promise<{ line: string; code: string }> {
  const units = await buildBriefs(loadJob(f), { toolVersion: 'test', charts: false, epoch: 0 });
  const e = units[0].error;
  if (!(e instanceof BriefError)) throw new Error(`no BriefError: ${String(e)}`);
  return { line: e.oneLine(), code: e.code };
}

describe('effects: keys checked against the schema, each error on its line', () => {
  it('days: an unknown choice', () => {
    const f = job('effects:\n  days: weekdays');
    // line 10 "      days: weekdays": 6 spaces + "days: " = 12 characters before the value → column 13
    expect(loadError(f)).toBe(
      `${f}:10:13: series[0].effects.days must be working, each_weekday or none, got "weekdays" — write days: working for flows that happen on working days, or days: none`,
    );
  });
  it('leap_year: not true or false', () => {
    const f = job('effects:\n  leap_year: sometimes');
    expect(loadError(f)).toMatch(new RegExp(`^${f}:10:18: series\\[0\\]\\.effects\\.leap_year must be true or false`));
  });
  it('easter_days: beyond 25', () => {
    const f = job('effects:\n  easter_days: 40');
    expect(loadError(f)).toMatch(new RegExp(`^${f}:10:20: .*easter_days.* — write e\\.g\\. easter_days: 8`));
  });
  it('find: an unknown switch', () => {
    const f = job('effects:\n  find: maybe');
    expect(loadError(f)).toMatch(new RegExp(`^${f}:10:13: .*find must be auto, on or off`));
  });
  it('find_kinds: an unknown kind', () => {
    const f = job('effects:\n  find_kinds: [one_off, spike]');
    // "      find_kinds: [one_off, " is 6 + 12 + 10 = 28 characters → column 29
    expect(loadError(f)).toMatch(new RegExp(`^${f}:10:29: .*one_off, step or fading`));
  });
  it('an event without a label', () => {
    const f = job('effects:\n  events:\n    - { kind: step, at: 2020-03 }');
    // the mapping starts after "        - " (10 characters): column 11
    expect(loadError(f)).toMatch(new RegExp(`^${f}:11:11: .*missing the required key "label"`));
  });
  it('an event of an unknown kind', () => {
    const f = job('effects:\n  events:\n    - { kind: jump, at: 2020-03, label: X }');
    // "        - { kind: " is 18 characters → column 19
    expect(loadError(f)).toMatch(new RegExp(`^${f}:11:19: .*step, fading, one_off or ramp`));
  });
  it('an event at something that is not a period', () => {
    const f = job('effects:\n  events:\n    - { kind: step, at: March, label: X }');
    expect(loadError(f)).toMatch(new RegExp(`^${f}:11:29: .*a period such as 2026-09`));
  });
  it('a ramp without its end', () => {
    const f = job('effects:\n  events:\n    - { kind: ramp, at: 2020-03, label: X }');
    expect(loadError(f)).toMatch(new RegExp(`^${f}:11:19: a ramp needs the period it ends at — add until:`));
  });
  it('until on a step', () => {
    const f = job('effects:\n  events:\n    - { kind: step, at: 2020-03, until: 2020-06, label: X }');
    expect(loadError(f)).toMatch(new RegExp(`^${f}:11:38: until is only used by a ramp, not by a step event`));
  });
  it('fading_rate on a one-off', () => {
    const f = job('effects:\n  events:\n    - { kind: one_off, at: 2020-03, fading_rate: 0.5, label: X }');
    expect(loadError(f)).toMatch(new RegExp(`^${f}:11:41: fading_rate is only used by a fading event`));
  });
  it('fading_rate of 1', () => {
    const f = job('effects:\n  events:\n    - { kind: fading, at: 2020-03, fading_rate: 1, label: X }');
    expect(loadError(f)).toMatch(new RegExp(`^${f}:11:53: .*fading_rate must be a number between 0 and 1`));
  });
  it('a ramp that ends before it starts', () => {
    const f = job('effects:\n  events:\n    - { kind: ramp, at: 2020-03, until: 2020-01, label: X }');
    expect(loadError(f)).toMatch(new RegExp(`^${f}:11:45: the ramp ends \\(2020-01\\) no later than it starts`));
  });
  it('an unknown key, with the close match', () => {
    const f = job('effects:\n  leapyear: true');
    expect(loadError(f)).toMatch(new RegExp(`^${f}:10:7: .*leap_year`));
  });
});

describe('effects: settings that need the data, each error on its line', () => {
  it('an event outside the data', async () => {
    const f = job('effects:\n  events:\n    - { kind: step, at: 2030-03, label: New tariff }');
    const { line, code } = await buildError(f);
    expect(code).toBe('event-outside-data');
    expect(line).toBe(
      `${f}:11:29: event "New tariff" at 2030-03 is outside the data (2018-01-01 to 2025-12-01) — give a period within the data, or remove the event`,
    );
  });
  it('an event on a missing period', async () => {
    const f = job('effects:\n  events:\n    - { kind: one_off, at: 2020-05, label: Strike }');
    const { line, code } = await buildError(f);
    expect(code).toBe('event-on-missing');
    expect(line).toMatch(new RegExp(`^${f}:11:32: event "Strike" at 2020-05 falls on a period with no value`));
  });
  it('a ramp ending outside the data', async () => {
    const f = job('effects:\n  events:\n    - { kind: ramp, at: 2020-03, until: 2031-01, label: Roll-out }');
    const { code, line } = await buildError(f);
    expect(code).toBe('event-outside-data');
    expect(line).toMatch(new RegExp(`^${f}:11:45: `));
  });
  it('working days on weekly data', async () => {
    const f = job('effects:\n  days: working', 'weekly.csv', 'week');
    const { line, code } = await buildError(f);
    expect(code).toBe('effects-frequency');
    expect(line).toBe(
      `${f}:10:13: days: working needs monthly or quarterly data, but this series is weekly — remove days: from this series' effects, or set it only for monthly and quarterly series`,
    );
  });
  it('leap year and Easter on weekly data', async () => {
    expect((await buildError(job('effects:\n  leap_year: true', 'weekly.csv', 'week'))).line).toMatch(
      /:10:18: leap_year/,
    );
    expect((await buildError(job('effects:\n  easter_days: 8', 'weekly.csv', 'week'))).line).toMatch(
      /:10:20: an Easter effect needs monthly or quarterly data/,
    );
  });
  it('an unknown holiday region, with close matches, on its line', async () => {
    const { line, code } = await buildError(job('effects:\n  days: working\n  holidays: UK'));
    expect(code).toBe('holiday-region');
    // line 11 "      holidays: UK": 6 + 10 characters before the value → column 17
    expect(line).toMatch(/:11:17: unknown holiday country "UK"; close matches: .*GB/);
  });
  it('a holiday file with a date that is not one: the file and its row', async () => {
    writeFileSync(join(dir, 'bad-holidays.csv'), '2024-12-25, Christmas Day\n2024-02-30, Nonsense\n');
    const { line } = await buildError(job('effects:\n  days: working\n  holiday_file: bad-holidays.csv'));
    expect(line).toMatch(/^bad-holidays\.csv: row 2: 2024-02-30/);
  });
  it('holidays on weekly data', async () => {
    const { line, code } = await buildError(job('effects:\n  holidays: GB-ENG', 'weekly.csv', 'week'));
    expect(code).toBe('effects-frequency');
    expect(line).toMatch(/:10:17: holidays needs monthly, quarterly or daily data, but this series is weekly/);
  });
  it('holidays of a region count out of working days', async () => {
    const f = job('effects:\n  days: working\n  holidays: GB-ENG\n  find: off');
    const units = await buildBriefs(loadJob(f), { toolVersion: 'test', charts: false, epoch: 0 });
    if (units[0].error) throw units[0].error;
    const s = units[0].brief!.series[0];
    expect(s.settings.effects?.holidays).toMatch(/^England, United Kingdom \(date-holidays [\d.]+\)$/);
    // December 2025: 23 weekdays, less Christmas Day (Thursday) and Boxing Day (Friday) → 21 (common knowledge).
    const i = s.components.dates.indexOf('2025-12-01');
    expect(s.effects?.workingDays?.[i]).toBe(21);
    expect(s.effects?.holidays).toEqual(expect.arrayContaining(['2025-12-25', '2025-12-26']));
  });
  it('a setting under defaults: is pointed at there', async () => {
    const f = join(dir, 'defaults.yaml');
    writeFileSync(
      f,
      [
        'brief: { title: D }',
        'defaults:',
        '  effects: { days: working }',
        'series:',
        '  - { id: w, label: W, combine: sum, data: { file: weekly.csv, date: week, value: value } }',
        '',
      ].join('\n'),
    );
    // line 3 "  effects: { days: " is 19 characters → column 20
    expect((await buildError(f)).line).toMatch(new RegExp(`^${f}:3:20: days: working needs monthly`));
  });
});

describe('effects: resolved as written', () => {
  it('merges defaults key by key; kinds in the pipeline names', () => {
    const f = join(dir, 'merge.yaml');
    writeFileSync(
      f,
      [
        'brief: { title: M }',
        'defaults:',
        '  effects: { days: each_weekday, easter_days: 8, find: off }',
        'series:',
        '  - id: a',
        '    label: A',
        '    combine: sum',
        '    data: { file: monthly.csv, date: month, value: value }',
        '    effects:',
        '      find: on',
        '      find_kinds: [step]',
        '      events: [{ kind: fading, at: 2020-03, label: Storm }]',
        '',
      ].join('\n'),
    );
    const e = loadJob(f).series[0].effects;
    expect(e.days).toBe('each-weekday');
    expect(e.easterDays).toBe(8);
    expect(e.find).toBe('on');
    expect(e.findKinds).toEqual(['step']);
    expect(e.events).toEqual([{ kind: 'fading', at: '2020-03', until: null, label: 'Storm', fadingRate: 0.7 }]);
  });
});
