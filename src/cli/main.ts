/**
 * The trendbrief command line: one dispatcher, each command in its own module and loaded only when
 * called, so `decompose` starts without the chart, PDF or email stack. Exit codes: 0 success, 1 a run that
 * failed, 2 invalid input or usage. Stack traces only with --debug.
 */
import { BriefError, debugStack } from '../errors.js';
import type { BatchTask, TaskResult } from './batch.js';
import { type Console, makeConsole } from './output.js';
import { toolVersion } from './version.js';

export const COMMANDS: Record<string, { summary: string; load: () => Promise<CommandModule> }> = {
  render: { summary: 'write the briefs of a job file (html, pdf, eml, json)', load: () => import('./render.js') },
  check: {
    summary: 'validate a job and its data, print the diagnostics, write nothing',
    load: () => import('./check.js'),
  },
  history: {
    summary: 'verify, list or export the record of published briefs; index one run',
    load: () => import('./history.js'),
  },
  init: { summary: 'write a starter job with invented data', load: () => import('./init.js') },
  decompose: {
    summary: 'split a CSV or JSON series into trend, seasonal and remainder',
    load: () => import('./decompose.js'),
  },
};

export interface CommandModule {
  run(args: string[], console: Console): Promise<number>;
  help: string;
}

export const MAIN_HELP = `trendbrief — briefs about a time series: trend, season, year-over-year change, firmness

Usage: trendbrief <command> [options]

Commands:
${Object.entries(COMMANDS)
  .map(([name, c]) => `  ${name.padEnd(11)} ${c.summary}`)
  .join('\n')}

Options for every command: --help (-h), --quiet (-q), --verbose, --debug (show stack traces)
Run "trendbrief <command> --help" for a command's options and an example.`;

export async function main(argv: string[]): Promise<number> {
  const debug = argv.includes('--debug');
  const quiet = argv.includes('--quiet') || argv.includes('-q');
  const verbosity = quiet ? 'quiet' : argv.includes('--verbose') ? 'verbose' : 'normal';
  const con = makeConsole(verbosity, debug);
  const rest = argv.filter((a) => a !== '--debug' && a !== '--quiet' && a !== '-q' && a !== '--verbose');
  const name = rest[0];
  if (name === undefined || name === '--help' || name === '-h' || name === 'help') {
    con.out(MAIN_HELP);
    return name === undefined ? 2 : 0;
  }
  if (name === '--version') {
    con.out(await toolVersion());
    return 0;
  }
  const command = COMMANDS[name];
  if (!command) {
    con.error(`trendbrief: unknown command "${name}" — run "trendbrief --help" to list the commands`);
    return 2;
  }
  try {
    const mod = await command.load();
    if (rest.includes('--help') || rest.includes('-h')) {
      con.out(mod.help);
      return 0;
    }
    return await mod.run(rest.slice(1), con);
  } catch (e) {
    return reportError(e, con);
  }
}

/**
 * A thread of one brief when the command line runs from the one-script build (dist/bundle/main.cjs with its
 * code cache; src/thread-entry.ts): `kind` 'pdf' is the PDF's own thread (render/pdf/thread.ts, started from
 * bin/pdf-thread.js), 'series' the second series thread (brief/share.ts, from bin/series-thread.js).
 */
export async function threadMain(kind: string): Promise<void> {
  const { parentPort, workerData } = await import('node:worker_threads');
  if (!parentPort) throw new Error('threadMain runs only in a worker thread');
  if (kind === 'pdf') {
    const { servePdf } = await import('../render/pdf/pdf-service.js');
    servePdf(parentPort);
  } else if (kind === 'series') {
    const { serveSeries } = await import('../brief/series-service.js');
    await serveSeries(parentPort, workerData);
  } else throw new Error(`no thread of kind "${kind}"`);
}

/**
 * One task of a batch's worker pool (cli/batch.ts runTasks), when the command line runs from the one-script
 * build: bin/batch-thread.js is the pool's worker module there, as cli/worker.ts is for the modules.
 */
export async function runBatchTask(task: BatchTask): Promise<TaskResult> {
  const { runTask } = await import('./batch.js');
  return runTask(task);
}

export function reportError(e: unknown, con: Console): number {
  if (e instanceof BriefError) {
    for (const line of e.oneLine().split('\n')) con.error(line);
    if (con.debug) con.error(debugStack(e));
    return e.exitCode;
  }
  const message = e instanceof Error ? e.message : String(e);
  con.error(`trendbrief: the run failed: ${message.split('\n')[0]} — run again with --debug for details`);
  if (con.debug) con.error(debugStack(e));
  return 1;
}
