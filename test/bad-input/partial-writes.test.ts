/**
 * Writes that fail part-way, through the real command line: a file-size limit (bash's `ulimit -f`, so the
 * kernel refuses the write with EFBIG), a full disk (a small tmpfs, where the machine lets us mount one), a
 * kill while a file is being written, and temporaries left by a process that died. The rule: a brief's
 * files are replaced together or not at all, and no temporary outlives the run that made it (issue "safe
 * under every fault"; DEVELOPERS.md: nothing is written on failure).
 */
import { type ChildProcess, spawn, spawnSync } from 'node:child_process';
import { mkdirSync, readdirSync, readFileSync, rmSync, statSync, watch, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { BriefError } from '../../src/errors.js';
import { writeFiles } from '../../src/render/write.js';
import { BIN, ROOT, runCli } from '../cli/run.js';
import { earlierOutputs, snapshot, tempDir, temps, writeJob } from './scenario.js';

afterAll(() => {
  for (const t of temps) rmSync(t, { recursive: true, force: true });
});

const FORMATS = ['html', 'pdf', 'eml', 'json'];
const STEM = 'limits';

/** The sizes of this brief's files, from a free run. */
function sizes(job: string): Record<string, number> {
  const out = tempDir('sizes');
  const r = runCli(['render', job, '--out', out, '--format', FORMATS.join(',')]);
  expect(r.code, r.stderr).toBe(0);
  return Object.fromEntries(FORMATS.map((f) => [f, statSync(join(out, `${STEM}.${f}`)).size]));
}

const hasBash = spawnSync('bash', ['-c', 'true']).status === 0;

describe('a write that fails part-way changes no file of the brief', () => {
  it.skipIf(!hasBash)('under a file-size limit that lets the HTML and PDF through but not the email', () => {
    const dir = tempDir('ulimit');
    const job = writeJob(dir, { title: 'Limits' });
    const size = sizes(job);
    // Written in the order asked: html, pdf, then the email, which is the largest (it carries the PDF).
    expect(size.eml).toBeGreaterThan(Math.max(size.html, size.pdf) + 2048);
    const limitKb = Math.ceil((Math.max(size.html, size.pdf) + 1024) / 1024);
    const out = join(dir, 'out');
    earlierOutputs(out, STEM, FORMATS);
    const before = snapshot(out);
    const r = spawnSync(
      'bash',
      [
        '-c',
        `ulimit -f ${limitKb} && exec "$0" "$@"`,
        process.execPath,
        BIN,
        'render',
        job,
        '--out',
        out,
        '--format',
        FORMATS.join(','),
      ],
      { cwd: ROOT, env: { ...process.env, NO_COLOR: '1' }, encoding: 'utf8' },
    );
    expect(r.status, r.stderr).toBe(1);
    expect(r.stderr.trim()).toBe(
      `${join(out, `${STEM}.eml`)}: cannot write ${STEM}.eml (the file is larger than the file-size limit); no file of this brief was changed — raise the limit (ulimit -f) or choose fewer formats`,
    );
    // The same names (no temporary left), bytes and times: last month's set, whole.
    expect(snapshot(out)).toEqual(before);
  });

  const canMount = process.getuid?.() === 0 && spawnSync('mount', ['--version']).status === 0;
  it.skipIf(!canMount)('on a disk that fills up (a 600 KB tmpfs; needs root, else skipped)', () => {
    const dir = tempDir('tmpfs');
    const job = writeJob(dir, { title: 'Limits' });
    const size = sizes(job);
    const out = join(dir, 'out');
    mkdirSync(out);
    const kb = 600;
    // Room for last month's small files and this month's HTML and PDF, not for the email as well.
    expect(size.html + size.pdf + 8192).toBeLessThan(kb * 1024);
    expect(size.html + size.pdf + size.eml).toBeGreaterThan(kb * 1024);
    const mounted = spawnSync('mount', ['-t', 'tmpfs', '-o', `size=${kb}k`, 'tmpfs', out]).status === 0;
    if (!mounted) {
      console.warn('skipped: tmpfs could not be mounted here');
      return;
    }
    try {
      earlierOutputs(out, STEM, FORMATS);
      const before = snapshot(out);
      const r = runCli(['render', job, '--out', out, '--format', FORMATS.join(',')]);
      expect(r.code, r.stderr).toBe(1);
      expect(r.stderr.trim()).toMatch(
        new RegExp(
          `^${out}/${STEM}\\.(eml|json): cannot write ${STEM}\\.(eml|json) \\(the disk is full\\); no file of this brief was changed — free some space`,
        ),
      );
      expect(snapshot(out)).toEqual(before);
    } finally {
      spawnSync('umount', [out]);
    }
  });
});

describe('writeFiles', () => {
  it('fails at any file of a set without replacing any earlier file or leaving a temporary', async () => {
    const dir = tempDir('set');
    const names = ['a.html', 'b.pdf', 'c.eml', 'd.json'];
    for (const n of names) writeFileSync(join(dir, n), `old ${n}`);
    const before = snapshot(dir);
    for (let broken = 0; broken < names.length; broken++) {
      // The broken file's folder does not exist: its temporary cannot be made.
      const files = names.map((n, i) => ({ path: join(dir, i === broken ? 'missing' : '', n), bytes: `new ${n}` }));
      const e = await writeFiles(files).catch((x: unknown) => x);
      expect(e).toBeInstanceOf(BriefError);
      expect((e as BriefError).oneLine()).toMatch(/cannot write .*; no file of this brief was changed — /);
      expect(snapshot(dir)).toEqual(before);
    }
    const written = await writeFiles(names.map((n) => ({ path: join(dir, n), bytes: `new ${n}` })));
    expect(readdirSync(dir).sort()).toEqual(names);
    // Sizes and SHA-256 of what was written (sha256sum of "new a.html" etc. would give the same).
    expect(written[0].size).toBe(10);
    expect(written[0].sha256).toMatch(/^[0-9a-f]{64}$/);
    const { createHash } = await import('node:crypto');
    expect(written[0].sha256).toBe(createHash('sha256').update('new a.html').digest('hex'));
  });

  it('reports a name too long for the file system as one located line, and its clean-up does not throw', async () => {
    const dir = tempDir('long-name');
    // 250 bytes fit a name (255), but not with the temporary's ".PID.RAND.tmp" around it.
    const path = join(dir, `${'x'.repeat(245)}.html`);
    const e = await writeFiles([{ path, bytes: 'x' }]).catch((x: unknown) => x);
    expect(e).toBeInstanceOf(BriefError);
    expect((e as BriefError).oneLine()).toContain('(the file name is too long)');
    expect(readdirSync(dir)).toEqual([]);
  });
});

describe('temporaries', () => {
  it('of processes that died are removed by the next run; those of live processes and other files stay', () => {
    const dir = tempDir('stale');
    const job = writeJob(dir, { title: 'Limits' });
    const out = join(dir, 'out');
    mkdirSync(out);
    // A process that has ended: its number names no running process (it could be reused, but not this soon).
    const dead = spawnSync(process.execPath, ['-e', 'process.stdout.write(String(process.pid))'], {
      encoding: 'utf8',
    }).stdout;
    const stale = [`.${STEM}.pdf.${dead}.0a1b2c3d.tmp`, `.${STEM}.html.${dead}.ffee0011.tmp`];
    const kept = [`.${STEM}.pdf.${process.pid}.0a1b2c3d.tmp`, '.keep', `.notes.${dead}.tmp`];
    for (const f of [...stale, ...kept]) writeFileSync(join(out, f), 'x'.repeat(1000));
    const r = runCli(['render', job, '--out', out, '--format', 'json', '--verbose']);
    expect(r.code, r.stderr).toBe(0);
    expect(readdirSync(out).sort()).toEqual([...kept, `${STEM}.json`].sort());
    for (const f of stale) expect(r.stderr).toContain(`removed ${join(out, f)}, left by an earlier run`);
  });

  it('are removed when the run is killed while writing (SIGTERM, SIGINT, SIGHUP)', async () => {
    const dir = tempDir('killed');
    // Ten years of days: a JSON of a few megabytes, long enough to be caught while it is written.
    const days: string[] = ['day,value'];
    for (let i = 0; i < 3653; i++) {
      const d = new Date(Date.UTC(2015, 0, 1 + i)).toISOString().slice(0, 10);
      days.push(`${d},${(100 + i / 50 + 10 * Math.sin((2 * Math.PI * i) / 7)).toFixed(2)}`);
    }
    const job = writeJob(dir, { title: 'Limits', data: `${days.join('\n')}\n` });
    writeFileSync(job, readFileSync(job, 'utf8').replace('date: month', 'date: day'));
    let caught = 0;
    for (const signal of ['SIGTERM', 'SIGINT', 'SIGHUP'] as const) {
      for (let attempt = 0; attempt < 6; attempt++) {
        const out = join(dir, `out-${signal}-${attempt}`);
        mkdirSync(out);
        const result = await killWhileWriting(out, job, signal);
        if (result === 'missed') continue;
        caught++;
        expect(result.signal, `${signal}: ${result.stderr}`).toBe(signal);
        expect(readdirSync(out).filter((f) => f.endsWith('.tmp'))).toEqual([]);
        break;
      }
    }
    // A kill that never lands while a temporary exists would test nothing.
    expect(caught).toBeGreaterThanOrEqual(2);
  }, 180_000);
});

/**
 * Starts a render, stops it (SIGSTOP) the moment a temporary appears in `out`, sends `signal` and lets it go
 * on. 'missed' when the temporary was gone by the time the process stopped.
 */
async function killWhileWriting(
  out: string,
  job: string,
  signal: NodeJS.Signals,
): Promise<'missed' | { signal: NodeJS.Signals | null; stderr: string }> {
  const child: ChildProcess = spawn(process.execPath, [BIN, 'render', job, '--out', out, '--format', 'json'], {
    cwd: ROOT,
    env: { ...process.env, NO_COLOR: '1' },
  });
  let stderr = '';
  child.stderr?.on('data', (d) => {
    stderr += d;
  });
  let stopped = false;
  let hit = false;
  const watcher = watch(out, (_, name) => {
    if (stopped || !name || !String(name).endsWith('.tmp')) return;
    stopped = true;
    child.kill('SIGSTOP');
    hit = readdirSync(out).some((f) => f.endsWith('.tmp'));
    if (hit) child.kill(signal);
    child.kill('SIGCONT');
  });
  const ended = await new Promise<{ signal: NodeJS.Signals | null }>((resolve) =>
    child.on('exit', (_code, sig) => resolve({ signal: sig })),
  );
  watcher.close();
  return hit ? { signal: ended.signal, stderr } : 'missed';
}
