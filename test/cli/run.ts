/** Runs the built command line (dist/, built by `npm test` before vitest) in a child process. */
import { spawnSync } from 'node:child_process';
import { basename } from 'node:path';
import { fileURLToPath } from 'node:url';

export const ROOT = fileURLToPath(new URL('../..', import.meta.url));
export const BIN = `${ROOT}bin/trendbrief.js`;

/**
 * cpSync options for copying an example: everything but the record of published briefs that README's render
 * command leaves beside the example's job (a test starts with no history unless it makes one).
 */
export const EXAMPLE_COPY = {
  recursive: true,
  filter: (path: string) => !basename(path).startsWith('trendbrief-record.sqlite'),
};

/** `decompose` of the AirPassengers CSV the command-line tests share. */
export const DECOMPOSE_EXAMPLE = [
  'decompose',
  'test/cli/files/air-passengers.csv',
  '--date',
  'month',
  '--value',
  'passengers',
] as const;

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
