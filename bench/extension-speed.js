/**
 * `node bench/extension-speed.js`: what forecast extension costs a whole brief. bench/brief-12.yaml (twelve
 * monthly series, ten years each) rendered to HTML and PDF by the built CLI in a fresh process, in
 * alternating rounds:
 *   on      the job as it is (monthly data: extension on by default, with the revision study re-estimating
 *           the chosen orders at each cut)
 *   off     the same job with `defaults.decomposition.extend: off`
 *   before  the job rendered by another build (--root DIR, e.g. a checkout of the code before extension was
 *           on; optional)
 * Prints the median wall time of each and the ratios, with the load average: on a shared machine only the
 * ratios mean much. Options: --runs N (default 5), --root DIR.
 *
 *   npm run build && node bench/extension-speed.js [--root ../other-checkout]
 */
import { spawnSync } from 'node:child_process';
import { copyFileSync, existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

const here = join(dirname(fileURLToPath(import.meta.url)), '..');
const argv = process.argv.slice(2);
const option = (name, fallback) => {
  const i = argv.indexOf(name);
  return i >= 0 ? argv[i + 1] : fallback;
};
const RUNS = Number(option('--runs', '5'));
const other = option('--root', null);
const before = other ? resolve(other) : null;

const work = mkdtempSync(join(tmpdir(), 'trendbrief-extension-speed-'));
try {
  mkdirSync(join(work, 'data'));
  copyFileSync(join(here, 'bench/data/brief-12.csv'), join(work, 'data/brief-12.csv'));
  const job = readFileSync(join(here, 'bench/brief-12.yaml'), 'utf8');
  writeFileSync(join(work, 'on.yaml'), job);
  if (/^defaults:/m.test(job)) throw new Error('bench/brief-12.yaml has defaults: extend this script');
  writeFileSync(join(work, 'off.yaml'), `${job}\ndefaults:\n  decomposition:\n    extend: off\n`);

  // CPU time (user + system, from /usr/bin/time where it exists) beside the wall time: steadier on a
  // shared machine.
  const timeBin = existsSync('/usr/bin/time') ? '/usr/bin/time' : null;
  const run = (root, name) => {
    const out = join(work, `out-${name}`);
    rmSync(out, { recursive: true, force: true });
    const args = [
      join(root, 'bin/trendbrief.js'),
      'render',
      join(work, name === 'before' ? 'on.yaml' : `${name}.yaml`),
    ].concat(['--out', out, '--format', 'html,pdf', '--quiet']);
    const t0 = performance.now();
    const r = spawnSync(timeBin ?? process.execPath, timeBin ? ['-f', 'cpu %U %S', process.execPath, ...args] : args, {
      env: { ...process.env, TRENDBRIEF_RECORD: 'never', SOURCE_DATE_EPOCH: '1790000000' },
      encoding: 'utf8',
    });
    const wall = (performance.now() - t0) / 1000;
    if (r.status !== 0) throw new Error(`${name}: exit ${r.status}\n${r.stderr}`);
    const m = /cpu ([\d.]+) ([\d.]+)/.exec(r.stderr);
    return { wall, cpu: m ? Number(m[1]) + Number(m[2]) : Number.NaN };
  };
  const arms = [
    ['on', here],
    ['off', here],
  ];
  if (before) {
    if (!existsSync(join(before, 'dist/cli/main.js'))) throw new Error(`${before}: no dist/ (build it first)`);
    arms.push(['before', before]);
  }
  const loadBefore = loadavg();
  for (const [name, root] of arms) run(root, name); // warm the file cache
  const times = Object.fromEntries(arms.map(([name]) => [name, []]));
  for (let i = 0; i < RUNS; i++) {
    for (const [name, root] of i % 2 ? [...arms].reverse() : arms) times[name].push(run(root, name));
  }
  const loadAfter = loadavg();
  const median = (xs) => {
    const s = [...xs].sort((a, b) => a - b);
    const m = s.length >> 1;
    return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
  };
  const med = Object.fromEntries(arms.map(([name]) => [name, median(times[name].map((t) => t.wall))]));
  const cpu = Object.fromEntries(arms.map(([name]) => [name, median(times[name].map((t) => t.cpu))]));
  const label = (name) =>
    name === 'on' ? 'extension on (default)' : name === 'off' ? 'extension off' : `before (${before})`;
  const rows = [
    '| brief-12, HTML + PDF | median wall | / off | median CPU | / off | wall of each run |',
    '| --- | ---: | ---: | ---: | ---: | --- |',
    ...arms.map(
      ([name]) =>
        `| ${label(name)} | ${med[name].toFixed(2)} s | ${(med[name] / med.off).toFixed(2)} | ${cpu[name].toFixed(2)} s | ${(cpu[name] / cpu.off).toFixed(2)} | ${times[name].map((t) => t.wall.toFixed(2)).join(', ')} |`,
    ),
  ];
  console.log(rows.join('\n'));
  const fmt = (l) => l.map((v) => v.toFixed(1)).join(' ');
  console.log(
    `\nload average before ${fmt(loadBefore)}, after ${fmt(loadAfter)}; target ≤ 1.5 s wall on a quiet machine`,
  );
} finally {
  rmSync(work, { recursive: true, force: true });
}
