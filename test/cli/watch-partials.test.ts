/**
 * render --watch follows the whole templates folder: an edit to a partial in its partials/ subfolder (or in
 * a subfolder made after the watch began) renders the brief again. A watch on the folder alone sees only
 * its own entries, not files inside its subfolders.
 */
import { spawn } from 'node:child_process';
import { mkdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, expect, it } from 'vitest';
import { tempDir, temps, writeJob } from '../bad-input/scenario.js';
import { BIN, ROOT } from './run.js';

afterAll(() => {
  for (const t of temps) rmSync(t, { recursive: true, force: true });
});

function waitFor(read: () => string, test: (s: string) => boolean, ms: number): Promise<void> {
  return new Promise((resolve, reject) => {
    const started = Date.now();
    const tick = (): void => {
      if (test(read())) resolve();
      else if (Date.now() - started > ms) reject(new Error(`timed out: ${read()}`));
      else setTimeout(tick, 100);
    };
    tick();
  });
}

const count = (s: string, needle: string): number => s.split(needle).length - 1;

it('renders again when a partial in the templates folder changes', async () => {
  const dir = tempDir('watch-partials');
  const partials = join(dir, 'templates', 'partials');
  mkdirSync(partials, { recursive: true });
  const masthead = readFileSync(join(ROOT, 'templates', 'partials', 'masthead.hbs'), 'utf8');
  writeFileSync(join(partials, 'masthead.hbs'), `${masthead}<p class="edition">first edition</p>\n`);
  const job = writeJob(dir, { title: 'Watched', brief: ['  templates: templates'] });
  const out = join(dir, 'out');
  const child = spawn(process.execPath, [BIN, 'render', job, '--out', out, '--format', 'html', '--watch'], {
    cwd: ROOT,
    env: { ...process.env, NO_COLOR: '1' },
  });
  let stderr = '';
  child.stderr.on('data', (b) => {
    stderr += String(b);
  });
  const exited = new Promise<number | null>((resolve) => child.on('exit', (code) => resolve(code)));
  try {
    await waitFor(
      () => stderr,
      (s) => /watching \d+ files/.test(s),
      60_000,
    );
    expect(readFileSync(join(out, 'watched.html'), 'utf8')).toContain('first edition');
    writeFileSync(join(partials, 'masthead.hbs'), `${masthead}<p class="edition">second edition</p>\n`);
    await waitFor(
      () => stderr,
      (s) => count(s, 'rendered; waiting for changes') >= 1 && count(s, 'watching') >= 2,
      30_000,
    );
    expect(readFileSync(join(out, 'watched.html'), 'utf8')).toContain('second edition');
    // A subfolder made while watching is followed from the next render on.
    const extra = join(dir, 'templates', 'partials', 'extra');
    mkdirSync(extra);
    await waitFor(
      () => stderr,
      (s) => count(s, 'watching') >= 3,
      30_000,
    );
    writeFileSync(join(extra, 'note.txt'), 'a file in the new subfolder\n');
    await waitFor(
      () => stderr,
      (s) => count(s, 'watching') >= 4,
      30_000,
    );
  } finally {
    child.kill('SIGINT');
    await exited;
  }
}, 180_000);
