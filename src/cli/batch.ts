/**
 * Many briefs in one run: several job files (by name, folder or a `*` pattern), many groups per job,
 * spread over all cores with a worker pool (piscina). `--shard K/N` keeps every N-th brief of the sorted
 * list, so a large estate can run on an existing batch scheduler across machines. A failing brief does not
 * stop the others; each is reported, and a summary closes the run.
 */
import { existsSync, readdirSync, statSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { basename, dirname, join, resolve } from 'node:path';
import { dataOfGroup, failedGroupsOf, groupsOf, loadJobData, PARALLEL_SERIES } from '../brief/build.js';
import { startSeriesWorkerEarly } from '../brief/early-worker.js';
import { briefTitle } from '../brief/title.js';
import type { LoadedData } from '../data/load.js';
import { BriefError, debugStack } from '../errors.js';
import { loadJob } from '../job/load.js';
import { fileStem, stemKey } from '../render/names.js';
import type { Refusal, SmtpSettings } from '../render/send.js';
import { bytesOf, cleanUpOnSignal, type WrittenFile, writeFiles } from '../render/write.js';
import { threadEntry } from '../thread-entry.js';
import type { Job } from '../vocabulary/settings.js';
import { usage } from './args.js';
import { inputsOf, type RenderOptions, renderBriefFiles } from './render-files.js';
import { toolVersion } from './version.js';

export interface BatchTask {
  jobFile: string;
  group: string | null;
  outDir: string;
  options: RenderOptions;
  /** The brief's file name without extension (render/names.ts), checked for collisions when planned. */
  stem?: string;
  /** Send each .eml over SMTP once written (render --send). */
  smtp: SmtpSettings | null;
  /**
   * This brief's own data, read once by the main thread (build.dataOfGroup: cache key → data with only
   * this group's series), so a worker neither reads the file nor holds the other groups. Absent: read it.
   */
  data?: [string, LoadedData][];
  /** How this run records its briefs (src/record/); absent: not recorded. */
  recording?: Recording;
}

/**
 * Recording of a run: `auto` records every brief written with a format other than json alone, `always`
 * records json-only briefs too, `never` records nothing. Run and shard name the run in the record; the
 * reason is the user's, for a re-issue.
 */
export interface Recording {
  mode: 'auto' | 'always' | 'never';
  run: string;
  shard: string;
  reason: string;
}

export const NO_RECORDING: Recording = { mode: 'never', run: '', shard: '', reason: '' };

export interface TaskResult {
  jobFile: string;
  group: string | null;
  name: string;
  files: string[];
  /** Each file written, with its size and SHA-256. */
  written: WrittenFile[];
  /** Each sent message: "FILE to ADDRESS, ADDRESS" (the recipients that got it). */
  sent: string[];
  /** Lines about the brief that are not errors (a record that could not be written). */
  notes: string[];
  /**
   * What became of each message sent (render --send), one per .eml: who got it, who did not and why, its
   * Message-ID. Files written and then not (fully) sent still count as written; `sendError` says the rest.
   */
  deliveries?: DeliveryRecord[];
  /** One line per message that some recipient did not get, or null. */
  sendError?: string | null;
  /** The one-line error, or null. */
  error: string | null;
  /** Where the error happened (its stack and those of its causes), shown with --debug. */
  stack?: string;
  exitCode: 0 | 1 | 2;
}

/** A Delivery (render/send.ts) as plain data, for the file it sent: it crosses from worker threads. */
export interface DeliveryRecord {
  file: string;
  messageId: string | null;
  accepted: string[];
  refused: Refusal[];
  attempts: number;
  /** Why the message failed as a whole, as one line, or null. */
  failure: string | null;
}

/**
 * Job files named by paths, folders (their *.yaml and *.yml files, and each subfolder's job.yaml) or a
 * `*`/`?` pattern in the last part.
 */
export function expandJobs(args: string[]): string[] {
  const out: string[] = [];
  for (const arg of args) {
    if (/[*?]/.test(basename(arg))) {
      const dir = dirname(arg);
      const re = new RegExp(
        `^${basename(arg)
          .replace(/[.+^${}()|[\]\\]/g, '\\$&')
          .replace(/\*/g, '.*')
          .replace(/\?/g, '.')}$`,
      );
      const found = existsSync(dir)
        ? readdirSync(dir)
            .filter((f) => re.test(f))
            .sort()
        : [];
      if (found.length === 0)
        throw usage('render', `no job file matches ${arg}`, 'check the pattern, e.g. "jobs/*.yaml"');
      out.push(...found.map((f) => join(dir, f)));
    } else if (existsSync(arg) && statSync(arg).isDirectory()) {
      // The folder's own .yaml files, and the job.yaml of each subfolder (one scenario a folder).
      const found = readdirSync(arg)
        .sort()
        .flatMap((f) => {
          const path = join(arg, f);
          if (/\.ya?ml$/i.test(f)) return [path];
          const nested = join(path, 'job.yaml');
          return statSync(path).isDirectory() && existsSync(nested) ? [nested] : [];
        });
      if (found.length === 0)
        throw usage('render', `the folder ${arg} holds no .yaml job file`, 'name a job file or a folder of them');
      out.push(...found);
    } else out.push(arg);
  }
  // One entry per file, kept as the user wrote it (messages name it that way).
  const seen = new Set<string>();
  const unique: string[] = [];
  for (const f of out) {
    if (seen.has(resolve(f))) continue;
    seen.add(resolve(f));
    unique.push(f);
  }
  return unique;
}

/** "K/N" → [K, N] with 1 ≤ K ≤ N. */
export function parseShard(text: string): [number, number] {
  const m = /^(\d+)\/(\d+)$/.exec(text.trim());
  const k = m ? Number(m[1]) : Number.NaN;
  const n = m ? Number(m[2]) : Number.NaN;
  if (!m || n < 1 || k < 1 || k > n)
    throw usage(
      'render',
      `--shard must be K/N with 1 ≤ K ≤ N, got "${text}"`,
      'e.g. --shard 2/8 runs the second of eight parts',
    );
  return [k, n];
}

/** The briefs of every job, in a stable order; jobs that fail to load come back as failures. */
export function planTasks(
  jobFiles: string[],
  outDir: string | null,
  options: RenderOptions,
  smtp: SmtpSettings | null,
  recording: Recording = NO_RECORDING,
): { tasks: BatchTask[]; failures: TaskResult[] } {
  const tasks: BatchTask[] = [];
  const failures: TaskResult[] = [];
  for (const jobFile of jobFiles) {
    try {
      const job = loadJob(jobFile);
      jobs.set(jobFile, job);
      // One job of many series is built on two threads: the second starts loading now, while the data are
      // read (brief/early-worker.ts); dropped again if the job turns out to be a batch of groups.
      const formats = options.formats ?? job.brief.outputs;
      if (jobFiles.length === 1 && job.series.length >= PARALLEL_SERIES && formats.some((f) => f !== 'json'))
        startSeriesWorkerEarly();
      const dir =
        outDir === null
          ? resolve(job.dir, 'out')
          : jobFiles.length === 1
            ? outDir
            : join(outDir, jobFolderName(jobFile));
      const loaded = loadJobData(job, undefined, options.period);
      for (const group of groupsOf(loaded)) {
        tasks.push({
          jobFile,
          group,
          outDir: dir,
          stem: fileStem(briefTitle(job.brief.title, group)),
          options,
          smtp,
          data: [...dataOfGroup(loaded, group, options.period ?? job.brief.period)],
          recording,
        });
      }
      // A group whose own rows are wrong fails alone; the job's other groups go on.
      for (const [group, e] of failedGroupsOf(loaded)) {
        failures.push(failedTask(jobFile, group, `${basename(jobFile)} — ${group}`, e));
      }
    } catch (e) {
      if (!(e instanceof BriefError)) throw e;
      failures.push(failedTask(jobFile, null, jobFile, e));
    }
  }
  tasks.sort((a, b) => taskKey(a).localeCompare(taskKey(b)));
  // A job that did not load writes nothing, so it takes no folder.
  checkFolderNames(
    jobFiles.filter((f) => !failures.some((x) => x.jobFile === f && x.group === null)),
    outDir,
  );
  checkCollisions(tasks);
  return { tasks, failures };
}

/**
 * Two briefs whose files would have the same name in the same folder (groups North and north, São Paulo and
 * Sao Paulo, A/B and A-B, or two jobs of the same title sharing an output folder) stop the run before
 * anything is written: one would silently replace the other.
 */
function checkCollisions(tasks: BatchTask[]): void {
  const byName = new Map<string, BatchTask[]>();
  for (const t of tasks) {
    if (t.stem === undefined) continue;
    const key = `${resolve(t.outDir)}\u0000${stemKey(t.stem)}`;
    byName.set(key, [...(byName.get(key) ?? []), t]);
  }
  for (const same of byName.values()) {
    if (same.length < 2) continue;
    const jobsOf = new Set(same.map((t) => t.jobFile));
    const what =
      jobsOf.size === 1
        ? `the groups ${same.map((t) => JSON.stringify(t.group ?? '')).join(' and ')}`
        : `the briefs of ${[...jobsOf].join(' and ')}`;
    throw new BriefError(
      'out-name-collision',
      `${what} would ${same.length === 2 ? 'both' : 'all'} be written as ${join(same[0].outDir, same[0].stem ?? '')}.*; nothing was written`,
      jobsOf.size === 1
        ? 'give the groups names that differ in more than case, accents or punctuation'
        : 'give the jobs different titles, or render them to different --out folders',
      { file: same[same.length - 1].jobFile },
    );
  }
}

/** Several jobs under one --out each get a subfolder named after the job: two the same would mix their files. */
function checkFolderNames(jobFiles: string[], outDir: string | null): void {
  if (outDir === null || jobFiles.length < 2) return;
  const seen = new Map<string, string>();
  for (const f of jobFiles) {
    const name = stemKey(jobFolderName(f));
    const other = seen.get(name);
    if (other !== undefined) {
      throw new BriefError(
        'out-name-collision',
        `${other} and ${f} would both write to ${join(outDir, jobFolderName(f))}; nothing was written`,
        'rename one of the job files (or its folder), or render them with separate --out folders',
        { file: f },
      );
    }
    seen.set(name, f);
  }
}

function taskKey(t: BatchTask): string {
  return `${t.jobFile}\u0000${t.group ?? ''}`;
}

/** Keeps the K-th of N shards: tasks k−1, k−1+N, k−1+2N, … of the sorted list. */
export function shardTasks(tasks: BatchTask[], shard: [number, number] | null): BatchTask[] {
  if (!shard) return tasks;
  const [k, n] = shard;
  return tasks.filter((_, i) => i % n === k - 1);
}

/**
 * The jobs that failed to load which this shard reports: each in one shard only (the job's place in the list
 * of job files, counted round the shards), so N shards do not report it N times. The briefs of the jobs
 * that did load keep their shards.
 */
export function shardFailures(
  failures: TaskResult[],
  jobFiles: string[],
  shard: [number, number] | null,
): TaskResult[] {
  if (!shard) return failures;
  const [k, n] = shard;
  return failures.filter((f) => Math.max(0, jobFiles.indexOf(f.jobFile)) % n === k - 1);
}

/** Output folder per job when several jobs share one --out: the job's file name, or its folder's for job.yaml. */
function jobFolderName(jobFile: string): string {
  const stem = basename(jobFile).replace(/\.ya?ml$/i, '');
  return stem === 'job' ? basename(dirname(jobFile)) : stem;
}

// Jobs, and the data of tasks that bring none, kept between the briefs of one run.
const jobs = new Map<string, Job>();
const data = new Map<string, LoadedData>();

/** Forgets loaded jobs and data, so the next run reads the files again (render --watch). */
export function clearCaches(): void {
  jobs.clear();
  data.clear();
}

/** Builds and writes one brief; never throws for a brief's own failure. */
export async function runTask(task: BatchTask): Promise<TaskResult> {
  const name = task.group === null ? basename(task.jobFile) : `${basename(task.jobFile)} — ${task.group}`;
  try {
    let job = jobs.get(task.jobFile);
    if (!job) {
      job = loadJob(task.jobFile);
      jobs.set(task.jobFile, job);
    }
    const cache = task.data ? new Map(task.data) : data;
    const version = await toolVersion();
    const formats = task.options.formats ?? job.brief.outputs;
    const recording = task.recording ?? NO_RECORDING;
    const records = recording.mode === 'always' || (recording.mode === 'auto' && formats.some((f) => f !== 'json'));
    const { beginRecord, failed } = await import('../record/session.js');
    const rec = records ? await beginRecord(job, task.group, version) : { store: null, past: new Map(), notes: [] };
    const out = await renderBriefFiles(job, task.group, task.outDir, task.options, version, cache, rec.past, task.stem);
    const written = await writeFiles(out.files, inputsOf(job));
    const notes = [...rec.notes];
    if (rec.store) {
      const { publicationEntries } = await import('../record/publication.js');
      const { run, shard, reason } = recording;
      await rec.store
        .append(publicationEntries(job, task.group, out.brief, written, { run, shard, reason }))
        .catch((e: unknown) => notes.push(...failed(job, e).notes));
    }
    const sent: string[] = [];
    const deliveries: DeliveryRecord[] = [];
    const problems: string[] = [];
    if (task.smtp) {
      const { deliverEmail, deliveryProblem } = await import('../render/send.js');
      const { emailEnvelope } = await import('../render/email.js');
      const envelope = emailEnvelope(job.brief.email, task.options.overrides);
      // With a record, each message goes only to those who have not got it (record/deliveries.ts).
      const once = rec.store ? await import('../record/deliveries.js') : null;
      const key = once ? once.messageKey(job, task.group, out.brief) : '';
      for (const f of out.files) {
        if (!f.path.endsWith('.eml')) continue;
        let to = envelope.to;
        if (once && rec.store) {
          const got = await once.deliveredTo(rec.store, key).catch((e: unknown) => {
            notes.push(...failed(job, e).notes);
            return new Set<string>();
          });
          to = envelope.to.filter((a) => !got.has(once.mailbox(a)));
          if (to.length === 0) {
            notes.push(
              `${f.path}: already sent to all ${envelope.to.length} recipients (the record says so); not sent again`,
            );
            continue;
          }
          if (to.length < envelope.to.length)
            notes.push(
              `${f.path}: ${envelope.to.length - to.length} recipients already have it (the record says so); sending to ${to.join(', ')}`,
            );
        }
        const d = await deliverEmail(bytesOf(f), { ...envelope, to }, task.smtp);
        const { failure, ...rest } = d;
        deliveries.push({ file: f.path, ...rest, failure: failure ? failure.oneLine() : null });
        if (d.accepted.length > 0) sent.push(`${f.path} to ${d.accepted.join(', ')}`);
        const problem = deliveryProblem(d, task.smtp);
        if (problem) problems.push(`${f.path}: ${problem.oneLine()}`);
        if (once && rec.store) {
          const { run, shard } = recording;
          await rec.store
            .append(once.deliveryEntries(job, task.group, out.brief, key, f, d, { run, shard, reason: '' }))
            .catch((e: unknown) => notes.push(...failed(job, e).notes));
        }
      }
    }
    return {
      jobFile: task.jobFile,
      group: task.group,
      name: out.name,
      files: out.files.map((f) => f.path),
      written,
      sent,
      notes,
      deliveries,
      sendError: problems.length > 0 ? problems.join('\n') : null,
      error: null,
      exitCode: problems.length > 0 ? 1 : 0,
    };
  } catch (e) {
    return failedTask(task.jobFile, task.group, name, e);
  }
}

/** A brief that wrote nothing: a BriefError keeps its line and exit code; anything else is a failed run (1). */
function failedTask(jobFile: string, group: string | null, name: string, e: unknown): TaskResult {
  const failure = { jobFile, group, name, files: [], written: [], sent: [], notes: [], stack: debugStack(e) };
  if (e instanceof BriefError) return { ...failure, error: e.oneLine(), exitCode: e.exitCode };
  const message = e instanceof Error ? e.message.split('\n')[0] : String(e);
  return { ...failure, error: `the run failed: ${message}`, exitCode: 1 };
}

/**
 * Each worker's heap is capped: V8 otherwise lets a busy worker's heap grow far past what it keeps alive
 * (a long batch on two workers once reached about 600 MB). A worker holds one brief at a time and no data
 * but that brief's group, so the caps follow the briefs themselves. The old generation needs room above
 * the largest brief: bench/brief-12.yaml (twelve series) died once in three runs with 48 MB, and one-series
 * briefs on a chart stack that loads vega took 45 % more CPU with 64 MB than with 96 or 128 MB (the heap
 * kept collecting near the cap). The young generation is what the peak follows: on 1,000 one-series briefs
 * (bench/memory.js, two workers, peak RSS of the process) 128/16 MB gave about 300 MB and 96/8 about 265,
 * at the same CPU time. A brief too big for the cap ends its worker, and runTasks builds it again on the
 * main thread, which has no cap.
 */
export const WORKER_LIMITS = { maxOldGenerationSizeMb: 96, maxYoungGenerationSizeMb: 8 };

/** Runs tasks in-process when there are few, else on a pool of worker threads, reporting each as it ends. */
export async function runTasks(
  tasks: BatchTask[],
  onDone: (r: TaskResult) => void,
  threads = availableParallelism(),
  limits = WORKER_LIMITS,
): Promise<TaskResult[]> {
  const results: TaskResult[] = [];
  const finish = (r: TaskResult): void => {
    results.push(r);
    onDone(r);
  };
  if (tasks.length < 4 || threads < 2) {
    for (const t of tasks) finish(await runTask(t));
    return results;
  }
  const { Piscina } = await import('piscina');
  // The modules' worker, or the one-script build's with its code cache (thread-entry.ts).
  const moduleWorker = new URL('./worker.js', import.meta.url);
  const pool = new Piscina({
    filename: (threadEntry('batch', moduleWorker) ?? moduleWorker).href,
    maxThreads: Math.min(threads, tasks.length),
    minThreads: 1,
    resourceLimits: limits,
  });
  // Piscina starts no new worker once one has died while starting up, and would leave the queued briefs
  // waiting for ever: with no worker left and briefs still queued, the pool is ended, which rejects them,
  // and they are built here too. A worker that dies with no task of ours is reported as a pool 'error'
  // (fatal when nobody listens); the same check follows it.
  // Worker threads see no signals: Ctrl-C or a kill removes their temporaries from here.
  const release = cleanUpOnSignal(tasks.map((t) => t.outDir));
  const giveUpIfStuck = (): void => {
    if (pool.threads.length === 0 && pool.queueSize > 0) void pool.destroy();
  };
  pool.on('error', giveUpIfStuck);
  try {
    // A worker that dies (a brief too big for WORKER_LIMITS) rejects its task: that brief is built here.
    await Promise.all(
      tasks.map((t) =>
        pool.run(t).then(
          (r: TaskResult) => finish(r),
          async () => {
            giveUpIfStuck();
            finish(await runTask(t));
          },
        ),
      ),
    );
  } finally {
    await pool.destroy();
    release();
  }
  return results;
}
