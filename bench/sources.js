/**
 * `node bench/sources.js`: 1,000,000 rows from each kind of source into the series model (dates → a regular
 * hourly index, values → Float64Array), each read a fresh process (bench/load-source.js) under
 * `/usr/bin/time -v`: wall time and peak resident memory. A CSV of the same rows is the yardstick, read in
 * the same run, so the ratios hold on a busy machine where the seconds do not.
 *
 * The rows: hourly from 1900-01-01T00:00 (a million hours is 114 years), values 1000 + 50·sin(2π·h/24) +
 * 10·sin(2π·h/8766) + (h mod 7). Written once per run into a temporary folder:
 *   - CSV, and a SQLite file (better-sqlite3, one transaction);
 *   - a workbook by exceljs's streaming writer (LibreOffice takes minutes for a sheet this size), dates as
 *     formatted date cells;
 *   - PostgreSQL: a table on a throwaway server from Debian's postgresql (as the tests start one), filled
 *     by generate_series on the server; or the server at TRENDBRIEF_BENCH_POSTGRES_URL. Skipped, with a
 *     line saying so, when neither is there.
 * Targets (issue 18): SQLite and PostgreSQL ≤ 3 s, the workbook ≤ 15 s, peak ≤ 500 MB each.
 * Options: --rows N (default 1000000), --repeat K (default 3; the median is shown), --root DIR.
 */
import { execFileSync } from 'node:child_process';
import { chownSync, existsSync, mkdtempSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { createServer } from 'node:net';
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
const ROWS = Number(option('--rows', '1000000'));
const REPEAT = Number(option('--repeat', '3'));
const require = createRequire(join(root, 'package.json'));
const log = (msg) => process.stderr.write(`${msg}\n`);
const loadBefore = loadavg();

const H0 = Date.UTC(1900, 0, 1);
const value = (h) => 1000 + 50 * Math.sin((2 * Math.PI * h) / 24) + 10 * Math.sin((2 * Math.PI * h) / 8766) + (h % 7);
const hourText = (h) => new Date(H0 + h * 3_600_000).toISOString().slice(0, 16);

const dir = mkdtempSync(join(tmpdir(), 'trendbrief-bench-sources-'));
const cleanups = [() => rmSync(dir, { recursive: true, force: true })];

function base(file, format, extra = {}) {
  return {
    file,
    fileAsWritten: file.split('/').pop(),
    format,
    dateColumn: 'hour',
    valueColumn: 'value',
    filter: null,
    groupBy: null,
    decimal: '.',
    delimiter: ',',
    frequencyHint: 'hourly',
    ...extra,
  };
}

function writeCsv() {
  const file = join(dir, 'rows.csv');
  const parts = ['hour,value\n'];
  for (let h = 0; h < ROWS; h++) parts.push(`${hourText(h)},${value(h)}\n`);
  writeFileSync(file, parts.join(''));
  return base(file, 'csv');
}

function writeSqlite() {
  const Database = require('better-sqlite3');
  const file = join(dir, 'rows.sqlite');
  const db = new Database(file);
  db.exec('create table readings (hour text, value real)');
  const insert = db.prepare('insert into readings values (?, ?)');
  db.transaction(() => {
    for (let h = 0; h < ROWS; h++) insert.run(hourText(h), value(h));
  })();
  db.close();
  return base(file, 'sqlite', {
    query: 'select hour, value from readings order by hour',
    parameters: [],
    timeoutSeconds: 60,
  });
}

async function writeWorkbook() {
  const ExcelJS = require('exceljs');
  const file = join(dir, 'rows.xlsx');
  const wb = new ExcelJS.stream.xlsx.WorkbookWriter({ filename: file, useSharedStrings: false, useStyles: true });
  const ws = wb.addWorksheet('Hours');
  ws.addRow(['hour', 'value']).commit();
  for (let h = 0; h < ROWS; h++) {
    const row = ws.addRow([new Date(H0 + h * 3_600_000), value(h)]);
    row.getCell(1).numFmt = 'yyyy-mm-dd hh:mm';
    row.commit();
  }
  ws.commit();
  await wb.commit();
  return base(file, 'xlsx', { sheet: 'Hours', range: null, headerRow: null });
}

function freePort() {
  return new Promise((res, rej) => {
    const s = createServer();
    s.once('error', rej);
    s.listen(0, '127.0.0.1', () => {
      const { port } = s.address();
      s.close(() => res(port));
    });
  });
}

/** A throwaway server as test/support/postgres-server.ts starts one (trust on loopback: a bench only). */
async function startPostgres() {
  if (process.env.TRENDBRIEF_BENCH_POSTGRES_URL) return process.env.TRENDBRIEF_BENCH_POSTGRES_URL;
  const lib = '/usr/lib/postgresql';
  const version = existsSync(lib) ? readdirSync(lib).sort((a, b) => Number(b) - Number(a))[0] : null;
  if (!version) return null;
  const bin = join(lib, version, 'bin');
  const folder = mkdtempSync(join(tmpdir(), 'trendbrief-bench-pg-'));
  const asRoot = process.getuid?.() === 0;
  const run = (cmd, args) =>
    execFileSync(asRoot ? 'runuser' : cmd, asRoot ? ['-u', 'postgres', '--', cmd, ...args] : args, { stdio: 'pipe' });
  if (asRoot) {
    const uid = Number(execFileSync('id', ['-u', 'postgres']).toString());
    const gid = Number(execFileSync('id', ['-g', 'postgres']).toString());
    chownSync(folder, uid, gid);
  }
  const data = join(folder, 'data');
  run(join(bin, 'initdb'), ['-D', data, '-U', 'postgres', '--auth=trust', '--no-sync', '-E', 'UTF8', '--locale=C']);
  const port = await freePort();
  run(join(bin, 'pg_ctl'), [
    '-D',
    data,
    '-o',
    `-p ${port} -k ${folder} -c listen_addresses=127.0.0.1 -c fsync=off`,
    '-l',
    join(folder, 'log'),
    '-w',
    'start',
  ]);
  cleanups.push(() => {
    try {
      run(join(bin, 'pg_ctl'), ['-D', data, '-m', 'immediate', '-w', 'stop']);
    } finally {
      rmSync(folder, { recursive: true, force: true });
    }
  });
  return `postgres://postgres@127.0.0.1:${port}/postgres`;
}

async function fillPostgres(url) {
  const pg = require('pg');
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  await client.query('drop table if exists bench_readings');
  await client.query(`create table bench_readings as
    select timestamp '1900-01-01' + h * interval '1 hour' as hour,
           1000 + 50 * sin(2 * pi() * h / 24) + 10 * sin(2 * pi() * h / 8766) + (h % 7) as value
    from generate_series(0, ${ROWS - 1}) as h`);
  await client.end();
  cleanups.unshift(async () => {
    const c = new pg.Client({ connectionString: url });
    await c.connect();
    await c.query('drop table if exists bench_readings');
    await c.end();
  });
  return base('', 'postgres', {
    fileAsWritten: 'PostgreSQL ($TRENDBRIEF_BENCH_DB)',
    connectionEnv: 'TRENDBRIEF_BENCH_DB',
    query: 'select hour, value from bench_readings order by hour',
    parameters: [],
    timeoutSeconds: 120,
  });
}

function median(xs) {
  const s = [...xs].sort((a, b) => a - b);
  return s[s.length >> 1];
}

const rowsText = ROWS.toLocaleString('en-GB');
try {
  log(`writing ${rowsText} rows as CSV, SQLite, a workbook and a PostgreSQL table…`);
  const specs = [['CSV (yardstick)', writeCsv(), null, null]];
  specs.push(['SQLite', writeSqlite(), 3, 500]);
  const url = await startPostgres();
  if (url) {
    process.env.TRENDBRIEF_BENCH_DB = url;
    specs.push(['PostgreSQL', await fillPostgres(url), 3, 500]);
  } else {
    log('PostgreSQL skipped: no /usr/lib/postgresql and no TRENDBRIEF_BENCH_POSTGRES_URL');
  }
  specs.push(['Excel workbook (.xlsx)', await writeWorkbook(), 15, 500]);
  const results = new Map(specs.map(([name]) => [name, []]));
  // Alternating rounds: each round reads every source once, so load changes touch all alike.
  for (let k = 0; k < REPEAT; k++) {
    for (const [name, spec] of specs) {
      const m = measure(['bench/load-source.js', root, JSON.stringify(spec)], { cwd: root });
      results.get(name).push(m);
      log(`${name}: ${m.wall.toFixed(2)} s, ${m.peakMb.toFixed(0)} MB`);
    }
  }
  const csvWall = median(results.get('CSV (yardstick)').map((m) => m.wall));
  console.log(
    `\n${rowsText} rows into the series model, fresh process each (median of ${REPEAT}; wall includes Node.js start-up):\n`,
  );
  console.log('| source | wall | / CSV | peak memory | target | |');
  console.log('| --- | ---: | ---: | ---: | --- | --- |');
  for (const [name, , seconds, mb] of specs) {
    const ms = results.get(name);
    const wall = median(ms.map((m) => m.wall));
    const peak = Math.max(...ms.map((m) => m.peakMb));
    const target = seconds === null ? '' : `≤ ${seconds} s, ≤ ${mb} MB`;
    const met = seconds === null ? '' : wall <= seconds && peak <= mb ? 'met' : 'NOT met';
    console.log(
      `| ${name} | ${wall.toFixed(2)} s | ${(wall / csvWall).toFixed(1)} | ${peak.toFixed(0)} MB | ${target} | ${met} |`,
    );
  }
  const cpu = cpus()[0]?.model ?? 'unknown CPU';
  console.log(
    `\nMachine: ${cpu}, ${availableParallelism()} cores, ${(totalmem() / 2 ** 30).toFixed(0)} GiB, Node ${process.version}; load average before ${loadBefore.map((x) => x.toFixed(1)).join(' ')}, after ${loadavg()
      .map((x) => x.toFixed(1))
      .join(' ')}`,
  );
} finally {
  for (const c of cleanups) await c();
}
