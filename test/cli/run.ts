/** Runs the built command line (dist/, built by `npm test` before vitest) in a child process. */
import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';

export const ROOT = fileURLToPath(new URL('../..', import.meta.url));
export const BIN = `${ROOT}bin/trendbrief.js`;

export interface RunResult {
  code: number;
  stdout: string;
  stderr: string;
}

export function runCli(args: string[], env: Record<string, string> = {}, cwd = ROOT): RunResult {
  const r = spawnSync(process.execPath, [BIN, ...args], {
    cwd,
    env: { ...process.env, NO_COLOR: '1', ...env },
    encoding: 'utf8',
    maxBuffer: 256 * 1024 * 1024,
  });
  return { code: r.status ?? -1, stdout: r.stdout, stderr: r.stderr };
}
