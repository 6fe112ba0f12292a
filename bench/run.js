/**
 * `npm run bench`: times the decomposition engine and prints Markdown tables on stdout (progress goes to
 * stderr, so a redirect keeps only the tables; bench/RESULTS.md holds one run with notes on the targets).
 *
 * 1. Robust STL (period 12, seasonal window 13, 15 outer and 1 inner passes) in-process at n = 1,200 …
 *    1,200,000 on the seeded series of series.js, beside R's stats::stl on the same numbers, timed inside
 *    R around the stl call only; rounds of ours-then-R after warm-up, the median and the fastest run.
 * 2. The whole `trendbrief decompose` command against an Rscript that reads the same CSV, runs stl and
 *    writes the components: wall time of each process, start-up included, and its peak RSS.
 * 3. Classical additive decomposition at n = 1,200,000.
 * 4. The machine.
 *
 * Options: --sizes 1200,12000  --no-r  --no-process
 */
import { spawnSync } from 'node:child_process';
import { closeSync, existsSync, mkdtempSync, openSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { cpus, loadavg, tmpdir, totalmem } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { classicalDecomposition } from '../dist/decompose/classical.js';
import { stl } from '../dist/decompose/stl.js';
import { syntheticSeries } from './series.js';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const argv = process.argv.slice(2);
const flag = (name) => argv.includes(name);
const option = (name) => {
  const i = argv.indexOf(name);
  return i >= 0 ? argv[i + 1] : undefined;
};
const SIZES = (option('--sizes') ?? '1200,12000,120000,1200000').split(',').map(Number);
const STL_OPTIONS = { period: 12, seasonalWindow: 13, robust: true };
const R_STL = 'stl(ts(x, frequency = 12), s.window = 13, robust = TRUE)';

/**
 * Samples per size, in how many rounds, and how many calls one sample times (small sizes run in batches,
 * for the resolution of R's clock). Each round times ours, then R: a change in the machine's load during
 * the run then touches both.
 */
function plan(n) {
  if (n <= 2000) return { rounds: 3, samples: 5, batch: 20 };
  if (n <= 20000) return { rounds: 3, samples: 4, batch: 2 };
  if (n <= 200000) return { rounds: 3, samples: 3, batch: 1 };
  return { rounds: 3, samples: 1, batch: 1 };
}

const median = (xs) => {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
};
const log = (msg) => process.stderr.write(`${msg}\n`);
const fmtInt = (n) => n.toLocaleString('en-US');
const ms = (t) => (t < 10 ? t.toFixed(2) : t < 100 ? t.toFixed(1) : t.toFixed(0));
const sec = (t) => (t / 1000).toFixed(t < 1000 ? 3 : 2);
const ratio = (a, b) => (b > 0 ? (a / b).toFixed(2) : '–');
const mb = (kb) => (kb > 0 ? `${Math.round(kb / 1024)} MB` : '–');

function which(cmd) {
  const r = spawnSync('sh', ['-c', `command -v ${cmd}`], { encoding: 'utf8' });
  return r.status === 0 ? r.stdout.trim() : null;
}
const hasR = !flag('--no-r') && which('Rscript') !== null;
const timeBin = existsSync('/usr/bin/time') ? '/usr/bin/time' : null;
const work = mkdtempSync(join(tmpdir(), 'trendbrief-bench-'));

function rscript(code, args = []) {
  const r = spawnSync('Rscript', ['-e', code, ...args], { encoding: 'utf8', maxBuffer: 64 << 20 });
  if (r.status !== 0) throw new Error(`Rscript failed: ${r.stderr.trim().split('\n').slice(-3).join(' ')}`);
  return r.stdout;
}

function rangeOf(x) {
  let lo = Number.POSITIVE_INFINITY;
  let hi = Number.NEGATIVE_INFINITY;
  for (const v of x) {
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  return hi - lo;
}

/** Ms per call of fn for each of the samples, after warm-up calls. */
function timeOurs(fn, { samples, batch }, warmups) {
  for (let i = 0; i < warmups; i++) fn();
  const times = [];
  for (let s = 0; s < samples; s++) {
    const t0 = performance.now();
    for (let b = 0; b < batch; b++) fn();
    times.push((performance.now() - t0) / batch);
  }
  return times;
}

/**
 * R's stl on the same doubles (read from a binary file), timed with proc.time around the call, after one
 * warm-up call; ms per call for each sample.
 */
function timeR(file, n, outFile, { samples, batch }) {
  const code = `
    a <- commandArgs(trailingOnly = TRUE)
    x <- readBin(a[1], 'double', as.integer(a[2]))
    samples <- as.integer(a[3]); batch <- as.integer(a[4])
    s <- ${R_STL}
    times <- numeric(samples)
    for (k in seq_len(samples)) {
      t0 <- proc.time()[['elapsed']]
      for (b in seq_len(batch)) s <- ${R_STL}
      times[k] <- (proc.time()[['elapsed']] - t0) / batch
    }
    writeBin(c(as.double(s$time.series[, 'trend']), as.double(s$time.series[, 'seasonal'])), a[5])
    cat(times * 1000, sep = '\\n')`;
  const out = rscript(code, [file, String(n), String(samples), String(batch), outFile]);
  return out.trim().split('\n').map(Number);
}

function readDoubles(file, count) {
  const buf = readFileSync(file);
  // A copy, since a Buffer's offset into its memory need not be a multiple of 8.
  return new Float64Array(buf.buffer.slice(buf.byteOffset, buf.byteOffset + 8 * count));
}

function engineTable() {
  log('engine: robust STL in-process');
  // JIT warm-up on a small series before anything is timed.
  const warm = syntheticSeries(1200, 1);
  for (let i = 0; i < 30; i++) stl(warm, STL_OPTIONS);
  const rows = [];
  for (const n of SIZES) {
    const x = syntheticSeries(n);
    const p = plan(n);
    const bin = join(work, `x-${n}.bin`);
    const rOut = join(work, `r-${n}.bin`);
    if (hasR) writeFileSync(bin, new Uint8Array(x.buffer));
    const oursTimes = [];
    const rTimes = [];
    for (let round = 0; round < p.rounds; round++) {
      oursTimes.push(...timeOurs(() => stl(x, STL_OPTIONS), p, round === 0 ? (n > 200000 ? 1 : 3) : 0));
      if (hasR) rTimes.push(...timeR(bin, n, rOut, p));
    }
    const ours = median(oursTimes);
    const oursBest = Math.min(...oursTimes);
    let r = null;
    let rBest = null;
    let agree = null;
    if (hasR) {
      r = median(rTimes);
      rBest = Math.min(...rTimes);
      const theirs = readDoubles(rOut, 2 * n);
      const fit = stl(x, STL_OPTIONS);
      let worst = 0;
      for (let i = 0; i < n; i++) {
        worst = Math.max(worst, Math.abs(fit.trend[i] - theirs[i]), Math.abs(fit.seasonal[i] - theirs[n + i]));
      }
      agree = worst / rangeOf(x);
    }
    log(`  n=${n}: ours ${ms(ours)} ms${r === null ? '' : `, R ${ms(r)} ms`}`);
    rows.push({ n, ours, oursBest, r, rBest, agree });
  }
  const lines = [
    '### Robust STL, in-process',
    '',
    `Settings: period 12, seasonal window 13, robust (15 outer passes, 1 inner); \`stl(values, { period: 12, seasonalWindow: 13, robust: true })\` against R's \`${R_STL}\` on the same doubles. Times per call after warm-up, in three rounds of ours-then-R (small sizes timed in batches of calls); R is timed with \`proc.time()\` around the \`stl\` call only. Median of all runs, and the fastest run.`,
    '',
    '| n | trendbrief, median | R stats::stl, median | trendbrief / R | trendbrief, fastest | R, fastest | trendbrief / R, fastest | largest difference in trend or seasonal, as a share of the range |',
    '|---:|---:|---:|---:|---:|---:|---:|---:|',
  ];
  for (const row of rows) {
    const hasRow = row.r !== null;
    lines.push(
      `| ${fmtInt(row.n)} | ${ms(row.ours)} ms | ${hasRow ? `${ms(row.r)} ms` : '–'} | ${hasRow ? ratio(row.ours, row.r) : '–'} | ${ms(row.oursBest)} ms | ${hasRow ? `${ms(row.rBest)} ms` : '–'} | ${hasRow ? ratio(row.oursBest, row.rBest) : '–'} | ${row.agree === null ? '–' : row.agree.toExponential(1)} |`,
    );
  }
  return lines;
}

/** The CSV the command rows read: monthly dates while they fit in four-digit years, hourly beyond. */
function writeCsv(n, file) {
  const x = syntheticSeries(n);
  const monthly = n <= 12000;
  const parts = ['date,value\n'];
  let chunk = '';
  for (let i = 0; i < n; i++) {
    let date;
    if (monthly) {
      date = `${1900 + Math.floor(i / 12)}-${String((i % 12) + 1).padStart(2, '0')}`;
    } else {
      date = new Date(Date.UTC(1900, 0, 1) + i * 3600000).toISOString().slice(0, 16);
    }
    chunk += `${date},${x[i]}\n`;
    if (chunk.length > 1 << 20) {
      parts.push(chunk);
      chunk = '';
    }
  }
  parts.push(chunk);
  writeFileSync(file, parts.join(''));
  return monthly;
}

/** Wall time (ms) and peak RSS (KB, 0 when /usr/bin/time is missing) of one command, stdout discarded. */
function timeProcess(cmd, args) {
  const rssFile = join(work, 'rss.txt');
  const devNull = openSync('/dev/null', 'w');
  const full = timeBin ? [timeBin, ['-f', '%M', '-o', rssFile, cmd, ...args]] : [cmd, args];
  const t0 = performance.now();
  const r = spawnSync(full[0], full[1], { cwd: root, stdio: ['ignore', devNull, 'pipe'], encoding: 'utf8' });
  const wall = performance.now() - t0;
  closeSync(devNull);
  if (r.status !== 0) throw new Error(`${cmd} failed: ${(r.stderr ?? '').trim().split('\n').slice(-3).join(' ')}`);
  const rss = timeBin ? Number(readFileSync(rssFile, 'utf8').trim().split('\n').pop()) : 0;
  return { wall, rss };
}

/**
 * Runs the commands in turn, round after round, so that a change in the machine's load touches them all
 * alike; the median wall time and the largest peak RSS of each.
 */
function timeCommands(commands, runs) {
  const walls = commands.map(() => []);
  const rss = commands.map(() => 0);
  for (let i = 0; i < runs; i++) {
    commands.forEach(([cmd, args], k) => {
      const t = timeProcess(cmd, args);
      walls[k].push(t.wall);
      rss[k] = Math.max(rss[k], t.rss);
    });
  }
  return commands.map((_, k) => ({ wall: median(walls[k]), rss: rss[k] }));
}

const R_BASE = `x <- read.csv(commandArgs(trailingOnly = TRUE)[1])
s <- ${R_STL.replace('ts(x,', 'ts(x$value,')}
write.csv(data.frame(date = x$date, observed = x$value, s$time.series, weights = s$weights), stdout(), row.names = FALSE)`;
const R_FAST = `x <- data.table::fread(commandArgs(trailingOnly = TRUE)[1])
s <- ${R_STL.replace('ts(x,', 'ts(x$value,')}
data.table::fwrite(data.frame(date = x$date, observed = x$value, s$time.series, weights = s$weights), '')`;

async function processTable() {
  log('including process start-up: the decompose command');
  const hasDataTable = hasR && rscript("cat(requireNamespace('data.table', quietly = TRUE))").trim() === 'TRUE';
  const rows = [];
  for (const n of SIZES) {
    const file = join(work, `series-${n}.csv`);
    const monthly = writeCsv(n, file);
    const runs = n <= 20000 ? 7 : n <= 200000 ? 5 : 3;
    const ours = ['bin/trendbrief.js', 'decompose', file, '--date', 'date', '--value', 'value'];
    ours.push('--model', 'additive', '--robust', '--seasonal-window', '13', '--format', 'json');
    if (!monthly) ours.push('--frequency', 'hourly', '--period', '12');
    const commands = [[process.execPath, ours]];
    if (hasR) commands.push(['Rscript', ['-e', R_BASE, file]]);
    if (hasDataTable) commands.push(['Rscript', ['-e', R_FAST, file]]);
    for (const [cmd, args] of commands) timeProcess(cmd, args); // file cache and start-up warm-up
    const [o, rb = null, rf = null] = timeCommands(commands, runs);
    log(
      `  n=${n}: ours ${sec(o.wall)} s${rb ? `, R ${sec(rb.wall)} s` : ''}${rf ? `, R data.table ${sec(rf.wall)} s` : ''}`,
    );
    rows.push({ n, monthly, o, rb, rf });
  }
  const largest = rows[rows.length - 1];
  const lines = [
    '### Including process start-up: the whole `decompose` command',
    '',
    'Wall time of the whole process, reading a CSV and writing every component to stdout (sent to /dev/null), median of several runs; peak resident memory from `/usr/bin/time`.',
    '',
    '- trendbrief: `node bin/trendbrief.js decompose FILE.csv --date date --value value --model additive --robust --seasonal-window 13 --format json` (`--model additive` so it computes what R computes; the default `auto` also tests which model fits).',
    `- R, base: \`Rscript -e 'x <- read.csv(FILE); s <- stl(ts(x$value, frequency = 12), s.window = 13, robust = TRUE); write.csv(data.frame(date, observed, s$time.series, weights), stdout())'\`.`,
    '- R, data.table: the same with `data.table::fread` and `data.table::fwrite`.',
    '- Dates: monthly from 1900-01 up to n = 12,000; beyond that four-digit years run out, so hourly date-times from 1900-01-01T00:00 with `--frequency hourly --period 12` (R is told `frequency = 12` in every case).',
    '',
    '| n | dates | trendbrief | peak RSS | R, base | peak RSS | trendbrief / R base | R, data.table | trendbrief / R data.table |',
    '|---:|---|---:|---:|---:|---:|---:|---:|---:|',
  ];
  for (const { n, monthly, o, rb, rf } of rows) {
    lines.push(
      `| ${fmtInt(n)} | ${monthly ? 'monthly' : 'hourly'} | ${sec(o.wall)} s | ${mb(o.rss)} | ${rb ? `${sec(rb.wall)} s` : '–'} | ${rb ? mb(rb.rss) : '–'} | ${rb ? ratio(o.wall, rb.wall) : '–'} | ${rf ? `${sec(rf.wall)} s` : '–'} | ${rf ? ratio(o.wall, rf.wall) : '–'} |`,
    );
  }
  if (largest) lines.push('', ...(await stageTable(largest.n, largest.o.wall)));
  return lines;
}

/**
 * Where the command's time goes at the largest size: start-up (the command's --help), loading the CSV and
 * decomposing (both timed in this process, once, as a fresh command would run them), and the rest —
 * formatting and writing the output — as what the whole command takes beyond those.
 */
async function stageTable(n, total) {
  try {
    const { loadData } = await import('../dist/data/load.js');
    const { emptyDecompositionSpec, resolveDecomposition } = await import('../dist/job/resolve.js');
    const { runDecomposition } = await import('../dist/decompose/index.js');
    const file = join(work, `series-${n}.csv`);
    const monthly = writeCsv(n, file);
    const help = timeCommands([[process.execPath, ['bin/trendbrief.js', 'decompose', '--help']]], 5)[0].wall;
    const dataSpec = {
      file,
      fileAsWritten: file,
      format: 'csv',
      dateColumn: 'date',
      valueColumn: 'value',
      filter: null,
      groupBy: null,
      decimal: '.',
      delimiter: ',',
    };
    let t0 = performance.now();
    const data = loadData(dataSpec, monthly ? null : 'hourly');
    const load = performance.now() - t0;
    const spec = { ...emptyDecompositionSpec(), model: 'additive', period: 12, seasonalWindow: 13, robust: true };
    t0 = performance.now();
    const values = data.groups[0].series.values;
    runDecomposition(values, resolveDecomposition(spec, values, data.frequency, { file }));
    const decompose = performance.now() - t0;
    const rest = Math.max(0, total - help - load - decompose);
    return [
      `Where the command's ${sec(total)} s go at n = ${fmtInt(n)} (estimated: start-up is the median of \`decompose --help\`; loading and decomposing are timed once in the benchmark's process; output is the remainder):`,
      '',
      '| start-up and module loading | reading the CSV | decomposition | formatting and writing the JSON |',
      '|---:|---:|---:|---:|',
      `| ${sec(help)} s | ${sec(load)} s | ${sec(decompose)} s | ${sec(rest)} s |`,
    ];
  } catch (e) {
    return [`(Stage breakdown skipped: ${e.message})`];
  }
}

/**
 * Peak RSS of a fresh Node process that builds the series and runs robust STL once, from VmHWM in
 * /proc/self/status (getrusage's maxrss can carry the parent's peak over fork and exec).
 */
function stlMemory(n) {
  const code = `import { readFileSync } from 'node:fs';
import { stl } from ${JSON.stringify(join(root, 'dist/decompose/stl.js'))};
import { syntheticSeries } from ${JSON.stringify(join(root, 'bench/series.js'))};
const hwm = () => Number(readFileSync('/proc/self/status', 'utf8').match(/VmHWM:\\s*(\\d+)/)[1]);
const before = hwm();
stl(syntheticSeries(${n}), ${JSON.stringify(STL_OPTIONS)});
console.log(before, hwm());`;
  const r = spawnSync(process.execPath, ['--input-type=module', '-e', code], { encoding: 'utf8' });
  if (r.status !== 0) return null;
  const [before, after] = r.stdout.trim().split(' ').map(Number);
  return { before, after };
}

function classicalTable() {
  log('classical decomposition');
  const n = 1200000;
  const x = syntheticSeries(n);
  const ours = median(
    timeOurs(() => classicalDecomposition(x, 12, { model: 'additive' }), { samples: 7, batch: 1 }, 5),
  );
  let r = null;
  if (hasR) {
    const bin = join(work, `x-${n}.bin`);
    writeFileSync(bin, new Uint8Array(x.buffer));
    const code = `a <- commandArgs(trailingOnly = TRUE); x <- readBin(a[1], 'double', as.integer(a[2]))
      d <- decompose(ts(x, frequency = 12))
      times <- sapply(1:7, function(k) { t0 <- proc.time()[['elapsed']]; d <- decompose(ts(x, frequency = 12)); proc.time()[['elapsed']] - t0 })
      cat(times * 1000, sep = '\\n')`;
    r = median(
      rscript(code, [bin, String(n)])
        .trim()
        .split('\n')
        .map(Number),
    );
  }
  log(`  n=${n}: ours ${ms(ours)} ms${r === null ? '' : `, R ${ms(r)} ms`}`);
  return [
    '### Classical additive decomposition',
    '',
    '`classicalDecomposition(values, 12, { model: "additive" })` against R\'s `decompose(ts(x, frequency = 12))`, median of 7 runs after warm-up. Target: under 0.1 s.',
    '',
    '| n | trendbrief | R stats::decompose | trendbrief / R |',
    '|---:|---:|---:|---:|',
    `| ${fmtInt(n)} | ${ms(ours)} ms | ${r === null ? '–' : `${ms(r)} ms`} | ${r === null ? '–' : ratio(ours, r)} |`,
  ];
}

function machine() {
  let cpu = cpus()[0]?.model ?? 'unknown CPU';
  try {
    const m = readFileSync('/proc/cpuinfo', 'utf8').match(/^model name\s*:\s*(.+)$/m);
    if (m) cpu = m[1].trim();
  } catch {
    // not Linux: keep os.cpus()
  }
  const rVersion = hasR ? rscript('cat(R.version.string)').trim() : 'R not found';
  const load = loadavg()
    .map((v) => v.toFixed(2))
    .join(', ');
  return `Machine: ${cpu}, ${cpus().length} cores, ${(totalmem() / 2 ** 30).toFixed(1)} GB memory; Node ${process.version}; ${rVersion}. Load average when the run started: ${load}.`;
}

async function main() {
  const started = new Date();
  const out = [`## Benchmark, ${started.toISOString().slice(0, 10)}`, '', machine(), ''];
  out.push(
    'Data: the seeded synthetic series of `bench/series.js` (trend + twelve-step seasonal + Gaussian noise + a spike about every 300 points), the same numbers for every tool.',
    '',
  );
  out.push(...engineTable(), '');
  const mem = stlMemory(1200000);
  if (mem) {
    out.push(
      `Peak RSS of a fresh Node process that builds the 1,200,000-point series and runs robust STL once: ${mb(mem.after)} (${mb(mem.before)} when the modules are loaded, before the series is built).`,
      '',
    );
  }
  if (!flag('--no-process')) out.push(...(await processTable()), '');
  out.push(...classicalTable(), '');
  out.push(
    `Load average when the run ended: ${loadavg()
      .map((v) => v.toFixed(2))
      .join(', ')}. Times on a shared machine vary from run to run; compare the columns of one run.`,
  );
  process.stdout.write(`${out.join('\n')}\n`);
}

try {
  await main();
} finally {
  rmSync(work, { recursive: true, force: true });
}
