/**
 * Special files where the job expects ordinary ones, through the real command line: a named pipe (read
 * until something writes to it, for ever) and a link to /dev/zero (read until memory runs out), as the job
 * file, a template, an email template and the logo. The rule (issue "safe under every fault", as data files
 * already were): anything that is not an ordinary file is refused at once, with one located line, exit 2 and
 * nothing written. Each run has a deadline and a small heap, so the old behaviour fails the test instead of
 * hanging it or filling the machine's memory.
 */
import { spawnSync } from 'node:child_process';
import { cpSync, mkdirSync, rmSync, symlinkSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { BIN, ROOT } from '../cli/run.js';
import { earlierOutputs, snapshot, tempDir, temps, writeJob } from './scenario.js';

afterAll(() => {
  for (const t of temps) rmSync(t, { recursive: true, force: true });
});

const canMkfifo = spawnSync('mkfifo', ['--version']).status === 0;

function mkfifo(path: string): void {
  const r = spawnSync('mkfifo', [path]);
  if (r.status !== 0) throw new Error(`mkfifo ${path} failed: ${r.stderr}`);
}

function render(job: string, out: string, formats = 'html,json') {
  const r = spawnSync(process.execPath, [BIN, 'render', job, '--out', out, '--format', formats], {
    cwd: ROOT,
    env: { ...process.env, NO_COLOR: '1', NODE_OPTIONS: '--max-old-space-size=384' },
    encoding: 'utf8',
    timeout: 30_000,
  });
  return { code: r.status, signal: r.signal, stdout: r.stdout, stderr: r.stderr };
}

interface Special {
  name: string;
  /** Makes the job with its special file; returns the job file, and the path the message must name. */
  setup: (dir: string, make: (path: string) => void) => { job: string; place: string };
  formats?: string;
}

const BUILT_IN = join(ROOT, 'templates');

const CASES: Special[] = [
  {
    name: 'the job file',
    setup: (dir, make) => {
      writeJob(dir, { title: 'Special' }, 'real.yaml');
      const job = join(dir, 'job.yaml');
      make(job);
      return { job, place: job };
    },
  },
  {
    name: 'a partial in the templates folder',
    setup: (dir, make) => {
      mkdirSync(join(dir, 'templates', 'partials'), { recursive: true });
      make(join(dir, 'templates', 'partials', 'masthead.hbs'));
      const job = writeJob(dir, { title: 'Special', brief: ['  templates: templates'] });
      return { job, place: join(dir, 'templates', 'partials', 'masthead.hbs') };
    },
  },
  {
    name: 'the main template',
    setup: (dir, make) => {
      mkdirSync(join(dir, 'templates'));
      make(join(dir, 'templates', 'brief.hbs'));
      const job = writeJob(dir, { title: 'Special', brief: ['  templates: templates'] });
      return { job, place: join(dir, 'templates', 'brief.hbs') };
    },
  },
  {
    name: 'the email template',
    formats: 'json,eml',
    setup: (dir, make) => {
      mkdirSync(join(dir, 'templates'));
      cpSync(join(BUILT_IN, 'email.txt.hbs'), join(dir, 'templates', 'email.txt.hbs'));
      make(join(dir, 'templates', 'email.hbs'));
      const job = writeJob(dir, { title: 'Special', brief: ['  templates: templates'] });
      return { job, place: join(dir, 'templates', 'email.hbs') };
    },
  },
];

describe('a special file where an ordinary one is expected is refused at once', () => {
  for (const kind of ['named pipe', 'link to /dev/zero'] as const) {
    for (const c of CASES) {
      it.skipIf(kind === 'named pipe' && !canMkfifo)(`${c.name}: a ${kind}`, () => {
        const dir = tempDir('special');
        const make = kind === 'named pipe' ? mkfifo : (path: string) => symlinkSync('/dev/zero', path);
        const { job, place } = c.setup(dir, make);
        const out = join(dir, 'out');
        earlierOutputs(out, 'special', ['html', 'json']);
        const before = snapshot(out);
        const r = render(job, out, c.formats);
        expect(r.signal, 'the run hung or was killed').toBeNull();
        expect(r.code, r.stderr).toBe(2);
        expect(r.stdout).toBe('');
        const lines = r.stderr.trim().split('\n');
        expect(lines, r.stderr).toHaveLength(1);
        expect(lines[0].startsWith(`${place}: `), lines[0]).toBe(true);
        expect(lines[0]).toMatch(
          new RegExp(`is ${kind === 'named pipe' ? 'a named pipe' : 'a device'}, not an ordinary file — `),
        );
        expect(snapshot(out)).toEqual(before);
      });
    }
  }
});
