/**
 * One run of `node ARGS` under `/usr/bin/time -v` when it exists (Debian: the `time` package), for
 * bench/briefs.js, bench/memory.js, bench/ratios.js and bench/effects-brief.js: wall seconds, peak resident set size in MB and CPU seconds (user +
 * system); the last two are NaN without /usr/bin/time. Throws with the tail of stderr when the run fails.
 */
import { spawnSync } from 'node:child_process';
import { closeSync, existsSync, openSync } from 'node:fs';

export const TIME = '/usr/bin/time';

export function measure(args, options = {}) {
  return measureCommand([process.execPath, ...args], options);
}

/** The same for any command (`[program, ...args]`), optionally with its own environment. */
export function measureCommand([program, ...args], { cwd, env, discardStdout = false } = {}) {
  const timed = existsSync(TIME);
  const command = timed ? TIME : program;
  const full = timed ? ['-v', program, ...args] : args;
  const sink = discardStdout ? openSync('/dev/null', 'w') : null;
  const started = process.hrtime.bigint();
  const r = spawnSync(command, full, {
    cwd,
    env,
    encoding: 'utf8',
    maxBuffer: 64 * 1024 * 1024,
    stdio: ['ignore', sink ?? 'pipe', 'pipe'],
  });
  const wall = Number(process.hrtime.bigint() - started) / 1e9;
  if (sink !== null) closeSync(sink);
  if (r.status !== 0) {
    throw new Error(
      `${[program, ...args].join(' ')} exited ${r.status}:\n${(r.stderr ?? '').split('\n').slice(-15).join('\n')}`,
    );
  }
  const field = (label) => {
    const m = new RegExp(`${label}[^:]*:\\s*([\\d.]+)`).exec(r.stderr ?? '');
    return m ? Number(m[1]) : Number.NaN;
  };
  return {
    wall,
    peakMb: timed ? field('Maximum resident set size') / 1024 : Number.NaN,
    cpu: timed ? field('User time') + field('System time') : Number.NaN,
  };
}

/** The median of a list of numbers. */
export function median(xs) {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}
