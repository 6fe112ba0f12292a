/**
 * Faults through the real command line, each once a wrong success, a crash or a leak: recipients given on
 * the command line that smuggle in another recipient or a header, a template that writes to stdout, and
 * --debug that showed nothing for a failure inside a brief.
 */
import { cpSync, existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { runCli } from './run.js';

const GOOD = fileURLToPath(new URL('../bad-input/good/', import.meta.url));

/** The bad-input suite's good job in a folder of its own, with template overrides if given. */
function job(templates: Record<string, string> = {}): { file: string; out: string } {
  const dir = mkdtempSync(join(tmpdir(), 'tb-faults-'));
  cpSync(GOOD, join(dir, 'job'), { recursive: true });
  const file = join(dir, 'job', 'job.yaml');
  if (Object.keys(templates).length > 0) {
    for (const [name, text] of Object.entries(templates)) {
      mkdirSync(join(dir, 'job', 'tpl', 'partials'), { recursive: true });
      writeFileSync(join(dir, 'job', 'tpl', name), text);
    }
    writeFileSync(
      file,
      readFileSync(file, 'utf8').replace(
        '  organisation: Test bench\n',
        '  organisation: Test bench\n  templates: tpl\n',
      ),
    );
  }
  return { file, out: join(dir, 'out') };
}

describe('--to is read as strictly as the job file’s addresses', () => {
  for (const to of ['a@x.example b@x.example', 'a@x.example\r\nBcc: evil@y.example', 'a@x.example:evil@y.example']) {
    it(`refuses ${JSON.stringify(to)} and writes nothing`, () => {
      // Once: one recipient "a@x.example" <b@x.example>, or a Bcc header of its own, and exit 0.
      const { file, out } = job();
      const r = runCli(['render', file, '--out', out, '--format', 'eml', '--to', to]);
      expect(r.code, r.stderr).toBe(2);
      const lines = r.stderr.trimEnd().split('\n');
      expect(lines).toHaveLength(1);
      expect(lines[0]).toMatch(/^--to has ".*", which is not an email address — write addresses like --to /);
      expect(existsSync(out) ? readdirSync(out) : []).toEqual([]);
    });
  }
});

describe('templates', () => {
  it('{{log}} writes nothing to stdout', () => {
    // handlebars' log helper printed to stdout, where a command's results go.
    const masthead = '<header class="masthead"><h1>{{title}}</h1>{{log}}</header>\n';
    const { file, out } = job({ 'partials/masthead.hbs': masthead });
    const r = runCli(['render', file, '--out', out, '--format', 'html']);
    expect(r.code, r.stderr).toBe(0);
    expect(r.stdout).toBe('');
  });
});

describe('--debug', () => {
  // A partial looked up by a name the data lack fails only while rendering, inside handlebars.
  const masthead = '<header class="masthead">{{> (lookup . "no_such_field")}}</header>\n';

  it('shows where a failure inside a brief happened', () => {
    const { file, out } = job({ 'partials/masthead.hbs': masthead });
    const r = runCli(['render', file, '--out', out, '--format', 'html', '--debug']);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/the template cannot be rendered/);
    // The stack of the error, and of the handlebars error it was made from.
    expect(r.stderr).toMatch(/\n {4}at /);
    expect(r.stderr).toMatch(/caused by: Error: .*partial/);
    expect(r.stderr).toMatch(/node_modules\/handlebars\//);
  });

  it('and only then', () => {
    const { file, out } = job({ 'partials/masthead.hbs': masthead });
    const r = runCli(['render', file, '--out', out, '--format', 'html']);
    expect(r.code).toBe(2);
    expect(r.stderr.trimEnd().split('\n')).toHaveLength(1);
    expect(r.stderr).not.toMatch(/\n {4}at /);
  });
});

describe('a batch with one bad group', () => {
  it('fails that group only; the others are written, and the exit code and summary say so', () => {
    // Four invented groups of 72 months; Bravo has a second row for 2019-09, Charlie no values at all.
    const dir = mkdtempSync(join(tmpdir(), 'tb-faults-groups-'));
    mkdirSync(join(dir, 'data'));
    const rows = ['month,zone,value'];
    for (const zone of ['Alpha', 'Bravo', 'Charlie', 'Delta'])
      for (let i = 0; i < 72; i++) {
        const month = `${2019 + Math.floor(i / 12)}-${String((i % 12) + 1).padStart(2, '0')}`;
        rows.push(
          `${month},${zone},${zone === 'Charlie' ? '' : 200 + 1.5 * i + 25 * Math.sin((2 * Math.PI * i) / 12)}`,
        );
      }
    rows.push('2019-09,Bravo,300');
    writeFileSync(join(dir, 'data', 'values.csv'), `${rows.join('\n')}\n`);
    const data = '{ file: data/values.csv, date: month, value: value, group_by: zone }';
    writeFileSync(
      join(dir, 'job.yaml'),
      `brief:\n  title: Zones\nseries:\n  - id: s\n    label: S\n    combine: sum\n    data: ${data}\n`,
    );
    const out = join(dir, 'out');
    const r = runCli(['render', join(dir, 'job.yaml'), '--out', out, '--format', 'json']);
    // Once: exit 2 and nothing written, for the one bad group.
    expect(r.code, r.stderr).toBe(1);
    expect(readdirSync(out).sort()).toEqual(['zones-alpha.json', 'zones-delta.json']);
    expect(r.stderr).toMatch(/^2 briefs written, 2 failed, in [\d.]+ s$/m);
    expect(r.stderr).toMatch(/^ {2}failed: job\.yaml — Bravo: data\/values\.csv: row 290, column "month": .*2019-09/m);
    expect(r.stderr).toMatch(/^ {2}failed: job\.yaml — Charlie: .*group "Charlie" has no usable values/m);
  });
});

describe('numbers that start with a dash', () => {
  const { file, out } = job();

  it('--shard -1/3 is explained, not "ambiguous"', () => {
    const r = runCli(['render', file, '--out', out, '--shard', '-1/3']);
    expect(r.code).toBe(2);
    expect(r.stderr).toBe(
      '--shard must be K/N with 1 ≤ K ≤ N, got "-1/3" — e.g. --shard 2/8 runs the second of eight parts\n',
    );
  });

  it('--period -5 is explained, as a period', () => {
    const r = runCli(['render', file, '--out', out, '--period', '-5']);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/^--period must be a reporting period, got "-5" — write it as 2026-09 \(month\)/);
    expect(existsSync(out)).toBe(false);
  });

  it('decompose --period -5 and --periods out of order are refused with the fix', () => {
    const csv = join(GOOD, 'data', 'values.csv');
    const base = ['decompose', csv, '--date', 'month', '--value', 'value'];
    const a = runCli([...base, '--period', '-5']);
    expect(a.code).toBe(2);
    expect(a.stderr).toMatch(/^--period must be a whole number of at least 2, got -5 — /);
    // MSTL takes the shorter cycle out first: 12,6 would silently run as 6,12.
    const b = runCli([...base, '--method', 'mstl', '--periods', '12,6']);
    expect(b.code).toBe(2);
    expect(b.stdout).toBe('');
    expect(b.stderr).toBe('--periods must be in ascending order, but 6 follows 12 — write --periods 6,12\n');
    const c = runCli([...base, '--method', 'mstl', '--periods', '6,6']);
    expect(c.stderr).toBe('--periods lists 6 twice — write --periods 6\n');
  });
});

describe('shards', () => {
  it('report a job that fails to load in one shard, not in each', () => {
    const good = job();
    const bad = job();
    writeFileSync(bad.file, readFileSync(bad.file, 'utf8').replace('  title: Hardening sample\n', ''));
    const reporting: number[] = [];
    for (const k of [1, 2, 3]) {
      const r = runCli(['render', good.file, bad.file, '--out', good.out, '--format', 'json', '--shard', `${k}/3`]);
      if (r.stderr.includes('missing the required key "title"')) reporting.push(k);
    }
    expect(reporting).toHaveLength(1);
  });
});
