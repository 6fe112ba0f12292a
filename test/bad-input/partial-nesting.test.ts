/**
 * Template partials that include themselves, directly, through another partial, or as an inline partial,
 * through the real command line. Handlebars follows such a loop until the process runs out of memory (an
 * abort, exit 134, after minutes and gigabytes). The rule (issue "safe under every fault"): partials nest
 * at most MAX_PARTIAL_DEPTH levels; past that the run stops with one line naming the template file and the
 * line and column of the {{> …}} that loops, exit 2, nothing written. A partial that includes itself a few
 * times and then stops (a recursion that ends) still renders. Each run has a deadline and a small heap, so
 * the old behaviour fails quickly.
 */
import { spawnSync } from 'node:child_process';
import { mkdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { MAX_PARTIAL_DEPTH } from '../../src/render/handlebars.js';
import { BIN, ROOT } from '../cli/run.js';
import { earlierOutputs, snapshot, tempDir, temps, writeJob } from './scenario.js';

afterAll(() => {
  for (const t of temps) rmSync(t, { recursive: true, force: true });
});

function render(job: string, out: string) {
  const r = spawnSync(process.execPath, [BIN, 'render', job, '--out', out, '--format', 'html'], {
    cwd: ROOT,
    env: { ...process.env, NO_COLOR: '1', NODE_OPTIONS: '--max-old-space-size=384' },
    encoding: 'utf8',
    timeout: 60_000,
  });
  return { code: r.status, signal: r.signal, stdout: r.stdout, stderr: r.stderr };
}

/** A job whose templates folder holds the given partials (name → text). */
function jobWithPartials(partials: Record<string, string>): { dir: string; job: string } {
  const dir = tempDir('partials');
  mkdirSync(join(dir, 'templates', 'partials'), { recursive: true });
  for (const [name, text] of Object.entries(partials))
    writeFileSync(join(dir, 'templates', 'partials', `${name}.hbs`), text);
  return { dir, job: writeJob(dir, { title: 'Nesting', brief: ['  templates: templates'] }) };
}

const builtIn = (name: string): string => readFileSync(join(ROOT, 'templates', 'partials', `${name}.hbs`), 'utf8');

/** line:column (1-based) of the first occurrence of `needle` in `text`. */
function at(text: string, needle: string): string {
  const lines = text.split('\n');
  const i = lines.findIndex((l) => l.includes(needle));
  return `${i + 1}:${lines[i].indexOf(needle) + 1}`;
}

describe('a partial that includes itself without end is a located error', () => {
  // Each case: the partials, and the places (file, call) the loop may be reported at — either of a loop
  // of two, whichever is the innermost when the depth runs out.
  const cases: [string, Record<string, string>, [string, string][]][] = [
    [
      'directly',
      { masthead: `${builtIn('masthead')}\n<p>again:</p>\n{{> masthead}}\n` },
      [['masthead', '{{> masthead}}']],
    ],
    [
      'through another partial',
      { masthead: `${builtIn('masthead')}{{> byline}}\n`, byline: '<p>by</p>\n  {{> masthead}}\n' },
      [
        ['byline', '{{> masthead}}'],
        ['masthead', '{{> byline}}'],
      ],
    ],
    [
      'as an inline partial',
      { masthead: `{{#*inline "loop"}}\n<i>x</i>{{> loop}}\n{{/inline}}\n${builtIn('masthead')}{{> loop}}\n` },
      [['masthead', '{{> loop}}']],
    ],
  ];
  for (const [how, partials, places] of cases) {
    it(how, () => {
      const { dir, job } = jobWithPartials(partials);
      const out = join(dir, 'out');
      earlierOutputs(out, 'nesting', ['html']);
      const before = snapshot(out);
      const r = render(job, out);
      expect(r.signal, 'the run hung or was killed').toBeNull();
      expect(r.code, r.stderr).toBe(2);
      const lines = r.stderr.trim().split('\n');
      expect(lines, r.stderr).toHaveLength(1);
      const starts = places.map(([file, call]) => {
        const path = join(dir, 'templates', 'partials', `${file}.hbs`);
        return `${path}:${at(partials[file], call)}: `;
      });
      expect(
        starts.some((start) => lines[0].startsWith(start)),
        lines[0],
      ).toBe(true);
      expect(lines[0]).toMatch(new RegExp(`nested more than ${MAX_PARTIAL_DEPTH} levels deep.* — `));
      expect(snapshot(out)).toEqual(before);
    });
  }
});

it('partials nested a few levels deep, and one partial used many times over, still render', () => {
  // masthead → level1 → … → level6, each twice per fact of the byline; level6 writes the fact's label.
  const levels = Object.fromEntries(
    [1, 2, 3, 4, 5].map((i) => [`level${i}`, `<span class="l${i}">{{> level${i + 1}}}</span>`]),
  );
  const { dir, job } = jobWithPartials({
    masthead: `${builtIn('masthead')}{{#each byline}}{{> level1}}{{> level1}}{{/each}}\n`,
    ...levels,
    level6: '<b class="deepest">{{label}}</b>',
  });
  const out = join(dir, 'out');
  const r = render(job, out);
  expect(r.code, r.stderr).toBe(0);
  const html = readFileSync(join(out, 'nesting.html'), 'utf8');
  expect(html.split('<b class="deepest">Reporting period</b>')).toHaveLength(3);
});
