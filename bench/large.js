/**
 * `node bench/large.js`: one brief of a 1,200,000-point hourly series (bench/make-hourly.mjs, seeded: about
 * 137 years of an invented city's electricity demand, MSTL with periods 24 and 168) rendered to HTML, PDF and
 * JSON by the built command line in a fresh process under `/usr/bin/time -v`: wall time, peak memory, the
 * PDF's pages and each file's size, against the targets (≤ 60 s, ≤ 1 GB, ≤ 60 pages). The record of
 * published briefs is written as a render writes it by default (an SQLite file beside the job, holding the
 * data values used). `--points N` for another length. Imports nothing of the project but the generator (dist/ for its random numbers).
 */
import { mkdtempSync, readdirSync, readFileSync, rmSync, statSync } from 'node:fs';
import { availableParallelism, cpus, loadavg, tmpdir, totalmem } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { writeHourlyJob } from './make-hourly.mjs';
import { measure } from './measure.js';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const argv = process.argv.slice(2);
const at = argv.indexOf('--points');
const POINTS = at >= 0 ? Number(argv[at + 1]) : 1_200_000;
const TARGET = { seconds: 60, peakMb: 1000, pages: 60 };

const log = (msg) => process.stderr.write(`${msg}\n`);
const work = mkdtempSync(join(tmpdir(), 'trendbrief-large-'));
const loadBefore = loadavg();
try {
  log(`writing a ${POINTS.toLocaleString('en')}-point hourly series …`);
  const job = writeHourlyJob(POINTS, join(work, 'job'));
  const out = join(work, 'out');
  log('rendering it to HTML, PDF and JSON …');
  const r = measure(
    [join(root, 'bin/trendbrief.js'), 'render', job, '--out', out, '--format', 'html,pdf,json', '--quiet'],
    {
      cwd: root,
      discardStdout: true,
    },
  );
  const files = readdirSync(out);
  const size = (ext) => {
    const f = files.find((x) => x.endsWith(ext));
    return f ? statSync(join(out, f)).size / 1e6 : Number.NaN;
  };
  const pdf = files.find((x) => x.endsWith('.pdf'));
  const pages = pdf
    ? (
        readFileSync(join(out, pdf))
          .toString('latin1')
          .match(/\/Type \/Page\b(?!s)/g) ?? []
      ).length
    : 0;
  const ok = (v, t) => (v <= t ? 'met' : 'NOT met');
  const lines = [
    `| measure | result | target | |`,
    '| --- | ---: | ---: | --- |',
    `| ${POINTS.toLocaleString('en')} hourly points to HTML + PDF + JSON, wall | ${r.wall.toFixed(1)} s | ≤ ${TARGET.seconds} s | ${ok(r.wall, TARGET.seconds)} |`,
    `| peak memory (max RSS) | ${r.peakMb.toFixed(0)} MB | ≤ ${TARGET.peakMb} MB | ${ok(r.peakMb, TARGET.peakMb)} |`,
    `| PDF pages | ${pages} | ≤ ${TARGET.pages} | ${ok(pages, TARGET.pages)} |`,
    `| HTML / PDF / JSON size | ${size('.html').toFixed(1)} / ${size('.pdf').toFixed(1)} / ${size('.json').toFixed(0)} MB | | |`,
  ];
  const machine = `Machine: ${cpus()[0]?.model ?? 'unknown CPU'}, ${availableParallelism()} cores, ${(totalmem() / 2 ** 30).toFixed(0)} GiB, Node ${process.version}; load average before ${loadBefore.map((l) => l.toFixed(1)).join(' ')}, after ${loadavg()
    .map((l) => l.toFixed(1))
    .join(' ')}`;
  process.stdout.write(`${lines.join('\n')}\n\n${machine}\n`);
} finally {
  rmSync(work, { recursive: true, force: true });
}
