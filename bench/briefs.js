/**
 * `node bench/briefs.js`: times whole briefs through the command line, start-up included, and checks them
 * against the targets. Runs the built CLI (bin/trendbrief.js → dist/; `npm run build` first) as a child
 * process and imports nothing of the project.
 *
 * (a) bench/brief-12.yaml (twelve invented monthly series, ten years each) rendered to HTML and PDF: wall
 *     time of the process, the median of three runs; as committed (today's defaults for monthly data:
 *     forecast extension and the search for unusual events, target 2.0 s) and, in alternating runs, with
 *     the effects stage off (`effects: { find: off }`: forecast extension only, target 1.5 s).
 * (b) 1,000 one-series briefs: bench/make-brief-data.mjs writes a job with one series grouped by a column
 *     with 1,000 groups (seeded, ten years of months each) into a temporary folder, and `render JOB --format
 *     html,pdf` spreads the groups over its worker pool on all cores: wall time of one run.
 * (c) Peak memory of each, from `/usr/bin/time -v` (maximum resident set size; the pool's workers are
 *     threads of the one process, so it covers them).
 *
 * Prints a Markdown table with the targets and pass or fail, and writes it with the date and the machine
 * to bench/BRIEFS.md (keeping whatever follows a `<!-- notes -->` line there). Options: --groups N (default
 * 1000), --runs N (default 3), --no-write, --root DIR (another checkout or build to time; default this one).
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { availableParallelism, cpus, loadavg, tmpdir, totalmem } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { measure } from './measure.js';

const here = join(dirname(fileURLToPath(import.meta.url)), '..');
const argv = process.argv.slice(2);
const option = (name, fallback) => {
  const i = argv.indexOf(name);
  return i >= 0 ? argv[i + 1] : fallback;
};
const root = resolve(option('--root', here));
const GROUPS = Number(option('--groups', '1000'));
const RUNS = Number(option('--runs', '3'));
const WRITE = !argv.includes('--no-write');
const CLI = join(root, 'bin/trendbrief.js');

const TARGETS = {
  // The forecast extension's target: the 12-series brief with extension on. The search for unusual events and
  // calendar effects, on by default for monthly data since, has a budget of its own.
  twelveSeconds: 1.5,
  twelveEffectsSeconds: 2.0,
  batchSeconds: 60,
  peakMb: 300,
};

const log = (msg) => process.stderr.write(`${msg}\n`);

const median = (xs) => {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
};
const secs = (t) => (t < 10 ? t.toFixed(2) : t.toFixed(1));
const mb = (v) => (Number.isFinite(v) ? v.toFixed(0) : 'n/a');
const verdict = (value, target) => (!Number.isFinite(value) ? 'n/a' : value <= target ? 'pass' : 'FAIL');

if (!existsSync(join(root, 'dist/cli/main.js'))) {
  log('bench/briefs.js: dist/ is missing — run `npm run build` first');
  process.exit(2);
}
const loadBefore = loadavg();
const work = mkdtempSync(join(tmpdir(), 'trendbrief-briefs-'));
try {
  // (a) the twelve-series brief, fresh process each time: as committed (today's defaults: forecast extension
  // and the search for unusual events), and with the effects stage off (extension only), in alternating runs.
  const plainJob = join(work, 'brief-12-extension-only.yaml');
  const jobText = readFileSync(join(root, 'bench/brief-12.yaml'), 'utf8');
  if (/^defaults:/m.test(jobText)) throw new Error('bench/brief-12.yaml has a defaults: section; add effects to it');
  writeFileSync(
    plainJob,
    jobText
      .replace(/^series:$/m, 'defaults:\n  effects: { find: off }\n\nseries:')
      .replaceAll('file: data/brief-12.csv', `file: ${JSON.stringify(join(root, 'bench/data/brief-12.csv'))}`),
  );
  const twelve = [];
  const plain = [];
  for (let i = 0; i < RUNS; i++) {
    for (const [job, into, label] of [
      ['bench/brief-12.yaml', twelve, 'as committed'],
      [plainJob, plain, 'effects off'],
    ]) {
      const out = join(work, `twelve-${into === twelve ? 'a' : 'b'}-${i}`);
      into.push(measure([CLI, 'render', job, '--out', out, '--format', 'html,pdf', '--quiet'], { cwd: root }));
      log(
        `12-series brief (${label}), run ${i + 1}/${RUNS}: ${secs(into.at(-1).wall)} s, ${mb(into.at(-1).peakMb)} MB`,
      );
    }
  }
  const twelveWall = median(twelve.map((r) => r.wall));
  const twelveCpu = median(twelve.map((r) => r.cpu));
  const twelvePeak = Math.max(...twelve.map((r) => r.peakMb));
  const plainWall = median(plain.map((r) => r.wall));
  const plainCpu = median(plain.map((r) => r.cpu));

  // (b) many one-series briefs from one grouped job
  const jobDir = join(work, 'groups');
  const made = spawnSync(
    process.execPath,
    [join(root, 'bench/make-brief-data.mjs'), '--groups', String(GROUPS), '--out', jobDir],
    {
      encoding: 'utf8',
    },
  );
  if (made.status !== 0) throw new Error(`make-brief-data failed: ${made.stderr}`);
  log(`${GROUPS} one-series briefs on ${availableParallelism()} cores …`);
  const outDir = join(jobDir, 'out');
  const batch = measure([CLI, 'render', join(jobDir, 'job.yaml'), '--out', outDir, '--format', 'html,pdf'], {
    cwd: root,
  });
  const files = readdirSync(outDir).length;
  if (files !== 2 * GROUPS) throw new Error(`expected ${2 * GROUPS} files, found ${files}`);
  log(`${GROUPS} briefs: ${secs(batch.wall)} s, ${mb(batch.peakMb)} MB`);
  // The target is for 1,000 briefs; a smaller --groups run is scaled to it (and says so).
  const scale = 1000 / GROUPS;
  const batchWall = batch.wall * scale;

  const rows = [
    ['measure', 'result', 'target', ''],
    ['---', '---:', '---:', '---'],
    [
      `(a) 12-series brief, HTML + PDF, forecast extension on, effects stage off, wall incl. start-up (median of ${RUNS})`,
      `${secs(plainWall)} s`,
      `≤ ${TARGETS.twelveSeconds} s`,
      verdict(plainWall, TARGETS.twelveSeconds),
    ],
    ['    CPU time of that process (user + system, median)', `${secs(plainCpu)} s`, '', ''],
    [
      `(a) the same as committed (today's defaults: extension and the search for unusual events), wall (median of ${RUNS})`,
      `${secs(twelveWall)} s`,
      `≤ ${TARGETS.twelveEffectsSeconds} s`,
      verdict(twelveWall, TARGETS.twelveEffectsSeconds),
    ],
    ['    CPU time of that process (user + system, median)', `${secs(twelveCpu)} s`, '', ''],
    [
      `(b) ${GROUPS === 1000 ? '1,000' : `${GROUPS} (scaled to 1,000)`} one-series briefs, HTML + PDF, wall on ${availableParallelism()} cores`,
      `${secs(batchWall)} s`,
      `≤ ${TARGETS.batchSeconds} s`,
      verdict(batchWall, TARGETS.batchSeconds),
    ],
    ['    CPU time of that process (user + system)', `${secs(batch.cpu * scale)} s`, '', ''],
    [
      '(c) peak memory, 12-series brief (max RSS)',
      `${mb(twelvePeak)} MB`,
      `≤ ${TARGETS.peakMb} MB`,
      verdict(twelvePeak, TARGETS.peakMb),
    ],
    [
      `(c) peak memory, ${GROUPS} briefs (max RSS, workers included)`,
      `${mb(batch.peakMb)} MB`,
      `≤ ${TARGETS.peakMb} MB`,
      verdict(batch.peakMb, TARGETS.peakMb),
    ],
  ];
  const table = rows.map((r) => `| ${r.join(' | ')} |`).join('\n');
  const cpu = cpus()[0]?.model ?? 'unknown CPU';
  const machine = `${cpu}, ${availableParallelism()} cores, ${(totalmem() / 2 ** 30).toFixed(0)} GiB, Node ${process.version}, ${process.platform}; load average before the run ${loadBefore
    .map((l) => l.toFixed(2))
    .join(' ')}, after it ${loadavg()
    .map((l) => l.toFixed(2))
    .join(' ')} (other work on the machine slows every figure)`;
  const date = new Date().toISOString().slice(0, 10);
  process.stdout.write(`${table}\n`);
  if (WRITE) {
    const text = `# Brief benchmark

Measured ${date} by \`node bench/briefs.js\` on ${machine}.

${table}

Wall times include Node's start-up and every import; each run is a fresh process of the built command line
(\`bin/trendbrief.js\`). Peak memory is the maximum resident set size reported by \`/usr/bin/time -v\`; the
render command's worker pool runs threads of the same process, so the figure covers them. The data are
invented and seeded (\`bench/make-brief-data.mjs\`); see \`bench/brief-12.yaml\` for the twelve series' settings.
`;
    const file = join(here, 'bench/BRIEFS.md');
    const old = existsSync(file) ? readFileSync(file, 'utf8') : '';
    const notes = old.indexOf('<!-- notes -->');
    writeFileSync(file, notes >= 0 ? `${text}\n${old.slice(notes)}` : text);
    log('wrote bench/BRIEFS.md');
  }
} finally {
  rmSync(work, { recursive: true, force: true });
}
