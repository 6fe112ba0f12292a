/** render --watch renders again when a data file changes, and stops cleanly on Ctrl-C (SIGINT). */
import { spawn } from 'node:child_process';
import { cpSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { BIN, EXAMPLE_COPY, ROOT } from './run.js';

function waitFor(read: () => string, pattern: RegExp, ms: number): Promise<void> {
  return new Promise((resolve, reject) => {
    const started = Date.now();
    const tick = (): void => {
      if (pattern.test(read())) resolve();
      else if (Date.now() - started > ms) reject(new Error(`timed out waiting for ${pattern}: ${read()}`));
      else setTimeout(tick, 100);
    };
    tick();
  });
}

describe('render --watch', () => {
  it('renders, renders again after the data changes, and exits 0 on SIGINT', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'tb-watch-'));
    cpSync(join(ROOT, 'examples/online-orders'), join(dir, 'job'), EXAMPLE_COPY);
    const job = join(dir, 'job', 'job.yaml');
    const out = join(dir, 'out');
    const child = spawn(process.execPath, [BIN, 'render', job, '--out', out, '--format', 'json', '--watch'], {
      env: { ...process.env, NO_COLOR: '1' },
    });
    let stderr = '';
    child.stderr.on('data', (b) => {
      stderr += String(b);
    });
    const exited = new Promise<number | null>((resolve) => child.on('exit', (code) => resolve(code)));
    await waitFor(() => stderr, /watching 2 files/, 30_000);
    const first = JSON.parse(readFileSync(join(out, 'online-orders.json'), 'utf8'));
    // Raise the latest month by a quarter: the brief must follow.
    const csv = join(dir, 'job', 'data', 'orders.csv');
    const lines = readFileSync(csv, 'utf8').trimEnd().split('\n');
    const [month, value] = lines[lines.length - 1].split(',');
    lines[lines.length - 1] = `${month},${Math.round(Number(value) * 1.25)}`;
    writeFileSync(csv, `${lines.join('\n')}\n`);
    await waitFor(() => stderr, /rendered; waiting for changes/, 30_000);
    const second = JSON.parse(readFileSync(join(out, 'online-orders.json'), 'utf8'));
    const r = first.series[0].reportingIndex;
    expect(second.series[0].components.observed[r]).toBe(Math.round(Number(value) * 1.25));
    expect(first.series[0].components.observed[r]).toBe(Number(value));
    child.kill('SIGINT');
    expect(await exited).toBe(0);
  });
});
