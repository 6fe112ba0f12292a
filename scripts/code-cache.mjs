#!/usr/bin/env node
/**
 * Writes dist/bundle/main.cjs.cache, the V8 code cache of the `render` command's script (bin/cached-script.js
 * says how it is used and checked). Part of `npm run build`, after scripts/bundle.mjs: it renders two of the
 * examples with the script in this process (a monthly brief with the default effects and extension; one with
 * calendar effects, a named step and the email), into a temporary folder and without the record, and then
 * asks V8 for the cache, which now holds the bytecode of every function those briefs ran. The file is the
 * script's SHA-256, then that of V8's bytes, then the bytes; it is written whole or not at all. Run it from a
 * plain `node`, as the command line is: V8 takes a cache only under the flags it was made with.
 */
import { mkdtempSync, renameSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { bundlePaths, cacheFile, loadBundle } from '../bin/cached-script.js';

const root = fileURLToPath(new URL('../', import.meta.url));
const JOBS = ['examples/water-deliveries/job.yaml', 'examples/harbour-freight/job.yaml'];

const paths = bundlePaths();
// A cache of an earlier build must not outlive a failure here (the digest would refuse it, but no stale file
// should be left to explain).
rmSync(paths.cache, { force: true });
process.env.TRENDBRIEF_RECORD = 'never';
const { exports, script, digest } = loadBundle({ cache: 'none' });
const out = mkdtempSync(join(tmpdir(), 'trendbrief-code-cache-'));
try {
  for (const job of JOBS) {
    const code = await exports.main(['render', join(root, job), '--out', out, '--quiet']);
    if (code !== 0) throw new Error(`scripts/code-cache.mjs: rendering ${job} failed (exit ${code})`);
  }
} finally {
  rmSync(out, { recursive: true, force: true });
}
const part = `${paths.cache}.${process.pid}.part`;
writeFileSync(part, cacheFile(digest, script.createCachedData()));
renameSync(part, paths.cache);
