/**
 * Output names that collide, outputs over inputs, and names too long for the file system, through the real
 * command line. The rule (issue "safe under every fault"; DEVELOPERS.md: nothing is written on failure):
 * every brief gets a distinct name that is the same on every run, or the run stops before writing anything,
 * with one line naming what collides and exit 2. Never is one brief's file replaced by another's, and never
 * is a file the job reads (data, logo, template, the job itself) written over.
 */
import { existsSync, mkdirSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { runCli } from '../cli/run.js';
import { snapshot, tempDir, temps, writeJob } from './scenario.js';

afterAll(() => {
  for (const t of temps) rmSync(t, { recursive: true, force: true });
});

/** The one-line refusal: the job file as the place, exit 2, nothing on stdout, and the folder untouched. */
function expectRefused(r: ReturnType<typeof runCli>, job: string, says: RegExp): void {
  expect(r.code, r.stderr).toBe(2);
  expect(r.stdout).toBe('');
  const lines = r.stderr.trim().split('\n');
  expect(lines, r.stderr).toHaveLength(1);
  expect(lines[0].startsWith(`${job}: `), lines[0]).toBe(true);
  expect(lines[0]).toMatch(says);
  expect(lines[0]).toContain(' — ');
  expect(r.stderr).not.toContain('\n    at ');
}

describe('groups whose names reduce to the same file name stop the run before anything is written', () => {
  const cases: [string, string[]][] = [
    ['letter case', ['North', 'north']],
    ['accents', ['São Paulo', 'Sao Paulo']],
    ['punctuation', ['A/B', 'A-B']],
  ];
  for (const [what, groups] of cases) {
    it(what, () => {
      const dir = tempDir('collide');
      const job = writeJob(dir, { title: 'Regions', groups: [...groups, 'Elsewhere'] });
      const out = join(dir, 'out');
      mkdirSync(out);
      writeFileSync(join(out, 'regions-elsewhere.json'), 'last month\n');
      const before = snapshot(out);
      const r = runCli(['render', job, '--out', out, '--format', 'json']);
      // Both colliding groups are named, as written in the data.
      expectRefused(r, job, /would both be written as .*; nothing was written — /);
      for (const g of groups) expect(r.stderr).toContain(JSON.stringify(g));
      expect(snapshot(out)).toEqual(before);
    });
  }

  it('groups written in other scripts keep their letters and get names of their own', () => {
    const dir = tempDir('scripts');
    const groups = ['東京', '大阪', 'Москва', 'Київ', 'القاهرة'];
    const job = writeJob(dir, { title: 'Regions', groups });
    const out = join(dir, 'out');
    const r = runCli(['render', job, '--out', out, '--format', 'json']);
    expect(r.code, r.stderr).toBe(0);
    const names = readdirSync(out).sort();
    expect(names).toEqual(groups.map((g) => `regions-${g.toLowerCase()}.json`).sort());
    // Each file holds its own group's brief.
    for (const g of groups) {
      const brief = JSON.parse(readFileSync(join(out, `regions-${g.toLowerCase()}.json`), 'utf8'));
      expect(brief.meta.title).toBe(`Regions — ${g}`);
    }
  });

  it('two jobs of the same title sharing an output folder', () => {
    const dir = tempDir('same-title');
    const a = writeJob(dir, { title: 'Orders', dataFile: 'a.csv' }, 'a.yaml');
    const b = writeJob(dir, { title: 'orders!', dataFile: 'b.csv' }, 'b.yaml');
    // Without --out each job writes to out/ beside itself: here the same folder.
    const r = runCli(['render', a, b, '--format', 'json']);
    expectRefused(r, b, /the briefs of .*a\.yaml and .*b\.yaml would both be written as .*orders\.\*/);
    expect(existsSync(join(dir, 'out'))).toBe(false);
  });
});

it('two jobs in folders of the same name rendered with one --out stop the run before anything is written', () => {
  const dir = tempDir('same-folder');
  const a = writeJob(join(dir, '2025', 'water'), { title: 'Water 2025' });
  const b = writeJob(join(dir, '2026', 'water'), { title: 'Water 2026' });
  const out = join(dir, 'out');
  const r = runCli(['render', a, b, '--out', out, '--format', 'json']);
  expectRefused(r, b, /2025\/water\/job\.yaml and .*2026\/water\/job\.yaml would both write to .*out\/water/);
  expect(existsSync(out)).toBe(false);
});

describe('never over an input', () => {
  it('a title that names the data file, with --out beside it, writes nothing and keeps the data', () => {
    const dir = tempDir('over-data');
    const job = writeJob(dir, { title: 'Orders', dataFile: 'orders.json', data: ordersJson() });
    const data = readFileSync(join(dir, 'orders.json'));
    const r = runCli(['render', job, '--out', dir, '--format', 'html,json']);
    expect(r.code, r.stderr).toBe(2);
    expect(r.stderr.trim()).toBe(
      `${join(dir, 'orders.json')}: this is the job's own data file: the brief must not be written over it — choose another --out folder, or change brief.title so the file names differ`,
    );
    expect(readFileSync(join(dir, 'orders.json')).equals(data)).toBe(true);
    // Nothing of the brief was written either: its HTML would have come first.
    expect(readdirSync(dir).sort()).toEqual(['job.yaml', 'orders.json']);
  });

  it('nor over the job file or a template', () => {
    for (const role of ['job file', 'template'] as const) {
      const dir = tempDir(`over-${role.replace(' ', '-')}`);
      // The job file is job.json here (YAML reads JSON and plain YAML alike), so a brief titled "Job" meets it.
      if (role === 'template') {
        mkdirSync(join(dir, 'templates'));
        writeFileSync(join(dir, 'templates', 'brief.html'), 'notes kept beside the templates\n');
      }
      const job =
        role === 'job file'
          ? writeJob(dir, { title: 'Job' }, 'job.json')
          : writeJob(dir, { title: 'Brief', brief: ['  templates: templates'] });
      const out = role === 'template' ? join(dir, 'templates') : dir;
      const files = snapshot(out);
      const r = runCli(['render', job, '--out', out, '--format', 'html,json']);
      expect(r.code, r.stderr).toBe(2);
      expect(r.stderr).toContain(`this is the job's own ${role}`);
      expect(snapshot(out)).toEqual(files);
    }
  });
});

describe('long titles', () => {
  const long = (end: string) => `${'Monthly deliveries of treated water to the northern supply zone '.repeat(4)}${end}`;

  it('give short, distinct names that are the same on every run', () => {
    const dir = tempDir('long');
    const a = writeJob(join(dir, 'a'), { title: long('A') });
    const b = writeJob(join(dir, 'b'), { title: long('B') });
    expect(long('A').length).toBeGreaterThan(250);
    const names = (job: string, out: string): string[] => {
      const r = runCli(['render', job, '--out', out, '--format', 'json,html']);
      expect(r.code, r.stderr).toBe(0);
      return readdirSync(out).sort();
    };
    const first = names(a, join(dir, 'out1'));
    expect(names(a, join(dir, 'out2'))).toEqual(first);
    const other = names(b, join(dir, 'out3'));
    expect(other).not.toEqual(first);
    for (const n of [...first, ...other]) expect(Buffer.byteLength(n)).toBeLessThanOrEqual(125);
    // The name starts as the title does and ends with a stable hash.
    expect(first[1]).toMatch(/^monthly-deliveries-of-treated-water-.*-[0-9a-f]{8}\.json$/);
  });

  it('in other scripts are cut at a whole character, under the byte limit of a name', () => {
    const dir = tempDir('long-utf8');
    const job = writeJob(dir, { title: 'Ежемесячные поставки воды '.repeat(12) });
    const out = join(dir, 'out');
    const r = runCli(['render', job, '--out', out, '--format', 'json']);
    expect(r.code, r.stderr).toBe(0);
    const [name] = readdirSync(out);
    expect(Buffer.byteLength(name)).toBeLessThanOrEqual(125);
    expect(name).toMatch(/^ежемесячные-поставки-.*-[0-9a-f]{8}\.json$/);
    expect(name).not.toContain('\uFFFD');
  });
});

function ordersJson(): string {
  const rows = [];
  for (let i = 0; i < 72; i++) {
    const m = (i % 12) + 1;
    rows.push({
      month: `${2019 + Math.floor(i / 12)}-${String(m).padStart(2, '0')}`,
      value: 200 + 1.5 * i + 25 * Math.sin((2 * Math.PI * m) / 12),
    });
  }
  return JSON.stringify(rows);
}
