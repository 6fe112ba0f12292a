/**
 * `node bench/startup.js [--rounds N]`: what a start costs, in alternating runs within this one run, so a
 * change in the machine's load touches every command alike. Commands: `node -e 0` (Node.js alone),
 * `trendbrief --version` and the one-series brief (bench/brief-1.yaml to HTML and PDF), each from the bundle
 * bin/trendbrief.js runs (dist/bundle/, scripts/bundle.mjs) and from tsc's modules (dist/cli/main.js), plus
 * the modules each loads (every ES module resolved and CommonJS module required, counted once). Prints
 * Markdown; median wall and CPU time (user + system, from /usr/bin/time where present). Run `npm run build`
 * first.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const argv = process.argv.slice(2);
const ROUNDS = Number(argv[argv.indexOf('--rounds') + 1] || 5) || 5;
const TIME = '/usr/bin/time';
const timed = existsSync(TIME);
const work = mkdtempSync(join(tmpdir(), 'trendbrief-startup-'));
const unbundled = join(work, 'unbundled.mjs');
writeFileSync(
  unbundled,
  `import { main } from ${JSON.stringify(join(root, 'dist/cli/main.js'))};\nmain(process.argv.slice(2)).then((code) => { process.exitCode = code; });\n`,
);
const bin = join(root, 'bin/trendbrief.js');
const node = process.execPath;
const brief = (entry, k) => [
  node,
  entry,
  'render',
  'bench/brief-1.yaml',
  '--out',
  join(work, `out-${k}`),
  '--format',
  'html,pdf',
  '--quiet',
];
const commands = [
  ['`node -e 0`', [node, '-e', '0']],
  ['`trendbrief --version`, bundle', [node, bin, '--version']],
  ['`trendbrief --version`, tsc modules', [node, unbundled, '--version']],
  ['one-series brief, HTML + PDF, bundle', brief(bin, 'b')],
  ['one-series brief, HTML + PDF, tsc modules', brief(unbundled, 'u')],
];
const ENV = { ...process.env, TRENDBRIEF_RECORD: 'never' };

function run(cmd, extraEnv = {}) {
  const rusage = join(work, 'rusage.txt');
  const full = timed ? [TIME, '-f', '%U %S', '-o', rusage, ...cmd] : cmd;
  const t0 = process.hrtime.bigint();
  const r = spawnSync(full[0], full.slice(1), { cwd: root, env: { ...ENV, ...extraEnv }, stdio: 'ignore' });
  const wall = Number(process.hrtime.bigint() - t0) / 1e9;
  if (r.status !== 0) throw new Error(`${cmd.join(' ')} exited ${r.status}`);
  const cpu = timed
    ? readFileSync(rusage, 'utf8')
        .trim()
        .split('\n')
        .pop()
        .split(' ')
        .map(Number)
        .reduce((a, b) => a + b, 0)
    : Number.NaN;
  return { wall, cpu };
}

function modules(cmd) {
  if (cmd[1] === '-e') return 0;
  const log = join(work, 'imports.txt');
  rmSync(log, { force: true });
  const [exe, ...rest] = cmd;
  const hooks = [
    '--import',
    join(root, 'test/cli/files/record-imports.mjs'),
    '--require',
    join(root, 'test/chart/files/record-requires.cjs'),
  ];
  spawnSync(exe, [...hooks, ...rest], { cwd: root, env: { ...ENV, IMPORT_LOG: log }, stdio: 'ignore' });
  const seen = new Set(
    readFileSync(log, 'utf8')
      .split('\n')
      .map((l) => l.replace(/^file:\/\//, ''))
      .filter((l) => l !== '' && !l.startsWith('node:') && !l.includes('/test/')),
  );
  return seen.size;
}

const median = (xs) => {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
};
const loadBefore = loadavg().map((l) => l.toFixed(2));
try {
  for (const [, cmd] of commands) run(cmd);
  const times = commands.map(() => []);
  for (let i = 0; i < ROUNDS; i++) {
    commands.forEach(([, cmd], k) => {
      times[k].push(run(cmd));
    });
    process.stderr.write(`startup round ${i + 1}/${ROUNDS}\n`);
  }
  const base = median(times[0].map((t) => t.wall));
  const lines = [
    '| command | median wall | / `node -e 0` | median CPU | modules loaded |',
    '| --- | ---: | ---: | ---: | ---: |',
  ];
  commands.forEach(([name, cmd], k) => {
    const wall = median(times[k].map((t) => t.wall));
    const cpu = median(times[k].map((t) => t.cpu));
    lines.push(
      `| ${name} | ${wall.toFixed(2)} s | ${(wall / base).toFixed(2)} | ${cpu.toFixed(2)} s | ${modules(cmd)} |`,
    );
  });
  const after = loadavg().map((l) => l.toFixed(2));
  process.stdout.write(
    `${lines.join('\n')}\n\n${ROUNDS} rounds; load average (1, 5, 15 min) before ${loadBefore.join(' ')}, after ${after.join(' ')}.\n`,
  );
} finally {
  rmSync(work, { recursive: true, force: true });
}
