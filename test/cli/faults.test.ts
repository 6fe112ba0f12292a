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
