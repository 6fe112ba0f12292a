import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { availableParallelism, cpus, loadavg, tmpdir, totalmem } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { measureCommand, median } from './measure.js';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const argv = process.argv.slice(2);
const option = (name, fallback) => {
  const i = argv.indexOf(name);
  return i >= 0 ? argv[i + 1] : fallback;
};
const ROUNDS = Number(option('--rounds', '5'));
const OTHER = argv.includes('--root') ? resolve(option('--root')) : null;
const HANDMADE = argv.includes('--handmade');
const WRITE = !argv.includes('--no-write');
const TARGET_WALL = 2.0;

const log = (msg) => process.stderr.write(`${msg}\n`);
const secs = (t) => (Number.isFinite(t) ? t.toFixed(2) : 'n/a');
const loadNow = () =>
  loadavg()
    .map((l) => l.toFixed(2))
    .join(' ');

if (!existsSync(join(root, 'dist/bundle/main.js'))) {
  log('bench/effects-brief.js: dist/ is missing — run `npm run build` first');
  process.exit(2);
}
const work = mkdtempSync(join(tmpdir(), 'trendbrief-effects-'));
const ENV = { ...process.env, TRENDBRIEF_RECORD: 'never' };

/** One run, stdout discarded: wall and CPU seconds (CPU NaN without /usr/bin/time). */
function run(command) {
  return measureCommand(command, { cwd: root, env: ENV, discardStdout: true });
}

const render = (base, job, k) => {
  const out = join(work, `out-${k}`);
  return {
    before: () => rmSync(out, { recursive: true, force: true }),
    command: [
      process.execPath,
      join(base, 'bin/trendbrief.js'),
      'render',
      job,
      '--out',
      out,
      '--format',
      'html,pdf',
      '--quiet',
    ],
  };
};

// The same job with every effect off, in the temporary folder, its data named by full path.
const effectsJob = join(root, 'bench/brief-12-effects.yaml');
const text = readFileSync(effectsJob, 'utf8');
const plainText = text
  .replace(/^ {2}effects: \{[^}]*\}$/m, '  effects: { find: off }')
  .replaceAll('file: data/brief-12.csv', `file: ${JSON.stringify(join(root, 'bench/data/brief-12.csv'))}`);
if (!plainText.includes('effects: { find: off }')) {
  throw new Error('bench/brief-12-effects.yaml: no `effects:` line under defaults to turn off');
}
const plainJob = join(work, 'brief-12-no-effects.yaml');
writeFileSync(plainJob, plainText);

const sides = [
  { name: 'effects on', ...render(root, effectsJob, 0) },
  { name: 'effects off', ...render(root, plainJob, 1) },
];
if (OTHER) sides.push({ name: `effects on, ${OTHER}`, ...render(OTHER, effectsJob, 2) });
if (HANDMADE) {
  sides.push({
    name: 'hand-made route',
    before: () => {},
    command: ['/usr/bin/python3', 'bench/handmade.py', 'bench/data/brief-12.csv', join(work, 'handmade.pdf')],
  });
}

const loadBefore = loadNow();
const walls = sides.map(() => []);
const cpuTimes = sides.map(() => []);
try {
  for (const s of sides) {
    s.before();
    run(s.command);
  }
  for (let i = 0; i < ROUNDS; i++) {
    sides.forEach((s, k) => {
      s.before();
      const t = run(s.command);
      walls[k].push(t.wall);
      cpuTimes[k].push(t.cpu);
    });
    log(`round ${i + 1}/${ROUNDS}: ${sides.map((s, k) => `${s.name} ${secs(walls[k].at(-1))} s`).join(', ')}`);
  }
} finally {
  rmSync(work, { recursive: true, force: true });
}
const loadAfter = loadNow();

const ratioOf = (k) => {
  const r = walls[0].map((w, i) => w / walls[k][i]);
  const c = cpuTimes[0].map((w, i) => w / cpuTimes[k][i]);
  return { wall: median(r), lo: Math.min(...r), hi: Math.max(...r), cpu: median(c) };
};
const wall = median(walls[0]);
const lines = [
  '# The 12-series brief with calendar effects and the search for events',
  '',
  `Measured ${new Date().toISOString().slice(0, 10)} by \`node bench/effects-brief.js\` (bench/brief-12-effects.yaml to HTML and PDF, whole process), ${ROUNDS} alternating rounds, medians.`,
  '',
  '| run | median wall | median CPU |',
  '| --- | ---: | ---: |',
  ...sides.map((s, k) => `| ${s.name} | ${secs(median(walls[k]))} s | ${secs(median(cpuTimes[k]))} s |`),
  '',
  '| ratio (effects on / …) | wall, median of the rounds' + "'" + ' ratios (range) | CPU |',
  '| --- | ---: | ---: |',
  ...sides.slice(1).map((s, k) => {
    const r = ratioOf(k + 1);
    return `| ${s.name} | ${r.wall.toFixed(2)} (${r.lo.toFixed(2)}–${r.hi.toFixed(2)}) | ${Number.isFinite(r.cpu) ? r.cpu.toFixed(2) : 'n/a'} |`;
  }),
  '',
  `Target: ≤ ${TARGET_WALL.toFixed(1)} s wall for the brief with effects — ${wall <= TARGET_WALL ? 'met' : 'not met'} here (${secs(wall)} s); on a shared machine read the ratios.`,
  `Machine: ${cpus()[0]?.model.trim() ?? 'unknown'}, ${availableParallelism()} cores, ${(totalmem() / 2 ** 30).toFixed(0)} GiB, Node ${process.version}; load average (1, 5, 15 min) before ${loadBefore}, after ${loadAfter}.`,
];
const table = lines.join('\n');
console.log(table);
if (WRITE) {
  const file = join(root, 'bench/EFFECTS-BRIEF.md');
  const old = existsSync(file) ? readFileSync(file, 'utf8') : '';
  const at = old.indexOf('<!-- notes -->');
  writeFileSync(file, `${table}\n\n${at >= 0 ? old.slice(at) : '<!-- notes -->\n'}`);
}
