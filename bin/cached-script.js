/**
 * The `render` command's start: dist/bundle/main.cjs, the whole command line as one CommonJS script
 * (scripts/bundle.mjs), compiled with the V8 code cache that `npm run build` wrote beside it
 * (dist/bundle/main.cjs.cache, scripts/code-cache.mjs). The cache holds the bytecode of every function a
 * brief ran when it was made, so a brief starts without parsing and compiling them again; Node 20 keeps no
 * such cache for ES modules. What the script does is the same whether the cache is taken or not.
 *
 * V8 checks a cache against its own version and flags, but against the source only by its length, and in a
 * release build it does not checksum the cache's bytes (a damaged cache can crash the process). So the cache
 * file begins with two SHA-256 digests, of the source it was made from and of V8's bytes that follow, and is
 * used only when both match: a cache left from another build, a hand-edited script or a damaged file is never
 * applied. A cache V8 rejects (another Node, other V8 flags) is ignored and the script compiled from its
 * source. The two digests cost about 3 ms of a brief's start.
 */
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname } from 'node:path';
import { fileURLToPath } from 'node:url';
import vm from 'node:vm';

const DIGEST = 32;

const sha256 = (bytes) => createHash('sha256').update(bytes).digest();

/** The cache file's bytes: the source's digest, the data's digest, the data. */
export function cacheFile(sourceDigest, data) {
  return Buffer.concat([sourceDigest, sha256(data), data]);
}

/** The script and its cache file in `dir` (dist/bundle by default). */
export function bundlePaths(dir = fileURLToPath(new URL('../dist/bundle/', import.meta.url))) {
  const script = `${dir.replace(/\/?$/, '/')}main.cjs`;
  return { script, cache: `${script}.cache` };
}

/** V8's bytes for the source with this digest, or undefined (absent, made from another source, or damaged). */
function cacheFor(file, digest) {
  let bytes;
  try {
    bytes = readFileSync(file);
  } catch {
    return undefined;
  }
  if (bytes.length <= 2 * DIGEST || !bytes.subarray(0, DIGEST).equals(digest)) return undefined;
  const data = bytes.subarray(2 * DIGEST);
  return sha256(data).equals(bytes.subarray(DIGEST, 2 * DIGEST)) ? data : undefined;
}

/**
 * Compiles and runs the script as Node would a CommonJS module (and lists it in require.cache, as Node's
 * own loader does). `cache`: 'use' (default) or 'none'. Returns the module's exports, the vm.Script (for
 * scripts/code-cache.mjs) and how the cache went: 'used', 'absent' (no cache, not this source's, or
 * damaged) or 'rejected' (V8 would not take it).
 */
export function loadBundle({ dir, cache = 'use' } = {}) {
  const paths = bundlePaths(dir);
  const bytes = readFileSync(paths.script);
  const digest = sha256(bytes);
  const cachedData = cache === 'use' ? cacheFor(paths.cache, digest) : undefined;
  // The script is ASCII (scripts/bundle.mjs checks), so latin1 is its text, and V8 keeps it one byte a
  // character. It is the function Node would wrap a CommonJS module in (the bundle writes it so).
  const script = new vm.Script(bytes.toString('latin1'), { filename: paths.script, cachedData });
  const require = createRequire(paths.script);
  const module = { id: paths.script, filename: paths.script, exports: {}, loaded: false, children: [], paths: [] };
  require.cache[paths.script] = module;
  script.runInThisContext()(module.exports, require, module, paths.script, dirname(paths.script));
  module.loaded = true;
  const state = cachedData === undefined ? 'absent' : script.cachedDataRejected ? 'rejected' : 'used';
  return { exports: module.exports, script, digest, cache: state };
}
