/**
 * `render --watch`: render again whenever the job file, a data file, the logo or a template (in any
 * subfolder of the templates folder) changes.
 * Changes are gathered for a moment (editors save in several steps) and a failed render is reported and
 * waited out, never fatal. Ends on Ctrl-C.
 */
import { type Dirent, existsSync, type FSWatcher, readdirSync, watch } from 'node:fs';
import { join } from 'node:path';
import { loadJob } from '../job/load.js';
import type { Console } from './output.js';

export const SETTLE_MS = 300;

/** The files a job's briefs depend on. */
export function watchedFiles(jobFile: string): string[] {
  const files = [jobFile];
  try {
    const job = loadJob(jobFile);
    for (const s of job.series) files.push(s.data.file);
    if (job.brief.logo) files.push(job.brief.logo);
    // A folder's watch sees its own entries only: each subfolder (partials/) is watched as well.
    if (job.brief.templates) files.push(job.brief.templates, ...foldersUnder(job.brief.templates));
  } catch {
    // A job that does not load yet still has its own file watched; the render reports the mistake.
  }
  return [...new Set(files)].filter((f) => existsSync(f));
}

function foldersUnder(dir: string, depth = 0): string[] {
  if (depth >= 8) return [];
  let entries: Dirent[];
  try {
    entries = readdirSync(dir, { withFileTypes: true });
  } catch {
    return [];
  }
  return entries
    .filter((e) => e.isDirectory())
    .flatMap((e) => [join(dir, e.name), ...foldersUnder(join(dir, e.name), depth + 1)]);
}

export async function watchAndRender(jobFiles: string[], render: () => Promise<number>, con: Console): Promise<number> {
  let watchers: FSWatcher[] = [];
  let timer: NodeJS.Timeout | null = null;
  let running = false;
  let again = false;
  const arm = (): void => {
    for (const w of watchers) w.close();
    const files = jobFiles.flatMap(watchedFiles);
    watchers = files.map((f) => watch(f, { persistent: true }, () => schedule()));
    con.info(`watching ${files.length} file${files.length === 1 ? '' : 's'}; press Ctrl-C to stop`);
  };
  const run = async (): Promise<void> => {
    if (running) {
      again = true;
      return;
    }
    running = true;
    do {
      again = false;
      const code = await render().catch(() => 1);
      con.info(code === 0 ? 'rendered; waiting for changes' : 'render failed; waiting for changes');
      arm();
    } while (again);
    running = false;
  };
  function schedule(): void {
    if (timer) clearTimeout(timer);
    timer = setTimeout(() => void run(), SETTLE_MS);
  }
  arm();
  // Ctrl-C ends the watch. Under a batch's waiting process (bin/batch-process.js) it arrives twice, from the
  // terminal and passed on: the listener stays, so the second does not end the process by the signal.
  return new Promise((resolve) => {
    process.on('SIGINT', () => {
      for (const w of watchers) w.close();
      if (timer) clearTimeout(timer);
      resolve(0);
    });
  });
}
