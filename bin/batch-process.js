/**
 * A batch of briefs runs in a second Node process started with V8's --single-threaded-gc and
 * --no-concurrent-recompilation, this one waiting for it. A batch keeps every core busy with a worker thread
 * (src/cli/batch.ts runTasks); V8 then still hands garbage collection (marking, sweeping, scavenging) and its
 * optimising compiler's work to helper threads, which only take turns with the workers on the same cores.
 * With each worker collecting its own heap, the 1,000-brief batch of bench/ratios.js took 0.83 of the time on
 * two cores (48.4 s against 58.0 s, and 0.80–0.83 in alternating runs of 200 briefs); compiling on the
 * worker's own thread as well, 0.96 of that again (the median of four sets of alternating runs of 200
 * briefs, which gave 0.93 to 1.03; 1,000 briefs, whose workers are warm for most of the run, 0.997). A
 * single brief, whose helpers run on an otherwise idle core, took 1.08 of the time with the collector flag,
 * so it keeps the defaults. V8 takes the flags only at start (set later, the process aborts), hence the
 * second process; the waiting one adds about 10 MB of its own (its other 34 MB of resident memory are the
 * Node binary's pages, shared with the child).
 *
 * Which runs are batches is judged from the command line alone, before anything is loaded: four job files
 * or more (runTasks builds fewer in-process), or one that splits into groups (`group_by` in its text). A
 * wrong guess costs time only: the child does exactly what this process would have done. Signals that end
 * a run are passed on, the child's exit code or signal becomes this process's, and TRENDBRIEF_BATCH_PROCESS=0
 * keeps a batch in this process.
 */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { basename, dirname, join } from 'node:path';

/** The V8 flags of the batch's process. */
export const BATCH_FLAGS = ['--single-threaded-gc', '--no-concurrent-recompilation'];

/** The options of `render` that take a value (src/cli/render.ts RENDER_OPTIONS; a test keeps them equal). */
export const VALUE_OPTIONS = new Set([
  'out',
  'format',
  'period',
  'to',
  'subject',
  'pdf-engine',
  'chart-files',
  'shard',
  'record',
  'reason',
  'run',
]);

/** Fewer job files than this are built in-process, one after the other (src/cli/batch.ts runTasks). */
export const POOL_FROM = 4;

const SIGNALS = ['SIGINT', 'SIGTERM', 'SIGHUP'];

/** The options the command line takes before its command (src/cli/main.ts). */
const GLOBAL_OPTIONS = new Set(['--quiet', '-q', '--verbose', '--debug']);

/** The job paths among `render`'s arguments (`args` as given to the command line, command included). */
export function jobArguments(args) {
  const rest = args.slice(args.findIndex((a) => !GLOBAL_OPTIONS.has(a)) + 1);
  const out = [];
  for (let i = 0; i < rest.length; i++) {
    const a = rest[i];
    if (a === '--') {
      out.push(...rest.slice(i + 1));
      break;
    }
    if (a.startsWith('-')) {
      if (a.startsWith('--') && !a.includes('=') && VALUE_OPTIONS.has(a.slice(2))) i++;
      continue;
    }
    out.push(a);
  }
  return out;
}

/** The job files an argument names (as src/cli/batch.ts expandJobs reads it), without reading them. */
function jobFilesOf(arg) {
  const name = basename(arg);
  try {
    if (/[*?]/.test(name)) {
      const re = new RegExp(
        `^${name
          .replace(/[.+^${}()|[\]\\]/g, '\\$&')
          .replace(/\*/g, '.*')
          .replace(/\?/g, '.')}$`,
      );
      return readdirSync(dirname(arg))
        .filter((f) => re.test(f))
        .map((f) => join(dirname(arg), f));
    }
    if (!statSync(arg).isDirectory()) return [arg];
    return readdirSync(arg, { withFileTypes: true }).flatMap((d) =>
      d.isFile() && /\.ya?ml$/i.test(d.name)
        ? [join(arg, d.name)]
        : d.isDirectory() && isFile(join(arg, d.name, 'job.yaml'))
          ? [join(arg, d.name, 'job.yaml')]
          : [],
    );
  } catch {
    return [arg];
  }
}

function isFile(path) {
  try {
    return statSync(path).isFile();
  } catch {
    return false;
  }
}

/**
 * Whether a job file's text splits its series into groups (`group_by:` anywhere, block or flow style). A
 * file too large to be a job (a data file named by mistake) is not read here; render says what is wrong.
 */
function groups(path) {
  try {
    const st = statSync(path);
    if (!st.isFile() || st.size > 1 << 22) return false;
    return /(^|[\s{,])group_by\s*:/m.test(readFileSync(path, 'utf8'));
  } catch {
    return false;
  }
}

/**
 * Whether this command line is a batch that runs on worker threads: `render`, two cores or more, and four
 * job files or more or a job with groups; never inside the batch's own process or with
 * TRENDBRIEF_BATCH_PROCESS=0.
 */
export function isBatch(args, env = process.env, cores = availableParallelism()) {
  if (cores < 2 || env.TRENDBRIEF_BATCH_PROCESS === '0' || env.TRENDBRIEF_BATCH_PROCESS === 'child') return false;
  if (process.execArgv.some((a) => BATCH_FLAGS.includes(a))) return false;
  const jobs = jobArguments(args).flatMap(jobFilesOf);
  return jobs.length >= POOL_FROM || jobs.some(groups);
}

/**
 * Runs the command line again in a process started with BATCH_FLAGS and waits for it. Resolves to its exit
 * code; when a signal ended it, this process ends by the same signal. Null when the process could not be
 * started (the caller then runs the batch itself).
 */
export async function runBatchProcess(args) {
  // Loaded here, not with the module: child_process brings net and dgram, about 2.5 ms that a single brief,
  // which never starts a process, need not pay.
  const { spawn } = await import('node:child_process');
  return new Promise((resolve) => {
    if (args.includes('--verbose'))
      process.stderr.write(`the batch runs in a process of its own, started with ${BATCH_FLAGS.join(' ')}\n`);
    let child;
    try {
      child = spawn(process.execPath, [...BATCH_FLAGS, ...process.execArgv, process.argv[1], ...args], {
        stdio: 'inherit',
        env: { ...process.env, TRENDBRIEF_BATCH_PROCESS: 'child' },
      });
    } catch {
      resolve(null);
      return;
    }
    // A signal sent to this process alone (a scheduler's kill) reaches the child; Ctrl-C reaches both, and
    // the child's handlers take a second one in their stride.
    const pass = (signal) => child.kill(signal);
    for (const s of SIGNALS) process.on(s, pass);
    const done = () => {
      for (const s of SIGNALS) process.removeListener(s, pass);
    };
    // Only a child that never started leaves the batch to this process.
    child.once('error', () => {
      if (child.pid !== undefined) return;
      done();
      resolve(null);
    });
    child.once('exit', (code, signal) => {
      done();
      if (signal) process.kill(process.pid, signal);
      else resolve(code ?? 1);
    });
  });
}
