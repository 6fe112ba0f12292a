/**
 * The command line runs from the bundle `npm run build` writes (scripts/bundle.mjs, dist/bundle/): `render`
 * from one CommonJS script with a V8 code cache (bin/cached-script.js), every other command from ES module
 * chunks. The bundle must write the same files as the modules tsc writes to dist/ (same code, same pdfkit and
 * fontkit), byte for byte: a brief with Hebrew and Arabic words (fontkit's shaper and the fallback fonts from
 * the package's fonts/ folder) in an archival PDF (pdfkit's sRGB profile, read beside pdfkit's own file). A
 * Latin brief loads none of the packages the bundle puts off until first use. The code cache is taken only
 * for the script it was made from.
 */
import { spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { cpSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Script } from 'node:vm';
import { afterAll, describe, expect, it } from 'vitest';
// @ts-expect-error: bin/ is plain JavaScript without declarations.
import { cacheFile } from '../../bin/cached-script.js';
import { BIN, DECOMPOSE_EXAMPLE, EXAMPLE_COPY, ROOT } from './run.js';

const dir = mkdtempSync(join(tmpdir(), 'tb-bundle-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** The same command line from tsc's modules (dist/cli/main.js) rather than the bundle. */
const UNBUNDLED = join(dir, 'unbundled.mjs');
writeFileSync(
  UNBUNDLED,
  `import { main } from ${JSON.stringify(join(ROOT, 'dist/cli/main.js'))};\nmain(process.argv.slice(2)).then((code) => { process.exitCode = code; });\n`,
);

/** Node's options that log every module a run loads into $IMPORT_LOG (ES modules and CommonJS alike). */
const RECORDING = [
  '--import',
  `${ROOT}test/cli/files/record-imports.mjs`,
  '--require',
  `${ROOT}test/chart/files/record-requires.cjs`,
];

function render(entry: string, job: string, out: string, extra: string[] = [], env: Record<string, string> = {}) {
  const r = spawnSync(process.execPath, [...extra, entry, 'render', job, '--out', out, '--format', 'html,pdf'], {
    cwd: ROOT,
    env: { ...process.env, NO_COLOR: '1', TRENDBRIEF_RECORD: 'never', SOURCE_DATE_EPOCH: '1700000000', ...env },
    encoding: 'utf8',
  });
  expect(r.status, r.stderr).toBe(0);
  return readdirSync(out).sort();
}

describe('the bundled command line', () => {
  it('is what bin/trendbrief.js runs: the cached script for render, the chunks for the rest', () => {
    const loads = (args: readonly string[]) => {
      const log = join(dir, `loads-${args[0]}.txt`);
      const r = spawnSync(process.execPath, [...RECORDING, BIN, ...args], {
        cwd: ROOT,
        env: { ...process.env, NO_COLOR: '1', TRENDBRIEF_RECORD: 'never', IMPORT_LOG: log },
        encoding: 'utf8',
      });
      expect(r.status, r.stderr).toBe(0);
      return readFileSync(log, 'utf8').split('\n');
    };
    const render = loads([
      'render',
      'examples/water-deliveries/job.yaml',
      '--out',
      join(dir, 'which'),
      '--format',
      'html',
    ]);
    expect(render).toContain(join(ROOT, 'dist/bundle/main.cjs'));
    expect(render.filter((u) => u.includes('/dist/bundle/main.js'))).toEqual([]);
    const decompose = loads(DECOMPOSE_EXAMPLE);
    expect(decompose.some((u) => u.includes('/dist/bundle/main.js'))).toBe(true);
    expect(decompose.filter((u) => u.includes('/dist/bundle/main.cjs'))).toEqual([]);
  });

  it('writes the same bytes as the unbundled modules: right-to-left words, archival PDF', () => {
    const job = join(dir, 'rtl');
    cpSync(join(ROOT, 'examples/water-deliveries'), job, EXAMPLE_COPY);
    const text = readFileSync(join(job, 'job.yaml'), 'utf8')
      .replace('organisation: Riverside Water Authority', 'organisation: "רשות המים — سلطة المياه"')
      .replace('outputs: [html, pdf]', 'outputs: [html, pdf]\n  pdf_archival: true');
    expect(text).toContain('pdf_archival: true');
    writeFileSync(join(job, 'job.yaml'), text);
    const a = join(dir, 'a');
    const b = join(dir, 'b');
    const files = render(BIN, join(job, 'job.yaml'), a);
    expect(render(UNBUNDLED, join(job, 'job.yaml'), b)).toEqual(files);
    expect(files.some((f) => f.endsWith('.pdf'))).toBe(true);
    for (const f of files) expect(readFileSync(join(a, f)).equals(readFileSync(join(b, f))), f).toBe(true);
    // The fallback fonts were really used (their subsets are in the file).
    const pdf = readFileSync(join(a, files.find((f) => f.endsWith('.pdf')) as string)).toString('latin1');
    expect(pdf).toMatch(/NotoSansHebrew/);
    expect(pdf).toMatch(/NotoSansArabic/);
  });

  it('a Latin brief loads none of the packages put off until first use', () => {
    const log = join(dir, 'imports.txt');
    render(BIN, 'examples/water-deliveries/job.yaml', join(dir, 'latin'), RECORDING, { IMPORT_LOG: log });
    const loaded = readFileSync(log, 'utf8').split('\n');
    expect(loaded).toContain(join(ROOT, 'dist/bundle/main.cjs'));
    for (const lazy of ['/brotli/', '/unicode-properties/', '/linebreak/', '/@noble/ciphers/']) {
      expect(loaded.filter((u) => u.includes(lazy))).toEqual([]);
    }
  });
});

describe('the code cache of the render script', () => {
  /** Loads the script in `bundle` (a folder) in a plain node, runs `trendbrief --help` from it. */
  function helpFrom(bundle?: string) {
    const code = `import(${JSON.stringify(join(ROOT, 'bin/cached-script.js'))}).then(async (m) => {
      const r = m.loadBundle(${bundle ? `{ dir: ${JSON.stringify(bundle)} }` : ''});
      process.stderr.write(r.cache);
      process.exitCode = await r.exports.main(['--help']);
    });`;
    const r = spawnSync(process.execPath, ['--input-type=module', '-e', code], { encoding: 'utf8' });
    expect(r.status, r.stderr).toBe(0);
    return { cache: r.stderr, help: r.stdout };
  }

  it('is made by the build and taken by a plain node', () => {
    expect(helpFrom().cache).toBe('used');
  });

  const SCRIPT = join(ROOT, 'dist/bundle/main.cjs');
  const CACHE = join(ROOT, 'dist/bundle/main.cjs.cache');

  /** A folder `name` holding this script and this cache, the loader run on it: what it did with the cache, the help. */
  function helpWith(name: string, script: Buffer, cache: Buffer) {
    const bundle = join(dir, name);
    mkdirSync(bundle);
    writeFileSync(join(bundle, 'main.cjs'), script);
    writeFileSync(join(bundle, 'main.cjs.cache'), cache);
    return helpFrom(bundle);
  }

  it('is not taken for another script of the same length, whose own code then runs', () => {
    // V8 itself compares only the length: without the digest, the cached bytecode of the old help text runs.
    const script = readFileSync(SCRIPT, 'latin1');
    expect(script).toContain('Usage: trendbrief <command>');
    const edited = script.replace('Usage: trendbrief <command>', 'Usage: trendbrieX <command>');
    expect(edited.length).toBe(script.length);
    const r = helpWith('edited', Buffer.from(edited, 'latin1'), readFileSync(CACHE));
    expect(r.cache).toBe('absent');
    expect(r.help).toContain('Usage: trendbrieX <command>');
  });

  it('a damaged cache is not handed to V8 (a release V8 does not check its bytes, and can crash on them)', () => {
    const cache = readFileSync(CACHE);
    for (let i = 96; i < cache.length; i += 97) cache[i] ^= 0x5a;
    const r = helpWith('damaged', readFileSync(SCRIPT), cache);
    expect(r.cache).toBe('absent');
    expect(r.help).toContain('Usage: trendbrief <command>');
  });

  it('a whole cache V8 will not take (made for another script) is left aside, and the script runs', () => {
    const script = readFileSync(SCRIPT);
    const other = new Script('(function () { return 1; })').createCachedData();
    const r = helpWith('other', script, cacheFile(createHash('sha256').update(script).digest(), other));
    expect(r.cache).toBe('rejected');
    expect(r.help).toContain('Usage: trendbrief <command>');
  });
});
