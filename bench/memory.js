/**
 * `node bench/memory.js`: peak memory (and wall time) of the built command line on large inputs, each run a
 * fresh process under `/usr/bin/time -v` (maximum resident set size; the render command's worker pool runs
 * threads of the same process, so the figure covers them). Imports nothing of the project: it runs
 * bin/trendbrief.js (→ dist/; `npm run build` first) as a child process.
 *
 * 1. `decompose` of a 1,200,000-point series, robust STL, to CSV and to JSON on stdout (sent to /dev/null).
 *    The CSV is the one bench/run.js writes for its largest size: the seeded series of bench/series.js with
 *    hourly dates from 1900-01-01T00:00 (monthly dates do not fit four-digit years at that length).
 * 2. A 500-group batch (`--groups 500,1000` for more sizes; `npm run bench` leaves the 1,000-group one to
 *    bench/briefs.js, which measures its time and peak): `render JOB --format html,pdf` on the job and data that
 *    bench/make-brief-data.mjs writes (one monthly series split by a column into that many groups).
 *
 * Prints one Markdown table (measure | max RSS | wall | target | pass/fail) and the machine line on stdout;
 * progress goes to stderr. Everything it writes lives in a temporary folder, removed at the end. Options:
 * --root DIR (another checkout or build to measure; default this one), --groups N[,N…], --skip-batch.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { availableParallelism, cpus, loadavg, tmpdir, totalmem } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { measure, TIME } from './measure.js';
import { syntheticSeries } from './series.js';

const here = join(dirname(fileURLToPath(import.meta.url)), '..');
const argv = process.argv.slice(2);
const option = (name, fallback) => {
  const i = argv.indexOf(name);
  return i >= 0 ? argv[i + 1] : fallback;
};
const root = resolve(option('--root', here));
const CLI = join(root, 'bin/trendbrief.js');
const POINTS = 1_200_000;

/** Issue 8's targets: 300 MB peak everywhere; 1,000 briefs in 60 s (bench/briefs.js), so 500 in 30 s. */
const PEAK_MB = 300;
const BATCH_SECONDS_PER_BRIEF = 60 / 1000;

const log = (msg) => process.stderr.write(`${msg}\n`);

/** The CSV of bench/run.js's largest size: date,value with hourly dates, written in 1 MB pieces. */
function writeSeriesCsv(n, file) {
  const x = syntheticSeries(n);
  const parts = ['date,value\n'];
  let chunk = '';
  for (let i = 0; i < n; i++) {
    const date = new Date(Date.UTC(1900, 0, 1) + i * 3600000).toISOString().slice(0, 16);
    chunk += `${date},${x[i]}\n`;
    if (chunk.length > 1 << 20) {
      parts.push(chunk);
      chunk = '';
    }
  }
  parts.push(chunk);
  writeFileSync(file, parts.join(''));
}

function makeGroups(count, dir) {
  const made = spawnSync(
    process.execPath,
    [join(root, 'bench/make-brief-data.mjs'), '--groups', String(count), '--out', dir],
    { encoding: 'utf8' },
  );
  if (made.status !== 0) throw new Error(`make-brief-data failed: ${made.stderr}`);
  return join(dir, 'job.yaml');
}

const secs = (t) => (t < 10 ? t.toFixed(2) : t.toFixed(1));
const mb = (v) => (Number.isFinite(v) ? `${v.toFixed(0)} MB` : 'n/a');

/** pass, or which target failed; n/a when /usr/bin/time is missing. */
function verdict(peakMb, wall, wallTarget) {
  if (!Number.isFinite(peakMb)) return 'n/a';
  const failed = [];
  if (peakMb > PEAK_MB) failed.push('memory');
  if (wallTarget !== null && wall > wallTarget) failed.push('time');
  return failed.length === 0 ? 'pass' : `FAIL (${failed.join(', ')})`;
}

if (!existsSync(join(root, 'dist/cli/main.js'))) {
  log('bench/memory.js: dist/ is missing — run `npm run build` first');
  process.exit(2);
}
if (!existsSync(TIME)) log('bench/memory.js: /usr/bin/time is missing (Debian: apt-get install time); no peak memory');

const loadBefore = loadavg();
const work = mkdtempSync(join(tmpdir(), 'trendbrief-memory-'));
const rows = [];
try {
  const csv = join(work, 'series-1200000.csv');
  log(`writing a ${POINTS.toLocaleString('en')}-point CSV …`);
  writeSeriesCsv(POINTS, csv);
  for (const format of ['csv', 'json']) {
    const args = [CLI, 'decompose', csv, '--date', 'date', '--value', 'value', '--model', 'additive', '--robust'];
    args.push('--seasonal-window', '13', '--frequency', 'hourly', '--period', '12', '--format', format);
    const r = measure(args, { cwd: root, discardStdout: true });
    log(`decompose to ${format}: ${secs(r.wall)} s, ${mb(r.peakMb)}`);
    rows.push({
      measure: `\`decompose\` of ${POINTS.toLocaleString('en')} points, robust STL, to ${format.toUpperCase()}`,
      ...r,
      target: `≤ ${PEAK_MB} MB`,
      verdict: verdict(r.peakMb, r.wall, null),
    });
  }
  if (!argv.includes('--skip-batch')) {
    for (const groups of option('--groups', '500').split(',').map(Number)) {
      const job = makeGroups(groups, join(work, `groups-${groups}`));
      const out = join(work, `out-${groups}`);
      log(`${groups} one-series briefs, HTML + PDF, on ${availableParallelism()} cores …`);
      const r = measure([CLI, 'render', job, '--out', out, '--format', 'html,pdf', '--quiet'], {
        cwd: root,
        discardStdout: true,
      });
      const files = readdirSync(out).length;
      if (files !== 2 * groups) throw new Error(`expected ${2 * groups} files, found ${files}`);
      log(`${groups} briefs: ${secs(r.wall)} s, ${mb(r.peakMb)}`);
      const wallTarget = groups * BATCH_SECONDS_PER_BRIEF;
      rows.push({
        measure: `batch of ${groups.toLocaleString('en')} one-series briefs, HTML + PDF`,
        ...r,
        target: `≤ ${PEAK_MB} MB, ≤ ${wallTarget} s`,
        verdict: verdict(r.peakMb, r.wall, wallTarget),
      });
      rmSync(out, { recursive: true, force: true });
    }
  }
} finally {
  rmSync(work, { recursive: true, force: true });
}

const table = [
  '| measure | max RSS | wall | target | pass/fail |',
  '| --- | ---: | ---: | --- | --- |',
  ...rows.map((r) => `| ${r.measure} | ${mb(r.peakMb)} | ${secs(r.wall)} s | ${r.target} | ${r.verdict} |`),
].join('\n');
const cpu = cpus()[0]?.model ?? 'unknown CPU';
const machine = `Machine: ${cpu}, ${availableParallelism()} cores, ${(totalmem() / 2 ** 30).toFixed(0)} GiB, Node ${process.version}, ${process.platform}; load average before ${loadBefore
  .map((l) => l.toFixed(2))
  .join(' ')}, after ${loadavg()
  .map((l) => l.toFixed(2))
  .join(' ')} (other work on the machine slows the wall times; peak memory hardly moves with it).`;
process.stdout.write(`${table}\n\n${machine}\n`);
