/**
 * `node bench/pdf-render.js [ROOT] [REPS]`: builds bench/brief-12.yaml once with ROOT's dist/ (default this
 * checkout; `npm run build` first), then draws its PDF REPS times (default 5) in the same process and prints
 * one JSON line: the CPU time of each draw in ms (the first is cold: nothing of the PDF engine has run yet),
 * the file's size and the start of its SHA-256. CPU time rather than wall time, as other work on a shared
 * machine moves wall time far more. To compare two builds, run this on each in alternation (bench/PDF.md).
 */
import { createHash } from 'node:crypto';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const here = join(dirname(fileURLToPath(import.meta.url)), '..');
const root = resolve(process.argv[2] ?? here);
const reps = Number(process.argv[3] ?? 5);
const load = (path) => import(pathToFileURL(join(root, 'dist', path)).href);

const { buildBriefs } = await load('brief/build.js');
const { loadJob } = await load('job/load.js');
const { renderPdf } = await load('render/pdf/index.js');
const units = await buildBriefs(loadJob(join(here, 'bench/brief-12.yaml')), {
  toolVersion: 'bench',
  charts: true,
  epoch: 1_700_000_000,
});
const brief = units[0].brief;
const cpu = [];
let pdf = Buffer.alloc(0);
for (let i = 0; i < reps; i++) {
  const start = process.cpuUsage();
  pdf = await renderPdf(brief);
  const used = process.cpuUsage(start);
  cpu.push(Math.round((used.user + used.system) / 1000));
}
const sha = createHash('sha256').update(pdf).digest('hex').slice(0, 12);
console.log(JSON.stringify({ root, cpuMs: cpu, bytes: pdf.length, sha256: sha }));
