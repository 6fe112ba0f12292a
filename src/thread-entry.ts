/**
 * Where a worker thread of `render` starts: the PDF's own thread (render/pdf/thread.ts), the second series
 * thread (brief/share.ts) and a batch's pool workers (cli/batch.ts). Run from the modules (dist/bundle/*.js,
 * as every command but `render` and any run with --debug), a thread starts from its entry module
 * (pdf-worker.js, series-worker.js, worker.js) and compiles its code afresh. Run from the one-script build
 * (dist/bundle/main.cjs, which `render` runs with its V8 code cache, bin/cached-script.js), it starts from
 * bin/<kind>-thread.js, which loads that script with the same cache: the thread compiles none of its code
 * again. On the 2-core benchmark machine that took 0.885 of the CPU time of the 12-series brief with both
 * of its threads forced on, 0.954 of the one-series brief's with the PDF thread, and 0.909 of a batch of
 * the four examples' (bench/BRIEFS.md).
 */
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { PACKAGE_ROOT } from './package-root.js';

export type ThreadKind = 'pdf' | 'series' | 'batch';

/** In the one-script build every module's URL is the script's own (scripts/bundle.mjs). */
const ONE_SCRIPT = import.meta.url.endsWith('.cjs');

/**
 * The file a thread of this kind starts from, or null where there is none (the sources under vitest have
 * no built entry module: their threads are not started). `moduleEntry`: the entry module beside the caller.
 */
export function threadEntry(kind: ThreadKind, moduleEntry: URL): URL | null {
  const file = ONE_SCRIPT ? new URL(`bin/${kind}-thread.js`, PACKAGE_ROOT) : moduleEntry;
  return existsSync(fileURLToPath(file)) ? file : null;
}
